/**
 * Report workbooks from a template's report sheet (src/engine/report-package.ts): the exact parts a
 * values copy is made of, the parts the report sheet points at (copied, renamed per report, shared
 * when binary, left out when they need a workbook part), the print names carried over and renamed,
 * the sheets that are not first unselected, the cells outside the print area clipped, and the fixed
 * scale that fits a print area on one page. Package structure against ECMA-376 Part 2 (OPC: content
 * types, relationships) and Part 1 (SpreadsheetML); the column width in points from ECMA-376 Part 1,
 * 18.3.1.13 col (width to pixels, Truncate(((256 * w + Truncate(128/7)) / 256) * 7) for a 7-pixel
 * digit; from memory); paper sizes from 18.3.1.64 pageSetup (from memory). Workbook contents are
 * invented; the packages are hand-written here so every part is known.
 */
import { Sheet, readBook } from "../../src/engine/book";
import { customPropertiesXml } from "../../src/engine/recalc";
import { ReportPackager } from "../../src/engine/report-package";
import { SOIL_NAMES } from "../../src/engine/soil";
import { XlsxPackage, openPackage } from "../../src/engine/xlsx-package";
import { writeZip } from "../../src/engine/zip";

const MAIN = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
const REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
const PKG_REL = "http://schemas.openxmlformats.org/package/2006/relationships";
const HEAD = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n';
const CT_WS = "application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml";

const rels = (...lines: string[]) => `${HEAD}<Relationships xmlns="${PKG_REL}">${lines.join("")}</Relationships>`;
const rel = (id: string, type: string, target: string, external = false) => `<Relationship Id="${id}" Type="${type}" Target="${target}"${external ? ' TargetMode="External"' : ""}/>`;
const worksheet = (body: string) => `${HEAD}<worksheet xmlns="${MAIN}" xmlns:r="${REL}">${body}</worksheet>`;

/** A PNG's first bytes (a binary part: copied once, never renamed). */
const PNG = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 1, 2, 3]);

interface Spec {
  /** The report sheet's XML (sheet 2, "Client report"). */
  readonly sheet: string;
  /** The report sheet's relationships part, or none. */
  readonly sheetRels?: string;
  readonly names?: string;
  readonly date1904?: boolean;
  readonly styles?: boolean;
  readonly theme?: boolean;
  readonly extra?: Record<string, string | Buffer>;
  readonly types?: string;
  readonly sheetName?: string;
}

async function template(spec: Spec): Promise<{ pkg: XlsxPackage; sheet: Sheet }> {
  const name = spec.sheetName ?? "Client report";
  const wbRels = [rel("rId1", `${REL}/worksheet`, "worksheets/sheet1.xml"), rel("rId2", `${REL}/worksheet`, "worksheets/sheet2.xml")];
  if (spec.styles !== false) wbRels.push(rel("rId3", `${REL}/styles`, "styles.xml"));
  if (spec.theme !== false) wbRels.push(rel("rId4", `${REL}/theme`, "theme/theme1.xml"));
  wbRels.push(rel("rId5", `${REL}/sharedStrings`, "sharedStrings.xml"));
  const parts: Record<string, string | Buffer> = {
    "[Content_Types].xml":
      `${HEAD}<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">` +
      (spec.types ??
        '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/>' +
          '<Default Extension="PNG" ContentType="image/png"/><Default Extension="vml" ContentType="application/vnd.openxmlformats-officedocument.vmlDrawing"/>' +
          '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>' +
          `<Override PartName="/xl/worksheets/sheet1.xml" ContentType="${CT_WS}"/><Override PartName="/xl/worksheets/sheet2.xml" ContentType="${CT_WS}"/>` +
          '<Override PartName="/xl/drawings/drawing1.xml" ContentType="application/vnd.openxmlformats-officedocument.drawing+xml"/>' +
          '<Override PartName="/xl/comments1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.comments+xml"/>') +
      "</Types>",
    "_rels/.rels": rels(rel("rId1", `${REL}/officeDocument`, "xl/workbook.xml")),
    "xl/workbook.xml":
      `${HEAD}<workbook xmlns="${MAIN}" xmlns:r="${REL}">${spec.date1904 ? '<workbookPr date1904="1"/>' : ""}<sheets><sheet name="Data" sheetId="1" r:id="rId1"/><sheet name="${name.replace(/&/g, "&amp;")}" sheetId="2" r:id="rId2"/></sheets>` +
      `${spec.names === undefined ? "" : `<definedNames>${spec.names}</definedNames>`}</workbook>`,
    "xl/_rels/workbook.xml.rels": rels(...wbRels),
    "xl/worksheets/sheet1.xml": worksheet('<sheetData><row r="1"><c r="A1" t="s"><v>0</v></c></row></sheetData>'),
    "xl/worksheets/sheet2.xml": spec.sheet,
    "xl/styles.xml": `${HEAD}<styleSheet xmlns="${MAIN}"><numFmts count="1"><numFmt numFmtId="164" formatCode="0.0"/></numFmts></styleSheet>`,
    "xl/theme/theme1.xml": `${HEAD}<a:theme xmlns:a="http://schemas.openxmlformats.org/drawingml/2006/main" name="Invented"/>`,
    "xl/sharedStrings.xml": `${HEAD}<sst xmlns="${MAIN}" count="1" uniqueCount="1"><si><t>private text of another sheet</t></si></sst>`,
    ...(spec.sheetRels ? { "xl/worksheets/_rels/sheet2.xml.rels": spec.sheetRels } : {}),
    ...spec.extra,
  };
  const bytes = writeZip(Object.entries(parts).map(([n, d]) => ({ name: n, data: Buffer.isBuffer(d) ? d : Buffer.from(d, "utf8") })));
  const pkg = await openPackage(bytes);
  const book = readBook(pkg, SOIL_NAMES);
  return { pkg, sheet: book.sheets[1]! };
}

/** Every part of a written package, as text (binary parts as hex). */
async function partsOf(bytes: Buffer): Promise<Map<string, string>> {
  const pkg = await openPackage(bytes);
  const out = new Map<string, string>();
  for (const p of pkg.parts()) out.set(p, p.endsWith(".png") ? pkg.bytes(p)!.toString("hex") : pkg.bytes(p)!.toString("utf8"));
  return out;
}

const PRINT = '<definedName name="_xlnm.Print_Area" localSheetId="1">\'Client report\'!$A$1:$C$4</definedName>';

