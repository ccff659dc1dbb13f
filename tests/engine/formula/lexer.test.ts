/**
 * The formula lexer on its own: every token kind with its exact offsets, space flags and parts, and
 * every refusal with its message. Formulas are invented; they exercise Excel's grammar, not any
 * workbook.
 *
 * Excel syntax asserted here comes from ECMA-376 Part 1, §18.17 "Formulas" (§18.17.2 syntax, its
 * constants and §18.17.2.3 cell references; the constants grammar read in the 1st edition's
 * Part 4 §3.17.2 text), with Microsoft's notes on how Office implements it (MS-OI29500 §2.1.860 for
 * §18.17.2 and §2.1.863 for §18.17.2.3), and the grid size from Microsoft Support, "Excel
 * specifications and limits" (16,384 columns to XFD, 1,048,576 rows). Cases without such a note pin
 * the lexer's own contract (lexer.ts comments): whitespace kinds, unsupported forms, refusal
 * messages and their 1-based positions; they are not published values.
 */
import { FormulaSyntaxError, RefParts, T, Token, tokenize } from "../../../src/engine/formula/lexer";

type Extra = Partial<Pick<Token, "space" | "value" | "ref" | "sheet" | "table">>;
const tk = (t: T, start: number, end: number, extra: Extra = {}): Token => ({ t, start, end, space: false, ...extra });
const end = (n: number): Token => tk(T.End, n, n);

/** Token kinds with the text each covers: a compact view for cases where parts do not matter. */
const kinds = (text: string): [T, string][] => tokenize(text).map((k) => [k.t, text.slice(k.start, k.end)]);

const cell = (r: number, c: number, ra = false, ca = false): RefParts => ({ r1: r, c1: c, r2: r, c2: c, ra1: ra, ca1: ca, ra2: ra, ca2: ca, range: false });
const area = (r1: number, c1: number, r2: number, c2: number, abs: [boolean, boolean, boolean, boolean] = [false, false, false, false]): RefParts => ({
  r1,
  c1,
  r2,
  c2,
  ra1: abs[0],
  ca1: abs[1],
  ra2: abs[2],
  ca2: abs[3],
  range: true,
});
const cols = (c1: number, c2: number, ca1 = false, ca2 = false): RefParts => ({ c1, c2, ca1, ca2, ra1: true, ra2: true, range: true });
const rows = (r1: number, r2: number, ra1 = false, ra2 = false): RefParts => ({ r1, r2, ra1, ra2, ca1: true, ca2: true, range: true });
const sheetRef = (parts: RefParts, sheet: string): RefParts => ({ ...parts, sheet });

