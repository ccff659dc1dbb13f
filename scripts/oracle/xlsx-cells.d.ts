/** Types for xlsx-cells.js (the oracle's cell reader), for the TypeScript tests. */
import JSZip from "jszip";

export type CachedValue = number | string | boolean | { error: string } | { date: string } | { unreadable: string } | null;

export interface FormulaInfo {
  readonly text: string;
  readonly t: string;
  readonly ref?: string;
  readonly si?: string;
  readonly aca?: string;
}

export interface Cell {
  readonly r: string;
  readonly row: number;
  readonly col: number;
  readonly t: string;
  readonly s?: string;
  readonly cm?: string;
  /** The raw text of <v>, when there is one. */
  readonly v?: string;
  readonly value: CachedValue;
  readonly f?: FormulaInfo;
}

export interface Sheet {
  readonly name: string;
  readonly path: string;
  readonly cells: Map<string, Cell>;
  readonly merges: string[];
}

export interface WorkbookCells {
  readonly date1904: boolean;
  readonly sheets: Sheet[];
  readonly names: { name: string; value: string; sheet?: string }[];
  readonly zip: JSZip;
}

export function readWorkbookCells(bytes: Buffer): Promise<WorkbookCells>;
export function readSheet(xml: string, sst: string[]): { cells: Map<string, Cell>; merges: string[] };
export function formulaAddresses(sheet: Sheet, maxArrayCells?: number): string[];
export function stripCachedValues(bytes: Buffer): Promise<Buffer>;
export function plain(cell: Cell | undefined): CachedValue;
export function parseA1(ref: string): { row: number; col: number };
export function parseRange(ref: string): { top: { row: number; col: number }; rows: number; cols: number };
export function addressesOf(ref: string): string[];
export function a1(row: number, col: number): string;
export function columnIndex(letters: string): number;
export function columnLetters(index: number): string;
