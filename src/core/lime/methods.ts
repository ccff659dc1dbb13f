/**
 * Lime requirement methods that need no buffer test: exchangeable Al (Kamprath 1970), Al
 * saturation (Cochrane, Salinas & Sánchez 1980), base saturation (the Brazilian V% method) and
 * pH buffer capacity. Each computes acidity to neutralize in cmol(+) and turns it into pure CaCO3
 * with 0.50043 g CaCO3 per cmol(+) (chemistry.ts), then into an area rate for the soil layer.
 *
 * Constants and sources: src/data/lime/methods.json (each with its seen / from-memory status).
 */
import methods from "../../data/lime/methods.json";
import { SoilError } from "../errors";
import { limeCaco3MgPerKg, limeDepth, limeLayerKgPerHa, limeRateIn } from "./rate";
import { convertUnit } from "../units";
import { BOUNDS, PERCENT, check, finite } from "../validate";

/** Soil layer and result unit shared by the methods. */
export interface LimeLayerOptions {
  /** Depth of the layer to lime, cm (> 0, ≤ 300); default the method's depth where it has one. */
  readonly depthCm?: number;
  /** Dry bulk density of the layer, g/cm3 (> 0, ≤ 2.65). */
  readonly bulkDensity?: number;
  /** t/ha (default), ton/ac, kg/ha or lb/ac. */
  readonly unit?: string;
}

const CMOL = "cmol(+)/kg";

function factorOf(factor: number | undefined, dflt: number): number {
  return factor === undefined ? dflt : check(factor, BOUNDS.positive("factor"));
}

/**
 * Exchangeable-aluminium lime requirement (Kamprath 1970): factor × exchangeable Al, as pure
 * CaCO3 for the layer given.
 * @param exchAl exchangeable Al (1 M KCl), cmol(+)/kg (= meq/100 g), ≥ 0
 * @param opts factor (cmol(+) CaCO3 per cmol(+) Al, > 0, default 1.5), depthCm and bulkDensity
 *   (both required: the method is per kg of soil), unit (default t/ha)
 * @returns pure CaCO3 equivalent in `unit`
 * @throws OUT_OF_RANGE for negative Al, a factor ≤ 0 or a bad depth/density; MISSING_INPUT when
 *   depth_cm or bulk_density is missing
 * @example limeExchAl(2, { depthCm: 20, bulkDensity: 1.2 }) //=> 3.6031
 * Source: Kamprath (1970) SSSA Proc. 34:252-254 (abstract seen); factor 1.5 as quoted citing
 * Mohr 1960, Cate 1965 and Kamprath 1970 (seen, secondary).
 */
export function limeExchAl(exchAl: number, opts: LimeLayerOptions & { readonly factor?: number } = {}): number {
  check(exchAl, BOUNDS.nonNegative("exch_al", CMOL));
  const factor = factorOf(opts.factor, methods.kamprath.factor_default);
  const kgHa = limeLayerKgPerHa(limeCaco3MgPerKg(factor * exchAl), opts.depthCm, opts.bulkDensity);
  return limeRateIn(kgHa, opts.unit);
}

/**
 * The Cochrane, Salinas & Sánchez (1980) lime requirement in meq Ca/100 g:
 * factor × [Al − RAS × (Al + Ca + Mg) / 100]; 0 when the Al saturation is already at or below RAS.
 * Without a factor the source's rule applies: 1.5, replaced by 2.0 when the 1.5 result is greater
 * than the exchangeable Al itself.
 * @param al exchangeable Al (1 N KCl), cmol(+)/kg (= meq/100 g), ≥ 0
 * @param ca exchangeable Ca (1 N KCl), cmol(+)/kg, ≥ 0
 * @param mg exchangeable Mg (1 N KCl), cmol(+)/kg, ≥ 0
 * @param targetAlSat RAS, the Al saturation of the effective CEC the crop tolerates: 0, or 1–100 %
 *   (between 0 and 1 is refused as a fraction; PERCENT.targetAlSat)
 * @param factor optional factor (> 0); when given it is used as is
 * @returns cmol(+)/kg (= meq/100 g) of CaCO3 to apply, ≥ 0
 * @example limeAlSatCmol(2, 1, 0.5, 10) //=> 3.3
 * Source: Cochrane, Salinas & Sánchez (1980) Tropical Agriculture 57:133-140 (abstract seen).
 */
