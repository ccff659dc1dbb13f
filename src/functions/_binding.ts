/**
 * The binding layer, written once and used by every SOIL function: argument shaping only.
 *
 * - every broadcast argument takes one value or a range; ranges pair element by element, a single
 *   value pairs with every element, any other mismatch is #VALUE! naming both shapes;
 * - blank in, blank out (a blank element of a numeric argument gives a blank result);
 * - omitted optional arguments arrive as null (Excel) or undefined (engine) and take the default;
 * - numeric text ("12.5") is accepted, other text is NOT_A_NUMBER;
 * - core SoilErrors become host errors through one factory (CustomFunctions.Error in Excel, the
 *   engine's own error value headless), with the code mapped once by `errorKindOf`.
 */
import { SoilError, errorKindOf, isSoilError, SpreadsheetErrorKind } from "../core/errors";
import { notANumberHint, numericText } from "../core/validate";

/** What a host puts in one cell of an argument. */
export type Cell = number | string | boolean | null | undefined | object;
/** A range as hosts pass it: rows of cells. */
export type Grid = Cell[][];
/** An argument: a range, a single value, or nothing (omitted). */
export type Arg = Grid | Cell;
/** What a binding returns: rows of values; "" is a blank result. */
export type Out = unknown[][];

/** Creates and recognises host error values. */
export interface HostErrors {
  make(kind: SpreadsheetErrorKind, message: string): object;
  is(value: unknown): boolean;
}

/** The error value used outside Excel until a host installs its own factory. */
export class PlainHostError {
  constructor(
    readonly kind: SpreadsheetErrorKind,
    readonly message: string,
  ) {}
}

const plainErrors: HostErrors = {
  make: (kind, message) => new PlainHostError(kind, message),
  is: (v) => v instanceof PlainHostError,
};

/** In Excel's runtime, errors are CustomFunctions.Error with the matching code. */
function excelErrors(): HostErrors | undefined {
  if (typeof CustomFunctions === "undefined") return undefined;
  return {
    make: (kind, message) =>
      new CustomFunctions.Error(
        kind === "#N/A" ? CustomFunctions.ErrorCode.notAvailable : CustomFunctions.ErrorCode.invalidValue,
        message,
      ),
    is: (v) => v instanceof CustomFunctions.Error,
  };
}

let hostErrors: HostErrors | undefined;

function errors(): HostErrors {
  if (!hostErrors) hostErrors = excelErrors() ?? plainErrors;
  return hostErrors;
}

/** Lets a host (the headless engine, a test) choose how errors are represented. */
export function setHostErrors(factory: HostErrors): void {
  hostErrors = factory;
}

export function hostErrorFor(e: unknown): object {
  if (isSoilError(e)) return errors().make(errorKindOf(e.code), e.message);
  const detail = e instanceof Error ? e.message : String(e);
  return errors().make("#VALUE!", `internal error: ${detail}`);
}

// ---------------------------------------------------------------------------------------------
// Parameter declarations

interface ParamBase {
  readonly name: string;
  /** For a required argument: what to give, appended to "<name> is required". */
  readonly need?: string;
  /**
   * For an argument the function needs although Excel's metadata lists it as optional (an
   * optional argument comes before it, and Excel allows no required one after): when it is
   * needed, in words, for the help page. Left out, core refuses with a message saying what to give.
   */
  readonly needed?: string;
}
export interface NumParam extends ParamBase {
  readonly kind: "number";
  readonly optional: boolean;
  readonly default?: number;
  /**
   * "not measured": a blank cell (or empty text) reaches core as omitted, a reading the lab did
   * not make, instead of giving a blank result (the screen then lists the check as not made).
   */
  readonly blank?: "not measured";
}
export interface TextParam extends ParamBase {
  readonly kind: "text";
  readonly optional: boolean;
  readonly default?: string;
  /** "number or word": a number or one of the function's words (a factor or its name), passed to core as text. */
  readonly accepts?: "number or word";
}
/** A whole range taken as one value (a calibration table, a list of limits); not broadcast. */
export interface RangeParam extends ParamBase {
  readonly kind: "range";
  readonly optional: boolean;
}
/**
 * A cell read by the function itself, number or text as it stands (a lab's "<0.05", "12,5"):
 * broadcast like a number, blank in blank out, but text is not refused here.
 */
