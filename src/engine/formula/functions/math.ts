/**
 * Arithmetic and aggregate functions, with Excel's rules: which values each counts, how it
 * rounds (ROUND rounds half away from zero on the decimal value shown to 15 digits), and which
 * error it gives where.
 */
import { Ctx, eachCell, notComputed } from "../evaluate";
import { approxAdd, approxSub, finite, power, toNumber } from "../coerce";
import { Scalar, Value, XlArray, XlRef, err, isError } from "../values";
import { Table, arrayArg, classes, eachValue, int, num, numbersOf, scalarFn } from "./kit";

/**
 * Whether a MOD quotient is just below a whole number that it is to 15 digits (0.3/0.1 is
 * 2.9999999999999996, shown as 3): its binary floor and its 15-digit floor differ, and no page
 * seen says which Excel's MOD takes (INT takes the 15-digit one; see INT below).
 */
function floorsApart(x: number): boolean {
  const shown = Number(x.toPrecision(15));
  return !Number.isInteger(x) && Number.isInteger(shown) && Math.floor(x) !== shown;
}

function modFloorUnknown(q: number): never {
  return notComputed(`MOD of ${q}, which is ${Number(q.toPrecision(15))} to 15 digits: whether Excel floors the binary or the 15-digit value is not known headless; round first, e.g. MOD(ROUND(x,9),d)`);
}

/** Rounds to `digits` decimals, half away from zero, on the number as Excel shows it (15 digits). */
export function roundHalfAway(x: number, digits: number): number {
  return roundWith(x, digits, "half");
}

/** Rounds |x| on its 15-digit decimal value, then restores the sign: "half" away from zero, "up" away, "down" toward. */
function roundWith(x: number, digits: number, mode: "half" | "up" | "down"): number {
  if (!Number.isFinite(x)) return x;
  const d = Math.trunc(digits);
  if (d > 15) return x;
  const shown = Math.abs(Number(x.toPrecision(15)));
  const step = (v: number) => (mode === "half" ? Math.round(v) : mode === "up" ? Math.ceil(v) : Math.floor(v));
  let r: number;
  if (d >= 0) {
    const f = 10 ** d;
    r = step(Number((shown * f).toPrecision(15))) / f;
  } else {
    const f = 10 ** -d;
    r = step(Number((shown / f).toPrecision(15))) * f;
  }
  return Math.sign(x) * r || 0;
}

const R = classes("R");

function sum(args: readonly (Value | undefined)[], ctx: Ctx): Scalar {
  let total = 0;
  const e = eachValue(args, ctx, (v, fromRange) => {
    if (isError(v)) return v;
    if (typeof v === "number") total += v;
    else if (!fromRange) {
      const n = toNumber(v);
      if (isError(n)) return n;
      total += n;
    }
  });
  return e ?? finite(total);
}

function pairArrays(args: readonly (XlArray | undefined)[]): XlArray[] | ReturnType<typeof err> {
  const arrays = args as XlArray[];
  const first = arrays[0] as XlArray;
  for (const a of arrays) if (a.rows !== first.rows || a.cols !== first.cols) return err("#VALUE!", "SUMPRODUCT's arrays differ in size");
  return arrays;
}

