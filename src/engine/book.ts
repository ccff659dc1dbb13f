/**
 * A workbook as the engine holds it: for each worksheet, its cells as the file has them (cached
 * value, formula and storage form), with the byte offsets of every row and cell in the sheet
 * part so a writer can replace exactly the cells it recomputes. Read with the XML tokenizer;
 * anything the reader cannot take faithfully (cells out of order, unknown markup inside a cell,
 * a shared-string index that does not exist) is refused, never guessed.
 */
import { a1, parseA1 } from "./cellref";
import { FormulaSyntaxError, T, Token, tokenize } from "./formula/lexer";
import { NameMap, Node, parseFormula, parseTokens } from "./formula/parser";
import { ErrorCode, Rect, Scalar, XlError, isErrorCode, MAX_COLS, MAX_ROWS } from "./formula/values";
import { MAIN_NS, Tok, XmlError, XmlScanner, prefixFor } from "./xml";
import { WorkbookFileError, XlsxPackage, asFileError, dynamicArrayCms, readRelationships, relsPathOf, resolveTarget } from "./xlsx-package";

/** How a formula is stored, which decides how Excel evaluates it. */
export type FormulaForm =
  /** A plain <f>: a legacy formula (implicit intersection where legacy Excel applied it). */
  | "plain"
  /** A member of a shared formula (filled down or across): legacy, like plain. */
  | "shared"
  /** A legacy array (CSE) formula over a fixed range. */
  | "array"
  /** An Excel 365 dynamic-array formula (cm pointing at XLDAPR metadata): spills to fit. */
  | "dynamic"
  /** A what-if data table: not computed headless. */
  | "table";

export interface Formula {
  readonly form: FormulaForm;
  /** The formula text as stored (for a shared member, its master's text). */
  readonly text: string;
  /** Where `text` was written (a shared member's master); the tree's relative references are from here. */
  readonly originRow: number;
  readonly originCol: number;
  /** The range an array, dynamic or shared-master formula covers in the file. */
  readonly ref?: Rect;
  /** The syntax tree, or the reason the text could not be parsed. */
  node?: Node;
  syntaxError?: string;
  /**
   * Where the cell's markup is, for a writer that rewrites only what changes: the end of the <c>
   * start tag, and the <f> element's start, the end of its start tag, the start of its end tag and
   * its end. `simple` is false when the cell holds anything besides <f>, <v> and <is> (comments,
   * extensions), which a writer must then keep.
   */
  readonly span: { readonly open: number; readonly f: number; readonly fOpen: number; readonly fClose: number; readonly fEnd: number; readonly simple: boolean };
}

export interface Cell {
  readonly row: number;
  readonly col: number;
  /** The value the file caches (a formula's last result); null when none. */
  readonly value: Scalar;
  /** True when the file caches a value (a formula without one is computed). */
  readonly cached: boolean;
  readonly formula?: Formula;
  /** Offsets of the whole <c> element in the sheet part. */
  readonly start: number;
  readonly end: number;
  /** The planner's index for a cell it computes, -1 otherwise (set by the planner). */
  planId: number;
}

export interface RowSpan {
  readonly row: number;
  readonly start: number;
  /** End of the <row …> start tag. */
  readonly openEnd: number;
  /** Start of </row> (equal to `end` for a self-closing row). */
  readonly closeStart: number;
  readonly end: number;
  readonly selfClosing: boolean;
}

export interface Sheet {
  readonly name: string;
  readonly index: number;
  readonly path: string;
  readonly isWorksheet: boolean;
  readonly xml: string;
  /** Rows of cells, sparse: rows[r]?.[c]. */
  readonly rows: (Cell | undefined)[][];
  readonly rowSpans: RowSpan[];
  /** The sheetData element: where rows go when a sheet has none yet. */
  readonly sheetData?: { readonly start: number; readonly openEnd: number; readonly closeStart: number; readonly selfClosing: boolean; readonly prefix: string };
  readonly merges: Rect[];
  readonly formulaCells: Cell[];
}

export interface DefinedName {
  readonly name: string;
  /** Sheet position for a sheet-scoped name. */
  readonly scope?: number;
  readonly text: string;
  node?: Node;
  syntaxError?: string;
}

