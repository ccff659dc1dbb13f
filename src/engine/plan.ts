/**
 * Which cells a recalculation computes, and in what order.
 *
 * The rule: the SOIL cells, and every cell that depends on them (directly, through ranges,
 * defined names or spills), are computed; so is a formula that the file holds without a cached
 * value, with every cell that depends on it. Every other cell keeps the value its file cached, unless the workbook was saved with
 * manual calculation (its cached values may be stale): then every formula is computed. Dependencies are read statically
 * from each formula's tree (a superset is safe: a cell computed needlessly gets Excel's value
 * anyway); structured references read their table's area. A formula whose references are only
 * known when it runs (OFFSET, INDIRECT) is computed whenever the workbook has any SOIL cell, since
 * it might read one, and kept when it read nothing recomputed; so is one whose reads cannot be
 * traced (it does not parse, or holds a 3-D reference or a data table), which becomes an error
 * where the engine cannot compute it.
 *
 * Dynamic-array results spill; their size is predicted here from the shapes of the arguments,
 * so that cells reading a spill are ordered after it and collisions (#SPILL!) are known before
 * anything is written. A result whose size turns out to differ from the prediction is an error.
 *
 * Built for season-size sheets: what a formula reads is derived once per formula tree (a column
 * filled down shares one), changed areas are kept as merged row intervals per column, and no
 * structure per referenced cell is built unless dependency chains are long.
 */
import { Book, Form } from "./book";
import type { Node, RefNode } from "./formula/parser";
import { nativeFunction, shift } from "./formula/evaluate";
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

export const enum Reason {
  Soil = 1,
  Depends = 2,
  Uncached = 3,
  Dynamic = 4,
  /** Reads cannot be traced (it does not parse, or holds a 3-D reference, a data table, …). */
  Untraced = 5,
}

export const enum ModeCode {
  Single = 0,
  Spill = 1,
  Fixed = 2,
}

/**
 * The plan, as column arrays indexed by a planned cell's number (0 … n-1): which sheet and cell,
 * how it is evaluated, why it is computed, and the area it is predicted to fill (from its own
 * cell to r2, c2: spills and fixed ranges start at their anchor).
 */
export interface Plan {
  readonly n: number;
  readonly sheet: Int32Array;
  /** The cell number in its sheet's store. */
  readonly cell: Int32Array;
  /** The formula number in its sheet's store. */
  readonly formula: Int32Array;
  readonly mode: Uint8Array;
  readonly soil: Uint8Array;
  readonly reason: Uint8Array;
  /** The predicted size could not be certain (it depends on data). */
  readonly uncertain: Uint8Array;
  readonly r2: Int32Array;
  readonly c2: Int32Array;
  /** Planned cells in an order where each comes after what it reads (cycles last). */
  readonly order: Int32Array;
  /**
   * Each planned cell's depth in the dependency order (0: reads no computed cell; -1: circular).
   * Cells of one level do not read each other, so a level can be computed in any grouping.
   */
  readonly level: Int32Array;
  readonly circular: Uint8Array;
  /** Formula cells in the workbook. */
  readonly formulaCells: number;
  /** The planned cell at a position, or -1. */
  at(sheet: number, row: number, col: number): number;
  /** The planned cell whose area (spill, fixed range, or the range it covered in the file) holds a position, or -1. */
  owner(sheet: number, row: number, col: number): number;
  /** The planned cell whose multi-cell area (or range it covered in the file) holds a position, or -1. */
  areaOwner(sheet: number, row: number, col: number): number;
  /** The predicted area of a planned cell. */
  area(id: number): Rect;
}

// ---------------------------------------------------------------------------------------------
// What a formula tree reads (derived once per tree)

