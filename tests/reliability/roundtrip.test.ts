/**
 * Round-trip fidelity: a workbook with many features goes through recalc, and everything
 * recalculation does not compute is identical afterwards. Parts are compared byte for byte
 * (except the patched sheets and the two parts that gain the dynamic-array metadata entry); in a
 * patched sheet everything outside sheetData is identical, and so is every cell that holds no
 * formula and is not in a spill. Contents are invented. ExcelJS cannot create charts, so the
 * drawing part here holds an image (our own icon).
 */
import fs from "fs";
import path from "path";
import ExcelJS from "exceljs";
import JSZip from "jszip";
import { recalcWorkbook } from "../../src/engine/recalc";
import { parseRange } from "../../src/engine/cellref";
import { decodeXml } from "../../src/engine/xlsx-package";
import { tempDir } from "../helpers/workbook";

async function featureRich(file: string): Promise<void> {
  const wb = new ExcelJS.Workbook();
  wb.creator = "invented";
  wb.created = new Date(Date.UTC(2024, 2, 1));
  const lab = wb.addWorksheet("Lab data", { views: [{ state: "frozen", xSplit: 1, ySplit: 1 }], properties: { tabColor: { argb: "FF009E73" } } });
  lab.columns = [{ width: 14 }, { width: 12 }, { width: 12 }, { width: 12 }, { width: 16 }, { width: 20 }];
  lab.addRow(["sample", "Ca mg/kg", "Mg mg/kg", "Ca cmol", "sampled", "note"]);
  const rows: [string, number, number, Date][] = [
    ["P1", 2003.9, 243.05, new Date(Date.UTC(2024, 3, 2))],
    ["P2", 1001.95, 121.5, new Date(Date.UTC(2024, 3, 3, 9, 30))],
    ["P3", 400.78, 60.76, new Date(Date.UTC(2024, 3, 4))],
  ];
  rows.forEach(([s, ca, mg, d], i) => {
    const r = lab.getRow(i + 2);
    r.getCell(1).value = s;
    r.getCell(2).value = ca;
    r.getCell(3).value = mg;
    r.getCell(5).value = d;
    r.getCell(5).numFmt = "yyyy-mm-dd hh:mm";
  });
  lab.getCell("D2").value = { formula: 'SOIL.CMOL(B2:B4,"Ca")' } as never; // spills D2:D4
  lab.getCell("G2").value = { formula: 'SOIL.CEC(B2,C2,0,0,"mg/kg")' } as never;
  lab.getCell("H2").value = { formula: "SUM(B2:B4)" } as never;
  lab.getCell("H3").value = { formula: 'IF(B3>1000,"high","low")' } as never;
  lab.getCell("F2").value = { richText: [{ text: "bold ", font: { bold: true } }, { text: "and blue", font: { color: { argb: "FF0072B2" } } }] };
  lab.getCell("F3").value = { text: "extension bulletin", hyperlink: "https://example.org/invented" };
  lab.getCell("F4").value = { text: "to the farm sheet", hyperlink: "#'O''Brien''s farm'!A1" };
  lab.getCell("A1").font = { bold: true, size: 12, name: "Calibri" };
  lab.getCell("B2").fill = { type: "pattern", pattern: "solid", fgColor: { argb: "FFF0E442" } };
  lab.getCell("B3").border = { top: { style: "thin" }, bottom: { style: "double", color: { argb: "FFD55E00" } } };
  lab.getCell("B4").numFmt = "#,##0.00";
  lab.getCell("C2").alignment = { horizontal: "center", wrapText: true };
  lab.getCell("A2").note = "invented sample id";
  lab.getCell("C3").note = { texts: [{ text: "a note with " }, { text: "formatting", font: { italic: true } }] } as never;
  lab.mergeCells("A6:C6");
  lab.getCell("A6").value = "merged heading";
  lab.getCell("B2").dataValidation = { type: "decimal", operator: "between", allowBlank: true, formulae: [0, 100000], showErrorMessage: true, error: "mg/kg from 0" };
  lab.getCell("A2").dataValidation = { type: "list", allowBlank: false, formulae: ['"P1,P2,P3,P4"'] };
  lab.addConditionalFormatting({
    ref: "B2:B4",
    rules: [{ type: "cellIs", operator: "greaterThan", formulae: [1500], priority: 1, style: { fill: { type: "pattern", pattern: "solid", bgColor: { argb: "FFCC79A7" } } } }],
  });
  lab.addConditionalFormatting({ ref: "C2:C4", rules: [{ type: "dataBar", priority: 2, cfvo: [{ type: "min" }, { type: "max" }], color: { argb: "FF56B4E9" } } as never] });
  const icon = wb.addImage({ buffer: fs.readFileSync(path.join(__dirname, "../../assets/icon-64.png")) as never, extension: "png" });
  lab.addImage(icon, "I2:J5");
  lab.autoFilter = "A1:F4";

  const farm = wb.addWorksheet("O'Brien's farm");
  farm.getCell("A1").value = "paddock";
  farm.getCell("B1").value = { formula: "'Lab data'!B2*2" } as never;
  farm.getCell("C1").value = { formula: "SOIL.CMOL('Lab data'!B3,\"Ca\")" } as never;
  farm.getCell("D1").value = { formula: "SOIL.CONVERT(firstCa,\"mg/kg\",\"kg/ha\",15,1.3)" } as never;
  farm.getCell("A2").value = 3.14159;
  farm.getCell("A2").numFmt = "0.000";
  farm.getCell("A3").value = true;
  farm.getCell("A4").value = { error: "#N/A" } as never;
  farm.getCell("A5").value = "text with <markup> & \"quotes\"";
  farm.pageSetup = { orientation: "landscape", fitToPage: true };
  farm.headerFooter = { oddFooter: "invented footer &P" };

  const notes = wb.addWorksheet("Notes & sources");
  notes.getCell("A1").value = "no formulas on this sheet";
  notes.getCell("A2").value = new Date(Date.UTC(2023, 11, 31));
  notes.state = "visible";
  wb.definedNames.add("'Lab data'!$B$2", "firstCa");
  wb.definedNames.add("'O''Brien''s farm'!$A$1:$A$5", "farmColumn");
  await wb.xlsx.writeFile(file);
}

