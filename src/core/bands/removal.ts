/**
 * Nutrients exported in the harvested product (SOIL.REMOVAL).
 *
 * removal (kg/ha) = yield (t/ha, on the crop's basis) × coefficient (kg per t, in the form the
 * source prints) × form factor (e.g. P2O5 → P, from atomic weights), then converted to the rate
 * unit asked for. Coefficients and bushel weights are data (src/data/bands/removal.json and
 * bushel-weights.json), each row with its source. Where a source prints a range the midpoint is
 * used (derived). No moisture correction is made: the yield must be on the row's own basis
 * (marketing moisture for grain, stated dry matter for forage, fresh weight for roots and tubers).
 *
 * Sources: OMAFA Field Crop News (2025) 'Crop Removal Values' Table 1 (grains and oilseeds);
 * Potash Development Association (2020) 'Nutrients in crop material' = AHDB RB209 (2020) P2O5
 * and K2O offtakes (pulses, forage, roots); Agriculture Victoria (2017) hay removal table; USDA
 * standard bushel weights. All seen; see each row.
 */
import removalData from "../../data/bands/removal.json";
import bushelData from "../../data/bands/bushel-weights.json";
import { SoilError, listWords } from "../errors";
import { nameTable, normaliseWord } from "../names";
import { convertRate, unitOfFamily, unitsOf } from "../units";
import { formFactor } from "../chemistry";
import { BOUNDS, check, finite } from "../validate";

/** A coefficient as printed: one value, or the two ends of a printed range. */
type Coefficient = number | readonly [number, number];

/** One crop's removal row as stored in removal.json. */
export interface RemovalRow {
  readonly id: string;
  readonly aliases: readonly string[];
  readonly product: string;
  readonly basis: string;
  /** kg of nutrient (in the keyed form) per tonne of harvested product on `basis`. */
  readonly kg_per_t: Readonly<Record<string, Coefficient>>;
  readonly published_lb_per_bu?: Readonly<Record<string, Coefficient>>;
  readonly source: string;
  readonly seen_at: string;
  readonly status: string;
  readonly note?: string;
}

interface BushelRow {
  readonly crop: string;
  readonly lb_per_bu: number;
  readonly source: string;
}

export const REMOVAL_ROWS: readonly RemovalRow[] = removalData.crops as unknown as RemovalRow[];
const BUSHELS: readonly BushelRow[] = bushelData.crops as BushelRow[];

const CROPS = nameTable(REMOVAL_ROWS.map((r) => ({ id: r.id, aliases: r.aliases, value: r })));

/** Nutrient words accepted for the result, with the chemistry.ts form each one means. */
const NUTRIENT_FORMS = nameTable([
  { id: "N", aliases: ["nitrogen"], value: "N" },
  { id: "P", aliases: ["phosphorus"], value: "P" },
  { id: "P2O5", aliases: ["phosphate"], value: "P2O5" },
  { id: "K", aliases: ["potassium"], value: "K" },
  { id: "K2O", aliases: ["potash"], value: "K2O" },
  { id: "S", aliases: ["sulfur", "sulphur"], value: "S" },
  { id: "SO3", value: "SO3" },
  { id: "SO4", value: "SO4" },
  { id: "Ca", aliases: ["calcium"], value: "Ca" },
  { id: "CaO", value: "CaO" },
  { id: "Mg", aliases: ["magnesium"], value: "Mg" },
  { id: "MgO", value: "MgO" },
]);

const BUSHEL_WORDS = ["bu/ac", "bu/a", "bu/acre", "bushel/ac", "bushels/ac", "bushel/acre", "bushels/acre", "bu ac-1"].map(normaliseWord);

/** The crop words REMOVAL accepts (no @example: the result is a list). */
export function removalCrops(): string[] {
  return [...CROPS.ids];
}

function midpoint(c: Coefficient): number {
  return typeof c === "number" ? c : (c[0] + c[1]) / 2;
}

/**
 * The coefficient a crop row holds for the element of `form`, converted to that form:
 * kg of `form` per tonne of product. Midpoint of a printed range.
 * @param cropWord a crop id or alias from removal.json
 * @param nutrientWord N, P, P2O5, K, K2O, S, SO3, SO4, Ca, CaO, Mg or MgO
 * @returns kg of the nutrient, in the form asked, per t of product on the row's basis
 * @throws UNKNOWN_NAME for an unknown crop or nutrient word; NO_REFERENCE_DATA when the source
 *   gives no value for that element and crop (the message lists those it gives)
 * @example removalCoefficient("corn", "P") //=> 3.16411
 */
export function removalCoefficient(cropWord: string, nutrientWord: string): number {
  const row = CROPS.lookup(cropWord, "crop");
  const form = NUTRIENT_FORMS.lookup(nutrientWord, "nutrient");
  for (const [held, coeff] of Object.entries(row.kg_per_t)) {
    let factor: number;
    try {
      factor = formFactor(held, form);
    } catch (e) {
      // Stryker disable next-line ConditionalExpression,LogicalOperator: equivalent where the test is widened: every held key and every nutrient word is a form chemistry.ts knows (data test), so formFactor throws only UNIT_MISMATCH here
      if (e instanceof SoilError && e.code === "UNIT_MISMATCH") continue; // another element
      throw e;
    }
    // Stryker disable next-line StringLiteral: equivalent: coefficients and factors are finite data (data test), so this message never reaches a user
    return finite(midpoint(coeff) * factor, "the removal coefficient");
  }
  throw new SoilError(
    "NO_REFERENCE_DATA",
    `no ${form} removal value for ${row.id} in its source; it gives ${listWords(Object.keys(row.kg_per_t))}`,
  );
}

