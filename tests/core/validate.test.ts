/**
 * Declared bounds and the percent ranges (issue 22 point 4): every percent argument's plausible
 * range is declared once in PERCENT, each bound is probed at the limit, just inside and just
 * outside, and a value that looks like a fraction (Excel keeps a cell shown as 95 % as 0.95) is
 * refused with a hint. The ranges' sources are named in validate.ts beside each range.
 */
import { Bound, check, finite, notANumberHint, numericText, PERCENT, percentListLooksFractional } from "../../src/core/validate";
import { limeProductRate } from "../../src/core/lime/product";
import { limeBaseSat } from "../../src/core/lime/methods";
import { errorCode, errorMessage } from "../helpers/errors";

const ok = (v: number, b: Bound) => expect(errorCode(() => check(v, b))).toBeUndefined();
const refused = (v: number, b: Bound) => expect(errorCode(() => check(v, b))).toBe("OUT_OF_RANGE");
const EPS = 1e-6;

/** [range, accepted edges (limit and just inside), refused just outside]. */
const EDGES: [string, Bound, number[], number[]][] = [
  ["cce_pct 5-250", PERCENT.cce, [5, 5 + EPS, 250, 250 - EPS], [5 - EPS, 250 + EPS]],
  ["fineness_pct above 1 to 100", PERCENT.fineness, [1 + EPS, 100, 100 - EPS], [1, 1 - EPS, 100 + EPS]],
  ["moisture_pct 0, or 1 to below 100", PERCENT.moisture, [0, 1, 1 + EPS, 100 - EPS], [EPS, 1 - EPS, 100, -EPS]],
  ["target_al_sat 0, or 1 to 100", PERCENT.targetAlSat, [0, 1, 1 + EPS, 100, 100 - EPS], [EPS, 1 - EPS, 100 + EPS, -EPS]],
  ["base_sat 0, or above 1 to 100", PERCENT.baseSat, [0, 1 + EPS, 100, 100 - EPS], [EPS, 1, 1 - EPS, 100 + EPS, -EPS]],
  ["target_base_sat 20-100", PERCENT.targetBaseSat, [20, 20 + EPS, 100, 100 - EPS], [20 - EPS, 100 + EPS]],
  ["ndfa_pct 0, or above 1 to 100", PERCENT.ndfa, [0, 1 + EPS, 100, 100 - EPS], [EPS, 1, 1 - EPS, 100 + EPS, -EPS]],
  ["shoot_n_pct 0, or 0.2-16", PERCENT.plantN("shoot_n_pct"), [0, 0.2, 0.2 + EPS, 16, 16 - EPS], [EPS, 0.2 - EPS, 16 + EPS, -EPS]],
];

describe("percent ranges: each bound at the limit, just inside and just outside", () => {
  describe.each(EDGES)("%s", (_name, bound, accepted, rejected) => {
    it.each(accepted)("accepts %d", (v) => ok(v, bound));
    it.each(rejected)("refuses %d (OUT_OF_RANGE)", (v) => refused(v, bound));
  });
  it("every range says where it comes from (a source, or common practice)", () => {
    const all = [PERCENT.cce, PERCENT.fineness, PERCENT.moisture, PERCENT.targetAlSat, PERCENT.baseSat, PERCENT.targetBaseSat, PERCENT.ndfa, PERCENT.plantN("x")];
    for (const b of all) {
      expect(b.unit).toBe("%");
      expect((b.basis ?? "").length).toBeGreaterThan(30);
    }
  });
});

describe("a fraction typed for a percent is refused with a hint", () => {
  it.each([
    // [range, value, hint] : the value × 100 lies in the range
    [PERCENT.cce, 0.95, "0.95 looks like a fraction; enter 95 for 95 %"],
    [PERCENT.cce, 2.48, "2.48 looks like a fraction; enter 248 for 248 %"],
    [PERCENT.fineness, 0.85, "0.85 looks like a fraction; enter 85 for 85 %"],
    [PERCENT.fineness, 1, "1 looks like a fraction; enter 100 for 100 %"],
    [PERCENT.moisture, 0.3, "0.3 looks like a fraction; enter 30 for 30 %"],
    [PERCENT.targetAlSat, 0.2, "0.2 looks like a fraction; enter 20 for 20 %"],
    [PERCENT.baseSat, 0.5, "0.5 looks like a fraction; enter 50 for 50 %"],
    [PERCENT.targetBaseSat, 0.7, "0.7 looks like a fraction; enter 70 for 70 %"],
    [PERCENT.ndfa, 0.82, "0.82 looks like a fraction; enter 82 for 82 %"],
    [PERCENT.plantN("shoot_n_pct"), 0.025, "0.025 looks like a fraction; enter 2.5 for 2.5 %"],
  ] as [Bound, number, string][])("%#: %s", (bound, v, hint) => {
    expect(errorCode(() => check(v, bound))).toBe("OUT_OF_RANGE");
    expect(errorMessage(() => check(v, bound))).toContain(hint);
  });
  it("a value in the gap just above 0 also says what to do with a real small value", () => {
    expect(errorMessage(() => check(0.5, PERCENT.moisture))).toContain("enter 0 (it changes the rate by less than 1 %)");
    expect(errorMessage(() => check(0.004, PERCENT.moisture))).not.toContain("looks like a fraction");
  });
  it("the message states the whole range, the gap included", () => {
    expect(errorMessage(() => check(0.3, PERCENT.moisture))).toMatch(/^moisture_pct must be 0, or from 1 to below 100 %/);
  });
  it("a value above the range gets no fraction hint", () => {
    expect(errorMessage(() => check(300, PERCENT.cce))).not.toContain("fraction");
  });
});

