/**
 * SOIL.SUFFICIENCY in core: published values land in the band their source gives, table choice,
 * CEC-dependent levels, refusals, and the integrity of every table file. Each check names its
 * Source (the same source the table row carries).
 */
import { sufficiencyBand, sufficiencyTableId, sufficiencyTables, SUFFICIENCY_ROWS } from "../../../src/core/bands/sufficiency";
import { errorCode as code } from "../../helpers/errors";


describe("Bray-1 P", () => {
  // Source: Magdoff & van Es (2009) Building Soils for Better Crops, SARE, Table 21.2 (published-values SUF-15):
  // low 0-15, optimum 15-24, high 24-31, very high > 31 ppm.
  it.each([
    [8, "Low"],
    [20, "Optimum"],
    [28, "High"],
    [45, "Very high"],
  ])("SARE Table 21.2: %s ppm is %s (crop-independent table)", (v, band) => {
    expect(sufficiencyBand("P", v, undefined, "Bray-1")).toBe(band);
  });
  it("SARE Table 21.2: the shared printed bound 15 goes to the band above (edge rule)", () => {
    expect(sufficiencyBand("P", 15, undefined, "Bray P1")).toBe("Optimum");
  });
  // Source: Vitosh, Johnson & Mengel (1995) Tri-State E-2567, via OSU Ag BMPs (SUF-01, seen):
  // critical level 15 ppm for corn/soybean, 25 ppm with wheat or alfalfa.
  it("Tri-State 1995: 12 ppm is below the corn critical level 15; 18 is above it", () => {
    expect(sufficiencyBand("P", 12, "corn", "Bray-1")).toBe("Below critical level");
    expect(sufficiencyBand("P", 18, "corn", "Bray-1")).toBe("At or above critical level");
  });
  it("Tri-State 1995: 18 ppm is below the wheat and alfalfa critical level 25", () => {
    expect(sufficiencyBand("P", 18, "wheat", "Bray-1")).toBe("Below critical level");
    expect(sufficiencyBand("P", 18, "lucerne", "bray1")).toBe("Below critical level");
  });
  it("a crop-specific table is preferred to the crop-independent one", () => {
    expect(sufficiencyTableId("P", "soybean", "Bray-1")).toBe("tristate1995-bray1-p-corn-soybean");
    expect(sufficiencyTableId("P", undefined, "Bray-1")).toBe("sare-bray1-p");
  });
  it("a crop without its own Bray-1 table reads the crop-independent one", () => {
    expect(sufficiencyTableId("P", "canola", "Bray-1")).toBe("sare-bray1-p");
  });
});

describe("Mehlich-3 P and K (Culman et al. 2020, Tri-State Bull. 974)", () => {
  // Source: OSU Ag BMPs restating Bull. 974 (SUF-03, seen): critical level 20 ppm corn/soybean,
  // 30 ppm with wheat or alfalfa; maintenance range to 50 ppm.
  it("18 ppm is deficient for corn (below 20); 25 is optimal", () => {
    expect(sufficiencyBand("P", 18, "corn", "Mehlich-3")).toBe("Deficient");
    expect(sufficiencyBand("P", 25, "maize", "M3")).toBe("Optimal");
  });
  it("25 ppm is deficient for wheat and alfalfa (below 30); 45 optimal; 60 sufficient (above 50)", () => {
    expect(sufficiencyBand("P", 25, "wheat", "Mehlich 3")).toBe("Deficient");
    expect(sufficiencyBand("P", 45, "alfalfa", "Mehlich-III")).toBe("Optimal");
    expect(sufficiencyBand("P", 60, "alfalfa", "Mehlich-3")).toBe("Sufficient");
  });
  it("at exactly the critical level the soil is optimal (no build-up below the critical level)", () => {
    expect(sufficiencyBand("P", 20, "soybean", "Mehlich-3")).toBe("Optimal");
  });
  // Source: A&L Great Lakes Laboratories' summary of Bull. 974 (SUF-05, seen there): K critical 100 ppm
  // for CEC 5 meq/100 g or less (maintenance 100-130), 120 ppm for CEC above 5 (maintenance 120-170).
  it("K 110 ppm: optimal on a sandy soil (CEC 4), deficient on a CEC 15 soil", () => {
    expect(sufficiencyBand("K", 110, "corn", "Mehlich-3", 4)).toBe("Optimal");
    expect(sufficiencyBand("K", 110, "corn", "Mehlich-3", 15)).toBe("Deficient");
  });
  it("K 150 ppm: sufficient at CEC 4 (above 130), optimal at CEC 15 (120-170)", () => {
    expect(sufficiencyBand("K", 150, "soybean", "Mehlich-3", 4)).toBe("Sufficient");
    expect(sufficiencyBand("K", 150, "soybean", "Mehlich-3", 15)).toBe("Optimal");
  });
  it("CEC exactly 5 is the sandy-soil row ('5 meq/100 g or less')", () => {
    expect(sufficiencyTableId("K", "wheat", "Mehlich-3", 5)).toBe("tristate2020-m3-k-cec-5-or-less");
    expect(sufficiencyTableId("K", "wheat", "Mehlich-3", 5.01)).toBe("tristate2020-m3-k-cec-above-5");
  });
  it("the CEC-dependent table needs cec", () => {
    expect(code(() => sufficiencyBand("K", 150, "corn", "Mehlich-3"))).toBe("MISSING_INPUT");
    expect(() => sufficiencyBand("K", 150, "corn", "Mehlich-3")).toThrow(/cec is needed/);
  });
  it("a bad cec is refused even where a table does not use it", () => {
    expect(code(() => sufficiencyBand("K", 150, "corn", "Mehlich-3", 0))).toBe("OUT_OF_RANGE");
    expect(code(() => sufficiencyBand("P", 25, "corn", "Mehlich-3", -3))).toBe("OUT_OF_RANGE");
  });
  it("cec is ignored by a table that does not depend on it", () => {
    expect(sufficiencyBand("P", 25, "corn", "Mehlich-3", 12)).toBe("Optimal");
  });
  it("the crop-specific Mehlich-3 tables need a crop", () => {
    expect(code(() => sufficiencyBand("P", 25, undefined, "Mehlich-3"))).toBe("MISSING_INPUT");
    expect(() => sufficiencyBand("P", 25, undefined, "Mehlich-3")).toThrow(/crop is needed/);
  });
});

