/**
 * What leaves a binding becomes an engine value: a number stays a number only when finite (NaN
 * and ±Infinity become #NUM!, as Excel cannot hold them), text and booleans pass, an error value
 * passes, and anything else is a visible #VALUE!. The bindings never return a non-finite number
 * (core refuses first), so the guard is probed with a stand-in binding. Values invented.
 */
import { soilCall } from "../../src/engine/soil";
import { REGISTRY } from "../../src/engine/registry";
import { XlArray, XlError } from "../../src/engine/formula/values";

const cmol = REGISTRY.find((f) => f.formulaName === "SOIL.CMOL")!;
const real = cmol.binding;
afterEach(() => {
  (cmol as { binding: typeof real }).binding = real;
});
const returning = (rows: unknown[][]) => {
  (cmol as { binding: typeof real }).binding = () => rows;
  return soilCall("SOIL.CMOL")!([]);
};
const asError = (v: unknown) => (v instanceof XlError ? `${v.code} ${v.message}` : v);

describe("a binding's result as an engine value", () => {
  it.each([
    [Infinity, "#NUM! a result was not a finite number"],
    [-Infinity, "#NUM! a result was not a finite number"],
    [NaN, "#NUM! a result was not a finite number"],
    [1.5, 1.5],
    [0, 0],
    ["text", "text"],
    [true, true],
    [{}, "#VALUE! internal error: a result was neither number nor text"],
    [undefined, "#VALUE! internal error: a result was neither number nor text"],
  ])("a single cell %p gives %p", (v, want) => {
    expect(asError(returning([[v]]))).toEqual(want);
  });
  it("each element of a spill is turned on its own: a non-finite one is #NUM!, its neighbours stay", () => {
    const r = returning([
      [1, Infinity],
      [NaN, "x"],
    ]) as XlArray;
    expect(r).toBeInstanceOf(XlArray);
    expect([r.rows, r.cols]).toEqual([2, 2]);
    expect([0, 1, 2, 3].map((i) => asError(r.data[i]))).toEqual([1, "#NUM! a result was not a finite number", "#NUM! a result was not a finite number", "x"]);
  });
  it("the real binding, for comparison: 400.78 mg/kg Ca is 2 cmol(+)/kg (source: IUPAC/CIAAW atomic weights, as tests/core)", () => {
    expect(soilCall("SOIL.CMOL")!([[[400.78]], [["Ca"]]] as never)).toBeCloseTo(2, 12);
  });
  it("a name that is not ours has no call", () => {
    expect(soilCall("SOIL.NOPE")).toBeUndefined();
  });
});
