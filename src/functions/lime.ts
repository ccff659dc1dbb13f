/** Excel bindings: lime. Argument shaping only; the science is in src/core. */
import { limeBuffer } from "../core/lime/buffer";
import { LIME_CALIBRATION_NEED } from "../core/lime/calibrations";
import { limeAlSat, limeBaseSat, limeExchAl, limePhBc } from "../core/lime/methods";
import { limeFinenessOfRanges, limeProductRate } from "../core/lime/product";
import { declare, num, optNum, optRange, optText, range } from "./_binding";

/**
 * Lime requirement from a buffer pH test, as pure CaCO3 (t/ha default), from a built-in or your own calibration table.
 *
 * @customfunction LIMEBUFFER
 * @param {any[][]} buffer_ph Soil-buffer pH from the lab, within the calibration's range (SIKORA-OR2025 4.8 to 6.9; MEHLICH up to 6.6).
 * @param {any[][]} target_ph Target soil pH, within the calibration's range (SIKORA-OR2025 5.6 to 7.2; MEHLICH up to 6.6).
 * @param {any[][]} calibration Required, no default: SIKORA-OR2025 (Oregon 2025, 6-inch depth), MEHLICH (NCDA&CS, needs soil_ph) or SMP (its table is not shipped yet, so #N/A); or your lab's table as a range: top row target pH, left column buffer pH, body lime rates.
 * @param {any[][]} [soil_ph] Current soil pH (0 to 14). MEHLICH needs it; with any calibration a target at or below it gives 0.
 * @param {any[][]} [depth_cm] Depth to lime in cm; default the calibration's own depth (SIKORA-OR2025 15.24 cm), and a given depth scales the rate in proportion. Leave blank with a range or MEHLICH.
 * @param {any[][]} [unit] t/ha (default), ton/ac, kg/ha or lb/ac. Leave blank with a range: the result is then in the range's own unit.
 * @returns {any[][]} Pure CaCO3 equivalent (MEHLICH: lime as NCDA&CS states it; a range: its own unit). Estimates: split large rates, incorporate to the depth used, check local calibrations, regulations and licensed advice.
 */
export function limebuffer(
  buffer_ph: any[][],
  target_ph: any[][],
  calibration: any[][],
  soil_ph?: any[][],
  depth_cm?: any[][],
  unit?: any[][],
): any[][] {
  return LIMEBUFFER(arguments);
}
const LIMEBUFFER = declare(
  limebuffer,
  [num("buffer_ph"), num("target_ph"), range("calibration", LIME_CALIBRATION_NEED), optNum("soil_ph"), optNum("depth_cm"), optText("unit")],
  (bufferPh, targetPh, calibration, soilPh, depthCm, unit) => limeBuffer(bufferPh, targetPh, { calibration, soilPh, depthCm, unit }),
);

/**
 * Lime to neutralize exchangeable Al (Kamprath 1970), factor × Al, as pure CaCO3 for the layer given (t/ha default).
 *
 * @customfunction LIMEAL
 * @param {any[][]} exch_al Exchangeable Al (1 M KCl) in cmol(+)/kg (= meq/100 g), at least 0.
 * @param {any[][]} [factor] cmol(+) of CaCO3 per cmol(+) of Al, above 0; default 1.5.
 * @param {any[][]} [depth_cm] Depth of the layer to lime in cm (0 to 300); required, the method is per kg of soil.
 * @param {any[][]} [bulk_density] Dry bulk density of the layer in g/cm3 (0 to 2.65); required.
 * @param {any[][]} [unit] t/ha (default), ton/ac, kg/ha or lb/ac.
 * @returns {any[][]} Pure CaCO3 equivalent. Estimates: split large rates, incorporate to the depth used, check local calibrations, regulations and licensed advice.
 */
export function limeal(exch_al: any[][], factor?: any[][], depth_cm?: any[][], bulk_density?: any[][], unit?: any[][]): any[][] {
  return LIMEAL(arguments);
}
const LIMEAL = declare(
  limeal,
  [num("exch_al"), optNum("factor"), optNum("depth_cm"), optNum("bulk_density"), optText("unit")],
  (exchAl, factor, depthCm, bulkDensity, unit) => limeExchAl(exchAl, { factor, depthCm, bulkDensity, unit }),
);

