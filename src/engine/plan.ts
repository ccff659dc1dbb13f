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
 *
 * Built for season-size sheets: what a formula reads is derived once per formula tree (a column
 * filled down shares one), changed areas are kept as merged row intervals per column, and no
 * structure per referenced cell is built unless dependency chains are long.
 */
import type { Book, Cell } from "./book";
import type { Node, RefNode } from "./formula/parser";
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
  /**
   * Each planned cell's depth in the dependency order (0: reads no computed cell; -1: circular).
   * Cells of one level do not read each other, so a level can be computed in any grouping.
   */
  readonly level: Int32Array;
  /** Planned cell by sheet and position. */
  at(sheet: number, row: number, col: number): Planned | undefined;
  /** The computed cell whose area (spill, fixed range, or the range it covered in the file) holds a position. */
  owner(sheet: number, row: number, col: number): Planned | undefined;
  /** Formula cells the file holds, and how many are computed. */
  readonly formulaCells: number;
}

// ---------------------------------------------------------------------------------------------
// What a formula tree reads (derived once per tree)

interface TreeInfo {
  readonly refs: readonly RefNode[];
  readonly names: readonly { readonly name: string; readonly sheet?: string }[];
  /** Anchors read through the spill operator (A1#). */
  readonly spills: readonly RefNode[];
  readonly soil: boolean;
  readonly dynamic: boolean;
  /** A spill operator over something that is not a plain reference: reads are not known. */
  readonly opaqueSpill: boolean;
}

const TREE_INFO = new WeakMap<Node, TreeInfo>();

