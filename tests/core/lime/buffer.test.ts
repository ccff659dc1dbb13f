/**
 * Single-buffer lime requirement: calibration tables (built-in and user ranges), bilinear
 * interpolation, range errors, the NCDA&CS Mehlich formula, basis and depth rules.
 *
 * Sources beside each check. "seen" = the numbers were read in that source; "derived" =
 * arithmetic on a seen definition; "invented" = made-up inputs for a property or an error case.
 * LIME-xx refers to the project's list of published check values.
 */
import fc from "fast-check";
import sikoraData from "../../../src/data/lime/sikora-or2025.json";
import { limeBuffer, limeBufferTableRate, limeMehlichAcidity, limeMehlichFactor, limeMehlichRate } from "../../../src/core/lime/buffer";
import { LIME_CALIBRATION_IDS, limeCalibration, limeCalibrationDepthCm, limeCalibrationUnit, LimeTableCalibration } from "../../../src/core/lime/calibrations";
import { limeRangeRate, limeTableFromRange, limeTableRate, LimeRange } from "../../../src/core/lime/table";
import { errorCode as codeOf, errorMessage as messageOf } from "../../helpers/errors";
import { convertRate } from "../../../src/core/units";


const SIK = "SIKORA-OR2025";
const tonAc = (bufferPh: number, targetPh: number, extra: object = {}) => limeBuffer(bufferPh, targetPh, { calibration: SIK, unit: "ton/ac", ...extra });

// Invented calibration for interpolation and error tests (not a published table).
const INVENTED: LimeRange = [
  ["lab table", 6.0, 6.5, 7.0],
  [6.8, 0.0, 0.5, 1.0],
  [6.4, 1.0, 2.0, 3.0],
  [6.0, 3.0, 4.0, 6.0],
];

