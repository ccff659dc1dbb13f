/**
 * Headless recalculation of a whole workbook.
 *
 * THE RULE: recalculate only the SOIL cells and the cells that depend on them; every other cell
 * keeps the value Excel (or whoever wrote the file) cached, byte for byte. Native cells upstream
 * of SOIL cells are read from their cached values; native cells downstream of SOIL cells are
 * recomputed with Excel 365's semantics (dynamic arrays, element-wise arithmetic over ranges,
 * text in a cell stays text, legacy formulas intersected as Excel does); a native cell with no
 * cached value is computed. A cell the engine cannot compute whose inputs it has recomputed, or
 * whose inputs it cannot trace in a workbook with SOIL cells, is an error with a message
 * (exit 1), never its stale value. A file that cannot be read faithfully is
 * refused (WorkbookFileError, exit 2), never half-computed.
 *
 * It never writes over its input: the output is written to a temporary file created exclusively
 * with a random name beside it, then renamed into place.
 */
import crypto from "crypto";
import fs from "fs";
import path from "path";
import { Book, Form, Sheet, formulaText, readBook } from "./book";
import { a1, rangeA1 } from "./cellref";
import { Ctx, Host, ResourceLimit, Uncomputable, ev, firstScalar, intersect, toArray } from "./formula/evaluate";
import "./formula/functions";
import { Rect, Scalar, Value, XlArray, XlError, XlRef, err, isError } from "./formula/values";
import { toStoredFormula, toTypedFormula } from "./formula-text";
import { ModeCode, Plan, planRecalc, readsSpillOf } from "./plan";
import { Circular, RecalcHost } from "./host";
import { CellWrite, DynamicFormula, cellXml, rewriteSheet } from "./sheet-patch";
import { SOIL_NAMES, SOIL_SIGNATURES, soilCall } from "./soil";
import { Tok, XmlScanner, encodeXmlText as encodeXml } from "./xml";
import { soilcellVersion } from "../core/about";
import { WorkbookFileError, XlsxPackage, asFileError, dynamicArrayIndex, openPackage, readRelationships, relsPathOf, resolveTarget } from "./xlsx-package";

export interface CellProblem {
  readonly sheet: string;
  readonly cell: string;
  /** The formula as a user would type it (cut to a readable length). */
  readonly formula: string;
  readonly error: string;
  readonly message: string;
}

export interface RecalcSummary {
  readonly input: string;
  readonly output: string;
  /** The values copy written beside the output, when one was asked for. */
  readonly valuesCopy?: string;
  readonly sheets: number;
  /** Formula cells in the workbook. */
  readonly formulaCells: number;
  /** Formula cells computed (SOIL cells, the cells depending on them, and formulas without a cached value). */
  readonly computedCells: number;
  /** Formula cells whose cached value was kept as the file had it. */
  readonly keptCells: number;
  readonly soilFormulaCells: number;
  /** Cells filled by spilled SOIL results, beyond their formula cells. */
  readonly spilledCells: number;
  /** Computed cells and spilled elements whose value is an error. */
  readonly errors: readonly CellProblem[];
  /** Formulas without a cached value that the engine cannot compute and nothing recomputed feeds: left without a value. */
  readonly kept: readonly CellProblem[];
  readonly seconds: number;
}

export interface RecalcOptions {
  /** Progress lines for long runs (the CLI passes stderr). */
  readonly progress?: (line: string) => void;
  /** Largest array (in cells) one formula may build; a bound on what a hostile file can ask for. */
  readonly maxCells?: number;
  /**
   * Write a copy anyone can open: every SOIL formula cell becomes its plain value (other formulas
   * stay), and the workbook's custom properties say which soilcell version computed it and when.
   */
  readonly values?: boolean;
  /**
   * Also write such a values copy to this path, from the same computation, beside the Excel form
   * written to `output` (the same safety rules hold for it).
   */
  readonly valuesCopy?: string;
}

export class RecalcRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = "RecalcRefused";
  }
}

/** The default output name: beside the input, with a suffix. */
export function defaultOutputPath(input: string): string {
  return withSuffix(input, "recalc");
}

/** The name of the values copy of an output: beside it, ".values" added before the extension. */
export function valuesCopyPath(output: string): string {
  return withSuffix(output, "values");
}

