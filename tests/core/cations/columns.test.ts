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

/**
 * A column that records its reads in a log shared by the columns of one call. A sample the kernel
 * computes itself is read once, when its column is copied in, so ordinary samples are read column
 * after column; the scalar function reads sample after sample (ca, mg, ... of one sample, then the
 * next), and a sample handed to it after the copy is read a second time. So the log shows that
 * ordinary samples take the kernel's own path (the reason the kernels exist) and that nothing past
 * the n samples is read.
 */
function watched(name: string, values: number[], log: string[]): ArrayLike<number> {
  return new Proxy(values, {
    get(target, key, receiver) {
      if (typeof key === "string" && /^\d+$/.test(key)) log.push(`${name}${key}`);
      return Reflect.get(target, key, receiver);
    },
  });
}
/** A refused sample's number is NaN (ColumnResult), never a 0 left in its place. */
const refusedAreNaN = (r: { values: Float64Array; errors: Map<number, SoilError> }) => [...r.errors.keys()].every((i) => Number.isNaN(r.values[i]));
/** The log of reading each named column once, one column after another. */
const columnByColumn = (names: string[], n: number) => names.flatMap((c) => Array.from({ length: n }, (_, i) => `${c}${i}`));

// Ordinary samples (invented), a 0 in every column somewhere: all go through the kernel's own path.
const CA = [2000, 0, 150.5, 900, 1];
const MG = [180, 40, 0, 75, 1];
const K = [150, 95, 60, 0, 1];
const NA = [30, 12, 8, 20, 0];
const ACID = [2, 0.5, 0, 1.25, 3];
const CEC = [14, 6, 4.5, 9, 1e-9];
const N = CA.length;
const UNITS = ["mg/kg", "ppm", "g/kg", "%", "cmol(+)/kg", "meq/100g", "mmolc/kg"];
const PARTS = ["Ca", "Mg", "K", "Na", "acidity", "bases"];

describe("column kernels: ordinary samples are computed in the kernel, equal to the scalar function to the last bit", () => {
  it.each(UNITS)("cecSumColumn in %s, with and without acidity, a shared value among columns", (unit) => {
    for (const withAcid of [true, false]) {
      const log: string[] = [];
      const acid = withAcid ? watched("acid", ACID, log) : 2;
      const r = cecSumColumn(watched("ca", CA, log), watched("mg", MG, log), 150, watched("na", NA, log), unit, acid, undefined, N);
      expect(asResults(r)).toEqual(CA.map((_, i) => cecSum(CA[i]!, MG[i]!, 150, NA[i]!, unit, withAcid ? ACID[i] : 2)));
      expect(r.errors.size).toBe(0);
      expect(log).toEqual(columnByColumn(["ca", "mg", "na", ...(withAcid ? ["acid"] : [])], N));
    }
  });
  it.each(UNITS.flatMap((u) => PARTS.map((p) => [p, u])))("cecSaturationColumn %s in %s, against the summed and a measured CEC", (part, unit) => {
    for (const withCec of [false, true]) {
      for (const withAcid of [true, false]) {
        if (!withAcid && (part === "acidity" || (part === "bases" && !withCec))) continue; // refused: see below
        const log: string[] = [];
        const [ca, mg, k, na, acid, cec] = (["ca", "mg", "k", "na", "acid", "cec"] as const).map((c, j) => watched(c, [CA, MG, K, NA, ACID, CEC][j]!, log));
        const r = cecSaturationColumn(part, ca!, mg!, k!, na!, unit, withAcid ? acid : undefined, withCec ? cec : undefined, undefined, N);
        const want = CA.map((_, i) => cecSaturation(part, CA[i]!, MG[i]!, K[i]!, NA[i]!, unit, withAcid ? ACID[i] : undefined, withCec ? CEC[i] : undefined));
        expect(asResults(r)).toEqual(want);
        expect(log).toEqual(columnByColumn(["ca", "mg", "k", "na", ...(withAcid ? ["acid"] : []), ...(withCec ? ["cec"] : [])], N));
      }
    }
  });
});

