/**
 * Soil conditions for N2 fixation: screens a paddock's soil test for a named legume (or inoculant
 * group) against published levels: pH for its rhizobia, soil nitrate-N at sowing, molybdenum supply
 * at low pH, and hot-water boron where a source gives a level. Each check reports a constraint, no
 * constraint, or that it was not made and why; a legume with no published level for a check gets
 * no check, never an invented one. pH in water and in CaCl2 are different tests: the test is an
 * argument, a level is compared only with a reading of its own test, and a water pH is never
 * converted. A check its sources leave open is reported as possible and not counted: Mo (its
 * source states no pH test, and a low pH makes a deficiency only more likely) and a general pulse
 * nitrate level for a legume a source says keeps fixing at that nitrate (faba bean). Levels and
 * sources: `src/data/nitrogen/legume-checks.json`. Screening aids only: an inoculant's label and
 * local advice govern.
 */
import { SoilError } from "../errors";
import { nameTable } from "../names";
import { BOUNDS, check, Bound } from "../validate";
import { flagged, fmt, Legume, legumeOf, Level, measured, MO_LEVEL, MO_NOT_COUNTED, PhLevel, sideWords } from "./legumes";

/** Bounds of the soil-test inputs; the upper bounds of nitrate and B are guards against unit slips. */
export const FIXSOIL_BOUNDS = {
  ph: BOUNDS.ph("ph"),
  /** Above this a value is more likely mg NO3/kg or a sum of layers than kg nitrate-N/ha at sowing. */
  nitrate: { name: "nitrate_kg_ha", unit: "kg N/ha", min: 0, max: 1000 },
  /** Hot-water B in soils is a few mg/kg at most; above this it is taken as a unit slip (guard). */
  boron: { name: "hot_water_b_mg_kg", unit: "mg/kg", min: 0, max: 50 },
} as const satisfies Record<string, Bound>;

export type PhTest = "CaCl2" | "water";

const PH_TESTS = nameTable<PhTest>([
  { id: "CaCl2", aliases: ["pHCa", "pH(CaCl2)", "calcium chloride", "0.01M CaCl2"] /* words are read without their spaces: "0.01 M CaCl2" too */, value: "CaCl2" },
  { id: "water", aliases: ["pHw", "pH(water)", "H2O", "1:5 water", "deionised water", "deionized water"], value: "water" },
]);

/** Words accepted for ph_method. */
export const PH_TEST_WORDS: readonly string[] = PH_TESTS.ids;

/**
 * The pH test a word names: "CaCl2" or "water" (and their spellings). There is no default.
 * @throws MISSING_INPUT when blank; UNKNOWN_NAME for another word
 * @example nfixPhTest("pHCa") //=> "CaCl2"
 */
export function nfixPhTest(word: string): PhTest {
  if (word.trim() === "") throw new SoilError("MISSING_INPUT", 'ph_method is required: "CaCl2" or "water" (different tests; never assumed)');
  return PH_TESTS.lookup(word, "ph_method");
}

export type CheckName = "pH" | "nitrate" | "Mo" | "B";

export interface SoilCheck {
  readonly check: CheckName;
  /**
   * constraint: counted; possible: flagged by a level its sources leave open (reported, not
   * counted); clear: not flagged; not made: no level, another pH test, or no reading.
   */
  readonly status: "constraint" | "possible" | "clear" | "not made";
  /** One clause naming the reading, the level, the source, and on a constraint what it means. */
  readonly text: string;
}

const cite = (l: Level, extra = "") => `[${l.short}${extra}]`;

function phCheck(legume: Legume, ph: number, test: PhTest): SoilCheck {
  const l: PhLevel | undefined = legume.ph;
  if (!l) {
    const why = legume.phNote ? ` (${legume.phNote})` : "";
    return { check: "pH", status: "not made", text: `pH for the rhizobia: no published level for ${legume.id} found${why}` };
  }
  if (l.test !== "not stated" && l.test !== test) {
    return {
      check: "pH",
      status: "not made",
      text: `pH for the rhizobia: the published level for ${legume.id} is pH ${fmt(l.level)} in ${l.test} ${cite(l)}, and a ${test} pH is not converted`,
    };
  }
  const unstated = l.test === "not stated" ? "; the source does not state its pH test" : "";
  const hit = flagged(ph, l);
  return {
    check: "pH",
    status: hit ? "constraint" : "clear",
    text: `pH ${fmt(ph)} (${test}) is ${sideWords(ph, l)}${hit ? `: ${l.meaning}` : ""} ${cite(l, unstated)}`,
  };
}

