/**
 * A workbook as the engine holds it: for each worksheet, its cells as the file has them (cached
 * value, formula and storage form), with the byte offsets of every row and cell in the sheet
 * part so a writer can replace exactly the cells it recomputes. Read with the XML tokenizer;
 * anything the reader cannot take faithfully (cells out of order, unknown markup inside a cell,
 * a shared-string index that does not exist) is refused, never guessed.
 */
import { a1, parseA1 } from "./cellref";
import { CellStore, Form, FormulaStore, RowStore } from "./store";
import { FormulaSyntaxError, T, Token, tokenize } from "./formula/lexer";
import { NameMap, Node, parseFormula } from "./formula/parser";
import { SharedTrees } from "./shared-trees";
import { ErrorCode, Rect, Scalar, XlError, isErrorCode, MAX_COLS, MAX_ROWS } from "./formula/values";
import { MAIN_NS, Tok, XmlError, XmlScanner, decodeXmlText, prefixFor } from "./xml";
import { WorkbookFileError, XlsxPackage, asFileError, dynamicArrayCms, readRelationships, relsPathOf, resolveTarget } from "./xlsx-package";

export { Form, Kind } from "./store";

export interface Sheet {
  readonly name: string;
  readonly index: number;
  readonly path: string;
  readonly isWorksheet: boolean;
  readonly xml: string;
  readonly cells: CellStore;
  readonly formulas: FormulaStore;
  readonly rowSpans: RowStore;
  /** The sheetData element: where rows go when a sheet has none yet. */
  readonly sheetData?: { readonly start: number; readonly openEnd: number; readonly closeStart: number; readonly selfClosing: boolean; readonly prefix: string };
  readonly merges: Rect[];
}

export interface DefinedName {
  readonly name: string;
  /** Sheet position for a sheet-scoped name. */
  readonly scope?: number;
  readonly text: string;
  node?: Node;
  syntaxError?: string;
}

/** An Excel table (a list object): where its cells are, for tracing what structured references read. */
export interface TableArea {
  readonly sheet: number;
  readonly rect: Rect;
}

export interface Book {
  readonly sheets: Sheet[];
  readonly names: DefinedName[];
  /** Tables by name (upper case); a structured reference reads within its table's area. */
  readonly tables: ReadonlyMap<string, TableArea>;
  readonly date1904: boolean;
  /** Saved with manual calculation: cached values may be stale, so a recalculation computes every formula. */
  readonly manualCalc?: boolean;
  /** Sheet lookup by name, case-insensitive. */
  sheetIndex(name: string): number | undefined;
  /** A defined name visible from a sheet (its own scope first, then the workbook's). */
  definedName(name: string, fromSheet: number): DefinedName | undefined;
}

/** A formula's text, decoded (a shared member's is its master's). */
export function formulaText(sheet: Sheet, i: number): string {
  const fs = sheet.formulas;
  const m = fs.master[i] as number;
  const j = m >= 0 ? m : i;
  return decodeXmlText(sheet.xml.slice(fs.fOpen[j] as number, fs.fClose[j] as number));
}

