/**
 * Nutrient sufficiency bands from reference tables (SOIL.SUFFICIENCY): a built-in table chosen by
 * nutrient, extraction method, crop or rotation and CEC; a built-in table named by its id; or the
 * consultant's own table passed as a range (sufficiency-user.ts).
 *
 * Each built-in table applies its source's own edge rule (`at_limit` in its data file: a value
 * equal to a limit falls on the side the source prints, or is not classified where the source
 * leaves it out). The consultant's own tables, like SOIL.BAND, put a value equal to a limit in
 * the band above.
 *
 * Choosing a built-in table: nutrient and method must match. A table written for the crop (or the
 * rotation, where the source keys it so) is preferred; otherwise a crop-independent table ("any")
 * applies. A rotation-keyed table that covers the crop but cannot tell the rotation from a single
 * crop word refuses (MISSING_INPUT) rather than fall back. Where the levels depend on CEC the
 * `cec` argument picks the row. Where several tables still fit (a sampling stage or depth), the
 * table id must be given.
 *
 * Sources: each row's own `source` (see sufficiencyTables() and `soilcell list`).
 */
import { SoilError, listWords } from "../errors";
import { AtLimit, CellGrid, bandIndexAt, bandLabel } from "./bands";
import {
  ANY,
  CropSpec,
  METHODS,
  NUTRIENTS,
  SUFFICIENCY_ROWS,
  SufficiencyRow,
  cecMatches,
  cecText,
  coverText,
  describeRow,
  knownCombinations,
  readCrop,
  rotationFits,
  rowById,
  samplingText,
} from "./sufficiency-rows";
import { userRowFor, userTable } from "./sufficiency-user";
import { check } from "../validate";

export { SUFFICIENCY_ROWS } from "./sufficiency-rows";
export type { SufficiencyRow } from "./sufficiency-rows";

/** A table argument: a built-in table id, or the consultant's own table as a range. */
export type SufficiencyTableArg = string | CellGrid;

const ROTATION_HINT =
  'pass the rotation as crop, the crops joined by "-": corn-soybean, corn-soybean-wheat (a crop grown every year: corn-corn)';

function checkCec(cec: number | undefined): void {
  if (cec !== undefined) check(cec, { name: "cec", unit: "cmol(+)/kg", min: 0, minExclusive: true });
}

/** Narrows candidate rows by CEC where they depend on it. */
function byCec(candidates: readonly SufficiencyRow[], nutrient: string, method: string, cec: number | undefined): SufficiencyRow[] {
  if (!candidates.some((r) => r.cec)) return [...candidates];
  if (cec === undefined) {
    throw new SoilError("MISSING_INPUT", `cec is needed: the ${nutrient} ${method} levels depend on CEC (${candidates.map(describeRow).join("; ")})`);
  }
  const fit = candidates.filter((r) => cecMatches(r, cec));
  if (fit.length === 0) throw new SoilError("NO_REFERENCE_DATA", `no ${nutrient} ${method} table covers CEC ${cec}`);
  return fit;
}

