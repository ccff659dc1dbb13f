/**
 * The .xlsx package as a zip of XML parts: opened with size guards, sheets located through the
 * workbook's relationships, parts replaced one by one so everything we do not touch is kept
 * byte for byte (re-saving through a workbook library drops add-in and dynamic-array parts).
 */
import v8 from "v8";
import zlib from "zlib";
import JSZip from "jszip";
import { columnIndex, columnLetters } from "./cellref";

export class WorkbookFileError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "WorkbookFileError";
  }
}

/** Limits that keep a hostile file from exhausting memory. */
export const PACKAGE_LIMITS = {
  /** Total uncompressed size of all parts. */
  maxTotalBytes: 2 * 1024 ** 3,
  /** Uncompressed size of one part. */
  maxPartBytes: 1024 ** 3,
  /** Largest uncompressed:compressed ratio accepted for a large part (zip bombs reach 1000:1 and more). */
  maxRatio: 200,
  /** Ratio checks apply to parts larger than this. */
  ratioFloorBytes: 16 * 1024 ** 2,
  maxParts: 10000,
  /**
   * Memory the cell reader and the engine need per byte of sheet and shared-strings XML, at worst.
   * Measured on generated sheets (tests/reliability): a million declared empty rows (17.7 MB of XML)
   * needed a 512 MB heap (384 MB failed), a million numeric cells (32 MB) 384 MB, 29 MB of shared
   * strings under 192 MB. 32 covers the worst of these with a margin.
   */
  heapPerCellXmlByte: 32,
  /** Share of this process's heap limit a workbook may be expected to use. */
  heapShare: 0.75,
};

export interface SheetPart {
  readonly name: string;
  /** Path inside the zip, e.g. "xl/worksheets/sheet1.xml". */
  readonly path: string;
}

export interface XlsxPackage {
  readonly zip: JSZip;
  readonly sheets: readonly SheetPart[];
  read(path: string): Promise<string | undefined>;
  write(path: string, text: string): void;
  toBuffer(): Promise<Buffer>;
}

interface ZipEntryInternals {
  _data?: { uncompressedSize?: number; compressedSize?: number };
}

function checkSizes(zip: JSZip): void {
  let total = 0;
  let parts = 0;
  for (const [name, entry] of Object.entries(zip.files)) {
    if (entry.dir) continue;
    parts += 1;
    const data = (entry as unknown as ZipEntryInternals)._data;
    const size = data?.uncompressedSize ?? 0;
    const packed = data?.compressedSize ?? 0;
    total += size;
    if (size > PACKAGE_LIMITS.maxPartBytes) {
      throw new WorkbookFileError(`part ${name} would expand to ${size} bytes, beyond the ${PACKAGE_LIMITS.maxPartBytes}-byte limit`);
    }
    if (size > PACKAGE_LIMITS.ratioFloorBytes && packed > 0 && size / packed > PACKAGE_LIMITS.maxRatio) {
      throw new WorkbookFileError(`part ${name} expands ${Math.round(size / packed)}:1, which looks like a zip bomb; refused`);
    }
  }
  if (parts > PACKAGE_LIMITS.maxParts) throw new WorkbookFileError(`the file has ${parts} parts, more than ${PACKAGE_LIMITS.maxParts}`);
  if (total > PACKAGE_LIMITS.maxTotalBytes) {
    throw new WorkbookFileError(`the file would expand to ${total} bytes, beyond the ${PACKAGE_LIMITS.maxTotalBytes}-byte limit`);
  }
}

const mb = (n: number) => Math.ceil(n / 1024 ** 2);

/**
 * Refuses, before reading a cell, a workbook whose cells would need more memory than this process
 * may use (the alternative is the runtime aborting with a heap-exhausted trace).
 */
