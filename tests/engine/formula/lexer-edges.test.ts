/**
 * The formula lexer, token by token (a second set, written beside lexer.test.ts): kinds, offsets, values, reference parts and every refusal.
 * Formulas are invented to exercise each branch. Syntax as Excel stores it: ECMA-376 Part 1
 * (5th edition, 2016), §18.17 "Formulas" (the grammar of cell references, sheet prefixes, error
 * literals, array constants and operators); the grid, 16,384 columns (XFD) by 1,048,576 rows, from
 * Microsoft Support, "Excel specifications and limits".
 */
import { FormulaSyntaxError, T, Token, tokenize } from "../../../src/engine/formula/lexer";

/** The tokens without the final End, as plain objects. */
const toks = (text: string): Token[] => {
  const all = tokenize(text);
  const end = all[all.length - 1] as Token;
  expect(end).toEqual({ t: T.End, start: text.length, end: text.length, space: false });
  return all.slice(0, -1);
};
const kinds = (text: string) => toks(text).map((t) => t.t);
const one = (text: string): Token => {
  const all = toks(text);
  expect(all).toHaveLength(1);
  return all[0] as Token;
};
const cell = (r: number, c: number, ra = false, ca = false) => ({ r1: r, c1: c, r2: r, c2: c, ra1: ra, ca1: ca, ra2: ra, ca2: ca, range: false });
const refused = (text: string, words: RegExp) => {
  expect(() => tokenize(text)).toThrow(FormulaSyntaxError);
  expect(() => tokenize(text)).toThrow(words);
};

describe("lexer: literals", () => {
  it("refusals are FormulaSyntaxError by name too (the evaluator tells them from other errors)", () => {
    try {
      tokenize('"open');
      throw new Error("no refusal");
    } catch (e) {
      expect((e as Error).name).toBe("FormulaSyntaxError");
      expect(e).toBeInstanceOf(FormulaSyntaxError);
    }
  });
  it("numbers in every written form, with offsets", () => {
    expect(one("12")).toEqual({ t: T.Num, start: 0, end: 2, space: false, value: 12 });
    expect(one("1.5")).toMatchObject({ t: T.Num, end: 3, value: 1.5 });
    expect(one("7.")).toMatchObject({ t: T.Num, end: 2, value: 7 });
    expect(one(".25")).toMatchObject({ t: T.Num, end: 3, value: 0.25 });
    expect(one("1E3")).toMatchObject({ t: T.Num, end: 3, value: 1000 });
    expect(one("2.5e-3")).toMatchObject({ t: T.Num, end: 6, value: 0.0025 });
    expect(one("4E+2")).toMatchObject({ t: T.Num, end: 4, value: 400 });
    // An exponent without digits is not part of the number: "1E" is 1 then a name.
    expect(toks("1E")).toEqual([
      { t: T.Num, start: 0, end: 1, space: false, value: 1 },
      { t: T.Name, start: 1, end: 2, space: false, value: "E" },
    ]);
    expect(toks("1.5.5").map((t) => [t.t, t.value])).toEqual([
      [T.Num, 1.5],
      [T.Num, 0.5],
    ]);
  });
  it("a lone dot is no number", () => {
    refused(".", /unexpected character "\." at 1/);
    refused("1+.", /unexpected character "\." at 3/);
  });
  it("strings keep their text, with doubled quotes as one", () => {
    expect(one('"mg/kg"')).toEqual({ t: T.Str, start: 0, end: 7, space: false, value: "mg/kg" });
    expect(one('""')).toMatchObject({ t: T.Str, end: 2, value: "" });
    expect(one('"say ""Ca"""')).toMatchObject({ t: T.Str, end: 12, value: 'say "Ca"' });
    expect(one('"""x"')).toMatchObject({ value: '"x' });
    expect(one('"A1 SUM( #N/A"')).toMatchObject({ t: T.Str, value: "A1 SUM( #N/A" }); // nothing inside is read
    refused('"open', /a string is not closed/);
    refused('"a""', /a string is not closed/);
  });
  it("booleans in any case; longer words are names", () => {
    expect(one("TRUE")).toEqual({ t: T.Bool, start: 0, end: 4, space: false, value: true });
    expect(one("false")).toMatchObject({ t: T.Bool, value: false });
    expect(one("True")).toMatchObject({ t: T.Bool, value: true });
    expect(one("TRUEX")).toMatchObject({ t: T.Name, value: "TRUEX" });
    expect(one("FALSE_1")).toMatchObject({ t: T.Name, value: "FALSE_1" });
    expect(toks("TRUE()")[0]).toMatchObject({ t: T.Func, value: "TRUE" });
  });
  it.each(["#NULL!", "#DIV/0!", "#VALUE!", "#REF!", "#NAME?", "#NUM!", "#N/A", "#GETTING_DATA", "#SPILL!", "#CALC!", "#FIELD!", "#BLOCKED!", "#CONNECT!", "#BUSY!", "#UNKNOWN!", "#PYTHON!"])(
    "error literal %s (any case)",
    (code) => {
      expect(one(code)).toEqual({ t: T.Err, start: 0, end: code.length, space: false, value: code });
      expect(one(code.toLowerCase())).toMatchObject({ t: T.Err, value: code });
    },
  );
  it("an error literal stops where its code ends", () => {
    expect(toks("#N/A+1").map((t) => [t.t, t.start, t.end])).toEqual([
      [T.Err, 0, 4],
      [T.Op, 4, 5],
      [T.Num, 5, 6],
    ]);
  });
  it("a # that starts no error code is refused, with its place", () => {
    refused("#NOPE!", /unexpected "#" at 1/);
    refused("1+#", /unexpected "#" at 3/);
    refused("#N/", /unexpected "#" at 1/);
  });
});