/**
 * Lime to bring Al saturation down to what the crop tolerates (Cochrane, Salinas & Sanchez 1980), as pure CaCO3.
 *
 * @customfunction LIMEALSAT
 * @param {any[][]} al Exchangeable Al (1 N KCl) in cmol(+)/kg (= meq/100 g), at least 0.
 * @param {any[][]} ca Exchangeable Ca (1 N KCl) in cmol(+)/kg, at least 0.
 * @param {any[][]} mg Exchangeable Mg (1 N KCl) in cmol(+)/kg, at least 0.
 * @param {any[][]} [target_al_sat] Al saturation the crop tolerates, % of Al + Ca + Mg (0, or 1 to 100; 0.2 is refused as a fraction, enter 20); required, crops differ.
 * @param {any[][]} [factor] Factor above 0; default the source's rule: 1.5, or 2.0 when the 1.5 result exceeds the Al itself.
 * @param {any[][]} [depth_cm] Depth to lime in cm; default 20 (the layer implied by the source's t/ha conversion).
 * @param {any[][]} [bulk_density] Dry bulk density in g/cm3 (0 to 2.65); required.
 * @param {any[][]} [unit] t/ha (default), ton/ac, kg/ha or lb/ac.
 * @returns {any[][]} Pure CaCO3 equivalent; 0 when the Al saturation is already at or below the target. Estimates: split large rates, check local calibrations, regulations and licensed advice.
 */
export function limealsat(
  al: any[][],
  ca: any[][],
  mg: any[][],
  target_al_sat?: any[][],
  factor?: any[][],
  depth_cm?: any[][],
  bulk_density?: any[][],
  unit?: any[][],
): any[][] {
  return LIMEALSAT(arguments);
}
const LIMEALSAT = declare(
  limealsat,
  [num("al"), num("ca"), num("mg"), optNum("target_al_sat"), optNum("factor"), optNum("depth_cm"), optNum("bulk_density"), optText("unit")],
  (al, ca, mg, targetAlSat, factor, depthCm, bulkDensity, unit) => limeAlSat(al, ca, mg, { targetAlSat, factor, depthCm, bulkDensity, unit }),
);

/**
 * Lime to raise base saturation V1 to V2 of the CEC at pH 7 (Brazilian V% method), as pure CaCO3 for 0-20 cm by default.
 *
 * @customfunction LIMEBASESAT
 * @param {any[][]} cec CEC at pH 7 (T) in cmol(+)/dm3 (= cmolc/dm3), as Brazilian labs report it; with bulk_density it is read as cmol(+)/kg.
 * @param {any[][]} base_sat Current base saturation V1, % (0, or above 1 to 100; 0.5 is refused as a fraction, enter 50).
 * @param {any[][]} target_base_sat Target base saturation V2, % (20 to 100); at or below V1 gives 0.
 * @param {any[][]} [depth_cm] Depth to lime in cm; default 20 (the method's 0-20 cm layer), scaled in proportion.
 * @param {any[][]} [bulk_density] Dry bulk density in g/cm3; give it only when cec is per kg (cmol(+)/kg).
 * @param {any[][]} [unit] t/ha (default), ton/ac, kg/ha or lb/ac.
 * @returns {any[][]} Pure CaCO3 equivalent (PRNT 100 %); divide by PRNT/100 (SOIL.LIMEPRODUCT) for the product. Estimates: check local calibrations, regulations and licensed advice.
 */
export function limebasesat(
  cec: any[][],
  base_sat: any[][],
  target_base_sat: any[][],
  depth_cm?: any[][],
  bulk_density?: any[][],
  unit?: any[][],
): any[][] {
  return LIMEBASESAT(arguments);
}
const LIMEBASESAT = declare(
  limebasesat,
  [num("cec"), num("base_sat"), num("target_base_sat"), optNum("depth_cm"), optNum("bulk_density"), optText("unit")],
  (cec, baseSat, targetBaseSat, depthCm, bulkDensity, unit) => limeBaseSat(cec, baseSat, targetBaseSat, { depthCm, bulkDensity, unit }),
);

