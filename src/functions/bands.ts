/** Excel bindings: bands. Argument shaping only; the science is in src/core. */
import { bandLabel, bandPosition } from "../core/bands/bands";
import { sufficiencyBand } from "../core/bands/sufficiency";
import { removalAmount, REMOVAL_YIELD_UNIT_NEED } from "../core/bands/removal";
import { buildupRate } from "../core/bands/buildup";
import { declare, neededText, num, optNum, optRange, optText, range, text } from "./_binding";

/**
 * The label of the band that holds a value, on your own limits; a value equal to a limit is in the band above it.
 *
 * @customfunction BAND
 * @param {any[][]} value Value in the unit of the limits; a cell or a range (a season's column).
 * @param {any[][]} limits A row or column of strictly ascending lower bounds; n limits make n+1 bands.
 * @param {any[][]} [labels] A row or column of n+1 labels in any language. Omitted: Very low, Low, Optimum, High, Very high (four limits only).
 * @returns {any[][]} The band's label.
 * @throws #VALUE! when limits are not strictly ascending, or labels are not one more than the limits (no labels: four limits only).
 * @example =SOIL.BAND(20, {15,24,31}, {"Low","Optimum","High","Very high"}) //=> "Optimum"
 * Source: Magdoff & van Es, Building Soils for Better Crops (SARE), Table 21.2, Bray-1 P: low 0-15, optimum 15-24, high 24-31, very high above 31 ppm (seen).
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
 * @throws #VALUE! for fewer than two limits or limits not strictly ascending.
 * @example =SOIL.BANDPOS(20, {15,24,31}) //=> 0.555556
 * Source: the Bray-1 P limits of Magdoff & van Es (SARE) Table 21.2 (seen); the position (20 - 15)/(24 - 15) is derived.
 */
export function bandpos(value: any[][], limits: any[][]): any[][] {
  return BANDPOS(arguments);
}
const BANDPOS = declare(bandpos, [num("value"), range("limits")], (value, limits) => bandPosition(value, limits));

/**
 * Band label for a soil-test or tissue value from a reference table: built-in (each with its source) or your own range.
 *
 * @customfunction SUFFICIENCY
 * @param {any[][]} nutrient P, K, S, N, Ca, Mg, B, Cu, Fe, Mn, Mo or Zn.
 * @param {any[][]} value Value, at least 0, in the table's unit (soilcell list shows it) or in the unit given as unit: soil tests mg/kg, the Olsen P index mg/dm3 (mg per litre of soil), tissue % of dry matter (micronutrients mg/kg).
 * @param {any[][]} [crop] The crop (corn, soybean, wheat, canola, alfalfa, clover, subclover, pasture, barley, …) or, for the Tri-State P tables, the rotation: crops joined by "-", e.g. corn-soybean or corn-soybean-wheat (every year the same crop: corn-corn). A table written for the crop or rotation is read before a crop-independent one (Bray-1 P: wheat, alfalfa and corn-soybean rotations read the Tri-State 1995 critical levels, other crops the SARE general ranges); name a table to read another. Omitted: a crop-independent table.
 * @param {any[][]} [method] Bray-1, Mehlich-3, Olsen, Colwell, KCl-40, DTPA, or tissue for plant analysis. Needed unless table names a table or is your own.
 * @param {any[][]} [cec] CEC in cmol(+)/kg, above 0; needed where the table's levels depend on it (Mehlich-3 K).
 * @param {any[][]} [table] A built-in table id (soilcell list): needed where several fit (subclover S by stage) or where sources disagree (KCl-40 S for wheat); or your own table as a range: nutrient | method | crop | band | limit | band … per row.
 * @param {any[][]} [unit] Unit of value: mg/kg (= ppm), g/kg, %, or mg/dm3 (mg per litre of soil); converted exactly to the table's unit. Needed for Olsen P, which labs report per kg or per litre of soil (the tables are in both); a value per kg is never read against a per-litre table.
 * @param {any[][]} [depth_cm] Depth of the sampled layer, cm (0 to depth_cm), above 0 and at most 300; needed, and must match, where the source states its sampling depth: KCl-40 S 30 (0-30 cm core), pasture Bray and Olsen P 10.
 * @returns {any[][]} The source's band label; #N/A where no table covers the combination (the message lists those that exist). Interpretations are regional estimates: check them locally.
 * @throws #N/A when no built-in table covers the nutrient, crop, method, unit and depth (the message lists those that exist), when the value sits exactly on a limit the source leaves in neither class, or is above the top of a closed published scale.
 * @throws #VALUE! when method is missing, cec, unit or depth_cm is missing where the table needs it, a table that sources dispute is not named, unit is a rate per area, or a table range is malformed.
 * @example =SOIL.SUFFICIENCY("P", 30, , "Olsen", , , "mg/dm3") //=> "Index 3"
 * Source: Nutrient Action Programme Regulations (Northern Ireland) 2019, S.R. 2019/81, Schedule 5 para. 10, Olsen P index in mg P per litre of soil (seen).
 */
export function sufficiency(
  nutrient: any[][],
  value: any[][],
  crop?: any[][],
  method?: any[][],
  cec?: any[][],
  table?: any[][],
  unit?: any[][],
  depth_cm?: any[][],
): any[][] {
  return SUFFICIENCY(arguments);
}
const SUFFICIENCY = declare(
  sufficiency,
  [text("nutrient"), num("value"), optText("crop"), neededText("method", "unless table names a built-in table or is your own"), optNum("cec"), optRange("table"), optText("unit"), optNum("depth_cm")],
  (nutrient, value, crop, method, cec, table, unit, depth) => sufficiencyBand(nutrient, value, crop, method, cec, table, unit, depth),
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
 * @throws #VALUE! for an unknown crop, nutrient or unit word, or a negative yield.
 * @throws #N/A when the source gives no coefficient for that crop and nutrient, or bu/ac is used for a crop without a standard bushel weight.
 * @example =SOIL.REMOVAL("corn", 10, "P2O5", "t/ha") //=> 72.5
 * Source: OMAFA Field Crop News (2025) "Crop Removal Values", Table 1: corn grain 6.6-7.9 kg P2O5/t (seen); 10 t/ha at the midpoint (derived).
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
 * @throws #VALUE! for a buffer_factor or years of 0 or less, or a negative soil test or target.
 * @example =SOIL.BUILDUP(10, 15, 20) //=> 25
 * Source: LaBarge, OSU Extension, "How much fertilizer will move soil test levels": 20 lb P2O5/A per ppm of soil-test P (seen); Tri-State four-year build-up (Culman et al. 2020, OSU Bull. 974, seen); 10 to 15 ppm is derived.
 */
export function buildup(soil_test: any[][], target: any[][], buffer_factor: any[][], years?: any[][]): any[][] {
  return BUILDUP(arguments);
}
const BUILDUP = declare(
  buildup,
  [num("soil_test"), num("target"), num("buffer_factor"), optNum("years")],
  (soilTest, target, bufferFactor, years) => buildupRate(soilTest, target, bufferFactor, years),
);
