/**
 * `soilcell report` on the sample template (sample-workbooks/caddow-2025-soil-tests.xlsx, invented
 * data): the demo season's 280 paddocks, each a values-only workbook and a PDF made by LibreOffice,
 * checked as a person would: the pages counted, the text of three reports read back from the PDF
 * (pdftotext) against the engine's own values for those samples, every page free of #NAME?,
 * #VALUE! and #REF!, one page rendered to PNG (pdftoppm) and its pixels looked at for the band
 * scales, the index's rows against the reports. Expected values are the engine's recalculation of
 * the same workbook (the SOIL results there are checked against their published sources in
 * tests/core and tests/cli/demo.test.ts); the colours are the Okabe–Ito palette (Okabe & Ito 2008,
 * "Color Universal Design", from memory).
 *
 * Needs Debian's libreoffice-calc and poppler-utils: skipped with a message when missing, a
 * failure when CI is set.
 */
import { execFileSync, spawnSync } from "child_process";
import fs from "fs";
import path from "path";
import ExcelJS from "exceljs";
import { recalcWorkbook } from "../../src/engine/recalc";
import { tempDir } from "../helpers/workbook";
import { readPng } from "../helpers/png";
import { parseCsv } from "../helpers/csv";
import { ROOT, describeHost, findProgram } from "../hosts/harness";

const BIN = path.join(ROOT, "bin/soilcell.js");
const SAMPLE = path.join(ROOT, "sample-workbooks", "caddow-2025-soil-tests.xlsx");
const soffice = findProgram("soffice", "libreoffice");
const poppler = ["pdfinfo", "pdftotext", "pdftoppm", "pdfseparate", "pdfunite", "pdffonts"].every((p) => findProgram(p));

type Row = Record<string, unknown>;
/** A cell's value as the file caches it: a formula's result (ExcelJS leaves an empty text result out). */
const plain = (v: ExcelJS.CellValue): unknown => (v && typeof v === "object" && !(v instanceof Date) && ("formula" in v || "sharedFormula" in v) ? ((v as { result?: unknown }).result ?? "") : v);

/** The engine's values for the samples of a lab sheet, by Sample ID, under the header row 2. */
async function labRows(file: string, sheet: string): Promise<Map<string, Row>> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(file);
  const ws = wb.getWorksheet(sheet)!;
  const head: string[] = [];
  ws.getRow(2).eachCell((c, i) => (head[i] = String(c.value)));
  const out = new Map<string, Row>();
  for (let r = 3; r <= ws.rowCount; r++) {
    const id = plain(ws.getCell(r, 1).value);
    if (!id) break;
    const o: Row = {};
    head.forEach((h, i) => (o[h] = plain(ws.getCell(r, i).value)));
    out.set(String(id), o);
  }
  return out;
}

/** A PDF's text in reading order (a wrapped cell's lines stay together). */
const text = (file: string) => execFileSync("pdftotext", [file, "-"], { encoding: "utf8" });
const pages = (file: string) => Number(/^Pages:\s+(\d+)/m.exec(execFileSync("pdfinfo", [file], { encoding: "utf8" }))![1]);
const ERRORS = /#NAME\?|#VALUE!|#REF!|#N\/A|#DIV\/0!|#NUM!/;

