/**
 * The evaluation host of a recalculation: what a formula reads (cached values, or results the
 * engine has computed, spills included), the results themselves, and the order they are computed
 * in. Cells of one dependency level whose formula is one SOIL call over single cells and
 * constants (a column filled down) are computed a column at a time: one binding call for the
 * whole run of cells instead of one per cell, with the same arguments each cell would pass.
 *
 * Results of single cells are kept in column arrays (a number costs 8 bytes, not an object);
 * only spills and fixed ranges have a result object.
 */
import { Book, Form, localSerial } from "./book";
import { a1, rangeA1 } from "./cellref";
import { Ctx, Host, NotComputed, Uncomputable, arityProblem, ev, firstScalar, intersect, notComputed, toArray } from "./formula/evaluate";
import type { Node } from "./formula/parser";
import { Rect, Scalar, Value, XlArray, XlError, XlRef, err, isError } from "./formula/values";
import { ModeCode, Plan, Reason } from "./plan";
import { soilCall } from "./soil";
import { REGISTRY } from "./registry";
import { Kind } from "./store";

/** What a spilling or fixed-range cell came to. */
export interface AreaResult {
  /** The area it fills. */
  readonly area: Rect;
  /** Values over the area, row-major. */
  readonly grid: Scalar[];
}

export class Circular extends XlError {
  constructor() {
    super("#VALUE!", "circular reference: the cell depends on itself; no value written, Excel reports it when the file is opened");
  }
}

/** Flags of a result. */
const DONE = 1;
/** No value to write (a circular reference, or an uncomputable cell without a cached value). */
const NO_VALUE = 2;
/** Keep the file's cached value (a formula with run-time references that read nothing recomputed). */
const KEEP = 4;
const IN_PROGRESS = 8;

export class RecalcHost implements Host {
  readonly date1904: boolean;
  readonly maxCells: number;
  /** Per planned cell: DONE, NO_VALUE, KEEP, IN_PROGRESS flags. */
  private readonly state: Uint8Array;
  /** The value of a single-cell result (or the anchor of an area result). */
  private readonly kind: Uint8Array;
  private readonly num: Float64Array;
  private readonly obj: (string | XlError | undefined)[] = [];
  private readonly areas = new Map<number, AreaResult>();
  private readonly bound: { rows: number; cols: number }[];
  /** Multi-cell areas computed formulas may fill, per sheet (cells a file may not have yet). */
  private readonly fill: Rect[][];
  /** Set when an evaluation reads a recomputed cell (per evaluation frame). */
  private touched: boolean[] = [];
  private readonly soilCache = new Map<string, ReturnType<typeof soilCall>>();
  private readonly clock = Date.now();
  /** The planned cell being computed, for messages. */
  private currentId = -1;

  constructor(
    readonly book: Book,
    private readonly plan: Plan,
    maxCells: number,
    /** Cells set from outside (a report's key): reading one counts as reading a recomputed cell. */
    private readonly changed: readonly { readonly sheet: number; readonly rect: Rect }[] = [],
  ) {
    this.date1904 = book.date1904;
    this.maxCells = maxCells;
    this.state = new Uint8Array(plan.n);
    this.kind = new Uint8Array(plan.n);
    this.num = new Float64Array(plan.n);
    this.bound = book.sheets.map((s) => ({ rows: s.cells.maxRow, cols: s.cells.maxCol }));
    this.fill = book.sheets.map(() => []);
    for (let i = 0; i < plan.n; i++) {
      if (plan.mode[i] === ModeCode.Single) continue;
      const a = plan.area(i);
      // Areas too large for any formula to fill (a hostile ref) do not widen what ranges visit.
      if ((a.r2 - a.r1 + 1) * (a.c2 - a.c1 + 1) > maxCells) continue;
      const b = this.bound[plan.sheet[i] as number] as { rows: number; cols: number };
      b.rows = Math.max(b.rows, a.r2);
      b.cols = Math.max(b.cols, a.c2);
      if (a.r2 > a.r1 || a.c2 > a.c1) (this.fill[plan.sheet[i] as number] as Rect[]).push(a);
    }
  }

