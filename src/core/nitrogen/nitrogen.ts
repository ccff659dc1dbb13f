/**
 * Legume N2 fixation from shoot measurements: the shoot-based estimate (dry matter × N % × %Ndfa ×
 * below-ground factor), the per-tonne rule of thumb, the grain N balance and shoot dry matter from
 * harvest index. Factors, rules and guards are data in `src/data/nitrogen/*.json`, each with its
 * source. There is no default below-ground factor: the general crop and pasture factors could not
 * be verified, so a factor is a number, "shoot", "walley2007" or a crop with a published share.
 */
import rootFactors from "../../data/nitrogen/root-factors.json";
import perTonne from "../../data/nitrogen/per-tonne.json";
import checks from "../../data/nitrogen/checks.json";
import { SoilError, listWords } from "../errors";
import { nameTable } from "../names";
import { check, finite, Bound, PERCENT, numericText } from "../validate";
import { convertUnit } from "../units";
import { MAX_CROP_N_KG_HA } from "./isotope";

const TISSUE = checks.tissue;

/** Bounds of the shared inputs, declared once so messages read the same. */
export const NFIX_BOUNDS = {
  shootDm: { name: "shoot_dm", unit: "t/ha", min: 0, max: TISSUE.max_shoot_dm_t_ha.value },
  grainYield: { name: "grain_yield", unit: "t/ha", min: 0, max: TISSUE.max_grain_yield_t_ha.value },
  /** Percent ranges are declared once in validate.ts (a fraction such as 0.025 for 2.5 % is refused). */
  nPct: PERCENT.plantN,
  ndfaPct: PERCENT.ndfa,
  rootFactor: { name: "root_factor", min: 1, max: TISSUE.max_root_factor.value },
  /** 1 t of tissue at the largest N % holds 10 × that many kg N: no rule can fix more per tonne. */
  kgNPerT: { name: "kg_n_per_t", unit: "kg N/t", min: 0, max: 10 * TISSUE.max_n_pct.value },
  /** The most a whole plant can hold: the largest shoot DM × the largest N % × the largest root factor (96,000 kg N/ha), so an overflowing or g/ha cell is refused. */
  fixedN: { name: "fixed_n", unit: "kg N/ha", min: 0, max: MAX_CROP_N_KG_HA * TISSUE.max_root_factor.value },
  harvestIndex: { name: "harvest_index", min: 0, minExclusive: true, max: 1 },
} as const satisfies Record<string, Bound | ((n: string) => Bound)>;

/** `check`, with a hint appended to the message when the value is rejected. */
function checkHinted(value: number, bound: Bound, hint: (v: number) => string | undefined): number {
  try {
    return check(value, bound);
  } catch (e) {
    const extra = e instanceof SoilError ? hint(value) : undefined;
    if (e instanceof SoilError && extra) throw new SoilError(e.code, `${e.message}; ${extra}`);
    throw e;
  }
}

const unitHint = (unit: string) => (v: number) =>
  // Stryker disable next-line EqualityOperator: equivalent for v >= 0: a value of 0 is inside both t/ha bounds, so it is never refused and never reaches the hint
  v > 0 ? `this looks like kg/ha: give ${unit} in t/ha (kg/ha ÷ 1000)` : undefined;
const proteinHint = (v: number) =>
  // Stryker disable next-line EqualityOperator: equivalent for v >= 16: 16 % itself is accepted, so it never reaches the hint
  v > TISSUE.max_n_pct.value ? "this looks like crude protein: N % = crude protein % ÷ 6.25" : undefined;

const shootDmOk = (v: number) => checkHinted(v, NFIX_BOUNDS.shootDm, unitHint("shoot_dm"));
const grainYieldOk = (v: number) => checkHinted(v, NFIX_BOUNDS.grainYield, unitHint("grain_yield"));
const nPctOk = (v: number, name: string) => checkHinted(v, NFIX_BOUNDS.nPct(name), proteinHint);

/** A word-or-number argument as a number: numbers pass, numeric text is read, other text is a word. */
function numberOrWord(value: string | number, argName: string): number | string {
  if (typeof value === "number") return value;
  const n = numericText(value);
  if (n !== undefined) return n;
  const t = value.trim();
  if (/\d,\d/.test(t)) throw new SoilError("NOT_A_NUMBER", `${argName}: "${value}" is not a number (use a full stop as the decimal separator)`);
  return t;
}

