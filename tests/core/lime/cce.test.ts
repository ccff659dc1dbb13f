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
import { errorCode as code, errorMessage as message } from "../../helpers/errors";

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

describe("messages and boundaries (invented analyses; probes of the code's own limits)", () => {
  const FORMS_LISTED = "CaCO3, MgCO3, CaMg(CO3)2, CaO, MgO, Ca(OH)2, Mg(OH)2, Ca or Mg";
  it("an unknown form is named as a form, listing the accepted ones", () => {
    expect(message(() => limeCceFactor("CaSO4"))).toBe(`unknown form "CaSO4"; use ${FORMS_LISTED}`);
    expect(message(() => limeCce([50], ["CaSO4"]))).toBe(`unknown form "CaSO4"; use ${FORMS_LISTED}`);
  });
  it("counts that differ are SHAPE_MISMATCH giving both counts", () => {
    expect(code(() => limeCce([50, 40], ["CaCO3"]))).toBe("SHAPE_MISMATCH");
    expect(message(() => limeCce([50, 40], ["CaCO3"]))).toBe("analysis_pct has 2 values but forms has 1; give one form per percentage");
    expect(message(() => limeCce([50], ["CaCO3", "MgO"]))).toBe("analysis_pct has 1 values but forms has 2; give one form per percentage");
  });
  it("the empty-analysis refusal lists the components", () => {
    expect(message(() => limeCce([], []))).toBe(`the analysis is empty: give the % of each component (${FORMS_LISTED})`);
  });
  it("a form twice, and an element with its compound, are named (whichever comes first)", () => {
    expect(message(() => limeCce([40, 40], ["CaCO3", "calcite"]))).toBe("CaCO3 is given twice; give each component once");
    expect(message(() => limeCce([20, 30], ["CaCO3", "Ca"]))).toBe("Ca and CaCO3 both count Ca: give Ca as an element or as its compounds, not both");
    expect(message(() => limeCce([30, 20], ["Ca", "CaCO3"]))).toBe("Ca and CaCO3 both count Ca: give Ca as an element or as its compounds, not both");
  });
  it("two compounds holding the same element are fine (only an element with its compounds counts twice)", () => {
    // 50 % dolomite + 30 % CaO: 50 × 1.0855 + 30 × 1.7848 (stoichiometric factors, derived)
    expect(limeCce([50, 30], ["CaMg(CO3)2", "CaO"])).toBeCloseTo(50 * limeCceFactor("dolomite") + 30 * limeCceFactor("CaO"), 9);
    expect(limeCce([50, 30], ["CaMg(CO3)2", "MgO"])).toBeCloseTo(50 * limeCceFactor("dolomite") + 30 * limeCceFactor("MgO"), 9);
  });
  it("a percentage out of range names its component and the unit", () => {
    expect(message(() => limeCce([-1, 50], ["CaCO3", "MgCO3"]))).toBe("analysis_pct (CaCO3) must be from 0 to 100 % (got -1 %)");
  });
  it("the total: exactly 101 % is allowed, beyond 101 % + 1e-9 is refused with the total shown", () => {
    expect(limeCce([100, 1], ["CaCO3", "MgCO3"])).toBeCloseTo(100 + limeCceFactor("MgCO3"), 9);
    const atLimit = 100 + 1 + 1e-9 - 100; // 100 + this adds up to the limit itself
    expect(limeCce([100, atLimit], ["CaCO3", "MgCO3"])).toBeGreaterThan(100);
    expect(code(() => limeCce([100, 1.00001], ["CaCO3", "MgCO3"]))).toBe("OUT_OF_RANGE");
    expect(message(() => limeCce([95, 6.5], ["CaCO3", "MgCO3"]))).toBe(
      "the components add up to 101.5 %; a material cannot hold more than 100 % (1 % allowed for rounding)",
    );
  });
  it("a total of exactly 1 % is refused as fractions; just above is accepted", () => {
    expect(code(() => limeCce([1], ["CaCO3"]))).toBe("OUT_OF_RANGE");
    expect(limeCce([1.01], ["CaCO3"])).toBeCloseTo(1.01, 12);
    expect(message(() => limeCce([0.9, 0.05], ["CaCO3", "MgCO3"]))).toBe(
      "the components add up to 0.95 %, too little for a liming material; if these are fractions (0.9 for 90 %), enter percentages",
    );
  });
  it("ranges: a ragged 2-row range is 2-D, named in the refusal", () => {
    expect(message(() => limeCceOfRanges([[90], [5, 3]], [["CaCO3"], ["MgCO3"], ["MgO"]]))).toBe("analysis_pct must be a single row or column (it is 2×2)");
    expect(message(() => limeCceOfRanges([[90, 5]], [["CaCO3", "MgCO3"], ["Ca", "Mg"]]))).toBe("forms must be a single row or column (it is 2×2)");
  });
  it("ranges: cell counts that differ are refused giving both", () => {
    expect(message(() => limeCceOfRanges([[90, 5]], [["CaCO3"]]))).toBe("analysis_pct has 2 cells but forms has 1; give one form per percentage");
  });
  it("ranges: pairs of spaces are blank pairs and ignored", () => {
    expect(limeCceOfRanges([[90, "  "]], [["CaCO3", " "]])).toBeCloseTo(90, 12);
    expect(limeCceOfRanges([[90, null]], [["CaCO3", "\t"]])).toBeCloseTo(90, 12);
  });
  it("ranges: a blank or numeric form is refused, placed by cell", () => {
    expect(message(() => limeCceOfRanges([[90, 5]], [["CaCO3", null]]))).toBe(`forms cell 2 is blank: name the component (${FORMS_LISTED})`);
    expect(message(() => limeCceOfRanges([[90, 5]], [["CaCO3", "  "]]))).toBe(`forms cell 2 is blank: name the component (${FORMS_LISTED})`);
    expect(code(() => limeCceOfRanges([[90, 5]], [["CaCO3", 7]]))).toBe("MISSING_INPUT");
    expect(message(() => limeCceOfRanges([[90, 5]], [["CaCO3", 7]]))).toBe(`forms cell 2 is the number 7: name the component (${FORMS_LISTED})`);
    expect(message(() => limeCceOfRanges([[5, 90]], [[7, "CaCO3"]]))).toBe(`forms cell 1 is the number 7: name the component (${FORMS_LISTED})`);
  });
  it("ranges: a blank or text percentage names the component, trimmed", () => {
    expect(message(() => limeCceOfRanges([[90, null]], [["CaCO3", " MgCO3 "]]))).toBe("analysis_pct for MgCO3 is blank; enter 0 if the product has none");
    expect(message(() => limeCceOfRanges([[90, "n.d."]], [["CaCO3", " MgCO3 "]]))).toBe('analysis_pct for MgCO3: "n.d." is not a number');
  });
  it("ranges: numeric text with spaces is read; a boolean is text, not a number", () => {
    expect(limeCceOfRanges([[" 90 ", "5"]], [["CaCO3", "MgCO3"]])).toBeCloseTo(limeCce([90, 5], ["CaCO3", "MgCO3"]), 12);
    expect(code(() => limeCceOfRanges([[true]], [["CaCO3"]]))).toBe("NOT_A_NUMBER");
    expect(message(() => limeCceOfRanges([[true]], [["CaCO3"]]))).toBe('analysis_pct for CaCO3: "true" is not a number');
    expect(code(() => limeCceOfRanges([[90]], [[false]]))).toBe("UNKNOWN_NAME"); // a boolean form is the word FALSE, not a component
  });
});
