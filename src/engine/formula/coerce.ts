/**
 * Excel's conversions between value types, as the operators and functions apply them. Where
 * Excel's own conversion depends on the machine's locale (text such as "01/02/2025",
 * "2025-03-10", "$5", "1,234", "3 PM" or "(5)" read as a number), the engine does not compute the
 * cell (an error with a message that IFERROR cannot swallow) instead of guessing.
 */
import { Scalar, XlError, err, isError } from "./values";
import { notComputed } from "./not-computed";

const NUMBER_TEXT = /^\s*([+-]?)(\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?\s*(%?)\s*$/;

/** Text read as a number where Excel reads it the same in every locale; undefined otherwise. */
export function numberFromText(s: string): number | undefined {
  const m = NUMBER_TEXT.exec(s);
  if (!m) return undefined;
  let n = Number(`${m[1]}${m[2]}${m[3] !== undefined ? `e${m[3]}` : ""}`);
  if (m[4]) n /= 100;
  return Number.isFinite(n) ? n : undefined;
}

/**
 * Text Excel may read as a number, a date or a time, by rules that depend on the computer's
 * regional settings: digits with date, time, grouping or currency marks ("01/02/2025",
 * "2025-03-10", "10:30", "1,234", "$5", "1 250"), an accounting negative "(5)", a time with AM/PM,
 * or a date with a month's name. The engine cannot know the locale, so it does not decide.
 */
const LOCALE_READ = [
  /\d[/:,$€£¥\-.]\s*\d|[$€£¥]\s*\d|\d\s*[$€£¥]|\d\s+\d/,
  /^\s*[-+]?\s*\(\s*[$€£¥]?\s*[\d.,]*\d[\d.,]*\s*%?\s*\)\s*$/,
  /\d\s*[ap]\.?\s*m?\.?\s*$/i,
  /\d.*\b(jan|feb|mar|apr|may|jun|jul|aug|sep|oct|nov|dec)|\b(jan|feb|mar|apr|may|jun|jul|aug|sep|oct|nov|dec)[a-z]*\.?[\s\-/]*\d/i,
];

function textNotNumber(s: string): XlError {
  const shown = s.length > 40 ? `${s.slice(0, 40)}…` : s;
  // Not computed, and never an ordinary error that IFERROR or ISNUMBER could turn into a
  // plausible answer.
  if (LOCALE_READ.some((re) => re.test(s))) {
    notComputed(`text "${shown}" is not read as a number headless: Excel's reading of it depends on the computer's locale; enter a number`);
  }
  return err("#VALUE!", `text "${shown}" is not a number`);
}

/** A scalar as a number: blank is 0, TRUE 1, numeric text its number; other text #VALUE!. */
export function toNumber(v: Scalar): number | XlError {
  // Stryker disable next-line ConditionalExpression,StringLiteral: equivalent: a number skipped here reaches the final return v
  if (typeof v === "number") return v;
  if (v === null) return 0;
  if (typeof v === "boolean") return v ? 1 : 0;
  if (typeof v === "string") {
    const n = numberFromText(v);
    return n === undefined ? textNotNumber(v) : n;
  }
  return v;
}

/**
 * A number as Excel writes it in text (15 significant digits): plain up to 20 characters
 * (1E+19 is "10000000000000000000"), E notation with a two-digit exponent from 1E+20 up and
 * below 1 where "0.", the leading zeros and the digits would be more than 20 characters.
 */
export function numberToText(n: number): string {
  // Stryker disable next-line ConditionalExpression: equivalent: the digits path writes 0 and -0 as "0" too
  if (n === 0) return "0";
  if (!Number.isFinite(n)) return "#NUM!";
  const [mant, exp] = Math.abs(n).toExponential(14).split("e") as [string, string];
  // The significant digits, without the point and trailing zeros; rounding to 15 digits can
  // carry into the exponent (9.999999999999999 is 10), which toExponential already did.
  const digits = mant.replace(".", "").replace(/0+$/, "");
  const e = Number(exp);
  // Stryker disable next-line EqualityOperator: equivalent for n <= 0: 0 returned above
  const sign = n < 0 ? "-" : "";
  // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent for true or e <= 0 in place of e < 0: at e >= 0 the length test is 1 − e + at most 15 digits, never above 20
  if (e > 19 || (e < 0 && 2 + (-e - 1) + digits.length > 20)) {
    const m = digits.length > 1 ? `${digits[0]}.${digits.slice(1)}` : digits;
    // Stryker disable next-line EqualityOperator: equivalent for e <= 0: e is above 19 or below 0 here
    return `${sign}${m}E${e < 0 ? "-" : "+"}${String(Math.abs(e)).padStart(2, "0")}`;
  }
  if (e < 0) return `${sign}0.${"0".repeat(-e - 1)}${digits}`;
  if (digits.length > e + 1) return `${sign}${digits.slice(0, e + 1)}.${digits.slice(e + 1)}`;
  return `${sign}${digits}${"0".repeat(e + 1 - digits.length)}`;
}

/** A scalar as text: numbers in General format, TRUE/FALSE, blank as "". */
export function toText(v: Scalar): string | XlError {
  // Stryker disable next-line ConditionalExpression,StringLiteral: equivalent: text skipped here reaches the final return v
  if (typeof v === "string") return v;
  if (v === null) return "";
  if (typeof v === "number") return numberToText(v);
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  return v;
}

/** A scalar as a boolean: numbers are TRUE unless 0; text "TRUE"/"FALSE"; blank FALSE. */
export function toBool(v: Scalar): boolean | XlError {
  // Stryker disable next-line ConditionalExpression,StringLiteral: equivalent: a boolean skipped here reaches the final return v
  if (typeof v === "boolean") return v;
  if (v === null) return false;
  if (typeof v === "number") return v !== 0;
  if (typeof v === "string") {
    const u = v.trim().toUpperCase();
    if (u === "TRUE") return true;
    if (u === "FALSE") return false;
    return err("#VALUE!", `text "${v.length > 40 ? `${v.slice(0, 40)}…` : v}" is not TRUE or FALSE`);
  }
  return v;
}

const E48 = 2 ** -48;

/** Two numbers equal to within the last few bits, as spreadsheets compare them. */
export function approxEqual(a: number, b: number): boolean {
  if (a === b) return true;
  // A zero side gives a zero tolerance: only an exact 0 equals 0.
  return Math.abs(a - b) < Math.min(Math.abs(a), Math.abs(b)) * E48;
}

/** a + b, with a result that only reflects rounding noise of nearly cancelling operands set to 0. */
export function approxAdd(a: number, b: number): number {
  // approxEqual(a, -b) already implies opposite signs (or both 0), so no sign test is needed.
  if (approxEqual(a, -b)) return 0;
  return a + b;
}

export function approxSub(a: number, b: number): number {
  if (approxEqual(a, b)) return 0;
  return a - b;
}

function typeRank(v: Scalar): number {
  if (typeof v === "number") return 0;
  if (typeof v === "string") return 1;
  return 2; // boolean
}

/**
 * Excel's comparison of two scalars: -1, 0 or 1. Blank takes the other side's type (0, "" or
 * FALSE); numbers sort before text before booleans; text compares without regard to case.
 */
export function compare(a: Scalar, b: Scalar): number | XlError {
  if (isError(a)) return a;
  if (isError(b)) return b;
  // Stryker disable next-line ConditionalExpression: equivalent: two blanks skipped here both become FALSE, which compare equal
  if (a === null && b === null) return 0;
  if (a === null) a = typeof b === "number" ? 0 : typeof b === "string" ? "" : false;
  if (b === null) b = typeof a === "number" ? 0 : typeof a === "string" ? "" : false;
  const ra = typeRank(a);
  const rb = typeRank(b);
  // Stryker disable next-line EqualityOperator: equivalent: ra !== rb here, so ra <= rb is ra < rb
  if (ra !== rb) return ra < rb ? -1 : 1;
  if (typeof a === "number") {
    const nb = b as number;
    if (approxEqual(a, nb)) return 0;
    // Stryker disable next-line EqualityOperator: equivalent: a !== nb here, so a <= nb is a < nb
    return a < nb ? -1 : 1;
  }
  if (typeof a === "string") return compareText(a, b as string);
  return a === b ? 0 : a ? 1 : -1;
}

// Text order as a spreadsheet sorts it: case ignored, punctuation before digits before letters,
// an accented letter beside its base letter (ICU's order for en-US, fixed whatever the machine's
// locale). Equal only when the same text ignoring case ("ß" is not "ss", "é" is not "e").
const COLLATOR = new Intl.Collator("en-US", { sensitivity: "accent" });

function compareText(a: string, b: string): number {
  const x = a.toLowerCase();
  const y = b.toLowerCase();
  if (x === y) return 0;
  const c = COLLATOR.compare(x, y);
  // Stryker disable next-line EqualityOperator: equivalent: c !== 0 here, so c <= 0 is c < 0
  if (c !== 0) return c < 0 ? -1 : 1;
  return x < y ? -1 : 1;
}

/**
 * x^y as the ^ operator and POWER compute it (one rule for both). 0^0 is #NUM! and 0 to a negative
 * power #DIV/0! (Microsoft Support, POWER and "Calculation operators": from memory). Odd roots of
 * negative numbers are taken: (-2)^(1/3) = -1.25992 on a worksheet, and POWER(-2,1/3) too
 * (practitioners' report, Stack Overflow question 6911356, 2011, "How to take the cube root of a
 * negative number in VBA for Excel"); other fractional powers of a negative number are #NUM!.
 * A result too small for a normal double (below 2.2250738585072014E-308, the smallest Excel
 * holds: from memory) from a base that is not 0 is refused: LibreOffice gives #NUM!, and whether
 * Excel gives 0 or #NUM! is not established here.
 */
export function power(x: number, y: number): number | XlError {
  if (x === 0 && y === 0) return err("#NUM!", "0^0 is not defined");
  // Stryker disable next-line EqualityOperator: equivalent for y <= 0: 0^0 returned above
  if (x === 0 && y < 0) return err("#DIV/0!", "0 raised to a negative power");
  let r: number;
  if (x < 0 && !Number.isInteger(y)) {
    const inv = 1 / y;
    const k = Math.round(inv);
    // Stryker disable next-line EqualityOperator: equivalent for >: 1/y − k is a multiple of 2^-52 or coarser when k ≠ 0 (and 1/y = 1e-12 means y is whole), and the double 1e-12 is not, so equality cannot occur
    if (Math.abs(inv - k) >= 1e-12 || k % 2 === 0) return err("#NUM!", "a negative number raised to a fractional power");
    r = -Math.pow(-x, y);
  } else r = Math.pow(x, y);
  if (x !== 0 && Math.abs(r) < 2.2250738585072014e-308) notComputed(`${x}^${y} is smaller than the smallest number a worksheet holds (about 2.2E-308): whether Excel gives 0 or #NUM! is not established headless`);
  return finite(r);
}

/** A finite number, or #NUM! for results Excel cannot hold (overflow, NaN). */
export function finite(n: number, what = "the result"): number | XlError {
  return Number.isFinite(n) ? (n === 0 ? 0 : n) : err("#NUM!", `${what} is not a finite number`);
}
