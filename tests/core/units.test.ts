import fc from "fast-check";
import { convertRate, convertUnit, unitById, unitOfFamily, REFUSED_UNIT_WORDS, UNITS } from "../../src/core/units";
import { normaliseWord } from "../../src/core/names";
import unitData from "../../src/data/units.json";
import { errorCode as code, errorMessage } from "../helpers/errors";


describe("convertUnit: exact factors", () => {
  // Source: 1959 international yard and pound agreement (lb = 0.45359237 kg, ft = 0.3048 m) and
  // NIST Handbook 44 App. C (acre = 43 560 ft2 = 4046.8564224 m2); published-values UNIT-01..03.
  it("1 lb/ac is 0.45359237 / 0.40468564224 kg/ha (UNIT-07 derived exact)", () => {
    expect(convertUnit(1, "lb/ac", "kg/ha")).toBeCloseTo(1.120851156, 9);
  });
  it("handbook factor 1.12 kg/ha per lb/ac (Better Crops 91(4) 2007 p.31, UNIT-07)", () => {
    expect(convertUnit(1, "lb/ac", "kg/ha")).toBeCloseTo(1.12, 2);
  });
  it("1 kg/ha = 0.8921791 lb/ac; handbook 0.891 (Better Crops 2007, UNIT-08)", () => {
    expect(convertUnit(1, "kg/ha", "lb/ac")).toBeCloseTo(0.8921791, 7);
    expect(Math.abs(convertUnit(1, "kg/ha", "lb/ac") - 0.891)).toBeLessThan(0.0015);
  });
  it("1 short ton/ac = 2.241702 t/ha; handbook 2.242 (Better Crops 2007, UNIT-09)", () => {
    expect(convertUnit(1, "ton/ac", "t/ha")).toBeCloseTo(2.241702, 6);
  });
  it("100 lb N/ac = 112.085 kg/ha (UNIT-10, derived from UNIT-07)", () => {
    expect(convertUnit(100, "lb/a", "kg/ha")).toBeCloseTo(112.085, 2);
  });
  it("1 g/m2 = 10 kg/ha and 1 t/ha = 1000 kg/ha (SI, NIST SP 811)", () => {
    expect(convertUnit(1, "g/m2", "kg/ha")).toBeCloseTo(10, 12);
    expect(convertUnit(1, "t/ha", "kg/ha")).toBe(1000);
  });
  it("1 % = 10 000 mg/kg; ppm is mg/kg (SI definition)", () => {
    expect(convertUnit(1, "%", "ppm")).toBe(10000);
    expect(convertUnit(2.5, "g/kg", "mg/kg")).toBe(2500);
  });
  it("1 meq/100 g = 1 cmol(+)/kg = 10 mmol(+)/kg (Rayment & Lyons 2011 App. 5)", () => {
    expect(convertUnit(1, "meq/100g", "cmolc/kg")).toBe(1);
    expect(convertUnit(1, "cmol(+)/kg", "mmolc/kg")).toBeCloseTo(10, 12);
  });
  it("1 dS/m = 1000 uS/cm = 1 mmho/cm (SI definition)", () => {
    expect(convertUnit(1, "dS/m", "uS/cm")).toBeCloseTo(1000, 9);
    expect(convertUnit(1, "mmho/cm", "dS/m")).toBe(1);
  });
});

