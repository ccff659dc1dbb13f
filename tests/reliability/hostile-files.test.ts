/**
 * Hostile and broken files through `soilcell recalc`, run as a user would (needs the build that
 * `npm test` makes first). Each gets a clear one-line refusal (exit 2) or a bounded, reported
 * result, within bounded time and memory (peak RSS measured in the child), never a stack trace.
 * File contents are invented (see hostile-files.ts); expected SOIL values as in tests/core
 * (Source: IUPAC/CIAAW atomic weights, 200.39 mg/kg Ca per cmol(+)/kg).
 */
import fs from "fs";
import path from "path";
import JSZip from "jszip";
import { HOSTILE } from "./hostile-files";
import { tempDir } from "../helpers/workbook";
import { Run, messages, soilcell } from "./cli-run";

interface Expectation {
  /** Exit status: 2 refused, 1 written with cells in error, 0 written clean. */
  readonly exit: 0 | 1 | 2;
  /** For a refusal: what the message says. */
  readonly says?: RegExp;
  readonly maxSeconds: number;
  readonly maxRssMB: number;
  /** For a written file: further checks on the summary and the output. */
  readonly check?: (run: Run, output: string) => Promise<void>;
}

async function sheetXml(file: string): Promise<string> {
  const zip = await JSZip.loadAsync(fs.readFileSync(file));
  return zip.file("xl/worksheets/sheet1.xml")!.async("string");
}

const cached = (xml: string, cell: string) => new RegExp(`<c r="${cell}"[^>]*>(?:<f[^>]*>[^<]*</f>)?<v>([^<]*)</v>`).exec(xml)?.[1];

