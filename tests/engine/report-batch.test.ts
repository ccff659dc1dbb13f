/**
 * A batch of reports (src/engine/report-batch.ts), in process: the files a batch writes and their
 * names, the options (no workbooks, a limit, no groups), the index's exact CSV and workbook cells,
 * figures by type and number format (dates as ISO dates, Excel's 1900 and 1904 date systems per
 * ECMA-376 Part 1, 18.17.4.1; the 1900 system counting a 29 February 1900 that did not exist, from
 * memory), the warnings, and the PDF steps run against stand-in office tools (small scripts that
 * answer as LibreOffice and poppler do, so the batch's own steps are checked: which workbooks go to
 * which run, how pages are split and placed, when a batch falls back to one workbook per report).
 * The real LibreOffice run is in tests/cli/report.test.ts. Workbook contents are invented.
 */
import fs from "fs";
import os from "os";
import path from "path";
import { openPackage } from "../../src/engine/xlsx-package";
import { readBook } from "../../src/engine/book";
import { SOIL_NAMES } from "../../src/engine/soil";
import { a1 } from "../../src/engine/cellref";
import { XlError } from "../../src/engine/formula/values";
import { OfficeTools } from "../../src/engine/office-pdf";
import { BatchOptions, isDateFormat, runReportBatch, safeFileName } from "../../src/engine/report-batch";
import { CAUTION } from "../../src/core/about";
import { tempDir, writeWorkbook } from "../helpers/workbook";

const STAMP = /^soilcell \S+ on \d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ$/;

/**
 * A template: Data lists samples (ID, name, group, sampled on, value); the report sheet's key
 * picks a row. Figures: a date, a date and time, a logical, a blank, an unlabelled row, a text
 * with a comma and quotes, a duration, and a number.
 */
async function template(file: string, o: { header?: string; date1904?: boolean; rows?: (string | number | null)[][]; noFound?: boolean } = {}): Promise<string> {
  return writeWorkbook(file, (wb) => {
    if (o.date1904) wb.properties.date1904 = true;
    const d = wb.addWorksheet("Data");
    d.addRow(["ID", "Name", "Group", "Sampled", "Value"]);
    const rows = o.rows ?? [
      ["S1", "North", "G1", 45658, 0.5],
      ["S2", "South", "G1", 59, 2],
      ["S3", "North", "G2", 61, 3],
      ["S4", "NORTH", null, 1, 4],
      [101, "Numbered", "G2", 45658.25, 5],
    ];
    for (const r of rows) d.addRow(r);
    const n = rows.length + 1;
    const r = wb.addWorksheet("Report");
    r.getCell("A1").value = "Sample";
    r.getCell("B1").value = "S1";
    r.getCell("B2").value = { formula: `IFERROR(MATCH(B1,Data!$A$2:$A$${n},0),0)` } as never;
    r.getCell("B3").value = { formula: "B2>0" } as never;
    r.getCell("B4").value = { formula: `IF(B2>0,INDEX(Data!$B$2:$B$${n},B2),"")` } as never;
    r.getCell("B5").value = { formula: `IF(B2>0,INDEX(Data!$C$2:$C$${n},B2)&"","")` } as never;
    const fig = (row: number, label: string | null, formula: string | number | null, fmt?: string) => {
      if (label !== null) r.getCell(`D${row}`).value = label;
      if (formula !== null) r.getCell(`E${row}`).value = typeof formula === "number" ? formula : ({ formula } as never);
      if (fmt) r.getCell(`E${row}`).numFmt = fmt;
    };
    fig(1, "Sampled", `IF(B2>0,INDEX(Data!$D$2:$D$${n},B2),"")`, "d mmm yyyy");
    fig(2, "At", `IF(B2>0,INDEX(Data!$D$2:$D$${n},B2),"")`, "yyyy-mm-dd hh:mm");
    fig(3, "Passed", "B2>2", undefined);
    fig(4, "Blank", null);
    fig(5, null, 7);
    fig(6, "Note, with comma", 'IF(B2>0,"say ""hi""","")');
    fig(7, "Duration", `IF(B2>0,INDEX(Data!$E$2:$E$${n},B2)*3,"")`, "[h]:mm");
    fig(8, "Value", `IF(B2>0,INDEX(Data!$E$2:$E$${n},B2)/10,"")`, "0.0");
    fig(9, " Error ", "1/(B2>2)", "0.0");
    if (o.header) r.headerFooter = { oddHeader: o.header } as never;
    wb.definedNames.add("Report!$B$1", "Report_Key");
    wb.definedNames.add(`Data!$A$2:$A$${n}`, "Report_Keys");
    if (!o.noFound) wb.definedNames.add("Report!$B$3", "Report_Found");
    wb.definedNames.add("Report!$B$4", "Report_File");
    wb.definedNames.add("Report!$B$5", "Report_Group");
    wb.definedNames.add("Report!$D$1:$E$9", "Report_Figures");
  });
}

