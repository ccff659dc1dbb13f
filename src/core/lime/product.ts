/**
 * From a pure-CaCO3 lime rate to the product spread: calcium carbonate equivalent (CCE),
 * fineness efficiency and moisture; and the fineness efficiency of a liming material from its
 * sieve fractions.
 *
 * Convention: effective CCE (ECCE) = CCE × fineness efficiency, on a dry basis; the product as
 * received carries water, so per tonne as received it is ECCE × dry-matter fraction. Minnesota's
 * lb ENP/ton = %ENP × 2000 × % dry matter, with %ENP = fineness index × %TNP (MN Dept. of
 * Agriculture, "Agricultural liming materials analysis explanation"; seen) has the same structure.
 *
 * Sources: Penn State AASL home-garden notes (CCE adjustment, seen); BC Soil Factsheet 637.200-2
 * (fineness rating of the method developed in Ohio, seen).
 */
import fineness from "../../data/lime/fineness-ohio.json";
import { SoilError } from "../errors";
import { LimeRange } from "./table";
import { BOUNDS, PERCENT, check, finite, percentListLooksFractional } from "../validate";

/**
 * Rate of a liming product to spread for a pure-CaCO3 rate:
 * caco3_rate / (CCE/100 × fineness/100) / (1 − moisture/100), in the same unit as caco3_rate.
 * @param caco3Rate lime requirement as pure CaCO3 equivalent, any rate unit, ≥ 0
 * @param ccePct calcium carbonate equivalent of the product (dry), 5–250 % (MgO is about 248;
 *   PERCENT.cce, so 0.95 is refused as a fraction)
 * @param finenessPct fineness efficiency, above 1 to 100 %; default 100 (already in an ECCE)
 * @param moisturePct water content of the product as received, % of its wet mass: 0, or 1 to
 *   below 100 (between 0 and 1 is refused as a fraction); default 0
 * @returns product rate as received, in caco3_rate's unit
 * @throws OUT_OF_RANGE for any argument outside its range, with a hint when a percent looks like
 *   a fraction ("0.95 looks like a fraction; enter 95 for 95 %")
 * @example limeProductRate(5, 70) //=> 7.14286
 * Source: Penn State AASL home-garden report notes: 5 lb/100 ft2 at CCE 100 → 7 lb of a CCE 70
 * product (the source rounds 7.14; seen).
 */
export function limeProductRate(caco3Rate: number, ccePct: number, finenessPct = 100, moisturePct = 0): number {
  check(caco3Rate, BOUNDS.nonNegative("caco3_rate"));
  check(ccePct, PERCENT.cce);
  check(finenessPct, PERCENT.fineness);
  check(moisturePct, PERCENT.moisture);
  const dryEffective = (ccePct / 100) * (finenessPct / 100);
  return finite(caco3Rate / dryEffective / (1 - moisturePct / 100), "the product rate");
}

/** The default four-class rating (finest first), from the data file. */
export const LIME_FINENESS_DEFAULT: readonly number[] = fineness.classes.map((c) => c.efficiency_pct);

const SUM_TOLERANCE = fineness.fraction_sum_tolerance_pct;

/**
 * Fineness efficiency (%) of a liming material: Σ fraction × efficiency / 100, fractions finest first.
 * Default efficiencies: finer than 60 mesh 100 %, 20–60 mesh 60 %, 8–20 mesh 20 %, coarser than
 * 8 mesh 0 % (four fractions). Fractions must add up to 100 ± 1 % and are not rescaled.
 * @param fractions % of the sample in each size class, finest first, each 0–100
 * @param efficiencies % effectiveness of each class, each 0–100, one per fraction
 * @returns fineness efficiency, %
 * @throws SHAPE_MISMATCH when the counts differ (or not four fractions without efficiencies);
 *   OUT_OF_RANGE for a value outside 0–100, fractions not adding up to 100 ± 1 % (with a hint when
 *   they look like fractions of 1), or efficiencies all at most 1 (fractions of 1, not percentages)
 * @example limeFineness([78.8, 10, 2.4, 7.8]) //=> 85.28
 * Source: BC Ministry of Agriculture Soil Factsheet 637.200-2, limestone A (seen).
 */
