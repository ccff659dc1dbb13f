/**
 * Report templates (src/engine/report-template.ts), in process: every refusal of the convention
 * with its exact words (behaviour: the report template's documented refusals), how the key list
 * is read, the per-key values of Report_Found, Report_File, Report_Group and Report_Figures, the
 * figures' number formats (built-in formats of ECMA-376 Part 1, 18.8.30 numFmt, from memory), the
 * shared strings written inline with their runs (ECMA-376 Part 1, 18.4 shared strings and 18.3.1.53
 * is), the parts of the sheet that would point elsewhere left out, and the cells in error listed in
 * reading order. Workbooks are hand-written (tests/helpers/xlsx.ts); contents are invented.
 */
import fs from "fs";
import path from "path";
import { openPackage, WorkbookFileError } from "../../src/engine/xlsx-package";
import { ReportTemplateError, TemplateOptions, openReportTemplate } from "../../src/engine/report-template";
import { c, f, row, xlsxBytes, BookSpec, SheetSpec } from "../helpers/xlsx";
import { tempDir } from "../helpers/workbook";
import { isError } from "../../src/engine/formula/values";

const dir = tempDir("soilcell-template-");
let n = 0;

/** Writes a workbook (the spec, then parts replaced or added) and returns its path. */
async function book(spec: BookSpec, parts: Record<string, string> = {}): Promise<string> {
  let bytes = xlsxBytes(spec);
  if (Object.keys(parts).length) {
    const pkg = await openPackage(bytes);
    for (const [p, t] of Object.entries(parts)) pkg.write(p, t);
    bytes = pkg.toBuffer();
  }
  const file = path.join(dir, `t${++n}.xlsx`);
  fs.writeFileSync(file, bytes);
  return file;
}

const DATA: SheetSpec = { name: "Data", rows: row(1, c("A1", "ID")) + row(2, c("A2", "S1")) + row(3, c("A3", "S2")) + row(4, c("A4", 101)) };
const REPORT: SheetSpec = { name: "Report", rows: row(1, c("A1", "Sample"), c("B1", "S1")) + row(2, f("B2", 'B1&"!"', "S1!")) };
const KEY = { name: "Report_Key", text: "Report!$B$1" };
const KEYS = { name: "Report_Keys", text: "Data!$A$2:$A$4" };

const open = async (spec: BookSpec, o: TemplateOptions = {}, parts: Record<string, string> = {}) => openReportTemplate(await book(spec, parts), o);
const refusal = async (spec: BookSpec, o: TemplateOptions, parts: Record<string, string> = {}) => {
  const file = await book(spec, parts);
  try {
    await openReportTemplate(file, o);
  } catch (e) {
    return { kind: (e as Error).name, message: (e as Error).message };
  }
  return { kind: "none", message: "" };
};
const tpl = (message: string) => ({ kind: "ReportTemplateError", message });

describe("the template file", () => {
  it("a folder, or a file that is not there, is refused as a workbook file error", async () => {
    await expect(openReportTemplate(dir)).rejects.toThrow(new WorkbookFileError(`${dir} is not a regular file; give a workbook file`));
    await expect(openReportTemplate(dir)).rejects.toBeInstanceOf(WorkbookFileError);
    const missing = path.join(dir, "missing.xlsx");
    await expect(openReportTemplate(missing)).rejects.toThrow(new WorkbookFileError(`cannot read ${missing}: ENOENT`));
  });
});