export interface Book {
  readonly sheets: Sheet[];
  readonly names: DefinedName[];
  readonly date1904: boolean;
  /** Sheet lookup by name, case-insensitive. */
  sheetIndex(name: string): number | undefined;
  /** A defined name visible from a sheet (its own scope first, then the workbook's). */
  definedName(name: string, fromSheet: number): DefinedName | undefined;
  cell(sheet: number, row: number, col: number): Cell | undefined;
}

/** Reads every worksheet of a package. */
export function readBook(pkg: XlsxPackage, names: NameMap): Book {
  const rels = readRelationships(pkg.text(relsPathOf(pkg.workbookPath)));
  const sstRel = rels.find((r) => r.type.endsWith("/sharedStrings"));
  const strings = sstRel ? asFileError("the shared strings cannot be read", () => readSharedStrings(pkg.text(resolveTarget(pkg.workbookPath, sstRel.target)))) : [];
  const metaRel = rels.find((r) => r.type.endsWith("/sheetMetadata"));
  const dynamicCms = metaRel ? asFileError("the cell metadata cannot be read", () => dynamicArrayCms(pkg.text(resolveTarget(pkg.workbookPath, metaRel.target)))) : new Set<number>();
  const cache = new Map<string, Node>();
  const sheets: Sheet[] = pkg.sheets.map((part) => {
    if (part.kind !== "worksheet") {
      return { name: part.name, index: part.index, path: part.path, isWorksheet: false, xml: "", rows: [], rowSpans: [], merges: [], formulaCells: [] };
    }
    const xml = pkg.text(part.path) as string;
    return asFileError(`sheet "${part.name}" cannot be read`, () => readSheet(part.name, part.index, part.path, xml, strings, dynamicCms, pkg.date1904, names, cache));
  });
  const byName = new Map(sheets.map((s) => [s.name.toUpperCase(), s.index]));
  const definedNames: DefinedName[] = [];
  for (const d of pkg.definedNames) {
    if (d.name.toUpperCase().startsWith("_XLNM.")) continue; // print areas, filters: not referred to by formulas
    const dn: DefinedName = d.localSheetId === undefined ? { name: d.name, text: d.text } : { name: d.name, text: d.text, scope: d.localSheetId };
    try {
      // Relative references in a defined name are relative to A1.
      dn.node = parseFormula(d.text, 0, 0, names);
    } catch (e) {
      dn.syntaxError = (e as Error).message;
    }
    definedNames.push(dn);
  }
  const nameIndex = new Map<string, DefinedName>();
  for (const d of definedNames) nameIndex.set(`${d.scope ?? ""}|${d.name.toUpperCase()}`, d);
  return {
    sheets,
    names: definedNames,
    date1904: pkg.date1904,
    sheetIndex: (name) => byName.get(name.toUpperCase()),
    definedName: (name, from) => nameIndex.get(`${from}|${name.toUpperCase()}`) ?? nameIndex.get(`|${name.toUpperCase()}`),
    cell: (sheet, row, col) => sheets[sheet]?.rows[row]?.[col],
  };
}

/** The current element's local name (a call, so the compiler does not narrow it across tokens). */
function localOf(s: XmlScanner): string {
  return s.local;
}

function readSharedStrings(xml: string | undefined): string[] {
  if (!xml) return [];
  const s = new XmlScanner(xml);
  const out: string[] = [];
  let current: string | undefined;
  let skipDepth = 0;
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t === Tok.Open) {
      if (skipDepth > 0) {
        if (!s.selfClosing) skipDepth++;
        continue;
      }
      if (localOf(s) === "si") {
        current = "";
        if (s.selfClosing) {
          out.push("");
          current = undefined;
        }
      } else if (localOf(s) === "rPh" || localOf(s) === "phoneticPr") {
        // Phonetic guides are not part of the text.
        if (!s.selfClosing) skipDepth = 1;
      } else if (localOf(s) === "t" && current !== undefined) {
        current += s.elementText();
      }
    } else if (t === Tok.Close) {
      if (skipDepth > 0) {
        skipDepth--;
        continue;
      }
      if (localOf(s) === "si" && current !== undefined) {
        out.push(current);
        current = undefined;
      }
    }
  }
  return out;
}

