import fc from "fast-check";
import { atomicWeight, cmolFromMgKg, mgKgFromCmol, mgPerCmol, formFactor, convertForm, molarMass, caco3GramsPerCmolCharge, ION_IDS } from "../../src/core/chemistry";
import { SoilError } from "../../src/core/errors";
import { errorCode, errorMessage } from "../helpers/errors";

// Atomic weights: IUPAC/CIAAW abridged standard atomic weights (Prohaska et al. 2022), as listed
// in src/data/atomic-weights.json (from memory, see that file).

describe("equivalent weights (mg/kg per cmol(+)/kg)", () => {
  it.each([
    // [ion, IUPAC-exact, handbook divisor, handbook tolerance] — published-values EQW-01..05
    ["Ca", 200.39, 200, 0.002], // handbook 200: Clemson Ag Service Lab CEC calculations
    ["Mg", 121.53, 120, 0.013], // handbook 120: Astera (2014) The Ideal Soil
    ["K", 390.98, 390, 0.003], // handbook 390: same
    ["Na", 229.9, 230, 0.001], // handbook 230: same
    ["H", 10.08, 10, 0.009], // handbook 10: same
  ])("%s: %d (IUPAC), handbook %d", (ion, exact, handbook, tol) => {
    expect(mgPerCmol(ion as string)).toBeCloseTo(exact as number, 2);
    expect(Math.abs(mgPerCmol(ion as string) / (handbook as number) - 1)).toBeLessThan(tol as number);
  });
  it("Al3+: 2 cmol(+)/kg is 179.9 mg/kg; lecture-note example 180 with 9 g/eq (EQW-06)", () => {
    expect(mgKgFromCmol(2, "Al")).toBeCloseTo(179.88, 1);
  });
  it("4 meq Ca/100 g = 801.6 ppm (IUPAC); lecture notes print 800 with 20 g/eq (EQW-07)", () => {
    expect(mgKgFromCmol(4, "Ca")).toBeCloseTo(801.56, 1);
  });
  it("NH4+: 180.39 mg NH4/kg per cmol(+)/kg (EQW-08, from memory)", () => {
    expect(mgPerCmol("NH4")).toBeCloseTo(180.39, 1);
  });
  it("Ca 2000 mg/kg = 9.981 cmol(+)/kg (CEC-05, derived)", () => {
    expect(cmolFromMgKg(2000, "Ca")).toBeCloseTo(9.981, 3);
  });
  it("round trip mg/kg → cmol → mg/kg for every ion (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e5, noNaN: true }), fc.constantFrom(...ION_IDS), (v, ion) => {
        expect(mgKgFromCmol(cmolFromMgKg(v, ion), ion)).toBeCloseTo(v, 6);
      }),
    );
  });
  it("refuses a negative amount and an unknown ion", () => {
    expect(() => cmolFromMgKg(-1, "Ca")).toThrow(SoilError);
    expect(() => cmolFromMgKg(1, "Fe")).toThrow(/unknown ion "Fe"; use Ca, Mg, K, Na, NH4, H, Al or Mn/);
  });
});

describe("element forms", () => {
  // Handbook factors: Reiter, Virginia Coop. Ext. SPES-201NP "Conversion Factors Needed for
  // Common Fertilizer Calculations" (OXI-01..07). Handbook values differ from IUPAC-exact in the
  // 4th digit, so the tolerance is that of the handbook's rounding.
  it.each([
    ["P", "P2O5", 2.291, 0.0005],
    ["P2O5", "P", 0.4365, 0.0002],
    ["K", "K2O", 1.2051, 0.0006],
    ["K2O", "K", 0.8301, 0.0004],
    ["Ca", "CaO", 1.3992, 0.0002],
    ["CaO", "Ca", 0.7147, 0.0002],
    ["Mg", "MgO", 1.6578, 0.0006],
    ["MgO", "Mg", 0.6032, 0.0003],
    ["SO4", "S", 0.3339, 0.0002],
    ["S", "SO4", 2.9963, 0.0004],
  ])("%s → %s ≈ %d (VT SPES-201NP)", (from, to, factor, tol) => {
    expect(Math.abs(formFactor(from as string, to as string) - (factor as number))).toBeLessThanOrEqual(tol as number);
  });
  it("VT SPES-201 worked example: 49.8 % K × 1.2051 = 60 % K2O", () => {
    expect(convertForm(49.8, "K", "K2O")).toBeCloseTo(60, 0);
  });
  it("S → SO3 2.497 (OXI-08, IUPAC arithmetic)", () => {
    expect(formFactor("S", "SO3")).toBeCloseTo(2.497, 3);
  });
  it("Ca → CaCO3 and the nitrogen forms", () => {
    expect(formFactor("Ca", "CaCO3")).toBeCloseTo(100.086 / 40.078, 6);
    expect(formFactor("NO3", "N")).toBeCloseTo(14.007 / 62.004, 6);
    expect(formFactor("N", "NH3")).toBeCloseTo(17.031 / 14.007, 4);
  });
  it("forms of different elements are refused with UNIT_MISMATCH", () => {
    try {
      formFactor("P2O5", "K2O");
      throw new Error("no error");
    } catch (e) {
      expect((e as SoilError).code).toBe("UNIT_MISMATCH");
    }
  });
  it("A→B × B→A = 1 (property)", () => {
    const forms = ["Ca", "CaO", "CaCO3"];
    fc.assert(fc.property(fc.constantFrom(...forms), fc.constantFrom(...forms), (a, b) => {
      expect(formFactor(a, b) * formFactor(b, a)).toBeCloseTo(1, 12);
    }));
  });
});