describe("the key cell and the report sheet", () => {
  const two = { sheets: [DATA, REPORT], names: [KEYS] };

  it.each([
    [{ keyCell: "B1+1" }, "the key cell must refer to cells (e.g. 'Client report'!$C$4), not a formula or a list of areas"],
    [{ keyCell: "B1" }, "the key cell needs a sheet name (e.g. 'Client report'!C4)"],
    [{ keyCell: "Nope!B1" }, 'the key cell refers to a sheet "Nope" that the workbook does not have'],
    [{ keyCell: "Report!B1:B2" }, "the key cell must be one cell; Report!B1:B2 is a range"],
    [{ keyCell: "Report!B1:C1" }, "the key cell must be one cell; Report!B1:C1 is a range"],
    [{ sheet: "Nope" }, 'the workbook has no sheet "Nope"; its sheets are "Data", "Report"'],
    [{ sheet: "Report", keyCell: "Data!A1" }, 'the key cell Data!A1 is not on the report sheet "Report"'],
    [{ sheet: "Report" }, 'sheet "Report" has no Report_Key name; define one on its key cell (Formulas > Define Name) or give --key-cell'],
    [{}, "the workbook has no Report_Key name: name the cell where a key is typed Report_Key (Formulas > Define Name), or give --key-cell"],
    [{ keyCell: "Report!C1" }, "the key cell Report!C1 is empty: type one key in it (the example the template shows)"],
    [{ keyCell: "Report!B2" }, "the key cell Report!B2 holds a formula; a key is typed, so it must hold a value"],
  ])("%j: %s", async (o, message) => {
    expect(await refusal(two, o)).toEqual(tpl(message));
  });

  it("a key cell that is not a reference at all says so, with the parser's words", async () => {
    expect(await refusal({ sheets: [DATA, REPORT] }, { keyCell: "Report!B1" })).toEqual(tpl("no keys: name the cells that list them Report_Keys, or give --keys-from or --keys"));
    const r = await refusal(two, { keyCell: "Report!B1)" });
    expect(r.kind).toBe("ReportTemplateError");
    expect(r.message).toMatch(/^the key cell "Report!B1\)" is not a cell reference \(.+\)$/);
  });

  it("--key-cell with or without =, with --sheet for a reference without one; the key cell's name", async () => {
    expect((await open(two, { keyCell: "=Report!$B$1" })).keyCell).toBe("Report!B1");
    const t = await open(two, { sheet: "Report", keyCell: "B1" });
    expect([t.sheet.name, t.keyCell, t.names.key]).toEqual(["Report", "Report!B1", "Report!B1"]);
    expect((await open(two, { sheet: "report", keyCell: "B1" })).sheet.name).toBe("Report"); // sheet names in any case
  });

  it("Report_Key: its name in any case, scoped to the workbook or a sheet", async () => {
    expect((await open({ sheets: [DATA, REPORT], names: [{ name: "report_KEY", text: "Report!$B$1" }, KEYS] })).keyCell).toBe("Report!B1");
    expect((await open({ sheets: [DATA, REPORT], names: [{ name: "Report_Key", text: "$B$1", localSheetId: 1 }, KEYS] })).keyCell).toBe("Report!B1");
  });

  it("Report_Key refusals: not cells, no sheet, on another sheet than --sheet, on several sheets", async () => {
    expect(await refusal({ sheets: [DATA, REPORT], names: [{ name: "Report_Key", text: "Report!$B$1*2" }, KEYS] }, {})).toEqual(tpl("Report_Key must refer to cells (e.g. 'Client report'!$C$4), not a formula or a list of areas"));
    expect(await refusal({ sheets: [DATA, REPORT], names: [{ name: "Report_Key", text: "$B$1" }, KEYS] }, {})).toEqual(tpl("Report_Key needs a sheet name (e.g. 'Client report'!C4)"));
    expect(await refusal({ sheets: [DATA, REPORT], names: [KEY, KEYS] }, { sheet: "Data" })).toEqual(tpl('Report_Key refers to "Report", not to the report sheet "Data"'));
    const several = { sheets: [DATA, REPORT], names: [{ name: "Report_Key", text: "Data!$A$1", localSheetId: 0 }, { name: "Report_Key", text: "Report!$B$1", localSheetId: 1 }, KEYS] };
    expect(await refusal(several, {})).toEqual(tpl('the workbook has Report_Key on several sheets ("Data", "Report"); choose one with --sheet'));
    const t = await open(several, { sheet: "Report" });
    expect(t.keyCell).toBe("Report!B1");
    // Two names on one sheet (one scoped, one not): one sheet, the first name's cell.
    const same = { sheets: [DATA, REPORT], names: [{ name: "Report_Key", text: "Report!$B$1" }, { name: "Report_Key", text: "Report!$B$1", localSheetId: 1 }, KEYS] };
    expect((await open(same)).keyCell).toBe("Report!B1");
  });

  it("a key cell on a chart sheet is refused: it is not a worksheet", async () => {
    const spec = { sheets: [DATA, REPORT, { name: "Chart1", rows: "" }], names: [KEYS] };
    const parts = {
      "xl/_rels/workbook.xml.rels":
        '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet2.xml"/><Relationship Id="rId3" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/chartsheet" Target="worksheets/sheet3.xml"/></Relationships>',
      "xl/worksheets/sheet3.xml": '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<chartsheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"/>',
    };
    expect(await refusal(spec, { keyCell: "Chart1!A1" }, parts)).toEqual(tpl('the key cell is on "Chart1", which is not a worksheet'));
  });
});