  /** The planned cell being computed, as "Sheet!A1". */
  get current(): string | undefined {
    const i = this.currentId;
    if (i < 0) return undefined;
    return `${this.book.sheets[this.plan.sheet[i] as number]?.name}!${a1(this.position(i))}`;
  }

  position(i: number): { row: number; col: number } {
    const cells = this.book.sheets[this.plan.sheet[i] as number]!.cells;
    const k = this.plan.cell[i] as number;
    return { row: cells.row[k] as number, col: cells.col[k] as number };
  }

  // -------------------------------------------------------------------------------------------
  // Results

  private setScalar(i: number, v: Scalar): void {
    if (typeof v === "number") {
      this.kind[i] = Kind.Number;
      this.num[i] = v;
    } else if (typeof v === "boolean") {
      this.kind[i] = Kind.Bool;
      this.num[i] = v ? 1 : 0;
    } else if (v === null) {
      this.kind[i] = Kind.Blank;
    } else {
      this.kind[i] = typeof v === "string" ? Kind.Text : Kind.Error;
      this.obj[i] = v;
    }
  }

  /** A planned cell's own value (the anchor's, for an area). */
  scalar(i: number): Scalar {
    switch (this.kind[i]) {
      case Kind.Number:
        return this.num[i] as number;
      case Kind.Bool:
        return this.num[i] === 1;
      case Kind.Text:
      case Kind.Error:
        return this.obj[i] as string | XlError;
      default:
        return null;
    }
  }

  /** The area a planned cell fills (its own cell for a single value or an error). */
  filled(i: number): Rect {
    const a = this.areas.get(i);
    if (a) return a.area;
    const p = this.position(i);
    return { r1: p.row, c1: p.col, r2: p.row, c2: p.col };
  }

  areaResult(i: number): AreaResult | undefined {
    return this.areas.get(i);
  }

  noValue(i: number): boolean {
    return ((this.state[i] as number) & NO_VALUE) !== 0;
  }

  keep(i: number): boolean {
    return ((this.state[i] as number) & KEEP) !== 0;
  }

  /** Computes a planned cell (and what it reads) if not yet done. */
  ensure(i: number): void {
    const st = this.state[i] as number;
    if (st & DONE) return;
    if (st & IN_PROGRESS || this.plan.circular[i]) {
      if (!(st & IN_PROGRESS)) {
        this.setScalar(i, new Circular());
        this.state[i] = DONE | NO_VALUE;
      }
      return;
    }
    this.state[i] = IN_PROGRESS;
    this.touched.push(false);
    const outer = this.currentId;
    this.currentId = i;
    try {
      this.compute(i);
    } catch (e) {
      if (e instanceof NotComputed) {
        this.areas.delete(i);
        this.setScalar(i, new Uncomputable(e.message));
      } else if (e instanceof RangeError) {
        this.areas.delete(i);
        this.setScalar(i, new Uncomputable("the formula chain is too deep to compute headless"));
      } else throw e;
    }
    this.currentId = outer;
    const touched = this.touched.pop() as boolean;
    if (this.touched.length && touched) this.touched[this.touched.length - 1] = true;
    let flags = DONE;
    const reason = this.plan.reason[i];
    const sheet = this.book.sheets[this.plan.sheet[i] as number]!;
    // A formula with run-time references that read nothing recomputed keeps its cached value.
    if (reason === Reason.Dynamic && !touched && sheet.cells.cached(this.plan.cell[i] as number)) flags |= KEEP;
    // One whose reads cannot be traced keeps it only when it computed without reading anything
    // recomputed; where the engine could not compute it, it might read a SOIL cell: an error.
    if (reason === Reason.Untraced && !touched && !(this.scalar(i) instanceof Uncomputable) && sheet.cells.cached(this.plan.cell[i] as number)) flags |= KEEP;
    // A formula without a cached value that cannot be computed, fed by nothing recomputed, stays without one.
    if (reason === Reason.Uncached && this.scalar(i) instanceof Uncomputable && !touched) flags |= NO_VALUE;
    this.state[i] = flags;
  }

  // -------------------------------------------------------------------------------------------
  // What formulas read

