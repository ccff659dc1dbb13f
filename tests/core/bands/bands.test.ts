/**
 * SOIL.BAND and SOIL.BANDPOS in core: the catalogue's edge rule and default labels, range shapes,
 * refusals, and properties. Limits in the edge-case tests are invented (a scale of 10, 20, 30, 40);
 * published tables are checked in sufficiency.test.ts.
 */
import fc from "fast-check";
import { bandIndex, bandIndexAt, bandLabel, bandPosition, DEFAULT_BAND_LABELS } from "../../../src/core/bands/bands";
import { errorCode as code, errorMessage as message } from "../../helpers/errors";


const L = [10, 20, 30, 40]; // invented

describe("bandLabel: the catalogue's edge rule (functions.md, 'Nutrient bands and fertility')", () => {
  it("a value equal to a limit belongs to the band above it", () => {
    expect(bandLabel(10, L)).toBe("Low");
    expect(bandLabel(20, L)).toBe("Optimum");
    expect(bandLabel(30, L)).toBe("High");
    expect(bandLabel(40, L)).toBe("Very high");
  });
  it("just below a limit stays in the band below", () => {
    expect(bandLabel(9.999, L)).toBe("Very low");
    expect(bandLabel(39.999, L)).toBe("High");
  });
  it("below the first limit is the first band, above the last the last band", () => {
    expect(bandLabel(-5, L)).toBe("Very low");
    expect(bandLabel(0, L)).toBe("Very low");
    expect(bandLabel(1e9, L)).toBe("Very high");
  });
  it("default labels for four limits: Very low, Low, Optimum, High, Very high", () => {
    expect(DEFAULT_BAND_LABELS).toEqual(["Very low", "Low", "Optimum", "High", "Very high"]);
    expect([5, 15, 25, 35, 45].map((v) => bandLabel(v, L))).toEqual(DEFAULT_BAND_LABELS);
  });
  it("own labels, in any language, n + 1 of them", () => {
    expect(bandLabel(25, [10, 20, 30], ["Muy bajo", "Bajo", "Medio", "Alto"])).toBe("Medio");
    expect(bandLabel(5, [10], ["niedrig", "ausreichend"])).toBe("niedrig");
    expect(bandLabel(10, [10], ["niedrig", "ausreichend"])).toBe("ausreichend");
  });
  it("bandIndex counts the limits at or below the value", () => {
    expect([0, 10, 15, 20, 40, 50].map((v) => bandIndex(v, L))).toEqual([0, 1, 1, 2, 4, 4]);
  });
});

describe("limits and labels as worksheet ranges", () => {
  it("a column range and a row range give the same bands", () => {
    const col = [[10], [20], [30], [40]];
    const row = [[10, 20, 30, 40]];
    expect(bandLabel(25, col)).toBe("Optimum");
    expect(bandLabel(25, row)).toBe("Optimum");
  });
  it("numeric text in a limit cell is read as a number", () => {
    expect(bandLabel(25, [["10", "20", "30", "40"]])).toBe("Optimum");
  });
  it("trailing blank cells of a longer selection are ignored", () => {
    expect(bandLabel(25, [[10], [20], [30], [40], [null], [null]])).toBe("Optimum");
    expect(bandLabel(25, [[10], [20], [30]], [["a"], ["b"], ["c"], ["d"], [""]])).toBe("c");
  });
  it("a blank between limits is refused, not skipped", () => {
    expect(code(() => bandLabel(25, [[10], [null], [30], [40]]))).toBe("MISSING_INPUT");
  });
  it("a 2-D block is refused", () => {
    expect(code(() => bandLabel(25, [[10, 20], [30, 40]]))).toBe("SHAPE_MISMATCH");
  });
  it("a number as a label is shown as text", () => {
    expect(bandLabel(25, [10, 20], [1, 2, 3])).toBe("3");
  });
});

