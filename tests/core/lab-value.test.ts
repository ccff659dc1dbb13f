/**
 * SOIL.LABVALUE's core (issue 22 point 6): a lab's censored or locally formatted result becomes a
 * number only by a policy the consultant names. The substitution policies (the limit, half of it,
 * zero) are those compared by Floit, Mahoney, Batey & Petroff (1996) ASTM STP 1291, "Evaluation of
 * the use of substitution methods to represent nondetect data" (abstract seen at astm.org). The
 * cell texts are invented, in the forms lab exports use.
 */
import fc from "fast-check";
import { labReading, labValue, LAB_BELOW_POLICIES, LAB_ABOVE_POLICIES, LAB_DECIMAL_MARKS, LAB_WORDS } from "../../src/core/lab-value";
import { errorCode, errorMessage } from "../helpers/errors";

describe("below detection: \"<0.05\" by the policy named", () => {
  it.each([
    ["limit", 0.05],
    ["half", 0.025],
    ["zero", 0],
  ])("%s gives %d", (policy, expected) => {
    expect(labValue("<0.05", policy)).toBe(expected);
  });
  it("blank gives a blank (null), never 0", () => {
    expect(labValue("<0.05", "blank")).toBeNull();
  });
  it("without a policy it is MISSING_INPUT, and the message gives what each policy would return", () => {
    expect(errorCode(() => labValue("<0.05"))).toBe("MISSING_INPUT");
    expect(errorMessage(() => labValue("<0.05"))).toContain("limit (0.05), half (0.025), zero or blank");
  });
  it.each(["< 0.05", "<=0.05", "≤0.05", " <0.05 "])("%s is read the same way", (t) => {
    expect(labValue(t, "half")).toBe(0.025);
  });
  it("policy words are case-insensitive and have the usual aliases (LOD/2 is half)", () => {
    expect(labValue("<0.05", "HALF")).toBe(0.025);
    expect(labValue("<0.05", "lod/2")).toBe(0.025);
    expect(labValue("<0.05", "0")).toBe(0);
  });
  it("an unknown policy word is UNKNOWN_NAME listing the policies", () => {
    expect(errorCode(() => labValue("<0.05", "third"))).toBe("UNKNOWN_NAME");
    expect(LAB_BELOW_POLICIES).toEqual(["limit", "half", "zero", "blank"]);
  });
  it("a limit that is not above 0 is OUT_OF_RANGE", () => {
    expect(errorCode(() => labValue("<0", "half"))).toBe("OUT_OF_RANGE");
    expect(errorCode(() => labValue("<-1", "half"))).toBe("OUT_OF_RANGE");
  });
});

describe("above the range: \">300\"", () => {
  it("limit gives the limit (the least it can be); blank a blank", () => {
    expect(labValue(">300", undefined, "limit")).toBe(300);
    expect(labValue("> 300", undefined, "blank")).toBeNull();
    expect(labValue("≥300", undefined, "limit")).toBe(300);
  });
  it("without a policy it is MISSING_INPUT", () => {
    expect(errorCode(() => labValue(">300", "half"))).toBe("MISSING_INPUT");
  });
  it("half and zero are not policies for above (UNKNOWN_NAME)", () => {
    expect(errorCode(() => labValue(">300", undefined, "half"))).toBe("UNKNOWN_NAME");
    expect(LAB_ABOVE_POLICIES).toEqual(["limit", "blank"]);
  });
});

describe("words with no limit: n.d., trace", () => {
  it.each(["n.d.", "ND", "nd", "N.D.", "not detected", "Not Detected", "BDL", "<LOD", "< LOR", "trace", "Tr", "tr."])(
    "%s is below detection: zero gives 0, blank a blank",
    (t) => {
      expect(labValue(t, "zero")).toBe(0);
      expect(labValue(t, "blank")).toBeNull();
    },
  );
  it("limit and half cannot apply to a value that states no limit (NOT_APPLICABLE)", () => {
    expect(errorCode(() => labValue("n.d.", "half"))).toBe("NOT_APPLICABLE");
    expect(errorCode(() => labValue("trace", "limit"))).toBe("NOT_APPLICABLE");
    // The message quotes the cell as written, without the spaces around it.
    expect(errorMessage(() => labValue("  n.d. ", "half"))).toBe(
      'value "n.d." states no limit, so below "half" cannot be applied: have the lab\'s limit written as "<0.05", or choose zero or blank',
    );
  });
  it("without a policy it is MISSING_INPUT offering zero or blank", () => {
    expect(errorCode(() => labValue("n.d."))).toBe("MISSING_INPUT");
    expect(errorMessage(() => labValue("n.d."))).toContain("zero or blank");
  });
  it.each(["n.a.", "N/A", "not analysed", "Not analyzed"])("%s (not analysed) is a blank whatever the policy", (t) => {
    expect(labValue(t)).toBeNull();
  });
  it("a lone dash is refused: labs use it for 'not detected' and for 'not analysed'", () => {
    expect(errorCode(() => labValue("-", "zero"))).toBe("NOT_A_NUMBER");
  });
  it("other text is NOT_A_NUMBER listing the words read", () => {
    expect(errorCode(() => labValue("high", "zero"))).toBe("NOT_A_NUMBER");
    expect(errorMessage(() => labValue("high", "zero"))).toContain('"n.d."');
  });
});

