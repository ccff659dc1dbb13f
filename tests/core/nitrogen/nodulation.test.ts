/**
 * Nodulation from root digs: % of plants adequately nodulated and its rating, % of nodules pink
 * inside, and the mean count per plant against a published count. Sources beside each check:
 * University of Adelaide, "Grower guide to assessing legume nodulation – Riverina" (seen, copy at
 * pdfslide.net); GRDC Communities, "Growing legumes? How to check their nodules" (seen); MLA
 * e-learning "How to assess legume nodulation", DPIRD method (seen). Dig counts are invented.
 */
import fc from "fast-check";
import {
  nfixNodulatedPct,
  nfixNodulationRating,
  nfixPinkNodulePct,
  nfixNoduleCount,
  nodulationRank,
  NODULATION_BOUNDS,
} from "../../../src/core/nitrogen/nodulation";
import { errorCode as code, errorMessage as message } from "../../helpers/errors";
import table from "../../../src/data/nitrogen/legume-checks.json";

const label = (r: string) => r.split(":")[0];

describe("nfixNodulatedPct: 100 × plants adequate ÷ plants dug", () => {
  it("the guide's dig of 30 plants (10 at each of 3 spots) with 21 adequate is 70 % (University of Adelaide grower guide)", () => {
    expect(nfixNodulatedPct(30, 21)).toBeCloseTo(70, 12);
  });
  it("0 and all plants adequate give 0 and 100 %", () => {
    expect(nfixNodulatedPct(30, 0)).toBe(0);
    expect(nfixNodulatedPct(30, 30)).toBe(100);
  });
  it("more plants adequate than dug is OUT_OF_RANGE saying a percentage is not a count", () => {
    expect(code(() => nfixNodulatedPct(30, 70))).toBe("OUT_OF_RANGE");
    expect(message(() => nfixNodulatedPct(30, 70))).toMatch(/not a percentage/);
  });
  it("a fraction such as 0.7 is refused with a hint, not read as 70 %", () => {
    expect(code(() => nfixNodulatedPct(30, 0.7))).toBe("OUT_OF_RANGE");
    expect(message(() => nfixNodulatedPct(30, 0.7))).toMatch(/looks like a fraction/);
    expect(code(() => nfixNodulatedPct(30.5, 10))).toBe("OUT_OF_RANGE");
  });
  it("plants_dug bounds 1–1000: at, just inside and just outside each limit (guard)", () => {
    expect(code(() => nfixNodulatedPct(0, 0))).toBe("OUT_OF_RANGE");
    expect(nfixNodulatedPct(1, 1)).toBe(100);
    expect(nfixNodulatedPct(2, 1)).toBe(50);
    expect(nfixNodulatedPct(999, 0)).toBe(0);
    expect(nfixNodulatedPct(1000, 1000)).toBe(100);
    expect(code(() => nfixNodulatedPct(1001, 0))).toBe("OUT_OF_RANGE");
    expect(code(() => nfixNodulatedPct(30, -1))).toBe("OUT_OF_RANGE");
    expect(NODULATION_BOUNDS.plantsDug).toMatchObject({ min: 1, max: 1000 });
  });
});