/** The refusal tokenize gives for `text`: always a FormulaSyntaxError, never another failure. */
function refusal(text: string): FormulaSyntaxError {
  let caught: unknown;
  try {
    tokenize(text);
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(FormulaSyntaxError);
  expect((caught as Error).name).toBe("FormulaSyntaxError");
  return caught as FormulaSyntaxError;
}

describe("lexer: the token stream", () => {
  it("an empty formula, or one of blanks only, is just End at the end", () => {
    expect(tokenize("")).toStrictEqual([end(0)]);
    expect(tokenize("   ")).toStrictEqual([end(3)]);
  });

  it("End never carries the space flag, even after trailing blanks", () => {
    expect(tokenize("A1  ")).toStrictEqual([tk(T.Ref, 0, 2, { ref: cell(0, 0) }), end(4)]);
  });

  it("a function call: Func, LParen, arguments, Comma, RParen, with offsets", () => {
    expect(tokenize("SUM(A1,2)")).toStrictEqual([
      tk(T.Func, 0, 3, { value: "SUM" }),
      tk(T.LParen, 3, 4),
      tk(T.Ref, 4, 6, { ref: cell(0, 0) }),
      tk(T.Comma, 6, 7),
      tk(T.Num, 7, 8, { value: 2 }),
      tk(T.RParen, 8, 9),
      end(9),
    ]);
  });

  it("a longer invented formula keeps every offset", () => {
    const f = 'IF(Soil!$B$2>=0.5,"ok",#N/A)';
    expect(tokenize(f)).toStrictEqual([
      tk(T.Func, 0, 2, { value: "IF" }),
      tk(T.LParen, 2, 3),
      tk(T.Ref, 3, 12, { ref: sheetRef(cell(1, 1, true, true), "Soil") }),
      tk(T.Op, 12, 14, { value: ">=" }),
      tk(T.Num, 14, 17, { value: 0.5 }),
      tk(T.Comma, 17, 18),
      tk(T.Str, 18, 22, { value: "ok" }),
      tk(T.Comma, 22, 23),
      tk(T.Err, 23, 27, { value: "#N/A" }),
      tk(T.RParen, 27, 28),
      end(28),
    ]);
  });

  it("words inside a string are never references, names or functions", () => {
    expect(tokenize('"A1,SOIL.CEC(#N/A\'x\'!{;}"')).toStrictEqual([tk(T.Str, 0, 25, { value: "A1,SOIL.CEC(#N/A'x'!{;}" }), end(25)]);
  });
});

describe("lexer: whitespace", () => {
  // ECMA-376 Part 1 §18.17.2: spaces (U+0020) may separate tokens and are kept apart from the space
  // (intersection) operator. Tab, CR, LF and the non-breaking space are the lexer's own wider set.
  it.each([
    ["space", " "],
    ["tab", "\t"],
    ["carriage return", "\r"],
    ["line feed", "\n"],
    ["non-breaking space", "\u00a0"],
  ])("%s separates tokens and sets the space flag", (_kind, ws) => {
    expect(tokenize(`A1${ws}B1`)).toStrictEqual([tk(T.Ref, 0, 2, { ref: cell(0, 0) }), tk(T.Ref, 3, 5, { space: true, ref: cell(0, 1) }), end(5)]);
    expect(tokenize(`${ws}1`)).toStrictEqual([tk(T.Num, 1, 2, { space: true, value: 1 }), end(2)]);
  });

  it("a run of mixed whitespace is one gap", () => {
    expect(tokenize("1 \t\r\n\u00a02")).toStrictEqual([tk(T.Num, 0, 1, { value: 1 }), tk(T.Num, 6, 7, { space: true, value: 2 }), end(7)]);
  });

  it("the flag belongs to the next token only", () => {
    expect(tokenize("A1:B2 B1:C3+1")).toStrictEqual([
      tk(T.Ref, 0, 5, { ref: area(0, 0, 1, 1) }),
      tk(T.Ref, 6, 11, { space: true, ref: area(0, 1, 2, 2) }),
      tk(T.Op, 11, 12, { value: "+" }),
      tk(T.Num, 12, 13, { value: 1 }),
      end(13),
    ]);
  });

  it("a non-breaking space ends a name or a cell word, as a space does", () => {
    // It used to count as a letter of another script there, so A1\u00a0B1 was one name.
    expect(tokenize("Rate\u00a0Total")).toStrictEqual([tk(T.Name, 0, 4, { value: "Rate" }), tk(T.Name, 5, 10, { space: true, value: "Total" }), end(10)]);
    expect(tokenize("A1\u00a0+1")).toStrictEqual([
      tk(T.Ref, 0, 2, { ref: cell(0, 0) }),
      tk(T.Op, 3, 4, { space: true, value: "+" }),
      tk(T.Num, 4, 5, { value: 1 }),
      end(5),
    ]);
    // Inside quotes it is just a character of the sheet name.
    expect(tokenize("'My\u00a0Sheet'!A1")[0]).toStrictEqual(tk(T.Ref, 0, 13, { ref: sheetRef(cell(0, 0), "My\u00a0Sheet") }));
    // Other characters above 127 are letters (any script).
    expect(tokenize("A1\u2003B1")).toStrictEqual([tk(T.Name, 0, 5, { value: "A1\u2003B1" }), end(5)]);
  });

  it("other control characters are not whitespace", () => {
    expect(refusal("1\u000b2").message).toBe('unexpected character "\u000b" at 2');
    expect(refusal("1\f2").message).toBe('unexpected character "\f" at 2');
  });
});

describe("lexer: numbers", () => {
  // ECMA-376 §18.17.2 constants, numerical-constant: whole-number-part [.] [exponent-part] |
  // . fractional-part [exponent-part] | whole . fractional [exponent-part]; exponent e|E [sign] digits.
  it.each([
    ["0", 0],
    ["9", 9],
    ["42", 42],
    ["007", 7],
    ["3.25", 3.25],
    ["1.", 1],
    [".5", 0.5],
    [".25", 0.25],
    ["1E3", 1000],
    ["1e3", 1000],
    ["1E10", 1e10],
    ["1e-3", 0.001],
    ["1E+3", 1000],
    ["2.5E2", 250],
    [".5e1", 5],
    ["1.e2", 100],
    ["1E308", 1e308],
  ])("%s is one number token", (text, value) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Num, 0, text.length, { value }), end(text.length)]);
  });

  it("a number followed by letters stops where the number does", () => {
    // "1E" has no exponent digits: the number is 1 and E is a name (the parser refuses the pair).
    expect(tokenize("1E")).toStrictEqual([tk(T.Num, 0, 1, { value: 1 }), tk(T.Name, 1, 2, { value: "E" }), end(2)]);
    expect(kinds("1E+")).toStrictEqual([
      [T.Num, "1"],
      [T.Name, "E"],
      [T.Op, "+"],
    ].concat([[T.End, ""]]) as [T, string][]);
    expect(kinds("1A")).toStrictEqual([
      [T.Num, "1"],
      [T.Name, "A"],
      [T.End, ""],
    ]);
  });

  it("a second decimal point starts a second number", () => {
    expect(tokenize("1.2.3")).toStrictEqual([tk(T.Num, 0, 3, { value: 1.2 }), tk(T.Num, 3, 5, { value: 0.3 }), end(5)]);
  });

  it('"." not followed by a digit is refused', () => {
    expect(refusal(".").message).toBe('unexpected character "." at 1');
    expect(refusal("1+.e1").message).toBe('unexpected character "." at 3');
  });

  it("a number beyond a double is refused, never read as Infinity", () => {
    // Excel's arithmetic is IEC 60559 double precision (MS-OI29500 §2.1.860 d); 1E400 has no value.
    const e = refusal("2*1E400");
    expect(e.message).toBe("the number 1E400 is too large, at 3");
    expect(refusal(".5E999").message).toContain(".5E999");
  });

  it("a number next to an operator", () => {
    expect(kinds("5+1")).toStrictEqual([
      [T.Num, "5"],
      [T.Op, "+"],
      [T.Num, "1"],
      [T.End, ""],
    ]);
  });
});

