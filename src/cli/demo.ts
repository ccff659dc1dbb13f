/**
 * `npm run demo`: recalculates every sample workbook headless into demo-output/ with the same
 * code Excel runs, then reads the results back and prints what a consultant would want to know
 * first: how many samples were interpreted, how much lime each farm needs, which paddocks sit
 * below optimum, which legume paddocks have a soil constraint on fixation or poor nodulation, and
 * which cells are in error and why. The inputs are never written.
 */
import crypto from "crypto";
import fs from "fs";
import path from "path";
import ExcelJS from "exceljs";
import { CAUTION } from "../core/about";
import { sufficiencyTables } from "../core/bands/sufficiency";
import { CellProblem, RecalcSummary, recalcWorkbook } from "../engine/recalc";
import { BatchSummary, runReportBatch } from "../engine/report-batch";
import { REPORT_NAMES } from "../engine/report-template";
import { openPackage } from "../engine/xlsx-package";

/** Sheet names and column headers the sample workbooks use; the generator takes them from here. */
export const LAYOUT = {
  SHEETS: { farms: "Farms", legume: "Legume N budget", legumeTotals: "Farm totals", nodulation: "Nodulation and soil" },
  /** The group label above a lab sheet's interpretation columns (row above the headers). */
  SOIL_GROUP: "Interpretation: SOIL formulas",
  HEADERS: {
    sampleId: "Sample ID",
    farm: "Farm",
    paddock: "Paddock",
    area: "Area (ha)",
    crop: "Next crop",
    product: "Lime product",
    lab: "Lab",
    samples: "Samples",
    rotation: "Rotation",
    pBand: "P band",
    pPos: "P position (band scale)",
    kBand: "K band",
    kPos: "K position (band scale)",
    sBand: "S band",
    sPos: "S position (band scale)",
    znBand: "Zn band",
    znPos: "Zn position (band scale)",
    cuBand: "Cu band",
    cuPos: "Cu position (band scale)",
    mnBand: "Mn band",
    limeCaco3: "Lime as CaCO3 (t/ha)",
    limeProduct: "Lime product (t/ha)",
    limeTonnes: "Lime to spread (t)",
    needLime: "Paddocks needing lime",
    pBelow: "P below optimum",
    kBelow: "K below optimum",
    sBelow: "S below optimum",
    znBelow: "Zn below optimum",
    cuBelow: "Cu below optimum",
    mnBelow: "Mn below optimum",
    legumePaddocks: "Legume paddocks",
    nFixedTotal: "N fixed (kg N)",
    nCreditTotal: "N credit to next crop (kg N)",
    nBalance: "N balance (kg N/ha)",
    nodRating: "Nodulation rating",
    soilScreen: "Soil conditions for fixation",
    soilConstraints: "Soil constraints found",
  },
  /**
   * The analytes the demo counts, in report order: the band column a lab sheet holds where a
   * reference table covers the analyte, and the raw columns of a lab that reports it with no
   * table (shown as "no reference table"). An analyte a sheet has neither of is not reported there.
   */
  ANALYTES: [
    { key: "P", band: "P band", unbanded: [] },
    { key: "K", band: "K band", unbanded: ["Colwell K (mg/kg)"] },
    { key: "S", band: "S band", unbanded: ["SO4-S (ppm)"] },
    { key: "Zn", band: "Zn band", unbanded: [] },
    { key: "Cu", band: "Cu band", unbanded: [] },
    { key: "Mn", band: "Mn band", unbanded: [] },
  ],
} as const;

const H = LAYOUT.HEADERS;

export interface DemoOptions {
  /** Folder of workbooks to recalculate; default sample-workbooks/ of the repository. */
  readonly inputDir?: string;
  /** Folder for the recalculated copies; default demo-output/ of the repository. */
  readonly outputDir?: string;
  /** Where the human summary goes; default stdout. Pass null for none. */
  readonly print?: ((line: string) => void) | null;
  /**
   * Client reports from every sample workbook that is a report template (it names a Report_Key),
   * into <outputDir>/reports/; false for none. `limit`: only the first N keys; `pdf`: false for
   * workbooks only.
   */
  readonly reports?: false | { readonly limit?: number; readonly pdf?: boolean };
}

