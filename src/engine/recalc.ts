/**
 * Headless recalculation of a whole workbook: read, compute every formula with the SOIL bindings
 * registered, write a NEW file in which every formula is kept and its cached value updated, and
 * report what failed and where. It never writes over its input, and the output appears only
 * complete (written to a temporary file, then renamed into place).
 */
import fs from "fs";
import path from "path";
import { DetailedCellError, HyperFormula } from "hyperformula";
import { CellAddress, a1, parseRange, rangeA1 } from "./cellref";
import { callsSoil, engineFormulaCallsSoil, toStoredFormula, toTypedFormula } from "./formula-text";
import { newEngine } from "./hf";
import { CachedValue, CellWrite, patchSheetXml } from "./sheet-patch";
import { readWorkbook } from "./workbook-read";
import { WorkbookFileError, dynamicArrayIndex, openPackage, readingCopy } from "./xlsx-package";

export interface CellProblem {
  readonly sheet: string;
  readonly cell: string;
  /** The formula as a user would type it. */
  readonly formula: string;
  readonly error: string;
  readonly message: string;
}

export interface RecalcSummary {
  readonly input: string;
  readonly output: string;
  readonly sheets: number;
  readonly formulaCells: number;
  readonly soilFormulaCells: number;
  /** Cells filled by spilled SOIL results, beyond their formula cells. */
  readonly spilledCells: number;
  /** Formula cells and spilled elements whose value is an error. */
  readonly errors: readonly CellProblem[];
  /** Formulas the engine does not support: their cached values were left as they were. */
  readonly kept: readonly CellProblem[];
  readonly seconds: number;
}

export interface RecalcOptions {
  /** Progress lines for long runs (the CLI passes stderr). */
  readonly progress?: (line: string) => void;
}

export class RecalcRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = "RecalcRefused";
  }
}

/** The default output name: beside the input, with a suffix. */
export function defaultOutputPath(input: string): string {
  const ext = path.extname(input);
  return path.join(path.dirname(input), `${path.basename(input, ext)}.recalc${ext || ".xlsx"}`);
}

function sameFile(a: string, b: string): boolean {
  const ra = path.resolve(a);
  const rb = path.resolve(b);
  if (ra === rb) return true;
  try {
    return fs.realpathSync(ra) === fs.realpathSync(rb);
  } catch {
    return false;
  }
}

/** The error values Excel itself writes; the engine's own (#CYCLE!, #ERROR!, #LIC!) are not valid in a file. */
const EXCEL_ERRORS = new Set(["#NULL!", "#DIV/0!", "#VALUE!", "#REF!", "#NAME?", "#NUM!", "#N/A", "#SPILL!", "#CALC!", "#GETTING_DATA"]);

/** What the engine's own error values mean, for the summary when the engine gives no message. */
const ENGINE_ERROR_MEANING: Record<string, string> = {
  "#CYCLE!": "circular reference: the value depends on itself; no value written, Excel will compute it",
  "#ERROR!": "the formula cannot be read headless",
};

function cachedOf(v: unknown): CachedValue {
  // An engine-only error is written as no cached value at all (Excel recomputes it on open).
  if (v instanceof DetailedCellError) return EXCEL_ERRORS.has(v.value) ? { error: v.value } : null;
  if (v === null || v === undefined) return null;
  if (typeof v === "number") return Number.isFinite(v) ? v : { error: "#NUM!" };
  if (typeof v === "string" || typeof v === "boolean") return v;
  return null;
}

interface Spill {
  readonly rows: number;
  readonly cols: number;
}

/** The size of the array a formula cell spilled, from the engine's own vertex (1×1 if none). */
function spillOf(hf: HyperFormula, sheet: number, at: CellAddress): Spill {
  const graph = (hf as unknown as { dependencyGraph: { getCell(a: unknown): unknown } }).dependencyGraph;
  const vertex = graph.getCell({ sheet, row: at.row, col: at.col }) as { width?: number; height?: number } | undefined;
  if (vertex && typeof vertex.width === "number" && typeof vertex.height === "number" && vertex.width > 0 && vertex.height > 0) {
    return { rows: vertex.height, cols: vertex.width };
  }
  return { rows: 1, cols: 1 };
}

function typed(stored: string): string {
  return `=${toTypedFormula(stored)}`;
}

/**
 * Recalculates `input` into `output` (default: beside the input with ".recalc" added).
 * @throws RecalcRefused when output is the input; WorkbookFileError for a file that is not a
 *   readable workbook. Cell errors are reported in the summary, never thrown.
 */
