/**
 * Cation exchange: CEC by summation, cation and base saturation, the Ca:Mg ratio and the
 * exchangeable sodium percentage (SAR of water and extracts is in sar.ts).
 *
 * Every cation is turned into charge (cmol(+)/kg) with the equivalent weights of chemistry.ts
 * (IUPAC/CIAAW atomic weights ÷ ion charge); no rounded divisor (200, 120, 390, 230) is typed in.
 * Exchangeable acidity (H + Al) and a measured CEC are always in cmol(+)/kg.
 *
 * Sources: summation and base saturation as worked in Clemson University Agricultural Service
 * Laboratory, "CEC calculations" (seen); ESP = 100 × Na / CEC, U.S. Salinity Laboratory Staff
 * (1954) USDA Handbook 60 (definition; from memory, also seen as a lab's definition).
 */
import { SoilError } from "../errors";
import { mgPerCmol } from "../chemistry";
import { nameTable } from "../names";
import { convertUnit, unitOfFamily, unitsOf, UnitDef } from "../units";
import { BOUNDS, check, finite } from "../validate";

/** The exchangeable bases summed into CEC and base saturation. */
export type BaseCation = "Ca" | "Mg" | "K" | "Na";

/** Unit families a lab may report exchangeable cations in. */
const CATION_FAMILIES = ["mass_fraction", "charge", "per_volume"] as const;

/** The unit words accepted for exchangeable cations, for help and messages. */
export function cecUnitWords(): string[] {
  return CATION_FAMILIES.flatMap((f) => unitsOf(f));
}

/** What to give when the cation unit is missing (core and binding say the same). */
export const CEC_UNIT_NEED = `the unit the lab reported the cations in (${cecUnitWords().join(", ")}); a guess between mg/kg and meq/100g is up to 200 times wrong`;

/**
 * The unit of exchangeable cations; required, because labs report mg/kg, meq/100 g and mmolc/kg
 * and a guess between them is up to 200 times wrong.
 */
function cationUnit(unitWord: string | undefined): UnitDef {
  if (unitWord === undefined || unitWord.trim() === "") {
    throw new SoilError("MISSING_INPUT", `unit is required: ${CEC_UNIT_NEED}`);
  }
  return unitOfFamily(unitWord, CATION_FAMILIES, "unit");
}

/**
 * One exchangeable cation in cmol(+)/kg, from the value and unit the lab reported.
 *
 * mg/kg (ppm), g/kg and % are divided by the ion's equivalent weight (mg/kg per cmol(+)/kg);
 * cmol(+)/kg (= meq/100 g) and mmolc/kg are charge already; mg/dm3 is first divided by the dry
 * bulk density to reach mg/kg.
 * @param value the cation as reported, ≥ 0
 * @param ion Ca, Mg, K or Na
 * @param unitWord required: mg/kg, ppm, g/kg, %, cmol(+)/kg, meq/100g, mmolc/kg or mg/dm3
 * @param bulkDensity dry bulk density, g/cm3 (> 0, ≤ 2.65); needed only for mg/dm3
 * @param argName the argument name shown in messages (default: the ion in lower case)
 * @returns cmol(+)/kg
 * @throws OUT_OF_RANGE for a negative value or a bad bulk density; UNKNOWN_NAME or UNIT_MISMATCH
 *   for a unit that is not a cation unit (UNIT_MISMATCH also for a bare cmol/kg or mmol/kg);
 *   MISSING_INPUT without a unit, or for mg/dm3 without bulk density
 * @example cecChargeOf(2000, "Ca", "mg/kg") //=> 9.98054
 * Source: equivalent weights from IUPAC/CIAAW standard atomic weights (see chemistry.ts).
 */
export function cecChargeOf(value: number, ion: BaseCation, unitWord: string | undefined, bulkDensity?: number, argName?: string): number {
  const unit = cationUnit(unitWord);
  check(value, { name: argName ?? ion.toLowerCase(), unit: unit.id, min: 0 });
  // Stryker disable next-line StringLiteral: equivalent: the charge units' factors (1 and 0.1 in units.json) cannot overflow a finite value; the check stays for a larger unit added there
  if (unit.family === "charge") return finite(value * unit.toBase, `${ion} in cmol(+)/kg`);
  const mgKg = unit.family === "per_volume" ? convertUnit(value, unit.id, "mg/kg", { bulkDensity }) : value * unit.toBase;
  return finite(mgKg / mgPerCmol(ion), `${ion} in cmol(+)/kg`);
}

