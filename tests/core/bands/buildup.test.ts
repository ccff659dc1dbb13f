/**
 * SOIL.BUILDUP in core: the Tri-State build-up arithmetic. Source for the buffer factors: LaBarge,
 * OSU Extension, 'How much fertilizer will move soil test levels' (published-values SUF-06, seen):
 * 20 lb P2O5/A per ppm of soil-test P, 6-10 lb K2O/A per ppm of K; four-year build-up period:
 * OSU Agronomic Crops Team, 'Phosphorus and Potassium' (Tri-State 2020, seen).
 */
import fc from "fast-check";
import { buildupRate, BUILDUP_DEFAULT_YEARS } from "../../../src/core/bands/buildup";
import { errorCode as code, errorMessage as message } from "../../helpers/errors";


describe("buildupRate", () => {
  it("P from 10 to the 15 ppm Bray critical level at 20 lb P2O5/ppm over 4 years: 25 lb P2O5/A a year (derived, SUF-06)", () => {
    expect(buildupRate(10, 15, 20, 4)).toBeCloseTo(25, 12);
  });
  it("K from 100 to 120 ppm at 8 lb K2O/ppm (within the published 6-10): 40 lb K2O/A a year over 4 years (derived)", () => {
    expect(buildupRate(100, 120, 8)).toBeCloseTo(40, 12);
  });
  it("the default period is the Tri-State four years", () => {
    expect(BUILDUP_DEFAULT_YEARS).toBe(4);
    expect(buildupRate(10, 15, 20)).toBe(buildupRate(10, 15, 20, 4));
  });
  it("a shorter period needs a higher yearly rate: 100 lb over 1 year", () => {
    expect(buildupRate(10, 15, 20, 1)).toBeCloseTo(100, 12);
  });
  it("at or above the target no build-up is needed: 0", () => {
    expect(buildupRate(15, 15, 20)).toBe(0);
    expect(buildupRate(40, 15, 20)).toBe(0);
  });
  it("refuses a negative soil test or target and a buffer factor or period that is not positive", () => {
    expect(code(() => buildupRate(-1, 15, 20))).toBe("OUT_OF_RANGE");
    expect(code(() => buildupRate(10, -15, 20))).toBe("OUT_OF_RANGE");
    expect(code(() => buildupRate(10, 15, 0))).toBe("OUT_OF_RANGE");
    expect(code(() => buildupRate(10, 15, 20, 0))).toBe("OUT_OF_RANGE");
    expect(code(() => buildupRate(10, 15, 20, -2))).toBe("OUT_OF_RANGE");
  });
});

describe("refusals name the argument (the code's own messages)", () => {
  it.each([
    ["soil_test", () => buildupRate(-1, 15, 20), "soil_test must be at least 0 (got -1)"],
    ["target", () => buildupRate(10, -15, 20), "target must be at least 0 (got -15)"],
    ["buffer_factor", () => buildupRate(10, 15, 0), "buffer_factor must be greater than 0 (got 0)"],
    ["years", () => buildupRate(10, 15, 20, 0), "years must be greater than 0 (got 0)"],
  ])("%s", (_, call, text) => {
    expect(message(call)).toBe(text);
  });
  it("a rate too large to represent says so, not Infinity", () => {
    expect(code(() => buildupRate(0, 1e308, 1e308))).toBe("OUT_OF_RANGE");
    expect(message(() => buildupRate(0, 1e308, 1e308))).toBe("the build-up rate cannot be computed for these inputs (result is not finite)");
  });
});

describe("properties (invented inputs)", () => {
  const pos = fc.double({ min: 0.01, max: 1000, noNaN: true });
  const test = fc.double({ min: 0, max: 500, noNaN: true });
  it("rate × years = (target − soil test) × buffer factor below the target", () => {
    fc.assert(
      fc.property(test, test, pos, fc.double({ min: 0.5, max: 20, noNaN: true }), (a, b, f, y) => {
        const [st, t] = a < b ? [a, b] : [b, a];
        if (st === t) return buildupRate(st, t, f, y) === 0;
        return Math.abs(buildupRate(st, t, f, y) * y - (t - st) * f) <= 1e-9 * Math.max(1, (t - st) * f);
      }),
    );
  });
  it("the rate never rises as the soil test rises", () => {
    fc.assert(
      fc.property(test, test, test, pos, (a, b, t, f) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        return buildupRate(hi, t, f) <= buildupRate(lo, t, f);
      }),
    );
  });
});
