/**
 * Evaluates formula trees with Excel 365's semantics. A formula is evaluated in one of two
 * modes, decided by how the file stores it:
 * - array mode (dynamic-array and CSE formulas, and the arguments of array-class parameters such
 *   as SUMPRODUCT's): a range in an operation is taken element by element, results broadcast and
 *   spill;
 * - legacy mode (plain and shared formulas): a range where one value is expected is implicitly
 *   intersected with the formula's row or column, as Excel has always done for such formulas
 *   (Excel 365 shows them with an @).
 * Functions declare each parameter's class (value, reference, array) once; value parameters are
 * lifted over arrays. Every error carries a message when the engine knows why.
 */
import type { Book } from "../book";
import type { Node, RefNode } from "./parser";
import { approxAdd, approxSub, compare, finite, power, toNumber, toText } from "./coerce";
import { MAX_COLS, MAX_ROWS, Scalar, Value, XlArray, XlError, XlRef, XlUnion, err, isError } from "./values";

/**
 * A cell's result that means "the engine cannot compute this", not "Excel would show this
 * error" (written as #VALUE! with the reason in the summary).
 */
export class Uncomputable extends XlError {
  constructor(message: string) {
    super("#VALUE!", message);
  }
}

export { NotComputed, notComputed } from "./not-computed";
import { notComputed } from "./not-computed";

export interface SoilCall {
  (args: (unknown[][] | null)[]): Value;
}

/**
 * Thrown (not returned) when a formula asks for more cells than any workbook needs: a hostile
 * file (a name over a whole sheet fed to a function that takes every cell). The file is refused.
 */
export class ResourceLimit extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ResourceLimit";
  }
}

/** What an evaluation reads from its workbook. */
export interface Host {
  readonly book: Book;
  readonly date1904: boolean;
  /** A cell's value as this evaluation sees it (cached, or computed when the engine recomputes it). */
  value(sheet: number, row: number, col: number): Scalar;
  /** The last row and column (0-based) that can hold a value on a sheet, or -1 when empty. */
  bounds(sheet: number): { readonly rows: number; readonly cols: number };
  /** Visits, row by row, the cells of a rectangle that may hold a value (blank ones may be skipped). */
  forEach(ref: XlRef, fn: (v: Scalar, r: number, c: number) => void): void;
  /** The spilled range of the dynamic-array formula at a cell; an error when the cell is no anchor. */
  spill(sheet: number, row: number, col: number): XlRef | XlError;
  /** Our add-in's functions by canonical name ("SOIL.CEC"), with the bindings' argument shaping. */
  soil(name: string): SoilCall | undefined;
  /** Largest array (in cells) an evaluation may build. */
  readonly maxCells: number;
  /** The time now as a serial number in the workbook's date system (for NOW and TODAY). */
  now(): number;
}

export interface Ctx {
  readonly host: Host;
  readonly sheet: number;
  readonly row: number;
  readonly col: number;
  readonly arrays: boolean;
  readonly depth: number;
}

/** The classes of a function parameter: value (lifted over arrays), reference, array. */
export type ParamClass = "V" | "R" | "A";

export interface NativeFunction {
  readonly min: number;
  readonly max: number;
  /** The class of parameter i (default V). */
  readonly param?: (i: number) => ParamClass;
  /** Called with evaluated arguments (undefined for an omitted one). */
  readonly call?: (args: (Value | undefined)[], ctx: Ctx) => Value;
  /** Called with the unevaluated arguments, for functions that evaluate only what they need (IF). */
  readonly lazy?: (args: readonly Node[], ctx: Ctx) => Value;
  /** Not lifted over arrays even where its V parameters receive one. */
  readonly noLift?: boolean;
  /** The result depends on more than its arguments' cells (OFFSET, INDIRECT, NOW). */
  readonly dynamic?: boolean;
  /** An argument written but left empty (F(1,)) takes the parameter's default, as if not written (see callFunction). */
  readonly emptyAsOmitted?: boolean;
}

