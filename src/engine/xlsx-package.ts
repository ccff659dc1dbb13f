/**
 * The .xlsx package: a zip of XML parts, opened with size guards and CRC checks, its worksheets
 * located through the workbook's relationships, and written back with only the parts the engine
 * changed replaced; every other part keeps its compressed bytes (re-saving through a workbook
 * library drops add-in and dynamic-array parts).
 */
import v8 from "v8";
import { XmlError, XmlScanner, Tok, encodeXmlText, decodeXmlText } from "./xml";
import { ZipEntry, ZipError, ZipOut, inflateEntry, readZipDirectory, writeZip } from "./zip";

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
  /** Uncompressed size of one part (V8 strings stop near 512 MB). */
  maxPartBytes: 512 * 1024 ** 2 - 64,
  /** Largest uncompressed:compressed ratio accepted for a large part (zip bombs reach 1000:1 and more). */
  maxRatio: 200,
  /** Ratio checks apply to parts larger than this. */
  ratioFloorBytes: 16 * 1024 ** 2,
  maxParts: 10000,
  /**
   * Memory the engine needs per byte of sheet and shared-strings XML, at worst: the part's text
   * (2 bytes a character), the cell records and the formula trees. Measured on generated sheets
   * (bench/): see the README's benchmark section.
   */
  heapPerCellXmlByte: 12,
  /** Share of this process's heap limit a workbook may be expected to use. */
  heapShare: 0.75,
};

export type SheetKind = "worksheet" | "chartsheet" | "other";

export interface SheetPart {
  readonly name: string;
  /** Path inside the zip, e.g. "xl/worksheets/sheet1.xml". */
  readonly path: string;
  readonly kind: SheetKind;
  /** Position in the workbook's sheet list (what localSheetId counts). */
  readonly index: number;
}

export interface DefinedNameDecl {
  readonly name: string;
  /** The sheet position it is scoped to, or undefined for the whole workbook. */
  readonly localSheetId?: number;
  readonly text: string;
}

export interface XlsxPackage {
  readonly sheets: readonly SheetPart[];
  readonly workbookPath: string;
  readonly definedNames: readonly DefinedNameDecl[];
  readonly date1904: boolean;
  /** The workbook was saved with manual calculation (calcPr calcMode="manual"): its cached values may be stale. */
  readonly manualCalc?: boolean;
  /** A part's text (UTF-8), or undefined when the package has no such part. */
  text(path: string): string | undefined;
  has(path: string): boolean;
  /** A part's bytes (any part, binary ones too), or undefined when the package has no such part. */
  bytes(path: string): Buffer | undefined;
  /** Every part's path, as the package will be written. */
  parts(): string[];
  /** A part the engine has not changed, as the zip holds it (its compressed bytes can be copied). */
  entry(path: string): ZipEntry | undefined;
  /** Replaces (or adds) a part (text, or UTF-8 bytes). */
  write(path: string, text: string | Buffer): void;
  /** Leaves a part out of the written package. */
  remove(path: string): void;
  toBuffer(): Buffer;
  /** Total uncompressed bytes of the sheet and shared-string parts. */
  readonly cellXmlBytes: number;
}

const REL_NS = new Set([
  "http://schemas.openxmlformats.org/officeDocument/2006/relationships",
  "http://purl.oclc.org/ooxml/officeDocument/relationships",
]);

/** Resolves a relationship target against the folder of the part that holds the relationship. */
export function resolveTarget(base: string, target: string): string {
  if (target.startsWith("/")) return target.slice(1);
  const dir = base.includes("/") ? base.slice(0, base.lastIndexOf("/")) : "";
  const parts = (dir ? `${dir}/${target}` : target).split("/");
  const out: string[] = [];
  for (const p of parts) {
    if (p === "..") out.pop();
    else if (p !== "." && p !== "") out.push(p);
  }
  return out.join("/");
}

/** The relationships part for a part: xl/workbook.xml → xl/_rels/workbook.xml.rels. */
export function relsPathOf(part: string): string {
  const i = part.lastIndexOf("/");
  return i < 0 ? `_rels/${part}.rels` : `${part.slice(0, i)}/_rels/${part.slice(i + 1)}.rels`;
}

interface Relationship {
  readonly id: string;
  readonly type: string;
  readonly target: string;
  readonly external: boolean;
}

export function readRelationships(xml: string | undefined): Relationship[] {
  if (!xml) return [];
  const out: Relationship[] = [];
  const s = new XmlScanner(xml);
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t !== Tok.Open || s.local !== "Relationship") continue;
    const id = s.attr("Id");
    const target = s.attr("Target");
    if (id && target !== undefined) out.push({ id, type: s.attr("Type") ?? "", target, external: s.attr("TargetMode") === "External" });
  }
  return out;
}

