/**
 * Doc examples are tests: every `@example call(...) //=> value` in src/core is evaluated against
 * the module's own exports. A number is checked with a relative tolerance of 5e-6 (so an example is
 * written with six significant digits, or exactly): half a unit in the last written place would let
 * `//=> 1` pass anything from 0.5 to 1.5. A quoted string is checked exactly, or as a prefix when
 * it ends with "…".
 * The expected values are those the doc comments give; their sources are named in the comments.
 */
import fs from "fs";
import path from "path";
import { docTolerance } from "../helpers/doc-tolerance";

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

const tolerance = docTolerance;

const all = examples();

describe("doc examples in src/core", () => {
  it("there are examples to check", () => {
    expect(all.length).toBeGreaterThan(20);
  });
  it("the tolerance is relative: 1 does not pass for 1.5, nor 43.64 for 43.6429", () => {
    expect(Math.abs(1.5 - 1)).toBeGreaterThan(tolerance(1));
    expect(Math.abs(43.6429 - 43.64)).toBeGreaterThan(tolerance(43.64));
    expect(Math.abs(43.64287 - 43.6429)).toBeLessThanOrEqual(tolerance(43.6429));
  });
  it.each(all.map((e) => [`${e.file}:${e.line} ${e.call}`, e] as const))("%s", (_name, e) => {
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const mod = require(path.join(CORE, e.file)) as Record<string, unknown>;
    const names = Object.keys(mod);
    const fn = new Function(...names, `return (${e.call});`);
    const actual = fn(...names.map((n) => mod[n]));
    if (/^-?\d/.test(e.expected)) {
      expect(typeof actual).toBe("number");
      expect(Math.abs((actual as number) - Number(e.expected))).toBeLessThanOrEqual(tolerance(Number(e.expected)));
    } else if (/^".*"$/.test(e.expected)) {
      const text = e.expected.slice(1, -1);
      if (text.endsWith("…")) expect(String(actual).startsWith(text.slice(0, -1))).toBe(true);
      else expect(actual).toBe(text);
    } else {
      throw new Error(`cannot read expected value ${e.expected}`);
    }
  });
});
