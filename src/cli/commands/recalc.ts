import fs from "fs";
import path from "path";
import { CAUTION } from "../../core/about";
import { RecalcSummary, writeAtomically } from "../../engine/recalc";
import type { JobOutcome } from "../../engine/season/jobs";
import { defaultJobs, runSeason } from "../../engine/season/pool";
import { runJob } from "../../engine/season/run-one";
import { summarizeSeason } from "../../engine/season/summary";
import { Command, Io, takeFlag, takeValue, usage } from "../command";
import { expandInputs, valuesPathFor } from "../inputs";
import { progressFor } from "../progress";
import { seasonCsv, seasonText } from "../season-text";

function printOne(s: RecalcSummary, io: Io): void {
  io.out(`wrote ${s.output}${s.valuesOutput ? ` and the values copy ${s.valuesOutput}` : ""}`);
  io.out(
    `${s.formulaCells} formula cells (${s.computedCells} computed, ${s.keptCells} kept as the file had them; ${s.soilFormulaCells} SOIL formulas, ${s.spilledCells} spilled cells) in ${s.sheets} sheets, ${s.seconds.toFixed(1)} s`,
  );
  io.out(`${s.errors.length} cells in error`);
  for (const e of s.errors.slice(0, 50)) io.out(`  ${e.sheet}!${e.cell}  ${e.error} ${e.message}   ${e.formula}`);
  if (s.errors.length > 50) io.out(`  … and ${s.errors.length - 50} more (use --json for the full list)`);
  if (s.kept.length) {
    io.out(`${s.kept.length} formulas the file holds without a value use something the headless engine does not compute; left without a value:`);
    for (const k of s.kept.slice(0, 20)) io.out(`  ${k.sheet}!${k.cell}  ${k.formula}   (${k.message})`);
  }
  io.out(CAUTION);
}

const HELP = `usage: soilcell recalc INPUT... [-o OUT] [--values] [--jobs N] [--summary FILE.csv|FILE.json] [--json]

Recalculates every SOIL formula, and every cell that depends on one, in each workbook given, and
writes a new workbook beside it (NAME.recalc.xlsx); the input is never written. Every other cell
keeps the value the file had.

INPUT is a workbook, a folder (searched recursively for .xlsx and .xlsm, skipping earlier
NAME.recalc/NAME.values outputs and Office lock files ~$NAME.xlsx), or a glob pattern such as
'season/**/*.xlsx' (quote it; the tool expands it). One workbook failing never stops the others.

  -o OUT              one workbook: the output file. Several, or a folder: an output folder;
                      the input folders' tree is mirrored under it.
  --values            also write NAME.values.xlsx: every SOIL result as a plain value (other
                      formulas kept), so LibreOffice, other spreadsheet programs and Excel
                      without the add-in show the numbers. Send this copy to people without soilcell.
  --jobs N            worker threads (default: the number of cores, here ${defaultJobs()})
  --summary FILE      write the season summary, one row per workbook (.csv) or all of it (.json)
  --json              print the summary as JSON on standard output, nothing else

Exit 0 when every cell computed cleanly, 1 when some cells are in error, 2 when some workbook
was refused or could not be read (or a usage error), 3 on an unexpected failure.`;

