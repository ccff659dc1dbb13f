/**
 * Declared argument constraints, enforced in one place so every message reads the same.
 *
 * A core function declares the bounds of each parameter with a `Bound` and calls `check`; fuzz
 * tests can read the same bounds. Every percent argument has its plausible range declared here
 * once (`PERCENT`), with where the range comes from, so a fraction typed for a percent (Excel
 * stores a cell formatted as 95 % as 0.95) is refused with a hint instead of read as 0.95 %.
 */
import nitrogenChecks from "../data/nitrogen/checks.json";
import { SoilError } from "./errors";

export interface Bound {
  /** Argument name as the user sees it (the Excel parameter name). */
  readonly name: string;
  /** Unit shown in messages, e.g. "cmol(+)/kg". */
  readonly unit?: string;
  readonly min?: number;
  readonly max?: number;
  /** When true the bound excludes `min` itself (e.g. a bulk density must be > 0). */
  readonly minExclusive?: boolean;
  readonly maxExclusive?: boolean;
  /**
   * 0 (none) is accepted although below `min`: the range leaves out the values just above 0 where
   * a fraction and a real small percent cannot be told apart.
   */
  readonly zero?: boolean;
  /** What to do when a real value lies in that left-out gap (shown when one is refused). */
  readonly small?: string;
  /** Where the range comes from: its source, or "common practice". */
  readonly basis?: string;
}

function describe(b: Bound): string {
  return b.zero ? `0, or ${describeRange(b)}` : describeRange(b);
}

function describeRange(b: Bound): string {
  const u = b.unit ? ` ${b.unit}` : "";
  if (b.min !== undefined && b.max !== undefined) {
    const lo = b.minExclusive ? "above" : "from";
    const hi = b.maxExclusive ? "to below" : "to";
    return `${lo} ${b.min} ${hi} ${b.max}${u}`;
  }
  if (b.min !== undefined) return b.minExclusive ? `greater than ${b.min}${u}` : `at least ${b.min}${u}`;
  if (b.max !== undefined) return b.maxExclusive ? `less than ${b.max}${u}` : `at most ${b.max}${u}`;
  // Stryker disable next-line StringLiteral: equivalent: describeRange is used only for a refused finite value, and a bound with neither min nor max refuses none
  return "a finite number";
}

function within(value: number, b: Bound): boolean {
  const { min, max } = b;
  // Stryker disable next-line ConditionalExpression: equivalent for true: a number compared with undefined is never below it
  const low = min !== undefined && (b.minExclusive ? value <= min : value < min);
  // Stryker disable next-line ConditionalExpression: equivalent for true: a number compared with undefined is never above it
  const high = max !== undefined && (b.maxExclusive ? value >= max : value > max);
  return !low && !high;
}

const shown = (v: number) => String(Number(v.toPrecision(12)));

/** The hints for a refused percent: it looks like a fraction, or it is a real value in the gap. */
function percentHints(value: number, b: Bound): string[] {
  // Stryker disable next-line EqualityOperator: equivalent for value < 0: a refused 0 is out of the range (a range that holds 0, or allows it as none, never reaches here), so 0 × 100 gets no fraction hint, and it is never above a min for the advice
  if (b.unit !== "%" || value <= 0) return [];
  const hints: string[] = [];
  const pct = shown(value * 100);
  if (within(value * 100, b)) hints.push(`${shown(value)} looks like a fraction; enter ${pct} for ${pct} %`);
  if (b.zero && b.small && b.min !== undefined && value <= b.min) hints.push(b.small);
  return hints;
}

/**
 * Throws OUT_OF_RANGE unless `value` is finite and within `bound`; returns the value. A refused
 * percent says when it looks like a fraction ("0.95 looks like a fraction; enter 95 for 95 %").
 */
export function check(value: number, bound: Bound): number {
  if (!Number.isFinite(value)) {
    throw new SoilError("OUT_OF_RANGE", `${bound.name} must be a finite number (got ${value})`);
  }
  if (bound.zero && value === 0) return value;
  if (!within(value, bound)) {
    const u = bound.unit ? ` ${bound.unit}` : "";
    const hints = percentHints(value, bound).map((h) => `; ${h}`).join("");
    throw new SoilError("OUT_OF_RANGE", `${bound.name} must be ${describe(bound)} (got ${value}${u})${hints}`);
  }
  return value;
}

