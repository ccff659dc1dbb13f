/**
 * Interpretation bands on a consultant's own limits: which band holds a value (SOIL.BAND) and
 * where the value sits on the band scale (SOIL.BANDPOS).
 *
 * Limits are ascending lower bounds: n limits L0 < L1 < … < L(n−1) make n + 1 bands, band 0 below
 * L0 and band n from L(n−1) up. A value equal to a limit belongs to the band above it (the
 * catalogue's edge rule), so band k holds L(k−1) ≤ value < L(k).
 *
 * Band position (for report bars): 0 at L0, 1 at L1, …, n − 1 at L(n−1), linear within each band.
 * The two open end bands are drawn half a band wide: below L0 the position runs on with the width
 * of the first band (L1 − L0), so the value L0 − (L1 − L0)/2 sits at −0.5; above L(n−1) it runs
 * on with the width of the last band, so L(n−1) + (L(n−1) − L(n−2))/2 sits at n − 0.5. A bar
 * scaled from −0.5 to n − 0.5 therefore shows every band, the end bands as half bands. Positions
 * are never clamped: a value further out gives a position beyond −0.5 or n − 0.5, and a report
 * template that wants the bar pinned to its ends says so itself (MAX(−0.5, MIN(n − 0.5, pos))).
 *
 * Source: the band rule and default labels are the project catalogue's (functions.md, "Nutrient
 * bands and fertility"); the arithmetic is linear interpolation (derived).
 */
import { SoilError } from "../errors";
import { check, finite, numericText } from "../validate";

/** The labels of five bands (four limits) when none are given. */
export const DEFAULT_BAND_LABELS: readonly string[] = ["Very low", "Low", "Optimum", "High", "Very high"];

/** A worksheet range as core receives it: rows of cells (number, text, boolean or blank). */
export type CellGrid = readonly (readonly (number | string | boolean | null)[])[];

/** Limits or labels as a plain list, or as a one-row or one-column range. */
export type ListInput<T> = readonly T[] | CellGrid;

/** A list of rows; an empty list counts as one too, and reads as no cells either way. */
function isGrid(x: readonly unknown[]): x is CellGrid {
  return x.every((r) => Array.isArray(r));
}

function isBlank(c: unknown): boolean {
  return c === null || c === undefined || (typeof c === "string" && c.trim() === "");
}

/** Flattens a one-row or one-column range (or a plain list); a 2-D block is refused. */
function flatten(input: unknown, name: string): unknown[] {
  if (!Array.isArray(input)) return [input];
  if (!isGrid(input)) return input as unknown[];
  const rows = input.length;
  const cols = Math.max(...input.map((r) => r.length));
  if (rows > 1 && cols > 1) {
    throw new SoilError("SHAPE_MISMATCH", `${name} must be a single row or a single column (got ${rows}×${cols})`);
  }
  return rows === 1 ? [...(input[0] as unknown[])] : input.map((r) => r[0]);
}

/** Drops blank cells at the end of a list (a range selected longer than needed); an inner blank is an error. */
function trimTrailing(cells: unknown[], name: string): unknown[] {
  let end = cells.length;
  while (end > 0 && isBlank(cells[end - 1])) end -= 1;
  const kept = cells.slice(0, end);
  const gap = kept.findIndex(isBlank);
  if (gap >= 0) throw new SoilError("MISSING_INPUT", `${name} has a blank cell at position ${gap + 1}; fill it or remove it`);
  return kept;
}

/**
 * The limits of a band scale from a list or a one-row/one-column range, checked.
 * @param input ascending lower bounds; numbers or numeric text; trailing blank cells are ignored
 * @returns the limits as numbers, strictly ascending
 * @throws MISSING_INPUT when there are no limits or a blank sits between two limits;
 *   NOT_A_NUMBER for text or a boolean; SHAPE_MISMATCH for a 2-D range;
 *   NOT_APPLICABLE when the limits are not strictly ascending
 */
