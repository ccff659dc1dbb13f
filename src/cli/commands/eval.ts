/** `soilcell eval`: one formula, computed with the same engine and bindings `recalc` uses. */
import { evaluateFormula } from "../../engine/evaluate";
import { UsageError } from "../args";
import { Command } from "./command";

function formatValue(v: unknown): string {
  if (Array.isArray(v)) return v.map((row) => (row as unknown[]).map(formatValue).join("\t")).join("\n");
  if (v === null || v === undefined) return "";
  return String(v);
}

export const command: Command = {
  name: "eval",
  summary: "compute one formula on its own and print its value",
  usage: [`eval '=SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)' [--json]`],
  about: [
    "Computes one formula as Excel would in an empty workbook: SOIL functions and Excel's own. A spilled result prints one row per line, its columns separated by tabs. Exits 0 with a value, 1 when the result is an error (printed with its message).",
    'There is no workbook behind it, so a formula that refers to cells or names is refused with a message: give the values themselves (a column as {1;2;3}, a row as {1,2,3}) or put the formula in a workbook and use soilcell recalc.',
    'Write the formula as Excel stores it: "," between arguments and "." for decimals. A formula written with ";" between arguments (as Excel shows formulas under many European regional settings) is refused, with the same formula rewritten for you to check.',
    "Quote the formula for your shell (single quotes in most shells).",
  ],
  options: [{ name: "--json", about: "print {value} or {error, message} as JSON" }],
  examples: [`soilcell eval '=SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)'      # 19.5`, `soilcell eval --json '=SOIL.CMOL({2000;180},{"Ca";"Mg"})'`],
  run(args, io) {
    const [formula, ...extra] = args.positional;
    if (formula === undefined) throw new UsageError("give a formula");
    if (extra.length) throw new UsageError(`give one formula (in quotes); got ${args.positional.length} arguments`);
    const result = evaluateFormula(formula);
    if (args.options.has("--json")) io.out(JSON.stringify(result));
    // A spilled result prints every element, an error in its own place (never the first alone).
    else if (Array.isArray(result.value)) io.out(formatValue(result.value));
    else if (result.error) io.out(`${result.error} ${result.message ?? ""}`.trim());
    else io.out(formatValue(result.value));
    return result.error ? 1 : 0;
  },
};
