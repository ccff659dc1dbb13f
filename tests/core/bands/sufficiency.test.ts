/**
 * SOIL.SUFFICIENCY in core: published values land in the band their source gives, each table's
 * own edge rule at every limit, table choice (crop, rotation, CEC, table id), refusals, and the
 * integrity of every table file. Each check names its source (the same source the table row
 * carries) and how it was seen.
 */
import { sufficiencyBand, sufficiencyTableId, sufficiencyTables, SUFFICIENCY_ROWS } from "../../../src/core/bands/sufficiency";
import { readCrop } from "../../../src/core/bands/sufficiency-rows";
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
