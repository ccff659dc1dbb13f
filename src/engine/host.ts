/**
 * The evaluation host of a recalculation: what a formula reads (cached values, or results the
 * engine has computed, spills included), the results themselves, and the order they are computed
 * in. Cells of one dependency level whose formula is one SOIL call over single cells and
 * constants (a column filled down) are computed a column at a time: one binding call for the
 * whole run of cells instead of one per cell, with the same arguments each cell would pass.
 */
import { Book, Cell } from "./book";
import { a1, rangeA1 } from "./cellref";
import { Ctx, Host, Uncomputable, ev, firstScalar, intersect, toArray } from "./formula/evaluate";
import type { Node } from "./formula/parser";
import { Rect, Scalar, Value, XlArray, XlError, XlRef, err, isError } from "./formula/values";
import { Plan, Planned } from "./plan";
import { soilCall } from "./soil";
import { REGISTRY } from "./registry";

/** What one computed cell came to. */
export interface Result {
  /** The final area it fills (the anchor alone for a single value or a spill error). */
  readonly area: Rect;
  /** Values over the area, row-major (a single value has one). */
  readonly grid: Scalar[];
  /** No value to write (a circular reference, or an uncomputable cell kept as cached). */
  readonly noValue?: boolean;
  /** Keep the file's cached value (a formula with dynamic references that read nothing recomputed). */
  readonly keep?: boolean;
}

export class Circular extends XlError {
  constructor() {
    super("#VALUE!", "circular reference: the cell depends on itself; no value written, Excel reports it when the file is opened");
  }
}

const single = (p: Planned): Rect => ({ r1: p.cell.row, c1: p.cell.col, r2: p.cell.row, c2: p.cell.col });

export class RecalcHost implements Host {
  readonly date1904: boolean;
  readonly maxCells: number;
  private readonly results: (Result | undefined)[];
  private readonly inProgress: Uint8Array;
  private readonly bound: { rows: number; cols: number }[];
  /** Set when an evaluation reads a recomputed cell (per evaluation frame). */
  private touched: boolean[] = [];
  private readonly soilCache = new Map<string, ReturnType<typeof soilCall>>();
  private readonly clock = Date.now();
  /** The cell being computed, for messages. */
  private currentCell: Planned | undefined;
  /** The cell being computed, as "Sheet!A1". */
  get current(): string | undefined {
    const p = this.currentCell;
    return p ? `${this.book.sheets[p.sheet]?.name}!${a1(p.cell)}` : undefined;
  }

  constructor(
    readonly book: Book,
    private readonly plan: Plan,
    maxCells: number,
  ) {
    this.date1904 = book.date1904;
    this.maxCells = maxCells;
    this.results = new Array(plan.order.length);
    this.inProgress = new Uint8Array(plan.order.length);
    this.bound = book.sheets.map((s) => {
      let cols = -1;
      for (const r of s.rows) if (r && r.length - 1 > cols) cols = r.length - 1;
      return { rows: s.rows.length - 1, cols };
    });
    this.areas = book.sheets.map(() => []);
    for (const p of plan.order) {
      // Areas too large for any formula to fill (a hostile ref) do not widen what ranges visit.
      if ((p.area.r2 - p.area.r1 + 1) * (p.area.c2 - p.area.c1 + 1) > maxCells) continue;
      const b = this.bound[p.sheet] as { rows: number; cols: number };
      b.rows = Math.max(b.rows, p.area.r2);
      b.cols = Math.max(b.cols, p.area.c2);
      if (p.area.r2 > p.area.r1 || p.area.c2 > p.area.c1) (this.areas[p.sheet] as Rect[]).push(p.area);
    }
  }

  /** Multi-cell areas computed formulas may fill, per sheet (cells a file may not have yet). */
  private readonly areas: Rect[][];