describe("nfixNodulationRating on the University of Adelaide grower guide's scale (Adequate ≥ 70 %, Borderline 50–70 %, Poor < 50 %, None: no nodules)", () => {
  it.each([
    [30, 21, "Adequate"],
    [30, 20, "Borderline"],
    [30, 15, "Borderline"],
    [30, 14, "Poor"],
    [30, 0, "Poor"],
  ])("%i plants dug, %i adequate: %s", (dug, adequate, expected) => {
    expect(label(nfixNodulationRating(dug, adequate))).toBe(expected);
  });
  it("at 70 %: exactly 70 is Adequate, 69 % Borderline, 71 % Adequate (edge; compared in whole numbers, so 7 of 10 is exactly 70 %)", () => {
    expect(label(nfixNodulationRating(100, 70))).toBe("Adequate");
    expect(label(nfixNodulationRating(10, 7))).toBe("Adequate");
    expect(label(nfixNodulationRating(100, 69))).toBe("Borderline");
    expect(label(nfixNodulationRating(100, 71))).toBe("Adequate");
    expect(label(nfixNodulationRating(1000, 699))).toBe("Borderline");
  });
  it("shares a hair from 70 % show on their own side: 695 of 993 is 69.99 % Borderline, 698 of 997 is 70.01 % Adequate", () => {
    expect(nfixNodulationRating(993, 695)).toMatch(/^Borderline: 69.99 %/);
    expect(nfixNodulationRating(997, 698)).toMatch(/^Adequate: 70.01 %/);
  });
  it("at 50 %: exactly 50 is Borderline, 49 % Poor, 51 % Borderline (edge)", () => {
    expect(label(nfixNodulationRating(100, 50))).toBe("Borderline");
    expect(label(nfixNodulationRating(100, 49))).toBe("Poor");
    expect(label(nfixNodulationRating(100, 51))).toBe("Borderline");
    expect(label(nfixNodulationRating(1000, 499))).toBe("Poor");
  });
  it("no nodules on any plant is None (= no nitrogen fixation); with nodules but none adequate it is Poor", () => {
    expect(nfixNodulationRating(30, 0, 0)).toMatch(/^None: no nodules on the 30 plants dug, no nodules present \(= no nitrogen fixation\)/);
    expect(label(nfixNodulationRating(30, 0, 12))).toBe("Poor");
  });
  it("without a nodule count, 0 adequate is Poor and says to count nodules to tell Poor from None", () => {
    expect(nfixNodulationRating(30, 0)).toMatch(/^Poor: 0 % .*count nodules to tell Poor from None/);
  });
  it("plants rated adequate with 0 nodules counted is NOT_APPLICABLE (the counts disagree)", () => {
    expect(code(() => nfixNodulationRating(30, 3, 0))).toBe("NOT_APPLICABLE");
  });
  it("the issue's case: 25 plants adequate but 10 nodules on all 30 plants is refused (each adequate plant has nodules; arithmetic)", () => {
    expect(code(() => nfixNodulationRating(30, 25, 10))).toBe("NOT_APPLICABLE");
    expect(message(() => nfixNodulationRating(30, 25, 10))).toMatch(/plants_adequate is 25 but only 10 nodules were counted .* at least 25/);
    expect(code(() => nfixNodulationRating(30, 25, 24))).toBe("NOT_APPLICABLE");
    expect(label(nfixNodulationRating(30, 25, 25))).toBe("Adequate"); // the least count consistent with 25 adequate plants
  });
  it("a dig smaller than the guide's about 30 plants (10 at each of 3 spots) is rated on the scale and says so", () => {
    // Source: University of Adelaide grower guide: 'collect about 30 plants, 10 at each of 3 sample spots'.
    expect(table.nodulation_scale.dig_plants).toBe(30);
    expect(nfixNodulationRating(3, 3)).toMatch(/^Adequate: 100 % .*only 3 plants dug: the guide rates a dig of about 30 plants \(10 at each of 3 sample spots\), so read with care/);
    expect(nfixNodulationRating(29, 29)).toMatch(/only 29 plants dug/);
    expect(nfixNodulationRating(30, 30)).not.toMatch(/read with care/);
    expect(nfixNodulationRating(10, 0, 0)).toMatch(/^None: .*only 10 plants dug/);
  });
  it("every rating names its source and gives the percentage, two decimals", () => {
    const r = nfixNodulationRating(30, 20);
    expect(r).toBe("Borderline: 66.67 % of plants adequately nodulated (50 to under 70 %) [University of Adelaide grower guide]");
  });
  it("the data row records the guide's wording and where it was seen", () => {
    expect(table.nodulation_scale.source).toMatch(/Adequate 70% or more of plants rated adequate; Borderline 50 70%/);
    expect(table.nodulation_scale.seen_at).toMatch(/^https:/);
    expect(table.nodulation_scale.levels.map((l) => l.min_pct)).toEqual([70, 50, 0]);
  });
  it("a fractional or negative nodule count is OUT_OF_RANGE", () => {
    expect(code(() => nfixNodulationRating(30, 10, 12.5))).toBe("OUT_OF_RANGE");
    expect(code(() => nfixNodulationRating(30, 10, -1))).toBe("OUT_OF_RANGE");
    expect(code(() => nfixNodulationRating(30, 10, 100001))).toBe("OUT_OF_RANGE");
    expect(label(nfixNodulationRating(30, 10, 100000))).toBe("Poor");
  });
  it("ranks: None < Poor < Borderline < Adequate", () => {
    expect(["None: x", "Poor: x", "Borderline: x", "Adequate: x"].map(nodulationRank)).toEqual([0, 1, 2, 3]);
  });
});

