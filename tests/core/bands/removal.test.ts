/**
 * SOIL.REMOVAL in core: coefficients against their sources, unit and form conversion, bushels,
 * refusals and properties. Each check names its Source; "derived" marks arithmetic on a source.
 */
import fc from "fast-check";
import { removalAmount, removalBushelWeight, removalCoefficient, removalCrops, removalTables, REMOVAL_ROWS } from "../../../src/core/bands/removal";
import { errorCode as code, errorMessage as message } from "../../helpers/errors";
import { FORM_IDS } from "../../../src/core/chemistry";


const mid = (c: number | readonly number[]) => (typeof c === "number" ? c : ((c[0] as number) + (c[1] as number)) / 2);

describe("coefficients as their sources print them", () => {
  // Source: OMAFA Field Crop News (2025) 'Crop Removal Values', Table 1 (seen), kg/t at marketing moisture.
  it("corn grain: P2O5 6.6-7.9 kg/t, so 10 t/ha removes 72.5 kg P2O5/ha (midpoint, derived)", () => {
    expect(removalAmount("corn", 10, "P2O5", "t/ha")).toBeCloseTo(72.5, 9);
  });
  it("soybean: N 62.3-66.7 kg/t, so 3.5 t/ha removes 225.75 kg N/ha (midpoint, derived)", () => {
    expect(removalAmount("soybean", 3.5, "N", "t/ha")).toBeCloseTo(3.5 * 64.5, 9);
  });
  it("dry beans print single values: N 41.6, P2O5 13.8, K2O 13.8 kg/t", () => {
    expect(removalCoefficient("dry bean", "N")).toBeCloseTo(41.6, 12);
    expect(removalCoefficient("navy beans", "P2O5")).toBeCloseTo(13.8, 12);
    expect(removalCoefficient("dry beans", "K2O")).toBeCloseTo(13.8, 12);
  });
  it("canola S 6.67 kg/t; oats P2O5 7.5 kg/t", () => {
    expect(removalCoefficient("canola", "S")).toBeCloseTo(6.67, 12);
    expect(removalCoefficient("oats", "P2O5")).toBeCloseTo(7.5, 12);
  });
  // Source: Potash Development Association (2020) 'Nutrients in crop material' (= RB209 2020), kg/t fresh (seen).
  it.each([
    ["peas", "P2O5", 9.0],
    ["peas", "K2O", 10.0],
    ["field beans", "P2O5", 11.0],
    ["faba bean", "K2O", 12.0],
    ["oilseed rape", "P2O5", 14.0],
    ["grass hay", "K2O", 18],
    ["grass silage", "P2O5", 1.7],
    ["maize silage", "K2O", 4.4],
    ["potatoes", "K2O", 5.8],
    ["sugar beet", "P2O5", 0.8],
  ])("PDA/RB209 2020: %s %s %s kg/t", (crop, n, v) => {
    expect(removalCoefficient(crop as string, n as string)).toBeCloseTo(v as number, 12);
  });
  it("PDA/RB209 2020: MgO 3.0 kg/t of peas is 1.809 kg Mg/t (derived with atomic weights)", () => {
    expect(removalCoefficient("peas", "MgO")).toBeCloseTo(3.0, 12);
    expect(removalCoefficient("peas", "Mg")).toBeCloseTo(3.0 / 1.6583, 3);
  });
  // Source: Agriculture Victoria (2017) 'Replacing nutrients removed from cutting hay', Table 1 (seen),
  // per t of dry matter: lucerne/clover hay P 2.5-3.5, K 20-30, S 3.5 kg.
  // 8.9 t DM is the source's worked example (10 500 kg of hay at 85 % DM); the DM arithmetic is the
  // user's, not the project's, so only the removal is checked here.
  it("lucerne hay: 8.9 t DM removes 222.5 kg K/ha at the range midpoint 25 kg/t (derived)", () => {
    expect(removalAmount("lucerne hay", 8.9, "K", "t/ha")).toBeCloseTo(222.5, 9);
    expect(removalAmount("alfalfa", 8.9, "S", "t/ha")).toBeCloseTo(31.15, 9);
  });
});