/** An ISO 8601 date-time (t="d" cells) as a serial number in the workbook's date system. */
export function isoToSerial(iso: string, date1904: boolean): number | undefined {
  const m = /^(\d{4})-(\d{2})-(\d{2})(?:T(\d{2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?)?Z?$/.exec(iso.trim());
  if (!m) return undefined;
  const ms = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4] ?? 0), Number(m[5] ?? 0)) + Number(m[6] ?? 0) * 1000;
  const epoch = date1904 ? Date.UTC(1904, 0, 1) : Date.UTC(1899, 11, 30);
  let serial = (ms - epoch) / 86400000;
  // Excel's 1900 system counts a 29 February 1900 that did not exist.
  if (!date1904 && serial < 61) serial -= 1;
  return serial;
}

/** The parts of the cell markup the reader keeps. */
interface RawCell {
  open: number;
  fStart: number;
  fOpen: number;
  fClose: number;
  fEnd: number;
  simple: boolean;
  t?: string;
  cm?: string;
  fText?: string;
  fType?: string;
  fRef?: string;
  fSi?: string;
  v?: string;
  inline?: string;
}

const isRefChar = (c: number) =>
  (c >= 48 && c <= 57) || (c >= 65 && c <= 90) || (c >= 97 && c <= 122) || c === 95 || c === 46 || c === 92 || c === 63 || c === 36 || c > 127;
const CELL_WORD = /^(\$?)([A-Za-z]{1,3})(\$?)([0-9]{1,7})$/;

/**
 * A formula's text with its relative cell references written as offsets from (row, col), so a
 * formula filled down a column has one key (and one tree). It recognises a reference exactly
 * where the lexer does (a whole word in cell form, not followed by "(", "!" or "["; text in
 * quotes left alone); anything else stays literal, so two formulas share a key only when one is
 * the other shifted.
 */
export function relativeKey(text: string, row: number, col: number): string {
  let out = "";
  let i = 0;
  const n = text.length;
  let last = 0;
  let positional = false;
  while (i < n) {
    const c = text.charCodeAt(i);
    if (c === 34 || c === 39) {
      // a string or a quoted sheet name: skip to its closing quote ("" and '' escape)
      let j = i + 1;
      for (;;) {
        const q = text.indexOf(c === 34 ? '"' : "'", j);
        if (q < 0) return text; // malformed: no sharing
        if (text.charCodeAt(q + 1) === c) {
          j = q + 2;
          continue;
        }
        i = q + 1;
        break;
      }
      continue;
    }
    if (!isRefChar(c)) {
      i++;
      continue;
    }
    let j = i;
    while (j < n && isRefChar(text.charCodeAt(j))) j++;
    const next = text.charCodeAt(j);
    const word = text.slice(i, j);
    // Whole columns (A:B) and rows (1:3) are relative too, but not in cell form: no sharing.
    if ((next === 58 || text.charCodeAt(i - 1) === 58) && /^\$?([A-Za-z]{1,3}|[0-9]{1,7})$/.test(word)) positional = true;
    if (next !== 40 && next !== 33 && next !== 91) {
      const m = CELL_WORD.exec(word);
      if (m) {
        let k = 0;
        for (const ch of m[2] as string) k = k * 26 + ((ch.charCodeAt(0) | 32) - 96);
        const colAt = k - 1;
        const rowAt = Number(m[4]) - 1;
        if (colAt < 16384 && rowAt >= 0 && rowAt < 1048576) {
          out += text.slice(last, i);
          out += `\u0001${m[1] ? `$${colAt}` : colAt - col},${m[3] ? `$${rowAt}` : rowAt - row}\u0001`;
          last = j;
        }
      }
    }
    i = j;
  }
  return out + text.slice(last) + (positional ? `\u0002${row},${col}` : "");
}

/** Parses a formula written at (row, col), sharing trees between formulas of the same relative shape. */
export function parseShared(text: string, row: number, col: number, names: NameMap, cache: Map<string, Node>): Node {
  const body = text.startsWith("=") ? text.slice(1) : text;
  const key = relativeKey(body, row, col);
  const hit = cache.get(key);
  if (hit) return hit;
  const node = parseTokens(tokenize(body), row, col, names);
  if (cache.size < 200000) cache.set(key, node);
  return node;
}