describe("SIKORA-OR2025: Moore (2025) OSU Extension EM 9585 Table 1 (seen)", () => {
  it("the source's worked example: Sikora 6.0, target 5.6 → 1.7 t/a (LIME-09, seen)", () => {
    expect(tonAc(6.0, 5.6)).toBeCloseTo(1.7, 10);
  });
  it.each([
    // LIME-10: Sikora 6.5 row, targets 5.6 / 6.0 / 6.4 / 6.8 / 7.2 (seen)
    [5.6, 0.7],
    [6.0, 1.2],
    [6.4, 1.8],
    [6.8, 2.5],
    [7.2, 3.3],
  ])("Sikora 6.5, target %s → %s t/a (Table 1, seen)", (target, rate) => {
    expect(tonAc(6.5, target)).toBeCloseTo(rate, 10);
  });
  it.each([
    // Further cells of Table 1 (seen): the table's corners and the rows printed without decimals
    [6.9, 5.6, 0.0],
    [6.9, 7.2, 1.0],
    [4.8, 5.6, 6.1],
    [4.8, 7.2, 23.2],
    [5.7, 7.2, 9.9],
    [5.0, 6.8, 14],
    [5.1, 6.8, 13],
  ])("Sikora %s, target %s → %s t/a (Table 1, seen)", (buffer, target, rate) => {
    expect(tonAc(buffer, target)).toBeCloseTo(rate, 10);
  });
  it("the data file holds all 22 rows (6.9 to 4.8 by 0.1) and 5 targets, each row with its source", () => {
    expect(sikoraData.rows).toHaveLength(22);
    expect(sikoraData.target_ph).toEqual([5.6, 6.0, 6.4, 6.8, 7.2]);
    for (const r of sikoraData.rows) {
      expect(r.rates).toHaveLength(5);
      expect(r.source).toMatch(/EM 9585/);
    }
  });
  it("calibration depth 6 in = 15.24 cm, unit ton/ac, basis 100-score lime (pure CaCO3 equivalent)", () => {
    expect(limeCalibrationDepthCm(SIK)).toBe(15.24);
    expect(limeCalibrationUnit(SIK)).toBe("ton/ac");
    expect((limeCalibration(SIK) as LimeTableCalibration).neutralizingValuePct).toBe(100);
  });
  it("default unit is t/ha: 1.7 ton/ac × 2.2417 = 3.8109 t/ha (UNIT-09 factor, derived)", () => {
    expect(limeBuffer(6.0, 5.6, { calibration: SIK })).toBeCloseTo(1.7 * 2.241702, 4);
    expect(limeBuffer(6.0, 5.6, { calibration: SIK, unit: "lb/ac" })).toBeCloseTo(3400, 6);
    expect(limeBuffer(6.0, 5.6, { calibration: SIK, unit: "kg/ha" })).toBeCloseTo(convertRate(1.7, "ton/ac", "kg/ha"), 6);
  });
  it("interpolates between rows: Sikora 6.45, target 6.0 → (1.2 + 1.5)/2 = 1.35 t/a (derived from Table 1)", () => {
    expect(tonAc(6.45, 6.0)).toBeCloseTo(1.35, 10);
  });
  it("interpolates between target columns: Sikora 6.0, target 5.8 → (1.7 + 2.5)/2 = 2.1 t/a (derived)", () => {
    expect(tonAc(6.0, 5.8)).toBeCloseTo(2.1, 10);
  });
  it("interpolates on both axes: Sikora 5.75, target 6.2 → 4.175 t/a (derived, bilinear in Table 1)", () => {
    // row 5.8: 3.1 (6.0), 4.1 (6.4) → 3.6 at 6.2; row 5.7: 4.0, 5.5 → 4.75; midway → 4.175
    expect(tonAc(5.75, 6.2)).toBeCloseTo(4.175, 10);
  });
  it("a given depth scales in proportion: 30.48 cm (12 in) doubles the 6-inch rate (derived)", () => {
    expect(tonAc(6.0, 5.6, { depthCm: 30.48 })).toBeCloseTo(3.4, 10);
    expect(tonAc(6.0, 5.6, { depthCm: 7.62 })).toBeCloseTo(0.85, 10);
  });
  it("buffer pH outside 4.8–6.9 is OUT_OF_RANGE with the table's range in the message, never extrapolated", () => {
    expect(codeOf(() => tonAc(4.7, 6.0))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => tonAc(7.0, 6.0))).toBe("OUT_OF_RANGE");
    expect(messageOf(() => tonAc(4.7, 6.0))).toBe(
      "buffer_ph 4.7 is outside the SIKORA-OR2025 table (buffer pH 4.8 to 6.9); the table is not extrapolated",
    );
  });
  it("target pH outside 5.6–7.2 is OUT_OF_RANGE naming the target range", () => {
    expect(codeOf(() => tonAc(6.0, 7.3))).toBe("OUT_OF_RANGE");
    expect(messageOf(() => tonAc(6.0, 5.5))).toMatch(/target pH 5\.6 to 7\.2/);
  });
  it("exact edges are inside: 4.8 and 6.9, 5.6 and 7.2 (floating slack of 1e-9 only)", () => {
    expect(tonAc(4.8, 7.2)).toBeCloseTo(23.2, 10);
    expect(tonAc(6.9 + 1e-12, 5.6)).toBeCloseTo(0, 10);
    expect(codeOf(() => tonAc(6.9 + 1e-6, 5.6))).toBe("OUT_OF_RANGE");
  });
  it("target at or below the soil pH gives 0 ('if the target soil pH has already been achieved, a lime application may not be necessary', EM 9585, seen)", () => {
    expect(tonAc(6.0, 6.0, { soilPh: 6.2 })).toBe(0);
    expect(tonAc(6.0, 6.0, { soilPh: 6.0 })).toBe(0);
    expect(tonAc(6.0, 6.0, { soilPh: 5.5 })).toBeCloseTo(2.5, 10);
    // a target below the table's range is fine when it is already reached
    expect(tonAc(6.0, 5.0, { soilPh: 5.5 })).toBe(0);
  });
  it("zero still checks the buffer pH and the unit (a bad argument is not hidden by a zero)", () => {
    expect(codeOf(() => tonAc(4.0, 6.0, { soilPh: 6.5 }))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeBuffer(6.0, 6.0, { calibration: SIK, soilPh: 6.5, unit: "bushels" }))).toBe("UNKNOWN_NAME");
  });
  it("property: the rate never rises as buffer pH rises, for every target (invented sampling of the seen table)", () => {
    fc.assert(
      fc.property(fc.double({ min: 4.8, max: 6.9, noNaN: true }), fc.double({ min: 4.8, max: 6.9, noNaN: true }), fc.double({ min: 5.6, max: 7.2, noNaN: true }), (a, b, t) => {
        const [lo, hi] = a < b ? [a, b] : [b, a];
        return tonAc(hi, t) <= tonAc(lo, t) + 1e-12;
      }),
    );
  });
  it("property: the rate never falls as the target rises (invented sampling)", () => {
    fc.assert(
      fc.property(fc.double({ min: 4.8, max: 6.9, noNaN: true }), fc.double({ min: 5.6, max: 7.2, noNaN: true }), fc.double({ min: 5.6, max: 7.2, noNaN: true }), (bp, a, b) => {
        const [lo, hi] = a < b ? [a, b] : [b, a];
        return tonAc(bp, lo) <= tonAc(bp, hi) + 1e-12;
      }),
    );
  });
  it("property: depth scaling is linear (invented depths)", () => {
    fc.assert(
      fc.property(fc.double({ min: 4.8, max: 6.9, noNaN: true }), fc.double({ min: 5.6, max: 7.2, noNaN: true }), fc.double({ min: 1, max: 150, noNaN: true }), (bp, t, d) => {
        const base = tonAc(bp, t);
        return Math.abs(tonAc(bp, t, { depthCm: d }) - (base * d) / 15.24) <= 1e-9 * Math.max(1, base * d);
      }),
    );
  });
});

