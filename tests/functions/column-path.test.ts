/**
 * A binding with a column kernel gives every element of a column exactly what the same element
 * gives on its own (one cell, which takes the element path): numbers, blanks, text, errors in
 * cells, refusals. Inputs are generated (property tests); invented values.
 */
import fc from "fast-check";
import * as bindings from "../../src/functions";
import { PlainHostError } from "../../src/functions/_binding";
import { cec } from "../../src/functions/cations";

const cellArb = fc.oneof(
  { weight: 6, arbitrary: fc.double({ min: -5, max: 4000, noNaN: true }) },
  { weight: 1, arbitrary: fc.constantFrom("", "12.5", "<0.5", "n.d.", null) },
  { weight: 1, arbitrary: fc.constant(new PlainHostError("#N/A", "an error in a cell")) },
);
const unitArb = fc.constantFrom("mg/kg", "meq/100g", "mmolc/kg", "mg/dm3", "cmol/kg", "");
const show = (v: unknown) => (v instanceof PlainHostError ? `${v.kind} ${v.message}` : v);

describe("column kernels through the bindings", () => {
  it("SOIL.CEC over a column = SOIL.CEC cell by cell", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(cellArb, cellArb, cellArb, cellArb, cellArb), { minLength: 16, maxLength: 40 }), unitArb, fc.boolean(), (rows, unit, withAcid) => {
        const col = (j: number) => rows.map((r) => [r[j]]);
        const whole = bindings.cec(col(0), col(1), col(2), col(3), [[unit]], withAcid ? col(4) : (undefined as never)).map((r) => show(r[0]));
        const single = rows.map((r) => show(bindings.cec([[r[0]]], [[r[1]]], [[r[2]]], [[r[3]]], [[unit]], withAcid ? [[r[4]]] : (undefined as never))[0]![0]));
        expect(whole).toEqual(single);
      }),
      { numRuns: 200 },
    );
  });
  it("SOIL.SATURATION over a column = SOIL.SATURATION cell by cell", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(cellArb, cellArb, cellArb, cellArb, cellArb, cellArb), { minLength: 16, maxLength: 40 }),
        unitArb,
        fc.constantFrom("Ca", "bases", "acidity", "K", "x"),
        fc.boolean(),
        fc.boolean(),
        (rows, unit, part, withAcid, withCec) => {
          const col = (j: number) => rows.map((r) => [r[j]]);
          const whole = bindings
            .saturation([[part]], col(0), col(1), col(2), col(3), [[unit]], withAcid ? col(4) : (undefined as never), withCec ? col(5) : (undefined as never))
            .map((r) => show(r[0]));
          const single = rows.map((r) =>
            show(bindings.saturation([[part]], [[r[0]]], [[r[1]]], [[r[2]]], [[r[3]]], [[unit]], withAcid ? [[r[4]]] : (undefined as never), withCec ? [[r[5]]] : (undefined as never))[0]![0]),
          );
          expect(whole).toEqual(single);
        },
      ),
      { numRuns: 200 },
    );
  });
});

/*
 * The layer's column path through a small binding declared here (invented arithmetic, no science):
 * x × y plus the number of cells in an optional whole range; x below 0 is refused, x = 13 makes a
 * non-finite number. The kernel does the same over columns, so any difference is the layer's.
 */
import { declare, num, optNum, optRange, text, cell, ColumnKernel } from "../../src/functions/_binding";
import { SoilError } from "../../src/core/errors";