export const recalcCommand: Command = {
  name: "recalc",
  summary: "recalculate the SOIL formulas of workbooks, folders or a whole season",
  help: HELP,
  async run(args, io) {
    const rest = [...args];
    const json = takeFlag(rest, "--json");
    const values = takeFlag(rest, "--values");
    const output = takeValue(rest, "-o", "--output");
    const jobsText = takeValue(rest, "-j", "--jobs");
    const summaryFile = takeValue(rest, "--summary");
    if (output === null) return usage(recalcCommand, io, "-o needs a file or folder after it");
    if (jobsText === null || (jobsText !== undefined && !/^[1-9]\d{0,3}$/.test(jobsText))) return usage(recalcCommand, io, "--jobs needs a whole number of threads, 1 or more");
    if (summaryFile === null || (summaryFile !== undefined && !/\.(csv|json)$/i.test(summaryFile))) return usage(recalcCommand, io, "--summary needs a file name ending in .csv or .json");
    const unknown = rest.find((a) => a.startsWith("-") && a !== "-");
    if (unknown) return usage(recalcCommand, io, `unknown option ${unknown}`);
    if (!rest.length) return usage(recalcCommand, io, "no workbook given");

    // One workbook named as a file: its own summary, as it always was.
    // (A missing file, a pipe or a device is refused by the recalculator itself, with its reason.)
    const first = rest[0] as string;
    const one = rest.length === 1 && !isDir(first) && !(isGlob(first) && !exists(first)) && !(output !== undefined && (isDir(output) || /[\\/]$/.test(output)));
    if (one && summaryFile === undefined) {
      const input = rest[0] as string;
      const expanded = expandInputs([input], undefined, values);
      const job = expanded.jobs[0];
      if (!job) {
        io.err(`soilcell: ${expanded.skipped[0]?.input ?? input}: ${expanded.skipped[0]?.reason ?? "not a workbook"}`);
        return 2;
      }
      const out = output ?? job.output;
      const outcome = await runJob(values ? { input, output: out, valuesOutput: valuesPathFor(out) } : { input, output: out });
      if (outcome.kind !== "recalculated") {
        io.err(`soilcell: ${outcome.reason}`);
        return outcome.kind === "failed" ? 3 : 2;
      }
      if (json) io.out(JSON.stringify(outcome.summary, null, 2));
      else printOne(outcome.summary, io);
      return outcome.summary.errors.length ? 1 : 0;
    }

    if (output !== undefined && isFile(output)) return usage(recalcCommand, io, `-o ${output} is a file; for several workbooks give an output folder`);
    const started = process.hrtime.bigint();
    const expanded = expandInputs(rest, output, values);
    for (const j of expanded.jobs) {
      for (const o of [j.output, j.valuesOutput]) if (o) fs.mkdirSync(path.dirname(o), { recursive: true });
    }
    const workers = Math.max(1, Math.min(jobsText ? Number(jobsText) : defaultJobs(), expanded.jobs.length || 1));
    const progress = progressFor(io, expanded.jobs.length, json);
    const outcomes = await runSeason(expanded.jobs, { jobs: workers, onOutcome: (o, done, total) => progress.update(o, done, total) });
    progress.stop();
    const refused: JobOutcome[] = expanded.refused.map((r) => ({ kind: "refused", job: { input: r.input, output: "" }, reason: r.reason, seconds: 0 }));
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    const summary = summarizeSeason([...outcomes, ...refused], expanded.skipped, seconds, workers);
    if (summaryFile !== undefined) {
      const body = /\.csv$/i.test(summaryFile) ? seasonCsv(summary) : `${JSON.stringify(summary, null, 2)}\n`;
      try {
        if (fs.existsSync(summaryFile) && !fs.lstatSync(summaryFile).isFile()) throw new Error("it exists and is not a regular file");
        writeAtomically(summaryFile, Buffer.from(body, "utf8"));
      } catch (e) {
        io.err(`soilcell: cannot write the summary ${summaryFile}: ${(e as Error).message}`);
        return Math.max(summary.exitCode, 2);
      }
    }
    if (json) io.out(JSON.stringify({ ...summary, caution: CAUTION }, null, 2));
    else for (const l of seasonText(summary)) io.out(l);
    return summary.exitCode;
  },
};

function exists(p: string): boolean {
  try {
    fs.statSync(p);
    return true;
  } catch {
    return false;
  }
}

const isGlob = (p: string) => /[*?[\]{}]/.test(p);

function isFile(p: string): boolean {
  try {
    return fs.statSync(p).isFile();
  } catch {
    return false;
  }
}

function isDir(p: string): boolean {
  try {
    return fs.statSync(p).isDirectory();
  } catch {
    return false;
  }
}
