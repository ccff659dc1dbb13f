/**
 * Logical and information functions. IF, IFERROR, IFNA, IFS, SWITCH and CHOOSE evaluate only the
 * branch they need when the condition is one value, and element by element when it is an array.
 */
import { Ctx, notComputed, ev, evalLazy, intersect, lift, toValue } from "../evaluate";
import type { Node } from "../parser";
import { compare, toBool, toNumber } from "../coerce";
import { Scalar, Value, XlArray, XlError, XlRef, XlUnion, err, isError } from "../values";
import { Table, classes, eachValue, scalarFn } from "./kit";

/** A lazily chosen branch keeps references (IF(A1,B1:B3,C1:C3) can feed SUM). */
function branch(node: Node | undefined, ctx: Ctx): Value {
  if (!node || node.k === "miss") return node ? 0 : false;
  return ev(node, ctx, true);
}

function conditionOf(v: Scalar | XlArray): boolean | XlError | XlArray {
  if (v instanceof XlArray) return v;
  return toBool(v);
}

function ifFn(args: readonly Node[], ctx: Ctx): Value {
  const cond = conditionOf(toValue(ev(args[0] as Node, ctx, false), ctx));
  if (isError(cond)) return cond;
  if (!(cond instanceof XlArray)) return branch(cond ? args[1] : args[2] ?? undefined, ctx) ?? false;
  // An array condition: both branches, chosen element by element.
  const a = toValue(branch(args[1], ctx), ctx);
  const b = args.length > 2 ? toValue(branch(args[2], ctx), ctx) : false;
  return lift([cond, a, b], ([c, x, y]) => {
    const t = toBool(c as Scalar);
    if (isError(t)) return t;
    return (t ? x : y) as Scalar;
  }, ctx);
}

/** IF with no else-branch gives FALSE; IF(cond,,x) gives 0 for the empty branch. */
function ifMissing(args: readonly Node[], ctx: Ctx): Value {
  if (args.length === 2) {
    const cond = conditionOf(toValue(ev(args[0] as Node, ctx, false), ctx));
    if (isError(cond)) return cond;
    if (!(cond instanceof XlArray) && !cond) return false;
  }
  return ifFn(args, ctx);
}

function onError(test: (e: XlError) => boolean) {
  return (args: readonly Node[], ctx: Ctx): Value => {
    const v = ev(args[0] as Node, ctx, true);
    const value = v instanceof XlRef || v instanceof XlUnion ? toValue(v, ctx) : v;
    if (!(value instanceof XlArray)) {
      if (isError(value) && test(value)) return evalLazy(args[1], ctx, true) ?? 0;
      return v instanceof XlRef ? v : value;
    }
    // The fallback is computed only when an element needs it, and taken element by element.
    if (!value.data.some((x) => isError(x) && test(x))) return value;
    const fallback = toValue(evalLazy(args[1], ctx, false) ?? 0, ctx);
    return lift([value, fallback], ([x, f]) => (isError(x) && test(x) ? f : x) as Scalar, ctx);
  };
}

function logicalFold(name: string, start: boolean, step: (acc: boolean, v: boolean) => boolean) {
  return {
    min: 1,
    max: 255,
    param: classes("R"),
    noLift: true,
    call: (args: readonly (Value | undefined)[], ctx: Ctx): Scalar => {
      let acc = start;
      let seen = false;
      const e = eachValue(args, ctx, (v, fromRange) => {
        if (isError(v)) return v;
        // A blank cell is skipped; an argument left empty (AND(TRUE,)) is the FALSE it stands for.
        if (v === null && fromRange) return;
        if (v === null || typeof v === "boolean") {
          acc = step(acc, v === true);
          seen = true;
        } else if (typeof v === "number") {
          acc = step(acc, v !== 0);
          seen = true;
        } else if (!fromRange) {
          const b = toBool(v);
          if (isError(b)) return b;
          acc = step(acc, b);
          seen = true;
        }
      });
      if (e) return e;
      return seen ? acc : err("#VALUE!", `${name} found no logical values`);
    },
  };
}