let FUNCTIONS: ReadonlyMap<string, NativeFunction> = new Map();

/** Installs the native function table (set once by the function modules' index). */
export function setNativeFunctions(table: ReadonlyMap<string, NativeFunction>): void {
  FUNCTIONS = table;
}
export function nativeFunction(name: string): NativeFunction | undefined {
  return FUNCTIONS.get(name);
}

const MAX_NAME_DEPTH = 64;

// ---------------------------------------------------------------------------------------------
// References

function resolveSheet(name: string | undefined, ctx: Ctx): number | XlError {
  if (name === undefined) return ctx.sheet;
  const i = ctx.host.book.sheetIndex(name);
  return i === undefined ? err("#REF!", `there is no sheet named "${name}"`) : i;
}

/** A reference node at the formula's cell: relative parts shifted, bounds checked. */
/** A relative coordinate moved to where it is used; wrapped around the sheet inside names. */
export function shift(offset: number, at: number, size: number, wrap: boolean): number {
  const v = offset + at;
  return wrap ? ((v % size) + size) % size : v;
}

export function resolveRef(n: RefNode, ctx: Ctx): XlRef | XlError {
  const sheet = resolveSheet(n.sheet, ctx);
  if (isError(sheet)) return sheet;
  // Inside a defined name, relative references wrap around the sheet's edges as Excel's do (a
  // "previous row" name is stored as row 1048576 relative to A1).
  const w = ctx.depth > 0;
  const r1 = n.abs & 1 ? n.r1 : shift(n.r1, ctx.row, MAX_ROWS, w);
  const c1 = n.abs & 2 ? n.c1 : shift(n.c1, ctx.col, MAX_COLS, w);
  const r2 = n.abs & 4 ? n.r2 : shift(n.r2, ctx.row, MAX_ROWS, w);
  const c2 = n.abs & 8 ? n.c2 : shift(n.c2, ctx.col, MAX_COLS, w);
  if (r1 < 0 || c1 < 0 || r2 >= MAX_ROWS || c2 >= MAX_COLS || r2 < 0 || c2 < 0 || r1 >= MAX_ROWS || c1 >= MAX_COLS) {
    return err("#REF!", "the reference moves off the sheet");
  }
  return new XlRef(sheet, Math.min(r1, r2), Math.min(c1, c2), Math.max(r1, r2), Math.max(c1, c2));
}

/** The values of a reference as an array (blank cells as null). */
export function derefArray(ref: XlRef, ctx: Ctx): XlArray | XlError {
  const rows = ref.rows;
  const cols = ref.cols;
  if (rows * cols > ctx.host.maxCells) {
    throw new ResourceLimit(`a formula asks for a range of ${rows}×${cols} cells, more than the ${ctx.host.maxCells} cells soilcell takes in one formula; refused`);
  }
  const b = ctx.host.bounds(ref.sheet);
  const data: Scalar[] = new Array(rows * cols).fill(null);
  const rEnd = Math.min(ref.r2, b.rows);
  const cEnd = Math.min(ref.c2, b.cols);
  for (let r = ref.r1; r <= rEnd; r++) {
    for (let c = ref.c1; c <= cEnd; c++) data[(r - ref.r1) * cols + (c - ref.c1)] = ctx.host.value(ref.sheet, r, c);
  }
  return new XlArray(rows, cols, data);
}

/** Visits the cells of a reference that may hold a value (the sheet's used area), row by row. */
export function eachCell(ref: XlRef, ctx: Ctx, fn: (v: Scalar, r: number, c: number) => void): void {
  ctx.host.forEach(ref, fn);
}

