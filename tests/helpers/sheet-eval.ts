/**
 * (A helper: it holds no reference values of its own.) Computes the formulas of a small
 * hand-written one-sheet workbook in this process (src, not build/), the way `recalc` does:
 * read the package, plan, compute with the recalculation host. Results are read from the host,
 * so error messages survive. Contents are invented.
 */
import { readBook } from "../../src/engine/book";
import { RecalcHost } from "../../src/engine/host";
import { NotComputed } from "../../src/engine/formula/evaluate";
import { Scalar, XlError } from "../../src/engine/formula/values";
import { planRecalc } from "../../src/engine/plan";
import { SOIL_NAMES, SOIL_SIGNATURES } from "../../src/engine/soil";
import { openPackage } from "../../src/engine/xlsx-package";
import { c, da, f, xlsxBytes } from "./xlsx";

/** A formula cell: text (a legacy formula, implicitly intersected) or a dynamic-array formula with its spill range. */
export type FormulaSpec = string | { readonly da: string; readonly spill: string };

export interface Computed {
  /** A cell's value; an error as its code ("#N/A"); a cell not computed headless as "not computed: why". */
  (ref: string): Scalar | string;
  /** An error cell as "#CODE message". */
  full(ref: string): string;
}

function position(ref: string): { row: number; col: number } {
  const m = /^([A-Z]+)(\d+)$/.exec(ref);
  if (!m) throw new Error(`bad cell ${ref}`);
  let col = 0;
  for (const ch of m[1] as string) col = col * 26 + (ch.charCodeAt(0) - 64);
  return { row: Number(m[2]) - 1, col: col - 1 };
}

/** Computes `formulas` over the constant `cells` of one sheet named S. */
export async function compute(
  cells: Record<string, number | string | boolean>,
  formulas: Record<string, FormulaSpec>,
  options: { date1904?: boolean; names?: { name: string; text: string }[]; dynamic?: boolean } = {},
): Promise<Computed> {
  const all = new Map<string, string>();
  for (const [ref, v] of Object.entries(cells)) all.set(ref, c(ref, v));
  let dynamic = options.dynamic === true;
  for (const [ref, spec] of Object.entries(formulas)) {
    if (typeof spec === "string") all.set(ref, f(ref, spec));
    else {
      dynamic = true;
      all.set(ref, da(ref, spec.spill, spec.da));
    }
  }
  const byRow = new Map<number, { col: number; xml: string }[]>();
  for (const [ref, xml] of all) {
    const p = position(ref);
    const list = byRow.get(p.row) ?? [];
    list.push({ col: p.col, xml });
    byRow.set(p.row, list);
  }
  const rows = [...byRow.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([r, list]) => `<row r="${r + 1}">${list.sort((a, b) => a.col - b.col).map((x) => x.xml).join("")}</row>`)
    .join("");
  const bytes = xlsxBytes({ sheets: [{ name: "S", rows }], dynamic, ...(options.date1904 ? { date1904: true } : {}), ...(options.names ? { names: options.names } : {}) });
  const book = readBook(await openPackage(bytes), SOIL_NAMES);
  const host = new RecalcHost(book, planRecalc(book, SOIL_SIGNATURES), 4_000_000);
  host.computeAll();
  const raw = (ref: string): Scalar | { notComputed: string } => {
    const p = position(ref);
    try {
      return host.value(0, p.row, p.col);
    } catch (e) {
      if (e instanceof NotComputed) return { notComputed: e.message };
      throw e;
    }
  };
  const get = ((ref: string) => {
    const v = raw(ref);
    if (v instanceof XlError) return v.code;
    if (v !== null && typeof v === "object") return `not computed: ${v.notComputed}`;
    return v;
  }) as Computed;
  get.full = (ref: string) => {
    const v = raw(ref);
    if (v instanceof XlError) return `${v.code}${v.message ? ` ${v.message}` : ""}`;
    throw new Error(`${ref} is no error: ${JSON.stringify(v)}`);
  };
  return get;
}

/** A case of a function table: [formula, expected (an error as "#CODE message"), its source]. */
export type SheetCase = readonly [string, number | string | boolean, string];

/** Checks one computed cell: an error by code and message, a number that is not whole to 12 places, anything else exactly. */
export function checkCell(v: Computed, cell: string, want: number | string | boolean): void {
  if (typeof want === "string" && /^#[A-Z]/.test(want)) expect(v.full(cell)).toBe(want);
  else if (typeof want === "number" && !Number.isInteger(want)) expect(v(cell) as number).toBeCloseTo(want, 12);
  else expect(v(cell)).toBe(want);
}

/**
 * One describe block for a table of cases: every formula in column H (row i + 1 for case i) of one
 * sheet over `cells` and `formulas`, computed once, each case a test named with its source.
 */
export function describeSheetCases(
  title: string,
  cases: readonly SheetCase[],
  cells: Record<string, number | string | boolean>,
  formulas: Record<string, string> = {},
  options: { date1904?: boolean; names?: { name: string; text: string }[] } = {},
): void {
  describe(title, () => {
    let v: Computed;
    beforeAll(async () => {
      const all: Record<string, string> = { ...formulas };
      cases.forEach(([f], i) => (all[`H${i + 1}`] = f));
      v = await compute(cells, all, options);
    });
    it.each(cases.map(([f, want, source], i) => [f, want, source, i] as const))("%s is %p (%s)", (_f, want, _source, i) => {
      checkCell(v, `H${i + 1}`, want);
    });
  });
}
