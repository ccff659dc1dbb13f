/**
 * Which cells a recalculation computes, and in what order.
 *
 * The rule: the SOIL cells, and every cell that depends on them (directly, through ranges,
 * defined names or spills), are computed; so is a formula that the file holds without a cached
 * value. Every other cell keeps the value its file cached. Dependencies are read statically
 * from each formula's tree (a superset is safe: a cell computed needlessly gets Excel's value
 * anyway). A formula whose references are only known when it runs (OFFSET, INDIRECT) is computed
 * whenever the workbook has any SOIL cell, since it might read one.
 *
 * Dynamic-array results spill; their size is predicted here from the shapes of the arguments,
 * so that cells reading a spill are ordered after it and collisions (#SPILL!) are known before
 * anything is written. A result whose size turns out to differ from the prediction is an error.
 */
import type { Book, Cell, Sheet } from "./book";
import type { Node } from "./formula/parser";
import { nativeFunction } from "./formula/evaluate";
import { MAX_COLS, MAX_ROWS, Rect } from "./formula/values";

export interface Shape {
  readonly rows: number;
  readonly cols: number;
}

/** What the planner knows of our add-in's functions: which parameters take a whole range. */
export interface SoilSignatures {
  /** For a function name ("SOIL.CEC"), whether each parameter is broadcast (false) or whole-range (true). */
  wholeRange(name: string): readonly boolean[] | undefined;
}

/** How a computed cell is evaluated and written. */
export type Mode =
  /** Legacy formula: one value. */
  | "single"
  /** Dynamic array (or a SOIL formula written as one): spills to its result's size. */
  | "spill"
  /** Legacy array (CSE) formula: fills its fixed range. */
  | "fixed";

export interface Planned {
  readonly id: number;
  readonly sheet: number;
  readonly cell: Cell;
  readonly mode: Mode;
  readonly soil: boolean;
  /** Predicted spill (mode "spill") or the fixed range (mode "fixed"), absolute. */
  readonly area: Rect;
  /** The prediction could not be certain (the result's size depends on data). */
  readonly uncertain: boolean;
  /** Why this cell is computed. */
  readonly reason: "soil" | "depends" | "uncached" | "dynamic";
}

export interface Plan {
  /** Computed cells in an order where each comes after what it reads (cycles last). */
  readonly order: readonly Planned[];
  /** Cells in a circular chain (computed to an error). */
  readonly circular: ReadonlySet<number>;
  /** Planned cell by sheet and position. */
  at(sheet: number, row: number, col: number): Planned | undefined;
  /** The computed cell whose area (spill, fixed range, or the range it covered in the file) holds a position. */
  owner(sheet: number, row: number, col: number): Planned | undefined;
  /** Formula cells the file holds, and how many are computed. */
  readonly formulaCells: number;
}

const key = (sheet: number, row: number, col: number) => (sheet * MAX_ROWS + row) * MAX_COLS + col;

interface Walk {
  rects: { sheet: number; rect: Rect }[];
  /** Anchors read through the spill operator. */
  spills: { sheet: number; row: number; col: number }[];
  soil: boolean;
  dynamic: boolean;
}

