/**
 * Bindings of the cation functions: argument order, broadcasting a column, blank in blank out,
 * defaults, and errors as host error values. Inputs are invented unless a source is named;
 * expected values follow from the core checks in tests/core/cations.test.ts.
 */
import { cec, saturation, camg, esp, sar } from "../../src/functions/cations";
import { PlainHostError, specOf } from "../../src/functions/_binding";

const err = (v: unknown) => (v instanceof PlainHostError ? `${v.kind} ${v.message}` : undefined);
const g = (v: unknown) => [[v]] as any[][];

describe("argument order is the catalogue's (functions.md, Cation exchange)", () => {
  it.each([
    ["CEC", cec, ["ca", "mg", "k", "na", "unit", "acidity", "bulk_density"]],
    ["SATURATION", saturation, ["part", "ca", "mg", "k", "na", "unit", "acidity", "cec", "bulk_density"]],
    ["CAMG", camg, ["ca", "mg", "unit", "basis"]],
    ["ESP", esp, ["na", "cec", "unit", "bulk_density"]],
    ["SAR", sar, ["na", "ca", "mg", "unit"]],
  ])("SOIL.%s", (_id, fn, names) => {
    expect(specOf(fn as Function)?.params.map((p) => p.name)).toEqual(names);
  });
});