function scaleBinding(): void {}
const tableCells = (t: unknown) => (Array.isArray(t) ? (t as unknown[][]).flat().length : 0);
const scaleKernel: ColumnKernel = (v, n) => {
  const at = (a: unknown, i: number) => (a instanceof Float64Array ? (a[i] as number) : (a as number));
  const values = new Float64Array(n);
  const errors = new Map<number, SoilError>();
  for (let i = 0; i < n; i++) {
    const x = at(v[0], i);
    if (x < 0) {
      errors.set(i, new SoilError("OUT_OF_RANGE", "x must be at least 0"));
      values[i] = NaN;
    } else values[i] = x === 13 ? NaN : x * at(v[1], i) + tableCells(v[2]);
  }
  return { values, errors };
};
const SCALE = declare(
  scaleBinding,
  [num("x"), optNum("y", 2), optRange("table")] as const,
  (x, y, table) => {
    if (x < 0) throw new SoilError("OUT_OF_RANGE", "x must be at least 0");
    return x === 13 ? NaN : x * (y as number) + tableCells(table);
  },
  scaleKernel,
);
const scale = (...a: unknown[]) => SCALE(a).map((r) => r.map(show));
/** Each element on its own (1×1 arguments take the element path). */
const oneByOne = (grids: (unknown[][] | null)[], table?: unknown) => {
  const rows = grids.find((g) => g && g.length * (g[0] as unknown[]).length > 1)!;
  return rows.map((row, r) =>
    row.map((_, c) => show(SCALE([...grids.map((g) => (g === null ? null : g.length === 1 && g[0]!.length === 1 ? g : [[g[r]![c]]])), table])[0]![0])),
  );
};
const numbers = (rows: number, cols: number, f: (r: number, c: number) => unknown) =>
  Array.from({ length: rows }, (_, r) => Array.from({ length: cols }, (_, c) => f(r, c)));
const mixed = (r: number, c: number) => [1.5, -1, 13, "", "4", null, new PlainHostError("#N/A", "an error in a cell"), 7][(r * 5 + c) % 8];

describe("the column path gives what the element path gives (the layer, through a binding declared here)", () => {
  it.each([
    ["a 16×1 column", 16, 1],
    ["a 1×16 row", 1, 16],
    ["a 4×4 block", 4, 4],
    ["a 3×7 block", 3, 7],
  ])("%s of x against a single y, with and without a whole-range table", (_, rows, cols) => {
    const x = numbers(rows, cols, mixed);
    for (const y of [[[3]], [["3"]], null, [[""]], [[new PlainHostError("#N/A", "an error in a cell")]], [["n.d."]]]) {
      for (const table of [undefined, [[1, 2], [3, null]]]) {
        const whole = scale(x, y, table);
        expect(whole).toEqual(oneByOne([x, y], table));
      }
    }
    // A spot check of the expected numbers themselves: x 1.5 × y 3 + 4 table cells.
    expect(scale(x, [[3]], [[1, 2], [3, null]])[0]![0]).toBe(8.5);
    expect(scale(x, [[3]])[0]![0]).toBe(4.5);
  });
  it("both arguments ranges of the same shape pair element by element", () => {
    const x = numbers(16, 1, (r) => r);
    const y = numbers(16, 1, (r) => 100 + r);
    expect(scale(x, y)).toEqual(numbers(16, 1, (r) => (r === 13 ? "#VALUE! internal error: a result was not a finite number" : r * (100 + r))));
    expect(scale(x, y)).toEqual(oneByOne([x, y]));
  });
  it("a required argument left out is named in every element, also over a long range", () => {
    const y = numbers(16, 1, (r) => r);
    expect(scale(null, y)).toEqual(numbers(16, 1, () => "#VALUE! x is required"));
  });
  it("a range with no plain number in it gives each element's own blank or refusal", () => {
    const x = numbers(16, 1, (r) => ["", null, "abc"][r % 3]);
    expect(scale(x, [[3]])).toEqual(oneByOne([x, [[3]]]));
    expect(scale(x, [[3]])[2]![0]).toBe('#VALUE! x: "abc" is not a number');
  });
});

