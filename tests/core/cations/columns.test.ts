/**
 * The column kernels give, sample by sample, exactly what the scalar functions give: the same
 * number to the last bit, or the same error (code and message). Inputs are generated (property
 * tests); the published checks of the scalar functions are in cations.test.ts.
 */
import fc from "fast-check";
import { SoilError } from "../../../src/core/errors";
import { cecSaturation, cecSaturationColumn, cecSum, cecSumColumn } from "../../../src/core/cations/cations";

const num = fc.oneof(fc.double({ min: -10, max: 5000, noNaN: true }), fc.constantFrom(0, -0, 1e308, Infinity, -1));
const units = fc.constantFrom("mg/kg", "ppm", "meq/100g", "cmol(+)/kg", "mmolc/kg", "g/kg", "%", "mg/dm3", "cmol/kg", "furlongs", "");
const parts = fc.constantFrom("Ca", "Mg", "K", "Na", "bases", "acidity", "calcium", "BS", "nitrogen");

function scalarOf(f: () => number): number | { code: string; message: string } {
  try {
    return f();
  } catch (e) {
    if (e instanceof SoilError) return { code: e.code, message: e.message };
    throw e;
  }
}
const asResults = (r: { values: Float64Array; errors: Map<number, SoilError> }) =>
  Array.from(r.values, (v, i) => {
    const e = r.errors.get(i);
    return e ? { code: e.code, message: e.message } : v;
  });

describe("cation column kernels", () => {
  it("cecSumColumn = cecSum sample by sample", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(num, num, num, num, fc.option(num, { nil: undefined }), fc.option(fc.double({ min: 0.5, max: 2 }), { nil: undefined })), { minLength: 1, maxLength: 20 }), units, (rows, unit) => {
        const col = (j: number) => rows.map((r) => r[j] as number);
        const hasAcidity = rows.every((r) => r[4] !== undefined);
        const acid = hasAcidity ? col(4) : undefined;
        const bd = rows.every((r) => r[5] !== undefined) ? col(5) : undefined;
        const got = asResults(cecSumColumn(col(0), col(1), col(2), col(3), unit, acid, bd, rows.length));
        const want = rows.map((r, i) => scalarOf(() => cecSum(r[0], r[1], r[2], r[3], unit, acid ? acid[i] : undefined, bd ? bd[i] : undefined)));
        expect(got).toEqual(want);
      }),
    );
  });
  it("cecSaturationColumn = cecSaturation sample by sample", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(num, num, num, num, num, num), { minLength: 1, maxLength: 20 }), units, parts, fc.boolean(), fc.boolean(), (rows, unit, part, withAcid, withCec) => {
        const col = (j: number) => rows.map((r) => r[j] as number);
        const acid = withAcid ? col(4) : undefined;
        const cec = withCec ? col(5) : undefined;
        const got = asResults(cecSaturationColumn(part, col(0), col(1), col(2), col(3), unit, acid, cec, undefined, rows.length));
        const want = rows.map((r, i) => scalarOf(() => cecSaturation(part, r[0], r[1], r[2], r[3], unit, acid ? acid[i] : undefined, cec ? cec[i] : undefined)));
        expect(got).toEqual(want);
      }),
    );
  });
});