describe("SMP: the Shoemaker, McLean & Pratt (1961) table is not shipped", () => {
  it("SMP named answers NO_REFERENCE_DATA (#N/A) saying why and what to use", () => {
    expect(LIME_CALIBRATION_IDS).toEqual(["SMP", "SIKORA-OR2025", "MEHLICH"]);
    expect(codeOf(() => limeBuffer(6.0, 6.5, { calibration: "SMP" }))).toBe("NO_REFERENCE_DATA");
    expect(codeOf(() => limeBuffer(6.0, 6.5, { calibration: "smp" }))).toBe("NO_REFERENCE_DATA");
    const msg = messageOf(() => limeBuffer(6.0, 6.5, { calibration: "SMP" }));
    expect(msg).toMatch(/SMP table is not shipped/);
    expect(msg).toMatch(/Pass your laboratory's SMP calibration as a range/);
  });
  it("a consultant's SMP table passed as a range works (LIME-02 values from memory, used only as invented table data here)", () => {
    // from memory, NOT verified: SMP 6.5 → 4.5/3.8/3.2 t/a for pH 7.0/6.5/6.0. Used only to show a user table works.
    const table: LimeRange = [["", 6.0, 6.5, 7.0], [6.5, 3.2, 3.8, 4.5], [6.0, 6.9, 8.3, 9.9]];
    expect(limeBuffer(6.5, 6.5, { calibration: table })).toBeCloseTo(3.8, 10);
    expect(limeBuffer(6.25, 6.5, { calibration: table })).toBeCloseTo((3.8 + 8.3) / 2, 10);
  });
});

describe("calibration names", () => {
  it("unknown name is UNKNOWN_NAME listing the built-ins", () => {
    expect(codeOf(() => limeBuffer(6.0, 6.5, { calibration: "WOODRUFF" }))).toBe("UNKNOWN_NAME");
    expect(messageOf(() => limeBuffer(6.0, 6.5, { calibration: "WOODRUFF" }))).toBe(
      'unknown calibration "WOODRUFF"; use SMP, SIKORA-OR2025 or MEHLICH',
    );
  });
  it("names are case-insensitive; a 1×1 range holding text is a name", () => {
    expect(limeBuffer(6.0, 5.6, { calibration: "sikora-or2025", unit: "ton/ac" })).toBeCloseTo(1.7, 10);
    expect(limeBuffer(6.0, 5.6, { calibration: [["Sikora-OR2025"]], unit: "ton/ac" })).toBeCloseTo(1.7, 10);
  });
  it.each([
    ["omitted", undefined],
    ["an empty text", ""],
    ["a 1×1 blank cell", [[null]]],
    ["a 1×1 cell of spaces", [["  "]]],
  ])("the calibration is required, no default (issue 22 point 3): %s is MISSING_INPUT", (_what, calibration) => {
    expect(codeOf(() => limeBuffer(6.0, 5.6, { calibration: calibration as LimeRange | string | undefined }))).toBe("MISSING_INPUT");
  });
  it("the missing-calibration message names the built-ins and the range form", () => {
    expect(messageOf(() => limeBuffer(6.0, 5.6))).toMatch(/^calibration is required: .*SIKORA-OR2025, MEHLICH .*range/);
  });
  it("a 1×1 range holding a number is SHAPE_MISMATCH (neither a name nor a table)", () => {
    expect(codeOf(() => limeBuffer(6.0, 5.6, { calibration: [[6.5]] }))).toBe("SHAPE_MISMATCH");
  });
});

describe("MEHLICH: NCDA&CS buffer acidity (lime factor table page, seen)", () => {
  it("LIME-14: BpH 6.3 → Ac = (6.6 − 6.3) × 4 = 1.2 meq/100 cm3 (seen formula, derived value)", () => {
    expect(limeMehlichAcidity(6.3)).toBeCloseTo(1.2, 10);
  });
  it("LIME-15: pH 5.0 → 6.0 gives FACTOR 0.625 (seen)", () => {
    expect(limeMehlichFactor(5.0, 6.0)).toBeCloseTo(0.625, 12);
  });
  it("LIME-16: Ac 1.2, pH 5.0 → 6.0: the source prints 0.76 ton/acre, its own arithmetic 1.2 × 0.625 = 0.75; the formula is computed (0.75)", () => {
    expect(limeMehlichRate(6.3, 6.0, 5.0)).toBeCloseTo(0.75, 10);
    expect(Math.abs(limeMehlichRate(6.3, 6.0, 5.0) - 0.76)).toBeLessThanOrEqual(0.01 + 1e-12); // within the printed rounding
    expect(limeBuffer(6.3, 6.0, { calibration: "MEHLICH", soilPh: 5.0, unit: "ton/ac" })).toBeCloseTo(0.75, 10);
  });
  it("default unit t/ha: 0.75 ton/ac = 1.6813 t/ha (derived)", () => {
    expect(limeBuffer(6.3, 6.0, { calibration: "MEHLICH", soilPh: 5.0 })).toBeCloseTo(0.75 * 2.241702, 5);
  });
  it("needs soil_ph (MISSING_INPUT); depth_cm is refused because the source does not state its depth", () => {
    expect(codeOf(() => limeBuffer(6.3, 6.0, { calibration: "MEHLICH" }))).toBe("MISSING_INPUT");
    expect(codeOf(() => limeBuffer(6.3, 6.0, { calibration: "MEHLICH", soilPh: 5.0, depthCm: 20 }))).toBe("NOT_APPLICABLE");
    expect(codeOf(() => limeCalibrationDepthCm("MEHLICH"))).toBe("NOT_APPLICABLE");
  });
  it("target at or below the soil pH gives 0; buffer pH above 6.6 and targets above 6.6 are OUT_OF_RANGE (derived limits)", () => {
    expect(limeBuffer(6.0, 5.5, { calibration: "MEHLICH", soilPh: 5.8 })).toBe(0);
    expect(codeOf(() => limeBuffer(6.7, 6.0, { calibration: "MEHLICH", soilPh: 5.0 }))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeBuffer(6.0, 6.8, { calibration: "MEHLICH", soilPh: 5.0 }))).toBe("OUT_OF_RANGE");
    expect(limeBuffer(6.6, 6.0, { calibration: "MEHLICH", soilPh: 5.0 })).toBe(0); // no acidity at the reference pH
  });
  it("property: rate non-increasing as buffer pH rises; zero when target ≤ soil pH (invented inputs)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 3, max: 6.6, noNaN: true }),
        fc.double({ min: 3, max: 6.6, noNaN: true }),
        fc.double({ min: 3.5, max: 6.5, noNaN: true }),
        fc.double({ min: 3.5, max: 6.6, noNaN: true }),
        (a, b, soil, target) => {
          const [lo, hi] = a < b ? [a, b] : [b, a];
          const r = (bp: number) => limeMehlichRate(bp, target, soil);
          if (target <= soil && r(lo) !== 0) return false;
          return r(hi) <= r(lo) + 1e-12 && r(lo) >= 0;
        },
      ),
    );
  });
});

