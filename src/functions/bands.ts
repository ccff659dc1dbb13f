/** Excel bindings: bands. Argument shaping only; the science is in src/core. */
import { bandLabel, bandPosition } from "../core/bands/bands";
import { sufficiencyBand } from "../core/bands/sufficiency";
import { removalAmount, REMOVAL_YIELD_UNIT_NEED } from "../core/bands/removal";
import { buildupRate } from "../core/bands/buildup";
import { declare, num, optNum, optRange, optText, range, text } from "./_binding";

/**
 * The label of the band that holds a value, on your own limits; a value equal to a limit is in the band above it.
 *
 * @customfunction BAND
 * @param {any[][]} value Value in the unit of the limits; a cell or a range (a season's column).
 * @param {any[][]} limits A row or column of strictly ascending lower bounds; n limits make n+1 bands.
 * @param {any[][]} [labels] A row or column of n+1 labels in any language. Omitted: Very low, Low, Optimum, High, Very high (four limits only).
 * @returns {any[][]} The band's label.
 */
export function band(value: any[][], limits: any[][], labels?: any[][]): any[][] {
  return BAND(arguments);
}
const BAND = declare(band, [num("value"), range("limits"), optRange("labels")], (value, limits, labels) => bandLabel(value, limits, labels));

/**
 * A value's position on the band scale: 0 at the first limit, 1 at the second, linear within bands; for report bars.
 *
 * @customfunction BANDPOS
 * @param {any[][]} value Value in the unit of the limits; a cell or a range.
 * @param {any[][]} limits A row or column of at least two strictly ascending lower bounds.
 * @returns {any[][]} Position: n limits give 0 … n−1; the open end bands run on with the width of the first and last band, so half a band out is −0.5 or n−0.5. Not clamped: values further out lie beyond that.
 */
export function bandpos(value: any[][], limits: any[][]): any[][] {
  return BANDPOS(arguments);
}
const BANDPOS = declare(bandpos, [num("value"), range("limits")], (value, limits) => bandPosition(value, limits));

/**
 * Band label from a built-in reference table for a soil-test or plant-tissue value; each table names its source.
 *
 * @customfunction SUFFICIENCY
 * @param {any[][]} nutrient P, K, N, Ca, Mg, B, Cu, Mn, Mo or Zn.
 * @param {any[][]} value Soil-test value in mg/kg (Olsen index: mg/L of soil) or tissue value in % (micronutrients mg/kg), at least 0.
 * @param {any[][]} [crop] corn, soybean, wheat, alfalfa or canola; omitted: a crop-independent table (Bray-1 general, Olsen index).
 * @param {any[][]} [method] Bray-1, Mehlich-3, Olsen, Colwell, or tissue for plant analysis; required.
 * @param {any[][]} [cec] CEC in cmol(+)/kg, above 0; needed where the table's levels depend on it (Mehlich-3 K).
 * @returns {any[][]} The source's band label; #N/A where no table covers the combination (the message lists those that exist).
 */
export function sufficiency(nutrient: any[][], value: any[][], crop?: any[][], method?: any[][], cec?: any[][]): any[][] {
  return SUFFICIENCY(arguments);
}
const SUFFICIENCY = declare(
  sufficiency,
  [text("nutrient"), num("value"), optText("crop"), optText("method"), optNum("cec")],
  (nutrient, value, crop, method, cec) => sufficiencyBand(nutrient, value, crop, method, cec),
);

/**
 * Nutrient exported in the harvested product, from sourced removal coefficients; an estimate to check locally.
 *
 * @customfunction REMOVAL
 * @param {any[][]} crop corn, soybean, wheat, barley, oats, rye, dry bean, canola, oilseed rape, peas, faba bean, grass hay, grass silage, maize silage, potatoes, sugar beet, lucerne hay or oaten hay.
 * @param {any[][]} crop_yield Harvested yield, at least 0, on the crop's basis (grain at marketing moisture; forage at the stated dry matter).
 * @param {any[][]} nutrient N, P, P2O5, K, K2O, S, SO3, SO4, Ca, CaO, Mg or MgO: the form the result is expressed in.
 * @param {any[][]} yield_unit Required, the unit of crop_yield: t/ha, kg/ha, lb/ac, ton/ac, g/m2, or bu/ac for crops with a standard bushel weight.
 * @param {any[][]} [rate_unit] Unit of the result: kg/ha (default), lb/ac, t/ha, ton/ac or g/m2.
 * @returns {any[][]} Nutrient removed in rate_unit. Results are estimates: check them against local calibrations, regulations and licensed advice.
 */
export function removal(crop: any[][], crop_yield: any[][], nutrient: any[][], yield_unit: any[][], rate_unit?: any[][]): any[][] {
  return REMOVAL(arguments);
}
const REMOVAL = declare(
  removal,
  [text("crop"), num("crop_yield"), text("nutrient"), text("yield_unit", REMOVAL_YIELD_UNIT_NEED), optText("rate_unit")],
  (crop, cropYield, nutrient, yieldUnit, rateUnit) => removalAmount(crop, cropYield, nutrient, yieldUnit, rateUnit),
);

/**
 * Yearly rate to raise a soil test to a target: (target − soil_test) × buffer_factor / years; 0 when at or above it.
 *
 * @customfunction BUILDUP
 * @param {any[][]} soil_test Current soil-test value (e.g. mg/kg), at least 0.
 * @param {any[][]} target Soil-test value to reach, same unit, at least 0 (e.g. the critical level).
 * @param {any[][]} buffer_factor Nutrient that raises the test by one unit, above 0 (e.g. 20 lb P2O5/ac per ppm P, Tri-State).
 * @param {any[][]} [years] Years to reach the target, above 0; default 4 (Tri-State build-up period).
 * @returns {any[][]} Rate per year in the buffer factor's unit; 0 means no build-up needed. Results are estimates: check them against local calibrations, regulations and licensed advice.
 */
export function buildup(soil_test: any[][], target: any[][], buffer_factor: any[][], years?: any[][]): any[][] {
  return BUILDUP(arguments);
}
const BUILDUP = declare(
  buildup,
  [num("soil_test"), num("target"), num("buffer_factor"), optNum("years")],
  (soilTest, target, bufferFactor, years) => buildupRate(soilTest, target, bufferFactor, years),
);