describe("elemental or oxide, kg/ha or lb/ac, as asked", () => {
  // The factors are derived from atomic weights (IUPAC/CIAAW abridged 2021, Prohaska et al. 2022, from
  // memory: P 30.974, O 15.999, K 39.098): P2O5 → P = 2P / P2O5 = 61.948 / 141.943 = 0.43643;
  // K → K2O = K2O / 2K = 94.195 / 78.196 = 1.20460. Reiter, Virginia Cooperative Extension SPES-201NP
  // (seen) prints 0.4365 and 1.2051 (OXI-02, OXI-03): the handbook's rounding, within 0.0002 and 0.0006.
  it("P from P2O5 with the atomic-weight factor 0.43643 (derived; the handbook prints 0.4365)", () => {
    const p = removalAmount("corn", 10, "P", "t/ha");
    expect(p).toBeCloseTo((72.5 * 61.948) / 141.943, 4);
    expect(Math.abs(p / 72.5 - 0.4365)).toBeLessThanOrEqual(0.0002);
  });
  it("K2O from elemental K with the atomic-weight factor 1.20460 (derived; the handbook prints 1.2051)", () => {
    const k2o = removalAmount("lucerne hay", 1, "K2O", "t/ha");
    expect(k2o).toBeCloseTo((25 * 94.195) / 78.196, 4);
    expect(Math.abs(k2o / 25 - 1.2051)).toBeLessThanOrEqual(0.0006);
  });
  it("phosphate and potash are the trade words for P2O5 and K2O (RB209 usage)", () => {
    expect(removalAmount("peas", 4, "phosphate", "t/ha")).toBeCloseTo(36, 9);
    expect(removalAmount("peas", 4, "potash", "t/ha")).toBeCloseTo(40, 9);
  });
  it("kg/ha to lb/ac with the exact factor (UNIT-08)", () => {
    expect(removalAmount("corn", 10, "P2O5", "t/ha", "lb/ac")).toBeCloseTo(72.5 * 0.8921791, 5);
  });
  it("2 short tons/ac of hay at 18 kg K2O per t is 72 lb K2O/ac (derived: kg/t = lb per 1000 lb; 4000 lb of hay)", () => {
    expect(removalAmount("grass hay", 2, "K2O", "ton/ac", "lb/ac")).toBeCloseTo(72, 9);
  });
  it("kg/ha and lb/ac yields", () => {
    expect(removalAmount("corn", 10000, "P2O5", "kg/ha")).toBeCloseTo(72.5, 9);
    expect(removalAmount("corn", 8921.791, "P2O5", "lb/ac")).toBeCloseTo(72.5, 4);
  });
});

describe("bushels (USDA standard weights per bushel)", () => {
  it("bushel weights: corn 56, soybean and wheat 60, barley 48, oats 32, rye 56 lb ('Test weight', USGSA)", () => {
    expect(["corn", "soybean", "wheat", "barley", "oats", "rye"].map(removalBushelWeight)).toEqual([56, 60, 60, 48, 32, 56]);
  });
  // Source: IPNI Plant Nutrition Today, Fall 2008 No. 4 (SUF-08, seen): 200 bu/A corn × 0.27 lb K2O/bu = 54 lb K2O/A.
  it("IPNI 2008: 200 bu/ac corn removes about 54 lb K2O/ac; the Ontario coefficient gives 54.9 (within 3 %)", () => {
    const lb = removalAmount("corn", 200, "K2O", "bu/ac", "lb/ac");
    expect(lb).toBeCloseTo(200 * 4.9 * 56 / 1000, 6);
    expect(Math.abs(lb - 54) / 54).toBeLessThan(0.03);
  });
  // Source: OMAFA 2025 Table 1 prints lb/bu beside kg/t; with the USDA bushel weights our per-bushel
  // values reproduce the printed ones (derived check of the bushel path; oats excluded: Ontario uses
  // the 34 lb Canadian bushel).
  const perBushel = REMOVAL_ROWS.filter((r) => r.published_lb_per_bu && r.id !== "oats").flatMap((r) =>
    ["N", "P2O5", "K2O"].map((n) => [r.id, n, mid(r.published_lb_per_bu![n] as number | readonly number[])] as const),
  );
  it.each(perBushel)("%s %s per bushel matches the printed %s lb/bu", (crop, n, printed) => {
    const got = removalAmount(crop, 1, n, "bu/ac", "lb/ac");
    expect(Math.abs(got - printed)).toBeLessThanOrEqual(Math.max(0.012, 0.02 * printed));
  });
  it("bu/ac for a crop without a bushel weight is #N/A, saying which units to use", () => {
    expect(code(() => removalAmount("grass hay", 3, "K2O", "bu/ac"))).toBe("NO_REFERENCE_DATA");
    expect(() => removalAmount("grass hay", 3, "K2O", "bu/ac")).toThrow(/t\/ha/);
  });
  it("bushel spellings: bu/a and bushels/acre", () => {
    expect(removalAmount("corn", 200, "K2O", "bu/a", "lb/ac")).toBeCloseTo(removalAmount("corn", 200, "K2O", "bushels/acre", "lb/ac"), 12);
  });
});

