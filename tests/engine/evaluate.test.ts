/**
 * Formula tests through the headless engine: argument counts, defaults, broadcasting, spills and
 * errors. Expected values: Source as in tests/core (UNIT-16 layer-mass definition; IUPAC/CIAAW
 * atomic weights for CMOL and OXIDE: 2P / P2O5 = 61.948 / 141.943 = 0.436429, derived from the
 * abridged weights, from memory; Virginia Tech SPES-201NP, seen, prints the rounded 0.4365).
 */
import { evaluateFormula } from "../../src/engine/evaluate";

describe("evaluateFormula", () => {
  it("CONVERT with depth and density (UNIT-16: 10 mg/kg, 15 cm, 1.3 g/cm3 → 19.5 kg/ha)", () => {
    expect(evaluateFormula('=SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)')).toEqual({ value: 19.5 });
  });
  it("names are case-insensitive and the leading = is optional", () => {
    expect(evaluateFormula('soil.convert(1,"t/ha","kg/ha")')).toEqual({ value: 1000 });
  });
  it("a missing density is #VALUE! saying which", () => {
    expect(evaluateFormula('=SOIL.CONVERT(10,"mg/kg","kg/ha",15)')).toEqual({
      error: "#VALUE!",
      message: "converting mg/kg to kg/ha needs bulk_density (dry bulk density in g/cm3)",
    });
  });
  it("an argument left empty takes its default (here: none, so depth is asked for)", () => {
    expect(evaluateFormula('=SOIL.CONVERT(10,"mg/kg","kg/ha",,1.3)').message).toMatch(/needs depth_cm/);
  });
  it("an array spills with blanks and per-element errors", () => {
    const r = evaluateFormula('=SOIL.CMOL({200.39;"";-1},"Ca")');
    const rows = r.value as unknown[][];
    expect(rows).toHaveLength(3);
    expect(rows[0]![0]).toBeCloseTo(1, 10);
    expect(rows[1]![0]).toBe("");
    expect(rows[2]![0]).toMatch(/^#VALUE! mg_per_kg must be at least 0/);
  });
  it("mismatched shapes are one #VALUE! naming both shapes", () => {
    expect(evaluateFormula('=SOIL.CMOL({1,2},{"Ca";"Mg"})').message).toBe(
      "mg_per_kg is 1×2 but ion is 2×1; ranges must have the same shape, or be a single cell",
    );
  });
  it("Excel's stored form is accepted (100 P2O5 is 43.6429 P, derived from atomic weights)", () => {
    expect((evaluateFormula('=_xldudf_SOIL_OXIDE(100,"P2O5","P")').value as number)).toBeCloseTo(43.6429, 4);
  });
  it("too many arguments is #VALUE! saying how many are allowed, not a crash", () => {
    expect(evaluateFormula('=SOIL.CMOL(1,"Ca",3)')).toEqual({ error: "#VALUE!", message: "too many arguments: at most 2" });
  });
  it("VERSION and ABOUT", () => {
    expect(evaluateFormula("=SOIL.VERSION()").value).toMatch(/^soilcell \d+\.\d+\.\d+$/);
    expect(evaluateFormula('=SOIL.ABOUT("SOIL.CMOL")').value).toMatch(/IUPAC/);
    expect(evaluateFormula('=SOIL.ABOUT("NOPE")').error).toBe("#VALUE!");
  });
});

describe("evaluateFormula: the workbook it stands in for", () => {
  it("counts dates in the 1900 system, Excel's default for a new workbook (1 January 1904 is serial 1462; Microsoft Support, 'Date systems in Excel': from memory)", () => {
    expect(evaluateFormula("=DATE(1904,1,1)")).toEqual({ value: 1462 });
    expect(evaluateFormula("=DATE(2026,12,5)")).toEqual({ value: 46361 }); // derived: 1462 + 44,899 days from 1 Jan 1904 to 5 Dec 2026, counted
  });
  it("with blank references, an empty cell is blank (ISBLANK is TRUE), not an error or text", () => {
    expect(evaluateFormula("=ISBLANK(C2)", { blankReferences: true })).toEqual({ value: true });
    expect(evaluateFormula('=C2&"x"', { blankReferences: true })).toEqual({ value: "x" });
  });
});
