/**
 * Lime methods without a buffer test: exchangeable Al (Kamprath), Al saturation (Cochrane,
 * Salinas & Sánchez), base saturation (Brazilian V% method) and pH buffer capacity.
 *
 * Sources beside each check. "seen" = read in that source; "derived" = arithmetic on a seen
 * definition; "from memory" = recalled, not seen; "invented" = made-up inputs for a property or
 * an error case. LIME-xx refers to the project's list of published check values.
 */
import fc from "fast-check";
import methods from "../../../src/data/lime/methods.json";
import { limeAlSat, limeAlSatCmol, limeBaseSat, limeExchAl, limePhBc } from "../../../src/core/lime/methods";
import { limeCaco3MgPerKg, limeLayerKgPerHa } from "../../../src/core/lime/rate";
import { limeProductRate } from "../../../src/core/lime/product";
import { errorCode as codeOf, errorMessage as messageOf } from "../../helpers/errors";


/** depth × bulk density giving a 2 000 000 lb/acre furrow slice (UNIT-12 convention): 22.417 cm·g/cm3. */
const AFS_DEPTH_X_BD = (2e6 * 0.45359237) / 0.40468564224 / 1e5;

describe("CaCO3 per cmol(+) of acidity", () => {
  it("0.50043 g CaCO3 per cmol(+) (stoichiometry from IUPAC atomic weights, derived): 3 cmol(+)/kg → 1501.29 mg/kg (LIME-24)", () => {
    expect(limeCaco3MgPerKg(1)).toBeCloseTo(500.43, 2);
    expect(limeCaco3MgPerKg(3)).toBeCloseTo(1501.29, 1);
  });
  it("Penn State Agronomy Guide (seen, LIME-04): 1 meq/100 g of acidity ≈ 1000 lb CCE per 7-in acre furrow slice of 2 million lb", () => {
    const lbPerAc = limeExchAl(1, { factor: 1, depthCm: AFS_DEPTH_X_BD, bulkDensity: 1, unit: "lb/ac" });
    expect(lbPerAc).toBeCloseTo(1000.86, 1); // the guide rounds to 1000
    // Penn State worked case: Ac 5.0 → 5000 lb CCE/A at target 7.0 (seen); ours 5004 (0.09 % above the rounded factor)
    expect(Math.abs(limeExchAl(5, { factor: 1, depthCm: AFS_DEPTH_X_BD, bulkDensity: 1, unit: "lb/ac" }) / 5000 - 1)).toBeLessThan(0.001);
  });
  it("layer mass needs both depth and bulk density (MISSING_INPUT names which)", () => {
    expect(codeOf(() => limeLayerKgPerHa(100, undefined, 1.2))).toBe("MISSING_INPUT");
    expect(codeOf(() => limeLayerKgPerHa(100, 20, undefined))).toBe("MISSING_INPUT");
  });
});

