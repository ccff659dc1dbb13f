#!/usr/bin/env node
/**
 * Consultant-style workbooks against LibreOffice: SOIL formulas feeding native formulas
 * downstream, recalculated by `soilcell recalc`, every native formula cell compared with what
 * LibreOffice computes on a reference copy (each SOIL cell and spill element replaced by the value
 * soilcell wrote for it; reference-copy.js).
 *
 * So that a downstream cell soilcell failed to recompute shows up, each input is made
 * self-consistent first, as Excel would have saved it before the season's new SOIL results: pass A
 * gives every native formula the value LibreOffice computes from the SOIL cells' *stale* cached
 * values (deliberately different from what soilcell computes). Then, after `recalc`, every native
 * formula cell (downstream or not) must equal LibreOffice's pass-B value; a cell soilcell should
 * have recomputed but kept shows up as its pass-A value.
 *
 * Workbooks: consultant-workbooks.js (invented farms and labs). Needs the build and LibreOffice.
 * Usage: node scripts/oracle/consultant-attack.js [--keep DIR] [--only NAME,NAME] [--print] [--all]
 *          [--fixture DIR --fixture-books NAME,NAME]
 *   --print    show soilcell's own output for each workbook
 *   --all      list every compared cell, not only the differences
 *   --fixture  write the named workbooks' self-consistent inputs and every native formula cell's
 *              expected value (LibreOffice's, or OVERRIDES' with its source) to DIR, for
 *              tests/engine/consultant-workbooks.test.ts; refuses while a difference is unexplained
 */
"use strict";
const fs = require("fs");
const os = require("os");
const path = require("path");
const { execFileSync } = require("child_process");
const { buildXlsx } = require("./xlsx-build");
const { convertAll } = require("./lo");
const { readWorkbookCells, parseRange, addressesOf } = require("./xlsx-cells");
const { referenceCopy } = require("./reference-copy");
const { BOOKS } = require("./consultant-workbooks");

const ROOT = path.resolve(__dirname, "../..");
const CLI = path.join(ROOT, "build/src/cli/main.js");

const arg = (name) => {
  const i = process.argv.indexOf(name);
  return i < 0 ? undefined : process.argv[i + 1];
};

/**
 * Cells where LibreOffice is not the reference: soilcell's value and why. Keyed "book!sheet!cell";
 * a value "refused" stands for the visible refusal #VALUE! (its message in the summary).
 */
const TEXT_REFUSED = { value: { error: "#VALUE!" }, source: "behaviour: TEXT is not computed headless (its format codes depend on the computer's locale); a visible refusal, not a value" };
const OVERRIDES = {};
for (const r of [2, 3, 4, 5, 6, 7, 8, 9]) OVERRIDES[`ardlow-downs-2025!Calc!J${r}`] = TEXT_REFUSED;
OVERRIDES["ardlow-downs-2025!Summary!J2"] = { value: { error: "#VALUE!" }, source: "behaviour: reads Calc!J2:J9, refused (TEXT)" };

const isSoil = (f) => /_xldudf_SOIL_|\bSOIL\./i.test(f);

/** SOIL cells of a described book: { sheet: Set(addr) } including spill elements. */
function soilCellsOfSpec(book) {
  const out = {};
  for (const s of book.sheets) {
    const set = (out[s.name] = new Set());
    for (const [addr, spec] of Object.entries(s.cells)) {
      if (spec && typeof spec === "object" && typeof spec.f === "string" && isSoil(spec.f)) {
        set.add(addr);
        if (spec.ref) for (const a of addressesOf(spec.ref)) set.add(a);
      }
    }
  }
  return out;
}

function specValue(spec) {
  if (spec === undefined || spec === null) return null;
  if (typeof spec === "number" || typeof spec === "string" || typeof spec === "boolean") return spec;
  if (spec.f !== undefined) return spec.v === undefined ? null : spec.v.e ? { error: spec.v.e } : spec.v;
  if (spec.n !== undefined) return spec.n;
  if (spec.inline !== undefined) return spec.inline;
  if (spec.b !== undefined) return spec.b;
  if (spec.e !== undefined) return { error: spec.e };
  return null;
}

const toCached = (v) => (v === null || v === undefined ? undefined : typeof v === "object" && v.error ? { e: v.error } : v);

function same(a, b) {
  if (typeof a === "number" && typeof b === "number") return a === b || Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b));
  return JSON.stringify(a) === JSON.stringify(b);
}