  forEach(ref: XlRef, fn: (v: Scalar, r: number, c: number) => void): void {
    const sheet = this.book.sheets[ref.sheet];
    if (!sheet) return;
    const cells = sheet.cells;
    const extra = (this.fill[ref.sheet] ?? []).filter((a) => a.r1 <= ref.r2 && ref.r1 <= a.r2 && a.c1 <= ref.c2 && ref.c1 <= a.c2);
    const rEnd = Math.min(ref.r2, cells.maxRow);
    if (!extra.length) {
      for (let r = ref.r1; r <= rEnd; r++) {
        const [a, b] = cells.rowRange(r);
        for (let k = a; k < b; k++) {
          const c = cells.col[k] as number;
          if (c < ref.c1) continue;
          if (c > ref.c2) break;
          fn(this.value(ref.sheet, r, c), r, c);
        }
      }
      return;
    }
    // Spilled cells the file does not have yet are visited too, in row order.
    const seen = new Set<number>();
    const positions: [number, number][] = [];
    for (let r = ref.r1; r <= rEnd; r++) {
      const [a, b] = cells.rowRange(r);
      for (let k = a; k < b; k++) {
        const c = cells.col[k] as number;
        if (c < ref.c1 || c > ref.c2) continue;
        positions.push([r, c]);
        seen.add(r * 16384 + c);
      }
    }
    for (const a of extra) {
      for (let r = Math.max(a.r1, ref.r1); r <= Math.min(a.r2, ref.r2); r++) {
        for (let c = Math.max(a.c1, ref.c1); c <= Math.min(a.c2, ref.c2); c++) {
          const k = r * 16384 + c;
          if (seen.has(k)) continue;
          seen.add(k);
          positions.push([r, c]);
        }
      }
    }
    positions.sort((x, y) => x[0] - y[0] || x[1] - y[1]);
    for (const [r, c] of positions) fn(this.value(ref.sheet, r, c), r, c);
  }

  bounds(sheet: number) {
    return this.bound[sheet] ?? { rows: -1, cols: -1 };
  }

  value(sheet: number, row: number, col: number): Scalar {
    const sh = this.book.sheets[sheet];
    if (!sh) return null;
    const cells = sh.cells;
    const k = cells.find(row, col);
    const own = k >= 0 ? (cells.planId[k] as number) : -1;
    const owner = own >= 0 ? own : this.plan.areaOwner(sheet, row, col);
    if (owner >= 0) {
      this.ensure(owner);
      if (this.keep(owner)) return k >= 0 ? cells.value(k) : null;
      if (this.touched.length) this.touched[this.touched.length - 1] = true;
      const area = this.areas.get(owner);
      if (!area) {
        const p = this.position(owner);
        if (p.row !== row || p.col !== col) return null;
        const v = this.scalar(owner);
        // A cell the engine could not compute has no value to read: the reader cannot be computed either.
        if (v instanceof Uncomputable) notComputed(`it reads ${a1({ row, col })}, which is not computed headless (${v.message})`);
        return v;
      }
      const a = area.area;
      if (row < a.r1 || row > a.r2 || col < a.c1 || col > a.c2) return null;
      return area.grid[(row - a.r1) * (a.c2 - a.c1 + 1) + (col - a.c1)] as Scalar;
    }
    if (this.changed.length && this.touched.length) {
      for (const c of this.changed) {
        if (c.sheet === sheet && row >= c.rect.r1 && row <= c.rect.r2 && col >= c.rect.c1 && col <= c.rect.c2) this.touched[this.touched.length - 1] = true;
      }
    }
    return k >= 0 ? cells.value(k) : null;
  }

  spill(sheet: number, row: number, col: number): XlRef | XlError {
    const i = this.plan.at(sheet, row, col);
    if (i >= 0) {
      if (this.plan.mode[i] !== ModeCode.Spill) return err("#REF!", `${a1({ row, col })} holds no spilling formula`);
      this.ensure(i);
      if (this.keep(i)) return this.cachedSpill(sheet, row, col);
      const v = this.scalar(i);
      if (isError(v) && v.code === "#SPILL!") return v;
      const a = this.filled(i);
      return new XlRef(sheet, a.r1, a.c1, a.r2, a.c2);
    }
    return this.cachedSpill(sheet, row, col);
  }

