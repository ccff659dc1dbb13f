/**
 * recalc: a workbook in, values out, untouched content preserved, Excel's stored form written.
 * Workbook contents are invented; expected SOIL values are the handbook checks of tests/core
 * (Source: IUPAC/CIAAW atomic weights → 200.39 mg/kg Ca per cmol(+)/kg; UNIT-16 layer mass).
 */
import fs from "fs";
import path from "path";
import { recalcWorkbook, defaultOutputPath, RecalcRefused } from "../../src/engine/recalc";
import { WorkbookFileError } from "../../src/engine/xlsx-package";
import { cellValues, partNames, readPart, tempDir, writeWorkbook } from "../helpers/workbook";

async function sample(dir: string): Promise<string> {
  return writeWorkbook(path.join(dir, "season.xlsx"), (wb) => {
    const ws = wb.addWorksheet("Lab");
    ws.addRow(["sample", "Ca mg/kg", "Ca cmol", "double"]);
    ws.addRow(["P1", 2003.9]);
    ws.addRow(["P2", "1001.95"]);
    ws.addRow(["P3", null]);
    ws.addRow(["P4", -5]);
    ws.getCell("C2").value = { formula: 'SOIL.CMOL(B2:B5,"Ca")', date1904: false } as never;
    ws.getCell("D2").value = { formula: "C2*2" } as never;
    ws.getCell("E2").value = { formula: 'SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)' } as never;
    ws.getCell("B2").font = { bold: true, color: { argb: "FF0072B2" } };
    ws.getCell("A1").note = "invented sample ids";
    ws.mergeCells("G1:H1");
    ws.getCell("G1").value = "merged";
    ws.getCell("B3").numFmt = "0.00";
    const other = wb.addWorksheet("Notes");
    other.getCell("A1").value = "untouched";
    other.getCell("B1").value = { formula: "LEN(A1)" } as never;
    wb.definedNames.add("Lab!$B$2", "firstCa");
    ws.getCell("F2").value = { formula: 'SOIL.CMOL(firstCa,"Ca")' } as never;
  });
}

describe("recalcWorkbook", () => {
  let dir: string;
  let input: string;
  let output: string;
  let summary: Awaited<ReturnType<typeof recalcWorkbook>>;
  beforeAll(async () => {
    dir = tempDir();
    input = await sample(dir);
    output = path.join(dir, "out.xlsx");
    summary = await recalcWorkbook(input, output);
  });

  it("computes SOIL formulas, spills a column, and updates dependants", async () => {
    const v = await cellValues(output, "Lab");
    expect((v.get("C2") as { result: number }).result).toBeCloseTo(10, 10);
    expect(v.get("C3")).toBeCloseTo(5, 10);
    expect(v.get("C4")).toBeUndefined(); // blank in, blank out
    expect(v.get("C5")).toEqual({ error: "#VALUE!" });
    expect((v.get("D2") as { result: number }).result).toBeCloseTo(20, 10);
    expect((v.get("E2") as { result: number }).result).toBeCloseTo(19.5, 10);
    expect((v.get("F2") as { result: number }).result).toBeCloseTo(10, 10);
  });

  it("writes Excel's stored form: _xldudf_, array formula with the spill range, cm and metadata.xml", async () => {
    const xml = (await readPart(output, "xl/worksheets/sheet1.xml"))!;
    expect(xml).toContain('<c r="C2" cm="1"><f t="array" ref="C2:C5">_xldudf_SOIL_CMOL(B2:B5,&quot;Ca&quot;)</f>');
    expect(await readPart(output, "xl/metadata.xml")).toContain("XLDAPR");
    expect(await readPart(output, "[Content_Types].xml")).toContain("/xl/metadata.xml");
  });

  it("reports each failing cell with sheet, cell, formula and message", () => {
    expect(summary.errors).toEqual([
      { sheet: "Lab", cell: "C5", formula: '=SOIL.CMOL(B2:B5,"Ca")', error: "#VALUE!", message: "mg_per_kg must be at least 0 mg/kg (got -5 mg/kg)" },
    ]);
    expect(summary.soilFormulaCells).toBe(3);
    expect(summary.spilledCells).toBe(3);
  });

  it("keeps every part, and every part it does not compute byte for byte", async () => {
    const before = await partNames(input);
    const after = await partNames(output);
    expect(after).toEqual([...before, "xl/metadata.xml"].sort());
    for (const part of before) {
      if (part === "xl/worksheets/sheet1.xml" || part === "xl/worksheets/sheet2.xml" || part === "[Content_Types].xml" || part === "xl/_rels/workbook.xml.rels") continue;
      expect(await readPart(output, part)).toBe(await readPart(input, part));
    }
  });

  it("keeps styles, merges, comments, number formats and defined names", async () => {
    const xml = (await readPart(output, "xl/worksheets/sheet1.xml"))!;
    const orig = (await readPart(input, "xl/worksheets/sheet1.xml"))!;
    expect(xml).toContain('<mergeCell ref="G1:H1"/>');
    expect(xml.match(/<c r="B2"[^>]*>/)![0]).toBe(orig.match(/<c r="B2"[^>]*>/)![0]);
    expect(xml.match(/<c r="B3"[^>]*>/)![0]).toBe(orig.match(/<c r="B3"[^>]*>/)![0]);
    // outside sheetData nothing changed
    const strip = (s: string) => s.replace(/<sheetData>[\s\S]*<\/sheetData>/, "");
    expect(strip(xml)).toBe(strip(orig));
  });

  it("a second recalc of its own output is stable", async () => {
    const again = path.join(dir, "again.xlsx");
    await recalcWorkbook(output, again);
    expect(await readPart(again, "xl/worksheets/sheet1.xml")).toBe(await readPart(output, "xl/worksheets/sheet1.xml"));
  });

  it("refuses to write over its input, and leaves it untouched", async () => {
    const bytes = fs.readFileSync(input);
    await expect(recalcWorkbook(input, input)).rejects.toBeInstanceOf(RecalcRefused);
    await expect(recalcWorkbook(input, path.join(dir, ".", "season.xlsx"))).rejects.toBeInstanceOf(RecalcRefused);
    expect(fs.readFileSync(input).equals(bytes)).toBe(true);
  });

  it("defaults the output beside the input with a suffix", () => {
    expect(defaultOutputPath("/a/b/season.xlsx")).toBe("/a/b/season.recalc.xlsx");
  });

  it("a file that is not a workbook is a plain error", async () => {
    const bad = path.join(dir, "bad.xlsx");
    fs.writeFileSync(bad, "not a zip");
    await expect(recalcWorkbook(bad, path.join(dir, "bad-out.xlsx"))).rejects.toBeInstanceOf(WorkbookFileError);
    const truncated = path.join(dir, "truncated.xlsx");
    fs.writeFileSync(truncated, fs.readFileSync(input).subarray(0, 2000));
    await expect(recalcWorkbook(truncated, path.join(dir, "t-out.xlsx"))).rejects.toBeInstanceOf(WorkbookFileError);
    expect(fs.existsSync(path.join(dir, "t-out.xlsx"))).toBe(false);
  });
});