describe("refusals (#VALUE! with a message)", () => {
  it("limits not ascending", () => {
    expect(code(() => bandLabel(5, [10, 30, 20, 40]))).toBe("NOT_APPLICABLE");
    expect(() => bandLabel(5, [10, 30, 20, 40])).toThrow(/strictly ascending.*limit 3 \(20\) is not above limit 2 \(30\)/);
  });
  it("equal limits are not ascending (an empty band)", () => {
    expect(code(() => bandLabel(5, [10, 20, 20, 40]))).toBe("NOT_APPLICABLE");
  });
  it("other than four limits without labels: says how many labels are needed", () => {
    expect(code(() => bandLabel(5, [10, 20, 30]))).toBe("MISSING_INPUT");
    expect(() => bandLabel(5, [10, 20, 30])).toThrow(/give labels \(4 of them\)/);
  });
  it("a wrong number of labels names both counts", () => {
    expect(code(() => bandLabel(5, L, ["a", "b", "c"]))).toBe("SHAPE_MISMATCH");
    expect(() => bandLabel(5, L, ["a", "b", "c"])).toThrow(/needs 5 entries \(got 3\)/);
  });
  it("text and booleans in limits are not numbers", () => {
    expect(code(() => bandLabel(5, [10, "twenty", 30, 40]))).toBe("NOT_A_NUMBER");
    expect(code(() => bandLabel(5, [10, true, 30, 40]))).toBe("NOT_A_NUMBER");
  });
  it("no limits at all", () => {
    expect(code(() => bandLabel(5, []))).toBe("MISSING_INPUT");
    expect(code(() => bandLabel(5, [[null, null]]))).toBe("MISSING_INPUT");
  });
  it("a boolean label is refused", () => {
    expect(code(() => bandLabel(5, [10], ["a", true]))).toBe("NOT_A_NUMBER");
  });
  it("a value that is not finite is refused", () => {
    expect(code(() => bandLabel(Number.NaN, L))).toBe("OUT_OF_RANGE");
  });
});

describe("bandPosition: 0 at the first limit, 1 at the second, … (catalogue); half bands at the ends (derived)", () => {
  it("whole numbers at the limits", () => {
    expect(L.map((v) => bandPosition(v, L))).toEqual([0, 1, 2, 3]);
  });
  it("interpolated within a band", () => {
    expect(bandPosition(25, L)).toBeCloseTo(1.5, 12);
    expect(bandPosition(12.5, [10, 20, 40])).toBeCloseTo(0.25, 12);
    expect(bandPosition(30, [10, 20, 40])).toBeCloseTo(1.5, 12); // the second band is twice as wide
  });
  it("below the first limit: the first band's width, −0.5 half a band below", () => {
    expect(bandPosition(5, L)).toBeCloseTo(-0.5, 12);
    expect(bandPosition(5, [10, 30, 40])).toBeCloseTo(-0.25, 12);
  });
  it("above the last limit: the last band's width, n − 0.5 half a band above", () => {
    expect(bandPosition(45, L)).toBeCloseTo(3.5, 12);
    expect(bandPosition(50, [10, 20, 30])).toBeCloseTo(4, 12);
  });
  it("not clamped: far outside gives positions beyond −0.5 and n − 0.5", () => {
    expect(bandPosition(-90, L)).toBeCloseTo(-10, 12);
    expect(bandPosition(140, L)).toBeCloseTo(13, 12);
  });
  it("needs at least two limits", () => {
    expect(code(() => bandPosition(5, [10]))).toBe("NOT_APPLICABLE");
  });
  it("refuses unsorted limits like BAND", () => {
    expect(code(() => bandPosition(5, [40, 30]))).toBe("NOT_APPLICABLE");
  });
  it("a position too large to represent is an error, not Infinity", () => {
    expect(code(() => bandPosition(1e10, [0, 1e-300]))).toBe("OUT_OF_RANGE");
  });
  it("rounding never pushes a value into the next band's position", () => {
    // 0.1 and 0.3 are not exact in binary; the largest double below 0.3 is still in band 1.
    const justBelow = 0.3 - 2 ** -54;
    expect(justBelow).toBeLessThan(0.3);
    const p = bandPosition(justBelow, [0.1, 0.3, 0.5]);
    expect(p).toBeLessThan(1);
    expect(bandIndex(justBelow, [0.1, 0.3, 0.5])).toBe(1);
  });
});

// Invented limit sets for the property tests: a start and 1–7 positive gaps (0.001 to 10 000),
// the spread of real soil-test scales.
const ascending = fc
  .tuple(
    fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }),
    fc.array(fc.double({ min: 1e-3, max: 1e4, noNaN: true, noDefaultInfinity: true }), { minLength: 1, maxLength: 7 }),
  )
  .map(([start, gaps]) => gaps.reduce((xs, g) => [...xs, (xs[xs.length - 1] as number) + g], [start]))
  .filter((xs) => xs.every((x, i) => i === 0 || x > (xs[i - 1] as number)));
const value = fc.double({ min: -3e6, max: 3e6, noNaN: true, noDefaultInfinity: true });

