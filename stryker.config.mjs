// Mutation testing (StrykerJS): `npm run mutation` (every part of src/core, src/functions and
// src/engine, one after another) or `npm run mutation:core` / `:functions` / `:engine`.
// MUTATE_PART picks the part (mutation/parts.js); each part keeps its own incremental file, committed,
// so a re-run after a small change only tests the mutants in changed code or reached by changed
// tests. Not part of `npm test` or CI.
import { createRequire } from "module";
const { PARTS } = createRequire(import.meta.url)("./mutation/parts.js");
const partName = process.env.MUTATE_PART || "core-top";
const part = PARTS[partName];
if (!part) throw new Error(`MUTATE_PART must be one of ${Object.keys(PARTS).join(", ")}, not ${partName}`);
const folder = part.folder;
process.env.MUTATE_FOLDER = folder; // read by mutation/jest.config.js in the test runner processes

/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
  packageManager: "npm",
  testRunner: "jest",
  jest: { configFile: "mutation/jest.config.js", enableFindRelatedTests: false },
  checkers: ["typescript"],
  tsconfigFile: "tsconfig.json",
  typescriptChecker: { prioritizePerformanceOverAccuracy: true },
  coverageAnalysis: "perTest",
  mutate: part.mutate,
  incremental: true,
  incrementalFile: `mutation/incremental/${partName}.json`,
  reporters: ["clear-text", "json", "progress-append-only"],
  jsonReporter: { fileName: `mutation/reports/${partName}.json` },
  clearTextReporter: { allowColor: false, logTests: false, reportScoreTable: true, reportMutants: false },
  // The machine has 2 cores, shared: one type checker and one test runner, then two runners once
  // every mutant is type-checked; at nice 15 (scripts/mutation.js).
  concurrency: 2,
  // Static mutants (module-level tables and constants) rerun every test in the folder per mutant:
  // 18 % of the mutants for ~80 % of the time. They are left out of a normal run and reported as
  // "static, not run" in the table; `MUTATE_STATIC=1 npm run mutation` runs them too.
  ignoreStatic: process.env.MUTATE_STATIC !== "1",
  timeoutMS: 20000,
  tempDirName: ".stryker-tmp",
  cleanTempDir: "always",
  thresholds: { high: folder === "core" ? 85 : 75, low: folder === "core" ? 85 : 75, break: null },
  ignorePatterns: ["build", "dist", "demo-output", "help-preview", "mutation/reports", ".stryker-tmp", "sample-workbooks", "*.log"],
};
