/**
 * Fuzzing every registered function, as Excel calls it and as core is called directly.
 * Inputs are invented (fast-check): extreme and non-finite numbers, numeric and hostile text,
 * booleans, blanks, error values, ranges of odd shapes and mixed contents, near-miss names.
 *
 * Invariants: a binding never throws; every result cell is a finite number, a text, a blank or
 * an error value with kind #VALUE!/#N/A and a message (never an "internal error", which is how
 * the binding reports anything core threw that was not a SoilError, or a non-finite result);
 * core (the binding's element callback) throws nothing but SoilError and returns only a finite
 * number, a text or null.
 */
import fc from "fast-check";
import { SOIL_ERROR_CODES, SoilError } from "../../src/core/errors";
import { ElementResult } from "../../src/functions/_binding";
import { FUNCTIONS, RUNS, TIMEOUT, argsFor, coreValuesFor, params, resultProblems, show, wordsOf } from "./kit";

interface Tally {
  cases: number;
  values: number;
  errors: number;
}
const tallies = new Map<string, { binding: Tally; core: Tally }>();

afterAll(() => {
  if (!process.env.FUZZ_REPORT) return;
  const rows = [...tallies].map(([id, t]) => `${id}\tbinding ${t.binding.cases} cases (${t.binding.values} value cells, ${t.binding.errors} error cells)\tcore ${t.core.cases} calls (${t.core.values} values)`);
  process.stdout.write(`${rows.join("\n")}\n`);
});

describe.each(FUNCTIONS.map((f) => [f.formulaName, f] as const))("%s", (_, fn) => {
  const words = wordsOf(fn);
  const tally = { binding: { cases: 0, values: 0, errors: 0 }, core: { cases: 0, values: 0, errors: 0 } };
  tallies.set(fn.id, tally);

  it(`binding: never throws, every cell well formed (${RUNS} cases)`, () => {
    fc.assert(
      fc.property(argsFor(fn, words), (args) => {
        let result: unknown;
        try {
          result = fn.binding(...args);
        } catch (e) {
          throw new Error(`threw ${(e as Error).stack ?? String(e)}\nargs ${show(args)}`);
        }
        const problems = resultProblems(result);
        if (problems.length) throw new Error(`${problems.join("; ")}\nargs ${show(args)}`);
        tally.binding.cases += 1;
        for (const row of result as unknown[][]) for (const c of row) typeof c === "object" ? (tally.binding.errors += 1) : (tally.binding.values += 1);
      }),
      params(fn, RUNS, "binding"),
    );
  }, TIMEOUT);

  it(`core: throws only SoilError, returns only finite numbers or text (${RUNS} calls)`, () => {
    const element = fn.spec.element as (...v: unknown[]) => ElementResult;
    fc.assert(
      fc.property(coreValuesFor(fn, words), (values) => {
        let out: unknown;
        try {
          out = element(...values);
        } catch (e) {
          if (!(e instanceof SoilError)) throw new Error(`threw ${(e as Error).stack ?? String(e)}\nvalues ${show(values)}`);
          if (!SOIL_ERROR_CODES.includes(e.code)) throw new Error(`unknown code ${e.code}`);
          if (!e.message.trim()) throw new Error(`SoilError ${e.code} without a message\nvalues ${show(values)}`);
          tally.core.cases += 1;
          tally.core.errors += 1;
          return;
        }
        const ok = out === null || typeof out === "string" || (typeof out === "number" && Number.isFinite(out));
        if (!ok) throw new Error(`returned ${show(out)}\nvalues ${show(values)}`);
        tally.core.cases += 1;
        tally.core.values += 1;
      }),
      params(fn, RUNS, "core"),
    );
  }, TIMEOUT);
});
