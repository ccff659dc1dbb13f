/**
 * The formula parser, tree by tree: every node kind, reference offsets and flags, operator
 * precedence, stored and typed function names, array constants and every refusal. Formulas are
 * invented to exercise each branch. Precedence as Microsoft Support, "Calculation operators and
 * precedence in Excel", lists it: reference operators (: space ,), negation, %, ^, * and /, + and -,
 * &, comparisons. Syntax: ECMA-376 Part 1 (5th edition, 2016), §18.17 "Formulas"; the grid (16,384
 * columns, 1,048,576 rows): Microsoft Support, "Excel specifications and limits".
 */
import { FormulaSyntaxError } from "../../../src/engine/formula/lexer";
import { MAX_DEPTH, NameMap, Node, canonicalFunctionName, parseFormula } from "../../../src/engine/formula/parser";
import { XlArray, XlError } from "../../../src/engine/formula/values";
import { SOIL_NAMES } from "../../../src/engine/soil";

// Written in C5 (row 4, column 2, 0-based), so relative offsets differ from positions.
const at = (text: string): Node => parseFormula(text, 4, 2, SOIL_NAMES);
const refused = (text: string, words: RegExp) => {
  expect(() => at(text)).toThrow(FormulaSyntaxError);
  expect(() => at(text)).toThrow(words);
};
const num = (v: number): Node => ({ k: "num", v });
const bin = (op: string, a: Node, b: Node): Node => ({ k: "bin", op, a, b }) as Node;
const NONE: NameMap = { addinFunction: () => undefined };

describe("parser: literals and references", () => {
  it("each literal kind", () => {
    expect(at("12.5")).toEqual(num(12.5));
    expect(at('"Ca"')).toEqual({ k: "str", v: "Ca" });
    expect(at("TRUE")).toEqual({ k: "bool", v: true });
    expect(at("#N/A")).toEqual({ k: "err", v: "#N/A" });
    expect(at("=7")).toEqual(num(7)); // a leading = is dropped
  });
  it("relative references are offsets from the formula's cell; absolute ones positions, flagged", () => {
    expect(at("B2")).toEqual({ k: "ref", r1: -3, c1: -1, r2: -3, c2: -1, abs: 0 });
    expect(at("$B$2")).toEqual({ k: "ref", r1: 1, c1: 1, r2: 1, c2: 1, abs: 15 });
    expect(at("B$2")).toEqual({ k: "ref", r1: 1, c1: -1, r2: 1, c2: -1, abs: 1 | 4 });
    expect(at("$B2")).toEqual({ k: "ref", r1: -3, c1: 1, r2: -3, c2: 1, abs: 2 | 8 });
    expect(at("C5:$E$9")).toEqual({ k: "ref", r1: 0, c1: 0, r2: 8, c2: 4, abs: 4 | 8 });
    expect(at("$C5:E$9")).toEqual({ k: "ref", r1: 0, c1: 2, r2: 8, c2: 2, abs: 2 | 4 });
    expect(at("Lab!D7")).toEqual({ k: "ref", sheet: "Lab", r1: 2, c1: 1, r2: 2, c2: 1, abs: 0 });
  });
  it("whole columns and rows have absolute open sides spanning the grid", () => {
    expect(at("B:D")).toEqual({ k: "ref", r1: 0, c1: -1, r2: 1048575, c2: 1, abs: 1 | 4 });
    expect(at("$B:$D")).toEqual({ k: "ref", r1: 0, c1: 1, r2: 1048575, c2: 3, abs: 15 });
    expect(at("2:9")).toEqual({ k: "ref", r1: -3, c1: 0, r2: 4, c2: 16383, abs: 2 | 8 });
    expect(at("$2:$9")).toEqual({ k: "ref", r1: 1, c1: 0, r2: 8, c2: 16383, abs: 15 });
  });
  it("names keep their sheet when they have one", () => {
    expect(at("limits")).toEqual({ k: "name", name: "limits" });
    expect(at("Lab!limits")).toEqual({ k: "name", name: "limits", sheet: "Lab" });
    expect(Object.keys(at("limits"))).toEqual(["k", "name"]); // no sheet key at all
  });
  it("what the engine does not evaluate still says what it reads where it can", () => {
    expect(at("Samples[Ca]")).toEqual({ k: "unsup", what: "a structured (table) reference", table: "Samples", opaque: false });
    expect(at("[1]Lab!A1")).toEqual({ k: "unsup", what: "a reference to another workbook", opaque: false });
    expect(at("Sheet1:Sheet3!A1")).toEqual({ k: "unsup", what: "a 3-D reference across sheets", opaque: true });
    expect(at("[@Ca]")).toEqual({ k: "unsup", what: "a structured (table) reference", opaque: true });
  });
});

