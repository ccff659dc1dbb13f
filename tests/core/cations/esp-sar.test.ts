/**
 * SOIL.ESPSAR in core: ESP estimated from the SAR of a saturation extract by the USDA Handbook 60
 * regression. Source of the equation: U.S. Salinity Laboratory Staff (1954) USDA Agriculture
 * Handbook 60, as reprinted in Oklahoma Administrative Code 165:10 (2013), seen quoted at
 * iadclexicon.org (secondary). No published worked example was found: the checks below are
 * arithmetic on the printed equation (derived) and its properties.
 */
import fc from "fast-check";
import { cecEspFromSar } from "../../../src/core/cations/esp-sar";
import { cecSar } from "../../../src/core/cations/sar";
import { errorCode as code, errorMessage as message } from "../../helpers/errors";

describe("ESP from SAR (USDA Handbook 60 regression, secondary)", () => {
  it("SAR 6.708 (Na 15, Ca 6, Mg 4 mmolc/L) gives ESR 0.0863 and ESP 7.95 % (derived; published-values CEC-10, CEC-13)", () => {
    expect(cecEspFromSar(cecSar(15, 6, 4, "mmolc/L"))).toBeCloseTo(7.948, 3);
  });
  it("SAR 10 gives 11.8865 % (derived: ESR 0.1349)", () => {
    expect(cecEspFromSar(10)).toBeCloseTo((100 * 0.1349) / 1.1349, 9);
  });
  it("the regression's own zero: SAR 0.0126/0.01475 gives ESP 0", () => {
    expect(cecEspFromSar(0.0126 / 0.01475)).toBeCloseTo(0, 12);
  });
  it("below that the intercept gives a small negative estimate, returned as computed: −1.276 % at SAR 0", () => {
    expect(cecEspFromSar(0)).toBeCloseTo((100 * -0.0126) / (1 - 0.0126), 9);
  });
  it("SAR 13 gives 15.19 % (derived)", () => {
    expect(cecEspFromSar(13)).toBeCloseTo(15.193, 3);
  });
  it("a negative or non-finite SAR is refused", () => {
    expect(code(() => cecEspFromSar(-0.1))).toBe("OUT_OF_RANGE");
    expect(code(() => cecEspFromSar(Number.NaN))).toBe("OUT_OF_RANGE");
    expect(message(() => cecEspFromSar(-0.1))).toBe("sar must be at least 0 (got -0.1)");
  });
  it("a SAR so large that 100 × ESR overflows is refused, not reported; just below it the estimate is near 100 % (boundary)", () => {
    // 100 × 0.01475 × SAR passes Number.MAX_VALUE at SAR ≈ 1.22e308.
    expect(message(() => cecEspFromSar(1.5e308))).toBe("the estimated ESP cannot be computed for these inputs (result is not finite)");
    expect(cecEspFromSar(1e308)).toBeCloseTo(100, 9);
  });
  it("rises with SAR and stays below 100 % (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e6, noNaN: true }), fc.double({ min: 0, max: 1e6, noNaN: true }), (a, b) => {
        const [lo, hi] = a < b ? [a, b] : [b, a];
        // Never falls by more than floating-point rounding (near-equal inputs round either way).
        expect(cecEspFromSar(lo)).toBeLessThanOrEqual(cecEspFromSar(hi) + 1e-12 * Math.abs(cecEspFromSar(hi)));
        expect(cecEspFromSar(hi)).toBeLessThan(100);
      }),
    );
  });
});
