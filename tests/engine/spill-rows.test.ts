/**
 * Spills into rows the sheet part does not have: a sheet written by a program that leaves empty
 * rows out (as Excel does) gets the spilled cells in new rows, in row order, and in an existing row
 * in column order; nothing else in the part changes. Workbook contents are invented; values from
 * IUPAC/CIAAW atomic weights (source: 200.39 mg/kg Ca is 1 cmol(+)/kg, as tests/core).
 */
import fs from "fs";
import path from "path";
import { recalcWorkbook } from "../../src/engine/recalc";
import { baseWorkbook, partsOf, zipOf } from "../reliability/hostile-files";
import { cellValues, readPart, tempDir } from "../helpers/workbook";

const SHEET = "xl/worksheets/sheet1.xml";

// Row 1: a spill down A1:A4 and a value in C1. Row 2 absent. Row 3 holds only B3. Rows 4 and 5
// absent. Row 6: a value in A6 and a spill down B6:B7; row 7 absent, past the last row.
const SHEET_DATA =
  "<sheetData>" +
  '<row r="1"><c r="A1"><f>SOIL.CMOL({200.39;400.78;601.17;801.56},"Ca")</f></c><c r="C1"><v>7</v></c></row>' +
  '<row r="3"><c r="B3"><v>5</v></c></row>' +
  '<row r="6"><c r="A6"><v>1</v></c><c r="B6"><f>SOIL.CMOL({200.39;400.78},"Ca")</f></c></row>' +
  "</sheetData>";

let xml: string;
let values: Map<string, unknown>;
beforeAll(async () => {
  const dir = tempDir();
  const parts = await partsOf(await baseWorkbook());
  const sheet = parts.get(SHEET)!.toString("utf8");
  parts.set(SHEET, Buffer.from(sheet.replace(/<sheetData[\s\S]*<\/sheetData>|<sheetData\/>/, SHEET_DATA)));
  const input = path.join(dir, "gaps.xlsx");
  fs.writeFileSync(input, zipOf(parts));
  const output = path.join(dir, "out.xlsx");
  const summary = await recalcWorkbook(input, output);
  expect(summary.errors).toEqual([]);
  expect(summary.spilledCells).toBe(4);
  xml = (await readPart(output, SHEET))!;
  values = await cellValues(output, "Lab");
});

const rowNumbers = () => [...xml.matchAll(/<row r="(\d+)"/g)].map((m) => Number(m[1]));
const rowXml = (r: number) => new RegExp(`<row r="${r}"[^>]*>([\\s\\S]*?)</row>`).exec(xml)?.[1] ?? "";
const cellRefs = (r: number) => [...rowXml(r).matchAll(/<c r="([A-Z]+\d+)"/g)].map((m) => m[1]);

describe("a spill into absent rows", () => {
  it("adds the missing rows 2, 4 and 7 in row order, and no row it does not need (5)", () => {
    expect(rowNumbers()).toEqual([1, 2, 3, 4, 6, 7]);
  });
  it("puts A3 before B3 in the existing row 3, and keeps every cell already there", () => {
    expect(cellRefs(1)).toEqual(["A1", "C1"]);
    expect(cellRefs(3)).toEqual(["A3", "B3"]);
    expect(cellRefs(6)).toEqual(["A6", "B6"]);
    expect(cellRefs(2)).toEqual(["A2"]);
    expect(cellRefs(4)).toEqual(["A4"]);
    expect(cellRefs(7)).toEqual(["B7"]);
  });
  it("writes the spilled values where they belong, and leaves the other values as they were", () => {
    expect((values.get("A1") as { result: number }).result).toBeCloseTo(1, 12);
    expect(values.get("A2")).toBeCloseTo(2, 12);
    expect(values.get("A3")).toBeCloseTo(3, 12);
    expect(values.get("A4")).toBeCloseTo(4, 12);
    expect((values.get("B6") as { result: number }).result).toBeCloseTo(1, 12);
    expect(values.get("B7")).toBeCloseTo(2, 12);
    expect(values.get("B3")).toBe(5);
    expect(values.get("C1")).toBe(7);
    expect(values.get("A6")).toBe(1);
    expect(values.get("A5")).toBeUndefined();
  });
  it("declares each spill's range on its formula", () => {
    expect(xml).toMatch(/<c r="A1"[^>]*><f t="array" ref="A1:A4">/);
    expect(xml).toMatch(/<c r="B6"[^>]*><f t="array" ref="B6:B7">/);
  });
});
