/**
 * Unit families and conversions (mass fraction, exchangeable charge, per soil volume, area rate,
 * salinity). Factors come from `src/data/units.json`, each row with its definition and source.
 *
 * Source: SI and NIST SP 811 (Thompson & Taylor 2008); pound and acre from the 1959 international
 * yard and pound agreement and NIST Handbook 44 App. C.
 */
import unitData from "../data/units.json";
import { SoilError, listWords } from "./errors";
import { nameTable, normaliseWord } from "./names";
import { BOUNDS, check, finite } from "./validate";

export type UnitFamily = "mass_fraction" | "charge" | "per_volume" | "area_rate" | "salinity";

export interface UnitDef {
  readonly id: string;
  readonly family: UnitFamily;
  /** Amount of the family's base unit in one of this unit. */
  readonly toBase: number;
  readonly definition: string;
  readonly source: string;
}

interface UnitRow {
  id: string;
  family: string;
  aliases: string[];
  /** Spellings matched exactly, where an SI prefix collides (Mg/ha is a tonne per hectare). */
  cased_aliases?: string[];
  factor?: number;
  mass_kg?: number;
  area_m2?: number;
  definition: string;
  source: string;
}

function rowFactor(row: UnitRow): number {
  if (row.factor !== undefined) return row.factor;
  if (row.mass_kg !== undefined && row.area_m2 !== undefined) {
    // kg/ha per unit: mass over area, the area expressed in hectares.
    return row.mass_kg / (row.area_m2 / 10000);
  }
  // Stryker disable next-line StringLiteral: equivalent: every row of units.json has a factor or a mass and an area, so no input reaches this data check (it runs at import)
  throw new Error(`unit row ${row.id} has no factor`);
}

export const UNITS: readonly UnitDef[] = (unitData.units as UnitRow[]).map((row) => ({
  id: row.id,
  family: row.family as UnitFamily,
  toBase: rowFactor(row),
  definition: row.definition,
  source: row.source,
}));

const TABLE = nameTable(
  (unitData.units as UnitRow[]).map((row, i) => ({ id: row.id, aliases: row.aliases, value: UNITS[i] as UnitDef })),
);

/** Spellings whose case carries meaning, matched exactly before anything else. */
const CASED = new Map<string, UnitDef>(
  (unitData.units as UnitRow[]).flatMap((row, i) => (row.cased_aliases ?? []).map((w) => [w.replace(/\s+/g, " ").trim(), UNITS[i] as UnitDef] as const)),
);

interface RefusedRow {
  words: string[];
  why: string;
  use: string[];
  hint?: string;
}

/** Words two trades read differently, keyed by their case-insensitive form. */
const REFUSED = new Map<string, RefusedRow>(
  (unitData.refused as RefusedRow[]).flatMap((r) => r.words.map((w) => [normaliseWord(w), r] as const)),
);

/** The words the unit tables refuse, for tests and help. */
export const REFUSED_UNIT_WORDS: readonly string[] = (unitData.refused as RefusedRow[]).flatMap((r) => r.words);

/** A spelling without its spaces, so "mg kg-1" and "mgkg-1" compare as one word. */
// Stryker disable next-line Regex: equivalent for /\s/g: a global replace removes a run of spaces one by one too
const compact = (w: string) => w.replace(/\s+/g, "");
/** Every spelling of each unit, as the table writes it, to check the case of an SI prefix against. */
const SPELLINGS = new Map<UnitDef, string[]>(
  (unitData.units as UnitRow[]).map((row, i) => [UNITS[i] as UnitDef, [row.id, ...row.aliases, ...(row.cased_aliases ?? [])]] as const),
);

/**
 * Where an m or M stands as an SI prefix before g (gram) or S (siemens), its case is its
 * meaning: milli (10^-3) or mega (10^6) (NIST SP 811, Thompson & Taylor 2008). A word matched
 * case-insensitively whose prefix case differs from every spelling of the unit is refused.
 */
function prefixCaseDiffers(word: string, u: UnitDef): boolean {
  const w = compact(word);
  const prefixes = (s: string) => [...s.matchAll(/(?<![A-Za-z])([mM])(?=[gGsS])/g)].map((m) => `${m.index}:${m[1]}`).join(",");
  const typed = prefixes(w);
  if (!typed) return false;
  // Stryker disable next-line ArrayDeclaration: equivalent: SPELLINGS holds every unit the table returns, so the fallback list is never used
  return !(SPELLINGS.get(u) ?? []).map(compact).some((s) => s.toLowerCase() === w.toLowerCase() && prefixes(s) === typed);
}

