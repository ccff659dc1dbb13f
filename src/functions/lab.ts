/** Excel bindings: reading a laboratory's result cells. Argument shaping only; the science is in src/core. */
import { labValue } from "../core/lab-value";
import { cell, declare, optText } from "./_binding";

/**
 * A lab result as a number: reads "<0.05", ">300", "n.d.", "trace", "1 250", "12,5" by the policy you name.
 *
 * @customfunction LABVALUE
 * @param {any[][]} value The lab's result, a cell or a range: a number, or text such as "<0.05", ">300", "n.d.", "trace", "n.a.", "1 250" or "12,5".
 * @param {any[][]} [below] How to count a value below detection: limit, half (half the limit), zero or blank. Required when such a value occurs: never assumed. "n.d." and "trace" state no limit, so only zero or blank apply to them.
 * @param {any[][]} [above] How to count a value above the lab's range (">300"): limit or blank. Required when such a value occurs.
 * @param {any[][]} [decimal] The lab's decimal mark: "." or ",". Omitted: a full stop is the decimal point, and a comma (or "1.250", which could group thousands) is refused, not guessed.
 * @returns {any[][]} The number, or a blank for blank, "n.a." or the blank policy. Numbers pass unchanged. A substituted value is an estimate: say in the report which policy was used.
 * @throws #VALUE! for a censored value without its policy, a comma or "1.250" without a stated decimal mark, or a lone "-".
 * @example =SOIL.LABVALUE("<0.05", "half") //=> 0.025
 * Source: substitution of half the detection limit, one of the policies compared by Floit et al. (1996), ASTM STP 1291 (abstract seen); the value is arithmetic.
 */
export function labvalue(value: any[][], below?: any[][], above?: any[][], decimal?: any[][]): any[][] {
  return LABVALUE(arguments);
}
const LABVALUE = declare(
  labvalue,
  [cell("value"), optText("below"), optText("above"), optText("decimal")],
  (value, below, above, decimal) => labValue(value, below, above, decimal),
);