describe("the key list", () => {
  it("reads ranges in rows then columns, skips blanks, lists logical values and errors where they stand", async () => {
    const data: SheetSpec = {
      name: "Data",
      rows: row(1, c("A1", "K1"), c("B1", "K2")) + row(2, c("A2", true), c("B2", "")) + row(3, `<c r="A3" t="e"><v>#REF!</v></c>`, c("B3", false)) + row(4, c("B4", "K3")),
    };
    const t = await open({ sheets: [data, REPORT], names: [KEY, { name: "Report_Keys", text: "Data!$A$1:$B$4" }] });
    expect(t.keys).toEqual([
      { key: "K1", from: "Data!A1" },
      { key: "K2", from: "Data!B1" },
      { key: "K3", from: "Data!B4" },
    ]);
    expect(t.keyProblems).toEqual([
      { key: "TRUE", from: "Data!A2", reason: "the key list holds a logical value, not a key", before: 2 },
      { key: "#REF!", from: "Data!A3", reason: "the key list holds the error #REF!", before: 2 },
      { key: "FALSE", from: "Data!B3", reason: "the key list holds a logical value, not a key", before: 2 },
    ]);
    expect(t.names.keys).toBe("Data!A1:B4");
  });

  it("--keys-from: several ranges, in order, named in the summary; a range written upside down is read top to bottom", async () => {
    const t = await open({ sheets: [DATA, REPORT], names: [KEY] }, { keysFrom: ["Data!A4", "Data!$A$3:$A$2"] });
    expect(t.keys.map((k) => k.key)).toEqual([101, "S1", "S2"]);
    expect(t.names.keys).toBe("Data!A4, Data!A2:A3");
    expect(await refusal({ sheets: [DATA, REPORT], names: [KEY] }, { keysFrom: ["A2:A3"] })).toEqual({ kind: "none", message: "" }); // on the report sheet
    expect(await refusal({ sheets: [DATA, REPORT], names: [KEY] }, { keysFrom: ["SUM(A2:A3)"] })).toEqual(tpl("--keys-from must refer to cells (e.g. 'Client report'!$C$4), not a formula or a list of areas"));
  });

  it("an empty --keys-from is no override: Report_Keys is read", async () => {
    const t = await open({ sheets: [DATA, REPORT], names: [KEY, KEYS] }, { keysFrom: [] });
    expect(t.keys.map((k) => k.key)).toEqual(["S1", "S2", 101]);
  });

  it("a typed key that matches only an error in the list is not in the list", async () => {
    const data: SheetSpec = { name: "Data", rows: row(1, c("A1", "S1")) + row(2, `<c r="A2" t="e"><v>#N/A</v></c>`) };
    const t = await open({ sheets: [data, REPORT], names: [KEY, { name: "Report_Keys", text: "Data!$A$1:$A$2" }] }, { keys: ["#N/A", "S1"] });
    expect(t.keys).toEqual([{ key: "S1", from: "--keys" }]);
    expect(t.keyProblems).toEqual([{ key: "#N/A", from: "--keys", reason: "not in the key list (Data!A1:A2), and the template names no Report_Found cell to look it up", before: 0, notFound: true }]);
  });

  it("Report_Keys scoped to the workbook without a sheet is on the report sheet", async () => {
    const report: SheetSpec = { name: "Report", rows: row(1, c("A1", "Sample"), c("B1", "S1")) + row(5, c("A5", "R1")) + row(6, c("A6", "R2")) };
    const t = await open({ sheets: [DATA, report], names: [KEY, { name: "Report_Keys", text: "$A$5:$A$6" }] });
    expect(t.keys.map((k) => [k.key, k.from])).toEqual([
      ["R1", "Report!A5"],
      ["R2", "Report!A6"],
    ]);
  });

  it("typed keys: numbers where the list holds that number, text otherwise (blank text stays text)", async () => {
    const data: SheetSpec = { name: "Data", rows: row(1, c("A1", 101)) + row(2, c("A2", 0)) + row(3, c("A3", "S1")) };
    const t = await open({ sheets: [data, REPORT], names: [KEY, { name: "Report_Keys", text: "Data!$A$1:$A$3" }, { name: "Report_Found", text: "Report!$B$2" }] }, { keys: ["101", "S1", " ", "0", "7"] });
    expect(t.keys).toEqual([
      { key: 101, from: "--keys" },
      { key: "S1", from: "--keys" },
      { key: " ", from: "--keys" },
      { key: 0, from: "--keys" },
      { key: "7", from: "--keys" }, // not in the list: text (and the found cell decides)
    ]);
    expect(t.keyProblems).toEqual([]);
  });

  it("duplicates: text in any case is one key; a number and its text are two", async () => {
    const data: SheetSpec = { name: "Data", rows: row(1, c("A1", 101)) + row(2, c("A2", "101")) + row(3, c("A3", "ab")) + row(4, c("A4", "AB")) + row(5, c("A5", 101)) };
    const t = await open({ sheets: [data, REPORT], names: [KEY, { name: "Report_Keys", text: "Data!$A$1:$A$5" }] });
    expect(t.keys.map((k) => k.key)).toEqual([101, "101", "ab"]);
    expect(t.keyProblems).toEqual([
      { key: "AB", from: "Data!A4", reason: "the same key as Data!A3: reported once", before: 3 },
      { key: "101", from: "Data!A5", reason: "the same key as Data!A1: reported once", before: 3 },
    ]);
  });

  it("typed keys with a list and a found cell: a key outside the list is still a key", async () => {
    const t = await open({ sheets: [DATA, REPORT], names: [KEY, KEYS, { name: "Report_Found", text: "Report!$B$2" }] }, { keys: ["ZZ"] });
    expect(t.keys).toEqual([{ key: "ZZ", from: "--keys" }]);
    expect(t.keyProblems).toEqual([]);
    // Without a list, typed keys are taken as they are.
    const bare = await open({ sheets: [DATA, REPORT], names: [KEY] }, { keys: ["ZZ", "zz"] });
    expect(bare.keys).toEqual([{ key: "ZZ", from: "--keys" }]);
    expect(bare.keyProblems).toEqual([{ key: "zz", from: "--keys", reason: "the same key as --keys: reported once", before: 1 }]);
  });

  it("without a list, several ranges name every range in the reason of a key not in them", async () => {
    const t = await open({ sheets: [DATA, REPORT], names: [KEY] }, { keysFrom: ["Data!A2", "Data!A3:A4"], keys: ["Q"] });
    expect(t.keyProblems).toEqual([{ key: "Q", from: "--keys", reason: "not in the key list (Data!A2, Data!A3:A4), and the template names no Report_Found cell to look it up", before: 0, notFound: true }]);
  });
});