function checkReadable(zip: JSZip, sheets: readonly SheetPart[]): void {
  const paths = new Set(sheets.map((s) => s.path));
  let bytes = 0;
  for (const [name, entry] of Object.entries(zip.files)) {
    if (entry.dir || !(paths.has(name) || READER_PARTS.test(name))) continue;
    bytes += (entry as unknown as ZipEntryInternals)._data?.uncompressedSize ?? 0;
  }
  const need = bytes * PACKAGE_LIMITS.heapPerCellXmlByte;
  const may = v8.getHeapStatistics().heap_size_limit * PACKAGE_LIMITS.heapShare;
  if (need > may) {
    throw new WorkbookFileError(
      `the sheets hold ${mb(bytes)} MB of cell data, which may need ${mb(need)} MB of memory; this process may use ${mb(may)} MB. ` +
        `Split the workbook, or allow more memory with NODE_OPTIONS=--max-old-space-size=${Math.ceil(mb(need) / PACKAGE_LIMITS.heapShare)}`,
    );
  }
}

interface CompressedInternals {
  _data?: { uncompressedSize?: number; compressedContent?: Uint8Array; compression?: { magic?: string } };
}

/**
 * Inflates every part once with a cap at the size its header declares, so a part whose data
 * expands beyond what the zip's directory says (a bomb with lying headers) is refused after at
 * most that many bytes, before any reader expands it in full.
 */
function verifyDeclaredSizes(zip: JSZip): void {
  for (const [name, entry] of Object.entries(zip.files)) {
    if (entry.dir) continue;
    const data = (entry as unknown as CompressedInternals)._data;
    const content = data?.compressedContent;
    const declared = data?.uncompressedSize;
    if (!content || declared === undefined) continue; // not loaded from bytes
    const method = data?.compression?.magic;
    let actual: number;
    if (method === "\x00\x00") actual = content.length;
    else if (method === "\x08\x00") {
      try {
        actual = zlib.inflateRawSync(content, { maxOutputLength: Math.max(1, declared + 1) }).length;
      } catch (e) {
        const tooLarge = (e as NodeJS.ErrnoException).code === "ERR_BUFFER_TOO_LARGE";
        throw new WorkbookFileError(
          tooLarge
            ? `part ${name} expands beyond the ${declared} bytes its header declares, which looks like a zip bomb; refused`
            : `part ${name} cannot be decompressed: the file is damaged (${(e as Error).message})`,
        );
      }
    } else continue; // a method JSZip itself will refuse
    if (actual !== declared) {
      throw new WorkbookFileError(`part ${name} holds ${actual} bytes but its header declares ${declared}: the file is damaged`);
    }
  }
}

function attr(tag: string, name: string): string | undefined {
  const m = new RegExp(`\\s${name.replace(":", "\\:")}="([^"]*)"`).exec(tag);
  return m ? decodeXml(m[1] as string) : undefined;
}

export function decodeXml(s: string): string {
  return s
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">")
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&#(\d+);/g, (_, d: string) => String.fromCodePoint(Number(d)))
    .replace(/&#x([0-9a-fA-F]+);/g, (_, h: string) => String.fromCodePoint(parseInt(h, 16)))
    .replace(/&amp;/g, "&");
}

export function encodeXml(s: string): string {
  // Characters XML 1.0 cannot carry at all are dropped rather than written as invalid XML.
  return s
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F]/g, "")
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;");
}

function resolveTarget(target: string): string {
  if (target.startsWith("/")) return target.slice(1);
  const parts = `xl/${target}`.split("/");
  const out: string[] = [];
  for (const p of parts) {
    if (p === "..") out.pop();
    else if (p !== ".") out.push(p);
  }
  return out.join("/");
}

