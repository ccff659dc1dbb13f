/**
 * The built-in buffer-pH calibrations, each a data file under src/data/lime/ with its source,
 * calibration depth, unit and basis:
 * - SMP: the Shoemaker, McLean & Pratt (1961) table. Not shipped: no copy of the table could be
 *   read, so the name answers NO_REFERENCE_DATA (#N/A) until a verified transcription is added.
 * - SIKORA-OR2025: Moore (2025) OSU Extension EM 9585, Table 1 (Sikora buffer, 6-inch depth,
 *   US tons per acre of 100-score lime; seen in full).
 * - MEHLICH: the NCDA&CS buffer-acidity formula (seen), which needs the soil pH.
 */
import smp from "../../data/lime/smp.json";
import sikora from "../../data/lime/sikora-or2025.json";
import mehlich from "../../data/lime/mehlich-ncda.json";
import { SoilError } from "../errors";
import { nameTable } from "../names";
import { LimeTable } from "./table";

/** A built-in calibration table and what its numbers mean. */
export interface LimeTableCalibration {
  readonly kind: "table";
  readonly id: string;
  readonly source: string;
  /** Unit of the table's rates (an area-rate unit id of units.json). */
  readonly unit: string;
  /** Depth the rates are for, cm; undefined when the source does not state it. */
  readonly depthCm: number | undefined;
  /** Neutralizing value (% CCE) of the material the rates are for; 100 = pure CaCO3. */
  readonly neutralizingValuePct: number;
  /** The table, or undefined when it is not shipped (see `status`). */
  readonly table: LimeTable | undefined;
  readonly status: string;
  /** Why a table is not shipped, in a few words (for the error message). */
  readonly reason?: string;
  readonly whatToDo?: string;
}

/** The NCDA&CS Mehlich buffer-acidity formula and its constants. */
export interface LimeMehlichCalibration {
  readonly kind: "mehlich";
  readonly id: string;
  readonly source: string;
  readonly unit: string;
  readonly depthCm: undefined;
  /** Reference pH of the Mehlich buffer (6.6). */
  readonly referencePh: number;
  /** meq/100 cm3 of acidity per unit of buffer-pH depression (4). */
  readonly acidityPerBufferPhUnit: number;
}

export type LimeCalibration = LimeTableCalibration | LimeMehlichCalibration;

interface TableFile {
  id: string;
  source: string;
  status: string;
  unit: string;
  depth_cm: number | null;
  basis: { neutralizing_value_pct: number | null };
  target_ph: number[];
  rows: { buffer_ph: number; rates: number[] }[];
  reason?: string;
  what_to_do?: string;
}

/** A data file's rows as a table with both axes ascending (the files list buffer pH downwards). */
function tableOf(file: TableFile): LimeTable | undefined {
  if (file.rows.length === 0) return undefined;
  const rows = [...file.rows].sort((a, b) => a.buffer_ph - b.buffer_ph);
  for (const r of rows) {
    if (r.rates.length !== file.target_ph.length) throw new Error(`${file.id}: row ${r.buffer_ph} has ${r.rates.length} rates`);
  }
  return { name: `the ${file.id} table`, bufferPh: rows.map((r) => r.buffer_ph), targetPh: file.target_ph, rates: rows.map((r) => r.rates) };
}

function tableCalibration(file: TableFile): LimeTableCalibration {
  const nv = file.basis.neutralizing_value_pct;
  if (nv === null || !(nv > 0)) throw new Error(`${file.id}: a table needs its basis neutralizing value`);
  return {
    kind: "table",
    id: file.id,
    source: file.source,
    unit: file.unit,
    depthCm: file.depth_cm ?? undefined,
    neutralizingValuePct: nv,
    table: tableOf(file),
    status: file.status,
    reason: file.reason,
    whatToDo: file.what_to_do,
  };
}

const MEHLICH: LimeMehlichCalibration = {
  kind: "mehlich",
  id: mehlich.id,
  source: mehlich.source,
  unit: mehlich.unit,
  depthCm: undefined,
  referencePh: mehlich.reference_ph,
  acidityPerBufferPhUnit: mehlich.acidity_per_buffer_ph_unit,
};

const BUILT_INS: readonly LimeCalibration[] = [tableCalibration(smp as TableFile), tableCalibration(sikora as TableFile), MEHLICH];

const NAMES = nameTable(BUILT_INS.map((c) => ({ id: c.id, value: c })));

/** Names of the built-in calibrations, in file order (SMP, not shipped, first). */
export const LIME_CALIBRATION_IDS: readonly string[] = NAMES.ids;

/**
 * What to give when no calibration is named. There is no default: a buffer reading means nothing
 * without the calibration the lab uses, and the one long-standing default (SMP) is not shipped.
 */
export const LIME_CALIBRATION_NEED =
  "the calibration your lab uses for this buffer: SIKORA-OR2025, MEHLICH (needs soil_ph), or a range holding your lab's table (top row target pH, left column buffer pH); SMP is not shipped yet";

/**
 * A built-in calibration by name (case-insensitive).
 * @param name SMP, SIKORA-OR2025 or MEHLICH
 * @returns the calibration's description and data
 * @throws UNKNOWN_NAME listing the built-ins; NO_REFERENCE_DATA for a calibration whose table is
 *   not shipped (SMP), saying why and what to use instead
 * @example limeCalibrationUnit("sikora-or2025") //=> "ton/ac"
 */
export function limeCalibration(name: string): LimeCalibration {
  const c = NAMES.lookup(name, "calibration");
  if (c.kind === "table" && c.table === undefined) {
    throw new SoilError("NO_REFERENCE_DATA", `the ${c.id} table is not shipped (${c.reason ?? "not verified"}). ${c.whatToDo ?? ""}`.trim());
  }
  return c;
}

/**
 * The depth (cm) a built-in calibration's rates are for.
 * @throws NOT_APPLICABLE when the source does not state the depth (MEHLICH)
 * @example limeCalibrationDepthCm("SIKORA-OR2025") //=> 15.24
 */
export function limeCalibrationDepthCm(name: string): number {
  const c = limeCalibration(name);
  if (c.depthCm === undefined) throw new SoilError("NOT_APPLICABLE", `the ${c.id} source does not state the depth its rates are for`);
  return c.depthCm;
}

/**
 * The unit a built-in calibration's rates are published in.
 * @example limeCalibrationUnit("MEHLICH") //=> "ton/ac"
 */
export function limeCalibrationUnit(name: string): string {
  return limeCalibration(name).unit;
}

export interface LimeCalibrationInfo {
  readonly id: string;
  readonly source: string;
  readonly unit: string;
  /** Calibration depth in cm, where the source states one. */
  readonly depthCm?: number;
  /** False for a calibration whose table could not be sourced (it answers #N/A, saying why). */
  readonly shipped: boolean;
}

/**
 * The built-in calibrations with their sources (for `soilcell list`).
 * @returns one entry per built-in, in file order (no @example: the result is a list)
 */
export function limeCalibrationTables(): LimeCalibrationInfo[] {
  return BUILT_INS.map((c) => ({
    id: c.id,
    source: c.source,
    unit: c.unit,
    depthCm: c.depthCm,
    shipped: c.kind !== "table" || c.table !== undefined,
  }));
}
