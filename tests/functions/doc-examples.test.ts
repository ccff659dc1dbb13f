/**
 * The worked examples on the help pages are tests: every `@example =SOIL.X(...) //=> value` in the
 * JSDoc of src/functions is typed into the headless engine as a user would type it, and must give
 * the value written (a number within a relative 5e-6, tests/helpers/doc-tolerance.ts; a quoted text exactly, or as a
 * prefix when it ends with "…"). Every function in the metadata must have one, with a Source line
 * naming where its numbers come from: the help page shows both. The sources are in the JSDoc
 * beside each example; the helpers here read them, they do not add any.
 */
import fs from "fs";
import path from "path";
import { evaluateFormula } from "../../src/engine/evaluate";
import { docTolerance } from "../helpers/doc-tolerance";

// eslint-disable-next-line @typescript-eslint/no-require-imports
const help = require("../../scripts/help.js") as {
  readBindingDocs(dir?: string): {
    module: string;
    functionName: string;
    examples: { formula: string; expected?: string; source: string }[];
    throws: string[];
  }[];
};

const ROOT = path.join(__dirname, "..", "..");
const metadata = JSON.parse(fs.readFileSync(path.join(ROOT, "generated", "functions.json"), "utf8")) as { functions: { id: string }[] };
const associations = JSON.parse(fs.readFileSync(path.join(ROOT, "generated", "associations.json"), "utf8")) as { id: string; functionName: string; module: string }[];
const docs = help.readBindingDocs(path.join(ROOT, "src", "functions"));

function docOf(id: string) {
  const a = associations.find((x) => x.id === id);
  return a ? docs.find((d) => d.module === a.module && d.functionName === a.functionName) : undefined;
}

const tolerance = (written: string): number => docTolerance(Number(written));

const examples = metadata.functions.flatMap((f) => (docOf(f.id)?.examples ?? []).map((e) => ({ id: f.id, ...e })));

describe("worked examples in the binding JSDoc", () => {
  it("every function in the metadata has a worked example with a Source line (add `@example =SOIL.X(…) //=> value` and `Source: …`)", () => {
    const missing = metadata.functions
      .filter((f) => !(docOf(f.id)?.examples ?? []).some((e) => e.expected !== undefined && e.source.length > 10))
      .map((f) => f.id);
    expect(missing).toEqual([]);
  });

  it("examples call the function they document", () => {
    const wrong = examples.filter((e) => !new RegExp(`^=SOIL\\.${e.id.replace(/\./g, "\\.")}\\(`, "i").test(e.formula)).map((e) => `${e.id}: ${e.formula}`);
    expect(wrong).toEqual([]);
  });

  it.each(examples.map((e) => [`${e.formula} //=> ${e.expected}`, e] as const))("%s", (_name, e) => {
    const r = evaluateFormula(e.formula);
    expect(r.error).toBeUndefined();
    const expected = e.expected!;
    if (/^-?\d/.test(expected)) {
      expect(typeof r.value).toBe("number");
      expect(Math.abs((r.value as number) - Number(expected))).toBeLessThanOrEqual(tolerance(expected));
    } else if (/^".*"$/.test(expected)) {
      const text = expected.slice(1, -1);
      if (text.endsWith("…")) expect(String(r.value).startsWith(text.slice(0, -1))).toBe(true);
      else expect(r.value).toBe(text);
    } else {
      throw new Error(`cannot read expected value ${expected}`);
    }
  });

  it("@throws lines name the error Excel shows (#VALUE! or #N/A) first", () => {
    const bad = docs.flatMap((d) => d.throws.filter((t) => !/^(#VALUE!|#N\/A) /.test(t)).map((t) => `${d.functionName}: ${t}`));
    expect(bad).toEqual([]);
  });
});