function acidityOf(acidity: number | undefined): number {
  if (acidity === undefined) return 0;
  return check(acidity, BOUNDS.nonNegative("acidity", "cmol(+)/kg"));
}

/** The four bases in cmol(+)/kg, in the order Ca, Mg, K, Na. */
function basesOf(ca: number, mg: number, k: number, na: number, unitWord: string | undefined, bulkDensity?: number): Record<BaseCation, number> {
  return {
    Ca: cecChargeOf(ca, "Ca", unitWord, bulkDensity),
    Mg: cecChargeOf(mg, "Mg", unitWord, bulkDensity),
    K: cecChargeOf(k, "K", unitWord, bulkDensity),
    Na: cecChargeOf(na, "Na", unitWord, bulkDensity),
  };
}

const sumOf = (b: Record<BaseCation, number>) => b.Ca + b.Mg + b.K + b.Na;

/**
 * Cation exchange capacity by summation: Ca + Mg + K + Na (as charge) + exchangeable acidity.
 *
 * With acidity the exchangeable H + Al (e.g. KCl-extractable acidity) this is the effective CEC
 * (ECEC); with a buffer-pH estimate of acidity it approaches the CEC at that buffer's pH. On
 * calcareous or saline soils the extractant also dissolves carbonates and salts, so the sum can
 * overstate the true CEC.
 * @param ca exchangeable Ca in `unitWord`, ≥ 0
 * @param mg exchangeable Mg in `unitWord`, ≥ 0
 * @param k exchangeable K in `unitWord`, ≥ 0
 * @param na exchangeable Na in `unitWord`, ≥ 0
 * @param unitWord unit of ca, mg, k, na, required; see cecChargeOf
 * @param acidity exchangeable acidity (H + Al), cmol(+)/kg, ≥ 0; omitted = 0
 * @param bulkDensity dry bulk density, g/cm3; only for mg/dm3
 * @returns CEC, cmol(+)/kg (= meq/100 g)
 * @throws as cecChargeOf; OUT_OF_RANGE for negative acidity
 * @example cecSum(2000, 180, 150, 30, "mg/kg", 2) //=> 13.9759
 * Source: summation method as worked by Clemson University Agricultural Service Laboratory,
 * "CEC calculations" (seen), which uses rounded divisors; here IUPAC equivalent weights.
 */
export function cecSum(ca: number, mg: number, k: number, na: number, unitWord: string | undefined, acidity?: number, bulkDensity?: number): number {
  const bases = basesOf(ca, mg, k, na, unitWord, bulkDensity);
  return finite(sumOf(bases) + acidityOf(acidity), "CEC");
}

/** What part of the exchange capacity SOIL.SATURATION reports. */
export type SaturationPart = BaseCation | "acidity" | "bases";

const PARTS = nameTable<SaturationPart>([
  { id: "Ca", aliases: ["Ca2+", "calcium"], value: "Ca" },
  { id: "Mg", aliases: ["Mg2+", "magnesium"], value: "Mg" },
  { id: "K", aliases: ["K+", "potassium"], value: "K" },
  { id: "Na", aliases: ["Na+", "sodium"], value: "Na" },
  { id: "acidity", aliases: ["H+Al", "Al+H", "exchangeable acidity", "acid"], value: "acidity" },
  { id: "bases", aliases: ["base", "BS", "Ca+Mg+K+Na", "base saturation"], value: "bases" },
]);

/** The words accepted for `part`. */
export const SATURATION_PARTS: readonly string[] = PARTS.ids;