/** The cells of a written workbook's sheet, errors as their code. */
async function cellsOf(file: string, sheet: string): Promise<Record<string, unknown>> {
  const book = readBook(await openPackage(fs.readFileSync(file)), SOIL_NAMES);
  const s = book.sheets.find((x) => x.name === sheet)!;
  const out: Record<string, unknown> = {};
  for (let k = 0; k < s.cells.n; k++) {
    const v = s.cells.value(k);
    out[a1({ row: s.cells.row[k] as number, col: s.cells.col[k] as number })] = v instanceof XlError ? v.code : v;
  }
  return out;
}

const csv = (file: string) => fs.readFileSync(file, "utf8");

describe("a batch of reports: files, names and the index", () => {
  let dir: string;
  let file: string;
  let s: Awaited<ReturnType<typeof runReportBatch>>;
  const lines: string[] = [];
  beforeAll(async () => {
    dir = tempDir("soilcell-batch-");
    file = await template(path.join(dir, "farm template.xlsx"));
    s = await runReportBatch(file, { outDir: path.join(dir, "out"), pdf: false, progress: (l) => lines.push(l) });
  });

  it("names the files from Report_File in folders from Report_Group; names that clash (in any case) get a number", () => {
    expect(s.entries.map((e) => [e.key, e.status, e.name, e.group ?? null, e.xlsx ?? null])).toEqual([
      ["S1", "errors", "North", "G1", path.join("G1", "North.xlsx")],
      ["S2", "errors", "South", "G1", path.join("G1", "South.xlsx")],
      ["S3", "ok", "North", "G2", path.join("G2", "North.xlsx")],
      ["S4", "ok", "NORTH", null, "NORTH.xlsx"], // no group: the output folder itself
      ["101", "ok", "Numbered", "G2", path.join("G2", "Numbered.xlsx")],
    ]);
    for (const e of s.entries) expect(fs.existsSync(path.join(dir, "out", e.xlsx!))).toBe(true);
    expect(s.entries.map((e) => e.from)).toEqual(["Data!A2", "Data!A3", "Data!A4", "Data!A5", "Data!A6"]);
  });

  it("sums up the batch", () => {
    expect(s.template).toBe(file);
    expect(s.sheet).toBe("Report");
    expect(s.keyCell).toBe("Report!B1");
    expect(s.names).toEqual({ key: "Report!B1", keys: "Data!A2:A6", found: "Report!B3", file: "Report!B4", group: "Report!B5", figures: "Report!D1:E9" });
    expect(s.outDir).toBe(path.join(dir, "out"));
    expect([s.reports, s.notFound, s.withErrors]).toEqual([5, 0, 2]);
    expect(s.index).toEqual({ csv: path.join(dir, "out", "index.csv"), xlsx: path.join(dir, "out", "index.xlsx"), problems: path.join(dir, "out", "problems.csv") });
    expect(s.groupPdfs).toEqual([]);
    expect(s.pdf).toEqual({ written: 0, notes: [] });
    expect(s.perKeyCells).toBe(11); // B2:B5, E1:E3, E6:E9 read the key; E5 is a constant
    expect(s.templateFormulaCells).toBe(11);
    expect(s.warnings).toEqual([]);
    expect(Object.keys(s.seconds)).toEqual(["total", "template", "reports", "pdf", "index"]);
    for (const v of Object.values(s.seconds)) expect(v).toBeGreaterThanOrEqual(0);
    for (const v of Object.values(s.seconds)) expect(v).toBeLessThan(60); // seconds, not milliseconds
    expect(s.seconds.total).toBeCloseTo(s.seconds.template + s.seconds.reports + s.seconds.pdf + s.seconds.index, 9);
    expect(s.seconds.total).toBeGreaterThanOrEqual(s.seconds.template);
    expect(lines).toEqual(["11 formula cells read the key cell Report!B1; 5 keys"]); // fewer than 50 reports: no progress line
  });

  it("each report workbook says what it is in its custom properties", async () => {
    const pkg = await openPackage(fs.readFileSync(path.join(dir, "out", "G1", "North.xlsx")));
    const note = /<vt:lpwstr>([^<]*)<\/vt:lpwstr>/.exec(pkg.text("docProps/custom.xml")!)![1]!;
    expect(note).toMatch(/^Report for S1 from farm template\.xlsx, every cell a value, by soilcell \S+ on \d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ\.$/);
    expect(pkg.text("docProps/core.xml")).toContain("<dc:title>North</dc:title>");
    expect((await cellsOf(path.join(dir, "out", "G2", "Numbered.xlsx"), "Report")).B1).toBe(101); // a number key stays a number
  });

  it("index.csv: figures by type (dates as ISO dates in the 1900 system, times to the second), fields quoted where CSV needs it", () => {
    expect(csv(s.index.csv)).toBe(
      [
        "Key,Status,Group,Name,Workbook,PDF,Pages,Sampled,At,Passed,Blank,\"Note, with comma\",Duration,Value,Error,Cells in error,Key from",
        `S1,errors,G1,North,${path.join("G1", "North.xlsx")},,,2025-01-01,2025-01-01,FALSE,,"say ""hi""",1.5,0.05,#DIV/0!,1,Data!A2`,
        `S2,errors,G1,South,${path.join("G1", "South.xlsx")},,,1900-02-28,1900-02-28,FALSE,,"say ""hi""",6,0.2,#DIV/0!,1,Data!A3`,
        `S3,ok,G2,North,${path.join("G2", "North.xlsx")},,,1900-03-01,1900-03-01,TRUE,,"say ""hi""",9,0.3,1,0,Data!A4`,
        "S4,ok,,NORTH,NORTH.xlsx,,,1900-01-01,1900-01-01,TRUE,,\"say \"\"hi\"\"\",12,0.4,1,0,Data!A5",
        `101,ok,G2,Numbered,${path.join("G2", "Numbered.xlsx")},,,2025-01-01T06:00:00,2025-01-01T06:00:00,TRUE,,"say ""hi""",15,0.5,1,0,Data!A6`,
        "",
      ].join("\r\n"),
    );
  });

  it("problems.csv lists every cell in error with its cell, error, formula and message", () => {
    const rows = csv(s.index.problems).split("\r\n");
    expect(rows[0]).toBe("Key,Problem,Cell,Error,Formula,Message,Key from");
    expect(rows.slice(1, 3).map((r) => r.split(",").slice(0, 5).join(","))).toEqual(["S1,cell in error,Report!E9,#DIV/0!,=1/(B2>2)", "S2,cell in error,Report!E9,#DIV/0!,=1/(B2>2)"]);
    expect(rows[1]!.split(",").at(-1)).toBe("Data!A2");
    expect(rows.slice(3)).toEqual([""]);
  });

  it("index.xlsx: a Reports sheet with the figures' values and formats, a Problems sheet, an About sheet", async () => {
    const reports = await cellsOf(s.index.xlsx, "Reports");
    expect([reports.A1, reports.H1, reports.P1, reports.Q1]).toEqual(["Key", "Sampled", "Cells in error", "Key from"]);
    expect([reports.A2, reports.B2, reports.C2, reports.D2, reports.E2, reports.F2, reports.G2]).toEqual(["S1", "errors", "G1", "North", path.join("G1", "North.xlsx"), undefined, undefined]);
    expect([reports.H2, reports.J2, reports.K2, reports.L2, reports.M2, reports.N2, reports.O2, reports.P2]).toEqual([45658, false, undefined, 'say "hi"', 1.5, 0.05, "#DIV/0!", 1]);
    expect(reports.A6).toBe("101");
    const pkg = await openPackage(fs.readFileSync(s.index.xlsx));
    const sheet1 = pkg.text("xl/worksheets/sheet1.xml")!;
    // Numbers keep their figure's format: d mmm yyyy, yyyy-mm-dd hh:mm, [h]:mm, 0.0 (styles 2–5).
    expect(/<c r="H2"[^>]*>/.exec(sheet1)![0]).toBe('<c r="H2" s="2">');
    expect(/<c r="I2"[^>]*>/.exec(sheet1)![0]).toBe('<c r="I2" s="3">');
    expect(/<c r="M2"[^>]*>/.exec(sheet1)![0]).toBe('<c r="M2" s="4">');
    expect(/<c r="N2"[^>]*>/.exec(sheet1)![0]).toBe('<c r="N2" s="5">');
    expect(/<c r="P2"[^>]*>/.exec(sheet1)![0]).toBe('<c r="P2">');
    expect(pkg.text("xl/styles.xml")).toContain('<numFmts count="4"><numFmt numFmtId="164" formatCode="d mmm yyyy"/><numFmt numFmtId="165" formatCode="yyyy-mm-dd hh:mm"/><numFmt numFmtId="166" formatCode="[h]:mm"/><numFmt numFmtId="167" formatCode="0.0"/></numFmts>');
    expect(sheet1).toContain(
      "<cols>" + [14, 14, 18, 18, 28, 28, 14, 14, 14, 14, 14, 14, 14, 14, 14, 14, 14].map((w, i) => `<col min="${i + 1}" max="${i + 1}" width="${w}" customWidth="1"/>`).join("") + "</cols>",
    );
    expect(pkg.text("xl/worksheets/sheet2.xml")).toContain("<cols>" + [14, 16, 18, 10, 50, 80, 22].map((w, i) => `<col min="${i + 1}" max="${i + 1}" width="${w}" customWidth="1"/>`).join("") + "</cols>");
    const problems = await cellsOf(s.index.xlsx, "Problems");
    expect([problems.A2, problems.B2, problems.C2, problems.D2, problems.E2, problems.G2]).toEqual(["S1", "cell in error", "Report!E9", "#DIV/0!", "=1/(B2>2)", "Data!A2"]);
    const about = await cellsOf(s.index.xlsx, "About");
    expect(about.A1).toBe("About");
    expect(about.A2).toMatch(/^Reports from farm template\.xlsx, sheet "Report", key cell Report!B1; written by soilcell \S+ on \d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ\.$/);
    expect(about.A3).toBe("Every report workbook holds values only: the template's formulas were computed for each key (SOIL results included) and written as values.");
    expect(about.A4).toBe(CAUTION);
    expect(pkg.text("xl/worksheets/sheet3.xml")).toContain('<cols><col min="1" max="1" width="120" customWidth="1"/></cols>');
  });
});

