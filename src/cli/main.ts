/**
 * The command line: `soilcell eval`, `soilcell recalc`, `soilcell list`. Talks to people: plain
 * messages, no stack traces for expected failures, progress on stderr, results on stdout.
 */
import { aboutFunction, CAUTION } from "../core/about";
import { sufficiencyTables } from "../core/bands/sufficiency";
import { limeCalibrationTables } from "../core/lime/calibrations";
import { removalTables } from "../core/bands/removal";
import { evaluateFormula, EvalResult } from "../engine/evaluate";
import { REGISTRY } from "../engine/registry";
import { RecalcRefused, RecalcSummary, defaultOutputPath, recalcWorkbook } from "../engine/recalc";
import { WorkbookFileError } from "../engine/xlsx-package";
import { REPORT_USAGE, runReport } from "./report";

export interface Io {
  out(line: string): void;
  err(line: string): void;
}

const USAGE = `usage:
  soilcell eval '=SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)' [--json]
  soilcell recalc IN.xlsx [-o OUT.xlsx] [--json]
  soilcell list [--json]
${REPORT_USAGE}`;

function formatValue(v: unknown): string {
  if (Array.isArray(v)) return v.map((row) => (row as unknown[]).map(formatValue).join("\t")).join("\n");
  if (v === null || v === undefined) return "";
  return String(v);
}

function runEval(args: string[], io: Io): number {
  const json = args.includes("--json");
  const formula = args.filter((a) => a !== "--json")[0];
  if (!formula) {
    io.err(USAGE);
    return 2;
  }
  const result: EvalResult = evaluateFormula(formula);
  if (json) io.out(JSON.stringify(result));
  else if (result.error) io.out(`${result.error} ${result.message ?? ""}`.trim());
  else io.out(formatValue(result.value));
  return result.error ? 1 : 0;
}

function printSummary(s: RecalcSummary, io: Io): void {
  io.out(`wrote ${s.output}`);
  io.out(
    `${s.formulaCells} formula cells recalculated (${s.soilFormulaCells} SOIL formulas, ${s.spilledCells} spilled cells) in ${s.sheets} sheets, ${s.seconds.toFixed(1)} s`,
  );
  io.out(`${s.errors.length} cells in error`);
  for (const e of s.errors.slice(0, 50)) io.out(`  ${e.sheet}!${e.cell}  ${e.error} ${e.message}   ${e.formula}`);
  if (s.errors.length > 50) io.out(`  … and ${s.errors.length - 50} more (use --json for the full list)`);
  if (s.kept.length) {
    io.out(`${s.kept.length} formulas use functions the headless engine does not have; their values were kept as saved:`);
    for (const k of s.kept.slice(0, 20)) io.out(`  ${k.sheet}!${k.cell}  ${k.formula}`);
  }
  io.out(CAUTION);
}

async function runRecalc(args: string[], io: Io): Promise<number> {
  const json = args.includes("--json");
  const rest = args.filter((a) => a !== "--json");
  let output: string | undefined;
  const o = rest.findIndex((a) => a === "-o" || a === "--output");
  if (o >= 0) {
    output = rest[o + 1];
    rest.splice(o, 2);
  }
  const input = rest[0];
  if (!input || rest.length > 1 || (o >= 0 && !output)) {
    io.err(USAGE);
    return 2;
  }
  try {
    const summary = await recalcWorkbook(input, output ?? defaultOutputPath(input), { progress: (l) => io.err(l) });
    if (json) {
      io.out(JSON.stringify(summary, null, 2));
      io.err(CAUTION); // stdout stays pure JSON
    } else printSummary(summary, io);
    return summary.errors.length ? 1 : 0;
  } catch (e) {
    if (e instanceof RecalcRefused || e instanceof WorkbookFileError) {
      io.err(`soilcell: ${e.message}`);
      return 2;
    }
    throw e;
  }
}

function runList(args: string[], io: Io): number {
  const functions = REGISTRY.map((f) => ({
    name: f.formulaName,
    arguments: f.meta.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)),
    description: f.meta.description ?? "",
    about: safeAbout(f.id),
  }));
  const tables = { lime: limeCalibrationTables(), sufficiency: sufficiencyTables(), removal: removalTables() };
  if (args.includes("--json")) {
    io.out(JSON.stringify({ functions, tables }, null, 2));
    return 0;
  }
  for (const r of functions) {
    io.out(`${r.name}(${r.arguments.join(", ")})`);
    io.out(`    ${r.description.split("\n")[0]}`);
    if (r.about) io.out(`    ${r.about}`);
  }
  io.out("");
  io.out("Lime calibrations (SOIL.LIMEBUFFER):");
  for (const t of tables.lime) {
    const depth = t.depthCm === undefined ? "depth not stated" : `${t.depthCm} cm`;
    io.out(`  ${t.id}  ${t.unit}, ${depth}${t.shipped ? "" : ", NOT SHIPPED (answers #N/A)"}  — ${t.source}`);
  }
  io.out("Sufficiency tables (SOIL.SUFFICIENCY; name one by its id in the table argument, or pass your own table as a range):");
  for (const t of tables.sufficiency) {
    const extra = [t.covers, t.cec, t.sampling].filter(Boolean).join("; ");
    io.out(`  ${t.id}: ${t.nutrient} ${t.method}, ${t.unit} (${extra}): limits ${t.limits.join(", ")} → ${t.labels.join(" | ")}`);
    io.out(`      edge rule: ${t.edgeRule}`);
    io.out(`      source: ${t.source} [${t.status}]`);
  }
  io.out("Removal coefficients (SOIL.REMOVAL):");
  for (const t of tables.removal) io.out(`  ${t.crop} (${t.product}, ${t.basis}): ${t.nutrients.join(", ")}  — ${t.source}`);
  io.out(CAUTION);
  return 0;
}

function safeAbout(id: string): string {
  try {
    return aboutFunction(id);
  } catch {
    return "";
  }
}

export async function main(argv: string[], io: Io): Promise<number> {
  const [command, ...args] = argv;
  switch (command) {
    case "eval":
      return runEval(args, io);
    case "recalc":
      return runRecalc(args, io);
    case "list":
      return runList(args, io);
    case "report":
      return runReport(args, io);
    case "--help":
    case "-h":
    case "help":
      io.out(USAGE);
      return 0;
    default:
      io.err(USAGE);
      return 2;
  }
}

if (require.main === module) {
  const io: Io = { out: (l) => process.stdout.write(`${l}\n`), err: (l) => process.stderr.write(`${l}\n`) };
  main(process.argv.slice(2), io).then(
    (code) => process.exit(code),
    (e) => {
      process.stderr.write(`soilcell: unexpected failure: ${(e as Error).message}\n`);
      process.exit(3);
    },
  );
}
