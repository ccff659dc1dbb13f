/**
 * The consultant's own table (sufficiency-user.ts): the words that key a row, a range read into
 * rows (header, blanks, labels, limits), every refusal with its row and column, and the choice
 * of the row that fits. Every table here is invented for the check (its limits and labels are
 * nobody's calibration), so no source is named.
 */
import { cropKey, methodKey, nutrientKey, userRowFor, userTable } from "../../../src/core/bands/sufficiency-user";
import { CellGrid } from "../../../src/core/bands/bands";
import { errorCode as code, errorMessage } from "../../helpers/errors";

/** The code and message a range is refused with. */
const refusal = (t: CellGrid) => [code(() => userTable(t)), errorMessage(() => userTable(t))];
/** One row for K, Colwell, wheat with this scale after the three word cells. */
const scaleRow = (...scale: unknown[]) => [["K", "Colwell", "wheat", ...scale]] as unknown as CellGrid;

describe("the key a word matches by", () => {
  it("a word the vocabulary knows keys as its canonical id, so aliases match", () => {
    expect(nutrientKey("potassium")).toBe("k");
    expect(nutrientKey(" K ")).toBe("k");
    expect(methodKey("Bray P1")).toBe("bray-1");
    expect(cropKey("maize")).toBe("corn");
  });
  it("an omitted word, a blank and 'any' all key as any (\"\")", () => {
    for (const w of [undefined, "", "   ", "any", " ANY "]) {
      expect(methodKey(w)).toBe("");
      expect(cropKey(w)).toBe("");
    }
  });
  it("a word the vocabulary does not know keys as itself, normalised", () => {
    expect(nutrientKey("Cl")).toBe("cl");
    expect(methodKey(" Hot Water ")).toBe("hotwater");
    expect(cropKey("Rice")).toBe("rice");
  });
});

describe("a range read into rows", () => {
  it("skips a first-row header and blank rows, trims the words and labels, and reads numeric text as a limit", () => {
    const t = [
      [" NUTRIENT ", "Method", "Crop", "Band", "Limit", "Band"],
      [" K ", " Colwell ", " wheat ", " Low ", " 60 ", "High "],
      [null, "", "   ", null, null, null],
      ["potassium", "", "any", "Low", 50, "Mid", "+1e2", "High"],
      [42, "", "", "a", 1, "b"],
    ];
    expect(userTable(t)).toEqual([
      { row: 2, nutrient: "k", method: "colwell", crop: "wheat", shown: "K Colwell (wheat)", limits: [60], labels: ["Low", "High"] },
      { row: 4, nutrient: "k", method: "", crop: "", shown: "potassium any method (any)", limits: [50, 100], labels: ["Low", "Mid", "High"] },
      // A number in a word cell is read as its text, not dropped.
      { row: 5, nutrient: "42", method: "", crop: "", shown: "42 any method (any crop)", limits: [1], labels: ["a", "b"] },
    ]);
  });
  it.each([
    ["null", null],
    ["undefined (a cell the host leaves out)", undefined],
    ["empty text", ""],
    ["spaces", "   "],
  ])("a trailing blank cell (%s) is ignored", (_, blank) => {
    expect(userTable(scaleRow("Low", 60, "High", blank))[0]!.limits).toEqual([60]);
    expect(userTable(scaleRow("Low", 60, "High", blank, blank, blank))[0]!.labels).toEqual(["Low", "High"]);
  });
  it("a row of blanks of every kind is skipped; only the first row can be a header", () => {
    const t = [
      ["K", "Colwell", "wheat", "Low", 60, "High"],
      [null, undefined, "", "  "],
      ["Nutrient", "Method", "Crop", "Band", "Limit", "Band"],
    ] as unknown as CellGrid;
    expect(refusal(t)).toEqual(["NOT_A_NUMBER", 'row 3, column 5 of the table should be a limit (a number), got "Limit"']);
  });
  it("a range with no rows (empty, a header only, blanks only) is refused", () => {
    const message = "the table range holds no rows: nutrient | method | crop | band | limit | band …";
    for (const t of [[], [["nutrient", "method", "crop"]], [[null, null], ["", " "]]]) expect(refusal(t)).toEqual(["SHAPE_MISMATCH", message]);
  });
  it("a row without a nutrient is refused with its row number within the range", () => {
    expect(refusal([["K", "", "", "a", 1, "b"], ["   ", "Colwell", "wheat", "Low", 9, "High"]])).toEqual([
      "MISSING_INPUT",
      "row 2 of the table has no nutrient in its first cell",
    ]);
  });
  it.each([
    [0, []],
    [1, ["Low"]],
    [2, ["Low", 5]],
    [4, ["Low", 5, "High", 9]],
  ])("a scale of %s cells is refused: it must run label, limit, …, label", (n, scale) => {
    expect(refusal(scaleRow(...scale))).toEqual([
      "MISSING_INPUT",
      `row 1 of the table needs band, limit, band, … after nutrient, method and crop: labels and limits alternating, starting and ending with a label (got ${n} cells)`,
    ]);
  });
  it.each([
    ["a number", ["Low", 5, 7, 9, "High"], "column 6", "got 7"],
    ["a boolean", [true, 5, "High"], "column 4", "got true"],
    ["a blank between limits", ["Low", 5, null, 9, "High"], "column 6", "got a blank"],
    ["spaces", ["Low", 5, "   ", 9, "High"], "column 6", "got a blank"],
  ])("a label that is %s is refused with its column", (_, scale, col, got) => {
    expect(refusal(scaleRow(...scale))).toEqual(["NOT_A_NUMBER", `row 1, ${col} of the table should be a band label (text), ${got}`]);
  });
  it.each([
    ["text", "five", 'got "five"'],
    ["hexadecimal text", "0x10", 'got "0x10"'],
    ["a boolean", true, 'got "true"'],
    ["not finite", Infinity, 'got "Infinity"'],
    ["not a number", NaN, 'got "NaN"'],
    ["blank", null, "got a blank"],
    ["spaces", "   ", "got a blank"],
  ])("a limit that is %s is refused with its column", (_, limit, got) => {
    expect(refusal(scaleRow("Low", 5, "Mid", limit, "High"))).toEqual(["NOT_A_NUMBER", `row 1, column 7 of the table should be a limit (a number), ${got}`]);
  });
  it("a limit as numeric text, with spaces, a sign or an exponent, is read as its number", () => {
    expect(userTable(scaleRow("a", " 60 ", "b", "+6.5e1", "c", ".7e2", "d"))[0]!.limits).toEqual([60, 65, 70]);
  });
  it("limits must ascend strictly: an equal or lower limit is refused, naming both", () => {
    expect(refusal(scaleRow("Low", 9, "Mid", 5, "High"))).toEqual(["NOT_APPLICABLE", "row 1 of the table: limits must ascend (9 then 5)"]);
    expect(refusal(scaleRow("Low", 1, "Mid", 5, "Mid", 5, "High"))).toEqual(["NOT_APPLICABLE", "row 1 of the table: limits must ascend (5 then 5)"]);
    expect(userTable(scaleRow("Low", 5, "Mid", 5.001, "High"))[0]!.limits).toEqual([5, 5.001]);
  });
});

