/**
 * The same call in Excel and headless gives the same result: each generated case calls the
 * binding as Excel's custom-functions runtime would (2-D arrays, null for an omitted argument)
 * and evaluates the same arguments written as a formula literal with evaluateFormula. All
 * inputs are invented (fast-check). Fewer cases than the binding fuzzer: each builds an engine.
 */
import fc from "fast-check";
import { RegisteredFunction } from "../../src/engine/registry";
import { evaluateFormula, EvalResult } from "../../src/engine/evaluate";
import { FUNCTIONS, PARITY_RUNS, TIMEOUT, Words, params, plausibleNumber, finiteNumber, show, wordArb, wordsOf } from "./kit";

type Scalar = { t: "num"; n: number; text: string } | { t: "str"; s: string } | { t: "bool"; b: boolean };
type Lit = Scalar | { t: "blank" } | { t: "omit" } | { t: "array"; rows: Scalar[][] };

/** A cell the formula refers to but nothing fills: a blank argument. */
const EMPTY_REF = "$Z$1000";

function numberText(n: number, upper: boolean): string {
  if (Object.is(n, -0)) return "-0";
  const s = String(n);
  return upper ? s.toUpperCase() : s;
}

function formulaText(l: Lit): string {
  switch (l.t) {
    case "num":
      return l.text;
    case "str":
      return `"${l.s.replace(/"/g, '""')}"`;
    case "bool":
      return l.b ? "TRUE" : "FALSE";
    case "blank":
      return EMPTY_REF;
    case "omit":
      return "";
    case "array":
      return `{${l.rows.map((r) => r.map(formulaText).join(",")).join(";")}}`;
  }
}

function scalarValue(l: Scalar): unknown {
  return l.t === "num" ? l.n : l.t === "str" ? l.s : l.b;
}

/** What Excel hands the custom function for this argument. */
function excelArg(l: Lit): unknown {
  switch (l.t) {
    case "omit":
      return null;
    case "blank":
      return [[null]];
    case "array":
      return l.rows.map((r) => r.map(scalarValue));
    default:
      return [[scalarValue(l)]];
  }
}

/** Words a formula can carry as a string literal (no line breaks or control characters). */
const printable = (s: string) => !/[\u0000-\u001f\u007f-\u009f\u2028\u2029]/.test(s) && s.length <= 200;

function scalarArb(fn: RegisteredFunction, words: Words, i: number, kind: string): fc.Arbitrary<Scalar> {
  const num = fc
    .tuple(fc.oneof({ weight: 3, arbitrary: plausibleNumber(fn, i) }, { weight: 1, arbitrary: finiteNumber(fn) }), fc.boolean())
    .map(([n, upper]): Scalar => ({ t: "num", n: Object.is(n, -0) ? -0 : n, text: numberText(n, upper) }));
  const own = words.accepted.get(i) ?? [];
  const str = fc
    .oneof({ weight: own.length ? 4 : 0, arbitrary: own.length ? fc.constantFrom(...own) : fc.constant("x") }, { weight: 2, arbitrary: wordArb(words, i) })
    .filter(printable)
    .map((s): Scalar => ({ t: "str", s }));
  const numText = finiteNumber(fn).map((n): Scalar => ({ t: "str", s: String(n) }));
  const bool = fc.boolean().map((b): Scalar => ({ t: "bool", b }));
  return kind === "number"
    ? fc.oneof({ weight: 8, arbitrary: num }, { weight: 1, arbitrary: numText }, { weight: 1, arbitrary: str }, { weight: 1, arbitrary: bool })
    : fc.oneof({ weight: 8, arbitrary: str }, { weight: 1, arbitrary: num }, { weight: 1, arbitrary: bool });
}

function litArb(fn: RegisteredFunction, words: Words, i: number, common: { rows: number; cols: number }): fc.Arbitrary<Lit> {
  const p = fn.spec.params[i]!;
  const scalar = scalarArb(fn, words, i, p.kind);
  const grid = (rows: number, cols: number) =>
    fc.array(fc.array(scalar, { minLength: cols, maxLength: cols }), { minLength: rows, maxLength: rows }).map((r): Lit => ({ t: "array", rows: r }));
  const anyGrid = fc.record({ rows: fc.integer({ min: 1, max: 4 }), cols: fc.integer({ min: 1, max: 4 }) }).chain((s) => grid(s.rows, s.cols));
  const ascending = fc
    .array(plausibleNumber(fn, i), { minLength: 1, maxLength: 5 })
    .map((xs) => [...new Set(xs)].sort((a, b) => a - b).map((n): Scalar => ({ t: "num", n, text: numberText(n, false) })))
    .chain((xs) => fc.constantFrom<Lit>({ t: "array", rows: [xs] }, { t: "array", rows: xs.map((x) => [x]) }));
  return fc.oneof(
    { weight: 8, arbitrary: scalar as fc.Arbitrary<Lit> },
    { weight: p.kind === "range" ? 0 : 3, arbitrary: grid(common.rows, common.cols) },
    { weight: p.kind === "range" ? 4 : 1, arbitrary: anyGrid },
    { weight: p.kind === "range" ? 4 : 0, arbitrary: ascending },
    { weight: 1, arbitrary: fc.constant<Lit>({ t: "blank" }) },
    { weight: p.optional ? 3 : 1, arbitrary: fc.constant<Lit>({ t: "omit" }) },
  );
}