/** A report sheet set to fit one page, with the page setup and cells given. */
function fitSheet(o: { cols?: string; rows?: string; format?: string; setup?: string; pr?: string; margins?: string } = {}): string {
  return worksheet(
    `<sheetPr>${o.pr ?? '<pageSetUpPr fitToPage="1"/>'}</sheetPr><sheetViews><sheetView tabSelected="1" workbookViewId="0"/></sheetViews>` +
      `${o.format ?? '<sheetFormatPr defaultRowHeight="15"/>'}${o.cols ?? ""}` +
      `<sheetData>${o.rows ?? [1, 2, 3, 4].map((r) => `<row r="${r}" ht="20" customHeight="1"><c r="A${r}"><v>${r}</v></c></row>`).join("")}</sheetData>` +
      `${o.margins ?? '<pageMargins left="0.7" right="0.7" top="0.75" bottom="0.75" header="0.3" footer="0.3"/>'}` +
      `${o.setup ?? '<pageSetup paperSize="9" orientation="portrait" fitToWidth="1" fitToHeight="1"/>'}`,
  );
}

async function scaleOf(o: Parameters<typeof fitSheet>[0], names = PRINT) {
  const t = await template({ sheet: fitSheet(o), names });
  return new ReportPackager(t.pkg, t.sheet).fixedScale;
}

/** Widths in points of ECMA-376's formula (7-pixel digit, 0.75 pt a pixel): 100 → 700 px, 525 pt; 10 → 70 px, 52.5 pt; 8.43 → 59 px, 44.25 pt. */
const WIDE = '<cols><col min="1" max="1" width="100" customWidth="1"/><col min="2" max="3" width="10" customWidth="1"/></cols>';

