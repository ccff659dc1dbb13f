/**
 * SOIL.SUFFICIENCY in core: published values land in the band their source gives, each table's
 * own edge rule at every limit, table choice (crop, rotation, CEC, table id), refusals, and the
 * integrity of every table file. Each check names its source (the same source the table row
 * carries) and how it was seen.
 */
import { sufficiencyBand, sufficiencyTableId, sufficiencyTables, SUFFICIENCY_ROWS, SufficiencyRow } from "../../../src/core/bands/sufficiency";
import { knownCombinations, readCrop } from "../../../src/core/bands/sufficiency-rows";
import { errorCode as code, errorMessage } from "../../helpers/errors";

/** The crop argument that reaches a row: its rotation, its first crop, or none. */
function cropFor(r: (typeof SUFFICIENCY_ROWS)[number]): string | undefined {
  if (r.crops.includes("any")) return undefined;
  if (r.rotation?.only) return r.rotation.only.length > 1 ? r.rotation.only.join("-") : `${r.rotation.only[0]}-${r.rotation.only[0]}`;
  if (r.rotation?.includes_any) return r.rotation.includes_any[0];
  return r.crops[0];
}
const cecFor = (r: (typeof SUFFICIENCY_ROWS)[number]) => (r.cec ? (r.cec.max ?? (r.cec.above as number) + 1) : undefined);
/** Reads a row by its own table id, in its own unit and depth, so rows that need one (a stage) are reached the same way. */
const bandOf = (r: (typeof SUFFICIENCY_ROWS)[number], v: number) => sufficiencyBand(r.nutrient, v, cropFor(r), r.method, cecFor(r), r.id, r.unit, r.depth_cm);
const tiny = (x: number) => Math.max(1e-9, Math.abs(x) * 1e-9);

describe("each built-in table's own edge rule, at every limit", () => {
  // Source: each row's at_limit, which its edge_rule derives from the source's printed form (the
  // row's source field names the source and how it was seen).
  for (const r of SUFFICIENCY_ROWS) {
    r.limits.forEach((limit, i) => {
      const rule = r.at_limit[i];
      it(`${r.id}: limit ${i + 1} (${limit} ${r.unit}) — just below, at (${rule}), just above`, () => {
        expect(bandOf(r, limit - tiny(limit))).toBe(r.labels[i]);
        if (rule === "none") expect(code(() => bandOf(r, limit))).toBe("NO_REFERENCE_DATA");
        else expect(bandOf(r, limit)).toBe(r.labels[rule === "above" ? i + 1 : i]);
        if (r.scale_top === undefined || limit + tiny(limit) < r.scale_top) expect(bandOf(r, limit + tiny(limit))).toBe(r.labels[i + 1]);
      });
    });
  }
});

describe("Bray-1 P", () => {
  // Source: Magdoff & van Es (2009) Building Soils for Better Crops, SARE, Table 21.2 (published-values
  // SUF-15, seen): low 0-15, optimum 15-24, high 24-31, very high > 31 ppm.
  it.each([
    [8, "Low"],
    [20, "Optimum"],
    [28, "High"],
    [45, "Very high"],
  ])("SARE Table 21.2: %s ppm is %s (crop-independent table)", (v, band) => {
    expect(sufficiencyBand("P", v, undefined, "Bray-1")).toBe(band);
  });
  it("SARE Table 21.2: 31 is High, as printed '24-31' (not Very high, '> 31')", () => {
    expect(sufficiencyBand("P", 31, undefined, "Bray-1")).toBe("High");
  });
  it("SARE Table 21.2: the shared printed bounds 15 and 24 stay in the range they close", () => {
    expect(sufficiencyBand("P", 15, undefined, "Bray P1")).toBe("Low");
    expect(sufficiencyBand("P", 24, undefined, "Bray P1")).toBe("Optimum");
  });
  // Source: Vitosh, Johnson & Mengel (1995) Tri-State E-2567, via OSU Ag BMPs (SUF-01, seen): 'less than
  // 15 PPM ... in a corn/soybean rotation'; 'if the crop rotation includes wheat or alfalfa ... less than 25 PPM'.
  it("Tri-State 1995, corn-soybean rotation: 14 ppm below the critical level, 15 at it", () => {
    expect(sufficiencyBand("P", 14, "corn-soybean", "Bray-1")).toBe("Below critical level");
    expect(sufficiencyBand("P", 15, "corn-soybean", "Bray-1")).toBe("At or above critical level");
  });
  it("Tri-State 1995: corn in a corn-soybean-wheat rotation reads the 25 ppm level", () => {
    expect(sufficiencyBand("P", 18, "corn-soybean-wheat", "Bray-1")).toBe("Below critical level");
    expect(sufficiencyTableId("P", "corn/soybean/wheat", "Bray-1")).toBe("tristate1995-bray1-p-wheat-alfalfa");
  });
  it("Tri-State 1995: wheat or alfalfa alone settles it (the rotation includes it)", () => {
    expect(sufficiencyBand("P", 18, "wheat", "Bray-1")).toBe("Below critical level");
    expect(sufficiencyBand("P", 18, "lucerne", "bray1")).toBe("Below critical level");
  });
  it("Tri-State 1995: corn alone does not say the rotation, so it is refused with the hint, not sent to another table", () => {
    expect(code(() => sufficiencyBand("P", 18, "corn", "Bray-1"))).toBe("MISSING_INPUT");
    expect(errorMessage(() => sufficiencyBand("P", 18, "corn", "Bray-1"))).toMatch(/corn-soybean/);
  });
  it("a crop the rotation tables do not cover reads the crop-independent table", () => {
    expect(sufficiencyTableId("P", "canola", "Bray-1")).toBe("sare-bray1-p");
    expect(sufficiencyTableId("P", "barley", "Bray-1")).toBe("sare-bray1-p");
  });
  // Source: Making More from Sheep (AWI and MLA), Tool 7.3 (seen): Bray and Olsen P for improved
  // pastures, 0-10 cm: responsive < 12, marginal response 12-15, generally non responsive > 15.
  it.each([
    [11, "Responsive"],
    [12, "Marginal response"],
    [15, "Marginal response"],
    [16, "Generally non-responsive"],
  ])("Making More from Sheep, pasture: Bray P %s mg/kg (0-10 cm) is %s", (v, band) => {
    expect(sufficiencyBand("P", v, "pasture", "Bray-1", undefined, undefined, undefined, 10)).toBe(band);
  });
  it("Making More from Sheep: the pasture levels are for a 0-10 cm sample, so depth_cm is needed and must be 10", () => {
    expect(code(() => sufficiencyBand("P", 13, "pasture", "Bray-1"))).toBe("MISSING_INPUT");
    expect(errorMessage(() => sufficiencyBand("P", 13, "pasture", "Bray-1"))).toMatch(/depth_cm is needed.*0-10 cm/);
    expect(code(() => sufficiencyBand("P", 13, "pasture", "Bray-1", undefined, undefined, undefined, 15))).toBe("NO_REFERENCE_DATA");
  });
  it("the choice of source by crop is documented, not hidden: barley reads SARE, wheat the Tri-State level, and either can be named", () => {
    // Sources as above: SARE Table 21.2 (crop-independent) and Tri-State 1995 (rotations with wheat).
    expect(sufficiencyTableId("P", "barley", "Bray-1")).toBe("sare-bray1-p");
    expect(sufficiencyTableId("P", "wheat", "Bray-1")).toBe("tristate1995-bray1-p-wheat-alfalfa");
    expect(sufficiencyBand("P", 20, "wheat", "Bray-1", undefined, "sare-bray1-p")).toBe("Optimum");
    expect(sufficiencyBand("P", 20, "wheat", "Bray-1")).toBe("Below critical level");
  });
});