describe("the other names", () => {
  const report: SheetSpec = {
    name: "Report",
    rows:
      row(1, c("A1", "Sample"), c("B1", "S1"), c("D1", "Ca"), f("E1", "LEN(B1)*2", 4)) +
      row(2, f("B2", 'IF(B1="S1",TRUE,IF(B1="S2",1,IF(B1="Z0",0,IF(B1="ZT","TRUE",IF(B1="ZE",1/0,IF(B1="ZN",-1,FALSE))))))', "TRUE"), c("D2", ""), f("E2", "7", 7)) +
      row(3, f("B3", 'IF(B1="S1","  North  ",IF(B1="S2",12,IF(B1="ZT",TRUE,IF(B1="ZE",1/0,IF(B1="ZF",FALSE,"")))))', "x"), c("D3", 5), f("E3", "1/0")) +
      row(4, f("B4", 'IF(B1="S1"," ",IF(B1="S2","G2",""))', ""), c("D4", "Empty")),
  };
  const names = [KEY, KEYS, { name: "Report_Found", text: "Report!$B$2" }, { name: "Report_File", text: "Report!$B$3" }, { name: "Report_Group", text: "Report!$B$4" }, { name: "Report_Figures", text: "Report!$D$1:$E$4" }];

  it("Report_Found is TRUE or a number other than 0; FALSE, 0, text, blank and errors say not found", async () => {
    const t = await open({ sheets: [DATA, report], names });
    const found = (k: string) => t.report(k).found;
    expect(["S1", "S2", "ZN", "Z0", "ZT", "ZE", "other"].map(found)).toEqual([true, true, true, false, false, false, false]);
    expect(t.names).toEqual({ key: "Report!B1", keys: "Data!A2:A4", found: "Report!B2", file: "Report!B3", group: "Report!B4", figures: "Report!D1:E4" });
  });

  it("Report_File and Report_Group: text trimmed, numbers and logical values as text; blank, spaces or an error fall back to the key (no group)", async () => {
    const t = await open({ sheets: [DATA, report], names });
    const r = (k: string) => [t.report(k).name, t.report(k).group];
    expect(r("S1")).toEqual(["North", undefined]);
    expect(r("S2")).toEqual(["12", "G2"]);
    expect(r("ZT")).toEqual(["TRUE", undefined]);
    expect(r("ZF")).toEqual(["FALSE", undefined]);
    expect(r("ZE")).toEqual(["ZE", undefined]);
    expect(r("Q")).toEqual(["Q", undefined]);
  });

  it("Report_Figures: a row per label (blank labels skipped, a number label as text), errors copied, a missing value cell General", async () => {
    const t = await open({ sheets: [DATA, report], names });
    const figs = t.report("S22").figures;
    expect(figs.map((x) => [x.label, isError(x.value) ? x.value.code : x.value, x.format])).toEqual([
      ["Ca", 6, "General"],
      ["5", "#DIV/0!", "General"],
      ["Empty", null, "General"],
    ]);
  });

  it("Report_Figures must be two columns wide", async () => {
    for (const [text, shown] of [["Report!$D$1:$F$2", "Report!D1:F2"], ["Report!$D$1:$D$2", "Report!D1:D2"]]) {
      expect(await refusal({ sheets: [DATA, report], names: [KEY, KEYS, { name: "Report_Figures", text: text! }] }, {})).toEqual(tpl(`Report_Figures must be two columns wide (label, value); ${shown} is not`));
    }
  });

  it("--found-cell, --file-cell, --group-cell stand in for the names, on the report sheet or with a sheet", async () => {
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS] }, { foundCell: "B2", fileCell: "Report!B3", groupCell: "$B$4" });
    expect(t.names).toEqual({ key: "Report!B1", keys: "Data!A2:A4", found: "Report!B2", file: "Report!B3", group: "Report!B4" });
    expect([t.report("S2").found, t.report("S2").name, t.report("S2").group]).toEqual([true, "12", "G2"]);
    expect(await refusal({ sheets: [DATA, report], names: [KEY, KEYS] }, { groupCell: "B4&B3" })).toEqual(tpl("the group cell must refer to cells (e.g. 'Client report'!$C$4), not a formula or a list of areas"));
    expect(await refusal({ sheets: [DATA, report], names: [KEY, KEYS] }, { fileCell: "X!B3" })).toEqual(tpl('the file-name cell refers to a sheet "X" that the workbook does not have'));
    expect(await refusal({ sheets: [DATA, report], names: [KEY, KEYS] }, { foundCell: "B2:" })).toMatchObject({ kind: "ReportTemplateError", message: expect.stringMatching(/^the found cell "B2:" is not a cell reference \(/) });
  });

  it("names scoped to the workbook without a sheet are on the report sheet", async () => {
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS, { name: "Report_Found", text: "$B$2" }, { name: "Report_File", text: "$B$3" }] });
    expect([t.names.found, t.names.file]).toEqual(["Report!B2", "Report!B3"]);
  });

  it("without the optional names: found undefined, the key as the name, no group, no figures", async () => {
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS] });
    const r = t.report(101);
    expect([r.found, r.name, r.group, r.figures]).toEqual([undefined, "101", undefined, []]);
    expect(t.names).toEqual({ key: "Report!B1", keys: "Data!A2:A4" });
  });
});