const mb = (n: number) => Math.ceil(n / 1024 ** 2);

/** Opens an .xlsx from its bytes. Throws WorkbookFileError with a plain message for anything that is not one. */
export async function openPackage(bytes: Buffer): Promise<XlsxPackage> {
  if (bytes.length < 4 || bytes.readUInt32LE(0) !== 0x04034b50) {
    throw new WorkbookFileError("not an .xlsx workbook (the file is not a zip package)");
  }
  let entries: ZipEntry[];
  try {
    entries = readZipDirectory(bytes, { maxEntries: PACKAGE_LIMITS.maxParts });
  } catch (e) {
    throw new WorkbookFileError(e instanceof ZipError ? e.message : `the workbook file is damaged or truncated (${(e as Error).message})`);
  }
  let total = 0;
  for (const e of entries) {
    total += e.size;
    if (e.size > PACKAGE_LIMITS.maxPartBytes) {
      throw new WorkbookFileError(`part ${e.name} would expand to ${e.size} bytes, beyond the ${PACKAGE_LIMITS.maxPartBytes}-byte limit`);
    }
    if (e.size > PACKAGE_LIMITS.ratioFloorBytes && e.compressedSize > 0 && e.size / e.compressedSize > PACKAGE_LIMITS.maxRatio) {
      throw new WorkbookFileError(`part ${e.name} expands ${Math.round(e.size / e.compressedSize)}:1, which looks like a zip bomb; refused`);
    }
  }
  if (total > PACKAGE_LIMITS.maxTotalBytes) {
    throw new WorkbookFileError(`the file would expand to ${total} bytes, beyond the ${PACKAGE_LIMITS.maxTotalBytes}-byte limit`);
  }
  const byName = new Map(entries.map((e) => [e.name, e]));
  // Every entry is inflated once and checked against its CRC before anything reads it.
  const texts = new Map<string, string>();
  const XML_PART = /\.(xml|rels)$/i;
  for (const e of entries) {
    let data: Buffer;
    try {
      data = inflateEntry(e);
    } catch (err) {
      throw new WorkbookFileError((err as Error).message);
    }
    if (XML_PART.test(e.name) || e.name === "[Content_Types].xml") texts.set(e.name, decodeUtf8(data, e.name));
  }
  const replaced = new Map<string, string | Buffer>();
  const removed = new Set<string>();
  const text = (p: string) => {
    if (removed.has(p)) return undefined;
    const r = replaced.get(p);
    if (r === undefined) return texts.get(p);
    return typeof r === "string" ? r : r.toString("utf8");
  };

  const root = readRelationships(text("_rels/.rels"));
  const office = root.find((r) => r.type.endsWith("/officeDocument") && !r.external);
  const workbookPath = office ? resolveTarget("", office.target) : "xl/workbook.xml";
  const workbookXml = text(workbookPath);
  if (!workbookXml) throw new WorkbookFileError(`not an Excel workbook (${workbookPath} is missing)`);
  const rels = readRelationships(text(relsPathOf(workbookPath)));
  const targets = new Map(rels.map((r) => [r.id, r]));
  const wb = asFileError("the workbook part cannot be read", () => readWorkbookXml(workbookXml));
  const sheets: SheetPart[] = wb.sheets.map((s, index) => {
    const rel = s.rid ? targets.get(s.rid) : undefined;
    if (!rel || rel.external) throw new WorkbookFileError(`sheet "${s.name}" has no part in the package: the file is damaged`);
    const path = resolveTarget(workbookPath, rel.target);
    if (!byName.has(path)) throw new WorkbookFileError(`sheet "${s.name}" is declared but its part ${path} is missing: the file is damaged`);
    const kind: SheetKind = rel.type.endsWith("/worksheet") ? "worksheet" : rel.type.endsWith("/chartsheet") ? "chartsheet" : "other";
    return { name: s.name, path, kind, index };
  });
  const names = new Set<string>();
  for (const s of sheets) {
    const key = s.name.toUpperCase();
    if (names.has(key)) throw new WorkbookFileError(`two sheets are named "${s.name}": the file is damaged`);
    names.add(key);
  }

  // What the cell reader will hold in memory, checked before reading a cell.
  const sharedStrings = rels.find((r) => r.type.endsWith("/sharedStrings"));
  let cellXmlBytes = 0;
  for (const s of sheets) if (s.kind === "worksheet") cellXmlBytes += byName.get(s.path)!.size;
  if (sharedStrings) cellXmlBytes += byName.get(resolveTarget(workbookPath, sharedStrings.target))?.size ?? 0;
  const need = cellXmlBytes * PACKAGE_LIMITS.heapPerCellXmlByte;
  const may = v8.getHeapStatistics().heap_size_limit * PACKAGE_LIMITS.heapShare;
  if (need > may) {
    throw new WorkbookFileError(
      `the sheets hold ${mb(cellXmlBytes)} MB of cell data, which may need ${mb(need)} MB of memory; this process may use ${mb(may)} MB. ` +
        `Split the workbook, or allow more memory with NODE_OPTIONS=--max-old-space-size=${Math.ceil(mb(need) / PACKAGE_LIMITS.heapShare)}`,
    );
  }

  return {
    sheets,
    workbookPath,
    definedNames: wb.definedNames,
    date1904: wb.date1904,
    manualCalc: wb.manualCalc,
    cellXmlBytes,
    text,
    has: (p) => !removed.has(p) && (replaced.has(p) || byName.has(p)),
    bytes(p) {
      if (removed.has(p)) return undefined;
      const r = replaced.get(p);
      if (r !== undefined) return asBytes(r);
      const e = byName.get(p);
      return e ? inflateEntry(e) : undefined;
    },
    entry: (p) => (removed.has(p) || replaced.has(p) ? undefined : byName.get(p)),
    parts: () => [...entries.map((e) => e.name).filter((n) => !removed.has(n)), ...[...replaced.keys()].filter((n) => !byName.has(n))],
    write(p, t) {
      removed.delete(p);
      replaced.set(p, t);
    },
    remove(p) {
      replaced.delete(p);
      removed.add(p);
    },
    toBuffer() {
      const out: ZipOut[] = entries
        .filter((e) => !removed.has(e.name))
        .map((e) => (replaced.has(e.name) ? { name: e.name, data: asBytes(replaced.get(e.name) as string | Buffer) } : { name: e.name, copy: e }));
      for (const [p, t] of replaced) if (!byName.has(p)) out.push({ name: p, data: asBytes(t) });
      return writeZip(out);
    },
  };
}

