/**
 * A batch of reports from one template: for every key a values-only workbook and a PDF, named
 * from the key (or Report_File), grouped by Report_Group when the template has one, and an index
 * (CSV and a workbook) listing every key with its headline figures, its files and its problems.
 * Keys that select nothing and reports with cells in error are listed, never skipped in silence.
 *
 * PDFs: every report's sheet goes into one workbook (one per LibreOffice run; two runs side by
 * side by default, each started once) that LibreOffice converts in a single pass; the PDF is split
 * into pages, one per report. When the pages do not come out one per
 * report (a report longer than a page, or a header naming the sheet), each report's own workbook
 * is converted instead, still in one run of LibreOffice for the lot.
 */
import fs from "fs";
import os from "os";
import path from "path";
import { CAUTION } from "../core/about";
import { Scalar, isError } from "./formula/values";
import { OfficeTools, convertToPdf, findOfficeTools, missingToolsMessage, officeVersion, pdfPageCount, splitPdf, unitePdfs } from "./office-pdf";
import { CellProblem, valuesStamp, writeAtomically } from "./recalc";
import { ReportPackager } from "./report-package";
import { tableWorkbook } from "./table-xlsx";
import { Figure, KeyProblem, ReportTemplate, TemplateOptions, openReportTemplate } from "./report-template";

export interface BatchOptions extends TemplateOptions {
  /** The folder the reports go into (created; files already there with the same names are replaced). */
  readonly outDir: string;
  readonly xlsx?: boolean;
  readonly pdf?: boolean;
  /** Put reports in a folder per Report_Group (default: when the template names one). */
  readonly group?: boolean;
  /**
   * LibreOffice runs side by side, each started once for its share of the reports (default: 2, or
   * 1 on a one-core machine; 280 reports on 2 shared cores took 62 s with one run, 38 s with two).
   */
  readonly jobs?: number;
  /** Only the first N keys (a trial run). */
  readonly limit?: number;
  /** "files": convert each report's workbook (one LibreOffice run for all); default "combined". */
  readonly pdfMode?: "combined" | "files";
  /** The office tools to use (default: found on PATH). */
  readonly tools?: OfficeTools;
}

export type ReportStatus = "ok" | "errors" | "not found" | "not reported";

export interface ReportEntry {
  readonly key: string;
  /** Where the key came from. */
  readonly from: string;
  readonly status: ReportStatus;
  /** Why a key gave no report. */
  readonly reason?: string;
  readonly name?: string;
  readonly group?: string;
  /** Paths relative to the output folder. */
  xlsx?: string;
  pdf?: string;
  pages?: number;
  readonly figures: readonly Figure[];
  readonly errors: readonly CellProblem[];
}

export interface BatchSummary {
  readonly template: string;
  readonly sheet: string;
  readonly keyCell: string;
  readonly names: ReportTemplate["names"];
  readonly outDir: string;
  readonly entries: readonly ReportEntry[];
  /** Reports written (a workbook, a PDF or both). */
  readonly reports: number;
  readonly notFound: number;
  readonly withErrors: number;
  readonly index: { readonly csv: string; readonly xlsx: string; readonly problems: string };
  /** Combined PDFs, one per group. */
  readonly groupPdfs: readonly string[];
  readonly pdf: {
    readonly written: number;
    readonly engine?: string;
    readonly mode?: "combined" | "files";
    /** LibreOffice runs (each started once). */
    readonly runs?: number;
    readonly skipped?: string;
    readonly notes: readonly string[];
  };
  /** Cells computed again per key; cells of the template's own recalculation. */
  readonly perKeyCells: number;
  readonly templateFormulaCells: number;
  readonly warnings: readonly string[];
  readonly seconds: { readonly total: number; readonly template: number; readonly reports: number; readonly pdf: number; readonly index: number };
}

