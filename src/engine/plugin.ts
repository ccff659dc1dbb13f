/**
 * Registers every SOIL binding with HyperFormula as one function plugin. Arguments arrive as
 * HyperFormula values and are turned into what Excel would pass (rows of cells; null for an
 * omitted argument); the binding's result rows come back as a scalar or a spilled range, with
 * host errors as CellErrors carrying the same message.
 */
import { ArraySize, CellError, ErrorType, FunctionArgumentType, FunctionPlugin, HyperFormula, SimpleRangeValue, EmptyValue } from "hyperformula";
import { SpreadsheetErrorKind } from "../core/errors";
import { HostErrors, broadcastShape, setHostErrors } from "../functions/_binding";
import { REGISTRY, RegisteredFunction } from "./registry";

/** The engine's host error: a CellError with the binding's message. */
class EngineHostError {
  constructor(
    readonly kind: SpreadsheetErrorKind,
    readonly message: string,
  ) {}
}

const ENGINE_ERRORS: HostErrors = {
  make: (kind, message) => new EngineHostError(kind, message),
  is: (v) => v instanceof EngineHostError || v instanceof CellError,
};

function toCellError(e: EngineHostError): CellError {
  return new CellError(e.kind === "#N/A" ? ErrorType.NA : ErrorType.VALUE, e.message);
}

type HfValue = unknown;

/** A HyperFormula argument value as Excel would pass it to a custom function. */
function excelArg(v: HfValue): unknown {
  if (v === undefined) return null;
  if (v instanceof SimpleRangeValue) return excelGrid(v.data);
  return [[excelCell(v)]];
}

const isPlain = (c: unknown) => typeof c === "number" || typeof c === "string" || typeof c === "boolean";

/**
 * A range's rows as Excel would pass them. Copied only when some cell needs converting: a whole
 * column of plain values is passed as it is (bindings only read their arguments), which spares
 * an array per row on every spilling call.
 */
function excelGrid(data: unknown[][]): unknown[][] {
  for (const row of data) for (const c of row) if (!isPlain(c)) return data.map((r) => r.map(excelCell));
  return data;
}

function excelCell(c: unknown): unknown {
  if (c === EmptyValue || c === null || c === undefined) return "";
  if (typeof c === "object" && c !== null && "val" in c && typeof (c as { val: unknown }).val === "number") {
    return (c as { val: number }).val; // HyperFormula's typed numbers (dates, percents)
  }
  return c;
}

/** The binding's result rows as engine values; copied only when some element needs converting. */
function hfGrid(rows: unknown[][]): unknown[][] {
  for (const row of rows) for (const v of row) if (!isPlain(v)) return rows.map((r) => r.map(hfCell));
  return rows;
}

function hfCell(v: unknown): unknown {
  if (v instanceof EngineHostError) return toCellError(v);
  if (v instanceof CellError) return v;
  if (typeof v === "number" || typeof v === "string" || typeof v === "boolean") return v;
  return new CellError(ErrorType.VALUE, "internal error: a result was neither number nor text");
}

function implement(fn: RegisteredFunction) {
  return function (this: FunctionPlugin, ast: { args: unknown[] }, state: unknown) {
    const self = this as unknown as {
      runFunction: (args: unknown[], state: unknown, meta: unknown, impl: (...a: unknown[]) => unknown) => unknown;
      metadata: (name: string) => unknown;
    };
    // An argument left out (`SOIL.X(a,,b)` or not written) is omitted; a reference to an empty
    // cell is a blank value. The engine passes both as its empty value, so the syntax decides.
    const omitted = fn.spec.params.map((_, i) => {
      const arg = ast.args[i] as { type?: string } | undefined;
      return arg === undefined || arg.type === "EMPTY";
    });
    return self.runFunction(ast.args, state, self.metadata(fn.formulaName), (...args: unknown[]) => {
      const rows = fn.binding(...args.map((a, i) => (omitted[i] ? null : excelArg(a))));
      if (rows.length === 1 && (rows[0] as unknown[]).length === 1) return hfCell((rows[0] as unknown[])[0]);
      return SimpleRangeValue.onlyValues(hfGrid(rows) as never);
    });
  };
}

/** Predicts the spill size from the shapes of the broadcast arguments, as the binding will. */
function predictSize(fn: RegisteredFunction) {
  return function (this: FunctionPlugin, ast: { args: unknown[] }, state: { formulaAddress: unknown }) {
    const self = this as unknown as { arraySizeForAst: (a: unknown, s: unknown) => ArraySize };
    // The size predictor reads only these two fields; array mode on so a range argument reports
    // its full size even though the engine's array arithmetic is off.
    const arrays = { formulaAddress: state.formulaAddress, arraysFlag: true };
    const shapes: { name: string; shape: { rows: number; cols: number } }[] = [];
    fn.spec.params.forEach((p, i) => {
      const arg = ast.args[i] as { type?: string } | undefined;
      if (p.kind === "range" || arg === undefined || arg.type === "EMPTY") return;
      const size = self.arraySizeForAst(arg, arrays);
      shapes.push({ name: p.name, shape: { rows: size.height, cols: size.width } });
    });
    const shape = broadcastShape(shapes);
    if ("error" in shape) return ArraySize.scalar();
    return new ArraySize(shape.cols, shape.rows);
  };
}

let registered = false;

/** Registers the SOIL plugin with HyperFormula once per process. */
export function registerSoilFunctions(): void {
  if (registered) return;
  setHostErrors(ENGINE_ERRORS);
  const implementedFunctions: Record<string, object> = {};
  const translations: Record<string, string> = {};
  class SoilPlugin extends FunctionPlugin {}
  const proto = SoilPlugin.prototype as unknown as Record<string, unknown>;
  for (const fn of REGISTRY) {
    const method = `soil_${fn.id}`;
    const sizeMethod = `soil_size_${fn.id}`;
    proto[method] = implement(fn);
    proto[sizeMethod] = predictSize(fn);
    implementedFunctions[fn.formulaName] = {
      method,
      sizeOfResultArrayMethod: sizeMethod,
      vectorizationForbidden: true,
      parameters: fn.meta.parameters.map((p) => ({ argumentType: FunctionArgumentType.ANY, optionalArg: Boolean(p.optional) })),
    };
    translations[fn.formulaName] = fn.formulaName;
  }
  (SoilPlugin as unknown as { implementedFunctions: unknown }).implementedFunctions = implementedFunctions;
  HyperFormula.registerFunctionPlugin(SoilPlugin as never, { enGB: translations } as never);
  registered = true;
}