describe("column kernels: a sample the kernel declines gets exactly the scalar function's number or refusal", () => {
  const row = (ca: number, mg: number, k: number, na: number, acid: number, cec: number) => ({ ca, mg, k, na, acid, cec });
  // Invented rows: each argument out of range alone, limits at and around them, and overflows.
  const ROWS = [
    row(2000, 180, 150, 30, 2, 14), // ordinary
    row(-1, 180, 150, 30, 2, 14),
    row(2000, -1, 150, 30, 2, 14),
    row(2000, 180, -1, 30, 2, 14),
    row(2000, 180, 150, -1, 2, 14),
    row(2000, 180, 150, 30, -1, 14),
    row(Infinity, 180, 150, 30, 2, 14),
    row(2000, 180, 150, 30, Infinity, 14),
    row(NaN, 180, 150, 30, 2, 14),
    row(2000, 180, 150, 30, 2, 0),
    row(2000, 180, 150, 30, 2, -0),
    row(2000, 180, 150, 30, 2, -3),
    row(2000, 180, 150, 30, 2, Infinity),
    row(2000, 180, 150, 30, 2, Number.MIN_VALUE),
    row(0, 0, 0, 0, 0, 14), // summed CEC 0
    row(-0, -0, -0, -0, -0, 14),
    row(1e306, 0, 1.79e308, 0, 0, 20), // the bases overflow in charge units
    row(1e306, 0, 0, 0, 1.79e308, 20), // the summed CEC overflows through the acidity
    row(1e307, 0, 0, 0, 0, 0.5), // the saturation overflows against a measured CEC
    row(1.7e308, 1.7e308, 0, 0, 0, 14), // the sum overflows
  ];
  const col = (key: keyof ReturnType<typeof row>) => ROWS.map((r) => r[key]);
  it.each(["cmol(+)/kg", "mmolc/kg", "mg/kg", "g/kg"])("cecSumColumn in %s", (unit) => {
    for (const withAcid of [true, false]) {
      const r = cecSumColumn(col("ca"), col("mg"), col("k"), col("na"), unit, withAcid ? col("acid") : undefined, undefined, ROWS.length);
      expect(asResults(r)).toEqual(ROWS.map((x) => scalarOf(() => cecSum(x.ca, x.mg, x.k, x.na, unit, withAcid ? x.acid : undefined))));
      expect([...r.errors.keys()].every((i) => i < ROWS.length)).toBe(true);
      expect(refusedAreNaN(r)).toBe(true);
    }
  });
  it.each(["cmol(+)/kg", "g/kg"].flatMap((u) => PARTS.map((p) => [p, u])))("cecSaturationColumn %s in %s", (part, unit) => {
    for (const withCec of [false, true]) {
      for (const withAcid of [true, false]) {
        const r = cecSaturationColumn(part, col("ca"), col("mg"), col("k"), col("na"), unit, withAcid ? col("acid") : undefined, withCec ? col("cec") : undefined, undefined, ROWS.length);
        const want = ROWS.map((x) => scalarOf(() => cecSaturation(part, x.ca, x.mg, x.k, x.na, unit, withAcid ? x.acid : undefined, withCec ? x.cec : undefined)));
        expect(asResults(r)).toEqual(want);
        expect([...r.errors.keys()].every((i) => i < ROWS.length)).toBe(true);
        expect(refusedAreNaN(r)).toBe(true);
      }
    }
  });
  it("a measured cec of Infinity, −0 or −3 is refused as the scalar function refuses it, not read as 0 % or −∞", () => {
    const r = cecSaturationColumn("Ca", [2000, 2000, 2000], 180, 150, 30, "mg/kg", 2, [Infinity, -0, -3], undefined, 3);
    expect(asResults(r)).toEqual([
      { code: "OUT_OF_RANGE", message: "cec must be a finite number (got Infinity)" },
      { code: "OUT_OF_RANGE", message: "cec must be greater than 0 cmol(+)/kg (got 0 cmol(+)/kg)" },
      { code: "OUT_OF_RANGE", message: "cec must be greater than 0 cmol(+)/kg (got -3 cmol(+)/kg)" },
    ]);
  });
  it("an infinite acidity is refused, not read as a 0 % Ca saturation of an infinite CEC", () => {
    const r = cecSaturationColumn("Ca", [2000], [180], [150], [30], "mg/kg", [Infinity], undefined, undefined, 1);
    expect(asResults(r)).toEqual([{ code: "OUT_OF_RANGE", message: "acidity must be a finite number (got Infinity)" }]);
  });
  it("part acidity without acidity, and bases without acidity or cec, are refused per sample (not read as 0 %); Ca without them is computed", () => {
    const need = (part: string) => scalarOf(() => cecSaturation(part, 2000, 180, 150, 30, "mg/kg"));
    expect(asResults(cecSaturationColumn("acidity", [2000, 2000], 180, 150, 30, "mg/kg", undefined, [14, 14], undefined, 2))).toEqual([need("acidity"), need("acidity")]);
    expect(asResults(cecSaturationColumn("bases", [2000, 2000], 180, 150, 30, "mg/kg", undefined, undefined, undefined, 2))).toEqual([need("bases"), need("bases")]);
    expect(need("acidity")).toMatchObject({ code: "MISSING_INPUT" });
    expect(need("bases")).toMatchObject({ code: "MISSING_INPUT" });
    const log: string[] = [];
    const r = cecSaturationColumn("bases", watched("ca", [2000], log), 180, 150, 30, "mg/kg", undefined, watched("cec", [14], log), undefined, 1);
    expect(asResults(r)).toEqual([cecSaturation("bases", 2000, 180, 150, 30, "mg/kg", undefined, 14)]);
    expect(log).toEqual(["ca0", "cec0"]);
  });
});

