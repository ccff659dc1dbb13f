/**
 * The bands bindings: a season's column against one set of limits, blank in / blank out, error
 * elements, whole-range arguments and #N/A. Limits and values are invented unless a Source is named.
 */
import { band, bandpos, sufficiency, removal, buildup } from "../../src/functions/bands";
import metadata from "../../generated/functions.json";
import { aboutFunction } from "../../src/core/about";
import { SUFFICIENCY_ROWS } from "../../src/core/bands/sufficiency";
import { PlainHostError, specOf } from "../../src/functions/_binding";

const err = (v: unknown) => (v instanceof PlainHostError ? `${v.kind} ${v.message}` : undefined);

const LIMITS = [[10], [20], [30], [40]]; // invented, a column range

describe("SOIL.BAND", () => {
  it("a column of values against a column of limits spills one label per value; blank stays blank", () => {
    const out = band([[5], [20], [""], [45], [null]], LIMITS);
    expect(out).toEqual([["Very low"], ["Optimum"], [""], ["Very high"], [""]]);
  });
  it("own labels from a row range", () => {
    expect(band([[25]], [[10, 20, 30]], [["bajo", "medio", "alto", "muy alto"]])).toEqual([["alto"]]);
  });
  it("limits not ascending: every element is #VALUE! with the reason", () => {
    const out = band([[5], [15]], [[10], [30], [20], [40]]);
    expect(err(out[0]![0])).toMatch(/^#VALUE! limits must be strictly ascending/);
    expect(err(out[1]![0])).toMatch(/^#VALUE! limits must be strictly ascending/);
  });
  it("three limits without labels: #VALUE! asking for four labels", () => {
    expect(err(band([[5]], [[10, 20, 30]])[0]![0])).toMatch(/^#VALUE! .*give labels \(4 of them\)/);
  });
  it("a text value is #VALUE! for that element only", () => {
    const out = band([[25], ["<5"]], LIMITS);
    expect(out[0]![0]).toBe("Optimum");
    expect(err(out[1]![0])).toMatch(/^#VALUE! value: "<5" is not a number/);
  });
  it("declares its parameters in catalogue order", () => {
    expect(specOf(band)?.params.map((p) => p.name)).toEqual(["value", "limits", "labels"]);
    expect(specOf(bandpos)?.params.map((p) => p.name)).toEqual(["value", "limits"]);
  });
});

describe("SOIL.BANDPOS", () => {
  it("positions for a column; not clamped at the ends", () => {
    expect(bandpos([[10], [25], [5], [60]], LIMITS)).toEqual([[0], [1.5], [-0.5], [5]]);
  });
  it("one limit is not enough", () => {
    expect(err(bandpos([[5]], [[10]])[0]![0])).toMatch(/^#VALUE! band position needs at least two limits/);
  });
});

describe("SOIL.SUFFICIENCY", () => {
  // Source: Culman et al. (2020) Tri-State Bull. 974 via OSU Ag BMPs (seen): Mehlich-3 P critical level
  // 20 ppm in a corn/soybean rotation, 30 ppm when the rotation includes wheat or alfalfa.
  it("a column of Mehlich-3 P values for a corn-soybean rotation", () => {
    expect(sufficiency([["P"]], [[15], [25], [""]], [["corn-soybean"]], [["Mehlich-3"]])).toEqual([["Deficient"], ["Optimal"], [""]]);
  });
  it("a rotation column picks the critical level row by row", () => {
    expect(sufficiency([["P"]], [[25]], [["corn-soybean"], ["corn-soybean-wheat"]], [["M3"]])).toEqual([["Optimal"], ["Deficient"]]);
  });
  it("corn alone is #VALUE! saying how to pass the rotation", () => {
    expect(err(sufficiency([["P"]], [[25]], [["corn"]], [["Mehlich-3"]])[0]![0])).toMatch(/^#VALUE! .*corn-soybean/);
  });
  it("the table argument: a built-in id in one cell, or your own table as a range", () => {
    // Source: Jones et al. (1980) Agron. J. 72:1043 (abstract, seen): subclover S 0.08 % at 133 days.
    expect(sufficiency([["S"]], [[0.1]], [["subclover"]], [["tissue"]], null as never, [["jones1980-subclover-tissue-s-133d"]])).toEqual([["At or above critical level"]]);
    const own = [["Cl", "water", "", "Low", 20, "Adequate"]]; // invented
    expect(sufficiency([["Cl"]], [[10], [20]], null as never, [["water"]], null as never, own)).toEqual([["Low"], ["Adequate"]]);
  });
  // Source: A&L Great Lakes summary of Bull. 974: K critical 100 ppm at CEC ≤ 5, 120 ppm above.
  it("a CEC column picks the K row element by element", () => {
    expect(sufficiency([["K"]], [[110], [110]], [["corn"]], [["M3"]], [[4], [15]])).toEqual([["Optimal"], ["Deficient"]]);
  });
  it("no table for the combination: #N/A with the combinations that exist", () => {
    const v = sufficiency([["P"]], [[30]], [["barley"]], [["Colwell"]])[0]![0];
    expect(v).toBeInstanceOf(PlainHostError);
    expect((v as PlainHostError).kind).toBe("#N/A");
    expect((v as PlainHostError).message).toMatch(/P Colwell \(wheat; mg\/kg\)/);
  });
  it("omitted method is #VALUE! listing the methods", () => {
    expect(err(sufficiency([["P"]], [[30]], [["corn"]])[0]![0])).toMatch(/^#VALUE! method is needed/);
  });
});

describe("SOIL.REMOVAL", () => {
  // Source: OMAFA Field Crop News (2025) 'Crop Removal Values': corn P2O5 6.6-7.9 kg/t (midpoint 7.25, derived).
  it("a column of yields, one crop and nutrient", () => {
    const out = removal([["corn"]], [[10], [""], [12]], [["P2O5"]], [["t/ha"]]);
    expect(out[0]![0]).toBeCloseTo(72.5, 9);
    expect(out[1]![0]).toBe("");
    expect(out[2]![0]).toBeCloseTo(87, 9);
  });
  it("crops and nutrients broadcast together; a missing coefficient is #N/A for that element", () => {
    const out = removal([["peas"], ["peas"]], [[4]], [["P2O5"], ["N"]], [["t/ha"]]);
    expect(out[0]![0]).toBeCloseTo(36, 9);
    expect((out[1]![0] as PlainHostError).kind).toBe("#N/A");
  });
  it("yield_unit is required (issue 22 point 3): omitted is #VALUE! listing the yield units", () => {
    expect(err(removal([["corn"]], [[180]], [["K2O"]], null as never)[0]![0])).toMatch(/^#VALUE! yield_unit is required: .*bu\/ac/);
  });
  it("Mg/ha is tonnes per hectare; mg/ha is #VALUE! (issue 22 point 5)", () => {
    expect(removal([["corn"]], [[10]], [["P2O5"]], [["Mg/ha"]])[0]![0]).toBeCloseTo(72.5, 9);
    expect(err(removal([["corn"]], [[10]], [["P2O5"]], [["mg/ha"]])[0]![0])).toMatch(/^#VALUE! yield_unit "mg\/ha"/);
  });
  it("bu/ac in, lb/ac out", () => {
    expect(removal([["corn"]], [[200]], [["K2O"]], [["bu/ac"]], [["lb/ac"]])[0]![0]).toBeCloseTo(54.88, 2);
  });
  it("declares crop_yield (yield is a reserved word in strict-mode TypeScript)", () => {
    expect(specOf(removal)?.params.map((p) => p.name)).toEqual(["crop", "crop_yield", "nutrient", "yield_unit", "rate_unit"]);
  });
});

describe("SOIL.BUILDUP", () => {
  // Source: LaBarge, OSU Extension (SUF-06): 20 lb P2O5/A per ppm; Tri-State four-year build-up.
  it("a column of soil tests against one critical level; omitted years = 4", () => {
    expect(buildup([[10], [15], [30], [""]], [[15]], [[20]])).toEqual([[25], [0], [0], [""]]);
  });
  it("given years", () => {
    expect(buildup([[10]], [[15]], [[20]], [[2]])).toEqual([[50]]);
  });
  it("a zero buffer factor is #VALUE!", () => {
    expect(err(buildup([[10]], [[15]], [[0]])[0]![0])).toMatch(/^#VALUE! buffer_factor must be greater than 0/);
  });
});

describe("SOIL.SUFFICIENCY's help and ABOUT list what exists", () => {
  const meta = (metadata.functions as { id: string; parameters: { name: string; description?: string }[] }[]).find((f) => f.id === "SUFFICIENCY")!;
  const param = (name: string) => meta.parameters.find((p) => p.name === name)!.description ?? "";
  it("every nutrient and method of a built-in table is named in the help and in ABOUT", () => {
    const about = aboutFunction("SUFFICIENCY");
    for (const r of SUFFICIENCY_ROWS) {
      expect(param("nutrient")).toContain(r.nutrient);
      expect(param("method")).toContain(r.method);
      expect(about).toContain(r.method === "tissue" ? "tissue" : r.method);
    }
  });
  it("the help says how to pass a rotation and a table", () => {
    expect(param("crop")).toMatch(/corn-soybean-wheat/);
    expect(param("table")).toMatch(/range/);
  });
  it("the help and ABOUT say where unit and depth_cm are needed, from the tables themselves", () => {
    const about = aboutFunction("SUFFICIENCY");
    for (const r of SUFFICIENCY_ROWS) {
      if (r.depth_cm !== undefined) {
        expect(param("depth_cm")).toContain(r.method === "KCl-40" ? `KCl-40 S ${r.depth_cm}` : `pasture Bray and Olsen P ${r.depth_cm}`);
        expect(about).toContain(`${r.depth_cm}`);
      }
    }
    expect(param("unit")).toMatch(/Needed for Olsen P/);
    expect(param("crop")).toMatch(/read before a crop-independent one/);
    expect(about).toMatch(/unit: needed for Olsen P/);
  });
  it("SUFFICIENCY spills over a column of S values with the sampling depth (Anderson et al. 2013, 0-30 cm canola CSTR 6.8-7.5; values invented)", () => {
    expect(sufficiency([["S"]], [[6], [7], [8], [""]], [["canola"]], [["KCl-40"]], null as never, null as never, null as never, [[30]])).toEqual([
      ["Below critical range"],
      ["Critical range (90 % of maximum yield)"],
      ["Above critical range"],
      [""],
    ]);
  });
});
