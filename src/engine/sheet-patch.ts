/**
 * Writes computed values into a worksheet's XML without touching anything else: the reader
 * recorded the offsets of every row and cell, so only the cells named in `writes` are
 * re-serialised (from their own markup, re-read with the tokenizer), new cells and rows are
 * inserted where they belong, and every other byte of the part is kept as it was.
 */
import type { Sheet } from "./book";
import { a1 } from "./cellref";
import { Scalar, XlError } from "./formula/values";
import { Tok, XmlScanner, encodeXmlText } from "./xml";

/** A formula rewritten as a dynamic array: its text in stored form (undefined keeps the file's text), range and metadata index. */
export interface DynamicFormula {
  readonly text?: string;
  readonly ref: string;
  readonly cm?: number;
}

export type CellWrite =
  | {
      readonly kind: "formula";
      readonly row: number;
      readonly col: number;
      /** The cached value; undefined writes none (Excel computes the cell on open). */
      readonly value: Scalar | undefined;
      /** Rewrite the <f> as a dynamic-array formula (text in stored form; undefined keeps the file's text). */
      readonly dynamic?: DynamicFormula;
      /** The cell's number in its sheet, when the file has it (its markup's offsets make the rewrite cheap). */
      readonly k?: number;
    }
  | { readonly kind: "value"; readonly row: number; readonly col: number; readonly value: Scalar }
  /** A plain constant where a formula was (a values-only copy): text as an inline string, not a formula's string. */
  | { readonly kind: "constant"; readonly row: number; readonly col: number; readonly value: Scalar; readonly inline?: string }
  | { readonly kind: "clear"; readonly row: number; readonly col: number };

interface Edit {
  start: number;
  end: number;
  text: string;
}

function formatNumber(n: number): string {
  // Shortest round-trip representation; Excel reads exponent form.
  return Object.is(n, -0) ? "0" : String(n);
}

/** The parts of a cell's markup a rewrite keeps. */
interface CellParts {
  attrs: [string, string][];
  formula?: { start: number; end: number; attrs: Map<string, string>; inner: string };
  keep: string[];
}

function cellParts(xml: string): CellParts {
  const s = new XmlScanner(xml);
  let t = s.next();
  while (t !== Tok.Open && t !== Tok.End) t = s.next();
  const attrs = [...s.attrs()];
  const out: CellParts = { attrs, keep: [] };
  if (s.selfClosing) return out;
  for (t = s.next(); t !== Tok.End; t = s.next()) {
    if (t === Tok.Close) break;
    if (t !== Tok.Open) continue;
    const start = s.start;
    const openEnd = s.end;
    const local = s.local;
    const fAttrs = local === "f" ? s.attrs() : undefined;
    const end = s.skipElement();
    if (local === "f") {
      // The inner text exactly as the file has it (entity-encoded).
      const close = xml.lastIndexOf("</", end - 1);
      out.formula = { start, end, attrs: fAttrs as Map<string, string>, inner: xml.slice(start, end).endsWith("/>") && openEnd === end ? "" : xml.slice(openEnd, close) };
      continue;
    }
    if (local === "v" || local === "is") continue;
    out.keep.push(xml.slice(start, end));
  }
  return out;
}

function attrText(attrs: Iterable<[string, string]>): string {
  let s = "";
  for (const [k, v] of attrs) s += ` ${k}="${encodeXmlText(v)}"`;
  return s;
}

function typeAndValue(v: Scalar, p: string, constant = false): { t?: string; body: string } {
  if (v === null) return { body: "" };
  if (typeof v === "number") return { body: `<${p}v>${formatNumber(v)}</${p}v>` };
  if (typeof v === "boolean") return { t: "b", body: `<${p}v>${v ? 1 : 0}</${p}v>` };
  if (v instanceof XlError) return { t: "e", body: `<${p}v>${encodeXmlText(v.code)}</${p}v>` };
  // Text a formula returned (in its own cell or spilled) is a formula string, as Excel stores it;
  // a constant's text is an inline string (no shared-strings part needed). Empty text stays
  // empty text, not a blank cell: ISBLANK, COUNTA and "" + "" tell them apart.
  if (constant) return { t: "inlineStr", body: `<${p}is><${p}t xml:space="preserve">${encodeXmlText(v)}</${p}t></${p}is>` };
  return { t: "str", body: `<${p}v>${encodeXmlText(v)}</${p}v>` };
}

/**
 * A start tag with some attributes dropped and others added; the kept ones exactly as written.
 * The tag was delimited by the tokenizer, so its attribute values are quoted and hold no '<'.
 */