describe("properties (counts invented)", () => {
  const dig = fc.integer({ min: 1, max: 200 }).chain((dug) =>
    // At least as many nodules as plants dug: every plant rated adequate has nodules.
    fc.tuple(fc.constant(dug), fc.integer({ min: 0, max: dug }), fc.integer({ min: 0, max: dug }), fc.option(fc.integer({ min: dug, max: 5000 }), { nil: undefined })),
  );
  it("more adequately nodulated plants never lowers the rating", () => {
    fc.assert(
      fc.property(dig, ([dug, a, b, nodules]) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        return nodulationRank(nfixNodulationRating(dug, hi, nodules)) >= nodulationRank(nfixNodulationRating(dug, lo, nodules));
      }),
    );
  });
  it("the rating's percentage is NODPCT's", () => {
    fc.assert(
      fc.property(dig, ([dug, a]) => {
        const pct = nfixNodulatedPct(dug, a);
        return nfixNodulationRating(dug, a).includes(`${Number(pct.toFixed(2))} % of plants`);
      }),
    );
  });
});

describe("nfixPinkNodulePct: nodules red/pink inside are effective (GRDC Communities, how to check nodules)", () => {
  it("30 of 40 nodules pink is 75 %", () => {
    expect(nfixPinkNodulePct(40, 30)).toBe(75);
  });
  it("all and none pink", () => {
    expect(nfixPinkNodulePct(40, 40)).toBe(100);
    expect(nfixPinkNodulePct(40, 0)).toBe(0);
  });
  it("no nodules: NOT_APPLICABLE, never 0 % or blank", () => {
    expect(code(() => nfixPinkNodulePct(0, 0))).toBe("NOT_APPLICABLE");
  });
  it("more pink than counted is OUT_OF_RANGE; fractions are refused", () => {
    expect(code(() => nfixPinkNodulePct(40, 41))).toBe("OUT_OF_RANGE");
    expect(message(() => nfixPinkNodulePct(40, 75))).toMatch(/not a percentage/);
    expect(code(() => nfixPinkNodulePct(40, 0.75))).toBe("OUT_OF_RANGE");
  });
});

