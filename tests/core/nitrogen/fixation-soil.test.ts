/**
 * Soil conditions for N2 fixation. Each level is checked against the source's printed number, at,
 * just inside and just outside it. Sources (all seen; addresses in legume-checks.json):
 * - pH, pulses: GRDC Paddock Practices (2022), "Sowing legumes in acidic soils" (SARDI): groups E, F
 *   (field pea, faba bean, lentil, vetch) and N (chickpea) sensitive "especially below pH 5.5 CaCl2".
 * - pH, clovers: Hackney et al. (2019) Crop Pasture Sci 70:1128 (abstract): Trifolium nodulation near
 *   adequate at pHCa > 5.55.
 * - nitrate: Cox (DAF Qld), GRDC Communities, "available soil N > 100 kg/ha"; GRDC Communities,
 *   chickpeas "> 100 kg N/ha"; Voisin et al. (2002) pea (abstract): initiated only below 56, absolute
 *   inhibition over 380 kg N/ha.
 * - Mo: Molybdenum – NSW fact sheet (soilquality.org.au): "liming to bring pH above 5.5"; its pH
 *   test is not stated, so the flag is "possible" and never counted (this project's rule).
 * - faba bean and nitrate: GRDC Communities, "Think twice before sowing chickpeas into high Nitrogen
 *   soils": faba bean "continues to fix N in the presence of moderate to high soil nitrate"; GRDC
 *   fact sheet (2013) "Nitrogen fixation and N benefits of chickpeas and faba beans": "more
 *   efficient at fixing N than chickpeas, principally because of their nitrate tolerance".
 * - B: Haddad & Kaldor (1982) (abstract): lucerne, hot-water B 0.34 µg/g.
 * Paddock readings are invented.
 */
import fc from "fast-check";
import { nfixSoilChecks, nfixSoilText, nfixSoilCount, nfixPhTest, FIXSOIL_BOUNDS } from "../../../src/core/nitrogen/fixation-soil";
import { LEGUME_WORDS } from "../../../src/core/nitrogen/legumes";
import { errorCode as code, errorMessage as message } from "../../helpers/errors";
import table from "../../../src/data/nitrogen/legume-checks.json";

const status = (what: string, ...args: Parameters<typeof nfixSoilChecks>) => nfixSoilChecks(...args).find((c) => c.check === what)!.status;

