/**
 * A report template: a workbook whose report sheet shows one thing (a sample, a paddock, a farm,
 * a client) chosen by a key cell. The convention uses Excel's own defined names, named like
 * Excel's Print_Area (and, like it, scoped to the report sheet or to the whole workbook):
 *
 *   Report_Key      the cell where a key is typed (required; its sheet is the report sheet)
 *   Report_Keys     the cells that list every key (a column or row; blanks skipped)
 *   Report_Found    a cell that is TRUE (or a number other than 0) when the key selects something
 *   Report_File     a cell whose text names the report's files (default: the key)
 *   Report_Group    a cell whose text groups reports (a folder and a combined PDF per group)
 *   Report_Figures  two columns, label and value: the headline figures the index lists
 *
 * The template is recalculated once (every SOIL cell and its dependents, as `recalc` does);
 * then, for each key, only the cells that read the key cell (directly or through others) are
 * computed again, with the key typed in. Every other cell keeps the value computed once.
 */
import fs from "fs";
import path from "path";
import { Book, Sheet, formulaText, readBook } from "./book";
import { a1 } from "./cellref";
import { ResourceLimit } from "./formula/evaluate";
import "./formula/functions";
import type { Node } from "./formula/parser";
import { parseFormula } from "./formula/parser";
import { Rect, Scalar, XlError, isError } from "./formula/values";
import { toTypedFormula } from "./formula-text";
import { RecalcHost } from "./host";
import { Plan, planRecalc } from "./plan";
import { CellProblem, RecalcCounts, recalcBytes, writable } from "./recalc";
import { CellWrite, patchSheetXml } from "./sheet-patch";
import { SOIL_NAMES, SOIL_SIGNATURES } from "./soil";
import { Tok, XmlScanner } from "./xml";
import { WorkbookFileError, XlsxPackage, openPackage, readRelationships, relsPathOf, resolveTarget } from "./xlsx-package";

/** The defined names of the convention. */
export const REPORT_NAMES = {
  key: "Report_Key",
  keys: "Report_Keys",
  found: "Report_Found",
  file: "Report_File",
  group: "Report_Group",
  figures: "Report_Figures",
} as const;

/** A template that does not follow the convention, or options that do not fit it (exit 2). */
export class ReportTemplateError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ReportTemplateError";
  }
}

export interface TemplateOptions {
  /** The report sheet (when the workbook has several, or none is named by Report_Key). */
  readonly sheet?: string;
  /** The key cell, A1 on the report sheet or with a sheet ("'Client report'!C4"); overrides Report_Key. */
  readonly keyCell?: string;
  /** Where the keys are, a range ("'Lab A'!A3:A152"); overrides Report_Keys. */
  readonly keysFrom?: readonly string[];
  /** The keys themselves; overrides both. */
  readonly keys?: readonly string[];
  /** Cells overriding Report_Group / Report_File / Report_Found (A1, on the report sheet or with a sheet). */
  readonly groupCell?: string;
  readonly fileCell?: string;
  readonly foundCell?: string;
  readonly maxCells?: number;
  readonly progress?: (line: string) => void;
}

/** A cell or range, by sheet number. */
export interface Place {
  readonly sheet: number;
  readonly rect: Rect;
}

/** One entry of the key list. */
export interface KeyEntry {
  readonly key: string | number;
  /** Where the key came from ("Lab A!A12", or "--keys"). */
  readonly from: string;
}

/** A key that gives no report, and why. */
export interface KeyProblem {
  readonly key: string;
  readonly from: string;
  readonly reason: string;
  /** Where it stood in the list: before the key of this index in `keys` (keys.length: after all). */
  readonly before: number;
  /** The key matches nothing (rather than the list entry not being a key). */
  readonly notFound?: boolean;
}

export interface Figure {
  readonly label: string;
  readonly value: Scalar;
  /** The value cell's number format code ("0.0", "d mmm yyyy"; "General" when none). */
  readonly format: string;
}

/** One key's report: the report sheet with every formula as its value, and what the index lists. */
export interface KeyReport {
  readonly key: string | number;
  /** Undefined when the template names no Report_Found cell. */
  readonly found: boolean | undefined;
  /** The base of the report's file names (not yet made safe for a file system). */
  readonly name: string;
  readonly group: string | undefined;
  readonly figures: readonly Figure[];
  /** Cells of the report sheet whose value is an error. */
  readonly errors: readonly CellProblem[];
  /** The report sheet's XML with values only. */
  readonly sheetXml: string;
}

