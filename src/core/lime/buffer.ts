/**
 * Single-buffer lime requirement (SOIL.LIMEBUFFER): a built-in calibration (SMP, SIKORA-OR2025,
 * MEHLICH) or the consultant's own table passed as a range.
 *
 * Built-in results are pure CaCO3 equivalent for the calibration's depth, scaled in proportion
 * to a given depth, in t/ha unless another unit is asked for. A table made for a product of
 * stated neutralizing value is converted to pure CaCO3 (rate × NV / 100). A range's result is in
 * the range's own unit and depth, so depth_cm and unit must then be blank.
 *
 * Sources: Moore (2025) OSU Extension EM 9585, Table 1 (seen); NCDA&CS lime factor table page,
 * Mehlich buffer acidity (seen). The SMP table (Shoemaker, McLean & Pratt 1961) is not shipped.
 */
import { SoilError } from "../errors";
import {
  LIME_CALIBRATION_NEED,
  LimeCalibration,
  LimeMehlichCalibration,
  LimeTableCalibration,
  limeCalibration,
} from "./calibrations";
import { LIME_DEFAULT_UNIT, limeDepth } from "./rate";
import { LimeRange, limeTableCheckBufferPh, limeTableFromRange, limeTableRate } from "./table";
import { convertRate } from "../units";
import { BOUNDS, check, finite } from "../validate";

export interface LimeBufferOptions {
  /** A built-in name, or a range holding a table (a 1×1 range holding text is a name). Required. */
  readonly calibration?: string | LimeRange;
  /** Current soil pH; needed by MEHLICH; with any calibration a target ≤ soil pH gives 0. */
  readonly soilPh?: number;
  /** Depth to lime, cm (> 0, ≤ 300); default the calibration's depth. Not with a range. */
  readonly depthCm?: number;
  /** t/ha (default), ton/ac, kg/ha or lb/ac. Not with a range. */
  readonly unit?: string;
}

function mehlichOf(): LimeMehlichCalibration {
  return limeCalibration("MEHLICH") as LimeMehlichCalibration;
}

/**
 * Acidity from the Mehlich buffer pH, meq/100 cm3: (6.6 − BpH) × 4.
 * @param bufferPh Mehlich buffer pH, 0–6.6
 * @returns acidity (Ac), meq/100 cm3 of soil
 * @throws OUT_OF_RANGE for a buffer pH above the buffer's reference pH 6.6 or below 0
 * @example limeMehlichAcidity(6.3) //=> 1.2
 * Source: NCDA&CS Agronomic Division, lime factor table page (seen).
 */
export function limeMehlichAcidity(bufferPh: number): number {
  const m = mehlichOf();
  check(bufferPh, { name: "buffer_ph", min: 0, max: m.referencePh });
  // Stryker disable next-line StringLiteral: equivalent: unreachable, bufferPh is checked finite within 0–6.6 and the constants are finite, so the product is finite
  return finite((m.referencePh - bufferPh) * m.acidityPerBufferPhUnit, "the Mehlich buffer acidity");
}

/**
 * The NCDA&CS lime factor: (target pH − soil pH) / (6.6 − soil pH); 0 when target ≤ soil pH.
 * @param soilPh current soil pH, 0–14
 * @param targetPh target pH, at most 6.6 when above the soil pH
 * @returns the factor, 0–1
 * @throws OUT_OF_RANGE for a target above 6.6 that is above the soil pH (the formula would extrapolate)
 * @example limeMehlichFactor(5.0, 6.0) //=> 0.625
 * Source: NCDA&CS Agronomic Division, lime factor table page (seen).
 */
export function limeMehlichFactor(soilPh: number, targetPh: number): number {
  const m = mehlichOf();
  check(soilPh, BOUNDS.ph("soil_ph"));
  check(targetPh, BOUNDS.ph("target_ph"));
  if (targetPh <= soilPh) return 0;
  check(targetPh, { name: "target_ph", min: 0, max: m.referencePh });
  // Stryker disable next-line StringLiteral: equivalent: unreachable, soilPh < targetPh <= 6.6 here, so the divisor is at least the numerator and above 0
  return finite((targetPh - soilPh) / (m.referencePh - soilPh), "the Mehlich lime factor");
}