describe("convertUnit: through a soil layer", () => {
  it("10 mg/kg over 15 cm at 1.3 g/cm3 is 19.5 kg/ha (UNIT-16: definition of layer mass)", () => {
    expect(convertUnit(10, "mg/kg", "kg/ha", { depthCm: 15, bulkDensity: 1.3 })).toBeCloseTo(19.5, 10);
  });
  it("ppm × 2 ≈ lb/ac for a 6.67-in furrow slice of 2 million lb (Better Crops 2007; Penn State Agronomy Guide, UNIT-13)", () => {
    // 2 000 000 lb/ac over 6.67 in (16.94 cm): bulk density = 2e6 lb/ac in kg/ha / (depth × 1e5).
    const depth = 6.67 * 2.54;
    const bd = (2e6 * 1.120851156) / (depth * 1e5);
    expect(convertUnit(60, "ppm", "lb/ac", { depthCm: depth, bulkDensity: bd })).toBeCloseTo(120, 6);
  });
  it("mg/dm3 to mg/kg divides by bulk density; to kg/ha needs only depth", () => {
    expect(convertUnit(26, "mg/dm3", "mg/kg", { bulkDensity: 1.3 })).toBeCloseTo(20, 10);
    expect(convertUnit(20, "mg/dm3", "kg/ha", { depthCm: 10 })).toBeCloseTo(20, 10);
  });
  it("says which argument is missing", () => {
    expect(code(() => convertUnit(10, "mg/kg", "kg/ha", { depthCm: 15 }))).toBe("MISSING_INPUT");
    expect(() => convertUnit(10, "mg/kg", "kg/ha", { bulkDensity: 1.3 })).toThrow(/depth_cm/);
    expect(() => convertUnit(10, "mg/kg", "kg/ha", { depthCm: 15 })).toThrow(/bulk_density/);
  });
  it("rejects a bulk density out of range rather than clamping", () => {
    expect(code(() => convertUnit(10, "mg/kg", "kg/ha", { depthCm: 15, bulkDensity: 0 }))).toBe("OUT_OF_RANGE");
    expect(code(() => convertUnit(10, "mg/kg", "kg/ha", { depthCm: -1, bulkDensity: 1.2 }))).toBe("OUT_OF_RANGE");
  });
});

describe("convertUnit: refusals", () => {
  it("unknown unit lists the accepted words", () => {
    expect(code(() => convertUnit(1, "kg/acre", "kg/ha"))).toBe("UNKNOWN_NAME");
    expect(() => convertUnit(1, "kg/acre", "kg/ha")).toThrow(/lb\/ac/);
  });
  it("charge to mass needs an ion", () => {
    expect(code(() => convertUnit(1, "cmol(+)/kg", "mg/kg"))).toBe("UNIT_MISMATCH");
    expect(() => convertUnit(1, "cmol(+)/kg", "mg/kg")).toThrow(/SOIL.CMOL/);
  });
  it("salinity to rate is refused", () => {
    expect(code(() => convertUnit(1, "dS/m", "kg/ha"))).toBe("UNIT_MISMATCH");
  });
  it("unit names are case-insensitive", () => {
    expect(convertUnit(1, "LB/AC", "KG/HA")).toBeCloseTo(1.120851156, 9);
  });
});

