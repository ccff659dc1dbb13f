/**
 * The committed sample workbooks are what `npm run samples` makes today: regenerating them into a
 * temporary folder gives the same cell values (formulas' cached results and inputs) as the files
 * in sample-workbooks/. Compared value by value, not byte by byte: the zip's timestamps differ
 * between runs. The workbooks' data are invented (scripts/samples, fixed seed); no value here is
 * checked against a published source (the demo and engine tests do that).
 */
import { execFileSync } from "child_process";
import fs from "fs";
import path from "path";
import { cachedValues } from "../helpers/xlsx";
import { tempDir } from "../helpers/workbook";

const ROOT = path.resolve(__dirname, "../..");
const SAMPLES = path.join(ROOT, "sample-workbooks");

describe("sample-workbooks/ are current", () => {
  let out: string;
  beforeAll(() => {
    out = tempDir("soilcell-samples-check-");
    // build/ is current: jest runs after `npm run build` (npm test) or the targeted tests' build:node.
    execFileSync(process.execPath, [path.join(ROOT, "scripts/samples/make-samples.js"), "--out", out], { cwd: ROOT, stdio: "pipe", timeout: 240_000 });
  }, 300_000);
  afterAll(() => fs.rmSync(out, { recursive: true, force: true }));

  const files = fs.readdirSync(SAMPLES).filter((f) => f.endsWith(".xlsx"));
  it("holds the sample workbooks the script writes", () => {
    expect(fs.readdirSync(out).sort()).toEqual(files.sort());
  });
  it.each(files)("%s: every cell of the committed file has the value regenerating gives", async (file) => {
    const committed = await cachedValues(path.join(SAMPLES, file));
    const fresh = await cachedValues(path.join(out, file));
    const differ: string[] = [];
    for (const key of new Set([...committed.keys(), ...fresh.keys()])) {
      const a = committed.get(key);
      const b = fresh.get(key);
      if (!Object.is(a, b)) differ.push(`${key}: committed ${JSON.stringify(a)}, regenerated ${JSON.stringify(b)}`);
    }
    expect(differ.slice(0, 20)).toEqual([]);
    expect(differ.length).toBe(0);
  });
});
