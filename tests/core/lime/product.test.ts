/**
 * Product rate (CCE, fineness, moisture) and fineness efficiency of liming materials.
 *
 * Sources beside each check. "seen" = read in that source; "derived" = arithmetic on a seen
 * definition; "invented" = made-up inputs for a property or an error case. OXI-xx and LIME-xx
 * refer to the project's list of published check values.
 */
import fc from "fast-check";
import finenessData from "../../../src/data/lime/fineness-ohio.json";
import { LIME_FINENESS_DEFAULT, limeFineness, limeFinenessOfRanges, limeProductRate } from "../../../src/core/lime/product";
import { errorCode as codeOf, errorMessage as messageOf } from "../../helpers/errors";


describe("limeProductRate", () => {
  it("OXI-12 Penn State AASL home-garden notes (seen): 5 lb/100 ft2 at CCE 100 → 7 lb of a CCE-70 product (the source rounds 7.14)", () => {
    expect(limeProductRate(5, 70)).toBeCloseTo(7.1429, 4);
    expect(Math.round(limeProductRate(5, 70))).toBe(7);
  });
  it("OXI-13 Clemson by-product liming materials page (seen): CCE 50 → apply 2×; CCE 150 → 2/3×", () => {
    expect(limeProductRate(3, 50)).toBeCloseTo(6, 12);
    expect(limeProductRate(3, 150)).toBeCloseTo(2, 12);
  });
  it("LIME-03 Tri-State (Vitosh, Johnson & Mengel 1995; seen): tons × 0.90 / NV: 4 tons of NV-90 rate is 4.5 tons of NV-80 lime", () => {
    // the NV-90 table rate as pure CaCO3 is 4 × 0.9 = 3.6; for an NV-80 product: 3.6 / 0.8 = 4.5
    expect(limeProductRate(4 * 0.9, 80)).toBeCloseTo(4.5, 12);
  });
  it("fineness enters as ECCE = CCE × fineness: 2 t/ha, CCE 90, fineness 85.28 % (BC Factsheet limestone A) → 2.606 t/ha (derived)", () => {
    expect(limeProductRate(2, 90, 85.28)).toBeCloseTo(2 / (0.9 * 0.8528), 12);
  });
  it("moisture: MN Dept. of Agriculture lb ENP/ton = %ENP × 2000 × % dry matter (LIME-38, seen): ENP 80 %, 10 % water → 1440 lb ENP per ton, so 1 ton of ENP needs 2000/1440 tons (derived)", () => {
    expect(limeProductRate(1, 80, 100, 10)).toBeCloseTo(2000 / 1440, 12);
  });
  it("the unit is kept: whatever unit caco3_rate is in, the product rate is in it", () => {
    expect(limeProductRate(5000, 100)).toBe(5000);
  });
  it("arguments outside their ranges are OUT_OF_RANGE (no division by zero ever leaves)", () => {
    expect(codeOf(() => limeProductRate(-1, 90))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeProductRate(2, 0))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeProductRate(2, 0.9))).toBe("OUT_OF_RANGE"); // a fraction (issue 22)
    expect(codeOf(() => limeProductRate(2, 90, 0.85))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeProductRate(2, 90, 100, 0.3))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeProductRate(2, 251))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeProductRate(2, 90, 0))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeProductRate(2, 90, 101))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeProductRate(2, 90, 100, 100))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeProductRate(2, 90, 100, -1))).toBe("OUT_OF_RANGE");
  });
  it("CCE up to 250 accepts pure MgO (248.3 exact, 250 printed: UNL PASSEL Table 4.4, OXI-10, seen)", () => {
    expect(limeProductRate(2.5, 250)).toBeCloseTo(1, 12);
  });
  it("property: never below the pure rate, and decreasing in CCE (invented inputs)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 50, noNaN: true }),
        // plausible ranges (PERCENT.cce 5-250, fineness above 1, moisture 0 or 1 to below 100)
        fc.double({ min: 5, max: 100, noNaN: true }),
        fc.double({ min: 1.001, max: 100, noNaN: true }),
        fc.oneof(fc.constant(0), fc.double({ min: 1, max: 90, noNaN: true })),
        (rate, cce, fine, moist) => {
          const r = limeProductRate(rate, cce, fine, moist);
          return r >= rate - 1e-12 && limeProductRate(rate, Math.min(250, cce + 10), fine, moist) <= r + 1e-12;
        },
      ),
    );
  });
});

