/**
 * Nodulation from a root dig: the % of plants dug that were scored adequately nodulated and its
 * rating on a published scale, the share of nodules that are pink (effective) inside, and the mean
 * nodule count per plant against a published count where one exists for the legume. Counts are
 * whole numbers of plants or nodules, never percentages. Levels and sources:
 * `src/data/nitrogen/legume-checks.json`. Screening aids: an inoculant's label and local advice govern.
 */
import { SoilError } from "../errors";
import { check, finite, Bound } from "../validate";
import { CountLevel, flagged, fmt, legumeOf, measured, NODULATION_SCALE } from "./legumes";

/**
 * Bounds of the dig counts. The upper bounds are guards against a wrong column, not science: a dig
 * scores tens of plants (the scale's guide digs about 30).
 */
export const NODULATION_BOUNDS = {
  plantsDug: { name: "plants_dug", unit: "plants", min: 1, max: 1000 },
  plantsAdequate: { name: "plants_adequate", unit: "plants", min: 0, max: 1000 },
  nodules: { name: "nodules", unit: "nodules", min: 0, max: 100000 },
  nodulesPink: { name: "nodules_pink", unit: "nodules", min: 0, max: 100000 },
} as const satisfies Record<string, Bound>;

/** A count: within its bound and a whole number (a fraction such as 0.7 is refused with a hint). */
function count(value: number, bound: Bound): number {
  check(value, bound);
  if (!Number.isInteger(value)) {
    // Every count bound starts at 0 or 1, so a value here is not negative: a non-whole value under 1 is a share.
    // Stryker disable next-line EqualityOperator: equivalent for value <= 1: 1 is a whole number, so it never reaches here
    const hint = value < 1 ? `; ${value} looks like a fraction: give the number counted, not a share` : "";
    throw new SoilError("OUT_OF_RANGE", `${bound.name} must be a whole number of ${bound.unit} (got ${value})${hint}`);
  }
  return value;
}

/** The plants rated adequate, checked against the plants dug (a percentage typed here is refused). */
function adequateOf(plantsDug: number, plantsAdequate: number): number {
  count(plantsDug, NODULATION_BOUNDS.plantsDug);
  count(plantsAdequate, NODULATION_BOUNDS.plantsAdequate);
  if (plantsAdequate > plantsDug) {
    throw new SoilError(
      "OUT_OF_RANGE",
      `plants_adequate (${plantsAdequate}) is more than plants_dug (${plantsDug}): give the number of plants scored adequately nodulated, not a percentage`,
    );
  }
  return plantsAdequate;
}

/**
 * A share of plants to 2 decimals: with at most 1000 plants a share is never within 0.01 % of 70 or
 * 50 % without being on it, so the shown number never rounds across a level of the scale.
 */
const pctText = (part: number, whole: number) => `${fmt(Number(((100 * part) / whole).toFixed(2)))} %`;

/**
 * A note for a dig smaller than the guide's: the scale is read from about 30 plants (10 at each of
 * 3 spots), and a share of a few plants moves in large steps (1 of 3 is 33 %).
 */
function fewText(plantsDug: number): string {
  if (plantsDug >= NODULATION_SCALE.dig_plants) return "";
  return `; only ${plantsDug} plant${plantsDug === 1 ? "" : "s"} dug: the guide rates a dig of ${NODULATION_SCALE.dig}, so read with care`;
}

/**
 * Percent of the plants dug that were scored adequately nodulated: 100 × adequate ÷ dug.
 * The University of Adelaide grower guide's measure: score each plant adequate or poor, work out
 * the % of plants adequately nodulated (seen).
 * @param plantsDug plants dug and scored, a whole number from 1 to 1000
 * @param plantsAdequate plants scored adequately nodulated, a whole number from 0 to plantsDug
 * @returns % of plants adequately nodulated, 0–100
 * @throws OUT_OF_RANGE for a count that is not a whole number, out of its bounds, or more plants
 *   adequate than dug (the message says a percentage is not a count)
 * @example nfixNodulatedPct(30, 21) //=> 70
 */