describe("a report workbook of one report", () => {
  const sheetRels = rels(
    rel("rId1", `${REL}/drawing`, "../drawings/drawing1.xml"),
    rel("rId2", `${REL}/comments`, "../comments1.xml"),
    rel("rId3", `${REL}/vmlDrawing`, "../drawings/vmlDrawing1.vml"),
    rel("rId4", `${REL}/table`, "../tables/table1.xml"),
    rel("rId5", `${REL}/hyperlink`, "https://example.invalid/a?b&amp;c", true),
    rel("rId6", `${REL}/image`, "../media/missing.png"),
  );
  const extra = {
    "xl/drawings/drawing1.xml": `${HEAD}<xdr:wsDr xmlns:xdr="http://schemas.openxmlformats.org/drawingml/2006/spreadsheetDrawing"/>`,
    "xl/drawings/_rels/drawing1.xml.rels": rels(rel("rId1", `${REL}/image`, "../media/image1.png")),
    "xl/drawings/vmlDrawing1.vml": "<xml><o:shapelayout/></xml>",
    "xl/comments1.xml": `${HEAD}<comments xmlns="${MAIN}"/>`,
    "xl/tables/table1.xml": `${HEAD}<table xmlns="${MAIN}"/>`,
    "xl/media/image1.png": PNG,
  };
  const names = PRINT + '<definedName name="_xlnm.Print_Titles" localSheetId="1">\'Client report\'!$1:$1</definedName><definedName name="_xlnm.Print_Area" localSheetId="0">Data!$A$1:$B$2</definedName><definedName name="Report_Key" localSheetId="1">\'Client report\'!$B$1</definedName>';
  const xml = worksheet('<sheetViews><sheetView tabSelected="1" workbookViewId="0"/></sheetViews><sheetData><row r="1"><c r="A1" t="inlineStr"><is><t>Client</t></is></c></row></sheetData><drawing r:id="rId1"/><legacyDrawing r:id="rId3"/>');

  it("holds exactly the sheet, its drawing, image and comments, the styles and theme, the print names, and the properties", async () => {
    const t = await template({ sheet: xml, sheetRels, extra, names });
    const p = new ReportPackager(t.pkg, t.sheet);
    expect(p.hasCharts).toBe(false); // an image, no chart
    const parts = await partsOf(p.single(xml, "North & South", "a note"));
    expect([...parts.keys()].sort()).toEqual([
      "[Content_Types].xml",
      "_rels/.rels",
      "docProps/core.xml",
      "docProps/custom.xml",
      "xl/_rels/workbook.xml.rels",
      "xl/comments1.xml",
      "xl/drawings/_rels/drawing1.xml.rels",
      "xl/drawings/drawing1.xml",
      "xl/drawings/vmlDrawing1.vml",
      "xl/media/image1.png",
      "xl/styles.xml",
      "xl/theme/theme1.xml",
      "xl/workbook.xml",
      "xl/worksheets/_rels/sheet1.xml.rels",
      "xl/worksheets/sheet1.xml",
    ]);
    expect(parts.get("xl/worksheets/sheet1.xml")).toBe(xml); // a single report's sheet stays selected
    // The table needs a workbook part (left out, recorded); the missing image has nothing to copy.
    expect(parts.get("xl/worksheets/_rels/sheet1.xml.rels")).toBe(
      rels(rel("rId1", `${REL}/drawing`, "../drawings/drawing1.xml"), rel("rId2", `${REL}/comments`, "../comments1.xml"), rel("rId3", `${REL}/vmlDrawing`, "../drawings/vmlDrawing1.vml"), rel("rId5", `${REL}/hyperlink`, "https://example.invalid/a?b&amp;c", true)),
    );
    expect(p.dropped).toEqual([`${REL}/table`]);
    expect(parts.get("xl/drawings/_rels/drawing1.xml.rels")).toBe(rels(rel("rId1", `${REL}/image`, "../media/image1.png")));
    expect(parts.get("xl/media/image1.png")).toBe(PNG.toString("hex"));
    expect(parts.get("xl/drawings/vmlDrawing1.vml")).toBe("<xml><o:shapelayout/></xml>");
    expect(parts.get("xl/styles.xml")).toBe(t.pkg.text("xl/styles.xml"));
    expect(parts.get("xl/theme/theme1.xml")).toBe(t.pkg.text("xl/theme/theme1.xml"));
    // Only the report sheet's print area and titles, the sheet keeping its name.
    expect(parts.get("xl/workbook.xml")).toBe(
      `${HEAD}<workbook xmlns="${MAIN}" xmlns:r="${REL}"><workbookPr/><bookViews><workbookView activeTab="0"/></bookViews>` +
        '<sheets><sheet name="Client report" sheetId="1" r:id="rIdS1"/></sheets>' +
        '<definedNames><definedName name="_xlnm.Print_Area" localSheetId="0">\'Client report\'!$A$1:$C$4</definedName><definedName name="_xlnm.Print_Titles" localSheetId="0">\'Client report\'!$1:$1</definedName></definedNames></workbook>',
    );
    expect(parts.get("xl/_rels/workbook.xml.rels")).toBe(rels(rel("rIdS1", `${REL}/worksheet`, "worksheets/sheet1.xml"), rel("rIdStyles", `${REL}/styles`, "styles.xml"), rel("rIdTheme", `${REL}/theme`, "theme/theme1.xml")));
    expect(parts.get("_rels/.rels")).toBe(rels(rel("rId1", `${REL}/officeDocument`, "xl/workbook.xml"), rel("rId2", `${PKG_REL}/metadata/core-properties`, "docProps/core.xml"), rel("rId3", `${REL}/custom-properties`, "docProps/custom.xml")));
    expect(parts.get("docProps/custom.xml")).toBe(customPropertiesXml("a note"));
    expect(parts.get("docProps/core.xml")).toMatch(
      /^<\?xml version="1\.0" encoding="UTF-8" standalone="yes"\?>\n<cp:coreProperties xmlns:cp="http:\/\/schemas\.openxmlformats\.org\/package\/2006\/metadata\/core-properties" xmlns:dc="http:\/\/purl\.org\/dc\/elements\/1\.1\/" xmlns:dcterms="http:\/\/purl\.org\/dc\/terms\/" xmlns:xsi="http:\/\/www\.w3\.org\/2001\/XMLSchema-instance"><dc:title>North &amp; South<\/dc:title><dcterms:created xsi:type="dcterms:W3CDTF">\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ<\/dcterms:created><\/cp:coreProperties>$/,
    );
    // Defaults: rels and xml first, the template's others lower-cased; overrides for the parts written.
    expect(parts.get("[Content_Types].xml")).toBe(
      `${HEAD}<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">` +
        '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/>' +
        '<Default Extension="png" ContentType="image/png"/><Default Extension="vml" ContentType="application/vnd.openxmlformats-officedocument.vmlDrawing"/>' +
        `<Override PartName="/xl/worksheets/sheet1.xml" ContentType="${CT_WS}"/>` +
        '<Override PartName="/xl/drawings/drawing1.xml" ContentType="application/vnd.openxmlformats-officedocument.drawing+xml"/>' +
        '<Override PartName="/xl/comments1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.comments+xml"/>' +
        '<Override PartName="/xl/styles.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"/>' +
        '<Override PartName="/xl/theme/theme1.xml" ContentType="application/vnd.openxmlformats-officedocument.theme+xml"/>' +
        '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>' +
        '<Override PartName="/docProps/core.xml" ContentType="application/vnd.openxmlformats-package.core-properties+xml"/>' +
        '<Override PartName="/docProps/custom.xml" ContentType="application/vnd.openxmlformats-officedocument.custom-properties+xml"/>' +
        "</Types>",
    );
  });

  it("the template's own rels and xml defaults do not replace the package's", async () => {
    const types = '<Default Extension="XML" ContentType="text/plain"/><Default Extension="Rels" ContentType="text/plain"/><Default Extension="jpeg" ContentType="image/jpeg"/>';
    const t = await template({ sheet: xml, types });
    const ct = (await partsOf(new ReportPackager(t.pkg, t.sheet).single(xml, "x", "n"))).get("[Content_Types].xml")!;
    expect(ct).toContain('<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Default Extension="jpeg" ContentType="image/jpeg"/><Override');
    expect(ct).not.toContain("text/plain");
  });

  it("a template without styles, theme or print names: none written; a sheet without relationships has no rels part; the 1904 date system kept", async () => {
    const t = await template({ sheet: xml, styles: false, theme: false, date1904: true });
    const p = new ReportPackager(t.pkg, t.sheet);
    const parts = await partsOf(p.single(xml, "x", "n"));
    expect([...parts.keys()].sort()).toEqual(["[Content_Types].xml", "_rels/.rels", "docProps/core.xml", "docProps/custom.xml", "xl/_rels/workbook.xml.rels", "xl/workbook.xml", "xl/worksheets/sheet1.xml"]);
    expect(parts.get("xl/workbook.xml")).toBe(`${HEAD}<workbook xmlns="${MAIN}" xmlns:r="${REL}"><workbookPr date1904="1"/><bookViews><workbookView activeTab="0"/></bookViews><sheets><sheet name="Client report" sheetId="1" r:id="rIdS1"/></sheets></workbook>`);
    expect(parts.get("xl/_rels/workbook.xml.rels")).toBe(rels(rel("rIdS1", `${REL}/worksheet`, "worksheets/sheet1.xml")));
    expect(p.fixedScale).toBeNull(); // no print area
    expect(p.forPdf(xml)).toBe(xml);
  });

  it("a sheet whose relationships part lists nothing gets none", async () => {
    const t = await template({ sheet: xml, sheetRels: rels() });
    const parts = await partsOf(new ReportPackager(t.pkg, t.sheet).single(xml, "x", "n"));
    expect(parts.has("xl/worksheets/_rels/sheet1.xml.rels")).toBe(false);
  });

  it("a sheet whose relationships are all left out keeps an empty relationships part", async () => {
    const t = await template({ sheet: xml, sheetRels: rels(rel("rId1", `${REL}/pivotTable`, "../pivotTables/p1.xml"), rel("rId2", `${REL}/queryTable`, "../queryTables/q1.xml"), rel("rId3", `${REL}/pivotTable`, "../pivotTables/p2.xml")) });
    const p = new ReportPackager(t.pkg, t.sheet);
    const parts = await partsOf(p.single(xml, "x", "n"));
    expect(parts.get("xl/worksheets/_rels/sheet1.xml.rels")).toBe(rels());
    expect(p.dropped).toEqual([`${REL}/pivotTable`, `${REL}/queryTable`]); // each type once
  });

  it("the types left out are known before any copy is made, through the parts the sheet points at; an external one is not a part", async () => {
    const t = await template({
      sheet: xml,
      sheetRels: rels(rel("rId1", `${REL}/drawing`, "../drawings/drawing1.xml"), rel("rId2", `${REL}/table`, "https://example.invalid/t", true), rel("rId3", `${REL}/table`, "../tables/table1.xml")),
      extra: { "xl/drawings/drawing1.xml": "<d/>", "xl/drawings/_rels/drawing1.xml.rels": rels(rel("rId1", `${REL}/drawing`, "drawing1.xml"), rel("rId2", `${REL}/pivotTable`, "../pivotTables/p1.xml")) },
    });
    const p = new ReportPackager(t.pkg, t.sheet);
    expect(p.dropped).toEqual([`${REL}/pivotTable`, `${REL}/table`]);
    const parts = await partsOf(p.single(xml, "x", "n"));
    expect(parts.get("xl/worksheets/_rels/sheet1.xml.rels")).toBe(rels(rel("rId1", `${REL}/drawing`, "../drawings/drawing1.xml"), rel("rId2", `${REL}/table`, "https://example.invalid/t", true)));
    expect(parts.get("xl/drawings/_rels/drawing1.xml.rels")).toBe(rels(rel("rId1", `${REL}/drawing`, "drawing1.xml")));
    expect(p.dropped).toEqual([`${REL}/pivotTable`, `${REL}/table`]);
  });

  it.each([
    ["slicer", `${REL}/slicer`],
    ["timeline", "http://schemas.microsoft.com/office/2011/relationships/timeline"],
    ["table (Microsoft's namespace)", "http://schemas.microsoft.com/office/2006/relationships/table"],
  ])("a %s relationship is left out", async (_, type) => {
    const t = await template({ sheet: xml, sheetRels: rels(rel("rId1", type, "../x/part1.xml")), extra: { "xl/x/part1.xml": "<x/>" } });
    const p = new ReportPackager(t.pkg, t.sheet);
    const parts = await partsOf(p.single(xml, "x", "n"));
    expect(parts.has("xl/x/part1.xml")).toBe(false);
    expect(p.dropped).toEqual([type]);
  });

  it("a table relationship whose type only contains the word is copied (the types are matched at their end)", async () => {
    const type = `${REL}/tableStyles`;
    const t = await template({ sheet: xml, sheetRels: rels(rel("rId1", type, "../x/part1.xml")), extra: { "xl/x/part1.xml": "<x/>" } });
    const p = new ReportPackager(t.pkg, t.sheet);
    const parts = await partsOf(p.single(xml, "x", "n"));
    expect(parts.get("xl/x/part1.xml")).toBe("<x/>");
    expect(p.dropped).toEqual([]);
  });

  it("says whether the sheet holds a chart, through its drawing (an external or circular relationship is not followed)", async () => {
    const chartRels = rels(rel("rId1", `${REL}/drawing`, "../drawings/drawing1.xml"));
    const withChart = await template({
      sheet: xml,
      sheetRels: chartRels,
      extra: { "xl/drawings/drawing1.xml": "<d/>", "xl/drawings/_rels/drawing1.xml.rels": rels(rel("rId1", `${REL}/image`, "../media/image1.png"), rel("rId2", `${REL}/chart`, "../charts/chart1.xml")), "xl/media/image1.png": PNG, "xl/charts/chart1.xml": "<c/>" },
    });
    expect(new ReportPackager(withChart.pkg, withChart.sheet).hasCharts).toBe(true);
    const external = await template({ sheet: xml, sheetRels: rels(rel("rId1", `${REL}/chart`, "https://example.invalid/chart", true)) });
    expect(new ReportPackager(external.pkg, external.sheet).hasCharts).toBe(false);
    const loop = await template({
      sheet: xml,
      sheetRels: chartRels,
      extra: { "xl/drawings/drawing1.xml": "<d/>", "xl/drawings/_rels/drawing1.xml.rels": rels(rel("rId1", `${REL}/drawing`, "drawing1.xml"), rel("rId2", `${REL}/image`, "../media/image1.png")), "xl/media/image1.png": PNG },
    });
    const lp = new ReportPackager(loop.pkg, loop.sheet);
    expect(lp.hasCharts).toBe(false);
    // The copy follows the loop once: the drawing is written once, pointing at itself.
    const parts = await partsOf(lp.single(xml, "x", "n"));
    expect(parts.get("xl/drawings/_rels/drawing1.xml.rels")).toBe(rels(rel("rId1", `${REL}/drawing`, "drawing1.xml"), rel("rId2", `${REL}/image`, "../media/image1.png")));
  });
});

