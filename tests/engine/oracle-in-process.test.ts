/**
 * The corpus oracle again, with the engine run in this process (recalcBytes from src) instead of
 * the built CLI, so that mutation testing, which changes src and never build/, is judged by the
 * outside oracle too. The expected values are LibreOffice Calc's (tests/fixtures/corpus/expected),
 * or Excel 365's where it differs from Calc by design (excel-overrides.json, each with its
 * published source); oracle.test.ts says how they were made. Workbook contents are invented.
 */
import fs from "fs";
import path from "path";
import { recalcBytes } from "../../src/engine/recalc";
import { stripCachedValues } from "../../scripts/oracle/xlsx-cells";
import { CORPUS, corpusNames, expectedOf, oracleDifferences } from "../helpers/oracle";

describe("in process, the engine computes every cell of the corpus as the outside oracle does", () => {
  it.each(corpusNames())("%s", async (name) => {
    const want = expectedOf(name);
    const input = await stripCachedValues(fs.readFileSync(path.join(CORPUS, want.file)));
    const run = await recalcBytes(input, `${name}.xlsx`);
    const { compared, wrong } = await oracleDifferences(name, run.bytes, run.summary);
    expect(compared).toBeGreaterThan(0);
    expect({ name, wrong }).toEqual({ name, wrong: [] });
  });
});