/** A file or folder name from a key: no path separators or characters file systems refuse. */
export function safeFileName(s: string): string {
  let out = s
    .normalize("NFC")
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u001f\u007f/\\:*?"<>|]/g, "_")
    .replace(/\s+/g, " ")
    .trim()
    .replace(/^[. ]+|[. ]+$/g, "");
  if (out.length > 120) out = out.slice(0, 120).trim();
  if (!out) out = "report";
  if (/^(con|prn|aux|nul|com[1-9]|lpt[1-9])(\..*)?$/i.test(out)) out = `${out}_`;
  return out;
}

function keyString(k: string | number): string {
  return typeof k === "number" ? String(k) : k;
}

/** Runs a batch: every key's workbook and PDF, the index, the group PDFs. */
export async function runReportBatch(template: string, options: BatchOptions): Promise<BatchSummary> {
  const t0 = Date.now();
  const say = options.progress ?? (() => undefined);
  const wantXlsx = options.xlsx !== false;
  const wantPdf = options.pdf !== false;
  const tpl = await openReportTemplate(template, options);
  const tTemplate = Date.now();
  const packager = new ReportPackager(tpl.pkg, tpl.sheet);
  const warnings: string[] = [];
  if (packager.hasCharts) warnings.push("the report sheet holds a chart: it is copied as it is, and its cached data are the template's, not each report's");
  for (const d of packager.dropped) warnings.push(`the report sheet's ${d.split("/").pop()} parts are not copied (a values copy has no tables or pivot tables); their cells are`);
  const outDir = path.resolve(options.outDir);
  fs.mkdirSync(outDir, { recursive: true });
  const grouping = options.group !== false && tpl.names.group !== undefined;

  const entries: ReportEntry[] = [];
  // Entries of the key list that cannot be keys, where they stood in the list.
  let pi = 0;
  const problemsBefore = (i: number) => {
    while (pi < tpl.keyProblems.length && (tpl.keyProblems[pi] as KeyProblem).before <= i) entries.push(problemEntry(tpl.keyProblems[pi++] as KeyProblem));
  };
  const sheets: { entry: ReportEntry; xml: string; dir: string; base: string }[] = [];
  const used = new Map<string, Set<string>>();
  const keys = options.limit !== undefined ? tpl.keys.slice(0, Math.max(0, options.limit)) : tpl.keys;
  const stamp = valuesStamp();
  keys.forEach((k, i) => {
    problemsBefore(i);
    if (i > 0 && i % 50 === 0) say(`${i} of ${keys.length} reports`);
    const r = tpl.report(k.key);
    const key = keyString(k.key);
    if (r.found === false) {
      entries.push({ key, from: k.from, status: "not found", reason: `the template's ${tpl.names.found ?? "found"} cell says this key selects nothing`, figures: r.figures, errors: [] });
      return;
    }
    const group = grouping ? r.group : undefined;
    const dir = group ? safeFileName(group) : "";
    const taken = used.get(dir.toUpperCase()) ?? new Set<string>();
    used.set(dir.toUpperCase(), taken);
    let base = safeFileName(r.name);
    for (let n = 2; taken.has(base.toUpperCase()); n++) base = `${safeFileName(r.name)} (${n})`;
    taken.add(base.toUpperCase());
    const entry: ReportEntry = { key, from: k.from, status: r.errors.length ? "errors" : "ok", name: r.name, ...(group ? { group } : {}), figures: r.figures, errors: r.errors };
    if (wantXlsx) {
      const rel = path.join(dir, `${base}.xlsx`);
      fs.mkdirSync(path.join(outDir, dir), { recursive: true });
      writeAtomically(path.join(outDir, rel), packager.single(r.sheetXml, r.name, `Report for ${key} from ${path.basename(template)}, every cell a value, by ${stamp}.`), { durable: false });
      entry.xlsx = rel;
    }
    entries.push(entry);
    sheets.push({ entry, xml: r.sheetXml, dir, base });
  });
  problemsBefore(keys.length === tpl.keys.length ? Number.MAX_SAFE_INTEGER : keys.length);
  const tReports = Date.now();

  // PDFs
  const tools = options.tools ?? findOfficeTools();
  const pdfNotes: string[] = [];
  let pdfInfo: BatchSummary["pdf"] = { written: 0, notes: pdfNotes };
  const groupPdfs: string[] = [];
  if (wantPdf && sheets.length) {
    const missing = missingToolsMessage(tools);
    if (missing) pdfInfo = { written: 0, skipped: missing, notes: pdfNotes };
    else {
      const tmp = fs.mkdtempSync(path.join(os.tmpdir(), "soilcell-reports-"));
      try {
        const headerNamesSheet = /<(?:\w+:)?headerFooter\b[\s\S]*&amp;A/.test(tpl.sheet.xml);
        let mode: "combined" | "files" = options.pdfMode ?? (headerNamesSheet ? "files" : "combined");
        let runs = 0;
        if (mode === "combined") {
          const jobs = Math.max(1, Math.min(options.jobs ?? Math.min(2, os.cpus().length), 8, sheets.length));
          const ok = await combinedPdfs(tools, packager, sheets, tmp, outDir, jobs, say, pdfNotes);
          runs += jobs;
          if (!ok) {
            pdfNotes.push("the reports did not come out one page each; each report's workbook was converted on its own");
            mode = "files";
          }
        }
        if (mode === "files") runs += await filePdfs(tools, packager, sheets, tmp, outDir, say, pdfNotes);
        if (grouping) {
          const byGroup = new Map<string, string[]>();
          for (const s of sheets) if (s.entry.pdf && s.dir) byGroup.set(s.dir, [...(byGroup.get(s.dir) ?? []), path.join(outDir, s.entry.pdf)]);
          for (const [dir, files] of byGroup) {
            const out = path.join(outDir, `${dir}.pdf`);
            unitePdfs(tools, files, out);
            groupPdfs.push(path.relative(outDir, out));
          }
        }
        pdfInfo = { written: sheets.filter((s) => s.entry.pdf).length, engine: officeVersion(tools), mode, runs, notes: pdfNotes };
      } finally {
        fs.rmSync(tmp, { recursive: true, force: true });
      }
    }
  }
  const tPdf = Date.now();

  const index = writeIndex(outDir, entries, tpl);
  const tIndex = Date.now();
  const reports = entries.filter((e) => e.xlsx || e.pdf).length;
  return {
    template,
    sheet: tpl.sheet.name,
    keyCell: tpl.keyCell,
    names: tpl.names,
    outDir,
    entries,
    reports,
    notFound: entries.filter((e) => e.status === "not found").length,
    withErrors: entries.filter((e) => e.status === "errors").length,
    index,
    groupPdfs,
    pdf: pdfInfo,
    perKeyCells: tpl.perKeyCells,
    templateFormulaCells: tpl.base.formulaCells,
    warnings,
    seconds: { total: (tIndex - t0) / 1000, template: (tTemplate - t0) / 1000, reports: (tReports - tTemplate) / 1000, pdf: (tPdf - tReports) / 1000, index: (tIndex - tPdf) / 1000 },
  };
}

