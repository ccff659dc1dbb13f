/**
 * A liming material's calcium carbonate equivalent (CCE) from its chemical analysis (SOIL.CCE),
 * so SOIL.LIMEPRODUCT's cce_pct can come from a product label when no measured CCE is given.
 *
 * CCE (%) = Σ pct_i × bases_i × M(CaCO3) / M(form_i): each Ca or Mg atom held as carbonate, oxide
 * or hydroxide neutralizes two H+, as one CaCO3 does. Molar masses come from IUPAC atomic weights
 * (chemistry.ts); the forms are data (src/data/lime/cce-forms.json). An element analysis (Ca, Mg)
 * assumes all of the element is in such forms; Ca or Mg in gypsum or silicates neutralizes
 * nothing, so for by-products a measured CCE is the right input.
 *
 * Source: stoichiometry (derived), checked against UNL PASSEL Table 4.4 neutralizing values of pure
 * forms and the MN Dept. of Agriculture calcite and dolomite compositions (both seen).
 */
import forms from "../../data/lime/cce-forms.json";
import { molarMass } from "../chemistry";
import { SoilError, listWords } from "../errors";
import { nameTable } from "../names";
import { LimeRange } from "./table";
import { check, finite, numericText } from "../validate";

interface CceForm {
  readonly id: string;
  readonly formula: string;
  readonly bases: number;
}

const FORMS = nameTable(forms.forms.map((f) => ({ id: f.id, aliases: f.aliases, value: f as CceForm })));
const SUM_TOLERANCE = forms.sum_tolerance_pct;

/** Form words SOIL.CCE accepts. */
export const CCE_FORMS: readonly string[] = FORMS.ids;

/**
 * Calcium carbonate equivalent of 1 % of a form in a material, % (CaCO3 1, MgO 2.48).
 * @example limeCceFactor("MgCO3") //=> 1.18708
 * Source: bases × M(CaCO3) / M(form) from IUPAC atomic weights (derived); UNL PASSEL Table 4.4 prints 119 % for MgCO3 (seen).
 */
export function limeCceFactor(formWord: string): number {
  const f = FORMS.lookup(formWord, "form");
  return (f.bases * molarMass("CaCO3")) / molarMass(f.formula);
}

/** The elements a form holds, to refuse counting an element twice. */
function elementsOf(f: CceForm): string[] {
  return ["Ca", "Mg"].filter((e) => new RegExp(`${e}(?![a-z])`).test(f.formula));
}

/**
 * CCE (%) of a liming material from its analysis: Σ pct × bases × M(CaCO3) / M(form).
 * @param analysisPct % of the material (as received or dry, as the label gives it; the CCE is on
 *   the same basis) of each component, each 0–100, together at most 100 (+1 for rounding)
 * @param formWords the component of each percentage: CaCO3, MgCO3, CaMg(CO3)2, CaO, MgO, Ca(OH)2,
 *   Mg(OH)2, or the elements Ca, Mg; each once, and an element not with its own compounds
 * @returns calcium carbonate equivalent, % (may exceed 100 for oxides and hydroxides)
 * @throws SHAPE_MISMATCH when the counts differ; MISSING_INPUT for no components; UNKNOWN_NAME for
 *   an unknown form; NOT_APPLICABLE for a form given twice or an element counted twice;
 *   OUT_OF_RANGE for a percentage outside 0–100, a total above 101, or a total of 1 or less
 *   (fractions typed for percentages)
 * @example limeCce([21.7, 13.1], ["Ca", "Mg"]) //=> 108.136
 * Source: the dolomite composition 21.7 % Ca, 13.1 % Mg of the MN Dept. of Agriculture (seen); the
 * CCE is derived (pure dolomite CaMg(CO3)2 is 108.6 %).
 */
