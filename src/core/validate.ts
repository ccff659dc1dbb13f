/**
 * Declared argument constraints, enforced in one place so every message reads the same.
 *
 * A core function declares the bounds of each parameter with a `Bound` and calls `check`; fuzz
 * tests can read the same bounds.
 */
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
}

function describe(b: Bound): string {
  const u = b.unit ? ` ${b.unit}` : "";
  if (b.min !== undefined && b.max !== undefined) {
    const lo = b.minExclusive ? "above" : "from";
    const hi = b.maxExclusive ? "below" : "to";
    return `${lo} ${b.min} ${hi} ${b.max}${u}`;
  }
  if (b.min !== undefined) return b.minExclusive ? `greater than ${b.min}${u}` : `at least ${b.min}${u}`;
  if (b.max !== undefined) return b.maxExclusive ? `less than ${b.max}${u}` : `at most ${b.max}${u}`;
  return "a finite number";
}

/** Throws OUT_OF_RANGE unless `value` is finite and within `bound`; returns the value. */
export function check(value: number, bound: Bound): number {
  if (!Number.isFinite(value)) {
    throw new SoilError("OUT_OF_RANGE", `${bound.name} must be a finite number (got ${value})`);
  }
  const { min, max } = bound;
  const low = min !== undefined && (bound.minExclusive ? value <= min : value < min);
  const high = max !== undefined && (bound.maxExclusive ? value >= max : value > max);
  if (low || high) {
    const u = bound.unit ? ` ${bound.unit}` : "";
    throw new SoilError("OUT_OF_RANGE", `${bound.name} must be ${describe(bound)} (got ${value}${u})`);
  }
  return value;
}

/** Common bounds, reused so the wording is the same everywhere. */
export const BOUNDS = {
  nonNegative: (name: string, unit?: string): Bound => ({ name, unit, min: 0 }),
  positive: (name: string, unit?: string): Bound => ({ name, unit, min: 0, minExclusive: true }),
  percent: (name: string): Bound => ({ name, unit: "%", min: 0, max: 100 }),
  ph: (name: string): Bound => ({ name, min: 0, max: 14 }),
  /** Bulk density of mineral and organic soils; > 0 and at most 2.65 g/cm3 (particle density of quartz). */
  bulkDensity: (name = "bulk_density"): Bound => ({ name, unit: "g/cm3", min: 0, minExclusive: true, max: 2.65 }),
  /** Sampling or incorporation depth, > 0 and at most 300 cm. */
  depth: (name = "depth_cm"): Bound => ({ name, unit: "cm", min: 0, minExclusive: true, max: 300 }),
} as const;

/** Throws if the result of a computation is not a finite number; no NaN or Infinity leaves core. */
export function finite(value: number, what: string): number {
  if (!Number.isFinite(value)) {
    throw new SoilError("OUT_OF_RANGE", `${what} cannot be computed for these inputs (result is not finite)`);
  }
  return value;
}
