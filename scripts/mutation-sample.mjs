#!/usr/bin/env node
/**
 * Draws a random sample of the mutants of some mutation parts (mutation/parts.js), for a
 * folder whose every mutant cannot be run in the time there is (src/engine: about 11,000 mutants in
 * the parts not run yet, at 8 to 15 a minute on two shared cores). Random mutant sampling is a
 * published way to estimate a mutation score at a fraction of the cost (Wong & Mathur 1995,
 * "Reducing the cost of mutation testing: an empirical study", J. Systems and Software; Zhang et
 * al. 2010, "Is operator-based mutant selection superior to random mutant selection?", ICSE: from
 * memory). The sample is an estimate with an interval, reported as such; a part run in full
 * replaces the sample's figures for that part.
 *
 *   node scripts/mutation-sample.mjs --size=320 --seed=20261204 engine-io engine-book ...
 *
 * Mutants are listed by Stryker's own instrumenter (the mutants a run would make, less those marked
 * equivalent in the source) and grouped by the span of source they change: several operators
 * change the same expression (`a < b` → true, false, <=, >=), and Stryker can only leave out whole
 * syntax nodes, not single operators. Spans are drawn without replacement by a seeded generator
 * (so a draw is reproducible) and every mutant of a drawn span is run: each mutant has the same
 * chance to be in the sample, and the estimate is the ratio over the drawn spans' mutants, its
 * interval from the spread between spans (cluster sampling). The list is written to
 * mutation/sample/<folder>.json (committed). The `<folder>-sample` part (mutation/parts.js) gives
 * Stryker each drawn span as a mutate range, and mutation/sample-ignorer.mjs leaves out the nodes
 * nested in a drawn span that hold no drawn span (those of a removed block's statements).
 */
import fs from "fs";
import path from "path";
import { createRequire } from "module";
import { fileURLToPath } from "url";
import { Instrumenter } from "@stryker-mutator/instrumenter";

const ROOT = path.join(path.dirname(fileURLToPath(import.meta.url)), "..");
const require = createRequire(import.meta.url);
const { PARTS } = require(path.join(ROOT, "mutation", "parts.js"));

const args = process.argv.slice(2);
const opt = (name, fallback) => {
  const a = args.find((x) => x.startsWith(`--${name}=`));
  return a ? a.slice(name.length + 3) : fallback;
};
const size = Number(opt("size", "200")); // spans
const seed = Number(opt("seed", "20261204"));
const partNames = args.filter((a) => !a.startsWith("--"));
if (!partNames.length || !Number.isInteger(size) || size < 1) {
  console.error("usage: node scripts/mutation-sample.mjs --size=N --seed=S PART...");
  process.exit(2);
}
const folders = new Set(partNames.map((p) => PARTS[p]?.folder));
if (folders.has(undefined)) throw new Error(`unknown part among ${partNames.join(", ")}`);
if (folders.size !== 1) throw new Error("a sample is drawn from the parts of one folder");
const folder = [...folders][0];

/** A seeded generator (the draw must be the same on every machine). */
const { seededRandom: generator } = require(path.join(ROOT, "scripts", "seeded-random.js"));