export interface ReportTemplate {
  readonly file: string;
  readonly pkg: XlsxPackage;
  readonly book: Book;
  readonly sheet: Sheet;
  readonly keyCell: string;
  readonly keys: readonly KeyEntry[];
  /** Keys listed that give no report (blank lists, errors in the list, duplicates). */
  readonly keyProblems: readonly KeyProblem[];
  /** The template's recalculation (SOIL cells computed once). */
  readonly base: RecalcCounts;
  /** Formula cells computed again for each key. */
  readonly perKeyCells: number;
  readonly names: { readonly [k in keyof typeof REPORT_NAMES]?: string };
  /** Computes the report for one key. */
  report(key: string | number): KeyReport;
}

function readFile(file: string): Buffer {
  try {
    const st = fs.statSync(file);
    if (!st.isFile()) throw new WorkbookFileError(`${file} is not a regular file; give a workbook file`);
    return fs.readFileSync(file);
  } catch (e) {
    if (e instanceof WorkbookFileError) throw e;
    throw new WorkbookFileError(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
}

/** A reference (name or typed A1) as a place; `from` is the sheet a reference without a sheet is on. */
function placeOf(book: Book, node: Node | undefined, from: number | undefined, what: string): Place {
  if (!node || node.k !== "ref") throw new ReportTemplateError(`${what} must refer to cells (e.g. 'Client report'!$C$4), not a formula or a list of areas`);
  const sheet = node.sheet === undefined ? from : book.sheetIndex(node.sheet);
  if (sheet === undefined) throw new ReportTemplateError(node.sheet === undefined ? `${what} needs a sheet name (e.g. 'Client report'!C4)` : `${what} refers to a sheet "${node.sheet}" that the workbook does not have`);
  if (!book.sheets[sheet]?.isWorksheet) throw new ReportTemplateError(`${what} is on "${book.sheets[sheet]?.name}", which is not a worksheet`);
  return { sheet, rect: { r1: Math.min(node.r1, node.r2), c1: Math.min(node.c1, node.c2), r2: Math.max(node.r1, node.r2), c2: Math.max(node.c1, node.c2) } };
}

function parseRef(text: string, what: string): Node {
  try {
    return parseFormula(text.startsWith("=") ? text.slice(1) : text, 0, 0, SOIL_NAMES);
  } catch (e) {
    throw new ReportTemplateError(`${what} "${text}" is not a cell reference (${(e as Error).message})`);
  }
}

function placeName(p: Place, book: Book): string {
  const r = p.rect;
  const one = r.r1 === r.r2 && r.c1 === r.c2;
  return `${book.sheets[p.sheet]!.name}!${a1({ row: r.r1, col: r.c1 })}${one ? "" : `:${a1({ row: r.r2, col: r.c2 })}`}`;
}

/** Finds the report sheet and its key cell. */
function findKey(book: Book, options: TemplateOptions): { sheet: number; key: Place } {
  let sheet: number | undefined;
  if (options.sheet !== undefined) {
    sheet = book.sheetIndex(options.sheet);
    if (sheet === undefined) throw new ReportTemplateError(`the workbook has no sheet "${options.sheet}"; its sheets are ${book.sheets.map((s) => `"${s.name}"`).join(", ")}`);
  }
  if (options.keyCell !== undefined) {
    const key = placeOf(book, parseRef(options.keyCell, "the key cell"), sheet, "the key cell");
    if (sheet !== undefined && key.sheet !== sheet) throw new ReportTemplateError(`the key cell ${options.keyCell} is not on the report sheet "${options.sheet}"`);
    return { sheet: key.sheet, key };
  }
  const all = book.names.filter((d) => d.name.toUpperCase() === REPORT_NAMES.key.toUpperCase());
  if (sheet !== undefined) {
    const d = book.definedName(REPORT_NAMES.key, sheet);
    if (!d) throw new ReportTemplateError(`sheet "${options.sheet}" has no ${REPORT_NAMES.key} name; define one on its key cell (Formulas > Define Name) or give --key-cell`);
    const key = placeOf(book, d.node, d.scope, REPORT_NAMES.key);
    if (key.sheet !== sheet) throw new ReportTemplateError(`${REPORT_NAMES.key} refers to "${book.sheets[key.sheet]!.name}", not to the report sheet "${options.sheet}"`);
    return { sheet, key };
  }
  if (all.length === 0) {
    throw new ReportTemplateError(`the workbook has no ${REPORT_NAMES.key} name: name the cell where a key is typed ${REPORT_NAMES.key} (Formulas > Define Name), or give --key-cell`);
  }
  const places = all.map((d) => placeOf(book, d.node, d.scope, REPORT_NAMES.key));
  const sheets = [...new Set(places.map((p) => p.sheet))];
  if (sheets.length > 1) {
    throw new ReportTemplateError(`the workbook has ${REPORT_NAMES.key} on several sheets (${sheets.map((s) => `"${book.sheets[s]!.name}"`).join(", ")}); choose one with --sheet`);
  }
  return { sheet: sheets[0] as number, key: places[0] as Place };
}

/** A named place visible from the report sheet, an override, or undefined. */
function optionalPlace(book: Book, sheet: number, name: string, override: string | undefined, what: string): Place | undefined {
  if (override !== undefined) return placeOf(book, parseRef(override, what), sheet, what);
  const d = book.definedName(name, sheet);
  if (!d) return undefined;
  return placeOf(book, d.node, d.scope ?? sheet, name);
}

function cellValue(book: Book, sheet: number, row: number, col: number): Scalar {
  const cells = book.sheets[sheet]!.cells;
  const k = cells.find(row, col);
  return k < 0 ? null : cells.value(k);
}

function keyText(v: string | number): string {
  return typeof v === "number" ? String(v) : v;
}

/** The keys to report on, and the entries that give none. */
function keyList(book: Book, sheet: number, options: TemplateOptions, hasFound: boolean): { keys: KeyEntry[]; problems: KeyProblem[]; listed: Place[] } {
  const problems: KeyProblem[] = [];
  const entries: KeyEntry[] = [];
  const listed: Place[] = [];
  if (options.keysFrom?.length) for (const r of options.keysFrom) listed.push(placeOf(book, parseRef(r, "--keys-from"), sheet, "--keys-from"));
  else {
    const d = book.definedName(REPORT_NAMES.keys, sheet);
    if (d) listed.push(placeOf(book, d.node, d.scope ?? sheet, REPORT_NAMES.keys));
  }
  // The list in order: keys, and entries that cannot be keys (listed where they stand).
  const fromList: (KeyEntry | Omit<KeyProblem, "before">)[] = [];
  for (const p of listed) {
    for (let r = p.rect.r1; r <= p.rect.r2; r++) {
      for (let c = p.rect.c1; c <= p.rect.c2; c++) {
        const v = cellValue(book, p.sheet, r, c);
        const from = `${book.sheets[p.sheet]!.name}!${a1({ row: r, col: c })}`;
        if (v === null || v === "") continue;
        if (isError(v)) fromList.push({ key: v.code, from, reason: `the key list holds the error ${v.code}` });
        else if (typeof v === "boolean") fromList.push({ key: v ? "TRUE" : "FALSE", from, reason: "the key list holds a logical value, not a key" });
        else fromList.push({ key: v, from });
      }
    }
  }
  if (options.keys) {
    // A typed key is text unless the list holds that number (Excel would have typed it as one).
    const numbers = new Set(fromList.filter((e) => typeof e.key === "number").map((e) => e.key as number));
    for (const k of options.keys) {
      const n = Number(k);
      entries.push({ key: k.trim() !== "" && numbers.has(n) ? n : k, from: "--keys" });
    }
  } else entries.push(...(fromList as KeyEntry[]));
  if (!options.keys && !listed.length) {
    throw new ReportTemplateError(`no keys: name the cells that list them ${REPORT_NAMES.keys}, or give --keys-from or --keys`);
  }
  // Excel matches text keys without regard to case: two that differ only in case are one key.
  const idOf = (k: string | number) => `${typeof k}|${keyText(k).toUpperCase()}`;
  // Typed keys with a list but no found cell: the list is what says a key selects something.
  const inList = options.keys && listed.length && !hasFound ? new Set(fromList.filter((e) => !("reason" in e)).map((e) => idOf(e.key))) : undefined;
  const seen = new Map<string, KeyEntry>();
  const keys: KeyEntry[] = [];
  for (const e of entries) {
    if ("reason" in e) {
      problems.push({ ...(e as Omit<KeyProblem, "before">), before: keys.length });
      continue;
    }
    const id = idOf(e.key);
    if (inList && !inList.has(id)) {
      const where = listed.map((p) => placeName(p, book)).join(", ");
      problems.push({ key: keyText(e.key), from: e.from, reason: `not in the key list (${where}), and the template names no ${REPORT_NAMES.found} cell to look it up`, before: keys.length, notFound: true });
      continue;
    }
    const first = seen.get(id);
    if (first) {
      problems.push({ key: keyText(e.key), from: e.from, reason: `the same key as ${first.from}: reported once`, before: keys.length });
      continue;
    }
    seen.set(id, e);
    keys.push(e);
  }
  return { keys, problems, listed };
}

/** Number format codes of the workbook's cell styles (by style index). */
function numberFormats(pkg: XlsxPackage): string[] {
  const rels = readRelationships(pkg.text(relsPathOf(pkg.workbookPath)));
  const st = rels.find((r) => r.type.endsWith("/styles"));
  const xml = st ? pkg.text(resolveTarget(pkg.workbookPath, st.target)) : undefined;
  if (!xml) return [];
  const custom = new Map<number, string>();
  const out: string[] = [];
  const s = new XmlScanner(xml);
  let inXfs = false;
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t === Tok.Open) {
      if (s.local === "numFmt") custom.set(Number(s.attr("numFmtId")), s.attr("formatCode") ?? "General");
      else if (s.local === "cellXfs") inXfs = !s.selfClosing;
      else if (inXfs && s.local === "xf") {
        const id = Number(s.attr("numFmtId") ?? 0);
        out.push(custom.get(id) ?? BUILTIN_FORMATS[id] ?? "General");
        if (!s.selfClosing) s.skipElement();
      }
    } else if (t === Tok.Close && s.local === "cellXfs") inXfs = false;
  }
  return out;
}