/**
 * Every argument of a call. Trailing omitted optional ones are left out of the formula; a
 * required one is written as an empty argument (`F(1,)`), except that a call cannot be written
 * with none at all (`F()` has no arguments, which both Excel and the engine refuse): a lone
 * omitted required argument becomes a blank cell.
 */
function callArb(fn: RegisteredFunction, words: Words): fc.Arbitrary<Lit[]> {
  return fc
    .record({ rows: fc.integer({ min: 1, max: 3 }), cols: fc.integer({ min: 1, max: 3 }) })
    .chain((common) => fc.tuple(...fn.spec.params.map((_, i) => litArb(fn, words, i, common))))
    .map((lits) => {
      const list = [...lits];
      const written = list.length - [...list].reverse().findIndex((l, k) => !(l.t === "omit" && fn.spec.params[list.length - 1 - k]!.optional));
      if (written === list.length + 1 || (written === 1 && list[0]!.t === "omit")) {
        // nothing but omitted optional arguments, or a lone omitted required one
        if (list.length && !fn.spec.params[0]!.optional && list[0]!.t === "omit") list[0] = { t: "blank" };
      }
      return list;
    });
}

function formulaOf(fn: RegisteredFunction, lits: Lit[]): string {
  const list = [...lits];
  while (list.length && list[list.length - 1]!.t === "omit" && fn.spec.params[list.length - 1]!.optional) list.pop();
  return `=${fn.formulaName}(${list.map(formulaText).join(",")})`;
}

/** A host error value (plain before the engine registers its factory: kind; the engine's own: code). */
interface HostError {
  kind: string;
  message: string;
}
const isHostError = (c: unknown): c is HostError => typeof c === "object" && c !== null && ("kind" in c || "code" in c) && "message" in c;
const kindOf = (c: HostError) => ("code" in c ? (c as unknown as { code: string }).code : c.kind);

/** A binding result cell in the engine's terms: errors as "#KIND message". */
function asEngine(cell: unknown): unknown {
  if (isHostError(cell)) return `${kindOf(cell)} ${cell.message}`;
  return cell;
}

function same(a: unknown, b: unknown): boolean {
  const blank = (x: unknown) => x === "" || x === null || x === undefined;
  if (blank(a) && blank(b)) return true;
  return Object.is(a, b) || (a === 0 && b === 0);
}

function mismatch(excel: unknown[][], engine: EvalResult): string | undefined {
  const top = excel[0]![0];
  const rows = excel.length === 1 && excel[0]!.length === 1 ? undefined : excel;
  if (!rows && isHostError(top)) {
    if (engine.error !== kindOf(top) || engine.message !== top.message) return `Excel ${asEngine(top)}, engine ${engine.error} ${engine.message}`;
    return undefined;
  }
  // A spill is compared element by element, errors included (an error in the first element must not hide the rest).
  if (!rows && engine.error) return `Excel ${show(excel.map((r) => r.map(asEngine)))}, engine error ${engine.error} ${engine.message}`;
  if (!rows) return same(top, engine.value) ? undefined : `Excel ${show(top)}, engine ${show(engine.value)}`;
  const got = engine.value;
  if (!Array.isArray(got) || got.length !== rows.length || got.some((r, i) => !Array.isArray(r) || r.length !== rows[i]!.length)) {
    return `shape: Excel ${rows.length}×${rows[0]!.length}, engine ${show(got)}`;
  }
  for (let r = 0; r < rows.length; r++) {
    for (let c = 0; c < rows[r]!.length; c++) {
      const want = asEngine(rows[r]![c]);
      const have = (got[r] as unknown[])[c];
      if (!same(want, have)) return `[${r}][${c}]: Excel ${show(want)}, engine ${show(have)}`;
    }
  }
  return undefined;
}

describe.each(FUNCTIONS.map((f) => [f.formulaName, f] as const))("%s", (_, fn) => {
  const words = wordsOf(fn);
  it(`gives the same result in Excel's binding and the headless engine (${PARITY_RUNS} cases)`, () => {
    fc.assert(
      fc.property(callArb(fn, words), (lits) => {
        const formula = formulaOf(fn, lits);
        const excel = fn.binding(...lits.map(excelArg));
        const engine = evaluateFormula(formula, { blankReferences: true });
        const problem = mismatch(excel, engine);
        if (problem) throw new Error(`${formula}\n${problem}`);
      }),
      params(fn, PARITY_RUNS, "parity"),
    );
  }, TIMEOUT);
});
