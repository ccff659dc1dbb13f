/**
 * The real-world and hostile workbooks of tests/reliability/real-workbooks.test.ts again, with
 * `soilcell recalc` run in this process from src instead of as a command, so that mutation
 * testing (which changes src, never the build) is judged by them too. The expected outcomes and
 * their sources are data (tests/fixtures/real-world/cases.json); the workbooks are invented.
 * Time and memory limits are the command's and are checked only by the other test.
 */
import fs from "fs";
import path from "path";
import { tempDir } from "../helpers/workbook";
import { soilcellInProcess } from "../reliability/cli-run";
import { CASES, FIXTURES, caseProblems } from "../reliability/real-world-cases";

describe("recalc in process on real-world and hostile workbooks (cases.json)", () => {
  let dir: string;
  beforeAll(() => {
    dir = tempDir("soilcell-real-in-process-");
  });
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it.each(CASES.map((c) => [`${c.file} (${c.issue}): ${c.what}`, c] as const))("%s", async (_, c) => {
    const input = path.join(dir, c.file);
    fs.copyFileSync(path.join(FIXTURES, c.file), input);
    const output = path.join(dir, `out-${c.file}`);
    const run = await soilcellInProcess(["recalc", input, "-o", output]);
    const problems = await caseProblems(c, run, input, output, true);
    expect({ file: c.file, problems }).toEqual({ file: c.file, problems: [] });
  });
});
