/** Jest: TypeScript tests under tests/, mirroring src/. */
module.exports = {
  testEnvironment: "node",
  roots: ["<rootDir>/tests"],
  transform: { "^.+\\.ts$": ["ts-jest", { tsconfig: "tsconfig.json" }] },
  testMatch: ["**/*.test.ts"],
  testTimeout: 60000,
};