describe("the row that fits a nutrient, method and crop", () => {
  // Rows 1-3: K for any method and crop, any method on wheat, Colwell on any crop; row 4 is P, row 5 another method.
  const ROWS = userTable([
    ["K", "", "", "r1", 10, "high"],
    ["K", "any", "wheat", "r2", 20, "high"],
    ["K", "Colwell", "", "r3", 30, "high"],
    ["P", "Colwell", "wheat", "r4", 40, "high"],
    ["K", "Mehlich-3", "canola", "r5", 50, "high"],
  ]);
  it.each<[string, string | undefined, string | undefined, number, string]>([
    ["K", "Colwell", "wheat", 3, "a method of its own wins over a crop of its own, and the P row is not read for K"],
    ["K", "Colwell K", "barley", 3, "the method by its alias"],
    ["K", "Bray-1", "wheat", 2, "the crop-specific row over the row for anything"],
    ["K", "Bray-1", "barley", 1, "the row for any method and crop"],
    ["K", undefined, undefined, 1, "no method or crop given: the row for anything"],
    ["K", undefined, "wheat", 2, "no method given"],
    ["potassium", "M3", "canola", 5, "method and crop both its own"],
    ["P", "Colwell", "wheat", 4, "the P row for P"],
  ])("%s %s %s: row %s (%s)", (n, m, c, row) => {
    expect(userRowFor(ROWS, n, m, c).row).toBe(row);
  });
  it("no row fits: #N/A naming what was asked and listing the rows as typed", () => {
    const rows = "K any method (any crop); K any (wheat); K Colwell (any crop); P Colwell (wheat); K Mehlich-3 (canola)";
    expect(code(() => userRowFor(ROWS, "P", "Bray-1", "wheat"))).toBe("NO_REFERENCE_DATA");
    expect(errorMessage(() => userRowFor(ROWS, "P", "Bray-1", "wheat"))).toBe(`the table has no row for P Bray-1 (wheat); its rows are ${rows}`);
    expect(errorMessage(() => userRowFor(ROWS, "Zn", undefined, undefined))).toBe(`the table has no row for Zn (no method) (no crop); its rows are ${rows}`);
  });
  it("two equally specific rows that fit are refused, naming both rows", () => {
    const t = userTable([
      ["K", "Colwell", "wheat", "a", 5, "b"],
      ["K", "", "", "a", 5, "b"],
      ["K", "Colwell", "wheat", "a", 6, "b"],
      ["K", "any", "any", "a", 7, "b"],
    ]);
    expect(code(() => userRowFor(t, "K", "Colwell", "wheat"))).toBe("NOT_APPLICABLE");
    expect(errorMessage(() => userRowFor(t, "K", "Colwell", "wheat"))).toBe("rows 1 and 3 of the table both fit K Colwell (wheat); keep one");
    expect(errorMessage(() => userRowFor(t, "K", undefined, undefined))).toBe("rows 2 and 4 of the table both fit K (no method) (no crop); keep one");
  });
});

describe("a limit typed as text beyond the floating-point range", () => {
  it('"1e999" (Infinity once read) is refused, never taken as a limit', () => {
    expect(refusal(scaleRow("Low", "1e999", "High"))).toEqual(["NOT_A_NUMBER", 'row 1, column 5 of the table should be a limit (a number), got "1e999"']);
    expect(userTable(scaleRow("Low", "1e300", "High"))[0]!.limits).toEqual([1e300]);
  });
});
