/**
 * The engine's scalar conversions, called directly (what formulas see is checked against
 * LibreOffice in the corpus case "conversions", tests/fixtures/corpus, run by
 * oracle-in-process.test.ts). Expected values name their source beside the check; the refusal
 * and error messages are the project's own rule, and the texts and numbers that exercise them
 * are invented.
 */
import { approxAdd, approxEqual, approxSub, compare, finite, numberToText, toBool, toNumber, toText } from "../../src/engine/formula/coerce";
import { NotComputed, notComputed } from "../../src/engine/formula/not-computed";
import { XlArray, XlError, XlRef, err } from "../../src/engine/formula/values";

const errorOf = (v: unknown): XlError => {
  expect(v).toBeInstanceOf(XlError);
  return v as XlError;
};

describe("toNumber", () => {
  it("blank is 0, TRUE 1, FALSE 0 (LibreOffice, corpus conversions C!B3 1/blank and C!B4 1/FALSE are #DIV/0!; booleans-errors S!B1 TRUE+1 is 2)", () => {
    expect(toNumber(null)).toBe(0);
    expect(toNumber(true)).toBe(1);
    expect(toNumber(false)).toBe(0);
    expect(toNumber("1.5E3")).toBe(1500); // corpus conversions C!B1 (LibreOffice)
    expect(toNumber("2e-2")).toBe(0.02); // C!B2
  });

  it("an error value stays itself (LibreOffice, corpus booleans-errors S!B11: #N/A+1 is #N/A)", () => {
    const na = err("#N/A", "no match");
    expect(toNumber(na)).toBe(na);
  });

  it('text that is no number is #VALUE! naming the text (LibreOffice, corpus booleans-errors S!B20: "a"+1; message: project rule)', () => {
    const e = errorOf(toNumber("n.d."));
    expect(e.code).toBe("#VALUE!");
    expect(e.message).toBe('text "n.d." is not a number');
  });

  it("a long text is cut to its first 40 characters in the message; 40 characters are shown whole (project rule)", () => {
    const forty = "x".repeat(39) + "y";
    expect(errorOf(toNumber(forty)).message).toBe(`text "${forty}" is not a number`);
    const e = errorOf(toNumber(`${forty}Z`));
    expect(e.message).toBe(`text "${forty}…" is not a number`);
    expect(e.message).not.toContain("Z");
  });

  it("locale-dependent text is not computed, with the text (cut at 40 characters) and the reason (project rule)", () => {
    const long = `1,234${"0".repeat(40)}`;
    let thrown: unknown;
    try {
      toNumber(long);
    } catch (e) {
      thrown = e;
    }
    expect(thrown).toBeInstanceOf(NotComputed);
    const m = (thrown as Error).message;
    expect(m).toContain(`text "${long.slice(0, 40)}…"`);
    expect(m).toContain("locale");
    expect(() => toNumber("1,234")).toThrow(/text "1,234" is not read as a number headless/);
  });
});

describe("numberToText (Excel writes at most 15 significant digits)", () => {
  it.each([
    // Apache POI, NumberToTextConverter API documentation, table "IEEE 64-bit Double Rendering
    // Comparison", Excel column:
    [123.45678901234568, "123.456789012346"],
    [0.0000123456789012346, "1.23456789012346E-05"],
    [5.6789012345e-8, "0.000000056789012345"],
    [5.67890123456e-8, "5.67890123456E-08"],
    [9.999999999999123e-98, "9.99999999999912E-98"],
    // LibreOffice (corpus conversions C!B8, C!B11, C!B14):
    [1e15, "1000000000000000"],
    [1e-10, "0.0000000001"],
    [-1.25e-12, "-0.00000000000125"],
    // From memory (Excel: plain up to 1E+19, E notation from 1E+20, e.g. 2^60 is
    // 1152921504606850000); agrees with Apache POI's documented 20-character rule:
    [1e19, "10000000000000000000"],
    [2 ** 60, "1152921504606850000"],
    [1e20, "1E+20"],
    [1.5e20, "1.5E+20"],
    [1.05e20, "1.05E+20"],
    [-1.5e20, "-1.5E+20"],
    [2 ** 70, "1.18059162071741E+21"],
    [0, "0"],
  ])("%p is %p", (n, text) => {
    expect(numberToText(n)).toBe(text);
  });

  it("a value no cell can hold is written as #NUM! (the engine's guard; finite() never lets one into a cell)", () => {
    expect(numberToText(Infinity)).toBe("#NUM!");
    expect(numberToText(NaN)).toBe("#NUM!");
  });
});