describe("batch options", () => {
  let dir: string;
  let file: string;
  beforeAll(async () => {
    dir = tempDir("soilcell-batch-opts-");
    file = await template(path.join(dir, "t.xlsx"));
  });

  it("no workbooks (xlsx: false): the index still lists every key, no report is written", async () => {
    const s = await runReportBatch(file, { outDir: path.join(dir, "none"), pdf: false, xlsx: false });
    expect(s.reports).toBe(0);
    expect(s.entries.map((e) => e.xlsx)).toEqual([undefined, undefined, undefined, undefined, undefined]);
    expect(fs.readdirSync(path.join(dir, "none")).sort()).toEqual(["index.csv", "index.xlsx", "problems.csv"]);
  });

  it("no groups (group: false): every report in the output folder, names numbered across the groups", async () => {
    const s = await runReportBatch(file, { outDir: path.join(dir, "flat"), pdf: false, group: false });
    expect(s.entries.map((e) => [e.xlsx, e.group])).toEqual([
      ["North.xlsx", undefined],
      ["South.xlsx", undefined],
      ["North (2).xlsx", undefined],
      ["NORTH (3).xlsx", undefined],
      ["Numbered.xlsx", undefined],
    ]);
    expect(csv(s.index.csv).split("\r\n")[3]!.startsWith("S3,ok,,North,North (2).xlsx,")).toBe(true);
  });

  it("a limit takes the first keys; the key list's problems after them are not listed", async () => {
    const t = await template(path.join(dir, "dups.xlsx"), { rows: [["S1", "A", "G", 1, 1], ["s1", "B", "G", 1, 1], ["S2", "C", "G", 1, 1], ["S2", "D", "G", 1, 1], ["S3", "E", "G", 1, 1]] });
    const all = await runReportBatch(t, { outDir: path.join(dir, "all"), pdf: false, xlsx: false });
    expect(all.entries.map((e) => [e.key, e.status])).toEqual([
      ["S1", "errors"],
      ["s1", "not reported"],
      ["S2", "ok"],
      ["S2", "not reported"],
      ["S3", "ok"],
    ]);
    const two = await runReportBatch(t, { outDir: path.join(dir, "two"), pdf: false, xlsx: false, limit: 2 });
    expect(two.entries.map((e) => [e.key, e.status])).toEqual([
      ["S1", "errors"],
      ["s1", "not reported"],
      ["S2", "ok"],
      ["S2", "not reported"], // stood before S3, the third key
    ]);
    const one = await runReportBatch(t, { outDir: path.join(dir, "one"), pdf: false, xlsx: false, limit: 1 });
    expect(one.entries.map((e) => [e.key, e.status])).toEqual([
      ["S1", "errors"],
      ["s1", "not reported"],
    ]);
    const none = await runReportBatch(t, { outDir: path.join(dir, "none2"), pdf: false, xlsx: false, limit: -3 });
    expect(none.entries).toEqual([]);
    expect(csv(none.index.csv)).toBe("Key,Status,Group,Name,Workbook,PDF,Pages,Cells in error,Key from\r\n");
    expect(csv(none.index.problems)).toBe("Key,Problem,Cell,Error,Formula,Message,Key from\r\n");
    const zero = await runReportBatch(t, { outDir: path.join(dir, "zero"), pdf: false, xlsx: false, limit: 0 });
    expect(zero.entries).toEqual([]);
  });

  it("keys that select nothing are listed with the found cell's reason; a progress line every 50 keys", async () => {
    const lines: string[] = [];
    const keys = Array.from({ length: 101 }, (_, i) => `X${i}`);
    const s = await runReportBatch(file, { outDir: path.join(dir, "many"), pdf: false, keys, progress: (l) => lines.push(l) });
    expect(lines).toEqual(["11 formula cells read the key cell Report!B1; 101 keys", "50 of 101 reports", "100 of 101 reports"]);
    expect(s.notFound).toBe(101);
    expect(s.reports).toBe(0);
    expect(s.entries[0]).toEqual({ key: "X0", from: "--keys", status: "not found", reason: "the template's Report!B3 cell says this key selects nothing", figures: s.entries[0]!.figures, errors: [] });
    expect(csv(s.index.problems).split("\r\n")[1]).toBe("X0,not found,,,,the template's Report!B3 cell says this key selects nothing,--keys");
    // Figures are still listed for a key that selects nothing.
    expect(csv(s.index.csv).split("\r\n")[1]).toBe('X0,not found,,,,,,,,FALSE,,,,,#DIV/0!,0,--keys');
  });

  it("without Report_Found, a typed key not in the key list is listed as not found, where it was typed", async () => {
    const t = await template(path.join(dir, "nofound.xlsx"), { noFound: true });
    const s = await runReportBatch(t, { outDir: path.join(dir, "nofound"), pdf: false, xlsx: false, keys: ["ZZ", "S3", "s3"] });
    expect(s.entries.map((e) => [e.key, e.status, e.reason ?? null])).toEqual([
      ["ZZ", "not found", "not in the key list (Data!A2:A6), and the template names no Report_Found cell to look it up"],
      ["S3", "ok", null],
      ["s3", "not reported", "the same key as --keys: reported once"],
    ]);
    expect(s.notFound).toBe(1);
    expect(csv(s.index.problems).split("\r\n").slice(1, 3)).toEqual(["ZZ,not found,,,,\"not in the key list (Data!A2:A6), and the template names no Report_Found cell to look it up\",--keys", "s3,not reported,,,,the same key as --keys: reported once,--keys"]);
  });

  it("CSV fields with a leading or trailing space, a line break or a carriage return are quoted", async () => {
    const s = await runReportBatch(file, { outDir: path.join(dir, "quoted"), pdf: false, keys: [" lead", "trail ", "two\nlines", "cr\rx", "plain"] });
    expect(csv(s.index.csv).split("\r\n").slice(1, 6).map((l) => l.split(",not found")[0])).toEqual(['" lead"', '"trail "', '"two\nlines"', '"cr\rx"', "plain"]);
  });

  it("the 1904 date system: serial 0 is 1 January 1904", async () => {
    const t = await template(path.join(dir, "1904.xlsx"), { date1904: true, rows: [["S1", "A", "G", 0, 1], ["S2", "B", "G", 366.75, 1]] });
    const s = await runReportBatch(t, { outDir: path.join(dir, "d1904"), pdf: false, xlsx: false });
    const rows = csv(s.index.csv).split("\r\n");
    expect(rows[1]!.split(",").slice(7, 9)).toEqual(["1904-01-01", "1904-01-01"]);
    expect(rows[2]!.split(",").slice(7, 9)).toEqual(["1905-01-01T18:00:00", "1905-01-01T18:00:00"]); // 1904 is a leap year
  });

  it("names that file systems refuse are made safe; the same folder in another case is one folder", async () => {
    const t = await template(path.join(dir, "odd.xlsx"), { rows: [["S1", "a/b", "Farm:1", 1, 1], ["S2", "A/B", "farm:1", 1, 1], ["S3", "con", "  ", 1, 1]] });
    const s = await runReportBatch(t, { outDir: path.join(dir, "odd"), pdf: false });
    expect(s.entries.map((e) => [e.group ?? null, e.xlsx])).toEqual([
      ["Farm:1", path.join("Farm_1", "a_b.xlsx")],
      ["farm:1", path.join("farm_1", "A_B (2).xlsx")],
      [null, "con_.xlsx"],
    ]);
  });
});