/** Levels grouped where two sources give the same level the same way (cited together when clear). */
function sameLevels(levels: readonly Level[]): Level[][] {
  const groups = new Map<string, Level[]>();
  for (const l of levels) {
    const key = `${l.flagWhen} ${l.level}`;
    groups.set(key, [...(groups.get(key) ?? []), l]);
  }
  return [...groups.values()];
}

function nitrateCheck(legume: Legume, nitrate: number | undefined): SoilCheck {
  if (!legume.nitrate.length) {
    return { check: "nitrate", status: "not made", text: `nitrate-N at sowing: no published suppression level for ${legume.id} found` };
  }
  if (nitrate === undefined) {
    const levels = legume.nitrate.map((l) => `${fmt(l.level)} kg N/ha ${cite(l)}`).join(", ");
    return { check: "nitrate", status: "not made", text: `nitrate-N at sowing: not given (levels for ${legume.id}: ${levels})` };
  }
  const hits = legume.nitrate.filter((l) => flagged(nitrate, l));
  const parts = hits.length
    ? hits.map((l) => `${sideWords(nitrate, l)}: ${l.meaning} ${cite(l)}`)
    : sameLevels(legume.nitrate).map((ls) => `${sideWords(nitrate, ls[0]!)} [${ls.map((l) => l.short).join("; ")}]`);
  // A legume a source says keeps fixing at this nitrate: the general level is reported, not counted.
  const open = hits.length > 0 && legume.nitrateNotCounted !== undefined;
  const note = open ? `, but ${legume.nitrateNotCounted}` : "";
  return {
    check: "nitrate",
    status: hits.length ? (open ? "possible" : "constraint") : "clear",
    text: `nitrate-N ${fmt(nitrate)} kg N/ha at sowing is ${parts.join(", and ")}${note}`,
  };
}

/** Mo: possible at or below pH 5.5 in either test, never counted (MO_NOT_COUNTED says why). */
function moCheck(ph: number, test: PhTest): SoilCheck {
  const hit = flagged(ph, MO_LEVEL);
  return {
    check: "Mo",
    status: hit ? "possible" : "clear",
    text: `Mo: pH ${fmt(ph)} (${test}) is ${sideWords(ph, MO_LEVEL)}${hit ? `: ${MO_LEVEL.meaning}` : ""} ${cite(MO_LEVEL, "; the source does not state its pH test")}${hit ? ` (not counted: ${MO_NOT_COUNTED})` : ""}`,
  };
}

function boronCheck(legume: Legume, b: number | undefined): SoilCheck {
  const l = legume.boron;
  if (!l) return { check: "B", status: "not made", text: `B: no published soil-test level for ${legume.id} found` };
  if (b === undefined) {
    return { check: "B", status: "not made", text: `B: hot-water B not given (level for ${legume.id}: ${fmt(l.level)} mg/kg ${cite(l)})` };
  }
  const hit = flagged(b, l);
  return {
    check: "B",
    status: hit ? "constraint" : "clear",
    text: `${l.method} B ${fmt(b)} mg/kg is ${sideWords(b, l)}${hit ? `: ${l.meaning}` : ""} ${cite(l)}`,
  };
}