/** Collects what a formula reads (a superset), evaluated at (sheet,row,col). */
function walk(book: Book, node: Node, sheet: number, row: number, col: number, out: Walk, depth = 0): void {
  if (depth > 64) return;
  const stack: Node[] = [node];
  while (stack.length) {
    const n = stack.pop() as Node;
    switch (n.k) {
      case "ref": {
        const s = n.sheet === undefined ? sheet : book.sheetIndex(n.sheet);
        if (s === undefined) break;
        const r1 = n.abs & 1 ? n.r1 : n.r1 + row;
        const c1 = n.abs & 2 ? n.c1 : n.c1 + col;
        const r2 = n.abs & 4 ? n.r2 : n.r2 + row;
        const c2 = n.abs & 8 ? n.c2 : n.c2 + col;
        const rect = { r1: Math.max(0, Math.min(r1, r2)), c1: Math.max(0, Math.min(c1, c2)), r2: Math.min(MAX_ROWS - 1, Math.max(r1, r2)), c2: Math.min(MAX_COLS - 1, Math.max(c1, c2)) };
        if (rect.r1 <= rect.r2 && rect.c1 <= rect.c2) out.rects.push({ sheet: s, rect });
        break;
      }
      case "name": {
        const from = n.sheet === undefined ? sheet : book.sheetIndex(n.sheet);
        if (from === undefined) break;
        const d = book.definedName(n.name, from);
        if (d?.node) walk(book, d.node, from === sheet ? sheet : from, row, col, out, depth + 1);
        break;
      }
      case "fn":
        if (n.name.startsWith("SOIL.")) out.soil = true;
        else if (nativeFunction(n.name)?.dynamic) out.dynamic = true;
        for (const a of n.args) stack.push(a);
        break;
      case "spill": {
        if (n.x.k === "ref") {
          const s = n.x.sheet === undefined ? sheet : book.sheetIndex(n.x.sheet);
          if (s !== undefined) out.spills.push({ sheet: s, row: n.x.abs & 1 ? n.x.r1 : n.x.r1 + row, col: n.x.abs & 2 ? n.x.c1 : n.x.c1 + col });
        } else out.dynamic = true;
        stack.push(n.x);
        break;
      }
      case "neg":
      case "plus":
      case "at":
      case "pct":
        stack.push(n.x);
        break;
      case "bin":
      case "range":
      case "isect":
        stack.push(n.a, n.b);
        break;
      case "union":
        for (const i of n.items) stack.push(i);
        break;
      default:
        break;
    }
  }
}

function area(r: Rect): number {
  return (r.r2 - r.r1 + 1) * (r.c2 - r.c1 + 1);
}

function intersects(a: Rect, b: Rect): boolean {
  return a.r1 <= b.r2 && b.r1 <= a.r2 && a.c1 <= b.c2 && b.c1 <= a.c2;
}

/** Per sheet and column, sorted disjoint row intervals: does a rectangle touch any of them? */
class IntervalIndex {
  private readonly cols = new Map<number, [number, number][]>();
  private readonly pending = new Map<number, [number, number][]>();
  add(sheet: number, rect: Rect): void {
    for (let c = rect.c1; c <= rect.c2; c++) {
      const k = sheet * MAX_COLS + c;
      let list = this.pending.get(k);
      if (!list) this.pending.set(k, (list = []));
      list.push([rect.r1, rect.r2]);
    }
  }
  private settle(): void {
    if (!this.pending.size) return;
    for (const [k, add] of this.pending) {
      const all = [...(this.cols.get(k) ?? []), ...add].sort((a, b) => a[0] - b[0]);
      const merged: [number, number][] = [];
      for (const iv of all) {
        const last = merged[merged.length - 1];
        if (last && iv[0] <= last[1] + 1) last[1] = Math.max(last[1], iv[1]);
        else merged.push([iv[0], iv[1]]);
      }
      this.cols.set(k, merged);
    }
    this.pending.clear();
  }
  touches(sheet: number, rect: Rect): boolean {
    this.settle();
    const width = rect.c2 - rect.c1 + 1;
    if (width > this.cols.size) {
      for (const [k, list] of this.cols) {
        const s = Math.floor(k / MAX_COLS);
        const c = k % MAX_COLS;
        if (s === sheet && c >= rect.c1 && c <= rect.c2 && hits(list, rect)) return true;
      }
      return false;
    }
    for (let c = rect.c1; c <= rect.c2; c++) {
      const list = this.cols.get(sheet * MAX_COLS + c);
      if (list && hits(list, rect)) return true;
    }
    return false;
  }
}

function hits(list: [number, number][], rect: Rect): boolean {
  // First interval ending at or after rect.r1.
  let lo = 0;
  let hi = list.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if ((list[mid] as [number, number])[1] >= rect.r1) {
      found = mid;
      hi = mid - 1;
    } else lo = mid + 1;
  }
  return found >= 0 && (list[found] as [number, number])[0] <= rect.r2;
}

const SMALL = 64;

interface Info {
  readonly id: number;
  readonly sheet: number;
  readonly cell: Cell;
  readonly walk: Walk;
}