export interface CellParam extends ParamBase {
  readonly kind: "cell";
  readonly optional: false;
}
export type Param = NumParam | TextParam | RangeParam | CellParam;

export const num = (name: string) => ({ kind: "number", name, optional: false }) as const satisfies NumParam;
/** Optional number; omitted gives `dflt` (or undefined, for core to apply its own method default). */
export const optNum = (name: string, dflt?: number) =>
  ({ kind: "number", name, optional: true, default: dflt }) as const satisfies NumParam;
/** Required text; `need` says what to give when it is missing (e.g. the accepted units). */
export const text = (name: string, need?: string) => ({ kind: "text", name, optional: false, need }) as const satisfies TextParam;
export const optText = (name: string, dflt?: string) =>
  ({ kind: "text", name, optional: true, default: dflt }) as const satisfies TextParam;
/** Optional in Excel's metadata (it follows an optional argument) but needed by the function: `when` says when, for help. */
export const neededText = (name: string, when: string) =>
  ({ kind: "text", name, optional: true, needed: when }) as const satisfies TextParam;
/** An optional number or word (a factor or a named factor); `needed` as for neededText. */
export const optNumOrWord = (name: string, needed?: string) =>
  ({ kind: "text", name, optional: true, accepts: "number or word", ...(needed ? { needed } : {}) }) as const satisfies TextParam;
/** An optional reading whose blank cell means "not measured", not a blank result. */
export const optMeasured = (name: string) => ({ kind: "number", name, optional: true, blank: "not measured" }) as const satisfies NumParam;
export const cell = (name: string) => ({ kind: "cell", name, optional: false }) as const satisfies CellParam;
export const range = (name: string, need?: string) => ({ kind: "range", name, optional: false, need }) as const satisfies RangeParam;
export const optRange = (name: string) => ({ kind: "range", name, optional: true }) as const satisfies RangeParam;

/** A range argument as core sees it: rows of numbers, strings or null (blank). */
export type RangeValue = (number | string | boolean | null)[][];

type ValueOf<P> = P extends NumParam
  ? P["optional"] extends false
    ? number
    : number | undefined
  : P extends TextParam
    ? P["optional"] extends false
      ? string
      : string | undefined
    : P extends RangeParam
      ? P["optional"] extends false
        ? RangeValue
        : RangeValue | undefined
      : P extends CellParam
        ? number | string
        : never;

export type ElementValues<Ps extends readonly Param[]> = { -readonly [K in keyof Ps]: ValueOf<Ps[K]> };

/** One element's result: a number, a text, or null for blank. */
export type ElementResult = number | string | null;

export interface BindingSpec {
  readonly params: readonly Param[];
  readonly element: (...values: never[]) => ElementResult;
  /**
   * The same computation over many elements at once (a core column kernel), given for each
   * parameter either a column of numbers (one per element) or the one value every element shares;
   * returns a number or a SoilError per element, exactly as `element` would.
   */
  readonly column?: ColumnKernel;
}

/** A column kernel: per parameter a Float64Array (one number per element) or a shared value; the element count. */
export type ColumnKernel = (values: unknown[], n: number) => { readonly values: Float64Array; readonly errors: Map<number, SoilError> };

const SPECS = new WeakMap<Function, BindingSpec>();

/**
 * Declares a binding's parameters and the per-element core call, and returns the function that
 * shapes Excel arguments into those calls. Keep the exported JSDoc function a one-liner that
 * calls it, so the declaration Excel reads and the one the engine reads stay the same object.
 */
export function declare<const Ps extends readonly Param[]>(
  binding: Function,
  params: Ps,
  element: (...values: ElementValues<Ps>) => ElementResult,
  column?: ColumnKernel,
): (args: ArrayLike<unknown>) => Out {
  const spec: BindingSpec = column ? { params, element: element as BindingSpec["element"], column } : { params, element: element as BindingSpec["element"] };
  SPECS.set(binding, spec);
  return (args) => {
    // An indexed copy: Array.from walks an `arguments` object through its iterator, which cost
    // more than the rest of a one-cell call's shaping.
    // Stryker disable next-line ArrayDeclaration: equivalent: the loop assigns every index, so the length given up front changes nothing
    const list = new Array<unknown>(args.length);
    for (let i = 0; i < args.length; i++) list[i] = args[i];
    return run(spec, list);
  };
}

