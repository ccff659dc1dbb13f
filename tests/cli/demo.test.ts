/**
 * The demo (`npm run demo`): recalculates the committed sample workbooks and summarises them.
 * The sample data are invented (scripts/samples, fixed seed). Expected figures are computed here
 * independently, from the lab values in the input files and the core functions, not read back
 * from the engine: lime by the SIKORA-OR2025 table (Source: Moore 2025, OSU Extension EM 9585,
 * Table 1) and the Al-saturation method (Source: Cochrane, Salinas & Sánchez 1980), products by
 * CCE, fineness and moisture (Source: Penn State AASL notes; BC Soil Factsheet 637.200-2), bands
 * by the Colwell P critical ranges (Source: GRDC Update 2020, southern NSW), KCl-40 S (Source: Anderson,
 * Peverill & Brennan 2013, abstract) and DTPA micronutrients (Source: Havlin et al. 1999, secondary), legume N by the
 * shoot-based and per-tonne rules (Source: Peoples et al. 2012; Walley et al. 2007 as reported
 * in doi:10.1007/s13593-015-0297-y; Khan et al. 2002, Plant and Soil, for faba bean and
 * chickpea), root digs by the University of Adelaide grower guide's scale and the soil screen by
 * its published levels (Sources in src/data/nitrogen/legume-checks.json).
 */
import crypto from "crypto";
import fs from "fs";
import path from "path";
import ExcelJS from "exceljs";
import { DemoSummary, LAYOUT, repoRoot, runDemo } from "../../src/cli/demo";
import { limeBuffer } from "../../src/core/lime/buffer";
import { limeAlSat } from "../../src/core/lime/methods";
import { limeFineness, limeProductRate } from "../../src/core/lime/product";
import { bandPosition } from "../../src/core/bands/bands";
import { sufficiencyBand, sufficiencyTableId, sufficiencyTables } from "../../src/core/bands/sufficiency";
import { nfixFixedN, nfixPerTonne, nfixShootDm } from "../../src/core/nitrogen/nitrogen";
import { nfixNdfa } from "../../src/core/nitrogen/isotope";
import { nfixNodulationRating } from "../../src/core/nitrogen/nodulation";
import { nfixSoilCount } from "../../src/core/nitrogen/fixation-soil";
import { labValue } from "../../src/core/lab-value";
import { convertUnit } from "../../src/core/units";
import { tempDir } from "../helpers/workbook";

const SAMPLES = path.join(repoRoot(), "sample-workbooks");
const SEASON = path.join(SAMPLES, "caddow-2025-soil-tests.xlsx");
const LEGUME = path.join(SAMPLES, "caddow-2025-legume-n-budget.xlsx");
const H = LAYOUT.HEADERS;

type Row = Record<string, unknown>;

/** The rows of a sheet under its header row (the row whose column A is `first`), raw input values. */
async function rowsOf(file: string, sheet: string, first: string): Promise<Row[]> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(file);
  const ws = wb.getWorksheet(sheet)!;
  let head = 0;
  for (let r = 1; r <= 10 && !head; r++) if (ws.getCell(r, 1).value === first) head = r;
  const names: string[] = [];
  ws.getRow(head).eachCell((c, i) => (names[i] = String(c.value)));
  const out: Row[] = [];
  for (let r = head + 1; r <= ws.rowCount; r++) {
    const row = ws.getRow(r);
    if (row.getCell(1).value === null || row.getCell(1).value === undefined) break;
    const o: Row = {};
    names.forEach((n, i) => (o[n] = row.getCell(i).value));
    out.push(o);
  }
  return out;
}

/** A lab value as a number: numbers, numeric text; blank → undefined. */
const num = (v: unknown): number | undefined => {
  if (v === null || v === undefined || v === "") return undefined;
  const n = typeof v === "number" ? v : Number(String(v).trim());
  if (!Number.isFinite(n)) throw new Error(`not a number: ${String(v)}`);
  return n;
};

const digest = (f: string) => crypto.createHash("sha256").update(fs.readFileSync(f)).digest("hex");