  forEach(ref: XlRef, fn: (v: Scalar, r: number, c: number) => void): void {
    const sheet = this.book.sheets[ref.sheet];
    if (!sheet) return;
    const extra = (this.areas[ref.sheet] ?? []).filter((a) => a.r1 <= ref.r2 && ref.r1 <= a.r2 && a.c1 <= ref.c2 && ref.c1 <= a.c2);
    const rows = sheet.rows;
    const rEnd = Math.min(ref.r2, rows.length - 1);
    if (!extra.length) {
      for (let r = ref.r1; r <= rEnd; r++) {
        const row = rows[r];
        if (!row) continue;
        const cEnd = Math.min(ref.c2, row.length - 1);
        for (let c = ref.c1; c <= cEnd; c++) if (row[c]) fn(this.value(ref.sheet, r, c), r, c);
      }
      return;
    }
    // Spilled cells the file does not have yet are visited too, in row order.
    const seen = new Set<number>();
    const positions: [number, number][] = [];
    for (let r = ref.r1; r <= rEnd; r++) {
      const row = rows[r];
      if (!row) continue;
      const cEnd = Math.min(ref.c2, row.length - 1);
      for (let c = ref.c1; c <= cEnd; c++) {
        if (!row[c]) continue;
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
    const owner = this.plan.owner(sheet, row, col);
    if (owner) {
      const r = this.result(owner);
      if (r.keep) return this.book.cell(sheet, row, col)?.value ?? null;
      if (this.touched.length) this.touched[this.touched.length - 1] = true;
      const a = r.area;
      if (row < a.r1 || row > a.r2 || col < a.c1 || col > a.c2) return null;
      if (r.noValue) return owner.cell.row === row && owner.cell.col === col ? (r.grid[0] as Scalar) : null;
      return r.grid[(row - a.r1) * (a.c2 - a.c1 + 1) + (col - a.c1)] as Scalar;
    }
    const cell = this.book.sheets[sheet]?.rows[row]?.[col];
    return cell ? cell.value : null;
  }

  spill(sheet: number, row: number, col: number): XlRef | XlError {
    const p = this.plan.at(sheet, row, col);
    if (p) {
      if (p.mode !== "spill") return err("#REF!", `${a1({ row, col })} holds no spilling formula`);
      const r = this.result(p);
      if (r.keep) return cachedSpill(this.book.cell(sheet, row, col), sheet);
      const v = r.grid[0];
      if (isError(v) && v.code === "#SPILL!") return v;
      return new XlRef(sheet, r.area.r1, r.area.c1, r.area.r2, r.area.c2);
    }
    return cachedSpill(this.book.cell(sheet, row, col), sheet);
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
    const ms = this.clock - new Date(this.clock).getTimezoneOffset() * 60000;
    const epoch = this.date1904 ? Date.UTC(1904, 0, 1) : Date.UTC(1899, 11, 30);
    return (ms - epoch) / 86400000;
  }

  /** The result of a computed cell, computing it (and what it reads) when not yet done. */
  result(p: Planned): Result {
    const done = this.results[p.id];
    if (done) return done;
    if (this.inProgress[p.id] || this.plan.circular.has(p.id)) {
      const r: Result = { area: single(p), grid: [new Circular()], noValue: true };
      if (!this.inProgress[p.id]) this.results[p.id] = r;
      return r;
    }
    this.inProgress[p.id] = 1;
    this.touched.push(false);
    const outer = this.currentCell;
    this.currentCell = p;
    let r: Result;
    try {
      r = this.compute(p);
    } catch (e) {
      if (!(e instanceof RangeError)) throw e;
      r = { area: single(p), grid: [new Uncomputable("the formula chain is too deep to compute headless")] };
    }
    this.currentCell = outer;
    const touched = this.touched.pop() as boolean;
    if (this.touched.length && touched) this.touched[this.touched.length - 1] = true;
    this.inProgress[p.id] = 0;
    // A formula with dynamic references that read nothing recomputed keeps its cached value.
    if (p.reason === "dynamic" && !touched && p.cell.cached) r = { ...r, keep: true };
    // A formula without a cached value that cannot be computed, fed by nothing recomputed, stays without one.
    if (p.reason === "uncached" && r.grid[0] instanceof Uncomputable && !touched) r = { ...r, noValue: true };
    this.results[p.id] = r;
    return r;
  }

  /**
   * Computes every planned cell: level by level, cells of one level that share a column-friendly
   * SOIL formula together (one binding call per run), the rest one by one.
   */
  computeAll(): void {
    const plan = this.plan;
    const byLevel = new Map<number, Planned[]>();
    for (const p of plan.order) {
      const l = plan.level[p.id] as number;
      const list = byLevel.get(l);
      if (list) list.push(p);
      else byLevel.set(l, [p]);
    }
    const levels = [...byLevel.keys()].filter((l) => l >= 0).sort((a, b) => a - b);
    for (const l of levels) {
      const cells = byLevel.get(l) as Planned[];
      const groups = new Map<Node, Planned[]>();
      for (const p of cells) {
        const node = p.cell.formula?.node;
        if (!node || p.reason === "dynamic" || p.reason === "uncached" || !(p.mode === "single" || (p.mode === "spill" && !p.uncertain && p.area.r1 === p.area.r2 && p.area.c1 === p.area.c2))) continue;
        if (!columnCall(node)) continue;
        const g = groups.get(node);
        if (g) g.push(p);
        else groups.set(node, [p]);
      }
      for (const [node, members] of groups) if (members.length >= 8) this.computeColumn(node, members);
      for (const p of cells) this.result(p);
    }
    for (const p of byLevel.get(-1) ?? []) this.result(p);
  }

  /** One SOIL call over single cells and constants, for many cells at once (same arguments each would pass). */
  private computeColumn(node: Node, members: Planned[]): void {
    const call = columnCall(node) as ColumnCall;
    const soil = this.soil(call.name);
    if (!soil) return;
    const n = members.length;
    const args: (unknown[][] | null)[] = [];
    for (const a of call.args) {
      if (a.kind === "omitted") {
        args.push(null);
      } else if (a.kind === "constant") {
        args.push([[a.value]]);
      } else {
        const col: unknown[][] = new Array(n);
        const ref = a.ref;
        const sheetOf = (p: Planned) => (ref.sheet === undefined ? p.sheet : this.book.sheetIndex(ref.sheet));
        for (let i = 0; i < n; i++) {
          const p = members[i] as Planned;
          const s = sheetOf(p);
          const r = ref.abs & 1 ? ref.r1 : ref.r1 + p.cell.row;
          const c = ref.abs & 2 ? ref.c1 : ref.c1 + p.cell.col;
          let v: Scalar;
          if (s === undefined) v = err("#REF!", `there is no sheet named "${ref.sheet}"`);
          else if (r < 0 || c < 0 || r >= 1048576 || c >= 16384) v = err("#REF!", "the reference moves off the sheet");
          else v = this.value(s, r, c);
          col[i] = [v === null ? "" : v]; // Excel passes an empty cell to a custom function as ""
        }
        args.push(col);
      }
    }
    const out = soil(args);
    for (let i = 0; i < n; i++) {
      const p = members[i] as Planned;
      const v = out instanceof XlArray ? (out.rows === n ? out.at(i, 0) : out.at(0, 0)) : (out as Scalar);
      this.results[p.id] = { area: p.area, grid: [zeroBlank(v)] };
    }
  }

  private compute(p: Planned): Result {
    const f = p.cell.formula!;
    const at = single(p);
    if (!f.node) {
      const why = f.form === "table" ? "a what-if data table is not computed headless" : `the formula cannot be read headless (${f.syntaxError ?? "unknown"})`;
      return { area: at, grid: [new Uncomputable(why)] };
    }
    const ctx: Ctx = { host: this, sheet: p.sheet, row: p.cell.row, col: p.cell.col, arrays: p.mode !== "single", depth: 0 };
    const v = ev(f.node, ctx, true);
    if (p.mode === "single") return { area: at, grid: [finalScalar(v, ctx)] };
    const arr = v instanceof XlRef ? toArray(v, ctx) : v;
    if (p.mode === "fixed") return { area: p.area, grid: fillFixed(arr, p.area, ctx) };
    // A dynamic array: spills to its size, if the cells it needs are free.
    if (isError(arr) || !(arr instanceof XlArray)) return { area: at, grid: [finalScalar(arr as Value, ctx)] };
    const rows = arr.rows;
    const cols = arr.cols;
    if (rows === 1 && cols === 1) return { area: at, grid: [zeroBlank(arr.at(0, 0))] };
    const area = { r1: p.cell.row, c1: p.cell.col, r2: p.cell.row + rows - 1, c2: p.cell.col + cols - 1 };
    if (area.r2 !== p.area.r2 || area.c2 !== p.area.c2) {
      return {
        area: at,
        grid: [new Uncomputable(`the result's size (${rows}×${cols}) depends on the data and differs from the size read from the formula; not computed headless`)],
      };
    }
    const blocked = this.spillBlocked(p, area);
    if (blocked) return { area: at, grid: [err("#SPILL!", blocked)] };
    const grid = arr.data.map(zeroBlank);
    return { area, grid };
  }

  /** Why a spill cannot go where it needs to, or undefined when the cells are free. */
  private spillBlocked(p: Planned, area: Rect): string | undefined {
    const sheet = this.book.sheets[p.sheet]!;
    const old = p.cell.formula?.ref;
    for (const m of sheet.merges) {
      if (m.r1 <= area.r2 && area.r1 <= m.r2 && m.c1 <= area.c2 && area.c1 <= m.c2) {
        return `the spill range ${rangeA1({ row: area.r1, col: area.c1 }, area.r2 - area.r1 + 1, area.c2 - area.c1 + 1)} holds merged cells`;
      }
    }
    for (let r = area.r1; r <= area.r2; r++) {
      const row = sheet.rows[r];
      for (let c = area.c1; c <= area.c2; c++) {
        if (r === p.cell.row && c === p.cell.col) continue;
        const owner = this.plan.owner(p.sheet, r, c);
        if (owner && owner !== p && (owner.mode !== "single" || (owner.cell.row === r && owner.cell.col === c))) {
          const oa = owner.area;
          if (r >= oa.r1 && r <= oa.r2 && c >= oa.c1 && c <= oa.c2) return `the spill range would cover ${a1({ row: r, col: c })}, which another formula fills`;
        }
        const cell = row?.[c];
        if (!cell) continue;
        if (cell.formula) return `the spill range would cover ${a1({ row: r, col: c })}, which holds a formula`;
        if (cell.value === null) continue;
        const inOld = old && r >= old.r1 && r <= old.r2 && c >= old.c1 && c <= old.c2;
        const freed = owner && owner !== p && !(r >= owner.area.r1 && r <= owner.area.r2 && c >= owner.area.c1 && c <= owner.area.c2);
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

function cachedSpill(cell: Cell | undefined, sheet: number): XlRef | XlError {
  const f = cell?.formula;
  if (!cell || !f || (f.form !== "dynamic" && f.form !== "array")) return err("#REF!", "the spill operator # needs a cell that holds a spilling formula");
  const ref = f.ref ?? { r1: cell.row, c1: cell.col, r2: cell.row, c2: cell.col };
  return new XlRef(sheet, ref.r1, ref.c1, ref.r2, ref.c2);
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

