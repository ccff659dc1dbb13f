/**
 * The one error type the science core throws, with a closed set of codes.
 *
 * Hosts map a code to a spreadsheet error once (see `errorKindOf`); tests assert the code, not the
 * wording of the message.
 */

/** Closed vocabulary of rejection reasons. */
export type SoilErrorCode =
  /** A word the function does not know: unit, ion, form, method, crop, nutrient, calibration. */
  | "UNKNOWN_NAME"
  /** Two units or forms that cannot be converted into each other (different families or elements). */
  | "UNIT_MISMATCH"
  /** A number outside its physical or calibrated range. */
  | "OUT_OF_RANGE"
  /** An argument this case needs was not given. */
  | "MISSING_INPUT"
  /** A value that is not a number where a number is needed (text such as "<0.5", a boolean). */
  | "NOT_A_NUMBER"
  /** Range arguments whose shapes cannot be broadcast together, or a range of the wrong shape. */
  | "SHAPE_MISMATCH"
  /** The method cannot be applied to these inputs (e.g. a table that is not ascending). */
  | "NOT_APPLICABLE"
  /** No reference data exists for this combination (shown as #N/A). */
  | "NO_REFERENCE_DATA";

export const SOIL_ERROR_CODES: readonly SoilErrorCode[] = [
  "UNKNOWN_NAME",
  "UNIT_MISMATCH",
  "OUT_OF_RANGE",
  "MISSING_INPUT",
  "NOT_A_NUMBER",
  "SHAPE_MISMATCH",
  "NOT_APPLICABLE",
  "NO_REFERENCE_DATA",
];

/** The spreadsheet error a code becomes. Excel shows a custom message only on #VALUE! and #N/A. */
export type SpreadsheetErrorKind = "#VALUE!" | "#N/A";

export function errorKindOf(code: SoilErrorCode): SpreadsheetErrorKind {
  return code === "NO_REFERENCE_DATA" ? "#N/A" : "#VALUE!";
}

export class SoilError extends Error {
  readonly code: SoilErrorCode;

  constructor(code: SoilErrorCode, message: string) {
    super(message);
    this.name = "SoilError";
    this.code = code;
  }
}

export function isSoilError(e: unknown): e is SoilError {
  return e instanceof SoilError;
}

/** Formats a list of accepted words for an error message: `a, b or c`. */
export function listWords(words: readonly string[]): string {
  // Stryker disable next-line StringLiteral: equivalent: a list of at most one word has no separator to place, so join gives the same text whatever its argument
  if (words.length <= 1) return words.join("");
  return `${words.slice(0, -1).join(", ")} or ${words[words.length - 1]}`;
}