describe("user calibration ranges (invented tables)", () => {
  it("interpolates linearly on both axes; axes may run up or down; the top-left label is ignored", () => {
    expect(limeBuffer(6.4, 6.5, { calibration: INVENTED })).toBe(2.0);
    expect(limeBuffer(6.6, 6.5, { calibration: INVENTED })).toBeCloseTo(1.25, 12);
    expect(limeBuffer(6.2, 6.75, { calibration: INVENTED })).toBeCloseTo((2.5 + 5.0) / 2, 12);
    const flipped: LimeRange = [[null, 7.0, 6.5, 6.0], [6.0, 6.0, 4.0, 3.0], [6.4, 3.0, 2.0, 1.0], [6.8, 1.0, 0.5, 0.0]];
    expect(limeBuffer(6.2, 6.75, { calibration: flipped })).toBeCloseTo(3.75, 12);
  });
  it("the result is in the range's own unit and depth: depth_cm or unit given is NOT_APPLICABLE explaining", () => {
    expect(codeOf(() => limeBuffer(6.4, 6.5, { calibration: INVENTED, unit: "t/ha" }))).toBe("NOT_APPLICABLE");
    expect(codeOf(() => limeBuffer(6.4, 6.5, { calibration: INVENTED, depthCm: 20 }))).toBe("NOT_APPLICABLE");
    expect(messageOf(() => limeBuffer(6.4, 6.5, { calibration: INVENTED, unit: "t/ha" }))).toMatch(/range's own unit and depth; leave depth_cm and unit blank/);
  });
  it("outside the range's buffer or target pH is OUT_OF_RANGE with the range in the message", () => {
    expect(messageOf(() => limeBuffer(5.9, 6.5, { calibration: INVENTED }))).toBe(
      "buffer_ph 5.9 is outside the calibration range (buffer pH 6 to 6.8); the table is not extrapolated",
    );
    expect(messageOf(() => limeBuffer(6.2, 7.1, { calibration: INVENTED }))).toMatch(/target pH 6 to 7/);
  });
  it("target at or below soil pH gives 0 with a range too", () => {
    expect(limeBuffer(6.2, 6.5, { calibration: INVENTED, soilPh: 6.6 })).toBe(0);
  });
  it("numeric text cells are read; trailing blank rows and columns are ignored", () => {
    const t: LimeRange = [["", "6.0", "6.5", null], ["6.0", "3", "4", ""], [6.4, 1, 2, null], [null, null, null, null]];
    expect(limeRangeRate(t, 6.2, 6.25)).toBeCloseTo(2.5, 12);
  });
  it("malformed tables: too small, blank body cell, text, repeated or zig-zag axis, negative rate, pH beyond 14", () => {
    expect(codeOf(() => limeTableFromRange([["", 6.0]]))).toBe("SHAPE_MISMATCH");
    expect(codeOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, null], [6.5, 0, 1]]))).toBe("NOT_APPLICABLE");
    expect(codeOf(() => limeTableFromRange([["", 6.0, 6.5], [6.0, 1, "n.d."], [6.5, 0, 1]]))).toBe("NOT_A_NUMBER");
    expect(codeOf(() => limeTableFromRange([["", 6.0, 6.0], [6.0, 1, 2], [6.5, 0, 1]]))).toBe("NOT_APPLICABLE");
    expect(codeOf(() => limeTableFromRange([["", 6.0], [6.0, 1], [6.5, 0], [6.2, 0.5]]))).toBe("NOT_APPLICABLE");
    expect(codeOf(() => limeTableFromRange([["", 6.0], [6.0, -1], [6.5, 0]]))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeTableFromRange([["", 16.0], [6.0, 1], [6.5, 0]]))).toBe("OUT_OF_RANGE");
  });
  it("a single target column needs that exact target", () => {
    const t: LimeRange = [["", 6.5], [6.0, 3], [6.5, 1]];
    expect(limeRangeRate(t, 6.25, 6.5)).toBeCloseTo(2, 12);
    expect(messageOf(() => limeRangeRate(t, 6.25, 6.4))).toMatch(/target pH 6\.5\)/);
  });
  it("property: for any table non-increasing down its buffer axis, the interpolated rate is non-increasing too (invented tables)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 5, noNaN: true }), { minLength: 3, maxLength: 3 }),
        fc.double({ min: 5, max: 7, noNaN: true }),
        fc.double({ min: 5, max: 7, noNaN: true }),
        (steps, a, b) => {
          // rates at buffer 5, 6, 7: cumulative sums from the top so rates fall as buffer pH rises
          const r7 = steps[0]!;
          const r6 = r7 + steps[1]!;
          const r5 = r6 + steps[2]!;
          const table = limeTableFromRange([["", 6.5], [5, r5], [6, r6], [7, r7]]);
          const [lo, hi] = a < b ? [a, b] : [b, a];
          return limeTableRate(table, hi, 6.5) <= limeTableRate(table, lo, 6.5) + 1e-9;
        },
      ),
    );
  });
});

