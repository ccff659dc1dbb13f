/** Excel bindings: legume nitrogen. Argument shaping only; the science is in src/core. */
import { nfixFixedN, nfixPerTonne, nfixNBalance, nfixShootDm } from "../core/nitrogen/nitrogen";
import { nfixNdfa, nfixNDifference } from "../core/nitrogen/isotope";
import { declare, num, optNum, optText } from "./_binding";

/**
 * N2 fixed by a legume, kg N/ha: shoot dry matter × shoot N % × %Ndfa × below-ground factor.
 * @customfunction NFIXED
 * @param {any[][]} shoot_dm Legume shoot dry matter at peak biomass, t/ha (0–60).
 * @param {any[][]} shoot_n_pct Shoot N, % of dry matter (0, or 0.2–16; crude protein ÷ 6.25 gives N %; 0.025 is refused as a fraction).
 * @param {any[][]} ndfa_pct Percent of legume N from the atmosphere: 0, or above 1 to 100 (e.g. from SOIL.NDFA; 0.82 is refused as a fraction).
 * @param {any[][]} [root_factor] Needed, no default: whole-plant N ÷ shoot N (1–10), "shoot" (1, shoots only) or "walley2007" (1.32, pulses).
 * @returns {any[][]} kg N/ha fixed by the whole plant (shoots only with "shoot").
 */
export function nfixed(shoot_dm: any[][], shoot_n_pct: any[][], ndfa_pct: any[][], root_factor?: any[][]): any[][] {
  return NFIXED(arguments);
}
const NFIXED = declare(
  nfixed,
  [num("shoot_dm"), num("shoot_n_pct"), num("ndfa_pct"), optText("root_factor")],
  (dm, nPct, ndfa, factor) => nfixFixedN(dm, nPct, ndfa, factor),
);

/**
 * N2 fixed by the per-tonne rule, kg N/ha: shoot dry matter × kg N fixed per t × optional below-ground factor.
 * @customfunction NFIXDM
 * @param {any[][]} shoot_dm Legume shoot (herbage) dry matter, t/ha (0–60).
 * @param {any[][]} [kg_n_per_t] Needed, no default: kg shoot N fixed per t shoot DM (0–160), or "pasture" (20, Peoples et al. 2012).
 * @param {any[][]} [root_factor] Whole-plant N ÷ shoot N (1–10) or "walley2007"; default "shoot" (1): shoot N fixed only.
 * @returns {any[][]} kg N/ha fixed.
 */
export function nfixdm(shoot_dm: any[][], kg_n_per_t?: any[][], root_factor?: any[][]): any[][] {
  return NFIXDM(arguments);
}
const NFIXDM = declare(
  nfixdm,
  [num("shoot_dm"), optText("kg_n_per_t"), optText("root_factor")],
  (dm, perT, factor) => nfixPerTonne(dm, perT, factor),
);

/**
 * Percent of legume N derived from the atmosphere by the 15N natural abundance method.
 * @customfunction NDFA
 * @param {any[][]} d15n_reference δ15N of the non-fixing reference plant, ‰ (−100 to 100).
 * @param {any[][]} d15n_legume δ15N of the legume, same plant part and date, ‰ (−100 to 100).
 * @param {any[][]} b_value B value: δ15N of the legume grown wholly on fixed N, ‰ (−100 to 100).
 * @param {any[][]} [min_gap] Smallest reference − B for a reliable result, ‰ (0–20); default 2.
 * @returns {any[][]} %Ndfa; values a little outside 0–100 reflect measurement error and are returned as computed.
 */
export function ndfa(d15n_reference: any[][], d15n_legume: any[][], b_value: any[][], min_gap?: any[][]): any[][] {
  return NDFA(arguments);
}
const NDFA = declare(
  ndfa,
  [num("d15n_reference"), num("d15n_legume"), num("b_value"), optNum("min_gap")],
  (reference, legume, b, gap) => nfixNdfa(reference, legume, b, gap),
);

/**
 * N2 fixed by the N-difference method, kg N/ha: legume N minus reference-crop N (plus the soil N difference).
 * @customfunction NDIFF
 * @param {any[][]} legume_n N in the legume crop, kg N/ha (at least 0).
 * @param {any[][]} reference_n N in the non-fixing reference crop, kg N/ha (at least 0).
 * @param {any[][]} [legume_soil_n] Soil mineral N under the legume, kg N/ha; give with reference_soil_n or not at all.
 * @param {any[][]} [reference_soil_n] Soil mineral N under the reference crop, kg N/ha.
 * @returns {any[][]} kg N/ha fixed; negative means the reference took up more N (the method failed).
 */
export function ndiff(legume_n: any[][], reference_n: any[][], legume_soil_n?: any[][], reference_soil_n?: any[][]): any[][] {
  return NDIFF(arguments);
}
const NDIFF = declare(
  ndiff,
  [num("legume_n"), num("reference_n"), optNum("legume_soil_n"), optNum("reference_soil_n")],
  (legumeN, referenceN, legumeSoilN, referenceSoilN) => nfixNDifference(legumeN, referenceN, legumeSoilN, referenceSoilN),
);

/**
 * Net N left by a legume crop, kg N/ha: fixed N minus N removed in grain; negative means soil N was mined.
 * @customfunction NBALANCE
 * @param {any[][]} fixed_n N2 fixed, kg N/ha (at least 0), e.g. from SOIL.NFIXED.
 * @param {any[][]} grain_yield Grain yield, t/ha (0–30), same moisture basis as grain_n_pct.
 * @param {any[][]} grain_n_pct Grain N, % (0 for no grain, or 0.2–16; crude protein ÷ 6.25 gives N %; 0.04 is refused as a fraction).
 * @returns {any[][]} kg N/ha; negative when grain removed more N than was fixed.
 */
export function nbalance(fixed_n: any[][], grain_yield: any[][], grain_n_pct: any[][]): any[][] {
  return NBALANCE(arguments);
}
const NBALANCE = declare(
  nbalance,
  [num("fixed_n"), num("grain_yield"), num("grain_n_pct")],
  (fixedN, grainYield, grainNPct) => nfixNBalance(fixedN, grainYield, grainNPct),
);

/**
 * Shoot dry matter from grain yield and harvest index (grain yield ÷ HI), in the unit of grain yield.
 * @customfunction SHOOTDM
 * @param {any[][]} grain_yield Grain yield, t/ha (0–30).
 * @param {any[][]} harvest_index Harvest index as a fraction, above 0 and at most 1 (35 % is 0.35).
 * @returns {any[][]} Shoot (above-ground) dry matter, t/ha.
 */
export function shootdm(grain_yield: any[][], harvest_index: any[][]): any[][] {
  return SHOOTDM(arguments);
}
const SHOOTDM = declare(shootdm, [num("grain_yield"), num("harvest_index")], (grainYield, hi) => nfixShootDm(grainYield, hi));
