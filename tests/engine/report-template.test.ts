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
  ])("%j: %s", async (o, message) => {
    expect(await refusal(two, o)).toEqual(tpl(message));
  });

  it("a key cell that is not a reference at all says so, with the parser's words", async () => {
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
      row(3, f("B3", 'IF(B1="S1","  North  ",IF(B1="S2",12,IF(B1="ZT",TRUE,IF(B1="ZE",1/0,""))))', "x"), c("D3", 5), f("E3", "1/0")) +
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
