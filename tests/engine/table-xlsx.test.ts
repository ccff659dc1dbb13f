/**
 * The plain table workbook (src/engine/table-xlsx.ts): its exact parts, checked against ECMA-376
 * Part 1 (SpreadsheetML: sheetData, c with t="b", "e" and "inlineStr", cols, pane, numFmts, cellXfs)
 * and Part 2 (OPC: content types and relationships). Contents are invented.
 */
import { Scalar, XlError } from "../../src/engine/formula/values";
import { tableWorkbook } from "../../src/engine/table-xlsx";
import { openPackage } from "../../src/engine/xlsx-package";

const MAIN = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
const REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
const HEAD = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n';

async function parts(bytes: Buffer): Promise<Map<string, string>> {
  const pkg = await openPackage(bytes);
  return new Map(pkg.parts().map((p) => [p, pkg.text(p)!]));
}

const sheet = (body: string) =>
  `${HEAD}<worksheet xmlns="${MAIN}" xmlns:r="${REL}"><sheetViews><sheetView workbookViewId="0"><pane ySplit="1" topLeftCell="A2" activePane="bottomLeft" state="frozen"/></sheetView></sheetViews>${body}</worksheet>`;

describe("tableWorkbook", () => {
  it("writes each value by its type: header row bold (style 1), numbers in their format, text inline, empty cells left out", async () => {
    const rows: Scalar[][] = [
      ["Key", null, "", 2],
      ["a<b & \"c\"", 1.5, true, false],
      [new XlError("#N/A", "not found"), 0.25, Number.NaN, Number.POSITIVE_INFINITY],
      [null, "", 3, 4],
    ];
    const formats: Record<string, string> = { "1|1": "0.0", "2|1": "0.00%", "3|2": "0.0", "3|3": "General" };
    const p = await parts(tableWorkbook([{ name: "R&D", rows, format: (r, c) => formats[`${r}|${c}`], widths: [10, 12.5] }, { name: "Two", rows: [["only"]] }]));
    expect([...p.keys()]).toEqual(["[Content_Types].xml", "_rels/.rels", "xl/workbook.xml", "xl/_rels/workbook.xml.rels", "xl/styles.xml", "xl/worksheets/sheet1.xml", "xl/worksheets/sheet2.xml"]);
    expect(p.get("xl/worksheets/sheet1.xml")).toBe(
      sheet(
        '<cols><col min="1" max="1" width="10" customWidth="1"/><col min="2" max="2" width="12.5" customWidth="1"/></cols><sheetData>' +
          '<row r="1"><c r="A1" s="1" t="inlineStr"><is><t xml:space="preserve">Key</t></is></c><c r="B1" s="1"/><c r="C1" s="1"/><c r="D1" s="1"><v>2</v></c></row>' +
          '<row r="2"><c r="A2" t="inlineStr"><is><t xml:space="preserve">a&lt;b &amp; &quot;c&quot;</t></is></c><c r="B2" s="2"><v>1.5</v></c><c r="C2" t="b"><v>1</v></c><c r="D2" t="b"><v>0</v></c></row>' +
          '<row r="3"><c r="A3" t="e"><v>#N/A</v></c><c r="B3" s="3"><v>0.25</v></c></row>' +
          '<row r="4"><c r="C4" s="2"><v>3</v></c><c r="D4"><v>4</v></c></row>' +
          "</sheetData>",
      ),
    );
    expect(p.get("xl/worksheets/sheet2.xml")).toBe(sheet('<sheetData><row r="1"><c r="A1" s="1" t="inlineStr"><is><t xml:space="preserve">only</t></is></c></row></sheetData>'));
    expect(p.get("xl/styles.xml")).toBe(
      `${HEAD}<styleSheet xmlns="${MAIN}"><numFmts count="2"><numFmt numFmtId="164" formatCode="0.0"/><numFmt numFmtId="165" formatCode="0.00%"/></numFmts>` +
        '<fonts count="2"><font><sz val="11"/><name val="Calibri"/></font><font><b/><sz val="11"/><name val="Calibri"/></font></fonts>' +
        '<fills count="2"><fill><patternFill patternType="none"/></fill><fill><patternFill patternType="gray125"/></fill></fills>' +
        '<borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders>' +
        '<cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs>' +
        '<cellXfs count="4"><xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/><xf numFmtId="0" fontId="1" fillId="0" borderId="0" xfId="0" applyFont="1"/>' +
        '<xf numFmtId="164" fontId="0" fillId="0" borderId="0" xfId="0" applyNumberFormat="1"/><xf numFmtId="165" fontId="0" fillId="0" borderId="0" xfId="0" applyNumberFormat="1"/>' +
        '</cellXfs><cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/></cellStyles></styleSheet>',
    );
    expect(p.get("xl/workbook.xml")).toBe(
      `${HEAD}<workbook xmlns="${MAIN}" xmlns:r="${REL}"><bookViews><workbookView activeTab="0"/></bookViews><sheets><sheet name="R&amp;D" sheetId="1" r:id="rId1"/><sheet name="Two" sheetId="2" r:id="rId2"/></sheets></workbook>`,
    );
    expect(p.get("xl/_rels/workbook.xml.rels")).toBe(
      `${HEAD}<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${REL}/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="${REL}/worksheet" Target="worksheets/sheet2.xml"/><Relationship Id="rIdS" Type="${REL}/styles" Target="styles.xml"/></Relationships>`,
    );
    expect(p.get("_rels/.rels")).toBe(`${HEAD}<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${REL}/officeDocument" Target="xl/workbook.xml"/></Relationships>`);
    expect(p.get("[Content_Types].xml")).toBe(
      `${HEAD}<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/>` +
        '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/><Override PartName="/xl/styles.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"/>' +
        '<Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/><Override PartName="/xl/worksheets/sheet2.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/></Types>',
    );
  });

  it("no formats: no numFmts, two cell formats; no widths (or none listed): no cols", async () => {
    const p = await parts(tableWorkbook([{ name: "A", rows: [["h"], [1]], widths: [] }]));
    expect(p.get("xl/styles.xml")).not.toContain("numFmts");
    expect(p.get("xl/styles.xml")).toContain('<cellXfs count="2">');
    expect(p.get("xl/worksheets/sheet1.xml")).toBe(sheet('<sheetData><row r="1"><c r="A1" s="1" t="inlineStr"><is><t xml:space="preserve">h</t></is></c></row><row r="2"><c r="A2"><v>1</v></c></row></sheetData>'));
  });

  it("a sheet with no rows has empty sheetData", async () => {
    const p = await parts(tableWorkbook([{ name: "Empty", rows: [] }]));
    expect(p.get("xl/worksheets/sheet1.xml")).toBe(sheet("<sheetData></sheetData>"));
  });
});