/** The declaration behind a binding function (for the engine and the tests). */
export function specOf(binding: Function): BindingSpec | undefined {
  return SPECS.get(binding);
}

// ---------------------------------------------------------------------------------------------
// Shapes

export interface Shape {
  readonly rows: number;
  readonly cols: number;
}

function isGrid(a: unknown): a is Grid {
  return Array.isArray(a) && a.every((row) => Array.isArray(row));
}

function gridOf(a: Arg): Grid {
  if (isGrid(a)) return a;
  return [[a as Cell]];
}

export function shapeOf(grid: Grid): Shape {
  return { rows: grid.length, cols: grid.length ? (grid[0] as Cell[]).length : 0 };
}

const fmt = (s: Shape) => `${s.rows}×${s.cols}`;

/**
 * The broadcast shape of several argument shapes: all equal, or 1×1 against any shape.
 * Returns an error message naming the two shapes that do not pair.
 */
export function broadcastShape(shapes: readonly { name: string; shape: Shape }[]): Shape | { error: string } {
  let out: { name: string; shape: Shape } | undefined;
  for (const s of shapes) {
    if (s.shape.rows === 1 && s.shape.cols === 1) continue;
    if (!out) {
      out = s;
      continue;
    }
    if (s.shape.rows !== out.shape.rows || s.shape.cols !== out.shape.cols) {
      return {
        error: `${out.name} is ${fmt(out.shape)} but ${s.name} is ${fmt(s.shape)}; ranges must have the same shape, or be a single cell`,
      };
    }
  }
  return out ? out.shape : { rows: 1, cols: 1 };
}

// ---------------------------------------------------------------------------------------------
// Cells

export function isBlank(c: unknown): boolean {
  return c === null || c === undefined || (typeof c === "string" && c.trim() === "");
}

/** A cell as a number; numeric text is accepted. Throws NOT_A_NUMBER otherwise. */
export function numberOfCell(c: unknown, name: string): number {
  if (typeof c === "number") {
    if (!Number.isFinite(c)) throw new SoilError("NOT_A_NUMBER", `${name} is not a finite number`);
    return c;
  }
  if (typeof c === "string") {
    const n = numericText(c);
    if (n !== undefined) return n;
    throw new SoilError("NOT_A_NUMBER", `${name}: "${c}" is not a number${notANumberHint(c)}`);
  }
  throw new SoilError("NOT_A_NUMBER", `${name}: ${String(c)} is not a number`);
}

function textOfCell(c: unknown, name: string): string {
  if (typeof c === "string") return c.trim();
  if (typeof c === "number") return String(c);
  throw new SoilError("NOT_A_NUMBER", `${name} must be text (got ${String(c)})`);
}

function rangeValueOf(a: Arg, name: string): RangeValue {
  return gridOf(a).map((row) =>
    row.map((c) => {
      if (isBlank(c)) return null;
      if (typeof c === "number" || typeof c === "string" || typeof c === "boolean") return c;
      if (errors().is(c)) throw new SoilError("NOT_A_NUMBER", `${name} holds an error value`);
      throw new SoilError("NOT_A_NUMBER", `${name} holds a value that is neither number nor text`);
    }),
  );
}

const BLANK = Symbol("blank");

function missing(p: Param): SoilError {
  return new SoilError("MISSING_INPUT", p.need ? `${p.name} is required: ${p.need}` : `${p.name} is required`);
}

/** Turns one cell of one argument into the value core receives, or BLANK. */
function elementValue(p: NumParam | TextParam | CellParam, c: unknown, omitted: boolean): unknown {
  if (omitted) {
    if (!p.optional) throw missing(p);
    return p.default;
  }
  if (p.kind === "cell") {
    if (isBlank(c)) return BLANK;
    if (typeof c === "number") return numberOfCell(c, p.name);
    if (typeof c === "string") return c;
    throw new SoilError("NOT_A_NUMBER", `${p.name} must be a number or text (got ${String(c)})`);
  }
  if (p.kind === "number") {
    if (isBlank(c)) return p.blank === "not measured" ? p.default : BLANK;
    return numberOfCell(c, p.name);
  }
  if (isBlank(c)) {
    if (p.optional) return p.default;
    throw missing(p);
  }
  return textOfCell(c, p.name);
}

