/**
 * How a season summary reads: as text for a person, as a CSV table one row per workbook, and
 * (the data itself) as JSON. Rendering only: the numbers come from engine/season/summary.ts.
 */
import { CAUTION } from "../core/about";
import type { SeasonSummary } from "../engine/season/summary";

const n = (x: number) => x.toLocaleString("en-US");
const MAX_GROUPS = 20;
const MAX_CELLS = 8;
const MAX_REFUSED = 50;

export function seasonText(s: SeasonSummary): string[] {
  const lines: string[] = [];
  const total = s.files.filter((f) => f.status !== "skipped").length;
  const parts = [`${s.recalculated} recalculated`];
  if (s.refused) parts.push(`${s.refused} refused`);
  if (s.failed) parts.push(`${s.failed} failed`);
  if (s.skipped) parts.push(`${s.skipped} skipped`);
  lines.push(`soilcell recalc: ${total} workbook${total === 1 ? "" : "s"}, ${parts.join(", ")}, in ${s.seconds.toFixed(1)} s on ${s.workers} worker${s.workers === 1 ? "" : "s"}`);
  lines.push(`  formula cells: ${n(s.formulaCells)} (${n(s.computedCells)} computed, ${n(s.keptCells)} kept as the file had them)`);
  const bad = s.files.filter((f) => f.status === "refused" || f.status === "failed");
  if (bad.length) {
    lines.push(`  not recalculated (nothing written for them):`);
    for (const f of bad.slice(0, MAX_REFUSED)) lines.push(`    ${f.input}: ${f.reason}`);
    if (bad.length > MAX_REFUSED) lines.push(`    … and ${bad.length - MAX_REFUSED} more (--summary FILE.csv lists every one)`);
  }
  const skipped = s.files.filter((f) => f.status === "skipped");
  if (skipped.length) {
    lines.push(`  skipped:`);
    for (const f of skipped.slice(0, MAX_REFUSED)) lines.push(`    ${f.input}: ${f.reason}`);
  }
  lines.push(`  cells in error: ${n(s.cellsInError)}${s.errorGroups.length ? ", by message:" : ""}`);
  for (const g of s.errorGroups.slice(0, MAX_GROUPS)) {
    lines.push(`    ${n(g.count)} × ${g.error} ${g.message}`);
    const shown = g.cells.slice(0, MAX_CELLS).join(", ");
    lines.push(`        ${shown}${g.cells.length > MAX_CELLS ? `, … (${n(g.cells.length - MAX_CELLS)} more)` : ""}`);
  }
  if (s.errorGroups.length > MAX_GROUPS) lines.push(`    … and ${s.errorGroups.length - MAX_GROUPS} more messages (--json lists every cell)`);
  const wrote = s.files.filter((f) => f.output);
  if (wrote.length) {
    const copies = wrote.filter((f) => f.valuesOutput).length;
    lines.push(`  written: ${wrote.length} recalculated workbook${wrote.length === 1 ? "" : "s"}${copies ? ` and ${copies} values cop${copies === 1 ? "y" : "ies"}` : ""} (e.g. ${wrote[0]?.output}${wrote[0]?.valuesOutput ? `, ${wrote[0].valuesOutput}` : ""})`);
  }
  lines.push(CAUTION);
  return lines;
}

function csvField(v: string | number | undefined): string {
  const s = v === undefined ? "" : String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** One row per workbook (RFC 4180 quoting). */
export function seasonCsv(s: SeasonSummary): string {
  const head = ["input", "status", "reason", "output", "values_output", "formula_cells", "computed_cells", "kept_cells", "soil_formula_cells", "cells_in_error", "seconds"];
  const rows = s.files.map((f) =>
    [f.input, f.status, f.reason, f.output, f.valuesOutput, f.formulaCells, f.computedCells, f.keptCells, f.soilFormulaCells, f.cellsInError, f.seconds.toFixed(3)].map(csvField).join(","),
  );
  return `${[head.join(","), ...rows].join("\r\n")}\r\n`;
}
