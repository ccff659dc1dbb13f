/**
 * The engine's arithmetic and aggregate functions (src/engine/formula/functions/math.ts), computed
 * in process on a hand-made sheet (contents invented). Each case names its source:
 * - "LO": LibreOffice 7.4.7 headless computes the same value for the same cells and formula
 *   (oracle profile of scripts/oracle/lo.js), and Microsoft's function pages describe nothing different;
 * - "MS: …": Microsoft's Excel function documentation, where LibreOffice differs. LibreOffice
 *   holds TRUE in a cell as the number 1 (so its SUM, AVERAGE, COUNT of a range count it), and
 *   writes its own "invalid argument" error as #VALUE! where Excel gives #NUM!;
 * - "XL: … (from memory)": Excel 365's behaviour as recalled, where LibreOffice differs.
 * Error cases check the code against the source and the message against soilcell's own wording
 * (behaviour: the message says why).
 */
import { evaluateFormula } from "../../../../src/engine/evaluate";
import { compute, describeSheetCases } from "../../../helpers/sheet-eval";

const DATA: Record<string, number | string | boolean> = {"A1": 1, "A2": 2, "A3": 3, "A4": 4, "A5": "5", "A6": true, "B1": 2, "B2": "x", "B3": 4, "B4": 5, "C1": -2.5, "C2": 1.5, "C3": 0, "C4": 10, "D1": 3, "D2": 1, "D3": 2, "E1": 2.5, "E2": "", "F1": 1, "F2": 2, "G1": 3, "G2": 4};
const DATA_FORMULAS: Record<string, string> = {"E3": "\"\""};
const NAMES: { name: string; text: string }[] = [];

