/**
 * The binding layer: broadcasting, blanks, numeric text and error mapping, through the units
 * bindings. Inputs are invented; expected values follow from the catalogue's conventions.
 */
import { convert, cmol } from "../../src/functions/units";
import { PlainHostError, broadcastShape, specOf } from "../../src/functions/_binding";

const err = (v: unknown) => (v instanceof PlainHostError ? `${v.kind} ${v.message}` : undefined);

describe("binding layer", () => {
  it("a single value gives a 1×1 result", () => {
    expect(convert([[10]], [["mg/kg"]], [["kg/ha"]], [[15]], [[1.3]])).toEqual([[19.5]]);
  });
  it("scalars pass as they are (the engine may pass plain values)", () => {
    expect(convert(10 as never, "mg/kg" as never, "kg/ha" as never, 15 as never, 1.3 as never)[0]![0]).toBeCloseTo(19.5, 10);
  });
  it("a column broadcasts against single values", () => {
    const out = cmol([[200.39], [400.78], [""]], [["Ca"]]);
    expect(out[0]![0]).toBeCloseTo(1, 10);
    expect(out[1]![0]).toBeCloseTo(2, 10);
    expect(out[2]![0]).toBe(""); // blank in, blank out
  });
  it("same-shape ranges pair element by element", () => {
    const out = cmol([[200.39, 121.53]], [["Ca", "Mg"]]);
    expect(out[0]![0]).toBeCloseTo(1, 6);
    expect(out[0]![1]).toBeCloseTo(1, 3);
  });
  it("mismatched shapes are #VALUE! naming both shapes", () => {
    const out = cmol([[1], [2], [3]], [["Ca", "Mg"]]);
    expect(err(out[0]![0])).toBe("#VALUE! mg_per_kg is 3×1 but ion is 1×2; ranges must have the same shape, or be a single cell");
  });
  it("numeric text is accepted; '12,5', '<0.5' and 'n.d.' are not", () => {
    expect(cmol([["200.39"]], [["Ca"]])[0]![0]).toBeCloseTo(1, 10);
    expect(err(cmol([["12,5"]], [["Ca"]])[0]![0])).toMatch(/^#VALUE! mg_per_kg: "12,5" is not a number/);
    expect(err(cmol([["<0.5"]], [["Ca"]])[0]![0])).toMatch(/below- or above-detection value is your call/);
    expect(err(cmol([["n.d."]], [["Ca"]])[0]![0])).toMatch(/not a number/);
    expect(err(cmol([[true]], [["Ca"]])[0]![0])).toMatch(/not a number/);
  });
  it("an error element does not spoil the others", () => {
    const out = cmol([[200.39], [-5]], [["Ca"]]);
    expect(out[0]![0]).toBeCloseTo(1, 10);
    expect(err(out[1]![0])).toMatch(/^#VALUE! mg_per_kg must be at least 0/);
  });
  it("omitted optional arguments (null from Excel) take their defaults; missing required ones are named", () => {
    expect(err(convert([[10]], [["mg/kg"]], [["kg/ha"]], null as never, null as never)[0]![0])).toMatch(/needs depth_cm/);
    expect(err(convert([[10]], [["mg/kg"]], null as never)[0]![0])).toBe("#VALUE! to_unit is required");
  });
  it("every binding declares its parameters", () => {
    expect(specOf(convert)?.params.map((p) => p.name)).toEqual(["value", "from_unit", "to_unit", "depth_cm", "bulk_density"]);
  });
  it("ambiguous unit words are #VALUE! naming the unambiguous spellings (issue 22 point 5)", () => {
    expect(err(convert([[1]], [["cmol/kg"]], [["mmolc/kg"]])[0]![0])).toMatch(/^#VALUE! from_unit "cmol\/kg" is ambiguous/);
    expect(err(convert([[26]], [["mg/L"]], [["mg/kg"]], null as never, [[1.3]])[0]![0])).toMatch(/write mg\/dm3/);
    expect(err(convert([[1]], [["mg/ha"]], [["kg/ha"]])[0]![0])).toMatch(/write Mg\/ha or t\/ha/);
    expect(convert([[1]], [["Mg/ha"]], [["kg/ha"]])).toEqual([[1000]]);
  });
  it("broadcastShape: 1×1 pairs with anything", () => {
    expect(broadcastShape([{ name: "a", shape: { rows: 1, cols: 1 } }, { name: "b", shape: { rows: 4, cols: 2 } }])).toEqual({ rows: 4, cols: 2 });
  });
});