describe("warnings about what a values copy cannot keep", () => {
  it("a table on the report sheet: its part is not copied, its cells are; said once", async () => {
    const dir = tempDir("soilcell-batch-warn-");
    const file = await writeWorkbook(path.join(dir, "table.xlsx"), (wb) => {
      const d = wb.addWorksheet("Data");
      d.addRow(["ID"]);
      d.addRow(["S1"]);
      d.addRow(["S2"]);
      const r = wb.addWorksheet("Report");
      r.getCell("A1").value = "S1";
      r.addTable({ name: "Results", ref: "A3", columns: [{ name: "Key" }, { name: "Len" }], rows: [["x", 1]] });
      wb.definedNames.add("Report!$A$1", "Report_Key");
      wb.definedNames.add("Data!$A$2:$A$3", "Report_Keys");
    });
    const s = await runReportBatch(file, { outDir: path.join(dir, "out"), pdf: false });
    expect(s.warnings).toEqual(["the report sheet's table parts are not copied (a values copy has no tables or pivot tables); their cells are"]);
    const pkg = await openPackage(fs.readFileSync(path.join(dir, "out", "S1.xlsx")));
    expect(pkg.parts().filter((p) => /table/i.test(p))).toEqual([]);
    expect((await cellsOf(path.join(dir, "out", "S2.xlsx"), "Report")).A4).toBe("x");
  });

  it("a chart on the report sheet: copied as it is, its cached data the template's", async () => {
    const dir = tempDir("soilcell-batch-chart-");
    const base = await writeWorkbook(path.join(dir, "base.xlsx"), (wb) => {
      const d = wb.addWorksheet("Data");
      d.addRow(["ID"]);
      d.addRow(["S1"]);
      const r = wb.addWorksheet("Report");
      r.getCell("A1").value = "S1";
      wb.definedNames.add("Report!$A$1", "Report_Key");
      wb.definedNames.add("Data!$A$2", "Report_Keys");
    });
    const pkg = await openPackage(fs.readFileSync(base));
    const REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
    const sheet = pkg.sheets.find((x) => x.name === "Report")!.path;
    const rels = (body: string) => `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">${body}</Relationships>`;
    pkg.write(sheet.replace("worksheets/", "worksheets/_rels/") + ".rels", rels(`<Relationship Id="rIdD" Type="${REL}/drawing" Target="../drawings/drawing1.xml"/>`));
    pkg.write("xl/drawings/drawing1.xml", '<xdr:wsDr xmlns:xdr="http://schemas.openxmlformats.org/drawingml/2006/spreadsheetDrawing"/>');
    pkg.write("xl/drawings/_rels/drawing1.xml.rels", rels(`<Relationship Id="rId1" Type="${REL}/chart" Target="../charts/chart1.xml"/>`));
    pkg.write("xl/charts/chart1.xml", '<c:chartSpace xmlns:c="http://schemas.openxmlformats.org/drawingml/2006/chart"/>');
    const file = path.join(dir, "chart.xlsx");
    fs.writeFileSync(file, pkg.toBuffer());
    const s = await runReportBatch(file, { outDir: path.join(dir, "out"), pdf: false });
    expect(s.warnings).toEqual(["the report sheet holds a chart: it is copied as it is, and its cached data are the template's, not each report's"]);
    const out = await openPackage(fs.readFileSync(path.join(dir, "out", "S1.xlsx")));
    expect(out.text("xl/charts/chart1.xml")).toBe('<c:chartSpace xmlns:c="http://schemas.openxmlformats.org/drawingml/2006/chart"/>');
  });
});