/** Opens an .xlsx from its bytes. Throws WorkbookFileError with a plain message for anything that is not one. */
export async function openPackage(bytes: Buffer): Promise<XlsxPackage> {
  if (bytes.length < 4 || bytes.readUInt32LE(0) !== 0x04034b50) {
    throw new WorkbookFileError("not an .xlsx workbook (the file is not a zip package)");
  }
  let zip: JSZip;
  try {
    zip = await JSZip.loadAsync(bytes, { checkCRC32: false });
  } catch (e) {
    throw new WorkbookFileError(`the workbook file is damaged or truncated (${(e as Error).message})`);
  }
  checkSizes(zip);
  verifyDeclaredSizes(zip);
  const read = async (path: string) => {
    const f = zip.file(path);
    if (!f) return undefined;
    try {
      return await f.async("string");
    } catch (e) {
      throw new WorkbookFileError(`part ${path} cannot be read: the file is damaged (${(e as Error).message})`);
    }
  };
  const workbook = await read("xl/workbook.xml");
  const rels = await read("xl/_rels/workbook.xml.rels");
  if (!workbook || !rels) throw new WorkbookFileError("not an Excel workbook (xl/workbook.xml is missing)");
  const targets = new Map<string, string>();
  for (const m of rels.matchAll(/<Relationship\b[^>]*>/g)) {
    const id = attr(m[0], "Id");
    const target = attr(m[0], "Target");
    if (id && target) targets.set(id, resolveTarget(target));
  }
  const sheets: SheetPart[] = [];
  for (const m of workbook.matchAll(/<sheet\b[^>]*>/g)) {
    const name = attr(m[0], "name");
    const rid = attr(m[0], "r:id");
    const path = rid ? targets.get(rid) : undefined;
    if (name && path && !zip.file(path)) throw new WorkbookFileError(`sheet "${name}" is declared but its part ${path} is missing: the file is damaged`);
    if (name && path) sheets.push({ name, path });
  }
  checkReadable(zip, sheets);
  return {
    zip,
    sheets,
    read,
    write(path, text) {
      zip.file(path, text, { createFolders: false });
    },
    toBuffer: () => zip.generateAsync({ type: "nodebuffer", compression: "DEFLATE", compressionOptions: { level: 6 } }),
  };
}

// ---------------------------------------------------------------------------------------------
// What the cell reader gets: only the parts that hold cells, and each sheet cut down to its
// sheetData. The workbook library behind the reader expands merged ranges, data validations and
// the like cell by cell (one merge over a whole sheet is 17 billion cells from a 100-byte
// element) and gives the cells of a merged range the anchor's value, which Excel does not. The
// written file is patched from the original package, so nothing cut here is lost.

const READER_PARTS = /^(\[Content_Types\]\.xml|_rels\/\.rels|xl\/workbook\.xml|xl\/_rels\/workbook\.xml\.rels|xl\/sharedStrings\.xml|xl\/styles\.xml)$/;

/** A sheet part reduced to its root element and sheetData. */
export function cellsOnly(xml: string): string {
  const root = /<([A-Za-z_][\w.-]*:)?worksheet\b[^>]*>/.exec(xml);
  if (!root) return xml; // not a worksheet: the reader reports what it finds
  const prefix = root[1] ?? "";
  const open = xml.indexOf(`<${prefix}sheetData`, root.index);
  let data = "";
  if (open >= 0) {
    const gt = xml.indexOf(">", open);
    const close = xml[gt - 1] === "/" ? gt + 1 : xml.indexOf(`</${prefix}sheetData>`, gt);
    if (gt < 0 || close < 0) return xml; // damaged: the reader reports it
    data = xml[gt - 1] === "/" ? xml.slice(open, close) : xml.slice(open, close + `</${prefix}sheetData>`.length);
  }
  return `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n${root[0]}${numberRowsAndCells(data)}</${prefix}worksheet>`;
}

