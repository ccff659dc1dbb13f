/**
 * Buffer-pH calibration tables: reading one from a worksheet range and interpolating in it.
 *
 * A table has buffer pH values down its left column, target pH values across its top row and a
 * lime rate in every body cell. Rates are interpolated linearly on both axes (bilinear); outside
 * the table's range is OUT_OF_RANGE with the range in the message, never extrapolated.
 *
 * Source: linear interpolation between the rows of a published table is how extension tables
 * are read between their printed steps (common practice); no table values live in this file.
 */
import { SoilError } from "../errors";
import { check, finite, numericText } from "../validate";

/** A range as core receives it: rows of numbers, text, booleans or null (blank). */
export type LimeRange = readonly (readonly (number | string | boolean | null)[])[];

/** A calibration table with both axes ascending. */
export interface LimeTable {
  /** Name used in messages, e.g. "SIKORA-OR2025" or "the calibration range". */
  readonly name: string;
  /** Buffer pH of each row, ascending. */
  readonly bufferPh: readonly number[];
  /** Target pH of each column, ascending. */
  readonly targetPh: readonly number[];
  /** rates[i][j]: lime rate for bufferPh[i] and targetPh[j], in the table's own unit. */
  readonly rates: readonly (readonly number[])[];
}

/** Floating-point slack at the table's edges (a computed 6.9000000001 is still 6.9). */
const EDGE = 1e-9;

function isBlankCell(c: unknown): boolean {
  return c === null || c === undefined || (typeof c === "string" && c.trim() === "");
}

function cellNumber(c: unknown, where: string): number {
  // Number.isFinite is false for anything but a finite number (it does not coerce text).
  if (Number.isFinite(c)) return c as number;
  const n = typeof c === "string" ? numericText(c) : undefined;
  if (n !== undefined) return n;
  if (isBlankCell(c)) throw new SoilError("NOT_APPLICABLE", `the calibration range has a blank cell at ${where}; fill it or trim the range`);
  throw new SoilError("NOT_A_NUMBER", `the calibration range has "${String(c)}" at ${where}, which is not a number`);
}

/** Drops trailing rows and columns that are entirely blank (a generously selected range). */
function trimmed(range: LimeRange): LimeRange {
  let rows = range.length;
  // Stryker disable next-line EqualityOperator: equivalent: rows >= 0 also steps to -1 on an all-blank range, and slice(0, -1) of it is still all blank, trimmed to no columns below
  while (rows > 0 && (range[rows - 1] ?? []).every(isBlankCell)) rows--;
  let cols = Math.max(0, ...range.slice(0, rows).map((r) => r.length));
  // Stryker disable next-line MethodExpression,EqualityOperator: equivalent: the rows cut off above are blank in every column, so including them changes no column's verdict; cols reaches 0 only when no row is kept (the last kept row has a non-blank cell), and a step to -1 on no rows changes nothing
  while (cols > 0 && range.slice(0, rows).every((r) => isBlankCell(r[cols - 1]))) cols--;
  return range.slice(0, rows).map((r) => r.slice(0, cols));
}

/** Order that sorts an axis ascending; the axis must be strictly monotonic as given. */
function axisOrder(values: readonly number[], what: string): number[] {
  const idx = values.map((_, i) => i);
  // Stryker disable next-line ConditionalExpression: equivalent: with one value the loop below does not run and the one index reversed is itself
  if (values.length < 2) return idx;
  // Stryker disable next-line EqualityOperator: equivalent: equal first values are refused as a repeat in the loop whichever way up is set
  const up = values[1]! > values[0]!;
  for (let i = 1; i < values.length; i++) {
    const step = values[i]! - values[i - 1]!;
    // A repeat (step 0) is refused first, so whether 0 counts as rising does not matter.
    // Stryker disable next-line EqualityOperator: equivalent: step 0 never reaches the comparison with up
    const rises = step > 0;
    if (step === 0 || rises !== up) {
      throw new SoilError(
        "NOT_APPLICABLE",
        `the calibration range's ${what} values must rise or fall steadily without repeats (found ${values[i - 1]} then ${values[i]})`,
      );
    }
  }
  return up ? idx : idx.reverse();
}

/**
 * Reads a calibration table from a worksheet range: the top row holds target pH values (its
 * first cell is ignored and may hold a label), the left column buffer pH values, the body lime
 * rates (≥ 0). Either axis may run up or down. Entirely blank trailing rows and columns are
 * ignored.
 * @param range the range as rows of cells, at least 2 × 2
 * @param name how messages name the table
 * @returns the table with both axes ascending
 * @throws SHAPE_MISMATCH for a range smaller than 2 × 2; NOT_APPLICABLE for a blank body cell or
 *   an axis that is not strictly monotonic; NOT_A_NUMBER for text in a cell; OUT_OF_RANGE for a pH
 *   outside 0–14 or a negative rate
 * @example limeRangeRate([["", 6.0, 6.5], [6.5, 0.5, 1.0], [6.0, 2.0, 3.0]], 6.5, 6.5) //=> 1
 */