describeHost("soilcell report: the demo season's 280 client reports through LibreOffice", soffice && poppler ? soffice : undefined, "libreoffice and poppler-utils", () => {
  let out: string;
  let summary: {
    reports: number;
    notFound: number;
    withErrors: number;
    pdf: { written: number; mode: string };
    groupPdfs: string[];
    entries: { key: string; status: string; group?: string; name?: string; xlsx?: string; pdf?: string; pages?: number; figures: { label: string; value: unknown }[] }[];
  };
  let status: number | null;
  let labA: Map<string, Row>;
  let labB: Map<string, Row>;

  beforeAll(async () => {
    out = path.join(tempDir("soilcell-report-"), "reports");
    const r = spawnSync(process.execPath, [BIN, "report", SAMPLE, "-o", out, "--json"], { encoding: "utf8", maxBuffer: 256 * 1024 * 1024, timeout: 900_000 });
    status = r.status;
    if (!r.stdout.trim().startsWith("{")) throw new Error(`soilcell report failed (${r.status}): ${r.stderr}`);
    summary = JSON.parse(r.stdout);
    const recalc = path.join(path.dirname(out), "season.recalc.xlsx");
    await recalcWorkbook(SAMPLE, recalc);
    labA = await labRows(recalc, "Lab A Brindlewick");
    labB = await labRows(recalc, "Lab B Quillon Downs");
  }, 900_000);

  it("writes a workbook and a one-page PDF for each of the 280 samples, in one folder per farm, and exits 0", () => {
    expect(status).toBe(0);
    expect(summary.reports).toBe(280);
    expect(summary.notFound).toBe(0);
    expect(summary.withErrors).toBe(0);
    expect(summary.pdf).toMatchObject({ written: 280, mode: "combined" });
    for (const e of summary.entries) {
      expect({ key: e.key, status: e.status, pages: e.pages }).toEqual({ key: e.key, status: "ok", pages: 1 });
      expect(fs.existsSync(path.join(out, e.xlsx!))).toBe(true);
      expect(fs.existsSync(path.join(out, e.pdf!))).toBe(true);
      expect(path.dirname(e.pdf!)).toBe(e.group);
    }
    expect(new Set(summary.entries.map((e) => e.group))).toEqual(new Set(["Wrenhollow", "Pellowmere", "Quondle Hill", "Brackenstow", "Ambergully", "Tarnaby Flats", "Mistlecombe"]));
  });

  it("counts the pages as pdfinfo reads them: one per report, each A4, and the farm PDFs hold every page", () => {
    let total = 0;
    for (const g of summary.groupPdfs) total += pages(path.join(out, g));
    expect(total).toBe(280);
    for (const e of summary.entries.slice(0, 12)) {
      const info = execFileSync("pdfinfo", [path.join(out, e.pdf!)], { encoding: "utf8" });
      expect(info).toMatch(/^Pages:\s+1$/m);
      expect(info).toMatch(/^Page size:\s+595\.\d+ x 841\.\d+ pts \(A4\)/m);
    }
  });

  it("embeds every font it uses", () => {
    const fonts = execFileSync("pdffonts", [path.join(out, summary.entries[0]!.pdf!)], { encoding: "utf8" }).trim().split("\n").slice(2);
    expect(fonts.length).toBeGreaterThan(0);
    // columns: name type encoding emb sub uni object ID
    for (const line of fonts) expect({ line, embedded: line.trim().split(/\s+/).slice(-5)[0] }).toEqual({ line, embedded: "yes" });
  });

  it("shows the engine's values and the sample's names in the text of three reports (Lab A Mehlich-3, Lab A Bray-1, Lab B)", () => {
    // Samples with every figure checked here reported (the labs' exports have gaps and numbers typed as text).
    const numeric = (r: Row, fields: string[]) => fields.every((f) => typeof r[f] === "number");
    const common = ["Lime as CaCO3 (t/ha)", "Lime product (t/ha)", "Lime to spread (t)"];
    const pick = (pred: (id: string, r: Row) => boolean, rows: Map<string, Row>) => [...rows].find(([id, r]) => pred(id, r))!;
    const cases = [
      { lab: "A", row: pick((id, r) => id.startsWith("WRN") && numeric(r, [...common, "P Mehlich-3 (ppm)", "CEC, sum of bases (cmol(+)/kg)"]) && (r["Lime as CaCO3 (t/ha)"] as number) > 0, labA) },
      { lab: "A", row: pick((id, r) => id.startsWith("PLM") && numeric(r, [...common, "P Bray-1 (ppm)", "CEC, sum of bases (cmol(+)/kg)"]), labA) },
      { lab: "B", row: pick((id, r) => id.startsWith("MSC") && numeric(r, [...common, "Zn DTPA (mg/kg)", "Colwell P (mg/kg)", "ECEC (cmol(+)/kg)"]) && (r["Lime as CaCO3 (t/ha)"] as number) > 0, labB) },
    ];
    for (const { lab, row } of cases) {
      const [id, r] = row;
      const entry = summary.entries.find((e) => e.key === id)!;
      const page = text(path.join(out, entry.pdf!));
      const num = (n: unknown, digits: number) => ({ n: n as number, digits });
      const want: (string | { n: number; digits: number })[] = [
        id,
        String(r.Farm),
        String(r.Paddock),
        lab === "A" ? "Brindlewick Soil Laboratory" : "Quillon Downs Analytical",
        String(r["P band"]),
        num(r["Lime as CaCO3 (t/ha)"], 2),
        num(r["Lime product (t/ha)"], 2),
        num(r["Lime to spread (t)"], 1),
        lab === "A" ? num(r["CEC, sum of bases (cmol(+)/kg)"], 1) : num(r["ECEC (cmol(+)/kg)"], 1),
        lab === "A" ? num(r["P Mehlich-3 (ppm)"] ?? r["P Bray-1 (ppm)"], 0) : num(r["Colwell P (mg/kg)"], 0),
        ...(lab === "B" ? [num(r["Zn DTPA (mg/kg)"], 2), String(r["Zn band"])] : [String(r["K band"])]),
        "Methods and sources",
        "Results are estimates: check them against local calibrations, regulations and licensed advice.",
      ];
      const flat = page.replace(/\s+/g, " ");
      for (const w of want) {
        // A number is shown rounded to its format's digits: either rounding of a value on a half is accepted.
        const forms = typeof w === "string" ? [w] : [w.n.toFixed(w.digits), (w.n + 1e-9).toFixed(w.digits), (w.n - 1e-9).toFixed(w.digits)];
        expect({ id, shows: forms[0], found: forms.some((f) => flat.includes(f.replace(/\s+/g, " "))) }).toEqual({ id, shows: forms[0], found: true });
      }
      expect(flat).toMatch(/Computed by soilcell \d+\.\d+\.\d+/);
      expect(flat).toMatch(/Clemson University Agricultural Service Laboratory/); // SOIL.ABOUT's source text, computed
      expect(page).not.toMatch(ERRORS);
    }
  });

  it("no page shows #NAME?, #VALUE! or #REF! (the season's data hold no error a report shows)", () => {
    let checked = 0;
    for (const g of summary.groupPdfs) {
      const all = text(path.join(out, g)).split("\f").filter((p) => p.trim());
      for (const p of all) {
        checked++;
        expect({ group: g, page: checked, error: ERRORS.exec(p)?.[0] ?? null }).toEqual({ group: g, page: checked, error: null });
        expect(p).toContain("Results are estimates");
        expect(p).toContain("Methods and sources");
      }
    }
    expect(checked).toBe(280);
  });

  it("renders a page whose pixels show the band scales and the exchange-complex strip in the Okabe–Ito colours, distinct in greyscale", () => {
    const e = summary.entries.find((x) => x.key.startsWith("AMB"))!;
    const base = path.join(path.dirname(out), "page");
    execFileSync("pdftoppm", ["-png", "-r", "60", "-singlefile", path.join(out, e.pdf!), base]);
    const img = readPng(`${base}.png`);
    const okabeIto = { vermillion: "213,94,0", yellow: "240,228,66", sky: "86,180,233", blue: "0,114,178", orange: "230,159,0" };
    const rgbAt = (im: typeof img, i: number) => `${im.data[i * 3]},${im.data[i * 3 + 1]},${im.data[i * 3 + 2]}`;
    const count = new Map<string, number>();
    let bandRows = 0;
    let complexRows = 0;
    for (let y = 0; y < img.height; y++) {
      const inRow = new Map<string, number>();
      for (let x = 0; x < img.width; x++) {
        const rgb = rgbAt(img, y * img.width + x);
        inRow.set(rgb, (inRow.get(rgb) ?? 0) + 1);
        count.set(rgb, (count.get(rgb) ?? 0) + 1);
      }
      const n = (c: string) => inRow.get(c) ?? 0;
      // A band scale: the three bands of a two-limit table side by side in one line of pixels.
      if (n(okabeIto.vermillion) >= 3 && n(okabeIto.yellow) >= 6 && n(okabeIto.sky) >= 3) bandRows++;
      // The exchange complex: calcium's long blue run beside magnesium's sky blue.
      if (n(okabeIto.blue) >= 30 && n(okabeIto.sky) >= 5) complexRows++;
    }
    for (const [name, rgb] of Object.entries(okabeIto)) expect({ name, pixels: (count.get(rgb) ?? 0) > 20 }).toEqual({ name, pixels: true });
    expect(bandRows).toBeGreaterThanOrEqual(8); // four strips (P, S, Zn, Cu), a few pixel lines each
    expect(complexRows).toBeGreaterThanOrEqual(8); // five table rows tall
    // Rendered in greyscale, neighbouring band colours stay apart (vermillion | yellow | sky | blue).
    execFileSync("pdftoppm", ["-png", "-gray", "-r", "60", "-singlefile", path.join(out, e.pdf!), `${base}-grey`]);
    const grey = readPng(`${base}-grey.png`);
    const greyOf = (rgb: string) => {
      // pdftoppm -gray -png writes grey as RGB with three equal samples.
      for (let i = 0; i < img.width * img.height; i++) if (rgbAt(img, i) === rgb) return grey.data[i * grey.channels] as number;
      return -1;
    };
    const levels = [okabeIto.vermillion, okabeIto.yellow, okabeIto.sky, okabeIto.blue].map(greyOf);
    expect(levels.every((l) => l >= 0)).toBe(true);
    for (let i = 1; i < levels.length; i++) expect(Math.abs((levels[i] as number) - (levels[i - 1] as number))).toBeGreaterThanOrEqual(25);
  });

  it("lists every report in index.csv and index.xlsx with its headline figures, equal to the engine's values", async () => {
    const rows = parseCsv(fs.readFileSync(path.join(out, "index.csv"), "utf8")).filter((r) => r.length > 1);
    const head = rows[0]!;
    expect(head.slice(0, 7)).toEqual(["Key", "Status", "Group", "Name", "Workbook", "PDF", "Pages"]);
    expect(head).toEqual(expect.arrayContaining(["Farm", "Paddock", "P band", "Lime as CaCO3 (t/ha)", "Product for the paddock (t)", "Cells in error", "Key from"]));
    expect(rows.length - 1).toBe(280);
    const col = (name: string) => head.indexOf(name);
    for (const r of rows.slice(1)) {
      const id = r[0]!;
      const lab = labA.get(id) ?? labB.get(id)!;
      expect({ id, status: r[col("Status")], farm: r[col("Farm")], paddock: r[col("Paddock")], pBand: r[col("P band")], pages: r[col("Pages")] }).toEqual({
        id,
        status: "ok",
        farm: lab.Farm,
        paddock: lab.Paddock,
        pBand: lab["P band"] ?? "",
        pages: "1",
      });
      const lime = lab["Lime as CaCO3 (t/ha)"];
      if (typeof lime === "number") expect(Number(r[col("Lime as CaCO3 (t/ha)")])).toBeCloseTo(lime, 12);
      expect(r[col("Name")]).toBe(`${id} ${lab.Paddock}`);
      expect(r[col("PDF")]).toBe(path.join(String(lab.Farm), `${id} ${lab.Paddock}.pdf`));
    }
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(path.join(out, "index.xlsx"));
    const ws = wb.getWorksheet("Reports")!;
    expect(ws.rowCount).toBe(281);
    expect(ws.getRow(1).values).toEqual([undefined, ...head]);
    expect(ws.getCell(2, 1).value).toBe(rows[1]![0]);
    expect(wb.getWorksheet("Problems")!.rowCount).toBe(1);
    expect(String(wb.getWorksheet("About")!.getCell("A4").value)).toContain("Results are estimates");
  });

  it("each report workbook holds values only: one sheet, no formula, no other sheet's data", async () => {
    const e = summary.entries.find((x) => x.key.startsWith("TNF"))!;
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(path.join(out, e.xlsx!));
    expect(wb.worksheets.map((w) => w.name)).toEqual(["Client report"]);
    let formulas = 0;
    wb.worksheets[0]!.eachRow((row) => row.eachCell((c) => (formulas += c.type === ExcelJS.ValueType.Formula ? 1 : 0)));
    expect(formulas).toBe(0);
    expect(wb.worksheets[0]!.getCell("C4").value).toBe(e.key);
    const lab = labB.get(e.key)!;
    expect(wb.worksheets[0]!.getCell("C6").value).toBe(lab.Farm);
  });
});