describe("parser: precedence across levels (Microsoft Support, 'Calculation operators and precedence in Excel': & below + and -, comparisons below &)", () => {
  it("1&2+3 is 1&(2+3); 1=2&3 is 1=(2&3)", () => {
    expect(at("1&2+3")).toEqual({ k: "bin", op: "&", a: { k: "num", v: 1 }, b: { k: "bin", op: "+", a: { k: "num", v: 2 }, b: { k: "num", v: 3 } } });
    expect(at("1=2&3")).toEqual({ k: "bin", op: "=", a: { k: "num", v: 1 }, b: { k: "bin", op: "&", a: { k: "num", v: 2 }, b: { k: "num", v: 3 } } });
    expect(at("1&2*3")).toEqual({ k: "bin", op: "&", a: { k: "num", v: 1 }, b: { k: "bin", op: "*", a: { k: "num", v: 2 }, b: { k: "num", v: 3 } } });
  });
});

describe("parser: operators", () => {
  it("each binary operator", () => {
    for (const op of ["+", "-", "*", "/", "^", "&", "=", "<>", "<", ">", "<=", ">="]) expect(at(`1${op}2`)).toEqual(bin(op, num(1), num(2)));
  });
  it("left to right within one level, ^ included (2^3^2 = 64)", () => {
    expect(at("1-2-3")).toEqual(bin("-", bin("-", num(1), num(2)), num(3)));
    expect(at("8/4*2")).toEqual(bin("*", bin("/", num(8), num(4)), num(2)));
    expect(at("2^3^2")).toEqual(bin("^", bin("^", num(2), num(3)), num(2)));
    expect(at('"a"&"b"&"c"')).toEqual(bin("&", bin("&", { k: "str", v: "a" }, { k: "str", v: "b" }), { k: "str", v: "c" }));
    expect(at("1=2=3")).toEqual(bin("=", bin("=", num(1), num(2)), num(3)));
    expect(at("1<2>3")).toEqual(bin(">", bin("<", num(1), num(2)), num(3)));
  });
  it("the levels in Excel's order", () => {
    expect(at("1+2*3")).toEqual(bin("+", num(1), bin("*", num(2), num(3))));
    expect(at("1*2+3")).toEqual(bin("+", bin("*", num(1), num(2)), num(3)));
    expect(at("2*3^2")).toEqual(bin("*", num(2), bin("^", num(3), num(2))));
    expect(at("1+2&3")).toEqual(bin("&", bin("+", num(1), num(2)), num(3)));
    expect(at("1&2=3")).toEqual(bin("=", bin("&", num(1), num(2)), num(3)));
    expect(at("1=2&3")).toEqual(bin("=", num(1), bin("&", num(2), num(3))));
    expect(at("(1+2)*3")).toEqual(bin("*", bin("+", num(1), num(2)), num(3)));
  });
  it("negation binds tighter than ^ (-2^2 = 4), % tighter than ^, and prefixes nest", () => {
    expect(at("-2^2")).toEqual(bin("^", { k: "neg", x: num(2) }, num(2)));
    expect(at("2^50%")).toEqual(bin("^", num(2), { k: "pct", x: num(50) }));
    expect(at("5%%")).toEqual({ k: "pct", x: { k: "pct", x: num(5) } });
    expect(at("-5%")).toEqual({ k: "pct", x: { k: "neg", x: num(5) } });
    expect(at("+1")).toEqual({ k: "plus", x: num(1) });
    expect(at("--1")).toEqual({ k: "neg", x: { k: "neg", x: num(1) } });
    expect(at("@C5:C9")).toEqual({ k: "at", x: { k: "ref", r1: 0, c1: 0, r2: 4, c2: 0, abs: 0 } });
    expect(at("1--1")).toEqual(bin("-", num(1), { k: "neg", x: num(1) }));
  });
  it("reference operators: range, spill, space intersection and parenthesised union", () => {
    const c5: Node = { k: "ref", r1: 0, c1: 0, r2: 0, c2: 0, abs: 0 };
    const d6: Node = { k: "ref", r1: 1, c1: 1, r2: 1, c2: 1, abs: 0 };
    expect(at("C5:limits")).toEqual({ k: "range", a: c5, b: { k: "name", name: "limits" } });
    expect(at("C5#")).toEqual({ k: "spill", x: c5 });
    refused("C5##", /unexpected "#" at 4/); // a # after a # starts an error literal
    expect(at("C5 D6")).toEqual({ k: "isect", a: c5, b: d6 });
    expect(at("C5 limits")).toEqual({ k: "isect", a: c5, b: { k: "name", name: "limits" } });
    expect(at("C5 (D6)")).toEqual({ k: "isect", a: c5, b: d6 });
    expect(at("C5 INDEX(D6,1)")).toEqual({ k: "isect", a: c5, b: { k: "fn", name: "INDEX", args: [d6, num(1)] } });
    for (const f of ["OFFSET", "INDIRECT", "CHOOSE", "IF", "_xlfn.INDEX"]) expect(at(`C5 ${f}(D6)`)).toMatchObject({ k: "isect" });
    refused("C5 SUM(D6)", /unexpected text at 4/); // SUM gives no reference: a space before it is no operator
    refused("C5 1", /unexpected text at 4/);
    expect(at("C5(D6)")).toEqual({ k: "fn", name: "C5", args: [d6] }); // a cell-like word before ( is a function name
    refused("(C5)limits", /unexpected text at 5/); // no space: no intersection
    expect(at("C5 +1")).toEqual(bin("+", c5, num(1)));
    expect(at("C5 + 1")).toEqual(bin("+", c5, num(1))); // spaces around an operator are only spaces
    expect(at("(C5,D6)")).toEqual({ k: "union", items: [c5, d6] });
    expect(at("(C5,D6,1)")).toMatchObject({ k: "union", items: [c5, d6, num(1)] });
    expect(at("(C5)")).toEqual(c5);
  });
});