export function limeTableFromRange(range: LimeRange, name = "the calibration range"): LimeTable {
  const grid = trimmed(range);
  const cols = grid.length ? Math.max(...grid.map((r) => r.length)) : 0;
  if (grid.length < 2 || cols < 2) {
    throw new SoilError(
      "SHAPE_MISMATCH",
      "a calibration range needs at least 2 rows and 2 columns: target pH values across the top row, buffer pH values down the left column, lime rates in the body",
    );
  }
  // Every column of the range needs its target pH: a top row shorter than the body is a blank cell
  // to refuse, not a narrower table that silently drops the body's last columns.
  const top = grid[0]!;
  const targets = Array.from({ length: cols - 1 }, (_, j) => top[j + 1]).map((c, j) => check(cellNumber(c, `row 1, column ${j + 2}`), { name: "a target pH in the calibration range", min: 0, max: 14 }));
  const buffers = grid.slice(1).map((r, i) => check(cellNumber(r[0], `row ${i + 2}, column 1`), { name: "a buffer pH in the calibration range", min: 0, max: 14 }));
  const body = grid.slice(1).map((r, i) =>
    targets.map((_, j) =>
      check(cellNumber(r[j + 1], `row ${i + 2}, column ${j + 2}`), { name: `the rate at row ${i + 2}, column ${j + 2} of the calibration range`, min: 0 }),
    ),
  );
  const rowOrder = axisOrder(buffers, "buffer pH (left column)");
  const colOrder = axisOrder(targets, "target pH (top row)");
  return {
    name,
    bufferPh: rowOrder.map((i) => buffers[i]!),
    targetPh: colOrder.map((j) => targets[j]!),
    rates: rowOrder.map((i) => colOrder.map((j) => body[i]![j]!)),
  };
}

/** The bracketing indices of x on an ascending axis and the fraction between them. */
function bracket(axis: readonly number[], x: number): { lo: number; hi: number; t: number } | undefined {
  const n = axis.length;
  const first = axis[0]!;
  const last = axis[n - 1]!;
  if (x < first - EDGE || x > last + EDGE) return undefined;
  if (n === 1) return { lo: 0, hi: 0, t: 0 };
  // Within the edge slack: clamp to the edge rather than extrapolate by a hair.
  // Stryker disable next-line EqualityOperator: equivalent: x equal to the first value gives lo 0, hi 1, t 0 through the search below too
  if (x <= first) return { lo: 0, hi: 1, t: 0 };
  // Stryker disable next-line EqualityOperator: equivalent: x equal to the last value gives lo n-2, hi n-1, t (x − a)/(x − a) = 1 through the search below too
  if (x >= last) return { lo: n - 2, hi: n - 1, t: 1 };
  let hi = 1;
  while (axis[hi]! < x) hi++;
  const lo = hi - 1;
  return { lo, hi, t: (x - axis[lo]!) / (axis[hi]! - axis[lo]!) };
}

const span = (axis: readonly number[]) => (axis.length === 1 ? `${axis[0]}` : `${axis[0]} to ${axis[axis.length - 1]}`);

/**
 * Checks that a buffer pH lies within a table's buffer pH range.
 * @returns the buffer pH
 * @throws OUT_OF_RANGE naming the table's buffer pH range
 * @example limeRangeRate([["", 6.0], [6.0, 2.0], [6.5, 0.5]], 6.5, 6.0) //=> 0.5
 */
export function limeTableCheckBufferPh(table: LimeTable, bufferPh: number): number {
  if (!bracket(table.bufferPh, bufferPh)) {
    throw new SoilError(
      "OUT_OF_RANGE",
      `buffer_ph ${bufferPh} is outside ${table.name} (buffer pH ${span(table.bufferPh)}); the table is not extrapolated`,
    );
  }
  return bufferPh;
}

/**
 * The lime rate a table gives for a buffer pH and a target pH, interpolated linearly on both axes.
 * @param table a calibration table (see limeTableFromRange)
 * @param bufferPh the soil-buffer pH, within the table's buffer pH range
 * @param targetPh the target soil pH, within the table's target pH range
 * @returns the rate in the table's own unit and basis
 * @throws OUT_OF_RANGE naming the table's range when either pH is outside it
 * @example limeRangeRate([["", 6.0, 6.5], [6.0, 2.0, 3.0], [6.5, 0.5, 1.0]], 6.25, 6.25) //=> 1.625
 */
export function limeTableRate(table: LimeTable, bufferPh: number, targetPh: number): number {
  const b = bracket(table.bufferPh, limeTableCheckBufferPh(table, bufferPh))!;
  const t = bracket(table.targetPh, targetPh);
  if (!t) {
    throw new SoilError(
      "OUT_OF_RANGE",
      `target_ph ${targetPh} is outside ${table.name} (target pH ${span(table.targetPh)}); the table is not extrapolated`,
    );
  }
  const r = table.rates;
  const along = (i: number) => r[i]![t.lo]! + (r[i]![t.hi]! - r[i]![t.lo]!) * t.t;
  const low = along(b.lo);
  const high = along(b.hi);
  return finite(low + (high - low) * b.t, "the interpolated lime rate");
}

/**
 * Reads a calibration range and interpolates in it: limeTableRate(limeTableFromRange(range), …).
 * @param range the calibration range (see limeTableFromRange)
 * @param bufferPh the soil-buffer pH
 * @param targetPh the target soil pH
 * @returns the rate in the range's own unit
 * @throws as limeTableFromRange and limeTableRate
 * @example limeRangeRate([["", 6.0, 6.5], [6.0, 2.0, 3.0], [6.5, 0.5, 1.0]], 6.25, 6.0) //=> 1.25
 */
export function limeRangeRate(range: LimeRange, bufferPh: number, targetPh: number): number {
  return limeTableRate(limeTableFromRange(range), bufferPh, targetPh);
}