  private cachedSpill(sheet: number, row: number, col: number): XlRef | XlError {
    const sh = this.book.sheets[sheet];
    const k = sh ? sh.cells.find(row, col) : -1;
    const f = k >= 0 ? (sh!.cells.formula[k] as number) : -1;
    const form = f >= 0 ? sh!.formulas.form[f] : -1;
    if (f < 0 || (form !== Form.Dynamic && form !== Form.Array)) return err("#REF!", "the spill operator # needs a cell that holds a spilling formula");
    const ref = sh!.formulas.ref.get(f) ?? { r1: row, c1: col, r2: row, c2: col };
    return new XlRef(sheet, ref.r1, ref.c1, ref.r2, ref.c2);
  }

  soil(name: string) {
    if (!name.startsWith("SOIL.")) return undefined;
    let c = this.soilCache.get(name);
    if (c === undefined && !this.soilCache.has(name)) {
      c = soilCall(name);
      this.soilCache.set(name, c);
    }
    return c;
  }

  now(): number {
    return localSerial(this.clock, new Date(this.clock).getTimezoneOffset(), this.date1904);
  }

  // -------------------------------------------------------------------------------------------
  // Computing

  /**
   * Computes every planned cell: level by level, cells of one level that share a column-friendly
   * SOIL formula together (one binding call per run), the rest one by one.
   */
  computeAll(): void {
    const plan = this.plan;
    let maxLevel = 0;
    for (let i = 0; i < plan.n; i++) if ((plan.level[i] as number) > maxLevel) maxLevel = plan.level[i] as number;
    const byLevel: number[][] = Array.from({ length: maxLevel + 1 }, () => []);
    const circular: number[] = [];
    for (let o = 0; o < plan.n; o++) {
      const i = plan.order[o] as number;
      const l = plan.level[i] as number;
      if (l < 0) circular.push(i);
      else (byLevel[l] as number[]).push(i);
    }
    for (const cells of byLevel) {
      const groups = new Map<Node, number[]>();
      for (const i of cells) {
        const node = this.nodeOf(i);
        if (!node || plan.reason[i] === Reason.Dynamic || plan.reason[i] === Reason.Untraced || plan.reason[i] === Reason.Uncached) continue;
        const mode = plan.mode[i];
        if (!(mode === ModeCode.Single || (mode === ModeCode.Spill && !plan.uncertain[i] && this.isOneCell(i)))) continue;
        if (!columnCall(node)) continue;
        const g = groups.get(node);
        if (g) g.push(i);
        else groups.set(node, [i]);
      }
      for (const [node, members] of groups) if (members.length >= 8) this.computeColumn(node, members);
      for (const i of cells) this.ensure(i);
    }
    for (const i of circular) this.ensure(i);
  }

  private isOneCell(i: number): boolean {
    const p = this.position(i);
    return this.plan.r2[i] === p.row && this.plan.c2[i] === p.col;
  }

  private nodeOf(i: number): Node | undefined {
    return this.book.sheets[this.plan.sheet[i] as number]!.formulas.node[this.plan.formula[i] as number];
  }

  /** One SOIL call over single cells and constants, for many cells at once (same arguments each would pass). */
  private computeColumn(node: Node, members: number[]): void {
    const call = columnCall(node) as ColumnCall;
    const soil = this.soil(call.name);
    if (!soil) return;
    const n = members.length;
    const plan = this.plan;
    const args: (unknown[][] | null)[] = [];
    for (const a of call.args) {
      if (a.kind === "omitted") {
        args.push(null);
      } else if (a.kind === "constant") {
        args.push([[a.value]]);
      } else {
        const col: unknown[][] = new Array(n);
        const ref = a.ref;
        const named = ref.sheet === undefined ? undefined : this.book.sheetIndex(ref.sheet);
        for (let j = 0; j < n; j++) {
          const i = members[j] as number;
          const s = ref.sheet === undefined ? (plan.sheet[i] as number) : named;
          const p = this.position(i);
          const r = ref.abs & 1 ? ref.r1 : ref.r1 + p.row;
          const c = ref.abs & 2 ? ref.c1 : ref.c1 + p.col;
          let v: Scalar;
          if (s === undefined) v = err("#REF!", `there is no sheet named "${ref.sheet}"`);
          else if (r < 0 || c < 0 || r >= 1048576 || c >= 16384) v = err("#REF!", "the reference moves off the sheet");
          else v = this.value(s, r, c);
          col[j] = [v === null ? "" : v]; // Excel passes an empty cell to a custom function as ""
        }
        args.push(col);
      }
    }
    const out = soil(args);
    for (let j = 0; j < n; j++) {
      const i = members[j] as number;
      const v = out instanceof XlArray ? (out.rows === n ? out.at(j, 0) : out.at(0, 0)) : (out as Scalar);
      this.setScalar(i, zeroBlank(v));
      this.state[i] = DONE;
    }
  }

