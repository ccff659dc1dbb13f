/**
 * Excel formula text into tokens, with the offsets of each, for the parser and for rewriting
 * function names in place (Excel's stored form `_xldudf_SOIL_CEC(` versus the typed
 * `SOIL.CEC(`). Strings, sheet names and array constants are read as Excel reads them, so a
 * word inside a string ("NH3", "SOIL.CEC(") is never taken for a reference or a name.
 */
import { MAX_COLS, MAX_ROWS, isErrorCode } from "./values";

export const enum T {
  Num,
  Str,
  Bool,
  Err,
  /** A cell, range, whole-column or whole-row reference, with an optional sheet prefix. */
  Ref,
  /** A defined name (or table name), with an optional sheet prefix. */
  Name,
  /** A function name; the next token is "(". */
  Func,
  Op,
  LParen,
  RParen,
  Comma,
  Semi,
  LBrace,
  RBrace,
  /** The spill-range operator, postfix: A1#. */
  Hash,
  /** Something the engine does not evaluate: structured, external and 3-D references. */
  Unsupported,
  End,
}

export interface RefParts {
  readonly sheet?: string;
  /** 0-based; undefined for the open side of a whole-column (rows) or whole-row (cols) range. */
  readonly r1?: number;
  readonly c1?: number;
  readonly r2?: number;
  readonly c2?: number;
  readonly ra1: boolean;
  readonly ca1: boolean;
  readonly ra2: boolean;
  readonly ca2: boolean;
  readonly range: boolean;
}

export interface Token {
  readonly t: T;
  readonly start: number;
  readonly end: number;
  /** Whitespace came before this token (the intersection operator is a space). */
  readonly space: boolean;
  /** Num: the number; Str: the text; Bool; Err: the code; Op: the operator; Name/Func: the name as written. */
  readonly value?: string | number | boolean;
  readonly ref?: RefParts;
  /** Name with a sheet prefix (Sheet1!Name). */
  readonly sheet?: string;
  /** Unsupported: the table a structured reference names (Table1[Ca] → "Table1"). */
  readonly table?: string;
}

export class FormulaSyntaxError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "FormulaSyntaxError";
  }
}

export const isDigit = (c: number) => c >= 48 && c <= 57;
export const isLetter = (c: number) => (c >= 65 && c <= 90) || (c >= 97 && c <= 122);
const isSpace = (c: number) => c === 32 || c === 10 || c === 13 || c === 9 || c === 0xa0;
/** Letters of other scripts; the non-breaking space is whitespace, never part of a name. */
const isOtherLetter = (c: number) => c > 127 && c !== 0xa0;
/** Characters of a name or unquoted sheet name: letters (any script), digits, _ . \ ? */
export function isNameChar(c: number): boolean {
  return isLetter(c) || isDigit(c) || c === 95 || c === 46 || c === 92 || c === 63 || isOtherLetter(c);
}
function isNameStart(c: number): boolean {
  return isLetter(c) || c === 95 || c === 92 || isOtherLetter(c);
}

function columnNumber(letters: string): number {
  let n = 0;
  for (let i = 0; i < letters.length; i++) n = n * 26 + ((letters.charCodeAt(i) | 32) - 96);
  return n - 1;
}

const CELL = /^(\$?)([A-Za-z]{1,3})(\$?)([0-9]{1,7})/;
const COLUMN = /^(\$?)([A-Za-z]{1,3})/;
const ROW = /^(\$?)([0-9]{1,7})/;

interface Corner {
  row?: number;
  col?: number;
  rowAbs: boolean;
  colAbs: boolean;
  length: number;
}

/** A cell corner at `s` (A1, $A$1), or undefined. Rows and columns are checked against Excel's limits. */
function cellAt(s: string): Corner | undefined {
  const m = CELL.exec(s);
  if (!m) return undefined;
  const col = columnNumber(m[2] as string);
  const row = Number(m[4]) - 1;
  if (col >= MAX_COLS || row < 0 || row >= MAX_ROWS) return undefined;
  return { row, col, rowAbs: m[3] === "$", colAbs: m[1] === "$", length: m[0].length };
}

function columnAt(s: string): Corner | undefined {
  const m = COLUMN.exec(s);
  if (!m) return undefined;
  const col = columnNumber(m[2] as string);
  if (col >= MAX_COLS) return undefined;
  // Stryker disable next-line BooleanLiteral: equivalent: a column corner's rowAbs is never read (refAt writes ra1/ra2 itself)
  return { col, colAbs: m[1] === "$", rowAbs: true, length: m[0].length };
}

function rowAt(s: string): Corner | undefined {
  const m = ROW.exec(s);
  if (!m) return undefined;
  const row = Number(m[2]) - 1;
  if (row < 0 || row >= MAX_ROWS) return undefined;
  // Stryker disable next-line BooleanLiteral: equivalent: a row corner's colAbs is never read (rowRangeAt writes ca1/ca2 itself)
  return { row, rowAbs: m[1] === "$", colAbs: true, length: m[0].length };
}