/** The rows written for these crops (crop- or rotation-keyed), or a refusal that says why none fits. */
function specificRows(rows: readonly SufficiencyRow[], spec: CropSpec, nutrient: string, method: string): SufficiencyRow[] {
  const specific = rows.filter((r) => !r.crops.includes(ANY));
  const covering = specific.filter((r) => spec.crops.every((c) => r.crops.includes(c)));
  const fit = covering.filter((r) => rotationFits(r, spec));
  if (fit.length > 0) return fit;
  if (covering.some((r) => r.rotation)) {
    if (!spec.rotation) {
      throw new SoilError(
        "MISSING_INPUT",
        `the ${nutrient} ${method} levels depend on the whole rotation, not the crop grown (${covering.map(describeRow).join("; ")}): ${ROTATION_HINT}`,
      );
    }
    throw new SoilError("NO_REFERENCE_DATA", `no ${nutrient} ${method} table for the rotation ${spec.word}; tables exist for ${knownCombinations(covering)}`);
  }
  const partial = specific.filter((r) => spec.crops.some((c) => r.crops.includes(c)));
  if (spec.crops.length > 1 && partial.some((r) => r.rotation)) {
    const outside = spec.crops.filter((c) => !partial.some((r) => r.crops.includes(c)));
    throw new SoilError("NO_REFERENCE_DATA", `no ${nutrient} ${method} table for a rotation with ${listWords(outside)}; tables exist for ${knownCombinations(partial)}`);
  }
  if (spec.crops.length > 1 && partial.length > 0) {
    throw new SoilError(
      "MISSING_INPUT",
      `the ${nutrient} ${method} tables are for the crop grown, and ${spec.word} names crops with different tables: give the one crop (${knownCombinations(specific)})`,
    );
  }
  return [];
}

/**
 * The built-in table row that interprets this nutrient, method, crop and CEC.
 * @param nutrientWord nutrient symbol or name
 * @param cropWord crop, rotation ("corn-soybean-wheat"), or omitted for a crop-independent table
 * @param methodWord extraction method or "tissue"
 * @param cec cmol(+)/kg (> 0), used where the table depends on CEC
 * @returns the table row
 * @throws UNKNOWN_NAME for a word outside the tables' vocabulary; MISSING_INPUT when the method is
 *   omitted, the crop or rotation is needed, the table needs cec, or several tables fit (the
 *   message lists their ids); NO_REFERENCE_DATA when no table covers the combination (the
 *   message lists the combinations that exist)
 */
function builtInRowFor(nutrientWord: string, cropWord?: string, methodWord?: string, cec?: number): SufficiencyRow {
  const nutrient = NUTRIENTS.lookup(nutrientWord, "nutrient");
  const ofNutrient = SUFFICIENCY_ROWS.filter((r) => r.nutrient === nutrient);
  if (ofNutrient.length === 0) {
    throw new SoilError("NO_REFERENCE_DATA", `no built-in table for ${nutrient}; pass your own as table (nutrient | method | crop | band | limit | band …). Tables exist for ${knownCombinations(SUFFICIENCY_ROWS)}`);
  }
  if (methodWord === undefined || methodWord.trim() === "") {
    const methods = [...new Set(ofNutrient.map((r) => r.method))];
    throw new SoilError("MISSING_INPUT", `method is needed: ${nutrient} tables exist for ${listWords(methods)} (${knownCombinations(ofNutrient)})`);
  }
  const method = METHODS.lookup(methodWord, "method");
  const ofMethod = ofNutrient.filter((r) => r.method === method);
  if (ofMethod.length === 0) {
    throw new SoilError("NO_REFERENCE_DATA", `no built-in ${method} table for ${nutrient}; pass your own as table, or use a table that exists: ${knownCombinations(ofNutrient)}`);
  }
  const spec = readCrop(cropWord);
  checkCec(cec);
  let candidates = spec ? specificRows(ofMethod, spec, nutrient, method) : [];
  if (candidates.length === 0) candidates = ofMethod.filter((r) => r.crops.includes(ANY));
  if (candidates.length === 0) {
    if (!spec) throw new SoilError("MISSING_INPUT", `crop is needed: ${nutrient} ${method} tables are crop-specific (${knownCombinations(ofMethod)})`);
    throw new SoilError("NO_REFERENCE_DATA", `no ${nutrient} ${method} table for ${spec.word}; tables exist for ${knownCombinations(ofMethod)}`);
  }
  candidates = byCec(candidates, nutrient, method, cec);
  if (candidates.length > 1) {
    throw new SoilError(
      "MISSING_INPUT",
      `several ${nutrient} ${method} tables fit; name one as table: ${candidates.map((r) => `"${r.id}" (${samplingText(r) || coverText(r)})`).join(", ")}`,
    );
  }
  return candidates[0]!;
}