  private compute(i: number): void {
    const plan = this.plan;
    const sheet = this.book.sheets[plan.sheet[i] as number]!;
    const f = plan.formula[i] as number;
    const node = sheet.formulas.node[f];
    const pos = this.position(i);
    if (!node) {
      const why =
        sheet.formulas.form[f] === Form.Table ? "a what-if data table is not computed headless" : `the formula cannot be read headless (${sheet.formulas.syntaxError.get(f) ?? "unknown"})`;
      this.setScalar(i, new Uncomputable(why));
      return;
    }
    const arity = arityProblem(node);
    if (arity) {
      this.setScalar(i, new Uncomputable(arity));
      return;
    }
    const mode = plan.mode[i];
    const ctx: Ctx = { host: this, sheet: plan.sheet[i] as number, row: pos.row, col: pos.col, arrays: mode !== ModeCode.Single, depth: 0 };
    const v = ev(node, ctx, true);
    if (mode === ModeCode.Single) {
      this.setScalar(i, finalScalar(v, ctx));
      return;
    }
    const arr = v instanceof XlRef ? toArray(v, ctx) : v;
    const predicted = plan.area(i);
    if (mode === ModeCode.Fixed) {
      const grid = fillFixed(arr, predicted, ctx);
      this.areas.set(i, { area: predicted, grid });
      this.setScalar(i, grid[0] as Scalar);
      return;
    }
    // A dynamic array: spills to its size, if the cells it needs are free.
    if (isError(arr) || !(arr instanceof XlArray)) {
      this.setScalar(i, finalScalar(arr as Value, ctx));
      return;
    }
    const rows = arr.rows;
    const cols = arr.cols;
    if (rows === 1 && cols === 1) {
      this.setScalar(i, zeroBlank(arr.at(0, 0)));
      return;
    }
    const area = { r1: pos.row, c1: pos.col, r2: pos.row + rows - 1, c2: pos.col + cols - 1 };
    if (area.r2 !== predicted.r2 || area.c2 !== predicted.c2) {
      this.setScalar(i, new Uncomputable(`the result's size (${rows}×${cols}) depends on the data and differs from the size read from the formula; not computed headless`));
      return;
    }
    const blocked = this.spillBlocked(i, area);
    if (blocked) {
      this.setScalar(i, err("#SPILL!", blocked));
      return;
    }
    const grid = arr.data.map(zeroBlank);
    this.areas.set(i, { area, grid });
    this.setScalar(i, grid[0] as Scalar);
  }

  /** Why a spill cannot go where it needs to, or undefined when the cells are free. */
  private spillBlocked(i: number, area: Rect): string | undefined {
    const plan = this.plan;
    const sheetIdx = plan.sheet[i] as number;
    const sheet = this.book.sheets[sheetIdx]!;
    const pos = this.position(i);
    const old = sheet.formulas.ref.get(plan.formula[i] as number);
    for (const m of sheet.merges) {
      if (m.r1 <= area.r2 && area.r1 <= m.r2 && m.c1 <= area.c2 && area.c1 <= m.c2) {
        return `the spill range ${rangeA1({ row: area.r1, col: area.c1 }, area.r2 - area.r1 + 1, area.c2 - area.c1 + 1)} holds merged cells`;
      }
    }
    const cells = sheet.cells;
    for (let r = area.r1; r <= area.r2; r++) {
      for (let c = area.c1; c <= area.c2; c++) {
        if (r === pos.row && c === pos.col) continue;
        const owner = plan.owner(sheetIdx, r, c);
        const ownerArea = owner >= 0 && owner !== i ? plan.area(owner) : undefined;
        if (ownerArea) {
          const ownerPos = this.position(owner);
          const fills = plan.mode[owner] !== ModeCode.Single || (ownerPos.row === r && ownerPos.col === c);
          if (fills && r >= ownerArea.r1 && r <= ownerArea.r2 && c >= ownerArea.c1 && c <= ownerArea.c2) return `the spill range would cover ${a1({ row: r, col: c })}, which another formula fills`;
        }
        const k = cells.find(r, c);
        if (k < 0) continue;
        if ((cells.formula[k] as number) >= 0) return `the spill range would cover ${a1({ row: r, col: c })}, which holds a formula`;
        if (cells.value(k) === null) continue;
        const inOld = old && r >= old.r1 && r <= old.r2 && c >= old.c1 && c <= old.c2;
        const freed = ownerArea && !(r >= ownerArea.r1 && r <= ownerArea.r2 && c >= ownerArea.c1 && c <= ownerArea.c2);
        if (!inOld && !freed) return `the spill range would cover ${a1({ row: r, col: c })}, which is not empty`;
      }
    }
    return undefined;
  }
}

