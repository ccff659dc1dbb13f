/** Test helpers: build small workbooks with ExcelJS (invented contents) and read parts back. */
import ExcelJS from "exceljs";
import JSZip from "jszip";
import fs from "fs";
import os from "os";
import path from "path";

export function tempDir(prefix = "soilcell-test-"): string {
  return fs.mkdtempSync(path.join(os.tmpdir(), prefix));
}

export async function writeWorkbook(file: string, build: (wb: ExcelJS.Workbook) => void): Promise<string> {
  const wb = new ExcelJS.Workbook();
  build(wb);
  await wb.xlsx.writeFile(file);
  return file;
}

export async function readPart(file: string, part: string): Promise<string | undefined> {
  const zip = await JSZip.loadAsync(fs.readFileSync(file));
  return zip.file(part)?.async("string");
}

export async function partNames(file: string): Promise<string[]> {
  const zip = await JSZip.loadAsync(fs.readFileSync(file));
  return Object.keys(zip.files).filter((n) => !zip.files[n]!.dir).sort();
}

export async function cellValues(file: string, sheet: string): Promise<Map<string, unknown>> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(file);
  const ws = wb.getWorksheet(sheet)!;
  const out = new Map<string, unknown>();
  ws.eachRow({ includeEmpty: false }, (row) => row.eachCell({ includeEmpty: false }, (cell) => out.set(cell.address, cell.value)));
  return out;
}