describe("lexer: strings", () => {
  // ECMA-376 §18.17.2 constants, string-constant: a double quote inside is written twice.
  it.each([
    ['""', ""],
    ['"ab"', "ab"],
    ['"ab""cd"', 'ab"cd'],
    ['""""', '"'],
    ['"""abcd"""', '"abcd"'],
  ])("%s", (text, value) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Str, 0, text.length, { value }), end(text.length)]);
  });

  it("the token ends after the closing quote", () => {
    expect(tokenize('"a"&"b"')).toStrictEqual([tk(T.Str, 0, 3, { value: "a" }), tk(T.Op, 3, 4, { value: "&" }), tk(T.Str, 4, 7, { value: "b" }), end(7)]);
  });

  it.each(['"abc', '"a""', '1&"'])("an unclosed string %s is refused", (text) => {
    expect(refusal(text).message).toBe("a string is not closed");
  });
});

describe("lexer: booleans and names", () => {
  // ECMA-376 §18.17.2 constants, logical-constant: TRUE | FALSE (Excel reads them in any case: from memory).
  it.each([
    ["TRUE", true],
    ["true", true],
    ["False", false],
    ["FALSE", false],
  ])("%s is a boolean", (text, value) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Bool, 0, text.length, { value }), end(text.length)]);
  });

  it.each(["TRUEX", "FALSE1", "TRUE_", "TRU", "FALSE.A"])("%s is a name, not a boolean", (text) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Name, 0, text.length, { value: text }), end(text.length)]);
  });

  it("TRUE( is the function TRUE()", () => {
    expect(tokenize("TRUE()")).toStrictEqual([tk(T.Func, 0, 4, { value: "TRUE" }), tk(T.LParen, 4, 5), tk(T.RParen, 5, 6), end(6)]);
  });

  it.each(["_Rate", "\\Data", "a_b", "a.b", "a\\b", "Rate?", "Ca_mg.kg", "Δph", "x\u0080", "\u0080x", "_1"])("%s is one name, kept as written", (text) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Name, 0, text.length, { value: text }), end(text.length)]);
  });

  it("characters that cannot start a name are refused", () => {
    expect(refusal("?x").message).toBe('unexpected character "?" at 1');
    expect(refusal("`").message).toBe('unexpected character "`" at 1');
    expect(refusal("\u007f").message).toBe('unexpected character "\u007f" at 1');
    // DEL (127) does not continue a name either: the name stops before it.
    expect(refusal("ab\u007f").message).toBe('unexpected character "\u007f" at 3');
  });

  it("a function name is the word before (, kept as written; dots and prefixes included", () => {
    expect(tokenize("_xlfn.XLOOKUP(")).toStrictEqual([tk(T.Func, 0, 13, { value: "_xlfn.XLOOKUP" }), tk(T.LParen, 13, 14), end(14)]);
    expect(tokenize("soil.cec(")).toStrictEqual([tk(T.Func, 0, 8, { value: "soil.cec" }), tk(T.LParen, 8, 9), end(9)]);
  });

  it("blanks between a function name and ( are skipped (lenient: Excel never stores them)", () => {
    // ECMA-376 §18.17.2 forbids the space; the lexer still reads SUM (A1) as the call it was meant to be.
    expect(tokenize("SUM  (A1)")).toStrictEqual([
      tk(T.Func, 0, 3, { value: "SUM" }),
      tk(T.LParen, 5, 6, { space: true }),
      tk(T.Ref, 6, 8, { ref: cell(0, 0) }),
      tk(T.RParen, 8, 9),
      end(9),
    ]);
  });

  it("inside an array constant a word before ( is a name, not a function", () => {
    expect(kinds("{X(1)}")).toStrictEqual([
      [T.LBrace, "{"],
      [T.Name, "X"],
      [T.LParen, "("],
      [T.Num, "1"],
      [T.RParen, ")"],
      [T.RBrace, "}"],
      [T.End, ""],
    ]);
    // ... and after the array closes, functions are functions again.
    expect(kinds("{1}+X(1)")[4]).toStrictEqual([T.Func, "X"]);
  });
});