const asBytes = (t: string | Buffer) => (typeof t === "string" ? Buffer.from(t, "utf8") : t);

function decodeUtf8(data: Buffer, name: string): string {
  // A byte-order mark is allowed; UTF-16 parts are not something Excel writes.
  if (data.length >= 2 && ((data[0] === 0xff && data[1] === 0xfe) || (data[0] === 0xfe && data[1] === 0xff))) {
    throw new WorkbookFileError(`part ${name} is UTF-16; re-save the workbook from Excel`);
  }
  let s = data.toString("utf8");
  if (s.charCodeAt(0) === 0xfeff) s = s.slice(1);
  return s;
}

interface WorkbookXml {
  sheets: { name: string; rid?: string }[];
  definedNames: DefinedNameDecl[];
  date1904: boolean;
  manualCalc: boolean;
}

function readWorkbookXml(xml: string): WorkbookXml {
  const s = new XmlScanner(xml);
  const sheets: { name: string; rid?: string }[] = [];
  const definedNames: DefinedNameDecl[] = [];
  let date1904 = false;
  let manualCalc = false;
  let relPrefix: string | undefined;
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t !== Tok.Open) continue;
    if (s.local === "workbook") {
      for (const [k, v] of s.attrs()) if (REL_NS.has(v) && k.startsWith("xmlns:")) relPrefix = k.slice(6);
    } else if (s.local === "workbookPr") {
      const d = s.attr("date1904");
      date1904 = d === "1" || d === "true";
    } else if (s.local === "calcPr") {
      // ECMA-376 Part 1, calcPr (18.2.2) calcMode: ST_CalcMode "manual", "auto" (the default), "autoNoTable" (section numbers from memory)
      manualCalc = s.attr("calcMode") === "manual";
    } else if (s.local === "sheet") {
      const attrs = s.attrs();
      const name = attrs.get("name");
      let rid: string | undefined;
      for (const [k, v] of attrs) {
        const colon = k.indexOf(":");
        if (colon > 0 && k.slice(colon + 1) === "id" && (relPrefix === undefined || k.slice(0, colon) === relPrefix)) rid = v;
      }
      if (name === undefined) throw new WorkbookFileError("a sheet has no name: the file is damaged");
      sheets.push({ name, rid });
    } else if (s.local === "definedName") {
      const name = s.attr("name") ?? "";
      const local = s.attr("localSheetId");
      const text = s.elementText();
      definedNames.push(local === undefined ? { name, text } : { name, text, localSheetId: Number(local) });
    }
  }
  return { sheets, definedNames, date1904, manualCalc };
}

/** Runs a step on the file's contents; anything it throws becomes a plain WorkbookFileError. */
export function asFileError<T>(what: string, step: () => T): T {
  try {
    return step();
  } catch (e) {
    if (e instanceof WorkbookFileError) throw e;
    if (e instanceof XmlError) throw new WorkbookFileError(`${what}: ${e.message}`);
    throw new WorkbookFileError(`${what} (${(e as Error).message})`);
  }
}