describe("parts the template package holds as changed (not as the zip's entries)", () => {
  it("copies their current contents: text parts as text, binary parts as bytes", async () => {
    const xml = worksheet("<sheetData/>");
    const t = await template({
      sheet: xml,
      sheetRels: rels(rel("rId1", `${REL}/drawing`, "../drawings/drawing1.xml")),
      extra: { "xl/drawings/drawing1.xml": "<d/>", "xl/drawings/_rels/drawing1.xml.rels": rels(rel("rId1", `${REL}/image`, "../media/image1.png")), "xl/media/image1.png": PNG },
    });
    t.pkg.write("xl/styles.xml", "<styleSheet>changed</styleSheet>");
    t.pkg.write("xl/theme/theme1.xml", "<theme>changed</theme>");
    t.pkg.write("xl/drawings/drawing1.xml", "<d>changed</d>");
    t.pkg.write("xl/media/image1.png", Buffer.from([1, 2, 3]));
    const parts = await partsOf(new ReportPackager(t.pkg, t.sheet).single(xml, "x", "n"));
    expect(parts.get("xl/styles.xml")).toBe("<styleSheet>changed</styleSheet>");
    expect(parts.get("xl/theme/theme1.xml")).toBe("<theme>changed</theme>");
    expect(parts.get("xl/drawings/drawing1.xml")).toBe("<d>changed</d>");
    expect(parts.get("xl/media/image1.png")).toBe("010203");
  });
});

