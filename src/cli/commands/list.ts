import { aboutFunction, CAUTION } from "../../core/about";
import { sufficiencyTables } from "../../core/bands/sufficiency";
import { limeCalibrationTables } from "../../core/lime/calibrations";
import { removalTables } from "../../core/bands/removal";
import { REGISTRY, registered, RegisteredFunction } from "../../engine/registry";
import { Command, takeFlag, usage } from "../command";

function safeAbout(id: string): string {
  try {
    return aboutFunction(id);
  } catch {
    return "";
  }
}

function describe(f: RegisteredFunction) {
  return {
    name: f.formulaName,
    arguments: f.meta.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)),
    description: f.meta.description ?? "",
    parameters: f.meta.parameters.map((p) => ({ name: p.name, optional: p.optional === true, description: p.description ?? "" })),
    about: safeAbout(f.id),
  };
}

/** One function in full: what `soilcell list NAME` prints. */
function showOne(f: RegisteredFunction, io: { out(l: string): void }): void {
  const d = describe(f);
  io.out(`${d.name}(${d.arguments.join(", ")})`);
  io.out(`  ${d.description}`);
  io.out("");
  io.out("Arguments ([name] is optional; an omitted one takes the default its description gives):");
  const width = Math.max(...d.parameters.map((p) => p.name.length + (p.optional ? 2 : 0)), 4);
  for (const p of d.parameters) io.out(`  ${(p.optional ? `[${p.name}]` : p.name).padEnd(width)}  ${p.description}`);
  if (d.about) {
    io.out("");
    io.out("Method and source:");
    io.out(`  ${d.about}`);
  }
  io.out("");
  io.out(CAUTION);
}

export const listCommand: Command = {
  name: "list",
  summary: "the functions, their arguments and sources, and every reference table",
  help: `usage: soilcell list [NAME] [--json]

Without NAME: every SOIL function with its arguments and its method and source, then every
reference table (lime calibrations, sufficiency tables with their edge rules, removal
coefficients) with its source. With NAME (SOIL.CEC or CEC, any case): that function in full,
each argument with its unit, range and default.

  --json   the same as JSON`,
  run(args, io) {
    const rest = [...args];
    const json = takeFlag(rest, "--json");
    if (rest.length > 1) return usage(listCommand, io, "give at most one function name");
    if (rest.length === 1) {
      const f = registered(rest[0] as string);
      if (!f) {
        io.err(`soilcell list: there is no function ${rest[0]}; the functions are ${REGISTRY.map((r) => r.formulaName).join(", ")}`);
        return 2;
      }
      if (json) io.out(JSON.stringify(describe(f), null, 2));
      else showOne(f, io);
      return 0;
    }
    const functions = REGISTRY.map((f) => {
      const { parameters: _p, ...rest } = describe(f);
      return rest;
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
    io.out(CAUTION);
    return 0;
  },
};