describe("lexer: error literals", () => {
  // ECMA-376 §18.17.2 constants: error-constant lists the first seven; #GETTING_DATA, #SPILL!, #CALC!
  // and the rest are the newer error values of Excel (Microsoft Support error pages, from memory).
  it.each([
    "#NULL!",
    "#DIV/0!",
    "#VALUE!",
    "#REF!",
    "#NAME?",
    "#NUM!",
    "#N/A",
    "#GETTING_DATA",
    "#SPILL!",
    "#CALC!",
    "#FIELD!",
    "#BLOCKED!",
    "#CONNECT!",
    "#BUSY!",
    "#UNKNOWN!",
    "#PYTHON!",
  ])("%s is one error token, exactly as long as the code", (code) => {
    expect(tokenize(`${code}+1`)).toStrictEqual([
      tk(T.Err, 0, code.length, { value: code }),
      tk(T.Op, code.length, code.length + 1, { value: "+" }),
      tk(T.Num, code.length + 1, code.length + 2, { value: 1 }),
      end(code.length + 2),
    ]);
    // Excel reads error literals in any case and shows them in capitals (from memory).
    expect(tokenize(code.toLowerCase())[0]).toStrictEqual(tk(T.Err, 0, code.length, { value: code }));
  });

  it("an error after an operator or a blank", () => {
    expect(tokenize("1+ #DIV/0!")).toStrictEqual([
      tk(T.Num, 0, 1, { value: 1 }),
      tk(T.Op, 1, 2, { value: "+" }),
      tk(T.Err, 3, 10, { space: true, value: "#DIV/0!" }),
      end(10),
    ]);
  });

  it.each([
    ["#NAME", 1],
    ["#VALUE", 1],
    ["#NUL!", 1],
    ["#DIV/0", 1],
    ["#", 1],
    ["#X+#N/A", 1],
    ["1+#", 3],
  ])('%s is refused: unexpected "#"', (text, at) => {
    expect(refusal(text).message).toBe(`unexpected "#" at ${at}`);
  });
});

describe("lexer: the spill operator #", () => {
  // A1# is the spilled range anchored at A1 (Microsoft Support, "Spilled range operator"; from memory).
  it("right after a reference, a name or ) it is Hash", () => {
    expect(tokenize("A1#")).toStrictEqual([tk(T.Ref, 0, 2, { ref: cell(0, 0) }), tk(T.Hash, 2, 3), end(3)]);
    expect(tokenize("Data#")).toStrictEqual([tk(T.Name, 0, 4, { value: "Data" }), tk(T.Hash, 4, 5), end(5)]);
    expect(tokenize("(A1)#")).toStrictEqual([tk(T.LParen, 0, 1), tk(T.Ref, 1, 3, { ref: cell(0, 0) }), tk(T.RParen, 3, 4), tk(T.Hash, 4, 5), end(5)]);
    expect(tokenize("Sheet1!B2#")).toStrictEqual([tk(T.Ref, 0, 9, { ref: sheetRef(cell(1, 1), "Sheet1") }), tk(T.Hash, 9, 10), end(10)]);
  });

  it("after a blank, or after anything else, # must begin an error literal", () => {
    expect(refusal("A1 #").message).toBe('unexpected "#" at 4');
    expect(tokenize("A1 #N/A")).toStrictEqual([tk(T.Ref, 0, 2, { ref: cell(0, 0) }), tk(T.Err, 3, 7, { space: true, value: "#N/A" }), end(7)]);
    expect(refusal("1#").message).toBe('unexpected "#" at 2');
    expect(refusal('"x"#').message).toBe('unexpected "#" at 4');
    expect(refusal("#N/A#").message).toBe('unexpected "#" at 5');
  });
});

describe("lexer: operators and punctuation", () => {
  it("each one-character operator, with the space flag of each", () => {
    const ops = ["+", "-", "*", "/", "^", "&", "=", "<", ">", "%", ":", "@"];
    const text = ops.join(" ");
    expect(tokenize(text)).toStrictEqual([...ops.map((op, k) => tk(T.Op, 2 * k, 2 * k + 1, { space: k > 0, value: op })), end(text.length)]);
  });

  it.each(["<=", ">=", "<>"])("%s is one two-character operator", (op) => {
    expect(tokenize(`1${op}2`)).toStrictEqual([tk(T.Num, 0, 1, { value: 1 }), tk(T.Op, 1, 3, { value: op }), tk(T.Num, 3, 4, { value: 2 }), end(4)]);
  });

  it.each([
    ["=<", "=", "<"],
    ["=>", "=", ">"],
    ["><", ">", "<"],
    ["<<", "<", "<"],
  ])("%s is two operators", (text, a, b) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Op, 0, 1, { value: a }), tk(T.Op, 1, 2, { value: b }), end(2)]);
  });

  it("a blank splits a two-character operator", () => {
    expect(tokenize("< =")).toStrictEqual([tk(T.Op, 0, 1, { value: "<" }), tk(T.Op, 2, 3, { space: true, value: "=" }), end(3)]);
  });

  it("parentheses and commas", () => {
    expect(tokenize("(1,2)")).toStrictEqual([tk(T.LParen, 0, 1), tk(T.Num, 1, 2, { value: 1 }), tk(T.Comma, 2, 3), tk(T.Num, 3, 4, { value: 2 }), tk(T.RParen, 4, 5), end(5)]);
  });

  it.each([
    ["!", 1],
    ["]", 1],
    ["1+~", 3],
    ["A1 ; ", 4],
  ])("%s: an unknown character is refused with its position", (text, at) => {
    const ch = text === "A1 ; " ? ";" : text[at - 1];
    const e = refusal(text);
    if (ch === ";") expect(e.message).toContain("argument separator");
    else expect(e.message).toBe(`unexpected character "${ch}" at ${at}`);
  });
});

