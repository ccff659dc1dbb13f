/**
 * Hostile and broken .xlsx files for the reliability tests, built from a small valid workbook
 * (invented contents: one sheet, a Ca value and a SOIL.CMOL formula).
 */
import ExcelJS from "exceljs";
import JSZip from "jszip";
import { Entry, writeZip } from "./zip-writer";

export type Parts = Map<string, Buffer>;

/** A small valid workbook: Lab!A1 = 400.78 mg/kg Ca, B1 = SOIL.CMOL(A1,"Ca") (= 2 cmol(+)/kg). */
export async function baseWorkbook(build?: (wb: ExcelJS.Workbook) => void): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  const ws = wb.addWorksheet("Lab");
  ws.getCell("A1").value = 400.78;
  ws.getCell("B1").value = { formula: 'SOIL.CMOL(A1,"Ca")' } as never;
  ws.getCell("A2").value = "invented sample";
  build?.(wb);
  return Buffer.from(await wb.xlsx.writeBuffer());
}

export async function partsOf(bytes: Buffer): Promise<Parts> {
  const zip = await JSZip.loadAsync(bytes);
  const out: Parts = new Map();
  for (const [name, f] of Object.entries(zip.files)) if (!f.dir) out.set(name, await f.async("nodebuffer"));
  return out;
}

export function zipOf(parts: Parts, options: Partial<Record<string, Omit<Entry, "name" | "data">>> = {}): Buffer {
  return writeZip([...parts].map(([name, data]) => ({ name, data, ...(options[name] ?? {}) })));
}

const SHEET = "xl/worksheets/sheet1.xml";
const MB = 1024 * 1024;

/** Replaces the sheetData of sheet1 (keeping the rest of the part). */
function withSheetData(parts: Parts, sheetData: string | Buffer): Parts {
  const xml = parts.get(SHEET)!.toString("utf8");
  const start = xml.indexOf("<sheetData");
  const end = xml.indexOf("</sheetData>") + "</sheetData>".length;
  const head = Buffer.from(xml.slice(0, start));
  const tail = Buffer.from(xml.slice(end));
  const out = new Map(parts);
  out.set(SHEET, Buffer.concat([head, Buffer.isBuffer(sheetData) ? sheetData : Buffer.from(sheetData), tail]));
  // the base file's dimension says A1:B2; a producer that lies about it must not matter
  return out;
}

/** Inserts XML right after sheet1's sheetData (where merges and validations go). */
async function withAfterSheetData(bytes: Buffer, extra: string): Promise<Buffer> {
  const parts = await partsOf(bytes);
  const xml = parts.get(SHEET)!.toString("utf8");
  const at = xml.indexOf("</sheetData>") + "</sheetData>".length;
  parts.set(SHEET, Buffer.from(xml.slice(0, at) + extra + xml.slice(at)));
  return zipOf(parts);
}

export interface HostileFile {
  readonly name: string;
  readonly what: string;
  readonly bytes: () => Promise<Buffer>;
}

