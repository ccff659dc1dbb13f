/** Excel bindings: cations. Argument shaping only; the science is in src/core. */
import { cecSum, cecSaturation, cecCaMgRatio, cecEsp, CEC_UNIT_NEED, cecSumColumn, cecSaturationColumn, ColumnOf } from "../core/cations/cations";
import { cecSar, SAR_UNIT_NEED } from "../core/cations/sar";
import { cecEspFromSar } from "../core/cations/esp-sar";
import { declare, num, optNum, optText, text } from "./_binding";

/**
 * CEC by summation of Ca, Mg, K, Na (as charge) and exchangeable acidity, in cmol(+)/kg (= meq/100 g).
 *
 * @customfunction CEC
 * @param {any[][]} ca Exchangeable Ca in unit, at least 0.
 * @param {any[][]} mg Exchangeable Mg in unit, at least 0.
 * @param {any[][]} k Exchangeable K in unit, at least 0.
 * @param {any[][]} na Exchangeable Na in unit, at least 0.
 * @param {any[][]} unit Required, the unit of ca, mg, k, na: mg/kg (= ppm), g/kg, %, cmol(+)/kg (= meq/100g, cmolc/kg), mmolc/kg or mg/dm3 (needs bulk_density). Bare cmol/kg and mmol/kg are refused as ambiguous.
 * @param {any[][]} [acidity] Exchangeable acidity (H + Al) in cmol(+)/kg, at least 0; omitted = 0. With KCl acidity the result is the effective CEC.
 * @param {any[][]} [bulk_density] Dry bulk density in g/cm3 (0–2.65); needed only when unit is mg/dm3.
 * @returns {any[][]} CEC in cmol(+)/kg. On calcareous or saline soils the extractant dissolves salts, so the sum can overstate the CEC.
 * @throws #VALUE! for an unknown or ambiguous unit word, mg/dm3 without bulk_density, or a negative amount.
 * @example =SOIL.CEC(200, 14, 110.5, 6, "mg/kg", 2.4) //=> 3.82198
 * Source: Clemson University Agricultural Service Laboratory, "CEC calculations" worked example: K 221, Mg 28, Ca 400, Na 12 lb/acre (halved to ppm), H 2.40 meq/100 g, CEC 3.83 meq/100 g with rounded divisors (seen); 3.822 with IUPAC/CIAAW equivalent weights.
 */
export function cec(ca: any[][], mg: any[][], k: any[][], na: any[][], unit: any[][], acidity?: any[][], bulk_density?: any[][]): any[][] {
  return CEC(arguments);
}
const CEC = declare(
  cec,
  [num("ca"), num("mg"), num("k"), num("na"), text("unit", CEC_UNIT_NEED), optNum("acidity"), optNum("bulk_density")],
  (ca, mg, k, na, unit, acidity, bulkDensity) => cecSum(ca, mg, k, na, unit, acidity, bulkDensity),
  (v, n) => cecSumColumn(v[0] as ColumnOf, v[1] as ColumnOf, v[2] as ColumnOf, v[3] as ColumnOf, v[4] as string, v[5] as ColumnOf, v[6] as ColumnOf, n),
);

