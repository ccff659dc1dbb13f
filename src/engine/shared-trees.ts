/**
 * One syntax tree for every formula of the same relative shape: a formula filled down a column is
 * parsed once. Two formulas share a tree only when one is the other shifted (its relative
 * references moved by the same rows and columns, everything else identical), decided exactly as
 * the lexer reads references. (A fill-down check that compares a formula with the one above it,
 * character by character without building a key, was tried: no faster at 100,000 samples.)
 */
import { isDigit, isLetter, isNameChar, tokenize } from "./formula/lexer";
import { NameMap, Node, parseTokens } from "./formula/parser";
import { MAX_COLS, MAX_ROWS } from "./formula/values";

/** A word of a reference: the lexer's name characters and "$" (the lexer's own predicates, so a key never reads a word the lexer reads otherwise). */
const isRefChar = (c: number) => isNameChar(c) || c === 36;

/**
 * A formula's text with its relative cell references written as offsets from (row, col), so a
 * formula filled down a column has one key (and one tree). It recognises a reference exactly
 * where the lexer does (a whole word in cell form, not followed by "(", "!" or "["; text in
 * quotes left alone); anything else stays literal, so two formulas share a key only when one is
 * the other shifted. A character scanner, not regular expressions: it runs once per formula cell
 * read (1.2 million in a 100,000-sample season).
 */
export function relativeKey(text: string, row: number, col: number): string {
  let out = "";
  let i = 0;
  const n = text.length;
  let last = 0;
  let positional = false;
  while (i < n) {
    const c = text.charCodeAt(i);
    if (c === 34 || c === 39) {
      // a string or a quoted sheet name: skip to its closing quote ("" and '' escape)
      let j = i + 1;
      for (;;) {
        const q = text.indexOf(c === 34 ? '"' : "'", j);
        if (q < 0) return text; // malformed: no sharing
        if (text.charCodeAt(q + 1) === c) {
          j = q + 2;
          continue;
        }
        i = q + 1;
        break;
      }
      continue;
    }
    if (!isRefChar(c)) {
      i++;
      continue;
    }
    let j = i;
    while (j < n && isRefChar(text.charCodeAt(j))) j++;
    const next = text.charCodeAt(j);
    const w = cellWord(text, i, j, WORD);
    // Whole columns (A:B) and rows (1:3) are relative too, but not in cell form: no sharing.
    if (w.positional && (next === 58 || text.charCodeAt(i - 1) === 58)) positional = true;
    if (next !== 40 && next !== 33 && next !== 91 && w.col >= 0) {
      out += text.slice(last, i);
      out += `\u0001${w.colAbs ? `$${w.col}` : w.col - col},${w.rowAbs ? `$${w.row}` : w.row - row}\u0001`;
      last = j;
    }
    i = j;
  }
  return out + text.slice(last) + (positional ? `\u0002${row},${col}` : "");
}

/** A word read as a cell: col ≥ 0 (0-based, inside Excel's grid) or −1 (not a cell); positional: a whole-column or whole-row form. */
interface CellWord {
  col: number;
  row: number;
  colAbs: boolean;
  rowAbs: boolean;
  positional: boolean;
}
// A scratch word, filled in place: this runs per word of every formula cell, so nothing is allocated.
const WORD: CellWord = { col: -1, row: -1, colAbs: false, rowAbs: false, positional: false };

/** Reads the word [i, end) of `text` into `w` and returns it. */
function cellWord(text: string, i: number, end: number, w: CellWord): CellWord {
  const colAbs = text.charCodeAt(i) === 36;
  const at = colAbs ? i + 1 : i;
  let p = at;
  let k = 0;
  while (p < end && p - at < 3) {
    const c = text.charCodeAt(p);
    if (!isLetter(c)) break;
    k = k * 26 + ((c | 32) - 96);
    p++;
  }
  const lettersEnd = p;
  let d = at;
  while (d < end && d - at < 7 && isDigit(text.charCodeAt(d))) d++;
  w.colAbs = colAbs;
  w.positional = (lettersEnd > at && lettersEnd === end) || (d > at && d === end);
  w.col = -1;
  w.row = -1;
  w.rowAbs = false;
  if (lettersEnd === at || lettersEnd === end) return w;
  const rowAbs = text.charCodeAt(lettersEnd) === 36;
  const digitsAt = rowAbs ? lettersEnd + 1 : lettersEnd;
  let rowNumber = 0;
  p = digitsAt;
  while (p < end && p - digitsAt < 7) {
    const c = text.charCodeAt(p);
    if (!isDigit(c)) break;
    rowNumber = rowNumber * 10 + (c - 48);
    p++;
  }
  if (p === digitsAt || p !== end) return w;
  const col = k - 1;
  const row = rowNumber - 1;
  if (col >= MAX_COLS || row < 0 || row >= MAX_ROWS) return w;
  w.col = col;
  w.row = row;
  w.rowAbs = rowAbs;
  return w;
}

/** The trees of a workbook's formulas, shared by relative shape (relativeKey). */
export class SharedTrees {
  private readonly byKey = new Map<string, Node>();
  constructor(private readonly names: NameMap) {}

  /** The tree of `text` (with or without its leading "=") written at (row, col); throws FormulaSyntaxError. */
  tree(text: string, row: number, col: number): Node {
    const body = text.charCodeAt(0) === 61 ? text.slice(1) : text;
    const key = relativeKey(body, row, col);
    let node = this.byKey.get(key);
    if (!node) {
      node = parseTokens(tokenize(body), row, col, this.names);
      if (this.byKey.size < 200000) this.byKey.set(key, node);
    }
    return node;
  }
}