describe("toText", () => {
  it('logical values are "TRUE" and "FALSE", blank is "" (from memory: Excel\'s =TRUE&"" is TRUE; LibreOffice, which has no logical type, writes 1)', () => {
    expect(toText(true)).toBe("TRUE");
    expect(toText(false)).toBe("FALSE");
    expect(toText(null)).toBe("");
    expect(toText("Mehlich-3")).toBe("Mehlich-3");
    expect(toText(0)).toBe("0"); // corpus conversions C!B7: 0&"x" is 0x (LibreOffice)
  });
  it("an error stays that error (an error in an operand is the result: Microsoft Support, 'How to correct a #VALUE! error': from memory)", () => {
    const e = err("#N/A", "no match");
    expect(toText(e)).toBe(e);
  });
});

describe("toBool", () => {
  it("blank is FALSE, 0 FALSE, other numbers TRUE (LibreOffice: corpus empty-refs S!B10 IF(blank), conversions C!B16 IF(2), C!B17 IF(0), C!B18 NOT(0))", () => {
    expect(toBool(null)).toBe(false);
    expect(toBool(0)).toBe(false);
    expect(toBool(2)).toBe(true);
    expect(toBool(-0.5)).toBe(true);
    expect(toBool(true)).toBe(true);
  });

  it('text TRUE/FALSE in any case, spaces around ignored (LibreOffice: corpus conversions C!B20 NOT("TRUE"), C!B21 NOT("false"), C!B43 NOT(" TRUE "))', () => {
    expect(toBool("TRUE")).toBe(true);
    expect(toBool("false")).toBe(false);
    expect(toBool(" TRUE ")).toBe(true);
    expect(toBool("True")).toBe(true);
  });

  it('other text is #VALUE! naming the text, cut at 40 characters (LibreOffice: corpus conversions C!B19 IF("abc"); message: project rule)', () => {
    const e = errorOf(toBool("yes"));
    expect(e.code).toBe("#VALUE!");
    expect(e.message).toBe('text "yes" is not TRUE or FALSE');
    const forty = "n".repeat(40);
    expect(errorOf(toBool(forty)).message).toBe(`text "${forty}" is not TRUE or FALSE`);
    expect(errorOf(toBool(`${forty}!`)).message).toBe(`text "${forty}…" is not TRUE or FALSE`);
    const na = err("#N/A");
    expect(toBool(na)).toBe(na);
  });
});

describe("nearly equal numbers (the engine's tolerance of 2^-48 relative; boundary probes of its own rule)", () => {
  it("equal within the tolerance, not at it", () => {
    expect(approxEqual(1, 1 + 2 ** -49)).toBe(true);
    expect(approxEqual(1 + 2 ** -49, 1)).toBe(true);
    expect(approxEqual(1, 1 + 2 ** -48)).toBe(false);
    expect(approxEqual(0, 1e-300)).toBe(false);
    expect(approxEqual(1e-300, 0)).toBe(false);
    expect(approxEqual(0.1 + 0.2, 0.3)).toBe(true); // corpus conversions C!B22, C!B40 (LibreOffice)
    expect(approxEqual(0.3, -0.3)).toBe(false);
  });

  it("a sum or difference that only reflects rounding noise is 0 (LibreOffice: corpus conversions C!B23, C!B24); others are exact", () => {
    expect(approxAdd(0.1 + 0.2, -0.3)).toBe(0);
    expect(approxAdd(-0.3, 0.1 + 0.2)).toBe(0);
    expect(approxAdd(0.1 + 0.2, 0.3)).toBeCloseTo(0.6, 15); // C!B41
    expect(approxAdd(2, 2)).toBe(4);
    expect(approxAdd(2, -3)).toBe(-1);
    expect(approxSub(0.1 + 0.2, 0.3)).toBe(0);
    expect(approxSub(-0.3, -(0.1 + 0.2))).toBe(0);
    expect(approxSub(5, 2)).toBe(3);
    expect(approxSub(2, -2)).toBe(4);
  });
});