describe("refusals", () => {
  it("unknown crop lists the crops", () => {
    expect(code(() => removalAmount("quinoa", 2, "N", "t/ha"))).toBe("UNKNOWN_NAME");
    expect(() => removalAmount("quinoa", 2, "N", "t/ha")).toThrow(/corn, soybean, wheat/);
  });
  it("a nutrient the source does not give for that crop is #N/A, listing those it gives", () => {
    expect(code(() => removalAmount("peas", 4, "N", "t/ha"))).toBe("NO_REFERENCE_DATA");
    expect(() => removalAmount("peas", 4, "N", "t/ha")).toThrow(/P2O5, K2O or MgO/);
    expect(code(() => removalAmount("grass hay", 4, "Mg", "t/ha"))).toBe("NO_REFERENCE_DATA");
  });
  it("unknown nutrient word, unknown or wrong-family units", () => {
    expect(code(() => removalAmount("corn", 10, "phosphoric acid", "t/ha"))).toBe("UNKNOWN_NAME");
    expect(code(() => removalAmount("corn", 10, "P", "bushels"))).toBe("UNKNOWN_NAME");
    expect(code(() => removalAmount("corn", 10, "P", "t/ha", "mg/kg"))).toBe("UNIT_MISMATCH");
    expect(code(() => removalAmount("corn", 10, "P", "mg/kg"))).toBe("UNIT_MISMATCH");
  });
  it("the yield unit is required, no default t/ha (issue 22 point 3): omitted or blank is MISSING_INPUT", () => {
    // invented: 180 bu/ac of corn typed without a unit would have been read as 180 t/ha.
    expect(code(() => removalAmount("corn", 180, "K2O", undefined))).toBe("MISSING_INPUT");
    expect(code(() => removalAmount("corn", 180, "K2O", " "))).toBe("MISSING_INPUT");
    expect(() => removalAmount("corn", 180, "K2O", undefined)).toThrow(/^yield_unit is required: .*bu\/ac/);
  });
  it("Mg/ha is a yield unit (tonnes); mg/ha is refused (issue 22 point 5)", () => {
    expect(removalAmount("corn", 10, "P2O5", "Mg/ha")).toBeCloseTo(72.5, 9);
    expect(code(() => removalAmount("corn", 10, "P2O5", "mg/ha"))).toBe("UNIT_MISMATCH");
  });
  it("a negative yield is refused; a zero yield removes nothing", () => {
    expect(code(() => removalAmount("corn", -1, "P", "t/ha"))).toBe("OUT_OF_RANGE");
    expect(removalAmount("corn", 0, "P", "t/ha")).toBe(0);
  });
});

describe("refusals name the argument and the words to use (the code's own messages)", () => {
  const crops = "corn, soybean, wheat, barley, oats, rye, dry bean, canola, oilseed rape, peas, faba bean, grass hay, grass silage, maize silage, potatoes, sugar beet, lucerne hay or oaten hay";
  it("an unknown crop, for the coefficient and for the bushel weight", () => {
    expect(message(() => removalCoefficient("quinoa", "N"))).toBe(`unknown crop "quinoa"; use ${crops}`);
    expect(message(() => removalBushelWeight("quinoa"))).toBe(`unknown crop "quinoa"; use ${crops}`);
  });
  it("an unknown nutrient word", () => {
    expect(message(() => removalCoefficient("corn", "phosphoric acid"))).toBe('unknown nutrient "phosphoric acid"; use N, P, P2O5, K, K2O, S, SO3, SO4, Ca, CaO, Mg or MgO');
  });
  it("a crop without a bushel weight lists the crops that have one and the units to use instead", () => {
    expect(message(() => removalBushelWeight("grass hay"))).toBe(
      "no bushel weight is held for grass hay (bushel weights exist for corn, soybean, wheat, barley, oats, rye, canola, dry bean or peas); give the yield in kg/ha, t/ha, g/m2, lb/ac, ton/ac",
    );
  });
  it("a negative yield and a result unit that is not a rate per area", () => {
    expect(message(() => removalAmount("corn", -1, "P", "t/ha"))).toBe("yield must be at least 0 (got -1)");
    expect(message(() => removalAmount("corn", 10, "P", "t/ha", "mg/kg"))).toBe('rate_unit "mg/kg" is not accepted here; use kg/ha, t/ha, g/m2, lb/ac, ton/ac');
  });
  it("a yield too large to convert says so, not Infinity", () => {
    expect(code(() => removalAmount("corn", 1e306, "P2O5", "t/ha"))).toBe("OUT_OF_RANGE");
    expect(message(() => removalAmount("corn", 1e306, "P2O5", "t/ha"))).toMatch(/cannot be computed for these inputs \(result is not finite\)$/);
  });
});