describe("basis: a table for a product of stated neutralizing value is converted to pure CaCO3", () => {
  // invented calibration: rates in ton/ac of a 90 % neutralizing-value limestone, 20 cm depth
  const cal: LimeTableCalibration = {
    kind: "table",
    id: "INVENTED-NV90",
    source: "invented",
    unit: "ton/ac",
    depthCm: 20,
    neutralizingValuePct: 90,
    status: "invented",
    table: limeTableFromRange([["", 6.5], [6.0, 2.0], [7.0, 0.0]], "the INVENTED-NV90 table"),
  };
  it("2.0 ton/ac of NV-90 lime is 1.8 ton/ac of pure CaCO3 (Tri-State convention: tons × 0.90, LIME-03; derived)", () => {
    expect(limeBufferTableRate(cal, 6.0, 6.5, { unit: "ton/ac" })).toBeCloseTo(1.8, 12);
  });
  it("depth scaling and units apply after the basis conversion (derived)", () => {
    expect(limeBufferTableRate(cal, 6.0, 6.5, { unit: "ton/ac", depthCm: 10 })).toBeCloseTo(0.9, 12);
    expect(limeBufferTableRate(cal, 6.5, 6.5, { unit: "lb/ac" })).toBeCloseTo(1800, 9);
  });
  it("a calibration without a stated depth refuses depth_cm", () => {
    expect(codeOf(() => limeBufferTableRate({ ...cal, depthCm: undefined }, 6.0, 6.5, { depthCm: 10 }))).toBe("NOT_APPLICABLE");
    expect(limeBufferTableRate({ ...cal, depthCm: undefined }, 6.0, 6.5, { unit: "ton/ac" })).toBeCloseTo(1.8, 12);
  });
});