describe("lexer: array constants", () => {
  // ECMA-376 §18.17.2 constants, array-constant: { row ; row }, a row being constants separated by ",".
  it("{1,2;3,4} with every offset", () => {
    expect(tokenize("{1,2;3,4}")).toStrictEqual([
      tk(T.LBrace, 0, 1),
      tk(T.Num, 1, 2, { value: 1 }),
      tk(T.Comma, 2, 3),
      tk(T.Num, 3, 4, { value: 2 }),
      tk(T.Semi, 4, 5),
      tk(T.Num, 5, 6, { value: 3 }),
      tk(T.Comma, 6, 7),
      tk(T.Num, 7, 8, { value: 4 }),
      tk(T.RBrace, 8, 9),
      end(9),
    ]);
  });

  it("mixed constants inside an array", () => {
    expect(kinds('{"a";TRUE;#N/A;-1}')).toStrictEqual([
      [T.LBrace, "{"],
      [T.Str, '"a"'],
      [T.Semi, ";"],
      [T.Bool, "TRUE"],
      [T.Semi, ";"],
      [T.Err, "#N/A"],
      [T.Semi, ";"],
      [T.Op, "-"],
      [T.Num, "1"],
      [T.RBrace, "}"],
      [T.End, ""],
    ]);
  });

  it('";" outside braces is refused (a stored formula separates arguments with ",")', () => {
    const msg = '";" is not an argument separator in a stored formula (use ","), at ';
    expect(refusal("SUM(1;2)").message).toBe(`${msg}6`);
    expect(refusal(";").message).toBe(`${msg}1`);
    // Braces are counted: once the array closes, ";" is outside again.
    expect(refusal("{1};2").message).toBe(`${msg}4`);
    expect(refusal("{1,2}+{3}+1;2").message).toBe(`${msg}12`);
  });

  it("braces are counted, not just seen: nested braces keep ; inside", () => {
    // (Nested arrays are the parser's refusal; the lexer only needs the depth.)
    expect(kinds("{{1};2}").map((k) => k[0])).toStrictEqual([T.LBrace, T.LBrace, T.Num, T.RBrace, T.Semi, T.Num, T.RBrace, T.End]);
  });
});

describe("lexer: cell references", () => {
  // ECMA-376 Part 1 §18.17.2.3: A1 references with $ marking an absolute row or column.
  it.each([
    ["A1", cell(0, 0)],
    ["$A$1", cell(0, 0, true, true)],
    ["A$1", cell(0, 0, true, false)],
    ["$A1", cell(0, 0, false, true)],
    ["b12", cell(11, 1)],
    ["Z1", cell(0, 25)],
    ["z9", cell(8, 25)],
    ["AA1", cell(0, 26)],
    ["az1", cell(0, 51)],
    ["ZZ1", cell(0, 701)],
    ["AAA1", cell(0, 702)],
    ["XFC1", cell(0, 16382)],
    // "LOG10 is always a cell reference, LOG10(…) is always a formula" (ECMA-376, cell references: limits).
    ["LOG10", cell(9, 8508)],
  ])("%s", (text, ref) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Ref, 0, text.length, { ref }), end(text.length)]);
  });

  // The grid: columns A..XFD (16,384), rows 1..1,048,576 (Microsoft Support, "Excel specifications
  // and limits"; ECMA-376, cell references: limits, A1 to XFD1048576).
  it.each([
    ["XFD1", cell(0, 16383)],
    ["xfd1", cell(0, 16383)],
    ["A1048576", cell(1048575, 0)],
    ["A1048575", cell(1048574, 0)],
    ["$XFD$1048576", cell(1048575, 16383, true, true)],
  ])("%s is a cell at the grid's edge", (text, ref) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Ref, 0, text.length, { ref }), end(text.length)]);
  });

  it.each(["XFE1", "xfe1", "A1048577", "A0", "AAAA1", "A10000000", "XFE1048576"])("%s, outside the grid, is a name", (text) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Name, 0, text.length, { value: text }), end(text.length)]);
  });

  it.each(["A1B", "A1_x", "A1.5", "A1?", "A1\\x", "B2C", "A1é"])("%s: a cell followed by more of a name is a name", (text) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Name, 0, text.length, { value: text }), end(text.length)]);
  });

  it("at most seven row digits, even with leading zeros (A00000001 is a name)", () => {
    expect(tokenize("A0000001")).toStrictEqual([tk(T.Ref, 0, 8, { ref: cell(0, 0) }), end(8)]);
    expect(tokenize("A00000001")).toStrictEqual([tk(T.Name, 0, 9, { value: "A00000001" }), end(9)]);
  });

  it("a cell inside a longer word is not found there", () => {
    expect(tokenize("A.A$1:$2")).toStrictEqual([tk(T.Name, 0, 3, { value: "A.A" }), tk(T.Ref, 3, 8, { ref: rows(0, 1, true, true) }), end(8)]);
  });

  it("single letters between operators are names, not columns", () => {
    expect(kinds("A+B")).toStrictEqual([
      [T.Name, "A"],
      [T.Op, "+"],
      [T.Name, "B"],
      [T.End, ""],
    ]);
    expect(tokenize("a b")).toStrictEqual([tk(T.Name, 0, 1, { value: "a" }), tk(T.Name, 2, 3, { space: true, value: "b" }), end(3)]);
  });

  it("a cell followed by ( is a function name", () => {
    expect(kinds("LOG10(2)")).toStrictEqual([
      [T.Func, "LOG10"],
      [T.LParen, "("],
      [T.Num, "2"],
      [T.RParen, ")"],
      [T.End, ""],
    ]);
    expect(tokenize("A1(")[0]).toStrictEqual(tk(T.Func, 0, 2, { value: "A1" }));
  });

  it("a cell followed by [ is a table name", () => {
    expect(tokenize("A1[x]")).toStrictEqual([tk(T.Unsupported, 0, 5, { value: "a structured (table) reference", table: "A1" }), end(5)]);
  });

  it("$ must begin a reference", () => {
    expect(refusal("$").message).toBe('unexpected "$" at 1');
    expect(refusal("$A").message).toBe('unexpected "$" at 1');
    expect(refusal("$1").message).toBe('unexpected "$" at 1');
    expect(refusal("1+$XFE$1").message).toBe('unexpected "$" at 3');
    expect(refusal("$A$1B").message).toBe('unexpected "$" at 1');
    // A cell cannot be a sheet name's end: "$A$1!" is not a prefix.
    expect(refusal("$A$1!B2").message).toBe('unexpected "$" at 1');
  });
});

