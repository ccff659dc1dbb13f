/**
 * Evaluates one formula headless, with the same bindings Excel runs: used by `soilcell eval` and
 * by the formula tests.
 */
import { DetailedCellError } from "hyperformula";
import { newEngine } from "./hf";
import { toEngineFormula } from "./formula-text";

export type EvalValue = number | string | boolean | null;

export interface EvalResult {
  /** A single value, or rows of values when the formula spills (an element in error reads "#VALUE! message"). */
  readonly value?: EvalValue | EvalValue[][];
  /** "#VALUE!", "#N/A", … when the formula's top-left result is an error. */
  readonly error?: string;
  readonly message?: string;
}

function plain(v: unknown): EvalValue {
  if (v instanceof DetailedCellError) return `${v.value}${v.message ? ` ${v.message}` : ""}`;
  if (v === null || v === undefined) return null;
  if (typeof v === "number" || typeof v === "string" || typeof v === "boolean") return v;
  return String(v);
}

/**
 * Evaluates `formula` (typed form "=SOIL.CEC(…)" or Excel's stored form) on an empty sheet.
 * @example evaluateFormula('=SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)') //=> { value: 19.5 }
 */
export function evaluateFormula(formula: string): EvalResult {
  const text = formula.trim().startsWith("=") ? formula.trim() : `=${formula.trim()}`;
  const hf = newEngine({ Eval: [[toEngineFormula(text)]] });
  try {
    const sheet = hf.getSheetId("Eval") as number;
    const top = hf.getCellValue({ sheet, row: 0, col: 0 });
    if (top instanceof DetailedCellError) {
      return { error: top.value, message: top.message };
    }
    const isArray = hf.isCellPartOfArray({ sheet, row: 0, col: 0 });
    if (!isArray) return { value: plain(top) };
    // The spill's own extent (the sheet may be larger: a referenced empty cell counts in its size).
    const inArray = (row: number, col: number) => hf.isCellPartOfArray({ sheet, row, col });
    let height = 1;
    while (inArray(height, 0)) height += 1;
    let width = 1;
    while (inArray(0, width)) width += 1;
    const rows: EvalValue[][] = [];
    for (let r = 0; r < height; r++) {
      const row: EvalValue[] = [];
      for (let c = 0; c < width; c++) row.push(plain(hf.getCellValue({ sheet, row: r, col: c })));
      rows.push(row);
    }
    return rows.length === 1 && rows[0]!.length === 1 ? { value: rows[0]![0]! } : { value: rows };
  } finally {
    hf.destroy();
  }
}

