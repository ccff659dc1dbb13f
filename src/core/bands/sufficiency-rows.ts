/**
 * The built-in sufficiency tables and the words that pick them: nutrient, extraction method and
 * crop (or rotation). Every table is a row of a JSON file under src/data/bands/ with its limits,
 * its source's own edge rule (`at_limit`, one per limit, explained in `edge_rule`), labels and
 * source; nothing of a published table is typed in here.
 *
 * Crops: a crop word, or a rotation written as crops joined by "-" (also "/", "," or "+"):
 * "corn-soybean-wheat". Tables keyed by the rotation (the Tri-State P critical levels) read the
 * whole rotation; tables keyed by the crop grown need one crop (or a rotation of crops that share
 * the table).
 */
import pBray1 from "../../data/bands/p-bray1.json";
import pMehlich3 from "../../data/bands/p-mehlich3.json";
import kMehlich3 from "../../data/bands/k-mehlich3.json";
import pOlsen from "../../data/bands/p-olsen.json";
import pColwell from "../../data/bands/p-colwell.json";
import sKcl40 from "../../data/bands/s-kcl40.json";
import microDtpa from "../../data/bands/micro-dtpa.json";
import microMehlich3 from "../../data/bands/micro-mehlich3.json";
import tissueAlfalfa from "../../data/bands/tissue-alfalfa.json";
import tissueSoybean from "../../data/bands/tissue-soybean.json";
import tissueClover from "../../data/bands/tissue-clover.json";
import cropWords from "../../data/bands/crops.json";
import { SoilError, listWords } from "../errors";
import { nameTable, normaliseWord } from "../names";
import { AtLimit } from "./bands";

/** One reference table as stored in src/data/bands/*.json. */
export interface SufficiencyRow {
  readonly id: string;
  readonly nutrient: string;
  readonly method: string;
  /** Crops the table covers; ["any"] for a crop-independent table. */
  readonly crops: readonly string[];
  /**
   * Present when the source keys the table by the rotation rather than the crop grown:
   * `only` = every crop of the rotation is one of these; `includes_any` = the rotation includes
   * at least one of these. The rotation's crops must all be in `crops`.
   */
  readonly rotation?: { readonly only?: readonly string[]; readonly includes_any?: readonly string[] };
  readonly unit: string;
  readonly limits: readonly number[];
  /** Per limit: the side a value equal to it falls on, as the source prints it. */
  readonly at_limit: readonly AtLimit[];
  /** The source's edge rule in words, with the printed form it comes from. */
  readonly edge_rule: string;
  readonly labels: readonly string[];
  /** CEC condition in cmol(+)/kg: `max` = at most, `above` = greater than. */
  readonly cec?: { readonly max?: number; readonly above?: number };
  /** First value past the published scale (values ≥ it are not classified). */
  readonly scale_top?: number;
  /** Soil sampling depth the table was calibrated for, e.g. "0-30 cm". */
  readonly depth?: string;
  /** The same depth as a number: the bottom of the 0-to-depth core, cm (SOIL.SUFFICIENCY's depth_cm must equal it). */
  readonly depth_cm?: number;
  /**
   * Present when the table is read only when named by its id, never chosen by the other arguments:
   * why (another source disagrees for the same crop and depth, and the choice is the consultant's).
   */
  readonly only_by_id?: string;
  /** Plant part and growth stage of a tissue table. */
  readonly part?: string;
  readonly stage?: string;
  readonly source: string;
  readonly seen_at: string;
  readonly status: string;
  readonly note?: string;
}

const FILES = [
  pBray1,
  pMehlich3,
  kMehlich3,
  pOlsen,
  pColwell,
  sKcl40,
  microDtpa,
  microMehlich3,
  tissueAlfalfa,
  tissueSoybean,
  tissueClover,
] as unknown as { rows: SufficiencyRow[] }[];

/** Every built-in table row, in file order. */
export const SUFFICIENCY_ROWS: readonly SufficiencyRow[] = FILES.flatMap((f) => f.rows);

/** The crop word of a crop-independent table. */
export const ANY = "any";