describe("limeFineness", () => {
  it("the default rating is the Ohio method as given in BC Soil Factsheet 637.200-2 (seen): 100, 60, 20, 0 %", () => {
    expect(LIME_FINENESS_DEFAULT).toEqual([100, 60, 20, 0]);
    for (const c of finenessData.classes) expect(c.source).toMatch(/637\.200-2/);
  });
  it("BC Factsheet limestone A (seen): 78.8 / 10 / 2.4 / 7.8 % → 85.28 % (fractions sum to 99.0 %, not rescaled)", () => {
    expect(limeFineness([78.8, 10, 2.4, 7.8])).toBeCloseTo(85.28, 10);
  });
  it("BC Factsheet limestone B: the source prints 94.46 %; its arithmetic 90 + 3.6 + 0.8 = 94.40 % (computed)", () => {
    expect(limeFineness([90, 6, 4, 0])).toBeCloseTo(94.4, 10);
  });
  it("a user's own rating as a list (invented three-class rating)", () => {
    expect(limeFineness([70, 20, 10], [100, 50, 10])).toBeCloseTo(81, 12);
  });
  it("fractions must add up to 100 ± 1 %: 98.9 % and 101.1 % are OUT_OF_RANGE, 99 % and 101 % pass", () => {
    expect(codeOf(() => limeFineness([78.8, 10, 2.4, 7.7]))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeFineness([80, 10, 3.1, 8]))).toBe("OUT_OF_RANGE");
    expect(limeFineness([80, 10, 3, 8])).toBeCloseTo(86.6, 10);
    expect(messageOf(() => limeFineness([50, 10, 2, 7]))).toBe("fractions add up to 69 %; they must add up to 100 ± 1 %");
  });
  it("counts must match; the default rating needs four fractions (SHAPE_MISMATCH)", () => {
    expect(codeOf(() => limeFineness([90, 10]))).toBe("SHAPE_MISMATCH");
    expect(codeOf(() => limeFineness([90, 10], [100, 50, 0]))).toBe("SHAPE_MISMATCH");
  });
  it("values outside 0–100 are OUT_OF_RANGE", () => {
    expect(codeOf(() => limeFineness([110, -10, 0, 0]))).toBe("OUT_OF_RANGE");
    expect(codeOf(() => limeFineness([100, 0, 0, 0], [120, 60, 20, 0]))).toBe("OUT_OF_RANGE");
  });
  it("ranges: a row or a column, numeric text accepted; a blank cell is MISSING_INPUT; a 2-D range is SHAPE_MISMATCH", () => {
    expect(limeFinenessOfRanges([[90], [6], [4], [0]])).toBeCloseTo(94.4, 10);
    expect(limeFinenessOfRanges([[90, "6", 4, 0]])).toBeCloseTo(94.4, 10);
    expect(limeFinenessOfRanges([[70, 20, 10]], [[100], [50], [10]])).toBeCloseTo(81, 12);
    expect(codeOf(() => limeFinenessOfRanges([[90, null, 4, 6]]))).toBe("MISSING_INPUT");
    expect(codeOf(() => limeFinenessOfRanges([[90, 6], [4, 0]]))).toBe("SHAPE_MISMATCH");
    expect(codeOf(() => limeFinenessOfRanges([[90, "six", 4, 0]]))).toBe("NOT_A_NUMBER");
  });
  it("property: the efficiency lies between 0 and 100 % for fractions adding up to 100 (invented inputs)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 4, maxLength: 4 }), (w) => {
        const total = w.reduce((a, b) => a + b, 0);
        if (total === 0) return true;
        const fr = w.map((x) => Math.min(100, (100 * x) / total));
        const r = limeFineness(fr);
        return r >= -1e-9 && r <= 100 + 1e-9;
      }),
    );
  });
  it("fractions typed as fractions of 1 are refused with a hint (issue 22 point 4; BC limestone A as fractions)", () => {
    expect(codeOf(() => limeFineness([0.788, 0.1, 0.024, 0.078]))).toBe("OUT_OF_RANGE");
    expect(messageOf(() => limeFineness([0.788, 0.1, 0.024, 0.078]))).toContain("they look like fractions");
  });
  it("efficiencies typed as fractions of 1 are refused, not read as 1 %, 0.6 % … (issue 22 point 4)", () => {
    expect(codeOf(() => limeFineness([78.8, 10, 2.4, 7.8], [1, 0.6, 0.2, 0]))).toBe("OUT_OF_RANGE");
    expect(limeFineness([78.8, 10, 2.4, 7.8], [100, 60, 20, 0])).toBeCloseTo(85.28, 10);
  });
});

