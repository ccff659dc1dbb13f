/**
 * Report templates in the engine (no office program needed): the convention's names, the per-key
 * plan (only the cells that read the key are computed again), values-only report sheets, the
 * listings of keys that give no report and of cells in error, the index, file names, and the
 * one-page scale given to the office engine. Workbook contents are invented; the SOIL values are
 * SOIL.CMOL's (Source: IUPAC/CIAAW standard atomic weights, 200.39 mg/kg Ca per cmol(+)/kg, as in
 * tests/hosts/cases.ts). The sample template is sample-workbooks/caddow-2025-soil-tests.xlsx.
 */
import fs from "fs";
import path from "path";
import ExcelJS from "exceljs";
import { readBook } from "../../src/engine/book";
import { a1 } from "../../src/engine/cellref";
import { openPackage } from "../../src/engine/xlsx-package";
import { SOIL_NAMES } from "../../src/engine/soil";
import { recalcWorkbook } from "../../src/engine/recalc";
import { CellWrite, patchSheetXml } from "../../src/engine/sheet-patch";
import { ReportPackager } from "../../src/engine/report-package";
import { ReportTemplateError, openReportTemplate } from "../../src/engine/report-template";
import { isDateFormat, runReportBatch, safeFileName } from "../../src/engine/report-batch";
import { XlError } from "../../src/engine/formula/values";
import { tempDir, writeWorkbook } from "../helpers/workbook";

const SAMPLE = path.join(__dirname, "../../sample-workbooks/caddow-2025-soil-tests.xlsx");

/** A small template: a data sheet and a report sheet whose key picks a row. */
async function miniTemplate(file: string, names = true): Promise<string> {
  return writeWorkbook(file, (wb) => {
    const d = wb.addWorksheet("Data");
    d.addRow(["ID", "Ca mg/kg", "Name"]);
    d.addRow(["S1", 2003.9, "North"]);
    d.addRow(["S2", "12,5", "South"]); // a decimal comma: SOIL.CMOL refuses it (the data are in error)
    d.addRow(["S3", 1001.95, "A/B: East"]);
    d.addRow(["s1", 1, "twice"]); // the same key as S1 to Excel's MATCH
    d.addRow([null]);
    d.addRow([{ error: "#N/A" } as never]);
    const r = wb.addWorksheet("Report");
    r.getCell("A1").value = "Sample";
    r.getCell("B1").value = "S1";
    r.getCell("B2").value = { formula: "IFERROR(MATCH(B1,Data!$A$2:$A$7,0),0)" } as never;
    r.getCell("B3").value = { formula: 'IF(B2>0,INDEX(Data!$B$2:$B$7,B2),"")' } as never;
    r.getCell("B4").value = { formula: 'SOIL.CMOL(B3,"Ca")' } as never;
    r.getCell("B4").numFmt = "0.00";
    r.getCell("B5").value = { formula: 'IF(B2>0,INDEX(Data!$C$2:$C$7,B2),"")' } as never;
    r.getCell("B6").value = { formula: "B2>0" } as never;
    r.getCell("B7").value = { formula: 'B1&" "&B5' } as never;
    r.getCell("B8").value = { formula: 'IF(B2>0,IF(B2<=2,"G1","G2"),"")' } as never;
    r.getCell("B9").value = { formula: 'SOIL.CMOL(400.78,"Ca")' } as never; // reads no key: computed once
    r.getCell("A10").value = "Label text";
    r.getCell("D1").value = "Ca (cmol(+)/kg)";
    r.getCell("E1").value = { formula: "B4" } as never;
    r.getCell("E1").numFmt = "0.00";
    r.getCell("D2").value = "Name";
    r.getCell("E2").value = { formula: "B5" } as never;
    r.pageSetup = { paperSize: 9, orientation: "portrait", fitToPage: true, fitToWidth: 1, fitToHeight: 1, printArea: "A1:E10" };
    for (let i = 1; i <= 10; i++) r.getRow(i).height = 20;
    if (names) {
      wb.definedNames.add("Report!$B$1", "Report_Key");
      wb.definedNames.add("Data!$A$2:$A$7", "Report_Keys");
      wb.definedNames.add("Report!$B$6", "Report_Found");
      wb.definedNames.add("Report!$B$7", "Report_File");
      wb.definedNames.add("Report!$B$8", "Report_Group");
      wb.definedNames.add("Report!$D$1:$E$2", "Report_Figures");
    }
  });
}