function treeInfo(node: Node): TreeInfo {
  const known = TREE_INFO.get(node);
  if (known) return known;
  const refs: RefNode[] = [];
  const names: { name: string; sheet?: string }[] = [];
  const spills: RefNode[] = [];
  let soil = false;
  let dynamic = false;
  let opaqueSpill = false;
  const stack: Node[] = [node];
  while (stack.length) {
    const n = stack.pop() as Node;
    switch (n.k) {
      case "ref":
        refs.push(n);
        break;
      case "name":
        names.push(n.sheet === undefined ? { name: n.name } : { name: n.name, sheet: n.sheet });
        break;
      case "fn":
        if (n.name.startsWith("SOIL.")) soil = true;
        else if (nativeFunction(n.name)?.dynamic) dynamic = true;
        for (const a of n.args) stack.push(a);
        break;
      case "spill":
        if (n.x.k === "ref") spills.push(n.x);
        else opaqueSpill = true;
        stack.push(n.x);
        break;
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
  const info: TreeInfo = { refs, names, spills, soil, dynamic: dynamic || opaqueSpill, opaqueSpill };
  TREE_INFO.set(node, info);
  return info;
}

/** A reference at a cell, written into `out`; false when it leaves the sheet or names no sheet. */
function placeRef(book: Book, n: RefNode, sheet: number, row: number, col: number, out: { sheet: number; r1: number; c1: number; r2: number; c2: number }): boolean {
  const s = n.sheet === undefined ? sheet : book.sheetIndex(n.sheet);
  if (s === undefined) return false;
  const r1 = n.abs & 1 ? n.r1 : n.r1 + row;
  const c1 = n.abs & 2 ? n.c1 : n.c1 + col;
  const r2 = n.abs & 4 ? n.r2 : n.r2 + row;
  const c2 = n.abs & 8 ? n.c2 : n.c2 + col;
  out.sheet = s;
  out.r1 = Math.max(0, Math.min(r1, r2));
  out.c1 = Math.max(0, Math.min(c1, c2));
  out.r2 = Math.min(MAX_ROWS - 1, Math.max(r1, r2));
  out.c2 = Math.min(MAX_COLS - 1, Math.max(c1, c2));
  return out.r1 <= out.r2 && out.c1 <= out.c2;
}

/**
 * Visits every rectangle a formula reads at (sheet,row,col), names followed (to a bounded depth);
 * stops when `visit` returns true. Returns true when stopped.
 */
function eachRead(book: Book, info: TreeInfo, sheet: number, row: number, col: number, visit: (r: { sheet: number; r1: number; c1: number; r2: number; c2: number }) => boolean, depth = 0): boolean {
  const scratch = { sheet: 0, r1: 0, c1: 0, r2: 0, c2: 0 };
  for (const ref of info.refs) if (placeRef(book, ref, sheet, row, col, scratch) && visit(scratch)) return true;
  for (const ref of info.spills) if (placeRef(book, ref, sheet, row, col, scratch) && visit(scratch)) return true;
  if (depth < 32) {
    for (const nm of info.names) {
      const from = nm.sheet === undefined ? sheet : book.sheetIndex(nm.sheet);
      if (from === undefined) continue;
      const d = book.definedName(nm.name, from);
      if (d?.node && eachRead(book, treeInfo(d.node), from, row, col, visit, depth + 1)) return true;
    }
  }
  return false;
}

/** Whether a formula calls SOIL or has run-time references, through its names too. */
function callsThrough(book: Book, info: TreeInfo, sheet: number, what: "soil" | "dynamic", depth = 0): boolean {
  if (info[what]) return true;
  if (depth >= 32) return false;
  for (const nm of info.names) {
    const from = nm.sheet === undefined ? sheet : book.sheetIndex(nm.sheet);
    if (from === undefined) continue;
    const d = book.definedName(nm.name, from);
    if (d?.node && callsThrough(book, treeInfo(d.node), from, what, depth + 1)) return true;
  }
  return false;
}

// ---------------------------------------------------------------------------------------------
// Changed areas: per sheet and column, merged row intervals

class IntervalIndex {
  private readonly cols = new Map<number, number[]>(); // flat [start, end, start, end, …], sorted, disjoint
  private readonly pending = new Map<number, number[]>();
  private readonly colsBySheet = new Map<number, Set<number>>();
  add(sheet: number, rect: Rect): void {
    for (let c = rect.c1; c <= rect.c2; c++) {
      const k = sheet * MAX_COLS + c;
      let list = this.pending.get(k);
      if (!list) {
        this.pending.set(k, (list = []));
        let set = this.colsBySheet.get(sheet);
        if (!set) this.colsBySheet.set(sheet, (set = new Set()));
        set.add(c);
      }
      list.push(rect.r1, rect.r2);
    }
  }
  settle(): void {
    if (!this.pending.size) return;
    for (const [k, add] of this.pending) {
      const old = this.cols.get(k) ?? [];
      const n = (old.length + add.length) / 2;
      const idx = new Array<number>(n);
      const all = old.concat(add);
      for (let i = 0; i < n; i++) idx[i] = i;
      idx.sort((a, b) => (all[2 * a] as number) - (all[2 * b] as number));
      const merged: number[] = [];
      for (const i of idx) {
        const s = all[2 * i] as number;
        const e = all[2 * i + 1] as number;
        const last = merged.length - 1;
        if (last > 0 && s <= (merged[last] as number) + 1) merged[last] = Math.max(merged[last] as number, e);
        else merged.push(s, e);
      }
      this.cols.set(k, merged);
    }
    this.pending.clear();
  }
  /** Whether a rectangle touches a changed area (as of the last settle). */
  touches(sheet: number, r1: number, c1: number, r2: number, c2: number): boolean {
    const used = this.colsBySheet.get(sheet);
    if (!used) return false;
    if (c2 - c1 + 1 > used.size) {
      for (const c of used) if (c >= c1 && c <= c2 && this.hits(sheet * MAX_COLS + c, r1, r2)) return true;
      return false;
    }
    for (let c = c1; c <= c2; c++) if (used.has(c) && this.hits(sheet * MAX_COLS + c, r1, r2)) return true;
    return false;
  }
  private hits(k: number, r1: number, r2: number): boolean {
    const list = this.cols.get(k);
    if (!list) return false;
    // First interval ending at or after r1.
    let lo = 0;
    let hi = list.length / 2 - 1;
    let found = -1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      if ((list[2 * mid + 1] as number) >= r1) {
        found = mid;
        hi = mid - 1;
      } else lo = mid + 1;
    }
    return found >= 0 && (list[2 * found] as number) <= r2;
  }
}

// ---------------------------------------------------------------------------------------------

interface Formula {
  readonly sheet: number;
  readonly cell: Cell;
  readonly info: TreeInfo | undefined;
}

const MAX_PASSES = 12;

/** Builds the plan for a workbook. */
export function planRecalc(book: Book, soil: SoilSignatures): Plan {
  const formulas: Formula[] = [];
  for (const sheet of book.sheets) {
    for (const cell of sheet.formulaCells) {
      const node = cell.formula?.node;
      formulas.push({ sheet: sheet.index, cell, info: node ? treeInfo(node) : undefined });
    }
  }
  const reason: (Planned["reason"] | undefined)[] = new Array(formulas.length);
  const shapes: (Guessed | undefined)[] = new Array(formulas.length);
  const idOf = (sheet: number, row: number, col: number): number | undefined => {
    const c = book.sheets[sheet]?.rows[row]?.[col];
    return c && c.formula ? formulaIndex.get(c) : undefined;
  };
  const formulaIndex = new Map<Cell, number>();
  formulas.forEach((f, i) => formulaIndex.set(f.cell, i));
  const shapeOf = (i: number): Guessed => (shapes[i] ??= predict(book, formulas[i] as Formula, soil, idOf, shapes, reason, i));

  const changed = new IntervalIndex();
  const markChanged = (i: number) => {
    const f = formulas[i] as Formula;
    const s = shapeOf(i);
    changed.add(f.sheet, s.area);
    const old = f.cell.formula?.ref;
    if (old && (f.cell.formula?.form === "dynamic" || f.cell.formula?.form === "array")) changed.add(f.sheet, old);
  };
  let anySoil = false;
  const isSoil: boolean[] = new Array(formulas.length);
  formulas.forEach((f, i) => {
    isSoil[i] = f.info ? callsThrough(book, f.info, f.sheet, "soil") : false;
    if (isSoil[i]) anySoil = true;
  });
  formulas.forEach((f, i) => {
    if (isSoil[i]) reason[i] = "soil";
    else if (anySoil && f.info && callsThrough(book, f.info, f.sheet, "dynamic")) reason[i] = "dynamic";
    if (reason[i]) markChanged(i);
  });

  // Cells reading a changed area change too: pass over the formulas until none is added.
  let passes = 0;
  let added = true;
  while (added && passes < MAX_PASSES) {
    passes++;
    added = false;
    changed.settle();
    for (let i = 0; i < formulas.length; i++) {
      if (reason[i]) continue;
      const f = formulas[i] as Formula;
      if (!f.info) continue;
      if (eachRead(book, f.info, f.sheet, f.cell.row, f.cell.col, (r) => changed.touches(r.sheet, r.r1, r.c1, r.r2, r.c2))) {
        reason[i] = "depends";
        markChanged(i);
        added = true;
      }
    }
  }
  if (added) propagateByIndex(book, formulas, reason, markChanged, changed);
  for (let i = 0; i < formulas.length; i++) if (!reason[i] && !(formulas[i] as Formula).cell.cached) reason[i] = "uncached";

  // Planned cells; positions of multi-cell areas (spills, fixed ranges, old ranges) by owner.
  const planned: Planned[] = [];
  const areaOwners = new Map<number, Map<number, Planned>>(); // sheet → (row*MAX_COLS+col) → owner
  const bigProducers: Planned[] = [];
  const producers = new Map<number, number[]>(); // sheet*MAX_COLS+col → rows of single-cell producers
  for (let i = 0; i < formulas.length; i++) {
    const why = reason[i];
    if (!why) continue;
    const f = formulas[i] as Formula;
    const s = shapeOf(i);
    const p: Planned = { id: planned.length, sheet: f.sheet, cell: f.cell, mode: s.mode, soil: isSoil[i] as boolean, area: s.area, uncertain: s.uncertain, reason: why };
    planned.push(p);
    f.cell.planId = p.id;
    const old = f.cell.formula?.ref;
    const regions = [s.area];
    if (old && (f.cell.formula?.form === "dynamic" || f.cell.formula?.form === "array")) regions.push(old);
    const multi = regions.some((r) => r.r2 > r.r1 || r.c2 > r.c1);
    if (!multi) {
      const k = f.sheet * MAX_COLS + f.cell.col;
      let rows = producers.get(k);
      if (!rows) producers.set(k, (rows = []));
      rows.push(f.cell.row);
      continue;
    }
    bigProducers.push(p);
    let owners = areaOwners.get(f.sheet);
    if (!owners) areaOwners.set(f.sheet, (owners = new Map()));
    for (const rect of regions) {
      if (area(rect) > 1 << 22) continue; // refused later as too large
      for (let r = rect.r1; r <= rect.r2; r++) {
        for (let c = rect.c1; c <= rect.c2; c++) {
          const k = r * MAX_COLS + c;
          // The first claim on a position stands (an anchor's own cell is its own through planId).
          if (!owners.has(k)) owners.set(k, p);
        }
      }
    }
  }
  for (const rows of producers.values()) rows.sort((a, b) => a - b);

  // Edges: a computed cell comes after the computed cells whose areas it reads.
  const n = planned.length;
  const indeg = new Int32Array(n);
  const succ = new Map<number, number[]>();
  const selfLoop = new Uint8Array(n);
  const bigBySheet = new Map<number, Planned[]>();
  for (const p of bigProducers) {
    const l = bigBySheet.get(p.sheet);
    if (l) l.push(p);
    else bigBySheet.set(p.sheet, [p]);
  }
  for (const p of planned) {
    const f = formulas[formulaIndex.get(p.cell) as number] as Formula;
    if (!f.info) continue;
    let seen: Set<number> | undefined;
    const link = (from: number) => {
      if (from === p.id) {
        selfLoop[p.id] = 1;
        return;
      }
      seen ??= new Set();
      if (seen.has(from)) return;
      seen.add(from);
      let l = succ.get(from);
      if (!l) succ.set(from, (l = []));
      l.push(p.id);
      indeg[p.id] = (indeg[p.id] as number) + 1;
    };
    eachRead(book, f.info, p.sheet, p.cell.row, p.cell.col, (r) => {
      const width = r.c2 - r.c1 + 1;
      if (width <= 64 || width * 4 < producers.size) {
        for (let c = r.c1; c <= r.c2; c++) linkColumn(producers.get(r.sheet * MAX_COLS + c), r, c);
      } else {
        for (const [k, rows] of producers) {
          if (Math.floor(k / MAX_COLS) !== r.sheet) continue;
          const c = k % MAX_COLS;
          if (c >= r.c1 && c <= r.c2) linkColumn(rows, r, c);
        }
      }
      for (const b of bigBySheet.get(r.sheet) ?? []) {
        const old = b.cell.formula?.ref;
        if (overlaps(b.area, r) || (old && overlaps(old, r))) link(b.id);
      }
      return false;
    });
    function linkColumn(rows: number[] | undefined, r: Rect & { sheet: number }, c: number) {
      if (!rows) return;
      for (let j = lowerBound(rows, r.r1); j < rows.length && (rows[j] as number) <= r.r2; j++) {
        const cell = book.sheets[r.sheet]?.rows[rows[j] as number]?.[c];
        if (cell && cell.planId >= 0) link(cell.planId);
      }
    }
  }
  const order: Planned[] = [];
  const ready: number[] = [];
  for (let i = n - 1; i >= 0; i--) if (indeg[i] === 0 && !selfLoop[i]) ready.push(i);
  const done = new Uint8Array(n);
  const level = new Int32Array(n);
  while (ready.length) {
    const id = ready.pop() as number;
    done[id] = 1;
    order.push(planned[id] as Planned);
    for (const next of succ.get(id) ?? []) {
      const d = (indeg[next] as number) - 1;
      indeg[next] = d;
      if ((level[next] as number) <= (level[id] as number)) level[next] = (level[id] as number) + 1;
      if (d === 0 && !selfLoop[next]) ready.push(next);
    }
  }
  const circular = new Set<number>();
  for (let i = 0; i < n; i++) {
    if (!done[i]) {
      circular.add(i);
      order.push(planned[i] as Planned);
      level[i] = -1;
    }
  }
  return {
    order,
    circular,
    level,
    formulaCells: formulas.length,
    at: (sheet, row, col) => {
      const c = book.sheets[sheet]?.rows[row]?.[col];
      return c && c.planId >= 0 ? planned[c.planId] : undefined;
    },
    owner: (sheet, row, col) => {
      const c = book.sheets[sheet]?.rows[row]?.[col];
      if (c && c.planId >= 0) return planned[c.planId];
      return areaOwners.get(sheet)?.get(row * MAX_COLS + col);
    },
  };
}

function overlaps(a: Rect, b: Rect): boolean {
  return a.r1 <= b.r2 && b.r1 <= a.r2 && a.c1 <= b.c2 && b.c1 <= a.c2;
}

function area(r: Rect): number {
  return (r.r2 - r.r1 + 1) * (r.c2 - r.c1 + 1);
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

/**
 * Long chains of dependent formulas (a running total down a column): instead of more passes, an
 * index of who reads which cell, walked from every changed cell.
 */
function propagateByIndex(book: Book, formulas: Formula[], reason: (Planned["reason"] | undefined)[], markChanged: (i: number) => void, changed: IntervalIndex): void {
  const readers = new Map<number, number[]>();
  const large: { sheet: number; rect: Rect; id: number }[] = [];
  const key = (sheet: number, row: number, col: number) => (sheet * MAX_ROWS + row) * MAX_COLS + col;
  formulas.forEach((f, i) => {
    if (reason[i] || !f.info) return;
    eachRead(book, f.info, f.sheet, f.cell.row, f.cell.col, (r) => {
      if (area(r) <= 64) {
        for (let row = r.r1; row <= r.r2; row++) {
          for (let col = r.c1; col <= r.c2; col++) {
            const k = key(r.sheet, row, col);
            const l = readers.get(k);
            if (l) l.push(i);
            else readers.set(k, [i]);
          }
        }
      } else large.push({ sheet: r.sheet, rect: { r1: r.r1, c1: r.c1, r2: r.r2, c2: r.c2 }, id: i });
      return false;
    });
  });
  const queue: number[] = [];
  formulas.forEach((_, i) => {
    if (reason[i]) queue.push(i);
  });
  const mark = (i: number) => {
    if (reason[i]) return;
    reason[i] = "depends";
    markChanged(i);
    queue.push(i);
  };
  for (;;) {
    while (queue.length) {
      const i = queue.pop() as number;
      const f = formulas[i] as Formula;
      const rects: Rect[] = [{ r1: f.cell.row, c1: f.cell.col, r2: f.cell.row, c2: f.cell.col }];
      const old = f.cell.formula?.ref;
      if (old) rects.push(old);
      for (const rect of rects) {
        if (area(rect) > 1 << 20) {
          for (const [k, l] of readers) if (Math.floor(k / (MAX_ROWS * MAX_COLS)) === f.sheet) for (const x of l) mark(x);
          continue;
        }
        for (let row = rect.r1; row <= rect.r2; row++) for (let col = rect.c1; col <= rect.c2; col++) for (const x of readers.get(key(f.sheet, row, col)) ?? []) mark(x);
      }
    }
    changed.settle();
    let fired = false;
    for (const l of large) {
      if (reason[l.id]) continue;
      if (changed.touches(l.sheet, l.rect.r1, l.rect.c1, l.rect.r2, l.rect.c2)) {
        mark(l.id);
        fired = true;
      }
    }
    if (!fired) break;
  }
}

// ---------------------------------------------------------------------------------------------
// Shapes

type Guess = { shape: Shape; uncertain: boolean };
interface Guessed {
  readonly area: Rect;
  readonly mode: Mode;
  readonly uncertain: boolean;
}
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

/** Trees whose predicted size does not depend on where they sit (no spill operator), by sheet. */
const SHAPE_CACHE = new WeakMap<Node, Map<number, Guess>>();

function predict(
  book: Book,
  f: Formula,
  soil: SoilSignatures,
  idOf: (sheet: number, row: number, col: number) => number | undefined,
  shapes: (Guessed | undefined)[],
  reason: (Planned["reason"] | undefined)[],
  self: number,
): Guessed {
  const formula = f.cell.formula!;
  const at = { r1: f.cell.row, c1: f.cell.col, r2: f.cell.row, c2: f.cell.col };
  const isSoil = f.info ? callsThrough(book, f.info, f.sheet, "soil") : false;
  // A SOIL formula is written as Excel stores add-in formulas, a dynamic array, whether the file
  // had it plain (typed without the add-in) or as a fixed array (LibreOffice drops the marks).
  if (formula.form === "array" && !isSoil) return { area: formula.ref ?? at, mode: "fixed", uncertain: false };
  const spills = formula.form === "dynamic" || (isSoil && (formula.form === "plain" || formula.form === "array"));
  if (!spills || !formula.node) return { area: at, mode: "single", uncertain: false };
  const node = formula.node;
  const cacheable = f.info !== undefined && f.info.spills.length === 0 && !f.info.opaqueSpill && !f.info.dynamic;
  let g = cacheable ? SHAPE_CACHE.get(node)?.get(f.sheet) : undefined;
  if (!g) {
    const visiting = new Set<number>([self]);
    const spillShape = (sheet: number, row: number, col: number): Guess => {
      const id = idOf(sheet, row, col);
      if (id === undefined) return ONE;
      const known = shapes[id];
      if (known) return { shape: { rows: known.area.r2 - known.area.r1 + 1, cols: known.area.c2 - known.area.c1 + 1 }, uncertain: known.uncertain };
      const target = book.sheets[sheet]?.rows[row]?.[col];
      if (!reason[id] || visiting.has(id) || !target?.formula?.node) {
        // Not recomputed: the spill the file records.
        const ref = target?.formula?.ref;
        return ref ? { shape: { rows: ref.r2 - ref.r1 + 1, cols: ref.c2 - ref.c1 + 1 }, uncertain: false } : ONE;
      }
      visiting.add(id);
      const inner = shapeOfNode(target.formula.node, { book, sheet, row, col, arrays: true, soil, spillShape, depth: 0 });
      visiting.delete(id);
      return inner;
    };
    g = shapeOfNode(node, { book, sheet: f.sheet, row: f.cell.row, col: f.cell.col, arrays: true, soil, spillShape, depth: 0 });
    if (cacheable) {
      let m = SHAPE_CACHE.get(node);
      if (!m) SHAPE_CACHE.set(node, (m = new Map()));
      m.set(f.sheet, g);
    }
  }
  if (g.shape.rows === 1 && g.shape.cols === 1 && !g.uncertain) return { area: at, mode: "spill", uncertain: false };
  const r2 = f.cell.row + g.shape.rows - 1;
  const c2 = f.cell.col + g.shape.cols - 1;
  return { area: { r1: f.cell.row, c1: f.cell.col, r2: Math.min(r2, MAX_ROWS - 1), c2: Math.min(c2, MAX_COLS - 1) }, mode: "spill", uncertain: g.uncertain || r2 >= MAX_ROWS || c2 >= MAX_COLS };
}