/** One template's reports in the demo. */
export interface DemoReports {
  readonly template: string;
  readonly summary: BatchSummary;
}

/** One sample workbook's recalculation: the engine's own summary, named by the sample file. */
export interface WorkbookResult extends Omit<RecalcSummary, "input" | "sheets"> {
  readonly file: string;
}

export interface LabSamples {
  readonly workbook: string;
  readonly sheet: string;
  readonly samples: number;
  /** Samples with at least one SOIL result in the row. */
  readonly interpreted: number;
}

export interface FarmLime {
  readonly farm: string;
  readonly lab: string;
  readonly samples: number;
  readonly paddocksNeedingLime: number;
  readonly product: string;
  /** Product as received, tonnes, over the farm's sampled paddocks. */
  readonly tonnes: number;
}

export interface AnalyteBelow {
  readonly analyte: string;
  /** Sample IDs in the first band of their table (below optimum); null where the lab reports the analyte but no reference table covers it. */
  readonly ids: readonly string[] | null;
}

export interface BelowOptimum {
  readonly farm: string;
  /** One entry per analyte the farm's lab reports, in LAYOUT.ANALYTES order. */
  readonly analytes: readonly AnalyteBelow[];
}

/** How many samples of the season got a band for an analyte, and how many of those are in the first band. */
export interface AnalyteCount {
  readonly analyte: string;
  readonly banded: number;
  readonly below: number;
}

export interface LegumeFarm {
  readonly farm: string;
  readonly paddocks: number;
  readonly nFixedKg: number;
  readonly nCreditKg: number;
}

/** The root digs and soil screen of the legume budget's "Nodulation and soil" sheet. */
export interface LegumeChecks {
  /** Paddocks with a rating or a screen result. */
  readonly paddocks: number;
  /** Paddocks whose soil screen found at least one constraint on fixation. */
  readonly constrained: readonly string[];
  /** Paddocks rated Poor or None for nodulation. */
  readonly poorNodulation: readonly string[];
}

export interface ErrorReason {
  readonly error: string;
  readonly message: string;
  readonly cells: readonly string[];
}

export interface DemoSummary {
  readonly inputDir: string;
  readonly outputDir: string;
  readonly workbooks: readonly WorkbookResult[];
  readonly labs: readonly LabSamples[];
  readonly samples: number;
  readonly lime: readonly FarmLime[];
  readonly belowOptimum: readonly BelowOptimum[];
  /** Band results per analyte over the season (the new analytes counted with the old). */
  readonly bands: readonly AnalyteCount[];
  readonly legume: readonly LegumeFarm[];
  /** Paddocks of the legume budget whose grain took more N than the crop fixed. */
  readonly legumeNegative: readonly string[];
  /** Root digs and soil screen; null when no workbook has the sheet. */
  readonly legumeChecks: LegumeChecks | null;
  readonly errors: readonly (CellProblem & { workbook: string })[];
  readonly reasons: readonly ErrorReason[];
  /** Every input file has the same bytes after the run as before. */
  readonly inputsUntouched: boolean;
  /** The client reports written (one entry per template workbook). */
  readonly reports: readonly DemoReports[];
}

/**
 * The repository root: the nearest folder above this file with soilcell's package.json and a
 * sample-workbooks/ folder (the compiled build/ holds a copy of package.json, but no samples).
 */
export function repoRoot(from = __dirname): string {
  let dir = from;
  for (;;) {
    const pkg = path.join(dir, "package.json");
    if (fs.existsSync(pkg) && fs.existsSync(path.join(dir, "sample-workbooks"))) {
      try {
        if (JSON.parse(fs.readFileSync(pkg, "utf8")).name === "soilcell") return dir;
      } catch {
        // not ours; keep looking
      }
    }
    const up = path.dirname(dir);
    if (up === dir) return process.cwd();
    dir = up;
  }
}

const digest = (file: string) => crypto.createHash("sha256").update(fs.readFileSync(file)).digest("hex");