describe("messages and edges (invented inputs; probes of the code's own limits)", () => {
  it("a negative rate names caco3_rate; a rate too large to divide refuses instead of returning Infinity", () => {
    expect(messageOf(() => limeProductRate(-1, 90))).toBe("caco3_rate must be at least 0 (got -1)");
    expect(codeOf(() => limeProductRate(1e308, 5))).toBe("OUT_OF_RANGE");
    expect(messageOf(() => limeProductRate(1e308, 5))).toBe("the product rate cannot be computed for these inputs (result is not finite)");
  });
  it("count mismatch: the default rating's message names its four classes; a user rating's gives both counts", () => {
    expect(messageOf(() => limeFineness([90, 10]))).toBe(
      "the default rating has 4 classes (finer than 60 mesh, 20-60, 8-20, coarser than 8 mesh) but fractions has 2; give efficiencies for your classes",
    );
    expect(messageOf(() => limeFineness([90, 10], [100, 50, 0]))).toBe("fractions has 2 classes but efficiencies has 3; give one efficiency per fraction");
    // an equal copy of the default is a rating of the user's own
    expect(messageOf(() => limeFineness([90, 10], [100, 60, 20, 0]))).toBe("fractions has 2 classes but efficiencies has 4; give one efficiency per fraction");
  });
  it("no fractions at all is MISSING_INPUT", () => {
    expect(codeOf(() => limeFineness([], []))).toBe("MISSING_INPUT");
    expect(messageOf(() => limeFineness([], []))).toBe("fractions is empty");
  });
  it("a value out of range names its class, counted from 1, and the unit", () => {
    expect(messageOf(() => limeFineness([110, -10, 0, 0]))).toBe("fraction 1 must be from 0 to 100 % (got 110 %)");
    expect(messageOf(() => limeFineness([100, -10, 0, 10]))).toBe("fraction 2 must be from 0 to 100 % (got -10 %)");
    expect(messageOf(() => limeFineness([100, 0, 0, 0], [100, 120, 20, 0]))).toBe("efficiency 2 must be from 0 to 100 % (got 120 %)");
  });
  it("efficiencies given as fractions of 1 are listed in the refusal", () => {
    expect(messageOf(() => limeFineness([78.8, 10, 2.4, 7.8], [1, 0.6, 0.2, 0]))).toBe(
      "efficiencies are all at most 1 (1, 0.6, 0.2, 0): they look like fractions; enter percentages (e.g. 100, 60, 20, 0)",
    );
  });
  it("ranges: a ragged 2-row range is 2-D; the refusal names the argument", () => {
    expect(messageOf(() => limeFinenessOfRanges([[90], [6, 4]]))).toBe("fractions must be a single row or column (it is 2×2), finest class first");
    expect(messageOf(() => limeFinenessOfRanges([[70, 20, 10]], [[100, 50], [10, 0]]))).toBe(
      "efficiencies must be a single row or column (it is 2×2), finest class first",
    );
  });
  it("ranges: a blank cell (empty or spaces) names the argument and the class", () => {
    expect(messageOf(() => limeFinenessOfRanges([[90, null, 4, 6]]))).toBe("fractions has a blank cell (class 2); enter 0 for an empty class");
    expect(codeOf(() => limeFinenessOfRanges([[90, "  ", 4, 6]]))).toBe("MISSING_INPUT");
    expect(messageOf(() => limeFinenessOfRanges([[100]], [[" "]]))).toBe("efficiencies has a blank cell (class 1); enter 0 for an empty class");
  });
  it("ranges: text and booleans are NOT_A_NUMBER quoting the cell and its class", () => {
    expect(messageOf(() => limeFinenessOfRanges([[90, "six", 4, 0]]))).toBe('fractions: "six" (class 2) is not a number');
    expect(codeOf(() => limeFinenessOfRanges([[90, true, 4, 0]]))).toBe("NOT_A_NUMBER");
    expect(messageOf(() => limeFinenessOfRanges([[100]], [[false]]))).toBe('efficiencies: "false" (class 1) is not a number');
  });
  it.each([
    ["90", 90],
    [" 90 ", 90],
    ["+60", 60],
    ["6.25", 6.25],
    ["6.", 6],
    [".5e1", 5],
    [".25e2", 25],
    ["1e1", 10],
    ["1e+1", 10],
    ["1.5e01", 15],
    ["2.5E1", 25],
    ["500e-1", 50],
  ])("ranges: numeric text %j is read as %s (as an efficiency of a single 100 %% class)", (text, value) => {
    expect(limeFinenessOfRanges([[100]], [[text]])).toBeCloseTo(value, 12);
  });
  it.each(["x6", "6x", "1e", "e1", ".", "6.5.1", "1e1.5", "--6", "6 5"])("ranges: %j is NOT_A_NUMBER", (text) => {
    expect(codeOf(() => limeFinenessOfRanges([[100]], [[text]]))).toBe("NOT_A_NUMBER");
  });
});