describe("pH for the rhizobia", () => {
  it("pulses: pH 5.5 CaCl2 is the level (GRDC Paddock Practices 2022): 5.49 constraint, 5.5 and 5.51 not", () => {
    expect(status("pH", "field pea", 5.49, "CaCl2")).toBe("constraint");
    expect(status("pH", "field pea", 5.5, "CaCl2")).toBe("clear");
    expect(status("pH", "field pea", 5.51, "CaCl2")).toBe("clear");
  });
  it.each(["field pea", "faba bean", "lentil", "vetch", "chickpea", "group E", "group F", "group N"])("%s rhizobia are sensitive below pH 5.5 (CaCl2)", (legume) => {
    expect(status("pH", legume, 5.2, "CaCl2")).toBe("constraint");
  });
  it("clovers: pHCa 5.55 (Hackney et al. 2019): 5.54 constraint, 5.55 and 5.56 not", () => {
    expect(status("pH", "subterranean clover", 5.54, "CaCl2")).toBe("constraint");
    expect(status("pH", "sub clover", 5.55, "CaCl2")).toBe("clear");
    expect(status("pH", "white clover", 5.56, "CaCl2")).toBe("clear");
  });
  it("a water pH is never compared with a CaCl2 level, nor converted: the check is listed as not made", () => {
    expect(status("pH", "field pea", 4.0, "water")).toBe("not made");
    expect(nfixSoilText("field pea", 4.0, "water")).toMatch(/pH for the rhizobia: the published level for field pea is pH 5.5 in CaCl2 .*, and a water pH is not converted/);
  });
  it("lupin, medic, lucerne and soybean have no published pH level: not made, with the reason", () => {
    for (const l of ["lupin", "annual medic", "lucerne", "soybean"]) expect(status("pH", l, 4.2, "CaCl2")).toBe("not made");
    expect(nfixSoilText("lupin", 4.2, "CaCl2")).toMatch(/no published level for lupin found \(lupin rhizobia are more tolerant of acidic soils/);
  });
  it("the constraint names the level's source and the test", () => {
    expect(nfixSoilText("faba bean", 5.1, "CaCl2")).toMatch(/pH 5\.1 \(CaCl2\) is below 5\.5: the rhizobia .* \[GRDC Paddock Practices 2022 \(SARDI\)\]/);
  });
});

describe("ph_method: required, never assumed", () => {
  it("CaCl2 and water with the trade's spellings", () => {
    expect(nfixPhTest("cacl2")).toBe("CaCl2");
    expect(nfixPhTest("pHCa")).toBe("CaCl2");
    expect(nfixPhTest("0.01 M CaCl2")).toBe("CaCl2");
    expect(nfixPhTest("Water")).toBe("water");
    expect(nfixPhTest("1:5 water")).toBe("water");
  });
  // The other spellings a lab report or a consultant uses for the two tests (common practice).
  it.each(["pH(CaCl2)", "calcium chloride", "0.01M CaCl2", "0.01 M CaCl2"])("%s is the CaCl2 test", (w) => {
    expect(nfixPhTest(w)).toBe("CaCl2");
  });
  it.each(["pHw", "pH(water)", "H2O", "deionised water", "deionized water"])("%s is the water test", (w) => {
    expect(nfixPhTest(w)).toBe("water");
  });
  it("blank is MISSING_INPUT; another test (KCl) is UNKNOWN_NAME listing CaCl2 or water", () => {
    expect(code(() => nfixSoilText("field pea", 5, " "))).toBe("MISSING_INPUT");
    expect(code(() => nfixSoilText("field pea", 5, "KCl"))).toBe("UNKNOWN_NAME");
    expect(message(() => nfixSoilText("field pea", 5, "KCl"))).toMatch(/use CaCl2 or water$/);
  });
  it("pH outside 0–14 is OUT_OF_RANGE", () => {
    expect(code(() => nfixSoilText("field pea", 14.01, "CaCl2"))).toBe("OUT_OF_RANGE");
    expect(code(() => nfixSoilText("field pea", -0.01, "CaCl2"))).toBe("OUT_OF_RANGE");
    expect(FIXSOIL_BOUNDS.ph).toMatchObject({ min: 0, max: 14 });
  });
});

describe("nitrate-N at sowing", () => {
  it("pulses: more than 100 kg/ha (Cox, GRDC Communities): 100 not flagged, 100.01 flagged", () => {
    expect(status("nitrate", "lentil", 6, "CaCl2", 100)).toBe("clear");
    expect(status("nitrate", "lentil", 6, "CaCl2", 100.01)).toBe("constraint");
    expect(status("nitrate", "lupin", 6, "CaCl2", 99.99)).toBe("clear");
  });
  it("chickpea: > 100 kg N/ha, from both GRDC Communities pages, cited together when clear", () => {
    expect(status("nitrate", "chickpea", 6, "CaCl2", 101)).toBe("constraint");
    expect(nfixSoilText("chickpea", 6, "CaCl2", 60)).toMatch(/not above 100 \[Cox \(DAF Qld\), GRDC Communities; GRDC Communities, chickpeas into high-N soils\]/);
  });
  it("pea: fixation starts only below 56 kg N/ha (Voisin et al. 2002): 56 flagged, 55.99 not", () => {
    expect(status("nitrate", "field pea", 6, "CaCl2", 56)).toBe("constraint");
    expect(status("nitrate", "field pea", 6, "CaCl2", 55.99)).toBe("clear");
    expect(nfixSoilText("field pea", 6, "CaCl2", 56)).toMatch(/is at or above 56: fixation by pea does not start until soil nitrate falls below 56 kg N\/ha/);
  });
  it("pea: inhibition absolute over 380 kg N/ha (Voisin et al. 2002): 380 does not say absolute, 380.01 does", () => {
    expect(nfixSoilText("field pea", 6, "CaCl2", 380)).not.toMatch(/absolute/);
    expect(nfixSoilText("field pea", 6, "CaCl2", 380.01)).toMatch(/above 380: nitrate inhibition of fixation by pea was absolute/);
  });
  it("faba bean at 150 kg N/ha: the general pulse level is reported as possible, not counted, because faba keeps fixing in moderate to high nitrate", () => {
    const t = nfixSoilText("faba bean", 6.5, "CaCl2", 150);
    expect(status("nitrate", "faba bean", 6.5, "CaCl2", 150)).toBe("possible");
    expect(t).toMatch(/^none found in the checks made: /);
    expect(t).toMatch(/Possible, not counted: nitrate-N 150 kg N\/ha at sowing is above 100: .*, but faba bean continues to fix N in the presence of moderate to high soil nitrate .*nitrate tolerance \[GRDC fact sheet 2013/);
    expect(nfixSoilCount("faba bean", 6.5, "CaCl2", 150)).toBe(0);
    expect(status("nitrate", "faba bean", 6.5, "CaCl2", 100)).toBe("clear");
  });
  it("chickpea at 150 kg N/ha stays a counted constraint: its sources agree", () => {
    expect(status("nitrate", "chickpea", 6.5, "CaCl2", 150)).toBe("constraint");
    expect(nfixSoilCount("chickpea", 6.5, "CaCl2", 150)).toBe(1);
  });
  it("pastures and soybean: no published suppression level: not made", () => {
    for (const l of ["lucerne", "subterranean clover", "soybean", "vetch"]) expect(status("nitrate", l, 6, "CaCl2", 300)).toBe("not made");
  });
  it("blank or omitted is 'not given' (the check is listed as not made, never read as 0)", () => {
    expect(status("nitrate", "field pea", 6, "CaCl2")).toBe("not made");
    expect(status("nitrate", "field pea", 6, "CaCl2", "")).toBe("not made");
    expect(nfixSoilText("field pea", 6, "CaCl2", " ")).toMatch(/nitrate-N at sowing: not given \(levels for field pea: 56 kg N\/ha/);
  });
  it("numeric text is read; '<0.5' and '12,5' are NOT_A_NUMBER; above 1000 kg N/ha is OUT_OF_RANGE (guard)", () => {
    expect(status("nitrate", "lentil", 6, "CaCl2", "120")).toBe("constraint");
    expect(code(() => nfixSoilText("lentil", 6, "CaCl2", "<0.5"))).toBe("NOT_A_NUMBER");
    expect(message(() => nfixSoilText("lentil", 6, "CaCl2", "<0.5"))).toMatch(/below- or above-detection value is your call/);
    expect(code(() => nfixSoilText("lentil", 6, "CaCl2", "12,5"))).toBe("NOT_A_NUMBER");
    expect(status("nitrate", "lentil", 6, "CaCl2", 1000)).toBe("constraint");
    expect(code(() => nfixSoilText("lentil", 6, "CaCl2", 1000.01))).toBe("OUT_OF_RANGE");
    expect(code(() => nfixSoilText("lentil", 6, "CaCl2", -1))).toBe("OUT_OF_RANGE");
  });
});

describe("Mo supply at low pH (Molybdenum – NSW fact sheet: liming to bring pH above 5.5 usually fixes Mo deficiency)", () => {
  it("at 5.5 flagged as possible (the sheet says above 5.5 fixes it), 5.51 not, 5.49 possible", () => {
    expect(status("Mo", "lupin", 5.5, "CaCl2")).toBe("possible");
    expect(status("Mo", "lupin", 5.51, "CaCl2")).toBe("clear");
    expect(status("Mo", "lupin", 5.49, "water")).toBe("possible");
  });
  it("applies to every legume and says that the source does not state its pH test", () => {
    for (const l of LEGUME_WORDS) expect(status("Mo", l, 5.0, "water")).toBe("possible");
    expect(nfixSoilText("soybean", 5.0, "water")).toMatch(/Possible, not counted: Mo: pH 5 \(water\) is at or below 5\.5: .*; the source does not state its pH test\] \(not counted: /);
    expect(table.mo_level.source).toMatch(/Liming to bring pH above 5\.5 usually fixes molybdenum deficiency in the long term/);
  });
  it("the rule: never counted, in either pH test, since the source states no test and pH alone cannot find a deficiency", () => {
    for (const test of ["water", "CaCl2"]) {
      for (const ph of [3, 4.5, 5.0, 5.5]) expect(nfixSoilCount("soybean", ph, test)).toBe(0); // soybean: no pH, nitrate or B level
    }
    expect(table.mo_level.counted).toBe(false);
    expect(table.mo_level.why_not_counted).toMatch(/no pH test/);
  });
  it("the issue's case: field pea at pH 5.2 in water or CaCl2 counts only the CaCl2 pH constraint, never Mo", () => {
    expect(nfixSoilCount("field pea", 5.2, "water")).toBe(0);
    expect(nfixSoilCount("field pea", 5.2, "CaCl2")).toBe(1);
    expect(nfixSoilText("field pea", 5.2, "water")).toMatch(/^none found in the checks made\. Possible, not counted: Mo: /);
  });
});

describe("B where a source gives a soil-test level", () => {
  it("lucerne, hot-water B 0.34 mg/kg (Haddad & Kaldor 1982): 0.3399 flagged, 0.34 and 0.3401 not", () => {
    expect(status("B", "lucerne", 6, "CaCl2", undefined, 0.3399)).toBe("constraint");
    expect(status("B", "lucerne", 6, "CaCl2", undefined, 0.34)).toBe("clear");
    expect(status("B", "alfalfa", 6, "CaCl2", undefined, 0.3401)).toBe("clear");
  });
  it("lucerne without a B reading: not made, naming the level; other legumes: no published level", () => {
    expect(nfixSoilText("lucerne", 6, "CaCl2")).toMatch(/B: hot-water B not given \(level for lucerne: 0\.34 mg\/kg/);
    expect(status("B", "field pea", 6, "CaCl2", undefined, 0.1)).toBe("not made");
  });
  it("B above 50 mg/kg is OUT_OF_RANGE (guard)", () => {
    expect(code(() => nfixSoilText("lucerne", 6, "CaCl2", undefined, 50.01))).toBe("OUT_OF_RANGE");
    expect(status("B", "lucerne", 6, "CaCl2", undefined, 50)).toBe("clear");
  });
});

describe("the screen as text and as a count", () => {
  it("constraints found: the count first, each with its source", () => {
    const t = nfixSoilText("field pea", 5.1, "CaCl2", 120);
    expect(t).toMatch(/^2 constraints found: pH 5\.1 \(CaCl2\) is below 5\.5/);
    expect(t).toMatch(/\. Possible, not counted: Mo: pH 5\.1/);
    expect(t).toMatch(/Not checked: B: no published soil-test level for field pea found\.$/);
    expect(nfixSoilCount("field pea", 5.1, "CaCl2", 120)).toBe(2);
  });
  it("none found: never a bare OK, it lists the checks made and those not made", () => {
    const t = nfixSoilText("chickpea", 6.4, "CaCl2", 60);
    expect(t).toMatch(/^none found in the checks made: pH 6\.4 \(CaCl2\) is not below 5\.5 \[GRDC Paddock Practices 2022 \(SARDI\)\]; nitrate-N 60 kg N\/ha at sowing is not above 100 .*; Mo: pH 6\.4 \(CaCl2\) is above 5\.5/);
    expect(t).toMatch(/Not checked: B: no published soil-test level for chickpea found\.$/);
    expect(nfixSoilCount("chickpea", 6.4, "CaCl2", 60)).toBe(0);
  });
  it("an inoculant group says once which checks need the legume's name", () => {
    expect(nfixSoilText("group E", 6.5, "CaCl2").match(/Note: inoculant group E/g)).toHaveLength(1);
  });
  it("an unknown legume is UNKNOWN_NAME listing the words", () => {
    expect(code(() => nfixSoilText("wheat", 6, "CaCl2"))).toBe("UNKNOWN_NAME");
    expect(message(() => nfixSoilText("wheat", 6, "CaCl2"))).toMatch(/use field pea, faba bean, lentil/);
  });
  it("every level row names its source and where it was seen", () => {
    for (const l of [...table.ph_levels, ...table.nitrate_levels, ...table.boron_levels, table.mo_level]) {
      expect(l.source.length).toBeGreaterThan(40);
      expect(l.seen_at).toMatch(/^https?:/);
    }
  });
});

describe("properties (readings invented)", () => {
  const legume = fc.constantFrom(...LEGUME_WORDS);
  const nitrate = fc.double({ min: 0, max: 1000, noNaN: true });
  it("more nitrate never removes a nitrate constraint", () => {
    fc.assert(
      fc.property(legume, nitrate, nitrate, (l, a, b) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        return status("nitrate", l, 6, "CaCl2", lo) !== "constraint" || status("nitrate", l, 6, "CaCl2", hi) === "constraint";
      }),
    );
  });
  it("more nitrate never lowers the count", () => {
    fc.assert(
      fc.property(legume, fc.double({ min: 3, max: 9, noNaN: true }), nitrate, nitrate, (l, ph, a, b) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        return nfixSoilCount(l, ph, "CaCl2", hi) >= nfixSoilCount(l, ph, "CaCl2", lo);
      }),
    );
  });
  it("a lower pH never removes a pH constraint or a possible Mo flag", () => {
    const flaggedAt = (c: string, l: string, ph: number, t: string) => ["constraint", "possible"].includes(status(c, l, ph, t));
    fc.assert(
      fc.property(legume, fc.double({ min: 0, max: 14, noNaN: true }), fc.double({ min: 0, max: 14, noNaN: true }), fc.constantFrom("CaCl2", "water"), (l, a, b, t) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        return (["pH", "Mo"] as const).every((c) => !flaggedAt(c, l, hi, t) || flaggedAt(c, l, lo, t));
      }),
    );
  });
  it("Mo is never a constraint, and the count never exceeds 3 (pH, nitrate, B)", () => {
    fc.assert(
      fc.property(legume, fc.double({ min: 0, max: 14, noNaN: true }), fc.constantFrom("CaCl2", "water"), nitrate, (l, ph, t, n) => {
        return status("Mo", l, ph, t) !== "constraint" && nfixSoilCount(l, ph, t, n) <= 3;
      }),
    );
  });
  it("the count is the number of constraint checks and the text says so", () => {
    fc.assert(
      fc.property(legume, fc.double({ min: 3, max: 9, noNaN: true }), nitrate, (l, ph, n) => {
        const k = nfixSoilCount(l, ph, "CaCl2", n);
        const t = nfixSoilText(l, ph, "CaCl2", n);
        return k === 0 ? /^none found in the checks made[.:]/.test(t) : t.startsWith(`${k} constraint`);
      }),
    );
  });
});

describe("wording of each clause and of the screen (readings invented; probes of how the text is put together)", () => {
  const MO_CLEAR_6 = "Mo: pH 6 (CaCl2) is above 5.5 [Molybdenum - NSW fact sheet, soilquality.org.au; the source does not state its pH test]";
  const PEA_PH_6 = "pH 6 (CaCl2) is not below 5.5 [GRDC Paddock Practices 2022 (SARDI)]";
  it("ph_method: a blank or unknown test is refused naming ph_method", () => {
    expect(message(() => nfixPhTest(" "))).toBe('ph_method is required: "CaCl2" or "water" (different tests; never assumed)');
    expect(message(() => nfixPhTest("KCl"))).toBe('unknown ph_method "KCl"; use CaCl2 or water');
  });
  it("every screen has the four checks in order, whether each is made or not", () => {
    for (const args of [["lucerne", 6, "CaCl2"], ["lucerne", 6, "CaCl2", undefined, 0.2], ["soybean", 5, "water"], ["field pea", 6, "CaCl2", 40]] as const) {
      expect(nfixSoilChecks(...(args as unknown as Parameters<typeof nfixSoilChecks>)).map((c) => c.check)).toEqual(["pH", "nitrate", "Mo", "B"]);
    }
  });
  it("a legume with no pH level and no note: the bare reason, nothing added", () => {
    expect(nfixSoilChecks("mungbean", 6, "CaCl2")[0]!.text).toBe("pH for the rhizobia: no published level for mungbean found");
  });
  it("no nitrate level: says so; not given: lists every level with its source, comma-separated", () => {
    expect(nfixSoilChecks("soybean", 6, "CaCl2")[1]!.text).toBe("nitrate-N at sowing: no published suppression level for soybean found");
    expect(nfixSoilChecks("field pea", 6, "CaCl2")[1]!.text).toBe(
      "nitrate-N at sowing: not given (levels for field pea: 56 kg N/ha [Voisin et al. 2002, Plant Soil], 100 kg N/ha [Cox (DAF Qld), GRDC Communities], 380 kg N/ha [Voisin et al. 2002, Plant Soil])",
    );
  });
  it("nitrate clear: different levels are each stated; the same level from two sources is cited together", () => {
    expect(nfixSoilChecks("field pea", 6, "CaCl2", 40)[1]!.text).toBe(
      "nitrate-N 40 kg N/ha at sowing is below 56 [Voisin et al. 2002, Plant Soil], and not above 100 [Cox (DAF Qld), GRDC Communities], and not above 380 [Voisin et al. 2002, Plant Soil]",
    );
    expect(nfixSoilChecks("chickpea", 6, "CaCl2", 60)[1]!.text).toBe(
      "nitrate-N 60 kg N/ha at sowing is not above 100 [Cox (DAF Qld), GRDC Communities; GRDC Communities, chickpeas into high-N soils]",
    );
  });
  it("nitrate flagged by several levels: each with its meaning and source, joined by ', and'", () => {
    const t = nfixSoilChecks("field pea", 6, "CaCl2", 400)[1]!.text;
    expect(t).toMatch(/^nitrate-N 400 kg N\/ha at sowing is at or above 56: fixation by pea does not start until soil nitrate falls below 56 kg N\/ha \[Voisin et al\. 2002, Plant Soil\], and above 100: /);
    expect(t).toMatch(/they use the soil N instead \[Cox \(DAF Qld\), GRDC Communities\], and above 380: nitrate inhibition .* over 380 kg N\/ha \[Voisin et al\. 2002, Plant Soil\]$/);
  });
  it("a flagged nitrate for a legume without a nitrate note ends at the source; a clear one for faba bean gets no 'but'", () => {
    expect(nfixSoilChecks("lentil", 6, "CaCl2", 150)[1]!.text).toMatch(/pulses are unlikely to fix much N: they use the soil N instead \[Cox \(DAF Qld\), GRDC Communities\]$/);
    const faba = nfixSoilChecks("faba bean", 6, "CaCl2", 50)[1]!;
    expect(faba.status).toBe("clear");
    expect(faba.text).toBe("nitrate-N 50 kg N/ha at sowing is not above 100 [Cox (DAF Qld), GRDC Communities]");
  });
  it("Mo clear: the side and the source, nothing else", () => {
    expect(nfixSoilChecks("field pea", 6, "CaCl2")[2]!.text).toBe(MO_CLEAR_6);
  });
  it("B flagged: method, reading, side, meaning and source; B clear: no meaning", () => {
    expect(nfixSoilChecks("lucerne", 6, "CaCl2", undefined, 0.2)[3]!.text).toBe(
      "hot water B 0.2 mg/kg is below 0.34: hot-water-soluble B below 0.34 mg/kg (air-dry soil) gave under 90 % of maximum lucerne yield, with B deficiency symptoms [Haddad & Kaldor 1982, Aust J Exp Agric Anim Husb 22:317]",
    );
    expect(nfixSoilChecks("lucerne", 6, "CaCl2", undefined, 0.5)[3]!.text).toBe("hot water B 0.5 mg/kg is not below 0.34 [Haddad & Kaldor 1982, Aust J Exp Agric Anim Husb 22:317]");
  });
  it("constraints are joined by '; ', and the clear checks follow as 'No constraint' only when some were clear", () => {
    const two = nfixSoilText("field pea", 5.1, "CaCl2", 400);
    expect(two).toContain("especially below pH 5.5 (CaCl2) [GRDC Paddock Practices 2022 (SARDI)]; nitrate-N 400 kg N/ha");
    expect(two).not.toContain("No constraint");
    const one = nfixSoilText("lentil", 6, "CaCl2", 150);
    expect(one).toContain(`GRDC Communities]. No constraint: ${PEA_PH_6}; ${MO_CLEAR_6}. Not checked: B:`);
  });
  it("no constraint: the clear checks come after the head, with no 'No constraint' repeat", () => {
    const t = nfixSoilText("field pea", 6, "CaCl2");
    expect(t).toMatch(new RegExp(`^none found in the checks made: ${PEA_PH_6.replace(/[.()[\]]/g, "\\$&")}; Mo: `));
    expect(t).not.toContain("No constraint");
  });
  it("possible flags are joined by '; '; without any, nothing is added between the head and 'Not checked'", () => {
    expect(nfixSoilText("faba bean", 5, "CaCl2", 150)).toContain("[GRDC fact sheet 2013, N fixation of chickpeas and faba beans]; Mo: pH 5 (CaCl2) is at or below 5.5");
    expect(nfixSoilText("field pea", 6, "CaCl2")).toContain(`${MO_CLEAR_6}. Not checked: nitrate-N`);
  });
  it("the checks not made are joined by '; '", () => {
    expect(nfixSoilText("soybean", 6, "CaCl2")).toBe(
      `none found in the checks made: ${MO_CLEAR_6}. Not checked: pH for the rhizobia: no published level for soybean found; nitrate-N at sowing: no published suppression level for soybean found; B: no published soil-test level for soybean found.`,
    );
  });
});

describe("levels the data file does not hold today (a changed copy of legume-checks.json, mocked)", () => {
  // No pH row states "not stated" and no legume has all four levels; these probe the code's handling.
  const DATA = "../../../src/data/nitrogen/legume-checks.json";
  type FixSoil = typeof import("../../../src/core/nitrogen/fixation-soil");
  const withChangedData = (): FixSoil => {
    const copy = JSON.parse(JSON.stringify(table)) as typeof table;
    copy.ph_levels.find((l) => l.id === "pulse-acid")!.test = "not stated";
    copy.legumes.find((l) => l.id === "field pea")!.boron = "lucerne-hot-water" as unknown as null;
    let mod: FixSoil | undefined;
    jest.isolateModules(() => {
      jest.doMock(DATA, () => copy);
      mod = require("../../../src/core/nitrogen/fixation-soil") as FixSoil;
    });
    jest.dontMock(DATA);
    return mod!;
  };
  it("a pH level whose test is not stated is compared with either test, and the citation says so", () => {
    const m = withChangedData();
    const water = m.nfixSoilChecks("field pea", 5, "water", 40, 0.5)[0]!;
    expect(water.status).toBe("constraint");
    expect(water.text).toMatch(/^pH 5 \(water\) is below 5\.5: the rhizobia .* \[GRDC Paddock Practices 2022 \(SARDI\); the source does not state its pH test\]$/);
    expect(m.nfixSoilChecks("field pea", 6, "CaCl2", 40, 0.5)[0]!.text).toBe(
      "pH 6 (CaCl2) is not below 5.5 [GRDC Paddock Practices 2022 (SARDI); the source does not state its pH test]",
    );
  });
  it("with every check made, the screen ends after the clear checks: no 'Not checked'", () => {
    const m = withChangedData();
    const t = m.nfixSoilText("field pea", 6, "CaCl2", 40, 0.5);
    expect(t).toMatch(/; hot water B 0\.5 mg\/kg is not below 0\.34 \[Haddad & Kaldor 1982, Aust J Exp Agric Anim Husb 22:317\]\.$/);
    expect(t).not.toContain("Not checked");
  });
});