describe("argument checks", () => {
  it("pH outside 0–14 is OUT_OF_RANGE for buffer_ph, target_ph and soil_ph", () => {
    expect(codeOf(() => limeBuffer(15, 6, { calibration: SIK }))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeBuffer(6, -1, { calibration: SIK }))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeBuffer(6, 6, { calibration: SIK, soilPh: 20 }))).toBe("OUT_OF_RANGE");
  });
  it("a bad depth or unit is refused", () => {
    expect(codeOf(() => limeBuffer(6, 6, { calibration: SIK, depthCm: 0 }))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeBuffer(6, 6, { calibration: SIK, unit: "mg/kg" }))).toBe("UNIT_MISMATCH");
  });
});

describe("ABOUT lines carry the method, its source and the cautions (cautions.json, each caution with its source)", () => {
  // eslint-disable-next-line @typescript-eslint/no-var-requires
  const about = require("../../../src/data/about/lime.json") as Record<string, string>;
  // eslint-disable-next-line @typescript-eslint/no-var-requires
  const cautions = require("../../../src/data/lime/cautions.json") as { cautions: { id: string; text: string; source: string }[] };
  const RATE_FUNCTIONS = ["LIMEBUFFER", "LIMEAL", "LIMEALSAT", "LIMEBASESAT", "LIMEPHBC", "LIMEPRODUCT"];
  it.each(RATE_FUNCTIONS)("%s says results are estimates to check against local calibrations, regulations and licensed advice", (id) => {
    expect(about[id]).toMatch(/Results are estimates: check them against local calibrations, regulations and licensed advice\./);
  });
  it("the split threshold quoted is the one the cited source uses (Ball 2002, Noble Foundation: 2.5 ton/ac surface, 4 ton/ac worked in; seen)", () => {
    const split = cautions.cautions.find((c) => c.id === "split")!;
    expect(split.text).toMatch(/2\.5 ton\/ac/);
    expect(split.source).toMatch(/Ball/);
    expect(about.LIMEBUFFER).toMatch(/2\.5 ton\/ac a year, 4 ton\/ac worked in: Ball 2002/);
  });
  it("handling care for caustic burnt and hydrated lime is in the product-rate line", () => {
    expect(about.LIMEPRODUCT).toMatch(/burnt \(quick\) and hydrated lime are caustic/);
    expect(cautions.cautions.every((c) => c.source.length > 0)).toBe(true);
  });
});

