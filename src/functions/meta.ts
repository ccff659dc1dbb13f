/** Excel bindings: ABOUT and VERSION. */
import { aboutFunction, soilcellVersion } from "../core/about";
import { declare, text } from "./_binding";

/**
 * One line on what a SOIL function computes, its units and its published source.
 * @customfunction ABOUT
 * @param {any[][]} function_name A function name such as CEC or SOIL.LIMEBUFFER.
 * @returns {any[][]} The description with its source.
 * @throws #VALUE! for a name that is not a SOIL function (the message lists the known names).
 * @example =SOIL.ABOUT("SAR") //=> "Sodium adsorption ratio of an irrigation water…"
 * Source: not a published value; the line is the add-in's own catalogue text, which names the published source of each method.
 */
export function about(function_name: any[][]): any[][] {
  return ABOUT(arguments);
}
const ABOUT = declare(about, [text("function_name")], (name) => aboutFunction(name));

/**
 * The soilcell version that computed the workbook, for report footers.
 * @customfunction VERSION
 * @returns {any[][]} The version text.
 * @example =SOIL.VERSION() //=> "soilcell …"
 * Source: not a published value; the version in package.json at build time.
 */
export function version(): any[][] {
  return VERSION(arguments);
}
const VERSION = declare(version, [], () => soilcellVersion());