async function main() {
  const work = arg("--keep") ?? fs.mkdtempSync(path.join(os.tmpdir(), "soilcell-attack-"));
  for (const d of ["a-in", "a-out", "in", "out", "b-in", "b-out"]) fs.mkdirSync(path.join(work, d), { recursive: true });
  const only = arg("--only");
  const books = BOOKS.filter((b) => !only || only.split(",").includes(b.name));

  // pass A: the stale state Excel would have saved
  const aInputs = [];
  for (const b of books) {
    const bytes = await buildXlsx(b.book);
    const soil = soilCellsOfSpec(b.book);
    const rep = {};
    for (const s of b.book.sheets) for (const a of soil[s.name]) (rep[s.name] ??= {})[a] = specValue(s.cells[a]);
    const f = path.join(work, "a-in", `${b.name}.xlsx`);
    fs.writeFileSync(f, await referenceCopy(bytes, rep, { emptyTextAsFormula: true }));
    aInputs.push(f);
  }
  convertAll(aInputs, path.join(work, "a-out"));
  for (const b of books) {
    const lo = await readWorkbookCells(fs.readFileSync(path.join(work, "a-out", `${b.name}.xlsx`)));
    const soil = soilCellsOfSpec(b.book);
    for (const s of b.book.sheets) {
      const los = lo.sheets.find((x) => x.name === s.name);
      for (const [addr, spec] of Object.entries(s.cells)) {
        if (!spec || typeof spec !== "object" || spec.f === undefined || soil[s.name].has(addr)) continue;
        const c = los.cells.get(addr);
        spec.v = toCached(c ? c.value : null);
        if (spec.t === "array" && spec.ref) {
          for (const a of addressesOf(spec.ref)) if (a !== addr) s.cells[a] = toCached(los.cells.get(a)?.value ?? null) ?? null;
        }
      }
    }
    fs.writeFileSync(path.join(work, "in", `${b.name}.xlsx`), await buildXlsx(b.book));
  }

  // soilcell
  const runs = {};
  for (const b of books) {
    const input = path.join(work, "in", `${b.name}.xlsx`);
    const output = path.join(work, "out", `${b.name}.xlsx`);
    let stdout = "";
    let stderr = "";
    let code = 0;
    try {
      stdout = execFileSync(process.execPath, [CLI, "recalc", input, "-o", output, "--jobs", "1"], { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
    } catch (e) {
      code = e.status;
      stdout = e.stdout;
      stderr = e.stderr;
    }
    runs[b.name] = { code, stdout, stderr };
  }

  // pass B: LibreOffice on soilcell's SOIL values
  const bInputs = [];
  const outs = {};
  for (const b of books) {
    const output = path.join(work, "out", `${b.name}.xlsx`);
    if (!fs.existsSync(output)) continue;
    const bytes = fs.readFileSync(output);
    const book = await readWorkbookCells(bytes);
    outs[b.name] = book;
    const rep = {};
    for (const s of book.sheets) {
      for (const c of s.cells.values()) {
        if (!c.f || !isSoil(c.f.text)) continue;
        const targets = c.f.ref ? addressesOf(c.f.ref) : [c.r];
        for (const a of targets) (rep[s.name] ??= {})[a] = s.cells.get(a)?.value ?? null;
      }
    }
    const f = path.join(work, "b-in", `${b.name}.xlsx`);
    fs.writeFileSync(f, await referenceCopy(bytes, rep, { emptyTextAsFormula: true }));
    bInputs.push(f);
    b.rep = rep;
  }
  if (bInputs.length) convertAll(bInputs, path.join(work, "b-out"));

  let compared = 0;
  let diffs = 0;
  const report = [];
  for (const b of books) {
    const r = runs[b.name];
    report.push(`== ${b.name} (exit ${r.code})`);
    if (process.argv.includes("--print")) report.push(r.stdout.trim(), r.stderr.trim());
    const book = outs[b.name];
    if (!book) {
      report.push(`  no output: ${r.stderr.trim()}`);
      continue;
    }
    const lo = await readWorkbookCells(fs.readFileSync(path.join(work, "b-out", `${b.name}.xlsx`)));
    for (const s of book.sheets) {
      const los = lo.sheets.find((x) => x.name === s.name);
      const soilHere = new Set(Object.keys(b.rep[s.name] ?? {}));
      const addrs = new Set();
      for (const c of s.cells.values()) {
        if (!c.f || soilHere.has(c.r)) continue;
        addrs.add(c.r);
        if (c.f.t === "array" && c.f.ref) for (const a of addressesOf(c.f.ref)) addrs.add(a);
      }
      for (const a of addrs) {
        const mine = s.cells.get(a)?.value ?? null;
        const theirs = los.cells.get(a)?.value ?? null;
        compared += 1;
        const f = s.cells.get(a)?.f?.text;
        const o = OVERRIDES[`${b.name}!${s.name}!${a}`];
        (((b.expected ??= {})[s.name] ??= {})[a] = o ? { value: o.value, source: o.source, libreoffice: theirs } : { value: theirs, source: "LO 7.4 headless" });
        if (o && same(mine, o.value)) continue;
        if (o || !same(mine, theirs)) {
          b.unexplained = true;
          diffs += 1;
          report.push(`  DIFF ${s.name}!${a} =${f ?? "(array element)"}: soilcell ${JSON.stringify(mine)} LO ${JSON.stringify(theirs)}`);
        } else if (process.argv.includes("--all")) report.push(`  same ${s.name}!${a} =${f ?? ""}: ${JSON.stringify(mine)}`);
      }
    }
  }
  console.log(report.join("\n"));
  const fixture = arg("--fixture");
  if (fixture) {
    fs.mkdirSync(fixture, { recursive: true });
    for (const name of (arg("--fixture-books") ?? "").split(",").filter(Boolean)) {
      const b = books.find((x) => x.name === name);
      if (!b) throw new Error(`no workbook ${name}`);
      if (b.unexplained) throw new Error(`${name}: a difference is not explained in OVERRIDES; no fixture written`);
      fs.copyFileSync(path.join(work, "in", `${name}.xlsx`), path.join(fixture, `${name}.xlsx`));
      const soil = {};
      for (const [sheet, m] of Object.entries(b.rep ?? {})) soil[sheet] = m;
      fs.writeFileSync(path.join(fixture, `${name}.json`), JSON.stringify({ file: `${name}.xlsx`, exit: runs[name].code, native: b.expected, soil }, null, 1) + "\n");
      console.log(`fixture ${name} written to ${fixture}`);
    }
  }
  console.log(`\n${books.length} workbooks, ${compared} native cells compared, ${diffs} differences (work: ${work})`);
}

main().catch((e) => {
  console.error(e);
  process.exit(3);
});
