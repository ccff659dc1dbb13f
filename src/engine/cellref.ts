/** A1-style cell references. */

export interface CellAddress {
  /** 0-based row. */
  readonly row: number;
  /** 0-based column. */
  readonly col: number;
}

export function columnLetters(col: number): string {
  let n = col + 1;
  let s = "";
  while (n > 0) {
    const m = (n - 1) % 26;
    s = String.fromCharCode(65 + m) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

export function columnIndex(letters: string): number {
  let n = 0;
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n - 1;
}

export function a1(addr: CellAddress): string {
  return `${columnLetters(addr.col)}${addr.row + 1}`;
}

export function parseA1(ref: string): CellAddress {
  const m = /^\$?([A-Za-z]{1,3})\$?(\d+)$/.exec(ref.trim());
  // Rows count from 1: "A0" is no cell (a range read from a file with it is then ignored, not placed at row −1).
  if (!m || Number(m[2]) < 1) throw new Error(`not a cell reference: ${ref}`);
  return { row: Number(m[2]) - 1, col: columnIndex(m[1] as string) };
}

export function rangeA1(top: CellAddress, rows: number, cols: number): string {
  if (rows === 1 && cols === 1) return a1(top);
  return `${a1(top)}:${a1({ row: top.row + rows - 1, col: top.col + cols - 1 })}`;
}

/** Parses "A1" or "A1:C3" into its corners. */
export function parseRange(ref: string): { top: CellAddress; rows: number; cols: number } {
  const [a, b] = ref.split(":");
  const top = parseA1(a as string);
  const bottom = b ? parseA1(b) : top;
  return { top, rows: bottom.row - top.row + 1, cols: bottom.col - top.col + 1 };
}