/** Implicit intersection: the one cell of a range in the formula's row or column. */
export function intersect(ref: XlRef, ctx: Ctx): Scalar {
  // Stryker disable next-line ConditionalExpression: equivalent for false: a fast path; a one-cell range intersects to its cell below too
  if (ref.isCell) return ctx.host.value(ref.sheet, ref.r1, ref.c1);
  let r: number;
  let c: number;
  if (ref.r1 === ref.r2) r = ref.r1;
  else if (ctx.row >= ref.r1 && ctx.row <= ref.r2) r = ctx.row;
  else return err("#VALUE!", "the range does not share a row with the formula's cell (implicit intersection)");
  if (ref.c1 === ref.c2) c = ref.c1;
  else if (ctx.col >= ref.c1 && ctx.col <= ref.c2) c = ctx.col;
  else return err("#VALUE!", "the range does not share a column with the formula's cell (implicit intersection)");
  return ctx.host.value(ref.sheet, r, c);
}

/** A value where one value is expected: references become their values (intersected in legacy mode). */
export function toValue(v: Value, ctx: Ctx): Scalar | XlArray {
  if (v instanceof XlRef) {
    if (ctx.arrays) {
      if (v.isCell) return ctx.host.value(v.sheet, v.r1, v.c1);
      return derefArray(v, ctx);
    }
    return intersect(v, ctx);
  }
  if (v instanceof XlUnion) return err("#VALUE!", "a union of ranges cannot be used as a value");
  return v;
}

/** A value as an array (a scalar is 1×1; references are read whole). */
export function toArray(v: Value, ctx: Ctx): XlArray | XlError {
  if (v instanceof XlArray) return v;
  if (v instanceof XlRef) return derefArray(v, ctx);
  if (v instanceof XlUnion) return err("#VALUE!", "a union of ranges cannot be used as an array");
  return new XlArray(1, 1, [v]);
}

/** The top-left scalar of any value (what a cell shows when a legacy formula returns an array). */
export function firstScalar(v: Value, ctx: Ctx): Scalar {
  if (v instanceof XlArray) return v.rows && v.cols ? v.at(0, 0) : err("#VALUE!", "an empty array");
  if (v instanceof XlRef) return ctx.arrays ? ctx.host.value(v.sheet, v.r1, v.c1) : intersect(v, ctx);
  if (v instanceof XlUnion) return err("#VALUE!", "a union of ranges cannot be used as a value");
  return v;
}

// ---------------------------------------------------------------------------------------------
// Broadcasting

/** Excel's array broadcast: a one-row or one-column array repeats; elements beyond a smaller array are #N/A. */
export function broadcastShape(values: readonly (Scalar | XlArray)[]): { rows: number; cols: number } | undefined {
  let rows = 0;
  let cols = 0;
  let any = false;
  for (const v of values) {
    if (v instanceof XlArray) {
      any = true;
      rows = Math.max(rows, v.rows);
      cols = Math.max(cols, v.cols);
    }
  }
  return any ? { rows, cols } : undefined;
}

const NA_BEYOND = err("#N/A", "the arrays differ in size; this element has no partner");

export function elementAt(v: Scalar | XlArray, r: number, c: number): Scalar {
  if (!(v instanceof XlArray)) return v;
  const rr = v.rows === 1 ? 0 : r;
  const cc = v.cols === 1 ? 0 : c;
  if (rr >= v.rows || cc >= v.cols) return NA_BEYOND;
  return v.at(rr, cc);
}