/** Builds the plan for a workbook. */
export function planRecalc(book: Book, soil: SoilSignatures): Plan {
  const infos: Info[] = [];
  const byKey = new Map<number, number>();
  for (const sheet of book.sheets) {
    for (const cell of sheet.formulaCells) {
      const f = cell.formula!;
      const w: Walk = { rects: [], spills: [], soil: false, dynamic: false };
      if (f.node) walk(book, f.node, sheet.index, cell.row, cell.col, w);
      const id = infos.length;
      infos.push({ id, sheet: sheet.index, cell, walk: w });
      byKey.set(key(sheet.index, cell.row, cell.col), id);
    }
  }
  const anySoil = infos.some((i) => i.walk.soil);

  // Reverse index: who reads a cell (small ranges cell by cell; large ranges checked by interval).
  const readers = new Map<number, number[]>();
  const large: { sheet: number; rect: Rect; id: number }[] = [];
  for (const info of infos) {
    for (const { sheet, rect } of info.walk.rects) {
      if (area(rect) <= SMALL) {
        for (let r = rect.r1; r <= rect.r2; r++) {
          for (let c = rect.c1; c <= rect.c2; c++) {
            const k = key(sheet, r, c);
            const list = readers.get(k);
            if (list) list.push(info.id);
            else readers.set(k, [info.id]);
          }
        }
      } else large.push({ sheet, rect, id: info.id });
    }
    for (const s of info.walk.spills) {
      const k = key(s.sheet, s.row, s.col);
      const list = readers.get(k);
      if (list) list.push(info.id);
      else readers.set(k, [info.id]);
    }
  }

  const reason = new Map<number, Planned["reason"]>();
  const shapes = new Map<number, { area: Rect; mode: Mode; uncertain: boolean }>();
  const dirtyIndex = new IntervalIndex();
  const queue: number[] = [];
  const mark = (id: number, why: Planned["reason"]) => {
    if (reason.has(id)) return;
    reason.set(id, why);
    queue.push(id);
  };
  for (const info of infos) {
    if (info.walk.soil) mark(info.id, "soil");
    else if (info.walk.dynamic && anySoil) mark(info.id, "dynamic");
  }
  const largeFired = new Array<boolean>(large.length).fill(false);
  const shapeOf = (id: number) => {
    let s = shapes.get(id);
    if (!s) {
      s = predict(book, infos[id] as Info, soil, byKey, shapes, reason);
      shapes.set(id, s);
    }
    return s;
  };
  for (;;) {
    while (queue.length) {
      const id = queue.pop() as number;
      const info = infos[id] as Info;
      const s = shapeOf(id);
      // What this cell changes: itself, its new area and the area it covered in the file.
      const regions: Rect[] = [s.area];
      const old = info.cell.formula?.ref;
      if (old && (info.cell.formula?.form === "dynamic" || info.cell.formula?.form === "array")) regions.push(old);
      for (const rect of regions) {
        dirtyIndex.add(info.sheet, rect);
        if (area(rect) <= 1 << 20) {
          for (let r = rect.r1; r <= rect.r2; r++) {
            for (let c = rect.c1; c <= rect.c2; c++) {
              const list = readers.get(key(info.sheet, r, c));
              if (list) for (const reader of list) mark(reader, "depends");
            }
          }
        } else {
          // A region too large to walk: every reader of its sheet is treated as depending on it.
          for (const [k, list] of readers) if (Math.floor(k / (MAX_ROWS * MAX_COLS)) === info.sheet) for (const reader of list) mark(reader, "depends");
        }
      }
    }
    let fired = false;
    large.forEach((l, i) => {
      if (largeFired[i] || reason.has(l.id)) return;
      if (dirtyIndex.touches(l.sheet, l.rect)) {
        largeFired[i] = true;
        mark(l.id, "depends");
        fired = true;
      }
    });
    if (!fired) break;
  }
  for (const info of infos) if (!info.cell.cached && !reason.has(info.id)) mark(info.id, "uncached");

  // Planned cells, and who owns which positions (new area and old covered range).
  const planned = new Map<number, Planned>();
  const owners = new Map<number, Planned>();
  const producers = new Map<number, number[]>(); // sheet*MAX_COLS+col → rows of single-cell producers
  const bigProducers: Planned[] = [];
  for (const [id, why] of reason) {
    const info = infos[id] as Info;
    const s = shapeOf(id);
    const p: Planned = { id, sheet: info.sheet, cell: info.cell, mode: s.mode, soil: info.walk.soil, area: s.area, uncertain: s.uncertain, reason: why };
    planned.set(id, p);
    const regions = [s.area];
    const old = info.cell.formula?.ref;
    if (old && (info.cell.formula?.form === "dynamic" || info.cell.formula?.form === "array")) regions.push(old);
    for (const rect of regions) {
      if (area(rect) > 1 << 22) continue; // refused later as too large
      for (let r = rect.r1; r <= rect.r2; r++) {
        for (let c = rect.c1; c <= rect.c2; c++) {
          const k = key(info.sheet, r, c);
          const prior = owners.get(k);
          // The anchor's own cell always belongs to it; otherwise the first claim stands.
          if (!prior || (r === info.cell.row && c === info.cell.col)) owners.set(k, p);
        }
      }
    }
    if (area(s.area) === 1 && !(old && area(old) > 1)) {
      const k = info.sheet * MAX_COLS + info.cell.col;
      let rows = producers.get(k);
      if (!rows) producers.set(k, (rows = []));
      rows.push(info.cell.row);
    } else bigProducers.push(p);
  }
  for (const rows of producers.values()) rows.sort((a, b) => a - b);

  // Edges: a computed cell comes after the computed cells whose areas it reads.
  const ids = [...planned.keys()].sort((a, b) => a - b);
  const succ = new Map<number, number[]>();
  const indeg = new Map<number, number>(ids.map((id) => [id, 0]));
  const edge = (from: number, to: number) => {
    if (from === to) {
      // A cell reading itself: circular.
      indeg.set(to, (indeg.get(to) as number) + 1);
      return;
    }
    let l = succ.get(from);
    if (!l) succ.set(from, (l = []));
    l.push(to);
    indeg.set(to, (indeg.get(to) as number) + 1);
  };
  for (const id of ids) {
    const info = infos[id] as Info;
    const seen = new Set<number>();
    const link = (from: number) => {
      if (seen.has(from)) return;
      seen.add(from);
      edge(from, id);
    };
    const reads = [...info.walk.rects];
    for (const s of info.walk.spills) reads.push({ sheet: s.sheet, rect: { r1: s.row, c1: s.col, r2: s.row, c2: s.col } });
    for (const { sheet, rect } of reads) {
      for (let c = rect.c1; c <= rect.c2; c++) {
        const rows = producers.get(sheet * MAX_COLS + c);
        if (!rows) {
          if (c - rect.c1 > 16384) break;
          continue;
        }
        let lo = lowerBound(rows, rect.r1);
        for (; lo < rows.length && (rows[lo] as number) <= rect.r2; lo++) {
          const pid = byKey.get(key(sheet, rows[lo] as number, c));
          if (pid !== undefined && planned.has(pid)) link(pid);
        }
      }
      for (const p of bigProducers) {
        if (p.sheet !== sheet) continue;
        const old = p.cell.formula?.ref;
        if (intersects(p.area, rect) || (old && intersects(old, rect)) || (rect.r1 <= p.cell.row && p.cell.row <= rect.r2 && rect.c1 <= p.cell.col && p.cell.col <= rect.c2)) link(p.id);
      }
    }
  }
  const order: Planned[] = [];
  const ready = ids.filter((id) => indeg.get(id) === 0);
  while (ready.length) {
    const id = ready.pop() as number;
    order.push(planned.get(id) as Planned);
    for (const next of succ.get(id) ?? []) {
      const d = (indeg.get(next) as number) - 1;
      indeg.set(next, d);
      if (d === 0) ready.push(next);
    }
  }
  const circular = new Set<number>();
  for (const id of ids) {
    if ((indeg.get(id) as number) > 0) {
      circular.add(id);
      order.push(planned.get(id) as Planned);
    }
  }
  return {
    order,
    circular,
    formulaCells: infos.length,
    at: (sheet, row, col) => {
      const id = byKey.get(key(sheet, row, col));
      return id === undefined ? undefined : planned.get(id);
    },
    owner: (sheet, row, col) => owners.get(key(sheet, row, col)),
  };
}

