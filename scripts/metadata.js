#!/usr/bin/env node
/**
 * Generates functions.json (Excel's custom-function metadata) from the JSDoc of every binding
 * module in src/functions, plus associations.json (id → exported function name) for the hosts.
 * Fails on any metadata error (the generator's own CLI exits 0 on errors).
 *
 * Usage: node scripts/metadata.js [outDir]   (default: generated/)
 */
const fs = require("fs");
const path = require("path");
const { generateCustomFunctionsMetadata } = require("custom-functions-metadata");

const root = path.join(__dirname, "..");
const srcDir = path.join(root, "src", "functions");

async function main() {
  const outDir = path.resolve(process.argv[2] || path.join(root, "generated"));
  const files = fs
    .readdirSync(srcDir)
    .filter((f) => f.endsWith(".ts") && !f.startsWith("_") && f !== "index.ts")
    .sort();
  const functions = [];
  const associations = [];
  const errors = [];
  for (const f of files) {
    const file = path.join(srcDir, f);
    const result = await generateCustomFunctionsMetadata(file, true);
    if (result.errors.length) errors.push(...result.errors.map((e) => `${f}: ${e}`));
    if (!result.metadataJson) continue;
    const meta = JSON.parse(result.metadataJson);
    functions.push(...meta.functions);
    for (const a of result.associate) associations.push({ id: a.id, functionName: a.functionName, module: f.replace(/\.ts$/, "") });
  }
  if (errors.length) {
    console.error(errors.join("\n"));
    process.exit(1);
  }
  const ids = new Set();
  for (const fn of functions) {
    const key = fn.id.toUpperCase().replace(/\./g, "_");
    if (ids.has(key)) {
      console.error(`duplicate function id ${fn.id} (ids may not differ only by case or . versus _)`);
      process.exit(1);
    }
    ids.add(key);
  }
  functions.sort((a, b) => a.id.localeCompare(b.id));
  associations.sort((a, b) => a.id.localeCompare(b.id));
  fs.mkdirSync(outDir, { recursive: true });
  fs.writeFileSync(path.join(outDir, "functions.json"), JSON.stringify({ functions }, null, 2) + "\n");
  fs.writeFileSync(path.join(outDir, "associations.json"), JSON.stringify(associations, null, 2) + "\n");
  console.error(`metadata: ${functions.length} functions → ${path.relative(root, outDir)}/functions.json`);
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