describe("Olsen P index (Northern Ireland S.R. 2019/81, Sched. 5 para. 10; SUF-16, seen)", () => {
  it.each([
    [5, "Index 0"],
    [9, "Index 0"],
    [10, "Index 1"],
    [15, "Index 1"],
    [18, "Index 2-"],
    [23, "Index 2+"],
    [30, "Index 3"],
    [46, "Index 4"],
    [70, "Index 4"],
  ])("%s mg/L is %s", (v, index) => {
    expect(sufficiencyBand("P", v, undefined, "Olsen")).toBe(index);
  });
  it("9.5 mg/L, between the printed ranges 0-9 and 10-15, is index 0", () => {
    expect(sufficiencyBand("P", 9.5, undefined, "Olsen")).toBe("Index 0");
  });
  it("a soil index applies whatever the crop", () => {
    expect(sufficiencyBand("P", 30, "wheat", "Olsen")).toBe("Index 3");
  });
  it("above the published scale (71 mg/L and more) is not classified: #N/A", () => {
    expect(code(() => sufficiencyBand("P", 71, undefined, "Olsen"))).toBe("NO_REFERENCE_DATA");
    expect(() => sufficiencyBand("P", 85, undefined, "Olsen")).toThrow(/above the published scale/);
  });
});

describe("Colwell P (GRDC Update 2020, southern NSW: critical values for 90-95 % of maximum yield)", () => {
  // Source: GRDC Grains Research Update (2020) 'Budgeting phosphorus in medium and lower rainfall
  // zones of southern NSW' (seen): wheat 35 to 42, canola 22 to 27 mg P/kg.
  it("wheat: 30 below, 38 within, 50 above the critical range", () => {
    expect(sufficiencyBand("P", 30, "wheat", "Colwell")).toBe("Below critical range");
    expect(sufficiencyBand("P", 38, "wheat", "Colwell")).toMatch(/^Critical range/);
    expect(sufficiencyBand("P", 50, "wheat", "Colwell")).toBe("Above critical range");
  });
  it("canola: 30 mg/kg is above the canola range 22-27 but below the wheat range", () => {
    expect(sufficiencyBand("P", 30, "canola", "Colwell")).toBe("Above critical range");
  });
  it("no Colwell table for corn: #N/A listing what exists", () => {
    expect(code(() => sufficiencyBand("P", 30, "corn", "Colwell"))).toBe("NO_REFERENCE_DATA");
    expect(() => sufficiencyBand("P", 30, "corn", "Colwell")).toThrow(/wheat.*canola/);
  });
});