/** A report sheet's values, read back from its values-only workbook. */
async function sheetValues(bytes: Buffer): Promise<{ values: Map<string, unknown>; formulas: number; xml: string; parts: string[] }> {
  const pkg = await openPackage(bytes);
  const book = readBook(pkg, SOIL_NAMES);
  const s = book.sheets[0]!;
  const values = new Map<string, unknown>();
  for (let k = 0; k < s.cells.n; k++) {
    const v = s.cells.value(k);
    values.set(a1({ row: s.cells.row[k] as number, col: s.cells.col[k] as number }), v instanceof XlError ? v.code : v);
  }
  return { values, formulas: s.formulas.n, xml: s.xml, parts: pkg.parts().sort() };
}

describe("report templates: the convention's names", () => {
  let dir: string;
  let file: string;
  beforeAll(async () => {
    dir = tempDir("soilcell-report-");
    file = await miniTemplate(path.join(dir, "mini.xlsx"));
  });

  it("finds the key cell, the keys and the other names; lists blanks, errors and duplicates in the key list", async () => {
    const tpl = await openReportTemplate(file);
    expect(tpl.sheet.name).toBe("Report");
    expect(tpl.keyCell).toBe("Report!B1");
    expect(tpl.names).toEqual({ key: "Report!B1", keys: "Data!A2:A7", found: "Report!B6", file: "Report!B7", group: "Report!B8", figures: "Report!D1:E2" });
    expect(tpl.keys.map((k) => k.key)).toEqual(["S1", "S2", "S3"]);
    expect(tpl.keyProblems).toEqual([
      { key: "s1", from: "Data!A5", reason: "the same key as Data!A2: reported once", before: 3 },
      { key: "#N/A", from: "Data!A7", reason: "the key list holds the error #N/A", before: 3 },
    ]);
  });

  it("computes again per key only the cells that read the key cell (B9, a SOIL cell reading no key, is computed once)", async () => {
    const tpl = await openReportTemplate(file);
    expect(tpl.perKeyCells).toBe(9); // B2:B8, E1, E2
    const r = tpl.report("S3");
    const { values } = await sheetValues(new ReportPackager(tpl.pkg, tpl.sheet).single(r.sheetXml, r.name, "test"));
    expect(values.get("B1")).toBe("S3");
    expect(values.get("B4")).toBe(5); // 1001.95 mg/kg Ca / 200.39 (Source: IUPAC/CIAAW atomic weights)
    expect(values.get("B5")).toBe("A/B: East");
    expect(values.get("B9")).toBeCloseTo(2, 12); // 400.78 / 200.39
    expect(r.found).toBe(true);
    expect(r.name).toBe("S3 A/B: East");
    expect(r.group).toBe("G2");
    expect(r.figures).toEqual([
      { label: "Ca (cmol(+)/kg)", value: 5, format: "0.00" },
      { label: "Name", value: "A/B: East", format: "General" },
    ]);
    expect(r.errors).toEqual([]);
  });

  it("lists the report's cells in error with the engine's message (the data are in error)", async () => {
    const tpl = await openReportTemplate(file);
    const r = tpl.report("S2");
    expect(r.errors.map((e) => [e.cell, e.error])).toEqual([
      ["E1", "#VALUE!"],
      ["B4", "#VALUE!"],
    ]); // in reading order
    expect(r.errors[1]!.message).toMatch(/12,5/);
    expect(r.errors[1]!.formula).toBe('=SOIL.CMOL(B3,"Ca")');
  });

  it("a key that selects nothing says so through Report_Found", async () => {
    const tpl = await openReportTemplate(file);
    const r = tpl.report("NOPE");
    expect(r.found).toBe(false);
  });

  it("writes values only: no formula, no shared strings, the template's styles and print area, one sheet", async () => {
    const tpl = await openReportTemplate(file);
    const r = tpl.report("S1");
    const v = await sheetValues(new ReportPackager(tpl.pkg, tpl.sheet).single(r.sheetXml, r.name, "test"));
    expect(v.formulas).toBe(0);
    expect(v.xml).not.toMatch(/<f[ >]/);
    expect(v.xml).not.toMatch(/t="s"/);
    expect(v.parts).toEqual(["[Content_Types].xml", "_rels/.rels", "docProps/core.xml", "docProps/custom.xml", "xl/_rels/workbook.xml.rels", "xl/styles.xml", "xl/theme/theme1.xml", "xl/workbook.xml", "xl/worksheets/sheet1.xml"]);
    expect(v.values.get("A10")).toBe("Label text");
    expect(v.values.get("B6")).toBe(true);
    const wb = new ExcelJS.Workbook();
    const out = path.join(dir, "one.xlsx");
    fs.writeFileSync(out, new ReportPackager(tpl.pkg, tpl.sheet).single(r.sheetXml, r.name, "test"));
    await wb.xlsx.readFile(out); // another reader opens it
    expect(wb.worksheets.map((w) => w.name)).toEqual(["Report"]);
    expect(wb.worksheets[0]!.getCell("B4").value).toBe(10); // 2003.9 / 200.39
    expect(wb.worksheets[0]!.getCell("B4").numFmt).toBe("0.00");
    expect(wb.worksheets[0]!.pageSetup.printArea).toBe("A1:E10");
  });

  it("a template without Report_Key is refused with what to do; --key-cell and --keys-from stand in for the names", async () => {
    const bare = await miniTemplate(path.join(dir, "bare.xlsx"), false);
    await expect(openReportTemplate(bare)).rejects.toThrow(ReportTemplateError);
    await expect(openReportTemplate(bare)).rejects.toThrow(/no Report_Key name/);
    await expect(openReportTemplate(bare, { keyCell: "Report!B1" })).rejects.toThrow(/no keys/);
    const tpl = await openReportTemplate(bare, { keyCell: "Report!B1", keysFrom: ["Data!A2:A4"] });
    expect(tpl.keys.map((k) => k.key)).toEqual(["S1", "S2", "S3"]);
    expect(tpl.report("S1").found).toBeUndefined();
    await expect(openReportTemplate(bare, { keyCell: "Report!B2", keysFrom: ["Data!A2:A4"] })).rejects.toThrow(/holds a formula/);
    await expect(openReportTemplate(bare, { keyCell: "Report!Z99", keysFrom: ["Data!A2:A4"] })).rejects.toThrow(/is empty/);
    await expect(openReportTemplate(bare, { sheet: "Nope", keyCell: "B1" })).rejects.toThrow(/no sheet "Nope"/);
  });

  it("without a Report_Found cell, a typed key that is not in the key list matches nothing (listed, no report)", async () => {
    const bare = await miniTemplate(path.join(dir, "bare2.xlsx"), false);
    const tpl = await openReportTemplate(bare, { keyCell: "Report!B1", keysFrom: ["Data!A2:A4"], keys: ["S2", "ZZZ-99"] });
    expect(tpl.keys.map((k) => k.key)).toEqual(["S2"]);
    expect(tpl.keyProblems.map((p) => [p.key, p.notFound])).toEqual([["ZZZ-99", true]]);
    expect(tpl.keyProblems[0]!.reason).toMatch(/not in the key list \(Data!A2:A4\)/);
  });
});