function problemEntry(p: KeyProblem): ReportEntry {
  return { key: p.key, from: p.from, status: p.notFound ? "not found" : "not reported", reason: p.reason, figures: [], errors: [] };
}

type Item = { entry: ReportEntry; xml: string; dir: string; base: string };

/** All reports as sheets of one workbook per job, each converted by one LibreOffice run, split into pages. False when the pages are not one per report. */
async function combinedPdfs(tools: OfficeTools, packager: ReportPackager, items: Item[], tmp: string, outDir: string, jobs: number, say: (l: string) => void, notes: string[]): Promise<boolean> {
  const size = Math.ceil(items.length / jobs);
  const chunks: Item[][] = [];
  for (let i = 0; i < items.length; i += size) chunks.push(items.slice(i, i + size));
  say(`converting ${items.length} reports to PDF with LibreOffice (${chunks.length} run${chunks.length > 1 ? "s" : ""} side by side)`);
  const files = chunks.map((c, j) => {
    const f = path.join(tmp, `reports-${j + 1}.xlsx`);
    fs.writeFileSync(f, packager.combined(c.map((it, i) => ({ xml: it.xml, name: `R${i + 1}` })), "reports"));
    return f;
  });
  const results = await Promise.all(files.map((f, j) => convertToPdf(tools, [f], path.join(tmp, `pdf-${j + 1}`))));
  for (const r of results) notes.push(...r.notes);
  for (const [j, c] of chunks.entries()) {
    const pdf = results[j]!.pdfs[0];
    if (!pdf || pdfPageCount(tools, pdf) !== c.length) return false;
  }
  for (const [j, c] of chunks.entries()) {
    const pages = path.join(tmp, `pages-${j + 1}`);
    fs.mkdirSync(pages);
    splitPdf(tools, results[j]!.pdfs[0] as string, path.join(pages, "p-%d.pdf"));
    c.forEach((it, i) => placePdf(it, path.join(pages, `p-${i + 1}.pdf`), outDir, 1));
  }
  return true;
}

