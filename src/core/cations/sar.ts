/**
 * Sodium adsorption ratio of an irrigation water or a soil saturation extract.
 *
 * SAR = Na / √((Ca + Mg) / 2), concentrations in mmolc/L (= meq/L); the result is in
 * (mmolc/L)^½ and is conventionally written without a unit.
 *
 * Source: U.S. Salinity Laboratory Staff (1954) Diagnosis and improvement of saline and alkali
 * soils, USDA Agriculture Handbook 60 (L.A. Richards, ed.), pp. 25–26 (citation seen at UC Davis
 * Analytical Lab, method 840; formula seen in the CSUS Office of Water Programs glossary, "SAR").
 */
import sarUnits from "../../data/cations/sar-units.json";
import { mgPerCmol } from "../chemistry";
import { SoilError, listWords } from "../errors";
import { nameTable, normaliseWord } from "../names";
import { check, finite } from "../validate";

type SarBasis = "charge" | "mass";

const UNITS = nameTable<SarBasis>(sarUnits.units.map((u) => ({ id: u.id, aliases: u.aliases, value: u.basis as SarBasis })));
const AMBIGUOUS = new Set(sarUnits.ambiguous.map(normaliseWord));

/** Unit words accepted by cecSar. */
export const SAR_UNITS: readonly string[] = UNITS.ids;

/** What to give when SAR's unit is missing, for the core and the binding's message alike. */
export const SAR_UNIT_NEED = `the unit of na, ca and mg: ${listWords(SAR_UNITS)} (mmolc/L = meq/L); mg/L read as meq/L gives a SAR several times wrong`;

/**
 * The basis of the concentrations. The unit is required: mg/L read as meq/L (or the reverse)
 * gives a plausible SAR that is several times wrong.
 */
function sarBasis(unitWord: string | undefined): SarBasis {
  if (unitWord === undefined || unitWord.trim() === "") {
    throw new SoilError("MISSING_INPUT", `unit is required: ${SAR_UNIT_NEED}`);
  }
  const word = unitWord;
  if (AMBIGUOUS.has(normaliseWord(word))) {
    throw new SoilError(
      "UNIT_MISMATCH",
      `unit "${word}" is ambiguous for SAR: 1 mmol/L of Ca2+ or Mg2+ is 2 mmolc/L; use ${listWords(SAR_UNITS)} (mmolc/L = meq/L)`,
    );
  }
  return UNITS.lookup(word, "unit for SAR");
}

/** Milligrams of an ion per millimole of its charge: molar mass ÷ charge (Na 22.990, Ca 20.039, Mg 12.153). */
export function sarMgPerMmolc(ionWord: "Na" | "Ca" | "Mg"): number {
  return mgPerCmol(ionWord) / 10; // 1 cmol of charge = 10 mmol of charge
}

/**
 * Sodium adsorption ratio, SAR = Na / √((Ca + Mg) / 2) with all three in mmolc/L.
 * @param na sodium in the water or extract, in `unitWord`, ≥ 0
 * @param ca calcium, in `unitWord`, ≥ 0
 * @param mg magnesium, in `unitWord`, ≥ 0; ca + mg must be > 0
 * @param unitWord required: mmolc/L (= meq/L) or mg/L; mg/L is divided by molar mass ÷ charge
 * @returns SAR, (mmolc/L)^½
 * @throws OUT_OF_RANGE for a negative concentration; NOT_APPLICABLE when ca and mg are both 0;
 *   UNKNOWN_NAME for an unknown unit; UNIT_MISMATCH for a bare mmol/L; MISSING_INPUT without a unit
 * @example cecSar(15, 6, 4, "mmolc/L") //=> 6.7082
 * Source: USDA Handbook 60 (1954), see the file header.
 */
export function cecSar(na: number, ca: number, mg: number, unitWord: string | undefined): number {
  const basis = sarBasis(unitWord);
  const shown = unitWord as string;
  check(na, { name: "na", unit: shown, min: 0 });
  check(ca, { name: "ca", unit: shown, min: 0 });
  check(mg, { name: "mg", unit: shown, min: 0 });
  const toCharge = (v: number, ion: "Na" | "Ca" | "Mg") => (basis === "charge" ? v : v / sarMgPerMmolc(ion));
  const naC = toCharge(na, "Na");
  const caMg = toCharge(ca, "Ca") + toCharge(mg, "Mg");
  if (caMg === 0) throw new SoilError("NOT_APPLICABLE", "ca and mg are both 0, so SAR is undefined (it divides by √((Ca + Mg)/2))");
  return finite(naC / Math.sqrt(caMg / 2), "SAR");
}