describe("one workbook of many reports (for the office engine)", () => {
  const sheetRels = rels(rel("rId1", `${REL}/drawing`, "../drawings/drawing1.xml"), rel("rId2", `${REL}/comments`, "../comments1.xml"));
  const extra = {
    "xl/drawings/drawing1.xml": "<d/>",
    "xl/drawings/_rels/drawing1.xml.rels": rels(rel("rId1", `${REL}/image`, "../media/image1.png")),
    "xl/comments1.xml": "<comments/>",
    "xl/media/image1.png": PNG,
  };
  const names = PRINT + '<definedName name="_xlnm.Print_Titles" localSheetId="1">\'Client report\'!$1:$1,\'Client report\'!$A:$A</definedName>';

  it("each report a sheet: XML parts copied per report (.rN), binary parts once, print names renamed, later sheets unselected, cells outside the print area left out", async () => {
    const sheet = fitSheet({ cols: WIDE });
    const t = await template({ sheet, sheetRels, extra, names });
    const p = new ReportPackager(t.pkg, t.sheet);
    const report = (n: number) =>
      worksheet(`<sheetViews><sheetView tabSelected="1" workbookViewId="0"><selection activeCell="A1"/></sheetView></sheetViews><sheetData><row r="1"><c r="A1"><v>${n}</v></c><c r="D1"><v>99</v></c></row></sheetData>${'<pageSetup paperSize="9" orientation="portrait" fitToWidth="1" fitToHeight="1"/>'}`);
    const parts = await partsOf(p.combined([{ xml: report(1), name: "R1" }, { xml: report(2), name: "R2" }], "reports"));
    expect([...parts.keys()].sort()).toEqual([
      "[Content_Types].xml",
      "_rels/.rels",
      "docProps/core.xml",
      "docProps/custom.xml",
      "xl/_rels/workbook.xml.rels",
      "xl/comments1.r1.xml",
      "xl/comments1.r2.xml",
      "xl/drawings/_rels/drawing1.r1.xml.rels",
      "xl/drawings/_rels/drawing1.r2.xml.rels",
      "xl/drawings/drawing1.r1.xml",
      "xl/drawings/drawing1.r2.xml",
      "xl/media/image1.png",
      "xl/styles.xml",
      "xl/theme/theme1.xml",
      "xl/workbook.xml",
      "xl/worksheets/_rels/sheet1.xml.rels",
      "xl/worksheets/_rels/sheet2.xml.rels",
      "xl/worksheets/sheet1.xml",
      "xl/worksheets/sheet2.xml",
    ]);
    expect(parts.get("xl/worksheets/_rels/sheet2.xml.rels")).toBe(rels(rel("rId1", `${REL}/drawing`, "../drawings/drawing1.r2.xml"), rel("rId2", `${REL}/comments`, "../comments1.r2.xml")));
    expect(parts.get("xl/drawings/_rels/drawing1.r1.xml.rels")).toBe(rels(rel("rId1", `${REL}/image`, "../media/image1.png")));
    expect(parts.get("xl/drawings/_rels/drawing1.r2.xml.rels")).toBe(rels(rel("rId1", `${REL}/image`, "../media/image1.png")));
    // D1 is outside the print area A1:C4; the first sheet stays selected, the second is not; the
    // page setup has the fixed scale (75, below) in place of fitting one page.
    const fixed = `<pageSetup paperSize="9" orientation="portrait" scale="75"/>`;
    expect(parts.get("xl/worksheets/sheet1.xml")).toBe(worksheet(`<sheetViews><sheetView tabSelected="1" workbookViewId="0"><selection activeCell="A1"/></sheetView></sheetViews><sheetData><row r="1"><c r="A1"><v>1</v></c></row></sheetData>${fixed}`));
    expect(parts.get("xl/worksheets/sheet2.xml")).toBe(worksheet(`<sheetViews><sheetView workbookViewId="0"><selection activeCell="A1"/></sheetView></sheetViews><sheetData><row r="1"><c r="A1"><v>2</v></c></row></sheetData>${fixed}`));
    // "R1" looks like a cell reference: quoted.
    expect(parts.get("xl/workbook.xml")).toBe(
      `${HEAD}<workbook xmlns="${MAIN}" xmlns:r="${REL}"><workbookPr/><bookViews><workbookView activeTab="0"/></bookViews>` +
        '<sheets><sheet name="R1" sheetId="1" r:id="rIdS1"/><sheet name="R2" sheetId="2" r:id="rIdS2"/></sheets><definedNames>' +
        "<definedName name=\"_xlnm.Print_Area\" localSheetId=\"0\">'R1'!$A$1:$C$4</definedName><definedName name=\"_xlnm.Print_Titles\" localSheetId=\"0\">'R1'!$1:$1,'R1'!$A:$A</definedName>" +
        "<definedName name=\"_xlnm.Print_Area\" localSheetId=\"1\">'R2'!$A$1:$C$4</definedName><definedName name=\"_xlnm.Print_Titles\" localSheetId=\"1\">'R2'!$1:$1,'R2'!$A:$A</definedName>" +
        "</definedNames></workbook>",
    );
    expect(parts.get("xl/_rels/workbook.xml.rels")).toBe(
      rels(rel("rIdS1", `${REL}/worksheet`, "worksheets/sheet1.xml"), rel("rIdS2", `${REL}/worksheet`, "worksheets/sheet2.xml"), rel("rIdStyles", `${REL}/styles`, "styles.xml"), rel("rIdTheme", `${REL}/theme`, "theme/theme1.xml")),
    );
    expect(parts.get("docProps/custom.xml")).toMatch(/<vt:lpwstr>reports from a template, for conversion \(soilcell [^)]+ on \d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ\)<\/vt:lpwstr>/);
    expect(parts.get("docProps/core.xml")).toContain("<dc:title>reports</dc:title>");
    // Each renamed XML part keeps its content type; the shared image has its default (png).
    const ct = parts.get("[Content_Types].xml")!;
    expect([...ct.matchAll(/<Override PartName="([^"]+)" ContentType="([^"]+)"\/>/g)].map((m) => `${m[1]} ${m[2]!.replace(/^application\/vnd\.openxmlformats-(officedocument|package)\./, "")}`)).toEqual([
      `/xl/worksheets/sheet1.xml spreadsheetml.worksheet+xml`,
      "/xl/drawings/drawing1.r1.xml drawing+xml",
      "/xl/comments1.r1.xml spreadsheetml.comments+xml",
      `/xl/worksheets/sheet2.xml spreadsheetml.worksheet+xml`,
      "/xl/drawings/drawing1.r2.xml drawing+xml",
      "/xl/comments1.r2.xml spreadsheetml.comments+xml",
      "/xl/styles.xml spreadsheetml.styles+xml",
      "/xl/theme/theme1.xml theme+xml",
      "/xl/workbook.xml spreadsheetml.sheet.main+xml",
      "/docProps/core.xml core-properties+xml",
      "/docProps/custom.xml custom-properties+xml",
    ]);
  });

  it("the pageSetUpPr's fitToPage is dropped where the fixed scale is given", async () => {
    const t = await template({ sheet: fitSheet({ cols: WIDE, pr: '<pageSetUpPr autoPageBreaks="0" fitToPage="1"></pageSetUpPr>' }), names: PRINT });
    const p = new ReportPackager(t.pkg, t.sheet);
    const s = '<sheetPr><pageSetUpPr autoPageBreaks="0" fitToPage="1"></pageSetUpPr></sheetPr><sheetData/><pageSetup fitToWidth="1" fitToHeight="1" paperSize="9" orientation="portrait"></pageSetup>';
    // This report's page setup is written differently from the template's: only an exact match is swapped.
    const parts = await partsOf(p.combined([{ xml: worksheet(s), name: "One" }], "t"));
    expect(parts.get("xl/worksheets/sheet1.xml")).toBe(worksheet('<sheetPr><pageSetUpPr autoPageBreaks="0"></pageSetUpPr></sheetPr><sheetData/><pageSetup fitToWidth="1" fitToHeight="1" paperSize="9" orientation="portrait"></pageSetup>'));
    expect(p.fixedScale).toEqual({
      from: '<pageSetup paperSize="9" orientation="portrait" fitToWidth="1" fitToHeight="1"/>',
      to: '<pageSetup paperSize="9" orientation="portrait" scale="75"/>',
      prFrom: '<pageSetUpPr autoPageBreaks="0" fitToPage="1">',
      prTo: '<pageSetUpPr autoPageBreaks="0">',
      scale: 75,
    });
  });

  it("without a fixed scale the reports are copied as they are (a plain name unquoted)", async () => {
    const t = await template({ sheet: fitSheet({ pr: "" }), names: PRINT });
    const p = new ReportPackager(t.pkg, t.sheet);
    expect(p.fixedScale).toBeNull();
    const s = worksheet('<sheetViews><sheetView workbookViewId="0"/></sheetViews><sheetData/><pageSetup fitToWidth="1"/>');
    const parts = await partsOf(p.combined([{ xml: s, name: "Farm_One" }, { xml: s, name: "Farm One's" }], "t"));
    expect(parts.get("xl/worksheets/sheet1.xml")).toBe(s);
    expect(parts.get("xl/worksheets/sheet2.xml")).toBe(s); // nothing selected: unchanged
    expect(parts.get("xl/workbook.xml")).toContain(`<sheet name="Farm One's" sheetId="2" r:id="rIdS2"/>`);
    expect(parts.get("xl/workbook.xml")).toContain("<definedName name=\"_xlnm.Print_Area\" localSheetId=\"0\">Farm_One!$A$1:$C$4</definedName><definedName name=\"_xlnm.Print_Area\" localSheetId=\"1\">'Farm One''s'!$A$1:$C$4</definedName>");
  });

  it("a selected sheet view written as a self-closing tag stays self-closing; views after sheetData are not looked at", async () => {
    const t = await template({ sheet: fitSheet({ pr: "" }) });
    const p = new ReportPackager(t.pkg, t.sheet);
    const a = worksheet('<sheetViews><sheetView tabSelected="1" zoomScale="90"/></sheetViews><sheetData/>');
    const b = worksheet('<sheetData/><sheetView tabSelected="1"/>');
    const c = worksheet('<dimension ref="A1"/>'); // no sheetData, no sheetView
    const parts = await partsOf(p.combined([{ xml: a, name: "A" }, { xml: a, name: "B" }, { xml: b, name: "C" }, { xml: c, name: "D" }], "t"));
    expect(parts.get("xl/worksheets/sheet4.xml")).toBe(c);
    expect(parts.get("xl/worksheets/sheet2.xml")).toBe(worksheet('<sheetViews><sheetView zoomScale="90"/></sheetViews><sheetData/>'));
    expect(parts.get("xl/worksheets/sheet3.xml")).toBe(b);
  });

  it("print names of a plain-named template sheet are renamed where they stand (after a comma or parenthesis too), quoted forms too", async () => {
    const plain = '<definedName name="_xlnm.Print_Area" localSheetId="1">Report.A!$A$1:$B$2,Report.A!$D$1:$E$2</definedName><definedName name="_xlnm.print_titles" localSheetId="1">(Report.A!$1:$1)</definedName><definedName name="_xlnm.Print_Titles" localSheetId="1">XReport.A!$1:$1</definedName>';
    const t = await template({ sheet: fitSheet({ pr: "" }), names: plain, sheetName: "Report.A" });
    const p = new ReportPackager(t.pkg, t.sheet);
    const parts = await partsOf(p.combined([{ xml: worksheet("<sheetData/>"), name: "New one" }], "t"));
    // A name like XReport.A is another sheet's: left as written.
    expect(parts.get("xl/workbook.xml")).toContain(
      "<definedNames><definedName name=\"_xlnm.Print_Area\" localSheetId=\"0\">'New one'!$A$1:$B$2,'New one'!$D$1:$E$2</definedName><definedName name=\"_xlnm.print_titles\" localSheetId=\"0\">('New one'!$1:$1)</definedName><definedName name=\"_xlnm.Print_Titles\" localSheetId=\"0\">XReport.A!$1:$1</definedName></definedNames>",
    );
    // The dot of the name is a dot, not any character.
    const t2 = await template({ sheet: fitSheet({ pr: "" }), names: '<definedName name="_xlnm.Print_Area" localSheetId="1">ReportXA!$A$1:$B$2</definedName>', sheetName: "Report.A" });
    const parts2 = await partsOf(new ReportPackager(t2.pkg, t2.sheet).combined([{ xml: worksheet("<sheetData/>"), name: "N" }], "t"));
    expect(parts2.get("xl/workbook.xml")).toContain('<definedName name="_xlnm.Print_Area" localSheetId="0">ReportXA!$A$1:$B$2</definedName>');
    // A quoted template name with an apostrophe.
    const t3 = await template({ sheet: fitSheet({ pr: "" }), names: "<definedName name=\"_xlnm.Print_Area\" localSheetId=\"1\">'O''Neill 2025'!$A$1:$B$2</definedName>", sheetName: "O'Neill 2025" });
    const parts3 = await partsOf(new ReportPackager(t3.pkg, t3.sheet).combined([{ xml: worksheet("<sheetData/>"), name: "_Plain9" }, { xml: worksheet("<sheetData/>"), name: "2025" }], "t"));
    expect(parts3.get("xl/workbook.xml")).toContain('<definedName name="_xlnm.Print_Area" localSheetId="0">_Plain9!$A$1:$B$2</definedName>');
    expect(parts3.get("xl/workbook.xml")).toContain("<definedName name=\"_xlnm.Print_Area\" localSheetId=\"1\">'2025'!$A$1:$B$2</definedName>");
    // The single report keeps the template's name: the text as written.
    const one = await partsOf(new ReportPackager(t3.pkg, t3.sheet).single(worksheet("<sheetData/>"), "x", "n"));
    expect(one.get("xl/workbook.xml")).toContain("<definedName name=\"_xlnm.Print_Area\" localSheetId=\"0\">'O''Neill 2025'!$A$1:$B$2</definedName>");
  });

  it("only names matching _xlnm.Print_Area / _xlnm.Print_Titles exactly are print names", async () => {
    const names = '<definedName name="_xlnm.Print_Area_x" localSheetId="1">\'Client report\'!$A$1:$B$2</definedName><definedName name="x_xlnm.Print_Titles" localSheetId="1">\'Client report\'!$1:$1</definedName><definedName name="_xlnm.Print_Area">\'Client report\'!$A$1:$B$2</definedName>';
    const t = await template({ sheet: fitSheet({ pr: "" }), names });
    const parts = await partsOf(new ReportPackager(t.pkg, t.sheet).single(worksheet("<sheetData/>"), "x", "n"));
    expect(parts.get("xl/workbook.xml")).not.toContain("definedName");
  });
});

