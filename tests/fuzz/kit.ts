/**
 * The generic fuzzer's parts, driven by the engine registry: every function with its declared
 * parameters gets the same hostile inputs, so a function added later is covered without a line
 * here. All generated values are invented (no science is checked here, only robustness).
 *
 * Case counts: FUZZ_RUNS per function and property (200 in `npm test`, 10,000 in `npm run fuzz`);
 * FUZZ_PARITY_RUNS for the engine comparison (each builds an engine, ~20 ms). FUZZ_SEED fixes the
 * seed; without it `npm test` uses a fixed seed per function and `npm run fuzz` a random one.
 */
import fc from "fast-check";
import { REGISTRY, RegisteredFunction } from "../../src/engine/registry";
import { aboutFunction } from "../../src/core/about";
import { Param, PlainHostError } from "../../src/functions/_binding";

export const RUNS = Number(process.env.FUZZ_RUNS ?? 200);
/** True under `npm run fuzz` (an explicit FUZZ_RUNS). */
export const DEEP = process.env.FUZZ_RUNS !== undefined;
export const PARITY_RUNS = Number(process.env.FUZZ_PARITY_RUNS ?? (DEEP ? Math.max(50, Math.round(RUNS / 20)) : 15));
/** Per-test time limit: the suite's 60 s, or more for deep runs (LIMEBUFFER takes ~6 ms a case). */
export const TIMEOUT = Math.max(60000, RUNS * 30, PARITY_RUNS * 100);

export const FUNCTIONS: readonly RegisteredFunction[] = REGISTRY;

/** fast-check parameters for one function's property. */
export function params(fn: RegisteredFunction, numRuns: number, salt: string): fc.Parameters<unknown> {
  const fixed = process.env.FUZZ_SEED;
  const seed = fixed !== undefined && fixed !== "random" ? Number(fixed) : DEEP ? undefined : hash(`${fn.id}:${salt}`);
  return { numRuns, ...(seed === undefined ? {} : { seed }) };
}

function hash(s: string): number {
  let h = 2166136261;
  for (let i = 0; i < s.length; i++) h = Math.imul(h ^ s.charCodeAt(i), 16777619);
  return h | 0;
}

// ---------------------------------------------------------------------------------------------
// Words: from the function's own description, parameter descriptions and ABOUT line, from the
// choices its UNKNOWN_NAME messages list, near-misses of those, and generic hostile text.

const STOP = new Set(["the", "and", "for", "from", "with", "that", "this", "into", "when", "than", "each", "only", "same"]);

