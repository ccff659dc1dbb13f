#!/usr/bin/env -S node --max-old-space-size=8192
// The soilcell command. A 100,000-sample season fits Node's default heap; the higher limit leaves
// room for larger workbooks (override with NODE_OPTIONS, or run node yourself). The TypeScript
// sources are compiled into build/ by `npm run build:node` (run automatically by `npm ci`).
const path = require("path");
const fs = require("fs");
const entry = path.join(__dirname, "..", "build", "src", "cli", "main.js");
if (!fs.existsSync(entry)) {
  process.stderr.write("soilcell: not built yet; run `npm run build:node` in the soilcell folder first\n");
  process.exit(3);
}
require(entry).runFromProcess(process.argv.slice(2));