export const HOSTILE: readonly HostileFile[] = [
  {
    name: "empty.xlsx",
    what: "an empty file",
    bytes: async () => Buffer.alloc(0),
  },
  {
    name: "not-a-zip.xlsx",
    what: "a text file named .xlsx",
    bytes: async () => Buffer.from("sample,Ca\nP1,400\n"),
  },
  {
    name: "truncated.xlsx",
    what: "a valid workbook cut in half",
    bytes: async () => {
      const b = await baseWorkbook();
      return b.subarray(0, Math.floor(b.length / 2));
    },
  },
  {
    name: "truncated-tail.xlsx",
    what: "a valid workbook missing its last 10 bytes (the end of the central directory)",
    bytes: async () => {
      const b = await baseWorkbook();
      return b.subarray(0, b.length - 10);
    },
  },
  {
    name: "zip-not-workbook.xlsx",
    what: "a zip of text files",
    bytes: async () => writeZip([{ name: "readme.txt", data: Buffer.from("hello") }]),
  },
  {
    name: "no-sheets.xlsx",
    what: "a workbook whose relationships point at a sheet part that is not there",
    bytes: async () => {
      const parts = await partsOf(await baseWorkbook());
      parts.delete(SHEET);
      return zipOf(parts);
    },
  },
  {
    name: "garbage-sheet.xlsx",
    what: "a sheet part that is not XML",
    bytes: async () => {
      const parts = await partsOf(await baseWorkbook());
      parts.set(SHEET, Buffer.from("\u0000\u0001<<<not xml at all"));
      return zipOf(parts);
    },
  },
  {
    name: "zip-bomb.xlsx",
    what: "a sheet part of 300 MB of zeros, compressed to 0.3 MB (1000:1)",
    bytes: async () => {
      const parts = await partsOf(await baseWorkbook());
      parts.set(SHEET, Buffer.alloc(300 * MB));
      return zipOf(parts);
    },
  },
  {
    name: "zip-bomb-lying.xlsx",
    what: "the same 300 MB of zeros, with headers claiming 2 KB uncompressed",
    bytes: async () => {
      const parts = await partsOf(await baseWorkbook());
      parts.set(SHEET, Buffer.alloc(300 * MB));
      return zipOf(parts, { [SHEET]: { declaredSize: 2048 } });
    },
  },
  {
    name: "million-rows.xlsx",
    what: "1,048,576 rows declared, all empty but A1 and A1048576 (with a SOIL formula on both ends)",
    bytes: async () => {
      const parts = await partsOf(await baseWorkbook());
      const rows: string[] = ['<sheetData><row r="1"><c r="A1"><v>400.78</v></c><c r="B1"><f>_xldudf_SOIL_CMOL(A1,"Ca")</f><v>0</v></c></row>'];
      for (let r = 2; r < 1048576; r++) rows.push(`<row r="${r}"/>`);
      rows.push('<row r="1048576"><c r="A1048576"><v>200.39</v></c><c r="B1048576"><f>_xldudf_SOIL_CMOL(A1048576,"Ca")</f><v>0</v></c></row></sheetData>');
      return zipOf(withSheetData(parts, rows.join("")));
    },
  },
  {
    name: "merge-bomb.xlsx",
    what: "one merged range over the whole sheet (C1:XFD1048576, 17 billion cells) in a 6 KB file",
    bytes: async () => withAfterSheetData(await baseWorkbook(), '<mergeCells count="1"><mergeCell ref="C1:XFD1048576"/></mergeCells>'),
  },
  {
    name: "validation-bomb.xlsx",
    what: "one data validation over the whole sheet",
    bytes: async () =>
      withAfterSheetData(
        await baseWorkbook(),
        '<dataValidations count="1"><dataValidation type="whole" allowBlank="1" sqref="C1:XFD1048576"><formula1>0</formula1><formula2>9</formula2></dataValidation></dataValidations>',
      ),
  },
  {
    name: "missing-sheet.xlsx",
    what: "formulas referring to a sheet that does not exist",
    bytes: async () =>
      baseWorkbook((wb) => {
        const ws = wb.getWorksheet("Lab")!;
        ws.getCell("C1").value = { formula: "'Gone sheet'!A1*2" } as never;
        ws.getCell("D1").value = { formula: "SOIL.CMOL(Gone!A1,\"Ca\")" } as never;
      }),
  },
  {
    name: "circular.xlsx",
    what: "circular references: two cells in a loop and a SOIL formula on itself",
    bytes: async () =>
      baseWorkbook((wb) => {
        const ws = wb.getWorksheet("Lab")!;
        ws.getCell("C1").value = { formula: "D1+1" } as never;
        ws.getCell("D1").value = { formula: "C1+1" } as never;
        ws.getCell("E1").value = { formula: 'SOIL.CMOL(E1,"Ca")' } as never;
        ws.getCell("F1").value = { formula: "B1*2" } as never; // fine: outside the loop
      }),
  },
  {
    name: "huge-shared-strings.xlsx",
    what: "a shared-strings part of 40 MB (500,000 distinct strings), of which the sheet uses two",
    bytes: async () => {
      const parts = await partsOf(await baseWorkbook());
      const n = 500000;
      const items: string[] = [];
      for (let i = 0; i < n; i++) items.push(`<si><t>invented sample label number ${i} ${(i * 2654435761) % 1000003}</t></si>`);
      const sst = `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" count="${n}" uniqueCount="${n}">${items.join("")}</sst>`;
      parts.set("xl/sharedStrings.xml", Buffer.from(sst));
      const withSst = withSheetData(
        parts,
        '<sheetData><row r="1"><c r="A1"><v>400.78</v></c><c r="B1"><f>_xldudf_SOIL_CMOL(A1,"Ca")</f><v>0</v></c></row><row r="2"><c r="A2" t="s"><v>0</v></c><c r="B2" t="s"><v>499999</v></c></row></sheetData>',
      );
      ensureSharedStrings(withSst);
      return zipOf(withSst);
    },
  },
  {
    name: "odd-attributes.xlsx",
    what: "a sheet with unknown and namespaced attributes, single-quoted attributes, and cells without r",
    bytes: async () => {
      const parts = await partsOf(await baseWorkbook());
      return zipOf(
        withSheetData(
          parts,
          "<sheetData>" +
            `<row r="1" spans="1:9" x14ac:dyDescent="0.25" custom:flag="yes" xmlns:custom="urn:invented"><c r='A1' s='0' custom:note="x"><v>400.78</v></c><c r="B1" t="n" data-extra="1"><f>_xldudf_SOIL_CMOL(A1,"Ca")</f><v>0</v></c></row>` +
            `<row r="2"><c><v>200.39</v></c><c><f>_xldudf_SOIL_CMOL(A2,"Ca")</f></c><c><v>7</v></c></row>` +
            `<row r='3' spans='1:2'><c r='A3' t='inlineStr'><is><t>invented</t></is></c><c r='B3'><f>_xldudf_SOIL_CMOL(A3,"Ca")</f><v>0</v></c></row>` +
            "</sheetData>",
        ),
      );
    },
  },
  {
    name: "rows-without-r.xlsx",
    what: "rows without an r attribute (allowed by the format, not by the cell reader)",
    bytes: async () => {
      const parts = await partsOf(await baseWorkbook());
      return zipOf(withSheetData(parts, `<sheetData><row><c><v>400.78</v></c><c><f>_xldudf_SOIL_CMOL(A1,"Ca")</f></c></row><row><c><v>1</v></c></row></sheetData>`));
    },
  },
];

/** Makes sure the package declares its shared-strings part (content type and relationship). */
function ensureSharedStrings(parts: Parts): void {
  const types = parts.get("[Content_Types].xml")!.toString();
  if (!types.includes("/xl/sharedStrings.xml")) {
    parts.set(
      "[Content_Types].xml",
      Buffer.from(
        types.replace(
          "</Types>",
          '<Override PartName="/xl/sharedStrings.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml"/></Types>',
        ),
      ),
    );
  }
  const rels = parts.get("xl/_rels/workbook.xml.rels")!.toString();
  if (!rels.includes("sharedStrings.xml")) {
    parts.set(
      "xl/_rels/workbook.xml.rels",
      Buffer.from(
        rels.replace(
          "</Relationships>",
          '<Relationship Id="rIdSst" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sharedStrings" Target="sharedStrings.xml"/></Relationships>',
        ),
      ),
    );
  }
}
