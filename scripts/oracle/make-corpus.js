#!/usr/bin/env node
/**
 * Writes the native-formula corpus (tests/fixtures/corpus/NAME.xlsx) from corpus-cases.js, and
 * for each workbook that LibreOffice cannot read as it stands, the reference copy it computes
 * instead (tests/fixtures/corpus/libreoffice-input/NAME.xlsx):
 * - every SOIL cell, and the cells of its spill, replaced by the values `soilcell eval` gives for
 *   each element (LibreOffice has no SOIL functions);
 * - `_xlfn.ANCHORARRAY(B2)` (Excel's stored form of `B2#`) replaced by the range the anchor's
 *   array formula covers (LibreOffice 7.4 has no spill operator).
 * Every formula cell of both files caches a sentinel value (-987654.321), deliberately wrong, so
 * the oracle can prove LibreOffice recomputed it. A manifest (corpus/manifest.json) records which
 * cells hold SOIL values and the eval calls they came from.
 *
 * Needs the build (`npm run build:node`). Usage: node scripts/oracle/make-corpus.js
 */
"use strict";
const { execFileSync } = require("child_process");
const fs = require("fs");
const path = require("path");
const { CASES } = require("./corpus-cases");
const { buildXlsx } = require("./xlsx-build");
const { addressesOf } = require("./xlsx-cells");

const ROOT = path.resolve(__dirname, "../..");
const CLI = path.join(ROOT, "build/src/cli/main.js");
const OUT = path.join(ROOT, "tests/fixtures/corpus");
const SENTINEL = -987654.321;

