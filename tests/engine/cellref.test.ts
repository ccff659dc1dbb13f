/**
 * A1 cell references: Excel's A1 notation (columns A–XFD, rows from 1; "$" marks an absolute side),
 * as Microsoft documents it ("Overview of formulas in Excel", A1 reference style: from memory).
 * The cells are invented.
 */
import { a1, columnIndex, columnLetters, parseA1, parseRange, rangeA1 } from "../../src/engine/cellref";

describe("A1 references", () => {
  it("a cell reads with or without $ and surrounding spaces; anything else is refused", () => {
    expect(parseA1("C7")).toEqual({ row: 6, col: 2 });
    expect(parseA1("$AB$12")).toEqual({ row: 11, col: 27 });
    expect(parseA1("  b2 ")).toEqual({ row: 1, col: 1 });
    expect(parseA1("xa1")).toEqual({ row: 0, col: 624 }); // column XA, not "x" before A1
    for (const bad of ["A1x", "-A1", "A-1", "A0", "$A$0", "A", "1", "A1:B2", "ABCD1", ""]) expect(() => parseA1(bad)).toThrow(`not a cell reference: ${bad}`);
  });
  it("a range's corners give its size, a single cell is 1×1", () => {
    expect(parseRange("B3:D7")).toEqual({ top: { row: 2, col: 1 }, rows: 5, cols: 3 });
    expect(parseRange("C4")).toEqual({ top: { row: 3, col: 2 }, rows: 1, cols: 1 });
    expect(rangeA1({ row: 2, col: 1 }, 5, 3)).toBe("B3:D7");
    expect(rangeA1({ row: 3, col: 2 }, 1, 1)).toBe("C4");
  });
  it("column letters and indices are each other's inverse at the grid's ends", () => {
    for (const [letters, index] of [["A", 0], ["Z", 25], ["AA", 26], ["XFD", 16383]] as const) {
      expect(columnLetters(index)).toBe(letters);
      expect(columnIndex(letters)).toBe(index);
    }
    expect(a1({ row: 1048575, col: 16383 })).toBe("XFD1048576");
  });
});