/**
 * Percent of the CEC held by Ca, Mg, K, Na, acidity or the bases; may exceed 100 % against a measured CEC.
 *
 * @customfunction SATURATION
 * @param {any[][]} part Ca, Mg, K, Na, acidity (H+Al) or bases (Ca+Mg+K+Na).
 * @param {any[][]} ca Exchangeable Ca in unit, at least 0.
 * @param {any[][]} mg Exchangeable Mg in unit, at least 0.
 * @param {any[][]} k Exchangeable K in unit, at least 0.
 * @param {any[][]} na Exchangeable Na in unit, at least 0.
 * @param {any[][]} unit Required, the unit of ca, mg, k, na: mg/kg (= ppm), g/kg, %, cmol(+)/kg (= meq/100g, cmolc/kg), mmolc/kg or mg/dm3 (needs bulk_density). Bare cmol/kg and mmol/kg are refused as ambiguous.
 * @param {any[][]} [acidity] Exchangeable acidity (H + Al) in cmol(+)/kg, at least 0; omitted = 0, but part acidity needs it, and so does bases without cec (give 0 for a calcareous soil).
 * @param {any[][]} [cec] Measured CEC in cmol(+)/kg, above 0; it becomes the denominator. Omitted: the summed CEC, and Ca+Mg+K+Na+acidity add up to 100 %.
 * @param {any[][]} [bulk_density] Dry bulk density in g/cm3 (0–2.65); needed only when unit is mg/dm3.
 * @returns {any[][]} Percent of the CEC, not capped: above 100 % means the extract held more bases than the measured CEC (carbonates, gypsum or salts dissolved), so read it as a warning about the sum, not as a saturation.
 * @throws #VALUE! for part acidity without acidity, bases without acidity or cec, a cec of 0 or less, or an unknown part or unit word.
 * @example =SOIL.SATURATION("bases", 200, 14, 110.5, 6, "mg/kg", 2.4) //=> 37.2053
 * Source: Clemson University Agricultural Service Laboratory, "CEC calculations" worked example: base saturation 1.43 / 3.83 = 37 % (seen; the source rounds to whole percent).
 */
export function saturation(
  part: any[][],
  ca: any[][],
  mg: any[][],
  k: any[][],
  na: any[][],
  unit: any[][],
  acidity?: any[][],
  cec?: any[][],
  bulk_density?: any[][],
): any[][] {
  return SATURATION(arguments);
}
const SATURATION = declare(
  saturation,
  [text("part"), num("ca"), num("mg"), num("k"), num("na"), text("unit", CEC_UNIT_NEED), optNum("acidity"), optNum("cec"), optNum("bulk_density")],
  (part, ca, mg, k, na, unit, acidity, cecMeasured, bulkDensity) => cecSaturation(part, ca, mg, k, na, unit, acidity, cecMeasured, bulkDensity),
  (v, n) => cecSaturationColumn(v[0] as string, v[1] as ColumnOf, v[2] as ColumnOf, v[3] as ColumnOf, v[4] as ColumnOf, v[5] as string, v[6] as ColumnOf, v[7] as ColumnOf, v[8] as ColumnOf, n),
);

/**
 * Ca:Mg ratio of exchangeable cations, charge basis (cmol(+):cmol(+)) by default or mass basis (mg:mg).
 *
 * @customfunction CAMG
 * @param {any[][]} ca Exchangeable Ca in unit, at least 0.
 * @param {any[][]} mg Exchangeable Mg in unit, above 0.
 * @param {any[][]} unit Required, the unit of ca and mg: mg/kg (= ppm), g/kg, %, cmol(+)/kg (= meq/100g), mmolc/kg or mg/dm3 (no bulk density needed: it cancels).
 * @param {any[][]} [basis] Basis of the result: charge (default; about 0.61 x the mass ratio) or mass. Ratios are weak grounds for fertiliser decisions: use sufficiency levels (Kopittke & Menzies 2007).
 * @returns {any[][]} The Ca:Mg ratio on the chosen basis.
 * @throws #VALUE! when mg is 0 (no ratio), for a negative amount, or a basis other than charge or mass.
 * @example =SOIL.CAMG(200, 14, "mg/kg") //=> 8.66346
 * Source: Ca 200 and Mg 14 ppm are the Clemson "CEC calculations" worked example (400 and 28 lb/acre, seen); the charge-basis ratio is derived from IUPAC/CIAAW equivalent weights.
 */
export function camg(ca: any[][], mg: any[][], unit: any[][], basis?: any[][]): any[][] {
  return CAMG(arguments);
}
const CAMG = declare(
  camg,
  [num("ca"), num("mg"), text("unit", CEC_UNIT_NEED), optText("basis")],
  (ca, mg, unit, basis) => cecCaMgRatio(ca, mg, unit, basis),
);