/** What may follow a reference without making it part of a longer name. */
function endsWord(s: string, i: number): boolean {
  // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: charCodeAt past the end is NaN, which no character test accepts (so the next line also says true)
  if (i >= s.length) return true;
  const c = s.charCodeAt(i);
  return !(isNameChar(c) || c === 40 /* ( */ || c === 33 /* ! */ || c === 91 /* [ */);
}

/**
 * Tokenizes a formula (without its leading "="). Throws FormulaSyntaxError for text that is not a
 * formula Excel could have saved.
 */
export function tokenize(text: string): Token[] {
  const out: Token[] = [];
  const n = text.length;
  let i = 0;
  let braces = 0;
  const push = (tok: Token) => out.push(tok);
  // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: at i >= n the loop body breaks before reading
  while (i < n) {
    let space = false;
    // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: charCodeAt past the end is NaN, which no character test accepts
    while (i < n && isSpace(text.charCodeAt(i))) {
      i++;
      space = true;
    }
    if (i >= n) break;
    const start = i;
    const c = text.charCodeAt(i);
    const rest = () => text.slice(i);

    // Strings
    if (c === 34) {
      let j = i + 1;
      let s = "";
      for (;;) {
        const q = text.indexOf('"', j);
        // Stryker disable next-line EqualityOperator: equivalent: the search starts after the opening quote, so q is never 0
        if (q < 0) throw new FormulaSyntaxError("a string is not closed");
        s += text.slice(j, q);
        if (text.charCodeAt(q + 1) === 34) {
          s += '"';
          j = q + 2;
          continue;
        }
        j = q + 1;
        break;
      }
      push({ t: T.Str, start, end: j, space, value: s });
      i = j;
      continue;
    }

    // Error literals (and #REF! standing for a reference)
    if (c === 35 /* # */) {
      const prev = out[out.length - 1];
      if (prev && !space && (prev.t === T.Ref || prev.t === T.Name || prev.t === T.RParen)) {
        push({ t: T.Hash, start, end: i + 1, space });
        i++;
        continue;
      }
      const m = /^#(NULL!|DIV\/0!|VALUE!|REF!|NAME\?|NUM!|N\/A|GETTING_DATA|SPILL!|CALC!|FIELD!|BLOCKED!|CONNECT!|BUSY!|UNKNOWN!|PYTHON!)/i.exec(rest());
      // Stryker disable next-line ConditionalExpression: equivalent: the regex lists exactly the error codes, so isErrorCode holds whenever it matches
      if (!m || !isErrorCode(m[0])) throw new FormulaSyntaxError(`unexpected "#" at ${i + 1}`);
      push({ t: T.Err, start, end: i + m[0].length, space, value: m[0].toUpperCase() });
      i += m[0].length;
      continue;
    }

    // Sheet prefixes: 'quoted name'!, [external]…!, Name!
    let sheet: string | undefined;
    let j = i;
    if (c === 39 /* ' */) {
      let k = i + 1;
      let s = "";
      for (;;) {
        const q = text.indexOf("'", k);
        // Stryker disable next-line EqualityOperator: equivalent: the search starts after the opening apostrophe, so q is never 0
        if (q < 0) throw new FormulaSyntaxError("a quoted sheet name is not closed");
        s += text.slice(k, q);
        if (text.charCodeAt(q + 1) === 39) {
          s += "'";
          k = q + 2;
          continue;
        }
        k = q + 1;
        break;
      }
      if (text.charCodeAt(k) !== 33) throw new FormulaSyntaxError(`a quoted name must be followed by "!" at ${k + 1}`);
      if (s.startsWith("[") || s.includes(":")) {
        // '[1]Sheet 1'!A1 (another workbook) or 'Sheet1:Sheet3'!A1 (3-D)
        const e = skipReferenceBody(text, k + 1);
        push({ t: T.Unsupported, start, end: e, space, value: s.startsWith("[") ? "a reference to another workbook" : "a 3-D reference across sheets" });
        i = e;
        continue;
      }
      sheet = s;
      j = k + 1;
    } else if (c === 91 /* [ */) {
      // [1]Sheet1!A1, [1]!Name (external) or [@Col] / [#This Row] (structured, table-relative)
      const close = matchingBracket(text, i);
      const after = text.charCodeAt(close + 1);
      const external = after === 33 || isNameStart(after) || isDigit(after);
      const e = external ? skipReferenceBody(text, close + 1) : close + 1;
      push({ t: T.Unsupported, start, end: e, space, value: external ? "a reference to another workbook" : "a structured (table) reference" });
      i = e;
      continue;
    } else if (isNameStart(c) || isDigit(c)) {
      // An unquoted prefix: a word followed by "!" (or word:word! for 3-D). "$" starts none: it is no name character.
      let k = i;
      // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: charCodeAt past the end is NaN, which no character test accepts
      while (k < n && isNameChar(text.charCodeAt(k))) k++;
      // k > i here: the branch starts at a name character (isNameStart and digits are name characters).
      if (text.charCodeAt(k) === 33) {
        sheet = text.slice(i, k);
        j = k + 1;
      } else if (text.charCodeAt(k) === 58 /* : */) {
        let k2 = k + 1;
        // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: charCodeAt past the end is NaN, which no character test accepts
        while (k2 < n && isNameChar(text.charCodeAt(k2))) k2++;
        if (k2 > k + 1 && text.charCodeAt(k2) === 33) {
          // Stryker disable next-line ArithmeticOperator: equivalent: text[k2 - 1] is a name character and text[k2] is "!", both skipped alike
          const e = skipReferenceBody(text, k2 + 1);
          push({ t: T.Unsupported, start, end: e, space, value: "a 3-D reference across sheets" });
          i = e;
          continue;
        }
      }
    }

    if (sheet !== undefined) {
      const body = text.slice(j);
      if (body.toUpperCase().startsWith("#REF!")) {
        push({ t: T.Err, start, end: j + 5, space, value: "#REF!" });
        i = j + 5;
        continue;
      }
      // Sheet1!1:3 is a whole-row range like 1:3 (ECMA-376 Part 1, §18.17.2.3 cell references).
      const ref = refAt(body) ?? rowRangeAt(body);
      if (ref) {
        push({ t: T.Ref, start, end: j + ref.length, space, ref: { ...ref.parts, sheet } });
        i = j + ref.length;
        continue;
      }
      let k = j;
      // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: charCodeAt past the end is NaN, which no character test accepts
      if (k < n && isNameStart(text.charCodeAt(k))) {
        // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: charCodeAt past the end is NaN, which no character test accepts
        while (k < n && isNameChar(text.charCodeAt(k))) k++;
        push({ t: T.Name, start, end: k, space, value: text.slice(j, k), sheet });
        i = k;
        continue;
      }
      throw new FormulaSyntaxError(`a sheet name must be followed by a reference at ${j + 1}`);
    }

    // Numbers, or a whole-row range (1:3)
    if (isDigit(c) || (c === 46 && isDigit(text.charCodeAt(i + 1)))) {
      const rr = rowRangeAt(rest());
      if (rr) {
        push({ t: T.Ref, start, end: i + rr.length, space, ref: rr.parts });
        i += rr.length;
        continue;
      }
      const m = /^(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?/.exec(rest()) as RegExpExecArray;
      const value = Number(m[0]);
      // 1E400 is beyond a double (Excel's numbers are IEC 60559 doubles): refuse, never Infinity.
      if (!Number.isFinite(value)) throw new FormulaSyntaxError(`the number ${m[0]} is too large, at ${i + 1}`);
      push({ t: T.Num, start, end: i + m[0].length, space, value });
      i += m[0].length;
      continue;
    }

    // References without a sheet
    // Stryker disable next-line ConditionalExpression: equivalent: refAt finds nothing in text that starts with neither "$" nor a letter
    if (c === 36 || isLetter(c)) {
      const ref = refAt(rest());
      if (ref) {
        push({ t: T.Ref, start, end: i + ref.length, space, ref: ref.parts });
        i += ref.length;
        continue;
      }
      if (c === 36) {
        const rr = rowRangeAt(rest());
        if (rr) {
          push({ t: T.Ref, start, end: i + rr.length, space, ref: rr.parts });
          i += rr.length;
          continue;
        }
        throw new FormulaSyntaxError(`unexpected "$" at ${i + 1}`);
      }
    }

    // Names, functions, TRUE/FALSE, structured references (Table1[Col])
    if (isNameStart(c)) {
      let k = i;
      // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: charCodeAt past the end is NaN, which no character test accepts
      while (k < n && isNameChar(text.charCodeAt(k))) k++;
      const word = text.slice(i, k);
      let k2 = k;
      // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: charCodeAt past the end is NaN, which no character test accepts
      while (k2 < n && isSpace(text.charCodeAt(k2))) k2++;
      if (text.charCodeAt(k2) === 40 /* ( */ && !(braces > 0)) {
        push({ t: T.Func, start, end: k, space, value: word });
        i = k;
        continue;
      }
      if (text.charCodeAt(k) === 91 /* [ */) {
        const close = matchingBracket(text, k);
        push({ t: T.Unsupported, start, end: close + 1, space, value: "a structured (table) reference", table: word });
        i = close + 1;
        continue;
      }
      const upper = word.toUpperCase();
      if (upper === "TRUE" || upper === "FALSE") {
        push({ t: T.Bool, start, end: k, space, value: upper === "TRUE" });
      } else {
        push({ t: T.Name, start, end: k, space, value: word });
      }
      i = k;
      continue;
    }

    // Operators and punctuation
    const two = text.slice(i, i + 2);
    if (two === "<=" || two === ">=" || two === "<>") {
      push({ t: T.Op, start, end: i + 2, space, value: two });
      i += 2;
      continue;
    }
    switch (c) {
      case 43: // +
      case 45: // -
      case 42: // *
      case 47: // /
      case 94: // ^
      case 38: // &
      case 61: // =
      case 60: // <
      case 62: // >
      case 37: // %
      case 58: // :
      case 64: // @
        push({ t: T.Op, start, end: i + 1, space, value: text[i] as string });
        break;
      case 40:
        push({ t: T.LParen, start, end: i + 1, space });
        break;
      case 41:
        push({ t: T.RParen, start, end: i + 1, space });
        break;
      case 44:
        push({ t: T.Comma, start, end: i + 1, space });
        break;
      case 59:
        if (braces === 0) throw new FormulaSyntaxError(`";" is not an argument separator in a stored formula (use ","), at ${i + 1}`);
        push({ t: T.Semi, start, end: i + 1, space });
        break;
      case 123:
        braces++;
        push({ t: T.LBrace, start, end: i + 1, space });
        break;
      case 125:
        braces--;
        push({ t: T.RBrace, start, end: i + 1, space });
        break;
      default:
        throw new FormulaSyntaxError(`unexpected character "${text[i]}" at ${i + 1}`);
    }
    i++;
  }
  out.push({ t: T.End, start: n, end: n, space: false });
  return out;
}

function matchingBracket(text: string, open: number): number {
  let depth = 0;
  // Stryker disable next-line EqualityOperator: equivalent: charCodeAt past the end is NaN, which no character test accepts
  for (let k = open; k < text.length; k++) {
    const ch = text.charCodeAt(k);
    if (ch === 39 /* ' escapes the next character inside structured references */) {
      k++;
      continue;
    }
    if (ch === 91) depth++;
    else if (ch === 93 && --depth === 0) return k;
  }
  throw new FormulaSyntaxError("a [ is not closed");
}

/** The end of what follows a sheet prefix: a reference, a name or #REF!. */
function skipReferenceBody(text: string, from: number): number {
  let k = from;
  // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: charCodeAt past the end is NaN, which no character test accepts
  while (k < text.length && (isNameChar(text.charCodeAt(k)) || text.charCodeAt(k) === 36 || text.charCodeAt(k) === 58 || text.charCodeAt(k) === 33 || text.charCodeAt(k) === 35)) k++;
  return k;
}

interface RefMatch {
  parts: RefParts;
  length: number;
}

/** A1, A1:B2, A:B at the start of `s`, not followed by more of a name. */
function refAt(s: string): RefMatch | undefined {
  const a = cellAt(s);
  if (a) {
    if (s.charCodeAt(a.length) === 58 /* : */) {
      const b = cellAt(s.slice(a.length + 1));
      if (b && endsWord(s, a.length + 1 + b.length)) {
        return {
          parts: { r1: a.row, c1: a.col, r2: b.row, c2: b.col, ra1: a.rowAbs, ca1: a.colAbs, ra2: b.rowAbs, ca2: b.colAbs, range: true },
          length: a.length + 1 + b.length,
        };
      }
    }
    if (endsWord(s, a.length)) {
      return { parts: { r1: a.row, c1: a.col, r2: a.row, c2: a.col, ra1: a.rowAbs, ca1: a.colAbs, ra2: a.rowAbs, ca2: a.colAbs, range: false }, length: a.length };
    }
    return undefined;
  }
  const ca = columnAt(s);
  if (ca && s.charCodeAt(ca.length) === 58) {
    const cb = columnAt(s.slice(ca.length + 1));
    if (cb && endsWord(s, ca.length + 1 + cb.length)) {
      return {
        parts: { c1: ca.col, c2: cb.col, ca1: ca.colAbs, ca2: cb.colAbs, ra1: true, ra2: true, range: true },
        length: ca.length + 1 + cb.length,
      };
    }
  }
  return undefined;
}

function rowRangeAt(s: string): RefMatch | undefined {
  const a = rowAt(s);
  if (!a || s.charCodeAt(a.length) !== 58) return undefined;
  const b = rowAt(s.slice(a.length + 1));
  if (!b || !endsWord(s, a.length + 1 + b.length)) return undefined;
  return { parts: { r1: a.row, r2: b.row, ra1: a.rowAbs, ra2: b.rowAbs, ca1: true, ca2: true, range: true }, length: a.length + 1 + b.length };
}