const MAIN = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
const RELS = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
const HEAD = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n';
/** The workbook's relationships with styles and shared strings added (sheets as xlsxBytes writes them). */
const wbRels = (sheets: number, extra: string) =>
  `${HEAD}<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">${Array.from({ length: sheets }, (_, i) => `<Relationship Id="rId${i + 1}" Type="${RELS}/worksheet" Target="worksheets/sheet${i + 1}.xml"/>`).join("")}${extra}</Relationships>`;
const STYLES_REL = `<Relationship Id="rIdSt" Type="${RELS}/styles" Target="styles.xml"/>`;
const SST_REL = `<Relationship Id="rIdSs" Type="${RELS}/sharedStrings" Target="sharedStrings.xml"/>`;
/** The cells of a report sheet's XML (between <sheetData> and </sheetData>), and what follows them. */
const dataOf = (xml: string) => /<sheetData>([\s\S]*)<\/sheetData>/.exec(xml)![1];
const tailOf = (xml: string) => xml.slice(xml.indexOf("</sheetData>") + "</sheetData>".length);

describe("figures' number formats, from the template's styles", () => {
  // cellXfs: 0 General, 1 custom 164, 2 built-in 14 (with a child element), 3 no numFmtId, 4 an id
  // with no built-in format (37 is not in the list kept), 5 a custom format without its code, 6 built-in 2.
  const styles =
    `${HEAD}<styleSheet xmlns="${MAIN}"><numFmts count="2"><numFmt numFmtId="164" formatCode="0.0 &quot;t/ha&quot;"/><numFmt numFmtId="165"/></numFmts>` +
    '<cellXfs count="7"><xf numFmtId="0"/><xf numFmtId="164"/><xf numFmtId="14" applyNumberFormat="1"><alignment horizontal="left"/></xf><xf/><xf numFmtId="37"/><xf numFmtId="165"/><xf numFmtId="2"/></cellXfs>' +
    '<cellStyleXfs count="1"><xf numFmtId="10"/></cellStyleXfs></styleSheet>';
  const labels = ["General", "custom", "built-in 14", "none", "37", "no code", "built-in 2", "past the list"];
  const report: SheetSpec = {
    name: "Report",
    rows: row(1, c("A1", "Sample"), c("B1", "S1")) + labels.map((l, i) => row(i + 2, c(`D${i + 2}`, l), `<c r="E${i + 2}" s="${i}"><f>LEN(B1)+${i}</f><v>0</v></c>`)).join(""),
  };
  const names = [KEY, KEYS, { name: "Report_Figures", text: `Report!$D$2:$E$${labels.length + 1}` }];

  it("each figure has its value cell's format code; General when the style has none or is not known", async () => {
    const t = await open({ sheets: [DATA, report], names }, {}, { "xl/styles.xml": styles, "xl/_rels/workbook.xml.rels": wbRels(2, STYLES_REL) });
    expect(t.report("S1").figures.map((x) => [x.label, x.value, x.format])).toEqual([
      ["General", 2, "General"],
      ["custom", 3, '0.0 "t/ha"'],
      ["built-in 14", 4, "m/d/yyyy"],
      ["none", 5, "General"],
      ["37", 6, "General"],
      ["no code", 7, "General"],
      ["built-in 2", 8, "0.00"],
      ["past the list", 9, "General"], // style 7: the cell styles' xf after cellXfs is not a cell format
    ]);
  });

  it("without a styles part every figure is General; a self-closing cellXfs holds no formats", async () => {
    const none = await open({ sheets: [DATA, report], names });
    expect(new Set(none.report("S1").figures.map((x) => x.format))).toEqual(new Set(["General"]));
    const empty = `${HEAD}<styleSheet xmlns="${MAIN}"><cellXfs count="0"/><cellStyleXfs count="1"><xf numFmtId="2"/></cellStyleXfs></styleSheet>`;
    const t = await open({ sheets: [DATA, report], names }, {}, { "xl/styles.xml": empty, "xl/_rels/workbook.xml.rels": wbRels(2, STYLES_REL) });
    expect(new Set(t.report("S1").figures.map((x) => x.format))).toEqual(new Set(["General"]));
  });

  it.each([
    [1, "0"],
    [3, "#,##0"],
    [4, "#,##0.00"],
    [9, "0%"],
    [10, "0.00%"],
    [11, "0.00E+00"],
    [15, "d-mmm-yy"],
    [16, "d-mmm"],
    [17, "mmm-yy"],
    [22, "m/d/yyyy h:mm"],
    [49, "@"],
  ])("built-in format %d is %s", async (id, code) => {
    const st = `${HEAD}<styleSheet xmlns="${MAIN}"><cellXfs count="2"><xf/><xf numFmtId="${id}"/></cellXfs></styleSheet>`;
    const r: SheetSpec = { name: "Report", rows: row(1, c("A1", "Sample"), c("B1", "S1"), c("D1", "x"), `<c r="E1" s="1"><v>1</v></c>`) };
    const t = await open({ sheets: [DATA, r], names: [KEY, KEYS, { name: "Report_Figures", text: "Report!$D$1:$E$1" }] }, {}, { "xl/styles.xml": st, "xl/_rels/workbook.xml.rels": wbRels(2, STYLES_REL) });
    expect(t.report("S1").figures[0]!.format).toBe(code);
  });
});