/**
 * Exchangeable sodium percentage: 100 x exchangeable Na / CEC, both as charge.
 *
 * @customfunction ESP
 * @param {any[][]} na Exchangeable Na in unit, at least 0.
 * @param {any[][]} cec CEC in cmol(+)/kg (= meq/100 g), above 0, whatever unit na is in.
 * @param {any[][]} unit Required, the unit of na: mg/kg (= ppm), g/kg, %, cmol(+)/kg (= meq/100g), mmolc/kg or mg/dm3 (needs bulk_density).
 * @param {any[][]} [bulk_density] Dry bulk density in g/cm3 (0–2.65); needed only when unit is mg/dm3.
 * @returns {any[][]} ESP in %, not capped (above 100 % means soluble Na was counted as exchangeable).
 * @throws #VALUE! for a cec of 0 or less, a negative Na, or mg/dm3 without bulk_density.
 * @example =SOIL.ESP(2, 20, "cmol(+)/kg") //=> 10
 * Source: definition ESP = 100 x exchangeable Na / CEC, as stated on Exova, "Soil characteristics" (seen) after USDA Agriculture Handbook 60 (1954; from memory).
 */
export function esp(na: any[][], cec: any[][], unit: any[][], bulk_density?: any[][]): any[][] {
  return ESP(arguments);
}
const ESP = declare(
  esp,
  [num("na"), num("cec"), text("unit", CEC_UNIT_NEED), optNum("bulk_density")],
  (na, cecValue, unit, bulkDensity) => cecEsp(na, cecValue, unit, bulkDensity),
);

/**
 * Sodium adsorption ratio of a water or saturation extract: Na / sqrt((Ca + Mg)/2) in mmolc/L (USDA Handbook 60).
 *
 * @customfunction SAR
 * @param {any[][]} na Sodium in the water or extract, in unit, at least 0.
 * @param {any[][]} ca Calcium, in unit, at least 0.
 * @param {any[][]} mg Magnesium, in unit, at least 0; ca + mg must be above 0.
 * @param {any[][]} unit Required: mmolc/L (= meq/L) or mg/L; a bare mmol/L is refused (for Ca and Mg it is half of mmolc/L).
 * @returns {any[][]} SAR in (mmolc/L)^0.5.
 * @throws #VALUE! when ca + mg is 0, for a negative concentration, or a bare mmol/L (ambiguous for Ca and Mg).
 * @example =SOIL.SAR(15, 6, 4, "mmolc/L") //=> 6.7082
 * Source: SAR = Na / sqrt((Ca + Mg)/2) in meq/L, U.S. Salinity Laboratory Staff (1954) USDA Handbook 60 pp. 25-26 (formula seen in the CSU Sacramento water glossary, citation on the UC Davis analytical lab page); arithmetic derived.
 */
export function sar(na: any[][], ca: any[][], mg: any[][], unit: any[][]): any[][] {
  return SAR(arguments);
}
const SAR = declare(sar, [num("na"), num("ca"), num("mg"), text("unit", SAR_UNIT_NEED)], (na, ca, mg, unit) => cecSar(na, ca, mg, unit));

/**
 * Exchangeable sodium percentage estimated from the SAR of a soil's saturation extract (USDA Handbook 60 regression).
 *
 * @customfunction ESPSAR
 * @param {any[][]} sar SAR of the soil's saturation extract, at least 0 (SOIL.SAR of the extract's Na, Ca and Mg).
 * @returns {any[][]} Estimated ESP, %: for when exchangeable Na and CEC were not measured (SOIL.ESP uses measured values). Slightly negative below SAR 0.85, not clamped.
 * @example =SOIL.ESPSAR(10) //=> 11.8865
 * Source: USDA Agriculture Handbook 60 (1954) regression ESP = 100(-0.0126 + 0.01475 SAR)/(1 + (-0.0126 + 0.01475 SAR)), as quoted in Oklahoma Administrative Code 165:10 (secondary); the value is arithmetic on it.
 */
export function espsar(sar: any[][]): any[][] {
  return ESPSAR(arguments);
}
const ESPSAR = declare(espsar, [num("sar")], (sarValue) => cecEspFromSar(sarValue));