/** A cell's value as the file caches it (formula results unwrapped; errors as { error }). */
function plain(v: ExcelJS.CellValue): unknown {
  if (v === null || v === undefined) return null;
  if (typeof v === "object" && !(v instanceof Date)) {
    if ("formula" in v || "sharedFormula" in v) return plain((v as { result?: ExcelJS.CellValue }).result ?? null);
    if ("richText" in v) return v.richText.map((t) => t.text).join("");
  }
  return v;
}

const asNumber = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);
const asText = (v: unknown): string => (v === null || v === undefined ? "" : typeof v === "object" ? "" : String(v));

interface Table {
  readonly headerRow: number;
  readonly header: Map<string, number>;
  readonly rows: unknown[][];
}

/** Reads a sheet as a table under the header row that holds `firstHeader` in column A. */
function table(ws: ExcelJS.Worksheet, firstHeader: string): Table | undefined {
  let headerRow = 0;
  for (let r = 1; r <= Math.min(ws.rowCount, 10); r++) {
    if (asText(plain(ws.getCell(r, 1).value)) === firstHeader) {
      headerRow = r;
      break;
    }
  }
  if (!headerRow) return undefined;
  const header = new Map<string, number>();
  ws.getRow(headerRow).eachCell((cell, c) => header.set(asText(plain(cell.value)), c));
  const rows: unknown[][] = [];
  for (let r = headerRow + 1; r <= ws.rowCount; r++) {
    const row = ws.getRow(r);
    const first = plain(row.getCell(1).value);
    if (first === null || first === "") break;
    const values: unknown[] = [];
    for (let c = 1; c <= ws.columnCount; c++) values[c] = plain(row.getCell(c).value);
    rows.push(values);
  }
  return { headerRow, header, rows };
}

const column = (t: Table, name: string): number | undefined => t.header.get(name);

/** Per nutrient, the labels of the first (lowest) band of its built-in tables: a sample there is below optimum. */
function firstBandLabels(): Map<string, Set<string>> {
  const out = new Map<string, Set<string>>();
  for (const t of sufficiencyTables()) {
    const set = out.get(t.nutrient) ?? new Set<string>();
    set.add(t.labels[0] as string);
    out.set(t.nutrient, set);
  }
  return out;
}