describe("plant tissue", () => {
  // Source: Plank, Plant Analysis Handbook for Georgia, UGA AESL 'Alfalfa' (SUF-18, seen): top 4-6 in
  // prior to or at 1/10 bloom; N 3.00-5.00, P 0.25-0.70, K 2.00-3.50, Ca 0.80-3.00, Mg 0.25-1.00 %.
  it.each([
    ["N", 2.5, "Below sufficiency range"],
    ["N", 4.2, "Sufficient"],
    ["P", 0.3, "Sufficient"],
    ["K", 1.6, "Below sufficiency range"],
    ["Ca", 1.5, "Sufficient"],
    ["Mg", 1.2, "Above sufficiency range"],
  ])("alfalfa %s %s %% is %s", (n, v, band) => {
    expect(sufficiencyBand(n as string, v as number, "alfalfa", "tissue")).toBe(band);
  });
  it("the alfalfa tables record the sampled part and growth stage", () => {
    const t = sufficiencyTables().find((x) => x.id === "uga-alfalfa-tissue-k")!;
    expect(t.sampling).toBe("top 4 to 6 inches of the plant, prior to or at 1/10 bloom");
  });
  // Source: Yin & Vyn (2002) via OMAFA Field Crop News 2025 'Plant tissue analysis', Table 1 (SUF-20, seen):
  // top fully developed trifoliate at first flower; critical / maximum normal N 4.0/6.0 %, P 0.35/0.5 %,
  // K 2.0/3.0 %, Mg 0.10/2.0 %, B 20/55, Mn 14/100, Zn 12/80 (ppm).
  it.each([
    ["N", 3.8, "Below critical concentration"],
    ["N", 5.0, "Normal"],
    ["P", 0.3, "Below critical concentration"],
    ["K", 3.2, "Above maximum normal"],
    ["Mg", 0.5, "Normal"],
    ["B", 30, "Normal"],
    ["Mn", 10, "Below critical concentration"],
    ["Zn", 90, "Above maximum normal"],
  ])("soybean %s %s is %s", (n, v, band) => {
    expect(sufficiencyBand(n as string, v as number, "soybean", "plant tissue")).toBe(band);
  });
  it("a tissue percentage above 100 is refused", () => {
    expect(code(() => sufficiencyBand("N", 120, "alfalfa", "tissue"))).toBe("OUT_OF_RANGE");
  });
  it("no tissue table for corn: #N/A", () => {
    expect(code(() => sufficiencyBand("N", 3, "corn", "tissue"))).toBe("NO_REFERENCE_DATA");
  });
  it("no soybean Ca table (the source gives no critical concentration)", () => {
    expect(code(() => sufficiencyBand("Ca", 1, "soybean", "tissue"))).toBe("NO_REFERENCE_DATA");
  });
});

describe("refusals", () => {
  it("the method is required, and the message lists the methods that exist", () => {
    expect(code(() => sufficiencyBand("P", 20, "corn"))).toBe("MISSING_INPUT");
    expect(() => sufficiencyBand("P", 20, "corn")).toThrow(/Bray-1, Mehlich-3, Olsen, Colwell or tissue/);
  });
  it("ammonium acetate K: the method is known but no table is held (#N/A listing what exists)", () => {
    expect(code(() => sufficiencyBand("K", 150, "corn", "ammonium acetate", 12))).toBe("NO_REFERENCE_DATA");
    expect(() => sufficiencyBand("K", 150, "corn", "NH4OAc")).toThrow(/K Mehlich-3/);
  });
  it("a nutrient with no table at all is #N/A", () => {
    expect(code(() => sufficiencyBand("Fe", 50, "soybean", "tissue"))).toBe("NO_REFERENCE_DATA");
    expect(code(() => sufficiencyBand("S", 0.3, "alfalfa", "tissue"))).toBe("NO_REFERENCE_DATA");
  });
  it("unknown words list the accepted ones (#VALUE!)", () => {
    expect(code(() => sufficiencyBand("Px", 20, "corn", "Bray-1"))).toBe("UNKNOWN_NAME");
    expect(code(() => sufficiencyBand("P", 20, "corn", "Truog"))).toBe("UNKNOWN_NAME");
    expect(code(() => sufficiencyBand("P", 20, "rice", "Bray-1"))).toBe("UNKNOWN_NAME");
    expect(() => sufficiencyBand("P", 20, "rice", "Bray-1")).toThrow(/corn, soybean, wheat, alfalfa, canola or any/);
  });
  it("a negative soil test is refused, not clamped", () => {
    expect(code(() => sufficiencyBand("P", -1, "corn", "Mehlich-3"))).toBe("OUT_OF_RANGE");
  });
});

describe("every table file", () => {
  it("each row has a source, a status, ascending limits and one label more than limits", () => {
    for (const r of SUFFICIENCY_ROWS) {
      expect(r.source.length).toBeGreaterThan(20);
      expect(r.seen_at).toMatch(/^https?:\/\//);
      expect(r.status.length).toBeGreaterThan(3);
      expect(r.labels.length).toBe(r.limits.length + 1);
      r.limits.forEach((l, i) => i === 0 || expect(l).toBeGreaterThan(r.limits[i - 1] as number));
      expect(r.crops.length).toBeGreaterThan(0);
    }
  });
  it("row ids are unique and every row is reachable through sufficiencyBand's choice rules", () => {
    const ids = SUFFICIENCY_ROWS.map((r) => r.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const r of SUFFICIENCY_ROWS) {
      const crop = r.crops[0] === "any" ? undefined : r.crops[0];
      const cec = r.cec ? (r.cec.max ?? (r.cec.above as number) + 1) : undefined;
      expect(sufficiencyTableId(r.nutrient, crop, r.method, cec)).toBe(r.id);
    }
  });
  it("sufficiencyTables lists every table with nutrient, method, crop, unit and source", () => {
    const list = sufficiencyTables();
    expect(list.length).toBe(SUFFICIENCY_ROWS.length);
    for (const t of list) {
      expect(t.nutrient && t.method && t.crop && t.unit && t.source).toBeTruthy();
    }
    expect(list.find((t) => t.id === "tristate2020-m3-k-cec-5-or-less")!.cec).toBe("CEC ≤ 5 cmol(+)/kg");
  });
});