export function rewriteStartTag(tag: string, drop: (name: string) => boolean, add: string): string {
  const isSpace = (c: number) => c === 32 || c === 9 || c === 10 || c === 13;
  const n = tag.length;
  let i = 1;
  while (i < n) {
    const c = tag.charCodeAt(i);
    if (isSpace(c) || c === 47 || c === 62) break;
    i++;
  }
  let out = tag.slice(0, i);
  for (;;) {
    while (i < n && isSpace(tag.charCodeAt(i))) i++;
    if (i >= n || tag.charCodeAt(i) === 62 || tag.charCodeAt(i) === 47) break;
    const a = i;
    while (i < n && tag.charCodeAt(i) !== 61 && !isSpace(tag.charCodeAt(i))) i++;
    const name = tag.slice(a, i);
    while (i < n && tag.charCodeAt(i) !== 34 && tag.charCodeAt(i) !== 39) i++;
    const close = tag.indexOf(tag[i] as string, i + 1);
    i = close + 1;
    if (!drop(name)) out += ` ${tag.slice(a, i)}`;
  }
  return `${out}${add}>`;
}

const TYPE_ATTRS = (name: string) => name === "t" || name === "cm" || name === "vm";

/** A formula cell rewritten from its own markup's offsets: start tag, <f> kept or rewritten, new value. */
function formulaCellFast(w: Extract<CellWrite, { kind: "formula" }>, sheet: Sheet, k: number, p: string): string {
  const xml = sheet.xml;
  const fs = sheet.formulas;
  const fi = sheet.cells.formula[k] as number;
  let add = "";
  let f: string;
  if (w.dynamic) {
    const inner = w.dynamic.text !== undefined ? encodeXmlText(w.dynamic.text) : xml.slice(fs.fOpen[fi] as number, fs.fClose[fi] as number);
    f = `<${p}f t="array" ref="${w.dynamic.ref}">${inner}</${p}f>`;
    if (w.dynamic.cm !== undefined) add += ` cm="${w.dynamic.cm}"`;
  } else {
    f = xml.slice(fs.f[fi] as number, fs.fEnd[fi] as number);
  }
  const tag = xml.slice(sheet.cells.start[k] as number, fs.open[fi] as number);
  const keepCm = !w.dynamic ? tag.includes(" cm=") || /\scm=/.test(tag) : false;
  if (!/\sr=/.test(tag)) add = ` r="${a1({ row: w.row, col: w.col })}"${add}`; // the position, written out
  const tv = w.value === undefined ? { body: "" } : typeAndValue(w.value, p);
  if ("t" in tv && tv.t) add += ` t="${tv.t}"`;
  const start = rewriteStartTag(tag.endsWith("/>") ? `${tag.slice(0, -2)}>` : tag, (n) => n === "t" || n === "vm" || (n === "cm" && !keepCm), add);
  return `${start}${f}${tv.body}</${p}c>`;
}

/** Serialises one cell: its own attributes kept (type, cm and vm recomputed), its formula kept or rewritten. */
export function cellXml(w: CellWrite, old: string | undefined, prefix: string, sheet?: Sheet): string {
  if (w.kind === "formula" && w.k !== undefined && sheet) {
    const fi = sheet.cells.formula[w.k] as number;
    if (fi >= 0 && sheet.formulas.simple[fi] && (sheet.formulas.f[fi] as number) >= 0) return formulaCellFast(w, sheet, w.k, prefix ? `${prefix}:` : "");
    old ??= sheet.xml.slice(sheet.cells.start[w.k] as number, sheet.cells.end[w.k] as number);
  }
  const p = prefix ? `${prefix}:` : "";
  const parts = old ? cellParts(old) : { attrs: [["r", a1({ row: w.row, col: w.col })]] as [string, string][], keep: [] as string[] };
  const attrs = new Map(parts.attrs.filter(([k]) => !TYPE_ATTRS(k)));
  if (!attrs.has("r")) attrs.set("r", a1({ row: w.row, col: w.col }));
  if (w.kind === "clear") {
    return `<${p}c${attrText(attrs)}/>`;
  }
  if (w.kind === "value" || w.kind === "constant") {
    // A shared string's own markup (its formatted runs) becomes the inline string.
    const tv = w.kind === "constant" && w.inline !== undefined ? { t: "inlineStr", body: `<${p}is>${w.inline}</${p}is>` } : typeAndValue(w.value, p, w.kind === "constant");
    if (tv.t) attrs.set("t", tv.t);
    return tv.body ? `<${p}c${attrText(attrs)}>${tv.body}</${p}c>` : `<${p}c${attrText(attrs)}/>`;
  }
  let f: string;
  const oldF = (parts as CellParts).formula;
  if (w.dynamic) {
    const fa = new Map<string, string>([
      ["t", "array"],
      ["ref", w.dynamic.ref],
    ]);
    const inner = w.dynamic.text !== undefined ? encodeXmlText(w.dynamic.text) : (oldF?.inner ?? "");
    f = `<${p}f${attrText(fa)}>${inner}</${p}f>`;
    if (w.dynamic.cm !== undefined) attrs.set("cm", String(w.dynamic.cm));
  } else {
    if (!oldF || !old) throw new Error(`cell ${a1({ row: w.row, col: w.col })} has no formula to keep`);
    f = old.slice(oldF.start, oldF.end);
    const cm = parts.attrs.find(([k]) => k === "cm");
    if (cm) attrs.set("cm", cm[1]);
  }
  const tv = w.value === undefined ? { body: "" } : typeAndValue(w.value, p);
  if ("t" in tv && tv.t) attrs.set("t", tv.t);
  return `<${p}c${attrText(attrs)}>${f}${tv.body}${parts.keep.join("")}</${p}c>`;
}