describe("lexer: ranges", () => {
  it.each([
    ["A1:B2", area(0, 0, 1, 1)],
    ["$A$1:$B$2", area(0, 0, 1, 1, [true, true, true, true])],
    ["A$1:B2", area(0, 0, 1, 1, [true, false, false, false])],
    ["$A1:B2", area(0, 0, 1, 1, [false, true, false, false])],
    ["A1:B$2", area(0, 0, 1, 1, [false, false, true, false])],
    ["A1:$B2", area(0, 0, 1, 1, [false, false, false, true])],
    ["B3:A1", area(2, 1, 0, 0)],
    ["a1:xfd1048576", area(0, 0, 1048575, 16383)],
  ])("%s", (text, ref) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Ref, 0, text.length, { ref }), end(text.length)]);
  });

  it("a range whose second corner is not a cell is a cell, then :, then the rest", () => {
    expect(tokenize("A1:XFE1")).toStrictEqual([tk(T.Ref, 0, 2, { ref: cell(0, 0) }), tk(T.Op, 2, 3, { value: ":" }), tk(T.Name, 3, 7, { value: "XFE1" }), end(7)]);
    expect(kinds("A1:B2C")).toStrictEqual([
      [T.Ref, "A1"],
      [T.Op, ":"],
      [T.Name, "B2C"],
      [T.End, ""],
    ]);
    expect(kinds("A1:B")).toStrictEqual([
      [T.Ref, "A1"],
      [T.Op, ":"],
      [T.Name, "B"],
      [T.End, ""],
    ]);
    expect(kinds("A1:")).toStrictEqual([
      [T.Ref, "A1"],
      [T.Op, ":"],
      [T.End, ""],
    ]);
  });

  // Whole columns and rows (ECMA-376, cell references: limits write column A as A:A).
  it.each([
    ["A:C", cols(0, 2)],
    ["$A:$C", cols(0, 2, true, true)],
    ["A:$C", cols(0, 2, false, true)],
    ["$A:C", cols(0, 2, true, false)],
    ["a:xfd", cols(0, 16383)],
    ["XFD:XFD", cols(16383, 16383)],
    ["Z:AA", cols(25, 26)],
  ])("whole columns %s", (text, ref) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Ref, 0, text.length, { ref }), end(text.length)]);
  });

  it("whole columns outside the grid, or not closed, are names", () => {
    expect(kinds("A:XFE")).toStrictEqual([
      [T.Name, "A"],
      [T.Op, ":"],
      [T.Name, "XFE"],
      [T.End, ""],
    ]);
    expect(kinds("XFE:XFE")).toStrictEqual([
      [T.Name, "XFE"],
      [T.Op, ":"],
      [T.Name, "XFE"],
      [T.End, ""],
    ]);
    expect(kinds("A:")).toStrictEqual([
      [T.Name, "A"],
      [T.Op, ":"],
      [T.End, ""],
    ]);
    // A:B1 is the name A, then the range operator, then the cell B1.
    expect(kinds("A:B1")).toStrictEqual([
      [T.Name, "A"],
      [T.Op, ":"],
      [T.Ref, "B1"],
      [T.End, ""],
    ]);
  });

  it.each([
    ["1:3", rows(0, 2)],
    ["$1:$3", rows(0, 2, true, true)],
    ["1:$3", rows(0, 2, false, true)],
    ["$1:3", rows(0, 2, true, false)],
    ["1048576:1048576", rows(1048575, 1048575)],
    ["1:1048576", rows(0, 1048575)],
    ["5:1", rows(4, 0)],
  ])("whole rows %s", (text, ref) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Ref, 0, text.length, { ref }), end(text.length)]);
  });

  it.each([
    ["1:1048577", "1048577"],
    ["0:1", "1"],
    ["1:0", "0"],
    ["1:10000000", "10000000"],
    ["1048577:2", "2"],
  ])("%s, outside the grid, is number : number", (text, second) => {
    const first = text.slice(0, text.indexOf(":"));
    expect(tokenize(text)).toStrictEqual([
      tk(T.Num, 0, first.length, { value: Number(first) }),
      tk(T.Op, first.length, first.length + 1, { value: ":" }),
      tk(T.Num, first.length + 1, text.length, { value: Number(second) }),
      end(text.length),
    ]);
  });

  it("at most seven digits in a whole-row corner", () => {
    expect(tokenize("0000001:2")).toStrictEqual([tk(T.Ref, 0, 9, { ref: rows(0, 1) }), end(9)]);
    expect(tokenize("00000001:2")).toStrictEqual([tk(T.Num, 0, 8, { value: 1 }), tk(T.Op, 8, 9, { value: ":" }), tk(T.Num, 9, 10, { value: 2 }), end(10)]);
  });

  it("a whole-row range followed by more of a word is not one", () => {
    expect(kinds("1:3A")).toStrictEqual([
      [T.Num, "1"],
      [T.Op, ":"],
      [T.Num, "3"],
      [T.Name, "A"],
      [T.End, ""],
    ]);
  });
});