describe("SOIL.CEC over blocks, rows and columns = cell by cell (invented values)", () => {
  const amounts = (rows: number, cols: number, base: number) => numbers(rows, cols, (r, c) => base + r * 3 + c);
  const cellByCell = (args: (unknown[][] | null)[]) => {
    const big = args.find((g) => g && g.length * (g[0] as unknown[]).length > 1)!;
    return big.map((row, r) =>
      row.map((_, c) => show((cec as (...a: unknown[]) => unknown[][])(...args.map((g) => (g === null ? null : g.length === 1 && g[0]!.length === 1 ? g : [[g[r]![c]]])))[0]![0])),
    );
  };
  const run = (args: (unknown[][] | null)[]) => (cec as (...a: unknown[]) => unknown[][])(...args).map((r) => r.map(show));
  it.each([
    [4, 4],
    [1, 16],
    [16, 1],
  ])("%i×%i ranges, a single mg, the unit as one cell or as a range of the same word", (rows, cols) => {
    const ca = amounts(rows, cols, 200);
    const k = amounts(rows, cols, 100);
    const na = amounts(rows, cols, 5);
    for (const unit of [[["mg/kg"]], numbers(rows, cols, () => "mg/kg")]) {
      const args = [ca, [[14]], k, na, unit];
      const whole = run(args);
      expect(whole).toEqual(cellByCell(args));
      expect(whole.flat().every((v) => typeof v === "number")).toBe(true);
    }
    const allRanges = [ca, amounts(rows, cols, 10), k, na, numbers(rows, cols, () => "mg/kg")];
    expect(run(allRanges)).toEqual(cellByCell(allRanges));
  });
  it("na left out is named in every element of a 16-cell range", () => {
    const ca = amounts(16, 1, 200);
    expect(run([ca, ca, ca, null, [["mg/kg"]]])).toEqual(numbers(16, 1, () => "#VALUE! na is required"));
  });
});

/*
 * The column path must do the work, not only agree with the element path: the benchmark's kernel
 * figures (one validation per column) rest on it. A binding declared here counts its calls: the
 * kernel gets, once, exactly the elements whose numeric arguments are all plain finite numbers, in
 * reading order; the element function only the others that are neither blank nor an error.
 */
describe("the column path takes the plain-number elements in one kernel call", () => {
  function countedBinding(): void {}
  const calls = { kernel: [] as { values: unknown[]; n: number }[], element: [] as unknown[][] };
  const counted = declare(
    countedBinding,
    [num("x"), optNum("y", 2), optRange("table")] as const,
    (x, y, table) => {
      calls.element.push([x, y, table]);
      return x * (y as number) + tableCells(table);
    },
    (values, n) => {
      calls.kernel.push({ values: values.map((v) => (v instanceof Float64Array ? Array.from(v) : v)), n });
      return scaleKernel(values, n);
    },
  );
  beforeEach(() => {
    calls.kernel = [];
    calls.element = [];
  });
  const plain = (v: unknown) => typeof v === "number" && Number.isFinite(v);

  it.each([
    ["a 4×4 block", 4, 4],
    ["a 16×1 column", 16, 1],
    ["a 1×16 row", 1, 16],
    ["a 3×7 block", 3, 7],
  ])("%s of x against a single y and a table", (_, rows, cols) => {
    const x = numbers(rows, cols, mixed);
    const table = [[1, 2], [3, null]];
    const out = counted([x, [[3]], table]).map((r) => r.map(show));
    const inOrder = x.flat();
    expect(calls.kernel).toEqual([{ values: [inOrder.filter(plain), 3, [[1, 2], [3, null]]], n: inOrder.filter(plain).length }]);
    // Only numeric text ("4") needs the element function; blanks and errors need neither.
    expect(calls.element).toEqual(inOrder.filter((v) => v === "4").map(() => [4, 3, [[1, 2], [3, null]]]));
    expect(out).toEqual(oneByOne([x, [[3]]], table));
  });
  it("two columns: the kernel gets the rows where both are plain numbers, the others go element by element", () => {
    const x = numbers(16, 1, (r) => [r, "", r, "7", r][r % 5]);
    const y = numbers(16, 1, (r) => [10, 10, "", 10, Infinity, 10][r % 6]);
    const out = counted([x, y]).map((r) => r.map(show));
    const both = x.flat().map((v, i) => [v, y.flat()[i]] as const).filter(([a, b]) => plain(a) && plain(b));
    expect(calls.kernel).toEqual([{ values: [both.map(([a]) => a), both.map(([, b]) => b), undefined], n: both.length }]);
    expect(out).toEqual(oneByOne([x, y]));
  });
  it("an omitted optional number reaches the kernel as its default, once for the column", () => {
    const x = numbers(16, 1, (r) => r + 1);
    counted([x]);
    expect(calls.kernel).toEqual([{ values: [x.flat(), 2, undefined], n: 16 }]);
    expect(calls.element).toEqual([]);
  });
  it("16 elements take the column path, 15 the element path", () => {
    counted([numbers(15, 1, (r) => r + 1), [[3]]]);
    expect(calls.kernel).toEqual([]);
    expect(calls.element).toHaveLength(15);
    calls.element = [];
    counted([numbers(4, 4, (r, c) => r + c + 1), [[3]]]);
    expect(calls.kernel).toHaveLength(1);
    expect(calls.element).toEqual([]);
  });
  it("a column with no plain number calls no kernel", () => {
    const x = numbers(16, 1, (r) => ["", null, "abc", "4"][r % 4]);
    const out = counted([x, [[3]]]).map((r) => r.map(show));
    expect(calls.kernel).toEqual([]);
    expect(out).toEqual(oneByOne([x, [[3]]]));
  });
  it("a shared y that is text, blank or an error sends every element down the element path", () => {
    for (const y of [[[""]], [[new PlainHostError("#N/A", "an error in a cell")]], [["n.d."]]]) {
      calls.kernel = [];
      counted([numbers(16, 1, (r) => r + 1), y]);
      expect(calls.kernel).toEqual([]);
    }
  });
});