function lowerBound(rows: number[], v: number): number {
  let lo = 0;
  let hi = rows.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((rows[mid] as number) < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

// ---------------------------------------------------------------------------------------------
// Shapes

type Guess = { shape: Shape; uncertain: boolean };
const ONE: Guess = { shape: { rows: 1, cols: 1 }, uncertain: false };

function broadcast(gs: Guess[]): Guess {
  let rows = 1;
  let cols = 1;
  let uncertain = false;
  for (const g of gs) {
    rows = Math.max(rows, g.shape.rows);
    cols = Math.max(cols, g.shape.cols);
    uncertain ||= g.uncertain;
  }
  return { shape: { rows, cols }, uncertain };
}

interface ShapeCtx {
  readonly book: Book;
  readonly sheet: number;
  readonly row: number;
  readonly col: number;
  readonly arrays: boolean;
  readonly soil: SoilSignatures;
  readonly spillShape: (sheet: number, row: number, col: number) => Guess;
  readonly depth: number;
}

function shapeOfNode(n: Node, c: ShapeCtx): Guess {
  if (c.depth > 200) return { shape: { rows: 1, cols: 1 }, uncertain: true };
  const sub = (x: Node, arrays = c.arrays): Guess => shapeOfNode(x, { ...c, arrays, depth: c.depth + 1 });
  switch (n.k) {
    case "arr":
      return { shape: { rows: n.v.rows, cols: n.v.cols }, uncertain: false };
    case "ref": {
      if (!c.arrays) return ONE;
      const r1 = n.abs & 1 ? n.r1 : n.r1 + c.row;
      const r2 = n.abs & 4 ? n.r2 : n.r2 + c.row;
      const c1 = n.abs & 2 ? n.c1 : n.c1 + c.col;
      const c2 = n.abs & 8 ? n.c2 : n.c2 + c.col;
      return { shape: { rows: Math.abs(r2 - r1) + 1, cols: Math.abs(c2 - c1) + 1 }, uncertain: false };
    }
    case "name": {
      const from = n.sheet === undefined ? c.sheet : c.book.sheetIndex(n.sheet);
      const d = from === undefined ? undefined : c.book.definedName(n.name, from);
      return d?.node ? sub(d.node) : ONE;
    }
    case "neg":
    case "pct":
    case "plus":
      return sub(n.x);
    case "at":
      return ONE;
    case "bin":
      return broadcast([sub(n.a), sub(n.b)]);
    case "spill": {
      if (n.x.k !== "ref") return { shape: { rows: 1, cols: 1 }, uncertain: true };
      const s = n.x.sheet === undefined ? c.sheet : c.book.sheetIndex(n.x.sheet);
      if (s === undefined) return ONE;
      return c.spillShape(s, n.x.abs & 1 ? n.x.r1 : n.x.r1 + c.row, n.x.abs & 2 ? n.x.c1 : n.x.c1 + c.col);
    }
    case "range":
    case "isect":
    case "union":
      return c.arrays ? { shape: { rows: 1, cols: 1 }, uncertain: true } : ONE;
    case "fn":
      return shapeOfCall(n.name, n.args, c, sub);
    default:
      return ONE;
  }
}

function shapeOfCall(name: string, args: readonly Node[], c: ShapeCtx, sub: (x: Node, arrays?: boolean) => Guess): Guess {
  const whole = c.soil.wholeRange(name);
  if (whole) {
    // Our functions: broadcast of the arguments that are not whole ranges, each in array mode.
    return broadcast(args.map((a, i) => (whole[i] || a.k === "miss" ? ONE : sub(a, true))));
  }
  const fn = nativeFunction(name);
  if (!fn) return ONE;
  switch (name) {
    case "ROW":
    case "COLUMN": {
      if (!c.arrays || !args[0]) return ONE;
      const s = sub(args[0], true);
      return name === "ROW" ? { shape: { rows: s.shape.rows, cols: 1 }, uncertain: s.uncertain } : { shape: { rows: 1, cols: s.shape.cols }, uncertain: s.uncertain };
    }
    case "TRANSPOSE": {
      const s = sub(args[0] as Node, true);
      return { shape: { rows: s.shape.cols, cols: s.shape.rows }, uncertain: s.uncertain };
    }
    case "INDEX": {
      const a = sub(args[0] as Node, true);
      const lit = (n: Node | undefined) => (n === undefined ? 0 : n.k === "num" ? n.v : undefined);
      const r = lit(args[1]);
      const k = args.length > 2 ? lit(args[2]) : undefined;
      const rowsIdx = args[1] ? sub(args[1]) : ONE;
      const colsIdx = args[2] ? sub(args[2]) : ONE;
      if (rowsIdx.shape.rows * rowsIdx.shape.cols > 1 || colsIdx.shape.rows * colsIdx.shape.cols > 1) return broadcast([rowsIdx, colsIdx]);
      if (r === undefined || (args.length > 2 && k === undefined)) return { shape: { rows: 1, cols: 1 }, uncertain: a.shape.rows * a.shape.cols > 1 };
      if (args.length <= 2) {
        if (a.shape.rows === 1 || a.shape.cols === 1) return r === 0 ? a : ONE;
        return r === 0 ? a : { shape: { rows: 1, cols: a.shape.cols }, uncertain: a.uncertain };
      }
      return { shape: { rows: r === 0 ? a.shape.rows : 1, cols: k === 0 ? a.shape.cols : 1 }, uncertain: a.uncertain };
    }
    case "IF":
    case "IFS":
    case "SWITCH":
    case "CHOOSE":
    case "IFERROR":
    case "IFNA": {
      const gs = args.filter((a) => a.k !== "miss").map((a) => sub(a));
      const b = broadcast(gs);
      const sizes = new Set(gs.map((g) => `${g.shape.rows}x${g.shape.cols}`));
      // With one condition value, the branch taken decides the size: certain only if all agree.
      return { shape: b.shape, uncertain: b.uncertain || (sizes.size > 1 && (name !== "IF" || sub(args[0] as Node).shape.rows * sub(args[0] as Node).shape.cols === 1)) };
    }
    case "OFFSET":
    case "INDIRECT":
      return { shape: { rows: 1, cols: 1 }, uncertain: c.arrays };
    default:
      break;
  }
  if (fn.noLift) return ONE;
  const cls = (i: number) => (fn.param ? fn.param(i) : "V");
  return broadcast(args.map((a, i) => (cls(i) === "V" && a.k !== "miss" ? sub(a) : ONE)));
}

function predict(book: Book, info: Info, soil: SoilSignatures, byKey: Map<number, number>, shapes: Map<number, { area: Rect; mode: Mode; uncertain: boolean }>, reason: Map<number, unknown>): { area: Rect; mode: Mode; uncertain: boolean } {
  const f = info.cell.formula!;
  const at = { r1: info.cell.row, c1: info.cell.col, r2: info.cell.row, c2: info.cell.col };
  // A SOIL formula is written as Excel stores add-in formulas, a dynamic array, whether the file
  // had it plain (typed without the add-in) or as a fixed array (LibreOffice drops the marks).
  if (f.form === "array" && !info.walk.soil) return { area: f.ref ?? at, mode: "fixed", uncertain: false };
  const spills = f.form === "dynamic" || (info.walk.soil && (f.form === "plain" || f.form === "array"));
  if (!spills || !f.node) return { area: at, mode: "single", uncertain: false };
  const visiting = new Set<number>([info.id]);
  const spillShape = (sheet: number, row: number, col: number): Guess => {
    const id = byKey.get(key(sheet, row, col));
    if (id === undefined) return ONE;
    const known = shapes.get(id);
    if (known) return { shape: { rows: known.area.r2 - known.area.r1 + 1, cols: known.area.c2 - known.area.c1 + 1 }, uncertain: known.uncertain };
    const target = book.sheets[sheet]?.rows[row]?.[col];
    if (!reason.has(id) || visiting.has(id) || !target?.formula?.node) {
      // Not recomputed: the spill the file records.
      const ref = target?.formula?.ref;
      return ref ? { shape: { rows: ref.r2 - ref.r1 + 1, cols: ref.c2 - ref.c1 + 1 }, uncertain: false } : ONE;
    }
    visiting.add(id);
    const g = shapeOfNode(target.formula.node, { book, sheet, row, col, arrays: true, soil, spillShape, depth: 0 });
    visiting.delete(id);
    return g;
  };
  const g = shapeOfNode(f.node, { book, sheet: info.sheet, row: info.cell.row, col: info.cell.col, arrays: true, soil, spillShape, depth: 0 });
  const r2 = info.cell.row + g.shape.rows - 1;
  const c2 = info.cell.col + g.shape.cols - 1;
  return { area: { r1: info.cell.row, c1: info.cell.col, r2: Math.min(r2, MAX_ROWS - 1), c2: Math.min(c2, MAX_COLS - 1) }, mode: "spill", uncertain: g.uncertain || r2 >= MAX_ROWS || c2 >= MAX_COLS };
}

export type { Sheet };