describe("unit words two trades read differently (issue 22 point 5)", () => {
  // Source: definition. A mole of Ca2+ or Mg2+ carries two moles of charge, so a bare cmol/kg or
  // mmol/kg does not say which was meant; SOIL.SAR refuses a bare mmol/L for the same reason.
  it.each(["cmol/kg", "CMOL/KG", "cmol kg-1", "mmol/kg", "mmol kg-1"])("bare %s is refused as ambiguous (UNIT_MISMATCH)", (w) => {
    expect(code(() => unitById(w))).toBe("UNIT_MISMATCH");
  });
  it("the refusal of a bare cmol/kg names the charge spellings", () => {
    expect(() => unitById("cmol/kg")).toThrow(/write cmol\(\+\)\/kg, cmolc\/kg or meq\/100g/);
  });
  it("the refusal of a bare mmol/kg names mmolc/kg", () => {
    expect(() => unitById("mmol/kg")).toThrow(/write mmolc\/kg, mmol\(\+\)\/kg or meq\/kg/);
  });
  it("cmol(+)/kg, cmolc/kg and meq/100g are charge; mmolc/kg is a tenth of them (Rayment & Lyons 2011 App. 5)", () => {
    expect(unitById("cmol(+)/kg").family).toBe("charge");
    expect(convertUnit(1, "cmolc/kg", "meq/100g")).toBe(1);
    expect(convertUnit(10, "mmolc/kg", "cmol(+)/kg")).toBeCloseTo(1, 12);
    expect(convertUnit(10, "mmol(+)/kg", "cmolc/kg")).toBeCloseTo(1, 12);
  });
  it.each(["mg/L", "mg/l", "MG/L", "mg L-1"])("%s is not read as mg per dm3 of soil (UNIT_MISMATCH naming mg/dm3)", (w) => {
    expect(code(() => convertUnit(26, w, "mg/kg", { bulkDensity: 1.3 }))).toBe("UNIT_MISMATCH");
    expect(() => convertUnit(26, w, "mg/kg", { bulkDensity: 1.3 })).toThrow(/write mg\/dm3/);
  });
  it("mg/dm3 and mg dm-3 are soil volume (SI definition)", () => {
    expect(unitById("mg dm-3").id).toBe("mg/dm3");
  });
  // Source: SI prefixes m (milli) and M (mega) differ only by case (NIST SP 811, Thompson & Taylor 2008).
  it("Mg/ha is a megagram (tonne) per hectare", () => {
    expect(convertUnit(1, "Mg/ha", "kg/ha")).toBe(1000);
    expect(convertUnit(1, "Mg ha-1", "t/ha")).toBe(1);
  });
  it.each(["mg/ha", "MG/HA", "mG/ha", "mg ha-1"])("%s does not resolve to Mg/ha: refused naming Mg/ha and t/ha", (w) => {
    expect(code(() => convertUnit(1, w, "kg/ha"))).toBe("UNIT_MISMATCH");
    expect(() => convertUnit(1, w, "kg/ha")).toThrow(/write Mg\/ha or t\/ha/);
  });
  it("the refusal names the argument it is in", () => {
    expect(() => convertUnit(1, "kg/ha", "mg/ha")).toThrow(/^to_unit "mg\/ha"/);
    expect(() => unitOfFamily("cmol/kg", ["charge"], "unit")).toThrow(/^unit "cmol\/kg" is ambiguous/);
  });
  it("matching stays case-insensitive where no prefix collides", () => {
    expect(unitById("PPM").id).toBe("mg/kg");
    expect(unitById("MEQ/100G").id).toBe("cmol(+)/kg");
    expect(unitById("T/HA").id).toBe("t/ha");
    expect(unitById("KG/HA").id).toBe("kg/ha");
  });
  // Source: NIST SP 811 (Thompson & Taylor 2008): m is milli (10^-3), M is mega (10^6), so before
  // g (gram) or S (siemens) the case of the prefix is its meaning.
  it("an m/M prefix before g or S in the wrong case is refused with the right spelling", () => {
    for (const [typed, write] of [["MG/KG", "mg/kg"], ["Mg/kg", "mg/kg"], ["MG/DM3", "mg/dm3"], ["Mg/dm3", "mg/dm3"], ["MS/cm", "mS/cm"]] as const) {
      expect(code(() => unitById(typed))).toBe("UNIT_MISMATCH");
      expect(errorMessage(() => unitById(typed))).toContain(`has an SI prefix in the wrong case (m is milli, M is mega: Mg is a tonne, MS a megasiemens); write ${write}`);
    }
    expect(unitById("mS/cm").id).toBe("dS/m");
    expect(unitById("Mg/ha").id).toBe("t/ha");
  });
  it("the spelling suggested for a wrong-case prefix keeps the table's spaces", () => {
    // "mg kg-1" as the unit table writes it, never the run-together "mgkg-1"
    expect(errorMessage(() => unitById("MG KG-1"))).toMatch(/; write mg kg-1$/);
    expect(errorMessage(() => unitById("MGKG-1"))).toMatch(/; write mg ?kg-1$/);
  });
  it("no refused word is also an accepted spelling (data check)", () => {
    const accepted = new Set(
      (unitData.units as { id: string; aliases: string[] }[]).flatMap((u) => [u.id, ...u.aliases]).map(normaliseWord),
    );
    for (const w of REFUSED_UNIT_WORDS) expect(accepted.has(normaliseWord(w))).toBe(false);
  });
});