describe("properties (fast-check; invented limits)", () => {
  it("BANDPOS is monotonic non-decreasing in the value", () => {
    fc.assert(
      fc.property(ascending, value, value, (limits, a, b) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        return bandPosition(lo, limits) <= bandPosition(hi, limits);
      }),
    );
  });
  it("BAND agrees with BANDPOS: band index = floor(position) + 1, within 0 … n", () => {
    fc.assert(
      fc.property(ascending, value, (limits, v) => {
        const n = limits.length;
        const k = bandIndex(v, limits);
        const fromPos = Math.min(n, Math.max(0, Math.floor(bandPosition(v, limits)) + 1));
        return k === fromPos;
      }),
    );
  });
  it("BAND agrees with BANDPOS exactly at every limit", () => {
    fc.assert(
      fc.property(ascending, (limits) =>
        limits.every((l, i) => bandIndex(l, limits) === i + 1 && bandPosition(l, limits) === i),
      ),
    );
  });
  it("BAND agrees with BANDPOS a few ulps either side of each limit (rounding guard)", () => {
    const f = new Float64Array(1);
    const u = new BigInt64Array(f.buffer);
    const nextUp = (x: number) => {
      if (x === 0) return Number.MIN_VALUE;
      f[0] = x;
      u[0] = (u[0] as bigint) + (x > 0 ? 1n : -1n);
      return f[0] as number;
    };
    const step = (x: number, ulps: number) => {
      let y = x;
      for (let i = 0; i < Math.abs(ulps); i++) y = ulps > 0 ? nextUp(y) : -nextUp(-y);
      return y;
    };
    fc.assert(
      fc.property(ascending, fc.nat(7), fc.integer({ min: -4, max: 4 }), (limits, i, ulps) => {
        const l = limits[i % limits.length] as number;
        const v = step(l, ulps);
        const n = limits.length;
        const fromPos = Math.min(n, Math.max(0, Math.floor(bandPosition(v, limits)) + 1));
        return bandIndex(v, limits) === fromPos;
      }),
    );
  });
  it("BAND is the label at the band index", () => {
    fc.assert(
      fc.property(ascending, value, (limits, v) => {
        const labels = Array.from({ length: limits.length + 1 }, (_, i) => `band ${i}`);
        return bandLabel(v, limits, labels) === `band ${bandIndex(v, limits)}`;
      }),
    );
  });
});

describe("bandIndexAt: a published table's own edge rule, limit by limit", () => {
  // Derived: the three rules a printed table can state at a limit (see AtLimit in bands.ts).
  it("'above' puts a value equal to the limit in the band above, like SOIL.BAND", () => {
    expect(bandIndexAt(20, [10, 20, 30], ["above", "above", "above"])).toBe(bandIndex(20, [10, 20, 30]));
  });
  it("'below' keeps it in the band the limit closes (a closed printed range)", () => {
    expect(bandIndexAt(20, [10, 20, 30], ["above", "below", "below"])).toBe(1);
    expect(bandIndexAt(10, [10, 20, 30], ["above", "below", "below"])).toBe(1);
  });
  it("'none' leaves the exact value unclassified (null); its neighbours are classified", () => {
    expect(bandIndexAt(1, [1], ["none"])).toBeNull();
    expect(bandIndexAt(0.999, [1], ["none"])).toBe(0);
    expect(bandIndexAt(1.001, [1], ["none"])).toBe(1);
  });
  it("values off the limits are unaffected by the rules", () => {
    fc.assert(
      fc.property(fc.double({ min: -100, max: 100, noNaN: true }), (v) => {
        const limits = [-10, 0, 10];
        fc.pre(!limits.includes(v));
        expect(bandIndexAt(v, limits, ["below", "none", "above"])).toBe(bandIndex(v, limits));
      }),
    );
  });
  it("refuses rules that do not match the limits in number", () => {
    expect(code(() => bandIndexAt(5, [1, 2], ["above"]))).toBe("SHAPE_MISMATCH");
  });
});