/** Runs the CLI; `eval` exits 1 when the result is an error, which is an answer here. */
function soilcell(args) {
  try {
    return execFileSync(process.execPath, [CLI, ...args], { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
  } catch (e) {
    if (e.status === 1 && e.stdout) return e.stdout;
    throw e;
  }
}

let params;
/** Parameter names of a SOIL function, in the order the current build declares them. */
function parameterNames(fn) {
  if (!params) {
    const list = JSON.parse(soilcell(["list", "--json"]));
    params = new Map(list.functions.map((f) => [f.name.replace(/^SOIL\./, ""), f.arguments.map((a) => a.replace(/^\[|\]$/g, ""))]));
  }
  const names = params.get(fn);
  if (!names) throw new Error(`SOIL.${fn} is not in this build`);
  return names;
}

function literal(v) {
  if (v === null || v === undefined) return "";
  if (typeof v === "number") return String(v);
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  if (typeof v === "string") return `"${v.replace(/"/g, '""')}"`;
  if (v.literal) return v.literal;
  throw new Error(`no literal for ${JSON.stringify(v)}`);
}

/**
 * The value of each spilled element of a SOIL cell, from `soilcell eval` on that element's own
 * arguments (scalars, placed by parameter name). Returns [{ formula, value | error, message }].
 */
function soilElements(soil, spillValues) {
  const names = parameterNames(soil.fn);
  for (const k of Object.keys(soil.args)) if (!names.includes(k)) throw new Error(`SOIL.${soil.fn} has no parameter ${k} (has ${names.join(", ")})`);
  const args = Object.fromEntries(
    Object.entries(soil.args).map(([k, v]) => [k, v && typeof v === "object" && v.spillOf ? spillValues.get(v.spillOf).map((e) => e.value ?? { literal: "NA()" }) : v]),
  );
  const n = Math.max(1, ...Object.values(args).map((v) => (Array.isArray(v) ? v.length : 1)));
  const out = [];
  for (let i = 0; i < n; i++) {
    const list = names.map((name) => (name in args ? (Array.isArray(args[name]) ? args[name][i] : args[name]) : undefined));
    while (list.length && list[list.length - 1] === undefined) list.pop();
    const formula = `=SOIL.${soil.fn}(${list.map(literal).join(",")})`;
    const r = JSON.parse(soilcell(["eval", formula, "--json"]));
    if (Array.isArray(r.value)) throw new Error(`${formula} spills by itself; give one element per call`);
    out.push(r.error ? { formula, error: r.error, message: r.message } : { formula, value: r.value });
  }
  return out;
}

/** Replaces `_xlfn.ANCHORARRAY(X)` outside string literals by the range of X's array formula. */
function withoutSpillOperator(formula, sheetName, book) {
  return formula
    .split(/("(?:[^"]|"")*")/)
    .map((part, i) =>
      i % 2
        ? part
        : part.replace(/_xlfn\.ANCHORARRAY\(((?:'(?:[^']|'')+'|[A-Za-z0-9_.]+)!)?\$?([A-Z]+)\$?(\d+)\)/g, (m, qual, col, row) => {
            const target = qual ? qual.slice(0, -1).replace(/^'|'$/g, "").replace(/''/g, "'") : sheetName;
            const spec = book.sheets.find((s) => s.name === target)?.cells[`${col}${row}`];
            if (!spec || spec.t !== "array") throw new Error(`${m}: ${target}!${col}${row} is not an array formula`);
            const [, end] = spec.ref.split(":");
            return `${qual ?? ""}${col}${row}${end ? `:${end}` : ""}`;
          }),
    )
    .join("");
}

function cachedCell(e) {
  if (e.error) return { e: e.error };
  if (typeof e.value === "number") return e.value;
  if (typeof e.value === "boolean") return { b: e.value };
  if (typeof e.value === "string") return e.value;
  if (e.value === null) return null;
  throw new Error(`unexpected SOIL value ${JSON.stringify(e)}`);
}

async function main() {
  fs.mkdirSync(path.join(OUT, "libreoffice-input"), { recursive: true });
  const manifest = {};
  for (const c of CASES) {
    const book = { sheets: c.sheets, names: c.names, date1904: c.date1904, sentinel: SENTINEL };
    fs.writeFileSync(path.join(OUT, `${c.name}.xlsx`), await buildXlsx(book));
    let changed = false;
    const soilCells = {};
    const loSheets = c.sheets.map((sheet) => {
      const cells = { ...sheet.cells };
      const spillValues = new Map();
      for (const [addr, spec] of Object.entries(sheet.cells)) {
        if (!spec || typeof spec !== "object" || !spec.soil) continue;
        const elements = soilElements(spec.soil, spillValues);
        spillValues.set(addr, elements);
        const range = addressesOf(spec.ref ?? addr);
        if (range.length !== elements.length) throw new Error(`${c.name} ${sheet.name}!${addr}: ref ${spec.ref} holds ${range.length} cells, the call gives ${elements.length}`);
        range.forEach((a, i) => {
          cells[a] = cachedCell(elements[i]);
          (soilCells[sheet.name] ??= {})[a] = elements[i];
        });
        changed = true;
      }
      for (const [addr, spec] of Object.entries(cells)) {
        if (spec && typeof spec === "object" && typeof spec.f === "string" && /_xlfn\.ANCHORARRAY\(/i.test(spec.f)) {
          cells[addr] = { ...spec, f: withoutSpillOperator(spec.f, sheet.name, c) };
          changed = true;
        }
      }
      return { ...sheet, cells };
    });
    const loInput = changed ? `libreoffice-input/${c.name}.xlsx` : null;
    if (loInput) fs.writeFileSync(path.join(OUT, loInput), await buildXlsx({ ...book, sheets: loSheets }));
    else fs.rmSync(path.join(OUT, `libreoffice-input/${c.name}.xlsx`), { force: true });
    manifest[c.name] = { file: `${c.name}.xlsx`, what: c.what, ...(c.notes ? { notes: c.notes } : {}), libreofficeInput: loInput, soilCells };
    process.stdout.write(`${c.name}.xlsx${loInput ? ` (+ ${loInput})` : ""}\n`);
  }
  fs.writeFileSync(path.join(OUT, "manifest.json"), `${JSON.stringify({ sentinel: SENTINEL, cases: manifest }, null, 2)}\n`);
}

module.exports = { SENTINEL, withoutSpillOperator };

if (require.main === module) {
  main().catch((e) => {
    process.stderr.write(`${e.stack ?? e}\n`);
    process.exit(1);
  });
}