describe("npm run demo (invented sample workbooks)", () => {
  let summary: DemoSummary;
  let printed: string[];
  let out: string;
  let before: Map<string, string>;
  let products: Map<string, { cce: number; moisture: number; fineness: number }>;
  let settings: { targetPh: number; targetAlSat: number; depthB: number };

  beforeAll(async () => {
    out = path.join(tempDir(), "demo-output");
    before = new Map(fs.readdirSync(SAMPLES).map((f) => [f, digest(path.join(SAMPLES, f))]));
    printed = [];
    // Three client reports, workbooks only: the whole season's reports and PDFs are tests/cli/report.test.ts.
    summary = await runDemo({ inputDir: SAMPLES, outputDir: out, print: (l) => printed.push(l), reports: { limit: 3, pdf: false } });

    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(SEASON);
    const p = wb.getWorksheet("Lime products")!;
    products = new Map();
    for (let r = 4; r <= 6; r++) {
      const fractions = [4, 5, 6, 7].map((c) => p.getCell(r, c).value as number);
      products.set(String(p.getCell(r, 1).value), {
        cce: p.getCell(r, 2).value as number,
        moisture: p.getCell(r, 3).value as number,
        fineness: limeFineness(fractions),
      });
    }
    const s = wb.getWorksheet("Settings")!;
    settings = { targetPh: s.getCell("C4").value as number, targetAlSat: s.getCell("C5").value as number, depthB: s.getCell("C6").value as number };
  });

  it("writes the season template's client reports into reports/ and says how many and where", () => {
    expect(summary.reports).toHaveLength(1);
    const r = summary.reports[0]!;
    expect(path.basename(r.template)).toBe("caddow-2025-soil-tests.xlsx");
    expect(r.summary.outDir).toBe(path.join(out, "reports"));
    expect(r.summary.reports).toBe(3);
    expect(fs.existsSync(r.summary.index.csv)).toBe(true);
    const line = printed.find((l) => l.startsWith("Client reports from caddow-2025-soil-tests.xlsx"));
    expect(line).toMatch(/: 3 written into .*reports\//);
  });

  it("recalculates every sample workbook into the output folder and leaves the inputs untouched", async () => {
    expect(summary.workbooks.map((w) => path.basename(w.file))).toEqual(["caddow-2025-legume-n-budget.xlsx", "caddow-2025-soil-tests.xlsx"]);
    for (const w of summary.workbooks) {
      expect(path.dirname(w.output)).toBe(out);
      const check = new ExcelJS.Workbook();
      await check.xlsx.readFile(w.output); // opens
      expect(w.kept).toEqual([]);
    }
    expect(summary.inputsUntouched).toBe(true);
    for (const [f, d] of before) expect(digest(path.join(SAMPLES, f))).toBe(d);
  });

  it("counts the samples of each lab", () => {
    expect(summary.labs.map((l) => [l.sheet, l.samples, l.interpreted])).toEqual([
      ["Lab A Brindlewick", 150, 150],
      ["Lab B Quillon Downs", 130, 130],
    ]);
    expect(summary.samples).toBe(280);
    expect(printed).toContain("Samples interpreted: 280 of 280");
  });

  it("lime for a Lab A farm equals the SIKORA-OR2025 table and the product's CCE, fineness and moisture, computed from core", async () => {
    const rows = (await rowsOf(SEASON, "Lab A Brindlewick", H.sampleId)).filter((r) => r[H.farm] === "Pellowmere");
    let tonnes = 0;
    let paddocks = 0;
    for (const r of rows) {
      const buffer = num(r["Buffer pH (Sikora)"]);
      if (buffer === undefined) continue; // the lab runs the buffer only below pH 6.7: no rate
      const caco3 = limeBuffer(buffer, settings.targetPh, { calibration: "SIKORA-OR2025", soilPh: num(r["pH (1:1 water)"]), unit: "t/ha" });
      const p = products.get(String(r[H.product]))!;
      const t = limeProductRate(caco3, p.cce, p.fineness, p.moisture) * num(r[H.area])!;
      tonnes += t;
      if (t > 0) paddocks++;
    }
    const farm = summary.lime.find((f) => f.farm === "Pellowmere")!;
    expect(farm.tonnes).toBeCloseTo(tonnes, 6);
    expect(farm.paddocksNeedingLime).toBe(paddocks);
    expect(farm.samples).toBe(rows.length);
    expect(tonnes).toBeGreaterThan(0);
  });

  it("lime for a Lab B farm equals the Al-saturation method over the sampled layer, computed from core", async () => {
    const rows = (await rowsOf(SEASON, "Lab B Quillon Downs", H.sampleId)).filter((r) => r[H.farm] === "Mistlecombe");
    let tonnes = 0;
    for (const r of rows) {
      const caco3 = limeAlSat(num(r["Exch. Al (cmol(+)/kg)"])!, num(r["Exch. Ca (cmol(+)/kg)"])!, num(r["Exch. Mg (cmol(+)/kg)"])!, {
        targetAlSat: settings.targetAlSat,
        depthCm: settings.depthB,
        bulkDensity: num(r["Bulk density (g/cm3)"]),
      });
      const p = products.get(String(r[H.product]))!;
      tonnes += limeProductRate(caco3, p.cce, p.fineness, p.moisture) * num(r[H.area])!;
    }
    expect(summary.lime.find((f) => f.farm === "Mistlecombe")!.tonnes).toBeCloseTo(tonnes, 6);
  });

  it("paddocks with Colwell P below the critical range match the core band tables", async () => {
    const rows = (await rowsOf(SEASON, "Lab B Quillon Downs", H.sampleId)).filter((r) => r[H.farm] === "Tarnaby Flats");
    const tables = sufficiencyTables();
    const below = rows
      .filter((r) => {
        const p = num(r["Colwell P (mg/kg)"]);
        if (p === undefined) return false;
        const id = sufficiencyTableId("P", String(r[H.crop]), "Colwell");
        return bandPosition(p, tables.find((t) => t.id === id)!.limits) < 0;
      })
      .map((r) => String(r[H.sampleId]));
    const farm = summary.belowOptimum.find((b) => b.farm === "Tarnaby Flats")!;
    const of = (k: string) => farm.analytes.find((a) => a.analyte === k);
    expect(of("P")!.ids).toEqual(below);
    expect(below.length).toBeGreaterThan(0);
    expect(of("K")!.ids).toBeNull(); // no Colwell K table: not assessed, not "0 below"
  });

  it("Quondle Hill's Mehlich-3 P is read for its corn-soybean-wheat rotation (critical level 30 ppm), from core", async () => {
    // Source: Culman et al. (2020) Tri-State Bull. 974 via OSU Ag BMPs (seen): 30 ppm when wheat is in the rotation.
    const rows = (await rowsOf(SEASON, "Lab A Brindlewick", H.sampleId)).filter((r) => r[H.farm] === "Quondle Hill");
    expect(new Set(rows.map((r) => r[H.rotation]))).toEqual(new Set(["corn-soybean-wheat"]));
    const deficient = rows
      .filter((r) => num(r["P Mehlich-3 (ppm)"]) !== undefined && sufficiencyBand("P", num(r["P Mehlich-3 (ppm)"])!, String(r[H.rotation]), "Mehlich-3") === "Deficient")
      .map((r) => String(r[H.sampleId]));
    const farm = summary.belowOptimum.find((b) => b.farm === "Quondle Hill")!;
    expect(farm.analytes.find((a) => a.analyte === "P")!.ids).toEqual(deficient);
    expect(rows.some((r) => { const p = num(r["P Mehlich-3 (ppm)"]); return p !== undefined && p >= 20 && p < 30; })).toBe(true); // deficient only because of the wheat
  });

  it("Lab B's KCl-40 S and DTPA Zn, Cu, Mn below optimum match the core tables, row by row", async () => {
    const rows = (await rowsOf(SEASON, "Lab B Quillon Downs", H.sampleId)).filter((r) => r[H.farm] === "Ambergully");
    const first = (id: string) => sufficiencyTables().find((t) => t.id === id)!.labels[0];
    const lowIds = (key: string, band: (v: number, crop: string) => string, firstLabel: (crop: string) => string) =>
      rows
        .filter((r) => {
          const v = num(r[key]);
          return v !== undefined && band(v, String(r[H.crop])) === firstLabel(String(r[H.crop]));
        })
        .map((r) => String(r[H.sampleId]));
    const farm = summary.belowOptimum.find((b) => b.farm === "Ambergully")!;
    const of = (k: string) => farm.analytes.find((a) => a.analyte === k)!.ids;
    // 0-30 cm cores; the wheat table is named (read only when named: its sources disagree).
    const sBand = (v: number, crop: string) => sufficiencyBand("S", v, crop, "KCl-40", undefined, crop === "wheat" ? "anderson2013-kcl40-s-wheat" : undefined, undefined, 30);
    const s = lowIds("S KCl-40, 0-30 cm (mg/kg)", sBand, (crop) => first(`anderson2013-kcl40-s-${crop}`));
    expect(of("S")).toEqual(s);
    expect(s.length).toBeGreaterThan(0);
    for (const [n, id] of [["Zn", "havlin1999-dtpa-zn"], ["Cu", "havlin1999-dtpa-cu"], ["Mn", "havlin1999-dtpa-mn"]] as const) {
      expect(of(n)).toEqual(lowIds(`${n} DTPA (mg/kg)`, (v) => sufficiencyBand(n, v, undefined, "DTPA"), () => first(id)));
    }
  });

  it("shows no 'no reference table' for an analyte a table covers, and counts the new analytes", () => {
    // Only Colwell K (no readable source) and Lab A's sulfate-S (its extraction is not named) lack a table.
    const LAB_A = ["Wrenhollow", "Pellowmere", "Quondle Hill", "Brackenstow"];
    for (const b of summary.belowOptimum) {
      const none = b.analytes.filter((a) => a.ids === null).map((a) => a.analyte);
      expect(none).toEqual(LAB_A.includes(b.farm) ? ["S"] : ["K"]);
    }
    const labB = summary.belowOptimum.filter((b) => ["Ambergully", "Tarnaby Flats", "Mistlecombe"].includes(b.farm));
    for (const b of labB) {
      expect(b.analytes.map((a) => a.analyte)).toEqual(["P", "K", "S", "Zn", "Cu", "Mn"]);
      expect(b.analytes.filter((a) => a.ids === null).map((a) => a.analyte)).toEqual(["K"]);
    }
    expect(summary.bands.map((b) => b.analyte)).toEqual(["P", "K", "S", "Zn", "Cu", "Mn"]);
    expect(summary.bands.find((b) => b.analyte === "S")!.banded).toBeGreaterThan(120);
    expect(printed.some((l) => /^Band results: .*S \d+ samples .*Zn \d+ samples .*Cu \d+ samples .*Mn \d+ samples/.test(l))).toBe(true);
  });

  it("reports exactly the one deliberate refusal: Lab A's \"<0.5\" converted without LABVALUE on the Read me sheet", () => {
    expect(summary.errors.map((e) => `${e.sheet}!${e.cell}`)).toEqual(["Read me!B17"]);
    for (const e of summary.errors) {
      expect(e.error).toBe("#VALUE!");
      expect(e.message).toContain('"<0.5" is not a number');
      expect(e.message).toContain("below- or above-detection value is your call");
    }
    expect(summary.reasons).toHaveLength(1);
    expect(summary.reasons[0]!.cells).toHaveLength(1);
    expect(printed).toContain("Cells in error: 1");
  });

  it("the lab sheets read the below-detection nitrate through SOIL.LABVALUE with the Settings policy, computed from core", async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(summary.workbooks.find((w) => /soil-tests/.test(w.file))!.output);
    const policy = String(wb.getWorksheet("Settings")!.getCell("C7").value);
    const cached = (sheet: string, header: string, id: string) => {
      const ws = wb.getWorksheet(sheet)!;
      let col = 0;
      ws.getRow(2).eachCell((c, i) => (c.value === header ? (col = i) : undefined));
      for (let r = 3; r <= ws.rowCount; r++) {
        if (ws.getCell(r, 1).value === id) {
          const v = ws.getCell(r, col).value as { result?: unknown } | number;
          return typeof v === "object" && v !== null ? v.result : v;
        }
      }
      throw new Error(`${id} not on ${sheet}`);
    };
    const rowsA = await rowsOf(SEASON, "Lab A Brindlewick", H.sampleId);
    const a = rowsA.find((r) => r["NO3-N (lb/ac)"] === "<0.5")!;
    expect(cached("Lab A Brindlewick", "NO3-N (kg/ha)", String(a[H.sampleId]))).toBeCloseTo(convertUnit(labValue("<0.5", policy) as number, "lb/ac", "kg/ha"), 9);
    const rowsB = await rowsOf(SEASON, "Lab B Quillon Downs", H.sampleId);
    const b = rowsB.find((r) => r["Nitrate-N (mg/kg)"] === "<0.5")!;
    const layer = { depthCm: settings.depthB, bulkDensity: num(b["Bulk density (g/cm3)"]) };
    expect(cached("Lab B Quillon Downs", "Nitrate-N (kg/ha, 0-10 cm)", String(b[H.sampleId]))).toBeCloseTo(convertUnit(labValue("<0.5", policy) as number, "mg/kg", "kg/ha", layer), 9);
  });

  it("legume N fixed for a farm equals the shoot-based and per-tonne rules, computed from core", async () => {
    const rows = (await rowsOf(LEGUME, LAYOUT.SHEETS.legume, H.sampleId)).filter((r) => r[H.farm] === "Tarnaby Flats");
    let fixedKg = 0;
    for (const r of rows) {
      const cut = num(r["Shoot DM, peak cut (t/ha)"]);
      const dm = cut ?? nfixShootDm(num(r["Grain yield (t/ha)"])!, num(r["Harvest index"])!);
      let fixed: number;
      if (r["Use"] === "pasture") fixed = nfixPerTonne(dm, "pasture");
      else {
        const ref = num(r["δ15N reference (‰)"]);
        const ndfa = ref === undefined ? num(r["%Ndfa assumed (Assumptions)"])! : nfixNdfa(ref, num(r["δ15N legume (‰)"])!, num(r["B value (‰)"])!);
        fixed = nfixFixedN(dm, num(r["Shoot N (%)"])!, ndfa, String(r["Below-ground factor"]));
      }
      fixedKg += fixed * num(r[H.area])!;
    }
    const farm = summary.legume.find((f) => f.farm === "Tarnaby Flats")!;
    expect(farm.paddocks).toBe(rows.length);
    expect(farm.nFixedKg).toBeCloseTo(fixedKg, 4);
    expect(summary.legumeNegative.every((id) => /^(WRN|QDH)-/.test(id))).toBe(true); // the soybean paddocks
  });

  it("legume checks: paddocks with a soil constraint and with poor or no nodulation equal the core screen and rating of the dig inputs", async () => {
    const rows = await rowsOf(LEGUME, LAYOUT.SHEETS.nodulation, H.sampleId);
    const constrained: string[] = [];
    const poor: string[] = [];
    for (const r of rows) {
      const word = String(r["Legume, as the checks name it"]);
      const count = nfixSoilCount(word, num(r["Soil pH (CaCl2), 0-10 cm"])!, "CaCl2", num(r["Nitrate-N at sowing (kg N/ha)"]), num(r["Hot-water B (mg/kg)"]));
      if (count > 0) constrained.push(String(r[H.sampleId]));
      const rating = nfixNodulationRating(num(r["Plants dug"])!, num(r["Plants adequately nodulated"])!, num(r["Nodules counted"]));
      if (/^(Poor|None):/.test(rating)) poor.push(String(r[H.sampleId]));
    }
    const c = summary.legumeChecks!;
    expect(c.paddocks).toBe(rows.length);
    expect(c.constrained).toEqual(constrained);
    expect(c.poorNodulation).toEqual(poor);
    // The invented season has both kinds, and the uninoculated soybean dig with no nodules rates None.
    expect(constrained.length).toBeGreaterThan(0);
    expect(poor).toContain("QDH-03");
    expect(printed).toContain(`  paddocks with a soil constraint on fixation: ${constrained.length} of ${rows.length} (${constrained.join(", ")})`);
    expect(printed).toContain(`  paddocks with poor or no nodulation: ${poor.length} of ${rows.length} (${poor.join(", ")})`);
  });

  it("the dig sheet's counts are whole numbers and its soil tests name the pH test (CaCl2) in the formula", async () => {
    const rows = await rowsOf(LEGUME, LAYOUT.SHEETS.nodulation, H.sampleId);
    for (const r of rows) {
      for (const k of ["Plants dug", "Plants adequately nodulated", "Nodules counted", "Nodules pink inside"]) expect(Number.isInteger(num(r[k]))).toBe(true);
    }
    const JSZip = (await import("jszip")).default;
    const zip = await JSZip.loadAsync(fs.readFileSync(LEGUME));
    const sheets = (await Promise.all(Object.keys(zip.files).filter((n) => /^xl\/worksheets\/sheet\d+\.xml$/.test(n)).map((n) => zip.file(n)!.async("string")))).join("");
    expect(sheets).toMatch(/_xldudf_SOIL_FIXSOIL\([A-Z]+3:[A-Z]+32,[A-Z]+3:[A-Z]+32,&quot;CaCl2&quot;,/);
  });

  it("the committed workbooks hold Excel's stored form with cached values", async () => {
    const JSZip = (await import("jszip")).default;
    const zip = await JSZip.loadAsync(fs.readFileSync(SEASON));
    const names = Object.keys(zip.files);
    expect(names).toContain("xl/metadata.xml");
    const all = (await Promise.all(names.filter((n) => /^xl\/worksheets\/sheet\d+\.xml$/.test(n)).map((n) => zip.file(n)!.async("string")))).join("");
    expect(all).toMatch(/<c r="W3"[^>]* cm="1"><f t="array" ref="W3:W152">_xldudf_SOIL_CEC\(M3:M152,N3:N152,L3:L152,O3:O152,(&quot;|")ppm(&quot;|")\)<\/f><v>[0-9.]+<\/v>/);
    expect(all).not.toMatch(/SOIL\.[A-Z]+\(/); // no typed form left
  });
});