/**
 * Percent of the exchange capacity held by one cation, by the acidity or by the bases together.
 *
 * The denominator is the measured CEC when `cec` is given, otherwise the summed CEC (cecSum).
 * Against the summed CEC, Ca + Mg + K + Na + acidity saturations add up to 100 %. Against a
 * measured CEC the result is not capped: on calcareous, gypsic or saline soils the extractant
 * dissolves Ca, Mg and Na that are not exchangeable, so the bases can sum to more than the
 * measured CEC and saturation exceeds 100 %; such a value says the sum overstates the exchange
 * complex, not that the soil is "over-saturated".
 *
 * Base saturation against the summed CEC is 100 % by construction when acidity is left out, so
 * `bases` without a measured `cec` needs `acidity` (give 0 for a calcareous soil); `acidity`
 * always needs `acidity`.
 * @param partWord Ca, Mg, K, Na, acidity (H+Al) or bases (Ca+Mg+K+Na)
 * @param ca exchangeable Ca in `unitWord`, ≥ 0 (mg, k, na likewise)
 * @param unitWord unit of ca, mg, k, na, required
 * @param acidity exchangeable acidity (H + Al), cmol(+)/kg, ≥ 0; omitted = 0 (see above)
 * @param cec measured CEC, cmol(+)/kg, > 0; omitted = the summed CEC
 * @param bulkDensity dry bulk density, g/cm3; only for mg/dm3
 * @returns percent of the CEC (may exceed 100 against a measured CEC)
 * @throws UNKNOWN_NAME for an unknown part; MISSING_INPUT as above; OUT_OF_RANGE for negative
 *   inputs or cec ≤ 0; NOT_APPLICABLE when the summed CEC is 0 (nothing to divide by)
 * @example cecSaturation("bases", 2000, 180, 150, 30, "mg/kg", 2) //=> 85.69
 * Source: Clemson University Agricultural Service Laboratory, "CEC calculations" (seen);
 * saturation above 100 % where gypsum dissolves in the extractant: Exova, "Soil characteristics"
 * (lab method page, seen).
 */
export function cecSaturation(
  partWord: string,
  ca: number,
  mg: number,
  k: number,
  na: number,
  unitWord: string | undefined,
  acidity?: number,
  cec?: number,
  bulkDensity?: number,
): number {
  const part = PARTS.lookup(partWord, "part");
  const bases = basesOf(ca, mg, k, na, unitWord, bulkDensity);
  const acid = acidityOf(acidity);
  if (part === "acidity" && acidity === undefined) {
    throw new SoilError("MISSING_INPUT", "acidity saturation needs acidity (exchangeable H + Al in cmol(+)/kg)");
  }
  if (part === "bases" && acidity === undefined && cec === undefined) {
    throw new SoilError(
      "MISSING_INPUT",
      "base saturation against the summed CEC needs acidity (exchangeable H + Al in cmol(+)/kg; 0 for a calcareous soil) or a measured cec; without either it is 100 % by construction",
    );
  }
  let denominator: number;
  if (cec !== undefined) {
    denominator = check(cec, BOUNDS.positive("cec", "cmol(+)/kg"));
  } else {
    // Refused like cecSum's: an overflowing sum would turn every saturation into 0 %.
    denominator = finite(sumOf(bases) + acid, "CEC");
    if (denominator === 0) {
      throw new SoilError("NOT_APPLICABLE", "all cations and acidity are 0, so the summed CEC is 0 and a saturation is undefined");
    }
  }
  const held = part === "bases" ? sumOf(bases) : part === "acidity" ? acid : bases[part];
  return finite((100 * held) / denominator, "saturation");
}

/** Basis of the Ca:Mg ratio. */
export type RatioBasis = "charge" | "mass";

const BASES = nameTable<RatioBasis>([
  { id: "charge", aliases: ["equivalent", "equivalents", "meq", "cmol", "cmolc"], value: "charge" },
  { id: "mass", aliases: ["weight", "ppm", "mg"], value: "mass" },
]);