describe("Mehlich-3 P and K (Culman et al. 2020, Tri-State Bull. 974), keyed by rotation", () => {
  // Source: OSU Ag BMPs restating Bull. 974 (SUF-03, seen): 'less than 20 PPM ... Mehlich III ... in a
  // corn/soybean rotation'; 'if the crop rotation includes wheat or alfalfa ... less than 30 PPM';
  // 'from above the critical level to 50 PPM is called the maintenance range'; 'once STP level reach
  // 50 PPM, no additional fertilizer application is suggested'.
  it("the issue's case: 25 ppm for corn in a corn-soybean-wheat rotation is Deficient (critical level 30)", () => {
    expect(sufficiencyBand("P", 25, "corn-soybean-wheat", "Mehlich-3")).toBe("Deficient");
  });
  it("25 ppm in a corn-soybean rotation is Optimal (critical level 20)", () => {
    expect(sufficiencyBand("P", 25, "corn-soybean", "M3")).toBe("Optimal");
    expect(sufficiencyBand("P", 25, "maize-soya", "Mehlich III")).toBe("Optimal");
  });
  it("corn alone is refused: the critical level depends on the rotation", () => {
    expect(code(() => sufficiencyBand("P", 25, "corn", "Mehlich-3"))).toBe("MISSING_INPUT");
  });
  it("the corn-soybean maintenance range runs to 50 ppm (the OSU page), not 40", () => {
    expect(sufficiencyBand("P", 45, "corn-soybean", "Mehlich-3")).toBe("Optimal");
    expect(sufficiencyBand("P", 50, "corn-soybean", "Mehlich-3")).toBe("Sufficient");
  });
  it("wheat/alfalfa rotation: 25 Deficient, 30 Optimal, 45 Optimal, 50 Sufficient", () => {
    expect(sufficiencyBand("P", 25, "wheat", "Mehlich 3")).toBe("Deficient");
    expect(sufficiencyBand("P", 30, "corn-alfalfa", "Mehlich-3")).toBe("Optimal");
    expect(sufficiencyBand("P", 45, "alfalfa", "Mehlich-III")).toBe("Optimal");
    expect(sufficiencyBand("P", 50, "alfalfa", "Mehlich-3")).toBe("Sufficient");
  });
  it("a continuous crop is written as a rotation of itself", () => {
    expect(sufficiencyTableId("P", "corn-corn", "Mehlich-3")).toBe("tristate2020-m3-p-corn-soybean");
  });
  it("a rotation with a crop outside the Tri-State crops has no table (#N/A)", () => {
    expect(code(() => sufficiencyBand("P", 25, "corn-soybean-canola", "Mehlich-3"))).toBe("NO_REFERENCE_DATA");
  });
  // Source: A&L Great Lakes Laboratories' summary of Bull. 974 (seen): K critical 100 ppm for CEC 5
  // meq/100 g or less, 'the maintenance range is 100 ppm to 130 ppm'; 120 ppm for CEC above 5, '120 ppm to 170 ppm'.
  it("K 110 ppm: optimal on a sandy soil (CEC 4), deficient on a CEC 15 soil", () => {
    expect(sufficiencyBand("K", 110, "corn", "Mehlich-3", 4)).toBe("Optimal");
    expect(sufficiencyBand("K", 110, "corn", "Mehlich-3", 15)).toBe("Deficient");
  });
  it("K at the top of a maintenance range is still Optimal ('100 ppm to 130 ppm')", () => {
    expect(sufficiencyBand("K", 130, "soybean", "Mehlich-3", 4)).toBe("Optimal");
    expect(sufficiencyBand("K", 170, "soybean", "Mehlich-3", 15)).toBe("Optimal");
    expect(sufficiencyBand("K", 171, "soybean", "Mehlich-3", 15)).toBe("Sufficient");
  });
  it("K levels are the same for every Tri-State crop, so a rotation reads them too", () => {
    expect(sufficiencyBand("K", 150, "corn-soybean-wheat", "Mehlich-3", 15)).toBe("Optimal");
  });
  it("CEC exactly 5 is the sandy-soil row ('5 meq/100 g or less')", () => {
    expect(sufficiencyTableId("K", "wheat", "Mehlich-3", 5)).toBe("tristate2020-m3-k-cec-5-or-less");
    expect(sufficiencyTableId("K", "wheat", "Mehlich-3", 5.01)).toBe("tristate2020-m3-k-cec-above-5");
  });
  it("the CEC-dependent table needs cec", () => {
    expect(code(() => sufficiencyBand("K", 150, "corn", "Mehlich-3"))).toBe("MISSING_INPUT");
  });
  it("a bad cec is refused even where a table does not use it", () => {
    expect(code(() => sufficiencyBand("K", 150, "corn", "Mehlich-3", 0))).toBe("OUT_OF_RANGE");
    expect(code(() => sufficiencyBand("P", 25, "corn-soybean", "Mehlich-3", -3))).toBe("OUT_OF_RANGE");
  });
  it("cec is ignored by a table that does not depend on it", () => {
    expect(sufficiencyBand("P", 25, "corn-soybean", "Mehlich-3", 12)).toBe("Optimal");
  });
  it("the Mehlich-3 P tables need a crop or rotation", () => {
    expect(code(() => sufficiencyBand("P", 25, undefined, "Mehlich-3"))).toBe("MISSING_INPUT");
  });
});

describe("Olsen P", () => {
  // Source: Northern Ireland S.R. 2019/81, Sched. 5 para. 10 (SUF-16, seen): index 0: 0-9, 1: 10-15,
  // 2-: 16-20, 2+: 21-25, 3: 26-45, 4: 46-70 mg P/l.
  it.each([
    [9, "Index 0"],
    [10, "Index 1"],
    [15, "Index 1"],
    [18, "Index 2-"],
    [23, "Index 2+"],
    [30, "Index 3"],
    [70, "Index 4"],
  ])("NI index: %s mg P per litre of soil is %s", (v, index) => {
    expect(sufficiencyBand("P", v, undefined, "Olsen", undefined, undefined, "mg/dm3")).toBe(index);
  });
  it("9.5 mg/dm3, between the printed ranges 0-9 and 10-15, is index 0", () => {
    expect(sufficiencyBand("P", 9.5, undefined, "Olsen", undefined, undefined, "mg/dm3")).toBe("Index 0");
  });
  it("above the published scale (71 mg/dm3 and more) is not classified: #N/A", () => {
    expect(code(() => sufficiencyBand("P", 71, undefined, "Olsen", undefined, undefined, "mg dm-3"))).toBe("NO_REFERENCE_DATA");
  });
  it("the issue's case: Olsen P 13 for wheat without a unit is refused, naming both bases and how to proceed", () => {
    // Australian labs report Olsen P per kg of soil; the NI index is per litre of soil (S.R. 2019/81, 'mg P/l').
    expect(code(() => sufficiencyBand("P", 13, "wheat", "Olsen"))).toBe("MISSING_INPUT");
    const m = errorMessage(() => sufficiencyBand("P", 13, "wheat", "Olsen"));
    expect(m).toMatch(/unit is needed/);
    expect(m).toMatch(/"mg\/dm3" and "mg\/kg"/);
    expect(m).toMatch(/bulk density/);
  });
  it("Olsen P in mg/kg is never read against the per-litre index: #N/A naming the index and the conversion", () => {
    expect(code(() => sufficiencyBand("P", 13, "wheat", "Olsen", undefined, undefined, "mg/kg"))).toBe("NO_REFERENCE_DATA");
    expect(errorMessage(() => sufficiencyBand("P", 13, "wheat", "Olsen", undefined, undefined, "ppm"))).toMatch(/another unit: P Olsen \(any crop; mg\/dm3\).*SOIL\.CONVERT/);
    expect(code(() => sufficiencyBand("P", 13, "wheat", "Olsen", undefined, "ni2019-olsen-p-index", "mg/kg"))).toBe("NOT_APPLICABLE");
  });
  it("mg/L is refused as a unit word (an extract concentration), with mg/dm3 offered for a litre of soil", () => {
    expect(code(() => sufficiencyBand("P", 13, undefined, "Olsen", undefined, undefined, "mg/L"))).toBe("UNIT_MISMATCH");
    expect(errorMessage(() => sufficiencyBand("P", 13, undefined, "Olsen", undefined, undefined, "mg/L"))).toMatch(/mg\/dm3/);
  });
  it("a rate per area or a charge is not a soil-test basis: #VALUE! saying to convert first", () => {
    expect(code(() => sufficiencyBand("P", 26, "corn-soybean", "Mehlich-3", undefined, undefined, "lb/ac"))).toBe("UNIT_MISMATCH");
    expect(code(() => sufficiencyBand("K", 0.3, "corn", "Mehlich-3", 12, undefined, "cmol(+)/kg"))).toBe("UNIT_MISMATCH");
  });
  it("naming the NI table still needs the unit: the name says which table, not which basis the value is in", () => {
    expect(code(() => sufficiencyBand("P", 30, undefined, "Olsen", undefined, "ni2019-olsen-p-index"))).toBe("MISSING_INPUT");
    expect(sufficiencyBand("P", 30, undefined, "Olsen", undefined, "ni2019-olsen-p-index", "mg/dm3")).toBe("Index 3");
  });
  // Source: Making More from Sheep (AWI and MLA), Tool 7.3 (seen): Olsen P for improved pastures,
  // 0-10 cm, mg P/kg: responsive < 12, marginal response 12-15, generally non responsive > 15.
  it("a pasture value per kg (0-10 cm) reads the pasture table; per litre of soil it reads the NI index, which covers grassland", () => {
    expect(sufficiencyBand("P", 13, "pasture", "Olsen", undefined, undefined, "mg/kg", 10)).toBe("Marginal response");
    expect(sufficiencyBand("P", 13, "pasture", "Olsen", undefined, undefined, "mg/dm3")).toBe("Index 1");
    expect(sufficiencyBand("P", 13, "wheat", "Olsen", undefined, undefined, "mg/dm3")).toBe("Index 1");
  });
});

