/** Excel bindings: ABOUT and VERSION. */
import { aboutFunction, soilcellVersion } from "../core/about";
import { declare, text } from "./_binding";

/**
 * One line on what a SOIL function computes, its units and its published source.
 * @customfunction ABOUT
 * @param {any[][]} function_name A function name such as CEC or SOIL.LIMEBUFFER.
 * @returns {any[][]} The description with its source.
 */
export function about(function_name: any[][]): any[][] {
  return ABOUT(arguments);
}
const ABOUT = declare(about, [text("function_name")], (name) => aboutFunction(name));

/**
 * The soilcell version that computed the workbook, for report footers.
 * @customfunction VERSION
 * @returns {any[][]} The version text.
 */
export function version(): any[][] {
  return VERSION(arguments);
}
const VERSION = declare(version, [], () => soilcellVersion());
