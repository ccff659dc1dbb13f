/**
 * Reading a laboratory's result cell (SOIL.LABVALUE): a censored value ("<0.05", ">300", "n.d.",
 * "trace") or a locally formatted number ("1 250", "12,5") becomes a number by the policy the
 * consultant names. Nothing is guessed: a censored value without a policy, a comma without a
 * stated decimal mark, or a word not in the list is refused with what to do.
 *
 * Sources: the substitution policies (the limit, half of it, zero) are those compared by Floit,
 * Mahoney, Batey & Petroff (1996) "Evaluation of the use of substitution methods to represent
 * nondetect data", ASTM STP 1291 (DOI 10.1520/STP16018S; abstract seen, which calls one-half the
 * quantitation limit the then recommended USEPA Superfund approach); the words labs print are
 * common practice (src/data/lab/words.json).
 */
import words from "../data/lab/words.json";
import { SoilError, listWords } from "./errors";
import { nameTable, normaliseWord } from "./names";

export type LabBelowPolicy = "limit" | "half" | "zero" | "blank";
export type LabAbovePolicy = "limit" | "blank";
export type LabDecimalMark = "." | ",";

/** What a result cell says. */
export type LabReading =
  | { readonly kind: "number"; readonly value: number }
  | { readonly kind: "below"; readonly limit?: number }
  | { readonly kind: "above"; readonly limit: number }
  | { readonly kind: "missing" };

const BELOW = nameTable(words.below_policies.map((p) => ({ id: p.id, aliases: p.aliases, value: p.id as LabBelowPolicy })));
const ABOVE = nameTable(words.above_policies.map((p) => ({ id: p.id, aliases: p.aliases, value: p.id as LabAbovePolicy })));
const MARKS = nameTable(words.decimal_marks.map((p) => ({ id: p.id, aliases: p.aliases, value: p.id as LabDecimalMark })));

/** A word as matched: case, spaces and full stops do not matter (n.d. = ND = n d). */
const wordKey = (w: string) => normaliseWord(w).replace(/\./g, "");
const BELOW_WORDS = new Set(words.below_no_limit.words.map(wordKey));
const MISSING_WORDS = new Set(words.missing.words.map(wordKey));

/** The words LABVALUE reads, for messages and help. */
export const LAB_WORDS: readonly string[] = [...words.below_no_limit.words, ...words.missing.words];

const SPACES = /[\s\u00a0\u2007\u2009\u202f]+/g;
const EXPONENT = /^([+-]?)(\d+(?:\.\d*)?|\.\d+)[eE]([+-]?\d+)$/;

/** Why a text is not a number LABVALUE can read, with what to do. */
function unreadable(text: string, why: string): SoilError {
  return new SoilError("NOT_A_NUMBER", `value: "${text}" ${why}`);
}

/**
 * A number written with a decimal mark and optional thousands grouping ("1 250,5" with ",").
 * The other mark and spaces may group thousands, in groups of three digits only.
 */
function parseWithMark(text: string, body: string, mark: LabDecimalMark): number {
  const group = mark === "." ? "," : ".";
  const sign = /^[+-]/.test(body) ? body[0] : "";
  const rest = sign ? body.slice(1) : body;
  const parts = rest.split(mark);
  if (parts.length > 2) throw unreadable(text, `has more than one decimal mark "${mark}"`);
  // Stryker disable next-line StringLiteral: equivalent: split always returns at least one part, so the default is never used
  const [int = "", frac] = parts;
  if (frac !== undefined && !/^\d+$/.test(frac)) throw unreadable(text, `is not a number written with the decimal mark "${mark}"`);
  const plain = /^\d*$/.test(int) && (int !== "" || frac !== undefined);
  const grouped = new RegExp(`^\\d{1,3}((${group === "." ? "\\." : ","}\\d{3})+|( \\d{3})+)$`).test(int);
  if (!plain && !grouped) {
    throw unreadable(text, `is not a number written with the decimal mark "${mark}" (thousands may be grouped by "${group}" or a space, three digits a group)`);
  }
  const digits = int.replace(/[ .,]/g, "");
  // No digits before the mark (".5", "-.5"): Number reads a leading decimal point itself.
  return Number(`${sign}${digits}${frac === undefined ? "" : `.${frac}`}`);
}

/** A number with no decimal mark stated: a full stop reads as the decimal point, a comma is refused. */
function parseUnstated(text: string, body: string): number {
  const exp = EXPONENT.exec(body);
  if (exp) return Number(body);
  if (body.includes(",")) {
    throw unreadable(
      text,
      'has a comma, which labs use both as a decimal mark (12,5) and to group thousands (1,250): give decimal "," or "." to say which',
    );
  }
  // "1.250" reads as 1.25 with a decimal point and as 1250 with a decimal comma: the cell alone does not say.
  if (/^[+-]?[1-9]\d{0,2}\.\d{3}$/.test(body)) {
    throw unreadable(text, 'could be read with a decimal point or as thousands grouped by a full stop: give decimal "." or "," to say which');
  }
  return parseWithMark(text, body, ".");
}

function parseNumber(text: string, body: string, mark: LabDecimalMark | undefined): number {
  // A space after the sign ("- 12.5") is dropped here, so every check below (the ambiguous
  // "1.250" among them) sees the number as if written "-12.5". The body comes from labReading's
  // cleaned text: spaces already single, U+2212 already "-", nothing at either end.
  const clean = body.replace(/^([+-]) /, "$1");
  if (clean === "") throw unreadable(text, "has no number");
  const value = mark === undefined ? parseUnstated(text, clean) : EXPONENT.test(clean) && mark === "." ? Number(clean) : parseWithMark(text, clean, mark);
  if (!Number.isFinite(value)) throw unreadable(text, "is not a finite number");
  return value;
}

