/**
 * Reads a workbook's cells with ExcelJS (which resolves shared strings and shared formulas) into
 * the plain sheets the formula engine is built from, keeping where every formula came from.
 */
import ExcelJS from "exceljs";
import { CellAddress, parseRange } from "./cellref";
import { toEngineFormula } from "./formula-text";
import { WorkbookFileError } from "./xlsx-package";

export interface FormulaCell {
  readonly sheet: string;
  readonly address: CellAddress;
  /** Formula as the file holds it (no "="). */
  readonly stored: string;
  /** The range an array formula covers in the file, when it is one. */
  readonly arrayRef?: string;
  /** The formula as the engine parses it (toEngineFormula of `stored`), so it is rewritten once. */
  readonly engine?: string;
}

export interface ReadWorkbook {
  /** Sheet name → rows of raw contents for the engine (numbers, text, booleans, "=formulas"). */
  readonly sheets: Record<string, unknown[][]>;
  readonly formulas: readonly FormulaCell[];
  readonly namedExpressions: readonly { name: string; expression: string; scope?: string }[];
  readonly cellCount: number;
}

const EXCEL_EPOCH_MS = Date.UTC(1899, 11, 30);

function excelSerial(d: Date): number {
  return (d.getTime() - EXCEL_EPOCH_MS) / 86400000;
}

/** Text that the engine would read as a formula or escape is marked as text. */
function asText(s: string): string {
  return /^[=']/.test(s) ? `'${s}` : s;
}

function rawValue(v: ExcelJS.CellValue): unknown {
  if (v === null || v === undefined) return null;
  if (typeof v === "number" || typeof v === "boolean") return v;
  if (typeof v === "string") return asText(v);
  if (v instanceof Date) return excelSerial(v);
  if (typeof v === "object") {
    if ("richText" in v) return asText(v.richText.map((t) => t.text).join(""));
    if ("error" in v) return v.error;
    if ("text" in v && typeof v.text === "string") return asText(v.text);
  }
  return null;
}

export async function readWorkbook(bytes: Buffer, sheetNames: readonly string[]): Promise<ReadWorkbook> {
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(bytes as never);
  } catch (e) {
    throw new WorkbookFileError(`the workbook cannot be read (${(e as Error).message})`);
  }
  const sheets: Record<string, unknown[][]> = {};
  const formulas: FormulaCell[] = [];
  let cellCount = 0;
  for (const name of sheetNames) {
    const ws = wb.getWorksheet(name);
    const rows: unknown[][] = [];
    sheets[name] = rows;
    if (!ws) continue;
    const spillChildren: { top: CellAddress; rows: number; cols: number }[] = [];
    ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
      const r = rowNumber - 1;
      const out: unknown[] = [];
      row.eachCell({ includeEmpty: false }, (cell, colNumber) => {
        const c = colNumber - 1;
        cellCount += 1;
        const formula = cell.formula;
        if (formula) {
          const value = cell.value as { shareType?: string; ref?: string };
          const arrayRef = value && value.shareType === "array" && value.ref ? value.ref : undefined;
          const engine = toEngineFormula(formula);
          formulas.push({ sheet: name, address: { row: r, col: c }, stored: formula, arrayRef, engine });
          if (arrayRef) spillChildren.push(parseRange(arrayRef));
          out[c] = `=${engine}`;
        } else {
          out[c] = rawValue(cell.value);
        }
      });
      rows[r] = out;
    });
    // The other cells of an array formula's range hold cached results; the engine spills anew.
    for (const s of spillChildren) {
      for (let dr = 0; dr < s.rows; dr++) {
        for (let dc = 0; dc < s.cols; dc++) {
          if (dr === 0 && dc === 0) continue;
          const row = rows[s.top.row + dr];
          if (row) row[s.top.col + dc] = null;
        }
      }
    }
    for (let i = 0; i < rows.length; i++) if (!rows[i]) rows[i] = [];
  }
  const namedExpressions: { name: string; expression: string }[] = [];
  const model = (wb.definedNames as unknown as { model: { name: string; ranges: string[] }[] }).model ?? [];
  for (const d of model) {
    if (d.ranges.length === 1 && !d.name.startsWith("_xlnm")) namedExpressions.push({ name: d.name, expression: `=${d.ranges[0]}` });
  }
  return { sheets, formulas, namedExpressions, cellCount };
}
