/** Excel bindings: legume nitrogen. Argument shaping only; the science is in src/core. */
import { nfixFixedN, nfixPerTonne, nfixNBalance, nfixShootDm } from "../core/nitrogen/nitrogen";
import { nfixNdfa, nfixNDifference } from "../core/nitrogen/isotope";
import { nfixNodulatedPct, nfixNodulationRating, nfixPinkNodulePct, nfixNoduleCount } from "../core/nitrogen/nodulation";
import { nfixSoilText, nfixSoilCount } from "../core/nitrogen/fixation-soil";
import { declare, num, optMeasured, optNum, optNumOrWord, text } from "./_binding";

/**
 * N2 fixed by a legume, kg N/ha: shoot dry matter × shoot N % × %Ndfa × below-ground factor.
 * @customfunction NFIXED
 * @param {any[][]} shoot_dm Legume shoot dry matter at peak biomass, t/ha (0–60).
 * @param {any[][]} shoot_n_pct Shoot N, % of dry matter (0, or 0.2–16; crude protein ÷ 6.25 gives N %; 0.025 is refused as a fraction).
 * @param {any[][]} ndfa_pct Percent of legume N from the atmosphere: 0, or above 1 to 100 (e.g. from SOIL.NDFA; 0.82 is refused as a fraction).
 * @param {any[][]} [root_factor] Needed, no default: whole-plant N ÷ shoot N (1–10), "shoot" (1), "walley2007" (1.32, pulses), or a crop: "faba bean" (1.43), "chickpea" (1.92), "mungbean" (1.39), "pigeonpea" (1.75).
 * @returns {any[][]} kg N/ha fixed by the whole plant (shoots only with "shoot").
 * @throws #VALUE! when root_factor is missing (no default: the published factors could not be verified), or for a %Ndfa outside 0 to 100 (not clamped) or a shoot N above 16 %.
 * @example =SOIL.NFIXED(8, 2.5, 71.4, "shoot") //=> 142.8
 * Source: fixed N = shoot N x %Ndfa (Peoples et al. 1989, ACIAR Monograph 11; Unkovich et al. 2008, ACIAR Monograph 136; method seen); 200 kg shoot N/ha at 71.4 % is derived.
 */
export function nfixed(shoot_dm: any[][], shoot_n_pct: any[][], ndfa_pct: any[][], root_factor?: any[][]): any[][] {
  return NFIXED(arguments);
}
const NFIXED = declare(
  nfixed,
  [num("shoot_dm"), num("shoot_n_pct"), num("ndfa_pct"), optNumOrWord("root_factor", "always: there is no default factor")],
  (dm, nPct, ndfa, factor) => nfixFixedN(dm, nPct, ndfa, factor),
);

/**
 * N2 fixed by the per-tonne rule, kg N/ha: shoot dry matter × kg N fixed per t × optional below-ground factor.
 * @customfunction NFIXDM
 * @param {any[][]} shoot_dm Legume shoot (herbage) dry matter, t/ha (0–60).
 * @param {any[][]} [kg_n_per_t] Needed, no default: kg N fixed per t shoot DM (0–160), "pasture" (20, Peoples et al. 2012) or "crop" (25, GRDC back pocket guide).
 * @param {any[][]} [root_factor] Whole-plant N ÷ shoot N (1–10), "walley2007" or a crop word as in SOIL.NFIXED; default "shoot" (1).
 * @returns {any[][]} kg N/ha fixed.
 * @throws #VALUE! when kg_n_per_t is missing (no crop-legume rule could be verified), or for a word other than pasture.
 * @example =SOIL.NFIXDM(5, "pasture") //=> 100
 * Source: Peoples et al. (2012) Crop & Pasture Science 63:759-786: about 20 kg shoot N fixed per t of legume herbage dry matter (abstract seen); 5 t/ha is derived.
 */