describe("PDFs", () => {
  let dir: string;
  let file: string;
  let tools: OfficeTools;
  beforeAll(async () => {
    dir = tempDir("soilcell-batch-pdf-");
    file = await template(path.join(dir, "t.xlsx"));
    tools = fakeTools(path.join(dir, "bin"));
  });
  /** What the stand-in soffice does (a shell file it reads). */
  const config = (text: string) => fs.writeFileSync(path.join(dir, "bin", "config"), text);
  afterEach(() => fs.rmSync(path.join(dir, "bin", "config"), { force: true }));
  const run = (out: string, o: Partial<BatchOptions> = {}, lines: string[] = []) => runReportBatch(file, { outDir: path.join(dir, out), tools, progress: (l) => lines.push(l), ...o });
  /** What a stand-in PDF says it is. */
  const pdfOf = (s: { outDir: string }, rel: string) => fs.readFileSync(path.join(s.outDir, rel), "utf8");

  it("without LibreOffice or poppler: no PDF, the reason given, the workbooks written", async () => {
    const s = await run("no-office", { tools: {} });
    expect(s.pdf).toEqual({ written: 0, skipped: "LibreOffice is not installed (Debian: apt-get install libreoffice-calc), so no PDF was written; the workbooks are.", notes: [] });
    expect(s.reports).toBe(5);
    const p = await run("no-poppler", { tools: { soffice: tools.soffice, pdfinfo: tools.pdfinfo } });
    expect(p.pdf.skipped).toBe("poppler's pdfseparate, pdfunite not installed (Debian: apt-get install poppler-utils), so no PDF was written; the workbooks are.");
    const q = await run("no-poppler2", { tools: { soffice: tools.soffice, pdfseparate: tools.pdfseparate, pdfunite: tools.pdfunite } });
    expect(q.pdf.skipped).toBe("poppler's pdfinfo not installed (Debian: apt-get install poppler-utils), so no PDF was written; the workbooks are.");
  });

  it("no PDF step when no key gives a report", async () => {
    const s = await run("nothing", { keys: ["NOPE"], tools: {} });
    expect(s.pdf).toEqual({ written: 0, notes: [] });
  });

  it("combined: the reports as sheets of one workbook per run, split into pages, each page placed as its report's PDF, a PDF per group", async () => {
    const lines: string[] = [];
    const s = await run("combined", { jobs: 2 }, lines);
    expect(lines).toContain("converting 5 reports to PDF with LibreOffice (2 runs side by side)");
    expect(s.pdf).toEqual({ written: 5, engine: "LibreOffice 0.0.0.0 stand-in", mode: "combined", runs: 2, notes: ["Warning: a note from the stand-in", "Warning: a note from the stand-in"] });
    // Runs of 3 and 2 reports (sheets R1.. of reports-1 and reports-2), one page each.
    expect(s.entries.map((e) => [e.pdf, e.pages, pdfOf(s, e.pdf!)])).toEqual([
      [path.join("G1", "North.pdf"), 1, "page 1 of reports-1.pdf\n"],
      [path.join("G1", "South.pdf"), 1, "page 2 of reports-1.pdf\n"],
      [path.join("G2", "North.pdf"), 1, "page 3 of reports-1.pdf\n"],
      ["NORTH.pdf", 1, "page 1 of reports-2.pdf\n"],
      [path.join("G2", "Numbered.pdf"), 1, "page 2 of reports-2.pdf\n"],
    ]);
    expect(s.groupPdfs).toEqual(["G1.pdf", "G2.pdf"]);
    expect(pdfOf(s, "G1.pdf")).toBe("page 1 of reports-1.pdf\npage 2 of reports-1.pdf\n");
    expect(pdfOf(s, "G2.pdf")).toBe("page 3 of reports-1.pdf\npage 2 of reports-2.pdf\n");
    expect(s.reports).toBe(5);
    expect(csv(s.index.csv).split("\r\n")[1]).toBe(`S1,errors,G1,North,${path.join("G1", "North.xlsx")},${path.join("G1", "North.pdf")},1,2025-01-01,2025-01-01,FALSE,,"say ""hi""",1.5,0.05,#DIV/0!,1,Data!A2`);
    // The combined workbooks: the reports as sheets R1, R2, … (what the stand-in was given).
    expect(fs.readFileSync(path.join(dir, "bin", "log"), "utf8").trim().split("\n").slice(-2).sort()).toEqual(["reports-1.xlsx sheets 3", "reports-2.xlsx sheets 2"]);
  });

  it("one run, or as many as reports at most, and no more than 8", async () => {
    const one: string[] = [];
    const s = await run("one-run", { jobs: 1, xlsx: false, group: false }, one);
    expect(one).toContain("converting 5 reports to PDF with LibreOffice (1 run side by side)");
    expect(s.pdf.runs).toBe(1);
    expect(s.entries.map((e) => pdfOf(s, e.pdf!))).toEqual([1, 2, 3, 4, 5].map((i) => `page ${i} of reports-1.pdf\n`));
    expect(s.groupPdfs).toEqual([]); // no groups: no group PDFs
    expect(s.reports).toBe(5); // a PDF alone is a report written
    const many = await run("many-runs", { jobs: 20, xlsx: false });
    expect(many.pdf.runs).toBe(5);
    const zero = await run("zero-runs", { jobs: 0, xlsx: false });
    expect(zero.pdf.runs).toBe(1);
    // By default two runs side by side, one on a one-core machine.
    const byDefault = await run("default-runs", { xlsx: false });
    expect(byDefault.pdf.runs).toBe(os.cpus().length > 1 ? 2 : 1);
    const ten = await template(path.join(dir, "ten.xlsx"), { rows: Array.from({ length: 10 }, (_, i) => [`T${i}`, `N${i}`, "G", 1, 1]) });
    const lot = await runReportBatch(ten, { outDir: path.join(dir, "lot"), tools, xlsx: false, group: false, keys: [...Array.from({ length: 9 }, (_, i) => `T${i}`), "NOPE"], jobs: 12 });
    expect(lot.pdf.runs).toBe(8); // 9 reports (the key that selects nothing is not one), at most 8 runs
    expect(lot.entries.slice(0, 3).map((e) => pdfOf(lot, e.pdf!))).toEqual(["page 1 of reports-1.pdf\n", "page 2 of reports-1.pdf\n", "page 1 of reports-2.pdf\n"]); // runs of 2 reports, the last of 1
  });

  it("when pages do not come out one per report, each report's workbook is converted on its own", async () => {
    config("PER=2\n");
    const lines: string[] = [];
    const s = await run("fallback", { jobs: 1 }, lines);
    expect(lines).toContain("converting 5 report workbooks to PDF with LibreOffice");
    expect(s.pdf).toMatchObject({ written: 5, mode: "files", runs: 2 });
    expect(s.pdf.notes[0]).toBe("Warning: a note from the stand-in");
    expect(s.pdf.notes).toContain("the reports did not come out one page each; each report's workbook was converted on its own");
    expect(s.entries.map((e) => [e.pages, pdfOf(s, e.pdf!)])).toEqual([1, 2, 3, 4, 5].map((i) => [2, `report-${i}.pdf pages 2\n`]));
    expect(pdfOf(s, "G1.pdf")).toBe("report-1.pdf pages 2\nreport-2.pdf pages 2\n");
  });

  it("a report workbook LibreOffice wrote no PDF for is noted, the others placed", async () => {
    config("NOPDF=report-2\n");
    const s = await run("missing", { pdfMode: "files" });
    expect(s.pdf).toMatchObject({ written: 4, mode: "files", runs: 1 });
    expect(s.pdf.notes).toEqual(["Warning: a note from the stand-in", "LibreOffice wrote no PDF for S2"]);
    expect(s.entries.map((e) => e.pdf ?? null)).toEqual([path.join("G1", "North.pdf"), null, path.join("G2", "North.pdf"), "NORTH.pdf", path.join("G2", "Numbered.pdf")]);
    expect(pdfOf(s, "G1.pdf")).toBe("report-1.pdf pages 1\n"); // one file: copied
    expect(s.reports).toBe(5);
    // Each report's own workbook, clipped to the print area, was what LibreOffice got: one sheet each.
    expect(fs.readFileSync(path.join(dir, "bin", "log"), "utf8").trim().split("\n").slice(-5)).toEqual([1, 2, 3, 4, 5].map((i) => `report-${i}.xlsx sheets 1`));
  });

  it("a header that prints the sheet's name (&A) makes each report's workbook converted on its own", async () => {
    const t = await template(path.join(dir, "header.xlsx"), { header: "&LFarm report &A" });
    const s = await runReportBatch(t, { outDir: path.join(dir, "header"), tools, xlsx: false });
    expect(s.pdf).toMatchObject({ written: 5, mode: "files", runs: 1 });
    const c = await runReportBatch(t, { outDir: path.join(dir, "header-combined"), tools, xlsx: false, pdfMode: "combined", jobs: 1 });
    expect(c.pdf).toMatchObject({ written: 5, mode: "combined", runs: 1 });
  });
});