export function limeAlSatCmol(al: number, ca: number, mg: number, targetAlSat: number, factor?: number): number {
  check(al, BOUNDS.nonNegative("al", CMOL));
  check(ca, BOUNDS.nonNegative("ca", CMOL));
  check(mg, BOUNDS.nonNegative("mg", CMOL));
  check(targetAlSat, PERCENT.targetAlSat);
  const c = methods.cochrane;
  const excess = al - (targetAlSat * (al + ca + mg)) / 100;
  // Stryker disable next-line EqualityOperator: equivalent for < vs <=: an excess of exactly 0 gives factor × 0 = 0 on either path (al ≥ 0, so 0 > al is false)
  if (excess <= 0) return 0;
  if (factor !== undefined) return finite(factorOf(factor, c.factor_default) * excess, "the lime requirement");
  const low = c.factor_default * excess;
  return finite(low > al ? c.factor_when_above_al * excess : low, "the lime requirement");
}

/**
 * Aluminium-saturation lime requirement (Cochrane, Salinas & Sánchez 1980) as pure CaCO3 for
 * the layer: see limeAlSatCmol. The default depth is 20 cm, the layer implied by the source's
 * conversion (t/ha = meq/100 g × apparent specific gravity); bulk density is required.
 * @param al exchangeable Al, cmol(+)/kg, ≥ 0
 * @param ca exchangeable Ca, cmol(+)/kg, ≥ 0
 * @param mg exchangeable Mg, cmol(+)/kg, ≥ 0
 * @param opts targetAlSat (required: 0, or 1–100 %), factor, depthCm (default 20), bulkDensity
 *   (required), unit (default t/ha)
 * @returns pure CaCO3 equivalent in `unit`
 * @throws MISSING_INPUT without target_al_sat or bulk_density; OUT_OF_RANGE for negative cations,
 *   a percentage outside 0–100 or a bad depth/density
 * @example limeAlSat(2, 1, 0.5, { targetAlSat: 20, bulkDensity: 1.0 }) //=> 1.95168
 * Source: Cochrane, Salinas & Sánchez (1980) (abstract seen); 20 cm derived from its conversion.
 */
export function limeAlSat(
  al: number,
  ca: number,
  mg: number,
  opts: LimeLayerOptions & { readonly targetAlSat?: number; readonly factor?: number } = {},
): number {
  if (opts.targetAlSat === undefined) {
    throw new SoilError(
      "MISSING_INPUT",
      "target_al_sat is needed: the Al saturation (% of Al + Ca + Mg) that the crop tolerates; the method has no default because crops differ",
    );
  }
  const cmol = limeAlSatCmol(al, ca, mg, opts.targetAlSat, opts.factor);
  const depth = limeDepth(opts.depthCm, methods.cochrane.depth_cm);
  return limeRateIn(limeLayerKgPerHa(limeCaco3MgPerKg(cmol), depth, opts.bulkDensity), opts.unit);
}