describe("parser: functions", () => {
  it("arguments, empty lists and missing arguments", () => {
    expect(at("SUM(1,2)")).toEqual({ k: "fn", name: "SUM", args: [num(1), num(2)] });
    expect(at("NOW()")).toEqual({ k: "fn", name: "NOW", args: [] });
    expect(at("IF(,1,)")).toEqual({ k: "fn", name: "IF", args: [{ k: "miss" }, num(1), { k: "miss" }] });
    expect(at("F(1,)")).toEqual({ k: "fn", name: "F", args: [num(1), { k: "miss" }] });
    expect(at("F( )")).toEqual({ k: "fn", name: "F", args: [] });
  });
  it("stored-form prefixes and our add-in's stored names are read back; names are upper-cased", () => {
    expect(at("_xlfn.STDEV.S(1)")).toEqual({ k: "fn", name: "STDEV.S", args: [num(1)] });
    expect(at("_xlfn._xlws.SORT(1)")).toMatchObject({ name: "SORT" });
    expect(at("_XLWS.FILTER(1,2)")).toMatchObject({ name: "FILTER" });
    expect(at("_xldudf_SOIL_CEC(1)")).toMatchObject({ name: "SOIL.CEC" });
    expect(at("_xldudf_soil_cmol(1)")).toMatchObject({ name: "SOIL.CMOL" });
    expect(at("_xldudf_OTHER_F(1)")).toMatchObject({ name: "_XLDUDF_OTHER_F" }); // another add-in: kept, upper-cased
    expect(at("soil.cec(1)")).toMatchObject({ name: "SOIL.CEC" });
    expect(canonicalFunctionName("_xlfn.x_xlfn.", NONE)).toBe("X_XLFN.");
    expect(canonicalFunctionName("_xldudf_SOIL_CEC", NONE)).toBe("_XLDUDF_SOIL_CEC");
  });
  it("ANCHORARRAY and SINGLE are the spill and @ operators in stored form (one argument only)", () => {
    const c5: Node = { k: "ref", r1: 0, c1: 0, r2: 0, c2: 0, abs: 0 };
    expect(at("_xlfn.ANCHORARRAY(C5)")).toEqual({ k: "spill", x: c5 });
    expect(at("_xlfn.SINGLE(C5)")).toEqual({ k: "at", x: c5 });
    expect(at("ANCHORARRAY(C5,1)")).toEqual({ k: "fn", name: "ANCHORARRAY", args: [c5, num(1)] });
    expect(at("SINGLE(C5,1)")).toEqual({ k: "fn", name: "SINGLE", args: [c5, num(1)] });
  });
  it("LET and LAMBDA are not evaluated, but keep their arguments", () => {
    expect(at("_xlfn.LET(_xlpm.x,1,_xlpm.x)")).toEqual({
      k: "unsup",
      what: "LET (LET and LAMBDA)",
      args: [{ k: "name", name: "_xlpm.x" }, num(1), { k: "name", name: "_xlpm.x" }],
      opaque: false,
    });
    expect(at("LAMBDA(1)")).toMatchObject({ k: "unsup", what: "LAMBDA (LET and LAMBDA)", opaque: false });
    expect(at("_xlpm.f(1)")).toMatchObject({ k: "unsup", what: "F (LET and LAMBDA)" });
  });
  it("a call must be closed and separated properly", () => {
    refused("SUM(1", /the formula ends too early|expected "," or "\)" at 6/);
    refused("SUM(1 2)", /expected "," or "\)" at 7/);
    refused("SUM(1;2)", /";" is not an argument separator/);
  });
});