describe("Colwell P (GRDC Update 2020, southern NSW: critical values for 90-95 % of maximum yield)", () => {
  // Source: GRDC Grains Research Update (2020) 'Budgeting phosphorus in medium and lower rainfall
  // zones of southern NSW' (seen): wheat 35 to 42, canola 22 to 27 mg P/kg.
  it("wheat: 30 below, 35 and 42 within (a closed range), 50 above", () => {
    expect(sufficiencyBand("P", 30, "wheat", "Colwell")).toBe("Below critical range");
    expect(sufficiencyBand("P", 35, "wheat", "Colwell")).toMatch(/^Critical range/);
    expect(sufficiencyBand("P", 42, "wheat", "Colwell")).toMatch(/^Critical range/);
    expect(sufficiencyBand("P", 50, "wheat", "Colwell")).toBe("Above critical range");
  });
  it("canola: 30 mg/kg is above the canola range 22-27", () => {
    expect(sufficiencyBand("P", 30, "canola", "Colwell")).toBe("Above critical range");
  });
  it("no Colwell table for barley: #N/A listing what exists", () => {
    expect(code(() => sufficiencyBand("P", 30, "barley", "Colwell"))).toBe("NO_REFERENCE_DATA");
    expect(errorMessage(() => sufficiencyBand("P", 30, "barley", "Colwell"))).toMatch(/wheat.*canola/);
  });
  it("no Colwell K table is held (no readable source): #N/A", () => {
    expect(code(() => sufficiencyBand("K", 120, "wheat", "Colwell"))).toBe("NO_REFERENCE_DATA");
  });
});

describe("KCl-40 sulfur (Anderson, Peverill & Brennan 2013, CPS 64:523, abstract, seen; 0-30 cm)", () => {
  // Source: Anderson et al. (2013) abstract: WA wheat CSTV 2.8, CSTR 2.4-3.2 mg/kg; canola CSTV 7.2,
  // CSTR 6.8-7.5 mg/kg; sampling depth to 30 cm.
  const WHEAT = "anderson2013-kcl40-s-wheat";
  it("wheat, the table named: 2.0 below, 2.8 (the CSTV) within, 4.0 above the critical range", () => {
    expect(sufficiencyBand("S", 2.0, "wheat", "KCl-40", undefined, WHEAT, undefined, 30)).toBe("Below critical range");
    expect(sufficiencyBand("S", 2.8, "wheat", "KCl40", undefined, WHEAT, "mg/kg", 30)).toMatch(/^Critical range/);
    expect(sufficiencyBand("S", 4.0, "wheat", "KCl-40", undefined, WHEAT, undefined, 30)).toBe("Above critical range");
  });
  it("wheat without the table named is refused: GRDC's fact sheet (2014) gives 4.6 (4 to 5.3) for all soils at the same depth", () => {
    // Source: GRDC fact sheet 'Soil testing for crop nutrition' (2014), elibrary.grdc.com.au (seen):
    // 'The critical wheat soil S test value measured in the 0 to 30cm soil layer is 4.6 (4 to 5.3) mgS/kg for all soils'.
    expect(code(() => sufficiencyBand("S", 4, "wheat", "KCl-40", undefined, undefined, undefined, 30))).toBe("MISSING_INPUT");
    const m = errorMessage(() => sufficiencyBand("S", 4, "wheat", "KCl-40", undefined, undefined, undefined, 30));
    expect(m).toMatch(/read only when named/);
    expect(m).toMatch(/4\.6 \(4 to 5\.3\)/);
    expect(m).toContain(WHEAT);
  });
  it("canola: 7.2 (the CSTV) is within 6.8-7.5; 6.0 below (0-30 cm)", () => {
    expect(sufficiencyBand("S", 7.2, "canola", "KCl-40", undefined, undefined, undefined, 30)).toMatch(/^Critical range/);
    expect(sufficiencyBand("S", 6.0, "canola", "KCl-40", undefined, undefined, undefined, 30)).toBe("Below critical range");
  });
  it("the criteria are for a 0-30 cm core: depth_cm is needed, and 10 (a topsoil core) is not read against them", () => {
    expect(code(() => sufficiencyBand("S", 7.2, "canola", "KCl-40"))).toBe("MISSING_INPUT");
    expect(errorMessage(() => sufficiencyBand("S", 7.2, "canola", "KCl-40"))).toMatch(/depth_cm is needed.*0-30 cm/);
    expect(code(() => sufficiencyBand("S", 7.2, "canola", "KCl-40", undefined, undefined, undefined, 10))).toBe("NO_REFERENCE_DATA");
    expect(code(() => sufficiencyBand("S", 7.2, "canola", "KCl-40", undefined, "anderson2013-kcl40-s-canola", undefined, 10))).toBe("NOT_APPLICABLE");
    expect(code(() => sufficiencyBand("S", 7.2, "canola", "KCl-40", undefined, "anderson2013-kcl40-s-canola"))).toBe("MISSING_INPUT");
  });
  it("a depth outside 0-300 cm is refused, even where no table uses it", () => {
    expect(code(() => sufficiencyBand("S", 7.2, "canola", "KCl-40", undefined, undefined, undefined, 0))).toBe("OUT_OF_RANGE");
    expect(code(() => sufficiencyBand("P", 25, "corn-soybean", "Mehlich-3", undefined, undefined, undefined, 400))).toBe("OUT_OF_RANGE");
  });
  it("a table whose source states no depth takes any depth_cm (Tri-State 2020 states none in the part seen)", () => {
    expect(sufficiencyBand("P", 25, "corn-soybean", "Mehlich-3", undefined, undefined, undefined, 20)).toBe("Optimal");
  });
  it("the table records its sampling depth", () => {
    expect(sufficiencyTables().find((t) => t.id === "anderson2013-kcl40-s-wheat")!.sampling).toBe("0-30 cm");
  });
  it("a wheat-canola rotation is refused: the tables are for the crop grown", () => {
    expect(code(() => sufficiencyBand("S", 5, "wheat-canola", "KCl-40", undefined, undefined, undefined, 30))).toBe("MISSING_INPUT");
  });
  it("no KCl-40 table for barley (#N/A)", () => {
    expect(code(() => sufficiencyBand("S", 5, "barley", "KCl-40"))).toBe("NO_REFERENCE_DATA");
  });
});

