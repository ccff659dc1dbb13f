/**
 * Atomic weights, ions, equivalent weights and element-form factors.
 *
 * Masses come from `src/data/atomic-weights.json` (IUPAC/CIAAW abridged standard atomic weights);
 * every factor here is computed from them, none is typed in.
 */
import weights from "../data/atomic-weights.json";
import species from "../data/species.json";
import { SoilError } from "./errors";
import { nameTable } from "./names";
import { check, finite } from "./validate";

const ATOMIC_WEIGHT = new Map<string, number>(weights.elements.map((e) => [e.symbol, e.weight]));

/** Standard atomic weight of an element symbol (case-sensitive chemical symbol). */
export function atomicWeight(symbol: string): number {
  const w = ATOMIC_WEIGHT.get(symbol);
  if (w === undefined) throw new SoilError("UNKNOWN_NAME", `no atomic weight for element "${symbol}"`);
  return w;
}

/**
 * Molar mass of a simple formula such as "P2O5", "CaCO3" or "Ca(OH)2", g/mol.
 * @example molarMass("CaCO3") //=> 100.086
 */
export function molarMass(formula: string): number {
  let mass = MOLAR_MASSES.get(formula);
  if (mass === undefined) {
    mass = parseMolarMass(formula);
    MOLAR_MASSES.set(formula, mass);
  }
  return mass;
}

/** Few distinct formulas are ever asked for (those of the data files), so the cache stays small. */
const MOLAR_MASSES = new Map<string, number>();

function parseMolarMass(formula: string): number {
  let pos = 0;
  function group(): number {
    let total = 0;
    while (pos < formula.length && formula[pos] !== ")") {
      let part: number;
      if (formula[pos] === "(") {
        pos += 1;
        part = group();
        if (formula[pos] !== ")") throw new Error(`unbalanced formula ${formula}`);
        pos += 1;
      } else {
        const m = /^[A-Z][a-z]?/.exec(formula.slice(pos));
        if (!m) throw new Error(`bad formula ${formula}`);
        pos += m[0].length;
        part = atomicWeight(m[0]);
      }
      const n = /^\d+/.exec(formula.slice(pos));
      const count = n ? Number(n[0]) : 1;
      if (n) pos += n[0].length;
      total += part * count;
    }
    return total;
  }
  const mass = group();
  if (pos !== formula.length) throw new Error(`bad formula ${formula}`);
  return mass;
}

export interface Ion {
  readonly id: string;
  readonly formula: string;
  readonly charge: number;
}

const IONS = nameTable(species.ions.map((i) => ({ id: i.id, aliases: i.aliases, value: i as Ion })));

/** Exchangeable ion ids accepted by SOIL.CMOL and SOIL.MGKG. */
export const ION_IDS: readonly string[] = IONS.ids;

export function ionById(word: string): Ion {
  return IONS.lookup(word, "ion");
}

/**
 * Mass (mg/kg) of an ion held as 1 cmol(+)/kg: 10 × molar mass ÷ charge.
 * Ca 200.39, Mg 121.53, K 390.98, Na 229.90 mg/kg per cmol(+)/kg.
 * Source: IUPAC/CIAAW standard atomic weights; 1 cmol(+)/kg = 0.01 mol of charge per kg.
 */
export function mgPerCmol(ionWord: string): number {
  const ion = ionById(ionWord);
  return (10 * molarMass(ion.formula)) / ion.charge;
}

/**
 * Exchangeable cation from mg/kg to cmol(+)/kg.
 * @param mgPerKg mass fraction of the ion, mg/kg, ≥ 0
 * @example cmolFromMgKg(2000, "Ca") //=> 9.98054
 */
export function cmolFromMgKg(mgPerKg: number, ionWord: string): number {
  check(mgPerKg, { name: "mg_per_kg", unit: "mg/kg", min: 0 });
  // Stryker disable next-line StringLiteral: equivalent: a finite mg/kg divided by at least 10 mg/kg per cmol(+)/kg (H, the lightest ion) is finite, so this guard never refuses and its words never show
  return finite(mgPerKg / mgPerCmol(ionWord), "cmol(+)/kg");
}

/**
 * Exchangeable cation from cmol(+)/kg to mg/kg (inverse of cmolFromMgKg).
 * @param cmolPerKg cmol(+)/kg, ≥ 0
 * @example mgKgFromCmol(1, "Ca") //=> 200.39
 */
export function mgKgFromCmol(cmolPerKg: number, ionWord: string): number {
  check(cmolPerKg, { name: "cmol_per_kg", unit: "cmol(+)/kg", min: 0 });
  return finite(cmolPerKg * mgPerCmol(ionWord), "mg/kg");
}

interface Form {
  readonly id: string;
  readonly element: string;
  readonly formula: string;
  readonly count: number;
}

const FORMS = nameTable(species.forms.map((f) => ({ id: f.id, value: f as Form })));

export const FORM_IDS: readonly string[] = FORMS.ids;

/** Mass of the form per unit mass of its element: (M_form / atoms of element) / M_element. */
function massPerElement(form: Form): number {
  // Stryker disable next-line ArithmeticOperator: equivalent: formFactor divides two of these for forms of the same element (checked first), so the element's atomic weight cancels whether it divides or multiplies
  return molarMass(form.formula) / form.count / atomicWeight(form.element);
}

/**
 * Factor that turns an amount expressed as `from` into the same amount of the element expressed as
 * `to` (P → P2O5 2.2913; K → K2O 1.2046; Ca → CaCO3 2.4973).
 * @throws UNKNOWN_NAME for an unknown form; UNIT_MISMATCH when the forms hold different elements
 */
export function formFactor(fromWord: string, toWord: string): number {
  const from = FORMS.lookup(fromWord, "form");
  const to = FORMS.lookup(toWord, "form");
  if (from.element !== to.element) {
    // Stryker disable next-line StringLiteral: equivalent: the ids come from the table itself, so this lookup never refuses and its "form" never shows
    const same = FORM_IDS.filter((id) => FORMS.lookup(id, "form").element === from.element);
    throw new SoilError(
      "UNIT_MISMATCH",
      `${from.id} and ${to.id} are forms of different elements (${from.element}, ${to.element}); ${from.id} converts to ${same.join(", ")}`,
    );
  }
  return massPerElement(to) / massPerElement(from);
}

/**
 * The same amount of an element expressed in another form, e.g. P2O5 → P.
 * @param value amount in any mass unit (the unit is unchanged); any finite number
 * @example convertForm(100, "P2O5", "P") //=> 43.6429
 */
export function convertForm(value: number, fromWord: string, toWord: string): number {
  check(value, { name: "value" });
  return finite(value * formFactor(fromWord, toWord), "the converted amount");
}

/** Mass of pure CaCO3 that neutralizes 1 cmol(+) of acidity: M(CaCO3)/2 × 0.01 g = 0.50043 g. */
export function caco3GramsPerCmolCharge(): number {
  return (molarMass("CaCO3") / 2) * 0.01;
}