/** A row's start tag without its spans hint (cells outside it are being added), and the row's element name. */
function rowOpen(xml: string, start: number, openEnd: number): { open: string; name: string } {
  const s = new XmlScanner(xml.slice(start, openEnd));
  s.next();
  const attrs = [...s.attrs()].filter(([k]) => k !== "spans");
  return { open: `<${s.name}${attrText(attrs)}>`, name: s.name };
}

/** Applies `writes` to a worksheet part's XML, as UTF-8 bytes. */
export function patchSheetXml(sheet: Sheet, writes: readonly CellWrite[]): Buffer {
  if (writes.length === 0) return Buffer.from(sheet.xml, "utf8");
  return applyEdits(sheet.xml, sheetEdits(sheet, writes));
}

/**
 * Rewrites a worksheet: each planned cell (planId ≥ 0) gets the markup `replace` makes for it,
 * as the sheet is walked in order (nothing per cell is kept for the whole sheet); `extras`
 * (spilled elements, cleared cells) are applied beside them; every other byte is copied.
 */
export function rewriteSheet(sheet: Sheet, replace: (k: number, prefix: string) => string | undefined, extras: readonly CellWrite[]): Buffer {
  const xml = sheet.xml;
  const sd = sheet.sheetData;
  if (!sd) throw new Error("worksheet has no sheetData");
  const cells = sheet.cells;
  const edits = extras.length
    ? sheetEdits(
        sheet,
        extras.filter((w) => {
          const k = cells.find(w.row, w.col);
          return !(k >= 0 && (cells.planId[k] as number) >= 0);
        }),
      )
    : [];
  const out = new Utf8Writer(xml.length * 1.15 + (1 << 16));
  let at = 0;
  let ei = 0;
  const take = (e: Edit) => {
    if (e.start < at) throw new Error("overlapping edits to the sheet");
    out.add(xml.slice(at, e.start));
    out.add(e.text);
    at = e.end;
  };
  const fs = sheet.formulas;
  for (let fi = 0; fi < fs.n; fi++) {
    const k = fs.cell[fi] as number;
    if ((cells.planId[k] as number) < 0) continue;
    const start = cells.start[k] as number;
    // Edits before this cell (an insertion at its very start goes first).
    while (ei < edits.length && ((edits[ei] as Edit).start < start || ((edits[ei] as Edit).start === start && (edits[ei] as Edit).end === start))) take(edits[ei++] as Edit);
    const text = replace(k, sd.prefix);
    if (text !== undefined) take({ start, end: cells.end[k] as number, text });
  }
  while (ei < edits.length) take(edits[ei++] as Edit);
  out.add(xml.slice(at));
  return out.toBuffer();
}