describe("numbers as labs format them", () => {
  it("numbers pass unchanged, whatever the options", () => {
    expect(labValue(7.9)).toBe(7.9);
    expect(labValue(7.9, "half", "limit", ",")).toBe(7.9);
    expect(labValue(-0.02)).toBe(-0.02);
  });
  it("numeric text with a full stop reads as without LABVALUE", () => {
    expect(labValue("12.5")).toBe(12.5);
    expect(labValue("0.125")).toBe(0.125);
    expect(labValue(".5")).toBe(0.5);
    expect(labValue("1.2E-03")).toBeCloseTo(0.0012, 15);
  });
  it.each([
    ["1 250", 1250],
    ["1\u00a0250", 1250],
    ["1\u202f250\u202f000", 1250000],
    ["12 345.5", 12345.5],
  ])("%s (thousands grouped by a space) is %d", (t, v) => {
    expect(labValue(t)).toBe(v);
  });
  it("a comma without a stated decimal mark is refused, never guessed (NOT_A_NUMBER)", () => {
    expect(errorCode(() => labValue("12,5"))).toBe("NOT_A_NUMBER");
    expect(errorCode(() => labValue("1,250"))).toBe("NOT_A_NUMBER");
    expect(errorMessage(() => labValue("12,5"))).toContain('give decimal "," or "."');
  });
  it('"1.250" without a stated decimal mark is refused: 1.25 or 1250?', () => {
    expect(errorCode(() => labValue("1.250"))).toBe("NOT_A_NUMBER");
  });
  it("with decimal \",\": 12,5 is 12.5; 1.250,5 and 1 250,5 are 1250.5; 1.250 is 1250", () => {
    expect(labValue("12,5", undefined, undefined, ",")).toBe(12.5);
    expect(labValue("1.250,5", undefined, undefined, "comma")).toBe(1250.5);
    expect(labValue("1 250,5", undefined, undefined, ",")).toBe(1250.5);
    expect(labValue("1.250", undefined, undefined, ",")).toBe(1250);
  });
  it("with decimal \".\": 1,250.5 is 1250.5 and 1.250 is 1.25", () => {
    expect(labValue("1,250.5", undefined, undefined, ".")).toBe(1250.5);
    expect(labValue("1.250", undefined, undefined, "point")).toBe(1.25);
  });
  it("a censored value with a decimal comma: \"<0,05\" half is 0.025", () => {
    expect(labValue("<0,05", "half", undefined, ",")).toBe(0.025);
    expect(labReading("<0,05", ",")).toEqual({ kind: "below", limit: 0.05 });
  });
  it.each([
    ["12.5", ","],
    ["1 25", undefined],
    ["12,50,0", "."],
    ["1,2,3", ","],
    ["12.5 mg/kg", undefined],
  ])("%s with decimal %s is refused (NOT_A_NUMBER)", (t, mark) => {
    expect(errorCode(() => labValue(t, undefined, undefined, mark))).toBe("NOT_A_NUMBER");
  });
  it("an unknown decimal word is UNKNOWN_NAME", () => {
    expect(errorCode(() => labValue("12,5", undefined, undefined, ";"))).toBe("UNKNOWN_NAME");
    expect(LAB_DECIMAL_MARKS).toEqual([".", ","]);
  });
  it("property: any number written with a decimal comma and space-grouped thousands reads back (invented inputs)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 99_999_999 }), fc.integer({ min: 0, max: 999 }), (whole, frac) => {
        const grouped = whole.toString().replace(/\B(?=(\d{3})+(?!\d))/g, " ");
        const text = `${grouped},${String(frac).padStart(3, "0")}`;
        return labValue(text, undefined, undefined, ",") === Number(`${whole}.${String(frac).padStart(3, "0")}`);
      }),
    );
  });
  it("property: half is half of limit for every stated limit (invented inputs)", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e6, noNaN: true }), (x) => {
        const t = `<${x}`;
        return labValue(t, "half") === (labValue(t, "limit") as number) / 2;
      }),
    );
  });
});

