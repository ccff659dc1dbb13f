/**
 * `soilcell report TEMPLATE.xlsx`: one report per key from a consultant's own template, each a
 * values-only workbook and a PDF, plus an index. Talks to people: the flags, progress on stderr,
 * a summary on stdout (or JSON), the listings of keys that gave no report and of cells in error.
 */
import fs from "fs";
import path from "path";
import { CAUTION } from "../core/about";
import { BatchSummary, ReportEntry, runReportBatch } from "../engine/report-batch";
import { REPORT_NAMES, ReportTemplateError } from "../engine/report-template";
import { RecalcRefused } from "../engine/recalc";
import { WorkbookFileError } from "../engine/xlsx-package";
import type { Io } from "./io";

export const REPORT_USAGE = `  soilcell report TEMPLATE.xlsx [-o DIR] [--sheet NAME] [--key-cell CELL]
                  [--keys-from RANGE]... [--keys K1,K2,…] [--keys-file FILE] [--limit N]
                  [--group-cell CELL | --no-group] [--file-cell CELL] [--found-cell CELL]
                  [--format xlsx,pdf] [--jobs N] [--json]`;

export const REPORT_HELP = `usage:
${REPORT_USAGE}

One report per key from a template workbook: a workbook with values only and a PDF for each,
named from the key, plus index.csv, index.xlsx and problems.csv in the output folder.

The template names its cells with Excel's defined names (Formulas > Define Name), scoped to the
report sheet or to the workbook, as Print_Area is:
  ${REPORT_NAMES.key.padEnd(15)}the cell where a key is typed (required, or --key-cell)
  ${REPORT_NAMES.keys.padEnd(15)}the cells that list the keys (or --keys-from, --keys, --keys-file)
  ${REPORT_NAMES.found.padEnd(15)}TRUE when the key selects something (else the key is listed as not found)
  ${REPORT_NAMES.file.padEnd(15)}the text that names the report's files (default: the key)
  ${REPORT_NAMES.group.padEnd(15)}the text that groups reports: a folder and one PDF per group
  ${REPORT_NAMES.figures.padEnd(15)}two columns, label and value: the figures the index lists

  -o, --out DIR     output folder (default: "<template> reports" beside the template)
  --sheet NAME      the report sheet, when several have a ${REPORT_NAMES.key}
  --format LIST     xlsx, pdf or both (default both; PDFs need LibreOffice and poppler-utils)
  --jobs N          LibreOffice runs side by side, each started once for its share (default 2; 1 on one core)
  --limit N         only the first N keys (a trial run)
  --json            the summary as JSON on stdout
  -h, --help        this help

Exit status: 0 every key reported without a cell in error; 1 a key gave no report, a report has
cells in error, or a PDF could not be written; 2 the template or the options cannot be used.`;

interface Parsed {
  template?: string;
  out?: string;
  sheet?: string;
  keyCell?: string;
  keysFrom: string[];
  keys?: string[];
  keysFile?: string;
  limit?: number;
  groupCell?: string;
  noGroup: boolean;
  fileCell?: string;
  foundCell?: string;
  formats: Set<string>;
  jobs?: number;
  json: boolean;
  help: boolean;
}

function parseArgs(args: readonly string[]): Parsed | string {
  const p: Parsed = { keysFrom: [], noGroup: false, formats: new Set(["xlsx", "pdf"]), json: false, help: false };
  const value = (i: number, flag: string): string => {
    const v = args[i + 1];
    if (v === undefined) throw new Error(`${flag} needs a value`);
    return v;
  };
  try {
    for (let i = 0; i < args.length; i++) {
      const a = args[i] as string;
      switch (a) {
        case "-o":
        case "--out":
          p.out = value(i++, a);
          break;
        case "--sheet":
          p.sheet = value(i++, a);
          break;
        case "--key-cell":
          p.keyCell = value(i++, a);
          break;
        case "--keys-from":
          p.keysFrom.push(value(i++, a));
          break;
        case "--keys":
          p.keys = [...(p.keys ?? []), ...value(i++, a).split(",").map((k) => k.trim()).filter(Boolean)];
          break;
        case "--keys-file":
          p.keysFile = value(i++, a);
          break;
        case "--limit": {
          const n = Number(value(i++, a));
          if (!Number.isInteger(n) || n < 1) return "--limit needs a whole number of keys, 1 or more";
          p.limit = n;
          break;
        }
        case "--group-cell":
          p.groupCell = value(i++, a);
          break;
        case "--no-group":
          p.noGroup = true;
          break;
        case "--file-cell":
          p.fileCell = value(i++, a);
          break;
        case "--found-cell":
          p.foundCell = value(i++, a);
          break;
        case "--format": {
          const list = value(i++, a).split(",").map((f) => f.trim().toLowerCase()).filter(Boolean);
          const bad = list.filter((f) => f !== "xlsx" && f !== "pdf");
          if (bad.length || !list.length) return `--format takes xlsx, pdf or both (xlsx,pdf); not ${bad.join(", ") || "nothing"}`;
          p.formats = new Set(list);
          break;
        }
        case "--jobs": {
          const n = Number(value(i++, a));
          if (!Number.isInteger(n) || n < 1 || n > 8) return "--jobs needs a whole number from 1 to 8";
          p.jobs = n;
          break;
        }
        case "--json":
          p.json = true;
          break;
        case "-h":
        case "--help":
          p.help = true;
          break;
        default:
          if (a.startsWith("-")) return `unknown option ${a}`;
          if (p.template !== undefined) return `one template at a time (got ${p.template} and ${a})`;
          p.template = a;
      }
    }
  } catch (e) {
    return (e as Error).message;
  }
  if (p.noGroup && p.groupCell) return "--group-cell and --no-group contradict each other";
  return p;
}