/**
 * NCDA&CS lime rate from Mehlich buffer acidity, US tons of lime per acre: Ac × factor
 * (no residual credit; subtract one yourself). The source's worked example (pH 5.0 → 6.0,
 * Ac 1.2) prints 0.76, where the formula gives 0.75; this returns the formula.
 * @param bufferPh Mehlich buffer pH, 0–6.6
 * @param targetPh target pH, at most 6.6
 * @param soilPh current soil pH
 * @returns ton/ac of lime as NCDA&CS states it (its lime basis and depth are not stated in the text seen)
 * @example limeMehlichRate(6.3, 6.0, 5.0) //=> 0.75
 * Source: NCDA&CS Agronomic Division, lime factor table page (seen).
 */
export function limeMehlichRate(bufferPh: number, targetPh: number, soilPh: number): number {
  const acidity = limeMehlichAcidity(bufferPh);
  // Stryker disable next-line StringLiteral: equivalent: unreachable, both factors are finite (acidity 0–26.4, factor 0–1)
  return finite(acidity * limeMehlichFactor(soilPh, targetPh), "the Mehlich lime rate");
}

/** What the calibration argument names: a built-in, or a table of the user's. */
function resolve(calibration: string | LimeRange | undefined): LimeCalibration | { kind: "range"; range: LimeRange } {
  const none = () => new SoilError("MISSING_INPUT", `calibration is required: ${LIME_CALIBRATION_NEED}`);
  if (calibration === undefined) throw none();
  if (typeof calibration === "string") {
    if (calibration.trim() === "") throw none();
    return limeCalibration(calibration);
  }
  const single = calibration.length === 1 && (calibration[0] ?? []).length === 1;
  if (single) {
    const cell = calibration[0]![0];
    if (cell === null || cell === undefined || (typeof cell === "string" && cell.trim() === "")) throw none();
    if (typeof cell === "string") return limeCalibration(cell);
    throw new SoilError(
      "SHAPE_MISMATCH",
      `calibration must be the name of a built-in calibration (SMP, SIKORA-OR2025, MEHLICH) or a range holding a table, not the single value ${String(cell)}`,
    );
  }
  return { kind: "range", range: calibration };
}

/**
 * The rate a built-in style calibration table gives, converted to pure CaCO3 equivalent
 * (rate × neutralizing value / 100), scaled from the calibration depth to the depth asked for and
 * expressed in the unit asked for. Used for the built-in tables; exported so the basis and depth
 * rules can be checked with any table.
 * @param c the calibration: its table, unit, depth (cm) and basis neutralizing value (%)
 * @param bufferPh soil-buffer pH within the table
 * @param targetPh target pH within the table
 * @param opts soilPh (target ≤ soil pH gives 0), depthCm, unit (default t/ha)
 * @returns pure CaCO3 equivalent in `unit`
 * @throws OUT_OF_RANGE outside the table; NOT_APPLICABLE for depth_cm when the depth is not stated
 * @example limeBufferTableRate({ kind: "table", id: "T", source: "invented", unit: "ton/ac", depthCm: 20, neutralizingValuePct: 90, status: "invented", table: { name: "T", bufferPh: [6, 7], targetPh: [6.5], rates: [[2], [0]] } }, 6, 6.5, { unit: "ton/ac" }) //=> 1.8
 */
export function limeBufferTableRate(c: LimeTableCalibration, bufferPh: number, targetPh: number, opts: LimeBufferOptions = {}): number {
  if (c.table === undefined) throw new SoilError("NO_REFERENCE_DATA", `the ${c.id} table is not shipped`);
  const table = c.table;
  limeTableCheckBufferPh(table, bufferPh);
  // Stryker disable next-line ConditionalExpression: equivalent for true: a number compared with undefined is never at or below it
  const reached = opts.soilPh !== undefined && targetPh <= opts.soilPh;
  // The published rate is for material of the table's neutralizing value: express it as pure CaCO3.
  // Zero still goes through the depth and unit checks below, so a bad argument is not hidden.
  const pure = reached ? 0 : (limeTableRate(table, bufferPh, targetPh) * c.neutralizingValuePct) / 100;
  const calDepth = c.depthCm;
  if (calDepth === undefined) {
    if (opts.depthCm !== undefined) throw new SoilError("NOT_APPLICABLE", `the ${c.id} source does not state its depth, so depth_cm cannot be scaled; leave it blank`);
    return convertRate(pure, c.unit, opts.unit ?? LIME_DEFAULT_UNIT);
  }
  const depth = limeDepth(opts.depthCm, calDepth);
  return convertRate((pure * depth) / calDepth, c.unit, opts.unit ?? LIME_DEFAULT_UNIT);
}