interface TreeInfo {
  readonly refs: readonly RefNode[];
  readonly names: readonly { readonly name: string; readonly sheet?: string }[];
  /** Anchors read through the spill operator (A1#). */
  readonly spills: readonly RefNode[];
  /** Tables named by structured references (upper case): each reads within its table's area. */
  readonly tables: readonly string[];
  readonly soil: boolean;
  readonly dynamic: boolean;
  /** A spill operator over something that is not a plain reference: reads are not known. */
  readonly opaqueSpill: boolean;
  /** Something whose reads cannot be traced (a 3-D reference, a table-relative [@Col]). */
  readonly opaque: boolean;
}

const TREE_INFO = new WeakMap<Node, TreeInfo>();

function treeInfo(node: Node): TreeInfo {
  const known = TREE_INFO.get(node);
  if (known) return known;
  const refs: RefNode[] = [];
  const names: { name: string; sheet?: string }[] = [];
  const spills: RefNode[] = [];
  const tables: string[] = [];
  let soil = false;
  let dynamic = false;
  let opaqueSpill = false;
  let opaque = false;
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
      case "unsup":
        if (n.table !== undefined) tables.push(n.table.toUpperCase());
        if (n.opaque) opaque = true;
        for (const a of n.args ?? []) stack.push(a);
        break;
      default:
        break;
    }
  }
  const info: TreeInfo = { refs, names, spills, tables, soil, dynamic: dynamic || opaqueSpill, opaqueSpill, opaque };
  TREE_INFO.set(node, info);
  return info;
}

/** A reference at a cell, written into `out`; false when it leaves the sheet or names no sheet. */
function placeRef(book: Book, n: RefNode, sheet: number, row: number, col: number, out: { sheet: number; r1: number; c1: number; r2: number; c2: number }, inName = false): boolean {
  const s = n.sheet === undefined ? sheet : book.sheetIndex(n.sheet);
  if (s === undefined) return false;
  const r1 = n.abs & 1 ? n.r1 : shift(n.r1, row, MAX_ROWS, inName);
  const c1 = n.abs & 2 ? n.c1 : shift(n.c1, col, MAX_COLS, inName);
  const r2 = n.abs & 4 ? n.r2 : shift(n.r2, row, MAX_ROWS, inName);
  const c2 = n.abs & 8 ? n.c2 : shift(n.c2, col, MAX_COLS, inName);
  out.sheet = s;
  out.r1 = Math.max(0, Math.min(r1, r2));
  out.c1 = Math.max(0, Math.min(c1, c2));
  out.r2 = Math.min(MAX_ROWS - 1, Math.max(r1, r2));
  out.c2 = Math.min(MAX_COLS - 1, Math.max(c1, c2));
  return out.r1 <= out.r2 && out.c1 <= out.c2;
}

/**
 * Whether a formula at (sheet,row,col) reads, through the spill operator (A1#), an anchor for which
 * `isAnchor` holds (names followed to a bounded depth); an operator over something that is not a
 * plain reference counts, as its target is not known.
 */
export function readsSpillOf(book: Book, node: Node, sheet: number, row: number, col: number, isAnchor: (sheet: number, row: number, col: number) => boolean, depth = 0): boolean {
  const info = treeInfo(node);
  if (info.opaqueSpill) return true;
  const scratch = { sheet: 0, r1: 0, c1: 0, r2: 0, c2: 0 };
  for (const ref of info.spills) if (placeRef(book, ref, sheet, row, col, scratch) && isAnchor(scratch.sheet, scratch.r1, scratch.c1)) return true;
  if (depth < 32) {
    for (const nm of info.names) {
      const from = nm.sheet === undefined ? sheet : book.sheetIndex(nm.sheet);
      if (from === undefined) continue;
      const d = book.definedName(nm.name, from);
      if (d?.node && readsSpillOf(book, d.node, from, row, col, isAnchor, depth + 1)) return true;
    }
  }
  return false;
}

/**
 * Visits every rectangle a formula reads at (sheet,row,col), names followed (to a bounded depth);
 * stops when `visit` returns true. Returns true when stopped.
 */
