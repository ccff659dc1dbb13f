/** Excel bindings: lime. Argument shaping only; the science is in src/core. */
import { limeBuffer } from "../core/lime/buffer";
import { LIME_CALIBRATION_NEED } from "../core/lime/calibrations";
import { limeAlSat, limeBaseSat, limeExchAl, limePhBc } from "../core/lime/methods";
import { limeFinenessOfRanges, limeProductRate } from "../core/lime/product";
import { limeCceOfRanges } from "../core/lime/cce";
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
 * @throws #N/A for the default calibration SMP: its table is not shipped yet (name SIKORA-OR2025 or MEHLICH, or pass your laboratory's table).
 * @throws #VALUE! when buffer_ph or target_ph lies outside the calibration table (it is never extrapolated), for MEHLICH without soil_ph, or depth_cm or unit given with a table of your own.
 * @example =SOIL.LIMEBUFFER(6, 5.6, "SIKORA-OR2025", , , "ton/ac") //=> 1.7
 * Source: Moore (2025) "Updated lime requirement recommendations for Oregon", OSU Extension EM 9585, Table 1 and its worked example: Sikora buffer 6.0, target 5.6, 1.7 t/acre (seen).
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
 * @throws #VALUE! when depth_cm or bulk_density is missing (the method is per kg of soil), or for a factor of 0 or less.
 * @example =SOIL.LIMEAL(2, , 20, 1.2) //=> 3.6031
 * Source: Kamprath (1970) SSSA Proc. 34:252-254, 1.5 cmol(+) CaCO3 per cmol(+) of exchangeable Al (abstract and factor seen); 2 cmol(+)/kg Al over 20 cm at 1.2 g/cm3 is arithmetic (derived).
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
 * @throws #VALUE! when target_al_sat or bulk_density is missing, or for a negative cation.
 * @example =SOIL.LIMEALSAT(2, 1, 0.5, 20, , , 1) //=> 1.95168
 * Source: Cochrane, Salinas & Sanchez (1980) Tropical Agriculture 57:133-140, LR = 1.5 [Al - RAS (Al + Ca + Mg)/100] meq/100 g (abstract seen); the rate for 20 cm at 1.0 g/cm3 is derived.
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
 * @throws #VALUE! for base_sat or target_base_sat outside 0 to 100, or a negative cec.
 * @example =SOIL.LIMEBASESAT(5.46, 8.42, 60) //=> 2.81869
 * Source: base-saturation method as used in Brazil (van Raij et al. 1997, IAC Boletim Tecnico 100; attribution from memory): T 5.46 cmolc/dm3, V 8.42 to 60 %, worked example seen on a Brazilian agronomy page (2.82 t/ha with 1 t/ha per cmolc/dm3).
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
 * @throws #VALUE! when depth_cm or bulk_density is missing, or for a pH outside 0 to 14 or a negative capacity.
 * @example =SOIL.LIMEPHBC(5.2, 6, 400/500.43, 15, 1.3, "kg/ha") //=> 624
 * Source: lime buffer capacity, Sonon & Kissel, UGA Extension Circular 874 and SERA-IEG-6 fact sheet 3 (definition seen): LBC 400 mg CaCO3/kg per pH unit, pH 5.2 to 6.0 is 320 mg/kg, 624 kg/ha over 15 cm at 1.3 g/cm3 (derived).
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
 * @throws #VALUE! for cce_pct of 0 or above 250, fineness_pct of 0 or above 100, or moisture_pct of 100 or more.
 * @example =SOIL.LIMEPRODUCT(5, 70) //=> 7.14286
 * Source: Penn State Agricultural Analytical Services Lab, home-garden report notes: 5 lb/100 ft2 at CCE 100 is 7 lb/100 ft2 of a CCE 70 product (seen; the source rounds 7.14).
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
 * @throws #VALUE! when the fractions do not add up to 100 +/- 1 %, or efficiencies do not match the fractions one for one.
 * @example =SOIL.FINENESS({78.8;10;2.4;7.8}) //=> 85.28
 * Source: BC Ministry of Agriculture Soil Factsheet 637.200-2, "Evaluation of Agricultural Limestone", limestone A: 85.28 % (seen).
 */
export function fineness(fractions: any[][], efficiencies?: any[][]): any[][] {
  return FINENESS(arguments);
}
const FINENESS = declare(fineness, [range("fractions"), optRange("efficiencies")], (fr, eff) => limeFinenessOfRanges(fr, eff));

/**
 * Calcium carbonate equivalent (%) of a liming material from its analysis, from molar masses; for SOIL.LIMEPRODUCT's cce_pct.
 *
 * @customfunction CCE
 * @param {any[][]} analysis_pct % of each component in the material, one row or column (0 to 100 each, together at most 100 plus 1 for rounding; 0 for a component it lacks).
 * @param {any[][]} forms The component of each percentage, same shape: CaCO3, MgCO3, CaMg(CO3)2, CaO, MgO, Ca(OH)2, Mg(OH)2, or the elements Ca and Mg (not both an element and its compounds).
 * @returns {any[][]} CCE, % on the analysis' own basis. Ca and Mg as elements count as neutralizing: gypsum or silicate Ca does not, so use a measured CCE for by-products. Burnt and hydrated lime are caustic.
 * @example =SOIL.CCE({21.7,13.1},{"Ca","Mg"}) //=> 108.136
 * Source: Minnesota Department of Agriculture, dolomite of 21.7 % Ca and 13.1 % Mg (seen); CCE derived from IUPAC/CIAAW molar masses.
 */
export function cce(analysis_pct: any[][], forms: any[][]): any[][] {
  return CCE(arguments);
}
const CCE = declare(cce, [range("analysis_pct"), range("forms")], (analysis, formWords) => limeCceOfRanges(analysis, formWords));