export function nfixNodulatedPct(plantsDug: number, plantsAdequate: number): number {
  const adequate = adequateOf(plantsDug, plantsAdequate);
  // Stryker disable next-line StringLiteral: equivalent: at most 1000 plants over at least 1 is always finite, so this message never shows
  return finite((100 * adequate) / plantsDug, "% of plants adequately nodulated");
}

/**
 * A dig's nodulation rating (Adequate, Borderline, Poor or None) with the % and the scale's source.
 * Adequate: 70 % or more of plants adequate; Borderline: 50 to under 70 %; Poor: under 50 %;
 * None: no nodules on any plant, no fixation. Scale of the University of Adelaide "Grower guide to assessing legume nodulation – Riverina"
 * (faba bean, field pea/vetch, lupin, lucerne; seen). The label comes first, so COUNTIF(range,
 * "Poor*") counts a column. Compared in whole numbers (adequate × 100 against level × dug), so
 * 21 of 30 is exactly 70 %.
 * @param plantsDug plants dug and scored, whole number 1–1000
 * @param plantsAdequate plants scored adequately nodulated, whole number 0–plantsDug
 * @param nodules optional: nodules counted on all plants dug, whole number 0–100000 (or numeric
 *   text); 0 gives None. Blank or omitted means not counted: a dig with no adequate plant is then
 *   Poor, and the text says to count nodules to tell Poor from None
 * @returns "Adequate: …", "Borderline: …", "Poor: …" or "None: …", naming the source; a dig of
 *   fewer plants than the guide's about 30 says so in the text (the rating is still the scale's)
 * @throws OUT_OF_RANGE as nfixNodulatedPct, and for a negative or fractional nodule count;
 *   NOT_A_NUMBER for nodule text that is not a number; NOT_APPLICABLE when fewer nodules were
 *   counted than plants rated adequate (each such plant has nodules), including 0
 * @example nfixNodulationRating(30, 18) //=> "Borderline: 60 % of plants adequately nodulated…"
 */
export function nfixNodulationRating(plantsDug: number, plantsAdequate: number, nodulesCounted?: number | string): string {
  const adequate = adequateOf(plantsDug, plantsAdequate);
  const source = `[${NODULATION_SCALE.short}]`;
  const nodules = measured(nodulesCounted, NODULATION_BOUNDS.nodules);
  if (nodules !== undefined) {
    count(nodules, NODULATION_BOUNDS.nodules);
    // Each plant rated adequate has at least one nodule (the guide's adequate plants have "most
    // nodules" red/pink inside), so fewer nodules than adequate plants is a miscount (arithmetic).
    if (nodules < adequate) {
      throw new SoilError(
        "NOT_APPLICABLE",
        `plants_adequate is ${adequate} but only ${nodules} nodule${nodules === 1 ? " was" : "s were"} counted on the ${plantsDug} plants dug: each adequately nodulated plant has nodules, so at least ${adequate}; check the two counts (nodules is the total on all plants dug)`,
      );
    }
    if (nodules === 0) {
      return `${NODULATION_SCALE.none.label}: no nodules on the ${plantsDug} plants dug, ${NODULATION_SCALE.none.meaning}${fewText(plantsDug)} ${source}`;
    }
  }
  const scale = NODULATION_SCALE.levels; // highest first
  // Stryker disable next-line ArithmeticOperator: equivalent: the lowest level starts at 0 %, so find always finds one and the fallback is never used
  const band = scale.find((l) => adequate * 100 >= l.min_pct * plantsDug) ?? scale[scale.length - 1]!;
  const unknownNone = adequate === 0 && nodules === undefined ? "; count nodules to tell Poor from None" : "";
  return `${band.label}: ${pctText(adequate, plantsDug)} of plants adequately nodulated (${band.range}${unknownNone})${fewText(plantsDug)} ${source}`;
}