function withSuffix(file: string, suffix: string): string {
  const ext = path.extname(file);
  return path.join(path.dirname(file), `${path.basename(file, ext)}.${suffix}${ext || ".xlsx"}`);
}

const MAX_MESSAGE = 300;
const MAX_FORMULA = 200;

function cut(s: string, n: number): string {
  return s.length > n ? `${s.slice(0, n)}… (${s.length} characters)` : s;
}

/** Refuses inputs and outputs that are not plain files, and an output that is the input. */
function checkPaths(input: string, output: string): void {
  let inStat: fs.Stats;
  try {
    inStat = fs.statSync(input);
  } catch (e) {
    throw new WorkbookFileError(`cannot read ${input}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  if (!inStat.isFile()) throw new WorkbookFileError(`${input} is not a regular file (a folder, device or pipe); give a workbook file`);
  let outStat: fs.Stats | undefined;
  try {
    outStat = fs.lstatSync(output);
  } catch {
    outStat = undefined;
  }
  if (outStat) {
    if (outStat.isSymbolicLink()) throw new RecalcRefused(`refusing to write to ${output}: it is a symbolic link; choose another output with -o`);
    if (!outStat.isFile()) throw new RecalcRefused(`refusing to write to ${output}: it exists and is not a regular file; choose another output with -o`);
    if (outStat.dev === inStat.dev && outStat.ino === inStat.ino) throw new RecalcRefused(`refusing to write over the input ${input}; choose another output with -o`);
  }
  if (path.resolve(input) === path.resolve(output)) throw new RecalcRefused(`refusing to write over the input ${input}; choose another output with -o`);
}

const EXCEL_ERRORS = new Set(["#NULL!", "#DIV/0!", "#VALUE!", "#REF!", "#NAME?", "#NUM!", "#N/A", "#SPILL!", "#CALC!", "#GETTING_DATA"]);

/**
 * Recalculates `input` into `output` (default: beside the input with ".recalc" added).
 * @throws RecalcRefused when output is the input or not a plain file; WorkbookFileError for a file
 *   that is not a readable workbook. Cell errors are reported in the summary, never thrown.
 */
export async function recalcWorkbook(input: string, output = defaultOutputPath(input), options: RecalcOptions = {}): Promise<RecalcSummary> {
  const started = process.hrtime.bigint();
  const say = options.progress ?? (() => undefined);
  checkPaths(input, output);
  if (options.valuesCopy !== undefined && !options.values) {
    checkPaths(input, options.valuesCopy);
    if (path.resolve(options.valuesCopy) === path.resolve(output)) throw new RecalcRefused(`refusing to write the values copy over the recalculated workbook ${output}; choose another name`);
  }
  let bytes: Buffer;
  try {
    bytes = fs.readFileSync(input);
  } catch (e) {
    throw new WorkbookFileError(`cannot read ${input}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  const wantCopy = options.valuesCopy !== undefined && !options.values;
  const done = await recalcBytes(bytes, path.basename(input), { ...options, ...(wantCopy ? {} : { valuesCopy: undefined }) }, path.basename(output));
  writeAtomically(output, done.bytes);
  if (wantCopy && done.valuesBytes) {
    say(`writing ${path.basename(options.valuesCopy as string)}`);
    writeAtomically(options.valuesCopy as string, done.valuesBytes);
  }
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  return { input, output, ...(wantCopy ? { valuesCopy: options.valuesCopy as string } : {}), ...done.summary, seconds };
}

/** What recalculating a workbook in memory found (the summary without file names and time). */
export type RecalcCounts = Omit<RecalcSummary, "input" | "output" | "seconds" | "valuesCopy">;

/**
 * Recalculates a workbook held in memory (the rule above) and returns the new file's bytes, and
 * those of a values copy from the same computation when `options.valuesCopy` is set.
 * @throws WorkbookFileError for bytes that are not a readable workbook
 */
export async function recalcBytes(bytes: Buffer, name: string, options: RecalcOptions = {}, outName = name): Promise<{ bytes: Buffer; valuesBytes?: Buffer; summary: RecalcCounts }> {
  const say = options.progress ?? (() => undefined);
  const pkg = await openPackage(bytes);
  say(`reading ${name} (${pkg.sheets.length} sheets)`);
  const book = readBook(pkg, SOIL_NAMES);
  const plan = asFileError("the workbook's formulas cannot be planned", () => planRecalc(book, SOIL_SIGNATURES));
  say(`computing ${plan.order.length} of ${plan.formulaCells} formula cells`);
  const host = new RecalcHost(book, plan, options.maxCells ?? 4_000_000);
  try {
    host.computeAll();
  } catch (e) {
    if (e instanceof ResourceLimit) throw new WorkbookFileError(`${e.message} (in ${host.current ?? "a formula"})`);
    throw e;
  }

  say(`writing ${outName}`);
  const { errors, kept, soilCells, spilled, computed } = writeResults(book, plan, host, pkg, options.values === true);
  if (options.values) markValuesCopy(pkg);
  const out = pkg.toBuffer();
  let valuesBytes: Buffer | undefined;
  if (options.valuesCopy !== undefined && !options.values) {
    // The same results again, SOIL cells as values: the sheets are rewritten from the workbook as
    // read (the package's edits so far are replaced), so nothing is computed twice.
    writeResults(book, plan, host, pkg, true);
    markValuesCopy(pkg);
    valuesBytes = pkg.toBuffer();
  }
  return {
    bytes: out,
    ...(valuesBytes ? { valuesBytes } : {}),
    summary: {
      sheets: pkg.sheets.length,
      formulaCells: plan.formulaCells,
      computedCells: computed,
      keptCells: plan.formulaCells - computed,
      soilFormulaCells: soilCells,
      spilledCells: spilled,
      errors,
      kept,
    },
  };
}

/**
 * Writes every computed cell into its sheet, one sheet at a time: each planned cell's markup is
 * made as the sheet is walked (nothing per cell is kept for the whole workbook), spilled elements
 * and cleared cells beside it; everything else is copied as it was.
 */
function writeResults(book: Book, plan: Plan, host: RecalcHost, pkg: XlsxPackage, values: boolean) {
  const asValue = values ? valuesCopyCells(book, plan) : undefined;
  const problems: { sheet: number; row: number; col: number; p: CellProblem }[] = [];
  const kept: CellProblem[] = [];
  let soilCells = 0;
  let spilled = 0;
  let computed = 0;
  let cm: number | undefined | null = null;
  let formsChanged = false;
  const oldRange = (i: number) => {
    const sh = book.sheets[plan.sheet[i] as number]!;
    const f = plan.formula[i] as number;
    const form = sh.formulas.form[f];
    return form === Form.Dynamic || form === Form.Array ? sh.formulas.ref.get(f) : undefined;
  };

  // Spilled elements, fixed-range elements and cleared cells: few; collected per sheet.
  const extras = new Map<number, CellWrite[]>();
  for (let i = 0; i < plan.n; i++) {
    if (host.keep(i) || host.noValue(i)) continue;
    const res = host.areaResult(i);
    const old = oldRange(i);
    if (!res && !(old && (old.r2 > old.r1 || old.c2 > old.c1))) continue;
    const sheet = book.sheets[plan.sheet[i] as number]!;
    const list = extras.get(plan.sheet[i] as number) ?? [];
    extras.set(plan.sheet[i] as number, list);
    const area = host.filled(i);
    const width = area.c2 - area.c1 + 1;
    if (res) {
      for (let j = 1; j < res.grid.length; j++) {
        const row = area.r1 + Math.floor(j / width);
        const col = area.c1 + (j % width);
        const v = res.grid[j] as Scalar;
        if (isError(v)) problems.push({ sheet: plan.sheet[i] as number, row, col, p: problemOf(sheet.name, row, col, formulaText(sheet, plan.formula[i] as number), v) });
        // In a values copy, the elements of a formula that became a value are plain constants too.
        list.push({ kind: asValue?.[i] ? "constant" : "value", row, col, value: writable(v) ?? null });
        if (plan.soil[i]) spilled++;
      }
    }
    // Cells the formula covered in the file but no longer fills are cleared.
    if (old) {
      const cells = sheet.cells;
      for (let row = old.r1; row <= Math.min(old.r2, cells.maxRow); row++) {
        const [a, b] = cells.rowRange(row);
        for (let k = a; k < b; k++) {
          const col = cells.col[k] as number;
          if (col < old.c1 || col > old.c2 || (row >= area.r1 && row <= area.r2 && col >= area.c1 && col <= area.c2)) continue;
          const owner = plan.owner(plan.sheet[i] as number, row, col);
          if (owner >= 0 && owner !== i) continue;
          list.push({ kind: "clear", row, col });
        }
      }
    }
  }

  /** The new markup of a planned cell, or undefined to keep it as it is. */
  const anchor = (sheet: Sheet, k: number, prefix: string): string | undefined => {
    const i = sheet.cells.planId[k] as number;
    const f = plan.formula[i] as number;
    const row = sheet.cells.row[k] as number;
    const col = sheet.cells.col[k] as number;
    if (host.keep(i)) return undefined;
    const top = host.scalar(i);
    if (host.noValue(i) && !(top instanceof Circular)) {
      kept.push({ sheet: sheet.name, cell: a1({ row, col }), formula: typedOf(formulaText(sheet, f)), error: (top as XlError).code, message: cut((top as XlError).message, MAX_MESSAGE) });
      return undefined;
    }
    computed++;
    if (plan.soil[i]) soilCells++;
    const value = host.noValue(i) ? undefined : writable(top);
    if (isError(top)) problems.push({ sheet: sheet.index, row, col, p: problemOf(sheet.name, row, col, formulaText(sheet, f), top) });
    if (asValue?.[i]) {
      // A values copy: the SOIL formula gives way to its value, so any program shows the number.
      formsChanged = true;
      // A constant (text as an inline string, "" as empty text), not a formula's string without its formula.
      return cellXml({ kind: "constant", row, col, value: value ?? null }, sheet.xml.slice(sheet.cells.start[k] as number, sheet.cells.end[k] as number), prefix);
    }
    let dynamic: DynamicFormula | undefined;
    const form = sheet.formulas.form[f];
    if (plan.mode[i] === ModeCode.Spill && (form === Form.Plain || form === Form.Dynamic || form === Form.Array)) {
      if (cm === null) cm = dynamicArrayIndex(pkg);
      const area = host.filled(i);
      // Only our own names are rewritten, and only when the file has them another way (typed, or
      // lower-cased); the test reads the markup itself, which entities do not change for it.
      const master = sheet.formulas.master[f] as number;
      const m = master >= 0 ? master : f;
      const raw = sheet.xml.slice(sheet.formulas.fOpen[m] as number, sheet.formulas.fClose[m] as number);
      const ref = sheet.formulas.ref.get(f);
      dynamic = {
        text: plan.soil[i] && needsStoredForm(raw) ? toStoredFormula(formulaText(sheet, f)) : undefined,
        ref: rangeA1({ row: area.r1, col: area.c1 }, area.r2 - area.r1 + 1, area.c2 - area.c1 + 1),
        ...(cm !== undefined ? { cm } : {}),
      };
      if (form !== Form.Dynamic || !ref || ref.r2 !== area.r2 || ref.c2 !== area.c2 || dynamic.text !== undefined) formsChanged = true;
    }
    const w: CellWrite = { kind: "formula", row, col, value, k, ...(dynamic ? { dynamic } : {}) };
    return cellXml(w, undefined, prefix, sheet);
  };

  for (const sheet of book.sheets) {
    if (!sheet.isWorksheet) continue;
    const list = extras.get(sheet.index) ?? [];
    let hasPlanned = false;
    for (let fi = 0; fi < sheet.formulas.n && !hasPlanned; fi++) if ((sheet.cells.planId[sheet.formulas.cell[fi] as number] as number) >= 0) hasPlanned = true;
    if (!hasPlanned && !list.length) continue;
    const bytes = asFileError(`sheet "${sheet.name}" cannot be updated`, () => rewriteSheet(sheet, (k, prefix) => anchor(sheet, k, prefix), dedupe(list)));
    pkg.write(sheet.path, bytes);
  }
  if (formsChanged) dropCalcChain(pkg);
  problems.sort((x, y) => x.sheet - y.sheet || x.row - y.row || x.col - y.col);
  return { errors: problems.map((x) => x.p), kept, soilCells, spilled, computed };
}

/**
 * The planned cells a values copy writes as values: every SOIL formula, and every formula that
 * reads one of those through the spill operator (A1# of a cell that is no longer a formula would
 * be #REF! once recalculated). The plan's order puts each anchor before its readers.
 */
function valuesCopyCells(book: Book, plan: Plan): Uint8Array {
  const out = new Uint8Array(plan.n);
  const isAnchor = (sheet: number, row: number, col: number) => {
    const j = plan.at(sheet, row, col);
    return j >= 0 && out[j] === 1;
  };
  for (let o = 0; o < plan.order.length; o++) {
    const i = plan.order[o] as number;
    if (plan.soil[i]) {
      out[i] = 1;
      continue;
    }
    const sheet = book.sheets[plan.sheet[i] as number]!;
    const node = sheet.formulas.node[plan.formula[i] as number];
    const k = plan.cell[i] as number;
    if (node && readsSpillOf(book, node, sheet.index, sheet.cells.row[k] as number, sheet.cells.col[k] as number, isAnchor)) out[i] = 1;
  }
  return out;
}

function typedOf(text: string): string {
  return cut(`=${toTypedFormula(text)}`, MAX_FORMULA);
}

function problemOf(sheet: string, row: number, col: number, text: string, v: XlError): CellProblem {
  return { sheet, cell: a1({ row, col }), formula: typedOf(text), error: v instanceof Circular ? "#CYCLE!" : v.code, message: cut(v.message, MAX_MESSAGE) };
}

const CUSTOM_PROPS = "docProps/custom.xml";
const CUSTOM_NS = "http://schemas.openxmlformats.org/officeDocument/2006/custom-properties";
const VT_NS = "http://schemas.openxmlformats.org/officeDocument/2006/docPropsVTypes";
const FMTID = "{D5CDD505-2E9C-101B-9397-08002B2CF9AE}";

/** A custom-properties part holding one "soilcell" property (what wrote a values copy). */
export function customPropertiesXml(note: string): string {
  return `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Properties xmlns="${CUSTOM_NS}" xmlns:vt="${VT_NS}">${soilcellProperty(note, 2)}</Properties>`;
}

function soilcellProperty(note: string, pid: number): string {
  return `<property fmtid="${FMTID}" pid="${pid}" name="soilcell"><vt:lpwstr>${encodeXml(note)}</vt:lpwstr></property>`;
}

/** The time stamp values copies carry: UTC, to the second. */
export function valuesStamp(): string {
  return `${soilcellVersion()} on ${new Date().toISOString().slice(0, 19)}Z`;
}

/** Records in the workbook's custom properties that its SOIL results are values, and what computed them. */
function markValuesCopy(pkg: XlsxPackage): void {
  const note = `SOIL results written as values by ${valuesStamp()}; the formulas are in the recalculated workbook.`;
  const prop = (pid: number) => soilcellProperty(note, pid);
  const existing = pkg.text(CUSTOM_PROPS);
  if (existing) {
    const s = new XmlScanner(existing);
    let pid = 1;
    let close = -1;
    for (let t = s.next(); t !== Tok.End; t = s.next()) {
      if (t === Tok.Open && s.local === "property") {
        pid = Math.max(pid, Number(s.attr("pid") ?? 1));
        if (s.attr("name") === "soilcell") {
          const start = s.start;
          const end = s.skipElement();
          pkg.write(CUSTOM_PROPS, existing.slice(0, start) + prop(Number(s.attr("pid") ?? pid)) + existing.slice(end));
          return;
        }
      }
      if (t === Tok.Close && s.local === "Properties") close = s.start;
    }
    if (close >= 0 && /xmlns:vt=/.test(existing)) {
      pkg.write(CUSTOM_PROPS, existing.slice(0, close) + prop(pid + 1) + existing.slice(close));
      return;
    }
    return; // a custom-properties part of a shape we do not recognise is left alone
  }
  pkg.write(CUSTOM_PROPS, customPropertiesXml(note));
  const rels = pkg.text("_rels/.rels");
  if (rels && !rels.includes("docProps/custom.xml")) {
    const ids = new Set(readRelationships(rels).map((r) => r.id));
    let n = ids.size + 1;
    while (ids.has(`rId${n}`)) n++;
    pkg.write("_rels/.rels", insertBefore(rels, "Relationships", `<Relationship Id="rId${n}" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/custom-properties" Target="docProps/custom.xml"/>`));
  }
  const types = pkg.text("[Content_Types].xml");
  if (types && !types.includes('PartName="/docProps/custom.xml"')) {
    pkg.write("[Content_Types].xml", insertBefore(types, "Types", '<Override PartName="/docProps/custom.xml" ContentType="application/vnd.openxmlformats-officedocument.custom-properties+xml"/>'));
  }
}

function insertBefore(xml: string, local: string, markup: string): string {
  const s = new XmlScanner(xml);
  let at = -1;
  for (let t = s.next(); t !== Tok.End; t = s.next()) if (t === Tok.Close && s.local === local) at = s.start;
  return at < 0 ? xml : xml.slice(0, at) + markup + xml.slice(at);
}

/** The value written in the file: Excel's own error codes only (a message lives in the summary). */
export function writable(v: Scalar): Scalar | undefined {
  if (isError(v)) return EXCEL_ERRORS.has(v.code) ? new XlError(v.code) : new XlError("#VALUE!");
  return v;
}

/**
 * Excel's calculation chain lists formula cells in the order it last computed them; once a
 * formula's form changes it is stale, and Excel rebuilds it when the part is absent.
 */
function dropCalcChain(pkg: XlsxPackage): void {
  const relsPath = relsPathOf(pkg.workbookPath);
  const rels = readRelationships(pkg.text(relsPath));
  const chain = rels.find((r) => r.type.endsWith("/calcChain"));
  if (!chain) return;
  const target = resolveTarget(pkg.workbookPath, chain.target);
  pkg.remove(target);
  pkg.write(relsPath, removeElement(pkg.text(relsPath) as string, "Relationship", (attrs) => attrs.get("Id") === chain.id));
  const types = pkg.text("[Content_Types].xml");
  if (types) pkg.write("[Content_Types].xml", removeElement(types, "Override", (attrs) => attrs.get("PartName") === `/${target}`));
}

function removeElement(xml: string, local: string, match: (attrs: Map<string, string>) => boolean): string {
  const s = new XmlScanner(xml);
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t === Tok.Open && s.local === local && match(s.attrs())) {
      const start = s.start;
      const end = s.skipElement();
      return xml.slice(0, start) + xml.slice(end);
    }
  }
  return xml;
}

