#!/usr/bin/env node
/**
 * Mutation testing, folder by folder (src/core, then src/functions, then src/engine), each folder in
 * parts (mutation/parts.js), then the score per folder and per part read from the committed
 * incremental files (mutation/incremental/<part>.json).
 *
 *   node scripts/mutation.js                 every part of all three folders, then the table
 *   node scripts/mutation.js core engine     only those folders, then the table
 *   node scripts/mutation.js core-lime       only that part, then the table
 *   node scripts/mutation.js --report        the table only, from the last runs
 *   node scripts/mutation.js --retest-timeouts core-lime
 *                                            first forgets the part's timed-out mutants, so they are
 *                                            run again (on a quiet machine, with a longer
 *                                            MUTATE_TIMEOUT_MS: a loaded machine times out mutants
 *                                            that only ran slowly)
 *   node scripts/mutation.js --retest-static functions
 *                                            the same for static mutants (with MUTATE_STATIC=1): a
 *                                            static mutant that a test also reaches ("hybrid") is
 *                                            otherwise run against that test alone
 *   node scripts/mutation.js --retest-survivors functions
 *                                            the same for surviving and uncovered mutants: after a
 *                                            test is added for them (Stryker's incremental mode
 *                                            does not see that a new test reaches a static mutant)
 *   node scripts/mutation.js --survivors     the table and every surviving / uncovered mutant
 *   node scripts/mutation.js --equivalents   every mutant marked equivalent in src, with its reason
 *                                            (Markdown, for the README)
 *   node scripts/mutation.js --markdown      the score table as Markdown
 *   node scripts/mutation.js --readme        writes that table and the equivalents list into README.md
 *   node scripts/mutation.js engine-sample   the random sample of the engine parts not run in full
 *                                            (drawn by scripts/mutation-sample.mjs); the table then
 *                                            gives the folder an estimate with a 95 % interval
 *
 * Stryker runs at low priority (nice 15): the machine is shared. Arguments after `--` go to Stryker.
 * Score = (killed + timed out) / (killed + timed out + survived + no coverage); mutants that do not
 * compile or that throw while loading ("errors": runtime errors, as Stryker counts them) are left
 * out (they can never reach a user), and mutants marked equivalent in the source
 * (`// Stryker disable next-line <mutator>: <reason>`) are listed with their reason, never hidden.
 * Static mutants (module-level code, which reruns the folder's every test per mutant) are skipped
 * unless MUTATE_STATIC=1, and counted in their own column, not in the score. Stryker counts a timeout
 * as detected; the table also gives the score if every timeout had survived ("floor").
 */
const fs = require("fs");
const path = require("path");
const { spawnSync } = require("child_process");

const ROOT = path.join(__dirname, "..");
const FOLDERS = ["core", "functions", "engine"];
const { PARTS } = require("../mutation/parts.js");
const { clusterRatio } = require("../mutation/estimate.js");
const TARGET = { core: 85, functions: 75, engine: 75 };

const argv = process.argv.slice(2);
const dash = argv.indexOf("--");
const own = dash < 0 ? argv : argv.slice(0, dash);
const passOn = dash < 0 ? [] : argv.slice(dash + 1);
const reportOnly = own.includes("--report");
const showSurvivors = own.includes("--survivors");
const showEquivalents = own.includes("--equivalents");
const markdown = own.includes("--markdown");
const readme = own.includes("--readme");
const retestTimeouts = own.includes("--retest-timeouts");
const retestStatic = own.includes("--retest-static");
const retestSurvivors = own.includes("--retest-survivors");
const chosen = own.filter((a) => !a.startsWith("--"));
for (const f of chosen) if (!FOLDERS.includes(f) && !PARTS[f]) throw new Error(`unknown folder or part ${f}: use ${[...FOLDERS, ...Object.keys(PARTS)].join(", ")}`);
// A folder's sample part runs only when named: a folder run runs its parts in full.
const parts = Object.keys(PARTS).filter((p) => chosen.includes(p) || (!PARTS[p].sample && (!chosen.length || chosen.includes(PARTS[p].folder))));
/** A folder's parts run in full (not its sample part). */
const fullParts = (folder) => Object.keys(PARTS).filter((p) => PARTS[p].folder === folder && !PARTS[p].sample);