interface RootFactorRow {
  id: string;
  aliases: string[];
  factor?: number;
  below_ground_share_pct?: Record<string, number>;
}

/** Whole-plant ÷ shoot N from a row: given directly, or 1 / (1 − below-ground share). */
function factorOfRow(row: RootFactorRow): number {
  if (row.factor !== undefined) return row.factor;
  const share = Object.values(row.below_ground_share_pct ?? {}).reduce((a, b) => a + b, 0) / 100;
  return 1 / (1 - share);
}

const ROOT_FACTORS = nameTable(
  (rootFactors.factors as RootFactorRow[]).map((r) => ({ id: r.id, aliases: r.aliases, value: factorOfRow(r) })),
);

const PER_TONNE = nameTable(perTonne.rules.map((r) => ({ id: r.id, aliases: r.aliases, value: r.kg_n_per_t })));

/** Words accepted for root_factor (SOIL.NFIXED, SOIL.NFIXDM). */
export const NFIX_ROOT_FACTOR_WORDS: readonly string[] = ROOT_FACTORS.ids;
/** Words accepted for kg_n_per_t (SOIL.NFIXDM). */
export const NFIX_PER_TONNE_WORDS: readonly string[] = PER_TONNE.ids;

/**
 * The below-ground factor (whole-plant N ÷ shoot N) from a number or a word of
 * `src/data/nitrogen/root-factors.json`: `shoot` (1, shoots only), `walley2007` (1 / (1 − 0.24):
 * roots 14 % and rhizodeposits 10 % of plant N, pulses of the Northern Great Plains, Walley et al.
 * 2007 as reported in Agron. Sustain. Dev. 2015, doi:10.1007/s13593-015-0297-y; seen), or a crop
 * with a published below-ground share s, factor 1 / (1 − s): faba bean 30 %, chickpea 48 %,
 * mungbean 28 %, pigeonpea 43 % of total plant N (Khan et al. 2002, Plant and Soil, glasshouse
 * pots; abstract seen).
 * @param value a factor from 1 to 10, numeric text, or a word; undefined when not given
 * @returns the factor, ≥ 1
 * @throws MISSING_INPUT when not given: there is no default, because the crop and pasture factors of
 *   Unkovich, Baldock & Peoples (2010) and Peoples et al. (2009) could not be verified
 * @throws UNKNOWN_NAME for another word (a crop without a published share, e.g. lupin, included);
 *   OUT_OF_RANGE below 1 or above 10 (a percentage given as a factor)
 * @example nfixRootFactor("walley2007") //=> 1.31579
 * @example nfixRootFactor("faba bean") //=> 1.42857
 */
export function nfixRootFactor(value: string | number | undefined): number {
  if (value === undefined || (typeof value === "string" && value.trim() === "")) {
    throw new SoilError(
      "MISSING_INPUT",
      `root_factor is needed: give the below-ground factor (whole-plant N ÷ shoot N, at least 1, e.g. 1.5) for your legume, ` +
        `or ${listWords(ROOT_FACTORS.ids.map((w) => `"${w}"`))}; there is no default factor`,
    );
  }
  const v = numberOrWord(value, "root_factor");
  if (typeof v === "string") {
    if (!ROOT_FACTORS.has(v)) {
      throw new SoilError("UNKNOWN_NAME", `unknown root_factor "${v}"; use a number from 1 to ${TISSUE.max_root_factor.value}, or ${listWords(ROOT_FACTORS.ids)}`);
    }
    // Stryker disable next-line StringLiteral: equivalent: has() was checked, so lookup never throws and its word for the message is never shown
    return ROOT_FACTORS.lookup(v, "root_factor");
  }
  return checkHinted(v, NFIX_BOUNDS.rootFactor, (x) =>
    // Stryker disable next-line EqualityOperator: equivalent for x >= 1: a factor of 1 is accepted, so it never reaches the hint
    x > 1
      ? "root_factor is whole-plant N ÷ shoot N; from a below-ground share s % of plant N it is 100 ÷ (100 − s)"
      : "root_factor is whole-plant N ÷ shoot N, so at least 1 (1 = shoots only)",
  );
}