describe("LIMEAL: Kamprath (1970) exchangeable-Al method", () => {
  it("factor default 1.5 (as quoted citing Mohr 1960, Cate 1965, Kamprath 1970; seen, secondary)", () => {
    expect(methods.kamprath.factor_default).toBe(1.5);
  });
  it("LIME-24 (derived): Al 2.0 cmol/kg, 20 cm, BD 1.2 → 3.0 cmol(+)/kg → 1.501 g/kg → 3.603 t CaCO3/ha", () => {
    expect(limeExchAl(2, { depthCm: 20, bulkDensity: 1.2 })).toBeCloseTo(3.6031, 4);
    expect(limeExchAl(2, { depthCm: 20, bulkDensity: 1.2, unit: "kg/ha" })).toBeCloseTo(3603.1, 1);
    expect(limeExchAl(2, { depthCm: 20, bulkDensity: 1.2, unit: "ton/ac" })).toBeCloseTo(3.6031 / 2.241702, 4);
  });
  it("Kamprath (1970) abstract (seen): lime equal to the exchangeable Al is factor 1 → 2.402 t/ha for the same layer (derived)", () => {
    expect(limeExchAl(2, { factor: 1, depthCm: 20, bulkDensity: 1.2 })).toBeCloseTo(2.4021, 4);
  });
  it("zero Al needs no lime", () => {
    expect(limeExchAl(0, { depthCm: 20, bulkDensity: 1.2 })).toBe(0);
  });
  it("depth and bulk density are required; bad values are OUT_OF_RANGE", () => {
    expect(codeOf(() => limeExchAl(2, { bulkDensity: 1.2 }))).toBe("MISSING_INPUT");
    expect(codeOf(() => limeExchAl(2, { depthCm: 20 }))).toBe("MISSING_INPUT");
    expect(codeOf(() => limeExchAl(-1, { depthCm: 20, bulkDensity: 1.2 }))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeExchAl(2, { factor: 0, depthCm: 20, bulkDensity: 1.2 }))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeExchAl(2, { depthCm: 400, bulkDensity: 1.2 }))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeExchAl(2, { depthCm: 20, bulkDensity: 3 }))).toBe("OUT_OF_RANGE");
  });
  it("property: linear in Al and in depth (invented inputs)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 10, noNaN: true }), fc.double({ min: 1, max: 100, noNaN: true }), (al, d) => {
        const one = limeExchAl(1, { depthCm: 10, bulkDensity: 1.3 });
        const r = limeExchAl(al, { depthCm: d, bulkDensity: 1.3 });
        return Math.abs(r - (one * al * d) / 10) <= 1e-9 * Math.max(1, r);
      }),
    );
  });
});

describe("LIMEALSAT: Cochrane, Salinas & Sánchez (1980) Al-saturation method (abstract seen)", () => {
  it("the 1.5 factor holds while the result does not exceed the Al: Al 2, Ca 1, Mg 0.5, RAS 20 → 1.5 × 1.3 = 1.95 meq/100 g (derived)", () => {
    expect(limeAlSatCmol(2, 1, 0.5, 20)).toBeCloseTo(1.95, 12);
  });
  it("the source's rule: when the 1.5 result exceeds the Al equivalent, 2.0 replaces 1.5: RAS 10 → 1.5 × 1.65 = 2.475 > 2 → 2.0 × 1.65 = 3.3 (derived)", () => {
    expect(limeAlSatCmol(2, 1, 0.5, 10)).toBeCloseTo(3.3, 12);
  });
  it("LIME-28 (RAS 0 → 3.00 = Kamprath 1.5 × Al) ignores that rule: with it the equation gives 2.0 × 2 = 4.00; an explicit factor 1.5 gives 3.00 (derived)", () => {
    expect(limeAlSatCmol(2, 1, 0.5, 0)).toBeCloseTo(4, 12);
    expect(limeAlSatCmol(2, 1, 0.5, 0, 1.5)).toBeCloseTo(3, 12);
  });
  it("no lime when the Al saturation is already at or below RAS: Al 0.5 of ECEC 5.5 (9 %) with RAS 20 → 0 (derived)", () => {
    expect(limeAlSatCmol(0.5, 4, 1, 20)).toBe(0);
    expect(limeAlSat(0.5, 4, 1, { targetAlSat: 20, bulkDensity: 1.1 })).toBe(0);
  });
  it("field rate: 'tons of lime/ha = result × apparent specific gravity' (source text): 1.95 × 1.2 = 2.34 t/ha; ours over 20 cm 2.342 (0.09 % above, derived)", () => {
    const r = limeAlSat(2, 1, 0.5, { targetAlSat: 20, bulkDensity: 1.2 });
    expect(Math.abs(r / (1.95 * 1.2) - 1)).toBeLessThan(0.001);
    expect(methods.cochrane.depth_cm).toBe(20);
  });
  it("depth scales in proportion; units convert", () => {
    const r20 = limeAlSat(2, 1, 0.5, { targetAlSat: 20, bulkDensity: 1.2 });
    expect(limeAlSat(2, 1, 0.5, { targetAlSat: 20, bulkDensity: 1.2, depthCm: 10 })).toBeCloseTo(r20 / 2, 12);
    expect(limeAlSat(2, 1, 0.5, { targetAlSat: 20, bulkDensity: 1.2, unit: "kg/ha" })).toBeCloseTo(r20 * 1000, 9);
  });
  it("target_al_sat and bulk density are required; percentages outside 0–100 and negative cations are OUT_OF_RANGE", () => {
    expect(codeOf(() => limeAlSat(2, 1, 0.5, { bulkDensity: 1.2 }))).toBe("MISSING_INPUT");
    expect(codeOf(() => limeAlSat(2, 1, 0.5, { targetAlSat: 20 }))).toBe("MISSING_INPUT");
    expect(codeOf(() => limeAlSatCmol(2, 1, 0.5, 120))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeAlSatCmol(2, -1, 0.5, 20))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeAlSatCmol(2, 1, 0.5, 20, -1))).toBe("OUT_OF_RANGE");
  });
  it("property: the requirement never rises as the tolerated Al saturation rises, never falls as Al rises (invented inputs)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 8, noNaN: true }),
        fc.double({ min: 0, max: 8, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        // tolerated Al saturation: 0, or 1-100 % (PERCENT.targetAlSat)
        fc.oneof(fc.constant(0), fc.double({ min: 1, max: 100, noNaN: true })),
        fc.oneof(fc.constant(0), fc.double({ min: 1, max: 100, noNaN: true })),
        (a, b, ca, r1, r2) => {
          const [lo, hi] = r1 < r2 ? [r1, r2] : [r2, r1];
          const [al1, al2] = a < b ? [a, b] : [b, a];
          return (
            limeAlSatCmol(al1, ca, 0.5, hi) <= limeAlSatCmol(al1, ca, 0.5, lo) + 1e-12 &&
            limeAlSatCmol(al1, ca, 0.5, lo) <= limeAlSatCmol(al2, ca, 0.5, lo) + 1e-12
          );
        },
      ),
    );
  });
});

