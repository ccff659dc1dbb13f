/**
 * Excel's stored form, end to end: a workbook written by hand part by part the way Excel saves an
 * add-in's formulas (`_xldudf_SOIL_…` in `<f t="array" ref=…>` cells with `cm="1"`, xl/metadata.xml
 * with the dynamic-array entry, the add-in's xl/webextensions parts) is recalculated headless and
 * comes back in that same form: SOIL cells rewritten with fresh cached values, every other part
 * byte for byte, every other cell as it was. The cached values in the input are deliberately
 * stale (invented); expected values: Source as in cases.ts (IUPAC/CIAAW 200.39 mg/kg Ca per
 * cmol(+)/kg, so 2003.9 → 10; UNIT-16 layer mass 10 mg/kg × 15 cm × 1.3 g/cm3 = 19.5 kg/ha; band limits invented).
 *
 * The webextension XML follows the part names and namespaces of [MS-OWEXML] as remembered (from
 * memory): not copied from a file Excel saved. What matters here is that it survives untouched.
 */
import fs from "fs";
import path from "path";
import JSZip from "jszip";
import { recalcWorkbook } from "../../src/engine/recalc";
import { tempDir } from "../helpers/workbook";

const XML = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\r\n';
const MAIN = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
const REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
const PKG_REL = "http://schemas.openxmlformats.org/package/2006/relationships";

const WEBEXT_ID = "{5A2C1E0B-7D44-4C1F-9B0E-2F5E3B8C9A11}";
const ADDIN_ID = "c1441366-d9ea-4277-bb4f-0a8c129bd5f3"; // the Id in manifest.xml