/** Every `// Stryker disable next-line <mutators>: <reason>` in src, as a Markdown list. */
function equivalents() {
  const out = [];
  const walk = (dir) => {
    for (const e of fs.readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
      const p = path.join(dir, e.name);
      if (e.isDirectory()) walk(p);
      else if (e.name.endsWith(".ts")) {
        fs.readFileSync(p, "utf8").split("\n").forEach((line, i) => {
          const m = /\/\/\s*Stryker disable(?: next-line)? ([\w,]+):\s*(?:equivalent:\s*)?(.*)$/.exec(line);
          if (m) out.push(`- \`${path.relative(ROOT, p)}:${i + 2}\` ${m[1].split(",").join(", ")}: ${m[2].trim()}`);
        });
      }
    }
  };
  walk(path.join(ROOT, "src"));
  return out;
}
if (showEquivalents) {
  console.log(equivalents().join("\n"));
  process.exit(0);
}

/** Drops some of a part's mutants from its incremental file, so Stryker tests them again. */
function forget(part, what, which) {
  const file = path.join(ROOT, "mutation", "incremental", `${part}.json`);
  if (!fs.existsSync(file)) return;
  const report = JSON.parse(fs.readFileSync(file, "utf8"));
  let n = 0;
  for (const f of Object.values(report.files)) {
    const before = f.mutants.length;
    f.mutants = f.mutants.filter((m) => !which(m));
    n += before - f.mutants.length;
  }
  fs.writeFileSync(file, JSON.stringify(report));
  console.log(`${part}: ${n} ${what} mutants forgotten, to be run again`);
}

let failed = false;
if (!reportOnly && !showSurvivors && !markdown && !readme) {
  for (const part of parts) {
    const folder = PARTS[part].folder;
    console.log(`\n== mutation testing ${part}: ${PARTS[part].sample ? `the sample in ${PARTS[part].sample}` : PARTS[part].mutate.join(" ")} ==`);
    if (retestTimeouts) forget(part, "timed-out", (m) => m.status === "Timeout");
    if (retestStatic) forget(part, "static", (m) => m.static === true);
    if (retestSurvivors) forget(part, "surviving", (m) => m.status === "Survived" || m.status === "NoCoverage");
    const r = spawnSync("nice", ["-n", "15", process.execPath, path.join(ROOT, "node_modules/@stryker-mutator/core/bin/stryker.js"), "run", "stryker.config.mjs", ...passOn], {
      cwd: ROOT,
      stdio: "inherit",
      env: { ...process.env, MUTATE_PART: part, MUTATE_FOLDER: folder },
    });
    if (r.status !== 0) {
      console.error(`stryker failed on ${part} (exit ${r.status})`);
      failed = true;
    }
  }
}

/** A mutant's status as the table counts it: a static mutant that was not run is "Static", not "Ignored". */
const statusOf = (m) => (m.status === "Ignored" && /static mutant/i.test(m.statusReason ?? "") ? "Static" : m.status);