describe("micronutrients", () => {
  // Source: Havlin et al. (1999) via Table 12 of J. Ecology and Environment (2019), s41610-019-0104-9
  // (secondary, seen): DTPA Zn low 0-0.5, marginal 0.6-1, high > 1; Cu 0-0.4, 0.4-0.6, > 0.6;
  // Mn < 1, > 1; Fe 0-2.5, 2.6-4.5, > 4.5 mg/kg.
  it.each([
    ["Zn", 0.4, "Low (deficient)"],
    ["Zn", 0.8, "Marginal"],
    ["Zn", 1.5, "High (sufficient)"],
    ["Cu", 0.5, "Marginal"],
    ["Mn", 0.5, "Low (deficient)"],
    ["Mn", 3, "High (sufficient)"],
    ["Fe", 3.5, "Marginal"],
  ])("DTPA %s %s mg/kg is %s, whatever the crop", (n, v, band) => {
    expect(sufficiencyBand(n as string, v as number, "wheat", "DTPA")).toBe(band);
  });
  it("DTPA Mn of exactly 1 is in neither printed class: #N/A, not a guess", () => {
    expect(code(() => sufficiencyBand("Mn", 1, undefined, "DTPA"))).toBe("NO_REFERENCE_DATA");
  });
  // Source: Rutgers NJAES Soil Testing Laboratory, relative levels of nutrients (SUF-13, seen):
  // Mehlich-3 Zn critical 1.0, high 50; Cu 0.5, 20; B 0.5, 20; Fe 50, 100 ppm.
  it.each([
    ["Zn", 0.8, "Below critical level (deficient)"],
    ["Zn", 1.0, "Critical level to high"],
    ["Cu", 25, "Above high (warning)"],
    ["B", 0.5, "Critical level to high"],
    ["Fe", 40, "Below critical level (deficient)"],
  ])("Mehlich-3 %s %s ppm is %s", (n, v, band) => {
    expect(sufficiencyBand(n as string, v as number, undefined, "Mehlich-3")).toBe(band);
  });
  it("no hot-CaCl2 boron table is held (no readable source names the extraction): #N/A, whichever way the method is spelt", () => {
    expect(code(() => sufficiencyBand("B", 1, "canola", "hot CaCl2"))).toBe("NO_REFERENCE_DATA");
    expect(code(() => sufficiencyBand("B", 1, "canola", "hot-CaCl2"))).toBe("NO_REFERENCE_DATA");
    expect(code(() => sufficiencyBand("B", 1, "canola", "Hot-CaCl2 B"))).toBe("NO_REFERENCE_DATA");
  });
});

describe("plant tissue", () => {
  // Source: Plank, Plant Analysis Handbook for Georgia, UGA AESL 'Alfalfa' (SUF-18, seen): top 4-6 in
  // prior to or at 1/10 bloom; N 3.00-5.00, P 0.25-0.70, K 2.00-3.50, Ca 0.80-3.00, Mg 0.25-1.00 %.
  it.each([
    ["N", 2.5, "Below sufficiency range"],
    ["N", 4.2, "Sufficient"],
    ["K", 1.6, "Below sufficiency range"],
    ["Mg", 1.2, "Above sufficiency range"],
  ])("alfalfa %s %s %% is %s", (n, v, band) => {
    expect(sufficiencyBand(n as string, v as number, "alfalfa", "tissue")).toBe(band);
  });
  it("UGA alfalfa N 5.00 % is Sufficient: the printed range 3.00-5.00 includes its ends", () => {
    expect(sufficiencyBand("N", 5.0, "alfalfa", "tissue")).toBe("Sufficient");
    expect(sufficiencyBand("N", 3.0, "lucerne", "tissue")).toBe("Sufficient");
  });
  // Source: Penn State Extension, Forages, 'Boron and Forages' (seen): 30 ppm in the top one-third of
  // alfalfa between bud and one-tenth bloom; 20 ppm for clover.
  it("Penn State: alfalfa B 25 ppm is below the 30 ppm sufficiency level; clover B 22 is at or above 20", () => {
    expect(sufficiencyBand("B", 25, "alfalfa", "tissue")).toBe("Below sufficiency level");
    expect(sufficiencyBand("B", 22, "clover", "tissue")).toBe("At or above sufficiency level");
  });
  it("the alfalfa boron table records its own part and stage", () => {
    expect(sufficiencyTables().find((t) => t.id === "psu-alfalfa-tissue-b")!.sampling).toBe("top one-third of the plant, between bud and one-tenth bloom");
  });
  // Source: Yin & Vyn (2002) via OMAFA Field Crop News 2025 'Plant tissue analysis', Table 1 (SUF-20,
  // seen): top fully developed trifoliate at first flower; critical / maximum normal N 4.0/6.0 %,
  // P 0.35/0.5 %, K 2.0/3.0 %, Mg 0.10/2.0 %, B 20/55, Cu 4/30, Mn 14/100, Mo 0.5/5, Zn 12/80 (ppm).
  it("OMAFA soybean P 0.35 % is Below critical concentration: yield loss is expected at or below it", () => {
    expect(sufficiencyBand("P", 0.35, "soybean", "tissue")).toBe("Below critical concentration");
  });
  it.each([
    ["N", 5.0, "Normal"],
    ["K", 3.2, "Above maximum normal"],
    ["B", 20, "Below critical concentration"],
    ["B", 55, "Normal"],
    ["Cu", 4.5, "Normal"],
    ["Mn", 10, "Below critical concentration"],
    ["Mo", 0.5, "Below critical concentration"],
    ["Zn", 80, "Normal"],
    ["Zn", 90, "Above maximum normal"],
  ])("soybean %s %s is %s", (n, v, band) => {
    expect(sufficiencyBand(n as string, v as number, "soybean", "plant tissue")).toBe(band);
  });
  // Source: Jones, Ruckman, Williams & Koenigs (1980) Agron. J. 72:1043 (abstract, seen): total S in
  // the three youngest fully expanded leaves for 90 % of maximum yield, 0.20 % at 60 and 0.08 % at
  // 133 days from planting.
  it("subclover S has two stages: without a table id it is refused, listing both ids", () => {
    expect(code(() => sufficiencyBand("S", 0.15, "subclover", "tissue"))).toBe("MISSING_INPUT");
    expect(errorMessage(() => sufficiencyBand("S", 0.15, "sub clover", "tissue"))).toMatch(/jones1980-subclover-tissue-s-60d.*jones1980-subclover-tissue-s-133d/);
  });
  it("subclover S 0.15 %: below the 60-day critical level, above the 133-day one", () => {
    expect(sufficiencyBand("S", 0.15, "subclover", "tissue", undefined, "jones1980-subclover-tissue-s-60d")).toMatch(/^Below/);
    expect(sufficiencyBand("S", 0.15, "subclover", "tissue", undefined, "jones1980-subclover-tissue-s-133d")).toBe("At or above critical level");
  });
  it("a tissue percentage above 100 is refused", () => {
    expect(code(() => sufficiencyBand("N", 120, "alfalfa", "tissue"))).toBe("OUT_OF_RANGE");
    expect(code(() => sufficiencyBand("N", 1200, "alfalfa", "tissue", undefined, undefined, "g/kg"))).toBe("OUT_OF_RANGE");
  });
  it("a tissue value in g/kg is converted exactly to the table's % (UGA alfalfa N 3.00-5.00 %: 30 and 50 g/kg are in the range)", () => {
    expect(sufficiencyBand("N", 30, "alfalfa", "tissue", undefined, undefined, "g/kg")).toBe("Sufficient");
    expect(sufficiencyBand("N", 50, "alfalfa", "tissue", undefined, undefined, "g/kg")).toBe("Sufficient");
    expect(sufficiencyBand("N", 29.9, "alfalfa", "tissue", undefined, undefined, "g/kg")).toBe("Below sufficiency range");
    expect(sufficiencyBand("B", 0.002, "alfalfa", "tissue", undefined, undefined, "%")).toBe("Below sufficiency level"); // 20 mg/kg < 30
  });
  it("no tissue table for corn, and none for soybean Ca (the source gives no critical concentration): #N/A", () => {
    expect(code(() => sufficiencyBand("N", 3, "corn", "tissue"))).toBe("NO_REFERENCE_DATA");
    expect(code(() => sufficiencyBand("Ca", 1, "soybean", "tissue"))).toBe("NO_REFERENCE_DATA");
  });
});