export function limeFineness(fractions: readonly number[], efficiencies: readonly number[] = LIME_FINENESS_DEFAULT): number {
  if (fractions.length !== efficiencies.length) {
    throw new SoilError(
      "SHAPE_MISMATCH",
      efficiencies === LIME_FINENESS_DEFAULT
        ? `the default rating has ${efficiencies.length} classes (finer than 60 mesh, 20-60, 8-20, coarser than 8 mesh) but fractions has ${fractions.length}; give efficiencies for your classes`
        : `fractions has ${fractions.length} classes but efficiencies has ${efficiencies.length}; give one efficiency per fraction`,
    );
  }
  if (fractions.length === 0) throw new SoilError("MISSING_INPUT", "fractions is empty");
  fractions.forEach((f, i) => check(f, { name: `fraction ${i + 1}`, unit: "%", min: 0, max: 100 }));
  efficiencies.forEach((e, i) => check(e, { name: `efficiency ${i + 1}`, unit: "%", min: 0, max: 100 }));
  if (percentListLooksFractional(efficiencies)) {
    throw new SoilError(
      "OUT_OF_RANGE",
      `efficiencies are all at most 1 (${efficiencies.join(", ")}): they look like fractions; enter percentages (e.g. 100, 60, 20, 0)`,
    );
  }
  const sum = fractions.reduce((a, b) => a + b, 0);
  // Stryker disable next-line EqualityOperator: equivalent for > vs >=: sum − 100 is a multiple of 2^-46 for sums near 99 or 101, and 1 + 1e-9 is not, so equality cannot occur
  if (Math.abs(sum - 100) > SUM_TOLERANCE + 1e-9) {
    const hint = percentListLooksFractional(fractions) ? "; they look like fractions: enter percentages (0.788 is 78.8 %)" : "";
    throw new SoilError("OUT_OF_RANGE", `fractions add up to ${+sum.toFixed(6)} %; they must add up to 100 ± ${SUM_TOLERANCE} %${hint}`);
  }
  // Stryker disable next-line StringLiteral: equivalent: unreachable, every fraction and efficiency is checked within 0–100, so the sum is finite
  return finite(fractions.reduce((acc, f, i) => acc + (f * efficiencies[i]!) / 100, 0), "the fineness efficiency");
}

function listOf(range: LimeRange, name: string): number[] {
  const rows = range.length;
  const cols = rows ? Math.max(...range.map((r) => r.length)) : 0;
  if (rows !== 1 && cols !== 1) {
    throw new SoilError("SHAPE_MISMATCH", `${name} must be a single row or column (it is ${rows}×${cols}), finest class first`);
  }
  return range.flat().map((c, i) => {
    if (typeof c === "number") return c;
    if (c === null || (typeof c === "string" && c.trim() === "")) {
      throw new SoilError("MISSING_INPUT", `${name} has a blank cell (class ${i + 1}); enter 0 for an empty class`);
    }
    if (typeof c === "string") {
      const text = c.trim();
      if (/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(text)) return Number(text);
    }
    throw new SoilError("NOT_A_NUMBER", `${name}: "${String(c)}" (class ${i + 1}) is not a number`);
  });
}

/**
 * limeFineness for worksheet ranges: each a single row or column, finest class first.
 * @param fractions range of % of the sample in each class
 * @param efficiencies optional range of % effectiveness of each class
 * @returns fineness efficiency, %
 * @throws as limeFineness; SHAPE_MISMATCH for a 2-D range; MISSING_INPUT for a blank cell
 * @example limeFinenessOfRanges([[90], [6], [4], [0]]) //=> 94.4
 * Source: BC Soil Factsheet 637.200-2, limestone B (the source prints 94.46 %; the arithmetic is 94.40 %).
 */
export function limeFinenessOfRanges(fractions: LimeRange, efficiencies?: LimeRange): number {
  const f = listOf(fractions, "fractions");
  return efficiencies === undefined ? limeFineness(f) : limeFineness(f, listOf(efficiencies, "efficiencies"));
}