describe("the report sheet's text and its other parts", () => {
  const sst = `${HEAD}<sst xmlns="${MAIN}" count="3" uniqueCount="3"><si><t>Plain</t></si><si/><si><r><rPr><b/></rPr><t>Bold</t></r><r><t xml:space="preserve"> tail</t></r></si></sst>`;

  it("shared strings become inline strings with their runs: no shared-strings part is needed", async () => {
    const report: SheetSpec = {
      name: "Report",
      rows: row(1, c("A1", "Sample"), c("B1", "S1")) + row(2, `<c r="A2" t="s"><v>0</v></c>`, `<c r="B2" t="s"><v>2</v></c>`, `<c r="C2" t="s"/>`, `<c r="D2" t="s"><v> 1 </v></c>`, `<c r="E2" s="0"><v>5</v></c>`),
    };
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS] }, {}, { "xl/sharedStrings.xml": sst, "xl/_rels/workbook.xml.rels": wbRels(2, SST_REL) });
    expect(dataOf(t.report("S2").sheetXml)).toBe(
      '<row r="1"><c r="A1" t="inlineStr"><is><t>Sample</t></is></c><c r="B1" t="inlineStr"><is><t xml:space="preserve">S2</t></is></c></row>' +
        '<row r="2"><c r="A2" t="inlineStr"><is><t>Plain</t></is></c><c r="B2" t="inlineStr"><is><r><rPr><b/></rPr><t>Bold</t></r><r><t xml:space="preserve"> tail</t></r></is></c><c r="C2" t="s"/><c r="D2" t="inlineStr"><is></is></c><c r="E2" s="0"><v>5</v></c></row>',
    );
  });

  it("leaves out what points at other sheets or needs workbook parts: validations, tables, conditional formats and links to another sheet, extensions that name one", async () => {
    const after =
      "<headerFooter><oddHeader>&amp;A</oddHeader></headerFooter>" +
      '<conditionalFormatting sqref="B1"><cfRule type="expression" priority="1"><formula>Data!$A$1="x"</formula></cfRule></conditionalFormatting>' +
      '<conditionalFormatting sqref="B2" pivot="0" xr:uid="Data!A1"><cfRule type="expression" priority="2"><formula>$B$2&gt;1</formula></cfRule></conditionalFormatting>' +
      '<conditionalFormatting sqref="A1"/>' +
      '<dataValidations count="1"><dataValidation type="list" sqref="B1"><formula1>$A$1:$A$2</formula1></dataValidation></dataValidations>' +
      '<dataValidations count="0"/>' +
      '<hyperlinks><hyperlink ref="A1" location="Data!A1" display="Data"/></hyperlinks>' +
      '<hyperlinks><hyperlink ref="A2" display="Go!"/></hyperlinks>' +
      "<hyperlinks/>" +
      '<pageMargins left="0.7" right="0.7" top="0.75" bottom="0.75" header="0.3" footer="0.3"/>' +
      '<tableParts count="0"/>' +
      '<tableParts count="1"><tablePart r:id="rId7"/></tableParts>' +
      '<extLst><ext uri="{A}"><x14:dataValidations count="1"/></ext></extLst>' +
      '<extLst><ext uri="{B}"><xm:f>Data!A1</xm:f></ext></extLst>' +
      '<extLst><ext uri="{C}" xmlns:xm="x!y"><xm:f>B1:B2</xm:f></ext></extLst>' +
      "<extLst/>";
    const report: SheetSpec = { name: "Report", rows: row(1, c("A1", "Sample"), c("B1", "S1")) + row(2, f("B2", 'B1&"!"', "S1!")), after };
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS] });
    expect(tailOf(t.report("S2").sheetXml)).toBe(
      "<headerFooter><oddHeader>&amp;A</oddHeader></headerFooter>" +
        '<conditionalFormatting sqref="B2" pivot="0" xr:uid="Data!A1"><cfRule type="expression" priority="2"><formula>$B$2&gt;1</formula></cfRule></conditionalFormatting>' +
        '<conditionalFormatting sqref="A1"/>' +
        '<hyperlinks><hyperlink ref="A2" display="Go!"/></hyperlinks>' +
        "<hyperlinks/>" +
        '<pageMargins left="0.7" right="0.7" top="0.75" bottom="0.75" header="0.3" footer="0.3"/>' +
        '<extLst><ext uri="{C}" xmlns:xm="x!y"><xm:f>B1:B2</xm:f></ext></extLst>' +
        "<extLst/>" +
        "</worksheet>",
    );
    // What comes before the cells is cut the same way.
    const before = { name: "Report", rows: report.rows };
    const t2 = await open({ sheets: [DATA, before], names: [KEY, KEYS] });
    expect(t2.report("S2").sheetXml).toBe(`${HEAD}<worksheet xmlns="${MAIN}" xmlns:r="${RELS}"><sheetData>${dataOf(t2.report("S2").sheetXml)}</sheetData></worksheet>`);
  });
});