describe("a built-in table named by id", () => {
  it("reads that table", () => {
    expect(sufficiencyBand("P", 38, "canola", "Colwell", undefined, "grdc2020-colwell-p-canola")).toBe("Above critical range");
    expect(sufficiencyBand("P", 38, undefined, undefined, undefined, [["GRDC2020-COLWELL-P-WHEAT"]])).toMatch(/^Critical range/);
  });
  it("refuses a nutrient, method or crop that is not the table's", () => {
    expect(code(() => sufficiencyBand("K", 38, "wheat", "Colwell", undefined, "grdc2020-colwell-p-wheat"))).toBe("NOT_APPLICABLE");
    expect(code(() => sufficiencyBand("P", 38, "wheat", "Olsen", undefined, "grdc2020-colwell-p-wheat"))).toBe("NOT_APPLICABLE");
    expect(code(() => sufficiencyBand("P", 38, "canola", "Colwell", undefined, "grdc2020-colwell-p-wheat"))).toBe("NOT_APPLICABLE");
  });
  it("checks a CEC condition and a rotation key", () => {
    expect(code(() => sufficiencyBand("K", 110, "corn", "Mehlich-3", 15, "tristate2020-m3-k-cec-5-or-less"))).toBe("NOT_APPLICABLE");
    expect(code(() => sufficiencyBand("K", 110, "corn", "Mehlich-3", undefined, "tristate2020-m3-k-cec-5-or-less"))).toBe("MISSING_INPUT");
    expect(code(() => sufficiencyBand("P", 25, "corn-soybean", "Mehlich-3", undefined, "tristate2020-m3-p-wheat-alfalfa"))).toBe("NOT_APPLICABLE");
  });
  it("an unknown id is #VALUE! naming where the ids are listed", () => {
    expect(code(() => sufficiencyBand("P", 38, "wheat", "Colwell", undefined, "no-such-table"))).toBe("UNKNOWN_NAME");
  });
  it("a single number where a table is expected is refused", () => {
    expect(code(() => sufficiencyBand("P", 38, "wheat", "Colwell", undefined, [[42]]))).toBe("NOT_APPLICABLE");
  });
});

describe("the consultant's own table, passed as a range", () => {
  const TABLE = [
    ["Nutrient", "Method", "Crop", "Band", "Limit", "Band", "Limit", "Band"],
    ["Cl", "water", "", "Low", 20, "Adequate", 200, "High"],
    ["K", "Colwell", "wheat", "Deficient", "60", "Marginal", 100, "Adequate"],
    ["K", "Colwell", "", "Low", 50, "OK", null, null],
    [null, null, null, null, null, null, null, null],
    ["P", "Bray P1", "corn", "Low", 10, "High", null, null],
  ];
  it("picks the row by nutrient, method and crop, the crop-specific row first", () => {
    expect(sufficiencyBand("K", 80, "wheat", "Colwell", undefined, TABLE)).toBe("Marginal");
    expect(sufficiencyBand("K", 80, "canola", "Colwell K", undefined, TABLE)).toBe("OK");
  });
  it("a nutrient no built-in table knows, with any method and crop", () => {
    expect(sufficiencyBand("Cl", 150, "barley", "water", undefined, TABLE)).toBe("Adequate");
  });
  it("uses SOIL.BAND's edge rule: a value equal to a limit is in the band above", () => {
    expect(sufficiencyBand("K", 100, "wheat", "Colwell", undefined, TABLE)).toBe("Adequate");
    expect(sufficiencyBand("Cl", 20, undefined, "water", undefined, TABLE)).toBe("Adequate");
  });
  it("method words match through their aliases", () => {
    expect(sufficiencyBand("P", 12, "maize", "Bray-1", undefined, TABLE)).toBe("High");
  });
  it("no row fits: #N/A listing the table's rows", () => {
    expect(code(() => sufficiencyBand("P", 12, "wheat", "Bray-1", undefined, TABLE))).toBe("NO_REFERENCE_DATA");
    expect(errorMessage(() => sufficiencyBand("P", 12, "wheat", "Bray-1", undefined, TABLE))).toMatch(/Cl water/);
  });
  it("refuses a malformed table with the row and column", () => {
    expect(code(() => sufficiencyBand("K", 1, "wheat", "Colwell", undefined, [["K", "Colwell", "wheat", "Low", 5]]))).toBe("MISSING_INPUT");
    expect(code(() => sufficiencyBand("K", 1, "wheat", "Colwell", undefined, [["K", "Colwell", "wheat", "Low", "five", "High"]]))).toBe("NOT_A_NUMBER");
    expect(code(() => sufficiencyBand("K", 1, "wheat", "Colwell", undefined, [["K", "Colwell", "wheat", "Low", 9, "Mid", 5, "High"]]))).toBe("NOT_APPLICABLE");
    expect(code(() => sufficiencyBand("K", 1, "wheat", "Colwell", undefined, [[null, "Colwell", "wheat", "Low", 9, "High"], ["K", "", "", "a", 1, "b"]]))).toBe("MISSING_INPUT");
  });
  it("two equally specific rows that both fit are refused", () => {
    const t = [
      ["K", "Colwell", "wheat", "Low", 50, "High"],
      ["K", "Colwell", "wheat", "Low", 60, "High"],
    ];
    expect(code(() => sufficiencyBand("K", 55, "wheat", "Colwell", undefined, t))).toBe("NOT_APPLICABLE");
  });
  it("a negative value is refused", () => {
    expect(code(() => sufficiencyBand("Cl", -1, undefined, "water", undefined, TABLE))).toBe("OUT_OF_RANGE");
  });
  it("unit and depth_cm are refused with your own table: it is read in its own unit and depth, never converted", () => {
    expect(code(() => sufficiencyBand("Cl", 150, undefined, "water", undefined, TABLE, "mg/kg"))).toBe("NOT_APPLICABLE");
    expect(code(() => sufficiencyBand("Cl", 150, undefined, "water", undefined, TABLE, undefined, 10))).toBe("NOT_APPLICABLE");
  });
});

describe("crops and rotations", () => {
  it("crops beyond the tables' own are known words: crop-independent tables serve them", () => {
    for (const crop of ["barley", "oats", "sorghum", "lupin", "field pea", "faba bean", "chickpea", "pasture"]) {
      expect(sufficiencyTableId("Zn", crop, "DTPA")).toBe("havlin1999-dtpa-zn");
    }
  });
  it("a rotation is read into its crops; a repeated crop counts once", () => {
    expect(readCrop("Corn - Soybean / wheat")).toEqual({ crops: ["corn", "soybean", "wheat"], rotation: true, word: "Corn - Soybean / wheat" });
    expect(readCrop("corn-corn")!.crops).toEqual(["corn"]);
    expect(readCrop("sub-clover")).toEqual({ crops: ["subclover"], rotation: false, word: "sub-clover" });
    expect(readCrop("any")).toBeUndefined();
  });
  it("unknown words list the accepted ones (#VALUE!)", () => {
    expect(code(() => sufficiencyBand("P", 20, "rice", "Bray-1"))).toBe("UNKNOWN_NAME");
    expect(code(() => sufficiencyBand("P", 20, "corn-rice", "Bray-1"))).toBe("UNKNOWN_NAME");
    expect(code(() => sufficiencyBand("P", 20, "corn-any", "Bray-1"))).toBe("UNKNOWN_NAME");
  });
});

describe("refusals", () => {
  it("the method is required, and the message lists the methods that exist", () => {
    expect(code(() => sufficiencyBand("P", 20, "corn"))).toBe("MISSING_INPUT");
    expect(errorMessage(() => sufficiencyBand("P", 20, "corn"))).toMatch(/Bray-1, Mehlich-3, Olsen, Colwell or tissue/);
  });
  it("ammonium acetate K: the method is known but no table is held (#N/A listing what exists)", () => {
    expect(code(() => sufficiencyBand("K", 150, "corn", "ammonium acetate", 12))).toBe("NO_REFERENCE_DATA");
    expect(errorMessage(() => sufficiencyBand("K", 150, "corn", "NH4OAc"))).toMatch(/K Mehlich-3/);
  });
  it("a nutrient with no table for that method is #N/A", () => {
    expect(code(() => sufficiencyBand("Fe", 50, "soybean", "tissue"))).toBe("NO_REFERENCE_DATA");
    expect(code(() => sufficiencyBand("S", 0.3, "alfalfa", "tissue"))).toBe("NO_REFERENCE_DATA");
  });
  it("unknown nutrient or method words are #VALUE!", () => {
    expect(code(() => sufficiencyBand("Px", 20, "corn", "Bray-1"))).toBe("UNKNOWN_NAME");
    expect(code(() => sufficiencyBand("P", 20, "corn", "Truog"))).toBe("UNKNOWN_NAME");
  });
  it("a negative soil test is refused, not clamped", () => {
    expect(code(() => sufficiencyBand("P", -1, "corn-soybean", "Mehlich-3"))).toBe("OUT_OF_RANGE");
  });
});