/**
 * Ratio of exchangeable Ca to Mg, on a charge basis (cmol(+) : cmol(+), default) or a mass basis
 * (mg : mg). The charge ratio is the mass ratio × (equivalent weight of Mg ÷ that of Ca), about
 * 0.606 × the mass ratio. A per-volume unit needs no bulk density: it cancels in the ratio.
 *
 * Balance ratios such as Ca:Mg have weak support as a basis for fertiliser decisions: within the
 * ranges common in soils, crop yield is generally not influenced by the Ca:Mg:K ratios, and
 * sufficiency levels of each nutrient are the better-supported basis (Kopittke & Menzies 2007).
 * @param ca exchangeable Ca in `unitWord`, ≥ 0
 * @param mg exchangeable Mg in `unitWord`, > 0 for a defined ratio
 * @param unitWord unit of ca and mg, required; any cation unit, both in the same unit
 * @param basisWord charge (default) or mass
 * @returns the Ca:Mg ratio (dimensionless)
 * @throws OUT_OF_RANGE for negative inputs; NOT_APPLICABLE when mg is 0; UNKNOWN_NAME for a
 *   basis or unit not listed; MISSING_INPUT without a unit
 * @example cecCaMgRatio(2000, 180, "mg/kg", "charge") //=> 6.73825
 * Source: charge basis as used by Crop File 1.04.132 "What is base saturation" ("ratios are
 * calculated on charge equivalent basis", seen); critique: Kopittke P.M. & Menzies N.W. (2007)
 * A review of the use of the basic cation saturation ratio and the "ideal" soil. Soil Sci. Soc.
 * Am. J. 71:259–265, doi:10.2136/sssaj2006.0186 (abstract seen at UQ eSpace; conclusion quoted
 * in SARE, Building Soils for Better Crops, 3rd ed., seen).
 */
export function cecCaMgRatio(ca: number, mg: number, unitWord: string | undefined, basisWord?: string): number {
  const unit = cationUnit(unitWord);
  const basis = BASES.lookup(basisWord ?? "charge", "basis");
  check(ca, { name: "ca", unit: unit.id, min: 0 });
  check(mg, { name: "mg", unit: unit.id, min: 0 });
  if (mg === 0) throw new SoilError("NOT_APPLICABLE", "mg is 0, so the Ca:Mg ratio is undefined");
  const eqCa = mgPerCmol("Ca");
  const eqMg = mgPerCmol("Mg");
  const massRatio = unit.family === "charge" ? (ca * eqCa) / (mg * eqMg) : ca / mg;
  const chargeRatio = unit.family === "charge" ? ca / mg : ca / eqCa / (mg / eqMg);
  return finite(basis === "charge" ? chargeRatio : massRatio, "Ca:Mg ratio");
}

/**
 * Exchangeable sodium percentage: 100 × exchangeable Na ÷ CEC, both as charge.
 * Not capped: Na above the CEC (soluble Na counted as exchangeable) gives more than 100 %.
 * @param na exchangeable Na in `unitWord`, ≥ 0
 * @param cec CEC, cmol(+)/kg, > 0 (whatever unit na is in)
 * @param unitWord unit of na, required
 * @param bulkDensity dry bulk density, g/cm3; only for mg/dm3
 * @returns ESP, %
 * @throws as cecChargeOf; OUT_OF_RANGE for cec ≤ 0
 * @example cecEsp(2, 20, "cmol(+)/kg") //=> 10
 * Source: U.S. Salinity Laboratory Staff (1954) USDA Agriculture Handbook 60 (Richards, ed.),
 * definition of ESP (from memory); same definition on Exova, "Soil characteristics" (seen).
 */
export function cecEsp(na: number, cec: number, unitWord: string | undefined, bulkDensity?: number): number {
  const naC = cecChargeOf(na, "Na", unitWord, bulkDensity, "na");
  check(cec, BOUNDS.positive("cec", "cmol(+)/kg"));
  return finite((100 * naC) / cec, "ESP");
}


// ---------------------------------------------------------------------------------------------
// Column kernels: the same computations over a column of samples, with the unit word, the part
// and the equivalent weights read once per column instead of once per sample. Every sample gets
// every check its scalar function makes; a sample that fails one is handed to the scalar function,
// so its error (code and message) is exactly the one a single cell gives.

/** Numbers of one argument: a column (one per sample) or one value for every sample. */
export type ColumnOf = ArrayLike<number> | number | undefined;