function tokens(text: string | undefined): string[] {
  if (!text) return [];
  return text
    .split(/[\s,;:()[\]]+/)
    .map((t) => t.replace(/^[.'"“”]+|[.'"“”]+$/g, ""))
    .filter((t) => /[A-Za-z]/.test(t) && t.length <= 24 && !STOP.has(t.toLowerCase()));
}

function about(id: string): string | undefined {
  try {
    return aboutFunction(id);
  } catch {
    return undefined;
  }
}

/** Choices listed by UNKNOWN_NAME messages ("…; use a, b or c"). */
export function listedChoices(message: string): string[] {
  const m = /;\s*use\s+(.+?)\.?$/.exec(message);
  if (!m) return [];
  return (m[1] as string)
    .split(/,\s*|\s+or\s+/)
    .map((w) => w.trim())
    .filter((w) => w.length > 0 && w.length <= 40);
}

const PROBE = "zzqx-probe";

/** The words a function declares or accepts, per text/range parameter and overall. */
export function wordsOf(fn: RegisteredFunction): { all: string[]; byParam: Map<number, string[]>; accepted: Map<number, string[]> } {
  const all = new Set<string>([...tokens(fn.meta.description), ...tokens(about(fn.id))]);
  const byParam = new Map<number, string[]>();
  const accepted = new Map<number, string[]>();
  fn.meta.parameters.forEach((p, i) => {
    const words = tokens(p.description);
    byParam.set(i, words);
    words.forEach((w) => all.add(w));
  });
  // Ask the binding itself: an unknown word in each text parameter, the others plausible.
  fn.spec.params.forEach((p, i) => {
    if (p.kind !== "text") return;
    const found = new Set<string>();
    for (let trial = 0; trial < 6; trial++) {
      const args = fn.spec.params.map((q, j) => {
        if (j === i) return [[PROBE]];
        if (q.kind === "number") return [[[1, 10, 0.5, 2, 100, 7][trial]]];
        if (q.kind === "cell") return [[LAB_TEXTS[trial % LAB_TEXTS.length]]];
        if (q.kind === "range") return [[1, 2, 3, 4]];
        const pool = accepted.get(j) ?? byParam.get(j) ?? [];
        return q.optional && trial % 2 === 0 ? null : [[pool[trial % Math.max(1, pool.length)] ?? "x"]];
      });
      for (const row of safeCall(fn, args)) {
        for (const cell of row) {
          if (cell instanceof PlainHostError && cell.message.includes(PROBE)) listedChoices(cell.message).forEach((w) => found.add(w));
        }
      }
    }
    if (found.size) accepted.set(i, [...found]);
    byParam.set(i, [...new Set([...(byParam.get(i) ?? []), ...found])]);
    found.forEach((w) => all.add(w));
  });
  return { all: [...all], byParam, accepted };
}

function safeCall(fn: RegisteredFunction, args: unknown[]): unknown[][] {
  try {
    const r = fn.binding(...args);
    return Array.isArray(r) ? r.filter(Array.isArray) : [];
  } catch {
    return [];
  }
}

const LOOKALIKE: Record<string, string> = { a: "а", o: "0", l: "1", u: "µ", e: "е", "/": "∕", c: "с", p: "р", "2": "₂", "3": "³" };

/** Near-misses of a word: case, spacing, one-character edits, look-alike characters. */
export function nearMisses(w: string): string[] {
  const out = [w.toUpperCase(), w.toLowerCase(), ` ${w} `, `${w}s`, `${w}.`, w.slice(1), w.slice(0, -1), `${w}${w.slice(-1)}`];
  if (w.length > 1) out.push(w[1] + w[0] + w.slice(2), w.slice(0, -2) + w.slice(-1) + w.slice(-2, -1));
  out.push(`${w}\u200b`, `\u00a0${w}`, `${w}\u0000`, w.normalize("NFD"), `${w}/`, `'${w}`, w.replace(/\//g, " per "), w.replace(/\s+/g, ""));
  for (const [from, to] of Object.entries(LOOKALIKE)) if (w.includes(from)) out.push(w.replace(from, to));
  return out.filter((x) => x !== w);
}

export const GENERIC_TEXT: readonly string[] = [
  "",
  " ",
  "\t",
  "\n",
  "__proto__",
  "constructor",
  "toString",
  "hasOwnProperty",
  "valueOf",
  "prototype",
  "NaN",
  "Infinity",
  "-Infinity",
  "undefined",
  "null",
  "true",
  "FALSE",
  "#N/A",
  "#VALUE!",
  "=1+1",
  "😀",
  "x".repeat(10000),
  "1e309",
  "-1e309",
  "0x10",
  "1,5",
  "<0.5",
  ">100",
  "5%",
  " 12 ",
  "+1",
  "-0",
  "1_000",
  "١٢",
  "１２",
  ".",
  "e5",
  "1e",
  "--1",
  "mg/kg",
  "ppm",
  "kg/ha",
  "%",
];

// ---------------------------------------------------------------------------------------------
// Numbers

const EXTREMES: readonly number[] = [
  0, -0, 1, -1, 0.5, -0.5, 2, 10, 100, 1000, 1e6, 1e9, 1e15, 1e300, -1e300, 1e308, -1e308, Number.MAX_VALUE, -Number.MAX_VALUE,
  5e-324, -5e-324, 2.2250738585072014e-308, Number.EPSILON, 1e-300, 1e-12, Number.MAX_SAFE_INTEGER, -Number.MAX_SAFE_INTEGER,
  0.1, 0.3, 7, 14, 14.000001, 2.65, 300, 4, 3.5, 100.0000001, 99.9999999,
];

/** Numbers named in a parameter's description (its range limits), with neighbours either side. */
export function declaredNumbers(fn: RegisteredFunction): number[] {
  const out = new Set<number>();
  for (const p of fn.meta.parameters) {
    for (const m of (p.description ?? "").matchAll(/-?\d+(\.\d+)?/g)) {
      const n = Number(m[0]);
      if (!Number.isFinite(n)) continue;
      for (const x of [n, -n, n + 1e-9, n - 1e-9, n * (1 + 1e-12), n + 1, n - 1]) out.add(x);
    }
  }
  return [...out];
}

export function finiteNumber(fn: RegisteredFunction): fc.Arbitrary<number> {
  const declared = declaredNumbers(fn);
  return fc.oneof(
    { weight: 3, arbitrary: fc.constantFrom(...EXTREMES) },
    { weight: declared.length ? 3 : 0, arbitrary: declared.length ? fc.constantFrom(...declared) : fc.constant(0) },
    { weight: 4, arbitrary: fc.double({ min: 0, max: 200, noNaN: true }) },
    { weight: 2, arbitrary: fc.integer({ min: -5, max: 20000 }) },
    { weight: 2, arbitrary: fc.double({ noNaN: true, noDefaultInfinity: true }) },
  );
}

/** The range a parameter's description declares ("(0 to 300)", "0–14", "at most 250"), else 0–100. */
export function declaredRange(description: string | undefined): [number, number] {
  const d = description ?? "";
  const m = /(-?\d+(?:\.\d+)?)\s*(?:–|-|to)\s*(?:below\s+)?(-?\d+(?:\.\d+)?)/.exec(d);
  if (m && Number(m[1]) < Number(m[2])) return [Number(m[1]), Number(m[2])];
  const most = /at most (\d+(?:\.\d+)?)/.exec(d);
  return [0, most ? Number(most[1]) : 100];
}

/** A number inside the parameter's declared range, most of the time. */
export function plausibleNumber(fn: RegisteredFunction, i: number): fc.Arbitrary<number> {
  const [lo, hi] = declaredRange(fn.meta.parameters[i]?.description);
  return fc.oneof(
    { weight: 6, arbitrary: fc.double({ min: lo, max: hi, noNaN: true }) },
    { weight: 2, arbitrary: fc.integer({ min: Math.ceil(lo), max: Math.floor(hi) }) },
    { weight: 1, arbitrary: fc.constantFrom(lo, hi, (lo + hi) / 2) },
  );
}

/** Any number a caller could hand core directly, non-finite ones included. */
export function anyNumber(fn: RegisteredFunction): fc.Arbitrary<number> {
  return fc.oneof({ weight: 9, arbitrary: finiteNumber(fn) }, { weight: 1, arbitrary: fc.constantFrom(NaN, Infinity, -Infinity) });
}

// ---------------------------------------------------------------------------------------------
// Cells, ranges and arguments as hosts pass them

export type Words = ReturnType<typeof wordsOf>;

export function wordArb(words: Words, index: number): fc.Arbitrary<string> {
  const own = words.byParam.get(index) ?? [];
  const near = [...new Set([...own, ...words.all].flatMap(nearMisses))];
  return fc.oneof(
    { weight: own.length ? 6 : 0, arbitrary: own.length ? fc.constantFrom(...own) : fc.constant("x") },
    { weight: 2, arbitrary: words.all.length ? fc.constantFrom(...words.all) : fc.constant("x") },
    { weight: 3, arbitrary: near.length ? fc.constantFrom(...near) : fc.constant("x") },
    { weight: 2, arbitrary: fc.constantFrom(...GENERIC_TEXT) },
    { weight: 1, arbitrary: fc.string({ maxLength: 12 }) },
    { weight: 1, arbitrary: fc.string({ unit: "binary", maxLength: 6 }) },
  );
}

const upstreamError = () => new PlainHostError("#N/A", "an upstream error");

/** Text that looks like a number, as a lab export may hold it. */
function numericText(fn: RegisteredFunction): fc.Arbitrary<string> {
  return fc.oneof(
    finiteNumber(fn).map((n) => String(n)),
    finiteNumber(fn).map((n) => ` ${n.toExponential()} `),
    fc.constantFrom("1e309", "-1e309", "1e-400", "12.5", "+3", ".5", "5.", "1E5", "0012", "1,5", "<0.5", "n.d.", "-"),
  );
}

const BLANKS = [null, undefined, "", "  "] as const;

/** Result cells as lab exports hold them: censored, locally formatted, words. */
export const LAB_TEXTS: readonly string[] = [
  "<0.5", "< 0.05", "<=2", "≤0.1", ">300", ">= 1e3", "≥5", "n.d.", "ND", "trace", "tr.", "n.a.", "N/A", "1 250", "1\u00a0250,5",
  "12,5", "1,250", "1.250", "1.250,5", "1,250.5", "<0,05", "<0", "<-1", "<", ">", "-", "—", "<LOD", "12.5 mg/kg", "1 25", "١٢", "1e309",
];

/** One cell of a cell argument (read by the function itself): numbers and lab texts. */
export function labCell(fn: RegisteredFunction): fc.Arbitrary<unknown> {
  return fc.oneof(
    { weight: 6, arbitrary: fc.constantFrom(...LAB_TEXTS) },
    { weight: 4, arbitrary: finiteNumber(fn) },
    { weight: 2, arbitrary: numericText(fn) },
    { weight: 1, arbitrary: fc.constantFrom(NaN, Infinity, -Infinity) },
    { weight: 2, arbitrary: fc.constantFrom(...BLANKS) },
    { weight: 1, arbitrary: fc.boolean() },
    { weight: 1, arbitrary: fc.constantFrom(...GENERIC_TEXT) },
    { weight: 1, arbitrary: fc.string({ maxLength: 10 }) },
    { weight: 1, arbitrary: fc.constant(null).map(upstreamError) },
    { weight: 1, arbitrary: fc.constantFrom({}, [], new Date(0)) },
  );
}

/** One cell of a numeric argument. */
export function numberCell(fn: RegisteredFunction): fc.Arbitrary<unknown> {
  return fc.oneof(
    { weight: 12, arbitrary: finiteNumber(fn) },
    { weight: 1, arbitrary: fc.constantFrom(NaN, Infinity, -Infinity) },
    { weight: 3, arbitrary: numericText(fn) },
    { weight: 2, arbitrary: fc.constantFrom(...BLANKS) },
    { weight: 1, arbitrary: fc.boolean() },
    { weight: 1, arbitrary: fc.constantFrom(...GENERIC_TEXT) },
    { weight: 1, arbitrary: fc.constant(null).map(upstreamError) },
    { weight: 1, arbitrary: fc.constantFrom({}, [], new Date(0), [[1]]) },
  );
}

/** One cell of a text argument. */
export function textCell(fn: RegisteredFunction, words: Words, index: number): fc.Arbitrary<unknown> {
  return fc.oneof(
    { weight: 12, arbitrary: wordArb(words, index) },
    { weight: 2, arbitrary: finiteNumber(fn) },
    { weight: 2, arbitrary: fc.constantFrom(...BLANKS) },
    { weight: 1, arbitrary: fc.boolean() },
    { weight: 1, arbitrary: fc.constant(null).map(upstreamError) },
    { weight: 1, arbitrary: fc.constantFrom({}, [], new Date(0)) },
  );
}

/** Any cell of a whole-range argument: numbers, words, blanks, booleans, errors. */
export function rangeCell(fn: RegisteredFunction, words: Words, index: number): fc.Arbitrary<unknown> {
  return fc.oneof(
    { weight: 6, arbitrary: finiteNumber(fn) },
    { weight: 3, arbitrary: wordArb(words, index) },
    { weight: 1, arbitrary: numericText(fn) },
    { weight: 1, arbitrary: fc.constantFrom(...BLANKS) },
    { weight: 1, arbitrary: fc.boolean() },
    { weight: 1, arbitrary: fc.constant(null).map(upstreamError) },
  );
}

export interface Shape {
  rows: number;
  cols: number;
}

function grid(cell: fc.Arbitrary<unknown>, shape: Shape): fc.Arbitrary<unknown[][]> {
  return fc.array(fc.array(cell, { minLength: shape.cols, maxLength: shape.cols }), { minLength: shape.rows, maxLength: shape.rows });
}

const anyShape = fc.record({ rows: fc.integer({ min: 1, max: 4 }), cols: fc.integer({ min: 1, max: 4 }) });

/** Grids of odd shapes: empty, a row with no cells, jagged rows, a bare value. */
function oddGrid(cell: fc.Arbitrary<unknown>): fc.Arbitrary<unknown> {
  return fc.oneof(
    fc.constant([]),
    fc.constant([[]]),
    fc.array(fc.array(cell, { maxLength: 4 }), { minLength: 1, maxLength: 4 }), // jagged
    cell, // a bare value (a direct caller, not Excel)
    cell.map((c) => [c]), // a 1-D array
  );
}

/** A broadcast argument: one cell, a range of the case's common shape, another shape, or odd. */
function broadcastArg(cell: fc.Arbitrary<unknown>, common: Shape): fc.Arbitrary<unknown> {
  return fc.oneof(
    { weight: 8, arbitrary: cell.map((c) => [[c]]) },
    { weight: 4, arbitrary: grid(cell, common) },
    { weight: 1, arbitrary: anyShape.chain((s) => grid(cell, s)) },
    { weight: 1, arbitrary: oddGrid(cell) },
  );
}

/** Ascending numbers, so limit lists and calibration tables get past their first check. */
function ascending(fn: RegisteredFunction): fc.Arbitrary<unknown[][]> {
  return fc
    .array(finiteNumber(fn), { minLength: 1, maxLength: 6 })
    .map((xs) => [...new Set(xs)].sort((a, b) => a - b))
    .chain((xs) => fc.constantFrom([xs], xs.map((x) => [x])));
}

/** Percentages that add up to about 100, as a row or a column (size classes, compositions). */
function composition(): fc.Arbitrary<unknown[][]> {
  return fc
    .array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 6 })
    .chain((ws) => {
      const sum = ws.reduce((a, b) => a + b, 0) || 1;
      const parts = ws.map((w) => (100 * w) / sum);
      return fc.constantFrom([parts], parts.map((x) => [x]));
    });
}

/** A calibration-like table: a header row, a left column, numbers in the body. */
function table(fn: RegisteredFunction, i: number): fc.Arbitrary<unknown[][]> {
  return fc
    .record({ rows: fc.integer({ min: 2, max: 6 }), cols: fc.integer({ min: 2, max: 6 }) })
    .chain((s) => grid(plausibleNumber(fn, i), s))
    .map((g) => {
      const sorted = (xs: number[]) => [...xs].sort((a, b) => a - b);
      const head = sorted(g[0] as number[]);
      const left = sorted(g.map((r) => r[0] as number));
      return g.map((r, ri) => (ri === 0 ? [null, ...head.slice(1)] : [left[ri], ...r.slice(1)]));
    });
}

function rangeArg(fn: RegisteredFunction, words: Words, index: number): fc.Arbitrary<unknown> {
  const cell = rangeCell(fn, words, index);
  return fc.oneof(
    { weight: 3, arbitrary: anyShape.chain((s) => grid(cell, s)) },
    { weight: 3, arbitrary: ascending(fn) },
    { weight: 2, arbitrary: composition() },
    { weight: 1, arbitrary: table(fn, index) },
    { weight: 2, arbitrary: wordArb(words, index).map((w) => [[w]]) },
    { weight: 2, arbitrary: fc.array(wordArb(words, index), { minLength: 1, maxLength: 6 }).chain((ws) => fc.constantFrom([ws], ws.map((w) => [w]))) },
    { weight: 1, arbitrary: fc.record({ rows: fc.integer({ min: 1, max: 40 }), cols: fc.integer({ min: 1, max: 8 }) }).chain((s) => grid(cell, s)) },
    { weight: 1, arbitrary: oddGrid(cell) },
  );
}

/** A range argument that is likely valid: ascending limits, a composition, a table, own words. */
function plausibleRange(fn: RegisteredFunction, words: Words, index: number): fc.Arbitrary<unknown[][]> {
  const own = words.accepted.get(index) ?? words.byParam.get(index) ?? [];
  return fc.oneof(
    ascending(fn),
    composition(),
    table(fn, index),
    own.length ? fc.array(fc.constantFrom(...own), { minLength: 1, maxLength: 6 }).chain((ws) => fc.constantFrom([ws], ws.map((w) => [w]))) : composition(),
  );
}

export function cellFor(fn: RegisteredFunction, words: Words, p: Param, i: number): fc.Arbitrary<unknown> {
  if (p.kind === "cell") return labCell(fn);
  return p.kind === "number" ? numberCell(fn) : p.kind === "text" ? textCell(fn, words, i) : rangeCell(fn, words, i);
}

/** A cell likely to be valid for its parameter: a number in range, one of its own words. */
function plausibleCell(fn: RegisteredFunction, words: Words, p: Param, i: number): fc.Arbitrary<unknown> {
  if (p.kind === "number") return plausibleNumber(fn, i);
  if (p.kind === "cell") return fc.oneof(plausibleNumber(fn, i), fc.constantFrom(...LAB_TEXTS));
  const own = words.accepted.get(i) ?? words.byParam.get(i) ?? [];
  return own.length ? fc.constantFrom(...own) : wordArb(words, i);
}

/**
 * A whole argument list as Excel (or a direct caller) would pass it: 2-D arrays, null or
 * undefined for omitted arguments, sometimes too few or one too many. Each argument is either
 * plausible (in its declared range, one of its own words) or hostile, so cases reach past the
 * first check as well as into it.
 */
export function argsFor(fn: RegisteredFunction, words: Words): fc.Arbitrary<unknown[]> {
  const ps = fn.spec.params;
  return anyShape.chain((common) => {
    const each = ps.map((p, i) => {
      const hostile = p.kind === "range" ? rangeArg(fn, words, i) : broadcastArg(cellFor(fn, words, p, i), common);
      const plausible = p.kind === "range" ? plausibleRange(fn, words, i) : broadcastArg(plausibleCell(fn, words, p, i), common);
      return fc.oneof(
        { weight: p.optional ? 3 : 1, arbitrary: fc.constantFrom(null, undefined) },
        { weight: 7, arbitrary: plausible },
        { weight: 3, arbitrary: hostile },
      );
    });
    return fc.tuple(fc.tuple(...each), fc.nat({ max: 19 }), numberCell(fn)).map(([args, cut, extra]) => {
      const list = [...args] as unknown[];
      if (cut === 0) return list.slice(0, Math.max(0, list.length - 1)); // one argument short
      if (cut === 1) return [...list, [[extra]]]; // one too many
      return list;
    });
  });
}

/** The values an element callback (the core call) may receive, of each parameter's own kind. */
export function coreValuesFor(fn: RegisteredFunction, words: Words): fc.Arbitrary<unknown[]> {
  const each = fn.spec.params.map((p, i) => {
    const value: fc.Arbitrary<unknown> = coreValueOf(fn, words, p, i);
    return p.optional ? fc.oneof({ weight: 1, arbitrary: fc.constant(undefined) }, { weight: 3, arbitrary: value }) : value;
  });
  return fc.tuple(...each).map((v) => [...v]);
}

function coreValueOf(fn: RegisteredFunction, words: Words, p: Param, i: number): fc.Arbitrary<unknown> {
  switch (p.kind) {
    case "number":
      return fc.oneof({ weight: 4, arbitrary: plausibleNumber(fn, i) }, { weight: 1, arbitrary: anyNumber(fn) });
    case "cell":
      return fc.oneof({ weight: 3, arbitrary: fc.constantFrom(...LAB_TEXTS) }, { weight: 2, arbitrary: anyNumber(fn) }, { weight: 1, arbitrary: fc.string({ maxLength: 10 }) });
    case "text":
      return fc.oneof({ weight: 4, arbitrary: plausibleCell(fn, words, p, i) as fc.Arbitrary<string> }, { weight: 1, arbitrary: wordArb(words, i) });
    case "range":
      return fc.oneof(
        { weight: 4, arbitrary: plausibleRange(fn, words, i).map((g) => g.map((r) => r.map(coreCell))) },
        { weight: 1, arbitrary: rangeArg(fn, words, i).filter((g) => Array.isArray(g) && g.every(Array.isArray)).map((g) => (g as unknown[][]).map((r) => r.map(coreCell))) },
        { weight: 1, arbitrary: fc.constant([] as unknown[][]) },
      );
  }
}

/** A range cell as the binding hands it to core: number, string, boolean or null. */
function coreCell(c: unknown): number | string | boolean | null {
  if (c === null || c === undefined) return null;
  if (typeof c === "number" || typeof c === "string" || typeof c === "boolean") return c;
  return null;
}

// ---------------------------------------------------------------------------------------------
// Invariants

const KINDS = new Set(["#VALUE!", "#N/A"]);

/** Problems with one binding result, or [] when it is well formed. */
export function resultProblems(result: unknown): string[] {
  if (!Array.isArray(result) || result.length === 0) return [`result is not rows of cells: ${show(result)}`];
  const problems: string[] = [];
  const width = Array.isArray(result[0]) ? result[0].length : -1;
  result.forEach((row, r) => {
    if (!Array.isArray(row) || row.length === 0) {
      problems.push(`row ${r} is not a non-empty array: ${show(row)}`);
      return;
    }
    if (row.length !== width) problems.push(`row ${r} has ${row.length} cells, row 0 has ${width}`);
    row.forEach((cell, c) => {
      const where = `[${r}][${c}]`;
      if (typeof cell === "number") {
        if (!Number.isFinite(cell)) problems.push(`${where} is ${cell}`);
        else if (Object.is(cell, -0)) problems.push(`${where} is -0`);
      } else if (typeof cell === "string") {
        // text results and "" (blank) are fine
      } else if (cell instanceof PlainHostError) {
        if (!KINDS.has(cell.kind)) problems.push(`${where} has error kind ${show(cell.kind)}`);
        if (typeof cell.message !== "string" || cell.message.trim() === "") problems.push(`${where} error has no message`);
        else if (/^internal error/.test(cell.message)) problems.push(`${where} ${cell.message}`);
      } else {
        problems.push(`${where} is ${show(cell)}`);
      }
    });
  });
  return problems;
}

export function show(v: unknown): string {
  try {
    const s = JSON.stringify(v, (_, x) => (typeof x === "number" && !Number.isFinite(x) ? String(x) : x === undefined ? "undefined" : x));
    return (s ?? String(v)).slice(0, 300);
  } catch {
    return String(v).slice(0, 300);
  }
}
