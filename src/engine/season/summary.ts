/**
 * A season run summed up as data: one row per workbook, the totals, and the cells in error
 * grouped by message (each with its file!sheet!cell), so a problem repeated across a season
 * reads as one line. The CLI renders it as text, CSV or JSON.
 */
import type { JobOutcome } from "./jobs";

export interface SeasonFileRow {
  readonly input: string;
  readonly output?: string;
  readonly valuesOutput?: string;
  readonly status: "recalculated" | "refused" | "failed" | "skipped";
  /** Why a workbook was refused, failed or skipped. */
  readonly reason?: string;
  readonly formulaCells: number;
  readonly computedCells: number;
  readonly keptCells: number;
  readonly soilFormulaCells: number;
  readonly cellsInError: number;
  readonly seconds: number;
}

export interface ErrorGroup {
  readonly error: string;
  readonly message: string;
  readonly count: number;
  /** file!sheet!cell for every cell with this error and message. */
  readonly cells: readonly string[];
}

export interface SeasonSummary {
  readonly files: readonly SeasonFileRow[];
  readonly recalculated: number;
  readonly refused: number;
  readonly failed: number;
  readonly skipped: number;
  readonly formulaCells: number;
  readonly computedCells: number;
  readonly keptCells: number;
  readonly cellsInError: number;
  readonly errorGroups: readonly ErrorGroup[];
  readonly seconds: number;
  readonly workers: number;
  /** 0 clean, 1 some cells in error, 2 some workbook refused or unreadable, 3 an unexpected failure. */
  readonly exitCode: 0 | 1 | 2 | 3;
}

export interface Skipped {
  readonly input: string;
  readonly reason: string;
}

/** A workbook's place in file!sheet!cell: quoted when it holds a space or a "!". */
function place(file: string, sheet: string, cell: string): string {
  const q = (s: string) => (/[\s!']/.test(s) ? `'${s.replace(/'/g, "''")}'` : s);
  return `${q(file)}!${q(sheet)}!${cell}`;
}

export function summarizeSeason(outcomes: readonly JobOutcome[], skipped: readonly Skipped[], seconds: number, workers: number): SeasonSummary {
  const files: SeasonFileRow[] = [];
  const groups = new Map<string, { error: string; message: string; cells: string[] }>();
  for (const o of outcomes) {
    if (o.kind === "recalculated") {
      const s = o.summary;
      files.push({
        input: o.job.input,
        output: s.output,
        ...(s.valuesOutput !== undefined ? { valuesOutput: s.valuesOutput } : {}),
        status: "recalculated",
        formulaCells: s.formulaCells,
        computedCells: s.computedCells,
        keptCells: s.keptCells,
        soilFormulaCells: s.soilFormulaCells,
        cellsInError: s.errors.length,
        seconds: s.seconds,
      });
      for (const e of s.errors) {
        const key = `${e.error}\u0000${e.message}`;
        const g = groups.get(key) ?? { error: e.error, message: e.message, cells: [] };
        groups.set(key, g);
        g.cells.push(place(o.job.input, e.sheet, e.cell));
      }
    } else {
      files.push({ input: o.job.input, status: o.kind, reason: o.reason, formulaCells: 0, computedCells: 0, keptCells: 0, soilFormulaCells: 0, cellsInError: 0, seconds: o.seconds });
    }
  }
  for (const s of skipped) files.push({ input: s.input, status: "skipped", reason: s.reason, formulaCells: 0, computedCells: 0, keptCells: 0, soilFormulaCells: 0, cellsInError: 0, seconds: 0 });
  const count = (st: SeasonFileRow["status"]) => files.filter((f) => f.status === st).length;
  const sum = (k: "formulaCells" | "computedCells" | "keptCells" | "cellsInError") => files.reduce((a, f) => a + f[k], 0);
  const errorGroups = [...groups.values()].map((g) => ({ ...g, count: g.cells.length })).sort((a, b) => b.count - a.count || a.message.localeCompare(b.message));
  const failed = count("failed");
  const refused = count("refused");
  const cellsInError = sum("cellsInError");
  return {
    files,
    recalculated: count("recalculated"),
    refused,
    failed,
    skipped: count("skipped"),
    formulaCells: sum("formulaCells"),
    computedCells: sum("computedCells"),
    keptCells: sum("keptCells"),
    cellsInError,
    errorGroups,
    seconds,
    workers,
    exitCode: failed ? 3 : refused ? 2 : cellsInError ? 1 : 0,
  };
}
