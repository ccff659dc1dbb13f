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
 * Choosing a built-in table: nutrient and method must match. Where the same test is reported in
 * more than one basis and the tables are in different units (Olsen P per kg and per litre of
 * soil), the value's unit is required and only tables in that basis are read; a unit given
 * anywhere is converted exactly within its family (ppm = mg/kg, g/kg and %) or refused. A table
 * written for the crop (or the rotation, where the source keys it so) is preferred; otherwise a
 * crop-independent table ("any") applies. A rotation-keyed table that covers the crop but cannot
 * tell the rotation from a single crop word refuses (MISSING_INPUT) rather than fall back. Where
 * the levels depend on CEC the `cec` argument picks the row; where the source states a sampling
 * depth, `depth_cm` is required and must equal it (never assumed). Where several tables still fit
 * (a growth stage), the table id must be given, and a table marked `only_by_id` (another source
 * disagrees for the same crop and depth) is read only when named.
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
import { BOUNDS, check } from "../validate";
import { UnitDef, unitById } from "../units";

export { SUFFICIENCY_ROWS } from "./sufficiency-rows";
export type { SufficiencyRow } from "./sufficiency-rows";

/** A table argument: a built-in table id, or the consultant's own table as a range. */
export type SufficiencyTableArg = string | CellGrid;

const ROTATION_HINT =
  'pass the rotation as crop, the crops joined by "-": corn-soybean, corn-soybean-wheat (a crop grown every year: corn-corn)';

function checkCec(cec: number | undefined): void {
  if (cec !== undefined) check(cec, { name: "cec", unit: "cmol(+)/kg", min: 0, minExclusive: true });
}

/** The unit of a row's values (memoised: rows are few, values many). */
const ROW_UNITS = new Map<string, UnitDef>();
function rowUnit(r: SufficiencyRow): UnitDef {
  let u = ROW_UNITS.get(r.unit);
  // Stryker disable next-line ConditionalExpression: equivalent: the memo only saves a lookup; a unit looked up again is the same unit
  if (!u) {
    u = unitById(r.unit, "unit");
    ROW_UNITS.set(r.unit, u);
  }
  return u;
}

/** Families a soil-test or tissue value can be stated in; others need a conversion first. */
const VALUE_FAMILIES = new Set(["mass_fraction", "per_volume"]);

/** The unit argument read, or undefined when omitted; a rate per area or a charge is refused. */
function readValueUnit(word: string | undefined): UnitDef | undefined {
  if (word === undefined || word.trim() === "") return undefined;
  const u = unitById(word, "unit");
  if (!VALUE_FAMILIES.has(u.family)) {
    throw new SoilError(
      "UNIT_MISMATCH",
      `unit "${word.trim()}" is not a soil-test or tissue basis: the tables are per kg of soil or dry matter (mg/kg, %) or per litre of soil (mg/dm3); convert the value first (SOIL.CONVERT, or SOIL.MGKG for a charge)`,
    );
  }
  return u;
}

/** The unit and depth arguments checked: the unit read (or undefined), the depth within 0-300 cm. */
function readBasis(unitWord: string | undefined, depthCm: number | undefined): UnitDef | undefined {
  const unit = readValueUnit(unitWord);
  if (depthCm !== undefined) check(depthCm, BOUNDS.depth());
  return unit;
}

const unitsOfRows = (rows: readonly SufficiencyRow[]) => [...new Set(rows.map((r) => r.unit))].map((u) => `"${u}"`);
/** "a", "a or b" for a choice; "a and b" for what exists. */
const unitList = (rows: readonly SufficiencyRow[]) => listWords(unitsOfRows(rows));
// Stryker disable next-line Regex: equivalent: listWords writes a single " or ", after the last comma, so the first " or " is the last
const unitsHeld = (rows: readonly SufficiencyRow[]) => listWords(unitsOfRows(rows)).replace(/ or (?=[^,]*$)/, " and ");

/**
 * Narrows rows to the value's basis. Without a unit, rows of one unit are read in it (the value is
 * in the table's unit); rows in several units need the unit, since a value that fits one would be
 * read silently against another.
 */
