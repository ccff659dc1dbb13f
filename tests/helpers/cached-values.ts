/**
 * (A helper: it holds no reference values of its own; the values compared come from each test's
 * source or from invented workbooks.)
 * Comparing the values cells cache, as the oracle and real-workbook tests do: numbers to 1e-9
 * relative (LibreOffice writes 15 significant digits), text exactly, logical values exactly,
 * errors by code, and an empty cell only with an empty cell.
 */
import { CachedValue } from "../../scripts/oracle/xlsx-cells";

export const RELATIVE_TOLERANCE = 1e-9;

export function sameValue(want: CachedValue | undefined, got: CachedValue | undefined): boolean {
  const a = want ?? null;
  const b = got ?? null;
  if (typeof a === "number" && typeof b === "number") {
    if (a === b) return true;
    return Math.abs(a - b) <= RELATIVE_TOLERANCE * Math.max(Math.abs(a), Math.abs(b));
  }
  if (a && b && typeof a === "object" && typeof b === "object") return JSON.stringify(a) === JSON.stringify(b);
  return a === b;
}

export function show(v: CachedValue | undefined): string {
  if (v === undefined || v === null) return "(empty)";
  return JSON.stringify(v);
}