async function readOutputs(outputs: readonly { file: string; output: string }[]) {
  const labs: LabSamples[] = [];
  const lime: FarmLime[] = [];
  const below = new Map<string, Map<string, string[] | null>>();
  const counts = new Map<string, { banded: number; below: number }>();
  const firstBands = firstBandLabels();
  const legume: LegumeFarm[] = [];
  const legumeNegative: string[] = [];
  let legumeChecks: LegumeChecks | null = null;
  for (const { file, output } of outputs) {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(output);
    for (const ws of wb.worksheets) {
      const lab = table(ws, H.sampleId);
      if (lab && column(lab, H.farm) && column(lab, H.limeCaco3)) {
        // Merged cells repeat their value: the group starts at the first column that shows it.
        let firstSoil = column(lab, H.limeCaco3) as number;
        if (lab.headerRow > 1) {
          ws.getRow(lab.headerRow - 1).eachCell((cell, c) => {
            if (asText(plain(cell.value)) === LAYOUT.SOIL_GROUP) firstSoil = Math.min(firstSoil, c);
          });
        }
        const soilCols = [...lab.header.values()].filter((c) => c >= firstSoil);
        let interpreted = 0;
        const reported = LAYOUT.ANALYTES.map((a) => ({
          key: a.key,
          band: column(lab, a.band),
          unbanded: (a.unbanded as readonly string[]).some((h) => column(lab, h) !== undefined),
        })).filter((a) => a.band !== undefined || a.unbanded);
        for (const row of lab.rows) {
          if (soilCols.some((c) => row[c] !== null && row[c] !== "")) interpreted++;
          const farm = asText(row[column(lab, H.farm) as number]);
          const id = asText(row[1]);
          const entry = below.get(farm) ?? new Map<string, string[] | null>();
          below.set(farm, entry);
          for (const a of reported) {
            if (a.band === undefined) {
              entry.set(a.key, null);
              continue;
            }
            const ids = entry.get(a.key) ?? [];
            entry.set(a.key, ids);
            const band = asText(row[a.band]);
            if (!band) continue;
            const c = counts.get(a.key) ?? { banded: 0, below: 0 };
            counts.set(a.key, c);
            c.banded++;
            if (firstBands.get(a.key)?.has(band)) {
              ids.push(id);
              c.below++;
            }
          }
        }
        labs.push({ workbook: path.basename(file), sheet: ws.name, samples: lab.rows.length, interpreted });
      }
      if (ws.name === LAYOUT.SHEETS.farms) {
        const t = table(ws, H.farm);
        if (!t) continue;
        for (const row of t.rows) {
          const farm = asText(row[1]);
          if (!column(t, H.lab) || !asText(row[column(t, H.lab) as number])) continue; // the totals row
          lime.push({
            farm,
            lab: asText(row[column(t, H.lab) as number]),
            samples: asNumber(row[column(t, H.samples) as number]) ?? 0,
            paddocksNeedingLime: asNumber(row[column(t, H.needLime) as number]) ?? 0,
            product: asText(row[column(t, H.product) as number]),
            tonnes: asNumber(row[column(t, H.limeTonnes) as number]) ?? 0,
          });
        }
      }
      if (ws.name === LAYOUT.SHEETS.legumeTotals) {
        const t = table(ws, H.farm);
        if (!t) continue;
        for (const row of t.rows) {
          const farm = asText(row[1]);
          if (/^all farms$/i.test(farm)) continue;
          legume.push({
            farm,
            paddocks: asNumber(row[column(t, H.legumePaddocks) as number]) ?? 0,
            nFixedKg: asNumber(row[column(t, H.nFixedTotal) as number]) ?? 0,
            nCreditKg: asNumber(row[column(t, H.nCreditTotal) as number]) ?? 0,
          });
        }
      }
      if (ws.name === LAYOUT.SHEETS.nodulation) legumeChecks = readLegumeChecks(ws) ?? legumeChecks;
      if (ws.name === LAYOUT.SHEETS.legume) {
        const t = table(ws, H.sampleId);
        const bal = t && column(t, H.nBalance);
        if (!t || !bal) continue;
        for (const row of t.rows) {
          const v = asNumber(row[bal]);
          if (v !== null && v < 0) legumeNegative.push(asText(row[1]));
        }
      }
    }
  }
  const order = LAYOUT.ANALYTES.map((a) => a.key as string);
  const belowOptimum = [...below.entries()].map(([farm, e]) => ({
    farm,
    analytes: order.filter((k) => e.has(k)).map((k) => ({ analyte: k, ids: e.get(k) ?? null })),
  }));
  const bands = order.filter((k) => counts.has(k)).map((k) => ({ analyte: k, ...counts.get(k)! }));
  return { labs, lime, belowOptimum, bands, legume, legumeNegative, legumeChecks };
}

/** Paddocks with a soil constraint (count > 0) and with a Poor or None nodulation rating. */
function readLegumeChecks(ws: ExcelJS.Worksheet): LegumeChecks | undefined {
  const t = table(ws, H.sampleId);
  const rating = t && column(t, H.nodRating);
  const count = t && column(t, H.soilConstraints);
  if (!t || !rating || !count) return undefined;
  const constrained: string[] = [];
  const poorNodulation: string[] = [];
  let paddocks = 0;
  for (const row of t.rows) {
    const id = asText(row[1]);
    const r = asText(row[rating]);
    const n = asNumber(row[count]);
    if (r || n !== null) paddocks++;
    if (n !== null && n > 0) constrained.push(id);
    if (/^(Poor|None):/.test(r)) poorNodulation.push(id);
  }
  return { paddocks, constrained, poorNodulation };
}