/** Applies a scalar function element by element over broadcast arguments. */
export function lift(values: readonly (Scalar | XlArray)[], fn: (args: Scalar[]) => Scalar, ctx: Ctx): Scalar | XlArray {
  const shape = broadcastShape(values);
  if (!shape) return fn(values as Scalar[]);
  if (shape.rows * shape.cols > ctx.host.maxCells) {
    throw new ResourceLimit(`a formula builds an array of ${shape.rows}×${shape.cols} cells, more than the ${ctx.host.maxCells} cells soilcell takes in one formula; refused`);
  }
  // Stryker disable next-line ArrayDeclaration: equivalent: the loops below assign every index, so the length given up front changes nothing
  const data: Scalar[] = new Array(shape.rows * shape.cols);
  // Stryker disable next-line ArrayDeclaration: equivalent: each element assigns every index before the call
  const args: Scalar[] = new Array(values.length);
  for (let r = 0; r < shape.rows; r++) {
    for (let c = 0; c < shape.cols; c++) {
      for (let i = 0; i < values.length; i++) args[i] = elementAt(values[i] as Scalar | XlArray, r, c);
      data[r * shape.cols + c] = fn(args);
    }
  }
  return new XlArray(shape.rows, shape.cols, data);
}

// ---------------------------------------------------------------------------------------------
// Operators

function arithmetic(op: string, a: Scalar, b: Scalar): Scalar {
  if (isError(a)) return a;
  if (isError(b)) return b;
  const x = toNumber(a);
  if (isError(x)) return x;
  const y = toNumber(b);
  if (isError(y)) return y;
  switch (op) {
    case "+":
      return finite(approxAdd(x, y));
    case "-":
      return finite(approxSub(x, y));
    case "*":
      return finite(x * y);
    case "/":
      return y === 0 ? err("#DIV/0!", "division by zero") : finite(x / y);
    case "^":
      return power(x, y);
  }
  return err("#VALUE!", `unknown operator ${op}`);
}

function binaryScalar(op: string, a: Scalar, b: Scalar): Scalar {
  if (op === "&") {
    // toText of an error is that error, so the left operand's error comes first, then the right's.
    const x = toText(a);
    if (isError(x)) return x;
    const y = toText(b);
    if (isError(y)) return y;
    const s = x + y;
    return s.length > 32767 ? err("#VALUE!", "text longer than 32,767 characters") : s;
  }
  if (op === "=" || op === "<>" || op === "<" || op === ">" || op === "<=" || op === ">=") {
    const c = compare(a, b);
    if (isError(c)) return c;
    switch (op) {
      case "=":
        return c === 0;
      case "<>":
        return c !== 0;
      case "<":
        return c < 0;
      case ">":
        return c > 0;
      case "<=":
        return c <= 0;
      default:
        return c >= 0;
    }
  }
  return arithmetic(op, a, b);
}

// ---------------------------------------------------------------------------------------------
// The evaluator

/**
 * Evaluates a node. With `wantRef` a reference-valued expression returns its reference;
 * otherwise references become values (arrays in array mode, intersected scalars in legacy mode).
 */