function parseRef(ref: string | undefined): Rect | undefined {
  if (!ref) return undefined;
  const [a, b] = ref.split(":");
  try {
    const top = parseA1(a as string);
    const bottom = b ? parseA1(b) : top;
    if (bottom.row < top.row || bottom.col < top.col || bottom.row >= MAX_ROWS || bottom.col >= MAX_COLS) return undefined;
    return { r1: top.row, c1: top.col, r2: bottom.row, c2: bottom.col };
  } catch {
    return undefined;
  }
}

function readSheet(
  name: string,
  index: number,
  path: string,
  xml: string,
  strings: readonly string[],
  dynamicCms: Set<number>,
  date1904: boolean,
  names: NameMap,
  cache: Map<string, Node>,
): Sheet {
  const s = new XmlScanner(xml);
  const rows: (Cell | undefined)[][] = [];
  const rowSpans: RowSpan[] = [];
  const merges: Rect[] = [];
  const formulaCells: Cell[] = [];
  let sheetData: Sheet["sheetData"];
  // Shared formula masters by si, and members waiting for theirs.
  const masters = new Map<string, { text: string; row: number; col: number }>();
  const pendingShared: { cell: Cell; si: string }[] = [];

  let main: string | undefined;
  let t = s.next();
  while (t !== Tok.End && t !== Tok.Open) t = s.next();
  if (t !== Tok.Open || localOf(s) !== "worksheet") throw new XmlError("the part is not a worksheet");
  main = prefixFor(s.attrs(), MAIN_NS);
  if (main === undefined) throw new XmlError("the worksheet is not in the SpreadsheetML namespace");
  const isMain = () => s.prefix === main;

  let lastRow = -1;
  for (t = s.next(); t !== Tok.End; t = s.next()) {
    if (t !== Tok.Open) continue;
    if (!isMain()) {
      s.skipElement();
      continue;
    }
    if (localOf(s) === "mergeCell") {
      const r = parseRef(s.attr("ref"));
      if (r) merges.push(r);
      continue;
    }
    if (localOf(s) === "mergeCells") continue; // its mergeCell children are read above
    if (localOf(s) !== "sheetData") {
      s.skipElement();
      continue;
    }
    const sdStart = s.start;
    const sdOpenEnd = s.end;
    if (s.selfClosing) {
      sheetData = { start: sdStart, openEnd: sdOpenEnd, closeStart: sdOpenEnd, selfClosing: true, prefix: main };
      continue;
    }
    // Rows
    for (t = s.next(); ; t = s.next()) {
      if (t === Tok.End) throw new XmlError("sheetData is not closed");
      if (t === Tok.Close) {
        sheetData = { start: sdStart, openEnd: sdOpenEnd, closeStart: s.start, selfClosing: false, prefix: main };
        break;
      }
      if (t === Tok.Text) {
        if (s.text().trim() !== "") throw new XmlError("text directly inside sheetData");
        continue;
      }
      if (t !== Tok.Open) continue; // comments, CDATA, PIs
      if (!isMain() || localOf(s) !== "row") throw new XmlError(`unexpected element <${s.name}> in sheetData`);
      const rowStart = s.start;
      const rAttr = s.attr("r");
      const row = rAttr === undefined ? lastRow + 1 : Number(rAttr) - 1;
      if (!Number.isInteger(row) || row < 0 || row >= MAX_ROWS) throw new XmlError(`row number ${rAttr} is out of range`);
      if (row <= lastRow) throw new XmlError(`row ${row + 1} comes after row ${lastRow + 1}; rows must be in order`);
      lastRow = row;
      const openEnd = s.end;
      if (s.selfClosing) {
        rowSpans.push({ row, start: rowStart, openEnd, closeStart: openEnd, end: openEnd, selfClosing: true });
        continue;
      }
      let lastCol = -1;
      const cells: (Cell | undefined)[] = [];
      for (t = s.next(); ; t = s.next()) {
        if (t === Tok.End) throw new XmlError("a row is not closed");
        if (t === Tok.Close) break;
        if (t === Tok.Text) {
          if (s.text().trim() !== "") throw new XmlError(`text directly inside row ${row + 1}`);
          continue;
        }
        if (t !== Tok.Open) continue;
        if (!isMain()) {
          s.skipElement(); // e.g. an extension element of another namespace
          continue;
        }
        if (localOf(s) !== "c") throw new XmlError(`unexpected element <${s.name}> in row ${row + 1}`);
        const cellStart = s.start;
        const r = s.attr("r");
        let col: number;
        if (r === undefined) col = lastCol + 1;
        else {
          const at = /^([A-Za-z]{1,3})(\d+)$/.exec(r);
          if (!at) throw new XmlError(`cell reference "${r}" is not a cell`);
          const p = parseA1(r);
          if (p.row !== row) throw new XmlError(`cell ${r} is inside row ${row + 1}`);
          col = p.col;
        }
        if (col >= MAX_COLS) throw new XmlError(`cell column beyond XFD in row ${row + 1}`);
        if (col <= lastCol) throw new XmlError(`cells of row ${row + 1} are out of order`);
        lastCol = col;
        const raw: RawCell = { open: s.end, fStart: -1, fOpen: -1, fClose: -1, fEnd: -1, simple: true, t: s.attr("t"), cm: s.attr("cm") };
        if (!s.selfClosing) readCellBody(s, raw, isMain, row, col);
        const cell = makeCell(raw, row, col, cellStart, s.end, strings, dynamicCms, date1904, names, cache, masters, pendingShared);
        cells[col] = cell;
        if (cell.formula) formulaCells.push(cell);
      }
      rows[row] = cells;
      rowSpans.push({ row, start: rowStart, openEnd, closeStart: s.start, end: s.end, selfClosing: false });
    }
  }
  // Shared members take their master's text; the master's tree serves them all.
  for (const p of pendingShared) {
    const m = masters.get(p.si);
    const f = p.cell.formula as Formula & { text: string; originRow: number; originCol: number };
    if (!m) {
      f.syntaxError = `shared formula ${p.si} has no master cell`;
      continue;
    }
    (f as { text: string }).text = m.text;
    (f as { originRow: number }).originRow = m.row;
    (f as { originCol: number }).originCol = m.col;
    try {
      f.node = parseShared(m.text, m.row, m.col, names, cache);
    } catch (e) {
      f.syntaxError = (e as Error).message;
    }
  }
  return { name, index, path, isWorksheet: true, xml, rows, rowSpans, sheetData, merges, formulaCells };
}