/** True when a formula's text holds our names in a form other than Excel's stored form. */
function needsStoredForm(text: string): boolean {
  return /soil\./i.test(text) || /_xldudf_(?!SOIL_)[sS][oO][iI][lL]_/.test(text) || /_xldudf_SOIL_[A-Z0-9_]*[a-z]/.test(text) || text.includes("#");
}

/** When two writes name one cell, the formula wins. */
function dedupe(writes: CellWrite[]): CellWrite[] {
  const byCell = new Map<number, CellWrite>();
  for (const w of writes) {
    const k = w.row * 16384 + w.col;
    const prior = byCell.get(k);
    if (!prior || (prior.kind !== "formula" && w.kind === "formula") || (prior.kind === "clear" && w.kind === "value")) byCell.set(k, w);
  }
  return [...byCell.values()];
}

/**
 * Writes to a temporary file created exclusively (random name, in the target's folder, never
 * following a planted link), flushes it to disk (unless `durable` is false), then renames it into place.
 */
export function writeAtomically(target: string, bytes: Buffer, options: { readonly durable?: boolean } = {}): void {
  const dir = path.dirname(path.resolve(target));
  const tmp = path.join(dir, `.${path.basename(target)}.${crypto.randomBytes(8).toString("hex")}.partial`);
  let fd: number | undefined;
  try {
    fd = fs.openSync(tmp, fs.constants.O_WRONLY | fs.constants.O_CREAT | fs.constants.O_EXCL | (fs.constants.O_NOFOLLOW ?? 0), 0o644);
    fs.writeSync(fd, bytes);
    // Durable by default; a batch of many small reports skips the flush (a crash leaves no partial
    // file under the target's name either way, only perhaps no file).
    if (options.durable !== false) fs.fsyncSync(fd);
    fs.closeSync(fd);
    fd = undefined;
    fs.renameSync(tmp, target);
  } catch (e) {
    if (fd !== undefined) {
      try {
        fs.closeSync(fd);
      } catch {
        // already closed
      }
    }
    try {
      fs.unlinkSync(tmp);
    } catch {
      // nothing to clean up
    }
    throw new WorkbookFileError(`cannot write ${target}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
}