export function ev(n: Node, ctx: Ctx, wantRef: boolean): Value {
  switch (n.k) {
    case "num":
      return n.v;
    // Stryker disable next-line ConditionalExpression: equivalent: an emptied case falls through to "bool", which returns n.v as well
    case "str":
      return n.v;
    case "bool":
      return n.v;
    case "err":
      return err(n.v);
    case "arr":
      return n.v;
    case "miss":
      return null;
    case "unsup":
      return notComputed(`${n.what} is not computed headless`);
    case "ref": {
      const r = resolveRef(n, ctx);
      // Stryker disable next-line ConditionalExpression: equivalent: toValue of an error is that error, and wantRef returns r either way
      if (isError(r)) return r;
      return wantRef ? r : toValue(r, ctx);
    }
    case "name":
      return evalName(n.name, n.sheet, ctx, wantRef);
    case "fn": {
      const v = callFunction(n.name, n.args, ctx);
      // Stryker disable next-line ConditionalExpression: equivalent: every caller of ev(…, false) reads the result with toValue or toArray, which read a returned reference as this does
      return wantRef || !(v instanceof XlRef || v instanceof XlUnion) ? v : toValue(v, ctx);
    }
    case "plus":
      return ev(n.x, ctx, wantRef);
    case "neg": {
      // Stryker disable next-line BooleanLiteral: equivalent: toValue reads a reference as ev would
      const x = toValue(ev(n.x, ctx, false), ctx);
      return lift([x], ([a]) => {
        const v = toNumber(a as Scalar);
        return isError(v) ? v : v === 0 ? 0 : -v;
      }, ctx);
    }
    case "pct": {
      // Stryker disable next-line BooleanLiteral: equivalent: toValue reads a reference as ev would
      const x = toValue(ev(n.x, ctx, false), ctx);
      return lift([x], ([a]) => {
        const v = toNumber(a as Scalar);
        return isError(v) ? v : v / 100;
      }, ctx);
    }
    case "bin": {
      // Stryker disable next-line BooleanLiteral: equivalent: toValue reads a reference as ev would
      const a = toValue(ev(n.a, ctx, false), ctx);
      // Stryker disable next-line BooleanLiteral: equivalent: toValue reads a reference as ev would
      const b = toValue(ev(n.b, ctx, false), ctx);
      // Stryker disable next-line ConditionalExpression: equivalent: a fast path; lift over two scalars calls binaryScalar once with them
      if (!(a instanceof XlArray) && !(b instanceof XlArray)) return binaryScalar(n.op, a, b);
      return lift([a, b], ([x, y]) => binaryScalar(n.op, x as Scalar, y as Scalar), ctx);
    }
    case "at": {
      const v = ev(n.x, ctx, true);
      if (v instanceof XlRef) return intersect(v, ctx);
      return firstScalar(v, ctx);
    }
    case "spill": {
      const v = ev(n.x, ctx, true);
      if (isError(v)) return v;
      if (!(v instanceof XlRef) || !v.isCell) return err("#REF!", "the spill operator # needs a single cell that holds a spilling formula");
      const s = ctx.host.spill(v.sheet, v.r1, v.c1);
      // Stryker disable next-line ConditionalExpression: equivalent: toValue of an error is that error; a spilled range returned as a reference is read by every ev(…, false) caller's toValue as here
      if (isError(s)) return s;
      return wantRef ? s : toValue(s, ctx);
    }
    case "range": {
      const a = ev(n.a, ctx, true);
      if (isError(a)) return a;
      const b = ev(n.b, ctx, true);
      if (isError(b)) return b;
      if (!(a instanceof XlRef) || !(b instanceof XlRef)) return err("#VALUE!", "the range operator : needs references on both sides");
      if (a.sheet !== b.sheet) return err("#VALUE!", "the two sides of a range are on different sheets");
      const r = new XlRef(a.sheet, Math.min(a.r1, b.r1), Math.min(a.c1, b.c1), Math.max(a.r2, b.r2), Math.max(a.c2, b.c2));
      return wantRef ? r : toValue(r, ctx);
    }
    case "isect": {
      const a = ev(n.a, ctx, true);
      if (isError(a)) return a;
      const b = ev(n.b, ctx, true);
      if (isError(b)) return b;
      if (!(a instanceof XlRef) || !(b instanceof XlRef)) return err("#VALUE!", "the intersection operator needs references on both sides");
      if (a.sheet !== b.sheet) return err("#NULL!", "the ranges are on different sheets");
      const r1 = Math.max(a.r1, b.r1);
      const c1 = Math.max(a.c1, b.c1);
      const r2 = Math.min(a.r2, b.r2);
      const c2 = Math.min(a.c2, b.c2);
      if (r1 > r2 || c1 > c2) return err("#NULL!", "the ranges do not intersect");
      const r = new XlRef(a.sheet, r1, c1, r2, c2);
      return wantRef ? r : toValue(r, ctx);
    }
    case "union": {
      const refs: XlRef[] = [];
      for (const item of n.items) {
        const v = ev(item, ctx, true);
        if (isError(v)) return v;
        if (v instanceof XlRef) refs.push(v);
        else if (v instanceof XlUnion) refs.push(...v.refs);
        else return err("#VALUE!", "a union (A1,B2) takes references only");
      }
      return new XlUnion(refs);
    }
  }
}

