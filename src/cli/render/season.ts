/**
 * A season summary in words for a person (one workbook: as the single-file run always read;
 * several: totals, refusals, cells in error grouped by message), and as the `--summary` table.
 * The data is the engine's SeasonSummary; nothing is computed here.
 */
import { ErrorGroup, SeasonFile, SeasonSummary, sheetCell } from "../../engine/season/summary";

/** A whole number with "," between thousands, the same on every machine. */
export function count(n: number): string {
  return String(Math.round(n)).replace(/\B(?=(\d{3})+(?!\d))/g, ",");
}

const plural = (n: number, one: string, many = `${one}s`) => `${count(n)} ${n === 1 ? one : many}`;

export function seconds(s: number): string {
  if (s < 60) return `${s.toFixed(1)} s`;
  const m = Math.floor(s / 60);
  return `${m} min ${Math.round(s - 60 * m)} s`;
}

const MAX_CELLS_LISTED = 50;
const MAX_GROUPS = 20;
const CELLS_PER_GROUP = 6;

/** One workbook recalculated: what was written, what was computed, every cell in error (up to 50). */
function renderOne(s: SeasonSummary, f: SeasonFile, out: (l: string) => void): void {
  out(`wrote ${f.output}`);
  if (f.valuesCopy) out(`wrote ${f.valuesCopy} (SOIL results as plain values, for programs without the add-in)`);
  const others = f.keptCells ? `; ${count(f.keptCells)} other formula cells kept as saved` : "";
  out(`${count(f.computedCells)} formula cells recalculated (${count(f.soilFormulaCells)} SOIL formulas, ${count(f.spilledCells)} spilled cells) in ${count(f.sheets)} sheets, ${f.seconds.toFixed(1)} s${others}`);
  out(`${count(f.cellsInError)} cells in error`);
  for (const e of s.errors.slice(0, MAX_CELLS_LISTED)) out(`  ${sheetCell(e.sheet, e.cell)}  ${e.error} ${e.message}   ${e.formula}`);
  if (s.errors.length > MAX_CELLS_LISTED) out(`  … and ${count(s.errors.length - MAX_CELLS_LISTED)} more (use --json or --summary FILE.json for the full list)`);
  if (s.kept.length) {
    out(`${count(s.kept.length)} formulas use functions the headless engine does not have; their values were kept as saved:`);
    for (const k of s.kept.slice(0, 20)) out(`  ${sheetCell(k.sheet, k.cell)}  ${k.formula}`);
  }
}

function renderGroup(g: ErrorGroup, out: (l: string) => void): void {
  out(`  ${g.error} ${g.message}`);
  out(`    ${plural(g.count, "cell")} in ${plural(g.workbooks, "workbook")}, e.g. ${g.formula}`);
  const shown = g.cells.slice(0, CELLS_PER_GROUP);
  out(`    ${shown.join("  ")}${g.count > shown.length ? `  … and ${count(g.count - shown.length)} more` : ""}`);
}

/** Several workbooks: the season's totals, what was refused and why, cells in error by message. */
function renderMany(s: SeasonSummary, out: (l: string) => void, hints: boolean): void {
  const t = s.totals;
  const notDone = [t.refused ? `${count(t.refused)} refused` : "", t.failed ? `${count(t.failed)} failed` : ""].filter(Boolean).join(", ");
  out(`${count(t.recalculated)} of ${plural(t.workbooks, "workbook")} recalculated${notDone ? `, ${notDone}` : ""}, in ${seconds(s.seconds)} (${plural(s.jobs, "job")}; ${seconds(s.workbookSeconds)} of work)`);
  if (t.recalculated) {
    out(`  ${count(t.computedCells)} formula cells computed (${count(t.soilFormulaCells)} SOIL formulas, ${count(t.spilledCells)} spilled cells), ${count(t.keptCells)} kept as saved, in ${plural(t.sheets, "sheet")}`);
    out(`  ${plural(t.cellsInError, "cell")} in error${t.cellsInError ? `, in ${plural(t.withErrors, "workbook")}` : ""}`);
  }
  const written = s.files.filter((f) => f.status === "recalculated");
  if (written.length) {
    const first = written[0] as SeasonFile;
    out(`  written: ${count(written.length)} recalculated workbooks${written.length > 1 ? `, e.g. ${first.output}` : `: ${first.output}`}`);
    const copies = written.filter((f) => f.valuesCopy);
    if (copies.length) out(`  and ${count(copies.length)} values copies (SOIL results as plain values), e.g. ${(copies[0] as SeasonFile).valuesCopy}`);
  }
  const refused = s.files.filter((f) => f.status !== "recalculated");
  if (refused.length) {
    out("");
    out(`not recalculated (nothing written for ${refused.length === 1 ? "it" : "them"}):`);
    for (const f of refused) out(`  ${f.input}: ${f.status === "failed" ? "FAILED, " : ""}${f.reason}`);
  }
  if (s.errorGroups.length) {
    out("");
    out(`cells in error, by message (${plural(s.errorGroups.length, "kind")}):`);
    for (const g of s.errorGroups.slice(0, MAX_GROUPS)) renderGroup(g, out);
    if (s.errorGroups.length > MAX_GROUPS) out(`  … and ${count(s.errorGroups.length - MAX_GROUPS)} more kinds`);
  }
  if (s.kept.length) {
    out("");
    out(`${plural(s.kept.length, "formula")} use functions the headless engine does not have; their values were kept as saved, e.g. ${s.kept[0]?.file}!${sheetCell(s.kept[0]?.sheet ?? "", s.kept[0]?.cell ?? "")}`);
  }
  if (hints && (s.errors.length || s.kept.length)) out("every cell, with its formula: --summary FILE.json or --json; one row per workbook: --summary FILE.csv");
}

/** The summary in words, line by line; `summaryFile`, when one was written, is named before the closing caution. */
export function renderSeason(s: SeasonSummary, out: (l: string) => void, summaryFile?: string): void {
  const only = s.files.length === 1 ? s.files[0] : undefined;
  if (only?.status === "recalculated") renderOne(s, only, out);
  else if (!only) renderMany(s, out, summaryFile === undefined);
  // One workbook refused: its one line on stderr says it all.
  if (summaryFile !== undefined) out(`summary written to ${summaryFile}`);
  if (s.totals.recalculated) out(s.caution);
}

/** A CSV field (RFC 4180); text a spreadsheet would run as a formula is prefixed with '. */
function csvField(v: string | number): string {
  if (typeof v === "number") return String(v);
  const safe = /^[=+\-@\t\r]/.test(v) ? `'${v}` : v;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

const COLUMNS: readonly [string, keyof SeasonFile][] = [
  ["file", "input"],
  ["status", "status"],
  ["reason", "reason"],
  ["output", "output"],
  ["values_copy", "valuesCopy"],
  ["sheets", "sheets"],
  ["formula_cells", "formulaCells"],
  ["computed_cells", "computedCells"],
  ["kept_cells", "keptCells"],
  ["soil_formula_cells", "soilFormulaCells"],
  ["spilled_cells", "spilledCells"],
  ["cells_in_error", "cellsInError"],
  ["without_value", "withoutValue"],
  ["seconds", "seconds"],
];

/** The `--summary FILE.csv` table: a header, then one row per workbook. */
export function seasonCsv(s: SeasonSummary): string {
  const rows = [COLUMNS.map(([h]) => h).join(",")];
  for (const f of s.files) rows.push(COLUMNS.map(([, k]) => csvField(k === "seconds" ? Number(f.seconds.toFixed(3)) : f[k])).join(","));
  return `${rows.join("\r\n")}\r\n`;
}