/** A column kernel's results: a number per sample, and the error a sample gets instead (its number is then NaN). */
export interface ColumnResult {
  readonly values: Float64Array;
  readonly errors: Map<number, SoilError>;
}

const at = (x: ColumnOf, i: number): number | undefined => (typeof x === "number" || x === undefined ? x : (x[i] as number));

/** A column as a Float64Array of n (a shared value repeated), so the kernel's loop reads one kind of array. */
function dense(x: ColumnOf, n: number): Float64Array {
  if (x === undefined) return new Float64Array(n); // an absent acidity or cec: zeros, never read as a sample
  if (typeof x === "number") return new Float64Array(n).fill(x);
  // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: only whether a column is read in place or copied first; each sample is read once either way, and one past a short column's end reads as undefined or NaN, both sent to the scalar function
  if (x instanceof Float64Array && x.length >= n) return x;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = x[i] as number;
  return out;
}

/** What check() with min 0 accepts: finite and not negative (NaN is neither). */
const usable = (x: number): boolean => x >= 0 && x < Infinity;

/**
 * From the reported unit to cmol(+)/kg: value × toBase ÷ divisor per ion (divisor 1 for a charge
 * unit), computed in the order cecChargeOf computes it so results agree to the last bit; undefined
 * for a per-volume unit (it needs a bulk density per sample).
 */
function chargeFactors(unitWord: string | undefined): { toBase: number; Ca: number; Mg: number; K: number; Na: number } | undefined {
  const unit = cationUnit(unitWord);
  if (unit.family === "per_volume") return undefined;
  const d = (ion: BaseCation) => (unit.family === "charge" ? 1 : mgPerCmol(ion));
  return { toBase: unit.toBase, Ca: d("Ca"), Mg: d("Mg"), K: d("K"), Na: d("Na") };
}

/** `e` if it is a refusal (SoilError); anything else is a fault, thrown on rather than kept as a sample's error. */
function refusal(e: unknown): SoilError {
  if (e instanceof SoilError) return e;
  throw e;
}

/** Runs a scalar function for one sample, its SoilError kept. */
function fallback(out: ColumnResult, i: number, f: () => number): void {
  try {
    out.values[i] = f();
  } catch (e) {
    out.errors.set(i, refusal(e));
    out.values[i] = NaN;
  }
}

/**
 * cecSum over `n` samples.
 * @returns one result per sample: the CEC in cmol(+)/kg, or (in `errors`) the SoilError cecSum gives that sample
 * @example cecSumColumn([2000], [180], [150], [30], "mg/kg", [2], undefined, 1).values[0] //=> 13.9759
 * Source: as cecSum.
 */
export function cecSumColumn(ca: ColumnOf, mg: ColumnOf, k: ColumnOf, na: ColumnOf, unitWord: string | undefined, acidity: ColumnOf, bulkDensity: ColumnOf, n: number): ColumnResult {
  const out: ColumnResult = { values: new Float64Array(n), errors: new Map() };
  const scalar = (i: number) => () => cecSum(at(ca, i) as number, at(mg, i) as number, at(k, i) as number, at(na, i) as number, unitWord, at(acidity, i), at(bulkDensity, i));
  let f: ReturnType<typeof chargeFactors>;
  try {
    f = chargeFactors(unitWord);
  } catch (e) {
    const refused = refusal(e);
    out.values.fill(NaN);
    for (let i = 0; i < n; i++) out.errors.set(i, refused);
    return out;
  }
  if (!f) {
    for (let i = 0; i < n; i++) fallback(out, i, scalar(i));
    return out;
  }
  // A charge unit's divisors are 1, and x / 1 is x exactly, so one formula serves both families.
  const { toBase: t, Ca, Mg, K, Na } = f;
  const A = dense(ca, n);
  const B = dense(mg, n);
  const C = dense(k, n);
  const D = dense(na, n);
  const H = dense(acidity, n);
  const values = out.values;
  for (let i = 0; i < n; i++) {
    const a = A[i] as number;
    const b = B[i] as number;
    const c = C[i] as number;
    const d = D[i] as number;
    const h = H[i] as number;
    // The checks cecSum makes: each cation and the acidity (0 when absent) finite and not negative.
    if (!(usable(a) && usable(b) && usable(c) && usable(d) && usable(h))) {
      fallback(out, i, scalar(i));
      continue;
    }
    const sum = (a * t) / Ca + (b * t) / Mg + (c * t) / K + (d * t) / Na + h;
    if (sum < Infinity) values[i] = sum;
    else fallback(out, i, scalar(i));
  }
  return out;
}

