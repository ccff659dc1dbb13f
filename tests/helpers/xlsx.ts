/**
 * Test helpers: hand-written workbooks (exact stored forms: plain, shared, array and dynamic-array
 * formulas, defined names, the 1904 date system) and a reader of what a written workbook caches.
 * Contents are invented.
 */
import fs from "fs";
import path from "path";
import { readBook } from "../../src/engine/book";
import { Scalar, XlError } from "../../src/engine/formula/values";
import { SOIL_NAMES } from "../../src/engine/soil";
import { openPackage } from "../../src/engine/xlsx-package";
import { writeZip } from "../../src/engine/zip";
import { recalcWorkbook, RecalcSummary } from "../../src/engine/recalc";
import { tempDir } from "./workbook";

export interface SheetSpec {
  readonly name: string;
  /** The rows, as they go inside <sheetData>. */
  readonly rows: string;
  /** Markup after sheetData (mergeCells, …). */
  readonly after?: string;
}

export interface BookSpec {
  readonly sheets: readonly SheetSpec[];
  readonly names?: readonly { name: string; text: string; localSheetId?: number }[];
  readonly date1904?: boolean;
  /** Adds xl/metadata.xml with Excel's dynamic-array entry (cm="1"). */
  readonly dynamic?: boolean;
}

const NS = 'xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"';

const esc = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

/** The bytes of a workbook built from the spec. */
export function xlsxBytes(spec: BookSpec): Buffer {
  const parts: { name: string; data: Buffer }[] = [];
  const add = (name: string, text: string) => parts.push({ name, data: Buffer.from(text, "utf8") });
  const overrides = spec.sheets.map((_, i) => `<Override PartName="/xl/worksheets/sheet${i + 1}.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>`).join("");
  add(
    "[Content_Types].xml",
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>${overrides}${spec.dynamic ? '<Override PartName="/xl/metadata.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheetMetadata+xml"/>' : ""}</Types>`,
  );
  add("_rels/.rels", '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>');
  const sheets = spec.sheets.map((s, i) => `<sheet name="${esc(s.name)}" sheetId="${i + 1}" r:id="rId${i + 1}"/>`).join("");
  const names = spec.names?.length
    ? `<definedNames>${spec.names.map((n) => `<definedName name="${esc(n.name)}"${n.localSheetId !== undefined ? ` localSheetId="${n.localSheetId}"` : ""}>${esc(n.text)}</definedName>`).join("")}</definedNames>`
    : "";
  add("xl/workbook.xml", `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<workbook ${NS}>${spec.date1904 ? '<workbookPr date1904="1"/>' : ""}<sheets>${sheets}</sheets>${names}</workbook>`);
  const rels = spec.sheets.map((_, i) => `<Relationship Id="rId${i + 1}" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet${i + 1}.xml"/>`).join("");
  const meta = spec.dynamic ? `<Relationship Id="rId${spec.sheets.length + 1}" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sheetMetadata" Target="metadata.xml"/>` : "";
  add("xl/_rels/workbook.xml.rels", `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">${rels}${meta}</Relationships>`);
  spec.sheets.forEach((s, i) => add(`xl/worksheets/sheet${i + 1}.xml`, `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet ${NS}><sheetData>${s.rows}</sheetData>${s.after ?? ""}</worksheet>`));
  if (spec.dynamic) {
    add(
      "xl/metadata.xml",
      '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<metadata xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:xda="http://schemas.microsoft.com/office/spreadsheetml/2017/dynamicarray"><metadataTypes count="1"><metadataType name="XLDAPR" minSupportedVersion="120000" copy="1" pasteAll="1" pasteValues="1" merge="1" splitFirst="1" rowColShift="1" clearFormats="1" clearComments="1" assign="1" coerce="1" cellMeta="1"/></metadataTypes><futureMetadata name="XLDAPR" count="1"><bk><extLst><ext uri="{bdbb8cdc-fa1e-496e-a857-3c3f30c029c3}"><xda:dynamicArrayProperties fDynamic="1" fCollapsed="0"/></ext></extLst></bk></futureMetadata><cellMetadata count="1"><bk><rc t="1" v="0"/></bk></cellMetadata></metadata>',
    );
  }
  return writeZip(parts);
}

/** A cell's markup: `c("A1", 5)`, `c("B1", "text")`, `f("C1", "A1*2")` (no cached value), `f("C1","A1*2",10)`. */
export function c(ref: string, v: number | string | boolean): string {
  if (typeof v === "number") return `<c r="${ref}"><v>${v}</v></c>`;
  if (typeof v === "boolean") return `<c r="${ref}" t="b"><v>${v ? 1 : 0}</v></c>`;
  return `<c r="${ref}" t="inlineStr"><is><t>${esc(v)}</t></is></c>`;
}

export function f(ref: string, formula: string, cached?: number | string, attrs = ""): string {
  const v = cached === undefined ? "" : typeof cached === "number" ? `<v>${cached}</v>` : `<v>${esc(cached)}</v>`;
  const t = typeof cached === "string" ? ' t="str"' : "";
  return `<c r="${ref}"${t}><f${attrs}>${esc(formula)}</f>${v}</c>`;
}

/** A dynamic-array formula in Excel's stored form (cm="1", t="array" with its spill range). */
export function da(ref: string, spill: string, formula: string, cached?: number): string {
  return `<c r="${ref}" cm="1"><f t="array" ref="${spill}">${esc(formula)}</f>${cached === undefined ? "" : `<v>${cached}</v>`}</c>`;
}

export function row(n: number, ...cells: string[]): string {
  return `<row r="${n}">${cells.join("")}</row>`;
}

/** Every cached value of a workbook file: "Sheet!A1" → value (errors as their code). */
export async function cachedValues(file: string): Promise<Map<string, Scalar | string>> {
  const pkg = await openPackage(fs.readFileSync(file));
  const book = readBook(pkg, SOIL_NAMES);
  const out = new Map<string, Scalar | string>();
  const letters = (col: number) => {
    let n = col + 1;
    let s = "";
    while (n > 0) {
      s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
      n = Math.floor((n - 1) / 26);
    }
    return s;
  };
  for (const sheet of book.sheets) {
    const cells = sheet.cells;
    for (let k = 0; k < cells.n; k++) {
      const v = cells.value(k);
      out.set(`${sheet.name}!${letters(cells.col[k] as number)}${(cells.row[k] as number) + 1}`, v instanceof XlError ? v.code : v);
    }
  }
  return out;
}

/** Writes the spec, recalculates it, and returns the summary and the output's cached values. */
export async function recalcSpec(spec: BookSpec): Promise<{ summary: RecalcSummary; values: Map<string, Scalar | string>; output: string; input: string }> {
  const dir = tempDir("soilcell-spec-");
  const input = path.join(dir, "in.xlsx");
  fs.writeFileSync(input, xlsxBytes(spec));
  const output = path.join(dir, "out.xlsx");
  const summary = await recalcWorkbook(input, output);
  return { summary, values: await cachedValues(output), output, input };
}