/** Excel's built-in number formats (ECMA-376 Part 1, 18.8.30 numFmt: the implied formats; from memory). */
const BUILTIN_FORMATS: Record<number, string> = {
  0: "General",
  1: "0",
  2: "0.00",
  3: "#,##0",
  4: "#,##0.00",
  9: "0%",
  10: "0.00%",
  11: "0.00E+00",
  14: "m/d/yyyy",
  15: "d-mmm-yy",
  16: "d-mmm",
  17: "mmm-yy",
  22: "m/d/yyyy h:mm",
  49: "@",
};

/** The style index a cell's markup names (s="…"), 0 when none. */
function styleOf(sheet: Sheet, k: number): number {
  const s = new XmlScanner(sheet.xml.slice(sheet.cells.start[k] as number, sheet.cells.end[k] as number));
  s.next();
  return Number(s.attr("s") ?? 0);
}

/** The raw inner markup of each shared string (rich-text runs kept), so a copy needs no shared-strings part. */
function rawSharedStrings(pkg: XlsxPackage): string[] {
  const rels = readRelationships(pkg.text(relsPathOf(pkg.workbookPath)));
  const sst = rels.find((r) => r.type.endsWith("/sharedStrings"));
  const xml = sst ? pkg.text(resolveTarget(pkg.workbookPath, sst.target)) : undefined;
  if (!xml) return [];
  const out: string[] = [];
  const s = new XmlScanner(xml);
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t === Tok.Open && s.local === "si") {
      if (s.selfClosing) {
        out.push("");
        continue;
      }
      const open = s.end;
      const end = s.skipElement();
      out.push(xml.slice(open, xml.lastIndexOf("<", end - 1)));
    }
  }
  return out;
}

