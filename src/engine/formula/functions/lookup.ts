/**
 * Lookup, reference and conditional-aggregate functions: INDEX, MATCH, VLOOKUP, HLOOKUP, ROW,
 * COLUMN, OFFSET, INDIRECT, TRANSPOSE, and the *IF(S) family with Excel's criteria syntax
 * (">=5", "<>x", wildcards * ? and the escape ~).
 */
import { tokenize, T } from "../lexer";
import { Ctx, ResourceLimit, notComputed, eachCell, resolveRef, toArray } from "../evaluate";
import { compare, numberFromText, toBool, toNumber, toText } from "../coerce";
import { MAX_COLS, MAX_ROWS, Scalar, Value, XlArray, XlError, XlRef, err, isError, isErrorCode } from "../values";
import { Table, arrayArg, classes, int, num } from "./kit";

// ---------------------------------------------------------------------------------------------
// Matching

function wildcardRegex(pattern: string): RegExp | undefined {
  if (!/[*?~]/.test(pattern)) return undefined;
  let re = "";
  for (let i = 0; i < pattern.length; i++) {
    const ch = pattern[i] as string;
    if (ch === "~" && i + 1 < pattern.length && "*?~".includes(pattern[i + 1] as string)) {
      re += escapeRe(pattern[++i] as string);
    } else if (ch === "*") re += "[\\s\\S]*";
    else if (ch === "?") re += "[\\s\\S]";
    else re += escapeRe(ch);
  }
  return new RegExp(`^${re}$`, "i");
}

function escapeRe(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
}

/** Exact match as MATCH(…,0) and VLOOKUP(…,FALSE) test it: same type, text without case, wildcards in text. */
function exactMatcher(lookup: Scalar): (v: Scalar) => boolean {
  if (typeof lookup === "string") {
    const re = wildcardRegex(lookup);
    const u = lookup.toUpperCase();
    return re ? (v) => typeof v === "string" && re.test(v) : (v) => typeof v === "string" && v.toUpperCase() === u;
  }
  // A number matches only itself, bit for bit, not a neighbour within rounding noise as = compares:
  // Excel cached #N/A for HLOOKUP(0.99900000000000011,…,FALSE) over a 0.999 (Stack Overflow
  // question 12695417, "Simple HLOOKUP failing with Excel 2010", its workbook's XML as posted),
  // and LibreOffice 7.4 gives #N/A for MATCH(0.3,{0.30000000000000004},0).
  if (typeof lookup === "number") return (v) => v === lookup;
  return (v) => v !== null && !isError(v) && typeof v === typeof lookup && compare(v, lookup) === 0;
}

/**
 * Approximate match on sorted data (match_type 1 ascending, -1 descending): the position of the
 * largest value ≤ lookup (or smallest ≥), among values of the lookup's type, by binary search.
 */