describe("edges and messages (invented inputs; boundary probes of the code's own logic)", () => {
  const msg = messageOf;
  it("each pH argument is named in its refusal", () => {
    expect(msg(() => limeBuffer(15, 6, { calibration: SIK }))).toBe("buffer_ph must be from 0 to 14 (got 15)");
    expect(msg(() => limeBuffer(6, -1, { calibration: SIK }))).toBe("target_ph must be from 0 to 14 (got -1)");
    expect(msg(() => limeBuffer(6, 6, { calibration: SIK, soilPh: 20 }))).toBe("soil_ph must be from 0 to 14 (got 20)");
    expect(msg(() => limeMehlichAcidity(6.7))).toBe("buffer_ph must be from 0 to 6.6 (got 6.7)");
    expect(msg(() => limeMehlichFactor(15, 6))).toBe("soil_ph must be from 0 to 14 (got 15)");
    expect(msg(() => limeMehlichFactor(5, 15))).toBe("target_ph must be from 0 to 14 (got 15)");
    expect(msg(() => limeMehlichFactor(5, 6.8))).toBe("target_ph must be from 0 to 6.6 (got 6.8)");
  });
  it("Mehlich factor: target equal to the soil pH is 0, even at or above the buffer's reference pH 6.6", () => {
    expect(limeMehlichFactor(6.6, 6.6)).toBe(0);
    expect(limeMehlichFactor(7, 7)).toBe(0);
    expect(limeMehlichFactor(7.5, 7)).toBe(0);
    expect(limeMehlichFactor(6.5, 6.6)).toBeCloseTo(1, 12); // at the reference pH the factor is 1
  });
  it("a calibration of spaces is MISSING_INPUT like a blank one", () => {
    expect(codeOf(() => limeBuffer(6.0, 5.6, { calibration: "   " }))).toBe("MISSING_INPUT");
    expect(msg(() => limeBuffer(6.0, 5.6, { calibration: "   " }))).toMatch(/^calibration is required/);
  });
  it("a 1×1 range holding undefined is a blank cell (MISSING_INPUT)", () => {
    expect(codeOf(() => limeBuffer(6.0, 5.6, { calibration: [[undefined]] as unknown as LimeRange }))).toBe("MISSING_INPUT");
  });
  it("a single row of several cells, or a column whose first cell is a name, is a (too small) table, not a name", () => {
    expect(codeOf(() => limeBuffer(6.0, 6.0, { calibration: [["", 6.0, 6.5]] }))).toBe("SHAPE_MISMATCH");
    expect(msg(() => limeBuffer(6.0, 6.0, { calibration: [["", 6.0, 6.5]] }))).toMatch(/at least 2 rows and 2 columns/);
    expect(codeOf(() => limeBuffer(6.0, 5.6, { calibration: [[SIK], ["more"]] }))).toBe("SHAPE_MISMATCH");
    expect(codeOf(() => limeBuffer(6.0, 5.6, { calibration: [[SIK, null]], unit: "ton/ac" }))).toBe("NOT_APPLICABLE"); // 1×2: a range, so unit is refused
  });
  it("a range with one missing row is a too-small table", () => {
    expect(codeOf(() => limeBuffer(6.0, 5.6, { calibration: [undefined] as unknown as LimeRange }))).toBe("SHAPE_MISMATCH");
  });
  it("a 1×1 number's refusal shows the value", () => {
    expect(msg(() => limeBuffer(6.0, 5.6, { calibration: [[6.5]] }))).toBe(
      "calibration must be the name of a built-in calibration (SMP, SIKORA-OR2025, MEHLICH) or a range holding a table, not the single value 6.5",
    );
  });
  it("built-in table: soil pH below the target still gives the table's rate; at the target it gives 0", () => {
    expect(tonAc(6.0, 5.6, { soilPh: 5.0 })).toBeCloseTo(1.7, 10);
    expect(tonAc(6.0, 5.6, { soilPh: 5.6 })).toBe(0);
  });
  it("range: soil pH below the target gives the table's rate; equal to the target gives 0", () => {
    expect(limeBuffer(6.4, 6.5, { calibration: INVENTED, soilPh: 6.0 })).toBe(2.0);
    expect(limeBuffer(6.4, 6.5, { calibration: INVENTED, soilPh: 6.5 })).toBe(0);
    expect(limeBuffer(6.4, 6.5, { calibration: INVENTED, soilPh: 6.49 })).toBe(2.0);
  });
  it("a table calibration whose table is not shipped answers NO_REFERENCE_DATA naming it", () => {
    const cal = { kind: "table", id: "INVENTED-X", source: "invented", unit: "ton/ac", depthCm: 20, neutralizingValuePct: 100, status: "invented", table: undefined } as const;
    expect(codeOf(() => limeBufferTableRate(cal, 6, 6))).toBe("NO_REFERENCE_DATA");
    expect(msg(() => limeBufferTableRate(cal, 6, 6))).toBe("the INVENTED-X table is not shipped");
  });
  it("the depth refusals name the calibration", () => {
    const cal: LimeTableCalibration = {
      kind: "table", id: "INVENTED-ND", source: "invented", unit: "ton/ac", depthCm: undefined, neutralizingValuePct: 100, status: "invented",
      table: limeTableFromRange([["", 6.5], [6.0, 2.0], [7.0, 0.0]]),
    };
    expect(msg(() => limeBufferTableRate(cal, 6.0, 6.5, { depthCm: 10 }))).toBe(
      "the INVENTED-ND source does not state its depth, so depth_cm cannot be scaled; leave it blank",
    );
    expect(msg(() => limeBuffer(6.3, 6.0, { calibration: "MEHLICH", soilPh: 5.0, depthCm: 20 }))).toBe(
      "the MEHLICH (NCDA&CS) source does not state the depth its rates are for, so depth_cm cannot be scaled; leave it blank",
    );
  });
});
