/**
 * A season's summary as data: one row per workbook, the totals, every cell in error (also grouped
 * by its message, with `file!sheet!cell` for each), and the run's exit code. The CLI renders it as
 * text, JSON or a CSV table; nothing here is worded for a terminal.
 */
import { CAUTION, soilcellVersion } from "../../core/about";
import { CellProblem, RecalcSummary } from "../recalc";
import { InputRefusal } from "./inputs";
import { FileResult } from "./pool";

export type FileStatus = "recalculated" | "refused" | "failed";

/** What a workbook's run computed (a refused workbook: all 0), summed over the season in the totals. */
export interface SeasonCounts extends Pick<RecalcSummary, "sheets" | "formulaCells" | "computedCells" | "keptCells" | "soilFormulaCells" | "spilledCells"> {
  readonly cellsInError: number;
  /** Formulas the engine does not have, fed by nothing recomputed, left as saved without a value. */
  readonly withoutValue: number;
}

/** One workbook's row (the `--summary` table has these columns). */
export interface SeasonFile extends SeasonCounts {
  readonly input: string;
  readonly status: FileStatus;
  /** Why it was refused or failed; empty when recalculated. */
  readonly reason: string;
  readonly output: string;
  readonly valuesCopy: string;
  readonly seconds: number;
}

/** A cell in error (or left without a value) and the workbook it is in. */
export interface SeasonCell extends CellProblem {
  readonly file: string;
}

/** Cells in error that share an error and a message. */
export interface ErrorGroup {
  readonly error: string;
  readonly message: string;
  readonly count: number;
  readonly workbooks: number;
  /** Every cell, as file!sheet!cell, in run order. */
  readonly cells: readonly string[];
  /** The formula of the first of them, as typed. */
  readonly formula: string;
}

export interface SeasonTotals extends SeasonCounts {
  readonly workbooks: number;
  readonly recalculated: number;
  readonly refused: number;
  readonly failed: number;
  /** Recalculated workbooks with at least one cell in error. */
  readonly withErrors: number;
}

export interface SeasonSummary {
  readonly computedBy: string;
  readonly finished: string;
  /** Wall-clock time of the whole run. */
  readonly seconds: number;
  /** The sum of the workbooks' own times (above `seconds` when they ran in parallel). */
  readonly workbookSeconds: number;
  readonly jobs: number;
  readonly totals: SeasonTotals;
  readonly files: readonly SeasonFile[];
  readonly errorGroups: readonly ErrorGroup[];
  readonly errors: readonly SeasonCell[];
  readonly kept: readonly SeasonCell[];
  /** 0 clean, 1 some cells in error, 2 some workbook refused or unreadable, 3 a failure in soilcell itself. */
  readonly exitCode: 0 | 1 | 2 | 3;
  readonly caution: string;
}

/** `sheet!cell` as Excel writes it: a sheet name that is not one plain word is quoted. */
export function sheetCell(sheet: string, cell: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(sheet) ? `${sheet}!${cell}` : `'${sheet.replace(/'/g, "''")}'!${cell}`;
}

const ZERO: SeasonCounts = { sheets: 0, formulaCells: 0, computedCells: 0, keptCells: 0, soilFormulaCells: 0, spilledCells: 0, cellsInError: 0, withoutValue: 0 };

function rowOf(r: FileResult): SeasonFile {
  const o = r.outcome;
  if (o.kind !== "recalculated") {
    return { input: r.item.input, status: o.kind, reason: o.reason, output: "", valuesCopy: "", ...ZERO, seconds: o.seconds };
  }
  const s = o.summary;
  return {
    input: r.item.input,
    status: "recalculated",
    reason: "",
    output: s.output,
    valuesCopy: s.valuesCopy ?? "",
    sheets: s.sheets,
    formulaCells: s.formulaCells,
    computedCells: s.computedCells,
    keptCells: s.keptCells,
    soilFormulaCells: s.soilFormulaCells,
    spilledCells: s.spilledCells,
    cellsInError: s.errors.length,
    withoutValue: s.kept.length,
    seconds: s.seconds,
  };
}

/**
 * The summary of a run: `refused` are the arguments and workbooks refused before anything was
 * computed, `results` the workbooks run, in order; `seconds` the run's wall-clock time.
 */
export function seasonSummary(refused: readonly InputRefusal[], results: readonly FileResult[], run: { seconds: number; jobs: number }): SeasonSummary {
  const files: SeasonFile[] = [
    ...refused.map((r): SeasonFile => ({ input: r.input, status: "refused", reason: r.reason, output: "", valuesCopy: "", ...ZERO, seconds: 0 })),
    ...results.map(rowOf),
  ];
  const errors: SeasonCell[] = [];
  const kept: SeasonCell[] = [];
  for (const r of results) {
    if (r.outcome.kind !== "recalculated") continue;
    for (const e of r.outcome.summary.errors) errors.push({ file: r.item.input, ...e });
    for (const k of r.outcome.summary.kept) kept.push({ file: r.item.input, ...k });
  }
  const groups = new Map<string, { error: string; message: string; cells: string[]; files: Set<string>; formula: string }>();
  for (const e of errors) {
    const key = `${e.error}\u0000${e.message}`;
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { error: e.error, message: e.message, cells: [], files: new Set(), formula: e.formula }));
    g.cells.push(`${e.file}!${sheetCell(e.sheet, e.cell)}`);
    g.files.add(e.file);
  }
  const errorGroups = [...groups.values()]
    .map((g): ErrorGroup => ({ error: g.error, message: g.message, count: g.cells.length, workbooks: g.files.size, cells: g.cells, formula: g.formula }))
    .sort((a, b) => b.count - a.count);
  const sum = (k: keyof SeasonCounts) => files.reduce((n, f) => n + f[k], 0);
  const count = (s: FileStatus) => files.filter((f) => f.status === s).length;
  const totals: SeasonTotals = {
    workbooks: files.length,
    recalculated: count("recalculated"),
    refused: count("refused"),
    failed: count("failed"),
    withErrors: files.filter((f) => f.cellsInError > 0).length,
    sheets: sum("sheets"),
    formulaCells: sum("formulaCells"),
    computedCells: sum("computedCells"),
    keptCells: sum("keptCells"),
    soilFormulaCells: sum("soilFormulaCells"),
    spilledCells: sum("spilledCells"),
    cellsInError: sum("cellsInError"),
    withoutValue: sum("withoutValue"),
  };
  const exitCode = totals.failed ? 3 : totals.refused ? 2 : totals.cellsInError ? 1 : 0;
  return {
    computedBy: soilcellVersion(),
    finished: new Date().toISOString(),
    seconds: run.seconds,
    workbookSeconds: files.reduce((n, f) => n + f.seconds, 0),
    jobs: run.jobs,
    totals,
    files,
    errorGroups,
    errors,
    kept,
    exitCode,
    caution: CAUTION,
  };
}
