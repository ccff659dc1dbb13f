/**
 * One-line descriptions with sources, for SOIL.ABOUT and `soilcell list`. The text lives in
 * `src/data/about/*.json`, one file per area, beside the area's other data.
 */
import units from "../data/about/units.json";
import cations from "../data/about/cations.json";
import lime from "../data/about/lime.json";
import bands from "../data/about/bands.json";
import nitrogen from "../data/about/nitrogen.json";
import lab from "../data/about/lab.json";
import pkg from "../../package.json";
import { SoilError, listWords } from "./errors";

const ENTRIES: Record<string, string> = { ...units, ...lab, ...cations, ...lime, ...bands, ...nitrogen };

/** The caution every lime and fertiliser result carries. */
export const CAUTION =
  "Results are estimates: check them against local calibrations, regulations and licensed advice.";

/** Function names (without the SOIL. prefix) that have an ABOUT entry. */
export function aboutNames(): string[] {
  return Object.keys(ENTRIES).sort();
}

/**
 * The ABOUT line for a function name, given as "CEC", "SOIL.CEC" or any letter case.
 * @throws UNKNOWN_NAME listing the known names
 * @example aboutFunction("soil.version") //=> "The soilcell version that computed the workbook, …"
 */
export function aboutFunction(name: string): string {
  const key = name.trim().toUpperCase().replace(/^SOIL[._]/, "");
  const line = ENTRIES[key];
  if (line === undefined) {
    throw new SoilError("UNKNOWN_NAME", `unknown function "${name}"; use ${listWords(aboutNames())}`);
  }
  return line;
}

/** The add-in version, from package.json at build time. */
export function soilcellVersion(): string {
  return `soilcell ${pkg.version}`;
}