const PARTS: Record<string, string> = {
  "[Content_Types].xml":
    XML +
    `<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">` +
    `<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/>` +
    `<Default Extension="xml" ContentType="application/xml"/>` +
    `<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>` +
    `<Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>` +
    `<Override PartName="/xl/styles.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"/>` +
    `<Override PartName="/xl/sharedStrings.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml"/>` +
    `<Override PartName="/xl/metadata.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheetMetadata+xml"/>` +
    `<Override PartName="/xl/webextensions/taskpanes.xml" ContentType="application/vnd.ms-office.webextensiontaskpanes+xml"/>` +
    `<Override PartName="/xl/webextensions/webextension1.xml" ContentType="application/vnd.ms-office.webextension+xml"/>` +
    `</Types>`,
  "_rels/.rels":
    XML +
    `<Relationships xmlns="${PKG_REL}">` +
    `<Relationship Id="rId1" Type="${REL}/officeDocument" Target="xl/workbook.xml"/>` +
    `<Relationship Id="rId2" Type="http://schemas.microsoft.com/office/2011/relationships/webextensiontaskpanes" Target="xl/webextensions/taskpanes.xml"/>` +
    `</Relationships>`,
  "xl/workbook.xml":
    XML +
    `<workbook xmlns="${MAIN}" xmlns:r="${REL}"><fileVersion appName="xl" lastEdited="7" lowestEdited="7" rupBuild="27328"/>` +
    `<workbookPr defaultThemeVersion="166925"/><bookViews><workbookView xWindow="0" yWindow="0" windowWidth="28800" windowHeight="12300"/></bookViews>` +
    `<sheets><sheet name="Lab" sheetId="1" r:id="rId1"/></sheets><calcPr calcId="191029"/></workbook>`,
  "xl/_rels/workbook.xml.rels":
    XML +
    `<Relationships xmlns="${PKG_REL}">` +
    `<Relationship Id="rId1" Type="${REL}/worksheet" Target="worksheets/sheet1.xml"/>` +
    `<Relationship Id="rId2" Type="${REL}/styles" Target="styles.xml"/>` +
    `<Relationship Id="rId3" Type="${REL}/sharedStrings" Target="sharedStrings.xml"/>` +
    `<Relationship Id="rId4" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sheetMetadata" Target="metadata.xml"/>` +
    `</Relationships>`,
  "xl/styles.xml":
    XML +
    `<styleSheet xmlns="${MAIN}"><fonts count="1"><font><sz val="11"/><name val="Calibri"/></font></fonts>` +
    `<fills count="2"><fill><patternFill patternType="none"/></fill><fill><patternFill patternType="gray125"/></fill></fills>` +
    `<borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders>` +
    `<cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs>` +
    `<cellXfs count="2"><xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/><xf numFmtId="2" fontId="0" fillId="0" borderId="0" xfId="0" applyNumberFormat="1"/></cellXfs>` +
    `<cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/></cellStyles></styleSheet>`,
  "xl/sharedStrings.xml": XML + `<sst xmlns="${MAIN}" count="3" uniqueCount="3"><si><t>Ca mg/kg</t></si><si><t>Ca cmol(+)/kg</t></si><si><t>notes</t></si></sst>`,
  "xl/metadata.xml":
    XML +
    `<metadata xmlns="${MAIN}" xmlns:xda="http://schemas.microsoft.com/office/spreadsheetml/2017/dynamicarray">` +
    `<metadataTypes count="1"><metadataType name="XLDAPR" minSupportedVersion="120000" copy="1" pasteAll="1" pasteValues="1" merge="1" splitFirst="1" rowColShift="1" clearFormats="1" clearComments="1" assign="1" coerce="1" cellMeta="1"/></metadataTypes>` +
    `<futureMetadata name="XLDAPR" count="1"><bk><extLst><ext uri="{bdbb8cdc-fa1e-496e-a857-3c3f30c029c3}"><xda:dynamicArrayProperties fDynamic="1" fCollapsed="0"/></ext></extLst></bk></futureMetadata>` +
    `<cellMetadata count="1"><bk><rc t="1" v="0"/></bk></cellMetadata></metadata>`,
  "xl/webextensions/taskpanes.xml":
    XML +
    `<wetp:taskpanes xmlns:wetp="http://schemas.microsoft.com/office/webextensions/taskpanes/2010/11">` +
    `<wetp:taskpane dockstate="right" visibility="0" width="350" row="0"><wetp:webextensionref xmlns:r="${REL}" r:id="rId1"/></wetp:taskpane></wetp:taskpanes>`,
  "xl/webextensions/_rels/taskpanes.xml.rels":
    XML +
    `<Relationships xmlns="${PKG_REL}"><Relationship Id="rId1" Type="http://schemas.microsoft.com/office/2011/relationships/webextension" Target="webextension1.xml"/></Relationships>`,
  "xl/webextensions/webextension1.xml":
    XML +
    `<we:webextension xmlns:we="http://schemas.microsoft.com/office/webextensions/webextension/2010/11" id="${WEBEXT_ID}">` +
    `<we:reference id="${ADDIN_ID}" version="0.1.0.0" store="developer" storeType="Registry"/><we:alternateReferences/>` +
    `<we:properties><we:property name="Office.AutoShowTaskpaneWithDocument" value="false"/>` +
    `<we:property name="customFunctionIds" value="&quot;CMOL,CONVERT,BAND&quot;"/></we:properties>` +
    `<we:bindings/><we:snapshot xmlns:r="${REL}"/></we:webextension>`,
};

