/**
 * A consultant's own interpretation table, passed to SOIL.SUFFICIENCY as a worksheet range, for
 * anything no built-in table covers (another lab's calibration, a regional guideline).
 *
 * Layout, one table per row: nutrient | method | crop | band | limit | band | limit | … | band,
 * the band labels and the limits alternating as they read along the scale (at least one limit).
 * A first row whose first cell is "nutrient" is a header and skipped; blank rows and trailing
 * blank cells are ignored. A blank method or crop cell (or "any") means any method or crop.
 * Limits must ascend; the edge rule is SOIL.BAND's: a value equal to a limit is in the band above.
 *
 * Source: the band rule of the project catalogue (SOIL.BAND); the layout is this project's own.
 */
import { SoilError } from "../errors";
import { normaliseWord } from "../names";
import { numericText } from "../validate";
import { CellGrid } from "./bands";
import { CROPS, METHODS, NUTRIENTS } from "./sufficiency-rows";

/** One row of a user table, parsed. */
export interface UserRow {
  /** 1-based row number within the range, for messages. */
  readonly row: number;
  /** Normalised keys ("" = any) used for matching. */
  readonly nutrient: string;
  readonly method: string;
  readonly crop: string;
  /** As typed, for messages. */
  readonly shown: string;
  readonly limits: readonly number[];
  readonly labels: readonly string[];
}

function isBlank(c: unknown): boolean {
  return c === null || c === undefined || (typeof c === "string" && c.trim() === "");
}

function text(c: unknown): string {
  return typeof c === "string" ? c.trim() : typeof c === "number" ? String(c) : "";
}

/**
 * A word's matching key: "" (any) for an omitted word, a blank or "any"; the canonical id where the
 * vocabulary knows the word; else the normalised word.
 */
function keyOf(word: string | undefined, table: { has(w: string): boolean; lookup(w: string, what: string): string }): string {
  // Stryker disable next-line StringLiteral: equivalent: any other key for an omitted word has spaces, so no row key (normalised, spaceless) equals it, and a row keyed "" fits it either way
  if (word === undefined) return "";
  const key = normaliseWord(word);
  if (key === "any") return "";
  // Stryker disable next-line StringLiteral: equivalent: has() was checked, so lookup never throws and its word for the message is never shown
  return table.has(word) ? normaliseWord(table.lookup(word, "")) : key;
}

export function nutrientKey(word: string): string {
  return keyOf(word, NUTRIENTS);
}
export function methodKey(word: string | undefined): string {
  return keyOf(word, METHODS);
}
export function cropKey(word: string | undefined): string {
  return keyOf(word, CROPS);
}

const cache = new WeakMap<object, readonly UserRow[]>();

/**
 * Parses a user table (see the file header).
 * @throws MISSING_INPUT for a row without a nutrient or without a limit; NOT_A_NUMBER for a limit
 *   that is not a number or a label that is not text; NOT_APPLICABLE for limits not ascending;
 *   SHAPE_MISMATCH for a table with no rows
 */
export function userTable(range: CellGrid): readonly UserRow[] {
  const cached = cache.get(range);
  // Stryker disable next-line ConditionalExpression: equivalent: the cache only saves parsing again; a range parsed again gives the same rows
  if (cached) return cached;
  const rows: UserRow[] = [];
  range.forEach((cells, i) => {
    const n = i + 1;
    if (cells.every(isBlank)) return;
    if (i === 0 && normaliseWord(text(cells[0])) === "nutrient") return;
    let end = cells.length;
    // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: a row of blanks returned above, so a cell that is not blank stops the loop before end reaches 0
    while (end > 0 && isBlank(cells[end - 1])) end--;
    const [nut, meth, crop] = [text(cells[0]), text(cells[1]), text(cells[2])];
    if (nut === "") throw new SoilError("MISSING_INPUT", `row ${n} of the table has no nutrient in its first cell`);
    const scale = cells.slice(3, end);
    if (scale.length < 3 || scale.length % 2 === 0) {
      throw new SoilError(
        "MISSING_INPUT",
        `row ${n} of the table needs band, limit, band, … after nutrient, method and crop: labels and limits alternating, starting and ending with a label (got ${scale.length} cells)`,
      );
    }
    const labels: string[] = [];
    const limits: number[] = [];
    scale.forEach((c, j) => {
      const col = j + 4;
      if (j % 2 === 0) {
        if (typeof c !== "string" || c.trim() === "") {
          throw new SoilError("NOT_A_NUMBER", `row ${n}, column ${col} of the table should be a band label (text), got ${isBlank(c) ? "a blank" : String(c)}`);
        }
        labels.push(c.trim());
      } else {
        // Number.isFinite is true only for a finite number (it converts nothing). Text such as
        // "1e999" reads as Infinity, which is no limit: refused below.
        const limit = typeof c === "string" ? numericText(c) : c;
        if (Number.isFinite(limit)) limits.push(limit as number);
        else throw new SoilError("NOT_A_NUMBER", `row ${n}, column ${col} of the table should be a limit (a number), got ${isBlank(c) ? "a blank" : `"${String(c)}"`}`);
        const k = limits.length - 1;
        if (k > 0 && !(limits[k]! > limits[k - 1]!)) {
          throw new SoilError("NOT_APPLICABLE", `row ${n} of the table: limits must ascend (${limits[k - 1]} then ${limits[k]})`);
        }
      }
    });
    rows.push({
      row: n,
      nutrient: nutrientKey(nut),
      method: methodKey(meth),
      crop: cropKey(crop),
      shown: `${nut} ${meth || "any method"} (${crop || "any crop"})`,
      limits,
      labels,
    });
  });
  if (rows.length === 0) throw new SoilError("SHAPE_MISMATCH", "the table range holds no rows: nutrient | method | crop | band | limit | band …");
  const frozen = Object.freeze(rows);
  cache.set(range, frozen);
  return frozen;
}

/**
 * The user-table row for a nutrient, method and crop: exact method and crop preferred over "any".
 * @throws NO_REFERENCE_DATA when no row fits (the message lists the rows); NOT_APPLICABLE when
 *   two equally specific rows fit
 */
export function userRowFor(rows: readonly UserRow[], nutrient: string, method: string | undefined, crop: string | undefined): UserRow {
  const n = nutrientKey(nutrient);
  const m = methodKey(method);
  const c = cropKey(crop);
  const fits = rows.filter((r) => r.nutrient === n && (r.method === "" || r.method === m) && (r.crop === "" || r.crop === c));
  const asked = `${nutrient} ${method ?? "(no method)"} (${crop ?? "no crop"})`;
  if (fits.length === 0) {
    throw new SoilError("NO_REFERENCE_DATA", `the table has no row for ${asked}; its rows are ${rows.map((r) => r.shown).join("; ")}`);
  }
  const score = (r: UserRow) => (r.method === "" ? 0 : 2) + (r.crop === "" ? 0 : 1);
  const best = Math.max(...fits.map(score));
  const top = fits.filter((r) => score(r) === best);
  if (top.length > 1) {
    throw new SoilError("NOT_APPLICABLE", `rows ${top.map((r) => r.row).join(" and ")} of the table both fit ${asked}; keep one`);
  }
  return top[0]!;
}