describe("report batches: files, the index and the listings", () => {
  let dir: string;
  let summary: Awaited<ReturnType<typeof runReportBatch>>;
  beforeAll(async () => {
    dir = tempDir("soilcell-batch-");
    const file = await miniTemplate(path.join(dir, "mini.xlsx"));
    summary = await runReportBatch(file, { outDir: path.join(dir, "out"), pdf: false, keys: ["S1", "S2", "S3", "NOPE", "s3"] });
  });

  it("writes one workbook per key that selects something, named by Report_File, in a folder per Report_Group", () => {
    expect(summary.reports).toBe(3);
    expect(summary.entries.map((e) => [e.key, e.status, e.xlsx ?? null])).toEqual([
      ["S1", "ok", path.join("G1", "S1 North.xlsx")],
      ["S2", "errors", path.join("G1", "S2 South.xlsx")],
      ["S3", "ok", path.join("G2", "S3 A_B_ East.xlsx")],
      ["NOPE", "not found", null],
      ["s3", "not reported", null],
    ]);
    for (const e of summary.entries) if (e.xlsx) expect(fs.existsSync(path.join(summary.outDir, e.xlsx))).toBe(true);
  });

  it("lists the missing and duplicate keys and the cells in error in problems.csv and index.xlsx", async () => {
    const problems = fs.readFileSync(summary.index.problems, "utf8").trim().split("\r\n");
    expect(problems[0]).toBe("Key,Problem,Cell,Error,Formula,Message,Key from");
    expect(problems.slice(1).map((l) => l.split(",").slice(0, 4).join(","))).toEqual(["S2,cell in error,Report!E1,#VALUE!", "S2,cell in error,Report!B4,#VALUE!", "NOPE,not found,,", "s3,not reported,,"]);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(summary.index.xlsx);
    const p = wb.getWorksheet("Problems")!;
    expect(p.rowCount).toBe(5);
    expect(p.getCell("F3").value).toMatch(/12,5/);
  });

  it("index.csv has a row per key with its status, files and figures (numbers in full)", () => {
    const rows = fs.readFileSync(summary.index.csv, "utf8").trim().split("\r\n");
    expect(rows[0]).toBe("Key,Status,Group,Name,Workbook,PDF,Pages,Ca (cmol(+)/kg),Name,Cells in error,Key from");
    expect(rows[1]).toBe(`S1,ok,G1,S1 North,${path.join("G1", "S1 North.xlsx")},,,10,North,0,--keys`);
    expect(rows[2]).toBe(`S2,errors,G1,S2 South,${path.join("G1", "S2 South.xlsx")},,,#VALUE!,South,2,--keys`);
    expect(rows[4]).toBe("NOPE,not found,,,,,,,,0,--keys");
  });

  it("index.xlsx keeps the figures' number formats", async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(summary.index.xlsx);
    const ws = wb.getWorksheet("Reports")!;
    expect(ws.getCell("H2").value).toBe(10);
    expect(ws.getCell("H2").numFmt).toBe("0.00");
    expect(ws.getCell("H3").value).toEqual({ error: "#VALUE!" });
  });
});