describe("compare", () => {
  it("an error on either side is the result (LibreOffice: corpus conversions C!B25 #N/A=1, C!B26 1=#N/A)", () => {
    const na = err("#N/A");
    expect(compare(na, 1)).toBe(na);
    expect(compare(1, na)).toBe(na);
  });

  it("blank takes the other side's type (LibreOffice: corpus conversions C!B27 to C!B34, C!B44)", () => {
    expect(compare(null, null)).toBe(0);
    expect(compare(null, 5)).toBe(-1);
    expect(compare(5, null)).toBe(1);
    expect(compare(null, 0)).toBe(0);
    expect(compare("a", null)).toBe(1);
    expect(compare(null, "a")).toBe(-1);
    expect(compare("", null)).toBe(0);
    expect(compare(null, false)).toBe(0);
    expect(compare(false, null)).toBe(0);
    expect(compare(null, true)).toBe(-1);
    expect(compare(true, null)).toBe(1);
  });

  it("numbers before text before FALSE before TRUE (Microsoft, WorksheetFunction.Match method (Excel): ascending order is ...-2, -1, 0, 1, 2, ..., A-Z, FALSE, TRUE; comparison operators use the same order, from memory — LibreOffice differs, its TRUE is 1)", () => {
    expect(compare("a", 5)).toBe(1); // also LibreOffice, corpus conversions C!B35
    expect(compare(5, "a")).toBe(-1);
    expect(compare(true, 1)).toBe(1);
    expect(compare(false, "zz")).toBe(1);
    expect(compare("zz", false)).toBe(-1);
    expect(compare("a", true)).toBe(-1);
    expect(compare(false, true)).toBe(-1); // corpus conversions C!B37
    expect(compare(true, false)).toBe(1);
    expect(compare(true, true)).toBe(0);
  });

  it("text ignores case (LibreOffice: corpus conversions C!B38, C!B39)", () => {
    expect(compare("b", "a")).toBe(1);
    expect(compare("a", "b")).toBe(-1);
    expect(compare("B", "a")).toBe(1);
    expect(compare("Ca", "cA")).toBe(0);
  });
});

describe("finite", () => {
  it("a finite result passes, -0 becomes 0, overflow is #NUM! naming what overflowed (message: project rule)", () => {
    expect(finite(2.5)).toBe(2.5);
    expect(Object.is(finite(-0), 0)).toBe(true);
    const e = errorOf(finite(Infinity));
    expect(e.code).toBe("#NUM!");
    expect(e.message).toBe("the result is not a finite number");
    expect(errorOf(finite(NaN, "the lime rate")).message).toBe("the lime rate is not a finite number");
  });
});

describe("values", () => {
  it("an error's text is its code, then its message when it has one", () => {
    expect(new XlError("#N/A").message).toBe("");
    expect(err("#N/A").message).toBe("");
    expect(String(err("#N/A"))).toBe("#N/A");
    expect(String(err("#VALUE!", 'text "x" is not a number'))).toBe('#VALUE! text "x" is not a number');
  });

  it("arrays are row-major with exactly rows × cols elements", () => {
    const a = XlArray.of([
      [1, 2],
      [3, 4],
    ]);
    expect(a.data).toStrictEqual([1, 2, 3, 4]);
    expect(a.data).toHaveLength(4);
    expect(a.at(1, 0)).toBe(3);
    const f = XlArray.fill(2, 3, "x");
    expect([f.rows, f.cols, f.data]).toEqual([2, 3, ["x", "x", "x", "x", "x", "x"]]);
  });

  it("a reference is one cell only when both corners are the same cell", () => {
    expect(new XlRef(0, 1, 1, 1, 1).isCell).toBe(true);
    expect(new XlRef(0, 1, 1, 1, 2).isCell).toBe(false);
    expect(new XlRef(0, 1, 1, 2, 1).isCell).toBe(false);
  });

  it("NotComputed is thrown, never returned, and names itself", () => {
    expect(() => notComputed("why")).toThrow(NotComputed);
    expect(new NotComputed("why").name).toBe("NotComputed");
  });
});