// The rest checks the code's own reading of ranges and its refusals (no published values): the
// limits are the invented scale above or smaller invented ones.
describe("reading limits and labels: shapes, blanks and single cells", () => {
  it("a 2-D block is refused with its size, for limits and for labels", () => {
    expect(message(() => bandLabel(25, [[10, 20], [30, 40]]))).toBe("limits must be a single row or a single column (got 2×2)");
    expect(message(() => bandLabel(25, [10, 20], [["a", "b", "c"], ["d", "e", "f"]]))).toBe("labels must be a single row or a single column (got 2×3)");
  });
  it("a ragged range is measured by its longest row", () => {
    expect(code(() => bandLabel(25, [[10], [20, 30]]))).toBe("SHAPE_MISMATCH");
    expect(message(() => bandLabel(25, [[10], [20, 30]]))).toMatch(/\(got 2×2\)$/);
  });
  it("a list mixing cells and rows is not a range: the row is not a number", () => {
    expect(code(() => bandLabel(5, [10, [20]] as never))).toBe("NOT_A_NUMBER");
  });
  it.each([
    ["null", null],
    ["empty text", ""],
    ["white space", "   "],
    ["undefined", undefined],
  ])("a trailing blank cell (%s) is ignored", (_, blank) => {
    expect(bandLabel(25, [10, 20, 30, 40, blank] as never)).toBe("Optimum");
    expect(bandLabel(25, [10, 20], ["a", "b", "c", blank] as never)).toBe("c");
  });
  it("an inner blank names its position, in limits and in labels", () => {
    expect(message(() => bandLabel(25, [[10], [null], [30], [40]]))).toBe("limits has a blank cell at position 2; fill it or remove it");
    expect(message(() => bandLabel(25, [null, 20, 30, 40]))).toBe("limits has a blank cell at position 1; fill it or remove it");
    expect(message(() => bandLabel(25, [10, 20], ["a", " ", "c"]))).toBe("labels has a blank cell at position 2; fill it or remove it");
  });
  it("no limits, or only blank cells, says the limits are empty", () => {
    for (const empty of [[], [[null, null]], [null]]) {
      expect(code(() => bandLabel(5, empty))).toBe("MISSING_INPUT");
      expect(message(() => bandLabel(5, empty))).toBe("limits is empty: give one or more ascending lower bounds");
    }
  });
  it("a single cell that is not in a list reads as a list of one", () => {
    expect(bandLabel(5, 10 as never, ["below", "from 10"])).toBe("below");
    expect(bandLabel(10, 10 as never, ["below", "from 10"])).toBe("from 10");
    expect(message(() => bandLabel(5, [10], "only one" as never))).toBe("1 limit make 2 bands, so labels needs 2 entries (got 1)");
  });
});

describe("reading limits: numbers and numeric text only", () => {
  it("numeric text may have spaces around it", () => {
    expect(bandLabel(25, [" 10", "20 ", " 30 ", "40"])).toBe("Optimum");
  });
  it("a limit that is not finite is refused, naming it", () => {
    expect(code(() => bandLabel(5, [10, Infinity], ["a", "b", "c"]))).toBe("NOT_A_NUMBER");
    expect(message(() => bandLabel(5, [10, Infinity], ["a", "b", "c"]))).toBe("limit 2 is not a finite number");
    expect(message(() => bandLabel(5, [Number.NaN, 20], ["a", "b", "c"]))).toBe("limit 1 is not a finite number");
  });
  it("text is quoted in the refusal, a boolean is not", () => {
    expect(message(() => bandLabel(5, [10, "twenty", 30, 40]))).toBe('limit 2 ("twenty") is not a number');
    expect(message(() => bandLabel(5, [10, true, 30, 40]))).toBe("limit 2 (true) is not a number");
  });
});

describe("reading labels", () => {
  it("labels omitted as null are the default five for four limits", () => {
    expect(bandLabel(25, L, null as never)).toBe("Optimum");
  });
  it("spaces around a label are dropped", () => {
    expect(bandLabel(15, [10, 20], [" under ", " between ", " over "])).toBe("between");
  });
  it("a label that is a boolean or a number that is not finite is refused, naming it", () => {
    expect(message(() => bandLabel(5, [10], ["a", true]))).toBe("label 2 must be text (got true)");
    expect(code(() => bandLabel(5, [10], ["a", Number.NaN]))).toBe("NOT_A_NUMBER");
    expect(message(() => bandLabel(5, [10], [Number.NaN, "b"]))).toBe("label 1 must be text (got NaN)");
  });
  it("labels omitted: the message counts the bands and lists the defaults", () => {
    const defaults = "default labels exist only for 4 limits (Very low, Low, Optimum, High, Very high)";
    expect(message(() => bandLabel(5, [10]))).toBe(`1 limit make 2 bands: give labels (2 of them); ${defaults}`);
    expect(message(() => bandLabel(5, [10, 20, 30]))).toBe(`3 limits make 4 bands: give labels (4 of them); ${defaults}`);
  });
  it("a wrong number of labels: the message counts limits, bands and labels", () => {
    expect(message(() => bandLabel(5, [10], ["a", "b", "c"]))).toBe("1 limit make 2 bands, so labels needs 2 entries (got 3)");
    expect(message(() => bandLabel(5, L, ["a", "b", "c"]))).toBe("4 limits make 5 bands, so labels needs 5 entries (got 3)");
  });
});