/**
 * cecSaturation over `n` samples.
 * @returns one result per sample: percent of the CEC, or (in `errors`) the SoilError cecSaturation gives that sample
 * @example cecSaturationColumn("bases", [2000], [180], [150], [30], "mg/kg", [2], undefined, undefined, 1).values[0] //=> 85.69
 * Source: as cecSaturation.
 */
export function cecSaturationColumn(
  partWord: string,
  ca: ColumnOf,
  mg: ColumnOf,
  k: ColumnOf,
  na: ColumnOf,
  unitWord: string | undefined,
  acidity: ColumnOf,
  cec: ColumnOf,
  bulkDensity: ColumnOf,
  n: number,
): ColumnResult {
  const out: ColumnResult = { values: new Float64Array(n), errors: new Map() };
  const scalar = (i: number) => () =>
    cecSaturation(partWord, at(ca, i) as number, at(mg, i) as number, at(k, i) as number, at(na, i) as number, unitWord, at(acidity, i), at(cec, i), at(bulkDensity, i));
  let f: ReturnType<typeof chargeFactors>;
  let part: SaturationPart;
  try {
    part = PARTS.lookup(partWord, "part");
    f = chargeFactors(unitWord);
  } catch (e) {
    const refused = refusal(e);
    out.values.fill(NaN);
    for (let i = 0; i < n; i++) out.errors.set(i, refused);
    return out;
  }
  if (!f || (part === "acidity" && acidity === undefined) || (part === "bases" && acidity === undefined && cec === undefined)) {
    for (let i = 0; i < n; i++) fallback(out, i, scalar(i));
    return out;
  }
  const { toBase: t, Ca, Mg, K, Na } = f; // divisors 1 for a charge unit, as in cecSumColumn
  const A = dense(ca, n);
  const B = dense(mg, n);
  const C = dense(k, n);
  const D = dense(na, n);
  const H = dense(acidity, n);
  const hasCec = cec !== undefined;
  const M = dense(cec, n);
  const which = part === "bases" ? 0 : part === "acidity" ? 1 : part === "Ca" ? 2 : part === "Mg" ? 3 : part === "K" ? 4 : 5;
  const values = out.values;
  for (let i = 0; i < n; i++) {
    const a = A[i] as number;
    const b = B[i] as number;
    const c = C[i] as number;
    const d = D[i] as number;
    const h = H[i] as number;
    const m = M[i] as number;
    // The checks cecSaturation makes: cations and acidity (0 when absent) finite and not negative, a measured CEC
    // above 0 (an infinite one is caught with the denominator below).
    if (!(usable(a) && usable(b) && usable(c) && usable(d) && usable(h) && (!hasCec || m > 0))) {
      fallback(out, i, scalar(i));
      continue;
    }
    const cCa = (a * t) / Ca;
    const cMg = (b * t) / Mg;
    const cK = (c * t) / K;
    const cNa = (d * t) / Na;
    const bases = cCa + cMg + cK + cNa;
    const denominator = hasCec ? m : bases + h;
    // An ion's charge that overflows, or a summed CEC that does, is refused by the scalar function.
    if (!(bases < Infinity && denominator < Infinity)) {
      fallback(out, i, scalar(i));
      continue;
    }
    const held = which === 0 ? bases : which === 1 ? h : which === 2 ? cCa : which === 3 ? cMg : which === 4 ? cK : cNa;
    // A summed CEC of 0 (every input 0) gives 0 / 0 = NaN here, sent to the scalar function's refusal.
    const v = (100 * held) / denominator;
    if (v < Infinity) values[i] = v;
    else fallback(out, i, scalar(i));
  }
  return out;
}