function byUnit(rows: readonly SufficiencyRow[], nutrient: string, method: string, unit: UnitDef | undefined): SufficiencyRow[] {
  const units = new Set(rows.map((r) => r.unit));
  if (!unit) {
    if (units.size > 1) {
      throw new SoilError(
        "MISSING_INPUT",
        `unit is needed: ${nutrient} ${method} values are reported in more than one basis, and the built-in tables are in ${unitsHeld(rows)} (${knownCombinations(rows)}); give the unit the lab reports, ${unitList(rows)}. Converting between a value per kg and per litre of soil needs the bulk density (SOIL.CONVERT)`,
      );
    }
    return [...rows];
  }
  const fit = rows.filter((r) => rowUnit(r).family === unit.family);
  if (fit.length === 0) {
    throw new SoilError(
      "NO_REFERENCE_DATA",
      `no ${nutrient} ${method} table in ${unit.id}: the tables are in ${unitsHeld(rows)} (${knownCombinations(rows)}); convert the value first (SOIL.CONVERT; per kg to per litre of soil needs the bulk density), or pass your own table`,
    );
  }
  return fit;
}

/**
 * Narrows rows by the sampling depth where the source states one: depth_cm is then required and
 * must equal it (a value from another depth is not read against the table). Rows whose source
 * states no depth take any depth_cm.
 */
function byDepth(candidates: readonly SufficiencyRow[], nutrient: string, method: string, depthCm: number | undefined): SufficiencyRow[] {
  const stated = candidates.filter((r) => r.depth_cm !== undefined);
  if (stated.length === 0) return [...candidates];
  const depths = listWords([...new Set(stated.map((r) => `0-${r.depth_cm} cm`))]);
  if (depthCm === undefined) {
    throw new SoilError(
      "MISSING_INPUT",
      `depth_cm is needed: the ${nutrient} ${method} levels are for a ${depths} sample (${stated.map(describeRow).join("; ")}); give the depth of the sampled layer in cm (${stated[0]!.depth_cm} for a 0-${stated[0]!.depth_cm} cm core): a value from another depth must not be read against them`,
    );
  }
  const fit = candidates.filter((r) => r.depth_cm === undefined || r.depth_cm === depthCm);
  if (fit.length === 0) {
    throw new SoilError("NO_REFERENCE_DATA", `no ${nutrient} ${method} table for a 0-${depthCm} cm sample: the tables are for a ${depths} sample (${stated.map(describeRow).join("; ")})`);
  }
  return fit;
}

