/** Excel bindings: units and chemistry. Argument shaping only; the science is in src/core. */
import { convertUnit } from "../core/units";
import { cmolFromMgKg, mgKgFromCmol, convertForm } from "../core/chemistry";
import { declare, num, optNum, text } from "./_binding";

/**
 * Converts a value between units of mass fraction, charge, soil volume, area rate or salinity.
 *
 * @customfunction CONVERT
 * @param {any[][]} value Amount in from_unit; a cell or a range.
 * @param {any[][]} from_unit Unit of value: mg/kg (ppm), g/kg, %, cmol(+)/kg (meq/100g), mmolc/kg, mg/dm3 (of soil), kg/ha, t/ha (Mg/ha), g/m2, lb/ac, ton/ac, dS/m, uS/cm. Refused as ambiguous: bare cmol/kg, mmol/kg, mg/L, mg/ha.
 * @param {any[][]} to_unit Unit wanted, from the same list.
 * @param {any[][]} [depth_cm] Soil layer depth in cm (0–300); needed between mass fraction or volume and area rate.
 * @param {any[][]} [bulk_density] Dry bulk density in g/cm3 (0–2.65); needed between mass fraction and area rate or volume.
 * @returns {any[][]} The value in to_unit.
 * @throws #VALUE! when from_unit and to_unit measure different things (a mass fraction and a salinity), or when a conversion between mass fraction, soil volume and area rate lacks depth_cm or bulk_density (the message names which).
 * @example =SOIL.CONVERT(100, "lb/ac", "kg/ha") //=> 112.085
 * Source: IPNI, Better Crops with Plant Food 91(4) 2007 p. 31, "Conversion factors for U.S. system and metric units": lb/A x 1.12 = kg/ha (seen); 1.120851 from the exact 1959 pound and acre (derived).
 */
export function convert(value: any[][], from_unit: any[][], to_unit: any[][], depth_cm?: any[][], bulk_density?: any[][]): any[][] {
  return CONVERT(arguments);
}
const CONVERT = declare(
  convert,
  [num("value"), text("from_unit"), text("to_unit"), optNum("depth_cm"), optNum("bulk_density")],
  (value, from, to, depthCm, bulkDensity) => convertUnit(value, from, to, { depthCm, bulkDensity }),
);

/**
 * Exchangeable cation from mg/kg to cmol(+)/kg (= meq/100 g), from IUPAC atomic weights.
 * @customfunction CMOL
 * @param {any[][]} mg_per_kg Exchangeable cation in mg/kg (ppm), at least 0.
 * @param {any[][]} ion Ca, Mg, K, Na, NH4, H, Al (Al3+) or Mn (Mn2+).
 * @returns {any[][]} cmol(+)/kg.
 * @throws #VALUE! for an ion not in the list, or a negative amount.
 * @example =SOIL.CMOL(200, "Ca") //=> 0.998054
 * Source: Clemson University Agricultural Service Laboratory, "CEC calculations": 200 ppm Ca (400 lb/acre) is 1 meq/100 g with the handbook divisor (seen); 0.998 with the IUPAC/CIAAW equivalent weight 200.39 (derived).
 */
export function cmol(mg_per_kg: any[][], ion: any[][]): any[][] {
  return CMOL(arguments);
}
const CMOL = declare(cmol, [num("mg_per_kg"), text("ion")], (mgKg, ion) => cmolFromMgKg(mgKg, ion));

/**
 * Exchangeable cation from cmol(+)/kg (= meq/100 g) to mg/kg; the inverse of SOIL.CMOL.
 * @customfunction MGKG
 * @param {any[][]} cmol_per_kg Exchangeable cation in cmol(+)/kg, at least 0.
 * @param {any[][]} ion Ca, Mg, K, Na, NH4, H, Al (Al3+) or Mn (Mn2+).
 * @returns {any[][]} mg/kg.
 * @throws #VALUE! for an ion not in the list, or a negative amount.
 * @example =SOIL.MGKG(1, "K") //=> 390.98
 * Source: Clemson University Agricultural Service Laboratory, "CEC calculations": K divisor 782 lb/acre, i.e. 391 ppm, per meq/100 g (seen); 390.98 from the IUPAC/CIAAW atomic weight of K (derived).
 */
export function mgkg(cmol_per_kg: any[][], ion: any[][]): any[][] {
  return MGKG(arguments);
}
const MGKG = declare(mgkg, [num("cmol_per_kg"), text("ion")], (cmolKg, ion) => mgKgFromCmol(cmolKg, ion));

/**
 * The same amount of an element expressed in another form, e.g. P2O5 to P, K to K2O.
 * @customfunction OXIDE
 * @param {any[][]} value Amount in from_form, in any mass or rate unit (kept as is).
 * @param {any[][]} from_form P, P2O5, K, K2O, Ca, CaO, CaCO3, Mg, MgO, MgCO3, S, SO4, SO3, N, NO3, NH4 or NH3.
 * @param {any[][]} to_form A form of the same element.
 * @returns {any[][]} The amount in to_form.
 * @throws #VALUE! for forms of different elements (P to K2O), or a form not in the list.
 * @example =SOIL.OXIDE(49.8, "K", "K2O") //=> 59.9891
 * Source: Reiter, Virginia Cooperative Extension SPES-201NP, "Conversion Factors Needed for Common Fertilizer Calculations": 49.8 % K x 1.2051 = 60 % K2O (seen); the IUPAC factor 1.2046 gives 59.99.
 */
export function oxide(value: any[][], from_form: any[][], to_form: any[][]): any[][] {
  return OXIDE(arguments);
}
const OXIDE = declare(oxide, [num("value"), text("from_form"), text("to_form")], (v, from, to) => convertForm(v, from, to));