/** XML text encoding and decoding, for the writers and the tests. */
export const encodeXml = encodeXmlText;
export const decodeXml = decodeXmlText;

// ---------------------------------------------------------------------------------------------
// Dynamic-array metadata: Excel marks a spilling formula cell with cm="N", pointing at a
// cellMetadata block whose type is XLDAPR (dynamic array properties) in xl/metadata.xml.
// The part below is the minimal form Excel writes (from memory of files Excel saves; not verified
// against Excel here, see platform-facts.md).

export const METADATA_XML =
  '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n' +
  '<metadata xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:xda="http://schemas.microsoft.com/office/spreadsheetml/2017/dynamicarray">' +
  '<metadataTypes count="1"><metadataType name="XLDAPR" minSupportedVersion="120000" copy="1" pasteAll="1" pasteValues="1" merge="1" splitFirst="1" rowColShift="1" clearFormats="1" clearComments="1" assign="1" coerce="1" cellMeta="1"/></metadataTypes>' +
  '<futureMetadata name="XLDAPR" count="1"><bk><extLst><ext uri="{bdbb8cdc-fa1e-496e-a857-3c3f30c029c3}"><xda:dynamicArrayProperties fDynamic="1" fCollapsed="0"/></ext></extLst></bk></futureMetadata>' +
  '<cellMetadata count="1"><bk><rc t="1" v="0"/></bk></cellMetadata></metadata>';

/**
 * The cm values (1-based cellMetadata block indices) that mark dynamic-array formulas in a
 * metadata part: blocks whose record type is XLDAPR.
 */
export function dynamicArrayCms(xml: string | undefined): Set<number> {
  const out = new Set<number>();
  if (!xml) return out;
  const s = new XmlScanner(xml);
  const types: string[] = [];
  let inCellMeta = false;
  let block = 0;
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t === Tok.Open) {
      if (s.local === "metadataType") types.push(s.attr("name") ?? "");
      else if (s.local === "cellMetadata") inCellMeta = !s.selfClosing;
      else if (inCellMeta && s.local === "bk") block++;
      else if (inCellMeta && s.local === "rc") {
        const type = types[Number(s.attr("t")) - 1];
        if (type === "XLDAPR") out.add(block);
      }
    } else if (t === Tok.Close && s.local === "cellMetadata") inCellMeta = false;
  }
  return out;
}

/**
 * The cm index that marks a dynamic-array formula, adding xl/metadata.xml (with its content type
 * and relationship) when the workbook has none. Returns undefined when the workbook has metadata
 * of its own without a dynamic-array entry (then formulas are written as plain array formulas).
 */
export function dynamicArrayIndex(pkg: XlsxPackage): number | undefined {
  const rels = readRelationships(pkg.text(relsPathOf(pkg.workbookPath)));
  const meta = rels.find((r) => r.type.endsWith("/sheetMetadata"));
  if (meta) {
    const cms = dynamicArrayCms(pkg.text(resolveTarget(pkg.workbookPath, meta.target)));
    return cms.size ? Math.min(...cms) : undefined;
  }
  const dir = pkg.workbookPath.includes("/") ? pkg.workbookPath.slice(0, pkg.workbookPath.lastIndexOf("/") + 1) : "";
  const metaPath = `${dir}metadata.xml`;
  if (pkg.has(metaPath)) return undefined; // a part of that name the workbook does not point at: leave it alone
  pkg.write(metaPath, METADATA_XML);
  const types = pkg.text("[Content_Types].xml");
  if (types && !types.includes(`PartName="/${metaPath}"`)) {
    pkg.write(
      "[Content_Types].xml",
      insertBeforeClose(types, "Types", `<Override PartName="/${metaPath}" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheetMetadata+xml"/>`),
    );
  }
  const relsPath = relsPathOf(pkg.workbookPath);
  const relsXml = pkg.text(relsPath) as string;
  const ids = new Set(rels.map((r) => r.id));
  let n = ids.size + 1;
  while (ids.has(`rId${n}`)) n += 1;
  pkg.write(
    relsPath,
    insertBeforeClose(relsXml, "Relationships", `<Relationship Id="rId${n}" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sheetMetadata" Target="metadata.xml"/>`),
  );
  return 1;
}

/** Inserts markup just before the root element's end tag (found by the tokenizer, whatever its prefix). */
function insertBeforeClose(xml: string, local: string, markup: string): string {
  const s = new XmlScanner(xml);
  let at = -1;
  for (let t = s.next(); t !== Tok.End; t = s.next()) if (t === Tok.Close && s.local === local) at = s.start;
  if (at < 0) throw new WorkbookFileError(`the ${local} part has no end tag: the file is damaged`);
  return xml.slice(0, at) + markup + xml.slice(at);
}
