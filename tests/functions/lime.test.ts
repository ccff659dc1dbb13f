/**
 * Bindings of the lime functions: argument order, ranges as calibrations, broadcasting a column,
 * blank in blank out, defaults, and errors as host error values. Inputs are invented unless a
 * source is named; expected values follow from tests/core/lime-*.test.ts (Source: Moore 2025,
 * OSU Extension EM 9585 Table 1; NCDA&CS lime factor page; BC Soil Factsheet 637.200-2).
 */
import { limebuffer, limeal, limealsat, limebasesat, limephbc, limeproduct, fineness } from "../../src/functions/lime";
import { PlainHostError, specOf } from "../../src/functions/_binding";

const err = (v: unknown) => (v instanceof PlainHostError ? `${v.kind} ${v.message}` : undefined);
const kind = (v: unknown) => (v instanceof PlainHostError ? v.kind : undefined);
const g = (v: unknown) => [[v]] as any[][];
const one = (out: any[][]) => out[0]![0];

describe("argument order is the catalogue's (functions.md, Lime requirement)", () => {
  it.each([
    ["LIMEBUFFER", limebuffer, ["buffer_ph", "target_ph", "calibration", "soil_ph", "depth_cm", "unit"]],
    ["LIMEAL", limeal, ["exch_al", "factor", "depth_cm", "bulk_density", "unit"]],
    ["LIMEALSAT", limealsat, ["al", "ca", "mg", "target_al_sat", "factor", "depth_cm", "bulk_density", "unit"]],
    ["LIMEBASESAT", limebasesat, ["cec", "base_sat", "target_base_sat", "depth_cm", "bulk_density", "unit"]],
    ["LIMEPHBC", limephbc, ["soil_ph", "target_ph", "ph_buffer_capacity", "depth_cm", "bulk_density", "unit"]],
    ["LIMEPRODUCT", limeproduct, ["caco3_rate", "cce_pct", "fineness_pct", "moisture_pct"]],
    ["FINENESS", fineness, ["fractions", "efficiencies"]],
  ])("SOIL.%s", (_id, fn, names) => {
    expect(specOf(fn as Function)?.params.map((p) => p.name)).toEqual(names);
  });
  it("calibration, fractions and efficiencies are whole ranges, not broadcast", () => {
    expect(specOf(limebuffer)?.params[2]?.kind).toBe("range");
    expect(specOf(fineness)?.params.map((p) => p.kind)).toEqual(["range", "range"]);
  });
});

