/**
 * The cation functions through the headless engine: defaults, spills built from array literals,
 * blanks and errors. Expected values: Source as in tests/core/cations.test.ts (CEC-05 derived from
 * IUPAC equivalent weights; Clemson 'CEC calculations' worked example, seen; CEC-10 derived from
 * the USDA Handbook 60 SAR definition).
 */
import { evaluateFormula } from "../../src/engine/evaluate";

const num = (f: string) => evaluateFormula(f).value as number;

describe("cation formulas", () => {
  it("SOIL.CEC of the CEC-05 soil, unit omitted (mg/kg) and given", () => {
    expect(num("=SOIL.CEC(2000,180,150,30,2)")).toBeCloseTo(13.976, 3);
    expect(num('=SOIL.CEC(2000,180,150,30,2,"ppm")')).toBeCloseTo(13.976, 3);
    expect(num('=SOIL.CEC(2600,234,195,39,2,"mg/dm3",1.3)')).toBeCloseTo(13.976, 3);
  });
  it("SOIL.SATURATION: Clemson worked example (seen), bases 37 %", () => {
    expect(Math.round(num('=SOIL.SATURATION("bases",200,14,110.5,6,2.4)'))).toBe(37);
  });
  it("a row of parts spills five saturations adding up to 100 %", () => {
    const rows = evaluateFormula('=SOIL.SATURATION({"Ca","Mg","K","Na","acidity"},2000,180,150,30,2)').value as number[][];
    expect(rows).toHaveLength(1);
    expect(rows[0]).toHaveLength(5);
    expect(rows[0]!.reduce((s, v) => s + v, 0)).toBeCloseTo(100, 9);
  });
  it("a column of Ca spills, with blank in blank out and a per-element error", () => {
    const rows = evaluateFormula('=SOIL.CEC({2000;"";-1},180,150,30,2)').value as unknown[][];
    expect(rows).toHaveLength(3);
    expect(rows[0]![0]).toBeCloseTo(13.976, 3);
    expect(rows[1]![0]).toBe("");
    expect(rows[2]![0]).toMatch(/^#VALUE! ca must be at least 0/);
  });
  it("a measured CEC smaller than the bases is computed above 100 %, not capped (inputs invented)", () => {
    expect(num('=SOIL.SATURATION("bases",5000,300,200,50,,15)')).toBeGreaterThan(100);
  });
  it("SOIL.CAMG charge by default and mass on request (CEC-06, derived)", () => {
    expect(num("=SOIL.CAMG(2000,180)")).toBeCloseTo(6.738, 3);
    expect(num('=SOIL.CAMG(2000,180,,"mass")')).toBeCloseTo(11.111, 3);
  });
  it("SOIL.ESP and SOIL.SAR (CEC-12 definition, from memory; CEC-10 derived)", () => {
    expect(num('=SOIL.ESP(2,20,"cmol/kg")')).toBeCloseTo(10, 10);
    expect(num("=SOIL.SAR(15,6,4)")).toBeCloseTo(6.708, 3);
  });
  it("errors say what is wrong", () => {
    expect(evaluateFormula('=SOIL.CEC(1,1,1,1,0,"lbs")')).toEqual({
      error: "#VALUE!",
      message: 'unknown unit "lbs" for unit; use mg/kg, g/kg, %, cmol/kg, mmol/kg, mg/dm3',
    });
    expect(evaluateFormula('=SOIL.SAR(1,1,1,"mmol/L")').message).toMatch(/ambiguous/);
    expect(evaluateFormula('=SOIL.SATURATION("acidity",2000,180,150,30)').message).toMatch(/needs acidity/);
    expect(evaluateFormula("=SOIL.CEC({1;2;3},{1,2},1,1)").message).toBe(
      "ca is 3×1 but mg is 1×2; ranges must have the same shape, or be a single cell",
    );
  });
  it("SOIL.ABOUT has a line for each cation function", () => {
    for (const id of ["CEC", "SATURATION", "CAMG", "ESP", "SAR"]) {
      expect(typeof evaluateFormula(`=SOIL.ABOUT("${id}")`).value).toBe("string");
    }
    expect(evaluateFormula('=SOIL.ABOUT("CAMG")').value).toMatch(/Kopittke & Menzies 2007/);
  });
});