describe("cells outside the print area are left out for the office engine", () => {
  it("keeps the cells inside the rectangle, and everything that is not a cell of sheetData", async () => {
    const t = await template({ sheet: fitSheet(), names: '<definedName name="_xlnm.Print_Area" localSheetId="1">\'Client report\'!$B$2:$C$3</definedName>' });
    const p = new ReportPackager(t.pkg, t.sheet);
    const cells = (r: number) => ["A", "B", "C", "D"].map((c) => `<c r="${c}${r}"><v>${r}</v></c>`).join("");
    const xml = worksheet(
      `<sheetViews><sheetView workbookViewId="0"><selection activeCell="A1" sqref="A1"/></sheetView></sheetViews><sheetData>` +
        [1, 2, 3, 4].map((r) => `<row r="${r}">${cells(r)}</row>`).join("") +
        `<row r="5"><c s="1"/><c r="B5" s="2"/><c r="b2"><v>7</v></c></row></sheetData><extLst><ext><c r="Z99"/></ext></extLst>`,
    );
    expect(p.forPdf(xml)).toBe(
      worksheet(
        `<sheetViews><sheetView workbookViewId="0"><selection activeCell="A1" sqref="A1"/></sheetView></sheetViews><sheetData><row r="1"></row><row r="2"><c r="B2"><v>2</v></c><c r="C2"><v>2</v></c></row><row r="3"><c r="B3"><v>3</v></c><c r="C3"><v>3</v></c></row><row r="4"></row>` +
          `<row r="5"><c s="1"/><c r="b2"><v>7</v></c></row></sheetData><extLst><ext><c r="Z99"/></ext></extLst>`,
      ),
    ); // a cell without a reference, or one not in upper case, is not judged
  });

  it.each([
    ["two areas", "'Client report'!$A$1:$B$2,'Client report'!$D$1:$E$2"],
    ["one cell", "'Client report'!$A$1"],
    ["whole rows", "'Client report'!$1:$4"],
  ])("a print area of %s is not clipped to", async (_, text) => {
    const t = await template({ sheet: fitSheet(), names: `<definedName name="_xlnm.Print_Area" localSheetId="1">${text}</definedName>` });
    const p = new ReportPackager(t.pkg, t.sheet);
    const xml = worksheet('<sheetData><row r="9"><c r="Z9"><v>1</v></c></row></sheetData>');
    expect(p.forPdf(xml)).toBe(xml);
    expect(p.fixedScale).toBeNull();
  });

  it("a print area written without $ and with spaces around it, or with a sheet name, is read", async () => {
    for (const text of [" A2:B3 ", "'Client report'!A2:B3", "Sheet!$A2:B$3"]) {
      const t = await template({ sheet: fitSheet(), names: `<definedName name="_xlnm.Print_Area" localSheetId="1">${text}</definedName>` });
      const xml = worksheet('<sheetData><row r="1"><c r="A1"><v>1</v></c></row><row r="2"><c r="A2"><v>2</v></c><c r="C2"><v>3</v></c></row><row r="4"><c r="B4"><v>4</v></c></row></sheetData>');
      expect({ text, clip: new ReportPackager(t.pkg, t.sheet).forPdf(xml) }).toEqual({ text, clip: worksheet('<sheetData><row r="1"></row><row r="2"><c r="A2"><v>2</v></c></row><row r="4"></row></sheetData>') });
    }
  });

  it("the print area's edges are inside: A1:C4 keeps A1 and C4, drops D4 and C5", async () => {
    const t = await template({ sheet: fitSheet(), names: PRINT });
    const xml = worksheet('<sheetData><row r="1"><c r="A1"><v>1</v></c></row><row r="4"><c r="C4"><v>2</v></c><c r="D4"><v>3</v></c></row><row r="5"><c r="C5"><v>4</v></c></row></sheetData>');
    expect(new ReportPackager(t.pkg, t.sheet).forPdf(xml)).toBe(worksheet('<sheetData><row r="1"><c r="A1"><v>1</v></c></row><row r="4"><c r="C4"><v>2</v></c></row><row r="5"></row></sheetData>'));
  });
});