describe("SOIL.CEC", () => {
  it("CEC-05 soil (derived): 13.976 cmol(+)/kg in mg/kg or its alias ppm", () => {
    expect(cec(g(2000), g(180), g(150), g(30), g("mg/kg"), g(2))[0]![0]).toBeCloseTo(13.976, 3);
    expect(cec(g(2000), g(180), g(150), g(30), g("ppm"), g(2))[0]![0]).toBeCloseTo(13.976, 3);
  });
  it("a column of Ca broadcasts against single cells; a blank Ca gives a blank result", () => {
    const out = cec([[2000], [1000], [""], [null]], g(180), g(150), g(30), g("mg/kg"), g(2));
    expect(out).toHaveLength(4);
    expect(out[0]![0]).toBeCloseTo(13.976, 3);
    expect(out[1]![0]).toBeCloseTo(13.976 - 1000 / 200.39, 3);
    expect(out[2]![0]).toBe("");
    expect(out[3]![0]).toBe("");
  });
  it("an acidity range with a blank element gives blank there (binding rule), and omitted acidity is 0", () => {
    const out = cec(g(2000), g(180), g(150), g(30), g("mg/kg"), [[2], [""], [0]]);
    expect(out[0]![0]).toBeCloseTo(13.976, 3);
    expect(out[1]![0]).toBe("");
    expect(out[2]![0]).toBeCloseTo(11.976, 3);
    expect(cec(g(2000), g(180), g(150), g(30), g("mg/kg"))[0]![0]).toBeCloseTo(11.976, 3);
  });
  it("all blank in, all blank out (catalogue: blank in, blank out, never 0 and never an error)", () => {
    expect(cec([[""], [""]], [[""], [""]], [[""], [""]], [[""], [""]], g("mg/kg"))).toEqual([[""], [""]]);
  });
  it("mg/dm3 needs bulk_density: #VALUE! saying so; with it the result matches mg/kg", () => {
    expect(err(cec(g(2600), g(234), g(195), g(39), g("mg/dm3"), g(2))[0]![0])).toMatch(/^#VALUE! .*needs bulk_density/);
    expect(cec(g(2600), g(234), g(195), g(39), g("mg/dm3"), g(2), g(1.3))[0]![0]).toBeCloseTo(13.976, 3);
  });
  it("a negative concentration is #VALUE! naming the argument and does not spoil the other elements", () => {
    const out = cec(g(2000), [[180], [-5]], g(150), g(30), g("mg/kg"), g(2));
    expect(out[0]![0]).toBeCloseTo(13.976, 3);
    expect(err(out[1]![0])).toMatch(/^#VALUE! mg must be at least 0/);
  });
  it("an unknown unit is #VALUE! listing the accepted units", () => {
    expect(err(cec(g(1), g(1), g(1), g(1), g("lbs"), g(0))[0]![0])).toBe(
      '#VALUE! unknown unit "lbs" for unit; use mg/kg, g/kg, %, cmol(+)/kg, mmolc/kg, mg/dm3',
    );
  });
  it("mismatched range shapes are #VALUE! naming both shapes", () => {
    expect(err(cec([[1], [2], [3]], [[1, 2]], g(1), g(1), g("mg/kg"))[0]![0])).toBe(
      "#VALUE! ca is 3×1 but mg is 1×2; ranges must have the same shape, or be a single cell",
    );
  });
  it("numeric text is accepted; '<5' is not", () => {
    expect(cec(g("2000"), g("180"), g("150"), g("30"), g("mg/kg"), g("2"))[0]![0]).toBeCloseTo(13.976, 3);
    expect(err(cec(g("<5"), g(1), g(1), g(1), g("mg/kg"))[0]![0])).toMatch(/^#VALUE! ca: "<5" is not a number/);
  });
});

describe("SOIL.SATURATION", () => {
  it("a row of parts spills the five saturations of the CEC-05 soil, adding up to 100 %", () => {
    const out = saturation([["Ca", "Mg", "K", "Na", "acidity"]], g(2000), g(180), g(150), g(30), g("mg/kg"), g(2));
    expect(out[0]).toHaveLength(5);
    const total = (out[0] as number[]).reduce((s, v) => s + v, 0);
    expect(total).toBeCloseTo(100, 9);
    expect(out[0]![0]).toBeCloseTo(71.41, 2);
  });
  it("Source: Clemson 'CEC calculations' worked example (seen): bases 37 %", () => {
    expect(Math.round(saturation(g("bases"), g(200), g(14), g(110.5), g(6), g("mg/kg"), g(2.4))[0]![0] as number)).toBe(37);
  });
  it("a measured cec is the denominator; below the sum of bases the result exceeds 100 %, not capped", () => {
    const v = saturation(g("bases"), g(5000), g(300), g(200), g(50), g("mg/kg"), null as never, g(15))[0]![0] as number;
    expect(v).toBeGreaterThan(100);
  });
  it("acidity without acidity, and bases without acidity or cec, are #VALUE! with the reason", () => {
    expect(err(saturation(g("acidity"), g(2000), g(180), g(150), g(30), g("mg/kg"))[0]![0])).toMatch(/^#VALUE! acidity saturation needs acidity/);
    expect(err(saturation(g("bases"), g(2000), g(180), g(150), g(30), g("mg/kg"))[0]![0])).toMatch(/100 % by construction/);
  });
  it("an unknown part is #VALUE! listing the parts; a blank cec element gives blank", () => {
    expect(err(saturation(g("H"), g(1), g(1), g(1), g(1), g("mg/kg"), g(1))[0]![0])).toMatch(/use Ca, Mg, K, Na, acidity or bases/);
    expect(saturation(g("Ca"), g(1), g(1), g(1), g(1), g("mg/kg"), g(1), [[10], [""]])[1]![0]).toBe("");
  });
  it("all cations and acidity 0 is #VALUE! (saturation undefined), never NaN", () => {
    expect(err(saturation(g("Ca"), g(0), g(0), g(0), g(0), g("mg/kg"), g(0))[0]![0])).toMatch(/^#VALUE! .*summed CEC is 0/);
  });
});

describe("SOIL.CAMG", () => {
  it("CEC-06 (derived): 6.74 charge basis by default, 11.1 mass basis on request", () => {
    expect(camg(g(2000), g(180), g("mg/kg"))[0]![0]).toBeCloseTo(6.738, 3);
    expect(camg(g(2000), g(180), g("mg/kg"), g("mass"))[0]![0]).toBeCloseTo(11.111, 3);
  });
  it("Mg = 0 is #VALUE! (ratio undefined); unknown basis lists charge and mass", () => {
    expect(err(camg(g(100), g(0), g("mg/kg"))[0]![0])).toMatch(/^#VALUE! mg is 0/);
    expect(err(camg(g(100), g(10), g("mg/kg"), g("molar"))[0]![0])).toMatch(/use charge or mass/);
  });
});

describe("SOIL.ESP", () => {
  it("CEC-12 (Handbook 60 definition, from memory): Na 2 cmol(+)/kg in CEC 20 → 10 %; a column of Na broadcasts", () => {
    const out = esp([[2], [4], [""]], g(20), g("cmol(+)/kg"));
    expect(out[0]![0]).toBeCloseTo(10, 10);
    expect(out[1]![0]).toBeCloseTo(20, 10);
    expect(out[2]![0]).toBe("");
  });
  it("cec of 0 is #VALUE! giving the range", () => {
    expect(err(esp(g(1), g(0), g("mg/kg"))[0]![0])).toMatch(/^#VALUE! cec must be greater than 0/);
  });
});

describe("SOIL.SAR", () => {
  it("CEC-10 (derived from Handbook 60): Na 15, Ca 6, Mg 4 meq/L → 6.708 in mmolc/L or meq/L", () => {
    expect(sar(g(15), g(6), g(4), g("mmolc/L"))[0]![0]).toBeCloseTo(6.708, 3);
    expect(sar(g(15), g(6), g(4), g("meq/L"))[0]![0]).toBeCloseTo(6.708, 3);
  });
  // Invented water, derived with the Handbook 60 definition and IUPAC/CIAAW abridged atomic weights
  // (from memory): Na 230 / 22.990 = 10.0043, Ca 40 / (40.078 / 2) = 1.99611, Mg 24.3 / (24.305 / 2) =
  // 1.99959 mmolc/L; SAR = 10.0043 / √((1.99611 + 1.99959) / 2) = 7.07792.
  it("mg/L is accepted; bare mmol/L is #VALUE! explaining the ambiguity", () => {
    expect(sar(g(230), g(40), g(24.3), g("mg/L"))[0]![0]).toBeCloseTo(7.07792, 4);
    expect(err(sar(g(1), g(1), g(1), g("mmol/L"))[0]![0])).toMatch(/^#VALUE! unit "mmol\/L" is ambiguous/);
  });
  it("Ca + Mg = 0 is #VALUE!, never Infinity", () => {
    expect(err(sar(g(5), g(0), g(0), g("mmolc/L"))[0]![0])).toMatch(/^#VALUE! ca and mg are both 0/);
  });
});

describe("no guessed unit (issue 22 points 3 and 5)", () => {
  // The soil: Ca 6, Mg 1, K 0.5, Na 0.2 meq/100 g, acidity 0.1 (derived: bases 7.7 of 7.8).
  it.each([
    // Excel passes an omitted argument as null.
    ["CEC", () => cec(g(6), g(1), g(0.5), g(0.2), null as never)],
    ["SATURATION", () => saturation(g("bases"), g(6), g(1), g(0.5), g(0.2), null as never)],
    ["CAMG", () => camg(g(6), g(1), null as never)],
    ["ESP", () => esp(g(0.2), g(7.8), null as never)],
    ["SAR", () => sar(g(15), g(6), g(4), null as never)],
  ])("SOIL.%s without a unit is #VALUE! saying the unit is required", (_id, call) => {
    expect(err((call as () => any[][])()[0]![0])).toMatch(/^#VALUE! unit is required: /);
  });
  it("a blank unit cell is the same #VALUE!, and the message lists the cation units", () => {
    expect(err(cec(g(6), g(1), g(0.5), g(0.2), g(""))[0]![0])).toMatch(/^#VALUE! unit is required: .*mg\/kg, g\/kg, %, cmol\(\+\)\/kg, mmolc\/kg, mg\/dm3/);
  });
  it("with meq/100g the issue's soil is ~98 % base saturation, not 13.7 %", () => {
    expect(saturation(g("bases"), g(6), g(1), g(0.5), g(0.2), g("meq/100g"), g(0.1))[0]![0]).toBeCloseTo((100 * 7.7) / 7.8, 9);
  });
  it("bare cmol/kg and mmol/kg are #VALUE! naming the charge spellings", () => {
    expect(err(cec(g(6), g(1), g(0.5), g(0.2), g("cmol/kg"))[0]![0])).toMatch(/^#VALUE! unit "cmol\/kg" is ambiguous.*write cmol\(\+\)\/kg/);
    expect(err(esp(g(2), g(20), g("mmol/kg"))[0]![0])).toMatch(/^#VALUE! unit "mmol\/kg" is ambiguous.*write mmolc\/kg/);
  });
  it("mg/L is #VALUE! naming mg/dm3 (an extract concentration, not soil volume)", () => {
    expect(err(cec(g(2600), g(234), g(195), g(39), g("mg/L"), g(2), g(1.3))[0]![0])).toMatch(/write mg\/dm3/);
  });
  it("a column of units broadcasts: each row in its own unit", () => {
    const out = cec([[6], [1202.34]], [[1], [121.525]], [[0.5], [195.49]], [[0.2], [45.98]], [["meq/100g"], ["mg/kg"]]);
    expect(out[0]![0]).toBeCloseTo(7.7, 9);
    expect(out[1]![0]).toBeCloseTo(6 + 1 + 0.5 + 0.2, 3);
  });
});
