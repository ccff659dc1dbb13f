/**
 * The binding layer: broadcasting, blanks, numeric text and error mapping, through the units
 * bindings. Inputs are invented; expected values follow from the catalogue's conventions.
 */
import { convert, cmol } from "../../src/functions/units";
import { PlainHostError, broadcastShape, specOf, declare, hostErrorFor, numberOfCell, num, optText, text, range, cell } from "../../src/functions/_binding";
import * as errorsModule from "../../src/core/errors";
import * as bands from "../../src/functions/bands";
import * as nitrogen from "../../src/functions/nitrogen";

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

// ---------------------------------------------------------------------------------------------
// The layer itself, through small bindings declared here (values invented; no science involved).


const show = (v: unknown) => (v instanceof PlainHostError ? `${v.kind} ${v.message}` : v);
const shown = (out: unknown[][]) => out.map((r) => r.map(show));

/** Echoes what core would receive, so each shaping rule can be read off the result. */
function echoBinding(): void {}
const ECHO = declare(echoBinding, [range("table"), text("word"), optText("mode", "plain"), cell("reading")] as const, (table, word, mode, reading) =>
  JSON.stringify([table, word, mode, reading]),
);
const echo = (...a: unknown[]) => shown(ECHO(a));

describe("binding layer: cells, texts and whole ranges", () => {
  it("a plain Error (not a SoilError) becomes #VALUE! 'internal error: …'", () => {
    expect(show(hostErrorFor(new Error("boom")))).toBe("#VALUE! internal error: boom");
    expect(show(hostErrorFor("odd"))).toBe("#VALUE! internal error: odd");
  });
  it("a non-finite number in a cell is NOT_A_NUMBER naming the argument", () => {
    expect(() => numberOfCell(Infinity, "ca")).toThrow(expect.objectContaining({ code: "NOT_A_NUMBER", message: "ca is not a finite number" }));
    expect(show(cmol([[NaN]], [["Ca"]])[0]![0])).toBe("#VALUE! mg_per_kg is not a finite number");
  });
  it("text that is no number at all has no hint appended", () => {
    expect(show(cmol([["abc"]], [["Ca"]])[0]![0])).toBe('#VALUE! mg_per_kg: "abc" is not a number');
  });
  it("a text argument takes a number as its text but refuses a boolean", () => {
    expect(show(cmol([[200]], [[true]])[0]![0])).toBe("#VALUE! ion must be text (got true)");
    expect(echo([[1]], [[7]], [["m"]], [[2]])).toEqual([['[[[1]],"7","m",2]']]);
  });
  it("a blank optional text takes its default; a blank required text is named as required", () => {
    expect(echo([[1]], [["w"]], [[""]], [[2]])).toEqual([['[[[1]],"w","plain",2]']]);
    expect(echo([[1]], [["w"]], [["  "]], [[2]])).toEqual([['[[[1]],"w","plain",2]']]);
    expect(echo([[1]], [[""]], [["m"]], [[2]])).toEqual([["#VALUE! word is required"]]);
  });
  it("a whole range passes numbers, texts, booleans and blanks (as null) to core", () => {
    expect(echo([[1, "a"], [true, ""]], [["w"]], null, [[2]])).toEqual([['[[[1,"a"],[true,null]],"w","plain",2]']]);
  });
  it("a whole range holding an error value or another object is refused", () => {
    expect(echo([[1, new PlainHostError("#N/A", "x")]], [["w"]], null, [[2]])).toEqual([["#VALUE! table holds an error value"]]);
    expect(echo([[1, { a: 1 }]], [["w"]], null, [[2]])).toEqual([["#VALUE! table holds a value that is neither number nor text"]]);
  });
  it("a cell argument: blank in blank out, number or text as it stands, anything else refused", () => {
    expect(echo([[1]], [["w"]], null, [[""], [null], [3], ["<0.5"], [false]])).toEqual([
      [""],
      [""],
      ['[[[1]],"w","plain",3]'],
      ['[[[1]],"w","plain","<0.5"]'],
      ["#VALUE! reading must be a number or text (got false)"],
    ]);
  });
  it("too many arguments, and an empty range, are refused with the reason", () => {
    expect(shown((cmol as (...a: unknown[]) => unknown[][])([[1]], [["Ca"]], [[1]]))).toEqual([["#VALUE! too many arguments: at most 2"]]);
    expect(shown(cmol([], [["Ca"]]))).toEqual([["#VALUE! mg_per_kg is an empty range"]]);
    expect(shown(cmol([[]], [["Ca"]]))).toEqual([["#VALUE! mg_per_kg is an empty range"]]);
  });
  it("ranges with the same rows but different columns (or the reverse) do not pair", () => {
    const two = (a: { rows: number; cols: number }, b: { rows: number; cols: number }) =>
      broadcastShape([
        { name: "a", shape: a },
        { name: "b", shape: b },
      ]);
    expect(two({ rows: 2, cols: 3 }, { rows: 2, cols: 2 })).toEqual({ error: "a is 2×3 but b is 2×2; ranges must have the same shape, or be a single cell" });
    expect(two({ rows: 3, cols: 2 }, { rows: 2, cols: 2 })).toEqual({ error: "a is 3×2 but b is 2×2; ranges must have the same shape, or be a single cell" });
    expect(two({ rows: 2, cols: 2 }, { rows: 2, cols: 2 })).toEqual({ rows: 2, cols: 2 });
    expect(shown(cmol([[1, 2, 3]], [["Ca", "Mg"]]))).toEqual([["#VALUE! mg_per_kg is 1×3 but ion is 1×2; ranges must have the same shape, or be a single cell"]]);
  });
  it("an element that computes a non-finite number is #VALUE!, not NaN in a cell", () => {
    function nanBinding(): void {}
    const NAN = declare(nanBinding, [num("x")] as const, (x) => x / 0 - x / 0);
    expect(shown(NAN([[[1]]]))).toEqual([["#VALUE! internal error: a result was not a finite number"]]);
  });
});