/**
 * A built-in table named by id, checked against the other arguments.
 * @throws UNKNOWN_NAME for an unknown id; NOT_APPLICABLE when the nutrient, method or crop given
 *   is not the table's, or the CEC is outside its condition; MISSING_INPUT when it needs cec
 */
function namedRow(id: string, nutrientWord: string, cropWord?: string, methodWord?: string, cec?: number): SufficiencyRow {
  const row = rowById(id);
  if (!row) {
    throw new SoilError("UNKNOWN_NAME", `no built-in sufficiency table "${id}"; the ids are listed by soilcell list (e.g. ${SUFFICIENCY_ROWS.slice(0, 3).map((r) => r.id).join(", ")}), or pass your own table as a range`);
  }
  const nutrient = NUTRIENTS.lookup(nutrientWord, "nutrient");
  if (nutrient !== row.nutrient) throw new SoilError("NOT_APPLICABLE", `table "${row.id}" is for ${row.nutrient}, not ${nutrient}`);
  if (methodWord !== undefined && methodWord.trim() !== "" && METHODS.lookup(methodWord, "method") !== row.method) {
    throw new SoilError("NOT_APPLICABLE", `table "${row.id}" is for the ${row.method} method, not ${methodWord.trim()}`);
  }
  const spec = readCrop(cropWord);
  if (spec && !row.crops.includes(ANY) && !(spec.crops.every((c) => row.crops.includes(c)) && rotationFits(row, spec))) {
    throw new SoilError("NOT_APPLICABLE", `table "${row.id}" is for ${coverText(row)}, not ${spec.word}`);
  }
  checkCec(cec);
  if (row.cec) {
    if (cec === undefined) throw new SoilError("MISSING_INPUT", `cec is needed: table "${row.id}" is for ${cecText(row)}`);
    if (!cecMatches(row, cec)) throw new SoilError("NOT_APPLICABLE", `table "${row.id}" is for ${cecText(row)}, not CEC ${cec}`);
  }
  return row;
}

/** A single text cell of a range argument, or undefined when the range is a table. */
function singleText(table: SufficiencyTableArg): string | undefined {
  if (typeof table === "string") return table;
  if (table.length === 1 && (table[0] ?? []).length === 1) {
    const cell = table[0]![0];
    if (typeof cell === "string") return cell;
    throw new SoilError("NOT_APPLICABLE", `table must be a built-in table id or a range holding your table, not the single value ${String(cell)}`);
  }
  return undefined;
}

/**
 * The id of the built-in table that SOIL.SUFFICIENCY would read for these arguments (its row in
 * src/data/bands/ and in sufficiencyTables() carries the source).
 * @throws as sufficiencyBand, except for the value checks
 * @example sufficiencyTableId("K", "corn", "Mehlich-3", 12) //=> "tristate2020-m3-k-cec-above-5"
 */
export function sufficiencyTableId(nutrientWord: string, cropWord?: string, methodWord?: string, cec?: number, table?: string): string {
  return (table ? namedRow(table, nutrientWord, cropWord, methodWord, cec) : builtInRowFor(nutrientWord, cropWord, methodWord, cec)).id;
}

/** The band label of a built-in row for a value, with the row's edge rule and scale top. */
function bandOfRow(row: SufficiencyRow, value: number): string {
  check(value, { name: "value", unit: row.unit, min: 0, max: row.unit === "%" ? 100 : undefined });
  if (row.scale_top !== undefined && value >= row.scale_top) {
    throw new SoilError(
      "NO_REFERENCE_DATA",
      `${value} ${row.unit} is above the published scale of ${describeRow(row)}, which ends below ${row.scale_top} ${row.unit}`,
    );
  }
  const k = bandIndexAt(value, row.limits, row.at_limit);
  if (k === null) {
    throw new SoilError("NO_REFERENCE_DATA", `${value} ${row.unit} is not classified by table "${row.id}": ${row.edge_rule}`);
  }
  return row.labels[k]!;
}