describe("data integrity and properties", () => {
  it("every coefficient is keyed by a form the chemistry knows, and every nutrient word reads for every crop or is #N/A", () => {
    // removalCoefficient skips a key of another element by formFactor's UNIT_MISMATCH; any other
    // refusal there would be a data error.
    const words = ["N", "P", "P2O5", "K", "K2O", "S", "SO3", "SO4", "Ca", "CaO", "Mg", "MgO"];
    for (const r of REMOVAL_ROWS) {
      for (const [key, c] of Object.entries(r.kg_per_t)) {
        expect(FORM_IDS).toContain(key);
        expect(Number.isFinite(mid(c))).toBe(true);
      }
      for (const w of words) expect([undefined, "NO_REFERENCE_DATA"]).toContain(code(() => removalCoefficient(r.id, w)));
    }
  });
  it("each crop's status says where its source was seen", () => {
    for (const t of removalTables()) {
      const row = REMOVAL_ROWS.find((r) => r.id === t.crop)!;
      expect(t.status).toBe(`${row.status}; ${row.seen_at}`);
    }
    expect(removalTables()[0]!.status).toMatch(/^seen; https:\/\//);
  });
  it("every crop row has a source, a basis and at least one coefficient; ranges are low-high", () => {
    for (const r of REMOVAL_ROWS) {
      expect(r.source.length).toBeGreaterThan(20);
      expect(r.seen_at).toMatch(/^https?:\/\//);
      expect(r.basis.length).toBeGreaterThan(3);
      const cs = Object.values(r.kg_per_t);
      expect(cs.length).toBeGreaterThan(0);
      for (const c of cs) if (typeof c !== "number") expect(c[1]).toBeGreaterThan(c[0]);
    }
    expect(removalCrops()).toContain("lucerne hay");
  });
  it("removalTables lists every crop with its basis, nutrients, bushel weight and source", () => {
    const list = removalTables();
    expect(list.map((t) => t.crop)).toEqual(removalCrops());
    const corn = list.find((t) => t.crop === "corn")!;
    expect(corn.lbPerBushel).toBe(56);
    expect(corn.nutrients).toEqual(["N", "P2O5", "K2O", "Ca", "Mg", "S"]);
    expect(corn.source).toMatch(/OMAFA/);
    expect(list.find((t) => t.crop === "grass hay")!.lbPerBushel).toBeUndefined();
  });
  it("removal is linear in yield (invented yields)", () => {
    fc.assert(
      fc.property(fc.constantFrom(...removalCrops()), fc.double({ min: 0, max: 100, noNaN: true }), (crop, y) => {
        const n = Object.keys(REMOVAL_ROWS.find((r) => r.id === crop)!.kg_per_t)[0]!;
        return Math.abs(removalAmount(crop, y, n, "t/ha") - y * removalAmount(crop, 1, n, "t/ha")) <= 1e-9 * Math.max(1, y);
      }),
    );
  });
  // Factors derived from atomic weights (IUPAC/CIAAW abridged 2021, from memory): K2O / 2K = 94.195 /
  // 78.196 = 1.20460; P2O5 / 2P = 141.943 / 61.948 = 2.29132.
  it("oxide and element round trip: K2O = K × 1.2046, P2O5 = P × 2.2913 (invented yields)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 20, noNaN: true }), (y) => {
        const k = removalAmount("soybean", y, "K", "t/ha");
        const k2o = removalAmount("soybean", y, "K2O", "t/ha");
        const p = removalAmount("soybean", y, "P", "t/ha");
        const p2o5 = removalAmount("soybean", y, "P2O5", "t/ha");
        return Math.abs(k2o - k * 1.2046) <= 1e-4 * Math.max(1, k2o) && Math.abs(p2o5 - p * 2.2913) <= 1e-4 * Math.max(1, p2o5);
      }),
    );
  });
});
