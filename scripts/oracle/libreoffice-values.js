#!/usr/bin/env node
/**
 * The oracle: LibreOffice Calc computes every formula of the corpus, and what it caches becomes
 * tests/fixtures/corpus/expected/NAME.json.
 *
 * One LibreOffice run (scripts/oracle/lo.js: private profile, recalculation on load forced to
 * "always", Excel-like text conversion, en-US) converts every corpus workbook (or its reference
 * copy, see make-corpus.js) to a recalculated .xlsx; this script reads each formula cell's cached
 * value from that file's sheet XML (xlsx-cells.js) at the addresses where the corpus file has a
 * formula or an array-formula element. Then:
 * - SOIL cells take the values `soilcell eval` gave per element (manifest.json), marked as such;
 * - where Excel 365 and LibreOffice differ by design, excel-overrides.json gives Excel's value with
 *   the reason and a source; the LibreOffice value recorded there must still be what it computes;
 * - every formula cell caches a deliberately wrong sentinel before LibreOffice sees it: a value
 *   that comes back as the sentinel means the recalculation did not happen, and the run fails.
 *
 * Usage: node scripts/oracle/libreoffice-values.js [--check]
 *   --check: compute, compare with the committed expected files, report differences (exit 1).
 */
"use strict";
const fs = require("fs");
const os = require("os");
const path = require("path");
const { convertAll, libreOfficeVersion } = require("./lo");
const { readWorkbookCells, formulaAddresses, plain } = require("./xlsx-cells");

const ROOT = path.resolve(__dirname, "../..");
const CORPUS = path.join(ROOT, "tests/fixtures/corpus");

function readJson(file) {
  return JSON.parse(fs.readFileSync(file, "utf8"));
}

function same(a, b) {
  return JSON.stringify(a) === JSON.stringify(b);
}

/** Computes the expected values of every corpus workbook. Returns { name → expected object }. */
async function computeExpected(corpus = CORPUS) {
  const manifest = readJson(path.join(corpus, "manifest.json"));
  const overrides = fs.existsSync(path.join(corpus, "excel-overrides.json")) ? readJson(path.join(corpus, "excel-overrides.json")) : {};
  const work = fs.mkdtempSync(path.join(os.tmpdir(), "soilcell-oracle-"));
  try {
    const inDir = path.join(work, "in");
    fs.mkdirSync(inDir);
    const names = Object.keys(manifest.cases);
    for (const name of names) {
      const c = manifest.cases[name];
      fs.copyFileSync(path.join(corpus, c.libreofficeInput ?? c.file), path.join(inDir, `${name}.xlsx`));
    }
    const version = libreOfficeVersion();
    convertAll(
      names.map((n) => path.join(inDir, `${n}.xlsx`)),
      path.join(work, "out"),
    );
    const result = {};
    const problems = [];
    for (const name of names) {
      const c = manifest.cases[name];
      const source = await readWorkbookCells(fs.readFileSync(path.join(corpus, c.file)));
      const computed = await readWorkbookCells(fs.readFileSync(path.join(work, "out", `${name}.xlsx`)));
      const cells = {};
      const fromSoilcell = {};
      const excelOverrides = {};
      for (const sheet of source.sheets) {
        const lo = computed.sheets.find((s) => s.name === sheet.name);
        if (!lo) {
          problems.push(`${name}: LibreOffice's copy has no sheet ${sheet.name}`);
          continue;
        }
        const out = (cells[sheet.name] = {});
        const soil = c.soilCells[sheet.name] ?? {};
        for (const addr of formulaAddresses(sheet)) {
          if (soil[addr]) {
            const e = soil[addr];
            out[addr] = e.error ? { error: e.error } : e.value;
            (fromSoilcell[sheet.name] ??= {})[addr] = e.formula;
            continue;
          }
          const v = plain(lo.cells.get(addr));
          if (typeof v === "number" && v === manifest.sentinel) problems.push(`${name} ${sheet.name}!${addr}: still the sentinel: LibreOffice did not recalculate`);
          const o = overrides[name]?.[sheet.name]?.[addr];
          if (o) {
            if (!same(o.libreoffice, v)) problems.push(`${name} ${sheet.name}!${addr}: excel-overrides.json says LibreOffice gives ${JSON.stringify(o.libreoffice)}, it gave ${JSON.stringify(v)}`);
            out[addr] = o.excel;
            (excelOverrides[sheet.name] ??= {})[addr] = o;
          } else out[addr] = v;
        }
      }
      for (const [sheet, byCell] of Object.entries(overrides[name] ?? {})) {
        for (const addr of Object.keys(byCell)) if (!excelOverrides[sheet]?.[addr]) problems.push(`${name} ${sheet}!${addr}: override for a cell that is not a formula cell`);
      }
      result[name] = {
        file: c.file,
        what: c.what,
        ...(c.notes ? { notes: c.notes } : {}),
        reference: `${version}, headless, recalculated on load (scripts/oracle/libreoffice-values.js)`,
        cells,
        ...(Object.keys(fromSoilcell).length ? { fromSoilcell } : {}),
        ...(Object.keys(excelOverrides).length ? { excelOverrides } : {}),
      };
    }
    return { result, problems };
  } finally {
    fs.rmSync(work, { recursive: true, force: true });
  }
}

/** Differences between two expected objects' cells (ignoring the LibreOffice version line). */
function differences(name, want, got) {
  const out = [];
  const sheets = new Set([...Object.keys(want.cells), ...Object.keys(got.cells)]);
  for (const s of sheets) {
    const a = want.cells[s] ?? {};
    const b = got.cells[s] ?? {};
    for (const addr of new Set([...Object.keys(a), ...Object.keys(b)])) {
      if (!same(a[addr], b[addr])) out.push(`${name} ${s}!${addr}: committed ${JSON.stringify(a[addr])}, LibreOffice now ${JSON.stringify(b[addr])}`);
    }
  }
  return out;
}

async function main() {
  const check = process.argv.includes("--check");
  const { result, problems } = await computeExpected();
  if (problems.length) {
    process.stderr.write(`${problems.join("\n")}\n`);
    process.exit(1);
  }
  const dir = path.join(CORPUS, "expected");
  if (check) {
    const diffs = [];
    for (const [name, got] of Object.entries(result)) {
      const file = path.join(dir, `${name}.json`);
      if (!fs.existsSync(file)) diffs.push(`${name}: no committed expected file`);
      else diffs.push(...differences(name, readJson(file), got));
    }
    process.stdout.write(diffs.length ? `${diffs.join("\n")}\n` : "the committed expected values are what LibreOffice computes\n");
    process.exit(diffs.length ? 1 : 0);
  }
  fs.mkdirSync(dir, { recursive: true });
  for (const [name, expected] of Object.entries(result)) {
    fs.writeFileSync(path.join(dir, `${name}.json`), `${JSON.stringify(expected, null, 2)}\n`);
    const n = Object.values(expected.cells).reduce((k, s) => k + Object.keys(s).length, 0);
    process.stdout.write(`expected/${name}.json: ${n} cells\n`);
  }
}

module.exports = { computeExpected, differences };

if (require.main === module) {
  main().catch((e) => {
    process.stderr.write(`${e.stack ?? e}\n`);
    process.exit(1);
  });
}
