/**
 * The parts mutation testing runs one at a time. Each part has its own incremental file
 * (mutation/incremental/<part>.json, committed), so a run stopped part-way keeps every part it
 * finished, and a re-run after a small change only tests what changed. `folder` is the one whose
 * score the part counts toward; `tests` (in mutation/jest.config.js) are that folder's.
 */
const PARTS = {
  "core-top": { folder: "core", mutate: ["src/core/*.ts"] },
  "core-bands": { folder: "core", mutate: ["src/core/bands/**/*.ts"] },
  "core-cations": { folder: "core", mutate: ["src/core/cations/**/*.ts"] },
  "core-lime": { folder: "core", mutate: ["src/core/lime/**/*.ts"] },
  "core-nitrogen": { folder: "core", mutate: ["src/core/nitrogen/**/*.ts"] },
  functions: { folder: "functions", mutate: ["src/functions/**/*.ts"] },
  "engine-io": { folder: "engine", mutate: ["src/engine/{xml,zip,xlsx-package,sheet-patch,store}.ts"] },
  // The formula engine in parts of under ~700 mutants (under about 90 minutes on 2 shared cores):
  // a part's results are kept only when it finishes.
  // evaluate.ts in two line ranges (references, broadcasting and operators; then the evaluator and
  // calls), each under an hour: the boundary is the "The evaluator" section heading, and a line
  // that moves across it is only tested again by the other part.
  "engine-evaluate-ops": { folder: "engine", mutate: ["src/engine/formula/evaluate.ts:1-306"] },
  "engine-evaluate": { folder: "engine", mutate: ["src/engine/formula/evaluate.ts:307-100000"] },
  "engine-values": { folder: "engine", mutate: ["src/engine/formula/{coerce,values,not-computed}.ts"] },
  "engine-lexer": { folder: "engine", mutate: ["src/engine/formula/lexer.ts"] },
  "engine-parser": { folder: "engine", mutate: ["src/engine/formula/parser.ts"] },
  "engine-functions": { folder: "engine", mutate: ["src/engine/formula/functions/**/*.ts"] },
  "engine-book": { folder: "engine", mutate: ["src/engine/{book,shared-trees,plan,recalc,host}.ts"] },
  "engine-small": { folder: "engine", mutate: ["src/engine/{cellref,registry,soil,formula-text,evaluate}.ts"] },
  "engine-reports": { folder: "engine", mutate: ["src/engine/{report-template,report-batch,report-package,table-xlsx}.ts", "src/engine/season/{inputs,summary,one}.ts"] },
  // A random sample of the engine parts not run in full yet (scripts/mutation-sample.mjs): an
  // estimate with an interval for them, replaced part by part as each is run in full.
  "engine-sample": { folder: "engine", sample: "mutation/sample/engine.json" },
};
// Not mutated, because no in-process test can reach them (their mutants could only "survive"):
// src/engine/office-pdf.ts drives LibreOffice in a child process, and src/engine/season/pool.ts and
// worker.ts run the compiled build/ in worker threads. Their tests (tests/cli) run end to end.
const NOT_MUTATED = ["src/engine/office-pdf.ts", "src/engine/season/pool.ts", "src/engine/season/worker.ts"];
module.exports = { PARTS, NOT_MUTATED };