describe("convertUnit: properties", () => {
  const layer = { depthCm: 15, bulkDensity: 1.3 };
  const ids = UNITS.filter((u) => u.family !== "charge" && u.family !== "salinity").map((u) => u.id);
  it("round trip A→B→A returns the value (invented inputs, property test)", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.constantFrom(...ids), fc.constantFrom(...ids), (v, a, b) => {
        const back = convertUnit(convertUnit(v, a, b, layer), b, a, layer);
        expect(back).toBeCloseTo(v, Math.abs(v) > 1000 ? 4 : 8);
      }),
    );
  });
  it("factors multiply: A→B × B→C = A→C", () => {
    fc.assert(
      fc.property(fc.constantFrom(...ids), fc.constantFrom(...ids), fc.constantFrom(...ids), (a, b, c) => {
        const ab = convertUnit(1, a, b, layer);
        const bc = convertUnit(1, b, c, layer);
        const ac = convertUnit(1, a, c, layer);
        expect(ab * bc).toBeCloseTo(ac, Math.max(0, 9 - Math.round(Math.log10(Math.abs(ac) + 1))));
      }),
    );
  });
});

// Mutation testing (issue 21): the refusals read whole, not by prefix. Inputs invented.
describe("refusals read whole", () => {
  const msg = (f: () => unknown) => errorMessage(f);
  it("charge to mass in either direction names both families and points to SOIL.CMOL / SOIL.MGKG", () => {
    expect(msg(() => convertUnit(1, "mg/kg", "cmol(+)/kg"))).toBe(
      "cannot convert mg/kg (mass fraction of dry soil) to cmol(+)/kg (exchangeable charge per mass of soil); charge and mass are linked through an ion: use SOIL.CMOL or SOIL.MGKG",
    );
    expect(msg(() => convertUnit(1, "cmol(+)/kg", "mg/kg"))).toBe(
      "cannot convert cmol(+)/kg (exchangeable charge per mass of soil) to mg/kg (mass fraction of dry soil); charge and mass are linked through an ion: use SOIL.CMOL or SOIL.MGKG",
    );
  });
  it("two families with no link and no charge: no hint", () => {
    expect(msg(() => convertUnit(1, "mg/kg", "dS/m"))).toBe("cannot convert mg/kg (mass fraction of dry soil) to dS/m (electrical conductivity)");
  });
  it("an ambiguous word names the argument, the reason and the spellings to use", () => {
    expect(msg(() => convertUnit(1, "cmol/kg", "kg/ha"))).toBe(
      'from_unit "cmol/kg" is ambiguous: labs write it for centimoles of charge and for centimoles of the ion (1 cmol/kg of Ca2+ is 2 cmol(+)/kg); write cmol(+)/kg, cmolc/kg or meq/100g',
    );
  });
  it("a missing layer input names it with its unit", () => {
    expect(msg(() => convertUnit(1, "mg/kg", "kg/ha", { bulkDensity: 1.3 }))).toBe("converting mg/kg to kg/ha needs depth_cm (the soil layer depth in cm)");
    expect(msg(() => convertUnit(1, "mg/kg", "kg/ha", { depthCm: 10 }))).toBe("converting mg/kg to kg/ha needs bulk_density (dry bulk density in g/cm3)");
  });
  it("a unit of the wrong family for a rate", () => {
    expect(msg(() => convertRate(1, "mg/kg", "kg/ha"))).toBe('unit "mg/kg" is not accepted here; use kg/ha, t/ha, g/m2, lb/ac, ton/ac');
  });
  it("an unknown word lists the units, starting with mg/kg", () => {
    expect(msg(() => convertUnit(1, "bogus", "kg/ha"))).toMatch(/^unknown unit "bogus"; use mg\/kg, g\/kg, %, cmol\(\+\)\/kg, mmolc\/kg, /);
  });
  it("spacing, and case where no SI prefix collides, do not matter (10 mg/kg over 10 cm at 1.0 is 10 kg/ha, UNIT-16)", () => {
    expect(convertUnit(10, "  PPM ", "KG/HA", { depthCm: 10, bulkDensity: 1 })).toBeCloseTo(10, 12);
    expect(convertUnit(10, "mg /  kg", "kg/ha", { depthCm: 10, bulkDensity: 1 })).toBeCloseTo(10, 12);
  });
});