describe("the fixed scale that fits the print area on one page", () => {
  // A4 portrait (595.28 × 841.89 pt) less 0.7 in margins each side: 494.48 pt wide, 733.89 tall.
  // A1:C4 = 525 + 52.5 + 52.5 = 630 pt wide: 494.48 / 630 × 0.96 = 0.7535 → 75 %.
  it("from the column widths, the paper and the margins, with 4 % to spare", async () => {
    expect((await scaleOf({ cols: WIDE }))?.scale).toBe(75);
  });

  it("fits when everything fits: 100 % less 4 %", async () => {
    expect((await scaleOf({}))?.scale).toBe(96); // 3 default columns of 44.25 pt, 4 rows of 20 pt
  });

  it("paper sizes by their widths: Letter and Legal 612 pt → 511.2 / 630 → 77 %; A3 fits → 96 %; A5 419.53 pt → 318.73 / 630 → 48 %", async () => {
    const at = (code: string) => scaleOf({ cols: WIDE, setup: `<pageSetup paperSize="${code}" fitToWidth="1" fitToHeight="1"/>` });
    expect((await at("1"))?.scale).toBe(77);
    expect((await at("5"))?.scale).toBe(77);
    expect((await at("8"))?.scale).toBe(96);
    expect((await at("9"))?.scale).toBe(75);
    expect((await at("11"))?.scale).toBe(48);
  });

  // 4 rows of 200 pt (800 pt) in default columns (132.75 pt), top and bottom margins 0.75 in (108 pt).
  const tall = [1, 2, 3, 4].map((r) => `<row r="${r}" ht="200" customHeight="1"/>`).join("");
  it("paper sizes by their heights: Letter 684 / 800 → 82 %; Legal 900 → 96 %; A4 733.89 → 88 %; A3 → 96 %; A5 487.28 → 58 %", async () => {
    const at = (code: string) => scaleOf({ rows: tall, setup: `<pageSetup paperSize="${code}" fitToWidth="1" fitToHeight="1"/>` });
    expect((await at("1"))?.scale).toBe(82);
    expect((await at("5"))?.scale).toBe(96);
    expect((await at("9"))?.scale).toBe(88);
    expect((await at("8"))?.scale).toBe(96);
    expect((await at("11"))?.scale).toBe(58);
  });

  it("landscape swaps the paper's sides; no paper size is A4", async () => {
    // A4 landscape: 841.89 − 100.8 = 741.09 wide → fits; 595.28 − 108 = 487.28 tall → 58 % for 800 pt.
    expect((await scaleOf({ cols: WIDE, setup: '<pageSetup orientation="landscape" fitToWidth="1" fitToHeight="1"/>' }))?.scale).toBe(96);
    expect((await scaleOf({ rows: tall, setup: '<pageSetup orientation="landscape"/>' }))?.scale).toBe(58);
    expect((await scaleOf({ cols: WIDE, setup: '<pageSetup orientation="portrait"/>' }))?.scale).toBe(75);
    // Legal landscape: 1008 − 100.8 = 907.2 wide; 612 − 108 = 504 tall → 504 / 800 × 0.96 → 60 %.
    expect((await scaleOf({ cols: WIDE, setup: '<pageSetup paperSize="5" orientation="landscape"/>' }))?.scale).toBe(96);
    expect((await scaleOf({ rows: tall, setup: '<pageSetup paperSize="5" orientation="landscape"/>' }))?.scale).toBe(60);
  });

  it("the height can set the scale: 4 rows of 400 pt on A4's 733.89 pt → 44 %", async () => {
    const rows = [1, 2, 3, 4].map((r) => `<row r="${r}" ht="400" customHeight="true"/>`).join("");
    expect((await scaleOf({ rows }))?.scale).toBe(44); // 733.89 / 1600 × 0.96 = 0.4403
  });

  it("no smaller than 10 %, no larger than 100 %", async () => {
    expect((await scaleOf({ cols: '<cols><col min="1" max="3" width="2000"/></cols>' }))?.scale).toBe(10);
  });

  it("rows missing from the sheet have the default height; rows of their own height count it; hidden rows and columns do not count", async () => {
    // Rows 2 and 4 absent: 2 × 300 + 2 × 250 (default) = 1100 → 733.89 / 1100 × 0.96 = 0.6405 → 64.
    const rows = '<row r="1" ht="300" customHeight="1"/><row r="3" ht="300" customHeight="1"/><row r="9"/>';
    expect((await scaleOf({ rows, format: '<sheetFormatPr defaultRowHeight="250"/>' }))?.scale).toBe(64);
    // Row 3 hidden: 300 + 500 → 733.89 / 800 × 0.96 = 0.8807 → 88.
    for (const h of ["1", "true"]) {
      const hidden = `<row r="1" ht="300" customHeight="1"/><row r="3" hidden="${h}"/>`;
      expect((await scaleOf({ rows: hidden, format: '<sheetFormatPr defaultRowHeight="250"/>' }))?.scale).toBe(88);
    }
    // Not hidden ("0"), a row without a height of its own: none.
    expect(await scaleOf({ rows: '<row r="1" ht="300" customHeight="1"/><row r="3" hidden="0"/>', format: '<sheetFormatPr defaultRowHeight="250"/>' })).toBeNull();
    // Column A hidden ("1" or "true"): 52.5 + 52.5 fits.
    expect((await scaleOf({ cols: '<cols><col min="1" max="1" width="100" hidden="1"/><col min="2" max="3" width="10"/></cols>' }))?.scale).toBe(96);
    expect((await scaleOf({ cols: '<cols><col min="1" max="1" width="100" hidden="true"/><col min="2" max="3" width="10"/></cols>' }))?.scale).toBe(96);
    expect((await scaleOf({ cols: '<cols><col min="1" max="1" width="100" hidden="0"/><col min="2" max="3" width="10"/></cols>' }))?.scale).toBe(75);
  });

  it("the default column width is the sheet's, or 8.43; a column without a width has the default", async () => {
    // 3 × 100 characters (525 pt each) = 1575 → 494.48 / 1575 × 0.96 = 0.3014 → 30.
    expect((await scaleOf({ format: '<sheetFormatPr defaultRowHeight="15" defaultColWidth="100"/>' }))?.scale).toBe(30);
    expect((await scaleOf({ format: '<sheetFormatPr defaultRowHeight="15" defaultColWidth="100"/>', cols: '<cols><col min="1" max="3"/></cols>' }))?.scale).toBe(30);
    // No sheetFormatPr: columns default to 8.43 (44.25 pt), the last column 100 wide: 88.5 + 525 = 613.5 → 0.7738 → 77.
    expect((await scaleOf({ format: "", cols: '<cols><col min="3" max="3" width="100"/></cols>' }))?.scale).toBe(77);
    // ... and rows to 15 pt: 3 rows absent and one of 700 pt → 745 → 733.89 / 745 × 0.96 = 0.9457 → 94; one of 650 → 695 fits → 96.
    expect((await scaleOf({ format: "", rows: '<row r="2" ht="700" customHeight="1"/>' }))?.scale).toBe(94);
    expect((await scaleOf({ format: "", rows: '<row r="2" ht="650" customHeight="1"/>' }))?.scale).toBe(96);
    // A sheetFormatPr without defaultRowHeight keeps 15 pt.
    expect((await scaleOf({ format: '<sheetFormatPr baseColWidth="8"/>', rows: '<row r="2" ht="700" customHeight="1"/>' }))?.scale).toBe(94);
  });

  it("the margins are the sheet's (inches), each defaulting on its own", async () => {
    // Left and right 2 in: 595.28 − 288 = 307.28 → 307.28 / 630 × 0.96 = 0.4682 → 46.
    expect((await scaleOf({ cols: WIDE, margins: '<pageMargins left="2" right="2" top="0.75" bottom="0.75"/>' }))?.scale).toBe(46);
    // Only left given (2 in): right stays 0.7 → 595.28 − 194.4 = 400.88 → 61.
    expect((await scaleOf({ cols: WIDE, margins: '<pageMargins left="2"/>' }))?.scale).toBe(61);
    expect((await scaleOf({ cols: WIDE, margins: '<pageMargins right="2"/>' }))?.scale).toBe(61);
    // Top and bottom: 4 rows of 150 pt = 600 pt; top 3 in and bottom 3 in → 841.89 − 432 = 409.89 → 0.6558 → 65.
    const rows = [1, 2, 3, 4].map((r) => `<row r="${r}" ht="150" customHeight="1"/>`).join("");
    expect((await scaleOf({ rows, margins: '<pageMargins top="3" bottom="3"/>' }))?.scale).toBe(65);
    expect((await scaleOf({ rows, margins: '<pageMargins top="3"/>' }))?.scale).toBe(91); // 841.89 − 270 = 571.89 / 600 × 0.96 = 0.915
    expect((await scaleOf({ rows, margins: '<pageMargins bottom="3"/>' }))?.scale).toBe(91);
    expect((await scaleOf({ rows, margins: '<pageMargins left="0.7"/>' }))?.scale).toBe(96);
  });

  it.each([
    ["no fitToPage", { pr: '<pageSetUpPr fitToPage="0"/>' }],
    ["no pageSetUpPr", { pr: "" }],
    ["no pageSetup", { setup: "" }],
    ["two pages wide", { setup: '<pageSetup paperSize="9" fitToWidth="2" fitToHeight="1"/>' }],
    ["any number of pages tall", { setup: '<pageSetup paperSize="9" fitToWidth="1" fitToHeight="0"/>' }],
    ["a paper size not known", { setup: '<pageSetup paperSize="3" fitToWidth="1" fitToHeight="1"/>' }],
    ["a row of the area without a height of its own", { rows: '<row r="1" ht="20" customHeight="1"/><row r="2" ht="20"/>' }],
    ["a custom-height row without its height", { rows: '<row r="1" customHeight="1"/>' }],
    ["every column hidden", { cols: '<cols><col min="1" max="3" width="10" hidden="1"/></cols>' }],
    ["every row hidden", { rows: [1, 2, 3, 4].map((r) => `<row r="${r}" hidden="1"/>`).join("") }],
    ["margins wider than the paper", { margins: '<pageMargins left="5" right="5"/>' }],
    ["margins taller than the paper", { margins: '<pageMargins top="6" bottom="6"/>' }],
  ])("none when %s", async (_, o) => {
    expect(await scaleOf(o)).toBeNull();
  });

  it("a row outside the print area without a height does not matter; a hidden row without one neither", async () => {
    expect((await scaleOf({ rows: '<row r="1" ht="20" customHeight="1"/><row r="2" hidden="1"/><row r="9"/>' }))?.scale).toBe(96);
  });

  it("swaps self-closing and open tags alike; the found scale is kept (memo)", async () => {
    const t = await template({ sheet: fitSheet({ cols: WIDE, setup: '<pageSetup scale="50" paperSize="9" fitToWidth="1" fitToHeight="1" r:id="rId9"></pageSetup>', pr: '<pageSetUpPr fitToPage="true"/>' }), names: PRINT });
    const p = new ReportPackager(t.pkg, t.sheet);
    const f = p.fixedScale;
    expect(f).toEqual({
      from: '<pageSetup scale="50" paperSize="9" fitToWidth="1" fitToHeight="1" r:id="rId9">',
      to: '<pageSetup paperSize="9" r:id="rId9" scale="75">',
      prFrom: '<pageSetUpPr fitToPage="true"/>',
      prTo: "<pageSetUpPr/>",
      scale: 75,
    });
    expect(p.fixedScale).toBe(f);
  });
});