function readCellBody(s: XmlScanner, raw: RawCell, isMain: () => boolean, row: number, col: number): void {
  const where = () => a1({ row, col });
  for (let t = s.next(); ; t = s.next()) {
    if (t === Tok.End) throw new XmlError(`cell ${where()} is not closed`);
    if (t === Tok.Close) return;
    if (t === Tok.Text) {
      if (s.text().trim() !== "") throw new XmlError(`text directly inside cell ${where()}`);
      continue;
    }
    if (t !== Tok.Open) {
      raw.simple = false; // a comment or CDATA inside a cell is not content, but a writer keeps it
      continue;
    }
    if (!isMain()) {
      raw.simple = false;
      s.skipElement();
      continue;
    }
    switch (localOf(s)) {
      case "f":
        if (raw.fText !== undefined) throw new XmlError(`cell ${where()} has two formulas`);
        raw.fType = s.attr("t");
        raw.fRef = s.attr("ref");
        raw.fSi = s.attr("si");
        raw.fStart = s.start;
        raw.fOpen = s.end;
        if (s.selfClosing) {
          raw.fText = "";
          raw.fClose = raw.fEnd = s.end;
        } else {
          raw.fText = s.elementText();
          raw.fClose = s.start;
          raw.fEnd = s.end;
        }
        break;
      case "v":
        if (raw.v !== undefined) throw new XmlError(`cell ${where()} has two values`);
        raw.v = s.elementText();
        break;
      case "is":
        raw.inline = readInline(s);
        break;
      case "extLst":
        raw.simple = false;
        s.skipElement();
        break;
      default:
        throw new XmlError(`unexpected element <${s.name}> in cell ${where()}`);
    }
  }
}

function readInline(s: XmlScanner): string {
  if (s.selfClosing) return "";
  let out = "";
  let depth = 1;
  for (let t = s.next(); ; t = s.next()) {
    if (t === Tok.End) throw new XmlError("an inline string is not closed");
    if (t === Tok.Open) {
      if (localOf(s) === "rPh" || localOf(s) === "phoneticPr") {
        s.skipElement();
        continue;
      }
      if (localOf(s) === "t") {
        out += s.elementText();
        continue;
      }
      if (!s.selfClosing) depth++;
    } else if (t === Tok.Close && --depth === 0) return out;
  }
}