/**
 * The per-tonne rule, kg N fixed per t shoot DM, from a number or a word of
 * `src/data/nitrogen/per-tonne.json`: `pasture` (20 kg shoot N; Peoples et al. 2012, Crop & Pasture
 * Sci. 63:759–786, abstract seen) or `crop` (25 kg N, inoculated legumes on average; GRDC 2013,
 * Inoculating legumes: The Back Pocket Guide, as quoted by SeedQuest 2014; seen, secondary).
 * @param value kg N/t from 0 to 160, numeric text, or a word; undefined when not given
 * @returns kg shoot N fixed per t shoot DM
 * @throws MISSING_INPUT when not given (pasture or crop legume: the rule differs, so none is assumed);
 *   UNKNOWN_NAME for another word; OUT_OF_RANGE outside 0–160 (160 = 1 t of tissue at 16 % N)
 * @example nfixKgPerTonne("pasture") //=> 20
 * @example nfixKgPerTonne("crop") //=> 25
 */
export function nfixKgPerTonne(value: string | number | undefined): number {
  if (value === undefined || (typeof value === "string" && value.trim() === "")) {
    throw new SoilError(
      "MISSING_INPUT",
      `kg_n_per_t is needed: give kg N fixed per t shoot dry matter for your legume, ` +
        `or ${listWords(perTonne.rules.map((r) => `"${r.id}" (${r.kg_n_per_t} kg N/t)`))}; there is no default rule`,
    );
  }
  const v = numberOrWord(value, "kg_n_per_t");
  if (typeof v === "string") {
    if (!PER_TONNE.has(v)) {
      throw new SoilError("UNKNOWN_NAME", `unknown kg_n_per_t "${v}"; use a number of kg N per t, or ${listWords(PER_TONNE.ids)}`);
    }
    // Stryker disable next-line StringLiteral: equivalent: has() was checked, so lookup never throws and its word for the message is never shown
    return PER_TONNE.lookup(v, "kg_n_per_t");
  }
  return check(v, NFIX_BOUNDS.kgNPerT);
}

/**
 * N2 fixed by a legume, kg N/ha: shoot DM × 1000 kg/t × shoot N %/100 × %Ndfa/100 × below-ground
 * factor. The shoot-based estimate as used in the linear models reviewed by Unkovich, Baldock &
 * Peoples (2010) Plant and Soil 329:75–89 (the form is standard; their factors are not used).
 * @param shootDm shoot dry matter at peak biomass, t/ha, 0–60
 * @param shootNPct shoot N, % of dry matter: 0, or 0.2–16 (a larger value is probably crude
 *   protein; a smaller one a fraction: 0.025 is refused, enter 2.5)
 * @param ndfaPct % of legume N derived from the atmosphere: 0, or above 1 to 100 (0 < v ≤ 1 is
 *   refused as a fraction; SOIL.NDFA results slightly outside 0–100 must be decided by the user:
 *   nothing is clamped)
 * @param rootFactor see nfixRootFactor; required
 * @returns kg N/ha fixed (whole plant, or shoots only with "shoot")
 * @throws OUT_OF_RANGE for inputs outside their bounds; MISSING_INPUT without rootFactor
 * @example nfixFixedN(8, 2.5, 82, "shoot") //=> 164
 */
export function nfixFixedN(shootDm: number, shootNPct: number, ndfaPct: number, rootFactor: string | number | undefined): number {
  shootDmOk(shootDm);
  nPctOk(shootNPct, "shoot_n_pct");
  checkHinted(ndfaPct, NFIX_BOUNDS.ndfaPct, (v) =>
    // Stryker disable next-line EqualityOperator: equivalent for v <= 0 and v >= 100: 0 and 100 are accepted, so they never reach the hint (v >= 0 and v <= 100 are killed by the hint tests)
    v < 0 || v > 100 ? "a %Ndfa slightly outside 0–100 from measurement error must be set to 0 or 100 by you; it is not clamped" : undefined,
  );
  const factor = nfixRootFactor(rootFactor);
  const shootN = convertUnit(shootDm, "t/ha", "kg/ha") * (shootNPct / 100);
  // Stryker disable next-line StringLiteral: equivalent: every input is bounded (60 t/ha × 16 % × 100 % × factor ≤ 10), so the product is always finite and this message never shows
  return finite(shootN * (ndfaPct / 100) * factor, "fixed N");
}