export function addMath(t: Table): void {
  t.set("SUM", { min: 1, max: 255, param: R, noLift: true, call: (a, ctx) => sum(a, ctx) });
  t.set("PRODUCT", {
    min: 1,
    max: 255,
    param: R,
    noLift: true,
    call: (a, ctx) => {
      const ns = numbersOf(a, ctx);
      if (isError(ns)) return ns;
      return ns.length ? finite(ns.reduce((p, x) => p * x, 1)) : 0;
    },
  });
  t.set("SUMSQ", {
    min: 1,
    max: 255,
    param: R,
    noLift: true,
    call: (a, ctx) => {
      const ns = numbersOf(a, ctx);
      if (isError(ns)) return ns;
      return finite(ns.reduce((p, x) => p + x * x, 0));
    },
  });
  t.set("SUMPRODUCT", {
    min: 1,
    max: 255,
    param: classes("A"),
    noLift: true,
    call: (a, ctx) => {
      const arrays: XlArray[] = [];
      for (const v of a) {
        const arr = arrayArg(v, ctx);
        if (isError(arr)) return arr;
        arrays.push(arr);
      }
      const paired = pairArrays(arrays);
      if (isError(paired)) return paired;
      let total = 0;
      const n = (paired[0] as XlArray).data.length;
      for (let i = 0; i < n; i++) {
        let p = 1;
        for (const arr of paired) {
          const v = arr.data[i];
          if (isError(v)) return v;
          p *= typeof v === "number" ? v : 0; // text, logical values and blanks count as 0
        }
        total += p;
      }
      return finite(total);
    },
  });
  t.set("ROUND", scalarFn(2, 2, ([x, d]) => {
    const a = num(x);
    if (isError(a)) return a;
    const b = num(d);
    if (isError(b)) return b;
    return roundHalfAway(a, b);
  }));
  t.set("ROUNDUP", scalarFn(2, 2, ([x, d]) => {
    const a = num(x);
    if (isError(a)) return a;
    const b = num(d);
    if (isError(b)) return b;
    return roundWith(a, b, "up");
  }));
  t.set("ROUNDDOWN", scalarFn(2, 2, ([x, d]) => {
    const a = num(x);
    if (isError(a)) return a;
    const b = num(d);
    if (isError(b)) return b;
    return roundWith(a, b, "down");
  }));
  t.set("TRUNC", scalarFn(1, 2, ([x, d]) => {
    const a = num(x);
    if (isError(a)) return a;
    const b = num(d, 0);
    if (isError(b)) return b;
    return roundWith(a, b, "down");
  }));
  t.set("INT", scalarFn(1, 1, ([x]) => {
    const a = num(x);
    if (isError(a)) return a;
    // Excel floors the number as it shows it, to 15 significant digits: practitioners measured
    // INT(123456789-0.0000004) = 123456789 (binary 123456788.9999995977) but
    // INT(123456789-0.0000005) = 123456788 (…8.999999493), and INT((8.2-INT(8.2))*10) = 1
    // (1.99999999999999289); LibreOffice floors the same way (its approxFloor).
    if (Number.isInteger(a)) return a || 0;
    return Math.floor(Number(a.toPrecision(15))) || 0;
  }));
  t.set("ABS", scalarFn(1, 1, ([x]) => {
    const a = num(x);
    return isError(a) ? a : Math.abs(a);
  }));
  t.set("SIGN", scalarFn(1, 1, ([x]) => {
    const a = num(x);
    return isError(a) ? a : Math.sign(a) || 0;
  }));
  t.set("SQRT", scalarFn(1, 1, ([x]) => {
    const a = num(x);
    if (isError(a)) return a;
    return a < 0 ? err("#NUM!", "the square root of a negative number") : Math.sqrt(a);
  }));
  t.set("EXP", scalarFn(1, 1, ([x]) => {
    const a = num(x);
    return isError(a) ? a : finite(Math.exp(a));
  }));
  t.set("LN", scalarFn(1, 1, ([x]) => {
    const a = num(x);
    if (isError(a)) return a;
    return a <= 0 ? err("#NUM!", "the logarithm of a number not above 0") : Math.log(a);
  }));
  t.set("LOG10", scalarFn(1, 1, ([x]) => {
    const a = num(x);
    if (isError(a)) return a;
    return a <= 0 ? err("#NUM!", "the logarithm of a number not above 0") : Math.log10(a);
  }));
  t.set("LOG", scalarFn(1, 2, ([x, b]) => {
    const a = num(x);
    if (isError(a)) return a;
    const base = num(b, 10);
    if (isError(base)) return base;
    if (a <= 0 || base <= 0) return err("#NUM!", "the logarithm of a number not above 0");
    if (base === 1) return err("#DIV/0!", "a logarithm to base 1");
    return finite(Math.log(a) / Math.log(base));
  }));
  t.set("POWER", scalarFn(2, 2, ([x, y]) => {
    const a = num(x);
    if (isError(a)) return a;
    const b = num(y);
    if (isError(b)) return b;
    return power(a, b);
  }));
  t.set("MOD", scalarFn(2, 2, ([x, y]) => {
    const a = num(x);
    if (isError(a)) return a;
    const b = num(y);
    if (isError(b)) return b;
    if (b === 0) return err("#DIV/0!", "MOD by zero");
    const q = a / b;
    if (floorsApart(q)) modFloorUnknown(q);
    // MOD(n, d) = n - d*INT(n/d), with the worksheet's subtraction (rounding noise of nearly
    // equal operands is 0): MOD(7.7,1.1) is 0, not -8.9E-16, a remainder of the wrong sign
    const r = approxSub(a, b * Math.floor(q));
    return finite(r);
  }));
  t.set("PI", scalarFn(0, 0, () => Math.PI));
  t.set("EVEN", scalarFn(1, 1, ([x]) => {
    const a = num(x);
    if (isError(a)) return a;
    const r = Math.ceil(Math.abs(a) / 2) * 2;
    return Math.sign(a) * r || 0;
  }));
  t.set("ODD", scalarFn(1, 1, ([x]) => {
    const a = num(x);
    if (isError(a)) return a;
    let r = Math.ceil(Math.abs(a));
    if (r % 2 === 0) r += 1;
    return a < 0 ? -r : r;
  }));

  // Aggregates
  t.set("AVERAGE", {
    min: 1,
    max: 255,
    param: R,
    noLift: true,
    call: (a, ctx) => {
      const ns = numbersOf(a, ctx);
      if (isError(ns)) return ns;
      if (!ns.length) return err("#DIV/0!", "AVERAGE of no numbers");
      let s = 0;
      for (const x of ns) s = approxAdd(s, x);
      return finite(s / ns.length);
    },
  });
  t.set("MIN", {
    min: 1,
    max: 255,
    param: R,
    noLift: true,
    call: (a, ctx) => {
      const ns = numbersOf(a, ctx);
      if (isError(ns)) return ns;
      return ns.length ? ns.reduce((m, x) => (x < m ? x : m)) : 0;
    },
  });
  t.set("MAX", {
    min: 1,
    max: 255,
    param: R,
    noLift: true,
    call: (a, ctx) => {
      const ns = numbersOf(a, ctx);
      if (isError(ns)) return ns;
      return ns.length ? ns.reduce((m, x) => (x > m ? x : m)) : 0;
    },
  });
  t.set("MEDIAN", {
    min: 1,
    max: 255,
    param: R,
    noLift: true,
    call: (a, ctx) => {
      const ns = numbersOf(a, ctx);
      if (isError(ns)) return ns;
      if (!ns.length) return err("#NUM!", "MEDIAN of no numbers");
      ns.sort((x, y) => x - y);
      const m = ns.length >> 1;
      return ns.length % 2 ? (ns[m] as number) : ((ns[m - 1] as number) + (ns[m] as number)) / 2;
    },
  });
  const variance = (sample: boolean) => (a: Parameters<typeof numbersOf>[0], ctx: Ctx) => {
    const ns = numbersOf(a, ctx);
    if (isError(ns)) return ns;
    const n = ns.length;
    if (n < (sample ? 2 : 1)) return err("#DIV/0!", `needs at least ${sample ? 2 : 1} numbers`);
    const mean = ns.reduce((s, x) => s + x, 0) / n;
    const ss = ns.reduce((s, x) => s + (x - mean) * (x - mean), 0);
    return finite(ss / (sample ? n - 1 : n));
  };
  for (const [name, sample, root] of [
    ["VAR", true, false],
    ["VAR.S", true, false],
    ["VARP", false, false],
    ["VAR.P", false, false],
    ["STDEV", true, true],
    ["STDEV.S", true, true],
    ["STDEVP", false, true],
    ["STDEV.P", false, true],
  ] as const) {
    t.set(name, {
      min: 1,
      max: 255,
      param: R,
      noLift: true,
      call: (a, ctx) => {
        const v = variance(sample)(a, ctx);
        return isError(v) || !root ? v : Math.sqrt(v);
      },
    });
  }
  const kth = (largest: boolean) => ({
    min: 2,
    max: 2,
    param: classes("R", "V"),
    call: (a: Parameters<typeof numbersOf>[0], ctx: Ctx): Scalar => {
      const ns = numbersOf([a[0]], ctx);
      if (isError(ns)) return ns;
      const k = num(a[1] as Scalar | undefined);
      if (isError(k)) return k;
      if (!Number.isInteger(k)) return notComputed(`${largest ? "LARGE" : "SMALL"} with k = ${k}, not a whole number, is not computed headless (LibreOffice truncates it; Excel's reading is not documented)`);
      if (k < 1 || k > ns.length) return err("#NUM!", `k = ${k} is outside 1 to ${ns.length}`);
      ns.sort((x, y) => (largest ? y - x : x - y));
      return ns[k - 1] as number;
    },
  });
  t.set("LARGE", kth(true));
  t.set("SMALL", kth(false));

  // Counting
  t.set("COUNT", {
    min: 1,
    max: 255,
    param: R,
    noLift: true,
    call: (a, ctx) => {
      let n = 0;
      eachValue(a, ctx, (v, fromRange) => {
        if (typeof v === "number") n++;
        // An argument left empty (COUNT(1,,2)) is counted as the 0 it stands for; blank cells are not.
        else if (!fromRange && (v === null || (!isError(v) && (typeof v === "boolean" || !isError(toNumber(v)))))) n++;
      });
      return n;
    },
  });
  t.set("COUNTA", {
    min: 1,
    max: 255,
    param: R,
    noLift: true,
    call: (a, ctx) => {
      let n = 0;
      eachValue(a, ctx, (v, fromRange) => {
        if (v !== null || !fromRange) n++;
      });
      return n;
    },
  });
  t.set("COUNTBLANK", {
    min: 1,
    max: 1,
    param: R,
    noLift: true,
    call: (a, ctx) => {
      const r = a[0];
      if (!(r instanceof XlRef)) return err("#VALUE!", "COUNTBLANK needs a range");
      let filled = 0;
      eachCell(r, ctx, (v) => {
        if (v !== null && v !== "") filled++;
      });
      return r.rows * r.cols - filled;
    },
  });
  // ROWS(5), COLUMNS("a"): LibreOffice 7.4 gives #VALUE!, the engine gave 1; Excel's answer is not
  // established (Microsoft's page names a reference or an array).
  const singleValueShape = (name: string) => notComputed(`${name} of a single value (not a range or array) is not computed headless (LibreOffice gives #VALUE!; Excel's answer is not established)`);
  t.set("ROWS", {
    min: 1,
    max: 1,
    param: R,
    noLift: true,
    call: ([a]) => (a instanceof XlRef || a instanceof XlArray ? a.rows : isError(a) ? a : singleValueShape("ROWS")),
  });
  t.set("COLUMNS", {
    min: 1,
    max: 1,
    param: R,
    noLift: true,
    call: ([a]) => (a instanceof XlRef || a instanceof XlArray ? a.cols : isError(a) ? a : singleValueShape("COLUMNS")),
  });
  void int;
}