function groupReasons(errors: readonly (CellProblem & { workbook: string })[]): ErrorReason[] {
  const byReason = new Map<string, ErrorReason & { cells: string[] }>();
  for (const e of errors) {
    const key = `${e.error} ${e.message}`;
    const r = byReason.get(key) ?? { error: e.error, message: e.message, cells: [] };
    r.cells.push(`${e.workbook}: ${e.sheet}!${e.cell}`);
    byReason.set(key, r);
  }
  return [...byReason.values()];
}

const fmt = (n: number, digits = 1) => n.toLocaleString("en-GB", { minimumFractionDigits: digits, maximumFractionDigits: digits });

function report(s: DemoSummary, say: (line: string) => void): void {
  say(`soilcell demo: ${s.workbooks.length} sample workbooks recalculated headless into ${path.relative(process.cwd(), s.outputDir) || s.outputDir}/`);
  for (const w of s.workbooks) {
    say(`  ${path.basename(w.file)}: ${w.formulaCells} formula cells (${w.soilFormulaCells} SOIL formulas, ${w.spilledCells} spilled cells), ${w.errors.length} in error, ${w.seconds.toFixed(1)} s`);
  }
  say("");
  say(`Samples interpreted: ${s.labs.reduce((a, l) => a + l.interpreted, 0)} of ${s.samples}`);
  for (const l of s.labs) say(`  ${l.sheet}: ${l.interpreted} of ${l.samples}`);
  if (s.lime.length) {
    say("");
    say("Lime needed per farm (product as received over the sampled paddocks):");
    for (const f of s.lime) {
      say(`  ${f.farm.padEnd(14)} ${fmt(f.tonnes).padStart(8)} t of ${f.product}, ${f.paddocksNeedingLime} of ${f.samples} paddocks`);
    }
    say(`  ${"all farms".padEnd(14)} ${fmt(s.lime.reduce((a, f) => a + f.tonnes, 0)).padStart(8)} t`);
  }
  if (s.belowOptimum.length) {
    say("");
    say("Paddocks below optimum (in the first band of their reference table):");
    const show = (ids: readonly string[] | null) =>
      ids === null ? "no reference table" : ids.length ? `${ids.length} (${ids.slice(0, 5).join(", ")}${ids.length > 5 ? ", …" : ""})` : "0";
    for (const b of s.belowOptimum) {
      say(`  ${b.farm.padEnd(14)} ${b.analytes.map((a) => `${a.analyte} ${show(a.ids)}`).join("; ")}`);
    }
  }
  if (s.bands.length) {
    say("");
    say(`Band results: ${s.bands.map((b) => `${b.analyte} ${b.banded} samples (${b.below} below optimum)`).join("; ")}`);
  }
  if (s.legume.length) {
    say("");
    say("Legume N budget:");
    for (const f of s.legume) say(`  ${f.farm.padEnd(14)} ${f.paddocks} paddocks, ${fmt(f.nFixedKg, 0)} kg N fixed, ${fmt(f.nCreditKg, 0)} kg N credit to the next crop`);
    if (s.legumeNegative.length) say(`  grain removed more N than was fixed in: ${s.legumeNegative.join(", ")}`);
  }
  if (s.legumeChecks) {
    const c = s.legumeChecks;
    const list = (ids: readonly string[]) => (ids.length ? ` (${ids.join(", ")})` : "");
    say("");
    say("Legume checks (root digs and soil screen; screening aids, the inoculant's label and local advice govern):");
    say(`  paddocks with a soil constraint on fixation: ${c.constrained.length} of ${c.paddocks}${list(c.constrained)}`);
    say(`  paddocks with poor or no nodulation: ${c.poorNodulation.length} of ${c.paddocks}${list(c.poorNodulation)}`);
  }
  say("");
  say(`Cells in error: ${s.errors.length}`);
  for (const r of s.reasons) {
    say(`  ${r.cells.length} × ${r.error} ${r.message}`);
    for (const c of r.cells.slice(0, 6)) say(`      ${c}`);
  }
  for (const r of s.reports) {
    const b = r.summary;
    const where = path.relative(process.cwd(), b.outDir) || b.outDir;
    say("");
    say(`Client reports from ${path.basename(r.template)}: ${b.reports} written into ${where}/ (${b.entries.some((e) => e.xlsx) ? "a values-only workbook" : ""}${b.pdf.written ? " and a PDF" : ""} each${b.groupPdfs.length ? `, one folder and one combined PDF per farm` : ""}), index in ${path.join(where, path.basename(b.index.csv))} and index.xlsx, ${b.seconds.total.toFixed(1)} s`);
    if (b.pdf.skipped) say(`  ${b.pdf.skipped}`);
    say(`  keys that matched nothing: ${b.notFound}; reports with cells in error: ${b.withErrors}`);
  }
  say("");
  say(s.inputsUntouched ? "Inputs untouched (same bytes as before the run)." : "WARNING: an input file changed during the run.");
  say(CAUTION);
}

