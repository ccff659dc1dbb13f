/**
 * A sheet's cells as the engine holds them: column arrays indexed by a cell number (cells in
 * file order), not one object per cell. A season of 100,000 samples is about two million cells;
 * as objects they cost more memory and collector time than everything else the engine does.
 *
 * Cell numbers are the handles the planner, the evaluator and the writer pass around.
 */
import type { Node } from "./formula/parser";
import { ErrorCode, Rect, Scalar, XlError } from "./formula/values";

/** What a cell's cached value is. */
export const enum Kind {
  Blank = 0,
  Number = 1,
  Text = 2,
  Bool = 3,
  Error = 4,
}

/** How a formula is stored, which decides how Excel evaluates it. */
export const enum Form {
  /** A plain <f>: a legacy formula (implicit intersection where legacy Excel applied it). */
  Plain = 0,
  /** A member of a shared formula (filled down or across): legacy, like plain. */
  Shared = 1,
  /** A legacy array (CSE) formula over a fixed range. */
  Array = 2,
  /** An Excel 365 dynamic-array formula (cm pointing at XLDAPR metadata): spills to fit. */
  Dynamic = 3,
  /** A what-if data table: not computed headless. */
  Table = 4,
}

function grow<T extends Int32Array | Uint8Array | Float64Array>(a: T, need: number): T {
  if (need <= a.length) return a;
  let size = a.length * 2;
  while (size < need) size *= 2;
  const b = new (a.constructor as new (n: number) => T)(size);
  b.set(a);
  return b;
}

/** Interned error values of the file (an error cell carries no message). */
const FILE_ERRORS = new Map<string, XlError>();
function fileError(code: ErrorCode): XlError {
  let e = FILE_ERRORS.get(code);
  if (!e) FILE_ERRORS.set(code, (e = new XlError(code)));
  return e;
}

export class CellStore {
  n = 0;
  row: Int32Array;
  col: Int32Array;
  /** Offsets of the whole <c> element in the sheet part. */
  start: Int32Array;
  end: Int32Array;
  /** Kind of the cached value, plus 8 when the file caches one (a formula without one is computed). */
  kind: Uint8Array;
  num: Float64Array;
  /** Text and error values, by cell number (holes elsewhere). */
  readonly obj: (string | XlError | undefined)[] = [];
  /** The cell's formula number, or -1. */
  formula: Int32Array;
  /** The planner's number for a cell it computes, -1 otherwise. */
  planId: Int32Array;

  /** `expected`: a guess at the number of cells (from the part's size), so the arrays rarely grow. */
  constructor(expected = 1024) {
    const n = Math.max(16, Math.ceil(expected));
    this.row = new Int32Array(n);
    this.col = new Int32Array(n);
    this.start = new Int32Array(n);
    this.end = new Int32Array(n);
    this.kind = new Uint8Array(n);
    this.num = new Float64Array(n);
    this.formula = new Int32Array(n);
    this.planId = new Int32Array(n);
  }
  /** First cell number of each row (rowFirst[r]..rowFirst[r+1]); built by finish(). */
  private rowFirst = new Int32Array(0);
  /** Last row (0-based) that holds a cell, -1 when none. */
  maxRow = -1;
  /** Last column that holds a cell, -1 when none. */
  maxCol = -1;

  add(row: number, col: number, start: number, end: number): number {
    const k = this.n++;
    if (k >= this.row.length) {
      const need = k + 1;
      this.row = grow(this.row, need);
      this.col = grow(this.col, need);
      this.start = grow(this.start, need);
      this.end = grow(this.end, need);
      this.kind = grow(this.kind, need);
      this.num = grow(this.num, need);
      this.formula = grow(this.formula, need);
      this.planId = grow(this.planId, need);
    }
    this.row[k] = row;
    this.col[k] = col;
    this.start[k] = start;
    this.end[k] = end;
    this.kind[k] = Kind.Blank;
    this.formula[k] = -1;
    this.planId[k] = -1;
    if (row > this.maxRow) this.maxRow = row;
    if (col > this.maxCol) this.maxCol = col;
    return k;
  }

  setNumber(k: number, v: number): void {
    this.kind[k] = Kind.Number | 8;
    this.num[k] = v;
  }
  setBool(k: number, v: boolean): void {
    this.kind[k] = Kind.Bool | 8;
    this.num[k] = v ? 1 : 0;
  }
  setText(k: number, v: string): void {
    this.kind[k] = Kind.Text | 8;
    this.obj[k] = v;
  }
  setError(k: number, code: ErrorCode): void {
    this.kind[k] = Kind.Error | 8;
    this.obj[k] = fileError(code);
  }