export function nfixdm(shoot_dm: any[][], kg_n_per_t?: any[][], root_factor?: any[][]): any[][] {
  return NFIXDM(arguments);
}
const NFIXDM = declare(
  nfixdm,
  [num("shoot_dm"), optNumOrWord("kg_n_per_t", "always: there is no default rule"), optNumOrWord("root_factor")],
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
 * @throws #VALUE! when d15n_reference is less than min_gap above b_value, or the result is below -20 % or above 120 % (the message says why).
 * @example =SOIL.NDFA(6, 1, -1) //=> 71.4286
 * Source: %Ndfa = 100 (d15N reference - d15N legume)/(d15N reference - B) (Ledgard 1989; Peoples et al. 1989 ACIAR Monograph 11; equation seen); these delta values are arithmetic on it (derived).
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
 * @param {any[][]} legume_n N in the legume crop, kg N/ha (0–9600).
 * @param {any[][]} reference_n N in the non-fixing reference crop, kg N/ha (0–9600).
 * @param {any[][]} [legume_soil_n] Soil mineral N under the legume, kg N/ha; give with reference_soil_n or not at all.
 * @param {any[][]} [reference_soil_n] Soil mineral N under the reference crop, kg N/ha.
 * @returns {any[][]} kg N/ha fixed; negative means the reference took up more N (the method failed).
 * @throws #VALUE! when only one of the two soil N values is given, or for an N value below 0 or above 9600 kg N/ha (60 t/ha of shoots at 16 % N: a larger figure is a unit error).
 * @example =SOIL.NDIFF(250, 90) //=> 160
 * Source: N-difference method, Peoples et al. (1989) ACIAR Monograph 11, as tabulated in Frontiers in Microbiology 2023 (formula seen); arithmetic derived.
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
 * @param {any[][]} fixed_n N2 fixed, kg N/ha (0–96,000), e.g. from SOIL.NFIXED.
 * @param {any[][]} grain_yield Grain yield, t/ha (0–30), same moisture basis as grain_n_pct.
 * @param {any[][]} grain_n_pct Grain N, % (0 for no grain, or 0.2–16; crude protein ÷ 6.25 gives N %; 0.04 is refused as a fraction).
 * @returns {any[][]} kg N/ha; negative when grain removed more N than was fixed.
 * @throws #VALUE! for a fixed_n below 0 or above 96,000 kg N/ha, a grain yield outside 0 to 30 t/ha, or grain N above 16 %.
 * @example =SOIL.NBALANCE(142.8, 2, 5) //=> 42.8
 * Source: partial N balance, fixed N minus grain N removed (Unkovich, Pate, Sanford & Armstrong 1994, abstract seen); fixed N from the SOIL.NFIXED example, grain yield and N % illustrative, not from a source.
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
 * @throws #VALUE! for a harvest_index of 0 or above 1 (35 % is given as 0.35), or a grain yield outside 0 to 30 t/ha.
 * @example =SOIL.SHOOTDM(2, 0.4) //=> 5
 * Source: definition of harvest index, grain yield / shoot dry matter (common practice); inputs illustrative, not from a source.
 */
export function shootdm(grain_yield: any[][], harvest_index: any[][]): any[][] {
  return SHOOTDM(arguments);
}
const SHOOTDM = declare(shootdm, [num("grain_yield"), num("harvest_index")], (grainYield, hi) => nfixShootDm(grainYield, hi));

// ---- Legume checks: root digs and the soil conditions for fixation ---------------------------
// One function per output, so each column of a dig sheet is one spilling formula of one type
// (numbers stay numbers for SOIL.BAND and conditional formats; ratings are text, label first).

/**
 * Percent of the plants dug that were scored adequately nodulated (100 × adequate ÷ dug).
 * @customfunction NODPCT
 * @param {any[][]} plants_dug Plants dug and scored, a whole number (1–1000; the guide digs about 30, 10 at each of 3 spots).
 * @param {any[][]} plants_adequate Plants scored adequately nodulated, a whole number from 0 to plants_dug (a count, not a percentage).
 * @returns {any[][]} % of plants adequately nodulated, 0–100.
 * @example =SOIL.NODPCT(30,21) //=> 70
 * Source: University of Adelaide, "Grower guide to assessing legume nodulation – Riverina": dig 30 plants (10 at each of 3 spots), 70 % adequately nodulated is the "adequate" threshold (seen); the percentage is arithmetic.
 */
export function nodpct(plants_dug: any[][], plants_adequate: any[][]): any[][] {
  return NODPCT(arguments);
}
const NODPCT = declare(nodpct, [num("plants_dug"), num("plants_adequate")], (dug, adequate) => nfixNodulatedPct(dug, adequate));

/**
 * Nodulation rating of a dig: Adequate (≥ 70 % of plants adequate), Borderline, Poor (< 50 %) or None; names its source.
 * @customfunction NODRATING
 * @param {any[][]} plants_dug Plants dug and scored, a whole number (1–1000).
 * @param {any[][]} plants_adequate Plants scored adequately nodulated, a whole number from 0 to plants_dug.
 * @param {any[][]} [nodules] Nodules counted on all plants dug (0–100000), at least plants_adequate (each adequate plant has nodules); 0 rates None. Blank cell: not counted.
 * @returns {any[][]} "Adequate: …", "Borderline: …", "Poor: …" or "None: …" with the % and the scale's source; a dig of fewer than the guide's about 30 plants says so.
 * @throws #VALUE! for counts that are not whole numbers, more plants adequate than dug, or fewer nodules than plants adequate.
 * @example =SOIL.NODRATING(30,21,600) //=> "Adequate: 70 %…"
 * Source: University of Adelaide, "Grower guide to assessing legume nodulation – Riverina": ≥ 70 % of plants adequate is adequate, 50–70 % borderline, < 50 % poor (seen).
 */
export function nodrating(plants_dug: any[][], plants_adequate: any[][], nodules?: any[][]): any[][] {
  return NODRATING(arguments);
}
const NODRATING = declare(
  nodrating,
  [num("plants_dug"), num("plants_adequate"), optMeasured("nodules")],
  (dug, adequate, nodules) => nfixNodulationRating(dug, adequate, nodules),
);

/**
 * Percent of the nodules cut open that are red or pink inside (effective, fixing N); white or green ones are not.
 * @customfunction NODPINK
 * @param {any[][]} nodules Nodules cut open and looked at, a whole number (1–100000).
 * @param {any[][]} nodules_pink Of those, nodules red or pink inside, a whole number from 0 to nodules.
 * @returns {any[][]} % of nodules effective, 0–100 (no published rating of this share exists, so none is given).
 * @example =SOIL.NODPINK(40,30) //=> 75
 * Source: GRDC Communities, "Growing legumes? How to check their nodules": nodules pink or red inside are effective (seen); the share is arithmetic.
 */
export function nodpink(nodules: any[][], nodules_pink: any[][]): any[][] {
  return NODPINK(arguments);
}
const NODPINK = declare(nodpink, [num("nodules"), num("nodules_pink")], (nodules, pink) => nfixPinkNodulePct(nodules, pink));

/**
 * Mean nodules per plant against the published count for the legume, where a source gives one (#N/A otherwise).
 * @customfunction NODCOUNT
 * @param {any[][]} plants_dug Plants dug, a whole number (1–1000).
 * @param {any[][]} nodules Nodules counted on all of them, a whole number (0–100000).
 * @param {any[][]} legume Legume: "field pea", "faba bean", "vetch" (50 per plant is good), or a pasture legume (at least 20).
 * @returns {any[][]} "Good: …"/"Adequate: …" or "Below: …" with the mean per plant and the source.
 * @example =SOIL.NODCOUNT(10,500,"field pea") //=> "Good: 50 nodules per plant…"
 * Source: GRDC Communities, "Growing legumes? How to check their nodules": 50 nodules per plant is good for field pea, vetch and faba bean (seen).
 */
export function nodcount(plants_dug: any[][], nodules: any[][], legume: any[][]): any[][] {
  return NODCOUNT(arguments);
}
const NODCOUNT = declare(
  nodcount,
  [num("plants_dug"), num("nodules"), text("legume")],
  (dug, nodules, legume) => nfixNoduleCount(dug, nodules, legume),
);

/**
 * Soil constraints on N2 fixation for a legume: pH for its rhizobia, nitrate at sowing, Mo, B; each with its source.
 * @customfunction FIXSOIL
 * @param {any[][]} legume Legume or inoculant group, e.g. "field pea", "chickpea", "lupin", "subterranean clover", "lucerne", "group N".
 * @param {any[][]} ph Soil pH (0–14), by the test named in ph_method.
 * @param {any[][]} ph_method "CaCl2" or "water": different tests, never assumed; a level is compared only with its own test.
 * @param {any[][]} [nitrate_kg_ha] Nitrate-N at sowing, kg N/ha (0–1000). Blank cell or omitted: not measured, listed as not checked (not a blank result).
 * @param {any[][]} [hot_water_b_mg_kg] Hot-water-soluble B, mg/kg (0–50). Blank cell or omitted: not measured.
 * @returns {any[][]} "n constraints found: …" or "none found in the checks made: …", then the possible ones, not counted (Mo at pH 5.5 or below: its source states no pH test; faba bean above 100 kg nitrate-N/ha: it keeps fixing), then the checks not made and why. A blank pH cell gives a blank result.
 * @throws #VALUE! when ph_method is missing or not CaCl2 or water, ph is left out, or a reading is out of range or text such as "<0.5".
 * @example =SOIL.FIXSOIL("field pea",5.2,"CaCl2",40) //=> "1 constraint found: pH 5.2 (CaCl2) is below 5.5…"
 * Source: GRDC Paddock Practices 2022 (SARDI): rhizobia of groups E, F and N are sensitive below pH 5.5 (CaCl2) (seen); "Molybdenum – NSW" fact sheet, soilquality.org.au: liming above pH 5.5 (seen).
 */
export function fixsoil(legume: any[][], ph: any[][], ph_method: any[][], nitrate_kg_ha?: any[][], hot_water_b_mg_kg?: any[][]): any[][] {
  return FIXSOIL(arguments);
}
const FIXSOIL = declare(
  fixsoil,
  [text("legume"), num("ph"), text("ph_method"), optMeasured("nitrate_kg_ha"), optMeasured("hot_water_b_mg_kg")],
  (legume, ph, method, nitrate, b) => nfixSoilText(legume, ph, method, nitrate, b),
);

/**
 * Number of soil factors (pH, nitrate, B) constraining N2 fixation for a legume, 0–3, for banding a report; Mo is not counted.
 * @customfunction FIXSOILCOUNT
 * @param {any[][]} legume Legume or inoculant group, as in SOIL.FIXSOIL.
 * @param {any[][]} ph Soil pH (0–14), by the test named in ph_method.
 * @param {any[][]} ph_method "CaCl2" or "water": different tests, never assumed.
 * @param {any[][]} [nitrate_kg_ha] Nitrate-N at sowing, kg N/ha (0–1000). Blank cell or omitted: not measured.
 * @param {any[][]} [hot_water_b_mg_kg] Hot-water-soluble B, mg/kg (0–50). Blank cell or omitted: not measured.
 * @returns {any[][]} Constraints found, 0–3; 0 means none in the checks made (SOIL.FIXSOIL lists them). The Mo check (its source states no pH test) and faba bean's nitrate (it keeps fixing) are possible, shown by SOIL.FIXSOIL, never counted.
 * @example =SOIL.FIXSOILCOUNT("field pea",5.2,"CaCl2",150) //=> 2
 * Source: GRDC Paddock Practices 2022 (SARDI), pH 5.5 CaCl2 (seen); Voisin et al. 2002: pea fixation starts only below 56 kg N/ha (abstract seen); Cox (DAF Qld), GRDC Communities: pulses fix little above 100 kg/ha soil N (seen); the Mo check of the "Molybdenum – NSW" fact sheet is possible, not counted.
 */
export function fixsoilcount(legume: any[][], ph: any[][], ph_method: any[][], nitrate_kg_ha?: any[][], hot_water_b_mg_kg?: any[][]): any[][] {
  return FIXSOILCOUNT(arguments);
}
const FIXSOILCOUNT = declare(
  fixsoilcount,
  [text("legume"), num("ph"), text("ph_method"), optMeasured("nitrate_kg_ha"), optMeasured("hot_water_b_mg_kg")],
  (legume, ph, method, nitrate, b) => nfixSoilCount(legume, ph, method, nitrate, b),
);