export async function recalcWorkbook(input: string, output = defaultOutputPath(input), options: RecalcOptions = {}): Promise<RecalcSummary> {
  const started = process.hrtime.bigint();
  const say = options.progress ?? (() => undefined);
  if (sameFile(input, output)) throw new RecalcRefused(`refusing to write over the input ${input}; choose another output with -o`);
  let bytes: Buffer;
  try {
    bytes = fs.readFileSync(input);
  } catch (e) {
    throw new WorkbookFileError(`cannot read ${input}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  const pkg = await openPackage(bytes);
  say(`reading ${path.basename(input)} (${pkg.sheets.length} sheets)`);
  const book = await readWorkbook(await readingCopy(pkg), pkg.sheets.map((s) => s.name));
  say(`computing ${book.formulas.length} formula cells`);
  const hf = asFileError("the workbook cannot be loaded into the formula engine", () => newEngine(book.sheets));
  for (const n of book.namedExpressions) {
    try {
      hf.addNamedExpression(n.name, n.expression);
    } catch {
      // A defined name the engine cannot hold (print areas, external links) is simply not used.
    }
  }

  const errors: CellProblem[] = [];
  const kept: CellProblem[] = [];
  const writesBySheet = new Map<string, CellWrite[]>();
  let soilFormulaCells = 0;
  let spilledCells = 0;
  let cm: number | undefined | null = null; // null: not yet asked

  for (const f of book.formulas) {
    const sheetId = hf.getSheetId(f.sheet) as number;
    const value = hf.getCellValue({ sheet: sheetId, row: f.address.row, col: f.address.col });
    const writes = writesBySheet.get(f.sheet) ?? [];
    writesBySheet.set(f.sheet, writes);
    // The typed form is wanted only in problem reports; the engine form came with the cell.
    const formula = () => typed(f.stored);
    const isSoil = f.engine !== undefined ? engineFormulaCallsSoil(f.engine) : callsSoil(f.stored);
    if (!isSoil && value instanceof DetailedCellError && (value.value === "#NAME?" || value.value === "#ERROR!")) {
      const message = value.value === "#NAME?" ? "function not supported headless" : "formula syntax not supported headless";
      kept.push({ sheet: f.sheet, cell: a1(f.address), formula: formula(), error: value.value, message: value.message || message });
      continue;
    }
    const spill = value instanceof DetailedCellError ? { rows: 1, cols: 1 } : spillOf(hf, sheetId, f.address);
    const report = (at: CellAddress, v: unknown) => {
      if (v instanceof DetailedCellError) errors.push({ sheet: f.sheet, cell: a1(at), formula: formula(), error: v.value, message: v.message || ENGINE_ERROR_MEANING[v.value] || "" });
    };
    report(f.address, value);
    if (isSoil) {
      soilFormulaCells += 1;
      if (cm === null) cm = await dynamicArrayIndex(pkg);
      const ref = rangeA1(f.address, spill.rows, spill.cols);
      writes.push({ address: f.address, value: cachedOf(value), arrayFormula: { text: toStoredFormula(f.stored), ref, cm } }); // the file's own text, only our names in stored form
    } else {
      writes.push({ address: f.address, value: cachedOf(value) });
    }
    // Spilled elements: for SOIL formulas the engine's spill; for native array formulas, only
    // within the range the file already gave them (their <f> is kept as it is).
    const covered = isSoil || !f.arrayRef ? spill : parseRange(f.arrayRef);
    for (let dr = 0; dr < covered.rows; dr++) {
      for (let dc = 0; dc < covered.cols; dc++) {
        if (dr === 0 && dc === 0) continue;
        const at = { row: f.address.row + dr, col: f.address.col + dc };
        const inSpill = dr < spill.rows && dc < spill.cols;
        const v = inSpill ? hf.getCellValue({ sheet: sheetId, ...at }) : null;
        if (inSpill) report(at, v);
        writes.push({ address: at, value: cachedOf(v), valueOnly: true });
        if (isSoil && inSpill) spilledCells += 1;
      }
    }
    // Cells a SOIL formula's old range covered but its new spill does not are cleared.
    if (isSoil && f.arrayRef) {
      const old = parseRange(f.arrayRef);
      for (let dr = 0; dr < old.rows; dr++) {
        for (let dc = 0; dc < old.cols; dc++) {
          if (dr < spill.rows && dc < spill.cols) continue;
          writes.push({ address: { row: f.address.row + dr, col: f.address.col + dc }, value: null, valueOnly: true });
        }
      }
    }
  }
  hf.destroy();

  say(`writing ${path.basename(output)}`);
  for (const sheet of pkg.sheets) {
    const writes = writesBySheet.get(sheet.name);
    if (!writes || writes.length === 0) continue;
    const xml = (await pkg.read(sheet.path)) as string;
    pkg.write(sheet.path, asFileError(`sheet "${sheet.name}" cannot be updated`, () => patchSheetXml(xml, dedupe(writes))));
  }
  const out = await pkg.toBuffer();
  writeAtomically(output, out);
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  return {
    input,
    output,
    sheets: pkg.sheets.length,
    formulaCells: book.formulas.length,
    soilFormulaCells,
    spilledCells,
    errors,
    kept,
    seconds,
  };
}

/** Runs a step on the file's contents; anything it throws becomes a plain WorkbookFileError. */
function asFileError<T>(what: string, step: () => T): T {
  try {
    return step();
  } catch (e) {
    if (e instanceof WorkbookFileError) throw e;
    throw new WorkbookFileError(`${what} (${(e as Error).message})`);
  }
}

/** When two writes name one cell (a formula inside another's old range), the formula wins. */
function dedupe(writes: CellWrite[]): CellWrite[] {
  const byCell = new Map<string, CellWrite>();
  for (const w of writes) {
    const key = `${w.address.row}:${w.address.col}`;
    const prior = byCell.get(key);
    if (!prior || (prior.valueOnly && !w.valueOnly)) byCell.set(key, w);
  }
  return [...byCell.values()];
}

/** Writes to a temporary file beside the target, then renames it into place. */
export function writeAtomically(target: string, bytes: Buffer): void {
  const dir = path.dirname(path.resolve(target));
  const tmp = path.join(dir, `.${path.basename(target)}.${process.pid}.partial`);
  try {
    fs.writeFileSync(tmp, bytes);
    fs.renameSync(tmp, target);
  } catch (e) {
    try {
      fs.unlinkSync(tmp);
    } catch {
      // nothing to clean up
    }
    throw new WorkbookFileError(`cannot write ${target}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
}