describe("report pieces", () => {
  it("safeFileName: separators and refused characters become _, spaces are one, dots and spaces at the ends go, at most 120 characters", () => {
    expect(safeFileName('a<b>c:d"e/f\\g|h?i*j')).toBe("a_b_c_d_e_f_g_h_i_j");
    expect(safeFileName("a\u001fb\u007fc")).toBe("a_b_c");
    expect(safeFileName("a \u00a0\u2003 b")).toBe("a b");
    expect(safeFileName("a\tb")).toBe("a_b"); // a tab is a control character
    expect(safeFileName(" .a. ")).toBe("a");
    expect(safeFileName("...")).toBe("report");
    expect(safeFileName("x".repeat(121))).toBe("x".repeat(120));
    expect(safeFileName("x".repeat(120))).toBe("x".repeat(120));
    expect(safeFileName(`${"x".repeat(119)} y`)).toBe("x".repeat(119)); // cut, then trimmed
    expect(safeFileName("Cafe\u0301")).toBe("Caf\u00e9"); // composed (NFC)
    for (const n of ["CON", "prn", "Aux", "NUL", "com1", "LPT9", "con.txt", "nul.tar.gz"]) expect(safeFileName(n)).toBe(`${n}_`);
    for (const n of ["com0", "lpt", "cons", "acon", "com10"]) expect(safeFileName(n)).toBe(n);
  });

  it("isDateFormat: d, m or y outside quotes, brackets and escapes; m with h or s, or with 0, is minutes or a number; elapsed time is not a date", () => {
    expect(isDateFormat("yyyy")).toBe(true);
    expect(isDateFormat("D")).toBe(true);
    expect(isDateFormat("mmm")).toBe(true);
    expect(isDateFormat("MM")).toBe(true);
    expect(isDateFormat("h:mm")).toBe(false);
    expect(isDateFormat("mm:ss")).toBe(false);
    expect(isDateFormat("H:MM")).toBe(false);
    expect(isDateFormat("0.0 m")).toBe(false);
    expect(isDateFormat('"day "0')).toBe(false);
    expect(isDateFormat("\\d0")).toBe(false);
    expect(isDateFormat("[Red]0.0")).toBe(false);
    expect(isDateFormat("[Blue]mmm")).toBe(true);
    expect(isDateFormat("General")).toBe(false);
    expect(isDateFormat("[h]:mm")).toBe(false);
    expect(isDateFormat("[mm]:ss")).toBe(false);
    expect(isDateFormat("[m]")).toBe(false);
    expect(isDateFormat("[hh]")).toBe(false);
  });
});