function sheetEdits(sheet: Sheet, writes: readonly CellWrite[]): Edit[] {
  const xml = sheet.xml;
  const sd = sheet.sheetData;
  if (!sd) throw new Error("worksheet has no sheetData");
  const p = sd.prefix ? `${sd.prefix}:` : "";
  const cells = sheet.cells;
  const byRow = new Map<number, CellWrite[]>();
  for (const w of writes) {
    const list = byRow.get(w.row);
    if (list) list.push(w);
    else byRow.set(w.row, [w]);
  }
  const rows = [...byRow.keys()].sort((a, b) => a - b);
  const spans = sheet.rowSpans;
  const edits: Edit[] = [];
  const newRows: { before: number; text: string }[] = [];
  let si = 0;
  for (const row of rows) {
    const ws = (byRow.get(row) as CellWrite[]).sort((a, b) => a.col - b.col);
    while (si < spans.n && (spans.row[si] as number) < row) si++;
    if (si >= spans.n || spans.row[si] !== row) {
      const rendered = ws.filter((w) => w.kind !== "clear").map((w) => cellXml(w, undefined, sd.prefix));
      if (rendered.length) newRows.push({ before: si < spans.n ? (spans.start[si] as number) : sd.closeStart, text: `<${p}row r="${row + 1}">${rendered.join("")}</${p}row>` });
      continue;
    }
    const rowStart = spans.start[si] as number;
    const rowOpenEnd = spans.openEnd[si] as number;
    const rowCloseStart = spans.closeStart[si] as number;
    const rowEnd = spans.end[si] as number;
    const selfClosing = spans.selfClosing[si] === 1;
    let added = false;
    const inserts: { at: number; text: string }[] = [];
    for (const w of ws) {
      const k = cells.find(w.row, w.col);
      if (k >= 0) {
        const start = cells.start[k] as number;
        const end = cells.end[k] as number;
        edits.push({ start, end, text: cellXml(w, xml.slice(start, end), sd.prefix, sheet) });
        continue;
      }
      if (w.kind === "clear") continue;
      // A new cell goes before the first existing cell to its right, or at the end of the row.
      const next = cells.firstAtOrAfter(w.row, w.col);
      const [, rowLast] = cells.rowRange(w.row);
      const at = next < rowLast ? (cells.start[next] as number) : rowCloseStart;
      inserts.push({ at, text: cellXml(w, undefined, sd.prefix) });
      added = true;
    }
    if (added) {
      const tag = rowOpen(xml, rowStart, rowOpenEnd);
      if (selfClosing) {
        edits.push({ start: rowStart, end: rowEnd, text: `${tag.open}${inserts.map((i) => i.text).join("")}</${tag.name}>` });
        continue;
      }
      edits.push({ start: rowStart, end: rowOpenEnd, text: tag.open });
      const grouped = new Map<number, string>();
      for (const i of inserts) grouped.set(i.at, (grouped.get(i.at) ?? "") + i.text);
      for (const [at, text] of grouped) edits.push({ start: at, end: at, text });
    }
  }
  if (newRows.length) {
    if (sd.selfClosing) {
      const inner = newRows.map((r) => r.text).join("");
      edits.push({ start: sd.start, end: sd.openEnd, text: `<${p}sheetData>${inner}</${p}sheetData>` });
    } else {
      const grouped = new Map<number, string>();
      for (const r of newRows) grouped.set(r.before, (grouped.get(r.before) ?? "") + r.text);
      for (const [at, text] of grouped) edits.push({ start: at, end: at, text });
    }
  }
  // Insertions at an offset go before a replacement starting there.
  edits.sort((a, b) => a.start - b.start || a.end - a.start - (b.end - b.start));
  return edits;
}

function applyEdits(xml: string, edits: readonly Edit[]): Buffer {
  const out = new Utf8Writer();
  let at = 0;
  for (const e of edits) {
    if (e.start < at) throw new Error("overlapping edits to the sheet");
    out.add(xml.slice(at, e.start));
    out.add(e.text);
    at = e.end;
  }
  out.add(xml.slice(at));
  return out.toBuffer();
}

/**
 * Collects text as UTF-8 bytes in one growing buffer (no joined string: a part may be larger than a
 * JavaScript string can hold). Small pieces are joined into a string of up to 64 K characters
 * before each encode: one encode per piece (two per cell of a large sheet) cost more than the join.
 */
export class Utf8Writer {
  private buf: Buffer;
  private at = 0;
  private pending = "";
  /** `expected`: the bytes the output will likely need (a rewritten sheet is about its own size). */
  constructor(expected = 1 << 20) {
    this.buf = Buffer.allocUnsafe(Math.max(1 << 16, Math.ceil(expected)));
  }
  add(s: string): void {
    this.pending += s;
    if (this.pending.length >= 1 << 16) this.flush();
  }
  private flush(): void {
    const s = this.pending;
    if (!s) return;
    this.pending = "";
    const need = this.at + s.length * 3;
    if (need > this.buf.length) {
      let size = this.buf.length * 2;
      while (size < need) size *= 2;
      const next = Buffer.allocUnsafe(size);
      this.buf.copy(next, 0, 0, this.at);
      this.buf = next;
    }
    this.at += this.buf.write(s, this.at, "utf8");
  }
  toBuffer(): Buffer {
    this.flush();
    return this.buf.subarray(0, this.at);
  }
}