/**
 * The parts of the report sheet outside its cells that would point at what a report does not
 * have (other sheets, input lists, table parts): data validations, conditional formats and
 * hyperlinks that name another sheet, and table parts (a values copy keeps their cells, not the
 * tables). Returns [start, end) spans of the template sheet's XML to leave out.
 */
function danglingSpans(sheet: Sheet): [number, number][] {
  const xml = sheet.xml;
  const s = new XmlScanner(xml);
  const spans: [number, number][] = [];
  let depth = 0;
  const otherSheet = (text: string) => text.includes("!");
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t === Tok.Open) {
      if (depth === 1) {
        const start = s.start;
        const local = s.local;
        if (local === "sheetData") {
          if (!s.selfClosing) s.skipElement();
          continue;
        }
        if (local === "dataValidations" || local === "tableParts") {
          spans.push([start, s.selfClosing ? s.end : s.skipElement()]);
          continue;
        }
        if (local === "conditionalFormatting" || local === "hyperlinks" || local === "extLst") {
          const end = s.selfClosing ? s.end : s.skipElement();
          const body = xml.slice(start, end);
          if (local === "extLst") {
            // Extensions (x14 conditional formats and validations) are kept unless they point elsewhere.
            if (/dataValidation/.test(body) || otherSheet(body.replace(/<[^>]*>/g, " "))) spans.push([start, end]);
          } else if (local === "hyperlinks") {
            if (/location="[^"]*!/.test(body)) spans.push([start, end]);
          } else if (otherSheet(body.replace(/<[^>]*>/g, " "))) spans.push([start, end]);
          continue;
        }
        if (!s.selfClosing) s.skipElement();
        continue;
      }
      if (!s.selfClosing) depth++;
    } else if (t === Tok.Close) depth--;
  }
  return spans;
}

