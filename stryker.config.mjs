// Mutation testing (StrykerJS): `npm run mutation` (every part of src/core, src/functions and
// src/engine, one after another) or `npm run mutation:core` / `:functions` / `:engine`.
// MUTATE_PART picks the part (mutation/parts.js); each part keeps its own incremental file, committed,
// so a re-run after a small change only tests the mutants in changed code or reached by changed
// tests. Not part of `npm test` or CI.
import fs from "fs";
import path from "path";
import { createRequire } from "module";
import { fileURLToPath } from "url";
const { PARTS } = createRequire(import.meta.url)("./mutation/parts.js");
const partName = process.env.MUTATE_PART || "core-top";
const part = PARTS[partName];
if (!part) throw new Error(`MUTATE_PART must be one of ${Object.keys(PARTS).join(", ")}, not ${partName}`);
const folder = part.folder;
process.env.MUTATE_FOLDER = folder; // read by mutation/jest.config.js in the test runner processes

// A sample part (scripts/mutation-sample.mjs) runs the drawn spans only: each as a mutate range
// (Stryker reads lines from 1 and columns from 0), and the nodes nested in one that hold no drawn
// span left out by mutation/sample-ignorer.mjs.
let mutate = part.mutate;
let sampleOptions = {};
if (part.sample) {
  const root = path.dirname(fileURLToPath(import.meta.url));
  process.env.MUTATE_SAMPLE = path.join(root, part.sample);
  const { drawnSpans } = JSON.parse(fs.readFileSync(process.env.MUTATE_SAMPLE, "utf8"));
  mutate = drawnSpans.map((s) => `${s.file}:${s.start.line}:${s.start.column - 1}-${s.end.line}:${s.end.column - 1}`);
  sampleOptions = { plugins: ["@stryker-mutator/*", path.join(root, "mutation", "sample-ignorer.mjs")], ignorers: ["drawn-sample"] };
}

/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
  packageManager: "npm",
  testRunner: "jest",
  // Only the test files that import the mutated file (directly or not) are loaded for its mutants.
  jest: { configFile: "mutation/jest.config.js", enableFindRelatedTests: true },
  // No TypeScript checker: tried first, it was the bottleneck on the shared 2-core machine (about
  // 10 mutants a minute, the test runners waiting on it). Without it, a mutant that would not
  // compile runs as plain JavaScript (tests are transpiled only, mutation/tsconfig.json) and is
  // killed or survives like any other; survivors are reviewed by hand (README, equivalent mutants).
  // To use it where cores are free: MUTATE_TYPECHECK=1.
  ...(process.env.MUTATE_TYPECHECK === "1" ? { checkers: ["typescript"], tsconfigFile: "tsconfig.json", typescriptChecker: { prioritizePerformanceOverAccuracy: true } } : {}),
  coverageAnalysis: "perTest",
  mutate,
  ...sampleOptions,
  incremental: true,
  incrementalFile: `mutation/incremental/${partName}.json`,
  reporters: ["clear-text", "json", "progress-append-only"],
  jsonReporter: { fileName: `mutation/reports/${partName}.json` },
  clearTextReporter: { allowColor: false, logTests: false, reportScoreTable: true, reportMutants: false },
  // Test runners, at nice 15 (scripts/mutation.js): on the 2 shared cores they take only what
  // others leave. MUTATE_CONCURRENCY overrides.
  concurrency: Number(process.env.MUTATE_CONCURRENCY || 3),
  // Static mutants (module-level tables and constants) rerun every test in the folder per mutant:
  // 18 % of the mutants for ~80 % of the time. They are left out of a normal run and reported as
  // "static, not run" in the table; `MUTATE_STATIC=1 npm run mutation` runs them too.
  ignoreStatic: process.env.MUTATE_STATIC !== "1",
  // Added to 1.5 × a mutant's normal test time before it counts as a timeout (an endless loop).
  // Every timeout also costs a test-runner restart (~3 s), so the margin is kept short: a mutant
  // that makes its tests 1.5 × + 1.5 s slower has changed behaviour a user would notice.
  timeoutMS: Number(process.env.MUTATE_TIMEOUT_MS || 1500),
  tempDirName: ".stryker-tmp",
  cleanTempDir: "always",
  thresholds: { high: folder === "core" ? 85 : 75, low: folder === "core" ? 85 : 75, break: null },
  ignorePatterns: ["build", "dist", "demo-output", "help-preview", "mutation/reports", ".stryker-tmp*", "*.log"],
};