describe("real small percentages are not refused", () => {
  it("legume shoot or grain N of 0.5 % is accepted (below any shoot, above wheat straw's ~0.5 %: Lentz & Lindsey, OSU, seen)", () => {
    ok(0.5, PERCENT.plantN("shoot_n_pct"));
  });
  it("a base saturation of 5.93 % (forest soil 10-20 cm, class data seen at trabalhosfeitos.com) is accepted", () => {
    ok(5.93, PERCENT.baseSat);
  });
  it("a %Ndfa of 0 (no fixation: sub clover 0-100 %, Unkovich et al. 1994 abstract, seen) is accepted", () => {
    ok(0, PERCENT.ndfa);
  });
  it("a wood-ash CCE of 22 % (ECCE 22-49 %, Commun. Soil Sci. Plant Anal. 2017 abstract, seen) is accepted", () => {
    ok(22, PERCENT.cce);
  });
});

describe("the cases of issue 22", () => {
  it("LIMEPRODUCT(3, 0.95, 0.85) is refused, not 37 151.7 t/ha", () => {
    expect(errorCode(() => limeProductRate(3, 0.95, 0.85))).toBe("OUT_OF_RANGE");
    expect(errorMessage(() => limeProductRate(3, 0.95, 0.85))).toContain("0.95 looks like a fraction; enter 95 for 95 %");
  });
  it("LIMEBASESAT(8.9, 0.5, 0.7) is refused, not 0.0178 t/ha", () => {
    expect(errorCode(() => limeBaseSat(8.9, 0.5, 0.7))).toBe("OUT_OF_RANGE");
    expect(errorMessage(() => limeBaseSat(8.9, 0.5, 0.7))).toContain("0.5 looks like a fraction; enter 50 for 50 %");
  });
  it("the same in percent gives the method's answer: 3 t/ha at CCE 95 %, fineness 85 % is 3.715 t/ha (derived)", () => {
    expect(limeProductRate(3, 95, 85)).toBeCloseTo(3 / 0.95 / 0.85, 10);
  });
});

describe("percentListLooksFractional", () => {
  it("true when every value is at most 1 and one is above 0", () => {
    expect(percentListLooksFractional([0.788, 0.1, 0.024, 0.078])).toBe(true);
    expect(percentListLooksFractional([1, 0.6, 0.2, 0])).toBe(true);
  });
  it("false for percentages, or for all zeros", () => {
    expect(percentListLooksFractional([100, 60, 20, 0])).toBe(false);
    expect(percentListLooksFractional([0, 0])).toBe(false);
    expect(percentListLooksFractional([0.5, 2])).toBe(false);
  });
});