const EXPECT: Record<string, Expectation> = {
  "empty.xlsx": { exit: 2, says: /not an \.xlsx workbook/, maxSeconds: 10, maxRssMB: 200 },
  "not-a-zip.xlsx": { exit: 2, says: /not an \.xlsx workbook/, maxSeconds: 10, maxRssMB: 200 },
  "truncated.xlsx": { exit: 2, says: /damaged or truncated/, maxSeconds: 10, maxRssMB: 200 },
  "truncated-tail.xlsx": { exit: 2, says: /damaged or truncated/, maxSeconds: 10, maxRssMB: 200 },
  "zip-not-workbook.xlsx": { exit: 2, says: /not an Excel workbook/, maxSeconds: 10, maxRssMB: 200 },
  "no-sheets.xlsx": { exit: 2, says: /declared but its part .* is missing/, maxSeconds: 10, maxRssMB: 200 },
  "garbage-sheet.xlsx": { exit: 2, says: /cannot be read/, maxSeconds: 10, maxRssMB: 200 },
  // refused from the zip directory alone, before anything is expanded
  "zip-bomb.xlsx": { exit: 2, says: /zip bomb/, maxSeconds: 10, maxRssMB: 200 },
  // refused after inflating at most the declared 2 KB
  "zip-bomb-lying.xlsx": { exit: 2, says: /beyond the 2048 bytes its header declares/, maxSeconds: 10, maxRssMB: 200 },
  "merge-bomb.xlsx": {
    exit: 0,
    maxSeconds: 10,
    maxRssMB: 300,
    check: async (_, out) => expect(await sheetXml(out)).toContain('<mergeCell ref="C1:XFD1048576"/>'),
  },
  "validation-bomb.xlsx": {
    exit: 0,
    maxSeconds: 10,
    maxRssMB: 300,
    check: async (_, out) => expect(await sheetXml(out)).toContain('sqref="C1:XFD1048576"'),
  },
  "million-rows.xlsx": {
    exit: 0,
    maxSeconds: 90,
    maxRssMB: 1500,
    check: async (run, out) => {
      expect(run.stdout).toMatch(/2 formula cells recalculated/);
      const xml = await sheetXml(out);
      expect(Number(cached(xml, "B1"))).toBeCloseTo(2, 10);
      expect(Number(cached(xml, "B1048576"))).toBeCloseTo(1, 10);
      expect(xml.match(/<row r="\d+"\/>/g)!.length).toBe(1048574); // the empty rows are kept
    },
  },
  "missing-sheet.xlsx": {
    exit: 1,
    maxSeconds: 10,
    maxRssMB: 300,
    check: async (run) => {
      expect(run.stdout).toMatch(/2 cells in error/);
      expect(run.stdout).toMatch(/Lab!C1 +#REF!/);
      expect(run.stdout).toMatch(/Lab!D1 +#REF!/);
    },
  },
  "circular.xlsx": {
    exit: 1,
    maxSeconds: 10,
    maxRssMB: 300,
    check: async (run, out) => {
      expect(run.stdout).toMatch(/3 cells in error/);
      for (const c of ["C1", "D1", "E1"]) expect(run.stdout).toMatch(new RegExp(`Lab!${c} +#CYCLE! circular reference`));
      const xml = await sheetXml(out);
      expect(xml).not.toContain("#CYCLE!"); // not an Excel error value: no cached value is written
      expect(Number(cached(xml, "F1"))).toBeCloseTo(4, 10); // the rest is computed
    },
  },
  "huge-shared-strings.xlsx": {
    exit: 0,
    maxSeconds: 30,
    maxRssMB: 800,
    check: async (_, out) => expect(Number(cached(await sheetXml(out), "B1"))).toBeCloseTo(2, 10),
  },
  "odd-attributes.xlsx": {
    exit: 1, // A3 holds text: SOIL.CMOL(A3) is #VALUE!, reported
    maxSeconds: 10,
    maxRssMB: 300,
    check: async (run, out) => {
      expect(run.stdout).toMatch(/Lab!B3 +#VALUE! mg_per_kg: "invented" is not a number/);
      const xml = await sheetXml(out);
      expect(Number(cached(xml, "B1"))).toBeCloseTo(2, 10);
      expect(Number(cached(xml, "B2"))).toBeCloseTo(1, 10); // a cell without r, after one without r
      expect(xml).toContain(`<c r='A1' s='0' custom:note="x"><v>400.78</v></c>`); // untouched cells kept as they were
      expect(xml).toContain("<c><v>7</v></c>");
    },
  },
  "rows-without-r.xlsx": {
    exit: 0,
    maxSeconds: 10,
    maxRssMB: 300,
    check: async (_, out) => expect(Number(cached(await sheetXml(out), "B1"))).toBeCloseTo(2, 10),
  },
};

const figures: string[] = [];
afterAll(() => {
  if (process.env.RELIABILITY_REPORT) process.stdout.write(`${figures.join("\n")}\n`);
});

describe("soilcell recalc on hostile and broken files", () => {
  let dir: string;
  beforeAll(() => {
    dir = tempDir("soilcell-hostile-");
  });
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it("every generated file has an expectation", () => {
    expect(HOSTILE.map((h) => h.name).sort()).toEqual(Object.keys(EXPECT).sort());
  });

  it.each(HOSTILE.map((h) => [h.name, h] as const))("%s", async (name, h) => {
    const input = path.join(dir, name);
    fs.writeFileSync(input, await h.bytes());
    const output = path.join(dir, `out-${name}`);
    const want = EXPECT[name]!;
    const run = soilcell(["recalc", input, "-o", output]);
    figures.push(`${name}\t${h.what}\texit ${run.status}\t${run.seconds.toFixed(2)} s\t${Math.round(run.rssMB)} MB\t${messages(run.stderr).join(" | ") || run.stdout.split("\n")[2] || ""}`);
    expect(run.signal).toBeNull();
    expect({ status: run.status, stderr: run.stderr }).toEqual({ status: want.exit, stderr: expect.any(String) });
    expect(run.stderr).not.toMatch(/\n\s+at .+:\d+:\d+/); // no stack trace
    expect(run.seconds).toBeLessThan(want.maxSeconds);
    expect(run.rssMB).toBeLessThan(want.maxRssMB);
    if (want.exit === 2) {
      const lines = messages(run.stderr);
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(/^soilcell: /);
      expect(lines[0]).toMatch(want.says!);
      expect(fs.existsSync(output)).toBe(false);
    } else {
      expect(messages(run.stderr)).toEqual([]);
      expect(fs.existsSync(output)).toBe(true);
      await want.check?.(run, output);
    }
    fs.rmSync(input);
  });

  it("a workbook too big for the heap it may use is refused with a plain message, not a heap abort", async () => {
    const h = HOSTILE.find((x) => x.name === "million-rows.xlsx")!;
    const input = path.join(dir, "capped.xlsx");
    fs.writeFileSync(input, await h.bytes());
    const run = soilcell(["recalc", input, "-o", path.join(dir, "capped-out.xlsx")], 128);
    figures.push(`million-rows.xlsx with a 128 MB heap\texit ${run.status}\t${run.seconds.toFixed(2)} s\t${Math.round(run.rssMB)} MB\t${messages(run.stderr).join(" | ")}`);
    expect(run.status).toBe(2);
    expect(messages(run.stderr)).toEqual([expect.stringMatching(/^soilcell: the sheets hold \d+ MB of cell data, which may need \d+ MB of memory; .*max-old-space-size=\d+$/)]);
    expect(fs.existsSync(path.join(dir, "capped-out.xlsx"))).toBe(false);
  });
});