export const NUTRIENTS = nameTable([
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

export const METHODS = nameTable([
  { id: "Bray-1", aliases: ["Bray 1", "Bray1", "Bray P1", "Bray-P1", "BrayP1", "Bray I", "Bray"], value: "Bray-1" },
  { id: "Mehlich-3", aliases: ["Mehlich 3", "Mehlich3", "M3", "Mehlich III", "Mehlich-III", "MIII", "M-3"], value: "Mehlich-3" },
  { id: "Olsen", aliases: ["Olsen P", "bicarbonate", "NaHCO3", "sodium bicarbonate"], value: "Olsen" },
  { id: "Colwell", aliases: ["Colwell P", "Colwell K"], value: "Colwell" },
  { id: "KCl-40", aliases: ["KCl40", "KCl 40", "KCl-40 S", "0.25 M KCl"], value: "KCl-40" },
  { id: "DTPA", aliases: ["DTPA-TEA"], value: "DTPA" },
  { id: "hot CaCl2", aliases: ["hot CaCl2 B", "hot-CaCl2", "hot-CaCl2 B", "hot calcium chloride", "hot-calcium-chloride", "CaCl2 hot"], value: "hot CaCl2" },
  { id: "ammonium acetate", aliases: ["NH4OAc", "NH4OAc K", "ammonium acetate K", "ammonium-acetate", "1 N ammonium acetate"], value: "ammonium acetate" },
  { id: "tissue", aliases: ["plant", "plant tissue", "leaf", "plant analysis", "tissue test"], value: "tissue" },
]);

export const CROPS = nameTable(cropWords.crops.map((c) => ({ id: c.id, aliases: c.aliases, value: c.id })));

/** A crop argument as read: the crops named, and whether several were joined as a rotation. */
export interface CropSpec {
  /** Canonical crop ids, deduplicated, in the order given. */
  readonly crops: readonly string[];
  /** True when the word joined two or more crop words (even the same one: "corn-corn"). */
  readonly rotation: boolean;
  /** The word as typed, for messages. */
  readonly word: string;
}

const ROTATION_SEPARATORS = /\s*[-–—/,+]\s*/;

/**
 * Reads a crop argument: one crop word, "any", or a rotation of crop words joined by "-", "/",
 * "," or "+". A whole word that is itself a crop name ("sub-clover") is one crop.
 * @returns undefined for an omitted crop or "any"
 * @throws UNKNOWN_NAME for a word that is not a crop (the message lists the crops)
 */
export function readCrop(word: string | undefined): CropSpec | undefined {
  if (word === undefined || word.trim() === "") return undefined;
  if (CROPS.has(word)) {
    // Stryker disable next-line StringLiteral: equivalent: has() was checked, so lookup never throws and its word for the message is never shown
    const id = CROPS.lookup(word, "crop");
    return id === ANY ? undefined : { crops: [id], rotation: false, word: word.trim() };
  }
  const parts = word.trim().split(ROTATION_SEPARATORS).filter((p) => p !== "");
  if (parts.length < 2) CROPS.lookup(word, "crop"); // throws, listing the crops
  const ids = parts.map((p) => {
    if (!CROPS.has(p)) {
      throw new SoilError(
        "UNKNOWN_NAME",
        `unknown crop "${p}" in "${word.trim()}"; use a crop (${listWords(CROPS.ids)}) or a rotation of them joined by "-", e.g. corn-soybean-wheat`,
      );
    }
    // Stryker disable next-line StringLiteral: equivalent: has() was checked, so lookup never throws and its word for the message is never shown
    const id = CROPS.lookup(p, "crop");
    if (id === ANY) throw new SoilError("UNKNOWN_NAME", `"${p}" cannot be part of a rotation ("${word.trim()}"); name the crops`);
    return id;
  });
  return { crops: [...new Set(ids)], rotation: true, word: word.trim() };
}

/** Does a rotation-keyed row fit these crops? Rows without a rotation key always do. */
export function rotationFits(r: SufficiencyRow, spec: CropSpec): boolean {
  if (!r.rotation) return true;
  const { only, includes_any: includes } = r.rotation;
  if (only && !(spec.rotation && spec.crops.every((c) => only.includes(c)))) return false;
  if (includes && !spec.crops.some((c) => includes.includes(c))) return false;
  return true;
}

/** The CEC condition of a row in words, or "". */
export function cecText(r: SufficiencyRow): string {
  if (!r.cec) return "";
  return r.cec.max !== undefined ? `CEC ≤ ${r.cec.max} cmol(+)/kg` : `CEC > ${r.cec.above} cmol(+)/kg`;
}

/** What a row covers, in words: its crops or rotation. */
export function coverText(r: SufficiencyRow): string {
  if (r.crops.includes(ANY)) return "any crop";
  if (r.rotation?.only) return `rotation of ${r.rotation.only.join(" and ")} only`;
  if (r.rotation?.includes_any) return `rotation including ${listWords(r.rotation.includes_any)}`;
  return r.crops.join(", ");
}

/** Sampling depth, plant part and stage of a row, joined, or "". */
export function samplingText(r: SufficiencyRow): string {
  return [r.depth, r.part, r.stage].filter(Boolean).join(", ");
}

/** One row in a message: "P Bray-1 (any crop; mg/kg)". */
export function describeRow(r: SufficiencyRow): string {
  const extra = [coverText(r), cecText(r), samplingText(r)].filter(Boolean).join("; ");
  return `${r.nutrient} ${r.method} (${extra}; ${r.unit})`;
}

/** The combinations that exist, one per table, deduplicated, for messages. */
export function knownCombinations(rows: readonly SufficiencyRow[]): string {
  const seen = [...new Set(rows.map((r) => describeRow({ ...r, cec: undefined }).replace(/\)$/, r.cec ? "; by CEC)" : ")")))];
  return seen.join("; ");
}

export function cecMatches(r: SufficiencyRow, cec: number): boolean {
  if (!r.cec) return true;
  if (r.cec.max !== undefined && !(cec <= r.cec.max)) return false;
  if (r.cec.above !== undefined && !(cec > r.cec.above)) return false;
  return true;
}

/** The built-in row with this id (case-insensitive), or undefined. */
export function rowById(id: string): SufficiencyRow | undefined {
  const key = normaliseWord(id);
  return SUFFICIENCY_ROWS.find((r) => normaliseWord(r.id) === key);
}