function approximateIndex(values: readonly Scalar[], lookup: Scalar, descending: boolean): number {
  const same = (v: Scalar) => v !== null && !isError(v) && typeof v === typeof lookup;
  // On values out of order the answer depends on how the search probes them, which Microsoft
  // leaves open ("VLOOKUP may not return the correct value"): refused, not guessed.
  let prev: Scalar | undefined;
  for (const v of values) {
    if (!same(v)) continue;
    if (prev !== undefined && (compare(prev, v) as number) * (descending ? -1 : 1) > 0) notComputed("an approximate match over values not in sorted order is not computed headless (the result depends on Excel's search; sort the values or use an exact match)");
    prev = v;
  }
  let lo = 0;
  let hi = values.length - 1;
  let found = -1;
  while (lo <= hi) {
    let mid = (lo + hi) >> 1;
    // Skip cells of another type (Excel's search looks past them).
    let m = mid;
    while (m <= hi && !same(values[m] as Scalar)) m++;
    if (m > hi) {
      hi = mid - 1;
      continue;
    }
    mid = m;
    const c = compare(values[mid] as Scalar, lookup) as number;
    if (descending ? c >= 0 : c <= 0) {
      found = mid;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return found;
}

function vector(a: XlArray): Scalar[] | undefined {
  if (a.rows === 1 || a.cols === 1) return a.data;
  return undefined;
}

// ---------------------------------------------------------------------------------------------
// Criteria (COUNTIF, SUMIF, …)

export function criterion(c: Scalar): (v: Scalar) => boolean {
  if (isError(c)) return (v) => isError(v) && v.code === c.code;
  if (typeof c === "number") return (v) => numericCell(v) === c;
  if (typeof c === "boolean") return (v) => v === c;
  if (c === null) return (v) => v === null || v === "";
  const m = /^(<=|>=|<>|=|<|>)?([\s\S]*)$/.exec(c) as RegExpExecArray;
  const op = m[1] ?? "=";
  const operand = m[2] as string;
  if (operand === "") {
    if (op === "=") return (v) => v === null || (m[1] === undefined && v === "");
    if (op === "<>") return (v) => v !== null;
    return () => false;
  }
  // "#N/A", "<>#DIV/0!": error text is matched against error cells, as Excel's criteria do.
  if ((op === "=" || op === "<>") && isErrorCode(operand)) {
    const code = operand.toUpperCase();
    return op === "=" ? (v) => isError(v) && v.code === code : (v) => !(isError(v) && v.code === code);
  }
  const n = numberFromText(operand);
  const b = operand.toUpperCase() === "TRUE" ? true : operand.toUpperCase() === "FALSE" ? false : undefined;
  if (n !== undefined) {
    const test = (x: number) => (op === "=" ? x === n : op === "<>" ? x !== n : op === "<" ? x < n : op === ">" ? x > n : op === "<=" ? x <= n : x >= n);
    return (v) => {
      const x = numericCell(v);
      if (x === undefined) return op === "<>";
      return test(x);
    };
  }
  if (b !== undefined) return (v) => (op === "<>" ? v !== b : op === "=" ? v === b : false);
  if (op === "=" || op === "<>") {
    const re = wildcardRegex(operand);
    const u = operand.toUpperCase();
    const eq = (v: Scalar) => typeof v === "string" && (re ? re.test(v) : v.toUpperCase() === u);
    return op === "=" ? eq : (v) => !eq(v);
  }
  return (v) => {
    if (typeof v !== "string") return false;
    const cmp = compare(v, operand) as number;
    return op === "<" ? cmp < 0 : op === ">" ? cmp > 0 : op === "<=" ? cmp <= 0 : cmp >= 0;
  };
}

/** A cell as a number for criteria: numbers, and text that reads as one. */
function numericCell(v: Scalar): number | undefined {
  if (typeof v === "number") return v;
  if (typeof v === "string") return numberFromText(v);
  return undefined;
}

function rangeOf(v: Value | undefined, what: string): XlRef | XlError {
  if (v instanceof XlRef) return v;
  if (isError(v)) return v;
  return err("#VALUE!", `${what} must be a range`);
}

/** Runs `fn` over the cells of `range` that meet every (range, criterion) pair, with their offsets. */
function eachMatch(ranges: XlRef[], tests: ((v: Scalar) => boolean)[], ctx: Ctx, fn: (dr: number, dc: number) => void): XlError | undefined {
  const first = ranges[0] as XlRef;
  for (const r of ranges) if (r.rows !== first.rows || r.cols !== first.cols) return err("#VALUE!", "the criteria ranges differ in size");
  if (first.rows * first.cols > ctx.host.maxCells) {
    throw new ResourceLimit(`a criteria range of ${first.rows}×${first.cols} cells is more than the ${ctx.host.maxCells} cells soilcell takes in one formula; refused`);
  }
  const emptyMatches = tests.map((t) => t(null));
  // Cells beyond the used area are blank: test them once per criterion.
  for (let dr = 0; dr < first.rows; dr++) {
    for (let dc = 0; dc < first.cols; dc++) {
      let ok = true;
      for (let k = 0; k < ranges.length && ok; k++) {
        const r = ranges[k] as XlRef;
        const b = ctx.host.bounds(r.sheet);
        const row = r.r1 + dr;
        const col = r.c1 + dc;
        const v = row > b.rows || col > b.cols ? null : ctx.host.value(r.sheet, row, col);
        ok = v === null ? (emptyMatches[k] as boolean) : (tests[k] as (v: Scalar) => boolean)(v);
      }
      if (ok) fn(dr, dc);
    }
  }
  return undefined;
}

function ifsAggregate(kind: "sum" | "count" | "average" | "min" | "max", hasTarget: boolean, targetFirst: boolean) {
  return (args: readonly (Value | undefined)[], ctx: Ctx): Scalar => {
    let target: XlRef | undefined;
    let pairs: (Value | undefined)[];
    if (!hasTarget) pairs = [...args];
    else if (targetFirst) {
      const t = rangeOf(args[0], "the range to aggregate");
      if (isError(t)) return t;
      target = t;
      pairs = args.slice(1);
    } else {
      // SUMIF(range, criterion, [sum_range]): the sum range takes the criteria range's size.
      pairs = args.slice(0, 2);
      const t = args[2] === undefined ? args[0] : args[2];
      const tr = rangeOf(t, "the range to aggregate");
      if (isError(tr)) return tr;
      const cr = rangeOf(args[0], "the criteria range");
      if (isError(cr)) return cr;
      target = new XlRef(tr.sheet, tr.r1, tr.c1, Math.min(MAX_ROWS - 1, tr.r1 + cr.rows - 1), Math.min(MAX_COLS - 1, tr.c1 + cr.cols - 1));
    }
    if (pairs.length % 2) return err("#VALUE!", "criteria come in range, criterion pairs");
    const ranges: XlRef[] = [];
    const tests: ((v: Scalar) => boolean)[] = [];
    for (let i = 0; i < pairs.length; i += 2) {
      const r = rangeOf(pairs[i], "a criteria range");
      if (isError(r)) return r;
      const c = pairs[i + 1];
      if (c instanceof XlArray) return notComputed("an array of criteria is not computed headless");
      const cv = c instanceof XlRef ? ctx.host.value(c.sheet, c.r1, c.c1) : ((c ?? null) as Scalar);
      ranges.push(r);
      // A criterion that is an empty cell, or written empty, is the number 0 (Microsoft Support,
      // COUNTIFS and AVERAGEIF: "treats the empty cell as a 0 value"; LibreOffice the same).
      tests.push(criterion(cv === null ? 0 : cv));
    }
    if (target && target !== ranges[0] && (target.rows !== (ranges[0] as XlRef).rows || target.cols !== (ranges[0] as XlRef).cols) && targetFirst) {
      return err("#VALUE!", "the range to aggregate and the criteria ranges differ in size");
    }
    let count = 0;
    let total = 0;
    let best: number | undefined;
    let bad: XlError | undefined;
    const e = eachMatch(ranges, tests, ctx, (dr, dc) => {
      if (!target) {
        count++;
        return;
      }
      const v = ctx.host.value(target.sheet, target.r1 + dr, target.c1 + dc);
      if (isError(v)) {
        bad ??= v;
        return;
      }
      if (typeof v !== "number") return;
      count++;
      total += v;
      best = best === undefined ? v : kind === "min" ? Math.min(best, v) : Math.max(best, v);
    });
    if (e) return e;
    if (bad) return bad;
    switch (kind) {
      case "count":
        return count;
      case "sum":
        return total;
      case "average":
        return count ? total / count : err("#DIV/0!", "no cell meets the criteria");
      default:
        return best ?? 0;
    }
  };
}

// ---------------------------------------------------------------------------------------------

function indexInto(a: Value | undefined, rowArg: Scalar | undefined, colArg: Scalar | undefined, ctx: Ctx): Value {
  if (isError(a)) return a;
  const row = rowArg === undefined ? 0 : toNumber(rowArg);
  if (isError(row)) return row;
  const col = colArg === undefined ? undefined : toNumber(colArg);
  if (isError(col)) return col;
  const shape = a instanceof XlRef || a instanceof XlArray ? { rows: a.rows, cols: a.cols } : { rows: 1, cols: 1 };
  let r = Math.trunc(row);
  let c = col === undefined ? undefined : Math.trunc(col);
  // One index into a single row is its column.
  if (c === undefined) {
    if (shape.rows === 1 && shape.cols > 1) {
      c = r;
      r = 0;
    } else c = 0;
  }
  if (r < 0 || c < 0 || r > shape.rows || c > shape.cols) return err("#REF!", "INDEX's row or column is outside the range");
  if (shape.cols > 1 && shape.rows > 1 && col === undefined && r !== 0) {
    // INDEX(2-D range, row) without a column: the whole row.
    c = 0;
  }
  if (a instanceof XlRef) {
    const r1 = r === 0 ? a.r1 : a.r1 + r - 1;
    const r2 = r === 0 ? a.r2 : r1;
    const c1 = c === 0 ? a.c1 : a.c1 + c - 1;
    const c2 = c === 0 ? a.c2 : c1;
    return new XlRef(a.sheet, r1, c1, r2, c2);
  }
  const arr = a instanceof XlArray ? a : new XlArray(1, 1, [(a ?? null) as Scalar]);
  if (r !== 0 && c !== 0) return arr.at(r - 1, c - 1);
  const rows = r === 0 ? arr.rows : 1;
  const cols = c === 0 ? arr.cols : 1;
  const data: Scalar[] = [];
  for (let i = 0; i < rows; i++) for (let j = 0; j < cols; j++) data.push(arr.at(r === 0 ? i : r - 1, c === 0 ? j : c - 1));
  return rows === 1 && cols === 1 ? (data[0] as Scalar) : new XlArray(rows, cols, data);
}

function lookupIn(table: XlArray, lookup: Scalar, index: number, exact: boolean, byRow: boolean): Scalar {
  const n = byRow ? table.cols : table.rows;
  const keys: Scalar[] = [];
  for (let i = 0; i < n; i++) keys.push(byRow ? table.at(0, i) : table.at(i, 0));
  const width = byRow ? table.rows : table.cols;
  if (index < 1) return err("#VALUE!", "the column (or row) index is less than 1");
  if (index > width) return err("#REF!", `the index ${index} is beyond the table's ${width}`);
  let at = -1;
  if (exact) {
    const m = exactMatcher(lookup);
    at = keys.findIndex((k) => m(k));
  } else at = approximateIndex(keys, lookup, false);
  if (at < 0) return err("#N/A", "the value is not found");
  return byRow ? table.at(index - 1, at) : table.at(at, index - 1);
}

/** A1-style reference text (as INDIRECT reads it): [Sheet!]A1[:B2], or a defined name. */
function parseReferenceText(s: string, ctx: Ctx): Value {
  let tokens;
  try {
    tokens = tokenize(s.trim());
  } catch {
    return err("#REF!", `"${s}" is not a reference`);
  }
  const [a, b] = tokens;
  if (tokens.length === 2 && a && a.t === T.Ref && a.ref) {
    const r = a.ref;
    const node = {
      k: "ref" as const,
      r1: r.r1 ?? 0,
      c1: r.c1 ?? 0,
      r2: r.r2 ?? MAX_ROWS - 1,
      c2: r.c2 ?? MAX_COLS - 1,
      abs: 15,
      ...(r.sheet !== undefined ? { sheet: r.sheet } : {}),
    };
    return resolveRef(node, ctx);
  }
  if (tokens.length === 2 && a && a.t === T.Name && b?.t === T.End) {
    const d = ctx.host.book.definedName(String(a.value), ctx.sheet);
    if (d?.node?.k === "ref") return resolveRef({ ...d.node }, { ...ctx, row: 0, col: 0 });
  }
  return err("#REF!", `"${s}" is not a reference INDIRECT can read headless`);
}

/**
 * SUMIF(r,c,) with its third argument written but empty: whether Excel sums r (as when it is left
 * out) or refuses is not established here (LibreOffice gives #VALUE!), so it is not computed.
 */
function emptyRangeRefused(name: string, f: (args: readonly (Value | undefined)[], ctx: Ctx) => Scalar) {
  return (args: readonly (Value | undefined)[], ctx: Ctx): Scalar => (args.length === 3 && args[2] === undefined ? notComputed(`${name} with its third argument left empty is not computed headless (give the range, or leave the argument out)`) : f(args, ctx));
}

export function addLookup(t: Table): void {
  t.set("INDEX", {
    min: 2,
    max: 3,
    // Reference or array: an expression is taken as an array even in a legacy formula (the
    // non-CSE INDEX(…,0) idiom), a reference stays a reference (A1:INDEX(…)).
    param: classes("A", "V", "V"),
    call: ([a, r, c], ctx) => a === undefined ? notComputed("INDEX with its array left empty is not computed headless (it gave 0; LibreOffice: #VALUE!)") : indexInto(a instanceof XlRef || a instanceof XlArray ? a : (a as Value), r as Scalar | undefined, c as Scalar | undefined, ctx),
  });
  t.set("MATCH", {
    min: 2,
    max: 3,
    param: classes("V", "A", "V"),
    call: ([v, arr, type], ctx) => {
      const lookup = (v ?? null) as Scalar;
      if (isError(lookup)) return lookup;
      // LibreOffice 7.4 gives #VALUE! for MATCH(5,5,0); Excel's answer is not established.
      if (!(arr instanceof XlRef || arr instanceof XlArray || isError(arr as Scalar))) return notComputed("MATCH over a single value (not a range or array) is not computed headless (LibreOffice gives #VALUE!; Excel's answer is not established)");
      const a = arrayArg(arr, ctx);
      if (isError(a)) return a;
      const values = vector(a);
      if (!values) return err("#N/A", "MATCH needs one row or one column");
      const mt = num(type as Scalar | undefined, 1);
      if (isError(mt)) return mt;
      if (lookup === null) return err("#N/A", "MATCH of a blank value");
      let at: number;
      if (mt === 0) {
        const m = exactMatcher(lookup);
        at = values.findIndex((x) => m(x));
      } else at = approximateIndex(values, lookup, mt < 0);
      return at < 0 ? err("#N/A", "the value is not found") : at + 1;
    },
  });
  for (const [name, byRow] of [
    ["VLOOKUP", false],
    ["HLOOKUP", true],
  ] as const) {
    t.set(name, {
      min: 3,
      max: 4,
      param: classes("V", "R", "V", "V"),
      call: ([v, table, index, range], ctx) => {
        const lookup = (v ?? null) as Scalar;
        if (isError(lookup)) return lookup;
        const tab = arrayArg(table, ctx);
        if (isError(tab)) return tab;
        const i = int(index as Scalar | undefined);
        if (isError(i)) return i;
        const approx = range === undefined ? true : toBool(range as Scalar);
        if (isError(approx)) return approx;
        if (lookup === null) return err("#N/A", `${name} of a blank value`);
        return lookupIn(tab, lookup, i, !approx, byRow);
      },
    });
  }
  t.set("ROW", {
    min: 0,
    max: 1,
    param: classes("R"),
    noLift: true,
    call: ([r], ctx) => {
      if (r === undefined) return ctx.row + 1;
      if (!(r instanceof XlRef)) return isError(r) ? r : err("#VALUE!", "ROW needs a reference");
      if (r.rows === 1 || !ctx.arrays) return r.r1 + 1;
      return new XlArray(r.rows, 1, Array.from({ length: r.rows }, (_, i) => r.r1 + i + 1));
    },
  });
  t.set("COLUMN", {
    min: 0,
    max: 1,
    param: classes("R"),
    noLift: true,
    call: ([r], ctx) => {
      if (r === undefined) return ctx.col + 1;
      if (!(r instanceof XlRef)) return isError(r) ? r : err("#VALUE!", "COLUMN needs a reference");
      if (r.cols === 1 || !ctx.arrays) return r.c1 + 1;
      return new XlArray(1, r.cols, Array.from({ length: r.cols }, (_, i) => r.c1 + i + 1));
    },
  });
  t.set("OFFSET", {
    // An empty height or width (OFFSET(r,0,0,,)) keeps the reference's, as LibreOffice computes;
    // rows and columns default to 0 either way.
    emptyAsOmitted: true,
    min: 3,
    max: 5,
    param: classes("R", "V"),
    dynamic: true,
    call: ([base, rows, cols, height, width]) => {
      if (!(base instanceof XlRef)) return isError(base) ? base : err("#VALUE!", "OFFSET needs a reference");
      const dr = int(rows as Scalar | undefined);
      if (isError(dr)) return dr;
      const dc = int(cols as Scalar | undefined);
      if (isError(dc)) return dc;
      const h = int(height as Scalar | undefined, base.rows);
      if (isError(h)) return h;
      const w = int(width as Scalar | undefined, base.cols);
      if (isError(w)) return w;
      if (h < 1 || w < 1) return err("#REF!", "OFFSET's height and width must be at least 1");
      const r1 = base.r1 + dr;
      const c1 = base.c1 + dc;
      if (r1 < 0 || c1 < 0 || r1 + h - 1 >= MAX_ROWS || c1 + w - 1 >= MAX_COLS) return err("#REF!", "OFFSET moves off the sheet");
      return new XlRef(base.sheet, r1, c1, r1 + h - 1, c1 + w - 1);
    },
  });
  t.set("INDIRECT", {
    min: 1,
    max: 2,
    dynamic: true,
    call: ([s, a1], ctx) => {
      const style = a1 === undefined ? true : toBool(a1 as Scalar);
      if (isError(style)) return style;
      if (!style) return notComputed("INDIRECT with R1C1 references is not computed headless");
      const str = toText((s ?? null) as Scalar);
      if (isError(str)) return str;
      return parseReferenceText(str, ctx);
    },
  });
  t.set("TRANSPOSE", {
    min: 1,
    max: 1,
    param: classes("A"),
    noLift: true,
    call: ([a], ctx) => {
      const arr = arrayArg(a, ctx);
      if (isError(arr)) return arr;
      const data: Scalar[] = new Array(arr.rows * arr.cols);
      for (let r = 0; r < arr.rows; r++) for (let c = 0; c < arr.cols; c++) data[c * arr.rows + r] = arr.at(r, c) ?? 0;
      return new XlArray(arr.cols, arr.rows, data);
    },
  });
  // Criteria ranges are references, criteria values; they alternate.
  const pairsFrom = (first: number) => (i: number) => (i < first ? "R" : (i - first) % 2 === 0 ? "R" : "V") as "R" | "V";
  t.set("COUNTIF", { min: 2, max: 2, param: pairsFrom(0), noLift: true, call: ifsAggregate("count", false, false) });
  t.set("COUNTIFS", { min: 2, max: 254, param: pairsFrom(0), noLift: true, call: ifsAggregate("count", false, false) });
  t.set("SUMIF", { min: 2, max: 3, param: classes("R", "V", "R"), noLift: true, call: emptyRangeRefused("SUMIF", ifsAggregate("sum", true, false)) });
  t.set("AVERAGEIF", { min: 2, max: 3, param: classes("R", "V", "R"), noLift: true, call: emptyRangeRefused("AVERAGEIF", ifsAggregate("average", true, false)) });
  t.set("SUMIFS", { min: 3, max: 255, param: pairsFrom(1), noLift: true, call: ifsAggregate("sum", true, true) });
  t.set("AVERAGEIFS", { min: 3, max: 255, param: pairsFrom(1), noLift: true, call: ifsAggregate("average", true, true) });
  t.set("MINIFS", { min: 3, max: 255, param: pairsFrom(1), noLift: true, call: ifsAggregate("min", true, true) });
  t.set("MAXIFS", { min: 3, max: 255, param: pairsFrom(1), noLift: true, call: ifsAggregate("max", true, true) });
  void eachCell;
  void toArray;
}
