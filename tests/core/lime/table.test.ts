/**
 * Calibration tables read from worksheet ranges: shapes, blank and text cells, the messages that
 * place a bad cell, the edges of the table and the interpolation guard.
 *
 * All tables here are invented: they exercise the reader and the interpolation, not any published
 * calibration (the published ones are checked in buffer.test.ts).
 */
import { LimeRange, LimeTable, limeRangeRate, limeTableCheckBufferPh, limeTableFromRange, limeTableRate } from "../../../src/core/lime/table";
import { errorCode as codeOf, errorMessage as messageOf } from "../../helpers/errors";

// Invented: rates fall as buffer pH rises and rise with the target.
const T: LimeRange = [
  ["", 6.0, 6.5],
  [6.0, 2.0, 3.0],
  [6.5, 0.5, 1.0],
];

describe("shape", () => {
  it("a 2 × 2 range (one buffer row, one target column) is a table", () => {
    expect(limeRangeRate([["", 6.5], [6.0, 1.25]], 6.0, 6.5)).toBe(1.25);
  });
  it("a single column or a single row is SHAPE_MISMATCH", () => {
    expect(codeOf(() => limeTableFromRange([["label"], [6.0], [6.5]]))).toBe("SHAPE_MISMATCH");
    expect(codeOf(() => limeTableFromRange([["", 6.0, 6.5]]))).toBe("SHAPE_MISMATCH");
    expect(codeOf(() => limeTableFromRange([]))).toBe("SHAPE_MISMATCH");
  });
  it("an entirely blank range is SHAPE_MISMATCH (trimming stops at nothing)", () => {
    expect(codeOf(() => limeTableFromRange([[null, ""], [" ", null]]))).toBe("SHAPE_MISMATCH");
    expect(codeOf(() => limeTableFromRange([[null], []]))).toBe("SHAPE_MISMATCH");
  });
  it("a missing row (undefined) at the end is trimmed like a blank one", () => {
    expect(limeRangeRate([...T, undefined] as unknown as LimeRange, 6.0, 6.0)).toBe(2.0);
  });
  it("trailing columns of spaces are trimmed", () => {
    expect(limeRangeRate([["", 6.0, 6.5, "  "], [6.0, 2.0, 3.0, " "], [6.5, 0.5, 1.0, "\t"]], 6.0, 6.5)).toBe(3.0);
  });
  it("a top row shorter than the body is a blank target cell, not a smaller table", () => {
    expect(messageOf(() => limeTableFromRange([["", 6.0], [6.0, 1, 2], [6.5, 0, 1]]))).toBe(
      "the calibration range has a blank cell at row 1, column 3; fill it or trim the range",
    );
  });
  it("a body row shorter than the others is a blank cell", () => {
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1], [6.5, 0, 1]]))).toBe(
      "the calibration range has a blank cell at row 2, column 3; fill it or trim the range",
    );
  });
});