describe("cells in error, listed in reading order", () => {
  it("computed errors with the engine's message; cached errors (constants, formulas not computed again) with the template's or 'cached in the template'", async () => {
    const report: SheetSpec = {
      name: "Report",
      rows:
        row(1, c("A1", "Sample"), c("B1", "S1"), `<c r="AA1" t="e"><v>#N/A</v></c>`) +
        row(2, f("B2", "1/0"), f("C2", 'IF(B1="S2",1/0,1)', 1), `<c r="D2" t="e"><f>NA()</f><v>#N/A</v></c>`) +
        row(9, f("B9", 'IF(B1="S2",NA(),1)', 1)) +
        row(10, f("B10", 'IF(B1="S2",SQRT(-1),1)', 1), f("C10", 'IF(B1="S2",1/0,1)', 1), f("AB10", 'IF(B1="S2",1/0,1)', 1)),
    };
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS] });
    expect(t.report("S2").errors.map((e) => [e.cell, e.error, e.formula, e.message])).toEqual([
      ["AA1", "#N/A", "", "cached in the template"],
      ["B2", "#DIV/0!", "=1/0", "division by zero"],
      ["C2", "#DIV/0!", '=IF(B1="S2",1/0,1)', "division by zero"],
      ["D2", "#N/A", "=NA()", "cached in the template"],
      ["B9", "#N/A", '=IF(B1="S2",NA(),1)', expect.any(String)],
      ["B10", "#NUM!", '=IF(B1="S2",SQRT(-1),1)', expect.any(String)],
      ["C10", "#DIV/0!", '=IF(B1="S2",1/0,1)', "division by zero"],
      ["AB10", "#DIV/0!", '=IF(B1="S2",1/0,1)', "division by zero"],
    ]);
    expect(t.report("S2").errors[0]!.sheet).toBe("Report");
    expect(t.report("S1").errors.map((e) => e.cell)).toEqual(["AA1", "B2", "D2"]);
  });

  it("a formula longer than 200 characters, a message longer than 300, are cut with their length", async () => {
    const long = "x".repeat(350);
    const report: SheetSpec = { name: "Report", rows: row(1, c("A1", "Sample"), c("B1", "S1")) + row(2, f("B2", `IF(B1="S2",SOIL.CMOL("${long}","Ca"),1)`.replace("SOIL.CMOL", "_xldudf_SOIL_CMOL"), 1)) + row(3, f("B3", `IF(B1="S2",SOIL.CMOL("${"y".repeat(150)}","Ca"),1)`.replace("SOIL.CMOL", "_xldudf_SOIL_CMOL"), 1)) };
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS] });
    const [e2, e3] = t.report("S2").errors;
    const typed = `=IF(B1="S2",SOIL.CMOL("${long}","Ca"),1)`;
    expect(e2!.formula).toBe(`${typed.slice(0, 200)}… (${typed.length} characters)`);
    const message = `mg_per_kg: "${long}" is not a number`; // SOIL.CMOL's refusal (behaviour)
    expect(e2!.message).toBe(`${message.slice(0, 300)}… (${message.length} characters)`);
    const typed3 = `=IF(B1="S2",SOIL.CMOL("${"y".repeat(150)}","Ca"),1)`;
    expect(typed3.length).toBeLessThanOrEqual(200);
    expect(e3!.formula).toBe(typed3); // 200 or fewer: whole
  });
});

