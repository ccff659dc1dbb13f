// Mutation testing (`npm run mutation`, or `npm run mutation -- --mutate "src/core/**/*.ts"` for
// one folder). Incremental: results are kept in reports/stryker-incremental.json, so a re-run
// after a small change tests only the mutants it touches. Not part of `npm test` or CI.
/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
  testRunner: "jest",
  jest: { configFile: "jest.mutation.config.js", enableFindRelatedTests: false },
  coverageAnalysis: "perTest",
  mutate: ["src/core/**/*.ts", "src/functions/**/*.ts", "src/engine/**/*.ts"],
  ignorePatterns: ["dist", "build", "demo-output", "bench-output", "help-preview", ".stryker-tmp", "reports"],
  // Static mutants (module-level code: tables loaded once, constant lists) need the whole suite per
  // mutant, about 90 % of the run time; they are reported as ignored, never counted as killed.
  ignoreStatic: true,
  incremental: true,
  incrementalFile: "reports/stryker-incremental.json",
  reporters: ["clear-text", "json", "progress"],
  jsonReporter: { fileName: "reports/mutation/mutation.json" },
  concurrency: 2,
  timeoutMS: 5000,
  tempDirName: ".stryker-tmp",
  cleanTempDir: "always",
};