/** Counts of the mutants of some parts by status, from their incremental files (null: none run). */
function tally(partNames) {
  const files = partNames.map((p) => path.join(ROOT, "mutation", "incremental", `${p}.json`)).filter((f) => fs.existsSync(f));
  if (!files.length) return null;
  const counts = { Killed: 0, Survived: 0, NoCoverage: 0, Timeout: 0, CompileError: 0, RuntimeError: 0, Ignored: 0, Static: 0 };
  const survivors = [];
  const ignored = [];
  // Files changed since their results were recorded: the counts are those of the earlier version.
  const changed = [];
  for (const [name, f] of files.flatMap((file) => Object.entries(JSON.parse(fs.readFileSync(file, "utf8")).files))) {
    const now = path.join(ROOT, name);
    if (!fs.existsSync(now) || fs.readFileSync(now, "utf8") !== f.source) changed.push(name);
    for (const m of f.mutants) {
      const status = statusOf(m);
      counts[status] = (counts[status] ?? 0) + 1;
      const where = `${name}:${m.location.start.line}:${m.location.start.column}`;
      if (status === "Survived" || status === "NoCoverage") survivors.push(`${status.padEnd(10)} ${where} ${m.mutatorName} -> ${oneLine(m.replacement)}`);
      if (status === "Ignored") ignored.push(`${where} ${m.mutatorName}: ${m.statusReason ?? ""}`);
    }
  }
  const detected = counts.Killed + counts.Timeout;
  const valid = detected + counts.Survived + counts.NoCoverage;
  return {
    counts,
    score: valid ? (100 * detected) / valid : NaN,
    floor: valid ? (100 * counts.Killed) / valid : NaN,
    survivors,
    ignored,
    changed,
    missing: partNames.length - files.length,
  };
}
const oneLine = (s) => String(s ?? "").replace(/\s+/g, " ").slice(0, 80);

/** A target judged on an estimate: met only when the whole interval is above it. */
const estimateVerdict = (est, target) => (est.counts.Missing ? "not judged: the sample is out of date" : est.folderLow >= target ? "met, on the estimate" : est.folderHigh < target ? "NOT met, on the estimate" : "not judged: the interval spans it");

/**
 * The estimate for a folder's parts not run in full, from the run of its sample part (drawn by
 * scripts/mutation-sample.mjs): the drawn spans of those parts, their mutants' statuses, the ratio
 * detected / valid over them with a 95 % interval for cluster sampling (spans drawn without
 * replacement, the ratio estimator's variance), and the folder's score with those parts estimated.
 * Null when the folder has no sample or it was not run.
 */
function sampleEstimate(folder, full) {
  const part = Object.keys(PARTS).find((p) => PARTS[p].folder === folder && PARTS[p].sample);
  if (!part) return null;
  const resultFile = path.join(ROOT, "mutation", "incremental", `${part}.json`);
  const drawFile = path.join(ROOT, PARTS[part].sample);
  if (!fs.existsSync(resultFile) || !fs.existsSync(drawFile)) return null;
  const draw = JSON.parse(fs.readFileSync(drawFile, "utf8"));
  const notRun = Object.keys(draw.parts).filter((p) => !fs.existsSync(path.join(ROOT, "mutation", "incremental", `${p}.json`)));
  if (!notRun.length) return null;
  const results = JSON.parse(fs.readFileSync(resultFile, "utf8")).files;
  const counts = { Killed: 0, Survived: 0, NoCoverage: 0, Timeout: 0, CompileError: 0, RuntimeError: 0, Ignored: 0, Static: 0, Missing: 0 };
  const perSpan = [];
  const survivors = [];
  let drawnMutants = 0;
  const spans = draw.drawnSpans.filter((sp) => notRun.includes(sp.part));
  for (const sp of spans) {
    const ms = (results[sp.file]?.mutants ?? []).filter(
      (m) => m.location.start.line === sp.start.line && m.location.start.column === sp.start.column && m.location.end.line === sp.end.line && m.location.end.column === sp.end.column,
    );
    drawnMutants += sp.mutants.length;
    let d = 0;
    let v = 0;
    for (const want of sp.mutants) {
      const m = ms.find((x) => x.mutatorName === want.mutator && x.replacement === want.replacement);
      if (!m) {
        counts.Missing++; // the source changed since the draw: draw again
        continue;
      }
      const status = statusOf(m);
      counts[status] = (counts[status] ?? 0) + 1;
      if (status === "Killed" || status === "Timeout") d++;
      if (status === "Killed" || status === "Timeout" || status === "Survived" || status === "NoCoverage") v++;
      if (status === "Survived" || status === "NoCoverage") survivors.push(`${status.padEnd(10)} ${sp.file}:${sp.start.line}:${sp.start.column} ${m.mutatorName} -> ${oneLine(m.replacement)} (sample)`);
    }
    perSpan.push([d, v]);
  }
  const n = perSpan.length;
  const { p, sd, valid: V } = clusterRatio(perSpan, draw.population.spans);
  // The folder: its full parts counted, the parts not run estimated from the sample (their valid
  // mutants from their population and the sample's share of valid mutants).
  const population = notRun.reduce((a, q) => a + draw.parts[q], 0);
  const validRest = drawnMutants ? (population * V) / drawnMutants : 0;
  const fullDetected = full ? full.counts.Killed + full.counts.Timeout : 0;
  const fullValid = full ? fullDetected + full.counts.Survived + full.counts.NoCoverage : 0;
  const folderScore = (100 * (fullDetected + p * validRest)) / (fullValid + validRest);
  const folderSd = (100 * sd * validRest) / (fullValid + validRest);
  return {
    part,
    notRun,
    spans: n,
    counts,
    population,
    drawnMutants,
    score: 100 * p,
    floor: (100 * counts.Killed) / (counts.Killed + counts.Timeout + counts.Survived + counts.NoCoverage),
    low: 100 * (p - 1.96 * sd),
    high: 100 * Math.min(1, p + 1.96 * sd),
    folderScore,
    folderLow: folderScore - 1.96 * folderSd,
    folderHigh: Math.min(100, folderScore + 1.96 * folderSd),
    survivors,
  };
}