describe("report pieces", () => {
  it("safeFileName keeps keys readable and never makes a path", () => {
    expect(safeFileName("WRN-07 Creek")).toBe("WRN-07 Creek");
    expect(safeFileName("A/B: East")).toBe("A_B_ East");
    expect(safeFileName("../..")).toBe("_"); // no dots at either end: never "." or ".."
    expect(safeFileName("  ")).toBe("report");
    expect(safeFileName("con")).toBe("con_");
    expect(safeFileName("a\u0000b")).toBe("a_b");
  });

  it("isDateFormat tells dates from numbers", () => {
    expect(isDateFormat("d mmm yyyy")).toBe(true);
    expect(isDateFormat("0.00")).toBe(false);
    expect(isDateFormat('0.0 "days"')).toBe(false);
    expect(isDateFormat("[$-409]mmm")).toBe(true);
  });

  it("gives the office engine a fixed scale that fits the print area on one page (from the sheet's widths and heights)", async () => {
    const dir = tempDir("soilcell-scale-");
    const tpl = await openReportTemplate(await miniTemplate(path.join(dir, "mini.xlsx")));
    const p = new ReportPackager(tpl.pkg, tpl.sheet);
    // 10 rows of 20 pt fit an A4 page's height; 5 default columns of 64 px (48 pt) fit its width.
    expect(p.fixedScale?.scale).toBe(96); // 100 % with 4 % to spare
    expect(p.fixedScale?.to).toMatch(/scale="96"/);
    expect(p.fixedScale?.to).not.toMatch(/fitTo/);
  });
});

describe("the sample template: per-key results equal a full recalculation with the key typed in", () => {
  it("AMB-07 and PLM-03, every cell of the report sheet", async () => {
    const dir = tempDir("soilcell-perkey-");
    const tpl = await openReportTemplate(SAMPLE);
    expect(tpl.keys).toHaveLength(280);
    expect(tpl.perKeyCells).toBeLessThan(tpl.base.formulaCells / 5);
    const packager = new ReportPackager(tpl.pkg, tpl.sheet);
    for (const key of ["AMB-07", "PLM-03"]) {
      const ours = await sheetValues(packager.single(tpl.report(key).sheetXml, key, "test"));
      // The same workbook with the key typed in, recalculated whole by recalc.
      const pkg = await openPackage(fs.readFileSync(SAMPLE));
      const book = readBook(pkg, SOIL_NAMES);
      const sheet = book.sheets.find((s) => s.name === "Client report")!;
      // Every formula of the report sheet loses its cached value, so recalc computes them all.
      const writes: CellWrite[] = [{ kind: "constant", row: 3, col: 2, value: key }];
      for (let f = 0; f < sheet.formulas.n; f++) {
        const k = sheet.formulas.cell[f] as number;
        writes.push({ kind: "formula", row: sheet.cells.row[k] as number, col: sheet.cells.col[k] as number, value: undefined, k });
      }
      pkg.write(sheet.path, patchSheetXml(sheet, writes));
      const typed = path.join(dir, `${key}.xlsx`);
      fs.writeFileSync(typed, pkg.toBuffer());
      const full = path.join(dir, `${key}.recalc.xlsx`);
      const s = await recalcWorkbook(typed, full);
      expect(s.kept).toEqual([]);
      const fullBook = readBook(await openPackage(fs.readFileSync(full)), SOIL_NAMES);
      const fs2 = fullBook.sheets.find((x) => x.name === "Client report")!;
      const wrong: string[] = [];
      let compared = 0;
      for (let k = 0; k < fs2.cells.n; k++) {
        const v = fs2.cells.value(k);
        const want = v instanceof XlError ? v.code : v; // a formula's "" stays "" in the values-only report
        const at = a1({ row: fs2.cells.row[k] as number, col: fs2.cells.col[k] as number });
        const got = ours.values.get(at) ?? null;
        compared++;
        if (JSON.stringify(got) !== JSON.stringify(want)) wrong.push(`${key} ${at}: full ${JSON.stringify(want)}, per key ${JSON.stringify(got)}`);
      }
      expect(compared).toBeGreaterThan(500);
      expect(wrong).toEqual([]);
    }
  }, 120_000);
});