function isOmitted(a: unknown): boolean {
  return a === null || a === undefined;
}

function run(spec: BindingSpec, args: unknown[]): Out {
  const { params } = spec;
  if (args.length > params.length) {
    return [[hostErrorFor(new SoilError("SHAPE_MISMATCH", `too many arguments: at most ${params.length}`))]];
  }
  // Whole-range arguments are parsed once.
  // Stryker disable next-line ArrayDeclaration: equivalent: wholes is read only at a range parameter's index, which the loop below always assigns
  const wholes: unknown[] = [];
  const grids: (Grid | undefined)[] = [];
  const shapes: { name: string; shape: Shape }[] = [];
  try {
    params.forEach((p, i) => {
      const a = args[i] as Arg;
      if (p.kind === "range") {
        if (isOmitted(a)) {
          if (!p.optional) throw missing(p);
          wholes[i] = undefined;
        } else {
          wholes[i] = rangeValueOf(a, p.name);
        }
        return;
      }
      if (isOmitted(a)) return;
      const g = gridOf(a);
      const shape = shapeOf(g);
      // shapeOf gives a grid of no rows no columns either, so one test refuses both.
      if (shape.cols === 0) throw new SoilError("SHAPE_MISMATCH", `${p.name} is an empty range`);
      grids[i] = g;
      shapes.push({ name: p.name, shape });
    });
  } catch (e) {
    return [[hostErrorFor(e)]];
  }
  const shape = broadcastShape(shapes);
  if ("error" in shape) return [[hostErrorFor(new SoilError("SHAPE_MISMATCH", shape.error))]];
  if (spec.column && shape.rows * shape.cols >= 16) {
    const fast = runColumn(spec, spec.column, grids, wholes, shape);
    if (fast) return fast;
  }

  const out: Out = [];
  // Stryker disable next-line ArrayDeclaration: equivalent: element assigns every index before the call, so the length given up front changes nothing
  const values: unknown[] = new Array(params.length);
  for (let r = 0; r < shape.rows; r++) {
    const row: unknown[] = [];
    for (let c = 0; c < shape.cols; c++) {
      row.push(element(spec, grids, wholes, values, r, c));
    }
    out.push(row);
  }
  return out;
}

/**
 * The column path: elements whose numeric arguments are all plain numbers go to the kernel in one
 * call; every other element (blank, text, an error in a cell) takes the element path, so each
 * element's result is what `element` gives it. Undefined when the arguments do not suit a kernel
 * (a text argument that varies by element, or one that is blank or an error).
 */
