/**
 * cecSar's refusals, read whole (argument, unit as typed, what could not be computed). Boundary and
 * message checks of the code's own behaviour, invented inputs; the published SAR checks are in
 * cations.test.ts.
 */
import { cecSar } from "../../../src/core/cations/sar";
import { errorCode, errorMessage } from "../../helpers/errors";

describe("cecSar refusals", () => {
  it("a unit of spaces is missing, not an unknown word", () => {
    expect(errorCode(() => cecSar(1, 1, 1, "   "))).toBe("MISSING_INPUT");
    expect(errorMessage(() => cecSar(1, 1, 1, "   "))).toMatch(/^unit is required: the unit of na, ca and mg: mmolc\/L or mg\/L/);
  });
  it("an unknown unit is named as the unit for SAR", () => {
    expect(errorMessage(() => cecSar(1, 1, 1, "ppm"))).toBe('unknown unit for SAR "ppm"; use mmolc/L or mg/L');
  });
  it.each([
    ["na", [-1, 2, 2]],
    ["ca", [1, -1, 2]],
    ["mg", [1, 2, -1]],
  ] as const)("a negative %s is refused naming it and the unit as typed", (name, [na, ca, mg]) => {
    expect(errorCode(() => cecSar(na, ca, mg, "meq/L"))).toBe("OUT_OF_RANGE");
    expect(errorMessage(() => cecSar(na, ca, mg, "meq/L"))).toBe(`${name} must be at least 0 meq/L (got -1 meq/L)`);
  });
  it("0 is the limit: every concentration may be 0 except ca and mg together", () => {
    expect(cecSar(0, 0, 2, "mmolc/L")).toBe(0);
    expect(cecSar(2, 2, 0, "mmolc/L")).toBeCloseTo(2, 12);
    expect(errorMessage(() => cecSar(5, 0, 0, "mmolc/L"))).toBe("ca and mg are both 0, so SAR is undefined (it divides by √((Ca + Mg)/2))");
  });
  it("a SAR too large for a number is refused, not returned as Infinity", () => {
    expect(errorMessage(() => cecSar(1e308, 1e-300, 0, "mmolc/L"))).toBe("SAR cannot be computed for these inputs (result is not finite)");
    expect(cecSar(1e200, 2e-100, 0, "mmolc/L")).toBeCloseTo(1e250, -240);
  });
});