/** Reads every worksheet of a package. */
export function readBook(pkg: XlsxPackage, names: NameMap): Book {
  const rels = readRelationships(pkg.text(relsPathOf(pkg.workbookPath)));
  const sstRel = rels.find((r) => r.type.endsWith("/sharedStrings"));
  const strings = sstRel ? asFileError("the shared strings cannot be read", () => readSharedStrings(pkg.text(resolveTarget(pkg.workbookPath, sstRel.target)))) : [];
  const metaRel = rels.find((r) => r.type.endsWith("/sheetMetadata"));
  const dynamicCms = metaRel ? asFileError("the cell metadata cannot be read", () => dynamicArrayCms(pkg.text(resolveTarget(pkg.workbookPath, metaRel.target)))) : new Set<number>();
  const trees = new SharedTrees(names);
  const sheets: Sheet[] = pkg.sheets.map((part) => {
    if (part.kind !== "worksheet") {
      const cells = new CellStore();
      cells.finish();
      return { name: part.name, index: part.index, path: part.path, isWorksheet: false, xml: "", cells, formulas: new FormulaStore(), rowSpans: new RowStore(), merges: [] };
    }
    const xml = pkg.text(part.path) as string;
    return asFileError(`sheet "${part.name}" cannot be read`, () => readSheet(part.name, part.index, part.path, xml, strings, dynamicCms, pkg.date1904, trees));
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
  const tables = readTables(pkg);
  const nameIndex = new Map<string, DefinedName>();
  for (const d of definedNames) nameIndex.set(`${d.scope ?? ""}|${d.name.toUpperCase()}`, d);
  return {
    sheets,
    names: definedNames,
    tables,
    date1904: pkg.date1904,
    manualCalc: pkg.manualCalc === true,
    sheetIndex: (name) => byName.get(name.toUpperCase()),
    definedName: (name, from) => nameIndex.get(`${from}|${name.toUpperCase()}`) ?? nameIndex.get(`|${name.toUpperCase()}`),
  };
}

/**
 * Every table's name and area, from each worksheet's table parts. A table part that cannot be
 * read is left out: a structured reference to it then counts as reading anything (the planner's
 * safe side).
 */
function readTables(pkg: XlsxPackage): Map<string, TableArea> {
  const out = new Map<string, TableArea>();
  for (const part of pkg.sheets) {
    if (part.kind !== "worksheet") continue;
    for (const rel of readRelationships(pkg.text(relsPathOf(part.path)))) {
      if (!rel.type.endsWith("/table")) continue;
      const xml = pkg.text(resolveTarget(part.path, rel.target));
      if (!xml) continue;
      try {
        const s = new XmlScanner(xml);
        let t = s.next();
        while (t !== Tok.End && t !== Tok.Open) t = s.next();
        if (t !== Tok.Open || localOf(s) !== "table") continue;
        const rect = parseRef(s.attr("ref"));
        if (!rect) continue;
        for (const n of [s.attr("name"), s.attr("displayName")]) if (n) out.set(n.toUpperCase(), { sheet: part.index, rect });
      } catch {
        // unreadable: left out (see above)
      }
    }
  }
  return out;
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

/** Day 0 of the workbook's date system, in milliseconds since 1970 UTC. */
function epochMs(date1904: boolean): number {
  return date1904 ? Date.UTC(1904, 0, 1) : Date.UTC(1899, 11, 30);
}

/**
 * The time `ms` (milliseconds since 1970 UTC) as a serial in local time, `offsetMinutes` west of
 * UTC (as getTimezoneOffset gives it), in the 1900 or 1904 date system: what NOW() reads.
 */
export function localSerial(ms: number, offsetMinutes: number, date1904 = false): number {
  return (ms - offsetMinutes * 60000 - epochMs(date1904)) / 86400000;
}

/** An ISO 8601 date-time (t="d" cells) as a serial number in the workbook's date system. */
export function isoToSerial(iso: string, date1904: boolean): number | undefined {
  const m = /^(\d{4})-(\d{2})-(\d{2})(?:T(\d{2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?)?Z?$/.exec(iso.trim());
  if (!m) return undefined;
  const ms = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4] ?? 0), Number(m[5] ?? 0)) + Number(m[6] ?? 0) * 1000;
  let serial = (ms - epochMs(date1904)) / 86400000;
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
  trees: SharedTrees,
): Sheet {
  const s = new XmlScanner(xml);
  // A cell's markup is rarely under 40 characters: the arrays start at a size they seldom outgrow.
  const cells = new CellStore(xml.length / 64);
  const formulas = new FormulaStore();
  const rowSpans = new RowStore();
  const merges: Rect[] = [];
  let sheetData: Sheet["sheetData"];
  // Shared formula masters by si, and members waiting for theirs.
  const masters = new Map<string, number>();
  const pendingShared: { formula: number; si: string }[] = [];

  let main: string | undefined;
  let t = s.next();
  while (t !== Tok.End && t !== Tok.Open) t = s.next();
  if (t !== Tok.Open || localOf(s) !== "worksheet") throw new XmlError("the part is not a worksheet");
  main = prefixFor(s.attrs(), MAIN_NS);
  if (main === undefined) throw new XmlError("the worksheet is not in the SpreadsheetML namespace");
  const isMain = () => s.prefix === main;
  const raw: RawCell = { open: 0, fStart: -1, fOpen: -1, fClose: -1, fEnd: -1, simple: true };

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
        rowSpans.add(row, rowStart, openEnd, openEnd, openEnd, true);
        continue;
      }
      let lastCol = -1;
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
          const p = cellRefIn(r);
          if (!p) throw new XmlError(`cell reference "${r}" is not a cell`);
          if (p.row !== row) throw new XmlError(`cell ${r} is inside row ${row + 1}`);
          col = p.col;
        }
        if (col >= MAX_COLS) throw new XmlError(`cell column beyond XFD in row ${row + 1}`);
        if (col <= lastCol) throw new XmlError(`cells of row ${row + 1} are out of order`);
        lastCol = col;
        raw.open = s.end;
        raw.fStart = raw.fOpen = raw.fClose = raw.fEnd = -1;
        raw.simple = true;
        raw.t = s.attr("t");
        raw.cm = s.attr("cm");
        raw.fText = raw.fType = raw.fRef = raw.fSi = raw.v = raw.inline = undefined;
        if (!s.selfClosing) readCellBody(s, raw, isMain, row, col);
        const k = cells.add(row, col, cellStart, s.end);
        storeCell(cells, formulas, k, raw, row, col, strings, dynamicCms, date1904, trees, masters, pendingShared);
      }
      rowSpans.add(row, rowStart, openEnd, s.start, s.end, false);
    }
  }
  cells.finish();
  // Shared members take their master's text; the master's tree serves them all.
  for (const p of pendingShared) {
    const m = masters.get(p.si);
    if (m === undefined) {
      formulas.syntaxError.set(p.formula, `shared formula ${p.si} has no master cell`);
      continue;
    }
    formulas.master[p.formula] = m;
    formulas.originRow[p.formula] = formulas.originRow[m] as number;
    formulas.originCol[p.formula] = formulas.originCol[m] as number;
    const node = formulas.node[m];
    if (node) formulas.node[p.formula] = node;
    else formulas.syntaxError.set(p.formula, formulas.syntaxError.get(m) ?? "its shared formula cannot be read");
  }
  return { name, index, path, isWorksheet: true, xml, cells, formulas, rowSpans, sheetData, merges };
}