function eachRead(book: Book, info: TreeInfo, sheet: number, row: number, col: number, visit: (r: { sheet: number; r1: number; c1: number; r2: number; c2: number }) => boolean, depth = 0): boolean {
  const scratch = { sheet: 0, r1: 0, c1: 0, r2: 0, c2: 0 };
  const inName = depth > 0;
  for (const ref of info.refs) if (placeRef(book, ref, sheet, row, col, scratch, inName) && visit(scratch)) return true;
  for (const ref of info.spills) if (placeRef(book, ref, sheet, row, col, scratch, inName) && visit(scratch)) return true;
  for (const name of info.tables) {
    const t = book.tables.get(name);
    if (!t) continue; // an unknown table counts as untraceable (callsThrough "opaque")
    scratch.sheet = t.sheet;
    scratch.r1 = t.rect.r1;
    scratch.c1 = t.rect.c1;
    scratch.r2 = t.rect.r2;
    scratch.c2 = t.rect.c2;
    if (visit(scratch)) return true;
  }
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

/**
 * Whether a formula calls SOIL, has run-time references, or reads what cannot be traced, through
 * its names too. Untraceable: an opaque construct, a table the workbook does not define, a
 * defined name that cannot be read, or names nested deeper than are followed.
 */
function callsThrough(book: Book, info: TreeInfo, sheet: number, what: "soil" | "dynamic" | "opaque", depth = 0): boolean {
  if (info[what]) return true;
  if (what === "opaque" && info.tables.some((t) => !book.tables.has(t))) return true;
  if (depth >= 32) return what === "opaque" && info.names.length > 0;
  for (const nm of info.names) {
    const from = nm.sheet === undefined ? sheet : book.sheetIndex(nm.sheet);
    if (from === undefined) continue;
    const d = book.definedName(nm.name, from);
    if (what === "opaque" && d && !d.node) return true;
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

const MAX_PASSES = 12;

/** Every formula of the workbook, numbered across sheets. */
interface Formulas {
  readonly n: number;
  readonly sheet: Int32Array;
  /** Formula number within its sheet. */
  readonly local: Int32Array;
  /** First global number of each sheet's formulas. */
  readonly base: Int32Array;
}

function numberFormulas(book: Book): Formulas {
  const base = new Int32Array(book.sheets.length + 1);
  let n = 0;
  book.sheets.forEach((s, i) => {
    base[i] = n;
    n += s.formulas.n;
  });
  base[book.sheets.length] = n;
  const sheet = new Int32Array(n);
  const local = new Int32Array(n);
  let g = 0;
  book.sheets.forEach((s, i) => {
    for (let f = 0; f < s.formulas.n; f++) {
      sheet[g] = i;
      local[g] = f;
      g++;
    }
  });
  return { n, sheet, local, base };
}

/** What a plan starts from, beyond the workbook's own formulas. */
export interface PlanOptions {
  /**
   * Cells whose value will be set from outside (a report's key cell): every formula that reads
   * them, directly or through others, is planned.
   */
  readonly changed?: readonly { readonly sheet: number; readonly rect: Rect }[];
  /**
   * Whether SOIL formulas are computed for their own sake (default true). A report's per-key
   * plan sets false: SOIL cells that do not read a changed cell keep the values computed once.
   */
  readonly soil?: boolean;
}

/** Builds the plan for a workbook. */
export function planRecalc(book: Book, soil: SoilSignatures, options: PlanOptions = {}): Plan {
  const F = numberFormulas(book);
  const nodeOf = (g: number) => book.sheets[F.sheet[g] as number]!.formulas.node[F.local[g] as number];
  const infoOf = (g: number): TreeInfo | undefined => {
    const node = nodeOf(g);
    return node ? treeInfo(node) : undefined;
  };
  const posOf = (g: number) => {
    const sh = book.sheets[F.sheet[g] as number]!;
    const k = sh.formulas.cell[F.local[g] as number] as number;
    return { row: sh.cells.row[k] as number, col: sh.cells.col[k] as number, k };
  };
  const formOf = (g: number) => book.sheets[F.sheet[g] as number]!.formulas.form[F.local[g] as number] as Form;
  const refOf = (g: number) => book.sheets[F.sheet[g] as number]!.formulas.ref.get(F.local[g] as number);
  const cachedOf = (g: number) => {
    const sh = book.sheets[F.sheet[g] as number]!;
    return sh.cells.cached(sh.formulas.cell[F.local[g] as number] as number);
  };
  /** Global formula number at a position, or undefined. */
  const idOf = (sheet: number, row: number, col: number): number | undefined => {
    const sh = book.sheets[sheet];
    if (!sh) return undefined;
    const k = sh.cells.find(row, col);
    if (k < 0) return undefined;
    const f = sh.cells.formula[k] as number;
    return f < 0 ? undefined : (F.base[sheet] as number) + f;
  };
  const reason = new Uint8Array(F.n);
  const shapes: (Guessed | undefined)[] = new Array(F.n);
  const isSoil = new Uint8Array(F.n);
  const shapeOf = (g: number): Guessed => (shapes[g] ??= predict(book, F, g, soil, idOf, shapes, reason, isSoil, infoOf, posOf, formOf, refOf));
  const oldRange = (g: number): Rect | undefined => {
    const form = formOf(g);
    return form === Form.Dynamic || form === Form.Array ? refOf(g) : undefined;
  };

  const changed = new IntervalIndex();
  const markChanged = (g: number) => {
    const sheet = F.sheet[g] as number;
    const sh = shapeOf(g);
    const p = posOf(g);
    changed.add(sheet, { r1: p.row, c1: p.col, r2: p.row + sh.rows - 1, c2: p.col + sh.cols - 1 });
    const old = oldRange(g);
    if (old) changed.add(sheet, old);
  };
  let anySoil = false;
  for (let g = 0; g < F.n; g++) {
    const info = infoOf(g);
    if (info && callsThrough(book, info, F.sheet[g] as number, "soil")) {
      isSoil[g] = 1;
      anySoil = true;
    }
  }
  const soilSeeds = options.soil !== false;
  const seeded = (options.changed?.length ?? 0) > 0;
  for (const c of options.changed ?? []) changed.add(c.sheet, c.rect);
  for (let g = 0; g < F.n; g++) {
    const info = infoOf(g);
    const live = (anySoil && soilSeeds) || seeded;
    if (isSoil[g] && soilSeeds) reason[g] = Reason.Soil;
    // A workbook saved with manual calculation may cache values its inputs no longer give (a pH
    // edited, not recalculated): keeping them would feed stale decisions into the SOIL cells'
    // dependents (IF(G2="Apply lime",…) over a G2 no longer true). Every formula is computed, as
    // Excel computes them all on F9; what the engine cannot compute is an error with its reason.
    else if (live && soilSeeds && book.manualCalc) reason[g] = Reason.Depends;
    // A formula whose reads are only known when it runs, or cannot be traced at all (it does not
    // parse, or holds something opaque), might read a recomputed or changed cell: it is computed,
    // and what the engine cannot compute becomes an error with its reason, never a stale value.
    else if (live && (!info || callsThrough(book, info, F.sheet[g] as number, "opaque"))) reason[g] = Reason.Untraced;
    else if (live && info && callsThrough(book, info, F.sheet[g] as number, "dynamic")) reason[g] = Reason.Dynamic;
    if (reason[g]) markChanged(g);
  }
  // A formula the file holds without a cached value is computed, so what reads it changes too
  // (its readers' cached values were not computed from the value it gets now).
  // (Every such formula is marked before any is predicted: a prediction follows the formulas that
  // are computed.)
  const uncached: number[] = [];
  for (let g = 0; g < F.n; g++) {
    if (reason[g] || cachedOf(g)) continue;
    reason[g] = Reason.Uncached;
    uncached.push(g);
  }
  for (const g of uncached) markChanged(g);

  // Cells reading a changed area change too: pass over the formulas until none is added.
  let passes = 0;
  let added = true;
  const touches = (r: { sheet: number; r1: number; c1: number; r2: number; c2: number }) => changed.touches(r.sheet, r.r1, r.c1, r.r2, r.c2);
  while (added && passes < MAX_PASSES) {
    passes++;
    added = false;
    changed.settle();
    for (let g = 0; g < F.n; g++) {
      if (reason[g]) continue;
      const info = infoOf(g);
      if (!info) continue;
      const p = posOf(g);
      if (eachRead(book, info, F.sheet[g] as number, p.row, p.col, touches)) {
        reason[g] = Reason.Depends;
        markChanged(g);
        added = true;
      }
    }
  }
  if (added) propagateByIndex(book, F, reason, infoOf, posOf, oldRange, markChanged, changed);
  for (let g = 0; g < F.n; g++) if (!reason[g] && !cachedOf(g)) reason[g] = Reason.Uncached;

  // Planned cells, numbered in formula order.
  let n = 0;
  for (let g = 0; g < F.n; g++) if (reason[g]) n++;
  const P = {
    sheet: new Int32Array(n),
    cell: new Int32Array(n),
    formula: new Int32Array(n),
    mode: new Uint8Array(n),
    soil: new Uint8Array(n),
    reason: new Uint8Array(n),
    uncertain: new Uint8Array(n),
    r2: new Int32Array(n),
    c2: new Int32Array(n),
  };
  const areaOwners = new Map<number, Map<number, number>>(); // sheet → (row*MAX_COLS+col) → planned id
  const bigProducers: number[] = [];
  const producers = new Map<number, number[]>(); // sheet*MAX_COLS+col → rows of single-cell producers
  let id = 0;
  for (let g = 0; g < F.n; g++) {
    if (!reason[g]) continue;
    const sheet = F.sheet[g] as number;
    const sh = book.sheets[sheet]!;
    const s = shapeOf(g);
    const pos = posOf(g);
    P.sheet[id] = sheet;
    P.cell[id] = pos.k;
    P.formula[id] = F.local[g] as number;
    P.mode[id] = s.mode === "single" ? ModeCode.Single : s.mode === "spill" ? ModeCode.Spill : ModeCode.Fixed;
    P.soil[id] = isSoil[g] as number;
    P.reason[id] = reason[g] as number;
    P.uncertain[id] = s.uncertain ? 1 : 0;
    const sArea = { r1: pos.row, c1: pos.col, r2: pos.row + s.rows - 1, c2: pos.col + s.cols - 1 };
    P.r2[id] = sArea.r2;
    P.c2[id] = sArea.c2;
    sh.cells.planId[pos.k] = id;
    const old = oldRange(g);
    const regions = [sArea];
    if (old) regions.push(old);
    const multi = regions.some((r) => r.r2 > r.r1 || r.c2 > r.c1);
    if (!multi) {
      const key = sheet * MAX_COLS + pos.col;
      let rows = producers.get(key);
      if (!rows) producers.set(key, (rows = []));
      rows.push(pos.row);
    } else {
      bigProducers.push(id);
      let owners = areaOwners.get(sheet);
      if (!owners) areaOwners.set(sheet, (owners = new Map()));
      for (const rect of regions) {
        if (area(rect) > 1 << 22) continue; // refused later as too large
        for (let r = rect.r1; r <= rect.r2; r++) {
          for (let c = rect.c1; c <= rect.c2; c++) {
            const key = r * MAX_COLS + c;
            // The first claim on a position stands (an anchor's own cell is its own through planId).
            if (!owners.has(key)) owners.set(key, id);
          }
        }
      }
    }
    id++;
  }
  for (const rows of producers.values()) rows.sort((a, b) => a - b);
  const rowOf = (i: number) => book.sheets[P.sheet[i] as number]!.cells.row[P.cell[i] as number] as number;
  const colOf = (i: number) => book.sheets[P.sheet[i] as number]!.cells.col[P.cell[i] as number] as number;
  const areaOf = (i: number): Rect => ({ r1: rowOf(i), c1: colOf(i), r2: P.r2[i] as number, c2: P.c2[i] as number });

  // Edges: a computed cell comes after the computed cells whose areas it reads.
  const indeg = new Int32Array(n);
  const succ = new Map<number, number[]>();
  const selfLoop = new Uint8Array(n);
  const bigBySheet = new Map<number, { id: number; area: Rect; old: Rect | undefined }[]>();
  for (const b of bigProducers) {
    const sheet = P.sheet[b] as number;
    const entry = { id: b, area: areaOf(b), old: oldRange((F.base[sheet] as number) + (P.formula[b] as number)) };
    const l = bigBySheet.get(sheet);
    if (l) l.push(entry);
    else bigBySheet.set(sheet, [entry]);
  }
  for (let i = 0; i < n; i++) {
    const sheet = P.sheet[i] as number;
    const info = infoOf((F.base[sheet] as number) + (P.formula[i] as number));
    if (!info) continue;
    let seen: Set<number> | undefined;
    const link = (from: number) => {
      if (from === i) {
        selfLoop[i] = 1;
        return;
      }
      seen ??= new Set();
      if (seen.has(from)) return;
      seen.add(from);
      let l = succ.get(from);
      if (!l) succ.set(from, (l = []));
      l.push(i);
      indeg[i] = (indeg[i] as number) + 1;
    };
    const linkColumn = (rows: number[] | undefined, r: Rect & { sheet: number }, c: number) => {
      if (!rows) return;
      const cells = book.sheets[r.sheet]!.cells;
      for (let j = lowerBound(rows, r.r1); j < rows.length && (rows[j] as number) <= r.r2; j++) {
        const k = cells.find(rows[j] as number, c);
        if (k >= 0 && (cells.planId[k] as number) >= 0) link(cells.planId[k] as number);
      }
    };
    eachRead(book, info, sheet, rowOf(i), colOf(i), (r) => {
      const width = r.c2 - r.c1 + 1;
      if (width <= 64 || width * 4 < producers.size) {
        for (let c = r.c1; c <= r.c2; c++) linkColumn(producers.get(r.sheet * MAX_COLS + c), r, c);
      } else {
        for (const [key, rows] of producers) {
          if (Math.floor(key / MAX_COLS) !== r.sheet) continue;
          const c = key % MAX_COLS;
          if (c >= r.c1 && c <= r.c2) linkColumn(rows, r, c);
        }
      }
      for (const b of bigBySheet.get(r.sheet) ?? []) if (overlaps(b.area, r) || (b.old && overlaps(b.old, r))) link(b.id);
      return false;
    });
  }
  const order = new Int32Array(n);
  let o = 0;
  const ready: number[] = [];
  for (let i = n - 1; i >= 0; i--) if (indeg[i] === 0 && !selfLoop[i]) ready.push(i);
  const done = new Uint8Array(n);
  const level = new Int32Array(n);
  while (ready.length) {
    const i = ready.pop() as number;
    done[i] = 1;
    order[o++] = i;
    for (const next of succ.get(i) ?? []) {
      const d = (indeg[next] as number) - 1;
      indeg[next] = d;
      if ((level[next] as number) <= (level[i] as number)) level[next] = (level[i] as number) + 1;
      if (d === 0 && !selfLoop[next]) ready.push(next);
    }
  }
  const circular = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    if (!done[i]) {
      circular[i] = 1;
      order[o++] = i;
      level[i] = -1;
    }
  }
  return {
    n,
    ...P,
    order,
    level,
    circular,
    formulaCells: F.n,
    at: (sheet, row, col) => {
      const sh = book.sheets[sheet];
      if (!sh) return -1;
      const k = sh.cells.find(row, col);
      return k < 0 ? -1 : (sh.cells.planId[k] as number);
    },
    owner: (sheet, row, col) => {
      const sh = book.sheets[sheet];
      if (!sh) return -1;
      const k = sh.cells.find(row, col);
      if (k >= 0 && (sh.cells.planId[k] as number) >= 0) return sh.cells.planId[k] as number;
      return areaOwners.get(sheet)?.get(row * MAX_COLS + col) ?? -1;
    },
    areaOwner: (sheet, row, col) => areaOwners.get(sheet)?.get(row * MAX_COLS + col) ?? -1,
    area: areaOf,
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
function propagateByIndex(
  book: Book,
  F: Formulas,
  reason: Uint8Array,
  infoOf: (g: number) => TreeInfo | undefined,
  posOf: (g: number) => { row: number; col: number },
  oldRange: (g: number) => Rect | undefined,
  markChanged: (g: number) => void,
  changed: IntervalIndex,
): void {
  const readers = new Map<number, number[]>();
  const large: { sheet: number; rect: Rect; g: number }[] = [];
  const key = (sheet: number, row: number, col: number) => (sheet * MAX_ROWS + row) * MAX_COLS + col;
  for (let g = 0; g < F.n; g++) {
    const info = infoOf(g);
    if (reason[g] || !info) continue;
    const p = posOf(g);
    eachRead(book, info, F.sheet[g] as number, p.row, p.col, (r) => {
      if (area(r) <= 64) {
        for (let row = r.r1; row <= r.r2; row++) {
          for (let col = r.c1; col <= r.c2; col++) {
            const k = key(r.sheet, row, col);
            const l = readers.get(k);
            if (l) l.push(g);
            else readers.set(k, [g]);
          }
        }
      } else large.push({ sheet: r.sheet, rect: { r1: r.r1, c1: r.c1, r2: r.r2, c2: r.c2 }, g });
      return false;
    });
  }
  const queue: number[] = [];
  for (let g = 0; g < F.n; g++) if (reason[g]) queue.push(g);
  const mark = (g: number) => {
    if (reason[g]) return;
    reason[g] = Reason.Depends;
    markChanged(g);
    queue.push(g);
  };
  for (;;) {
    while (queue.length) {
      const g = queue.pop() as number;
      const sheet = F.sheet[g] as number;
      const p = posOf(g);
      const rects: Rect[] = [{ r1: p.row, c1: p.col, r2: p.row, c2: p.col }];
      const old = oldRange(g);
      if (old) rects.push(old);
      for (const rect of rects) {
        if (area(rect) > 1 << 20) {
          for (const [k, l] of readers) if (Math.floor(k / (MAX_ROWS * MAX_COLS)) === sheet) for (const x of l) mark(x);
          continue;
        }
        for (let row = rect.r1; row <= rect.r2; row++) for (let col = rect.c1; col <= rect.c2; col++) for (const x of readers.get(key(sheet, row, col)) ?? []) mark(x);
      }
    }
    changed.settle();
    let fired = false;
    for (const l of large) {
      if (reason[l.g]) continue;
      if (changed.touches(l.sheet, l.rect.r1, l.rect.c1, l.rect.r2, l.rect.c2)) {
        mark(l.g);
        fired = true;
      }
    }
    if (!fired) break;
  }
}

// ---------------------------------------------------------------------------------------------
// Shapes

type Guess = { shape: Shape; uncertain: boolean };
/** A predicted result: its size from the anchor, how it is evaluated, and whether the size is certain. */
interface Guessed {
  readonly rows: number;
  readonly cols: number;
  readonly mode: Mode;
  readonly uncertain: boolean;
}
const SINGLE: Guessed = { rows: 1, cols: 1, mode: "single", uncertain: false };
const ONE_SPILL: Guessed = { rows: 1, cols: 1, mode: "spill", uncertain: false };
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
  // Too few or too many arguments: the cell is refused when computed; nothing to predict.
  if (args.length < fn.min || args.length > fn.max) return ONE;
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
  F: Formulas,
  g: number,
  soil: SoilSignatures,
  idOf: (sheet: number, row: number, col: number) => number | undefined,
  shapes: (Guessed | undefined)[],
  reason: Uint8Array,
  isSoil: Uint8Array,
  infoOf: (g: number) => TreeInfo | undefined,
  posOf: (g: number) => { row: number; col: number },
  formOf: (g: number) => Form,
  refOf: (g: number) => Rect | undefined,
): Guessed {
  const pos = posOf(g);
  const sheetIdx = F.sheet[g] as number;
  const at = { r1: pos.row, c1: pos.col, r2: pos.row, c2: pos.col };
  const form = formOf(g);
  const soilFormula = isSoil[g] === 1;
  // A SOIL formula is written as Excel stores add-in formulas, a dynamic array, whether the file
  // had it plain (typed without the add-in) or as a fixed array (LibreOffice drops the marks).
  if (form === Form.Array && !soilFormula) {
    const ref = refOf(g) ?? at;
    return { rows: ref.r2 - ref.r1 + 1, cols: ref.c2 - ref.c1 + 1, mode: "fixed", uncertain: false };
  }
  const spills = form === Form.Dynamic || (soilFormula && (form === Form.Plain || form === Form.Array));
  const node = book.sheets[sheetIdx]!.formulas.node[F.local[g] as number];
  if (!spills || !node) return SINGLE;
  const info = infoOf(g);
  const cacheable = info !== undefined && info.spills.length === 0 && !info.opaqueSpill && !info.dynamic;
  let guess = cacheable ? SHAPE_CACHE.get(node)?.get(sheetIdx) : undefined;
  if (!guess) {
    const visiting = new Set<number>([g]);
    const spillShape = (sheet: number, row: number, col: number): Guess => {
      const id = idOf(sheet, row, col);
      if (id === undefined) return ONE;
      const known = shapes[id];
      if (known) return { shape: { rows: known.rows, cols: known.cols }, uncertain: known.uncertain };
      const sh = book.sheets[sheet]!;
      const local = F.local[id] as number;
      const targetNode = sh.formulas.node[local];
      if (!reason[id] || visiting.has(id) || !targetNode) {
        // Not recomputed: the spill the file records.
        const ref = sh.formulas.ref.get(local);
        return ref ? { shape: { rows: ref.r2 - ref.r1 + 1, cols: ref.c2 - ref.c1 + 1 }, uncertain: false } : ONE;
      }
      visiting.add(id);
      const inner = shapeOfNode(targetNode, { book, sheet, row, col, arrays: true, soil, spillShape, depth: 0 });
      visiting.delete(id);
      return inner;
    };
    guess = shapeOfNode(node, { book, sheet: sheetIdx, row: pos.row, col: pos.col, arrays: true, soil, spillShape, depth: 0 });
    if (cacheable) {
      let m = SHAPE_CACHE.get(node);
      if (!m) SHAPE_CACHE.set(node, (m = new Map()));
      m.set(sheetIdx, guess);
    }
  }
  if (guess.shape.rows === 1 && guess.shape.cols === 1 && !guess.uncertain) return ONE_SPILL;
  const r2 = pos.row + guess.shape.rows - 1;
  const c2 = pos.col + guess.shape.cols - 1;
  return {
    rows: Math.min(r2, MAX_ROWS - 1) - pos.row + 1,
    cols: Math.min(c2, MAX_COLS - 1) - pos.col + 1,
    mode: "spill",
    uncertain: guess.uncertain || r2 >= MAX_ROWS || c2 >= MAX_COLS,
  };
}