describe("nfixNoduleCount: mean nodules per plant against a published count", () => {
  it("faba bean 1620 nodules on 30 plants is 54 per plant: Good, 50 per plant is good for field pea, vetch and faba bean (GRDC Communities, how to check nodules)", () => {
    expect(nfixNoduleCount(30, 1620, "faba bean")).toMatch(/^Good: 54 nodules per plant on average; 50 nodules per plant is good for field pea, vetch and faba bean \[GRDC Communities/);
  });
  it("at 50 per plant: exactly 50 is Good, 49.97 Below, 50.03 Good (edge)", () => {
    expect(label(nfixNoduleCount(30, 1500, "field pea"))).toBe("Good");
    expect(label(nfixNoduleCount(30, 1499, "vetch"))).toBe("Below");
    expect(label(nfixNoduleCount(30, 1501, "faba bean"))).toBe("Good");
  });
  it("pasture legumes: a minimum of 20 nodules per plant is adequate (MLA e-learning, DPIRD method); at 20 Adequate, 19.97 Below, 20.03 Adequate (edge)", () => {
    expect(label(nfixNoduleCount(30, 600, "subterranean clover"))).toBe("Adequate");
    expect(label(nfixNoduleCount(30, 599, "lucerne"))).toBe("Below");
    expect(label(nfixNoduleCount(30, 601, "pasture"))).toBe("Adequate");
    expect(nfixNoduleCount(30, 599, "lucerne")).toMatch(/^Below: 19.9667 nodules per plant on average, under 20;/);
  });
  it("a legume with no published per-plant count (lentil, chickpea, lupin) is NO_REFERENCE_DATA: no invented rating", () => {
    for (const l of ["lentil", "chickpea", "lupin"]) expect(code(() => nfixNoduleCount(30, 900, l))).toBe("NO_REFERENCE_DATA");
    expect(message(() => nfixNoduleCount(30, 900, "lentil"))).toMatch(/SOIL\.NODRATING/);
  });
  it("an unknown legume is UNKNOWN_NAME listing the words; blank is MISSING_INPUT", () => {
    expect(code(() => nfixNoduleCount(30, 900, "wheat"))).toBe("UNKNOWN_NAME");
    expect(message(() => nfixNoduleCount(30, 900, "wheat"))).toMatch(/use field pea, faba bean/);
    expect(code(() => nfixNoduleCount(30, 900, " "))).toBe("MISSING_INPUT");
  });
  it("every count level records its source wording and where it was seen", () => {
    expect(table.count_levels[0]!.source).toMatch(/50 per plant is good for field peas, vetch, and faba bean/);
    expect(table.count_levels[1]!.source).toMatch(/minimum of 20 nodules on the root system/);
    for (const l of table.count_levels) expect(l.seen_at).toMatch(/^https:/);
  });
});

describe("refusal and note wording (probes of the code's own guards; counts invented)", () => {
  it("the fraction hint is given for a count between 0 and 1 only, not for 1.5", () => {
    expect(message(() => nfixNodulatedPct(30, 0.7))).toBe(
      "plants_adequate must be a whole number of plants (got 0.7); 0.7 looks like a fraction: give the number counted, not a share",
    );
    expect(message(() => nfixNodulatedPct(30, 1.5))).toBe("plants_adequate must be a whole number of plants (got 1.5)");
    expect(message(() => nfixPinkNodulePct(40, 0.25))).toContain("0.25 looks like a fraction");
  });
  it("a dig of one plant says 'plant', of two 'plants'", () => {
    expect(nfixNodulationRating(1, 1)).toContain("; only 1 plant dug: the guide rates a dig of about 30 plants");
    expect(nfixNodulationRating(2, 1)).toContain("; only 2 plants dug:");
    expect(nfixNodulationRating(30, 21)).not.toContain("only");
  });
  it("too few nodules: 'nodule was' for one, 'nodules were' for more", () => {
    expect(message(() => nfixNodulationRating(30, 2, 1))).toBe(
      "plants_adequate is 2 but only 1 nodule was counted on the 30 plants dug: each adequately nodulated plant has nodules, so at least 2; check the two counts (nodules is the total on all plants dug)",
    );
    expect(message(() => nfixNodulationRating(30, 5, 3))).toContain("only 3 nodules were counted on the 30 plants dug");
  });
  it("with nodules counted, 0 adequate plants is Poor without the 'count nodules' note", () => {
    const r = nfixNodulationRating(30, 0, 12);
    expect(r).toMatch(/^Poor: 0 % of plants adequately nodulated/);
    expect(r).not.toContain("count nodules");
  });
});
