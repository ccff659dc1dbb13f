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
import { stripCachedValues } from "../../scripts/oracle/xlsx-cells";
import { computeExpected, differences } from "../../scripts/oracle/libreoffice-values";
import { findLibreOffice } from "../../scripts/oracle/lo";
import { CORPUS, corpusNames, expectedOf, oracleDifferences, OracleSummary } from "../helpers/oracle";
import { tempDir } from "../helpers/workbook";

const ROOT = path.join(__dirname, "../..");
const CLI = path.join(ROOT, "build/src/cli/main.js");
const names = corpusNames();

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
    const summary = JSON.parse(run.stdout || "{}") as OracleSummary;
    if (!fs.existsSync(run.output)) {
      throw new Error(`no output (exit ${run.status}): ${run.stderr.trim().split("\n").slice(-3).join(" | ")}`);
    }
    const { compared, wrong } = await oracleDifferences(name, fs.readFileSync(run.output), summary);
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
