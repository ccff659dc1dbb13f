/**
 * Jest for mutation testing (`npm run mutation`): the in-process tests only. Tests that run the
 * compiled CLI or the built add-in (tests/cli, tests/hosts, tests/reliability, the oracle) test
 * build/ and dist/, which Stryker does not mutate, so they could never kill a mutant.
 */
const base = require("./jest.config.js");
module.exports = {
  ...base,
  testMatch: ["<rootDir>/tests/core/**/*.test.ts", "<rootDir>/tests/functions/**/*.test.ts", "<rootDir>/tests/engine/**/*.test.ts"],
  testPathIgnorePatterns: ["/node_modules/", "<rootDir>/tests/engine/oracle.test.ts"],
  transform: { "^.+\\.ts$": ["ts-jest", { tsconfig: "tsconfig.json", isolatedModules: true, diagnostics: false }] },
};