// The sheet as Excel stores it: literal quotes inside <f>, stale cached values, a spill whose old
// range (G2:G4) is larger than the new result, a native formula depending on a SOIL cell.
const ROWS: Record<number, string[]> = {
  1: ['<c r="A1" t="s"><v>0</v></c>', '<c r="B1" t="s"><v>1</v></c>', '<c r="H1" t="s"><v>2</v></c>'],
  2: [
    '<c r="A2" s="1"><v>2003.9</v></c>',
    '<c r="B2" cm="1"><f t="array" ref="B2:B5">_xldudf_SOIL_CMOL(A2:A5,"Ca")</f><v>0</v></c>',
    '<c r="C2" cm="1"><f t="array" ref="C2">_xldudf_SOIL_CONVERT(10,"mg/kg","kg/ha",15,1.3)</f><v>1</v></c>',
    '<c r="D2" cm="1" t="str"><f t="array" ref="D2">_xldudf_SOIL_BAND(25,{10,20,30,40})</f><v>old</v></c>',
    '<c r="E2" cm="1"><f t="array" ref="E2">_xldudf_SOIL_CMOL(1,"Xx")</f><v>0</v></c>',
    '<c r="F2"><f>B2*2</f><v>0</v></c>',
    '<c r="G2" cm="1"><f t="array" ref="G2:G4">_xldudf_SOIL_CMOL({2003.9;1001.95},"Ca")</f><v>0</v></c>',
    '<c r="H2" t="s"><v>2</v></c>',
  ],
  3: ['<c r="A3"><v>1001.95</v></c>', '<c r="B3"><v>0</v></c>', '<c r="G3"><v>0</v></c>'],
  4: ['<c r="B4"><v>0</v></c>', '<c r="G4"><v>0</v></c>'],
  5: ['<c r="A5"><v>-5</v></c>', '<c r="B5"><v>0</v></c>'],
};

const SHEET =
  XML +
  `<worksheet xmlns="${MAIN}" xmlns:r="${REL}" xmlns:mc="http://schemas.openxmlformats.org/markup-compatibility/2006" mc:Ignorable="x14ac xr xr2 xr3" xmlns:x14ac="http://schemas.microsoft.com/office/spreadsheetml/2009/9/ac" xmlns:xr="http://schemas.microsoft.com/office/spreadsheetml/2014/revision" xmlns:xr2="http://schemas.microsoft.com/office/spreadsheetml/2015/revision2" xmlns:xr3="http://schemas.microsoft.com/office/spreadsheetml/2016/revision3" xr:uid="{00000000-0001-0000-0000-000000000000}">` +
  `<dimension ref="A1:H5"/><sheetViews><sheetView tabSelected="1" workbookViewId="0"/></sheetViews><sheetFormatPr defaultRowHeight="15" x14ac:dyDescent="0.25"/>` +
  `<sheetData>` +
  Object.entries(ROWS)
    .map(([r, cells]) => `<row r="${r}" spans="1:8" x14ac:dyDescent="0.25">${cells.join("")}</row>`)
    .join("") +
  `</sheetData><pageMargins left="0.7" right="0.7" top="0.75" bottom="0.75" header="0.3" footer="0.3"/></worksheet>`;

const SHEET_PATH = "xl/worksheets/sheet1.xml";

async function writePackage(file: string): Promise<void> {
  const zip = new JSZip();
  for (const [name, text] of Object.entries({ ...PARTS, [SHEET_PATH]: SHEET })) zip.file(name, text, { createFolders: false });
  fs.writeFileSync(file, await zip.generateAsync({ type: "nodebuffer", compression: "DEFLATE" }));
}

async function parts(file: string): Promise<Map<string, Buffer>> {
  const zip = await JSZip.loadAsync(fs.readFileSync(file));
  const out = new Map<string, Buffer>();
  for (const name of Object.keys(zip.files).sort()) {
    if (!zip.files[name]!.dir) out.set(name, await zip.file(name)!.async("nodebuffer"));
  }
  return out;
}

const decode = (s: string) => s.replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&lt;/g, "<").replace(/&gt;/g, ">").replace(/&amp;/g, "&");

/** Each cell element of a sheet by address. */
function cells(sheetXml: string): Map<string, string> {
  const out = new Map<string, string>();
  for (const m of sheetXml.matchAll(/<c\b[^>]*?\sr="([A-Z]+\d+)"[^>]*?(?:\/>|>[\s\S]*?<\/c>)/g)) out.set(m[1]!, m[0]);
  return out;
}

const REWRITTEN = ["B2", "B3", "B4", "B5", "C2", "D2", "E2", "F2", "G2", "G3", "G4"];