function bandLimits(input: ListInput<number | string | boolean | null>): readonly number[] {
  const cells = trimTrailing(flatten(input, "limits"), "limits");
  if (cells.length === 0) throw new SoilError("MISSING_INPUT", "limits is empty: give one or more ascending lower bounds");
  const limits = cells.map((c, i) => {
    if (typeof c === "number") {
      if (!Number.isFinite(c)) throw new SoilError("NOT_A_NUMBER", `limit ${i + 1} is not a finite number`);
      return c;
    }
    const n = typeof c === "string" ? numericText(c) : undefined;
    // Text such as "1e999" reads as Infinity: refused like an infinite number, never a limit.
    if (Number.isFinite(n)) return n as number; // false for undefined: it converts nothing
    if (n !== undefined) throw new SoilError("NOT_A_NUMBER", `limit ${i + 1} ("${c}") is not a finite number`);
    throw new SoilError("NOT_A_NUMBER", `limit ${i + 1} (${typeof c === "string" ? `"${c}"` : String(c)}) is not a number`);
  });
  for (let i = 1; i < limits.length; i++) {
    if (!((limits[i] as number) > (limits[i - 1] as number))) {
      throw new SoilError(
        "NOT_APPLICABLE",
        `limits must be strictly ascending lower bounds; limit ${i + 1} (${limits[i]}) is not above limit ${i} (${limits[i - 1]})`,
      );
    }
  }
  return limits;
}

/**
 * The labels for a scale of `count` limits: the given ones (count + 1 of them) or, for four
 * limits only, the default five (Very low, Low, Optimum, High, Very high).
 * @throws MISSING_INPUT when labels are omitted and the limits are not four; SHAPE_MISMATCH when
 *   the number of labels is not count + 1; NOT_A_NUMBER for a boolean label
 */
function bandLabels(count: number, input?: ListInput<string | number | boolean | null>): readonly string[] {
  if (input === undefined || input === null) {
    if (count === DEFAULT_BAND_LABELS.length - 1) return DEFAULT_BAND_LABELS;
    throw new SoilError(
      "MISSING_INPUT",
      `${count} limit${count === 1 ? "" : "s"} make ${count + 1} bands: give labels (${count + 1} of them); default labels exist only for 4 limits (${DEFAULT_BAND_LABELS.join(", ")})`,
    );
  }
  const labels = trimTrailing(flatten(input, "labels"), "labels").map((c, i) => {
    if (typeof c === "string") return c.trim();
    if (Number.isFinite(c)) return String(c); // true for finite numbers only
    throw new SoilError("NOT_A_NUMBER", `label ${i + 1} must be text (got ${String(c)})`);
  });
  if (labels.length !== count + 1) {
    throw new SoilError(
      "SHAPE_MISMATCH",
      `${count} limit${count === 1 ? "" : "s"} make ${count + 1} bands, so labels needs ${count + 1} entries (got ${labels.length})`,
    );
  }
  return labels;
}

/**
 * Index of the band that holds `value`: 0 below the first limit, k when L(k−1) ≤ value < L(k),
 * n from the last limit up. A value equal to a limit belongs to the band above it.
 * @param value any finite number, in the unit of the limits
 * @param limits ascending lower bounds (see bandLimits)
 * @returns band index 0 … n
 * @throws as bandLimits; OUT_OF_RANGE for a value that is not finite
 * @example bandIndex(20, [10, 20, 30, 40]) //=> 2
 */