function evalName(name: string, sheetName: string | undefined, ctx: Ctx, wantRef: boolean): Value {
  let from = ctx.sheet;
  // Stryker disable next-line ConditionalExpression: equivalent: resolveSheet of no name is ctx.sheet
  if (sheetName !== undefined) {
    const s = resolveSheet(sheetName, ctx);
    if (isError(s)) return s;
    from = s;
  }
  const d = ctx.host.book.definedName(name, from);
  if (!d) return err("#NAME?", `there is no defined name "${name}"`);
  if (d.syntaxError || !d.node) return notComputed(`the defined name "${name}" cannot be read headless (${d.syntaxError ?? "no formula"})`);
  if (ctx.depth > MAX_NAME_DEPTH) return err("#NAME?", `the defined name "${name}" refers to itself`);
  // A name's formula is evaluated where it is used: relative references shift from A1.
  const inner: Ctx = { ...ctx, depth: ctx.depth + 1 };
  return ev(d.node, inner, wantRef);
}

function paramClass(fn: NativeFunction, i: number): ParamClass {
  return fn.param ? fn.param(i) : "V";
}

/** Evaluates one argument by its parameter class. */
export function evalArg(node: Node, cls: ParamClass, ctx: Ctx): Value | undefined {
  if (node.k === "miss") return undefined;
  // Stryker disable next-line BooleanLiteral: equivalent: toValue reads a reference as ev would
  if (cls === "V") return toValue(ev(node, ctx, false), ctx);
  if (cls === "R") return ev(node, ctx, true);
  return ev(node, ctx.arrays ? ctx : { ...ctx, arrays: true }, true);
}

/** "ABS takes 1 arguments, not 2; not computed headless": the refusal of a call with a wrong argument count. */
function arityMessage(name: string, fn: NativeFunction, given: number): string {
  const range = fn.min === fn.max ? `${fn.min}` : fn.max === Infinity ? `at least ${fn.min}` : `${fn.min} to ${fn.max}`;
  return `${name} takes ${range} arguments, not ${given}; not computed headless`;
}

const ARITY = new WeakMap<Node, string | undefined>();

/**
 * The first call in a formula with a wrong number of arguments for a native function, said as a
 * refusal, or undefined. Checked over the whole formula before it is computed, so a call in a
 * branch not taken (CHOOSE(1,FALSE,CODE())) refuses the cell too: Excel does not accept the formula.
 */
export function arityProblem(n: Node): string | undefined {
  // Stryker disable next-line ConditionalExpression: equivalent for false: a memo; the same tree gives the same answer again
  if (ARITY.has(n)) return ARITY.get(n);
  let out: string | undefined;
  const kids: Node[] = [];
  switch (n.k) {
    case "fn": {
      const fn = FUNCTIONS.get(n.name);
      if (fn && (n.args.length < fn.min || n.args.length > fn.max)) out = arityMessage(n.name, fn, n.args.length);
      kids.push(...n.args);
      break;
    }
    case "neg":
    case "plus":
    case "at":
    case "pct":
    case "spill":
      kids.push(n.x);
      break;
    case "bin":
    case "range":
    case "isect":
      kids.push(n.a, n.b);
      break;
    case "union":
      kids.push(...n.items);
      break;
    default:
      break;
  }
  for (const c of kids) out ??= arityProblem(c);
  ARITY.set(n, out);
  return out;
}

