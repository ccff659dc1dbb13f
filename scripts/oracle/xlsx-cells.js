/**
 * Reads what an .xlsx caches in every cell, straight from the sheet XML (through the tokenizer of
 * xml.js, not a workbook library: ExcelJS expands shared formulas by rewriting their text and
 * drops cached zeros). Also strips the cached values of formula cells, for the oracle's
 * "compute everything" copies. Used by the oracle scripts and by the tests.
 */
"use strict";
const JSZip = require("jszip");
const { parse, textOf, childrenNamed, tokenize } = require("./xml");

const MAIN_NS = new Set(["http://schemas.openxmlformats.org/spreadsheetml/2006/main", "http://purl.oclc.org/ooxml/spreadsheetml/main"]);
const REL_NS = new Set(["http://schemas.openxmlformats.org/officeDocument/2006/relationships", "http://purl.oclc.org/ooxml/officeDocument/relationships"]);

function columnIndex(letters) {
  let n = 0;
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n - 1;
}

function columnLetters(index) {
  let s = "";
  let n = index + 1;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

function parseA1(ref) {
  const m = /^\$?([A-Za-z]{1,3})\$?(\d+)$/.exec(ref);
  if (!m) throw new Error(`not a cell reference: ${ref}`);
  return { row: Number(m[2]) - 1, col: columnIndex(m[1]) };
}

const a1 = (row, col) => `${columnLetters(col)}${row + 1}`;

function parseRange(ref) {
  const [a, b] = ref.split(":");
  const top = parseA1(a);
  const bottom = b ? parseA1(b) : top;
  return { top, rows: bottom.row - top.row + 1, cols: bottom.col - top.col + 1 };
}

/** Every address of a range, row by row. */
function addressesOf(ref) {
  const r = parseRange(ref);
  const out = [];
  for (let i = 0; i < r.rows; i++) for (let j = 0; j < r.cols; j++) out.push(a1(r.top.row + i, r.top.col + j));
  return out;
}

function isMain(el) {
  return MAIN_NS.has(el.ns);
}

function mainChildren(el, local) {
  return el.children.filter((c) => c.local === local && MAIN_NS.has(c.ns));
}

function attrOf(el, local) {
  for (const [k, v] of el.attrs) {
    const colon = k.indexOf(":");
    if (colon < 0 ? k === local : false) return v;
  }
  return undefined;
}

/** A relationship-namespace attribute (r:id, whatever the prefix). */
function relAttr(el, local) {
  for (const [k, v] of el.attrs) {
    const colon = k.indexOf(":");
    if (colon < 0) continue;
    if (k.slice(colon + 1) === local && REL_NS.has(el.nsMap.get(k.slice(0, colon)))) return v;
  }
  return undefined;
}

/** Text of a string item (<si>, <is>): its <t> and runs' <t>, without phonetic runs. */
function stringItem(el) {
  let s = "";
  for (const c of el.children) {
    if (c.local === "t" && isMain(c)) s += textOf(c);
    else if (c.local === "r" && isMain(c)) for (const t of mainChildren(c, "t")) s += textOf(t);
  }
  return s;
}

function resolveTarget(base, target) {
  if (target.startsWith("/")) return target.slice(1);
  const parts = `${base}/${target}`.split("/");
  const out = [];
  for (const p of parts) {
    if (p === "..") out.pop();
    else if (p !== "." && p !== "") out.push(p);
  }
  return out.join("/");
}

async function readPart(zip, name) {
  const f = zip.file(name);
  return f ? f.async("string") : undefined;
}

/** The value a cell caches, typed: number, string, boolean, { error }, or null (no value). */
function cachedValue(t, v, inline, sst) {
  if (t === "inlineStr") return inline === undefined ? null : inline;
  if (v === undefined) return null;
  switch (t) {
    case "s":
      return sst[Number(v)] ?? null;
    case "str":
      return v;
    case "b":
      return v.trim() === "1" || v.trim().toLowerCase() === "true";
    case "e":
      return { error: v.trim() };
    case "d":
      return { date: v.trim() };
    default:
      return v.trim() === "" ? null : Number(v);
  }
}

/** Reads the cells of one sheet part. */
function readSheet(xml, sst) {
  const root = parse(xml);
  const cells = new Map();
  const data = mainChildren(root, "sheetData")[0];
  const merges = [];
  for (const mc of mainChildren(root, "mergeCells")) for (const m of mainChildren(mc, "mergeCell")) merges.push(attrOf(m, "ref"));
  if (!data) return { cells, merges };
  let rowIndex = -1;
  for (const row of mainChildren(data, "row")) {
    const r = attrOf(row, "r");
    rowIndex = r ? Number(r) - 1 : rowIndex + 1;
    let col = -1;
    for (const c of mainChildren(row, "c")) {
      const ref = attrOf(c, "r");
      const at = ref ? parseA1(ref) : { row: rowIndex, col: col + 1 };
      col = at.col;
      const t = attrOf(c, "t") ?? "n";
      const vEl = mainChildren(c, "v")[0];
      const isEl = mainChildren(c, "is")[0];
      const fEl = mainChildren(c, "f")[0];
      const cell = {
        r: a1(at.row, at.col),
        row: at.row,
        col: at.col,
        t,
        s: attrOf(c, "s"),
        cm: attrOf(c, "cm"),
        v: vEl ? textOf(vEl) : undefined,
        value: cachedValue(t, vEl ? textOf(vEl) : undefined, isEl ? stringItem(isEl) : undefined, sst),
      };
      if (fEl) {
        cell.f = { text: textOf(fEl), t: attrOf(fEl, "t") ?? "normal", ref: attrOf(fEl, "ref"), si: attrOf(fEl, "si"), aca: attrOf(fEl, "aca") };
      }
      cells.set(cell.r, cell);
    }
  }
  return { cells, merges };
}

/**
 * Opens a workbook's bytes and reads every sheet's cells, its defined names and date system.
 * `checkCRC32` is on: a corrupt entry fails here.
 */
async function readWorkbookCells(bytes) {
  const zip = await JSZip.loadAsync(bytes, { checkCRC32: true });
  const wbXml = await readPart(zip, "xl/workbook.xml");
  if (!wbXml) throw new Error("xl/workbook.xml is missing");
  const wb = parse(wbXml);
  const rels = parse((await readPart(zip, "xl/_rels/workbook.xml.rels")) ?? "<Relationships/>");
  const targets = new Map();
  let sstPath;
  for (const rel of rels.children.filter((c) => c.local === "Relationship")) {
    const target = resolveTarget("xl", rel.attrs.get("Target"));
    targets.set(rel.attrs.get("Id"), target);
    if (/\/sharedStrings$/.test(rel.attrs.get("Type") ?? "")) sstPath = target;
  }
  const sstXml = sstPath ? await readPart(zip, sstPath) : undefined;
  const sst = sstXml ? mainChildren(parse(sstXml), "si").map(stringItem) : [];
  const pr = mainChildren(wb, "workbookPr")[0];
  const date1904 = pr ? ["1", "true"].includes((attrOf(pr, "date1904") ?? "").toLowerCase()) : false;
  const sheets = [];
  const sheetsEl = mainChildren(wb, "sheets")[0];
  for (const s of sheetsEl ? mainChildren(sheetsEl, "sheet") : []) {
    const name = attrOf(s, "name");
    const path = targets.get(relAttr(s, "id"));
    const xml = path ? await readPart(zip, path) : undefined;
    if (xml === undefined) throw new Error(`sheet ${name}: part ${path} is missing`);
    sheets.push({ name, path, ...readSheet(xml, sst) });
  }
  const names = [];
  const dn = mainChildren(wb, "definedNames")[0];
  for (const d of dn ? mainChildren(dn, "definedName") : []) {
    const local = attrOf(d, "localSheetId");
    names.push({ name: attrOf(d, "name"), value: textOf(d), sheet: local === undefined ? undefined : sheets[Number(local)]?.name });
  }
  return { date1904, sheets, names, zip };
}

/**
 * The addresses whose values formulas decide: every cell with an <f>, and every cell inside the
 * ref of an array formula (legacy CSE or dynamic); for a ref over more than `maxArrayCells`
 * cells, only the cells the sheet holds inside it. Sorted row by row.
 */
function formulaAddresses(sheet, maxArrayCells = 100000) {
  const out = new Set();
  for (const c of sheet.cells.values()) {
    if (!c.f) continue;
    out.add(c.r);
    if (c.f.t !== "array" || !c.f.ref) continue;
    const r = parseRange(c.f.ref);
    if (r.rows * r.cols <= maxArrayCells) {
      for (const a of addressesOf(c.f.ref)) out.add(a);
      continue;
    }
    // a huge ref (a hostile file): only the cells the sheet holds inside it
    for (const d of sheet.cells.values()) {
      if (d.row >= r.top.row && d.row < r.top.row + r.rows && d.col >= r.top.col && d.col < r.top.col + r.cols) out.add(d.r);
    }
  }
  return [...out].sort((x, y) => {
    const p = parseA1(x);
    const q = parseA1(y);
    return p.row - q.row || p.col - q.col;
  });
}

/** A JSON-friendly cached value: number, string, boolean, { error }, or null. */
function plain(cell) {
  if (!cell) return null;
  const v = cell.value;
  if (typeof v === "number" && !Number.isFinite(v)) return { unreadable: cell.v };
  return v;
}

/**
 * Removes the cached value (and value type) of every formula cell and of every cell inside an
 * array formula's ref, in every sheet; other parts are carried over unchanged.
 */
async function stripCachedValues(bytes) {
  const book = await readWorkbookCells(bytes);
  const zip = book.zip;
  for (const sheet of book.sheets) {
    const targets = new Set(formulaAddresses(sheet));
    if (!targets.size) continue;
    const xml = await zip.file(sheet.path).async("string");
    zip.file(sheet.path, stripSheet(xml, targets), { createFolders: false });
  }
  return zip.generateAsync({ type: "nodebuffer", compression: "DEFLATE" });
}

/** Cuts the <v> children (and the t attribute) of the cells in `targets` out of a sheet part. */
function stripSheet(xml, targets) {
  const root = parse(xml);
  const cuts = []; // [start, end, replacement]
  const data = mainChildren(root, "sheetData")[0];
  let rowIndex = -1;
  for (const row of data ? mainChildren(data, "row") : []) {
    const r = attrOf(row, "r");
    rowIndex = r ? Number(r) - 1 : rowIndex + 1;
    let col = -1;
    for (const c of mainChildren(row, "c")) {
      const ref = attrOf(c, "r");
      const at = ref ? parseA1(ref) : { row: rowIndex, col: col + 1 };
      col = at.col;
      if (!targets.has(a1(at.row, at.col))) continue;
      const t = c.attrTokens.find((a) => a.name === "t");
      if (t) {
        let start = t.start; // with the white space before the attribute
        while (/\s/.test(xml[start - 1])) start--;
        cuts.push([start, t.end, ""]);
      }
      for (const v of [...mainChildren(c, "v"), ...mainChildren(c, "is")]) cuts.push([v.start, v.end, ""]);
    }
  }
  cuts.sort((p, q) => p[0] - q[0]);
  const parts = [];
  let at = 0;
  for (const [s, e, rep] of cuts) {
    parts.push(xml.slice(at, s), rep);
    at = e;
  }
  parts.push(xml.slice(at));
  const out = parts.join("");
  tokenize(out); // still well-formed
  return out;
}

module.exports = {
  readWorkbookCells,
  readSheet,
  formulaAddresses,
  stripCachedValues,
  plain,
  parseA1,
  parseRange,
  addressesOf,
  a1,
  columnIndex,
  columnLetters,
  MAIN_NS,
  childrenNamed,
};
