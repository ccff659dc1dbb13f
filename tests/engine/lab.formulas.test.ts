/**
 * SOIL.LABVALUE through the headless engine (issue 22 point 6): spills over a column of lab
 * results and feeds other SOIL functions. Policies as compared by Floit et al. (1996) ASTM STP 1291
 * (abstract seen); cell texts and soils invented.
 */
import { evaluateFormula } from "../../src/engine/evaluate";

describe("LABVALUE formulas", () => {
  it("a column of lab texts spills by the policy named; blank and n.a. stay blank", () => {
    const rows = evaluateFormula('=SOIL.LABVALUE({12.4;"<0.5";"";"n.a.";"1 250"},"half")').value as unknown[][];
    expect(rows).toEqual([[12.4], [0.25], [""], [""], [1250]]);
  });
  it("a censored value without a policy is #VALUE! in its own cell; the others compute", () => {
    const rows = evaluateFormula('=SOIL.LABVALUE({12.4;"<0.5"})').value as unknown[][];
    expect(rows[0]![0]).toBe(12.4);
    expect(rows[1]![0]).toMatch(/^#VALUE! value "<0.5" is below detection: say how to count it with below: limit \(0.5\), half \(0.25\)/);
  });
  it('">300" with above "limit" is 300; "12,5" needs decimal ","', () => {
    expect(evaluateFormula('=SOIL.LABVALUE(">300",,"limit")').value).toBe(300);
    expect(evaluateFormula('=SOIL.LABVALUE("12,5",,,",")').value).toBe(12.5);
    expect(evaluateFormula('=SOIL.LABVALUE("12,5")').error).toBe("#VALUE!");
  });
  it("n.d. and trace take zero or blank; half cannot apply to them", () => {
    expect(evaluateFormula('=SOIL.LABVALUE("n.d.","zero")').value).toBe(0);
    expect(evaluateFormula('=SOIL.LABVALUE("trace","half")').error).toBe("#VALUE!");
  });
  it("feeds a SOIL function: Na below detection counted as half the limit in a CEC (meq/100g)", () => {
    expect(evaluateFormula('=SOIL.CEC(6,1,0.5,SOIL.LABVALUE("<0.05","half"),"meq/100g")').value).toBeCloseTo(7.525, 12);
  });
  it("the issue's spill with a \"<0.05\" Na, read by LABVALUE inside SOIL.CEC, computes both rows (derived sums)", () => {
    const rows = evaluateFormula('=SOIL.CEC({6;9},{1;2},{0.5;0.6},SOIL.LABVALUE({"<0.05";0.2},"half"),"meq/100g")').value as number[][];
    expect(rows[0]![0]).toBeCloseTo(6 + 1 + 0.5 + 0.025, 12);
    expect(rows[1]![0]).toBeCloseTo(9 + 2 + 0.6 + 0.2, 12);
  });
  it("SOIL.ABOUT names the policies' source", () => {
    expect(evaluateFormula('=SOIL.ABOUT("LABVALUE")').value).toMatch(/Floit/);
  });
});
