#!/usr/bin/env node
/** Rewrites the README's function list from the generated metadata (run `npm run metadata` first). */
const fs = require("fs");
const path = require("path");
const root = path.join(__dirname, "..");
const meta = JSON.parse(fs.readFileSync(path.join(root, "generated", "functions.json"), "utf8"));
const rows = meta.functions.map((f) => {
  const args = f.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ");
  return `| \`SOIL.${f.id}(${args})\` | ${f.description.split("\n")[0].replace(/\|/g, "\\|")} |`;
});
const table = ["| function | returns |", "|---|---|", ...rows].join("\n");
const readme = path.join(root, "README.md");
const text = fs.readFileSync(readme, "utf8");
const out = text.replace(/<!-- functions:start -->[\s\S]*<!-- functions:end -->/, `<!-- functions:start -->\n${table}\n<!-- functions:end -->`);
fs.writeFileSync(readme, out);
console.error(`README: ${rows.length} functions listed`);