/** The score table as Markdown lines. */
function markdownTable() {
  const lines = [];
  const pct = (x) => `${x.toFixed(1)} %`;
  const cells = (t) => {
    const c = t.counts;
    return [c.Killed, c.Survived, c.NoCoverage, c.Timeout, c.CompileError + c.RuntimeError, c.Ignored, c.Static];
  };
  lines.push("| part | killed | survived | no coverage | timed out | errors | equivalent | static, not run | score | floor |");
  lines.push("|---|---|---|---|---|---|---|---|---|---|");
  for (const folder of FOLDERS) {
    const names = fullParts(folder);
    const t = tally(names);
    if (!t) {
      lines.push(`| \`src/${folder}\` | not run | | | | | | | | |`);
      continue;
    }
    const target = TARGET[folder];
    const est = t.missing ? sampleEstimate(folder, t) : null;
    const verdict = !t.missing ? (t.score >= target ? "met" : "NOT met") : est ? estimateVerdict(est, target) : `not judged, ${t.missing} of ${names.length} parts not run`;
    const shown = est ? `**${pct(est.folderScore)}** (95 % interval ${pct(est.folderLow)}–${pct(est.folderHigh)}; target ≥ ${target} % ${verdict}); ${pct(t.score)} over the ${names.length - t.missing} parts run in full` : `**${pct(t.score)}** (target ≥ ${target} % ${verdict})`;
    lines.push(`| \`src/${folder}\` | ${cells(t).join(" | ")} | ${shown} | ${pct(t.floor)} |`);
    for (const p of names) {
      const tp = tally([p]);
      const since = tp && tp.changed.length ? ` (run before the last change to ${tp.changed.map((n) => `\`${path.basename(n)}\``).join(", ")})` : "";
      if (tp) lines.push(`| \`${p}\`${since} | ${cells(tp).join(" | ")} | ${pct(tp.score)} | ${pct(tp.floor)} |`);
      else lines.push(`| \`${p}\` | not run in full${est && est.notRun.includes(p) ? " (in the sample below)" : ""} | | | | | | | | |`);
    }
    if (est) lines.push(`| \`${est.part}\`: ${est.spans} random spans, ${est.drawnMutants} of the ${est.population} mutants of the ${est.notRun.length} parts not run in full | ${cells(est).join(" | ")} | ${pct(est.score)} (95 % interval ${pct(est.low)}–${pct(est.high)}) | ${pct(est.floor)} |`);
  }
  return lines;
}

