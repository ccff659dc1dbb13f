/**
 * Nutrient sufficiency bands from built-in reference tables (SOIL.SUFFICIENCY).
 *
 * Every table is a row of a JSON file under src/data/bands/ that names its nutrient, extraction
 * method (or "tissue" for plant analysis), crops, unit, limits, labels and source; nothing of a
 * published table is typed in here. The band is found with the edge rule of bands.ts (a value
 * equal to a limit belongs to the band above).
 *
 * Choosing a table: nutrient and method must match; a table written for the crop is preferred,
 * otherwise a crop-independent table ("any" crop, e.g. a statutory soil index) applies; with the
 * crop omitted only a crop-independent table applies. Where a table's levels depend on CEC (the
 * 2020 Tri-State Mehlich-3 K levels) the `cec` argument picks the row and is required.
 *
 * Sources: each row's own `source` (Tri-State 1995 and 2020 via Ohio State University Extension;
 * Magdoff & van Es, SARE; Northern Ireland S.R. 2019/81; GRDC Update 2020; Plank, UGA; Yin & Vyn
 * 2002 via OMAFA) — see sufficiencyTables().
 */
import pBray1 from "../../data/bands/p-bray1.json";
import pMehlich3 from "../../data/bands/p-mehlich3.json";
import kMehlich3 from "../../data/bands/k-mehlich3.json";
import pOlsen from "../../data/bands/p-olsen.json";
import pColwell from "../../data/bands/p-colwell.json";
import tissueAlfalfa from "../../data/bands/tissue-alfalfa.json";
import tissueSoybean from "../../data/bands/tissue-soybean.json";
import { SoilError, listWords } from "../errors";
import { nameTable } from "../names";
import { bandLabel } from "./bands";
import { check } from "../validate";

/** One reference table as stored in src/data/bands/*.json. */
export interface SufficiencyRow {
  readonly id: string;
  readonly nutrient: string;
  readonly method: string;
  readonly crops: readonly string[];
  readonly unit: string;
  readonly limits: readonly number[];
  readonly labels: readonly string[];
  /** CEC condition in cmol(+)/kg: `max` = at most, `above` = greater than. */
  readonly cec?: { readonly max?: number; readonly above?: number };
  /** First value past the published scale (values ≥ it are not classified). */
  readonly scale_top?: number;
  readonly part?: string;
  readonly stage?: string;
  readonly source: string;
  readonly seen_at: string;
  readonly status: string;
  readonly note?: string;
}

const FILES = [pBray1, pMehlich3, kMehlich3, pOlsen, pColwell, tissueAlfalfa, tissueSoybean] as { rows: SufficiencyRow[] }[];

/** Every built-in table row, in file order. */
export const SUFFICIENCY_ROWS: readonly SufficiencyRow[] = FILES.flatMap((f) => f.rows);

/** The crop word of a crop-independent table. */
const ANY = "any";

const NUTRIENTS = nameTable([
  { id: "N", aliases: ["nitrogen"], value: "N" },
  { id: "P", aliases: ["phosphorus", "phosphorous"], value: "P" },
  { id: "K", aliases: ["potassium"], value: "K" },
  { id: "Ca", aliases: ["calcium"], value: "Ca" },
  { id: "Mg", aliases: ["magnesium"], value: "Mg" },
  { id: "S", aliases: ["sulfur", "sulphur"], value: "S" },
  { id: "B", aliases: ["boron"], value: "B" },
  { id: "Cu", aliases: ["copper"], value: "Cu" },
  { id: "Fe", aliases: ["iron"], value: "Fe" },
  { id: "Mn", aliases: ["manganese"], value: "Mn" },
  { id: "Mo", aliases: ["molybdenum"], value: "Mo" },
  { id: "Zn", aliases: ["zinc"], value: "Zn" },
]);

const METHODS = nameTable([
  { id: "Bray-1", aliases: ["Bray 1", "Bray1", "Bray P1", "Bray-P1", "BrayP1", "Bray I", "Bray"], value: "Bray-1" },
  { id: "Mehlich-3", aliases: ["Mehlich 3", "Mehlich3", "M3", "Mehlich III", "Mehlich-III", "MIII", "M-3"], value: "Mehlich-3" },
  { id: "Olsen", aliases: ["Olsen P", "bicarbonate", "NaHCO3", "sodium bicarbonate"], value: "Olsen" },
  { id: "Colwell", aliases: ["Colwell P"], value: "Colwell" },
  { id: "ammonium acetate", aliases: ["NH4OAc", "NH4OAc K", "ammonium acetate K", "1 N ammonium acetate"], value: "ammonium acetate" },
  { id: "tissue", aliases: ["plant", "plant tissue", "leaf", "plant analysis", "tissue test"], value: "tissue" },
]);