function cut(s: string, n: number): string {
  return s.length > n ? `${s.slice(0, n)}… (${s.length} characters)` : s;
}

/** Opens a template: recalculates it once, finds the convention's cells, plans the per-key work. */
export async function openReportTemplate(file: string, options: TemplateOptions = {}): Promise<ReportTemplate> {
  const say = options.progress ?? (() => undefined);
  const bytes = readFile(file);
  const done = await recalcBytes(bytes, path.basename(file), { maxCells: options.maxCells });
  const pkg = await openPackage(done.bytes);
  const book = readBook(pkg, SOIL_NAMES);
  const { sheet: sheetIdx, key } = findKey(book, options);
  const sheet = book.sheets[sheetIdx]!;
  if (key.rect.r1 !== key.rect.r2 || key.rect.c1 !== key.rect.c2) throw new ReportTemplateError(`the key cell must be one cell; ${placeName(key, book)} is a range`);
  const keyK = sheet.cells.find(key.rect.r1, key.rect.c1);
  const keyCell = placeName(key, book);
  if (keyK < 0) throw new ReportTemplateError(`the key cell ${keyCell} is empty: type one key in it (the example the template shows)`);
  if ((sheet.cells.formula[keyK] as number) >= 0) throw new ReportTemplateError(`the key cell ${keyCell} holds a formula; a key is typed, so it must hold a value`);
  const found = optionalPlace(book, sheetIdx, REPORT_NAMES.found, options.foundCell, "the found cell");
  const { keys, problems, listed } = keyList(book, sheetIdx, options, found !== undefined);
  const fileCell = optionalPlace(book, sheetIdx, REPORT_NAMES.file, options.fileCell, "the file-name cell");
  const group = optionalPlace(book, sheetIdx, REPORT_NAMES.group, options.groupCell, "the group cell");
  const figures = optionalPlace(book, sheetIdx, REPORT_NAMES.figures, undefined, REPORT_NAMES.figures);
  if (figures && figures.rect.c2 - figures.rect.c1 !== 1) throw new ReportTemplateError(`${REPORT_NAMES.figures} must be two columns wide (label, value); ${placeName(figures, book)} is not`);
  const names: { -readonly [k in keyof typeof REPORT_NAMES]?: string } = { key: keyCell };
  if (listed.length) names.keys = listed.map((p) => placeName(p, book)).join(", ");
  if (found) names.found = placeName(found, book);
  if (fileCell) names.file = placeName(fileCell, book);
  if (group) names.group = placeName(group, book);
  if (figures) names.figures = placeName(figures, book);

  const changed = [key];
  const plan: Plan = planRecalc(book, SOIL_SIGNATURES, { changed, soil: false });
  say(`${plan.n} formula cells read the key cell ${keyCell}; ${keys.length} keys`);
  const formats = numberFormats(pkg);
  const strings = rawSharedStrings(pkg);
  const baseErrors = new Map(done.summary.errors.map((e) => [`${e.sheet}!${e.cell}`, e]));
  const skip = danglingSpans(sheet);
  const sd = sheet.sheetData;
  if (!sd) throw new ReportTemplateError(`the report sheet "${sheet.name}" has no cells`);
  const sdEnd = sd.selfClosing ? sd.openEnd : sheet.xml.indexOf(">", sd.closeStart) + 1;
  const cleanHead = cutSpans(sheet.xml, 0, sd.start, skip);
  const cleanTail = cutSpans(sheet.xml, sdEnd, sheet.xml.length, skip);

  // The shared string each constant cell of the report sheet shows (-1: none), found once.
  const sharedOf = new Int32Array(sheet.cells.n).fill(-1);
  for (let k = 0; k < sheet.cells.n; k++) {
    if ((sheet.cells.formula[k] as number) >= 0) continue;
    const i = sharedIndexOf(sheet, k);
    if (i !== undefined) sharedOf[k] = i;
  }

  const setKey = (v: string | number) => {
    if (typeof v === "number") sheet.cells.setNumber(keyK, v);
    else sheet.cells.setText(keyK, v);
  };

  const report = (keyValue: string | number): KeyReport => {
    setKey(keyValue);
    const host = new RecalcHost(book, plan, options.maxCells ?? 4_000_000, changed);
    try {
      host.computeAll();
    } catch (e) {
      if (e instanceof ResourceLimit) throw new WorkbookFileError(`${e.message} (in ${host.current ?? "a formula"})`);
      throw e;
    }
    const read = (p: Place, r = p.rect.r1, c = p.rect.c1): Scalar => host.value(p.sheet, r, c);
    const writes: CellWrite[] = [];
    const errors: CellProblem[] = [];
    const cells = sheet.cells;
    const fs_ = sheet.formulas;
    const problem = (row: number, col: number, f: number, v: XlError, computed: boolean) => {
      const at = a1({ row, col });
      const base = baseErrors.get(`${sheet.name}!${at}`);
      const message = computed ? v.message : (base?.message ?? v.message);
      errors.push({ sheet: sheet.name, cell: at, formula: f >= 0 ? cut(`=${toTypedFormula(formulaText(sheet, f))}`, 200) : "", error: v.code, message: cut(message || "cached in the template", 300) });
    };
    for (let k = 0; k < cells.n; k++) {
      const row = cells.row[k] as number;
      const col = cells.col[k] as number;
      const f = cells.formula[k] as number;
      if (k === keyK) {
        writes.push({ kind: "constant", row, col, value: keyValue });
        continue;
      }
      if (f < 0) {
        if (plannedArea(host, plan, sheetIdx, row, col) >= 0) continue; // a spill computed for this key writes it
        // A shared-string constant becomes an inline string (with its runs): no shared-strings part.
        const raw = sharedOf[k] as number;
        if (raw >= 0) writes.push({ kind: "constant", row, col, value: cells.value(k), inline: strings[raw] });
        const v = cells.value(k);
        if (isError(v)) problem(row, col, -1, v, false);
        continue;
      }
      const i = cells.planId[k] as number;
      let v: Scalar;
      let computed = false;
      if (i >= 0 && !host.keep(i) && !host.noValue(i)) {
        computed = true;
        const area = host.areaResult(i);
        v = host.scalar(i);
        if (area) {
          const w = area.area.c2 - area.area.c1 + 1;
          for (let j = 1; j < area.grid.length; j++) {
            const r = area.area.r1 + Math.floor(j / w);
            const c = area.area.c1 + (j % w);
            const x = area.grid[j] as Scalar;
            if (isError(x)) problem(r, c, f, x, true);
            writes.push({ kind: "constant", row: r, col: c, value: writable(x) ?? null });
          }
        }
        const old = fs_.ref.get(f);
        if (old) {
          const now = area?.area ?? { r1: row, c1: col, r2: row, c2: col };
          for (let r = old.r1; r <= old.r2; r++) for (let c = old.c1; c <= old.c2; c++) if (r < now.r1 || r > now.r2 || c < now.c1 || c > now.c2) if (!(r === row && c === col)) writes.push({ kind: "constant", row: r, col: c, value: null });
        }
      } else v = cells.value(k);
      if (isError(v)) problem(row, col, f, v, computed);
      writes.push({ kind: "constant", row, col, value: writable(v) ?? null });
    }
    const patched = patchSheetXml(sheet, dedupeWrites(writes)).toString("utf8");
    const tailLen = sheet.xml.length - sdEnd;
    const sheetXml = cleanHead + patched.slice(sd.start, patched.length - tailLen) + cleanTail;
    errors.sort((x, y) => compareA1(x.cell, y.cell));

    const found_ = found ? truthy(read(found)) : undefined;
    const name = fileCell ? textOf(read(fileCell)) || keyText(keyValue) : keyText(keyValue);
    const groupName = group ? textOf(read(group)) || undefined : undefined;
    const figs: Figure[] = [];
    if (figures) {
      for (let r = figures.rect.r1; r <= figures.rect.r2; r++) {
        const label = textOf(read(figures, r, figures.rect.c1));
        if (!label) continue;
        const value = read(figures, r, figures.rect.c2);
        const fsheet = book.sheets[figures.sheet]!;
        const fk = fsheet.cells.find(r, figures.rect.c2);
        figs.push({ label, value: isError(value) ? new XlError(value.code, value.message) : value, format: fk >= 0 ? (formats[styleOf(fsheet, fk)] ?? "General") : "General" });
      }
    }
    return { key: keyValue, found: found_, name, group: groupName, figures: figs, errors, sheetXml };
  };

  return {
    file,
    pkg,
    book,
    sheet,
    keyCell,
    keys,
    keyProblems: problems,
    base: done.summary,
    perKeyCells: plan.n,
    names,
    report,
  };
}