/**
 * Each report's own workbook, converted by LibreOffice in one run (runs of at most 200 files:
 * LibreOffice 7.4 stopped after 246 files in one run when tried, without a message).
 */
async function filePdfs(tools: OfficeTools, packager: ReportPackager, items: Item[], tmp: string, outDir: string, say: (l: string) => void, notes: string[]): Promise<number> {
  const dir = path.join(tmp, "files");
  fs.mkdirSync(dir, { recursive: true });
  const files = items.map((it, i) => {
    const f = path.join(dir, `report-${i + 1}.xlsx`);
    fs.writeFileSync(f, packager.single(packager.forPdf(it.xml), it.entry.name ?? it.entry.key, "for conversion"));
    return f;
  });
  say(`converting ${items.length} report workbooks to PDF with LibreOffice`);
  let runs = 0;
  for (let i = 0; i < files.length; i += 200) {
    runs++;
    const r = await convertToPdf(tools, files.slice(i, i + 200), path.join(tmp, "files-pdf"));
    notes.push(...r.notes);
    r.pdfs.forEach((pdf, j) => {
      const it = items[i + j]!;
      if (pdf) placePdf(it, pdf, outDir, pdfPageCount(tools, pdf));
      else notes.push(`LibreOffice wrote no PDF for ${it.entry.key}`);
    });
  }
  return runs;
}

function placePdf(it: Item, from: string, outDir: string, pages: number): void {
  const rel = path.join(it.dir, `${it.base}.pdf`);
  fs.mkdirSync(path.join(outDir, it.dir), { recursive: true });
  fs.renameSync(from, path.join(outDir, rel));
  it.entry.pdf = rel;
  it.entry.pages = pages;
}

// ---------------------------------------------------------------------------------------------
// Index

const INDEX_HEAD = ["Key", "Status", "Group", "Name", "Workbook", "PDF", "Pages"];