/**
 * What a laboratory's result cell says: a number, below a limit ("<0.05", or "n.d." with no
 * limit), above a limit (">300"), or not analysed.
 * @param text the cell's text as exported, e.g. "<0.05", "> 300", "n.d.", "trace", "1 250", "12,5"
 * @param decimalMark "." or ","; omitted: a full stop is the decimal point, and a comma (or a
 *   full stop that could group thousands, as in "1.250") is refused rather than guessed
 * @returns the reading
 * @throws NOT_A_NUMBER for text that is none of these (the message lists the words read);
 *   OUT_OF_RANGE for a limit that is not above 0
 * @example labReading("<0,05", ",").kind //=> "below"
 * Source: common practice (src/data/lab/words.json).
 */
export function labReading(text: string, decimalMark?: LabDecimalMark): LabReading {
  // U+2212 (the typographic minus some exports use) is a minus sign everywhere in the cell.
  const t = text.replace(SPACES, " ").replace(/\u2212/g, "-").trim();
  if (t === "") return { kind: "missing" };
  const key = wordKey(t);
  if (BELOW_WORDS.has(key)) return { kind: "below" };
  if (MISSING_WORDS.has(key)) return { kind: "missing" };
  // Stryker disable next-line Regex: equivalent for the regex without "$": (.*) runs to the end either way, since every line break became a space above
  const censored = /^(<=|>=|[<>≤≥])\s*(.*)$/.exec(t);
  if (censored) {
    const sign = censored[1] as string;
    const limit = parseNumber(text, censored[2] as string, decimalMark);
    if (!(limit > 0)) throw new SoilError("OUT_OF_RANGE", `value: "${text}" states a limit of ${limit}; a detection or range limit must be above 0`);
    return /[<≤]/.test(sign) ? { kind: "below", limit } : { kind: "above", limit };
  }
  if (/^[+-]? ?[\d.,]/.test(t)) return { kind: "number", value: parseNumber(text, t, decimalMark) };
  throw unreadable(
    text,
    `is not a lab value LABVALUE reads: a number ("12.5", "1 250", "12,5" with decimal ","), "<0.05", ">300", or ${listWords(LAB_WORDS.map((w) => `"${w}"`))}`,
  );
}

function shownNumber(v: number): string {
  return String(Number(v.toPrecision(12)));
}

/**
 * A laboratory's result as a number, by the policy the consultant names for censored values.
 * A number passes unchanged; "not analysed" words give blank (null).
 * @param value the cell: a number, or text as the lab exported it
 * @param belowWord for a value below detection: limit, half (half the limit), zero or blank;
 *   required when the value is below detection, never assumed
 * @param aboveWord for a value above the range (">300"): limit or blank; required for such a value
 * @param decimalWord "." (point) or "," (comma); see labReading
 * @returns the number, or null for blank
 * @throws MISSING_INPUT for a censored value without its policy (the message gives what each
 *   policy would return); NOT_APPLICABLE for limit or half on a value that states no limit
 *   ("n.d."); UNKNOWN_NAME for a policy or decimal word not listed; as labReading
 * @example labValue("<0.05", "half") //=> 0.025
 * Source: substitution by the limit, half of it or zero as compared by Floit et al. (1996) ASTM
 * STP 1291 (abstract seen); see the file header.
 */
export function labValue(value: number | string, belowWord?: string, aboveWord?: string, decimalWord?: string): number | null {
  const mark = decimalWord === undefined || decimalWord.trim() === "" ? undefined : MARKS.lookup(decimalWord, "decimal mark");
  const below = belowWord === undefined || belowWord.trim() === "" ? undefined : BELOW.lookup(belowWord, "policy for below");
  const above = aboveWord === undefined || aboveWord.trim() === "" ? undefined : ABOVE.lookup(aboveWord, "policy for above");
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new SoilError("NOT_A_NUMBER", "value is not a finite number");
    return value;
  }
  const r = labReading(value, mark);
  switch (r.kind) {
    case "number":
      return r.value;
    case "missing":
      return null;
    case "below":
      return fromBelow(value, r.limit, below);
    case "above":
      return fromAbove(value, r.limit, above);
  }
}

function fromBelow(text: string, limit: number | undefined, policy: LabBelowPolicy | undefined): number | null {
  if (policy === undefined) {
    const choices =
      limit === undefined
        ? "zero or blank (it states no limit, so limit and half cannot apply)"
        : `limit (${shownNumber(limit)}), half (${shownNumber(limit / 2)}), zero or blank`;
    throw new SoilError("MISSING_INPUT", `value "${text.trim()}" is below detection: say how to count it with below: ${choices}`);
  }
  if (policy === "zero") return 0;
  if (policy === "blank") return null;
  if (limit === undefined) {
    throw new SoilError(
      "NOT_APPLICABLE",
      `value "${text.trim()}" states no limit, so below "${policy}" cannot be applied: have the lab's limit written as "<0.05", or choose zero or blank`,
    );
  }
  return policy === "limit" ? limit : limit / 2;
}

function fromAbove(text: string, limit: number, policy: LabAbovePolicy | undefined): number | null {
  if (policy === undefined) {
    throw new SoilError(
      "MISSING_INPUT",
      `value "${text.trim()}" is above the lab's range: say how to count it with above: limit (${shownNumber(limit)}, the least it can be) or blank`,
    );
  }
  return policy === "limit" ? limit : null;
}

/** The accepted words of each option, for help and messages. */
export const LAB_BELOW_POLICIES: readonly string[] = BELOW.ids;
export const LAB_ABOVE_POLICIES: readonly string[] = ABOVE.ids;
export const LAB_DECIMAL_MARKS: readonly string[] = MARKS.ids;
