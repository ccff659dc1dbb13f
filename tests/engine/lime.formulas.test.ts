/**
 * Lime formulas through the headless engine: defaults, array-literal calibration tables, spills
 * and errors. Expected values: Source as in tests/core/lime-*.test.ts (Moore 2025, OSU Extension
 * EM 9585 Table 1; NCDA&CS lime factor page; BC Soil Factsheet 637.200-2; Brazilian V% worked
 * example), tables marked invented where they are.
 */
import { evaluateFormula } from "../../src/engine/evaluate";

const num = (f: string) => {
  const r = evaluateFormula(f);
  if (typeof r.value !== "number") throw new Error(`${f} gave ${JSON.stringify(r)}`);
  return r.value;
};

describe("lime formulas", () => {
  it("EM 9585 worked example: =SOIL.LIMEBUFFER(6,5.6,\"SIKORA-OR2025\",,,\"ton/ac\") → 1.7", () => {
    expect(num('=SOIL.LIMEBUFFER(6,5.6,"SIKORA-OR2025",,,"ton/ac")')).toBeCloseTo(1.7, 10);
  });
  it("a column of buffer pH spills, with the out-of-table element as its own error", () => {
    const rows = evaluateFormula('=SOIL.LIMEBUFFER({6.5;6;4},6,"SIKORA-OR2025",,,"ton/ac")').value as unknown[][];
    expect(rows).toHaveLength(3);
    expect(rows[0]![0]).toBeCloseTo(1.2, 10);
    expect(rows[1]![0]).toBeCloseTo(2.5, 10);
    expect(rows[2]![0]).toBe("#VALUE! buffer_ph 4 is outside the SIKORA-OR2025 table (buffer pH 4.8 to 6.9); the table is not extrapolated");
  });
  it("an array literal as the calibration table (invented lab table), interpolated on both axes", () => {
    expect(num('=SOIL.LIMEBUFFER(6.25,6.25,{"",6,6.5;6,3,4;6.5,1,2})')).toBeCloseTo(2.5, 10);
  });
  it("the calibration is required (issue 22 point 3): left out it is an error; left empty #VALUE! naming the built-ins", () => {
    // Too few arguments: Excel refuses the formula when typed; the engine answers an error.
    expect(evaluateFormula("=SOIL.LIMEBUFFER(6,6.5)").error).toBeDefined();
    const r = evaluateFormula("=SOIL.LIMEBUFFER(6,6.5,)");
    expect(r.error).toBe("#VALUE!");
    expect(r.message).toMatch(/^calibration is required: .*SIKORA-OR2025, MEHLICH/);
  });
  it("SMP named is #N/A with the reason (its table is not shipped)", () => {
    const r = evaluateFormula('=SOIL.LIMEBUFFER(6,6.5,"SMP")');
    expect(r.error).toBe("#N/A");
    expect(r.message).toMatch(/^the SMP table is not shipped/);
  });
  it("issue 22 point 4: =SOIL.LIMEPRODUCT(3,0.95,0.85) and =SOIL.LIMEBASESAT(8.9,0.5,0.7) are refused with the fraction hint", () => {
    const p = evaluateFormula("=SOIL.LIMEPRODUCT(3,0.95,0.85)");
    expect(p.error).toBe("#VALUE!");
    expect(p.message).toContain("0.95 looks like a fraction; enter 95 for 95 %");
    const b = evaluateFormula("=SOIL.LIMEBASESAT(8.9,0.5,0.7)");
    expect(b.error).toBe("#VALUE!");
    expect(b.message).toContain("0.5 looks like a fraction; enter 50 for 50 %");
  });
  it("the same in percent computes: 3 t/ha at CCE 95 %, fineness 85 % is 3.715 (derived)", () => {
    expect(num("=SOIL.LIMEPRODUCT(3,95,85)")).toBeCloseTo(3 / 0.95 / 0.85, 10);
  });
  it("a CCE of 95 % written as a percent literal (95%, stored 0.95) is refused too", () => {
    expect(evaluateFormula("=SOIL.LIMEPRODUCT(3,95%)").error).toBe("#VALUE!");
  });
  it("MEHLICH needs soil_ph: NCDA&CS example 0.75 ton/ac; without it #VALUE!", () => {
    expect(num('=SOIL.LIMEBUFFER(6.3,6,"MEHLICH",5,,"ton/ac")')).toBeCloseTo(0.75, 10);
    expect(evaluateFormula('=SOIL.LIMEBUFFER(6.3,6,"MEHLICH")').error).toBe("#VALUE!");
  });
  it("nesting: base-saturation rate into the product rate (T 5.46, V 8.42 → 60 %, PRNT 80 → 3.5 t/ha)", () => {
    expect(num("=SOIL.LIMEPRODUCT(SOIL.LIMEBASESAT(5.46,8.42,60),80)")).toBeCloseTo(3.52, 2);
  });
  it("LIMEAL with an empty factor takes 1.5: 3.603 t/ha (LIME-24, derived)", () => {
    expect(num("=SOIL.LIMEAL(2,,20,1.2)")).toBeCloseTo(3.6031, 4);
  });
  it("FINENESS from a column literal (BC Factsheet limestone A, 85.28 %) and with a user rating", () => {
    expect(num("=SOIL.FINENESS({78.8;10;2.4;7.8})")).toBeCloseTo(85.28, 10);
    expect(num("=SOIL.FINENESS({70,20,10},{100,50,10})")).toBeCloseTo(81, 10);
  });
  it("ABOUT carries the source and the caution", () => {
    const about = evaluateFormula('=SOIL.ABOUT("LIMEBUFFER")').value as string;
    expect(about).toMatch(/EM 9585/);
    expect(about).toMatch(/check them against local calibrations, regulations and licensed advice/);
  });
});