describe("column kernels: refusals of the whole column and the scalar path", () => {
  it.each([["furlongs"], ["cmol/kg"], [""], [undefined]])("an unusable unit (%s) gives every sample the scalar function's refusal, and no sample is read", (unit) => {
    const log: string[] = [];
    const ca = watched("ca", [2000, 900, 1], log);
    const r = cecSumColumn(ca, 180, 150, 30, unit, 2, undefined, 3);
    const want = scalarOf(() => cecSum(2000, 180, 150, 30, unit, 2));
    expect(asResults(r)).toEqual([want, want, want]);
    expect(r.errors.size).toBe(3);
    expect(refusedAreNaN(r)).toBe(true);
    const s = cecSaturationColumn("Ca", ca, 180, 150, 30, unit, 2, undefined, undefined, 3);
    expect(asResults(s)).toEqual([want, want, want]);
    expect(s.errors.size).toBe(3);
    expect(refusedAreNaN(s)).toBe(true);
    expect(log).toEqual([]);
  });
  it("an unknown part gives every sample that refusal, and no sample is read", () => {
    const log: string[] = [];
    const r = cecSaturationColumn("nitrogen", watched("ca", [2000, 900], log), 180, 150, 30, "mg/kg", 2, undefined, undefined, 2);
    const want = scalarOf(() => cecSaturation("nitrogen", 2000, 180, 150, 30, "mg/kg", 2));
    expect(want).toMatchObject({ code: "UNKNOWN_NAME" });
    expect(asResults(r)).toEqual([want, want]);
    expect(r.errors.size).toBe(2);
    expect(log).toEqual([]);
  });
  it("mg/dm3 goes sample by sample through the scalar function, a shared bulk density and acidity given to each, nothing read past the end", () => {
    // invented: 2600, 234, 195, 39 mg/dm3 at 1.3 g/cm3 = CEC-05's 2000, 180, 150, 30 mg/kg
    const log: string[] = [];
    const ca = watched("ca", [2600, 2600], log);
    const r = cecSumColumn(ca, 234, 195, 39, "mg/dm3", 2, 1.3, 2);
    expect(asResults(r)).toEqual([cecSum(2600, 234, 195, 39, "mg/dm3", 2, 1.3), cecSum(2600, 234, 195, 39, "mg/dm3", 2, 1.3)]);
    expect(r.values[0]).toBeCloseTo(13.976, 3);
    expect(r.errors.size).toBe(0);
    expect(log).toEqual(["ca0", "ca1"]);
    const s = cecSaturationColumn("Ca", ca, 234, 195, 39, "mg/dm3", 2, undefined, 1.3, 2);
    expect(asResults(s)).toEqual([cecSaturation("Ca", 2600, 234, 195, 39, "mg/dm3", 2, undefined, 1.3), cecSaturation("Ca", 2600, 234, 195, 39, "mg/dm3", 2, undefined, 1.3)]);
    expect(s.errors.size).toBe(0);
  });
  it("a column shorter than n: the samples past its end are refused as a missing number, not filled from its first", () => {
    const want = { code: "OUT_OF_RANGE", message: "ca must be a finite number (got undefined)" };
    expect(asResults(cecSumColumn([2000], [180, 180], 150, 30, "mg/kg", 2, undefined, 2))).toEqual([cecSum(2000, 180, 150, 30, "mg/kg", 2), want]);
    expect(asResults(cecSaturationColumn("Ca", [2000], [180, 180], 150, 30, "mg/kg", 2, undefined, undefined, 2))).toEqual([cecSaturation("Ca", 2000, 180, 150, 30, "mg/kg", 2), want]);
  });
  it("a fault that is not a refusal (a column that fails when read) is thrown, not kept as a sample's error", () => {
    const failing = new Proxy([2000], {
      get(target, key, receiver) {
        if (key === "0") throw new Error("column read failed");
        return Reflect.get(target, key, receiver);
      },
    }) as ArrayLike<number>;
    expect(() => cecSumColumn(failing, 234, 195, 39, "mg/dm3", 2, 1.3, 1)).toThrow("column read failed");
    expect(() => cecSaturationColumn("Ca", failing, 234, 195, 39, "mg/dm3", 2, undefined, 1.3, 1)).toThrow("column read failed");
    expect(() => cecSumColumn(failing, 180, 150, 30, "mg/kg", 2, undefined, 1)).toThrow("column read failed");
  });
});