describe("SOIL.LIMEBUFFER", () => {
  it("EM 9585 worked example through the binding: Sikora 6.0, target 5.6 → 1.7 ton/ac", () => {
    expect(one(limebuffer(g(6.0), g(5.6), g("SIKORA-OR2025"), null as never, null as never, g("ton/ac")))).toBeCloseTo(1.7, 10);
  });
  it("a column of buffer pH broadcasts; a blank buffer pH gives a blank result; an out-of-table one is #VALUE! with the range", () => {
    const out = limebuffer([[6.5], [""], [6.0], [4.0]], g(6.0), g("SIKORA-OR2025"), null as never, null as never, g("ton/ac"));
    expect(out[0]![0]).toBeCloseTo(1.2, 10);
    expect(out[1]![0]).toBe("");
    expect(out[2]![0]).toBeCloseTo(2.5, 10);
    expect(err(out[3]![0])).toBe("#VALUE! buffer_ph 4 is outside the SIKORA-OR2025 table (buffer pH 4.8 to 6.9); the table is not extrapolated");
  });
  it("calibration is required (issue 22 point 3): omitted or a blank cell is #VALUE! naming the built-ins and the range form", () => {
    expect(err(one(limebuffer(g(6.0), g(6.5), null as never)))).toMatch(/^#VALUE! calibration is required: .*SIKORA-OR2025, MEHLICH .*range/);
    expect(err(one(limebuffer(g(6.0), g(6.5), g(""))))).toMatch(/^#VALUE! calibration is required/);
  });
  it("SMP named is #N/A with the reason: its table is not shipped", () => {
    const v = one(limebuffer(g(6.0), g(6.5), g("SMP")));
    expect(kind(v)).toBe("#N/A");
    expect(err(v)).toMatch(/SMP table is not shipped/);
  });
  it("an unknown calibration name is #VALUE! listing the built-ins", () => {
    expect(err(one(limebuffer(g(6.0), g(6.5), g("ADAMS-EVANS"))))).toBe('#VALUE! unknown calibration "ADAMS-EVANS"; use SMP, SIKORA-OR2025 or MEHLICH');
  });
  it("a worksheet range as calibration (invented lab table); its own unit, so unit must be blank", () => {
    const table = [["", 6.0, 6.5], [6.0, 3.0, 4.0], [6.5, 1.0, 2.0]];
    expect(one(limebuffer(g(6.25), g(6.5), table))).toBeCloseTo(3.0, 12);
    expect(kind(one(limebuffer(g(6.25), g(6.5), table, null as never, null as never, g("t/ha"))))).toBe("#VALUE!");
    expect(err(one(limebuffer(g(6.25), g(6.5), table, null as never, g(20))))).toMatch(/leave depth_cm and unit blank/);
  });
  it("MEHLICH with soil_ph (NCDA&CS example: 0.75 ton/ac by the formula); without soil_ph #VALUE! asking for it", () => {
    expect(one(limebuffer(g(6.3), g(6.0), g("MEHLICH"), g(5.0), null as never, g("ton/ac")))).toBeCloseTo(0.75, 10);
    expect(err(one(limebuffer(g(6.3), g(6.0), g("MEHLICH"))))).toMatch(/^#VALUE! soil_ph is needed/);
  });
  it("target at or below soil pH gives 0, not an error", () => {
    expect(one(limebuffer(g(6.0), g(6.0), g("SIKORA-OR2025"), g(6.4)))).toBe(0);
  });
});

describe("SOIL.LIMEAL", () => {
  it("LIME-24 (derived): Al 2, 20 cm, BD 1.2 → 3.603 t/ha; a column of Al broadcasts with a blank", () => {
    const out = limeal([[2], [""], [0]], null as never, g(20), g(1.2));
    expect(out[0]![0]).toBeCloseTo(3.6031, 4);
    expect(out[1]![0]).toBe("");
    expect(out[2]![0]).toBe(0);
  });
  it("missing depth is #VALUE! saying which argument", () => {
    expect(err(one(limeal(g(2), null as never, null as never, g(1.2))))).toMatch(/^#VALUE! depth_cm is needed/);
  });
});

describe("SOIL.LIMEALSAT", () => {
  it("Cochrane et al. rule through the binding: RAS 10 → 3.3 meq/100 g; 20 cm at BD 1.0 → 3.303 t/ha (derived)", () => {
    expect(one(limealsat(g(2), g(1), g(0.5), g(10), null as never, null as never, g(1.0)))).toBeCloseTo(3.3 * 1.00086, 4);
  });
  it("target_al_sat omitted is #VALUE! explaining that crops differ", () => {
    expect(err(one(limealsat(g(2), g(1), g(0.5), null as never, null as never, null as never, g(1.0))))).toMatch(/target_al_sat is needed/);
  });
});

describe("SOIL.LIMEBASESAT", () => {
  // Source: agronomiacomgismonti (2010), seen: NC = (60 − 8.42) × 5.46 / 100 = 2.816 t/ha for 0–20 cm,
  // printed to three decimals, at the method's rounded 1 t CaCO3/ha per cmolc/dm3. Ours uses the exact
  // 1.00086 t (100.086 / 2 g per mol of charge × 2000 m3/ha of layer; derived from atomic weights).
  it("worked example T 5.46, V 8.42 → 60 %: the source's 2.816 t/ha to its three decimals, × 1.00086 in ours", () => {
    const r = one(limebasesat(g(5.46), g(8.42), g(60))) as number;
    expect(Math.abs(r / 1.00086 - 2.816)).toBeLessThanOrEqual(0.0005);
    expect(r).toBeCloseTo(((60 - 8.42) * 5.46 * 1.00086) / 100, 9);
  });
  it("issue 22: LIMEBASESAT(8.9, 0.5, 0.7) is #VALUE! with the fraction hint, not 0.0178", () => {
    expect(err(one(limebasesat(g(8.9), g(0.5), g(0.7))))).toMatch(/^#VALUE! base_sat must be 0, or above 1 to 100 %.*0\.5 looks like a fraction; enter 50 for 50 %/);
    expect(err(one(limebasesat(g(8.9), g(50), g(0.7))))).toContain("0.7 looks like a fraction; enter 70 for 70 %");
  });
  it("depth_cm, bulk_density and unit reach the method (arithmetic derived from the 1.00086 t per cmolc/dm3 above)", () => {
    // T 10 cmol(+)/kg × 1.2 g/cm3 = 12 cmolc/dm3; V 50 → 70 % is 2.4 cmolc/dm3: 2.402064 t/ha for 0–20 cm.
    expect(one(limebasesat(g(10), g(50), g(70), g(10)))).toBeCloseTo((2 * 1.00086) / 2, 9);
    expect(one(limebasesat(g(10), g(50), g(70), null as never, g(1.2)))).toBeCloseTo(2.4 * 1.00086, 9);
    expect(one(limebasesat(g(10), g(50), g(70), null as never, null as never, g("kg/ha")))).toBeCloseTo(2 * 1000.86, 6);
    expect(one(limebasesat(g(10), g(50), g(70), g(10), g(1.2), g("kg/ha")))).toBeCloseTo(1200 * 1.00086, 6);
  });
  it("a row of targets broadcasts; V2 ≤ V1 gives 0", () => {
    const out = limebasesat(g(10), g(50), [[40, 50, 70]]);
    expect(out[0]).toEqual([0, 0, expect.any(Number)]);
    expect(out[0]![2]).toBeCloseTo(2.0017, 4);
  });
});

describe("SOIL.LIMEPHBC", () => {
  it("LIME-30 (derived): 650.6 kg/ha", () => {
    expect(one(limephbc(g(5), g(6), g(1), g(10), g(1.3), g("kg/ha")))).toBeCloseTo(650.56, 2);
  });
  it("an unknown unit is #VALUE! listing rate units", () => {
    expect(err(one(limephbc(g(5), g(6), g(1), g(10), g(1.3), g("bushels"))))).toMatch(/^#VALUE! unknown unit "bushels"/);
  });
});

describe("SOIL.LIMEPRODUCT", () => {
  it("Penn State AASL example: 5 at CCE 70 → 7.14; fineness and moisture default to 100 and 0", () => {
    expect(one(limeproduct(g(5), g(70)))).toBeCloseTo(7.1429, 4);
    expect(one(limeproduct(g(5), g(70), g(100), g(0)))).toBeCloseTo(7.1429, 4);
  });
  it("CCE 0 is #VALUE!, never Infinity", () => {
    expect(err(one(limeproduct(g(5), g(0))))).toMatch(/^#VALUE! cce_pct must be/);
  });
  it("issue 22: LIMEPRODUCT(3, 0.95, 0.85) is #VALUE! with the fraction hint, not 37 151.7", () => {
    expect(err(one(limeproduct(g(3), g(0.95), g(0.85))))).toContain("0.95 looks like a fraction; enter 95 for 95 %");
    expect(one(limeproduct(g(3), g(95), g(85)))).toBeCloseTo(3 / 0.95 / 0.85, 10);
  });
  it("a column of CCE formatted as % (0.95, 0.9) is refused element by element; real percents compute", () => {
    const out = limeproduct(g(3), [[0.95], [95], [""]]);
    expect(kind(out[0]![0])).toBe("#VALUE!");
    expect(out[1]![0]).toBeCloseTo(3 / 0.95, 10);
    expect(out[2]![0]).toBe("");
  });
});

describe("SOIL.FINENESS", () => {
  it("BC Factsheet 637.200-2 limestone A (85.28 %) from a column, and B (94.40 %) from a row", () => {
    expect(one(fineness([[78.8], [10], [2.4], [7.8]]))).toBeCloseTo(85.28, 10);
    expect(one(fineness([[90, 6, 4, 0]]))).toBeCloseTo(94.4, 10);
  });
  it("fractions or efficiencies typed as fractions of 1 are #VALUE! (issue 22 point 4)", () => {
    expect(err(one(fineness([[0.788], [0.1], [0.024], [0.078]])))).toMatch(/they look like fractions/);
    expect(err(one(fineness([[78.8], [10], [2.4], [7.8]], [[1], [0.6], [0.2], [0]])))).toMatch(/look like fractions/);
  });
  it("a user's rating as a second range; fractions not adding up to 100 ± 1 % is #VALUE!", () => {
    expect(one(fineness([[70, 20, 10]], [[100, 50, 10]]))).toBeCloseTo(81, 12);
    expect(err(one(fineness([[50, 10, 2, 7]])))).toBe("#VALUE! fractions add up to 69 %; they must add up to 100 ± 1 %");
  });
  it("fractions omitted is #VALUE! saying it is required", () => {
    expect(err(one(fineness(null as never)))).toBe("#VALUE! fractions is required");
  });
});
