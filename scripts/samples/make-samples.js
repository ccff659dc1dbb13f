#!/usr/bin/env node
/**
 * `npm run samples`: writes the sample workbooks of sample-workbooks/ from invented, seeded data.
 * Each workbook is written with ExcelJS using typed formulas (=SOIL.CEC(…)) and then passed
 * through the headless engine, so the committed file holds Excel's stored form
 * (_xldudf_SOIL_… dynamic-array formulas) with cached values. Needs `npm run build:node` first
 * (the npm script runs it). `--out DIR` writes them into DIR instead (the test that the committed
 * files are current regenerates them into a temporary folder).
 */
"use strict";
const fs = require("fs");
const os = require("os");
const path = require("path");
const ExcelJS = require("exceljs");

const ROOT = path.resolve(__dirname, "../..");
const BUILD = path.join(ROOT, "build/src");
const need = (p) => {
  try {
    return require(path.join(BUILD, p));
  } catch (e) {
    throw new Error(`cannot load build/src/${p} (${e.message}); run npm run build:node first`);
  }
};
const { recalcWorkbook } = need("engine/recalc");
const build = {
  chemistry: need("core/chemistry"),
  sufficiency: need("core/bands/sufficiency"),
  about: need("core/about"),
  legumes: need("core/nitrogen/legumes"),
  layout: need("cli/demo").LAYOUT,
};
const { seasonWorkbook } = require("./season");
const { legumeWorkbook } = require("./legume");

/** The output folder: sample-workbooks/, or the folder after --out. */
function outDir(argv) {
  const i = argv.indexOf("--out");
  if (i === -1) return path.join(ROOT, "sample-workbooks");
  const dir = argv[i + 1];
  if (!dir || dir.startsWith("--")) throw new Error("--out needs a folder");
  return path.resolve(dir);
}
const OUT = outDir(process.argv.slice(2));

async function write(name, made, expectedErrors) {
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), "soilcell-samples-"));
  const typed = path.join(tmp, name);
  await made.wb.xlsx.writeFile(typed);
  const target = path.join(OUT, name);
  const s = await recalcWorkbook(typed, target);
  fs.rmSync(tmp, { recursive: true, force: true });

  // The result must open, and hold no error cell other than the deliberate ones.
  const check = new ExcelJS.Workbook();
  await check.xlsx.readFile(target);
  const found = s.errors.map((e) => `${e.sheet}!${e.cell}`).sort();
  const wanted = expectedErrors.map((e) => `${e.sheet}!${e.cell}`).sort();
  if (JSON.stringify(found) !== JSON.stringify(wanted)) {
    for (const e of s.errors) console.error(`  ${e.sheet}!${e.cell} ${e.error} ${e.message}   ${e.formula}`);
    throw new Error(`${name}: cells in error ${JSON.stringify(found)}, expected ${JSON.stringify(wanted)}`);
  }
  if (s.kept.length) throw new Error(`${name}: formulas the engine could not compute: ${s.kept.map((k) => `${k.sheet}!${k.cell} ${k.formula}`).join("; ")}`);
  console.log(`${name}: ${check.worksheets.length} sheets, ${s.formulaCells} formula cells (${s.soilFormulaCells} SOIL, ${s.spilledCells} spilled cells), ${s.errors.length} deliberate error cells`);
  return s;
}

async function main() {
  fs.mkdirSync(OUT, { recursive: true });
  const season = seasonWorkbook(build);
  await write("caddow-2025-soil-tests.xlsx", season, season.facts.deliberateErrors);
  console.log(`  ${season.facts.samplesA} + ${season.facts.samplesB} samples; client report shows ${season.facts.reportSample}`);
  const legume = legumeWorkbook(build);
  await write("caddow-2025-legume-n-budget.xlsx", legume, []);
  console.log(`  ${legume.facts.paddocks} legume paddocks`);
}

main().catch((e) => {
  console.error(`samples: ${e.message}`);
  process.exitCode = 1;
});