/**
 * Lime from the soil's pH buffer capacity: capacity x (target - soil pH), as pure CaCO3 for the layer given.
 *
 * @customfunction LIMEPHBC
 * @param {any[][]} soil_ph Current soil pH (0 to 14), measured as the capacity was.
 * @param {any[][]} target_ph Target pH (0 to 14); at or below soil_ph gives 0.
 * @param {any[][]} ph_buffer_capacity pH buffer capacity in cmol(+)/kg per pH unit, at least 0 (mg CaCO3/kg per pH unit divided by 500.43).
 * @param {any[][]} [depth_cm] Depth of the layer to lime in cm (0 to 300); required.
 * @param {any[][]} [bulk_density] Dry bulk density of the layer in g/cm3 (0 to 2.65); required.
 * @param {any[][]} [unit] t/ha (default), ton/ac, kg/ha or lb/ac.
 * @returns {any[][]} Pure CaCO3 equivalent. Estimates: split large rates, incorporate to the depth used, check local calibrations, regulations and licensed advice.
 */
export function limephbc(
  soil_ph: any[][],
  target_ph: any[][],
  ph_buffer_capacity: any[][],
  depth_cm?: any[][],
  bulk_density?: any[][],
  unit?: any[][],
): any[][] {
  return LIMEPHBC(arguments);
}
const LIMEPHBC = declare(
  limephbc,
  [num("soil_ph"), num("target_ph"), num("ph_buffer_capacity"), optNum("depth_cm"), optNum("bulk_density"), optText("unit")],
  (soilPh, targetPh, capacity, depthCm, bulkDensity, unit) => limePhBc(soilPh, targetPh, capacity, { depthCm, bulkDensity, unit }),
);

/**
 * Product rate to spread for a pure-CaCO3 lime rate: rate / (CCE x fineness) / dry matter, in the rate's own unit.
 *
 * @customfunction LIMEPRODUCT
 * @param {any[][]} caco3_rate Lime requirement as pure CaCO3 equivalent, in any rate unit, at least 0.
 * @param {any[][]} cce_pct Calcium carbonate equivalent of the product, % of dry matter (5 to 250; 0.95 is refused as a fraction, enter 95).
 * @param {any[][]} [fineness_pct] Fineness efficiency, % (above 1, at most 100; SOIL.FINENESS); default 100, e.g. when cce_pct is already an ECCE.
 * @param {any[][]} [moisture_pct] Water in the product as received, % of its wet mass (0, or 1 to below 100: below 1 % enter 0); default 0.
 * @returns {any[][]} Product as received, same unit as caco3_rate. Handle with care: dust; burnt and hydrated lime are caustic. Estimates: check local calibrations and regulations.
 */
export function limeproduct(caco3_rate: any[][], cce_pct: any[][], fineness_pct?: any[][], moisture_pct?: any[][]): any[][] {
  return LIMEPRODUCT(arguments);
}
const LIMEPRODUCT = declare(
  limeproduct,
  [num("caco3_rate"), num("cce_pct"), optNum("fineness_pct"), optNum("moisture_pct")],
  (rate, cce, fine, moisture) => limeProductRate(rate, cce, fine, moisture),
);

/**
 * Fineness efficiency (%) of a liming material from its sieve fractions, finest first (default: 100/60/20/0 % rating).
 *
 * @customfunction FINENESS
 * @param {any[][]} fractions % of the sample in each size class, one row or column, finest first; must add up to 100 +/- 1 %. Default classes: finer than 60 mesh, 20-60, 8-20, coarser than 8 mesh.
 * @param {any[][]} [efficiencies] % effectiveness of each class, one per fraction (0 to 100); default 100, 60, 20, 0 (the method developed in Ohio).
 * @returns {any[][]} Fineness efficiency, % (use as fineness_pct in SOIL.LIMEPRODUCT).
 */
export function fineness(fractions: any[][], efficiencies?: any[][]): any[][] {
  return FINENESS(arguments);
}
const FINENESS = declare(fineness, [range("fractions"), optRange("efficiencies")], (fr, eff) => limeFinenessOfRanges(fr, eff));
