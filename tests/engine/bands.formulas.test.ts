/**
 * The bands functions through the headless engine: limits as array literals, spills, defaults,
 * blanks and errors. Limits of 10, 20, 30, 40 are invented; published values: Source as in
 * tests/core/bands/sufficiency.test.ts and removal.test.ts (Tri-State 2020 via OSU Ag BMPs and
 * A&L Great Lakes; Northern Ireland S.R. 2019/81; OMAFA 2025 removal table; LaBarge, OSU, SUF-06).
 */
import { evaluateFormula } from "../../src/engine/evaluate";

const value = (f: string) => evaluateFormula(f).value;

describe("band formulas", () => {
  it("SOIL.BAND with limits as an array literal and the default labels; a limit is in the band above", () => {
    expect(value("=SOIL.BAND(20,{10,20,30,40})")).toBe("Optimum");
    expect(value("=SOIL.BAND(5,{10;20;30;40})")).toBe("Very low");
  });
  it("SOIL.BAND over a column of values spills, blank in blank out", () => {
    expect(value('=SOIL.BAND({5;25;"";45},{10,20,30,40})')).toEqual([["Very low"], ["Optimum"], [""], ["Very high"]]);
  });
  it("own labels", () => {
    expect(value('=SOIL.BAND(25,{10,20,30},{"muy bajo","bajo","medio","alto"})')).toBe("medio");
  });
  it("limits not ascending and missing labels are #VALUE! with the reason", () => {
    expect(evaluateFormula("=SOIL.BAND(5,{10,30,20,40})")).toMatchObject({ error: "#VALUE!" });
    expect(evaluateFormula("=SOIL.BAND(5,{10,30,20,40})").message).toMatch(/strictly ascending/);
    expect(evaluateFormula("=SOIL.BAND(5,{10,20,30})").message).toMatch(/give labels \(4 of them\)/);
  });
  it("SOIL.BANDPOS interpolates and runs on half a band at the ends", () => {
    expect(value("=SOIL.BANDPOS(25,{10,20,30,40})")).toBeCloseTo(1.5, 12);
    expect(value("=SOIL.BANDPOS({5;45},{10,20,30,40})")).toEqual([[-0.5], [3.5]]);
  });
});

describe("sufficiency, removal and build-up formulas", () => {
  // Source: Culman et al. (2020) Tri-State Bull. 974 via OSU Ag BMPs (seen): Mehlich-3 P critical level 20 ppm
  // in a corn/soybean rotation, 30 ppm with wheat or alfalfa; NI S.R. 2019/81 Olsen index (seen).
  it("SOIL.SUFFICIENCY: Mehlich-3 P by rotation, Mehlich-3 K by CEC, Olsen index", () => {
    expect(value('=SOIL.SUFFICIENCY("P",25,"corn-soybean","Mehlich-3")')).toBe("Optimal");
    expect(value('=SOIL.SUFFICIENCY("P",25,"corn-soybean-wheat","Mehlich-3")')).toBe("Deficient");
    expect(value('=SOIL.SUFFICIENCY("K",110,"corn","Mehlich-3",{4;15})')).toEqual([["Optimal"], ["Deficient"]]);
    expect(value('=SOIL.SUFFICIENCY("P",23,,"Olsen",,,"mg/dm3")')).toBe("Index 2+");
    // Olsen P is reported per kg and per litre of soil: without the unit it is refused, never read against the index.
    expect(evaluateFormula('=SOIL.SUFFICIENCY("P",13,"wheat","Olsen")').message).toMatch(/^unit is needed/);
  });
  it("SOIL.SUFFICIENCY: KCl-40 S takes the sampling depth, and the wheat table only when named (Anderson et al. 2013; GRDC 2014 fact sheet)", () => {
    expect(value('=SOIL.SUFFICIENCY("S",{6;7.2},"canola","KCl-40",,,,30)')).toEqual([["Below critical range"], ["Critical range (90 % of maximum yield)"]]);
    expect(evaluateFormula('=SOIL.SUFFICIENCY("S",4,"canola","KCl-40")').message).toMatch(/^depth_cm is needed/);
    expect(value('=SOIL.SUFFICIENCY("S",4,"wheat","KCl-40",,"anderson2013-kcl40-s-wheat",,30)')).toBe("Above critical range");
    expect(evaluateFormula('=SOIL.SUFFICIENCY("S",4,"wheat","KCl-40",,,,30)').message).toMatch(/read only when named/);
  });
  it("SOIL.SUFFICIENCY without a table is #N/A with the message", () => {
    const r = evaluateFormula('=SOIL.SUFFICIENCY("P",30,"barley","Colwell")');
    expect(r.error).toBe("#N/A");
    expect(r.message).toMatch(/no P Colwell table for barley/);
  });
  it("SOIL.SUFFICIENCY with your own table as a range (invented limits)", () => {
    expect(value('=SOIL.SUFFICIENCY("Cl",{10;20},,"water",,{"Cl","water","","Low",20,"Adequate"})')).toEqual([["Low"], ["Adequate"]]);
  });
  it("SOIL.REMOVAL: t/ha in, kg/ha out by default; bu/ac in, lb/ac out", () => {
    expect(value('=SOIL.REMOVAL("corn",10,"P2O5","t/ha")')).toBeCloseTo(72.5, 9);
    expect(value('=SOIL.REMOVAL("corn",200,"K2O","bu/ac","lb/ac")')).toBeCloseTo(54.88, 2);
  });
  it("SOIL.REMOVAL's yield_unit is required (issue 22 point 3): left empty it is #VALUE! listing the units", () => {
    const r = evaluateFormula('=SOIL.REMOVAL("corn",180,"K2O",)');
    expect(r.error).toBe("#VALUE!");
    expect(r.message).toMatch(/^yield_unit is required: .*bu\/ac/);
  });
  it("Mg/ha is tonnes per hectare; mg/ha is refused (issue 22 point 5)", () => {
    expect(value('=SOIL.REMOVAL("corn",10,"P2O5","Mg/ha")')).toBeCloseTo(72.5, 9);
    expect(evaluateFormula('=SOIL.REMOVAL("corn",10,"P2O5","mg/ha")').message).toMatch(/write Mg\/ha or t\/ha/);
  });
  it("SOIL.BUILDUP with the default four years, and 0 at or above the target", () => {
    expect(value("=SOIL.BUILDUP(10,15,20)")).toBeCloseTo(25, 12);
    expect(value("=SOIL.BUILDUP({10;20},15,20)")).toEqual([[25], [0]]);
  });
  it("SOIL.ABOUT has a line for each bands function, with the caution where rates are given", () => {
    for (const id of ["BAND", "BANDPOS", "SUFFICIENCY", "REMOVAL", "BUILDUP"]) {
      expect(typeof value(`=SOIL.ABOUT("${id}")`)).toBe("string");
    }
    expect(value('=SOIL.ABOUT("REMOVAL")')).toMatch(/Results are estimates/);
    expect(value('=SOIL.ABOUT("BUILDUP")')).toMatch(/Results are estimates/);
  });
});