describe("parser: array constants", () => {
  it("rows and columns, with signed numbers, text, booleans and errors", () => {
    expect(at("{1,2;3,4}")).toEqual({ k: "arr", v: XlArray.of([[1, 2], [3, 4]]) });
    expect(at('{-1,+2,"a",TRUE,#N/A}')).toEqual({ k: "arr", v: XlArray.of([[-1, 2, "a", true, new XlError("#N/A")]]) });
    expect(at("{1;2;3}")).toEqual({ k: "arr", v: XlArray.of([[1], [2], [3]]) });
  });
  it("refuses references, formulas and ragged rows", () => {
    refused("{C5}", /an array constant holds only numbers, text, TRUE\/FALSE and errors \(at 2\)/);
    refused("{-C5}", /an array constant holds only numbers.*\(at 2\)/); // the sign, with no number after it
    refused("{1+2}", /expected ",", ";" or "}" in an array constant at 3/);
    refused("{1,2;3}", /the rows of an array constant differ in length/);
    refused("{1;2,3}", /the rows of an array constant differ in length/);
    refused("{}", /an array constant holds only numbers.*\(at 2\)/);
    refused("{1,}", /an array constant holds only numbers.*\(at 4\)/);
    refused("{1", /expected ",", ";" or "}" in an array constant at 3/);
  });
});

describe("parser: refusals", () => {
  it("text after a whole formula, an early end, a stray token", () => {
    refused("1 2", /unexpected text at 3/);
    refused("1)", /unexpected text at 2/);
    refused("", /the formula ends too early/);
    refused("1+", /the formula ends too early/);
    refused("(1", /expected "\)" at 3/);
    refused("(1,2", /expected "\)" at 5/);
    refused(")", /unexpected "\)" at 1/);
    refused(",1", /unexpected "," at 1/);
    refused("}", /unexpected "}" at 1/);
    refused("1+*2", /unexpected "\*" at 3/);
    refused("{1;2}+;", /";" is not an argument separator/);
    refused("C5#+#", /unexpected "#"/);
  });
  it(`nesting deeper than ${MAX_DEPTH} levels is refused; ${MAX_DEPTH} is accepted`, () => {
    const deep = (n: number) => `${"(".repeat(n)}1${")".repeat(n)}`;
    // Each parenthesis enters twice (the group and its expression), the formula itself once.
    expect(() => at(deep(MAX_DEPTH / 2 - 1))).not.toThrow();
    refused(deep(MAX_DEPTH / 2), new RegExp(`the formula nests deeper than ${MAX_DEPTH} levels`));
    const negs = (n: number) => `${"-".repeat(n)}1`;
    expect(() => at(negs(MAX_DEPTH - 1))).not.toThrow();
    refused(negs(MAX_DEPTH), /nests deeper than/);
    // Flat chains are loops, not recursion: a long sum is fine.
    expect(() => at(Array.from({ length: 5000 }, () => "1").join("+"))).not.toThrow();
  });
  it("depth is counted down on the way out: 300 groups one after another are not 300 levels deep", () => {
    expect(() => at(Array.from({ length: 300 }, () => "(1)").join("+"))).not.toThrow();
    expect(() => at(`SUM(${Array.from({ length: 300 }, () => "(1)").join(",")})`)).not.toThrow();
  });
  it("text that looks like an operator is text: a string between operands is refused, never read as the operator", () => {
    // Behaviour (ECMA-376 Part 1 §18.17 formula grammar: operators are tokens, not string literals).
    for (const op of ["&", "=", "<>", "+", "-", "*", "^"]) refused(`1"${op}"2`, /^unexpected text at 2$/);
    refused("1@", /^unexpected text at 2$/);
    refused("{*1}", /^an array constant holds only numbers, text, TRUE\/FALSE and errors \(at 2\)$/);
    refused('{"-"1}', /^expected ",", ";" or "}" in an array constant at 5$/);
  });
  it("the messages name the token: ';', '#', and the position", () => {
    refused("#", /^unexpected "#" at 1$/);
    refused("1#2", /^unexpected "#" at 2$/);
    refused("SUM(1;2)", /^";" is not an argument separator in a stored formula \(use ","\), at 6$/);
  });
});