describe("lexer: the spill operator", () => {
  it("# right after a reference, a name or a closing parenthesis is the spill operator", () => {
    expect(toks("A1#")).toEqual([
      { t: T.Ref, start: 0, end: 2, space: false, ref: cell(0, 0) },
      { t: T.Hash, start: 2, end: 3, space: false },
    ]);
    expect(kinds("Lab#")).toEqual([T.Name, T.Hash]);
    expect(kinds("(A1)#")).toEqual([T.LParen, T.Ref, T.RParen, T.Hash]);
  });
  it("after a space, a number or an operator, # starts an error literal", () => {
    refused("A1 #", /unexpected "#" at 4/);
    expect(kinds("A1 #N/A")).toEqual([T.Ref, T.Err]);
    refused("1#", /unexpected "#" at 2/);
    expect(kinds("1+#N/A")).toEqual([T.Num, T.Op, T.Err]);
  });
});

describe("lexer: references", () => {
  it("a cell in every absolute form", () => {
    expect(one("B3")).toEqual({ t: T.Ref, start: 0, end: 2, space: false, ref: cell(2, 1) });
    expect(one("$B$3").ref).toEqual(cell(2, 1, true, true));
    expect(one("B$3").ref).toEqual(cell(2, 1, true, false));
    expect(one("$B3").ref).toEqual(cell(2, 1, false, true));
    expect(one("b3").ref).toEqual(cell(2, 1));
    expect(one("AA10").ref).toEqual(cell(9, 26));
  });
  it("the grid's last cell is a reference; one past it in either direction is a name", () => {
    expect(one("XFD1048576")).toMatchObject({ t: T.Ref, end: 10, ref: cell(1048575, 16383) });
    expect(one("XFE1")).toMatchObject({ t: T.Name, value: "XFE1" });
    expect(one("A1048577")).toMatchObject({ t: T.Name, value: "A1048577" });
    expect(one("A0")).toMatchObject({ t: T.Name, value: "A0" });
    expect(one("ABCD1")).toMatchObject({ t: T.Name, value: "ABCD1" }); // four letters: no column
    expect(one("A12345678")).toMatchObject({ t: T.Name }); // eight digits: no row
  });
  it("a word that goes on after the cell form is a name or a function", () => {
    expect(one("A1[Ca]")).toEqual({ t: T.Unsupported, start: 0, end: 6, space: false, value: "a structured (table) reference", table: "A1" });
    expect(one("A1B")).toMatchObject({ t: T.Name, value: "A1B" });
    expect(one("A1_")).toMatchObject({ t: T.Name, value: "A1_" });
    expect(one("A1.x")).toMatchObject({ t: T.Name, value: "A1.x" });
    expect(toks("LOG10(2)")[0]).toEqual({ t: T.Func, start: 0, end: 5, space: false, value: "LOG10" });
  });
  it("ranges of cells, with each corner's flags", () => {
    expect(one("A1:$C$4")).toEqual({
      t: T.Ref,
      start: 0,
      end: 7,
      space: false,
      ref: { r1: 0, c1: 0, r2: 3, c2: 2, ra1: false, ca1: false, ra2: true, ca2: true, range: true },
    });
    expect(one("$A1:C$4").ref).toEqual({ r1: 0, c1: 0, r2: 3, c2: 2, ra1: false, ca1: true, ra2: true, ca2: false, range: true });
    // A second corner outside the grid, or going on as a name: the first cell alone, then ":".
    expect(kinds("A1:XFE4")).toEqual([T.Ref, T.Op, T.Name]);
    expect(kinds("A1:B2C")).toEqual([T.Ref, T.Op, T.Name]);
  });
  it("whole columns and whole rows", () => {
    expect(one("A:C")).toEqual({ t: T.Ref, start: 0, end: 3, space: false, ref: { c1: 0, c2: 2, ca1: false, ca2: false, ra1: true, ra2: true, range: true } });
    expect(one("$A:$XFD").ref).toEqual({ c1: 0, c2: 16383, ca1: true, ca2: true, ra1: true, ra2: true, range: true });
    expect(kinds("A:XFE")).toEqual([T.Name, T.Op, T.Name]);
    expect(one("2:5")).toEqual({ t: T.Ref, start: 0, end: 3, space: false, ref: { r1: 1, r2: 4, ra1: false, ra2: false, ca1: true, ca2: true, range: true } });
    expect(one("$2:$1048576").ref).toEqual({ r1: 1, r2: 1048575, ra1: true, ra2: true, ca1: true, ca2: true, range: true });
    expect(one("2:$5").ref).toMatchObject({ ra1: false, ra2: true });
    expect(kinds("1:1048577")).toEqual([T.Num, T.Op, T.Num]);
    expect(kinds("0:3")).toEqual([T.Num, T.Op, T.Num]);
    expect(kinds("3:")).toEqual([T.Num, T.Op]);
    expect(kinds("3:A")).toEqual([T.Num, T.Op, T.Name]);
    expect(kinds("1:2B")).toEqual([T.Num, T.Op, T.Num, T.Name]);
    expect(one("Jan:Mar")).toMatchObject({ t: T.Ref, ref: { c1: 6799, c2: 8831 } }); // three letters each: columns JAN (10·676 + 26 + 14 = 6800th) to MAR (8832nd)
  });
  it("a $ that starts no reference is refused", () => {
    refused("$", /unexpected "\$" at 1/);
    refused("1+$x", /unexpected "\$" at 3/);
    refused("$A", /unexpected "\$" at 1/);
  });
  it("sheet prefixes, plain and quoted", () => {
    expect(one("Lab!B2")).toEqual({ t: T.Ref, start: 0, end: 6, space: false, ref: { ...cell(1, 1), sheet: "Lab" } });
    expect(one("'Lab 2025'!A1:B2")).toMatchObject({ t: T.Ref, end: 16, ref: { sheet: "Lab 2025", range: true, r2: 1, c2: 1 } });
    expect(one("'O''Hara'!A1").ref).toMatchObject({ sheet: "O'Hara" });
    expect(one("Lab!A:A").ref).toMatchObject({ sheet: "Lab", c1: 0, c2: 0 });
    expect(one("Lab!limits")).toEqual({ t: T.Name, start: 0, end: 10, space: false, value: "limits", sheet: "Lab" });
    expect(toks("Lab!pH+1").map((t) => [t.t, t.end])).toEqual([
      [T.Name, 6],
      [T.Op, 7],
      [T.Num, 8],
    ]);
    expect(one("Lab!#REF!")).toEqual({ t: T.Err, start: 0, end: 9, space: false, value: "#REF!" });
    expect(one("Lab!#ref!")).toMatchObject({ t: T.Err, value: "#REF!" });
    expect(one("LAB1!A1")).toMatchObject({ t: T.Ref, ref: { sheet: "LAB1", r1: 0, c1: 0 } }); // a sheet named like a cell
    expect(one("2025!A1").ref).toMatchObject({ sheet: "2025" });
  });
  it("a sheet prefix must be followed by a reference, a name or #REF!", () => {
    refused("Lab!", /a sheet name must be followed by a reference at 5/);
    refused("Lab!1", /a sheet name must be followed by a reference at 5/);
    refused("'Lab'!+1", /a sheet name must be followed by a reference at 7/);
  });
  it("a quoted name needs its closing quote and then !", () => {
    refused("'Lab", /a quoted sheet name is not closed/);
    refused("'Lab''", /a quoted sheet name is not closed/);
    refused("'Lab'A1", /a quoted name must be followed by "!" at 6/);
  });
  it("3-D, external and structured references are read whole and marked unsupported", () => {
    expect(one("Sheet1:Sheet3!B2")).toEqual({ t: T.Unsupported, start: 0, end: 16, space: false, value: "a 3-D reference across sheets" });
    expect(one("'Jan:Mar'!B2:C3")).toMatchObject({ t: T.Unsupported, end: 15, value: "a 3-D reference across sheets" });
    expect(one("'[1]Lab'!$A$1")).toMatchObject({ t: T.Unsupported, end: 13, value: "a reference to another workbook" });
    expect(one("[1]Lab!A1")).toMatchObject({ t: T.Unsupported, end: 9, value: "a reference to another workbook" });
    expect(one("[1]!Limits")).toMatchObject({ t: T.Unsupported, end: 10, value: "a reference to another workbook" });
    expect(one("[2]3!A1")).toMatchObject({ t: T.Unsupported, end: 7 });
    expect(one("[@Ca]")).toEqual({ t: T.Unsupported, start: 0, end: 5, space: false, value: "a structured (table) reference" });
    expect(one("Samples[Ca]")).toEqual({ t: T.Unsupported, start: 0, end: 11, space: false, value: "a structured (table) reference", table: "Samples" });
    expect(one("Samples[[#This Row],[Ca]]")).toMatchObject({ t: T.Unsupported, end: 25, table: "Samples" });
    expect(one("Samples['[x]")).toMatchObject({ t: T.Unsupported, end: 12 }); // ' escapes a bracket inside
    expect(one("Samples[a[b]c]")).toMatchObject({ t: T.Unsupported, end: 14 }); // nested brackets counted
    expect(toks("[@Ca]+1").map((t) => t.t)).toEqual([T.Unsupported, T.Op, T.Num]);
    expect(toks("Sheet1:Sheet3!B2+1").map((t) => [t.t, t.end])).toEqual([
      [T.Unsupported, 16],
      [T.Op, 17],
      [T.Num, 18],
    ]);
    // The body after a 3-D prefix runs over name characters, $, :, ! and #, no further.
    expect(one("Sheet1:Sheet3!$B$2:C#")).toMatchObject({ end: 21 });
    expect(one("Sheet1:Sheet3!B2!C")).toMatchObject({ end: 18 });
    expect(toks("Sheet1:Sheet3!B2 +1")[0]).toMatchObject({ end: 16 });
    expect(toks("Sheet1:Sheet3!B2,1")[0]).toMatchObject({ end: 16 });
    refused("Samples[Ca", /a \[ is not closed/);
    refused("[1", /a \[ is not closed/);
  });
  it("a word and a colon without ! is no 3-D prefix", () => {
    expect(kinds("Sheet1:Sheet3")).toEqual([T.Name, T.Op, T.Name]);
    expect(kinds("Sheet1:")).toEqual([T.Name, T.Op]);
    expect(kinds("Sheet1:+1")).toEqual([T.Name, T.Op, T.Op, T.Num]);
    expect(kinds("A:B1")).toEqual([T.Name, T.Op, T.Ref]);
  });
});

describe("lexer: names, functions and operators", () => {
  it("names may hold letters of any script, digits, _ . \\ and ?; they start with a letter, _ or \\", () => {
    expect(one("pH_target")).toMatchObject({ t: T.Name, end: 9, value: "pH_target" });
    expect(one("\\limit")).toMatchObject({ t: T.Name, value: "\\limit" });
    expect(one("_x.y?z")).toMatchObject({ t: T.Name, value: "_x.y?z" });
    expect(one("Ñandú")).toMatchObject({ t: T.Name, value: "Ñandú" });
    expect(one("kg·ha")).toMatchObject({ t: T.Name, value: "kg·ha" });
    refused("?a", /unexpected character "\?" at 1/);
    refused("\u007f", /unexpected character "\u007f" at 1/); // DEL, the last ASCII code, starts no name
    expect(one("\u0080x")).toMatchObject({ t: T.Name, value: "\u0080x" }); // the first code past ASCII does
  });
  it("a function name is a word followed by (, also after spaces, but not inside an array constant", () => {
    expect(toks("SOIL.CEC(1)").map((t) => [t.t, t.start, t.end, t.value])).toEqual([
      [T.Func, 0, 8, "SOIL.CEC"],
      [T.LParen, 8, 9, undefined],
      [T.Num, 9, 10, 1],
      [T.RParen, 10, 11, undefined],
    ]);
    expect(toks("SUM\t(1)")[0]).toMatchObject({ t: T.Func, end: 3, value: "SUM" });
    expect(kinds("{x(1)}")).toEqual([T.LBrace, T.Name, T.LParen, T.Num, T.RParen, T.RBrace]);
    expect(kinds("{1}+x(1)")).toEqual([T.LBrace, T.Num, T.RBrace, T.Op, T.Func, T.LParen, T.Num, T.RParen]);
  });
  it("every operator, with two-character comparisons read whole", () => {
    const ops = toks("1+2-3*4/5^6&7=8<9>1%:@").filter((t) => t.t === T.Op).map((t) => t.value);
    expect(ops).toEqual(["+", "-", "*", "/", "^", "&", "=", "<", ">", "%", ":", "@"]);
    expect(toks("1<=2>=3<>4").filter((t) => t.t === T.Op).map((t) => [t.value, t.start, t.end])).toEqual([
      ["<=", 1, 3],
      [">=", 4, 6],
      ["<>", 7, 9],
    ]);
    expect(toks("1=<2").filter((t) => t.t === T.Op).map((t) => t.value)).toEqual(["=", "<"]);
    expect(toks("1<>2")[1]).toEqual({ t: T.Op, start: 1, end: 3, space: false, value: "<>" });
  });
  it("punctuation tokens and their offsets", () => {
    expect(toks("(1,2)")).toEqual([
      { t: T.LParen, start: 0, end: 1, space: false },
      { t: T.Num, start: 1, end: 2, space: false, value: 1 },
      { t: T.Comma, start: 2, end: 3, space: false },
      { t: T.Num, start: 3, end: 4, space: false, value: 2 },
      { t: T.RParen, start: 4, end: 5, space: false },
    ]);
    expect(toks("{1;2}")).toEqual([
      { t: T.LBrace, start: 0, end: 1, space: false },
      { t: T.Num, start: 1, end: 2, space: false, value: 1 },
      { t: T.Semi, start: 2, end: 3, space: false },
      { t: T.Num, start: 3, end: 4, space: false, value: 2 },
      { t: T.RBrace, start: 4, end: 5, space: false },
    ]);
  });
  it('";" separates rows only inside an array constant', () => {
    refused("SUM(1;2)", /";" is not an argument separator in a stored formula \(use ","\), at 6/);
    refused("{1};2", /";" is not an argument separator/);
    expect(kinds("{{1;2}}")).toContain(T.Semi);
  });
  it("characters no formula uses are refused with their place", () => {
    refused("1~2", /unexpected character "~" at 2/);
    refused("A1 ]", /unexpected character "]" at 4/);
    refused("1|2", /unexpected character "\|" at 2/);
  });
});

describe("lexer: whitespace", () => {
  it("space, tab, CR, LF and no-break space mark the next token; other characters do not count as space", () => {
    for (const ws of [" ", "\t", "\r", "\n", "\u00a0"]) {
      expect(toks(`1${ws}+2`).map((t) => t.space)).toEqual([false, true, false]);
      expect(toks(`1${ws}+2`)[1]).toMatchObject({ start: 2, end: 3 });
    }
    expect(() => tokenize("1\u000b+2")).toThrow(/unexpected character/);
  });
  it("leading and trailing space: the first token knows, End comes at the very end", () => {
    expect(tokenize("  A1  ")).toEqual([
      { t: T.Ref, start: 2, end: 4, space: true, ref: cell(0, 0) },
      { t: T.End, start: 6, end: 6, space: false },
    ]);
    expect(tokenize("")).toEqual([{ t: T.End, start: 0, end: 0, space: false }]);
    expect(tokenize("   ")).toEqual([{ t: T.End, start: 3, end: 3, space: false }]);
  });
  it("the intersection operator is a space between references", () => {
    expect(toks("A1:B2 B1:B3").map((t) => [t.t, t.space])).toEqual([
      [T.Ref, false],
      [T.Ref, true],
    ]);
  });
});