const PREFIX_CASE: RefusedRow = {
  words: [],
  why: "has an SI prefix in the wrong case (m is milli, M is mega: Mg is a tonne, MS a megasiemens)",
  use: [],
};

/** What a typed word was found to be; remembered, since a unit column repeats one word. */
type Found = UnitDef | RefusedRow | null;
const seen = new Map<string, Found>();

function classify(word: string): Found {
  const exact = CASED.get(word.replace(/\s+/g, " ").trim());
  if (exact) return exact;
  const refused = REFUSED.get(normaliseWord(word));
  if (refused) return refused;
  if (!TABLE.has(word)) return null;
  // Stryker disable next-line StringLiteral: equivalent: the word was just found by TABLE.has, so this lookup never refuses and its "unit" never shows
  const u = TABLE.lookup(word, "unit");
  if (prefixCaseDiffers(word, u)) {
    const w = compact(word).toLowerCase();
    // The unit's own spelling of the word typed, as the table writes it (spaces kept: "mg kg-1",
    // not "mgkg-1"); no unit has two that differ only in case.
    // Stryker disable next-line ArrayDeclaration: equivalent: SPELLINGS holds every unit the table returns, so the fallback list is never used
    const same = (SPELLINGS.get(u) ?? []).find((x) => compact(x).toLowerCase() === w);
    return { ...PREFIX_CASE, use: [same ?? u.id] };
  }
  return u;
}

/** The unit a typed word names: a cased spelling exactly, else case-insensitively; undefined if none. */
function findUnit(word: string, argName: string): UnitDef | undefined {
  let found = seen.get(word);
  // Stryker disable next-line ConditionalExpression: equivalent for true: the memo only saves work; a word classified again is the same unit
  if (found === undefined) {
    found = classify(word);
    // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: the cap only bounds the memo's memory; a word not remembered is classified again to the same unit
    if (seen.size < 4096) seen.set(word, found);
  }
  if (found === null) return undefined;
  if ("why" in found) {
    const then = found.hint ? ` ${found.hint}` : "";
    throw new SoilError("UNIT_MISMATCH", `${argName} "${word.trim()}" ${found.why}; write ${listWords(found.use)}${then}`);
  }
  return found;
}

/** The unit ids of one family, for messages and help. */
export function unitsOf(family: UnitFamily): string[] {
  return UNITS.filter((u) => u.family === family).map((u) => u.id);
}

/**
 * Looks up a unit by id or alias: case-insensitive, except where an SI prefix collides (Mg/ha).
 * Throws UNIT_MISMATCH for an ambiguous word (naming the unambiguous spellings) and UNKNOWN_NAME
 * listing every unit for a word not in the table.
 */
export function unitById(word: string, argName = "unit"): UnitDef {
  const u = findUnit(word, argName);
  if (!u) throw new SoilError("UNKNOWN_NAME", `unknown unit "${word}"; use ${listWords(TABLE.ids)}`);
  return u;
}

/** Looks up a unit and requires it to be of one of `families`; otherwise UNIT_MISMATCH listing those units. */
export function unitOfFamily(word: string, families: readonly UnitFamily[], argName: string): UnitDef {
  // The accepted list is built only for a message: this runs once per cell of a season.
  const accepted = () => families.flatMap(unitsOf).join(", ");
  const u = findUnit(word, argName);
  if (!u) {
    throw new SoilError("UNKNOWN_NAME", `unknown unit "${word}" for ${argName}; use ${accepted()}`);
  }
  if (!families.includes(u.family)) {
    throw new SoilError("UNIT_MISMATCH", `${argName} "${word}" is not accepted here; use ${accepted()}`);
  }
  return u;
}

/** Soil layer for converting between a concentration in soil and an amount per area. */
export interface SoilLayer {
  /** Layer depth, cm (> 0, ≤ 300). */
  readonly depthCm?: number;
  /** Dry bulk density, g/cm3 (= t/m3; > 0, ≤ 2.65). */
  readonly bulkDensity?: number;
}

