/**
 * The .xlsx package as a zip of XML parts: opened with size guards, sheets located through the
 * workbook's relationships, parts replaced one by one so everything we do not touch is kept
 * byte for byte (re-saving through a workbook library drops add-in and dynamic-array parts).
 */
import JSZip from "jszip";

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
    if (name && path && zip.file(path)) sheets.push({ name, path });
  }
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