describe("lexer: sheet-qualified references and names", () => {
  // ECMA-376 Part 1 §18.17.2.3, as Office writes it (MS-OI29500 §2.1.863): single-sheet-prefix is a
  // sheet name, or one in apostrophes with '' for an apostrophe, then "!"; then an A1-reference.
  it.each([
    ["Sheet1!A1", cell(0, 0), "Sheet1"],
    ["Soil.Data!$B$2", cell(1, 1, true, true), "Soil.Data"],
    ["LAB1!A1", cell(0, 0), "LAB1"],
    ["2019!C3", cell(2, 2), "2019"],
    ["TRUE!A1", cell(0, 0), "TRUE"],
    ["'My Sheet'!$B$2", cell(1, 1, true, true), "My Sheet"],
    ["'It''s'!A1", cell(0, 0), "It's"],
    ["''''!A1", cell(0, 0), "'"],
    ["'a[1]'!A1", cell(0, 0), "a[1]"],
    ["Sheet1!A1:B2", area(0, 0, 1, 1), "Sheet1"],
    ["'Field A'!B:B", cols(1, 1), "Field A"],
    ["Sheet1!a:$c", cols(0, 2, false, true), "Sheet1"],
    ["Sheet1!XFD1048576", cell(1048575, 16383), "Sheet1"],
  ])("%s", (text, parts, sheet) => {
    expect(tokenize(text)).toStrictEqual([tk(T.Ref, 0, text.length, { ref: sheetRef(parts, sheet) }), end(text.length)]);
  });

  it("a whole-row range after a sheet name (Sheet1!1:3 is as valid as 1:3)", () => {
    expect(tokenize("Sheet1!1:3")).toStrictEqual([tk(T.Ref, 0, 10, { ref: sheetRef(rows(0, 2), "Sheet1") }), end(10)]);
    expect(tokenize("'Field A'!$2:$5+1")).toStrictEqual([
      tk(T.Ref, 0, 15, { ref: sheetRef(rows(1, 4, true, true), "Field A") }),
      tk(T.Op, 15, 16, { value: "+" }),
      tk(T.Num, 16, 17, { value: 1 }),
      end(17),
    ]);
  });

  it("the sheet prefix is part of the reference token; what follows starts after it", () => {
    expect(tokenize("Sheet1!A1+'S 2'!B2")).toStrictEqual([
      tk(T.Ref, 0, 9, { ref: sheetRef(cell(0, 0), "Sheet1") }),
      tk(T.Op, 9, 10, { value: "+" }),
      tk(T.Ref, 10, 18, { ref: sheetRef(cell(1, 1), "S 2") }),
      end(18),
    ]);
    expect(tokenize("A1+Sheet1!B2")).toStrictEqual([
      tk(T.Ref, 0, 2, { ref: cell(0, 0) }),
      tk(T.Op, 2, 3, { value: "+" }),
      tk(T.Ref, 3, 12, { ref: sheetRef(cell(1, 1), "Sheet1") }),
      end(12),
    ]);
    expect(tokenize(" Sheet1!A1")[0]).toStrictEqual(tk(T.Ref, 1, 10, { space: true, ref: sheetRef(cell(0, 0), "Sheet1") }));
  });

  it("a word after a sheet that is not a cell is a sheet-level name", () => {
    expect(tokenize("Sheet1!Rate*2")).toStrictEqual([tk(T.Name, 0, 11, { value: "Rate", sheet: "Sheet1" }), tk(T.Op, 11, 12, { value: "*" }), tk(T.Num, 12, 13, { value: 2 }), end(13)]);
    expect(tokenize("'My Sheet'!_Rate_2")).toStrictEqual([tk(T.Name, 0, 18, { value: "_Rate_2", sheet: "My Sheet" }), end(18)]);
    expect(tokenize("Sheet1!XFE1")).toStrictEqual([tk(T.Name, 0, 11, { value: "XFE1", sheet: "Sheet1" }), end(11)]);
  });

  it("#REF! after a sheet name is the error itself, in any case", () => {
    expect(tokenize("Sheet1!#REF!+1")).toStrictEqual([tk(T.Err, 0, 12, { value: "#REF!" }), tk(T.Op, 12, 13, { value: "+" }), tk(T.Num, 13, 14, { value: 1 }), end(14)]);
    expect(tokenize("'S'!#ref!")).toStrictEqual([tk(T.Err, 0, 9, { value: "#REF!" }), end(9)]);
  });

  it("a sheet name must be followed by a reference or a name", () => {
    expect(refusal("Sheet1!").message).toBe("a sheet name must be followed by a reference at 8");
    expect(refusal("Sheet1!1").message).toBe("a sheet name must be followed by a reference at 8");
    expect(refusal("1+Sheet1! A1").message).toBe("a sheet name must be followed by a reference at 10");
    expect(refusal("'My Sheet'!+1").message).toBe("a sheet name must be followed by a reference at 12");
    expect(refusal("Sheet1!#N/A").message).toBe("a sheet name must be followed by a reference at 8");
  });

  it("a quoted name must be closed and followed by !", () => {
    expect(refusal("'My Sheet").message).toBe("a quoted sheet name is not closed");
    expect(refusal("'It''s").message).toBe("a quoted sheet name is not closed");
    expect(refusal("'My Sheet'A1").message).toBe('a quoted name must be followed by "!" at 11');
    expect(refusal("1+'S'").message).toBe('a quoted name must be followed by "!" at 6');
  });

  it("a word, a colon and nothing before ! is not a 3-D prefix", () => {
    expect(refusal("Sheet1:!A1").message).toBe('unexpected character "!" at 8');
  });
});

