/**
 * Yearly fertiliser rate to build a soil test up to a target (SOIL.BUILDUP).
 *
 * rate per year = (target − soil_test) × buffer_factor / years, where buffer_factor is the amount
 * of nutrient (in any rate unit, e.g. lb P2O5/ac or kg P/ha) that raises the soil test by one unit
 * (e.g. 1 ppm). The result is in the buffer factor's rate unit per year. A soil test at or above
 * the target needs no build-up: the rate is 0 (a computed zero, not missing data).
 *
 * Method: the build-up part of the Tri-State build-up-and-maintenance approach — raise the soil
 * test to the critical level over four years (default `years` = 4; Culman et al. 2020, Tri-State
 * Fertilizer Recommendations, OSU Bull. 974, as described by OSU Agronomic Crops Team 'Phosphorus
 * and Potassium', seen); Tri-State buffer factors: about 20 lb P2O5/ac per ppm of soil-test P and
 * 6 to 10 lb K2O/ac per ppm of K depending on CEC (LaBarge, OSU Extension, 'How much fertilizer
 * will move soil test levels', seen). Buffer factors are soil-specific: the results are estimates
 * to check against local calibrations, regulations and licensed advice.
 */
import { BOUNDS, check, finite } from "../validate";

/** Years over which the Tri-State recommendations build a deficient soil test up to the critical level. */
export const BUILDUP_DEFAULT_YEARS = 4;

/**
 * Yearly rate to raise a soil test to a target (SOIL.BUILDUP).
 * @param soilTest current soil-test value (any soil-test unit, e.g. mg/kg), ≥ 0
 * @param target soil-test value to reach, same unit, ≥ 0
 * @param bufferFactor nutrient that raises the test by one unit (rate unit per test unit), > 0
 * @param years years to reach the target, > 0; default 4 (Tri-State)
 * @returns rate per year in the buffer factor's rate unit; 0 when soilTest ≥ target
 * @throws OUT_OF_RANGE for a negative soil test or target, a buffer factor or years ≤ 0
 * @example buildupRate(10, 15, 20, 4) //=> 25
 */
export function buildupRate(soilTest: number, target: number, bufferFactor: number, years: number = BUILDUP_DEFAULT_YEARS): number {
  check(soilTest, BOUNDS.nonNegative("soil_test"));
  check(target, BOUNDS.nonNegative("target"));
  check(bufferFactor, BOUNDS.positive("buffer_factor"));
  check(years, BOUNDS.positive("years"));
  // Stryker disable next-line EqualityOperator: equivalent: at soilTest = target the formula below gives 0 as well
  if (soilTest >= target) return 0;
  return finite(((target - soilTest) * bufferFactor) / years, "the build-up rate");
}