/** Common bounds, reused so the wording is the same everywhere. */
export const BOUNDS = {
  nonNegative: (name: string, unit?: string): Bound => ({ name, unit, min: 0 }),
  positive: (name: string, unit?: string): Bound => ({ name, unit, min: 0, minExclusive: true }),
  ph: (name: string): Bound => ({ name, min: 0, max: 14 }),
  /** Bulk density of mineral and organic soils; > 0 and at most 2.65 g/cm3 (particle density of quartz). */
  bulkDensity: (name = "bulk_density"): Bound => ({ name, unit: "g/cm3", min: 0, minExclusive: true, max: 2.65 }),
  /** Sampling or incorporation depth, > 0 and at most 300 cm. */
  depth: (name = "depth_cm"): Bound => ({ name, unit: "cm", min: 0, minExclusive: true, max: 300 }),
} as const;

const WEAKEST_LIMING_MATERIAL =
  "by-product liming materials run from about 22 % ECCE (wood ash, 22-49 %: Commun. Soil Sci. Plant Anal. 2017, doi:10.1080/00103624.2017.1421643, abstract seen) and 37 % CCE on average (paper-mill boiler ash: Muse & Mitchell 1995, Agron. J. 87:432-438, abstract seen)";

/**
 * Plausible ranges of every percent argument, declared once. Each range leaves out the values a
 * fraction of a real percent would take (Excel keeps a cell shown as 95 % as 0.95), so such a
 * value is refused with a hint instead of read as 0.95 %. Where real values also reach down to
 * about 0, the range keeps 0 (none) and leaves out only the values just above it, with advice
 * for a real value there (`small`). Each bound is tested at, just inside and just outside it.
 */