describeHost("the bench's reports part", soffice && poppler ? soffice : undefined, "libreoffice and poppler-utils", () => {
  it("runs in a child process and prints its figures: reports per second and the ratio to the per-page script (a trial of 2 keys; no target)", () => {
    const r = spawnSync(process.execPath, [path.join(ROOT, "bench/run.js"), "--only=reports", "--jobs=1", "--report-limit=2"], { encoding: "utf8", timeout: 300_000 });
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^Client reports \(soilcell report on the sample template/m);
    expect(r.stdout).toMatch(/reports\/s {2}× script/);
    expect(r.stdout).toMatch(/^ {2}1 +2 +2 +2 +\d+\.\d+ s/m); // 1 run, 2 reports, 2 PDFs, 2 pages, seconds
    expect(r.stdout).toMatch(/a trial on the first 2 keys: no target/);
    expect(r.stdout).not.toMatch(/280 reports, workbook \+ PDF/);
  });
});

describe("soilcell report without LibreOffice", () => {
  it("says so in one line, still writes the workbooks and exits 1", () => {
    const out = path.join(tempDir("soilcell-report-nolo-"), "r");
    const r = spawnSync(process.execPath, [BIN, "report", SAMPLE, "-o", out, "--limit", "2"], { encoding: "utf8", env: { ...process.env, SOILCELL_SOFFICE: "/nonexistent/soffice" } });
    expect(r.status).toBe(1);
    expect(r.stdout).toMatch(/^ {2}PDF: LibreOffice is not installed \(Debian: apt-get install libreoffice-calc\), so no PDF was written; the workbooks are\.$/m);
    expect(fs.readdirSync(path.join(out, "Wrenhollow")).sort()).toEqual(["WRN-01 Creek.xlsx", "WRN-02 Top Flat.xlsx"]);
  });

  it("--format xlsx needs no LibreOffice and exits 0", () => {
    const out = path.join(tempDir("soilcell-report-xlsx-"), "r");
    const r = spawnSync(process.execPath, [BIN, "report", SAMPLE, "-o", out, "--limit", "1", "--format", "xlsx"], { encoding: "utf8", env: { ...process.env, SOILCELL_SOFFICE: "/nonexistent/soffice" } });
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^wrote 1 report \(a workbook each\)/m);
  });
});

describe("soilcell report: usage", () => {
  const run = (...args: string[]) => spawnSync(process.execPath, [BIN, "report", ...args], { encoding: "utf8" });
  it("refuses unknown options and bad values with exit 2", () => {
    expect(run(SAMPLE, "--bogus").status).toBe(2);
    expect(run(SAMPLE, "--format", "docx").stderr).toMatch(/--format takes xlsx, pdf or both/);
    expect(run(SAMPLE, "--jobs", "0").status).toBe(2);
    expect(run().status).toBe(2);
  });
  it("a workbook without Report_Key is refused with what to do (exit 2)", () => {
    const r = run(path.join(ROOT, "sample-workbooks", "caddow-2025-legume-n-budget.xlsx"), "-o", tempDir());
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/no Report_Key name: name the cell where a key is typed Report_Key/);
  });
  it("--help describes the convention's names", () => {
    const r = run("--help");
    expect(r.status).toBe(0);
    for (const n of ["Report_Key", "Report_Keys", "Report_Found", "Report_File", "Report_Group", "Report_Figures"]) expect(r.stdout).toContain(n);
  });
});