const CROPS = nameTable([
  { id: "corn", aliases: ["maize", "grain corn"], value: "corn" },
  { id: "soybean", aliases: ["soybeans", "soya", "soy", "soya bean"], value: "soybean" },
  { id: "wheat", aliases: ["winter wheat", "spring wheat"], value: "wheat" },
  { id: "alfalfa", aliases: ["lucerne"], value: "alfalfa" },
  { id: "canola", aliases: ["oilseed rape", "rapeseed"], value: "canola" },
  { id: ANY, aliases: ["all", "any crop", "all crops"], value: ANY },
]);

function describeRow(r: SufficiencyRow): string {
  const crops = r.crops.includes(ANY) ? "any crop" : r.crops.join(", ");
  const cec = r.cec ? (r.cec.max !== undefined ? `, CEC ≤ ${r.cec.max}` : `, CEC > ${r.cec.above}`) : "";
  return `${r.nutrient} ${r.method} (${crops}${cec}; ${r.unit})`;
}

/** The combinations that exist, one per table, deduplicated, for messages. */
function knownCombinations(rows: readonly SufficiencyRow[]): string {
  const seen = [...new Set(rows.map((r) => describeRow(r).replace(/, CEC [^;]+/, ", by CEC")))];
  return seen.join("; ");
}

function cecMatches(r: SufficiencyRow, cec: number): boolean {
  if (!r.cec) return true;
  if (r.cec.max !== undefined && !(cec <= r.cec.max)) return false;
  if (r.cec.above !== undefined && !(cec > r.cec.above)) return false;
  return true;
}

/**
 * The reference table row that interprets this nutrient, method, crop and CEC.
 * @param nutrientWord nutrient symbol or name
 * @param cropWord crop, or omitted for a crop-independent table
 * @param methodWord extraction method or "tissue"
 * @param cec cmol(+)/kg (> 0), used where the table depends on CEC
 * @returns the table row
 * @throws UNKNOWN_NAME for a nutrient, method or crop word outside the tables' vocabulary;
 *   MISSING_INPUT when the method is omitted, or the crop is omitted and only crop tables exist,
 *   or the table needs cec; NO_REFERENCE_DATA when no table covers the combination (the message
 *   lists the combinations that exist)
 */
function sufficiencyTableFor(nutrientWord: string, cropWord?: string, methodWord?: string, cec?: number): SufficiencyRow {
  const nutrient = NUTRIENTS.lookup(nutrientWord, "nutrient");
  const ofNutrient = SUFFICIENCY_ROWS.filter((r) => r.nutrient === nutrient);
  if (ofNutrient.length === 0) {
    throw new SoilError("NO_REFERENCE_DATA", `no reference table for ${nutrient}; tables exist for ${knownCombinations(SUFFICIENCY_ROWS)}`);
  }
  if (methodWord === undefined || methodWord.trim() === "") {
    const methods = [...new Set(ofNutrient.map((r) => r.method))];
    throw new SoilError("MISSING_INPUT", `method is needed: ${nutrient} tables exist for ${listWords(methods)} (${knownCombinations(ofNutrient)})`);
  }
  const method = METHODS.lookup(methodWord, "method");
  const ofMethod = ofNutrient.filter((r) => r.method === method);
  if (ofMethod.length === 0) {
    throw new SoilError("NO_REFERENCE_DATA", `no ${method} table for ${nutrient}; tables exist for ${knownCombinations(ofNutrient)}`);
  }
  const crop = cropWord === undefined || cropWord.trim() === "" ? undefined : CROPS.lookup(cropWord, "crop");
  let candidates = crop && crop !== ANY ? ofMethod.filter((r) => r.crops.includes(crop)) : [];
  if (candidates.length === 0) candidates = ofMethod.filter((r) => r.crops.includes(ANY));
  if (candidates.length === 0) {
    if (crop === undefined || crop === ANY) {
      throw new SoilError("MISSING_INPUT", `crop is needed: ${nutrient} ${method} tables are crop-specific (${knownCombinations(ofMethod)})`);
    }
    throw new SoilError("NO_REFERENCE_DATA", `no ${nutrient} ${method} table for ${crop}; tables exist for ${knownCombinations(ofMethod)}`);
  }
  if (cec !== undefined) check(cec, { name: "cec", unit: "cmol(+)/kg", min: 0, minExclusive: true });
  if (candidates.some((r) => r.cec)) {
    if (cec === undefined) {
      throw new SoilError("MISSING_INPUT", `cec is needed: the ${nutrient} ${method} levels depend on CEC (${candidates.map(describeRow).join("; ")})`);
    }
    candidates = candidates.filter((r) => cecMatches(r, cec));
  }
  const row = candidates[0];
  if (!row) throw new SoilError("NO_REFERENCE_DATA", `no ${nutrient} ${method} table covers CEC ${cec}`);
  return row;
}

