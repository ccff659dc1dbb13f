/**
 * SOIL.CCE in core: a liming material's calcium carbonate equivalent from its analysis, by
 * stoichiometry from IUPAC atomic weights. Checked against the neutralizing values of pure forms in
 * the University of Nebraska-Lincoln PASSEL lesson 'Soil acidity', Table 4.4 (seen; the lesson
 * computes from rounded molecular weights: MgO 40, so 250 %), and the calcite and dolomite
 * compositions of the Minnesota Department of Agriculture page 'Dolomite or calcite ag lime: what
 * is best?' (seen: calcite 40 % Ca and 0-0.6 % Mg; dolomite 21.7 % Ca and 13.1 % Mg).
 */
import fc from "fast-check";
import { CCE_FORMS, limeCce, limeCceFactor, limeCceOfRanges } from "../../../src/core/lime/cce";
import { limeProductRate } from "../../../src/core/lime/product";
import { errorCode as code } from "../../helpers/errors";

describe("CCE of pure forms (UNL PASSEL Table 4.4, seen)", () => {
  it.each([
    ["CaCO3", 100, 0],
    ["MgCO3", 119, 0.5],
    ["Ca(OH)2", 135, 0.5],
    ["Mg(OH)2", 172, 0.5],
    ["CaO", 178, 0.55],
  ])("100 %% %s is %s %% CCE (to the table's rounding)", (form, printed, tol) => {
    expect(Math.abs(limeCce([100], [form as string]) - (printed as number))).toBeLessThanOrEqual((tol as number) + 1e-9);
  });
  it("MgO: the table's 250 % comes from a molecular weight of 40; IUPAC weights give 248.3 %", () => {
    expect(limeCce([100], ["MgO"])).toBeCloseTo(248.3, 1);
    expect(limeCceFactor("MgO") * 40.304 / 40).toBeCloseTo(2.5, 2);
  });
  it("pure dolomite CaMg(CO3)2 is 108.6 % (derived, published-values OXI-11)", () => {
    expect(limeCce([100], ["dolomite"])).toBeCloseTo(108.55, 2);
  });
});

describe("CCE from an element analysis (MN Dept. of Agriculture compositions, seen; CCE derived)", () => {
  it("dolomite as 21.7 % Ca and 13.1 % Mg is 108.1 %, the compound's 108.6 % to the composition's rounding", () => {
    expect(limeCce([21.7, 13.1], ["Ca", "Mg"])).toBeCloseTo(108.14, 2);
  });
  it("calcite as 40 % Ca is 99.9 %, pure CaCO3 to the rounding of 40.04 % Ca", () => {
    expect(limeCce([40], ["Ca"])).toBeCloseTo(99.89, 2);
  });
  it("an element and a compound analysis of the same material agree", () => {
    // 90 % CaCO3 + 5 % MgCO3 holds 36.04 % Ca and 1.441 % Mg (derived).
    const ca = (90 * 40.078) / 100.086;
    const mg = (5 * 24.305) / 84.313;
    expect(limeCce([ca, mg], ["Ca", "Mg"])).toBeCloseTo(limeCce([90, 5], ["CaCO3", "MgCO3"]), 9);
  });
});

describe("from the analysis to the product rate", () => {
  it("LIMEPRODUCT takes the computed CCE: 5 t/ha CaCO3 of a 90 % CaCO3 + 5 % MgCO3 product (CCE 95.9 %) is 5.21 t/ha", () => {
    const cce = limeCce([90, 5], ["CaCO3", "MgCO3"]);
    expect(cce).toBeCloseTo(95.935, 3);
    expect(limeProductRate(5, cce)).toBeCloseTo(5.212, 3);
  });
});

describe("ranges", () => {
  it("a row of percentages with a row of forms; blank pairs ignored", () => {
    expect(limeCceOfRanges([[90, 5, null]], [["CaCO3", "MgCO3", null]])).toBeCloseTo(95.935, 3);
    expect(limeCceOfRanges([[90], ["5"]], [["calcium carbonate"], ["MgCO3"]])).toBeCloseTo(95.935, 3);
  });
  it("a blank percentage is refused: enter 0 for a component the product does not have", () => {
    expect(code(() => limeCceOfRanges([[90, null]], [["CaCO3", "MgCO3"]]))).toBe("MISSING_INPUT");
  });
  it("a blank form, text for a percentage, or a 2-D range is refused", () => {
    expect(code(() => limeCceOfRanges([[90, 5]], [["CaCO3", null]]))).toBe("MISSING_INPUT");
    expect(code(() => limeCceOfRanges([[90, "n.d."]], [["CaCO3", "MgCO3"]]))).toBe("NOT_A_NUMBER");
    expect(code(() => limeCceOfRanges([[90, 5], [1, 1]], [["CaCO3", "MgCO3"], ["Ca", "Mg"]]))).toBe("SHAPE_MISMATCH");
    expect(code(() => limeCceOfRanges([[90, 5]], [["CaCO3"]]))).toBe("SHAPE_MISMATCH");
  });
});

describe("refusals", () => {
  it("an unknown form lists the accepted ones", () => {
    expect(code(() => limeCce([50], ["CaSO4"]))).toBe("UNKNOWN_NAME");
  });
  it("a form twice, or an element with its own compound, is refused (counted twice)", () => {
    expect(code(() => limeCce([40, 40], ["CaCO3", "calcite"]))).toBe("NOT_APPLICABLE");
    expect(code(() => limeCce([30, 20], ["Ca", "CaCO3"]))).toBe("NOT_APPLICABLE");
    expect(code(() => limeCce([30, 20], ["Mg", "dolomite"]))).toBe("NOT_APPLICABLE");
  });
  it("Ca as an element with Mg as a compound is fine (no element twice)", () => {
    expect(limeCce([36, 5], ["Ca", "MgCO3"])).toBeGreaterThan(90);
  });
  it("percentages outside 0-100, a total above 101, and fractions typed for percentages are refused", () => {
    expect(code(() => limeCce([-1, 50], ["CaCO3", "MgCO3"]))).toBe("OUT_OF_RANGE");
    expect(code(() => limeCce([101.5], ["CaCO3"]))).toBe("OUT_OF_RANGE");
    expect(code(() => limeCce([95, 6.5], ["CaCO3", "MgCO3"]))).toBe("OUT_OF_RANGE");
    expect(code(() => limeCce([0.9, 0.05], ["CaCO3", "MgCO3"]))).toBe("OUT_OF_RANGE");
    expect(limeCce([95.2, 5.1], ["CaCO3", "MgCO3"])).toBeGreaterThan(100); // 100.3 %: within the 1 % rounding allowance
  });
  it("an empty analysis is refused", () => {
    expect(code(() => limeCce([], []))).toBe("MISSING_INPUT");
  });
});

describe("properties", () => {
  it("CCE is the sum of each component's own CCE, and every form is accepted", () => {
    fc.assert(
      fc.property(fc.double({ min: 1.5, max: 50, noNaN: true }), fc.double({ min: 0, max: 50, noNaN: true }), (a, b) => {
        expect(limeCce([a, b], ["CaCO3", "MgO"])).toBeCloseTo(limeCce([a], ["CaCO3"]) + b * limeCceFactor("MgO"), 9);
      }),
    );
    for (const f of CCE_FORMS) expect(limeCceFactor(f)).toBeGreaterThan(0.9);
  });
});