function needDepth(layer: SoilLayer, from: UnitDef, to: UnitDef): number {
  if (layer.depthCm === undefined) {
    throw new SoilError("MISSING_INPUT", `converting ${from.id} to ${to.id} needs depth_cm (the soil layer depth in cm)`);
  }
  return check(layer.depthCm, BOUNDS.depth());
}

function needDensity(layer: SoilLayer, from: UnitDef, to: UnitDef): number {
  if (layer.bulkDensity === undefined) {
    throw new SoilError("MISSING_INPUT", `converting ${from.id} to ${to.id} needs bulk_density (dry bulk density in g/cm3)`);
  }
  return check(layer.bulkDensity, BOUNDS.bulkDensity());
}

/**
 * Converts `value` from one unit to another.
 *
 * Within a family the factor is exact. Between families:
 * - mass fraction → area rate: kg/ha = mg/kg × depth_cm × bulk_density × 0.1 (soil mass of a layer
 *   of 1 ha × d cm at density ρ is d × ρ × 10^5 kg);
 * - per volume → mass fraction: mg/kg = mg/dm3 ÷ bulk_density;
 * - per volume → area rate: kg/ha = mg/dm3 × depth_cm × 0.1.
 * Charge ↔ mass needs an ion (SOIL.CMOL / SOIL.MGKG) and is refused here.
 *
 * @param value amount in `from`; any finite number (negative values are allowed for differences)
 * @returns the same amount in `to`
 * @throws UNKNOWN_NAME for an unknown unit; UNIT_MISMATCH between families that cannot be linked;
 *   MISSING_INPUT when depth or density is needed but not given; OUT_OF_RANGE for a bad depth/density
 * @example convertUnit(10, "mg/kg", "kg/ha", { depthCm: 15, bulkDensity: 1.3 }) //=> 19.5
 * Source: definition (layer mass = depth × bulk density × area); NIST SP 811 for factors.
 */
export function convertUnit(value: number, fromWord: string, toWord: string, layer: SoilLayer = {}): number {
  check(value, { name: "value" });
  const from = unitById(fromWord, "from_unit");
  const to = unitById(toWord, "to_unit");
  const base = value * from.toBase;
  const converted = convertBase(base, from, to, layer);
  return finite(converted / to.toBase, "the converted value");
}

/** Converts an amount in `from`'s base unit into `to`'s base unit. */
function convertBase(base: number, from: UnitDef, to: UnitDef, layer: SoilLayer): number {
  if (from.family === to.family) return base;
  const key = `${from.family}>${to.family}`;
  switch (key) {
    case "mass_fraction>area_rate":
      return base * needDepth(layer, from, to) * needDensity(layer, from, to) * 0.1;
    case "area_rate>mass_fraction":
      return base / (needDepth(layer, from, to) * needDensity(layer, from, to) * 0.1);
    case "per_volume>mass_fraction":
      return base / needDensity(layer, from, to);
    case "mass_fraction>per_volume":
      return base * needDensity(layer, from, to);
    case "per_volume>area_rate":
      return base * needDepth(layer, from, to) * 0.1;
    case "area_rate>per_volume":
      return base / (needDepth(layer, from, to) * 0.1);
    default: {
      const hint =
        from.family === "charge" || to.family === "charge"
          ? "; charge and mass are linked through an ion: use SOIL.CMOL or SOIL.MGKG"
          : "";
      throw new SoilError("UNIT_MISMATCH", `cannot convert ${from.id} (${familyLabel(from.family)}) to ${to.id} (${familyLabel(to.family)})${hint}`);
    }
  }
}

function familyLabel(f: UnitFamily): string {
  // Stryker disable next-line OptionalChaining: equivalent: every family a unit row names has a label in units.json, so the lookup is never undefined
  return (unitData.families as Record<string, { label: string }>)[f]?.label ?? f;
}

/** Converts an area rate between units (kg/ha, t/ha, g/m2, lb/ac, ton/ac). */
export function convertRate(value: number, fromWord: string, toWord: string): number {
  const from = unitOfFamily(fromWord, ["area_rate"], "unit");
  const to = unitOfFamily(toWord, ["area_rate"], "unit");
  return finite((value * from.toBase) / to.toBase, "the converted rate");
}