// Mutation testing (issue 21): edges of the reader, each read whole. Inputs invented.
describe("reader edges", () => {
  it("a policy or mark given as spaces counts as not given", () => {
    expect(errorMessage(() => labValue("<0.05", "  "))).toBe('value "<0.05" is below detection: say how to count it with below: limit (0.05), half (0.025), zero or blank');
    expect(errorMessage(() => labValue(">300", undefined, "  "))).toBe('value ">300" is above the lab\'s range: say how to count it with above: limit (300, the least it can be) or blank');
    expect(errorMessage(() => labValue("12,5", undefined, undefined, "  "))).toMatch(/^value: "12,5" has a comma, which labs use both as a decimal mark/);
  });
  it("the value is quoted trimmed in the message", () => {
    expect(errorMessage(() => labValue("  >300 "))).toMatch(/^value ">300" is above the lab's range/);
  });
  it("signs, a leading decimal point and grouped thousands", () => {
    expect(labValue("-12.5")).toBe(-12.5);
    expect(labValue("-1 250")).toBe(-1250);
    expect(labValue("+.5")).toBe(0.5);
    expect(labValue("-.5")).toBe(-0.5);
    expect(labValue(".5")).toBe(0.5);
    expect(labValue("1  250")).toBe(1250);
    expect(labValue("1\u00a0250")).toBe(1250);
    expect(labValue("1.5e3")).toBe(1500);
  });
  it.each(["a<0.05", "n1", "+ x", "- -5", "1e5x", "1-2"])("%s is refused as not a number", (text) => {
    expect(errorCode(() => labValue(text))).toBe("NOT_A_NUMBER");
  });
  it("text after the decimals is refused with the mark named", () => {
    expect(errorMessage(() => labValue("12,5x", undefined, undefined, ","))).toBe('value: "12,5x" is not a number written with the decimal mark ","');
  });
  it("the refusal of an unreadable text lists the words it reads", () => {
    const m = errorMessage(() => labValue("n1"));
    for (const w of LAB_WORDS) expect(m).toContain(`"${w}"`);
  });
});

// Mutation testing (issue 21), second round: each refusal read whole, signs and marks at the
// edges, the ambiguous "1.250" pattern probed around it, and the empty cell. Inputs invented.
describe("reader edges, second round", () => {
  const msg = (f: () => unknown) => errorMessage(f);
  it("an empty or all-space cell is not analysed: blank, never 0", () => {
    expect(labReading("")).toEqual({ kind: "missing" });
    expect(labReading(" \u00a0 ")).toEqual({ kind: "missing" });
    expect(labValue("")).toBeNull();
  });
  it("a number cell that is not finite is refused", () => {
    expect(errorCode(() => labValue(NaN))).toBe("NOT_A_NUMBER");
    expect(msg(() => labValue(Infinity))).toBe("value is not a finite number");
  });
  it("a censoring sign with no number after it is refused as having none", () => {
    expect(msg(() => labValue("<", "half"))).toBe('value: "<" has no number');
    expect(msg(() => labValue("> ", undefined, "limit"))).toBe('value: "> " has no number');
  });
  it("a censoring sign followed by a lone sign is not a number (never a limit of 0)", () => {
    expect(msg(() => labValue("<-", "half"))).toBe(
      'value: "<-" is not a number written with the decimal mark "." (thousands may be grouped by "," or a space, three digits a group)',
    );
    expect(errorCode(() => labValue("<+", "half"))).toBe("NOT_A_NUMBER");
  });
  it("a limit that is not above 0 is refused with the limit read, a space after its minus sign or a minus sign U+2212 included", () => {
    expect(msg(() => labValue("<0", "half"))).toBe('value: "<0" states a limit of 0; a detection or range limit must be above 0');
    expect(msg(() => labValue("<- 0.5", "half"))).toBe('value: "<- 0.5" states a limit of -0.5; a detection or range limit must be above 0');
    expect(msg(() => labValue("<\u22120.5", "half"))).toBe('value: "<\u22120.5" states a limit of -0.5; a detection or range limit must be above 0');
  });
  it("a sign is read the same with or without a space after it, in a cell or a limit", () => {
    expect(labValue("+ 12.5")).toBe(12.5);
    expect(labValue("- 12.5")).toBe(-12.5);
    expect(labValue("<+ 5", "limit")).toBe(5);
    expect(labValue("> + 300", undefined, "limit")).toBe(300);
  });
  it("the ambiguous '1.250' is refused with a space after its sign too (it once read as 1.25)", () => {
    const ambiguous = /could be read with a decimal point or as thousands grouped by a full stop/;
    expect(msg(() => labValue("<+ 1.250", "limit"))).toMatch(ambiguous);
    expect(msg(() => labValue("- 1.250"))).toMatch(ambiguous);
    expect(msg(() => labValue("\u22121.250"))).toMatch(ambiguous);
    expect(labValue("- 1.250", undefined, undefined, ",")).toBe(-1250);
  });
  it("a minus sign U+2212 reads as a minus in a cell as in a limit", () => {
    expect(labValue("\u221212.5")).toBe(-12.5);
    expect(labValue("\u2212 1 250")).toBe(-1250);
    expect(labReading("\u22120,5", ",")).toEqual({ kind: "number", value: -0.5 });
  });
  it("more than one decimal mark is refused naming the mark", () => {
    expect(msg(() => labValue("1,2,3", undefined, undefined, ","))).toBe('value: "1,2,3" has more than one decimal mark ","');
  });
  it("decimals that do not start with a digit are refused naming the mark", () => {
    expect(msg(() => labValue("12,x5", undefined, undefined, ","))).toBe('value: "12,x5" is not a number written with the decimal mark ","');
    expect(msg(() => labValue(".5-"))).toBe('value: ".5-" is not a number written with the decimal mark "."');
  });
  it("a badly grouped number names the grouping the mark allows", () => {
    expect(msg(() => labValue("12,50,0", undefined, undefined, "."))).toBe(
      'value: "12,50,0" is not a number written with the decimal mark "." (thousands may be grouped by "," or a space, three digits a group)',
    );
    expect(msg(() => labValue("12.50.0", undefined, undefined, ","))).toMatch(/^value: "12.50.0" is not a number written with the decimal mark "," \(thousands may be grouped by "\." or a space/);
  });
  it("a full stop before three digits is ambiguous without a stated mark only after one to three digits, signed or not", () => {
    for (const t of ["1.250", "12.250", "123.456", "-1.250", "+1.250"]) {
      expect(msg(() => labValue(t))).toBe(`value: "${t}" could be read with a decimal point or as thousands grouped by a full stop: give decimal "." or "," to say which`);
    }
    expect(labValue("1234.567")).toBe(1234.567); // four digits before the point: not a thousands group
    expect(labValue("0.250")).toBe(0.25); // a leading 0 is never a thousands group
    expect(labValue("1.25")).toBe(1.25);
  });
  it("an exponent is read with decimal \".\" but not with decimal \",\"", () => {
    expect(labValue("1.5e3", undefined, undefined, ".")).toBe(1500);
    // every form of the mantissa: digits on both sides, a fraction only, a sign (invented values)
    expect(labValue("12.25e3", undefined, undefined, ".")).toBe(12250);
    expect(labValue(".25e2", undefined, undefined, ".")).toBe(25);
    expect(labValue("-1.5e3", undefined, undefined, ".")).toBe(-1500);
    expect(msg(() => labValue("x1e3", undefined, undefined, "."))).toMatch(/^value: "x1e3" is not a lab value LABVALUE reads/);
    expect(msg(() => labValue("1.2.5e3", undefined, undefined, "."))).toBe('value: "1.2.5e3" has more than one decimal mark "."');
    expect(msg(() => labValue("1e3", undefined, undefined, ","))).toBe(
      'value: "1e3" is not a number written with the decimal mark "," (thousands may be grouped by "." or a space, three digits a group)',
    );
  });
  it("text after an exponent is refused as not a number, not as an infinite one", () => {
    expect(msg(() => labValue("1e5x"))).toBe(
      'value: "1e5x" is not a number written with the decimal mark "." (thousands may be grouped by "," or a space, three digits a group)',
    );
  });
  it("a number too large for a double is refused, not returned as Infinity", () => {
    expect(msg(() => labValue("1e999"))).toBe('value: "1e999" is not a finite number');
  });
  it("an unknown option word names the option and its words", () => {
    expect(msg(() => labValue("12,5", undefined, undefined, ";"))).toBe('unknown decimal mark ";"; use . or ,');
    expect(msg(() => labValue("<0.05", "third"))).toBe('unknown policy for below "third"; use limit, half, zero or blank');
    expect(msg(() => labValue(">300", undefined, "half"))).toBe('unknown policy for above "half"; use limit or blank');
  });
  it("a below-detection value without a policy is quoted trimmed", () => {
    expect(msg(() => labValue("  <0.05 "))).toMatch(/^value "<0.05" is below detection: /);
  });
});