// Mutation testing (issue 21), second round: spacing of cased spellings, the micro sign, the
// words of each refusal, and results too large to be a number. Inputs invented.
describe("spellings, refusals and overflow read whole", () => {
  const msg = (f: () => unknown) => errorMessage(f);
  it("a cased spelling is matched after trimming and with inner spaces read as one (Mg/ha is a tonne per hectare, NIST SP 811)", () => {
    expect(convertUnit(1, " Mg/ha ", "t/ha")).toBe(1);
    expect(convertUnit(1, "Mg  ha-1", "t/ha")).toBe(1);
  });
  it("the Greek letter mu is read as the micro sign: μg/g (U+03BC) is µg/g, i.e. mg/kg (SI definition)", () => {
    expect(unitById("\u03bcg/g").id).toBe("mg/kg");
    expect(convertUnit(1, "\u03bcg/g", "mg/kg")).toBe(1);
  });
  it("a wrong-case prefix typed with spaces is refused naming the right spelling", () => {
    expect(msg(() => unitById("MS / cm"))).toBe(
      'unit "MS / cm" has an SI prefix in the wrong case (m is milli, M is mega: Mg is a tonne, MS a megasiemens); write mS/cm',
    );
  });
  it("unitById names the argument 'unit' when none is given, and quotes the word trimmed", () => {
    expect(msg(() => unitById("cmol/kg"))).toMatch(/^unit "cmol\/kg" is ambiguous: /);
    expect(msg(() => convertUnit(1, " cmol/kg ", "kg/ha"))).toMatch(/^from_unit "cmol\/kg" is ambiguous: /);
  });
  it("the refusal of mg/L carries its hint after the spellings to use", () => {
    expect(msg(() => unitById("mg/L"))).toBe(
      'unit "mg/L" is usually the concentration of an extract or a water, not an amount per volume of soil; write mg/dm3 ' +
        "if the lab means mg per litre of soil (as volume-based soil indices do); an extract concentration must first be turned into mg per kg or dm3 of soil with the extraction ratio, and SOIL.SAR takes mg/L for a water or extract",
    );
  });
  it("a missing depth is MISSING_INPUT, like a missing density", () => {
    expect(code(() => convertUnit(10, "mg/kg", "kg/ha", { bulkDensity: 1.3 }))).toBe("MISSING_INPUT");
  });
  it("a value that is not finite is refused naming 'value'", () => {
    expect(msg(() => convertUnit(Infinity, "mg/kg", "g/kg"))).toBe("value must be a finite number (got Infinity)");
  });
  it("a converted value too large for a number is refused, not returned as Infinity", () => {
    expect(msg(() => convertUnit(1e308, "%", "mg/kg"))).toBe("the converted value cannot be computed for these inputs (result is not finite)");
    expect(msg(() => convertRate(1e308, "ton/ac", "kg/ha"))).toBe("the converted rate cannot be computed for these inputs (result is not finite)");
  });
  it("convertRate refuses a to-unit of the wrong family naming it", () => {
    expect(msg(() => convertRate(1, "kg/ha", "mg/kg"))).toBe('unit "mg/kg" is not accepted here; use kg/ha, t/ha, g/m2, lb/ac, ton/ac');
  });
});
