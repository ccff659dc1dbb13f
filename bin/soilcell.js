#!/usr/bin/env -S node --max-old-space-size=8192
// The soilcell command, with room for a season of 100,000 samples (8 GB heap limit; override
// with NODE_OPTIONS or by running node yourself). The TypeScript sources are compiled into build/ by `npm run build:node`
// (run automatically by `npm ci` / `npm install`).
const path = require("path");
const fs = require("fs");
const entry = path.join(__dirname, "..", "build", "src", "cli", "main.js");
if (!fs.existsSync(entry)) {
  process.stderr.write("soilcell: not built yet; run `npm run build:node` in the soilcell folder first\n");
  process.exit(3);
}
const { main } = require(entry);
process.stdout.on("error", (e) => { if (e.code === "EPIPE") process.exit(0); });
const io = { out: (l) => process.stdout.write(`${l}\n`), err: (l) => process.stderr.write(`${l}\n`) };
main(process.argv.slice(2), io).then(
  // exitCode, not exit(): a large --json answer on a pipe is written out before the process ends.
  (code) => {
    process.exitCode = code;
  },
  (e) => {
    process.stderr.write(`soilcell: unexpected failure: ${e && e.message ? e.message : e}\n`);
    process.exit(3);
  },
);