export const PERCENT = {
  /** Calcium carbonate equivalent of a liming product, % (LIMEPRODUCT). */
  cce: {
    name: "cce_pct",
    unit: "%",
    min: 5,
    max: 250,
    basis: `top: MgO, the strongest liming compound, is 248 % CCE (UNL PASSEL soil-acidity lesson, Table 4.4, seen; stoichiometry); bottom: ${WEAKEST_LIMING_MATERIAL}; 5 % chosen below them (common practice). As a fraction every product is at most 2.5, so none passes`,
  },
  /** Fineness efficiency of a liming product, % (LIMEPRODUCT). */
  fineness: {
    name: "fineness_pct",
    unit: "%",
    min: 1,
    minExclusive: true,
    max: 100,
    basis: "definition: 0-100 %; 1 % or less is refused because it is what a fraction of 100 % or less looks like, and a material that fine-rated is no liming material (it would need over 100 times its CCE rate)",
  },
  /** Water in a liming product as received, % of its wet mass (LIMEPRODUCT). */
  moisture: {
    name: "moisture_pct",
    unit: "%",
    min: 1,
    max: 100,
    maxExclusive: true,
    zero: true,
    small: "if the product really holds less than 1 % water, enter 0 (it changes the rate by less than 1 %)",
    basis: "definition: below 100 % of the wet mass; dry agricultural lime holds well under 1 % water while wet by-products hold tens of %, so values between 0 and 1 are refused as fractions and 0 is kept for a dry product (common practice)",
  },
  /** Al saturation of the effective CEC the crop tolerates, % (LIMEALSAT). */
  targetAlSat: {
    name: "target_al_sat",
    unit: "%",
    min: 1,
    max: 100,
    zero: true,
    small: "for a crop that tolerates less than 1 % Al saturation, enter 0",
    basis: "definition (% of Al + Ca + Mg); Cochrane, Salinas & Sanchez (1980) express crop tolerance as a percentage Al saturation (abstract seen); values between 0 and 1 are refused as fractions (a crop tolerating 100 % is none) and 0 is kept (common practice)",
  },
  /** Current base saturation V1, % of the CEC at pH 7 (LIMEBASESAT). */
  baseSat: {
    name: "base_sat",
    unit: "%",
    min: 1,
    minExclusive: true,
    max: 100,
    zero: true,
    small: "if the base saturation really is 1 % or less, enter 0 (the lime differs by at most cec/100 t/ha)",
    basis: "definition 0-100 %; real soils reach single figures (5.9 % under forest at 10-20 cm in a Brazilian class data set seen at trabalhosfeitos.com), so only values in (0, 1], where a fraction of 100 % or less lies, are refused (common practice)",
  },
  /** Target base saturation V2, % (LIMEBASESAT). */
  targetBaseSat: {
    name: "target_base_sat",
    unit: "%",
    min: 20,
    max: 100,
    basis: "targets published for the method are 60 % (Parana) and 70 % (Sao Paulo) (agronomiacomgismonti page on the base-saturation method, seen); 20 % chosen well below any target seen (common practice)",
  },
  /** Percent of legume N derived from the atmosphere (NFIXED). */
  ndfa: {
    name: "ndfa_pct",
    unit: "%",
    min: 1,
    minExclusive: true,
    max: 100,
    zero: true,
    small: "if %Ndfa really is 1 % or less, enter 0 (fixed N differs by at most 1 % of the shoot N)",
    basis: "definition 0-100 %; field values span the whole range (sub clover 0-100 % in southwest Australia: Unkovich et al. 1994, authors from memory, abstract seen), so only values in (0, 1], where a fraction of 100 % or less lies, are refused (common practice)",
  },
  /** N concentration of legume shoots or grain, % of dry matter (NFIXED, NBALANCE). */
  plantN: (name: string): Bound => ({
    name,
    unit: "%",
    min: 0.2,
    max: nitrogenChecks.tissue.max_n_pct.value,
    zero: true,
    small: "0 means none (e.g. no grain harvested); a real N concentration is at least 0.2 %",
    basis: "0 is kept for none (no grain harvested, as before); bottom: wheat straw, about the poorest plant tissue harvested, holds about 0.5 % N (9-12 lb N per ton: Lentz & Lindsey, Ohio State C.O.R.N. newsletter, 'Nutrient value of wheat straw', seen at farms.com; '0.5 per cent nitrogen or less': Grainews, seen), so 0.2 % is below any shoot or grain; top: about 16 % N in pure protein (nitrogen/checks.json). As a fraction, N % is at most 0.16",
  }),
} as const satisfies Record<string, Bound | ((name: string) => Bound)>;

/**
 * True when a list of percentages looks like fractions of 1: every value at most 1 and one above 0
 * (no @example: the result is a boolean).
 */
export function percentListLooksFractional(values: readonly number[]): boolean {
  return values.some((v) => v > 0) && values.every((v) => v <= 1);
}

/** Throws if the result of a computation is not a finite number; no NaN or Infinity leaves core. */
export function finite(value: number, what: string): number {
  if (!Number.isFinite(value)) {
    throw new SoilError("OUT_OF_RANGE", `${what} cannot be computed for these inputs (result is not finite)`);
  }
  return value;
}

/** A plain decimal number as text: optional sign, digits with an optional full stop, optional exponent. */
const NUMERIC_TEXT = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/**
 * The number a cell's text states ("12.5", " -.5 ", "1e3"), or undefined for any other text
 * (a unit, a comma, a censoring sign: no guessing). Spaces at either end are ignored. Text beyond
 * the range of doubles ("1e999") reads as ±Infinity: every caller refuses it with its own message.
 */
export function numericText(text: string): number | undefined {
  const t = text.trim();
  return NUMERIC_TEXT.test(t) ? Number(t) : undefined;
}

/** Why a text a user typed as a number is not one, when the text says: a censored value or a decimal comma. */
export function notANumberHint(text: string): string {
  const t = text.trim();
  if (/^[<>]/.test(t)) return " (a below- or above-detection value is your call: enter a number or leave the cell blank)";
  if (/\d,\d/.test(t)) return " (use a full stop as the decimal separator)";
  return "";
}