describe("lexer: references the engine does not evaluate", () => {
  const THREE_D = "a 3-D reference across sheets";
  const EXTERNAL = "a reference to another workbook";
  const STRUCTURED = "a structured (table) reference";

  // ECMA-376 §18.17.2.3 / MS-OI29500 §2.1.863: sheet-range prefixes (Sheet1:Sheet3!) and
  // workbook-index prefixes ([1]); structured references are Office's own addition (§2.1.860 c).
  it.each([
    ["Sheet1:Sheet3!A1", THREE_D],
    ["Sheet1:Sheet3!$A$1:$B$2", THREE_D],
    ["'Sheet 1:Sheet 3'!A1:B2", THREE_D],
    ["'[1]Sheet 1'!A1", EXTERNAL],
    ["[1]Sheet1!A1", EXTERNAL],
    ["[1]Sheet1!$A$1:$B$2", EXTERNAL],
    ["[1]Sheet1!#REF!", EXTERNAL],
    ["[1]!Rate", EXTERNAL],
    ["[2]2019!B2", EXTERNAL],
    ["[Ca]", STRUCTURED],
    ["[@Ca]", STRUCTURED],
    ["[[#This Row],[Ca]]", STRUCTURED],
  ])("%s is one Unsupported token, up to what follows", (text, value) => {
    expect(tokenize(`${text}*2`)).toStrictEqual([
      tk(T.Unsupported, 0, text.length, { value }),
      tk(T.Op, text.length, text.length + 1, { value: "*" }),
      tk(T.Num, text.length + 1, text.length + 2, { value: 2 }),
      end(text.length + 2),
    ]);
  });

  it("a table's structured reference names the table", () => {
    expect(tokenize("Table1[Ca]")).toStrictEqual([tk(T.Unsupported, 0, 10, { value: STRUCTURED, table: "Table1" }), end(10)]);
    expect(tokenize("SUM(Table1[[#This Row],[Ca]])")).toStrictEqual([
      tk(T.Func, 0, 3, { value: "SUM" }),
      tk(T.LParen, 3, 4),
      tk(T.Unsupported, 4, 28, { value: STRUCTURED, table: "Table1" }),
      tk(T.RParen, 28, 29),
      end(29),
    ]);
  });

  it("a range between structured references is three tokens (the colon is not part of either)", () => {
    expect(tokenize("[@Ca]:[@Mg]")).toStrictEqual([
      tk(T.Unsupported, 0, 5, { value: STRUCTURED }),
      tk(T.Op, 5, 6, { value: ":" }),
      tk(T.Unsupported, 6, 11, { value: STRUCTURED }),
      end(11),
    ]);
    expect(kinds("Table1[Ca]:Table1[Mg]").map((k) => k[0])).toStrictEqual([T.Unsupported, T.Op, T.Unsupported, T.End]);
  });

  it("' escapes the next character inside brackets", () => {
    expect(tokenize("T[a'[b]+1")[0]).toStrictEqual(tk(T.Unsupported, 0, 7, { value: STRUCTURED, table: "T" }));
    expect(tokenize("T[a']b]+1")[0]).toStrictEqual(tk(T.Unsupported, 0, 7, { value: STRUCTURED, table: "T" }));
  });

  it("an unclosed [ is refused", () => {
    for (const text of ["Table1[Ca", "[Ca", "T[[a]", "T[a']", "[1"]) expect(refusal(text).message).toBe("a [ is not closed");
  });
});