async function parts(file: string): Promise<Map<string, Buffer>> {
  const zip = await JSZip.loadAsync(fs.readFileSync(file));
  const out = new Map<string, Buffer>();
  for (const [n, f] of Object.entries(zip.files)) if (!f.dir) out.set(n, await f.async("nodebuffer"));
  return out;
}

const CELL = /<c\b[^>]*?(?:\/>|>[\s\S]*?<\/c>)/g;
const ref = (cell: string) => /^<c\b[^>]*?\sr="([A-Z]+\d+)"/.exec(cell)![1]!;

function cellsOf(xml: string): Map<string, string> {
  const data = /<sheetData>[\s\S]*<\/sheetData>/.exec(xml)?.[0] ?? "";
  return new Map([...data.matchAll(CELL)].map((m) => [ref(m[0]), m[0]]));
}

function inRange(cell: string, range: string): boolean {
  const r = parseRange(range);
  const m = /^([A-Z]+)(\d+)$/.exec(cell)!;
  const c = parseRange(`${m[1]}${m[2]}`).top;
  return c.row >= r.top.row && c.row < r.top.row + r.rows && c.col >= r.top.col && c.col < r.top.col + r.cols;
}

describe("recalc round trip of a feature-rich workbook", () => {
  let before: Map<string, Buffer>;
  let after: Map<string, Buffer>;
  let output: string;
  beforeAll(async () => {
    const dir = tempDir();
    const input = path.join(dir, "rich.xlsx");
    await featureRich(input);
    output = path.join(dir, "rich.recalc.xlsx");
    const s = await recalcWorkbook(input, output);
    expect(s.errors).toEqual([]);
    expect(s.soilFormulaCells).toBe(4);
    before = await parts(input);
    after = await parts(output);
  });

  it("keeps every part and adds only the dynamic-array metadata", () => {
    expect([...after.keys()].sort()).toEqual([...before.keys(), "xl/metadata.xml"].sort());
    expect([...before.keys()]).toEqual(expect.arrayContaining(["xl/drawings/drawing1.xml", "xl/media/image1.png", "xl/comments1.xml", "xl/styles.xml", "docProps/core.xml"]));
  });

  it("every part it does not patch is byte for byte the same", () => {
    const patched = new Set(["xl/worksheets/sheet1.xml", "xl/worksheets/sheet2.xml", "[Content_Types].xml", "xl/_rels/workbook.xml.rels"]);
    const same = [...before.keys()].filter((p) => !patched.has(p));
    expect(same.length).toBeGreaterThan(10);
    for (const p of same) expect({ part: p, same: after.get(p)!.equals(before.get(p)!) }).toEqual({ part: p, same: true });
    expect(after.get("xl/worksheets/sheet3.xml")!.equals(before.get("xl/worksheets/sheet3.xml")!)).toBe(true); // the sheet without formulas
  });

  it("content types and workbook relationships differ only by the metadata entry", () => {
    const types = after.get("[Content_Types].xml")!.toString().replace(/<Override PartName="\/xl\/metadata\.xml"[^>]*\/>/, "");
    expect(types).toBe(before.get("[Content_Types].xml")!.toString());
    const rels = after.get("xl/_rels/workbook.xml.rels")!.toString().replace(/<Relationship Id="rId\d+" Type="[^"]*\/sheetMetadata" Target="metadata\.xml"\/>/, "");
    expect(rels).toBe(before.get("xl/_rels/workbook.xml.rels")!.toString());
  });

  it.each([
    ["Lab data", "xl/worksheets/sheet1.xml"],
    ["O'Brien's farm", "xl/worksheets/sheet2.xml"],
  ])("in the patched sheet %s, everything outside sheetData and every non-formula cell is the same", (_, part) => {
    const b = before.get(part)!.toString();
    const a = after.get(part)!.toString();
    const strip = (s: string) => s.replace(/<sheetData>[\s\S]*<\/sheetData>/, "");
    expect(strip(a)).toBe(strip(b));
    const cellsBefore = cellsOf(b);
    const cellsAfter = cellsOf(a);
    const spills = [...a.matchAll(/<f t="array" ref="([A-Z]+\d+(?::[A-Z]+\d+)?)"/g)].map((m) => m[1]!);
    let compared = 0;
    for (const [r, xml] of cellsBefore) {
      if (/<f\b/.test(xml) || spills.some((s) => inRange(r, s))) continue;
      expect({ cell: r, xml: cellsAfter.get(r) }).toEqual({ cell: r, xml });
      compared += 1;
    }
    expect(compared).toBeGreaterThanOrEqual(5);
    // formula cells keep their formula: native ones byte for byte, ours in Excel's stored form
    // (the same text; the writer may choose other character escapes)
    for (const [r, xml] of cellsBefore) {
      const f = /<f>([^<]*)<\/f>/.exec(xml)?.[1];
      if (!f) continue;
      const out = cellsAfter.get(r)!;
      if (/SOIL\./.test(f)) expect(decodeXml(/<f[^>]*>([^<]*)<\/f>/.exec(out)![1]!)).toBe(decodeXml(f).replace(/SOIL\.([A-Z]+)/g, "_xldudf_SOIL_$1"));
      else expect(out).toContain(`<f>${f}</f>`);
    }
  });

  it("the computed values are there, and the file reads back in ExcelJS with its features", async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(output);
    const lab = wb.getWorksheet("Lab data")!;
    expect((lab.getCell("D2").value as { result: number }).result).toBeCloseTo(10, 9); // Source: IUPAC/CIAAW weights, 200.39 mg/kg per cmol(+)/kg
    expect(lab.getCell("D4").value).toBeCloseTo(2, 9);
    expect((lab.getCell("H2").value as { result: number }).result).toBeCloseTo(3406.63, 9);
    expect(lab.getCell("B2").dataValidation).toMatchObject({ type: "decimal" });
    expect(lab.getCell("A6").isMerged).toBe(true);
    expect(lab.views[0]).toMatchObject({ state: "frozen", xSplit: 1, ySplit: 1 });
    expect(lab.getCell("F3").hyperlink).toBe("https://example.org/invented");
    expect(lab.getImages()).toHaveLength(1);
    const farm = wb.getWorksheet("O'Brien's farm")!;
    expect((farm.getCell("B1").value as { result: number }).result).toBeCloseTo(4007.8, 9);
    expect((farm.getCell("C1").value as { result: number }).result).toBeCloseTo(5, 9);
    expect((farm.getCell("D1").value as { result: number }).result).toBeCloseTo(3907.605, 6); // derived: 2003.9 mg/kg × 15 cm × 1.3 g/cm3 × 0.1
    expect(farm.getCell("A5").value).toBe('text with <markup> & "quotes"');
  });
});