/** [formula (in H1, H2, … in this order), expected value or "#CODE message", source]. */
const CASES: [string, number | string | boolean, string][] = [
  ["SUM(A1:A6)", 10, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["SUM(1,\"2\",TRUE)", 4, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["SUM(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["SUM(A1:A4,10)", 20, "LO"],
  ["SUM(B1:B4)", 11, "LO"],
  ["SUM(A7)", 0, "LO"],
  ["SUM(1,,2)", 3, "LO"],
  ["SUM(NA())", "#N/A", "LO"],
  ["SUM(A1,A5,A6)", 1, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["SUM(1E308,1E308)", "#NUM! the result is not a finite number", "LO"],
  ["SUM({1,2,3})", 6, "LO"],
  ["SUM({1,\"2\",TRUE})", 1, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["SUM((A1:A2,A3:A4))", 10, "LO"],
  ["PRODUCT(A1:A4)", 24, "LO"],
  ["PRODUCT(2,\"3\")", 6, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["PRODUCT(A7)", 0, "LO"],
  ["PRODUCT(B2)", 0, "LO"],
  ["PRODUCT(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["PRODUCT(1E200,1E200)", "#NUM! the result is not a finite number", "LO"],
  ["PRODUCT(0,5)", 0, "LO"],
  ["PRODUCT(-2,3)", -6, "LO"],
  ["SUMSQ(A1:A4)", 30, "LO"],
  ["SUMSQ(3,\"4\")", 25, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["SUMSQ(A7)", 0, "LO"],
  ["SUMSQ(-2,TRUE)", 5, "LO"],
  ["SUMSQ(1E200,1E200)", "#NUM! the result is not a finite number", "LO"],
  ["SUMPRODUCT(A1:A4,F1:F4)", 5, "LO"],
  ["SUMPRODUCT(F1:F2,G1:G2)", 11, "LO"],
  ["SUMPRODUCT(A1:A2,B1:B2)", 2, "LO"],
  ["SUMPRODUCT(A1:A3,B1:B2)", "#VALUE! SUMPRODUCT's arrays differ in size", "LO"],
  ["SUMPRODUCT({1,2},{3,4})", 11, "LO"],
  ["SUMPRODUCT(A1:A4)", 10, "LO"],
  ["SUMPRODUCT(A5:A6,F1:F2)", 0, "MS:SUMPRODUCT treats non-numeric array entries as if they were zeros (LO counts TRUE as 1)"],
  ["SUMPRODUCT({1,2}*{3,4})", 11, "LO"],
  ["SUMPRODUCT(NA())", "#N/A", "LO"],
  ["SUMPRODUCT(1E308*{1,1})", "#NUM! the result is not a finite number", "LO"],
  ["ROUND(2.5,0)", 3, "LO"],
  ["ROUND(-2.5,0)", -3, "LO"],
  ["ROUND(2.15,1)", 2.2, "LO"],
  ["ROUND(2.149,1)", 2.1, "LO"],
  ["ROUND(-1.475,2)", -1.48, "LO"],
  ["ROUND(1234.567,-2)", 1200, "LO"],
  ["ROUND(1250,-2)", 1300, "LO"],
  ["ROUND(-1250,-2)", -1300, "LO"],
  ["ROUND(0.1+0.2,15)", 0.3, "LO"],
  ["ROUND(1.005,2)", 1.01, "LO"],
  ["ROUND(21.5,-1)", 20, "LO"],
  ["ROUND(5,20)", 5, "LO"],
  ["ROUND(2.5,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["ROUND(\"x\",1)", "#VALUE! text \"x\" is not a number", "LO"],
  ["ROUND(2.567,1.9)", 2.6, "LO"],
  ["ROUND(-0.4,0)", 0, "LO"],
  ["ROUND(1E300,2)", 1e+300, "LO"],
  ["ROUNDUP(3.2,0)", 4, "LO"],
  ["ROUNDUP(-3.2,0)", -4, "LO"],
  ["ROUNDUP(3.14159,3)", 3.142, "LO"],
  ["ROUNDUP(31415.92654,-2)", 31500, "LO"],
  ["ROUNDUP(0.1+0.2,1)", 0.3, "LO"],
  ["ROUNDUP(\"x\",1)", "#VALUE! text \"x\" is not a number", "LO"],
  ["ROUNDUP(1,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["ROUNDDOWN(3.7,0)", 3, "LO"],
  ["ROUNDDOWN(-3.7,0)", -3, "LO"],
  ["ROUNDDOWN(3.14159,3)", 3.141, "LO"],
  ["ROUNDDOWN(31415.92654,-2)", 31400, "LO"],
  ["ROUNDDOWN(\"x\",1)", "#VALUE! text \"x\" is not a number", "LO"],
  ["ROUNDDOWN(1,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["TRUNC(8.9)", 8, "LO"],
  ["TRUNC(-8.9)", -8, "LO"],
  ["TRUNC(0.45,1)", 0.4, "LO"],
  ["TRUNC(123.456,-1)", 120, "LO"],
  ["TRUNC(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["TRUNC(1,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["TRUNC(-0.5)", 0, "LO"],
  ["INT(8.9)", 8, "LO"],
  ["INT(-8.9)", -9, "LO"],
  ["INT(-0.5)", -1, "LO"],
  ["INT(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["INT(\"3.5\")", 3, "LO"],
  ["INT(TRUE)", 1, "LO"],
  ["ABS(-4)", 4, "LO"],
  ["ABS(4)", 4, "LO"],
  ["ABS(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["SIGN(-3)", -1, "LO"],
  ["SIGN(0)", 0, "LO"],
  ["SIGN(2.5)", 1, "LO"],
  ["SIGN(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["SIGN(A7)", 0, "LO"],
  ["SQRT(16)", 4, "LO"],
  ["SQRT(-1)", "#NUM! the square root of a negative number", "MS:SQRT: a negative number is #NUM! (LO writes its own error 502 as #VALUE!)"],
  ["SQRT(0)", 0, "LO"],
  ["SQRT(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["EXP(1)", 2.718281828459045, "LO"],
  ["EXP(0)", 1, "LO"],
  ["EXP(1000)", "#NUM! the result is not a finite number", "LO"],
  ["EXP(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["LN(EXP(2))", 2, "LO"],
  ["LN(0)", "#NUM! the logarithm of a number not above 0", "XL:#NUM! (from memory; LO writes its error 502 as #VALUE!)"],
  ["LN(-1)", "#NUM! the logarithm of a number not above 0", "XL:#NUM! (from memory; LO writes its error 502 as #VALUE!)"],
  ["LN(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["LN(1)", 0, "LO"],
  ["LOG10(1000)", 3, "LO"],
  ["LOG10(0)", "#NUM! the logarithm of a number not above 0", "XL:#NUM! (from memory; LO writes its error 502 as #VALUE!)"],
  ["LOG10(-5)", "#NUM! the logarithm of a number not above 0", "XL:#NUM! (from memory; LO writes its error 502 as #VALUE!)"],
  ["LOG10(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["LOG(100)", 2, "LO"],
  ["LOG(8,2)", 3, "LO"],
  ["LOG(0)", "#NUM! the logarithm of a number not above 0", "XL:#NUM! (from memory; LO writes its error 502 as #VALUE!)"],
  ["LOG(8,0)", "#NUM! the logarithm of a number not above 0", "XL:#NUM! (from memory; LO writes its error 502 as #VALUE!)"],
  ["LOG(8,-2)", "#NUM! the logarithm of a number not above 0", "XL:#NUM! (from memory; LO writes its error 502 as #VALUE!)"],
  ["LOG(8,1)", "#DIV/0! a logarithm to base 1", "XL:ln 8 / ln 1 divides by zero: #DIV/0! (from memory; LO: #VALUE!)"],
  ["LOG(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["LOG(8,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["LOG(1,1)", "#DIV/0! a logarithm to base 1", "XL:ln 1 / ln 1 divides by zero: #DIV/0! (from memory; LO: #VALUE!)"],
  ["POWER(2,10)", 1024, "LO"],
  ["POWER(0,0)", "#NUM! 0^0 is not defined", "XL:0^0 is #NUM! (from memory; LO: 1)"],
  ["POWER(0,-1)", "#DIV/0! 0 raised to a negative power", "XL:#DIV/0! (from memory; LO: #NUM!)"],
  ["POWER(-8,1/3)", -2, "LO; Excel too: practitioners' report (Stack Overflow question 6911356, 2011, 'How to take the cube root of a negative number in VBA for Excel': =(-2)^(1/3) gives -1.25992 on a worksheet, and POWER(-2,1/3) works); the engine gave #NUM! here while its ^ operator took the root"],
  ["POWER(-2,1/3)", -1.2599210498948732, "LO; the same report's worksheet value -1.25992"],
  ["POWER(-8,0.5)", "#NUM! a negative number raised to a fractional power", "LO"],
  ["POWER(-8,1/4)", "#NUM! a negative number raised to a fractional power", "LO"],
  ["POWER(4,0.5)", 2, "LO"],
  ["POWER(10,400)", "#NUM! the result is not a finite number", "LO"],
  ["POWER(\"x\",2)", "#VALUE! text \"x\" is not a number", "LO"],
  ["POWER(2,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["POWER(0,2)", 0, "LO"],
  ["POWER(-2,3)", -8, "LO"],
  ["MOD(3,2)", 1, "LO"],
  ["MOD(-3,2)", 1, "LO"],
  ["MOD(3,-2)", -1, "LO"],
  ["MOD(-3,-2)", -1, "LO"],
  ["MOD(3,0)", "#DIV/0! MOD by zero", "LO"],
  ["MOD(5.5,2)", 1.5, "LO"],
  ["MOD(\"x\",2)", "#VALUE! text \"x\" is not a number", "LO"],
  ["MOD(2,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["MOD(0,3)", 0, "LO"],
  ["PI()", 3.141592653589793, "LO"],
  ["EVEN(1.5)", 2, "LO"],
  ["EVEN(3)", 4, "LO"],
  ["EVEN(2)", 2, "LO"],
  ["EVEN(-1)", -2, "LO"],
  ["EVEN(0)", 0, "LO"],
  ["EVEN(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["EVEN(-2.5)", -4, "LO"],
  ["ODD(1.5)", 3, "LO"],
  ["ODD(3)", 3, "LO"],
  ["ODD(2)", 3, "LO"],
  ["ODD(-1)", -1, "LO"],
  ["ODD(-2)", -3, "LO"],
  ["ODD(0)", 1, "LO"],
  ["ODD(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["ODD(-0.5)", -1, "LO"],
  ["AVERAGE(A1:A6)", 2.5, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["AVERAGE(1,\"2\",TRUE)", 1.3333333333333333, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["AVERAGE(A7)", "#DIV/0! AVERAGE of no numbers", "LO"],
  ["AVERAGE(B2)", "#DIV/0! AVERAGE of no numbers", "LO"],
  ["AVERAGE(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["AVERAGE(C1:C4)", 2.25, "LO"],
  ["AVERAGE(0.1,0.2)", 0.15000000000000002, "LO"],
  ["AVERAGE(NA(),1)", "#N/A", "LO"],
  ["AVERAGE(1E308,1E308)", "#NUM! the result is not a finite number", "LO"],
  ["MIN(A1:A6)", 1, "LO"],
  ["MIN(5,\"2\",TRUE)", 1, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["MIN(A7)", 0, "LO"],
  ["MIN(C1:C4)", -2.5, "LO"],
  ["MIN(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["MIN(3,2,1)", 1, "LO"],
  ["MIN(1,2,3)", 1, "LO"],
  ["MAX(A1:A6)", 4, "LO"],
  ["MAX(5,\"9\",TRUE)", 9, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["MAX(A7)", 0, "LO"],
  ["MAX(C1:C4)", 10, "LO"],
  ["MAX(-1,-2)", -1, "LO"],
  ["MAX(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["MAX(1,3,2)", 3, "LO"],
  ["MEDIAN(A1:A6)", 2.5, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["MEDIAN(1,2,3,4)", 2.5, "LO"],
  ["MEDIAN(3,1,2)", 2, "LO"],
  ["MEDIAN(A7)", "#NUM! MEDIAN of no numbers", "XL:MEDIAN of no numbers is #NUM! (from memory; LO: #VALUE!)"],
  ["MEDIAN(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["MEDIAN(10,2,30,4)", 7, "LO"],
  ["VAR(A1:A4)", 1.6666666666666667, "LO"],
  ["_xlfn.VAR.S(1,2,3,4)", 1.6666666666666667, "LO"],
  ["VARP(A1:A4)", 1.25, "LO"],
  ["_xlfn.VAR.P(1,2,3,4)", 1.25, "LO"],
  ["STDEV(A1:A4)", 1.2909944487358056, "LO"],
  ["_xlfn.STDEV.S(1,2,3,4)", 1.2909944487358056, "LO"],
  ["STDEVP(A1:A4)", 1.118033988749895, "LO"],
  ["_xlfn.STDEV.P(1,2,3,4)", 1.118033988749895, "LO"],
  ["VAR(1)", "#DIV/0! needs at least 2 numbers", "LO"],
  ["VARP(1)", 0, "LO"],
  ["VARP(A7)", "#DIV/0! needs at least 1 numbers", "LO"],
  ["STDEV(1)", "#DIV/0! needs at least 2 numbers", "LO"],
  ["STDEV(\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["VAR(2,\"4\",TRUE)", 2.333333333333333, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["_xlfn.STDEV.P(5)", 0, "LO"],
  ["VARP(1,1E+298)", "#NUM! the result is not a finite number", "LO 7.4 headless (#NUM!; the engine wrote Infinity, found by scripts/oracle/differential.js)"],
  ["STDEV(-1E+300,1E+300)", "#NUM! the result is not a finite number", "LO 7.4 headless"],
  ["LARGE(A1:A4,1)", 4, "LO"],
  ["LARGE(A1:A4,2)", 3, "LO"],
  ["LARGE(A1:A4,4)", 1, "LO"],
  ["LARGE(A1:A4,0)", "#NUM! k = 0 is outside 1 to 4", "MS:LARGE: k <= 0 or more than the data points is #NUM! (LO writes #VALUE!)"],
  ["LARGE(A1:A4,5)", "#NUM! k = 5 is outside 1 to 4", "MS:LARGE: k <= 0 or more than the data points is #NUM! (LO writes #VALUE!)"],
  ["LARGE(A1:A4,\"x\")", "#VALUE! text \"x\" is not a number", "LO"],
  ["SMALL(A1:A4,1)", 1, "LO"],
  ["SMALL(A1:A4,3)", 3, "LO"],
  ["SMALL(C1:C4,2)", 0, "LO"],
  ["SMALL(A1:A4,-1)", "#NUM! k = -1 is outside 1 to 4", "MS:SMALL: k <= 0 or more than the data points is #NUM! (LO writes #VALUE!)"],
  ["LARGE({3,1,2},2)", 2, "LO"],
  ["SMALL(A7,1)", "#NUM! k = 1 is outside 1 to 0", "MS:SMALL: an empty array is #NUM! (LO writes #VALUE!)"],
  ["LARGE(NA(),1)", "#N/A", "LO"],
  ["COUNT(A1:A6)", 4, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["COUNT(1,\"2\",TRUE,\"x\")", 3, "LO"],
  ["COUNT(B1:B4)", 3, "LO"],
  ["COUNT(A7)", 0, "LO"],
  ["COUNT(NA(),1)", 1, "LO"],
  ["COUNT(1,,2)", 3, "LO"],
  ["COUNT({1,\"2\",TRUE})", 1, "MS:COUNT page (same remark on the SUM, AVERAGE, MIN, MAX, VAR pages, from memory): logical values and numeric text typed as arguments count, in a reference or array only numbers do (LO counts TRUE in cells as 1 / refuses typed text)"],
  ["COUNT(E1:E2)", 1, "LO"],
  ["COUNTA(A1:A6)", 6, "LO"],
  ["COUNTA(A1:A8)", 6, "LO"],
  ["COUNTA(1,\"x\",TRUE)", 3, "LO"],
  ["COUNTA(E1:E3)", 3, "MS:COUNTA counts cells holding empty text \"\" (LO drops the constant empty text of E2)"],
  ["COUNTA(1,,2)", 3, "LO"],
  ["COUNTA(NA())", 1, "LO"],
  ["COUNTA({1,\"\"})", 2, "LO"],
  ["COUNTBLANK(A1:A8)", 2, "LO"],
  ["COUNTBLANK(E1:E3)", 2, "LO"],
  ["COUNTBLANK(A1:B4)", 0, "LO"],
  ["COUNTBLANK(Z1:Z5)", 5, "MS:COUNTBLANK counts the empty cells of the range (LO: 0 beyond the used area)"],
  ["ROWS(A1:B4)", 4, "LO"],
  ["COLUMNS(A1:B4)", 2, "LO"],
  ["ROWS({1,2;3,4;5,6})", 3, "LO"],
  ["COLUMNS({1,2,3})", 3, "LO"],
  ["ROWS(NA())", "#N/A", "LO"],
  ["COLUMNS(NA())", "#N/A", "LO"],
  ["ROWS({5})", 1, "LO"],
  ["COLUMNS(A2)", 1, "LO"],
  ["SUMPRODUCT(A1:A2,{1;#N/A})", "#N/A", "LO"],
  ["COUNT(,)", 2, "LO"],
  ["COUNTA(,)", 2, "LO"],
  ["SUM(A1:A2,,)", 3, "LO"],
  ["AVERAGE(1,,3)", 1.3333333333333333, "LO"],
  ["MIN(1,,3)", 0, "LO"],
];

describeSheetCases("math functions on a sheet", CASES, DATA, DATA_FORMULAS, { names: NAMES });

describe("math functions over arrays and at their limits", () => {
  it("rounding functions lift over an array (LibreOffice 7.4 computes every case of this block the same, as an array formula, except COUNTBLANK of an array, which it reads as 0)", () => {
    expect(evaluateFormula("=ROUND({1.25,-1.25},1)")).toEqual({ value: [[1.3, -1.3]] });
    expect(evaluateFormula("=ROUNDUP({1.21;-1.21},1)")).toEqual({ value: [[1.3], [-1.3]] });
    expect(evaluateFormula("=ROUNDDOWN({1.29,-1.29},1)")).toEqual({ value: [[1.2, -1.2]] });
  });
  it("ROUND works on the 15-digit value Excel shows (MS: Excel keeps 15 significant digits; 1.005 is stored as 1.00499999999999989…, shown 1.005, rounded 1.01 as LO also gives)", () => {
    expect(evaluateFormula("=ROUND(1.005,2)")).toEqual({ value: 1.01 });
    expect(evaluateFormula("=ROUNDDOWN(0.1+0.2,15)")).toEqual({ value: 0.3 });
    expect(evaluateFormula("=ROUNDUP(-0.0000001,0)")).toEqual({ value: -1 });
    expect(evaluateFormula("=ROUND(-0.4,0)")).toEqual({ value: 0 }); // no -0
  });
  it("an overflow is #NUM!, not Infinity (MS: Excel's largest number is about 1.8E308)", () => {
    expect(evaluateFormula("=SUM(1E308,1E308)").error).toBe("#NUM!");
    expect(evaluateFormula("=EXP(1000)").error).toBe("#NUM!");
    expect(evaluateFormula("=POWER(10,400)").error).toBe("#NUM!");
    expect(evaluateFormula("=PRODUCT(1E200,1E200)").error).toBe("#NUM!");
  });
  it("COUNTBLANK needs a range (Excel refuses an array there; behaviour: #VALUE! saying so)", () => {
    expect(evaluateFormula("=COUNTBLANK({1,2})")).toEqual({ error: "#VALUE!", message: "COUNTBLANK needs a range" });
  });
  it("SUMPRODUCT of arrays of different sizes is #VALUE! (MS SUMPRODUCT: the array arguments must have the same dimensions)", () => {
    expect(evaluateFormula("=SUMPRODUCT({1,2},{1,2,3})")).toEqual({ error: "#VALUE!", message: "SUMPRODUCT's arrays differ in size" });
    expect(evaluateFormula("=SUMPRODUCT({1,2},{3;4})")).toEqual({ error: "#VALUE!", message: "SUMPRODUCT's arrays differ in size" });
  });
  it("aggregates over a union of ranges see every cell of every area (LO the same)", async () => {
    const v = await compute({ A1: 1, A2: 2, C1: 10, C2: "x" }, { H1: "SUM((A1:A2,C1:C2))", H2: "COUNT((A1:A2,C1:C2))", H3: "COUNTA((A1:A2,C1:C3))", H4: "MAX((A1:A2,C1:C2))" });
    expect([v("H1"), v("H2"), v("H3"), v("H4")]).toEqual([13, 3, 4, 10]);
  });
});

describe("math functions: errors passed through, and no negative zero", () => {
  it("an error argument is the result (LibreOffice 7.4 computes the same)", () => {
    expect(evaluateFormula("=SUMSQ(NA())").error).toBe("#N/A");
    expect(evaluateFormula("=PRODUCT(NA())").error).toBe("#N/A");
    expect(evaluateFormula("=MEDIAN(NA())").error).toBe("#N/A");
    expect(evaluateFormula("=LARGE(NA(),1)").error).toBe("#N/A");
    expect(evaluateFormula('=SUMSQ(1,"x")')).toEqual({ error: "#VALUE!", message: 'text "x" is not a number' });
  });
  it("INT(-0) is 0, not -0 (LO: 0; a cell cannot hold a negative zero)", () => {
    expect(evaluateFormula("=INT(-0)")).toEqual({ value: 0 });
    expect(evaluateFormula("=SIGN(-0)")).toEqual({ value: 0 });
  });
});

describe("LARGE and SMALL with a k that is not a whole number", () => {
  it("are refused (LO 7.4 headless: LARGE(A1:A6,0.5) is #VALUE!, the engine rounded k up and gave the largest; Microsoft's LARGE page does not say how k is read; found by scripts/oracle/differential.js)", () => {
    expect(evaluateFormula("=LARGE({3,1,2},1.5)")).toEqual({ error: "#VALUE!", message: "LARGE with k = 1.5, not a whole number, is not computed headless (LibreOffice truncates it; Excel's reading is not documented)" });
    expect(evaluateFormula("=SMALL({3,1,2},0.5)")).toEqual({ error: "#VALUE!", message: "SMALL with k = 0.5, not a whole number, is not computed headless (LibreOffice truncates it; Excel's reading is not documented)" });
    expect(evaluateFormula("=LARGE({3,1,2},2)")).toEqual({ value: 2 }); // LO
  });
});

describe("INT and MOD just below a whole number (found by a consultant-style workbook and scripts/oracle/differential.js)", () => {
  it("INT floors the number to 15 significant digits, as Excel does (joeu2004, 2010, 'INT defect: Please try this on 2007 for me', and 2008, 'Why does Excel INT(x) behave like ROUND(x,0) for 10^14 and higher?', microsoft.public.excel, measurements of Excel 2003; 6StringJazzer, 2010, 'INT function returns unexpected results', excelforum.com; LibreOffice 7.4 headless gives the same)", () => {
    expect(evaluateFormula("=INT(8.2-0.2)")).toEqual({ value: 8 }); // 7.999999999999999 in binary; LO 8
    expect(evaluateFormula("=INT(123456789-0.0000004)")).toEqual({ value: 123456789 }); // joeu2004: Excel 123456789
    expect(evaluateFormula("=INT(123456789-0.0000005)")).toEqual({ value: 123456788 }); // joeu2004: Excel 123456788
    expect(evaluateFormula("=INT((8.2-INT(8.2))*10)")).toEqual({ value: 1 }); // excelforum: Excel 1 (1.99999999999999289)
    expect(evaluateFormula("=INT(10^14+0.5)")).toEqual({ value: 100000000000001 }); // joeu2004: Excel 100000000000001
    expect(evaluateFormula("=INT(-(8.2-0.2))")).toEqual({ value: -8 }); // LO
    expect(evaluateFormula("=INT(-9.000000000000002)")).toEqual({ value: -9 }); // 15 digits: -9
    expect(evaluateFormula("=INT(-9.00000000000002)")).toEqual({ value: -10 }); // 15 digits: -9.00000000000002
    expect(evaluateFormula("=INT(0.1*3*10)")).toEqual({ value: 3 }); // LO: 3.0000000000000004
    expect(evaluateFormula("=INT(2.5)")).toEqual({ value: 2 });
    expect(evaluateFormula("=INT(-2.5)")).toEqual({ value: -3 }); // Microsoft Support, INT: INT(-8.9) is -9
    expect(evaluateFormula("=INT(1E+300)")).toEqual({ value: 1e300 }); // LO
  });
  it("MOD whose quotient is just below a whole number is refused the same way: MOD(0.3,0.1), quotient 2.9999999999999996 (LO 7.4 headless: 0; the engine gave 0.09999999999999998)", () => {
    expect(evaluateFormula("=MOD(0.3,0.1)")).toEqual({ error: "#VALUE!", message: "MOD of 2.9999999999999996, which is 3 to 15 digits: whether Excel floors the binary or the 15-digit value is not known headless; round first, e.g. MOD(ROUND(x,9),d)" });
    expect(evaluateFormula("=MOD(1E+20,7)")).toEqual({ value: 0 }); // a quotient beyond 15 digits is whole: not refused
  });
  it("MOD's remainder uses the worksheet's subtraction, so rounding noise is 0, not a remainder of the wrong sign (LO 7.4 headless: MOD(7.7,1.1) 0, MOD(-0.3,0.1) 0; the engine gave -8.9E-16 and 5.6E-17; MS MOD page: MOD(n,d) = n - d*INT(n/d), from memory)", () => {
    expect(evaluateFormula("=MOD(7.7,1.1)")).toEqual({ value: 0 });
    expect(evaluateFormula("=MOD(-0.3,0.1)")).toEqual({ value: 0 });
    expect(evaluateFormula("=MOD(5.5,2)")).toEqual({ value: 1.5 }); // LO
  });
});

describe("ROWS and COLUMNS of a single value (found by scripts/oracle/differential.js)", () => {
  it("are refused: LO 7.4 headless gives #VALUE! for ROWS(5), COLUMNS(5) and ROWS(\"a\"), the engine gave 1; Microsoft's page names a reference or an array, and Excel's answer for a value is not established", () => {
    for (const f of ["ROWS(5)", "COLUMNS(5)", 'ROWS("a")', "ROWS(TRUE)", "ROWS(IF(TRUE,5))"]) {
      expect(evaluateFormula(`=${f}`)).toEqual({ error: "#VALUE!", message: expect.stringMatching(/^(ROWS|COLUMNS) of a single value \(not a range or array\) is not computed headless/) });
    }
  });
});

describe("POWER and ^ below the smallest normal number (found by scripts/oracle/differential.js)", () => {
  it("are refused, not written as 0 (LO 7.4 headless: POWER(10,-400), 10^-400 and POWER(2,-1075) are #NUM!; the engine wrote 0; Excel's answer is not established)", () => {
    const refused = (f: string) => expect(evaluateFormula(`=${f}`)).toEqual({ error: "#VALUE!", message: expect.stringContaining("smaller than the smallest number a worksheet holds") });
    refused("POWER(10,-400)");
    refused("10^-400");
    refused("POWER(2,-1075)");
    refused("POWER(2,-1023)"); // subnormal: 1.1E-308, below 2.2250738585072014E-308
    refused("(-2)^-1023");
  });
  it("at the edge: 2^-1022, the smallest normal number, is kept (behaviour: the bound is the smallest normal double)", () => {
    expect(evaluateFormula("=POWER(2,-1022)")).toEqual({ value: 2.2250738585072014e-308 });
    expect(evaluateFormula("=2^-1022")).toEqual({ value: 2.2250738585072014e-308 });
    expect(evaluateFormula("=0^5")).toEqual({ value: 0 });
    // 0 to a fractional power is 0, not a "negative base" case (LO 7.4 headless: 0)
    expect(evaluateFormula("=0^0.5")).toEqual({ value: 0 });
    expect(evaluateFormula("=POWER(0,1/3)")).toEqual({ value: 0 });
  });
  it("^ and POWER give the same answers: one rule (coerce.ts power)", () => {
    for (const [x, y] of [["-8", "1/3"], ["-8", "0.5"], ["0", "0"], ["0", "-1"], ["2", "0.5"], ["-32", "1/5"], ["10", "400"]]) {
      expect(evaluateFormula(`=POWER(${x},${y})`)).toEqual(evaluateFormula(`=(${x})^(${y})`));
    }
  });
});