/**
 * Stand-ins for soffice, pdfinfo, pdfseparate and pdfunite, as POSIX shell scripts (fast to start):
 * a "PDF" is a text file. soffice writes for each workbook X.xlsx a file X.pdf, one line a page, a
 * page per sheet (times PER in the folder's config file), none for the workbook named NOPDF; it
 * logs each workbook's sheet count (the distinct xl/worksheets/sheetN.xml names in the zip).
 * pdfinfo reads "pages N" or counts lines; pdfseparate writes one file a line; pdfunite joins.
 */
function fakeTools(bin: string): OfficeTools {
  fs.mkdirSync(bin, { recursive: true });
  const scripts: Record<string, string> = {
    soffice: `d=$(dirname "$0")
PER=1; NOPDF=
[ -f "$d/config" ] && . "$d/config"
if [ "$1" = "--version" ]; then echo "LibreOffice 0.0.0.0 stand-in "; exit 0; fi
while [ "$1" != "--outdir" ]; do shift; done
out=$2; shift 2
for f in "$@"; do
  n=$(grep -ao 'xl/worksheets/sheet[0-9]*\\.xml' "$f" | sort -u | wc -l); n=$((n))
  base=$(basename "$f" .xlsx)
  echo "$base.xlsx sheets $n" >> "$d/log"
  echo "convert $f -> $base.pdf using filter : calc_pdf_Export"
  [ "$base" = "$NOPDF" ] && continue
  pages=$((n * PER))
  case $base in
    report-*) echo "$base.pdf pages $pages" > "$out/$base.pdf";;
    *) i=1; : > "$out/$base.pdf"; while [ $i -le $pages ]; do echo "page $i of $base.pdf" >> "$out/$base.pdf"; i=$((i+1)); done;;
  esac
done
echo "Warning: a note from the stand-in" >&2`,
    pdfinfo: `m=$(sed -n 's/.* pages \\([0-9]*\\)$/\\1/p' "$1")
[ -z "$m" ] && m=$(wc -l < "$1")
echo "Producer: stand-in"; echo "Pages:          $((m))"`,
    pdfseparate: `pre=\${2%%%d*}; post=\${2#*%d}; i=1
while IFS= read -r l; do printf '%s\\n' "$l" > "$pre$i$post"; i=$((i+1)); done < "$1"`,
    pdfunite: `for a in "$@"; do out=$a; done
i=1; for a in "$@"; do [ $i -lt $# ] && cat "$a"; i=$((i+1)); done > "$out.part"; mv "$out.part" "$out"`,
  };
  const t: Record<string, string> = {};
  for (const [n, body] of Object.entries(scripts)) {
    const p = path.join(bin, n);
    fs.writeFileSync(p, `#!/bin/sh\n${body}\n`, { mode: 0o755 });
    t[n] = p;
  }
  return t as OfficeTools;
}