describe("the same array read again after it was refilled", () => {
  // A caller may change an array between two calls: each call reads what the array holds now.
  it.each([
    ["one limit changed", (l: number[]): void => void (l[1] = 26), 25, 2, 1],
    ["every limit changed", (l: number[]): void => void l.splice(0, 4, 26, 27, 28, 29), 25, 2, 0],
    ["a limit removed", (l: number[]): void => void (l.length = 3), 45, 4, 3],
    ["a limit added", (l: number[]): void => void l.push(50), 55, 4, 5],
  ] as const)("%s", (_, refill, v, before, after) => {
    const limits = [10, 20, 30, 40];
    expect(bandIndex(v, limits)).toBe(before);
    refill(limits);
    expect(bandIndex(v, limits)).toBe(after);
  });
  it("a cell of a column range changed", () => {
    const col = [[10], [20], [30], [40]];
    expect(bandLabel(25, col)).toBe("Optimum");
    (col[1] as number[])[0] = 26;
    expect(bandLabel(25, col)).toBe("Low");
  });
  it("a label changed", () => {
    const labels = ["a", "b", "c"];
    expect(bandLabel(15, [10, 20], labels)).toBe("b");
    labels[1] = "B";
    expect(bandLabel(15, [10, 20], labels)).toBe("B");
  });
});

describe("the value and the edge rules: refusals name the argument", () => {
  it("a value that is not finite", () => {
    expect(message(() => bandIndex(Number.NaN, L))).toBe("value must be a finite number (got NaN)");
    expect(message(() => bandIndexAt(Infinity, [1, 2], ["above", "above"]))).toBe("value must be a finite number (got Infinity)");
  });
  it("edge rules that do not match the limits in number", () => {
    expect(message(() => bandIndexAt(5, [1, 2], ["above"]))).toBe("2 limits need 2 edge rules (got 1)");
  });
});

describe("bandPosition: the rounding guards (derived from binary floating point)", () => {
  // The largest double below a positive x, one step down in its bits.
  const below = (x: number) => {
    const f = new Float64Array([x]);
    const u = new BigUint64Array(f.buffer);
    u[0] = (u[0] as bigint) - 1n;
    return f[0] as number;
  };
  it("a value one step below a limit, where the division rounds up to the next whole number, stays in its band", () => {
    // (7.25⁻ − 1.15) / (7.25 − 1.15) rounds to 1 exactly; the position is the largest double below 1.
    const v1 = below(7.25);
    expect((v1 - 1.15) / (7.25 - 1.15)).toBe(1);
    expect(bandPosition(v1, [1.15, 7.25, 7.51])).toBe(1 - 2 ** -53);
    // In the second band the sum 1 + fraction rounds up to 2; the position is the largest double below 2.
    const v2 = below(15.32);
    expect(1 + (v2 - 6.71) / (15.32 - 6.71)).toBe(2);
    expect(bandPosition(v2, [2.25, 6.71, 15.32])).toBe(2 - 2 ** -52);
    expect(bandIndex(v2, [2.25, 6.71, 15.32])).toBe(2);
  });
  it("a value just below the first limit has a negative position even where the division underflows to 0", () => {
    expect(-Number.MIN_VALUE / 1e10).toBe(-0);
    expect(bandPosition(-Number.MIN_VALUE, [0, 1e10])).toBe(-Number.MIN_VALUE);
  });
  it("a position too large to represent says so", () => {
    expect(message(() => bandPosition(1e10, [0, 1e-300]))).toBe("the band position cannot be computed for these inputs (result is not finite)");
  });
});

describe("a limit typed as text beyond the floating-point range", () => {
  it('"1e999" (Infinity once read) is refused, never taken as a limit', () => {
    expect(code(() => bandIndex(5, [1, "1e999"]))).toBe("NOT_A_NUMBER");
    expect(message(() => bandIndex(5, [1, "1e999"]))).toContain('limit 2 ("1e999") is not a finite number');
    expect(message(() => bandIndex(5, [1, "-1e999"]))).toContain('limit 2 ("-1e999") is not a finite number');
    expect(bandIndex(5, [1, "1e300"])).toBe(1);
  });
});
