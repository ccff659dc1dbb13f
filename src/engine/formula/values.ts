/**
 * The values a formula computes with, as Excel has them: numbers, text, booleans, errors (each
 * may carry a message saying why), blank (an empty cell; never a formula's final result), arrays
 * and references to rectangles of cells.
 */

/** The error values Excel writes in a file. */
export const ERROR_CODES = [
  "#NULL!",
  "#DIV/0!",
  "#VALUE!",
  "#REF!",
  "#NAME?",
  "#NUM!",
  "#N/A",
  "#GETTING_DATA",
  "#SPILL!",
  "#CALC!",
  "#FIELD!",
  "#BLOCKED!",
  "#CONNECT!",
  "#BUSY!",
  "#UNKNOWN!",
  "#PYTHON!",
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number];

const CODES = new Set<string>(ERROR_CODES);
export function isErrorCode(s: string): s is ErrorCode {
  return CODES.has(s.toUpperCase());
}

/** An error value, with what caused it when soilcell knows. */
export class XlError {
  constructor(
    readonly code: ErrorCode,
    readonly message = "",
  ) {}
  toString(): string {
    return this.message ? `${this.code} ${this.message}` : this.code;
  }
}

/** Blank: an empty cell (or an omitted argument's place in an array). */
export const BLANK = null;
export type Blank = null;

export type Scalar = number | string | boolean | XlError | Blank;

/** A rectangular array of scalars, row-major. */
export class XlArray {
  constructor(
    readonly rows: number,
    readonly cols: number,
    readonly data: Scalar[],
  ) {}
  at(r: number, c: number): Scalar {
    return this.data[r * this.cols + c] as Scalar;
  }
  static of(rows: Scalar[][]): XlArray {
    const r = rows.length;
    const c = r ? (rows[0] as Scalar[]).length : 0;
    // Stryker disable next-line ArrayDeclaration: equivalent: the loop fills every index, so a preallocated length changes nothing
    const data: Scalar[] = new Array(r * c);
    for (let i = 0; i < r; i++) for (let j = 0; j < c; j++) data[i * c + j] = (rows[i] as Scalar[])[j] as Scalar;
    return new XlArray(r, c, data);
  }
  static fill(rows: number, cols: number, v: Scalar): XlArray {
    return new XlArray(rows, cols, new Array(rows * cols).fill(v));
  }
}

/** A rectangle of cells on one sheet (0-based, inclusive corners). */
export interface Rect {
  readonly r1: number;
  readonly c1: number;
  readonly r2: number;
  readonly c2: number;
}

/** A reference: a rectangle on a sheet (the sheet's index in the workbook). */
export class XlRef implements Rect {
  constructor(
    readonly sheet: number,
    readonly r1: number,
    readonly c1: number,
    readonly r2: number,
    readonly c2: number,
  ) {}
  get rows(): number {
    return this.r2 - this.r1 + 1;
  }
  get cols(): number {
    return this.c2 - this.c1 + 1;
  }
  get isCell(): boolean {
    return this.r1 === this.r2 && this.c1 === this.c2;
  }
}

/** Several references joined by the union operator (A1,B2:C3): only a few functions take them. */
export class XlUnion {
  constructor(readonly refs: readonly XlRef[]) {}
}

export type Value = Scalar | XlArray | XlRef | XlUnion;

export const MAX_ROWS = 1048576;
export const MAX_COLS = 16384;

export function err(code: ErrorCode, message = ""): XlError {
  return new XlError(code, message);
}

export function isError(v: unknown): v is XlError {
  return v instanceof XlError;
}