describe("binding layer: the code of each refusal made here", () => {
  // Hosts receive a refusal's kind and message only, so the code is read where the layer maps it.
  const codesOf = (f: () => unknown): string[] => {
    const spy = jest.spyOn(errorsModule, "errorKindOf");
    try {
      f();
      return spy.mock.calls.map((c) => c[0]);
    } finally {
      spy.mockRestore();
    }
  };
  it("a value of the wrong type is NOT_A_NUMBER", () => {
    expect(codesOf(() => cmol([[200]], [[true]]))).toEqual(["NOT_A_NUMBER"]);
    expect(codesOf(() => echo([[new PlainHostError("#N/A", "x")]], [["w"]], null, [[2]]))).toEqual(["NOT_A_NUMBER"]);
    expect(codesOf(() => echo([[{}]], [["w"]], null, [[2]]))).toEqual(["NOT_A_NUMBER"]);
    expect(codesOf(() => echo([[1]], [["w"]], null, [[false]]))).toEqual(["NOT_A_NUMBER"]);
    // A number argument given a boolean, and given text that is not a number.
    expect(codesOf(() => cmol([[true]], [["K"]]))).toEqual(["NOT_A_NUMBER"]);
    expect(codesOf(() => cmol([["abc"]], [["K"]]))).toEqual(["NOT_A_NUMBER"]);
  });
  it("a required argument left out is MISSING_INPUT", () => {
    expect(codesOf(() => convert([[10]], [["mg/kg"]], null as never))).toEqual(["MISSING_INPUT"]);
  });
  it("too many arguments, an empty range and ranges that do not pair are SHAPE_MISMATCH", () => {
    expect(codesOf(() => (cmol as (...a: unknown[]) => unknown[][])([[1]], [["Ca"]], [[1]]))).toEqual(["SHAPE_MISMATCH"]);
    expect(codesOf(() => cmol([[]], [["Ca"]]))).toEqual(["SHAPE_MISMATCH"]);
    expect(codesOf(() => cmol([[1, 2, 3]], [["Ca", "Mg"]]))).toEqual(["SHAPE_MISMATCH"]);
  });
});

describe("binding layer: cells a host may hand over", () => {
  it("a cell holding undefined inside a range is blank, as null is", () => {
    expect(cmol([[undefined], [null], [391.0]], [["K"]]).map((r) => r[0])).toEqual(["", "", expect.any(Number)]);
  });
  it("no negative zero reaches a cell, on the element path and the column path", () => {
    // Invented arithmetic: -0 × x is -0 for a positive x.
    function negZero(): void {}
    const NEG = declare(negZero, [num("x")] as const, (x) => -0 * x, (v, n) => ({ values: new Float64Array(n).fill(-0), errors: new Map() }));
    const one = NEG([[[2]]])[0]![0];
    expect(Object.is(one, 0)).toBe(true);
    const column = NEG([Array.from({ length: 16 }, () => [2])]).map((r) => r[0]);
    expect(column.every((v) => Object.is(v, 0))).toBe(true);
  });
});

describe("binding layer: what the help page says a needed argument needs", () => {
  // scripts/help.js prints `needed <words>` for these; the words are the declarations' own.
  const neededOf = (f: Function) => Object.fromEntries((specOf(f)?.params ?? []).filter((p) => "needed" in p).map((p) => [p.name, (p as { needed?: string }).needed]));
  it("each argument Excel lists as optional but the function needs says when", () => {
    expect(neededOf(bands.sufficiency)).toEqual({ method: "unless table names a built-in table or is your own" });
    expect(neededOf(nitrogen.nfixed)).toEqual({ root_factor: "always: there is no default factor" });
    expect(neededOf(nitrogen.nfixdm)).toEqual({ kg_n_per_t: "always: there is no default rule" });
  });
});
