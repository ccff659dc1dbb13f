/**
 * Legume N2 fixation measured in the field: the 15N natural abundance method (%Ndfa) and the
 * N-difference method. Guards are data in `src/data/nitrogen/checks.json`.
 */
import checks from "../../data/nitrogen/checks.json";
import { SoilError } from "../errors";
import { check, finite, Bound } from "../validate";

const NDFA = checks.ndfa;
const DELTA = NDFA.delta_limit_permil.value;

const delta = (name: string): Bound => ({ name, unit: "‰", min: -DELTA, max: DELTA });

/** Bounds of the isotope and N-difference inputs. */
/**
 * The most N a crop (or a soil's mineral pool) can be said to hold, kg N/ha: the largest shoot dry
 * matter accepted (t/ha) × 1000 kg/t × the largest tissue N % / 100. Derived from the two guards
 * in checks.json, so a g/ha figure entered as kg/ha, or an overflowing cell, is refused instead of
 * giving a fixed N in the millions.
 */
export const MAX_CROP_N_KG_HA = checks.tissue.max_shoot_dm_t_ha.value * 1000 * (checks.tissue.max_n_pct.value / 100);

export const NDFA_BOUNDS = {
  reference: delta("d15n_reference"),
  legume: delta("d15n_legume"),
  b: delta("b_value"),
  minGap: { name: "min_gap", unit: "‰", min: 0, max: 20 },
  nYield: (name: string): Bound => ({ name, unit: "kg N/ha", min: 0, max: MAX_CROP_N_KG_HA }),
} as const;

const fmt = (v: number) => String(Number(v.toPrecision(6)));

/**
 * Percent of legume N derived from the atmosphere by the 15N natural abundance method:
 * %Ndfa = 100 × (δ15N reference − δ15N legume) / (δ15N reference − B), where B is the δ15N of the
 * legume grown wholly on fixed N (Ledgard 1989, Proc. XVI Int. Grassland Congress, seen; Peoples
 * et al. 1989 ACIAR Monograph 11; Unkovich et al. 2008 ACIAR Monograph 136, from memory).
 * Results slightly outside 0–100 % come from measurement error and are returned as computed.
 * @param reference δ15N of the non-fixing reference plant, ‰ (−100 to 100)
 * @param legume δ15N of the legume (same plant part and time as the reference), ‰ (−100 to 100)
 * @param b B value of the legume species and plant part, ‰ (−100 to 100)
 * @param minGap smallest reference − B, ‰, for a reliable estimate; default 2 (common practice)
 * @returns %Ndfa
 * @throws NOT_APPLICABLE when reference equals B, is below B, or is less than minGap above it
 * @throws OUT_OF_RANGE when the result is below −20 % or above 120 % (the message says why)
 * @example nfixNdfa(6, 1, -1) //=> 71.4286
 */
export function nfixNdfa(reference: number, legume: number, b: number, minGap?: number): number {
  check(reference, NDFA_BOUNDS.reference);
  check(legume, NDFA_BOUNDS.legume);
  check(b, NDFA_BOUNDS.b);
  const gap = minGap === undefined ? NDFA.min_gap_permil.value : check(minGap, NDFA_BOUNDS.minGap);
  const spread = reference - b;
  if (spread === 0) {
    throw new SoilError(
      "NOT_APPLICABLE",
      `d15n_reference equals b_value (${fmt(b)} ‰): the natural abundance method cannot tell soil N from fixed N here`,
    );
  }
  // Stryker disable next-line EqualityOperator: equivalent for spread <= 0: a spread of 0 was refused just above
  if (spread < 0) {
    throw new SoilError(
      "NOT_APPLICABLE",
      `d15n_reference (${fmt(reference)} ‰) is below b_value (${fmt(b)} ‰): the reference must be more 15N-enriched than B; check the order (reference, legume, B)`,
    );
  }
  if (spread < gap) {
    throw new SoilError(
      "NOT_APPLICABLE",
      `d15n_reference is only ${fmt(spread)} ‰ above b_value (less than ${fmt(gap)} ‰): too little natural 15N enrichment for a reliable %Ndfa`,
    );
  }
  const pct = finite((100 * (reference - legume)) / spread, "%Ndfa");
  if (pct < NDFA.result_low_pct.value) {
    throw new SoilError(
      "OUT_OF_RANGE",
      `%Ndfa is ${fmt(pct)} %, far below 0: the legume (${fmt(legume)} ‰) is much more 15N-enriched than the reference (${fmt(reference)} ‰); check the reference plant and the samples`,
    );
  }
  if (pct > NDFA.result_high_pct.value) {
    throw new SoilError(
      "OUT_OF_RANGE",
      `%Ndfa is ${fmt(pct)} %, far above 100: the legume (${fmt(legume)} ‰) is well below the B value (${fmt(b)} ‰); the B value does not fit this legume or a sample is wrong`,
    );
  }
  return pct;
}

/**
 * N2 fixed by the N-difference method, kg N/ha: (legume N yield − reference N yield), plus, when
 * both are given, (soil mineral N after the legume − soil mineral N after the reference)
 * (Peoples et al. 1989, as tabulated in Front. Microbiol. 2023, Table 10; seen). A negative result
 * is returned as computed: it says the reference took up more N than the legume, so the method's
 * assumption (both crops take up the same soil N) failed.
 * @param legumeN N in the legume crop, kg N/ha, 0 to MAX_CROP_N_KG_HA (9600)
 * @param referenceN N in the non-fixing reference crop, kg N/ha, 0 to 9600
 * @param legumeSoilN soil mineral N under the legume, kg N/ha, 0 to 9600 (optional, with referenceSoilN)
 * @param referenceSoilN soil mineral N under the reference, kg N/ha, 0 to 9600 (optional, with legumeSoilN)
 * @returns kg N/ha fixed
 * @throws MISSING_INPUT when only one of the two soil N values is given; OUT_OF_RANGE below 0 or
 *   above 9600
 * @example nfixNDifference(250, 90) //=> 160
 */
export function nfixNDifference(legumeN: number, referenceN: number, legumeSoilN?: number, referenceSoilN?: number): number {
  check(legumeN, NDFA_BOUNDS.nYield("legume_n"));
  check(referenceN, NDFA_BOUNDS.nYield("reference_n"));
  let q = legumeN - referenceN;
  // Both, or neither: tested in this order so each part of each test can be observed.
  if (legumeSoilN !== undefined && referenceSoilN !== undefined) {
    check(legumeSoilN, NDFA_BOUNDS.nYield("legume_soil_n"));
    check(referenceSoilN, NDFA_BOUNDS.nYield("reference_soil_n"));
    q += legumeSoilN - referenceSoilN;
  } else if (legumeSoilN !== undefined || referenceSoilN !== undefined) {
    const missing = legumeSoilN === undefined ? "legume_soil_n" : "reference_soil_n";
    throw new SoilError("MISSING_INPUT", `${missing} is needed: the soil N term takes both legume_soil_n and reference_soil_n, or neither`);
  }
  // Stryker disable next-line StringLiteral: equivalent: every term is bounded to 0–9600, so the sum is always finite and the message never shows
  return finite(q, "fixed N");
}