/**
 * Standard weight of a bushel of the crop, lb (USDA standard weights; see bushel-weights.json).
 * @throws UNKNOWN_NAME for an unknown crop; NO_REFERENCE_DATA where no bushel weight is held
 * @example removalBushelWeight("soybean") //=> 60
 */
export function removalBushelWeight(cropWord: string): number {
  const row = CROPS.lookup(cropWord, "crop");
  const b = BUSHELS.find((x) => x.crop === row.id);
  if (!b) {
    throw new SoilError(
      "NO_REFERENCE_DATA",
      `no bushel weight is held for ${row.id} (bushel weights exist for ${listWords(BUSHELS.map((x) => x.crop))}); give the yield in ${unitsOf("area_rate").join(", ")}`,
    );
  }
  return b.lb_per_bu;
}

/** A yield in t/ha from the yield and its unit: an area rate, or bu/ac through the crop's bushel weight. */
function yieldTonnesPerHa(cropWord: string, yieldValue: number, unitWord: string): number {
  if (BUSHEL_WORDS.includes(normaliseWord(unitWord))) {
    const lbPerAc = yieldValue * removalBushelWeight(cropWord);
    return convertRate(lbPerAc, "lb/ac", "t/ha");
  }
  const unit = unitOfFamily(unitWord, ["area_rate"], "yield_unit");
  return convertRate(yieldValue, unit.id, "t/ha");
}

/** What to give when the yield's unit is missing (core and binding say the same). */
export const REMOVAL_YIELD_UNIT_NEED = "the unit of the yield: t/ha, kg/ha, lb/ac, ton/ac, g/m2, or bu/ac for crops with a standard bushel weight";

/**
 * Nutrient exported in the harvested product (SOIL.REMOVAL).
 * @param cropWord crop id or alias (see removalCrops())
 * @param yieldValue harvested yield, ≥ 0, on the crop row's basis (moisture)
 * @param nutrientWord N, P, P2O5, K, K2O, S, SO3, SO4, Ca, CaO, Mg or MgO (elemental or oxide as asked)
 * @param yieldUnit required: t/ha, kg/ha, lb/ac, ton/ac, g/m2, or bu/ac (crops with a bushel weight)
 * @param rateUnit unit of the result: kg/ha (default), lb/ac, t/ha, ton/ac or g/m2
 * @returns nutrient removed, in rateUnit of the nutrient form asked
 * @throws OUT_OF_RANGE for a negative yield; UNKNOWN_NAME / UNIT_MISMATCH for a bad word or unit;
 *   NO_REFERENCE_DATA for a crop without that nutrient, or bu/ac for a crop without a bushel weight;
 *   MISSING_INPUT without a yield unit (a yield in bu/ac or kg/ha read as t/ha is far off)
 * @example removalAmount("corn", 10, "P2O5", "t/ha") //=> 72.5
 */
export function removalAmount(cropWord: string, yieldValue: number, nutrientWord: string, yieldUnit: string | undefined, rateUnit?: string): number {
  check(yieldValue, BOUNDS.nonNegative("yield"));
  if (yieldUnit === undefined || yieldUnit.trim() === "") throw new SoilError("MISSING_INPUT", `yield_unit is required: ${REMOVAL_YIELD_UNIT_NEED}`);
  const perTonne = removalCoefficient(cropWord, nutrientWord);
  const outUnit = unitOfFamily(rateUnit ?? "kg/ha", ["area_rate"], "rate_unit");
  const tHa = yieldTonnesPerHa(cropWord, yieldValue, yieldUnit);
  // convertRate refuses a result that is not finite itself (and the yield's own conversion to t/ha overflows before this product could).
  return convertRate(tHa * perTonne, "kg/ha", outUnit.id);
}

/** One entry of the list of removal coefficients, for `soilcell list` and help. */
export interface RemovalTableInfo {
  readonly crop: string;
  readonly aliases: readonly string[];
  readonly product: string;
  /** What one tonne of yield means (moisture basis). */
  readonly basis: string;
  /** Nutrient forms the source gives, e.g. ["N", "P2O5", "K2O"]. */
  readonly nutrients: readonly string[];
  /** Standard bushel weight in lb, where one is held (bu/ac yields accepted). */
  readonly lbPerBushel?: number;
  readonly source: string;
  readonly status: string;
}

/**
 * The built-in removal coefficients with their sources (for `soilcell list`).
 * @returns one entry per crop, in file order (no @example: the result is a list)
 */
export function removalTables(): RemovalTableInfo[] {
  return REMOVAL_ROWS.map((r) => ({
    crop: r.id,
    aliases: r.aliases,
    product: r.product,
    basis: r.basis,
    nutrients: Object.keys(r.kg_per_t),
    lbPerBushel: BUSHELS.find((b) => b.crop === r.id)?.lb_per_bu,
    source: r.source,
    status: `${r.status}; ${r.seen_at}`,
  }));
}