describe("every table file", () => {
  it("each row has a source, a status, an edge rule per limit, ascending limits and one label more than limits", () => {
    for (const r of SUFFICIENCY_ROWS) {
      expect(r.source.length).toBeGreaterThan(20);
      expect(r.seen_at).toMatch(/^https?:\/\//);
      expect(r.status).toMatch(/^(seen|secondary|derived)/);
      expect(r.edge_rule.length).toBeGreaterThan(20);
      expect(r.at_limit.length).toBe(r.limits.length);
      for (const a of r.at_limit) expect(["above", "below", "none"]).toContain(a);
      expect(r.labels.length).toBe(r.limits.length + 1);
      r.limits.forEach((l, i) => i === 0 || expect(l).toBeGreaterThan(r.limits[i - 1] as number));
      expect(r.crops.length).toBeGreaterThan(0);
      for (const c of [...r.crops, ...(r.rotation?.only ?? []), ...(r.rotation?.includes_any ?? [])]) expect(readCrop(c) ?? "any").toBeTruthy();
    }
  });
  it("no row is from memory", () => {
    for (const r of SUFFICIENCY_ROWS) expect(r.status).not.toMatch(/from memory/i);
  });
  it("row ids are unique and every row is reachable: by the choice rules (in its unit and depth), or by its id where several fit or it is read only when named", () => {
    const ids = SUFFICIENCY_ROWS.map((r) => r.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const r of SUFFICIENCY_ROWS) {
      const crop = cropFor(r);
      const chosen = (() => {
        try {
          return sufficiencyTableId(r.nutrient, crop, r.method, cecFor(r), undefined, r.unit, r.depth_cm);
        } catch (e) {
          expect((e as Error).message).toContain(r.id);
          return sufficiencyTableId(r.nutrient, crop, r.method, cecFor(r), r.id, r.unit, r.depth_cm);
        }
      })();
      expect(chosen).toBe(r.id);
    }
  });
  it("a row's depth in words and in cm agree, and only rows whose source states a depth need one", () => {
    for (const r of SUFFICIENCY_ROWS) {
      if (r.depth === undefined) expect(r.depth_cm).toBeUndefined();
      else expect(r.depth).toBe(`0-${r.depth_cm} cm`);
    }
  });
  it("a table read only when named says why, naming the disagreeing source", () => {
    const only = SUFFICIENCY_ROWS.filter((r) => r.only_by_id);
    expect(only.map((r) => r.id)).toEqual(["anderson2013-kcl40-s-wheat"]);
    for (const r of only) expect(r.only_by_id).toMatch(/disagree/);
  });
  it("sufficiencyTables lists every table with its source and edge rule", () => {
    const list = sufficiencyTables();
    expect(list.length).toBe(SUFFICIENCY_ROWS.length);
    for (const t of list) expect(t.nutrient && t.method && t.crop && t.unit && t.source && t.edgeRule).toBeTruthy();
    expect(list.find((t) => t.id === "tristate2020-m3-k-cec-5-or-less")!.cec).toBe("CEC ≤ 5 cmol(+)/kg");
    expect(list.find((t) => t.id === "tristate2020-m3-p-wheat-alfalfa")!.covers).toBe("rotation including wheat or alfalfa");
  });
});

describe("messages: a refusal says why, in words", () => {
  // These check the code's own wording (a refusal's reason, a boundary): no published value.
  const M3_P = "P Mehlich-3 (rotation of corn and soybean only; mg/kg); P Mehlich-3 (rotation including wheat or alfalfa; mg/kg)";
  const BRAY = "P Bray-1 (rotation of corn and soybean only; mg/kg); P Bray-1 (rotation including wheat or alfalfa; mg/kg); P Bray-1 (pasture; 0-10 cm; mg/kg)";
  const K_M3 = "K Mehlich-3 (corn, soybean, wheat, alfalfa; CEC ≤ 5 cmol(+)/kg; mg/kg); K Mehlich-3 (corn, soybean, wheat, alfalfa; CEC > 5 cmol(+)/kg; mg/kg)";
  const U = undefined;
  it.each<[string, () => unknown, string, string]>([
    ["cec must be above 0", () => sufficiencyBand("K", 110, "corn", "Mehlich-3", 0), "OUT_OF_RANGE", "cec must be greater than 0 cmol(+)/kg (got 0 cmol(+)/kg)"],
    [
      "a unit that is not a soil-test basis, named as typed but trimmed",
      () => sufficiencyBand("P", 20, U, "Bray-1", U, U, " lb/ac "),
      "UNIT_MISMATCH",
      'unit "lb/ac" is not a soil-test or tissue basis: the tables are per kg of soil or dry matter (mg/kg, %) or per litre of soil (mg/dm3); convert the value first (SOIL.CONVERT, or SOIL.MGKG for a charge)',
    ],
    [
      "no table in the value's basis",
      () => sufficiencyBand("P", 20, U, "Bray-1", U, U, "mg/dm3"),
      "NO_REFERENCE_DATA",
      `no P Bray-1 table in mg/dm3: the tables are in "mg/kg" (P Bray-1 (any crop; mg/kg); ${BRAY}); convert the value first (SOIL.CONVERT; per kg to per litre of soil needs the bulk density), or pass your own table`,
    ],
    [
      "the depth is needed",
      () => sufficiencyBand("P", 13, "pasture", "Bray-1"),
      "MISSING_INPUT",
      "depth_cm is needed: the P Bray-1 levels are for a 0-10 cm sample (P Bray-1 (pasture; 0-10 cm; mg/kg)); give the depth of the sampled layer in cm (10 for a 0-10 cm core): a value from another depth must not be read against them",
    ],
    [
      "no table for the depth given",
      () => sufficiencyBand("P", 13, "pasture", "Bray-1", U, U, U, 15),
      "NO_REFERENCE_DATA",
      "no P Bray-1 table for a 0-15 cm sample: the tables are for a 0-10 cm sample (P Bray-1 (pasture; 0-10 cm; mg/kg))",
    ],
    ["cec is needed", () => sufficiencyBand("K", 150, "corn", "Mehlich-3"), "MISSING_INPUT", `cec is needed: the K Mehlich-3 levels depend on CEC (${K_M3})`],
    [
      "one crop where the levels depend on the rotation",
      () => sufficiencyBand("P", 18, "corn", "Bray-1"),
      "MISSING_INPUT",
      'the P Bray-1 levels depend on the whole rotation, not the crop grown (P Bray-1 (rotation of corn and soybean only; mg/kg); P Bray-1 (rotation including wheat or alfalfa; mg/kg)): pass the rotation as crop, the crops joined by "-": corn-soybean, corn-soybean-wheat (a crop grown every year: corn-corn)',
    ],
    ["a rotation with a crop the rotation tables leave out", () => sufficiencyBand("P", 25, "corn-soybean-canola", "Mehlich-3"), "NO_REFERENCE_DATA", `no P Mehlich-3 table for a rotation with canola; tables exist for ${M3_P}`],
    ["the same, one crop named of three", () => sufficiencyBand("P", 25, "corn-pasture-canola", "Bray-1"), "NO_REFERENCE_DATA", `no P Bray-1 table for a rotation with canola; tables exist for ${BRAY}`],
    ["each crop has a table, none covers the rotation", () => sufficiencyBand("P", 25, "pasture-corn", "Bray-1"), "NO_REFERENCE_DATA", `no P Bray-1 table for the rotation pasture-corn; tables exist for ${BRAY}`],
    [
      "a rotation of crops with tables of their own, where the tables are for the crop grown",
      () => sufficiencyBand("P", 25, "pasture-barley", "Bray-1"),
      "MISSING_INPUT",
      `the P Bray-1 tables are for the crop grown, and pasture-barley names crops with different tables: give the one crop (${BRAY})`,
    ],
    ["an unknown nutrient", () => sufficiencyBand("Px", 20, "corn", "Bray-1"), "UNKNOWN_NAME", 'unknown nutrient "Px"; use N, P, K, Ca, Mg, S, B, Cu, Fe, Mn, Mo or Zn'],
    ["an unknown method", () => sufficiencyBand("P", 20, "corn", "Truog"), "UNKNOWN_NAME", 'unknown method "Truog"; use Bray-1, Mehlich-3, Olsen, Colwell, KCl-40, DTPA, hot CaCl2, ammonium acetate or tissue'],
    [
      "no table in the unit given for the crop, the other unit's named",
      () => sufficiencyBand("P", 13, "wheat", "Olsen", U, U, "mg/kg"),
      "NO_REFERENCE_DATA",
      "no P Olsen table in mg/kg for wheat; tables exist for P Olsen (pasture; 0-10 cm; mg/kg); in another unit: P Olsen (any crop; mg/dm3) (convert the value first: SOIL.CONVERT, which needs the bulk density between per-kg and per-litre values)",
    ],
    ["no table for the crop", () => sufficiencyBand("P", 30, "barley", "Colwell"), "NO_REFERENCE_DATA", "no P Colwell table for barley; tables exist for P Colwell (wheat; mg/kg); P Colwell (canola; mg/kg)"],
    ["the crop is needed", () => sufficiencyBand("P", 25, U, "Mehlich-3"), "MISSING_INPUT", `crop is needed: P Mehlich-3 tables are crop-specific (${M3_P})`],
    [
      "several tables fit: their ids, with the sampling that tells them apart",
      () => sufficiencyBand("S", 0.15, "subclover", "tissue"),
      "MISSING_INPUT",
      'several S tissue tables fit; name one as table: "jones1980-subclover-tissue-s-60d" (three youngest fully expanded leaves, 60 days from planting), "jones1980-subclover-tissue-s-133d" (three youngest fully expanded leaves, 133 days from planting)',
    ],
    [
      "an unknown table id, trimmed, with where the ids are listed",
      () => sufficiencyBand("P", 38, "wheat", "Colwell", U, " nosuch "),
      "UNKNOWN_NAME",
      `no built-in sufficiency table "nosuch"; the ids are listed by soilcell list (e.g. ${SUFFICIENCY_ROWS.slice(0, 3)
        .map((r) => r.id)
        .join(", ")}), or pass your own table as a range`,
    ],
    ["a named table: an unknown nutrient", () => sufficiencyBand("Px", 38, U, U, U, "grdc2020-colwell-p-wheat"), "UNKNOWN_NAME", 'unknown nutrient "Px"; use N, P, K, Ca, Mg, S, B, Cu, Fe, Mn, Mo or Zn'],
    ["a named table: another nutrient", () => sufficiencyBand("K", 38, U, U, U, "grdc2020-colwell-p-wheat"), "NOT_APPLICABLE", 'table "grdc2020-colwell-p-wheat" is for P, not K'],
    ["a named table: another method, as typed but trimmed", () => sufficiencyBand("P", 38, U, " Olsen ", U, "grdc2020-colwell-p-wheat"), "NOT_APPLICABLE", 'table "grdc2020-colwell-p-wheat" is for the Colwell method, not Olsen'],
    ["a named table: an unknown method", () => sufficiencyBand("P", 38, U, "Truog", U, "grdc2020-colwell-p-wheat"), "UNKNOWN_NAME", 'unknown method "Truog"; use Bray-1, Mehlich-3, Olsen, Colwell, KCl-40, DTPA, hot CaCl2, ammonium acetate or tissue'],
    ["a named table: a rotation it does not cover", () => sufficiencyBand("P", 38, "wheat-canola", "Colwell", U, "grdc2020-colwell-p-wheat"), "NOT_APPLICABLE", 'table "grdc2020-colwell-p-wheat" is for wheat, not wheat-canola'],
    ["a named table: cec is needed", () => sufficiencyBand("K", 110, "corn", "Mehlich-3", U, "tristate2020-m3-k-cec-5-or-less"), "MISSING_INPUT", 'cec is needed: table "tristate2020-m3-k-cec-5-or-less" is for CEC ≤ 5 cmol(+)/kg'],
    ["a named table: a CEC outside it", () => sufficiencyBand("K", 110, "corn", "Mehlich-3", 15, "tristate2020-m3-k-cec-5-or-less"), "NOT_APPLICABLE", 'table "tristate2020-m3-k-cec-5-or-less" is for CEC ≤ 5 cmol(+)/kg, not CEC 15'],
    [
      "a named table: another basis",
      () => sufficiencyBand("P", 13, U, "Olsen", U, "ni2019-olsen-p-index", "mg/kg"),
      "NOT_APPLICABLE",
      'table "ni2019-olsen-p-index" is in mg/dm3, not mg/kg: convert the value first (SOIL.CONVERT; per kg to per litre of soil needs the bulk density)',
    ],
    ["a named table: another depth", () => sufficiencyBand("S", 7.2, "canola", "KCl-40", U, "anderson2013-kcl40-s-canola", U, 10), "NOT_APPLICABLE", 'table "anderson2013-kcl40-s-canola" is for a 0-30 cm sample, not 0-10 cm'],
    ["one number where a table is expected", () => sufficiencyBand("P", 38, "wheat", "Colwell", U, [[42]]), "NOT_APPLICABLE", "table must be a built-in table id or a range holding your table, not the single value 42"],
    [
      "a column of one-cell rows is a table, not a table id",
      () => sufficiencyBand("P", 38, "wheat", "Colwell", U, [["grdc2020-colwell-p-wheat"], [null]]),
      "MISSING_INPUT",
      "row 1 of the table needs band, limit, band, … after nutrient, method and crop: labels and limits alternating, starting and ending with a label (got 0 cells)",
    ],
    ["a negative value in a unit, named in that unit", () => sufficiencyBand("N", -1, "alfalfa", "tissue", U, U, "g/kg"), "OUT_OF_RANGE", "value must be at least 0 g/kg (got -1 g/kg)"],
    ["a percentage above 100, refused before it is converted", () => sufficiencyBand("B", 150, "alfalfa", "tissue", U, U, "%"), "OUT_OF_RANGE", "value must be from 0 to 100 % (got 150 %)"],
    ["a negative value in the table's unit", () => sufficiencyBand("N", -1, "alfalfa", "tissue"), "OUT_OF_RANGE", "value must be from 0 to 100 % (got -1 %)"],
    [
      "a value at the top of a closed scale",
      () => sufficiencyBand("P", 71, U, "Olsen", U, U, "mg/dm3"),
      "NO_REFERENCE_DATA",
      "71 mg/dm3 is above the published scale of P Olsen (any crop; mg/dm3), which ends below 71 mg/dm3",
    ],
    [
      "a unit or depth with your own table",
      () => sufficiencyBand("Cl", 1, U, "water", U, [["Cl", "water", "", "Low", 20, "High"]], "mg/kg"),
      "NOT_APPLICABLE",
      "unit and depth_cm are for the built-in tables: your own table is read in its own unit and depth, so leave them blank",
    ],
    ["a negative value with your own table", () => sufficiencyBand("Cl", -1, U, "water", U, [["Cl", "water", "", "Low", 20, "High"]]), "OUT_OF_RANGE", "value must be at least 0 (got -1)"],
  ])("%s", (_, f, c, message) => {
    expect([code(f), errorMessage(f)]).toEqual([c, message]);
  });
  it("a value on a limit the source leaves unclassified names the table and its edge rule", () => {
    const mn = SUFFICIENCY_ROWS.find((r) => r.id === "havlin1999-dtpa-mn")!;
    expect(errorMessage(() => sufficiencyBand("Mn", 1, undefined, "DTPA"))).toBe(`1 mg/kg is not classified by table "havlin1999-dtpa-mn": ${mn.edge_rule}`);
  });
  it("an unknown or ambiguous unit word is refused naming it as the unit; a blank one is no unit", () => {
    expect(errorMessage(() => sufficiencyBand("P", 20, undefined, "Bray-1", undefined, undefined, "furlong"))).toMatch(/^unknown unit "furlong"; use mg\/kg, /);
    expect(errorMessage(() => sufficiencyBand("P", 13, undefined, "Olsen", undefined, undefined, " mg/L "))).toMatch(/^unit "mg\/L" is usually the concentration of an extract/);
    // Source: SARE Table 21.2 (as above): 20 ppm Bray-1 P is Optimum.
    expect(sufficiencyBand("P", 20, undefined, "Bray-1", undefined, undefined, "   ")).toBe("Optimum");
  });
  it("a blank method is no method", () => {
    expect(code(() => sufficiencyBand("P", 20, "corn", "   "))).toBe("MISSING_INPUT");
    expect(errorMessage(() => sufficiencyBand("P", 20, "corn", "   "))).toMatch(/^method is needed: P tables exist for Bray-1, /);
  });
});

describe("choice and naming edges", () => {
  // Bands from the sources named above: SARE Table 21.2 (Bray-1 P), GRDC Update 2020 (Colwell P
  // wheat 35 to 42), Bull. 974 via OSU (Mehlich-3 P rotations).
  it("a rotation of crops that no table names reads the crop-independent table", () => {
    expect(sufficiencyTableId("P", "barley-oats", "Bray-1")).toBe("sare-bray1-p");
  });
  it("a rotation one crop of which a rotation table covers is not read against that table", () => {
    expect(code(() => sufficiencyTableId("P", "wheat-canola", "Mehlich-3"))).toBe("NO_REFERENCE_DATA");
  });
  it("a blank table id reads the table the other arguments choose", () => {
    expect(sufficiencyBand("P", 20, undefined, "Bray-1", undefined, "  ")).toBe("Optimum");
    expect(sufficiencyBand("P", 20, undefined, "Bray-1", undefined, "")).toBe("Optimum");
    expect(sufficiencyBand("P", 20, undefined, "Bray-1", undefined, [[" "]])).toBe("Optimum");
  });
  it("a named table with a blank method, and a depth where its source states none", () => {
    expect(sufficiencyBand("P", 38, "wheat", "  ", undefined, "grdc2020-colwell-p-wheat")).toMatch(/^Critical range/);
    expect(sufficiencyBand("P", 38, "wheat", "Colwell", undefined, "grdc2020-colwell-p-wheat", undefined, 10)).toMatch(/^Critical range/);
  });
  it("sufficiencyTables: crops joined, no reason when the table can be chosen, status with where it was seen", () => {
    const list = sufficiencyTables();
    const k = list.find((t) => t.id === "tristate2020-m3-k-cec-above-5")!;
    const row = SUFFICIENCY_ROWS.find((r) => r.id === k.id)!;
    expect(k.crop).toBe("corn, soybean, wheat, alfalfa");
    expect(k.cec).toBe("CEC > 5 cmol(+)/kg");
    expect(k.onlyById).toBe("");
    expect(k.status).toBe(`${row.status}; ${row.seen_at}`);
    expect(list.find((t) => t.id === "tristate1995-bray1-p-corn-soybean")!.covers).toBe("rotation of corn and soybean only");
  });
});

describe("choice rules on invented tables (no table held today has these shapes)", () => {
  // Every row here is invented to reach a rule the held tables do not: its limits, labels and
  // conditions are nobody's. The held tables are put back after each check.
  const ROWS = SUFFICIENCY_ROWS as SufficiencyRow[];
  const invented = (r: Partial<SufficiencyRow> & { id: string }): SufficiencyRow => ({
    nutrient: "Mo",
    method: "DTPA",
    crops: ["any"],
    unit: "mg/kg",
    limits: [1],
    at_limit: ["above"],
    edge_rule: "invented for a check of the choice rules",
    labels: ["Low", "High"],
    source: "invented, no source",
    seen_at: "-",
    status: "invented",
    ...r,
  });
  /** Runs f with the held tables edited, then puts them back. */
  function withTables<T>(edit: (rows: SufficiencyRow[]) => SufficiencyRow[], f: () => T): T {
    const held = [...ROWS];
    ROWS.splice(0, ROWS.length, ...edit(held));
    try {
      return f();
    } finally {
      ROWS.splice(0, ROWS.length, ...held);
    }
  }
  const adding = (...rows: SufficiencyRow[]) => (held: SufficiencyRow[]) => [...held, ...rows];
  /** The table id chosen, or the refusal as "CODE: message". */
  const outcome = (f: () => string) => {
    try {
      return f();
    } catch (e) {
      return `${(e as { code?: string }).code}: ${(e as Error).message}`;
    }
  };
  const id = (crop?: string, cec?: number, unit?: string, depth?: number) => outcome(() => sufficiencyTableId("Mo", crop, "DTPA", cec, undefined, unit, depth));

  it("tables for two depths: the depth is needed, must be one of them, and picks the table", () => {
    const d10 = invented({ id: "inv-d10", depth: "0-10 cm", depth_cm: 10 });
    const d30 = invented({ id: "inv-d30", depth: "0-30 cm", depth_cm: 30 });
    const both = "Mo DTPA (any crop; 0-10 cm; mg/kg); Mo DTPA (any crop; 0-30 cm; mg/kg)";
    withTables(adding(d10, d30), () => {
      expect(id()).toBe(
        `MISSING_INPUT: depth_cm is needed: the Mo DTPA levels are for a 0-10 cm or 0-30 cm sample (${both}); give the depth of the sampled layer in cm (10 for a 0-10 cm core): a value from another depth must not be read against them`,
      );
      expect(id(undefined, undefined, undefined, 20)).toBe(`NO_REFERENCE_DATA: no Mo DTPA table for a 0-20 cm sample: the tables are for a 0-10 cm or 0-30 cm sample (${both})`);
      expect(id(undefined, undefined, undefined, 30)).toBe("inv-d30");
    });
  });
  it("a table with a depth beside one without: any depth reads the one without, its own depth both", () => {
    const d10 = invented({ id: "inv-d10", depth: "0-10 cm", depth_cm: 10 });
    const open = invented({ id: "inv-open", stage: "any depth" });
    withTables(adding(d10, open), () => {
      expect(id(undefined, undefined, undefined, 20)).toBe("inv-open");
      expect(id(undefined, undefined, undefined, 10)).toMatch(/^MISSING_INPUT: several Mo DTPA tables fit; name one as table: "inv-d10" \(0-10 cm\), "inv-open" \(any depth\)$/);
    });
  });
  it("a CEC table beside one without: cec is needed, and a CEC outside the condition reads the one without", () => {
    const sandy = invented({ id: "inv-sandy", cec: { max: 5 } });
    const open = invented({ id: "inv-open" });
    withTables(adding(sandy, open), () => {
      expect(id(undefined, 10)).toBe("inv-open");
      expect(id()).toBe("MISSING_INPUT: cec is needed: the Mo DTPA levels depend on CEC (Mo DTPA (any crop; CEC ≤ 5 cmol(+)/kg; mg/kg); Mo DTPA (any crop; mg/kg))");
    });
  });
  it("CEC conditions with a gap: a CEC in it has no table", () => {
    withTables(adding(invented({ id: "inv-low", cec: { max: 5 } }), invented({ id: "inv-high", cec: { above: 10 } })), () => {
      expect(id(undefined, 7)).toBe("NO_REFERENCE_DATA: no Mo DTPA table covers CEC 7");
      expect([id(undefined, 5), id(undefined, 10.5)]).toEqual(["inv-low", "inv-high"]);
    });
  });
  it("a rotation table that covers the crops but not this rotation: #N/A for a rotation, the hint for one crop", () => {
    const cs = invented({ id: "inv-cs", crops: ["corn", "soybean", "wheat"], rotation: { only: ["corn", "soybean"] } });
    withTables(adding(cs), () => {
      expect(id("corn-soybean")).toBe("inv-cs");
      expect(id("corn-wheat")).toBe("NO_REFERENCE_DATA: no Mo DTPA table for the rotation corn-wheat; tables exist for Mo DTPA (rotation of corn and soybean only; mg/kg)");
      expect(id("wheat")).toMatch(/^MISSING_INPUT: the Mo DTPA levels depend on the whole rotation, not the crop grown \(Mo DTPA \(rotation of corn and soybean only; mg\/kg\)\): pass the rotation/);
    });
  });
  it("several tables fit that no sampling tells apart: their ids, with what they cover", () => {
    withTables(adding(invented({ id: "inv-a" }), invented({ id: "inv-b" })), () => {
      expect(id()).toBe('MISSING_INPUT: several Mo DTPA tables fit; name one as table: "inv-a" (any crop), "inv-b" (any crop)');
    });
  });
  it("a nutrient with no table at all: #N/A pointing to your own table, listing the tables held", () => {
    withTables(
      (held) => held.filter((r) => r.nutrient !== "Mo"),
      () => {
        expect(outcome(() => sufficiencyBand("Mo", 1, "soybean", "tissue"))).toBe(
          `NO_REFERENCE_DATA: no built-in table for Mo; pass your own as table (nutrient | method | crop | band | limit | band …). Tables exist for ${knownCombinations(SUFFICIENCY_ROWS)}`,
        );
      },
    );
  });
  it("a table in a unit word that is not a soil basis is refused, naming it as the unit, not read", () => {
    withTables(adding(invented({ id: "inv-mgl", unit: "mg/L" })), () => {
      expect(id(undefined, undefined, "mg/kg")).toMatch(/^UNIT_MISMATCH: unit "mg\/L" is usually the concentration of an extract/);
    });
  });
});
