/**
 * Jest for mutation testing only (not `npm test`): the in-process tests of the folder being mutated,
 * transpiled without type checks (the TypeScript checker judges types once per mutant instead, so a
 * mutant that does not compile is a compile error, never a kill). Tests that run the built CLI or a
 * browser/LibreOffice exercise build/, not the mutated source, so they cannot kill a mutant.
 */
const path = require("path");
const folder = process.env.MUTATE_FOLDER || "core";
const TESTS = {
  core: ["tests/core", "tests/functions"],
  functions: ["tests/functions", "tests/engine", "tests/hosts/engine.cases.test.ts"],
  engine: ["tests/engine", "tests/hosts/engine.cases.test.ts", "tests/hosts/stored-form.test.ts", "tests/reliability/roundtrip.test.ts", "tests/reliability/formula-literals.test.ts"],
}[folder];
if (!TESTS) throw new Error(`MUTATE_FOLDER must be core, functions or engine, not ${folder}`);
const root = path.join(__dirname, "..");
module.exports = {
  rootDir: root,
  testEnvironment: "node",
  // src is a root too, so Jest can find the tests related to a mutated file (enableFindRelatedTests).
  roots: ["<rootDir>/tests", "<rootDir>/src"],
  transform: { "^.+\\.ts$": ["ts-jest", { tsconfig: path.join(__dirname, "tsconfig.json") }] },
  testMatch: TESTS.map((t) => (t.endsWith(".ts") ? `<rootDir>/${t}` : `<rootDir>/${t}/**/*.test.ts`)),
  // The oracle test recalculates through build/ (the compiled CLI), which a mutant never reaches;
  // oracle-in-process.test.ts runs the same comparison on src.
  testPathIgnorePatterns: ["/node_modules/", "tests/engine/oracle.test.ts"],
  testTimeout: 60000,
};