function makeCell(
  raw: RawCell,
  row: number,
  col: number,
  start: number,
  end: number,
  strings: readonly string[],
  dynamicCms: Set<number>,
  date1904: boolean,
  names: NameMap,
  cache: Map<string, Node>,
  masters: Map<string, { text: string; row: number; col: number }>,
  pendingShared: { cell: Cell; si: string }[],
): Cell {
  const where = () => a1({ row, col });
  let value: Scalar = null;
  let cached = false;
  const type = raw.t ?? "n";
  if (type === "inlineStr") {
    if (raw.inline !== undefined) {
      value = raw.inline;
      cached = true;
    }
  } else if (raw.v !== undefined) {
    cached = true;
    switch (type) {
      case "n": {
        const text = raw.v.trim();
        if (text === "") {
          value = null;
          cached = false;
          break;
        }
        const n = Number(text);
        if (!Number.isFinite(n)) throw new XmlError(`cell ${where()} holds "${raw.v}", which is not a number`);
        value = n;
        break;
      }
      case "s": {
        const i = Number(raw.v.trim());
        if (!Number.isInteger(i) || i < 0 || i >= strings.length) throw new XmlError(`cell ${where()} points at shared string ${raw.v}, which does not exist`);
        value = strings[i] as string;
        break;
      }
      case "str":
        value = raw.v;
        break;
      case "b":
        value = raw.v.trim() === "1" || raw.v.trim().toLowerCase() === "true";
        break;
      case "e": {
        const code = raw.v.trim().toUpperCase();
        value = new XlError(isErrorCode(code) ? (code as ErrorCode) : "#VALUE!");
        break;
      }
      case "d": {
        const serial = isoToSerial(raw.v, date1904);
        if (serial === undefined) throw new XmlError(`cell ${where()} holds the date "${raw.v}", which is not ISO 8601`);
        value = serial;
        break;
      }
      default:
        throw new XmlError(`cell ${where()} has an unknown type "${type}"`);
    }
  } else if (type === "str" && raw.fText !== undefined) {
    cached = false;
  }
  if (raw.fText === undefined) return { row, col, value, cached, start, end, planId: -1 };

  const fType = raw.fType ?? "normal";
  let form: FormulaForm;
  if (fType === "shared") form = "shared";
  else if (fType === "array") form = raw.cm !== undefined && dynamicCms.has(Number(raw.cm)) ? "dynamic" : "array";
  else if (fType === "dataTable") form = "table";
  else if (fType === "normal") form = "plain";
  else throw new XmlError(`cell ${where()} has a formula of unknown type "${fType}"`);
  const ref = parseRef(raw.fRef);
  if ((form === "array" || form === "dynamic") && (!ref || ref.r1 !== row || ref.c1 !== col)) {
    throw new XmlError(`the array formula in ${where()} covers "${raw.fRef ?? ""}", which does not start at its cell`);
  }
  const span = { open: raw.open, f: raw.fStart, fOpen: raw.fOpen, fClose: raw.fClose, fEnd: raw.fEnd, simple: raw.simple };
  // One shape for every formula (no optional fields added later), so the engine's objects stay compact.
  const formula: Formula = { form, text: raw.fText, originRow: row, originCol: col, span, ref, node: undefined, syntaxError: undefined };
  const cell: Cell = { row, col, value, cached, formula, start, end, planId: -1 };
  if (form === "shared") {
    const si = raw.fSi ?? "";
    if (raw.fText.trim() !== "") {
      if (masters.has(si)) throw new XmlError(`shared formula ${si} has two masters`);
      masters.set(si, { text: raw.fText, row, col });
    } else {
      pendingShared.push({ cell, si });
      return cell;
    }
  }
  if (form !== "table") {
    try {
      formula.node = parseShared(raw.fText, row, col, names, cache);
    } catch (e) {
      if (!(e instanceof FormulaSyntaxError)) throw e;
      formula.syntaxError = e.message;
    }
  }
  return cell;
}

export { WorkbookFileError };