function runColumn(spec: BindingSpec, kernel: ColumnKernel, grids: (Grid | undefined)[], wholes: unknown[], shape: Shape): Out | undefined {
  const { params } = spec;
  // Stryker disable next-line ArrayDeclaration: equivalent: every index is assigned below (a shared value, or a column of numbers), so the length given up front changes nothing
  const shared: unknown[] = new Array(params.length);
  // Stryker disable next-line ArrayDeclaration: equivalent: an index never assigned reads undefined either way (no column)
  const columns: (Grid | undefined)[] = new Array(params.length);
  for (let i = 0; i < params.length; i++) {
    const p = params[i] as Param;
    if (p.kind === "range") {
      shared[i] = wholes[i];
      continue;
    }
    const g = grids[i];
    if (!g) {
      if (!p.optional) return undefined;
      shared[i] = p.default;
      continue;
    }
    const single = g.length === 1 && (g[0] as Cell[]).length === 1;
    if (p.kind === "number" && !single) {
      columns[i] = g;
      continue;
    }
    const c = (g[0] as Cell[])[0];
    if (!single || errors().is(c)) return undefined;
    // Stryker disable next-line ConditionalExpression,LogicalOperator,StringLiteral: equivalent where the shortcut is dropped or narrowed (false, p.kind === "", a non-finite number let through): elementValue below reads a plain number the same way, gives numeric text the number the element path gives it, and sends a blank (BLANK), other text and a non-finite number (refused) to the element path as this does
    if (p.kind === "number" && !(typeof c === "number" && Number.isFinite(c))) return undefined;
    try {
      const v = elementValue(p, c, false);
      if (v === BLANK) return undefined;
      shared[i] = v;
    } catch {
      return undefined;
    }
  }
  const n = shape.rows * shape.cols;
  const eligible: number[] = [];
  for (let pos = 0; pos < n; pos++) {
    const r = Math.floor(pos / shape.cols);
    const c = pos % shape.cols;
    let ok = true;
    // Stryker disable next-line EqualityOperator: equivalent for i <= params.length: columns[params.length] is undefined, so that pass does nothing
    for (let i = 0; i < params.length && ok; i++) {
      const g = columns[i];
      if (!g) continue;
      const v = (g[r] as Cell[])[c];
      ok = Number.isFinite(v); // false for anything not a number: it does not convert text
    }
    if (ok) eligible.push(pos);
  }
  // Stryker disable next-line EqualityOperator: equivalent for i <= params.length: columns[params.length] is undefined, so that pass does nothing
  for (let i = 0; i < params.length; i++) {
    const g = columns[i];
    if (!g) continue;
    const a = new Float64Array(eligible.length);
    for (let j = 0; j < eligible.length; j++) {
      const pos = eligible[j] as number;
      a[j] = (g[Math.floor(pos / shape.cols)] as Cell[])[pos % shape.cols] as number;
    }
    shared[i] = a; // each column's numbers in its place among the shared values
  }
  // Stryker disable next-line ObjectLiteral: equivalent: with no eligible element the loop below never reads the results
  const results = eligible.length ? kernel(shared, eligible.length) : { values: new Float64Array(0), errors: new Map<number, SoilError>() };
  const out: Out = [];
  // Stryker disable next-line ArrayDeclaration: equivalent: the loop below assigns every cell of every row, so the length given up front changes nothing
  for (let r = 0; r < shape.rows; r++) out.push(new Array(shape.cols));
  // Stryker disable next-line ArrayDeclaration: equivalent: element assigns every index before the call, so the length given up front changes nothing
  const scratch: unknown[] = new Array(params.length);
  let next = 0;
  for (let pos = 0; pos < n; pos++) {
    const r = Math.floor(pos / shape.cols);
    const c = pos % shape.cols;
    let v: unknown;
    // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent for true or next <= eligible.length in place of the bound: eligible[eligible.length] is undefined, never a position
    if (next < eligible.length && eligible[next] === pos) {
      const e = results.errors.get(next);
      const x = results.values[next++] as number;
      v = e ? hostErrorFor(e) : Number.isFinite(x) ? (x === 0 ? 0 : x) : hostErrorFor(new Error("a result was not a finite number"));
    } else v = element(spec, grids, wholes, scratch, r, c);
    (out[r] as unknown[])[c] = v;
  }
  return out;
}

function element(spec: BindingSpec, grids: (Grid | undefined)[], wholes: unknown[], values: unknown[], r: number, c: number): unknown {
  const { params } = spec;
  try {
    for (let i = 0; i < params.length; i++) {
      const p = params[i] as Param;
      if (p.kind === "range") {
        values[i] = wholes[i];
        continue;
      }
      const g = grids[i];
      let cell: unknown;
      if (g) {
        const single = g.length === 1 && (g[0] as Cell[]).length === 1;
        cell = single ? (g[0] as Cell[])[0] : (g[r] as Cell[])[c];
        if (errors().is(cell)) return cell; // an error in is the same error out
      }
      const v = elementValue(p, cell, g === undefined);
      if (v === BLANK) return "";
      values[i] = v;
    }
    const result = (spec.element as (...v: unknown[]) => ElementResult)(...values);
    if (result === null) return "";
    if (typeof result === "number") {
      if (!Number.isFinite(result)) throw new Error("a result was not a finite number");
      return result === 0 ? 0 : result; // no negative zero in a report
    }
    return result;
  } catch (e) {
    return hostErrorFor(e);
  }
}