function csvField(v: unknown): string {
  const s = v === null || v === undefined ? "" : String(v);
  return /[",\r\n]/.test(s) || /^\s|\s$/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** A figure's value for a CSV: numbers in full, dates (by their format) as ISO dates, errors as their code. */
function figureText(f: Figure | undefined, date1904: boolean): string {
  if (!f) return "";
  const v: Scalar = f.value;
  if (v === null) return "";
  if (isError(v)) return v.code;
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  if (typeof v === "number" && isDateFormat(f.format)) return serialToIso(v, date1904);
  return String(v);
}

/**
 * Whether a number format shows a date (d, m, y outside quotes and brackets; m alone may be minutes
 * only with h or s). Elapsed time ([h]:mm, [mm]:ss) is a duration, not a date.
 */
export function isDateFormat(code: string): boolean {
  const unquoted = code.replace(/"[^"]*"|\\./g, "");
  if (/\[(?:h+|m+|s+)\]/i.test(unquoted)) return false;
  const bare = unquoted.replace(/\[[^\]]*\]/g, "");
  return /[dy]/i.test(bare) || (/m/i.test(bare) && !/[hs]/i.test(bare) && !/0/.test(bare));
}

function serialToIso(serial: number, date1904: boolean): string {
  // Excel's 1900 system counts a 29 February 1900 that did not exist.
  const days = date1904 ? serial + 1462 : serial < 60 ? serial + 1 : serial;
  const ms = Date.UTC(1899, 11, 30) + Math.round(days * 86400000);
  const iso = new Date(ms).toISOString();
  return serial % 1 === 0 ? iso.slice(0, 10) : iso.slice(0, 19);
}

function problemRows(entries: readonly ReportEntry[]): string[][] {
  const rows: string[][] = [];
  for (const e of entries) {
    if (e.status === "not found" || e.status === "not reported") rows.push([e.key, e.status, "", "", "", e.reason ?? "", e.from]);
    for (const p of e.errors) rows.push([e.key, "cell in error", `${p.sheet}!${p.cell}`, p.error, p.formula, p.message, e.from]);
  }
  return rows;
}

const PROBLEM_HEAD = ["Key", "Problem", "Cell", "Error", "Formula", "Message", "Key from"];

function writeIndex(outDir: string, entries: readonly ReportEntry[], tpl: ReportTemplate): BatchSummary["index"] {
  const labels: string[] = [];
  for (const e of entries) for (const f of e.figures) if (!labels.includes(f.label)) labels.push(f.label);
  const head = [...INDEX_HEAD, ...labels, "Cells in error", "Key from"];
  const row = (e: ReportEntry) => [e.key, e.status, e.group ?? "", e.name ?? "", e.xlsx ?? "", e.pdf ?? "", e.pages ?? ""];
  const date1904 = tpl.book.date1904;
  const lines = [head.map(csvField).join(",")];
  for (const e of entries) {
    const figs = labels.map((l) => figureText(e.figures.find((f) => f.label === l), date1904));
    lines.push([...row(e), ...figs, e.errors.length, e.from].map(csvField).join(","));
  }
  const csv = path.join(outDir, "index.csv");
  writeAtomically(csv, Buffer.from(`${lines.join("\r\n")}\r\n`, "utf8"));
  const problems = path.join(outDir, "problems.csv");
  writeAtomically(problems, Buffer.from(`${[PROBLEM_HEAD, ...problemRows(entries)].map((r) => r.map(csvField).join(",")).join("\r\n")}\r\n`, "utf8"));

  const reportRows: Scalar[][] = [head];
  const formats = new Map<string, string>();
  entries.forEach((e, ri) => {
    const figs = labels.map((l, i) => {
      const f = e.figures.find((x) => x.label === l);
      if (f && typeof f.value === "number") formats.set(`${ri + 1}|${INDEX_HEAD.length + i}`, f.format);
      return f ? f.value : null;
    });
    reportRows.push([...row(e), ...figs, e.errors.length, e.from]);
  });
  const about = [
    ["About"],
    [`Reports from ${path.basename(tpl.file)}, sheet "${tpl.sheet.name}", key cell ${tpl.keyCell}; written by ${valuesStamp()}.`],
    ["Every report workbook holds values only: the template's formulas were computed for each key (SOIL results included) and written as values."],
    [CAUTION],
  ];
  const book = tableWorkbook([
    { name: "Reports", rows: reportRows, format: (r, c) => formats.get(`${r}|${c}`), widths: head.map((_, i) => (i < 2 ? 14 : i < 4 ? 18 : i < 6 ? 28 : 14)) },
    { name: "Problems", rows: [PROBLEM_HEAD, ...problemRows(entries)], widths: [14, 16, 18, 10, 50, 80, 22] },
    { name: "About", rows: about, widths: [120] },
  ]);
  const xlsx = path.join(outDir, "index.xlsx");
  writeAtomically(xlsx, book);
  return { csv, xlsx, problems };
}