export function bandIndex(value: number, limits: ListInput<number | string | boolean | null>): number {
  check(value, { name: "value" });
  const l = bandLimits(limits);
  // Binary search for the number of limits ≤ value.
  let lo = 0;
  let hi = l.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((l[mid] as number) <= value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Which side a value exactly equal to a limit falls on, as a published table prints it: "above"
 * (the limit opens the band above, as in "less than 20 is deficient"), "below" (the limit closes
 * the band below, as in a closed range "3.00–5.00" or "at or below the critical level") or "none"
 * (the source classifies that exact value on neither side, as in "< 1 low; > 1 high").
 */
export type AtLimit = "above" | "below" | "none";

/**
 * Index of the band that holds `value` under a table's own edge rule, one rule per limit (see
 * AtLimit); null when the value equals a limit the source leaves unclassified ("none").
 * SOIL.BAND's rule on the user's own limits is the special case of every limit "above".
 * @param value any finite number, in the unit of the limits
 * @param limits strictly ascending limits (checked by the caller's data test)
 * @param atLimit one rule per limit
 * @returns band index 0 … n, or null
 * @throws OUT_OF_RANGE for a value that is not finite; SHAPE_MISMATCH when the rules and limits differ in number
 * @example bandIndexAt(20, [10, 20, 30], ["above", "below", "below"]) //=> 1
 */
export function bandIndexAt(value: number, limits: readonly number[], atLimit: readonly AtLimit[]): number | null {
  check(value, { name: "value" });
  if (atLimit.length !== limits.length) {
    throw new SoilError("SHAPE_MISMATCH", `${limits.length} limits need ${limits.length} edge rules (got ${atLimit.length})`);
  }
  let k = 0;
  for (; k < limits.length; k++) {
    const l = limits[k] as number;
    if (value > l) continue;
    if (value < l) break;
    const rule = atLimit[k];
    if (rule === "none") return null;
    if (rule === "below") break;
  }
  return k;
}

/**
 * The label of the band that holds `value` (SOIL.BAND).
 * @param value any finite number, in the unit of the limits
 * @param limits ascending lower bounds; n limits make n + 1 bands
 * @param labels n + 1 labels in any language; omitted: the default five for four limits
 * @returns the band's label
 * @throws as bandLimits and bandLabels
 * @example bandLabel(20, [10, 20, 30, 40]) //=> "Optimum"
 */
export function bandLabel(
  value: number,
  limits: ListInput<number | string | boolean | null>,
  labels?: ListInput<string | number | boolean | null>,
): string {
  const l = bandLimits(limits);
  const names = bandLabels(l.length, labels);
  return names[bandIndex(value, l)] as string;
}

const f64 = new Float64Array(1);
const u64 = new BigUint64Array(f64.buffer);

/** The largest double below x, for x > 0 (a band number): one step down in its bits. */
function nextDownPositive(x: number): number {
  f64[0] = x;
  u64[0] = (u64[0] as bigint) - 1n;
  return f64[0] as number;
}

/**
 * Position of `value` on the band scale (SOIL.BANDPOS): 0 at the first limit, 1 at the second, …,
 * linear within a band; below the first limit it runs on with the first band's width (−0.5 half a
 * band below), above the last with the last band's width (n − 0.5 half a band above). Not clamped.
 *
 * Rounding guard: the position always lies in its band's own interval ([k − 1, k) for band k), so
 * floor(position) + 1 is the band index of bandIndex even where the division rounds up to the next
 * whole number.
 * @param value any finite number, in the unit of the limits
 * @param limits at least two ascending lower bounds
 * @returns position on the band scale (dimensionless; bands span −0.5 … n − 0.5 when drawn)
 * @throws as bandLimits; NOT_APPLICABLE for a single limit (no band width to scale by);
 *   OUT_OF_RANGE when the position is not finite
 * @example bandPosition(25, [10, 20, 30, 40]) //=> 1.5
 */
export function bandPosition(value: number, limits: ListInput<number | string | boolean | null>): number {
  const l = bandLimits(limits);
  const n = l.length;
  if (n < 2) {
    throw new SoilError("NOT_APPLICABLE", "band position needs at least two limits (one band of known width to scale by)");
  }
  const k = bandIndex(value, l);
  const at = (i: number) => l[i] as number;
  let pos: number;
  if (k === 0) {
    pos = (value - at(0)) / (at(1) - at(0));
    // value < L0 makes the difference negative, but the division can underflow to −0.
    if (!(pos < 0)) pos = -Number.MIN_VALUE;
  } else if (k === n) {
    pos = n - 1 + (value - at(n - 1)) / (at(n - 1) - at(n - 2));
  } else {
    // No guard below: value ≥ L(k−1) makes the fraction ≥ 0, and adding it to k − 1 never rounds below k − 1.
    pos = k - 1 + (value - at(k - 1)) / (at(k) - at(k - 1));
    if (pos >= k) pos = nextDownPositive(k);
  }
  return finite(pos, "the band position");
}