/** Rank of a rating for comparisons: None 0, Poor 1, Borderline 2, Adequate 3. */
export function nodulationRank(rating: string): number {
  const label = rating.split(":")[0];
  // Stryker disable next-line StringLiteral: equivalent: split always returns at least one part, so the default is never used
  return [NODULATION_SCALE.none.label, ...NODULATION_SCALE.levels.map((l) => l.label).reverse()].indexOf(label ?? "");
}

/**
 * Percent of the nodules cut open that are red or pink inside (effective, fixing N).
 * White or green nodules are ineffective (GRDC Communities, "Growing legumes? How to check their
 * nodules"; seen). No published rating of this share was found, so none is given.
 * @param nodules nodules cut open and looked at, whole number 1–100000
 * @param nodulesPink of those, nodules red or pink inside, whole number 0–nodules
 * @returns % of nodules effective, 0–100
 * @throws NOT_APPLICABLE when no nodule was counted (there is no share of nothing);
 *   OUT_OF_RANGE for fractional or out-of-bounds counts or more pink than counted
 * @example nfixPinkNodulePct(40, 30) //=> 75
 */
export function nfixPinkNodulePct(nodules: number, nodulesPink: number): number {
  count(nodules, NODULATION_BOUNDS.nodules);
  count(nodulesPink, NODULATION_BOUNDS.nodulesPink);
  if (nodules === 0) throw new SoilError("NOT_APPLICABLE", "nodules is 0: with no nodules there is no share of pink nodules (the dig rates None)");
  if (nodulesPink > nodules) {
    throw new SoilError("OUT_OF_RANGE", `nodules_pink (${nodulesPink}) is more than nodules (${nodules}): give the number of nodules pink inside, not a percentage`);
  }
  // Stryker disable next-line StringLiteral: equivalent: at most 100000 pink over at least 1 nodule is always finite, so this message never shows
  return finite((100 * nodulesPink) / nodules, "% of nodules pink");
}

/**
 * Mean nodules per plant dug against the published per-plant count for the legume, if one exists.
 * 50 per plant is good for field pea, vetch and faba bean (GRDC Communities, "Growing legumes? How to check their nodules";
 * seen); an adequately nodulated pasture legume has at least 20 (MLA e-learning, DPIRD method;
 * seen). The source's level is per plant and this is a mean: plants below it can hide in a good
 * mean, so score plants one by one for SOIL.NODRATING.
 * @param plantsDug plants dug, whole number 1–1000
 * @param nodules nodules counted on all of them, whole number 0–100000
 * @param legume a legume word (see LEGUME_WORDS)
 * @returns the source's word first ("Good", "Adequate") or "Below", then the mean and the source
 * @throws NO_REFERENCE_DATA for a legume with no published per-plant count (use the % of plants
 *   adequately nodulated instead); UNKNOWN_NAME for an unknown legume; OUT_OF_RANGE for counts
 * @example nfixNoduleCount(30, 1620, "faba bean") //=> "Good: 54 nodules per plant on average…"
 */
export function nfixNoduleCount(plantsDug: number, nodules: number, legume: string): string {
  count(plantsDug, NODULATION_BOUNDS.plantsDug);
  count(nodules, NODULATION_BOUNDS.nodules);
  const row = legumeOf(legume);
  const levelRow: CountLevel | undefined = row.count;
  if (!levelRow) {
    throw new SoilError(
      "NO_REFERENCE_DATA",
      `no published nodules-per-plant count for ${row.id} was found, so none is judged; rate the dig by the % of plants adequately nodulated (SOIL.NODRATING)`,
    );
  }
  const mean = nodules / plantsDug;
  const meanText = `${fmt(mean)} nodules per plant on average`; // 6 figures: never rounded across the level
  const source = `[${levelRow.short}]`;
  return flagged(mean, levelRow)
    ? `Below: ${meanText}, under ${fmt(levelRow.level)}; ${levelRow.meaning} ${source}`
    : `${levelRow.metLabel}: ${meanText}; ${levelRow.meaning} ${source}`;
}
