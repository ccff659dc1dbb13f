/**
 * `soilcell list`: every function with its arguments and source, and the reference tables;
 * `soilcell list NAME`: one function in full. The data comes from the engine's registry (built
 * from the same declarations Excel's metadata is) and core's ABOUT lines.
 */
import { CAUTION, aboutFunction } from "../../core/about";
import { removalTables } from "../../core/bands/removal";
import { sufficiencyTables } from "../../core/bands/sufficiency";
import { listWords } from "../../core/errors";
import { limeCalibrationTables } from "../../core/lime/calibrations";
import { REGISTRY, RegisteredFunction, registered } from "../../engine/registry";
import { UsageError } from "../args";
import { Io } from "../io";
import { Command, wrap } from "./command";

/** One argument of a function, as `list NAME` shows it. */
export interface ArgumentInfo {
  readonly name: string;
  readonly optional: boolean;
  /** number, text, range or cell: how the binding reads it. */
  readonly kind: string;
  /** The default the binding declares, when it declares one (most state theirs in the description). */
  readonly default?: number | string;
  /** Whether it takes a range (Excel's "matrix"): a column of samples spills a column of results. */
  readonly acceptsRange: boolean;
  readonly description: string;
}

export interface FunctionInfo {
  readonly name: string;
  readonly description: string;
  readonly arguments: readonly ArgumentInfo[];
  /** The function's method and source (its SOIL.ABOUT line). */
  readonly source: string;
}

function safeAbout(id: string): string {
  try {
    return aboutFunction(id);
  } catch {
    return "";
  }
}

export function functionInfo(f: RegisteredFunction): FunctionInfo {
  return {
    name: f.formulaName,
    description: f.meta.description ?? "",
    arguments: f.meta.parameters.map((p, i) => {
      const spec = f.spec.params[i];
      const dflt = spec && "default" in spec ? spec.default : undefined;
      return {
        name: p.name,
        optional: p.optional === true,
        kind: spec?.kind ?? "any",
        ...(dflt !== undefined ? { default: dflt } : {}),
        acceptsRange: p.dimensionality === "matrix",
        description: p.description ?? "",
      };
    }),
    source: safeAbout(f.id),
  };
}

const signature = (f: FunctionInfo) => `${f.name}(${f.arguments.map((a) => (a.optional ? `[${a.name}]` : a.name)).join(", ")})`;

function renderFunction(f: FunctionInfo, io: Io): void {
  io.out(signature(f));
  for (const l of wrap(f.description, 92)) io.out(`  ${l}`);
  io.out("");
  io.out("arguments (optional ones in [ ]; where there is a default, its description states it):");
  for (const a of f.arguments) {
    const head = `  ${a.optional ? `[${a.name}]` : a.name}  ${a.optional ? "optional" : "required"}, ${a.kind}${a.default !== undefined ? `, default ${JSON.stringify(a.default)}` : ""}`;
    io.out(head);
    for (const l of wrap(a.description, 88)) io.out(`      ${l}`);
  }
  io.out("");
  io.out("source:");
  for (const l of wrap(f.source || "no ABOUT line (see the README)", 92)) io.out(`  ${l}`);
  io.out("");
  io.out(`In Excel: =SOIL.ABOUT("${f.name}") shows the same source line.`);
}

function listOne(name: string, json: boolean, io: Io): number {
  const f = registered(name);
  if (!f) {
    const key = name.toUpperCase().replace(/^SOIL[._]/, "");
    // The closest names first: those the name begins, then those holding it, then a shared start.
    const tiers = [(id: string) => id.startsWith(key), (id: string) => id.includes(key) || key.startsWith(id), (id: string) => id.startsWith(key.slice(0, 3))];
    const near = (tiers.map((t) => REGISTRY.filter((r) => key.length > 0 && t(r.id))).find((l) => l.length) ?? []).map((r) => r.formulaName);
    throw new UsageError(`no function "${name}"${near.length ? `; did you mean ${listWords(near)}?` : ""} (soilcell list shows them all)`);
  }
  const info = functionInfo(f);
  if (json) io.out(JSON.stringify(info, null, 2));
  else renderFunction(info, io);
  return 0;
}

function listAll(json: boolean, io: Io): number {
  const functions = REGISTRY.map((f) => {
    const info = functionInfo(f);
    return { name: info.name, arguments: info.arguments.map((a) => (a.optional ? `[${a.name}]` : a.name)), description: info.description, about: info.source };
  });
  const tables = { lime: limeCalibrationTables(), sufficiency: sufficiencyTables(), removal: removalTables() };
  if (json) {
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
  io.out("");
  io.out("soilcell list NAME shows one function with each argument in full.");
  io.out(CAUTION);
  return 0;
}

export const command: Command = {
  name: "list",
  summary: "the functions, their arguments and sources, and the reference tables",
  usage: ["list [--json]", "list NAME [--json]"],
  about: [
    "Without a name: every SOIL function with its arguments and the source of its method, then the lime calibrations, sufficiency tables and removal coefficients shipped, each with its source.",
    "With a name (SOIL.CEC, CEC or cec): that function in full: what it computes, each argument (required or optional, what it takes, its description with units, ranges and defaults) and its source.",
  ],
  options: [{ name: "--json", about: "the same as JSON" }],
  examples: ["soilcell list", "soilcell list SOIL.LIMEBUFFER", "soilcell list cec --json"],
  run(args, io) {
    const json = args.options.has("--json");
    if (args.positional.length > 1) throw new UsageError(`give at most one function name; got ${args.positional.length}`);
    const name = args.positional[0];
    return name === undefined ? listAll(json, io) : listOne(name, json, io);
  },
};
