/**
 * Doc examples are tests: every `@example call(...) //=> value` in src/core is evaluated against
 * the module's own exports. A number is checked to the digits it is written with (half a unit in
 * the last written place); a quoted string exactly, or as a prefix when it ends with "…".
 * The expected values are those the doc comments give; their sources are named in the comments.
 */
import fs from "fs";
import path from "path";

const CORE = path.join(__dirname, "../../src/core");

interface Example {
  file: string;
  line: number;
  call: string;
  expected: string;
}

function examples(): Example[] {
  const out: Example[] = [];
  const files = (fs.readdirSync(CORE, { recursive: true }) as string[]).filter((n) => n.endsWith(".ts")).sort();
  for (const f of files) {
    const lines = fs.readFileSync(path.join(CORE, f), "utf8").split("\n");
    lines.forEach((l, i) => {
      const m = /^\s*\*\s*@example\s+(.+?)\s*\/\/=>\s*(.+?)\s*$/.exec(l);
      if (m) out.push({ file: f, line: i + 1, call: m[1]!, expected: m[2]! });
    });
  }
  return out;
}

function tolerance(written: string): number {
  const dec = /\.(\d+)/.exec(written);
  return 0.5 * 10 ** -(dec ? dec[1]!.length : 0) + 1e-12;
}

const all = examples();

describe("doc examples in src/core", () => {
  it("there are examples to check", () => {
    expect(all.length).toBeGreaterThan(20);
  });
  it.each(all.map((e) => [`${e.file}:${e.line} ${e.call}`, e] as const))("%s", (_name, e) => {
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const mod = require(path.join(CORE, e.file)) as Record<string, unknown>;
    const names = Object.keys(mod);
    const fn = new Function(...names, `return (${e.call});`);
    const actual = fn(...names.map((n) => mod[n]));
    if (/^-?\d/.test(e.expected)) {
      expect(typeof actual).toBe("number");
      expect(Math.abs((actual as number) - Number(e.expected))).toBeLessThanOrEqual(tolerance(e.expected));
    } else if (/^".*"$/.test(e.expected)) {
      const text = e.expected.slice(1, -1);
      if (text.endsWith("…")) expect(String(actual).startsWith(text.slice(0, -1))).toBe(true);
      else expect(actual).toBe(text);
    } else {
      throw new Error(`cannot read expected value ${e.expected}`);
    }
  });
});
