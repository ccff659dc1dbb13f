/**
 * Exchangeable sodium percentage estimated from the SAR of a soil's saturation extract, by the
 * USDA Handbook 60 regression (SOIL.ESPSAR): ESR = −0.0126 + 0.01475 × SAR and
 * ESP = 100 × ESR / (1 + ESR), ESR being the exchangeable sodium ratio Na / (CEC − Na).
 *
 * An estimate for when exchangeable Na and CEC were not measured; SOIL.ESP computes the ESP from
 * measured values. Below SAR 0.854 (= 0.0126 / 0.01475) the regression's intercept makes the
 * estimate slightly negative (−1.28 % at SAR 0): it is returned as computed, not clamped, and
 * reads as "no sodium hazard by this estimate".
 *
 * Source: U.S. Salinity Laboratory Staff (1954) USDA Agriculture Handbook 60, as reprinted in the
 * Oklahoma Administrative Code 165:10 (2013); secondary (see src/data/cations/esp-sar.json).
 */
import regression from "../../data/cations/esp-sar.json";
import { check, finite } from "../validate";

/**
 * Estimated ESP (%) from the SAR of a saturation extract: 100 ESR / (1 + ESR), ESR = −0.0126 + 0.01475 SAR.
 * @param sar sodium adsorption ratio of the saturation extract, (mmolc/L)^½, ≥ 0 (SOIL.SAR)
 * @returns estimated exchangeable sodium percentage, % (slightly negative below SAR 0.854; not clamped)
 * @throws OUT_OF_RANGE for a negative or non-finite SAR
 * @example cecEspFromSar(10) //=> 11.8865
 * Source: USDA Handbook 60 (1954) regression as reprinted in OAC 165:10 (secondary); the example is
 * arithmetic on the printed equation (derived).
 */
export function cecEspFromSar(sar: number): number {
  check(sar, { name: "sar", min: 0 });
  const esr = regression.intercept + regression.slope * sar;
  return finite((100 * esr) / (1 + esr), "the estimated ESP");
}