/**
 * Base-saturation lime requirement, as used in Brazil: raise the base saturation V1 to V2 of the
 * CEC at pH 7 (T). NC (t/ha, 0–20 cm, PRNT 100 %) = T × (V2 − V1) / 100 with T in cmolc/dm3;
 * here computed from 0.50043 g CaCO3 per cmol(+), which is 0.09 % above the formula's rounded 1 t/ha
 * per cmolc/dm3. 0 when V2 ≤ V1.
 * @param cec CEC at pH 7, cmol(+)/dm3 (= cmolc/dm3, as Brazilian labs report it), ≥ 0; with
 *   bulkDensity given it is read as cmol(+)/kg and multiplied by the density
 * @param baseSat current base saturation V1: 0, or above 1 to 100 % (PERCENT.baseSat: 0.5 is refused
 *   as a fraction)
 * @param targetBaseSat target base saturation V2, 20–100 % (PERCENT.targetBaseSat)
 * @param opts depthCm (default 20), bulkDensity (only for a CEC per kg), unit (default t/ha)
 * @returns pure CaCO3 equivalent in `unit`
 * @throws OUT_OF_RANGE for a negative CEC, a percentage outside its range (with a hint when it
 *   looks like a fraction) or a bad depth/density
 * @example limeBaseSat(5.46, 8.42, 60) //=> 2.8187
 * Source: van Raij et al. (1997) IAC Boletim Técnico 100 (attribution from memory); formula and
 * this worked example (T 5.46, V 8.42 → 60 %) seen in a Brazilian agronomy page (agronomiacomgismonti).
 */
export function limeBaseSat(cec: number, baseSat: number, targetBaseSat: number, opts: LimeLayerOptions = {}): number {
  check(cec, BOUNDS.nonNegative("cec", opts.bulkDensity === undefined ? "cmol(+)/dm3" : CMOL));
  check(baseSat, PERCENT.baseSat);
  check(targetBaseSat, PERCENT.targetBaseSat);
  const perVolume = opts.bulkDensity === undefined ? cec : cec * check(opts.bulkDensity, BOUNDS.bulkDensity());
  const cmolPerDm3 = (perVolume * Math.max(0, targetBaseSat - baseSat)) / 100;
  const depth = limeDepth(opts.depthCm, methods.base_saturation.depth_cm);
  // mg CaCO3 per dm3 of soil; the layer's volume gives the rate without a density.
  const kgHa = convertUnit(limeCaco3MgPerKg(cmolPerDm3), "mg/dm3", "kg/ha", { depthCm: depth });
  return limeRateIn(kgHa, opts.unit);
}

/**
 * pH-buffer-capacity lime requirement: capacity × (target pH − soil pH) cmol(+)/kg, as pure
 * CaCO3 for the layer given; 0 when target ≤ soil pH.
 * @param soilPh current soil pH, 0–14
 * @param targetPh target pH, 0–14
 * @param phBufferCapacity pH buffer capacity, cmol(+)/kg per pH unit, ≥ 0 (a capacity in
 *   mg CaCO3/kg per pH unit divided by 500.43 gives this unit)
 * @param opts depthCm and bulkDensity (both required), unit (default t/ha)
 * @returns pure CaCO3 equivalent in `unit`
 * @throws OUT_OF_RANGE for a pH outside 0–14, a negative capacity or a bad depth/density;
 *   MISSING_INPUT when depth_cm or bulk_density is missing
 * @example limePhBc(5.0, 6.0, 1.0, { depthCm: 10, bulkDensity: 1.3, unit: "kg/ha" }) //=> 650.56
 * Source: definition of the lime buffer capacity, Sonon & Kissel, UGA Ext. Circular 874 and
 * SERA-IEG-6 fact sheet 3 (seen); arithmetic derived.
 */
export function limePhBc(soilPh: number, targetPh: number, phBufferCapacity: number, opts: LimeLayerOptions = {}): number {
  check(soilPh, BOUNDS.ph("soil_ph"));
  check(targetPh, BOUNDS.ph("target_ph"));
  check(phBufferCapacity, BOUNDS.nonNegative("ph_buffer_capacity", "cmol(+)/kg per pH unit"));
  const cmol = phBufferCapacity * Math.max(0, targetPh - soilPh);
  return limeRateIn(limeLayerKgPerHa(limeCaco3MgPerKg(cmol), opts.depthCm, opts.bulkDensity), opts.unit);
}