interface ColumnArg {
  readonly kind: "omitted" | "constant" | "cell";
  readonly value?: unknown;
  readonly ref: Extract<Node, { k: "ref" }>;
}

interface ColumnCall {
  readonly name: string;
  readonly args: readonly ColumnArg[];
}

const COLUMN_CALLS = new WeakMap<Node, ColumnCall | null>();
const WHOLE_RANGE = new Map(REGISTRY.map((f) => [f.formulaName.toUpperCase(), f.spec.params.map((x) => x.kind === "range")]));

/**
 * A formula that is one SOIL call whose arguments are single cells or constants (what a column
 * filled down holds), or null. Arrays, ranges, expressions and whole-range parameters given a
 * cell are left to the cell-by-cell path.
 */
function columnCall(node: Node): ColumnCall | null {
  const known = COLUMN_CALLS.get(node);
  if (known !== undefined) return known;
  let out: ColumnCall | null = null;
  if (node.k === "fn" && WHOLE_RANGE.has(node.name)) {
    const whole = WHOLE_RANGE.get(node.name) as boolean[];
    const args: ColumnArg[] = [];
    let ok = node.args.length <= whole.length;
    const none = { k: "ref", r1: 0, c1: 0, r2: 0, c2: 0, abs: 0 } as const;
    node.args.forEach((a, i) => {
      if (!ok) return;
      if (a.k === "miss") args.push({ kind: "omitted", ref: none });
      else if (a.k === "num" || a.k === "str" || a.k === "bool") args.push({ kind: "constant", value: a.v, ref: none });
      else if (a.k === "ref" && !whole[i] && a.r1 === a.r2 && a.c1 === a.c2 && (a.abs & 1) === (a.abs & 4) >> 2 && (a.abs & 2) === (a.abs & 8) >> 2) args.push({ kind: "cell", ref: a });
      else ok = false;
    });
    if (ok) out = { name: node.name, args };
  }
  COLUMN_CALLS.set(node, out);
  return out;
}

/** A formula's displayed value: an empty cell it refers to shows 0. */
function zeroBlank(v: Scalar): Scalar {
  return v === null ? 0 : v;
}

function finalScalar(v: Value, ctx: Ctx): Scalar {
  if (v instanceof XlRef) return zeroBlank(ctx.arrays ? firstScalar(v, ctx) : intersect(v, ctx));
  return zeroBlank(firstScalar(v, ctx));
}

/** A legacy array formula's fixed range: a single value fills it, a row or column repeats, beyond the result is #N/A. */
function fillFixed(v: Value | XlError, area: Rect, ctx: Ctx): Scalar[] {
  const rows = area.r2 - area.r1 + 1;
  const cols = area.c2 - area.c1 + 1;
  const arr = v instanceof XlArray ? v : null;
  const out: Scalar[] = new Array(rows * cols);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      let x: Scalar;
      if (!arr) x = zeroBlank(firstScalar(v as Value, ctx));
      else {
        const rr = arr.rows === 1 ? 0 : r;
        const cc = arr.cols === 1 ? 0 : c;
        x = rr < arr.rows && cc < arr.cols ? zeroBlank(arr.at(rr, cc)) : err("#N/A", "outside the array formula's result");
      }
      out[r * cols + c] = x;
    }
  }
  return out;
}