describe("molar masses", () => {
  it("CaCO3 100.086 g/mol and 0.5004 g CaCO3 per cmol(+) (issue text: 0.5004 g/kg per cmol(+)/kg)", () => {
    expect(molarMass("CaCO3")).toBeCloseTo(100.086, 3);
    expect(caco3GramsPerCmolCharge()).toBeCloseTo(0.5004, 4);
  });
  it("CCE of pure materials, UNL PASSEL Table 4.4 (OXI-10): CaO 178, Ca(OH)2 135, MgO 250 (±2)", () => {
    const cce = (f: string, n = 1) => (100 * molarMass("CaCO3") * n) / molarMass(f);
    expect(cce("CaO")).toBeCloseTo(178.5, 0);
    expect(cce("Ca(OH)2")).toBeCloseTo(135.1, 0);
    expect(Math.abs(cce("MgO") - 250)).toBeLessThan(2);
    expect(cce("CaMg(CO3)2", 2)).toBeCloseTo(108.6, 0); // OXI-11, stoichiometry (derived)
  });
});

// Mutation testing (issue 21): refusals read whole; formula parsing edge cases. Inputs invented.
describe("refusals and formula parsing", () => {
  const msg = (f: () => unknown) => errorMessage(f);
  it("an element without an atomic weight, forms of two elements, an unknown ion: the whole message", () => {
    expect(msg(() => atomicWeight("Xx"))).toBe('no atomic weight for element "Xx"');
    expect(msg(() => formFactor("P", "K2O"))).toBe("P and K2O are forms of different elements (P, K); P converts to P, P2O5");
    expect(msg(() => cmolFromMgKg(1, "Fe"))).toBe('unknown ion "Fe"; use Ca, Mg, K, Na, NH4, H, Al or Mn');
  });
  it("a malformed formula is refused, never read as something else", () => {
    expect(msg(() => molarMass("Ca(OH2"))).toBe("unbalanced formula Ca(OH2");
    expect(msg(() => molarMass("ca"))).toBe("bad formula ca");
    expect(msg(() => molarMass("CaCO3)"))).toBe("bad formula CaCO3)");
  });
  it("groups and two-digit counts: Ca(OH)2 = 40.078 + 2 × 17.007 = 74.092; C12 = 144.132 (IUPAC/CIAAW abridged weights, from memory)", () => {
    expect(molarMass("Ca(OH)2")).toBeCloseTo(74.092, 9);
    expect(molarMass("C12")).toBeCloseTo(144.132, 9);
  });
});

// Mutation testing (issue 21), second round: the code and words of each refusal, a formula with a
// character that is no element, and results too large to be a number. Inputs invented.
describe("refusals read whole, second round", () => {
  const msg = (f: () => unknown) => errorMessage(f);
  it("an element without an atomic weight is UNKNOWN_NAME", () => {
    expect(errorCode(() => atomicWeight("Xx"))).toBe("UNKNOWN_NAME");
  });
  it("a formula with a space or a sign between elements is refused, not read past it", () => {
    expect(msg(() => molarMass("Ca O"))).toBe("bad formula Ca O");
    expect(msg(() => molarMass("-CaO"))).toBe("bad formula -CaO");
  });
  it("a negative amount is refused with its name and unit, either way", () => {
    expect(msg(() => cmolFromMgKg(-1, "Ca"))).toBe("mg_per_kg must be at least 0 mg/kg (got -1 mg/kg)");
    expect(msg(() => mgKgFromCmol(-1, "Ca"))).toBe("cmol_per_kg must be at least 0 cmol(+)/kg (got -1 cmol(+)/kg)");
  });
  it("an unknown form names itself and the forms, as from or as to", () => {
    expect(msg(() => formFactor("P2O7", "P"))).toMatch(/^unknown form "P2O7"; use P, P2O5, /);
    expect(msg(() => formFactor("P", "P2O7"))).toMatch(/^unknown form "P2O7"; use P, P2O5, /);
  });
  it("convertForm refuses a value that is not finite naming 'value'", () => {
    expect(msg(() => convertForm(NaN, "P", "P2O5"))).toBe("value must be a finite number (got NaN)");
  });
  it("a result too large for a number is refused, not returned as Infinity", () => {
    expect(msg(() => mgKgFromCmol(1e307, "K"))).toBe("mg/kg cannot be computed for these inputs (result is not finite)");
    expect(msg(() => convertForm(1e308, "P", "P2O5"))).toBe("the converted amount cannot be computed for these inputs (result is not finite)");
  });
});