/** Gives every row and cell its r attribute (optional in the format; the reader needs it). */
function numberRowsAndCells(sheetData: string): string {
  if (!/<(?:row|c)(?=[\s>/])(?![^>]*\sr=)/.test(sheetData)) return sheetData;
  let row = 0;
  let col = -1;
  return sheetData.replace(/<(row|c)(?=[\s>/])([^>]*)>/g, (tag, name: string, attrs: string) => {
    const r = /\sr=["']([A-Z]*)(\d+)["']/.exec(attrs);
    if (name === "row") {
      row = r ? Number(r[2]) : row + 1;
      col = -1;
      return r ? tag : `<row r="${row}"${attrs}>`;
    }
    col = r ? columnIndex(r[1] as string) : col + 1;
    return r ? tag : `<c r="${columnLetters(col)}${row}"${attrs}>`;
  });
}

/** The package as the cell reader should see it (stored, not compressed: it is read at once). */
export async function readingCopy(pkg: XlsxPackage): Promise<Buffer> {
  const copy = new JSZip();
  const sheetPaths = new Set(pkg.sheets.map((s) => s.path));
  for (const [name, entry] of Object.entries(pkg.zip.files)) {
    if (entry.dir) continue;
    if (sheetPaths.has(name)) copy.file(name, cellsOnly((await pkg.read(name)) as string));
    else if (READER_PARTS.test(name)) copy.file(name, await entry.async("nodebuffer"));
  }
  return copy.generateAsync({ type: "nodebuffer", compression: "STORE" });
}

// ---------------------------------------------------------------------------------------------
// Dynamic-array metadata: Excel marks a spilling formula cell with cm="N", pointing at a
// cellMetadata block whose type is XLDAPR (dynamic array properties) in xl/metadata.xml.
// The part below is the minimal form Excel writes (from memory of files Excel saves; not verified
// against Excel here, see platform-facts.md).

const METADATA_PATH = "xl/metadata.xml";
const METADATA_XML =
  '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n' +
  '<metadata xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:xda="http://schemas.microsoft.com/office/spreadsheetml/2017/dynamicarray">' +
  '<metadataTypes count="1"><metadataType name="XLDAPR" minSupportedVersion="120000" copy="1" pasteAll="1" pasteValues="1" merge="1" splitFirst="1" rowColShift="1" clearFormats="1" clearComments="1" assign="1" coerce="1" cellMeta="1"/></metadataTypes>' +
  '<futureMetadata name="XLDAPR" count="1"><bk><extLst><ext uri="{bdbb8cdc-fa1e-496e-a857-3c3f30c029c3}"><xda:dynamicArrayProperties fDynamic="1" fCollapsed="0"/></ext></extLst></bk></futureMetadata>' +
  '<cellMetadata count="1"><bk><rc t="1" v="0"/></bk></cellMetadata></metadata>';

/**
 * The cm index that marks a dynamic-array formula, adding xl/metadata.xml (with its content type
 * and relationship) when the workbook has none. Returns undefined when the workbook has metadata
 * of its own without a dynamic-array entry (then formulas are written as plain array formulas).
 */
export async function dynamicArrayIndex(pkg: XlsxPackage): Promise<number | undefined> {
  const existing = await pkg.read(METADATA_PATH);
  if (existing !== undefined) {
    const types = [...existing.matchAll(/<metadataType\b[^>]*>/g)].map((m) => attr(m[0], "name"));
    const typeIndex = types.indexOf("XLDAPR") + 1;
    if (typeIndex === 0) return undefined;
    const cellMeta = /<cellMetadata\b[^>]*>([\s\S]*?)<\/cellMetadata>/.exec(existing);
    if (!cellMeta) return undefined;
    const blocks = [...(cellMeta[1] as string).matchAll(/<bk>([\s\S]*?)<\/bk>/g)];
    const i = blocks.findIndex((b) => new RegExp(`<rc\\b[^>]*\\st="${typeIndex}"`).test(b[1] as string));
    return i >= 0 ? i + 1 : undefined;
  }
  pkg.write(METADATA_PATH, METADATA_XML);
  const types = await pkg.read("[Content_Types].xml");
  if (types && !types.includes('PartName="/xl/metadata.xml"')) {
    pkg.write(
      "[Content_Types].xml",
      types.replace(
        "</Types>",
        '<Override PartName="/xl/metadata.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheetMetadata+xml"/></Types>',
      ),
    );
  }
  const rels = (await pkg.read("xl/_rels/workbook.xml.rels")) as string;
  const ids = new Set([...rels.matchAll(/\sId="([^"]*)"/g)].map((m) => m[1]));
  let n = ids.size + 1;
  while (ids.has(`rId${n}`)) n += 1;
  pkg.write(
    "xl/_rels/workbook.xml.rels",
    rels.replace(
      "</Relationships>",
      `<Relationship Id="rId${n}" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sheetMetadata" Target="metadata.xml"/></Relationships>`,
    ),
  );
  return 1;
}