/**
 * The id of the built-in table that SOIL.SUFFICIENCY would read for these arguments (its row in
 * src/data/bands/ and in sufficiencyTables() carries the source).
 * @throws as sufficiencyBand, except for the value checks
 * @example sufficiencyTableId("K", "corn", "Mehlich-3", 12) //=> "tristate2020-m3-k-cec-above-5"
 */
export function sufficiencyTableId(nutrientWord: string, cropWord?: string, methodWord?: string, cec?: number): string {
  return sufficiencyTableFor(nutrientWord, cropWord, methodWord, cec).id;
}

/**
 * The band label a built-in reference table gives a soil-test or plant-tissue value
 * (SOIL.SUFFICIENCY). The value must be in the table's unit (see sufficiencyTables()).
 * @param nutrientWord P, K, N, Ca, Mg, B, Cu, Mn, Mo, Zn (or the element's name)
 * @param value soil-test or tissue value in the table's unit (mg/kg, mg/L or % of dry matter), ≥ 0
 * @param cropWord corn, soybean, wheat, alfalfa, canola; omitted: a crop-independent table
 * @param methodWord Bray-1, Mehlich-3, Olsen, Colwell, ammonium acetate, or tissue
 * @param cec cation exchange capacity, cmol(+)/kg (> 0); needed where the table depends on it
 * @returns the source's own band label
 * @throws as sufficiencyTableFor; OUT_OF_RANGE for a negative value or a percentage above 100;
 *   NO_REFERENCE_DATA for a value beyond the top of a closed published scale
 * @example sufficiencyBand("P", 25, "corn", "Mehlich-3") //=> "Optimal"
 */
export function sufficiencyBand(nutrientWord: string, value: number, cropWord?: string, methodWord?: string, cec?: number): string {
  const row = sufficiencyTableFor(nutrientWord, cropWord, methodWord, cec);
  check(value, { name: "value", unit: row.unit, min: 0, max: row.unit === "%" ? 100 : undefined });
  if (row.scale_top !== undefined && value >= row.scale_top) {
    throw new SoilError(
      "NO_REFERENCE_DATA",
      `${value} ${row.unit} is above the published scale of ${describeRow(row)}, which ends below ${row.scale_top} ${row.unit}`,
    );
  }
  return bandLabel(value, row.limits, row.labels);
}

/** One entry of the list of built-in tables, for `soilcell list` and help. */
export interface SufficiencyTableInfo {
  readonly id: string;
  readonly nutrient: string;
  readonly method: string;
  /** Crops the table applies to, joined ("any" for a crop-independent table). */
  readonly crop: string;
  readonly unit: string;
  /** The CEC condition, e.g. "CEC ≤ 5 cmol(+)/kg", or "" when the table does not depend on CEC. */
  readonly cec: string;
  /** Sampled plant part and growth stage of a tissue table, or "". */
  readonly sampling: string;
  readonly limits: readonly number[];
  readonly labels: readonly string[];
  readonly source: string;
  /** Where the values were seen and whether first-hand or secondary. */
  readonly status: string;
}

/**
 * The built-in sufficiency tables with their sources (for `soilcell list`).
 * @returns one entry per table row, in file order (no @example: the result is a list)
 */
export function sufficiencyTables(): SufficiencyTableInfo[] {
  return SUFFICIENCY_ROWS.map((r) => ({
    id: r.id,
    nutrient: r.nutrient,
    method: r.method,
    crop: r.crops.join(", "),
    unit: r.unit,
    cec: r.cec ? (r.cec.max !== undefined ? `CEC ≤ ${r.cec.max} cmol(+)/kg` : `CEC > ${r.cec.above} cmol(+)/kg`) : "",
    sampling: [r.part, r.stage].filter(Boolean).join(", "),
    limits: r.limits,
    labels: r.labels,
    source: r.source,
    status: `${r.status}; ${r.seen_at}`,
  }));
}