describe("cut lengths at their limits", () => {
  it("a formula of 200 characters is whole, of 201 cut; a message of 300 characters whole, of 301 cut", async () => {
    const cell = (ref: string, n: number) => f(ref, `IF(B1="S2",_xldudf_SOIL_CMOL("${"y".repeat(n)}","Ca"),1)`, 1);
    const report: SheetSpec = { name: "Report", rows: row(1, c("A1", "Sample"), c("B1", "S1")) + row(2, cell("B2", 167), cell("C2", 168), cell("D2", 271), cell("E2", 272)) };
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS] });
    const [b2, c2, d2, e2] = t.report("S2").errors;
    const typed = (n: number) => `=IF(B1="S2",SOIL.CMOL("${"y".repeat(n)}","Ca"),1)`;
    expect(typed(167).length).toBe(200);
    expect(b2!.formula).toBe(typed(167));
    expect(c2!.formula).toBe(`${typed(168).slice(0, 200)}… (201 characters)`);
    const message = (n: number) => `mg_per_kg: "${"y".repeat(n)}" is not a number`; // SOIL.CMOL's refusal (behaviour)
    expect(message(271).length).toBe(300);
    expect(d2!.message).toBe(message(271));
    expect(e2!.message).toBe(`${message(272).slice(0, 300)}… (301 characters)`);
  });
});

describe("spills computed for a key", () => {
  it("writes the spill's cells, clears what the template's spill covered beyond it, keeps another spill's values over a stale clear, lists errors inside it", async () => {
    const report: SheetSpec = {
      name: "Report",
      rows:
        row(1, c("A1", "Sample"), c("B1", "S1"), `<c r="C1" cm="1"><f t="array" ref="C1:D4">IF(B1="S1",{1;2;3},1/{1;0;2})</f><v>1</v></c>`) +
        row(2, `<c r="B2" cm="1"><f t="array" ref="B2:C3">B1&amp;"!"</f><v>0</v></c>`, `<c r="C2" t="e"><v>#N/A</v></c>`) +
        row(3, c("C3", 3)),
    };
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS], dynamic: true });
    expect(dataOf(t.report("S1").sheetXml)).toBe(
      '<row r="1"><c r="A1" t="inlineStr"><is><t>Sample</t></is></c><c r="B1" t="inlineStr"><is><t xml:space="preserve">S1</t></is></c><c r="C1"><v>1</v></c><c r="D1"/></row>' +
        '<row r="2"><c r="B2" t="inlineStr"><is><t xml:space="preserve">S1!</t></is></c><c r="C2"><v>2</v></c><c r="D2"/></row>' +
        '<row r="3"><c r="B3"/><c r="C3"><v>3</v></c><c r="D3"/></row><row r="4"><c r="C4"/><c r="D4"/></row>',
    );
    expect(t.report("S1").errors).toEqual([]); // the stale #N/A in C2 is the spill's now
    const s2 = t.report("S2");
    expect(dataOf(s2.sheetXml)).toContain('<c r="C2" t="e"><v>#DIV/0!</v></c>');
    expect(s2.errors.map((e) => [e.cell, e.error, e.formula, e.message])).toEqual([["C2", "#DIV/0!", '=IF(B1="S1",{1;2;3},1/{1;0;2})', "division by zero"]]);
  });
});

describe("cells in error inside spills, sorted into reading order", () => {
  it("by row, then by column (Z before AA before AB)", async () => {
    const report: SheetSpec = {
      name: "Report",
      rows:
        row(1, c("A1", "Sample"), c("B1", "S1"), `<c r="Z1" cm="1"><f t="array" ref="Z1:AB1">1/(B1="S1")*{1,1,1}</f><v>1</v></c>`, c("AA1", 1), c("AB1", 1)) +
        row(2, `<c r="C2" cm="1"><f t="array" ref="C2:C4">1/(B1="S1")*{1;1;1}</f><v>1</v></c>`) +
        row(3, f("B3", 'IF(B1="S2",1/0,1)', 1), c("C3", 1)) +
        row(4, c("C4", 1)),
    };
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS], dynamic: true });
    expect(t.report("S1").errors).toEqual([]);
    expect(t.report("S2").errors.map((e) => e.cell)).toEqual(["Z1", "AA1", "AB1", "C2", "B3", "C3", "C4"]);
  });
});

describe("limits", () => {
  it("a formula asking for more cells than allowed, for one key, is refused as a workbook error naming the cell", async () => {
    const report: SheetSpec = { name: "Report", rows: row(1, c("A1", "Sample"), c("B1", "S1")) + row(2, f("B2", 'IF(B1="BIG",SUMPRODUCT(Data!A1:Z1000),0)', 0)) };
    const t = await open({ sheets: [DATA, report], names: [KEY, KEYS] }, { maxCells: 1000 });
    expect(t.report("S1").errors).toEqual([]);
    expect(() => t.report("BIG")).toThrow(new WorkbookFileError("a formula asks for a range of 1000×26 cells, more than the 1000 cells soilcell takes in one formula; refused (in Report!B2)"));
    const big = await open({ sheets: [DATA, report], names: [KEY, KEYS] });
    expect(big.report("BIG").errors).toEqual([]); // 4,000,000 cells by default
  });

  it("a template refusal is a ReportTemplateError by name", () => {
    expect(ReportTemplateError.name).toBe("ReportTemplateError");
    expect(new ReportTemplateError("m")).toMatchObject({ name: "ReportTemplateError", message: "m" });
  });
});
