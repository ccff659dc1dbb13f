/**
 * `soilcell recalc`: a season of workbooks (files, folders, patterns) recalculated in one run on
 * every core, with one summary. The engine does the work (src/engine/season); this module reads
 * the command line, shows progress and says what happened.
 */
import path from "path";
import { writeAtomically } from "../../engine/recalc";
import { InputError, seasonInputs } from "../../engine/season/inputs";
import { defaultJobs, runSeason } from "../../engine/season/pool";
import { seasonSummary } from "../../engine/season/summary";
import { WorkbookFileError } from "../../engine/xlsx-package";
import { UsageError } from "../args";
import { progressFor } from "../progress";
import { renderSeason, seasonCsv } from "../render/season";
import { Command } from "./command";

function jobsOf(value: string | true | undefined): number {
  if (value === undefined) return defaultJobs();
  const n = Number(value);
  if (!Number.isInteger(n) || n < 1) throw new UsageError(`--jobs takes a whole number of 1 or more (got ${String(value)})`);
  return n;
}

function summaryFileOf(value: string | true | undefined): { file: string; kind: "csv" | "json" } | undefined {
  if (typeof value !== "string") return undefined;
  const ext = path.extname(value).toLowerCase();
  if (ext !== ".csv" && ext !== ".json") throw new UsageError(`--summary writes a .csv or a .json file (got ${value})`);
  return { file: value, kind: ext === ".csv" ? "csv" : "json" };
}

export const command: Command = {
  name: "recalc",
  summary: "recalculate workbooks (files, folders, patterns) into new files, with a season summary",
  usage: ["recalc IN.xlsx|FOLDER|'PATTERN' ... [-o OUT.xlsx|DIR/] [--values] [--jobs N] [--summary FILE.csv|FILE.json] [--json]"],
  about: [
    "Opens each workbook, computes every SOIL formula and the cells that depend on them with the same code as the add-in, and writes a new file beside it, NAME.recalc.xlsx; every other cell keeps the value it was saved with. The input is never written.",
    "Give any mix of files, folders and patterns. A folder is searched with its subfolders for .xlsx and .xlsm workbooks; soilcell's own outputs (NAME.recalc.xlsx), Office's lock files (~$NAME.xlsx) and hidden files are skipped. Patterns are expanded by soilcell itself, so quote them ('season/**/*.xlsx'); * matches within a folder, ** across folders.",
    "With -o DIR/ (a trailing slash, or a folder that exists) the outputs go under DIR, mirroring each input folder's tree; with one workbook, -o OUT.xlsx names the output file.",
    "--values also writes NAME.recalc.values.xlsx beside each output: every SOIL result as a plain value (every other formula and every style kept), with a note in the file's properties saying which soilcell version computed it and when. Send that copy to anyone without the add-in: LibreOffice, other spreadsheet programs and Excel without soilcell show the numbers; keep the .recalc.xlsx, which keeps the formulas.",
    "Workbooks are recalculated in parallel, one per core unless --jobs says otherwise; one workbook refused or failing never stops the others. On a terminal a progress bar shows the workbooks done, the cells computed and the time to go; otherwise one line per workbook. At the end a summary: workbooks recalculated and refused (with the reason), formula cells computed, cells in error grouped by message with file!sheet!cell, and the time taken.",
    "Exit code over the whole run: 0 every workbook recalculated with no cell in error; 1 some cells in error; 2 some workbook refused or unreadable (or nothing to recalculate); 3 a failure in soilcell itself.",
  ],
  options: [
    { name: "--output", short: "-o", value: "PATH", about: "the output file (one workbook), or a folder DIR/ to write under, mirroring the inputs' tree" },
    { name: "--values", about: "also write NAME.recalc.values.xlsx, SOIL results as plain values, for programs without the add-in" },
    { name: "--jobs", short: "-j", value: "N", about: `workbooks at once (default: the number of cores, here ${defaultJobs()})` },
    { name: "--summary", value: "FILE", about: "write the summary as a table, one row per workbook: FILE.csv, or FILE.json with every cell in error" },
    { name: "--json", about: "print the whole summary as JSON on standard output, and nothing else" },
  ],
  examples: [
    "soilcell recalc season.xlsx                         # writes season.recalc.xlsx beside it",
    "soilcell recalc season/ -o out/ --summary season.csv",
    "soilcell recalc 'season/**/*.xlsx' --values --jobs 2",
    "soilcell recalc season.xlsx -o client.xlsx --json",
  ],
  async run(args, io) {
    if (!args.positional.length) throw new UsageError("give the workbooks to recalculate: files, folders or patterns");
    const json = args.options.has("--json");
    const jobs = jobsOf(args.options.get("--jobs"));
    const summaryFile = summaryFileOf(args.options.get("--summary"));
    const output = args.options.get("--output");
    let inputs;
    try {
      inputs = seasonInputs(args.positional, { ...(typeof output === "string" ? { output } : {}), values: args.options.has("--values") });
    } catch (e) {
      if (e instanceof InputError) throw new UsageError(e.message);
      throw e;
    }
    const total = inputs.items.length + inputs.refused.length;
    if (!json) for (const r of inputs.refused) io.err(total > 1 ? `soilcell: ${r.input}: ${r.reason}` : `soilcell: ${r.reason}`);

    const started = process.hrtime.bigint();
    const progress = progressFor(io, json || !inputs.items.length ? "quiet" : io.tty ? "bar" : "lines", inputs.items.length);
    let results;
    try {
      results = await runSeason(inputs.items, { jobs, onProgress: (item, line) => progress.progress(item, line), onDone: (r) => progress.done(r) });
    } finally {
      progress.stop();
    }
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    const summary = seasonSummary(inputs.refused, results, { seconds, jobs: Math.max(1, Math.min(jobs, inputs.items.length)) });

    let code: number = summary.exitCode;
    let written = false;
    if (summaryFile) {
      const text = summaryFile.kind === "csv" ? seasonCsv(summary) : `${JSON.stringify(summary, null, 2)}\n`;
      try {
        writeAtomically(summaryFile.file, Buffer.from(text, "utf8"));
        written = true;
      } catch (e) {
        if (!(e instanceof WorkbookFileError)) throw e;
        io.err(`soilcell: the summary: ${e.message}`);
        code = Math.max(code, 2);
      }
    }
    if (json) io.out(JSON.stringify(summary, null, 2));
    else renderSeason(summary, (l) => io.out(l), summaryFile && written ? summaryFile.file : undefined);
    return code;
  },
};