/** "B12" → its position, or undefined (no regular expression per cell: this runs for every cell). */
function cellRefIn(r: string): { row: number; col: number } | undefined {
  let i = 0;
  let col = 0;
  while (i < r.length) {
    const c = r.charCodeAt(i) | 32;
    if (c < 97 || c > 122) break;
    col = col * 26 + (c - 96);
    i++;
  }
  if (i === 0 || i > 3 || i === r.length) return undefined;
  let row = 0;
  for (; i < r.length; i++) {
    const c = r.charCodeAt(i);
    if (c < 48 || c > 57) return undefined;
    row = row * 10 + (c - 48);
  }
  if (row < 1) return undefined;
  return { row: row - 1, col: col - 1 };
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

function storeCell(
  cells: CellStore,
  formulas: FormulaStore,
  k: number,
  raw: RawCell,
  row: number,
  col: number,
  strings: readonly string[],
  dynamicCms: Set<number>,
  date1904: boolean,
  trees: SharedTrees,
  masters: Map<string, number>,
  pendingShared: { formula: number; si: string }[],
): void {
  const where = () => a1({ row, col });
  const type = raw.t ?? "n";
  if (type === "inlineStr") {
    if (raw.inline !== undefined) cells.setText(k, raw.inline);
  } else if (raw.v !== undefined) {
    switch (type) {
      case "n": {
        const text = raw.v.trim();
        if (text === "") break; // no cached value
        const n = Number(text);
        if (!Number.isFinite(n)) throw new XmlError(`cell ${where()} holds "${raw.v}", which is not a number`);
        cells.setNumber(k, n);
        break;
      }
      case "s": {
        const i = Number(raw.v.trim());
        if (!Number.isInteger(i) || i < 0 || i >= strings.length) throw new XmlError(`cell ${where()} points at shared string ${raw.v}, which does not exist`);
        cells.setText(k, strings[i] as string);
        break;
      }
      case "str":
        cells.setText(k, raw.v);
        break;
      case "b":
        cells.setBool(k, raw.v.trim() === "1" || raw.v.trim().toLowerCase() === "true");
        break;
      case "e": {
        const code = raw.v.trim().toUpperCase();
        cells.setError(k, isErrorCode(code) ? (code as ErrorCode) : "#VALUE!");
        break;
      }
      case "d": {
        const serial = isoToSerial(raw.v, date1904);
        if (serial === undefined) throw new XmlError(`cell ${where()} holds the date "${raw.v}", which is not ISO 8601`);
        cells.setNumber(k, serial);
        break;
      }
      default:
        throw new XmlError(`cell ${where()} has an unknown type "${type}"`);
    }
  }
  if (raw.fText === undefined) return;

  const fType = raw.fType ?? "normal";
  let form: Form;
  if (fType === "shared") form = Form.Shared;
  else if (fType === "array") form = raw.cm !== undefined && dynamicCms.has(Number(raw.cm)) ? Form.Dynamic : Form.Array;
  else if (fType === "dataTable") form = Form.Table;
  else if (fType === "normal") form = Form.Plain;
  else throw new XmlError(`cell ${where()} has a formula of unknown type "${fType}"`);
  const ref = parseRef(raw.fRef);
  if ((form === Form.Array || form === Form.Dynamic) && (!ref || ref.r1 !== row || ref.c1 !== col)) {
    throw new XmlError(`the array formula in ${where()} covers "${raw.fRef ?? ""}", which does not start at its cell`);
  }
  const i = formulas.add(k, form, row, col);
  cells.formula[k] = i;
  formulas.open[i] = raw.open;
  formulas.f[i] = raw.fStart;
  formulas.fOpen[i] = raw.fOpen;
  formulas.fClose[i] = raw.fClose;
  formulas.fEnd[i] = raw.fEnd;
  formulas.simple[i] = raw.simple ? 1 : 0;
  if (ref) formulas.ref.set(i, ref);
  if (form === Form.Shared) {
    const si = raw.fSi ?? "";
    if (raw.fText.trim() !== "") {
      if (masters.has(si)) throw new XmlError(`shared formula ${si} has two masters`);
      masters.set(si, i);
    } else {
      pendingShared.push({ formula: i, si });
      return;
    }
  }
  if (form !== Form.Table) {
    try {
      formulas.node[i] = trees.tree(raw.fText, row, col);
    } catch (e) {
      if (!(e instanceof FormulaSyntaxError)) throw e;
      formulas.syntaxError.set(i, e.message);
    }
  }
}

export { WorkbookFileError };
