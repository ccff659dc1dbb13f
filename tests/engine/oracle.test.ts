/**
 * The outside oracle: every native formula of the corpus (tests/fixtures/corpus, made by
 * scripts/oracle/make-corpus.js) must give what LibreOffice Calc computes (or, where Excel 365
 * differs from Calc by design, Excel's value from excel-overrides.json, each with its published
 * source), and every SOIL cell what `soilcell eval` gives element by element.
 *
 * 1. Each corpus workbook, with every formula cell's cached value stripped (so the engine computes
 *    every native cell, not only those downstream of SOIL cells), goes through
 *    `node build/src/cli/main.js recalc IN -o OUT --json`; every formula cell and array element
 *    of the output is compared with expected/NAME.json. A failure lists every differing cell.
 * 2. LibreOffice recomputes the corpus (scripts/oracle/libreoffice-values.js) and must still give
 *    the committed expected values (skipped, with a message, only when LibreOffice is missing).
 *
 * Workbook contents are invented. Needs the build (`npm run build:node`; `npm test` builds first).
 */
import { spawnSync } from "child_process";
import fs from "fs";
import path from "path";
import { readWorkbookCells, stripCachedValues, CachedValue } from "../../scripts/oracle/xlsx-cells";
import { computeExpected, differences, Expected } from "../../scripts/oracle/libreoffice-values";
import { findLibreOffice } from "../../scripts/oracle/lo";
import { sameValue, show } from "../helpers/cached-values";
import { tempDir } from "../helpers/workbook";

const ROOT = path.join(__dirname, "../..");
const CLI = path.join(ROOT, "build/src/cli/main.js");
const CORPUS = path.join(ROOT, "tests/fixtures/corpus");
const EXPECTED = path.join(CORPUS, "expected");

const names = fs
  .readdirSync(EXPECTED)
  .filter((f) => f.endsWith(".json"))
  .map((f) => f.replace(/\.json$/, ""))
  .sort();

const expectedOf = (name: string): Expected => JSON.parse(fs.readFileSync(path.join(EXPECTED, `${name}.json`), "utf8"));

/** Cells soilcell refuses on purpose (a locale-dependent reading), each with its reason. */
const REFUSALS = JSON.parse(fs.readFileSync(path.join(CORPUS, "soilcell-refusals.json"), "utf8")) as Record<string, Record<string, Record<string, string>> | string>;
const refusalOf = (name: string, sheet: string, addr: string): string | undefined => {
  const book = REFUSALS[name];
  return typeof book === "object" ? book[sheet]?.[addr] : undefined;
};

interface EngineRun {
  status: number | null;
  stdout: string;
  stderr: string;
  output: string;
}

function recalc(input: string, output: string): EngineRun {
  const r = spawnSync(process.execPath, [CLI, "recalc", input, "-o", output, "--json"], { encoding: "utf8", timeout: 120000, maxBuffer: 64 * 1024 * 1024 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr, output };
}

describe("the engine computes every native cell of the corpus as the outside oracle does", () => {
  let dir: string;
  beforeAll(() => {
    dir = tempDir("soilcell-oracle-");
  });
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it("the corpus has an expected file for every workbook, and the other way round", () => {
    const books = fs
      .readdirSync(CORPUS)
      .filter((f) => f.endsWith(".xlsx"))
      .map((f) => f.replace(/\.xlsx$/, ""))
      .sort();
    expect(books).toEqual(names);
  });

  it.each(names)("%s", async (name) => {
    const want = expectedOf(name);
    const input = path.join(dir, `${name}.stripped.xlsx`);
    fs.writeFileSync(input, await stripCachedValues(fs.readFileSync(path.join(CORPUS, want.file))));
    const run = recalc(input, path.join(dir, `${name}.out.xlsx`));
    const summary = JSON.parse(run.stdout || "{}") as { errors?: { sheet: string; cell: string; message: string }[]; kept?: { sheet: string; cell: string; message: string }[] };
    if (!fs.existsSync(run.output)) {
      throw new Error(`no output (exit ${run.status}): ${run.stderr.trim().split("\n").slice(-3).join(" | ")}`);
    }
    const got = await readWorkbookCells(fs.readFileSync(run.output));
    const wrong: string[] = [];
    let compared = 0;
    for (const [sheet, cells] of Object.entries(want.cells)) {
      const out = got.sheets.find((s) => s.name === sheet);
      for (const [addr, value] of Object.entries(cells)) {
        compared += 1;
        const v: CachedValue = out ? (out.cells.get(addr)?.value ?? null) : null;
        const refused = refusalOf(name, sheet, addr);
        if (refused) {
          // Refused: an error with its message, or (a formula the file held without a value, which
          // nothing recomputed feeds) left without a value and listed with the reason.
          const listed = summary.errors?.find((e) => e.sheet === sheet && e.cell === addr);
          const keptBlank = summary.kept?.find((e) => e.sheet === sheet && e.cell === addr);
          const isError = typeof v === "object" && v !== null && "error" in v;
          if (!((isError && listed?.message) || (v === null && keptBlank?.message))) wrong.push(`${sheet}!${addr}: a refusal with a message was expected (${refused}), got ${show(v)}`);
          continue;
        }
        if (!sameValue(value, v)) {
          const soil = want.fromSoilcell?.[sheet]?.[addr];
          const excel = want.excelOverrides?.[sheet]?.[addr];
          const why = soil ? ` (SOIL element, as ${soil})` : excel ? " (Excel's value; LibreOffice differs by design)" : "";
          wrong.push(`${sheet}!${addr}: expected ${show(value)}${why}, got ${show(v)}`);
        }
      }
    }
    expect(compared).toBeGreaterThan(0);
    expect({ name, exit: run.status, wrong }).toEqual({ name, exit: run.status, wrong: [] });
  });
});

const soffice = findLibreOffice();
const describeLo = soffice ? describe : describe.skip;
if (!soffice) {
  // eslint-disable-next-line no-console
  console.warn("SKIPPED the LibreOffice re-run of the corpus oracle: LibreOffice is not installed (Debian: apt-get install libreoffice-calc)");
}

describeLo("the committed expected values are still what LibreOffice computes", () => {
  it("re-runs the oracle on the corpus: same values, no sentinel left, overrides still needed", async () => {
    const { result, problems } = await computeExpected(CORPUS);
    expect(problems).toEqual([]);
    const diffs: string[] = [];
    for (const name of names) {
      expect(result[name]).toBeDefined();
      diffs.push(...differences(name, expectedOf(name), result[name]!));
    }
    expect(diffs).toEqual([]);
  }, 300000);
});