/** Replaces what lies between `<!-- name -->` and `<!-- /name -->` in the README. */
function replaceBetween(text, name, content) {
  const open = `<!-- ${name} -->`;
  const close = `<!-- /${name} -->`;
  const i = text.indexOf(open);
  const j = text.indexOf(close);
  if (i < 0 || j < i) throw new Error(`README.md has no ${open} … ${close} block`);
  return `${text.slice(0, i + open.length)}\n${content}\n${text.slice(j)}`;
}

if (markdown) {
  console.log(markdownTable().join("\n"));
  process.exit(0);
}
if (readme) {
  const file = path.join(ROOT, "README.md");
  let text = fs.readFileSync(file, "utf8");
  text = replaceBetween(text, "mutation:table", markdownTable().join("\n"));
  text = replaceBetween(text, "mutation:equivalents", equivalents().join("\n"));
  fs.writeFileSync(file, text);
  console.log("README.md: score table and equivalent mutants rewritten (the words around them are yours to update)");
  process.exit(0);
}

console.log("\n                  killed  survived  no-cov  timeout       errors  equivalent  static-not-run  score    floor    target");
const row = (label, t, target) => {
  const c = t.counts;
  // A folder with parts not run is not judged: its score is over the parts that were.
  const goal = target ? `≥ ${target} % ${t.missing ? `not judged, ${t.missing} parts not run` : t.score >= target ? "met" : "NOT met"}` : "";
  console.log(
    `${label.padEnd(18)}${String(c.Killed).padStart(6)}${String(c.Survived).padStart(10)}${String(c.NoCoverage).padStart(8)}` +
      `${String(c.Timeout).padStart(9)}${String(c.CompileError + c.RuntimeError).padStart(13)}${String(c.Ignored).padStart(12)}${String(c.Static).padStart(16)}  ${t.score.toFixed(1).padStart(5)} %  ${t.floor.toFixed(1).padStart(5)} %  ${goal}`,
  );
};
for (const folder of FOLDERS) {
  const names = fullParts(folder);
  const t = tally(names);
  if (!t) {
    console.log(`src/${folder.padEnd(14)}(not run yet)`);
    continue;
  }
  const est = t.missing ? sampleEstimate(folder, t) : null;
  row(`src/${folder}`, t, est ? undefined : TARGET[folder]);
  if (est) console.log(`  over the ${names.length - t.missing} parts run in full; with the other ${t.missing} estimated from a sample: ${est.folderScore.toFixed(1)} % (95 % interval ${est.folderLow.toFixed(1)}–${est.folderHigh.toFixed(1)} %), target ≥ ${TARGET[folder]} % ${estimateVerdict(est, TARGET[folder])}`);
  else if (t.missing) console.log(`  (${t.missing} of ${names.length} parts not run yet)`);
  for (const p of names) {
    const tp = tally([p]);
    if (tp) row(`  ${p}`, tp);
    else console.log(`  ${p.padEnd(16)}(not run yet)`);
    if (tp && tp.changed.length) console.log(`    run before the last change to ${tp.changed.join(", ")}: node scripts/mutation.js ${p} tests what changed`);
  }
  if (est) {
    row(`  ${est.part}`, est);
    console.log(`    ${est.spans} random spans, ${est.drawnMutants} of the ${est.population} mutants of ${est.notRun.join(", ")}: ${est.score.toFixed(1)} % (95 % interval ${est.low.toFixed(1)}–${est.high.toFixed(1)} %)${est.counts.Missing ? `; ${est.counts.Missing} drawn mutants not in the results (draw again)` : ""}`);
    console.log(`    src/${folder} with those parts estimated: ${est.folderScore.toFixed(1)} % (${est.folderLow.toFixed(1)}–${est.folderHigh.toFixed(1)} %), target ≥ ${TARGET[folder]} % ${estimateVerdict(est, TARGET[folder])}`);
  }
  if (showSurvivors) {
    for (const s of t.survivors) console.log(`    ${s}`);
    if (est) for (const s of est.survivors) console.log(`    ${s}`);
    for (const s of t.ignored) console.log(`    equivalent ${s}`);
  }
}
process.exit(failed ? 1 : 0);