/**
 * The soil checks for N2 fixation by a legume, in the order pH, nitrate, Mo, B.
 * pH: field pea, faba bean, lentil, vetch (inoculant groups E, F) and chickpea (N): rhizobia
 * sensitive below pH 5.5 CaCl2 (GRDC Paddock Practices 2022, SARDI; seen); clovers: nodulation
 * below adequate under pHCa 5.55 (Hackney et al. 2019, Crop Pasture Sci 70:1128; abstract seen).
 * Nitrate-N at sowing: pulses fix little above 100 kg/ha (Cox, GRDC Communities; seen), chickpea
 * likewise (GRDC Communities; seen); pea: fixation starts only below 56, absolutely inhibited
 * above 380 kg N/ha (Voisin et al. 2002; abstract seen); faba bean keeps fixing at moderate to
 * high nitrate (GRDC Communities; GRDC fact sheet 2013; seen), so its flag is possible, not a
 * constraint. Mo: pH at or below 5.5 (Molybdenum – NSW fact sheet, soilquality.org.au; seen; its
 * pH test is not stated, so the reading is compared as given, and the flag is possible, not a
 * constraint). B: lucerne, hot-water B below 0.34 mg/kg (Haddad & Kaldor 1982; abstract seen).
 * @param legume a legume or inoculant-group word (see LEGUME_WORDS)
 * @param ph soil pH, 0–14, measured by `phMethod`
 * @param phMethod "CaCl2" or "water": required, never assumed
 * @param nitrateKgHa nitrate-N at sowing, kg N/ha, 0–1000; blank or omitted = not measured (the
 *   check is listed as not made)
 * @param hotWaterB hot-water-soluble B, mg/kg, 0–50; blank or omitted = not measured
 * @returns one check per soil factor, each with its status and text
 * @throws UNKNOWN_NAME for an unknown legume or pH test; MISSING_INPUT for a blank one;
 *   OUT_OF_RANGE for readings out of bounds; NOT_A_NUMBER for text such as "<0.5"
 */
export function nfixSoilChecks(
  legume: string,
  ph: number,
  phMethod: string,
  nitrateKgHa?: string | number,
  hotWaterB?: string | number,
): SoilCheck[] {
  const row = legumeOf(legume);
  const test = nfixPhTest(phMethod);
  check(ph, FIXSOIL_BOUNDS.ph);
  const nitrate = measured(nitrateKgHa, FIXSOIL_BOUNDS.nitrate);
  const b = measured(hotWaterB, FIXSOIL_BOUNDS.boron);
  return [phCheck(row, ph, test), nitrateCheck(row, nitrate), moCheck(ph, test), boronCheck(row, b)];
}

/**
 * The soil screen as one text per paddock, each clause naming its source; never a bare OK.
 * "2 constraints found: …", or "none found in the checks made: …" listing every check made, then
 * the possible ones (reported, not counted), then the checks not made and why.
 * Arguments and errors as nfixSoilChecks.
 * @returns the screen's text, each clause naming its source in brackets
 * @example nfixSoilText("field pea", 5.1, "CaCl2", 40) //=> "1 constraint found: pH 5.1 (CaCl2) is below 5.5…"
 * @example nfixSoilText("chickpea", 6.4, "CaCl2", 60) //=> "none found in the checks made: pH 6.4 (CaCl2) is not below 5.5…"
 */
export function nfixSoilText(legume: string, ph: number, phMethod: string, nitrateKgHa?: string | number, hotWaterB?: string | number): string {
  const checks = nfixSoilChecks(legume, ph, phMethod, nitrateKgHa, hotWaterB);
  const of = (s: SoilCheck["status"]) => checks.filter((c) => c.status === s).map((c) => c.text);
  const [found, possible, clear, notMade] = [of("constraint"), of("possible"), of("clear"), of("not made")];
  const head = found.length
    ? `${found.length} constraint${found.length > 1 ? "s" : ""} found: ${found.join("; ")}.`
    : `none found in the checks made${clear.length ? `: ${clear.join("; ")}` : ""}.`;
  const clearAfter = found.length && clear.length ? ` No constraint: ${clear.join("; ")}.` : "";
  const maybe = possible.length ? ` Possible, not counted: ${possible.join("; ")}.` : "";
  const note = legumeOf(legume).note;
  return `${head}${maybe}${clearAfter}${notMade.length ? ` Not checked: ${notMade.join("; ")}.` : ""}${note ? ` Note: ${note}.` : ""}`;
}

/**
 * The number of soil factors (pH, nitrate, B) with a constraint on fixation, 0–3, for banding a
 * report column. The Mo check and a nitrate level a source leaves open (faba bean) are possible,
 * not constraints, and are not counted; SOIL.FIXSOIL reports them. 0 means none found in the
 * checks made (SOIL.FIXSOIL says which checks those were).
 * Arguments and errors as nfixSoilChecks.
 * @example nfixSoilCount("field pea", 5.1, "CaCl2", 120) //=> 2
 */
export function nfixSoilCount(legume: string, ph: number, phMethod: string, nitrateKgHa?: string | number, hotWaterB?: string | number): number {
  return nfixSoilChecks(legume, ph, phMethod, nitrateKgHa, hotWaterB).filter((c) => c.status === "constraint").length;
}