  /** Cells are added in file order (rows ascending, columns ascending within a row). */
  finish(): void {
    const first = new Int32Array(this.maxRow + 2);
    let k = 0;
    for (let r = 0; r <= this.maxRow + 1; r++) {
      while (k < this.n && (this.row[k] as number) < r) k++;
      first[r] = k;
    }
    this.rowFirst = first;
  }

  /** The cell number at a position, or -1. */
  find(row: number, col: number): number {
    if (row < 0 || row > this.maxRow) return -1;
    let lo = this.rowFirst[row] as number;
    let hi = (this.rowFirst[row + 1] as number) - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const c = this.col[mid] as number;
      if (c === col) return mid;
      if (c < col) lo = mid + 1;
      else hi = mid - 1;
    }
    return -1;
  }

  /** The first and one-past-last cell numbers of a row. */
  rowRange(row: number): [number, number] {
    if (row < 0 || row > this.maxRow) return [0, 0];
    return [this.rowFirst[row] as number, this.rowFirst[row + 1] as number];
  }

  /** The first cell number in a row at or right of a column. */
  firstAtOrAfter(row: number, col: number): number {
    const [a, b] = this.rowRange(row);
    let lo = a;
    let hi = b;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if ((this.col[mid] as number) < col) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }

  value(k: number): Scalar {
    switch ((this.kind[k] as number) & 7) {
      case Kind.Number:
        return this.num[k] as number;
      case Kind.Text:
      case Kind.Error:
        return this.obj[k] as string | XlError;
      case Kind.Bool:
        return this.num[k] === 1;
      default:
        return null;
    }
  }

  cached(k: number): boolean {
    return ((this.kind[k] as number) & 8) !== 0;
  }
}

export class FormulaStore {
  n = 0;
  /** The formula's cell number. */
  cell = new Int32Array(256);
  form = new Uint8Array(256);
  /** Where the text was written (a shared member's master): the tree's relative references are from here. */
  originRow = new Int32Array(256);
  originCol = new Int32Array(256);
  /** End of the <c> start tag; the <f> element's start, end of start tag, start of end tag, end. */
  open = new Int32Array(256);
  f = new Int32Array(256);
  fOpen = new Int32Array(256);
  fClose = new Int32Array(256);
  fEnd = new Int32Array(256);
  /** 1 when the cell holds nothing but <f>, <v> and <is> (no comments or extensions to keep). */
  simple = new Uint8Array(256);
  readonly node: (Node | undefined)[] = [];
  /** The range an array, dynamic or shared-master formula covers in the file. */
  readonly ref = new Map<number, Rect>();
  readonly syntaxError = new Map<number, string>();
  /** For a shared formula's member, its master's formula number; -1 otherwise. */
  master = new Int32Array(256);

  add(cell: number, form: Form, row: number, col: number): number {
    const i = this.n++;
    if (i >= this.cell.length) {
      const need = i + 1;
      this.cell = grow(this.cell, need);
      this.form = grow(this.form, need);
      this.originRow = grow(this.originRow, need);
      this.originCol = grow(this.originCol, need);
      this.open = grow(this.open, need);
      this.f = grow(this.f, need);
      this.fOpen = grow(this.fOpen, need);
      this.fClose = grow(this.fClose, need);
      this.fEnd = grow(this.fEnd, need);
      this.simple = grow(this.simple, need);
      this.master = grow(this.master, need);
    }
    this.master[i] = -1;
    this.cell[i] = cell;
    this.form[i] = form;
    this.originRow[i] = row;
    this.originCol[i] = col;
    this.node[i] = undefined;
    return i;
  }
}

/** Where each <row> element is in the sheet part. */
export class RowStore {
  n = 0;
  row = new Int32Array(256);
  start = new Int32Array(256);
  /** End of the <row …> start tag. */
  openEnd = new Int32Array(256);
  /** Start of </row> (equal to end for a self-closing row). */
  closeStart = new Int32Array(256);
  end = new Int32Array(256);
  selfClosing = new Uint8Array(256);

  add(row: number, start: number, openEnd: number, closeStart: number, end: number, selfClosing: boolean): void {
    const i = this.n++;
    if (i >= this.row.length) {
      const need = i + 1;
      this.row = grow(this.row, need);
      this.start = grow(this.start, need);
      this.openEnd = grow(this.openEnd, need);
      this.closeStart = grow(this.closeStart, need);
      this.end = grow(this.end, need);
      this.selfClosing = grow(this.selfClosing, need);
    }
    this.row[i] = row;
    this.start[i] = start;
    this.openEnd[i] = openEnd;
    this.closeStart[i] = closeStart;
    this.end[i] = end;
    this.selfClosing[i] = selfClosing ? 1 : 0;
  }
}
