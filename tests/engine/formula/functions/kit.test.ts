/**
 * The helpers every native function is declared with (src/engine/formula/functions/kit.ts): the
 * defaults of omitted arguments, whole-number truncation, and the values an aggregate sees in
 * arrays, ranges and unions of ranges, checked through formulas computed in process on a hand-made
 * sheet (contents invented). Each case names its source:
 * - "LO": LibreOffice 7.4.7 headless computes the same value for the same cells and formula
 *   (oracle profile of scripts/oracle/lo.js), and Microsoft's function pages describe nothing different;
 * - "MS: …": Microsoft's Excel function documentation, where LibreOffice differs.
 * Error cases check the code against the source and the message against soilcell's own wording.
 */
import { evaluateFormula } from "../../../../src/engine/evaluate";
import { describeSheetCases } from "../../../helpers/sheet-eval";

const DATA: Record<string, number | string | boolean> = {"A1": 1, "A2": 2, "A3": "x", "B1": 10, "B2": "5", "C1": 3};
const DATA_FORMULAS: Record<string, string> = {"E1": "1/0", "E2": "NA()"};
const NAMES: { name: string; text: string }[] = [];

/** [formula (in H1, H2, … in this order), expected value or "#CODE message", source]. */
const CASES: [string, number | string | boolean, string][] = [
  ["ROUND(2.5,)", 3, "LO"],
  ["ROUND(,)", 0, "LO"],
  ["SUBSTITUTE(\"abc\",\"b\",)", "ac", "LO"],
  ["CONCATENATE(\"a\",,\"b\")", "ab", "LO"],
  ["MID(\"abc\",2,)", "", "LO"],
  ["SUM({1,#N/A})", "#N/A", "LO"],
  ["AVERAGE({1,#N/A})", "#N/A", "LO"],
  ["SUM((A1:A2,B1:B2))", 13, "LO"],
  ["SUM((A1:A3,E1:E2))", "#DIV/0! division by zero", "LO"],
  ["SUM((E1:E2,A1:A2))", "#DIV/0! division by zero", "LO"],
  ["MAX((E1:E2,A1:A2))", "#DIV/0! division by zero", "LO"],
  ["SUM(1,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["SUM(\"1e1\",\"-2\")", 8, "MS:COUNT page (same remark on the SUM page, from memory): numeric text and logical values typed as arguments count (LO, with Excel's text conversion setting, refuses typed text)"],
  ["MIN(\"x\",1)", "#VALUE! text \"x\" is not a number", "LO"],
  ["OFFSET(B2,-1.5,0)", 10, "LO"],
  ["OFFSET(A1,1.5,0)", 2, "LO"],
  ["INDEX(A1:A3,-0.5)", "#VALUE! the range does not share a row with the formula's cell (implicit intersection)", "LO"],
  ["CHAR(65.9)", "A", "LO"],
  ["COUNTA((A1:A3,B1:B2))", 5, "LO"],
  ["AND((A1:A2,C1))", true, "LO"],
  ["SUM(A1:A3,\"3\",TRUE)", 7, "MS:COUNT page (same remark on the SUM page, from memory): numeric text and logical values typed as arguments count (LO, with Excel's text conversion setting, refuses typed text)"],
  ["PRODUCT((A1:A2,B1))", 20, "LO"],
  ["EXACT(,\"\")", true, "LO"],
  ["EXACT(,0)", false, "LO"],
  ["LEN(,)", "not computed: it reads H25, which is not computed headless (LEN takes 1 arguments, not 2; not computed headless)", "behaviour: Excel does not accept a formula with a wrong argument count, so it is refused (LO: #VALUE!, which ISERR or COUNT would swallow)"],
  ["CHOOSE(1,FALSE,CODE())", "not computed: it reads H26, which is not computed headless (CODE takes 1 arguments, not 0; not computed headless)", "behaviour: Excel does not accept a formula with a wrong argument count, so the cell is refused even where the call is in a branch not taken (it gave FALSE; LO: #VALUE!; found by scripts/oracle/differential.js)"],
  ["IFERROR(ABS(),5)", "not computed: it reads H27, which is not computed headless (ABS takes 1 arguments, not 0; not computed headless)", "behaviour: as above (LO: #VALUE!)"],
];

describeSheetCases("kit functions on a sheet", CASES, DATA, DATA_FORMULAS, { names: NAMES });

describe("kit: array arguments and typed values", () => {
  it("an array argument left empty is #VALUE! saying so (LO: #VALUE! too; the message is soilcell's)", () => {
    expect(evaluateFormula("=SUMPRODUCT({1,2},)")).toEqual({ error: "#VALUE!", message: "an array argument is missing" });
    expect(evaluateFormula("=TRANSPOSE(1/0)")).toEqual({ error: "#DIV/0!", message: "division by zero" });
  });
  it("an error inside an array argument stops the aggregate at the first one (MS array constants may hold error values; the first error is the result, from memory; LO 7.4 reads every error in an array constant as #N/A)", () => {
    expect(evaluateFormula("=SUM({1,#N/A,#DIV/0!})").error).toBe("#N/A");
    expect(evaluateFormula("=SUM({1,#DIV/0!,#N/A})").error).toBe("#DIV/0!");
    expect(evaluateFormula("=AND({TRUE,#NUM!})").error).toBe("#NUM!");
    expect(evaluateFormula('=CONCAT({"a",#REF!})').error).toBe("#REF!");
  });
  it("text typed directly that is no number is #VALUE! in an aggregate; in an array it is skipped (MS COUNT page: in an array only numbers count; LO the same, except that it counts TRUE as 1 in AVERAGE's array)", () => {
    expect(evaluateFormula('=SUM(1,"x")')).toEqual({ error: "#VALUE!", message: 'text "x" is not a number' });
    expect(evaluateFormula('=SUM({1,"x"})')).toEqual({ value: 1 });
    expect(evaluateFormula('=AVERAGE({1,"x",TRUE},3)')).toEqual({ value: 2 });
    expect(evaluateFormula('=MAX({1,"9",TRUE})')).toEqual({ value: 1 });
  });
});