function callFunction(name: string, argNodes: readonly Node[], ctx: Ctx): Value {
  const soil = ctx.host.soil(name);
  if (soil) return callSoil(soil, argNodes, ctx);
  const fn = FUNCTIONS.get(name);
  if (!fn) {
    if (name.startsWith("SOIL.")) return err("#NAME?", `${name} is not a SOIL function`);
    return notComputed(`${name} is not computed headless`);
  }
  if (argNodes.length < fn.min || argNodes.length > fn.max) {
    // Excel does not accept such a formula, so what it shows for one in a file is not known; an
    // error value here would be swallowed by IFERROR, ISERR or COUNT into a number.
    return notComputed(arityMessage(name, fn, argNodes.length));
  }
  if (fn.lazy) return fn.lazy(argNodes, ctx);
  // An argument written but left empty (VLOOKUP(x,t,2,), LEFT(s,)) reaches a value parameter as
  // a blank, read as 0, FALSE or "" as Excel reads it: an exact match, no characters. Only an
  // argument not written at all takes the function's default (undefined here).
  const args = argNodes.map((a, i) => (a.k === "miss" && !fn.emptyAsOmitted && paramClass(fn, i) === "V" ? null : evalArg(a, paramClass(fn, i), ctx)));
  const call = fn.call as NonNullable<NativeFunction["call"]>;
  if (fn.noLift) return call(args, ctx);
  // Lift over arrays given to value parameters.
  let lifted = false;
  // Stryker disable next-line EqualityOperator: equivalent: args[args.length] is undefined, not an array
  for (let i = 0; i < args.length; i++) if (args[i] instanceof XlArray && paramClass(fn, i) === "V") lifted = true;
  if (!lifted) return call(args, ctx);
  const vIndex = args.map((_, i) => paramClass(fn, i) === "V");
  const values = args.map((a, i) => (vIndex[i] ? ((a ?? null) as Scalar | XlArray) : null));
  const omitted = args.map((a) => a === undefined);
  return lift(
    values.filter((_, i) => vIndex[i]),
    (scalars) => {
      let k = 0;
      const each = args.map((a, i) => (vIndex[i] ? (omitted[i] ? undefined : (scalars[k++] as Scalar)) : a));
      return firstScalar(call(each, ctx), ctx);
    },
    ctx,
  );
}

/** Our add-in's functions: every argument in array mode, passed as rows of cells as Excel passes them. */
function callSoil(soil: SoilCall, argNodes: readonly Node[], ctx: Ctx): Value {
  const actx = ctx.arrays ? ctx : { ...ctx, arrays: true };
  const args: (unknown[][] | null)[] = [];
  for (const a of argNodes) {
    if (a.k === "miss") {
      args.push(null);
      continue;
    }
    // Stryker disable next-line BooleanLiteral: equivalent: toArray reads a returned reference as ev would
    const v = ev(a, actx, false);
    if (v instanceof XlUnion) return err("#VALUE!", "a SOIL function does not take a union of ranges");
    const arr = toArray(v as Scalar | XlArray | XlRef, actx);
    if (isError(arr)) return arr;
    const grid: unknown[][] = [];
    for (let r = 0; r < arr.rows; r++) {
      // Stryker disable next-line ArrayDeclaration: equivalent: the loop fills every index
      const row: unknown[] = new Array(arr.cols);
      for (let c = 0; c < arr.cols; c++) {
        const x = arr.data[r * arr.cols + c];
        // Stryker disable next-line ConditionalExpression: equivalent: the bindings read null and "" alike, as a blank cell (isBlank in src/functions/_binding.ts); "" is what Excel passes
        row[c] = x === null ? "" : x; // Excel passes an empty cell to a custom function as ""
      }
      grid.push(row);
    }
    args.push(grid);
  }
  return soil(args);
}

/** Evaluates a thunk argument of a lazy function (IF's branches), as a value or reference. */
export function evalLazy(node: Node | undefined, ctx: Ctx, wantRef: boolean): Value {
  // A "miss" node (an argument left empty) evaluates to null through ev as well.
  // Stryker disable next-line ConditionalExpression: equivalent: the callers (IFERROR, IFNA) take exactly 2 arguments, so the node is always there
  if (!node) return null;
  return ev(node, ctx, wantRef);
}

export { MAX_ROWS, MAX_COLS };