describe("a shared text argument reaches the kernel as its text", () => {
  function wordBinding(): void {}
  const seen: unknown[][] = [];
  const withWord = declare(
    wordBinding,
    [num("x"), text("unit")] as const,
    (x, unit) => (unit === "twice" ? 2 * x : x),
    (values, n) => {
      seen.push(values.map((v) => (v instanceof Float64Array ? Array.from(v) : v)));
      const out = new Float64Array(n);
      for (let i = 0; i < n; i++) out[i] = (values[1] === "twice" ? 2 : 1) * ((values[0] as Float64Array)[i] as number);
      return { values: out, errors: new Map<number, SoilError>() };
    },
  );
  it("one kernel call with the word, trimmed as the element path trims it", () => {
    const x = numbers(16, 1, (r) => r);
    expect(withWord([x, [[" twice "]]])).toEqual(numbers(16, 1, (r) => 2 * r));
    expect(seen).toEqual([[x.flat(), "twice"]]);
  });
  it("a text argument that varies by element (a range, words or numbers) sends every element down the element path", () => {
    const x = numbers(16, 1, (r) => r);
    for (const unit of [numbers(16, 1, (r) => (r % 2 ? "twice" : "once")), numbers(16, 1, (r) => r), numbers(16, 1, (r) => (r ? "twice" : new PlainHostError("#N/A", "an error in a cell")))]) {
      seen.length = 0;
      const out = withWord([x, unit]).map((r) => r.map(show));
      expect(seen).toEqual([]);
      expect(out).toEqual(unit.map((u, r) => [show(withWord([[[r]], [u]])[0]![0])]));
    }
  });
});

describe("a blank shared cell argument sends every element down the element path", () => {
  // A cell argument (number or text as it stands) left blank gives a blank result, never a kernel value.
  function cellBinding(): void {}
  let kernelCalls = 0;
  const withCell = declare(
    cellBinding,
    [num("x"), cell("reading")] as const,
    (x, reading) => x + Number(reading),
    (values, n) => {
      kernelCalls++;
      const out = new Float64Array(n);
      for (let i = 0; i < n; i++) out[i] = ((values[0] as Float64Array)[i] as number) + Number(values[1]);
      return { values: out, errors: new Map<number, SoilError>() };
    },
  );
  it("blank in, blank out over a 16-cell column", () => {
    expect(withCell([numbers(16, 1, (r) => r), [[""]]])).toEqual(numbers(16, 1, () => ""));
    expect(kernelCalls).toBe(0);
    expect(withCell([numbers(16, 1, (r) => r), [[5]]])).toEqual(numbers(16, 1, (r) => r + 5));
    expect(kernelCalls).toBe(1);
  });
});