describe("cells", () => {
  it("a body cell of spaces is a blank cell (NOT_APPLICABLE), placed by row and column", () => {
    expect(codeOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, 2], [6.5, "  ", 1]]))).toBe("NOT_APPLICABLE");
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, 2], [6.5, "  ", 1]]))).toBe(
      "the calibration range has a blank cell at row 3, column 2; fill it or trim the range",
    );
  });
  it("numeric text with spaces around it is read", () => {
    expect(limeRangeRate([["", " 6.0 ", "6.5"], [" 6.0", " 2 ", 3], [6.5, 0.5, "1.0 "]], 6.0, 6.0)).toBe(2);
  });
  it("text is NOT_A_NUMBER quoting the cell and its place", () => {
    expect(codeOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, "n.d."], [6.5, 0, 1]]))).toBe("NOT_A_NUMBER");
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, "n.d."], [6.5, 0, 1]]))).toBe(
      'the calibration range has "n.d." at row 2, column 3, which is not a number',
    );
    expect(messageOf(() => limeTableFromRange([["", "pH6", 6.5], [6.0, 1, 2], [6.5, 0, 1]]))).toBe(
      'the calibration range has "pH6" at row 1, column 2, which is not a number',
    );
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, 2], ["low", 0, 1]]))).toBe(
      'the calibration range has "low" at row 3, column 1, which is not a number',
    );
  });
  it("a boolean cell is NOT_A_NUMBER, shown as text", () => {
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, true], [6.5, 0, 1]]))).toBe(
      'the calibration range has "true" at row 2, column 3, which is not a number',
    );
  });
  it("a non-finite number in a cell is NOT_A_NUMBER, not a range error", () => {
    expect(codeOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, Infinity], [6.5, 0, 1]]))).toBe("NOT_A_NUMBER");
    expect(codeOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, NaN], [6.5, 0, 1]]))).toBe("NOT_A_NUMBER");
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, NaN], [6.5, 0, 1]]))).toBe(
      'the calibration range has "NaN" at row 2, column 3, which is not a number',
    );
  });
  it("a target pH, a buffer pH or a rate out of range is named and placed", () => {
    expect(messageOf(() => limeTableFromRange([["", 6.0, 16], [6.0, 1, 2], [6.5, 0, 1]]))).toBe(
      "a target pH in the calibration range must be from 0 to 14 (got 16)",
    );
    expect(codeOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, 2], [16, 0, 1]]))).toBe("OUT_OF_RANGE");
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, 2], [16, 0, 1]]))).toBe(
      "a buffer pH in the calibration range must be from 0 to 14 (got 16)",
    );
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, 2], [-0.5, 0, 1]]))).toBe(
      "a buffer pH in the calibration range must be from 0 to 14 (got -0.5)",
    );
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, 2], [6.5, 0, -1]]))).toBe(
      "the rate at row 3, column 3 of the calibration range must be at least 0 (got -1)",
    );
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, -2, 2], [6.5, 0, 1]]))).toBe(
      "the rate at row 2, column 2 of the calibration range must be at least 0 (got -2)",
    );
  });
  it("an axis that repeats or turns back names the axis and the two values", () => {
    expect(messageOf(() => limeTableFromRange([["", 6.0, 6.5, 6.5], [6.0, 1, 2, 3], [6.5, 0, 1, 2]]))).toBe(
      "the calibration range's target pH (top row) values must rise or fall steadily without repeats (found 6.5 then 6.5)",
    );
    expect(messageOf(() => limeTableFromRange([["", 6.0], [6.0, 1], [6.5, 0], [6.2, 0.5]]))).toBe(
      "the calibration range's buffer pH (left column) values must rise or fall steadily without repeats (found 6.5 then 6.2)",
    );
  });
});

describe("edges", () => {
  const table = limeTableFromRange(T);
  it("floating-point slack of 1e-9 at each edge is inside the table; beyond it is outside", () => {
    expect(limeTableRate(table, 6.0 - 1e-9, 6.0)).toBe(2.0);
    expect(limeTableRate(table, 6.5 + 1e-9, 6.0)).toBe(0.5);
    expect(limeTableRate(table, 6.0, 6.0 - 1e-9)).toBe(2.0);
    expect(limeTableRate(table, 6.0, 6.5 + 1e-9)).toBe(3.0);
    expect(codeOf(() => limeTableRate(table, 6.0 - 1e-8, 6.0))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeTableRate(table, 6.5 + 1e-8, 6.0))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeTableRate(table, 6.0, 6.0 - 1e-8))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeTableRate(table, 6.0, 6.5 + 1e-8))).toBe("OUT_OF_RANGE");
    expect(limeTableCheckBufferPh(table, 6.5 + 1e-9)).toBe(6.5 + 1e-9);
  });
  it("the target refusal names the table and its target range", () => {
    expect(messageOf(() => limeTableRate(table, 6.2, 6.6))).toBe(
      "target_ph 6.6 is outside the calibration range (target pH 6 to 6.5); the table is not extrapolated",
    );
  });
  it("a table given directly with a non-finite rate refuses instead of returning NaN", () => {
    const bad: LimeTable = { name: "an invented table", bufferPh: [6, 7], targetPh: [6.5], rates: [[Infinity], [0]] };
    expect(codeOf(() => limeTableRate(bad, 6.5, 6.5))).toBe("OUT_OF_RANGE");
    expect(messageOf(() => limeTableRate(bad, 6.5, 6.5))).toBe("the interpolated lime rate cannot be computed for these inputs (result is not finite)");
  });
});
