/**
 * Shared arithmetic of the lime-requirement methods: acidity to CaCO3, a soil layer to an area
 * rate, depth scaling and the result unit. Every lime function returns pure CaCO3 equivalent
 * (100 % CCE) unless it says otherwise.
 *
 * Source: 1 cmol(+) of acidity is neutralized by M(CaCO3)/2 × 0.01 g = 0.50043 g CaCO3
 * (stoichiometry, chemistry.ts); layer mass from depth × bulk density (units.ts).
 */
import { caco3GramsPerCmolCharge } from "../chemistry";
import { SoilError } from "../errors";
import { convertRate, convertUnit } from "../units";
import { BOUNDS, check, finite } from "../validate";

/** Unit of every lime result unless the caller asks for another: tonne per hectare. */
export const LIME_DEFAULT_UNIT = "t/ha";

/**
 * mg of pure CaCO3 per kg of soil that neutralizes `cmolPerKg` cmol(+)/kg of acidity.
 * @param cmolPerKg acidity to neutralize, cmol(+)/kg (= meq/100 g), ≥ 0
 * @returns mg CaCO3/kg (500.43 per cmol(+)/kg)
 * @example limeCaco3MgPerKg(3) //=> 1501.29
 * Source: stoichiometry, 0.50043 g CaCO3 per cmol(+) (derived from IUPAC atomic weights).
 */
export function limeCaco3MgPerKg(cmolPerKg: number): number {
  return finite(cmolPerKg * caco3GramsPerCmolCharge() * 1000, "the CaCO3 equivalent");
}

/** A result in kg/ha turned into the unit asked for (t/ha when omitted). */
export function limeRateIn(kgPerHa: number, unitWord: string | undefined): number {
  return convertRate(kgPerHa, "kg/ha", unitWord ?? LIME_DEFAULT_UNIT);
}

/**
 * Area rate of CaCO3 for a concentration in a soil layer of given depth and bulk density.
 * @param mgPerKg CaCO3 per kg of soil, mg/kg
 * @param depthCm layer depth, cm (> 0, ≤ 300); required
 * @param bulkDensity dry bulk density, g/cm3 (> 0, ≤ 2.65); required
 * @returns kg/ha
 * @throws MISSING_INPUT naming depth_cm or bulk_density when either is missing
 * @example limeLayerKgPerHa(1501.29, 20, 1.2) //=> 3603.1
 * Source: layer mass = depth × bulk density × area (units.ts).
 */
export function limeLayerKgPerHa(mgPerKg: number, depthCm: number | undefined, bulkDensity: number | undefined): number {
  if (depthCm === undefined) {
    throw new SoilError("MISSING_INPUT", "depth_cm is needed: this method gives lime per kg of soil, so give the depth (cm) of the layer to be limed");
  }
  if (bulkDensity === undefined) {
    throw new SoilError("MISSING_INPUT", "bulk_density is needed: this method gives lime per kg of soil, so give the dry bulk density (g/cm3) of the layer");
  }
  return convertUnit(mgPerKg, "mg/kg", "kg/ha", { depthCm, bulkDensity });
}

/**
 * The depth a rate is for: the given one (checked) or the method's calibration depth.
 * @throws OUT_OF_RANGE for a depth outside 0–300 cm
 */
export function limeDepth(depthCm: number | undefined, calibrationDepthCm: number): number {
  return depthCm === undefined ? calibrationDepthCm : check(depthCm, BOUNDS.depth());
}
