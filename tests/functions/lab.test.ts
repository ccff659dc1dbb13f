/**
 * Binding of SOIL.LABVALUE (issue 22 point 6): spills over a column of lab results, blank in blank
 * out, each element's refusal in its own cell, policies broadcast like any argument. Cell texts
 * are invented; the policies follow Floit et al. (1996) ASTM STP 1291 (abstract seen), as in
 * tests/core/lab-value.test.ts.
 */
import { labvalue } from "../../src/functions/lab";
import { PlainHostError, specOf } from "../../src/functions/_binding";

const err = (v: unknown) => (v instanceof PlainHostError ? `${v.kind} ${v.message}` : undefined);
const g = (v: unknown) => [[v]] as any[][];

describe("SOIL.LABVALUE", () => {
  it("declares value, below, above, decimal; value is read as it stands (number or text)", () => {
    expect(specOf(labvalue)?.params.map((p) => p.name)).toEqual(["value", "below", "above", "decimal"]);
    expect(specOf(labvalue)?.params.map((p) => p.kind)).toEqual(["cell", "text", "text", "text"]);
  });
  it("a column of lab results spills: numbers pass, '<0.5' by the policy, blank stays blank", () => {
    const out = labvalue([[12.4], ["<0.5"], [""], ["n.a."], ["8.1"]], g("half"));
    expect(out).toEqual([[12.4], [0.25], [""], [""], [8.1]]);
  });
  it("a censored value without a policy is #VALUE! in its own cell; the other cells compute", () => {
    const out = labvalue([[12.4], ["<0.5"], [3]]);
    expect(out[0]![0]).toBe(12.4);
    expect(err(out[1]![0])).toMatch(/^#VALUE! value "<0.5" is below detection: say how to count it with below: limit \(0.5\), half \(0.25\), zero or blank/);
    expect(out[2]![0]).toBe(3);
  });
  it("the blank policy gives a blank cell, never 0", () => {
    expect(labvalue(g("<0.5"), g("blank"))).toEqual([[""]]);
  });
  it("above and decimal: '>300' limit is 300; '12,5' with ',' is 12.5 and without it #VALUE!", () => {
    expect(labvalue(g(">300"), null as never, g("limit"))).toEqual([[300]]);
    expect(labvalue(g("12,5"), null as never, null as never, g(","))).toEqual([[12.5]]);
    expect(err(labvalue(g("12,5"))[0]![0])).toMatch(/^#VALUE! value: "12,5" has a comma/);
  });
  it("a column of policies broadcasts against one value", () => {
    expect(labvalue(g("<0.05"), [["limit"], ["half"], ["zero"], ["blank"]])).toEqual([[0.05], [0.025], [0], [""]]);
  });
  it("an error value in is the same error out", () => {
    const e = new PlainHostError("#N/A", "upstream");
    expect(labvalue(g(e))[0]![0]).toBe(e);
  });
  it("a boolean is #VALUE!", () => {
    expect(err(labvalue(g(true))[0]![0])).toMatch(/^#VALUE! value must be a number or text/);
  });
});
