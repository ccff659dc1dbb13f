import { evaluateFormula, EvalResult } from "../../engine/evaluate";
import { Command, takeFlag, usage } from "../command";

function formatValue(v: unknown): string {
  if (Array.isArray(v)) return v.map((row) => (row as unknown[]).map(formatValue).join("\t")).join("\n");
  if (v === null || v === undefined) return "";
  return String(v);
}

export const evalCommand: Command = {
  name: "eval",
  summary: "compute one formula and print its value (no workbook)",
  help: `usage: soilcell eval FORMULA [--json]

Computes one formula as Excel would, with every SOIL function, and prints the value; a spilled
result prints as rows (columns separated by tabs). Arguments are separated by "," as Excel stores
them, whatever your computer's regional settings show (";" is refused with a hint). A formula that
refers to cells needs a workbook: use soilcell recalc.

  --json   print {"value": …} or {"error": …, "message": …}

Exit 0 for a value, 1 for an error value, 2 for a usage error.
Example: soilcell eval '=SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)'   → 19.5`,
  run(args, io) {
    const rest = [...args];
    const json = takeFlag(rest, "--json");
    if (rest.length !== 1) return usage(evalCommand, io, rest.length ? "give one formula (quote it)" : "no formula given");
    const result: EvalResult = evaluateFormula(rest[0] as string);
    if (json) io.out(JSON.stringify(result));
    // A spilled result prints every element, an error in its own place (never the first alone).
    else if (Array.isArray(result.value)) io.out(formatValue(result.value));
    else if (result.error) io.out(`${result.error} ${result.message ?? ""}`.trim());
    else io.out(formatValue(result.value));
    return result.error ? 1 : 0;
  },
};