/**
 * N2 fixed by the per-tonne rule, kg N/ha: shoot DM × kg N fixed per t × below-ground factor.
 * Rules: about 20 kg shoot N fixed per t herbage DM for pasture legumes (Peoples et al. 2012, Crop &
 * Pasture Sci. 63:759–786; seen); 25 kg N per t shoot DM for inoculated crop legumes on average
 * (GRDC 2013 back pocket guide, as quoted; seen). Without rootFactor the factor is 1.
 * @param shootDm legume shoot dry matter, t/ha, 0–60
 * @param kgNPerT see nfixKgPerTonne; required
 * @param rootFactor see nfixRootFactor; default "shoot" (1: the rule counts shoot N only)
 * @returns kg N/ha fixed
 * @throws OUT_OF_RANGE for inputs outside their bounds; MISSING_INPUT without kgNPerT
 * @example nfixPerTonne(5, "pasture") //=> 100
 * @example nfixPerTonne(4, "crop") //=> 100
 */
export function nfixPerTonne(shootDm: number, kgNPerT: string | number | undefined, rootFactor?: string | number): number {
  shootDmOk(shootDm);
  const rule = nfixKgPerTonne(kgNPerT);
  const factor = nfixRootFactor(rootFactor === undefined || (typeof rootFactor === "string" && rootFactor.trim() === "") ? "shoot" : rootFactor);
  // Stryker disable next-line StringLiteral: equivalent: every input is bounded (60 t/ha × 160 kg/t × factor ≤ 10), so the product is always finite and this message never shows
  return finite(shootDm * rule * factor, "fixed N");
}

/**
 * Net N left by a legume crop, kg N/ha: fixed N − N removed in grain (grain yield × 1000 kg/t ×
 * grain N %/100). Negative means the crop removed more N than it fixed, i.e. it mined soil N
 * (the partial N balance of e.g. Unkovich, Pate, Sanford & Armstrong 1994, Aust. J. Agric. Res.).
 * @param fixedN N2 fixed, kg N/ha, 0 to 96,000 (from nfixFixedN or a measurement; the bound is the
 *   largest shoot DM × the largest N % × the largest root factor, a guard against unit errors)
 * @param grainYield grain yield, t/ha, 0–30, on the same moisture basis as grainNPct
 * @param grainNPct grain N, %: 0 (no grain), or 0.2–16 (a larger value is probably crude protein, a
 *   smaller one a fraction)
 * @returns kg N/ha; negative when grain N exceeds fixed N
 * @throws OUT_OF_RANGE for inputs outside their bounds
 * @example nfixNBalance(164, 2, 5) //=> 64
 */
export function nfixNBalance(fixedN: number, grainYield: number, grainNPct: number): number {
  check(fixedN, NFIX_BOUNDS.fixedN);
  grainYieldOk(grainYield);
  nPctOk(grainNPct, "grain_n_pct");
  const removed = convertUnit(grainYield, "t/ha", "kg/ha") * (grainNPct / 100);
  // Stryker disable next-line StringLiteral: equivalent: fixedN and removed are finite and ≥ 0, so their difference lies between −removed and fixedN and is always finite
  return finite(fixedN - removed, "N balance");
}

/**
 * Shoot (above-ground) dry matter from grain yield and harvest index: grain yield ÷ HI, in the
 * unit and basis of grain yield. HI is grain ÷ above-ground dry matter at maturity; peak shoot
 * biomass is larger where leaves have fallen (definition of harvest index; common practice).
 * @param grainYield grain yield, t/ha, 0–30
 * @param harvestIndex fraction above 0 and at most 1; a percentage (e.g. 35) is rejected, not guessed
 * @returns shoot dry matter, t/ha
 * @throws OUT_OF_RANGE for HI ≤ 0 or > 1 (the message says to give a fraction) and for grain yield out of bounds
 * @example nfixShootDm(2, 0.4) //=> 5
 */
export function nfixShootDm(grainYield: number, harvestIndex: number): number {
  grainYieldOk(grainYield);
  checkHinted(harvestIndex, NFIX_BOUNDS.harvestIndex, (v) =>
    // Stryker disable next-line EqualityOperator: equivalent for v >= 1: a harvest index of 1 is accepted, so it never reaches the hint
    v > 1 ? "give harvest_index as a fraction from 0 to 1 (a percentage such as 35 is 0.35)" : undefined,
  );
  return finite(grainYield / harvestIndex, "shoot dry matter");
}