export function limeCce(analysisPct: readonly number[], formWords: readonly string[]): number {
  if (analysisPct.length !== formWords.length) {
    throw new SoilError("SHAPE_MISMATCH", `analysis_pct has ${analysisPct.length} values but forms has ${formWords.length}; give one form per percentage`);
  }
  if (analysisPct.length === 0) throw new SoilError("MISSING_INPUT", `the analysis is empty: give the % of each component (${listWords(CCE_FORMS)})`);
  const used = formWords.map((w) => FORMS.lookup(w, "form"));
  for (const f of used) {
    if (used.filter((g) => g === f).length > 1) throw new SoilError("NOT_APPLICABLE", `${f.id} is given twice; give each component once`);
  }
  for (const e of ["Ca", "Mg"]) {
    const holding = used.filter((f) => elementsOf(f).includes(e));
    const bare = holding.find((f) => f.formula === e);
    const other = holding.find((f) => f !== bare);
    if (bare && other) {
      throw new SoilError("NOT_APPLICABLE", `${bare.id} and ${other.id} both count ${e}: give ${e} as an element or as its compounds, not both`);
    }
  }
  analysisPct.forEach((p, i) => check(p, { name: `analysis_pct (${used[i]!.id})`, unit: "%", min: 0, max: 100 }));
  const total = analysisPct.reduce((a, b) => a + b, 0);
  if (total > 100 + SUM_TOLERANCE + 1e-9) {
    throw new SoilError("OUT_OF_RANGE", `the components add up to ${+total.toFixed(6)} %; a material cannot hold more than 100 % (${SUM_TOLERANCE} % allowed for rounding)`);
  }
  if (total <= 1) {
    throw new SoilError(
      "OUT_OF_RANGE",
      `the components add up to ${+total.toFixed(6)} %, too little for a liming material; if these are fractions (0.9 for 90 %), enter percentages`,
    );
  }
  // Stryker disable next-line StringLiteral: equivalent: unreachable, each percentage is checked within 0–100 and each factor is finite, so the sum is finite
  return finite(analysisPct.reduce((acc, p, i) => acc + p * limeCceFactor(used[i]!.id), 0), "the CCE");
}

function listOf(range: LimeRange, name: string): (number | string | null)[] {
  const rows = range.length;
  const cols = rows ? Math.max(...range.map((r) => r.length)) : 0;
  if (rows !== 1 && cols !== 1) {
    throw new SoilError("SHAPE_MISMATCH", `${name} must be a single row or column (it is ${rows}×${cols})`);
  }
  // A blank cell (null, or text of spaces) becomes null; null itself passes through unchanged.
  return range.flat().map((c) => (typeof c === "string" && c.trim() === "" ? null : typeof c === "boolean" ? String(c) : c));
}

/**
 * limeCce for worksheet ranges: the analysis and the forms, each one row or column of the same
 * length. Pairs blank in both are ignored (a generous selection); a form with a blank percentage
 * is refused (enter 0 for a component the product does not have).
 * @throws as limeCce; MISSING_INPUT for a blank percentage or a blank form; NOT_A_NUMBER for text
 *   where a percentage is expected
 * @example limeCceOfRanges([[40, 0.6]], [["Ca", "Mg"]]) //=> 102.362
 * Source: MN Dept. of Agriculture, calcite '40% Ca and 0-0.6% Mg' (seen); the CCE is derived.
 */
export function limeCceOfRanges(analysisPct: LimeRange, formWords: LimeRange): number {
  const a = listOf(analysisPct, "analysis_pct");
  const f = listOf(formWords, "forms");
  if (a.length !== f.length) {
    throw new SoilError("SHAPE_MISMATCH", `analysis_pct has ${a.length} cells but forms has ${f.length}; give one form per percentage`);
  }
  const pcts: number[] = [];
  const names: string[] = [];
  a.forEach((v, i) => {
    const form = f[i];
    if (v === null && form === null) return;
    // A blank form (null) is not a string either.
    if (typeof form !== "string") {
      throw new SoilError("MISSING_INPUT", `forms cell ${i + 1} is ${form === null ? "blank" : `the number ${form}`}: name the component (${listWords(CCE_FORMS)})`);
    }
    if (v === null) throw new SoilError("MISSING_INPUT", `analysis_pct for ${form.trim()} is blank; enter 0 if the product has none`);
    if (typeof v === "number") pcts.push(v);
    else {
      const n = numericText(v);
      if (n === undefined) throw new SoilError("NOT_A_NUMBER", `analysis_pct for ${form.trim()}: "${v}" is not a number`);
      pcts.push(n);
    }
    names.push(form);
  });
  return limeCce(pcts, names);
}