describe("LIMEBASESAT: base-saturation method as used in Brazil", () => {
  it("worked example (agronomiacomgismonti 2010, seen): T 5.46, V1 8.42 → V2 60 %: NC = 51.58 × 5.46 / 100 = 2.816 t/ha; × 1.25 for PRNT 80 → 3.5 t/ha", () => {
    const pure = limeBaseSat(5.46, 8.42, 60);
    expect(Math.abs(pure / 2.816 - 1)).toBeLessThan(0.001); // ours 2.8187, 0.09 % above the formula's rounded 1 t/ha per cmolc/dm3
    expect(limeProductRate(pure, 80)).toBeCloseTo(3.5, 1);
  });
  it("worked example (resposta.org, seen): T 15, V1 25 → V2 60, PRNT 90 → 5.8 t/ha", () => {
    expect(limeProductRate(limeBaseSat(15, 25, 60), 90)).toBeCloseTo(5.8, 1);
  });
  it("worked example (agronomia.hi7.co, seen): T 6.0, V1 70 → V2 80 → 0.600 t/ha", () => {
    expect(Math.abs(limeBaseSat(6.0, 70, 80) / 0.6 - 1)).toBeLessThan(0.001); // 0.6005: 0.09 % above the rounded formula
  });
  it("T reported in mmolc/dm3 must be divided by 10 first: 50 mmolc/dm3, 40 → 70 % is 1.5 t/ha, not 15 (agronomiacomgismonti 2011 warning, seen)", () => {
    expect(limeBaseSat(50 / 10, 40, 70)).toBeCloseTo(1.5, 2);
  });
  it("0 when the target base saturation is at or below the current one (derived)", () => {
    expect(limeBaseSat(8, 70, 60)).toBe(0);
    expect(limeBaseSat(8, 60, 60)).toBe(0);
  });
  it("default depth 0–20 cm; a given depth scales in proportion; bulk density turns a CEC per kg into one per dm3 (derived)", () => {
    const r20 = limeBaseSat(10, 40, 70);
    expect(limeBaseSat(10, 40, 70, { depthCm: 10 })).toBeCloseTo(r20 / 2, 12);
    expect(limeBaseSat(10 / 1.25, 40, 70, { bulkDensity: 1.25 })).toBeCloseTo(r20, 12);
    expect(limeBaseSat(10, 40, 70, { unit: "kg/ha" })).toBeCloseTo(r20 * 1000, 9);
  });
  it("percentages outside 0–100, a negative CEC or a bad density are OUT_OF_RANGE", () => {
    expect(codeOf(() => limeBaseSat(10, -5, 70))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeBaseSat(10, 40, 101))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeBaseSat(-1, 40, 70))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeBaseSat(10, 40, 70, { bulkDensity: 0 }))).toBe("OUT_OF_RANGE");
  });
  it("property: linear in CEC and in (V2 − V1), zero when V2 ≤ V1 (invented inputs)", () => {
    // V1: 0, or above 1 to 100 %; V2: 20-100 % (PERCENT.baseSat, PERCENT.targetBaseSat)
    const v1s = fc.oneof(fc.constant(0), fc.double({ min: 1.001, max: 100, noNaN: true }));
    fc.assert(
      fc.property(fc.double({ min: 0, max: 40, noNaN: true }), v1s, fc.double({ min: 20, max: 100, noNaN: true }), (t, v1, v2) => {
        const r = limeBaseSat(t, v1, v2);
        if (v2 <= v1) return r === 0;
        const unit = limeBaseSat(1, 0, 100) / 100;
        return Math.abs(r - unit * t * (v2 - v1)) <= 1e-9 * Math.max(1, r);
      }),
    );
  });
});