// Mutation testing (issue 21) showed the messages were checked by prefix only; these read them
// whole. Bounds below are invented for the check; PERCENT ranges as above.
describe("messages read whole: range wording, unit and hints", () => {
  const msg = (v: number, b: Bound) => errorMessage(() => check(v, b));
  it.each([
    [{ name: "x", min: 5, max: 100, unit: "cm" }, 0.5, "x must be from 5 to 100 cm (got 0.5 cm)"],
    [{ name: "x", min: 5, max: 100 }, 200, "x must be from 5 to 100 (got 200)"],
    [{ name: "x", min: 5, minExclusive: true, max: 100, maxExclusive: true, unit: "cm" }, 100, "x must be above 5 to below 100 cm (got 100 cm)"],
    [{ name: "x", min: 5, unit: "cm" }, 1, "x must be at least 5 cm (got 1 cm)"],
    [{ name: "x", min: 5, minExclusive: true }, 5, "x must be greater than 5 (got 5)"],
    [{ name: "x", max: 5, unit: "cm" }, 6, "x must be at most 5 cm (got 6 cm)"],
    [{ name: "x", max: 5, maxExclusive: true }, 5, "x must be less than 5 (got 5)"],
  ] as [Bound, number, string][])("%# %j at %d", (b, v, text) => expect(msg(v, b)).toBe(text));
  it("a bound that is not a percent never gets a fraction hint", () => {
    expect(msg(0.5, { name: "x", unit: "g/cm3", min: 5, max: 100 })).not.toContain("fraction");
  });
  it("a negative percent gets no hint", () => {
    expect(msg(-0.5, PERCENT.cce)).toBe("cce_pct must be from 5 to 250 % (got -0.5 %)");
  });
  it("a percent above the range gets neither the fraction hint nor the small-value advice", () => {
    expect(msg(150, PERCENT.moisture)).toBe("moisture_pct must be 0, or from 1 to below 100 % (got 150 %)");
  });
  it("the small-value advice is given at the lower limit itself (value ≤ min), with the fraction hint", () => {
    expect(msg(1, PERCENT.baseSat)).toBe(
      `base_sat must be 0, or above 1 to 100 % (got 1 %); 1 looks like a fraction; enter 100 for 100 %; ${PERCENT.baseSat.small}`,
    );
  });
  it("a zero-allowed range without advice gives the fraction hint alone", () => {
    expect(msg(0.5, { name: "x", unit: "%", min: 1, max: 100, zero: true })).toBe("x must be 0, or from 1 to 100 % (got 0.5 %); 0.5 looks like a fraction; enter 50 for 50 %");
  });
  it("advice without zero allowed is not given", () => {
    expect(msg(0.5, { name: "x", unit: "%", min: 1, max: 100, small: "ADVICE" })).not.toContain("ADVICE");
  });
  it("a non-finite value says so", () => {
    expect(msg(Infinity, PERCENT.cce)).toBe("cce_pct must be a finite number (got Infinity)");
  });
});

describe("finite: no NaN or Infinity leaves core", () => {
  it("passes a finite number, refuses the others naming what could not be computed", () => {
    expect(finite(2.5, "the rate")).toBe(2.5);
    expect(errorMessage(() => finite(NaN, "the rate"))).toBe("the rate cannot be computed for these inputs (result is not finite)");
    expect(errorCode(() => finite(-Infinity, "the rate"))).toBe("OUT_OF_RANGE");
  });
});

// Mutation testing (issue 21), second round. PERCENT ranges as above.
describe("messages read whole, second round", () => {
  it("a negative percent gets no hint, even where 0 is allowed and small-value advice exists", () => {
    expect(errorMessage(() => check(-0.5, PERCENT.moisture))).toBe("moisture_pct must be 0, or from 1 to below 100 % (got -0.5 %)");
    expect(errorMessage(() => check(-0.5, PERCENT.ndfa))).toBe("ndfa_pct must be 0, or above 1 to 100 % (got -0.5 %)");
  });
  it("the CCE range names the sources of its bottom, the weakest liming materials", () => {
    expect(PERCENT.cce.basis).toContain("wood ash, 22-49 %: Commun. Soil Sci. Plant Anal. 2017");
    expect(PERCENT.cce.basis).toContain("Muse & Mitchell 1995");
  });
});

describe("numericText and notANumberHint: the one reading of numbers typed as text (values invented)", () => {
  it.each([
    ["12.5", 12.5],
    [" -.5 ", -0.5],
    ["+3.", 3],
    ["1e3", 1000],
    ["2.5E-2", 0.025],
    ["12.25", 12.25],
    [".125", 0.125],
  ])("%j reads as %p", (text, value) => {
    expect(numericText(text)).toBe(value);
  });
  it.each(["", " ", "12,5", "1 250", "<0.05", "5 mg/kg", "e5", "1e", ".", "+", "0x10", "Infinity", "NaN", "1e5x"])("%j is not a number", (text) => {
    expect(numericText(text)).toBeUndefined();
  });
  it("text beyond the doubles reads as Infinity, for the caller to refuse", () => {
    expect(numericText("1e999")).toBe(Infinity);
    expect(numericText("-1e999")).toBe(-Infinity);
  });
  it("the hint names a censored value or a decimal comma, and nothing else", () => {
    expect(notANumberHint(" <0.05")).toBe(" (a below- or above-detection value is your call: enter a number or leave the cell blank)");
    expect(notANumberHint(">300 ")).toBe(" (a below- or above-detection value is your call: enter a number or leave the cell blank)");
    expect(notANumberHint("12,5")).toBe(" (use a full stop as the decimal separator)");
    expect(notANumberHint("5<")).toBe("");
    expect(notANumberHint("a,5")).toBe("");
    expect(notANumberHint("abc")).toBe("");
  });
});