/** A table that is read only when named refuses to be chosen by the other arguments. */
function notOnlyById(row: SufficiencyRow): SufficiencyRow {
  if (row.only_by_id) throw new SoilError("MISSING_INPUT", `the ${describeRow(row)} table is read only when named: ${row.only_by_id}`);
  return row;
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
  // Only a rotation of crops gets past here with a partial table: for one crop, partial is covering,
  // which is empty here (a table of its own would fit, or one keyed by rotation refused above).
  const partial = specific.filter((r) => spec.crops.some((c) => r.crops.includes(c)));
  if (partial.some((r) => r.rotation)) {
    const outside = spec.crops.filter((c) => !partial.some((r) => r.crops.includes(c)));
    // Every crop may have tables of its own while none covers them together (pasture-corn).
    const what = outside.length > 0 ? `a rotation with ${listWords(outside)}` : `the rotation ${spec.word}`;
    throw new SoilError("NO_REFERENCE_DATA", `no ${nutrient} ${method} table for ${what}; tables exist for ${knownCombinations(partial)}`);
  }
  if (partial.length > 0) {
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
 * @param unit the value's unit, or undefined: needed where the tables of the test are in more than one unit
 * @param depthCm depth of the sampled layer, cm: needed where the table's source states one
 * @returns the table row
 * @throws UNKNOWN_NAME for a word outside the tables' vocabulary; MISSING_INPUT when the method is
 *   omitted, the unit, crop or rotation, cec or depth is needed, several tables fit (the message
 *   lists their ids), or the one that fits is read only when named; NO_REFERENCE_DATA when no
 *   table covers the combination (the message lists the combinations that exist)
 */
function builtInRowFor(nutrientWord: string, cropWord?: string, methodWord?: string, cec?: number, unit?: UnitDef, depthCm?: number): SufficiencyRow {
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
  const ofMethodAll = ofNutrient.filter((r) => r.method === method);
  if (ofMethodAll.length === 0) {
    throw new SoilError("NO_REFERENCE_DATA", `no built-in ${method} table for ${nutrient}; pass your own as table, or use a table that exists: ${knownCombinations(ofNutrient)}`);
  }
  const ofMethod = byUnit(ofMethodAll, nutrient, method, unit);
  const spec = readCrop(cropWord);
  checkCec(cec);
  let candidates = spec ? specificRows(ofMethod, spec, nutrient, method) : [];
  if (candidates.length === 0) candidates = ofMethod.filter((r) => r.crops.includes(ANY));
  if (candidates.length === 0) {
    // Tables left out for their unit are named too, with what reading them would take.
    const otherBasis = ofMethodAll.filter((r) => !ofMethod.includes(r));
    const also = otherBasis.length
      ? `; in another unit: ${knownCombinations(otherBasis)} (convert the value first: SOIL.CONVERT, which needs the bulk density between per-kg and per-litre values)`
      : "";
    if (!spec) throw new SoilError("MISSING_INPUT", `crop is needed: ${nutrient} ${method} tables are crop-specific (${knownCombinations(ofMethod)})${also}`);
    throw new SoilError("NO_REFERENCE_DATA", `no ${nutrient} ${method} table${unit ? ` in ${unit.id}` : ""} for ${spec.word}; tables exist for ${knownCombinations(ofMethod)}${also}`);
  }
  candidates = byCec(candidates, nutrient, method, cec);
  candidates = byDepth(candidates, nutrient, method, depthCm);
  if (candidates.length > 1) {
    throw new SoilError(
      "MISSING_INPUT",
      `several ${nutrient} ${method} tables fit; name one as table: ${candidates.map((r) => `"${r.id}" (${samplingText(r) || coverText(r)})`).join(", ")}`,
    );
  }
  return notOnlyById(candidates[0]!);
}

/**
 * A built-in table named by id, checked against the other arguments.
 * @throws UNKNOWN_NAME for an unknown id; NOT_APPLICABLE when the nutrient, method, crop, unit
 *   basis or depth given is not the table's, or the CEC is outside its condition; MISSING_INPUT
 *   when it needs cec, depth_cm, or the unit (its test's tables are in more than one unit)
 */
function namedRow(id: string, nutrientWord: string, cropWord?: string, methodWord?: string, cec?: number, unit?: UnitDef, depthCm?: number): SufficiencyRow {
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
  const siblings = SUFFICIENCY_ROWS.filter((r) => r.nutrient === row.nutrient && r.method === row.method);
  if (unit && rowUnit(row).family !== unit.family) {
    throw new SoilError("NOT_APPLICABLE", `table "${row.id}" is in ${row.unit}, not ${unit.id}: convert the value first (SOIL.CONVERT; per kg to per litre of soil needs the bulk density)`);
  }
  if (!unit) byUnit(siblings, row.nutrient, row.method, undefined);
  if (row.depth_cm !== undefined) {
    if (depthCm === undefined) byDepth([row], row.nutrient, row.method, undefined);
    else if (depthCm !== row.depth_cm) throw new SoilError("NOT_APPLICABLE", `table "${row.id}" is for a ${row.depth} sample, not 0-${depthCm} cm`);
  }
  return row;
}

/** A single text cell of a range argument, or undefined when the range is a table. */
function singleText(table: SufficiencyTableArg): string | undefined {
  if (typeof table === "string") return table;
  if (table.length === 1 && table[0]!.length === 1) {
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
export function sufficiencyTableId(
  nutrientWord: string,
  cropWord?: string,
  methodWord?: string,
  cec?: number,
  table?: string,
  unitWord?: string,
  depthCm?: number,
): string {
  const unit = readBasis(unitWord, depthCm);
  return (table ? namedRow(table, nutrientWord, cropWord, methodWord, cec, unit, depthCm) : builtInRowFor(nutrientWord, cropWord, methodWord, cec, unit, depthCm)).id;
}

/** A value in `unit` (or already in the row's unit) as the row reads it, checked on both sides. */
function inRowUnit(row: SufficiencyRow, value: number, unit: UnitDef | undefined): number {
  if (!unit) return value;
  check(value, { name: "value", unit: unit.id, min: 0, max: unit.id === "%" ? 100 : undefined });
  return (value * unit.toBase) / rowUnit(row).toBase;
}

/** The band label of a built-in row for a value, with the row's edge rule and scale top. */
function bandOfRow(row: SufficiencyRow, given: number, unit?: UnitDef): string {
  const value = inRowUnit(row, given, unit);
  check(value, { name: "value", unit: row.unit, min: 0, max: row.unit === "%" ? 100 : undefined });
  // A closed published scale ends below scale_top; an open one (no scale_top) never ends.
  if (value >= (row.scale_top ?? Infinity)) {
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
 * @param unitWord the value's unit (mg/kg = ppm, g/kg, %, mg/dm3 = mg per litre of soil), converted
 *   exactly to the table's; needed where the test's tables are in more than one unit (Olsen P)
 * @param depthCm depth of the sampled layer (0 to depth_cm), cm; needed where the table's source
 *   states its sampling depth (KCl-40 S: 30; pasture Bray and Olsen P: 10), and must equal it
 * @returns the source's own band label (or the user table's)
 * @throws as builtInRowFor, namedRow and userTable; OUT_OF_RANGE for a negative value, a
 *   percentage above 100 or a depth outside 0-300 cm; UNIT_MISMATCH for a unit that is not a
 *   soil-test or tissue basis (lb/ac, cmol(+)/kg); NOT_APPLICABLE for a unit or depth with your
 *   own table; NO_REFERENCE_DATA for a value beyond the top of a closed published scale or
 *   exactly on a limit the source leaves unclassified
 * @example sufficiencyBand("P", 25, "corn-soybean", "Mehlich-3") //=> "Optimal"
 * @example sufficiencyBand("S", 4, "canola", "KCl-40", undefined, undefined, "mg/kg", 30) //=> "Below critical range"
 */
export function sufficiencyBand(
  nutrientWord: string,
  value: number,
  cropWord?: string,
  methodWord?: string,
  cec?: number,
  table?: SufficiencyTableArg,
  unitWord?: string,
  depthCm?: number,
): string {
  const unit = readBasis(unitWord, depthCm);
  if (table !== undefined) {
    const id = singleText(table);
    if (id === undefined) {
      if (unit || depthCm !== undefined) {
        throw new SoilError("NOT_APPLICABLE", "unit and depth_cm are for the built-in tables: your own table is read in its own unit and depth, so leave them blank");
      }
      const row = userRowFor(userTable(table as CellGrid), nutrientWord, methodWord, cropWord);
      check(value, { name: "value", min: 0 });
      return bandLabel(value, row.limits, row.labels);
    }
    if (id.trim() !== "") return bandOfRow(namedRow(id.trim(), nutrientWord, cropWord, methodWord, cec, unit, depthCm), value, unit);
  }
  return bandOfRow(builtInRowFor(nutrientWord, cropWord, methodWord, cec, unit, depthCm), value, unit);
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
  /** Depth of the sampled layer the table needs as depth_cm, or undefined when its source states none. */
  readonly depthCm?: number;
  /** Why the table is read only when named, or "" when the other arguments can choose it. */
  readonly onlyById: string;
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
    depthCm: r.depth_cm,
    onlyById: r.only_by_id ?? "",
    limits: r.limits,
    atLimit: r.at_limit,
    edgeRule: r.edge_rule,
    labels: r.labels,
    source: r.source,
    status: `${r.status}; ${r.seen_at}`,
  }));
}