describe("LIMEPHBC: pH buffer capacity method", () => {
  it("LIME-30 (derived): pHBC 1.0 cmol(+)/kg/pH, ΔpH 1.0, 10 cm, BD 1.3 → 650.6 kg CaCO3/ha", () => {
    expect(limePhBc(5.0, 6.0, 1.0, { depthCm: 10, bulkDensity: 1.3, unit: "kg/ha" })).toBeCloseTo(650.56, 2);
  });
  it("LIME-29 UGA lime buffer capacity (definition seen, numbers derived): LBC 400 mg CaCO3/kg/pH, pH 5.2 → 6.0: 320 mg/kg; 15 cm, BD 1.3 → 624 kg/ha", () => {
    // 1 cmol(+)/kg of CaCO3 is 100.086 / 2 × 10 = 500.43 mg/kg (molar mass from IUPAC/CIAAW abridged
    // atomic weights, from memory), written out so the factor under test does not cancel itself out.
    const capacityCmol = 400 / 500.43;
    expect(limePhBc(5.2, 6.0, capacityCmol, { depthCm: 15, bulkDensity: 1.3, unit: "kg/ha" })).toBeCloseTo(624, 6);
  });
  it("0 when the target is at or below the soil pH", () => {
    expect(limePhBc(6.5, 6.0, 1.0, { depthCm: 10, bulkDensity: 1.3 })).toBe(0);
    expect(limePhBc(6.0, 6.0, 1.0, { depthCm: 10, bulkDensity: 1.3 })).toBe(0);
  });
  it("depth and bulk density are required; a negative capacity and pH beyond 0–14 are OUT_OF_RANGE", () => {
    expect(codeOf(() => limePhBc(5, 6, 1, { bulkDensity: 1.3 }))).toBe("MISSING_INPUT");
    expect(codeOf(() => limePhBc(5, 6, 1, { depthCm: 10 }))).toBe("MISSING_INPUT");
    expect(codeOf(() => limePhBc(5, 6, -1, { depthCm: 10, bulkDensity: 1.3 }))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limePhBc(5, 15, 1, { depthCm: 10, bulkDensity: 1.3 }))).toBe("OUT_OF_RANGE");
  });
  it("property: linear in the pH rise, the capacity and the depth; zero when target ≤ soil pH (invented inputs)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 3, max: 8, noNaN: true }),
        fc.double({ min: 3, max: 8, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        fc.double({ min: 1, max: 100, noNaN: true }),
        (ph, target, cap, d) => {
          const r = limePhBc(ph, target, cap, { depthCm: d, bulkDensity: 1.3 });
          if (target <= ph) return r === 0;
          const unit = limePhBc(5, 6, 1, { depthCm: 1, bulkDensity: 1.3 });
          return Math.abs(r - unit * cap * (target - ph) * d) <= 1e-9 * Math.max(1, r);
        },
      ),
    );
  });
});

