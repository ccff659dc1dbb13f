/** Helpers for declaring native functions: argument classes, scalar coercion, aggregation. */
import { Ctx, NativeFunction, ParamClass, eachCell, toArray } from "../evaluate";
import { toBool, toNumber, toText } from "../coerce";
import { Scalar, Value, XlArray, XlError, XlRef, XlUnion, err, isError } from "../values";

export type Table = Map<string, NativeFunction>;

/** A function of scalar arguments (lifted over arrays by the evaluator); undefined for an omitted one. */
export function scalarFn(min: number, max: number, impl: (a: (Scalar | undefined)[], ctx: Ctx) => Scalar | Value): NativeFunction {
  return { min, max, call: (args, ctx) => impl(args as (Scalar | undefined)[], ctx) };
}

/** A function whose parameters have the classes given (the last class repeats). */
export function classes(...cls: ParamClass[]): (i: number) => ParamClass {
  return (i) => (cls[Math.min(i, cls.length - 1)] as ParamClass);
}

export function num(v: Scalar | undefined, dflt?: number): number | XlError {
  if (v === undefined) return dflt === undefined ? 0 : dflt;
  return toNumber(v);
}

export function text(v: Scalar | undefined, dflt = ""): string | XlError {
  if (v === undefined) return dflt;
  return toText(v);
}

export function bool(v: Scalar | undefined, dflt = false): boolean | XlError {
  if (v === undefined) return dflt;
  return toBool(v);
}

/** Whole-number arguments are truncated toward zero, as Excel does. */
export function int(v: Scalar | undefined, dflt?: number): number | XlError {
  const n = num(v, dflt);
  return isError(n) ? n : Math.trunc(n);
}

/**
 * Visits the values an aggregate (SUM, AVERAGE, COUNT…) sees. References and arrays give their
 * elements with `fromRange` true; arguments typed directly give scalars with it false (Excel
 * counts text and logical values typed directly, and ignores them in ranges).
 */
export function eachValue(args: readonly (Value | undefined)[], ctx: Ctx, fn: (v: Scalar, fromRange: boolean) => XlError | void): XlError | undefined {
  for (const a of args) {
    if (a === undefined) {
      const e = fn(null, false);
      if (e) return e;
      continue;
    }
    if (a instanceof XlRef || a instanceof XlUnion) {
      const refs = a instanceof XlRef ? [a] : a.refs;
      let stop: XlError | undefined;
      for (const r of refs) {
        eachCell(r, ctx, (v) => {
          if (stop) return;
          const e = fn(v, true);
          if (e) stop = e;
        });
        if (stop) return stop;
      }
      continue;
    }
    if (a instanceof XlArray) {
      for (const v of a.data) {
        const e = fn(v, true);
        if (e) return e;
      }
      continue;
    }
    const e = fn(a, false);
    if (e) return e;
  }
  return undefined;
}

/**
 * The numbers an aggregate takes: numbers in ranges; numbers, logical values and numeric text
 * typed directly. Errors stop it. Text typed directly that is no number is #VALUE!.
 */
export function numbersOf(args: readonly (Value | undefined)[], ctx: Ctx): number[] | XlError {
  const out: number[] = [];
  const e = eachValue(args, ctx, (v, fromRange) => {
    if (isError(v)) return v;
    if (typeof v === "number") out.push(v);
    else if (!fromRange) {
      const n = toNumber(v);
      if (isError(n)) return n;
      out.push(n);
    }
  });
  return e ?? out;
}

/** An argument as an array for functions with array-class parameters. */
export function arrayArg(v: Value | undefined, ctx: Ctx): XlArray | XlError {
  if (v === undefined) return err("#VALUE!", "an array argument is missing");
  if (isError(v)) return v;
  return toArray(v, ctx);
}

export { err, isError };