/**
 * The band label a reference table gives a soil-test or plant-tissue value (SOIL.SUFFICIENCY).
 * The value must be in the table's unit (see sufficiencyTables()).
 * @param nutrientWord P, K, N, Ca, Mg, S, B, Cu, Fe, Mn, Mo, Zn (or the element's name)
 * @param value soil-test or tissue value in the table's unit (mg/kg, mg/L or % of dry matter), ≥ 0
 * @param cropWord a crop (corn, soybean, wheat, canola, alfalfa, clover, subclover, pasture, …), a
 *   rotation of them joined by "-" (the Tri-State P tables need it), or omitted: a crop-independent table
 * @param methodWord Bray-1, Mehlich-3, Olsen, Colwell, KCl-40, DTPA, or tissue
 * @param cec cation exchange capacity, cmol(+)/kg (> 0); needed where the table depends on it
 * @param table a built-in table id, or the consultant's own table as a range
 * @returns the source's own band label (or the user table's)
 * @throws as builtInRowFor, namedRow and userTable; OUT_OF_RANGE for a negative value or a
 *   percentage above 100; NO_REFERENCE_DATA for a value beyond the top of a closed published scale
 *   or exactly on a limit the source leaves unclassified
 * @example sufficiencyBand("P", 25, "corn-soybean", "Mehlich-3") //=> "Optimal"
 */
export function sufficiencyBand(
  nutrientWord: string,
  value: number,
  cropWord?: string,
  methodWord?: string,
  cec?: number,
  table?: SufficiencyTableArg,
): string {
  if (table !== undefined) {
    const id = singleText(table);
    if (id === undefined) {
      const row = userRowFor(userTable(table as CellGrid), nutrientWord, methodWord, cropWord);
      check(value, { name: "value", min: 0 });
      return bandLabel(value, row.limits, row.labels);
    }
    if (id.trim() !== "") return bandOfRow(namedRow(id.trim(), nutrientWord, cropWord, methodWord, cec), value);
  }
  return bandOfRow(builtInRowFor(nutrientWord, cropWord, methodWord, cec), value);
}

/** One entry of the list of built-in tables, for `soilcell list` and help. */
export interface SufficiencyTableInfo {
  readonly id: string;
  readonly nutrient: string;
  readonly method: string;
  /** Crops the table applies to, joined ("any" for a crop-independent table). */
  readonly crop: string;
  /** The crops or rotation it covers, in words ("rotation including wheat or alfalfa"). */
  readonly covers: string;
  readonly unit: string;
  /** The CEC condition, e.g. "CEC ≤ 5 cmol(+)/kg", or "" when the table does not depend on CEC. */
  readonly cec: string;
  /** Soil sampling depth, or sampled plant part and growth stage, or "". */
  readonly sampling: string;
  readonly limits: readonly number[];
  readonly atLimit: readonly AtLimit[];
  /** The source's edge rule in words. */
  readonly edgeRule: string;
  readonly labels: readonly string[];
  readonly source: string;
  /** Where the values were seen and whether first-hand or secondary. */
  readonly status: string;
}

/**
 * The built-in sufficiency tables with their sources and edge rules (for `soilcell list`).
 * @returns one entry per table row, in file order (no @example: the result is a list)
 */
export function sufficiencyTables(): SufficiencyTableInfo[] {
  return SUFFICIENCY_ROWS.map((r) => ({
    id: r.id,
    nutrient: r.nutrient,
    method: r.method,
    crop: r.crops.join(", "),
    covers: coverText(r),
    unit: r.unit,
    cec: cecText(r),
    sampling: samplingText(r),
    limits: r.limits,
    atLimit: r.at_limit,
    edgeRule: r.edge_rule,
    labels: r.labels,
    source: r.source,
    status: `${r.status}; ${r.seen_at}`,
  }));
}
