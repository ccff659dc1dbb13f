/**
 * Calls and names in the evaluator (src/engine/formula/evaluate.ts, its second half), in a
 * workbook (tests/helpers/sheet-eval: read, planned and computed by the recalculation host) and
 * through `soilcell eval` (evaluateFormula). Written for the mutants of the engine-evaluate part
 * that no test told apart. Expected values: Microsoft Support's pages where named (from memory);
 * the rest is the engine's own rule ("behaviour"), each stated beside its check.
 */
import { compute } from "../../helpers/sheet-eval";
import { evaluateFormula } from "../../../src/engine/evaluate";

const refused = (why: string, cell: string) => `not computed: it reads ${cell}, which is not computed headless (${why})`;
const CODE0 = "CODE takes 1 arguments, not 0; not computed headless";
const INDEX0 = "INDEX takes 2 to 3 arguments, not 0; not computed headless";

describe("a call with a wrong argument count in a branch not taken", () => {
  // behaviour: Excel does not accept such a formula, so the whole cell is refused wherever the call
  // sits (tests/engine/formula/functions/kit.test.ts has CHOOSE, which evaluates every choice;
  // these sit under IF, which evaluates only the branch taken, below each kind of operator).
  const FORMULAS: Record<string, [string, string]> = {
    H1: ["IF(FALSE,CODE(),1)", CODE0],
    H2: ["IF(FALSE,-CODE(),1)", CODE0],
    H3: ["IF(FALSE,+CODE(),1)", CODE0],
    H4: ["IF(FALSE,@CODE(),1)", CODE0],
    H5: ["IF(FALSE,CODE()%,1)", CODE0],
    H6: ["IF(FALSE,INDEX()#,1)", INDEX0],
    H7: ["IF(FALSE,1+CODE(),1)", CODE0],
    H8: ["IF(FALSE,A1:INDEX(),1)", INDEX0],
    H9: ["IF(FALSE,A1:B2 INDEX(),1)", INDEX0],
    H10: ["IF(FALSE,SUM((A1,INDEX())),1)", INDEX0],
    H11: ["IF(FALSE,1,CODE())", CODE0],
  };
  it("is refused in a workbook, under every kind of operator", async () => {
    const v = await compute({ A1: 1 }, Object.fromEntries(Object.entries(FORMULAS).map(([c, [f]]) => [c, f])));
    for (const [cell, [, why]] of Object.entries(FORMULAS)) expect(v(cell)).toBe(refused(why, cell));
  });
  it("and through soilcell eval the same way (it gave 1 there)", () => {
    expect(evaluateFormula("=IF(FALSE,CODE(),1)")).toEqual({ error: "#VALUE!", message: CODE0 });
    expect(evaluateFormula("=IF(TRUE,1,-CODE())")).toEqual({ error: "#VALUE!", message: CODE0 });
  });
});

describe("native functions lifted over an array", () => {
  it("lift only their value parameters: MATCH's lookup array is read whole (behaviour, as Excel's MATCH page: lookup_array is a range or array)", () => {
    expect(evaluateFormula("=MATCH({2,3},{1,2,3},0)")).toEqual({ value: [[2, 3]] });
  });
  it("keep an argument left out as left out in each call: LEFT takes 1 character by default (MS LEFT page)", () => {
    expect(evaluateFormula('=LEFT({"abc","de"})')).toEqual({ value: [["a", "d"]] });
  });
});

describe("defined names and the intersection operator", () => {
  it("a name that cannot be read refuses its readers with the name and the reason (behaviour)", async () => {
    const v = await compute({}, { H1: "bad" }, { names: [{ name: "bad", text: "1+" }] });
    expect(v("H1")).toBe(refused('the defined name "bad" cannot be read headless (the formula ends too early)', "H1"));
  });
  it("the intersection operator needs references on both sides (MS 'Calculation operators': a space is the intersection of two references)", async () => {
    const v = await compute({ A1: 1, B2: 5 }, { H1: "A1:B3 five", H2: "A1:B3 B2:C2" }, { names: [{ name: "five", text: "5" }] });
    expect(v.full("H1")).toBe("#VALUE! the intersection operator needs references on both sides");
    expect(v("H2")).toBe(5); // B2, the only cell the two ranges share
  });
  it("a chain of names is followed 65 deep and refused beyond (behaviour: the bound that stops a name that refers to itself)", async () => {
    // Names such as n1 would be cells: x_1 is not.
    const chain = (n: number) => Array.from({ length: n }, (_, i) => ({ name: `x_${i}`, text: i === n - 1 ? "7" : `x_${i + 1}` }));
    const ok = await compute({}, { H1: "x_0" }, { names: chain(65) });
    expect(ok("H1")).toBe(7);
    const deep = await compute({}, { H1: "x_0" }, { names: chain(66) });
    expect(deep.full("H1")).toBe('#NAME? the defined name "x_65" refers to itself');
  });
});

describe("SOIL functions called from a formula", () => {
  // 39.1 mg/kg of K is 0.1 cmol(+)/kg (K 39.098, IUPAC 2021 standard atomic weight; one charge).
  it("get a range whole, also in a legacy cell, where a native function would intersect it (behaviour: Excel passes a custom function's range argument whole)", async () => {
    const v = await compute({ A1: 39.1, A2: 78.2, A3: 117.3 }, { H2: 'SUM(SOIL.CMOL(A1:A3,"K"))' });
    expect(v("H2") as number).toBeCloseTo(0.6, 3);
  });
  it("refuse a union of ranges (behaviour: a custom function takes one range per argument)", async () => {
    const v = await compute({ A1: 39.1, A2: 78.2 }, { H1: 'SOIL.CMOL((A1,A2),"K")' });
    expect(v.full("H1")).toBe("#VALUE! a SOIL function does not take a union of ranges");
  });
});