function isKindValue(f: (v: Scalar) => Scalar) {
  return { min: 1, max: 1, call: ([v]: readonly (Value | undefined)[]) => f((v ?? null) as Scalar) };
}

function isKind(test: (v: Scalar) => boolean) {
  return { min: 1, max: 1, call: ([v]: readonly (Value | undefined)[]) => test((v ?? null) as Scalar) };
}

export function addLogic(t: Table): void {
  t.set("IF", { min: 2, max: 3, lazy: ifMissing });
  t.set("IFERROR", { min: 2, max: 2, lazy: onError(() => true) });
  t.set("IFNA", { min: 2, max: 2, lazy: onError((e) => e.code === "#N/A") });
  t.set("IFS", {
    min: 2,
    max: 254,
    lazy: (args, ctx) => {
      // Excel does not accept IFS with a condition and no value (as with a wrong argument count).
      if (args.length % 2) return notComputed("IFS takes condition, value pairs; not computed headless");
      for (let i = 0; i < args.length; i += 2) {
        const c = toValue(ev(args[i] as Node, ctx, false), ctx);
        if (c instanceof XlArray) return notComputed("IFS with an array condition is not computed headless");
        const b = toBool(c);
        if (isError(b)) return b;
        if (b) return branch(args[i + 1], ctx);
      }
      return err("#N/A", "no condition of IFS is TRUE");
    },
  });
  t.set("SWITCH", {
    min: 3,
    max: 254,
    lazy: (args, ctx) => {
      const x = toValue(ev(args[0] as Node, ctx, false), ctx);
      if (x instanceof XlArray) return notComputed("SWITCH over an array is not computed headless");
      if (isError(x)) return x;
      let i = 1;
      for (; i + 1 < args.length; i += 2) {
        const v = toValue(ev(args[i] as Node, ctx, false), ctx);
        if (v instanceof XlArray) return notComputed("SWITCH over an array is not computed headless");
        if (isError(v)) return v;
        if (compare(x, v) === 0) return branch(args[i + 1], ctx);
      }
      if (i < args.length && (args[i] as Node).k === "miss") return notComputed("SWITCH with its default written but left empty is not computed headless (LibreOffice gives #N/A, Excel's reading is not checked)");
      return i < args.length ? branch(args[i], ctx) : err("#N/A", "SWITCH found no match");
    },
  });
  t.set("CHOOSE", {
    min: 2,
    max: 255,
    lazy: (args, ctx) => {
      const k = toValue(ev(args[0] as Node, ctx, false), ctx);
      if (k instanceof XlArray) {
        // Each choice an index names is computed once and broadcast with the index, as Excel's
        // array arithmetic pairs arrays (CHOOSE({1,2},B2:B9,A2:A9) is an 8×2 array); choices
        // no index names are not computed.
        // In a legacy formula too (the left-lookup idiom VLOOKUP(x,CHOOSE({1,2},B2:B9,A2:A9),2,0)
        // is written without Ctrl+Shift+Enter): the chosen ranges are read whole, not intersected.
        const actx = ctx.arrays ? ctx : { ...ctx, arrays: true };
        const chosen: (Scalar | XlArray)[] = args.map(() => null);
        for (let r = 0; r < k.rows; r++) {
          for (let c = 0; c < k.cols; c++) {
            const n = toNumber(k.at(r, c));
            if (isError(n)) continue;
            const i = Math.trunc(n);
            if (i >= 1 && i < args.length && chosen[i] === null) chosen[i] = toValue(branch(args[i], actx), actx);
          }
        }
        return lift([k, ...chosen.slice(1)], ([x, ...vs]) => {
          const n = toNumber(x as Scalar);
          if (isError(n)) return n;
          const i = Math.trunc(n);
          if (i < 1 || i >= args.length) return err("#VALUE!", `CHOOSE index ${n} is outside 1 to ${args.length - 1}`);
          return vs[i - 1] as Scalar;
        }, ctx);
      }
      const n = toNumber(k);
      if (isError(n)) return n;
      const i = Math.trunc(n);
      if (i < 1 || i >= args.length) return err("#VALUE!", `CHOOSE index ${n} is outside 1 to ${args.length - 1}`);
      return branch(args[i], ctx);
    },
  });
  t.set("AND", logicalFold("AND", true, (a, v) => a && v));
  t.set("OR", logicalFold("OR", false, (a, v) => a || v));
  t.set("XOR", logicalFold("XOR", false, (a, v) => a !== v));
  t.set("NOT", scalarFn(1, 1, ([v]) => {
    const b = toBool((v ?? null) as Scalar);
    return isError(b) ? b : !b;
  }));
  t.set("TRUE", scalarFn(0, 0, () => true));
  t.set("FALSE", scalarFn(0, 0, () => false));

  // Information
  t.set("ISNUMBER", isKind((v) => typeof v === "number"));
  t.set("ISTEXT", isKind((v) => typeof v === "string"));
  t.set("ISNONTEXT", isKind((v) => typeof v !== "string"));
  t.set("ISLOGICAL", isKind((v) => typeof v === "boolean"));
  t.set("ISBLANK", isKind((v) => v === null));
  t.set("ISERROR", isKind((v) => isError(v)));
  t.set("ISERR", isKind((v) => isError(v) && v.code !== "#N/A"));
  t.set("ISNA", isKind((v) => isError(v) && v.code === "#N/A"));
  t.set("ISREF", { min: 1, max: 1, param: classes("R"), noLift: true, call: ([v]) => v instanceof XlRef || v instanceof XlUnion });
  t.set("ISEVEN", scalarFn(1, 1, ([v]) => {
    const n = toNumber((v ?? null) as Scalar);
    return isError(n) ? n : Math.trunc(n) % 2 === 0;
  }));
  t.set("ISODD", scalarFn(1, 1, ([v]) => {
    const n = toNumber((v ?? null) as Scalar);
    return isError(n) ? n : Math.abs(Math.trunc(n) % 2) === 1;
  }));
  t.set("NA", scalarFn(0, 0, () => err("#N/A")));
  const ERROR_NUMBERS: Record<string, number> = { "#NULL!": 1, "#DIV/0!": 2, "#VALUE!": 3, "#REF!": 4, "#NAME?": 5, "#NUM!": 6, "#N/A": 7, "#GETTING_DATA": 8, "#SPILL!": 9, "#CALC!": 14 };
  t.set("ERROR.TYPE", isKindValue((v) => (isError(v) && ERROR_NUMBERS[v.code] !== undefined ? (ERROR_NUMBERS[v.code] as number) : err("#N/A", "ERROR.TYPE of a value that is no error"))));
  t.set("N", {
    min: 1,
    max: 1,
    param: classes("R"),
    noLift: true,
    call: ([v], ctx) => {
      const x = v instanceof XlRef ? intersectFirst(v, ctx) : v instanceof XlArray ? v.at(0, 0) : ((v ?? null) as Scalar);
      if (typeof x === "number") return x;
      if (typeof x === "boolean") return x ? 1 : 0;
      if (isError(x)) return x;
      return 0;
    },
  });
  t.set("T", {
    min: 1,
    max: 1,
    param: classes("R"),
    noLift: true,
    call: ([v], ctx) => {
      const x = v instanceof XlRef ? intersectFirst(v, ctx) : v instanceof XlArray ? v.at(0, 0) : ((v ?? null) as Scalar);
      if (typeof x === "string") return x;
      if (isError(x)) return x;
      return "";
    },
  });
}

function intersectFirst(r: XlRef, ctx: Ctx): Scalar {
  return r.isCell ? ctx.host.value(r.sheet, r.r1, r.c1) : ctx.arrays ? ctx.host.value(r.sheet, r.r1, r.c1) : intersect(r, ctx);
}