/** The default output folder: beside the template, named after it. */
export function defaultReportDir(template: string): string {
  const ext = path.extname(template);
  return path.join(path.dirname(template), `${path.basename(template, ext)} reports`);
}

function readKeysFile(file: string): string[] {
  let text: string;
  try {
    text = fs.readFileSync(file, "utf8");
  } catch (e) {
    throw new ReportTemplateError(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  return text
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter(Boolean);
}

export async function runReport(args: readonly string[], io: Io): Promise<number> {
  const p = parseArgs(args);
  if (typeof p === "string") {
    io.err(`soilcell report: ${p}`);
    io.err(REPORT_USAGE);
    return 2;
  }
  if (p.help) {
    io.out(REPORT_HELP);
    return 0;
  }
  if (!p.template) {
    io.err(REPORT_USAGE);
    return 2;
  }
  try {
    const keys = p.keysFile ? [...(p.keys ?? []), ...readKeysFile(p.keysFile)] : p.keys;
    const summary = await runReportBatch(p.template, {
      outDir: p.out ?? defaultReportDir(p.template),
      ...(p.sheet !== undefined ? { sheet: p.sheet } : {}),
      ...(p.keyCell !== undefined ? { keyCell: p.keyCell } : {}),
      ...(p.keysFrom.length ? { keysFrom: p.keysFrom } : {}),
      ...(keys ? { keys } : {}),
      ...(p.limit !== undefined ? { limit: p.limit } : {}),
      ...(p.groupCell !== undefined ? { groupCell: p.groupCell } : {}),
      ...(p.noGroup ? { group: false } : {}),
      ...(p.fileCell !== undefined ? { fileCell: p.fileCell } : {}),
      ...(p.foundCell !== undefined ? { foundCell: p.foundCell } : {}),
      ...(p.jobs !== undefined ? { jobs: p.jobs } : {}),
      xlsx: p.formats.has("xlsx"),
      pdf: p.formats.has("pdf"),
      progress: (l) => io.err(l),
    });
    if (p.json) {
      io.out(JSON.stringify(summary, null, 2));
      io.err(CAUTION);
    } else printReportSummary(summary, (l) => io.out(l));
    const expected = summary.entries.filter((e) => e.status === "ok" || e.status === "errors").length;
    const incomplete = p.formats.has("pdf") && summary.pdf.written < expected;
    return summary.notFound || summary.withErrors || summary.entries.some((e) => e.status === "not reported") || incomplete ? 1 : 0;
  } catch (e) {
    if (e instanceof ReportTemplateError || e instanceof WorkbookFileError || e instanceof RecalcRefused) {
      io.err(`soilcell report: ${e.message}`);
      return 2;
    }
    throw e;
  }
}

const rel = (p: string) => path.relative(process.cwd(), p) || p;

/** The summary a person reads: what was written, where, and every key that gave no report or has errors. */
export function printReportSummary(s: BatchSummary, say: (line: string) => void): void {
  const kinds = [s.entries.some((e) => e.xlsx) ? "a workbook" : "", s.pdf.written ? "a PDF" : ""].filter(Boolean).join(" and ");
  say(`wrote ${s.reports} report${s.reports === 1 ? "" : "s"} (${kinds || "nothing"} each) into ${rel(s.outDir)}/`);
  say(`  index: ${path.basename(s.index.csv)}, ${path.basename(s.index.xlsx)}; problems: ${path.basename(s.index.problems)}`);
  if (s.groupPdfs.length) say(`  one PDF per group: ${s.groupPdfs.slice(0, 8).join(", ")}${s.groupPdfs.length > 8 ? ", …" : ""}`);
  say(`  template: sheet "${s.sheet}", key cell ${s.keyCell}${s.names.keys ? `, keys from ${s.names.keys}` : ""}; ${s.perKeyCells} formula cells computed per key (of ${s.templateFormulaCells})`);
  if (s.pdf.skipped) say(`  PDF: ${s.pdf.skipped}`);
  else if (s.pdf.engine) {
    const runs = `${s.pdf.runs} run${s.pdf.runs === 1 ? "" : "s"}`;
    say(`  PDF: ${s.pdf.written} by ${s.pdf.engine}, ${runs} (${s.pdf.mode === "combined" ? "each run one workbook of its reports, split into pages" : "each report's own workbook"})`);
  }
  for (const n of s.pdf.notes.slice(0, 5)) say(`    ${n}`);
  for (const w of s.warnings) say(`  note: ${w}`);
  const list = (title: string, rows: readonly ReportEntry[], line: (e: ReportEntry) => string) => {
    say(`${title}: ${rows.length}`);
    for (const e of rows.slice(0, 20)) say(`  ${line(e)}`);
    if (rows.length > 20) say(`  … and ${rows.length - 20} more (see ${path.basename(s.index.problems)})`);
  };
  list("Keys that gave no report", s.entries.filter((e) => e.status === "not found" || e.status === "not reported"), (e) => `${e.key} (${e.from}): ${e.reason}`);
  list("Reports with cells in error", s.entries.filter((e) => e.status === "errors"), (e) => `${e.key}: ${e.errors.slice(0, 3).map((x) => `${x.cell} ${x.error} ${x.message}`).join("; ")}${e.errors.length > 3 ? ` … (${e.errors.length} cells)` : ""}`);
  const t = s.seconds;
  say(`${t.total.toFixed(1)} s (template ${t.template.toFixed(1)} s, reports ${t.reports.toFixed(1)} s, PDF ${t.pdf.toFixed(1)} s)`);
  say(CAUTION);
}
