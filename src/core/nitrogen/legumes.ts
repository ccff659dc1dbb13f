/**
 * The legume words of the legume checks and the published levels each one is checked against, read
 * from `src/data/nitrogen/legume-checks.json` (one source per level). Shared by the nodulation
 * functions and the soil screen; typed keys are resolved once, at load, so a row naming a level
 * that does not exist fails the first test that loads this module.
 */
import table from "../../data/nitrogen/legume-checks.json";
import { SoilError } from "../errors";
import { nameTable } from "../names";
import { check, Bound, notANumberHint, numericText } from "../validate";

/** How a reading is compared with a published level, as the source words it. */
export type FlagWhen = "below" | "at_or_below" | "above" | "at_or_above";

/** A published level: the reading is flagged when it lies on the `flagWhen` side of `level`. */
export interface Level {
  readonly id: string;
  readonly level: number;
  readonly flagWhen: FlagWhen;
  /** What the source says happens on the flagged side, in a sentence fragment. */
  readonly meaning: string;
  /** Short citation shown in results, e.g. "GRDC Paddock Practices 2022 (SARDI)". */
  readonly short: string;
}

export interface PhLevel extends Level {
  /** The pH test the source states, or "not stated". */
  readonly test: "CaCl2" | "water" | "not stated";
}

export interface CountLevel extends Level {
  /** The source's own word for a count that meets the level ("Good", "Adequate"). */
  readonly metLabel: string;
}

export interface BoronLevel extends Level {
  readonly method: string;
}

export interface Legume {
  readonly id: string;
  readonly kind: string;
  readonly ph?: PhLevel;
  readonly nitrate: readonly Level[];
  readonly count?: CountLevel;
  readonly boron?: BoronLevel;
  /** Published context shown beside a check (e.g. why a legume has no pH level). */
  readonly phNote?: string;
  /**
   * Why a flagged nitrate level is reported as possible and not counted for this legume (a source
   * says it keeps fixing N at that nitrate), with the citation.
   */
  readonly nitrateNotCounted?: string;
  readonly note?: string;
}

/** An optional measurement: blank or omitted is "not measured", a number or numeric text is read. */
export function measured(value: string | number | undefined, bound: Bound): number | undefined {
  if (value === undefined) return undefined;
  if (typeof value === "number") return check(value, bound);
  if (value.trim() === "") return undefined;
  const n = numericText(value);
  if (n === undefined) throw new SoilError("NOT_A_NUMBER", `${bound.name}: "${value}" is not a number${notANumberHint(value)}`);
  return check(n, bound);
}

/** True when `value` lies on the flagged side of the level. */
export function flagged(value: number, l: Level): boolean {
  switch (l.flagWhen) {
    case "below":
      return value < l.level;
    case "at_or_below":
      return value <= l.level;
    case "above":
      return value > l.level;
    case "at_or_above":
      return value >= l.level;
  }
}

const FLAG_WORDS: Record<FlagWhen, readonly [flaggedWord: string, clearWord: string]> = {
  below: ["below", "not below"],
  at_or_below: ["at or below", "above"],
  above: ["above", "not above"],
  at_or_above: ["at or above", "below"],
};

/** "below 5.5" or "not below 5.5": how the reading stands against the level, in words. */
export function sideWords(value: number, l: Level): string {
  const [yes, no] = FLAG_WORDS[l.flagWhen];
  return `${flagged(value, l) ? yes : no} ${fmt(l.level)}`;
}

/** A number as a report shows it: at most 6 significant figures, no trailing zeros. */
export function fmt(v: number): string {
  return String(Number(v.toPrecision(6)));
}

interface RawLevel {
  id: string;
  level?: number;
  per_plant?: number;
  flag_when: string;
  meaning?: string;
  met_meaning?: string;
  short: string;
}

function level(r: RawLevel): Level {
  const value = r.level ?? r.per_plant;
  // A level without its meaning would show a blank where the source's words belong.
  const meaning = r.meaning ?? r.met_meaning;
  if (value === undefined || meaning === undefined || !(r.flag_when in FLAG_WORDS)) throw new Error(`legume-checks.json: level ${r.id} is malformed`);
  return { id: r.id, level: value, flagWhen: r.flag_when as FlagWhen, meaning, short: r.short };
}

function byId<T extends { id: string }>(rows: readonly T[]): Map<string, T> {
  return new Map(rows.map((r) => [r.id, r]));
}

const PH = byId(table.ph_levels.map((r) => ({ ...level(r), test: r.test as PhLevel["test"] })));
const NITRATE = byId(table.nitrate_levels.map(level));
const COUNT = byId(table.count_levels.map((r) => ({ ...level(r), metLabel: r.met_label })));
const BORON = byId(table.boron_levels.map((r) => ({ ...level(r), method: r.method })));

function resolve<T>(map: Map<string, T>, id: string | null | undefined, legume: string): T | undefined {
  if (id === null || id === undefined) return undefined;
  const found = map.get(id);
  if (!found) throw new Error(`legume-checks.json: ${legume} names an unknown level "${id}"`);
  return found;
}

interface RawLegume {
  id: string;
  aliases: string[];
  kind: string;
  ph: string | null;
  nitrate: string[];
  count: string | null;
  boron: string | null;
  ph_note?: string;
  nitrate_not_counted?: string;
  note?: string;
}

const LEGUMES: Legume[] = (table.legumes as RawLegume[]).map((r) => ({
  id: r.id,
  kind: r.kind,
  ph: resolve(PH, r.ph, r.id),
  nitrate: r.nitrate.map((id) => resolve(NITRATE, id, r.id) as Level),
  count: resolve(COUNT, r.count, r.id),
  boron: resolve(BORON, r.boron, r.id),
  phNote: r.ph_note,
  nitrateNotCounted: r.nitrate_not_counted,
  note: r.note,
}));

const NAMES = nameTable((table.legumes as RawLegume[]).map((r, i) => ({ id: r.id, aliases: r.aliases, value: LEGUMES[i] as Legume })));

/** Legume and inoculant-group words the legume checks accept. */
export const LEGUME_WORDS: readonly string[] = NAMES.ids;

/** The molybdenum level (all legumes) and the nodulation scale, as the data file gives them. */
export const MO_LEVEL: PhLevel = { ...level({ id: "mo", ...table.mo_level }), test: table.mo_level.test as PhLevel["test"] };
/** Why the Mo check is reported as possible and never counted as a constraint. */
export const MO_NOT_COUNTED: string = table.mo_level.why_not_counted;
export const NODULATION_SCALE = table.nodulation_scale;
export const PINK_NODULES = table.pink_nodules;

/**
 * The legume (or inoculant group) a word names, with its published levels.
 * @throws UNKNOWN_NAME listing the accepted words
 */
export function legumeOf(word: string, argName = "legume"): Legume {
  if (word.trim() === "") throw new SoilError("MISSING_INPUT", `${argName} is required: name the legume (e.g. "field pea") or inoculant group (e.g. "group N")`);
  return NAMES.lookup(word, argName);
}
