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
  "engine-formula": { folder: "engine", mutate: ["src/engine/formula/*.ts"] },
  "engine-functions": { folder: "engine", mutate: ["src/engine/formula/functions/**/*.ts"] },
  "engine-book": { folder: "engine", mutate: ["src/engine/{book,plan,recalc,host}.ts"] },
  "engine-small": { folder: "engine", mutate: ["src/engine/{cellref,registry,soil,formula-text,evaluate}.ts"] },
};
module.exports = { PARTS };