describe("messages and guards (invented inputs; probes of the code's own limits)", () => {
  it("the layer refusals say which input is missing and why", () => {
    expect(messageOf(() => limeLayerKgPerHa(100, undefined, 1.2))).toBe(
      "depth_cm is needed: this method gives lime per kg of soil, so give the depth (cm) of the layer to be limed",
    );
    expect(messageOf(() => limeLayerKgPerHa(100, 20, undefined))).toBe(
      "bulk_density is needed: this method gives lime per kg of soil, so give the dry bulk density (g/cm3) of the layer",
    );
  });
  it("acidity too large to convert refuses instead of returning Infinity", () => {
    expect(codeOf(() => limeCaco3MgPerKg(1e308))).toBe("OUT_OF_RANGE");
    expect(messageOf(() => limeCaco3MgPerKg(1e308))).toBe("the CaCO3 equivalent cannot be computed for these inputs (result is not finite)");
  });
  it("Kamprath: exch_al and factor are named in their refusals", () => {
    expect(messageOf(() => limeExchAl(-1, { depthCm: 20, bulkDensity: 1.2 }))).toBe("exch_al must be at least 0 cmol(+)/kg (got -1 cmol(+)/kg)");
    expect(messageOf(() => limeExchAl(1, { factor: 0, depthCm: 20, bulkDensity: 1.2 }))).toBe("factor must be greater than 0 (got 0)");
  });
  it("Cochrane: each cation is named in its refusal", () => {
    expect(messageOf(() => limeAlSatCmol(-1, 1, 1, 10))).toBe("al must be at least 0 cmol(+)/kg (got -1 cmol(+)/kg)");
    expect(messageOf(() => limeAlSatCmol(1, -1, 1, 10))).toBe("ca must be at least 0 cmol(+)/kg (got -1 cmol(+)/kg)");
    expect(messageOf(() => limeAlSatCmol(1, 1, -1, 10))).toBe("mg must be at least 0 cmol(+)/kg (got -1 cmol(+)/kg)");
  });
  it("Cochrane: Al saturation exactly at the target gives 0 (with and without a factor)", () => {
    // Al 1 of Al + Ca + Mg = 4 is 25 %
    expect(limeAlSatCmol(1, 2, 1, 25)).toBe(0);
    expect(limeAlSatCmol(1, 2, 1, 25, 3)).toBe(0);
  });
  it("Cochrane: a requirement too large to represent refuses instead of returning Infinity", () => {
    expect(messageOf(() => limeAlSatCmol(1e308, 0, 0, 0, 10))).toBe("the lime requirement cannot be computed for these inputs (result is not finite)");
    expect(messageOf(() => limeAlSatCmol(1e308, 0, 0, 0))).toBe("the lime requirement cannot be computed for these inputs (result is not finite)");
  });
  it("base saturation: the CEC's unit in its refusal follows the basis (per dm3 without a density, per kg with one)", () => {
    expect(messageOf(() => limeBaseSat(-1, 40, 60))).toBe("cec must be at least 0 cmol(+)/dm3 (got -1 cmol(+)/dm3)");
    expect(messageOf(() => limeBaseSat(-1, 40, 60, { bulkDensity: 1.2 }))).toBe("cec must be at least 0 cmol(+)/kg (got -1 cmol(+)/kg)");
  });
  it("pH buffer capacity: each argument is named in its refusal", () => {
    const layer = { depthCm: 20, bulkDensity: 1.2 };
    expect(messageOf(() => limePhBc(15, 6, 1, layer))).toBe("soil_ph must be from 0 to 14 (got 15)");
    expect(messageOf(() => limePhBc(5, 15, 1, layer))).toBe("target_ph must be from 0 to 14 (got 15)");
    expect(messageOf(() => limePhBc(5, 6, -1, layer))).toBe(
      "ph_buffer_capacity must be at least 0 cmol(+)/kg per pH unit (got -1 cmol(+)/kg per pH unit)",
    );
  });
});