/** Whether a workbook follows the report convention (names a Report_Key). */
async function isReportTemplate(file: string): Promise<boolean> {
  try {
    const pkg = await openPackage(fs.readFileSync(file));
    return pkg.definedNames.some((d) => d.name.toUpperCase() === REPORT_NAMES.key.toUpperCase());
  } catch {
    return false;
  }
}

/**
 * Recalculates every .xlsx in `inputDir` into `outputDir` (same file names), reads the results,
 * prints a short summary and returns it.
 */
export async function runDemo(options: DemoOptions = {}): Promise<DemoSummary> {
  const root = repoRoot();
  const inputDir = path.resolve(options.inputDir ?? path.join(root, "sample-workbooks"));
  const outputDir = path.resolve(options.outputDir ?? path.join(root, "demo-output"));
  if (inputDir === outputDir) throw new Error("the demo's output folder must differ from its input folder");
  const files = fs
    .readdirSync(inputDir)
    .filter((f) => f.toLowerCase().endsWith(".xlsx") && !f.startsWith("~$") && !f.startsWith("."))
    .sort()
    .map((f) => path.join(inputDir, f));
  if (!files.length) throw new Error(`no .xlsx files in ${inputDir}`);
  fs.mkdirSync(outputDir, { recursive: true });
  const before = new Map(files.map((f) => [f, digest(f)]));

  const workbooks: WorkbookResult[] = [];
  for (const file of files) {
    const output = path.join(outputDir, path.basename(file));
    const r: RecalcSummary = await recalcWorkbook(file, output);
    workbooks.push({ ...r, file, output });
  }
  const read = await readOutputs(workbooks);
  const reports: DemoReports[] = [];
  if (options.reports !== false) {
    const templates: string[] = [];
    for (const f of files) if (await isReportTemplate(f)) templates.push(f);
    for (const template of templates) {
      const dir = templates.length === 1 ? path.join(outputDir, "reports") : path.join(outputDir, "reports", path.basename(template, path.extname(template)));
      fs.rmSync(dir, { recursive: true, force: true }); // the demo's own folder: no report of an earlier run stays behind
      const summary = await runReportBatch(template, {
        outDir: dir,
        ...(options.reports?.limit !== undefined ? { limit: options.reports.limit } : {}),
        pdf: options.reports?.pdf !== false,
      });
      reports.push({ template, summary });
    }
  }
  const errors = workbooks.flatMap((w) => w.errors.map((e) => ({ ...e, workbook: path.basename(w.file) })));
  const summary: DemoSummary = {
    inputDir,
    outputDir,
    workbooks,
    labs: read.labs,
    samples: read.labs.reduce((a, l) => a + l.samples, 0),
    lime: read.lime,
    belowOptimum: read.belowOptimum,
    bands: read.bands,
    legume: read.legume,
    legumeNegative: read.legumeNegative,
    legumeChecks: read.legumeChecks,
    errors,
    reasons: groupReasons(errors),
    inputsUntouched: files.every((f) => digest(f) === before.get(f)),
    reports,
  };
  const say = options.print === undefined ? (line: string) => process.stdout.write(`${line}\n`) : options.print;
  if (say) report(summary, say);
  return summary;
}

if (require.main === module) {
  runDemo().then(
    (s) => {
      process.exitCode = s.inputsUntouched ? 0 : 1;
    },
    (e: unknown) => {
      process.stderr.write(`soilcell demo: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 2;
    },
  );
}
