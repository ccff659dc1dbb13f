/**
 * The shared host case table (tests/hosts/cases.ts, each case naming its Source) through the
 * headless engine: each case typed as a user would type it and evaluated with evaluateFormula.
 * The browser test checks the built bundle against the same table.
 */
import associations from "../../generated/associations.json";
import { CASES, formulaOf, mismatches } from "./cases";
import { engineResult } from "./harness";

describe("host case table, headless engine", () => {
  it.each(CASES.map((c) => [formulaOf(c), c] as const))("%s", (_formula, c) => {
    expect(mismatches(c, engineResult(c))).toEqual([]);
  });

  it("covers every area that has functions, and only ids that exist", () => {
    const areas = new Set((associations as { module: string }[]).map((a) => a.module));
    const ids = new Set((associations as { id: string }[]).map((a) => a.id));
    const covered = new Set(CASES.map((c) => c.area));
    const missing = [...areas].filter((a) => !covered.has(a));
    expect({ areasWithoutACase: missing }).toEqual({ areasWithoutACase: [] });
    expect(CASES.filter((c) => !ids.has(c.id)).map((c) => c.id)).toEqual([]);
  });

  it("has value, spill, blank and error cases, and both error kinds", () => {
    const shapes = CASES.map((c) => JSON.stringify(c.expected));
    expect(CASES.some((c) => Array.isArray(c.expected))).toBe(true);
    expect(shapes.some((s) => s.includes('""'))).toBe(true);
    expect(shapes.some((s) => s.includes('"#VALUE!"'))).toBe(true);
    expect(shapes.some((s) => s.includes('"#N/A"'))).toBe(true);
  });
});
