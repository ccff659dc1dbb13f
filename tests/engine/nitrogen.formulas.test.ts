/**
 * The legume-N functions through the headless engine: values, words or numbers for the factors,
 * spills from array literals, blanks and errors. Expected values: Source as in
 * tests/core/nitrogen*.test.ts (NFIX-02 and NFIX-04 derived from the natural abundance equation;
 * NFIX-08 Peoples et al. 2012, 20 kg shoot N fixed per t herbage DM, seen). Other inputs invented.
 */
import { evaluateFormula } from "../../src/engine/evaluate";

const num = (f: string) => evaluateFormula(f).value as number;

describe("legume nitrogen formulas", () => {
  it("SOIL.NDFA of the NFIX-02 worked case is 71.43 %", () => {
    expect(num("=SOIL.NDFA(6,1,-1)")).toBeCloseTo(71.43, 2);
  });
  it("SOIL.NFIXED chains with SOIL.NDFA (NFIX-04: 200 kg shoot N × 71.4 %)", () => {
    expect(num('=SOIL.NFIXED(8,2.5,71.4,"shoot")')).toBeCloseTo(142.8, 9);
    expect(num('=SOIL.NFIXED(8,2.5,SOIL.NDFA(6,1,-1),"shoot")')).toBeCloseTo(142.857, 3);
    expect(num("=SOIL.NFIXED(8,2.5,71.4,1.5)")).toBeCloseTo(214.2, 9);
  });
  it("percents typed as fractions are refused with the hint (issue 22 point 4)", () => {
    expect(evaluateFormula('=SOIL.NFIXED(8,0.025,80,"shoot")').message).toContain("0.025 looks like a fraction; enter 2.5 for 2.5 %");
    expect(evaluateFormula('=SOIL.NFIXED(8,2.5,82%,"shoot")').message).toContain("0.82 looks like a fraction; enter 82 for 82 %");
    expect(evaluateFormula("=SOIL.NBALANCE(50,2.5,0.04)").error).toBe("#VALUE!");
  });
  it("SOIL.NFIXED without root_factor says a factor is needed", () => {
    const r = evaluateFormula("=SOIL.NFIXED(8,2.5,80)");
    expect(r.error).toBe("#VALUE!");
    expect(r.message).toMatch(/^root_factor is needed/);
  });
  it("SOIL.NFIXDM with the pasture rule (NFIX-08) and a column of DM that spills", () => {
    expect(num('=SOIL.NFIXDM(5,"pasture")')).toBe(100);
    const rows = evaluateFormula('=SOIL.NFIXDM({2;"";-1},"pasture")').value as unknown[][];
    expect(rows).toHaveLength(3);
    expect(rows[0]![0]).toBe(40);
    expect(rows[1]![0]).toBe("");
    expect(rows[2]![0]).toMatch(/^#VALUE! shoot_dm must be from 0 to 60 t\/ha/);
  });
  it("SOIL.NDIFF, SOIL.NBALANCE and SOIL.SHOOTDM", () => {
    expect(num("=SOIL.NDIFF(250,90)")).toBe(160);
    expect(num("=SOIL.NDIFF(250,90,40,60)")).toBe(140);
    expect(num("=SOIL.NBALANCE(50,2.5,4)")).toBeCloseTo(-50, 9);
    expect(num("=SOIL.SHOOTDM(2,0.4)")).toBeCloseTo(5, 12);
    expect(evaluateFormula("=SOIL.SHOOTDM(2,35)").message).toMatch(/fraction/);
  });
  it("SOIL.NDFA with reference equal to B is #VALUE! with a message", () => {
    expect(evaluateFormula("=SOIL.NDFA(-1,0,-1)")).toEqual({
      error: "#VALUE!",
      message: "d15n_reference equals b_value (-1 ‰): the natural abundance method cannot tell soil N from fixed N here",
    });
  });
  it("SOIL.ABOUT has a line for each legume-N function", () => {
    for (const id of ["NFIXED", "NFIXDM", "NDFA", "NDIFF", "NBALANCE", "SHOOTDM"]) {
      expect(typeof evaluateFormula(`=SOIL.ABOUT("${id}")`).value).toBe("string");
    }
  });
});