function fromMehlich(c: LimeMehlichCalibration, bufferPh: number, targetPh: number, opts: LimeBufferOptions): number {
  if (opts.soilPh === undefined) {
    throw new SoilError("MISSING_INPUT", "soil_ph is needed: the MEHLICH calibration computes lime from the buffer acidity and the current soil pH");
  }
  if (opts.depthCm !== undefined) {
    throw new SoilError("NOT_APPLICABLE", "the MEHLICH (NCDA&CS) source does not state the depth its rates are for, so depth_cm cannot be scaled; leave it blank");
  }
  return convertRate(limeMehlichRate(bufferPh, targetPh, opts.soilPh), c.unit, opts.unit ?? LIME_DEFAULT_UNIT);
}

function fromRange(range: LimeRange, bufferPh: number, targetPh: number, opts: LimeBufferOptions): number {
  if (opts.depthCm !== undefined || opts.unit !== undefined) {
    throw new SoilError(
      "NOT_APPLICABLE",
      "with a calibration range the result is in the range's own unit and depth; leave depth_cm and unit blank (scale or convert the result yourself, e.g. with SOIL.CONVERT)",
    );
  }
  const table = limeTableFromRange(range);
  limeTableCheckBufferPh(table, bufferPh);
  // Stryker disable next-line ConditionalExpression: equivalent for true: a number compared with undefined is never at or below it
  if (opts.soilPh !== undefined && targetPh <= opts.soilPh) return 0;
  return limeTableRate(table, bufferPh, targetPh);
}

/**
 * Lime requirement from a single-buffer test: pure CaCO3 equivalent for the calibration's depth
 * (or the depth given), in t/ha unless another unit is asked for; 0 when the target pH is at or
 * below the soil pH (when soil_ph is given).
 * @param bufferPh soil-buffer pH, within the calibration's range (SIKORA-OR2025 4.8–6.9; MEHLICH ≤ 6.6)
 * @param targetPh target soil pH, within the calibration's range (SIKORA-OR2025 5.6–7.2; MEHLICH ≤ 6.6)
 * @param opts calibration (required), soilPh, depthCm, unit (see LimeBufferOptions)
 * @returns lime rate: pure CaCO3 equivalent in `unit` for built-in tables; NCDA&CS lime for MEHLICH;
 *   the range's own unit for a range
 * @throws MISSING_INPUT without a calibration (there is no default); UNKNOWN_NAME for an unknown
 *   calibration (lists the built-ins); NO_REFERENCE_DATA for SMP
 *   (not shipped); OUT_OF_RANGE outside the table (message gives its range); MISSING_INPUT for
 *   MEHLICH without soil_ph; NOT_APPLICABLE for depth_cm or unit with a range, or depth_cm with MEHLICH
 * @example limeBuffer(6.0, 5.6, { calibration: "SIKORA-OR2025", unit: "ton/ac" }) //=> 1.7
 * Source: Moore (2025) EM 9585 Table 1 worked example (Sikora 6.0, target 5.6 → 1.7 t/a; seen).
 */
export function limeBuffer(bufferPh: number, targetPh: number, opts: LimeBufferOptions = {}): number {
  check(bufferPh, BOUNDS.ph("buffer_ph"));
  check(targetPh, BOUNDS.ph("target_ph"));
  if (opts.soilPh !== undefined) check(opts.soilPh, BOUNDS.ph("soil_ph"));
  const c = resolve(opts.calibration);
  switch (c.kind) {
    case "range":
      return fromRange(c.range, bufferPh, targetPh, opts);
    case "table":
      return limeBufferTableRate(c, bufferPh, targetPh, opts);
    case "mehlich":
      return fromMehlich(c, bufferPh, targetPh, opts);
  }
}