describe("Excel's stored form, read and written back", () => {
  let dir: string;
  let input: string;
  let output: string;
  let before: Map<string, Buffer>;
  let after: Map<string, Buffer>;
  let sheet: string;

  beforeAll(async () => {
    dir = tempDir("soilcell-stored-");
    input = path.join(dir, "excel-form.xlsx");
    output = path.join(dir, "excel-form.recalc.xlsx");
    await writePackage(input);
    const summary = await recalcWorkbook(input, output);
    expect(summary.soilFormulaCells).toBe(5);
    before = await parts(input);
    after = await parts(output);
    sheet = after.get(SHEET_PATH)!.toString("utf8");
  });

  it("adds and drops no part, and keeps every part but the sheet byte for byte (webextension, metadata, content types)", () => {
    expect([...after.keys()]).toEqual([...before.keys()]);
    for (const [name, bytes] of before) {
      if (name === SHEET_PATH) continue;
      expect({ part: name, same: Buffer.compare(bytes, after.get(name)!) === 0 }).toEqual({ part: name, same: true });
    }
    expect(after.get("xl/webextensions/webextension1.xml")!.toString("utf8")).toBe(PARTS["xl/webextensions/webextension1.xml"]);
  });

  it("rewrites the SOIL cells in Excel's form with fresh values: _xldudf_, t=array with the spill range, cm=1", () => {
    const c = cells(sheet);
    expect(decode(c.get("B2")!)).toBe('<c r="B2" cm="1"><f t="array" ref="B2:B5">_xldudf_SOIL_CMOL(A2:A5,"Ca")</f><v>10</v></c>');
    expect(decode(c.get("C2")!)).toBe('<c r="C2" cm="1"><f t="array" ref="C2">_xldudf_SOIL_CONVERT(10,"mg/kg","kg/ha",15,1.3)</f><v>19.5</v></c>');
    expect(decode(c.get("D2")!)).toBe('<c r="D2" cm="1" t="str"><f t="array" ref="D2">_xldudf_SOIL_BAND(25,{10,20,30,40})</f><v>Optimum</v></c>');
    expect(decode(c.get("E2")!)).toBe('<c r="E2" cm="1" t="e"><f t="array" ref="E2">_xldudf_SOIL_CMOL(1,"Xx")</f><v>#VALUE!</v></c>');
    expect(decode(c.get("G2")!)).toBe('<c r="G2" cm="1"><f t="array" ref="G2:G3">_xldudf_SOIL_CMOL({2003.9;1001.95},"Ca")</f><v>10</v></c>');
  });

  it("spilled elements are plain values (a blank result is the empty text the function returns), the shrunk spill's old cell cleared", () => {
    const c = cells(sheet);
    expect(c.get("B3")).toBe('<c r="B3"><v>5</v></c>');
    expect(c.get("B4")).toBe('<c r="B4" t="str"><v></v></c>');
    expect(c.get("B5")).toBe('<c r="B5" t="e"><v>#VALUE!</v></c>');
    expect(c.get("G3")).toBe('<c r="G3"><v>5</v></c>');
    expect(c.get("G4")).toBe('<c r="G4"/>');
  });

  it("a native formula depending on a SOIL cell keeps its <f> and gets its new value", () => {
    expect(cells(sheet).get("F2")).toBe('<c r="F2"><f>B2*2</f><v>20</v></c>');
  });

  it("every other cell and every byte around the cells is as it was (rows with new values drop the optional spans hint)", () => {
    const strip = (xml: string) => {
      let s = xml;
      for (const [addr, el] of cells(xml)) if (REWRITTEN.includes(addr)) s = s.replace(el, `[${addr}]`);
      return s.replace(/<row r="([2-5])" spans="1:8"/g, '<row r="$1"');
    };
    expect(strip(sheet)).toBe(strip(SHEET));
    expect(sheet).toContain('<row r="1" spans="1:8" x14ac:dyDescent="0.25">'); // a row without writes is untouched
  });

  it("recalculating the result again gives the same bytes: the stored form is a fixed point", async () => {
    const again = path.join(dir, "again.xlsx");
    await recalcWorkbook(output, again);
    const twice = await parts(again);
    for (const [name, bytes] of after) expect({ part: name, same: Buffer.compare(bytes, twice.get(name)!) === 0 }).toEqual({ part: name, same: true });
  });
});