/** Whether a spill computed for this key covers a position (its anchor's plan number), or -1. */
function plannedArea(host: RecalcHost, plan: Plan, sheet: number, row: number, col: number): number {
  const o = plan.areaOwner(sheet, row, col);
  return o >= 0 && !host.keep(o) ? o : -1;
}

/** The shared-string index a constant cell's markup holds (t="s"), or undefined. */
function sharedIndexOf(sheet: Sheet, k: number): number | undefined {
  const xml = sheet.xml.slice(sheet.cells.start[k] as number, sheet.cells.end[k] as number);
  const s = new XmlScanner(xml);
  s.next();
  if (s.attr("t") !== "s" || s.selfClosing) return undefined;
  for (let t = s.next(); t !== Tok.End; t = s.next()) if (t === Tok.Open && s.local === "v") return Number(s.elementText().trim());
  return undefined;
}

function cutSpans(xml: string, from: number, to: number, spans: readonly [number, number][]): string {
  let out = "";
  let at = from;
  for (const [a, b] of spans) {
    if (b <= from || a >= to) continue;
    out += xml.slice(at, Math.max(at, a));
    at = Math.max(at, b);
  }
  return out + xml.slice(at, to);
}

/** When two writes name one cell, the later wins (a cell's own value over a cleared spill). */
function dedupeWrites(writes: CellWrite[]): CellWrite[] {
  const byCell = new Map<number, CellWrite>();
  for (const w of writes) {
    const k = w.row * 16384 + w.col;
    const prior = byCell.get(k);
    if (prior && w.kind === "constant" && w.value === null && prior.kind === "constant" && prior.value !== null) continue;
    byCell.set(k, w);
  }
  return [...byCell.values()];
}

function compareA1(a: string, b: string): number {
  const pa = /^([A-Z]+)(\d+)$/.exec(a);
  const pb = /^([A-Z]+)(\d+)$/.exec(b);
  if (!pa || !pb) return a < b ? -1 : 1;
  const ra = Number(pa[2]);
  const rb = Number(pb[2]);
  if (ra !== rb) return ra - rb;
  return pa[1]!.length - pb[1]!.length || (pa[1]! < pb[1]! ? -1 : pa[1]! > pb[1]! ? 1 : 0);
}

/** Report_Found: TRUE or a number other than 0; FALSE, 0, text, blank and errors are "not found". */
function truthy(v: Scalar): boolean {
  return v === true || (typeof v === "number" && v !== 0);
}

function textOf(v: Scalar): string {
  if (v === null || isError(v)) return "";
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  return String(v).trim();
}