// The files of a glob as parts.js writes them: {a,b} alternatives and a dir/**/*.ts tail (any depth).
function expand(glob) {
  const brace = /\{([^{}]*)\}/.exec(glob);
  if (brace) return brace[1].split(",").flatMap((alt) => expand(glob.slice(0, brace.index) + alt + glob.slice(brace.index + brace[0].length)));
  const deep = /^(.*)\/\*\*\/\*(\.[a-z]+)$/.exec(glob);
  if (deep) {
    const found = [];
    const walk = (dir) => {
      for (const e of fs.readdirSync(path.join(ROOT, dir), { withFileTypes: true })) {
        const rel = `${dir}/${e.name}`;
        if (e.isDirectory()) walk(rel);
        else if (e.name.endsWith(deep[2])) found.push(rel);
      }
    };
    walk(deep[1]);
    return found;
  }
  if (/[*?[]/.test(glob)) throw new Error(`a pattern this script cannot expand: ${glob}`);
  return fs.existsSync(path.join(ROOT, glob)) ? [glob] : [];
}

/** A part's mutate pattern as files and an optional line range (1-based, as Stryker reads it). */
function filesOf(pattern) {
  const m = /^(.*?):(\d+)-(\d+)$/.exec(pattern);
  return expand(m ? m[1] : pattern).sort().map((f) => ({ file: f, from: m ? Number(m[2]) : 1, to: m ? Number(m[3]) : Infinity }));
}

const silent = { isDebugEnabled: () => false, isTraceEnabled: () => false, isInfoEnabled: () => false, debug() {}, trace() {}, info() {}, warn() {}, error() {}, fatal() {} };
const instrumenter = new Instrumenter(silent);
const population = [];
const perPart = {};
for (const part of partNames) {
  let n = 0;
  for (const pattern of PARTS[part].mutate) {
    for (const { file, from, to } of filesOf(pattern)) {
      const content = fs.readFileSync(path.join(ROOT, file), "utf8");
      const r = await instrumenter.instrument([{ name: file, content, mutate: true }], { plugins: null, excludedMutations: [], ignorers: [], noHeader: false });
      for (const m of r.mutants) {
        const line = m.location.start.line + 1; // the instrumenter counts lines from 0
        if (line < from || line > to) continue;
        if (m.statusReason) continue; // marked equivalent in the source (listed in the README)
        population.push({ part, file, mutator: m.mutatorName, replacement: m.replacement, start: { line, column: m.location.start.column + 1 }, end: { line: m.location.end.line + 1, column: m.location.end.column + 1 } });
        n++;
      }
    }
  }
  perPart[part] = n;
}

// The spans, in a fixed order (file, then place), each with its mutants.
const spanKey = (m) => `${m.file}:${m.start.line}:${m.start.column}-${m.end.line}:${m.end.column}`;
const spans = new Map();
for (const m of population) {
  const k = spanKey(m);
  if (!spans.has(k)) spans.set(k, { part: m.part, file: m.file, start: m.start, end: m.end, mutants: [] });
  spans.get(k).mutants.push({ mutator: m.mutator, replacement: m.replacement });
}
const order = [...spans.values()].sort((a, b) => a.file.localeCompare(b.file) || a.start.line - b.start.line || a.start.column - b.start.column || a.end.line - b.end.line || a.end.column - b.end.column);
// Partial Fisher–Yates: the first `size` places are a simple random sample without replacement.
const rand = generator(seed);
const pool = order.slice();
const take = Math.min(size, pool.length);
for (let i = 0; i < take; i++) {
  const j = i + Math.floor(rand() * (pool.length - i));
  [pool[i], pool[j]] = [pool[j], pool[i]];
}
const drawnSpans = pool.slice(0, take).sort((a, b) => order.indexOf(a) - order.indexOf(b));
const out = {
  note: "A random sample of mutants by span (scripts/mutation-sample.mjs); lines and columns 1-based, as Stryker reports them.",
  drawn: new Date().toISOString().slice(0, 10),
  seed,
  spans: take,
  mutantsDrawn: drawnSpans.reduce((a, s) => a + s.mutants.length, 0),
  population: { spans: order.length, mutants: population.length },
  parts: perPart,
  drawnSpans,
};
const file = path.join(ROOT, "mutation", "sample", `${folder}.json`);
fs.mkdirSync(path.dirname(file), { recursive: true });
fs.writeFileSync(file, JSON.stringify(out, null, 1) + "\n");
console.log(`${take} of ${order.length} spans drawn (seed ${seed}), ${out.mutantsDrawn} of ${population.length} mutants, from ${partNames.join(", ")}: ${path.relative(ROOT, file)}`);
for (const [p, n] of Object.entries(perPart)) console.log(`  ${p.padEnd(18)} ${String(n).padStart(6)} mutants, ${drawnSpans.filter((s) => s.part === p).reduce((a, s) => a + s.mutants.length, 0)} drawn`);
