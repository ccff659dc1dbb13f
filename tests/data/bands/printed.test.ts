/**
 * Every built-in sufficiency table (src/data/bands/*.json), and every removal coefficient and
 * bushel weight of the same folder, against the numbers its source prints,
 * typed here by hand from the source, never read from the data file: a transcription change to any
 * limit, edge side, label, unit, sampling depth, CEC condition or scale top fails this test. The
 * generic edge tests (tests/core/bands/sufficiency.test.ts) take their expectations from the data
 * file and cannot catch that.
 *
 * Each row names its source (author, year, title, table or page) and how the printed numbers were
 * checked for this table: "re-read" = read again in the stored copy of the page given (December
 * 2026); otherwise the reason. Labels are the source's own words where it prints band names, and
 * the project's plain words where it prints only a critical level or range (said on the row).
 */
import { SUFFICIENCY_ROWS } from "../../../src/core/bands/sufficiency";
import removal from "../../../src/data/bands/removal.json";
import bushels from "../../../src/data/bands/bushel-weights.json";

type Side = "above" | "below" | "none";
interface Printed {
  /** Author, year, title, table or page. */
  readonly source: string;
  /** The numbers as the source prints them, quoted or transcribed. */
  readonly printed: string;
  /** How the printed numbers were checked for this table. */
  readonly checked: string;
  readonly unit: string;
  readonly limits: readonly number[];
  readonly atLimit: readonly Side[];
  readonly labels: readonly string[];
  readonly depthCm?: number;
  readonly cec?: { readonly max?: number; readonly above?: number };
  readonly scaleTop?: number;
}

const CRIT3 = ["Below critical range", "Critical range (90-95 % of maximum yield)", "Above critical range"];
const S3 = ["Below critical range", "Critical range (90 % of maximum yield)", "Above critical range"];
const TRI = ["Deficient", "Optimal", "Sufficient"];
const CRIT2 = ["Below critical level", "At or above critical level"];
const MMFS = ["Responsive", "Marginal response", "Generally non-responsive"];
const DTPA3 = ["Low (deficient)", "Marginal", "High (sufficient)"];
const RUT = ["Below critical level (deficient)", "Critical level to high", "Above high (warning)"];
const UGA = ["Below sufficiency range", "Sufficient", "Above sufficiency range"];
const OMAFA = ["Below critical concentration", "Normal", "Above maximum normal"];
const LEVEL = ["Below sufficiency level", "At or above sufficiency level"];
const JONES = ["Below critical level (90 % of maximum yield)", "At or above critical level"];

const SARE = "Magdoff, F. & van Es, H. (2009) Building Soils for Better Crops, 3rd ed., SARE Handbook 10, ch. 21, Table 21.2";
const TRI95 = "Vitosh, Johnson & Mengel (1995) Tri-State Fertilizer Recommendations, MSU Ext. Bull. E-2567, as restated by OSU Agricultural BMPs, 'Soil test P levels less than 50 PPM'";
const TRI20P = "Culman et al. (2020) Tri-State Fertilizer Recommendations, OSU Ext. Bull. 974, as restated by OSU Agricultural BMPs, 'Soil Test P value less than 50 PPM'";
const TRI20K = "Culman et al. (2020) Tri-State Fertilizer Recommendations, OSU Ext. Bull. 974, as restated by A&L Great Lakes Laboratories, 'Release of New Tri-State Recommendations'";
const MMFS_SRC = "Making More from Sheep (AWI and MLA; no year on the page), Module 7 'Grow More Pasture', Tool 7.3, table 'Using P Olsen and P Bray extraction methods (based on 0-10 cm sample)'";
const NI = "The Nutrient Action Programme Regulations (Northern Ireland) 2019, S.R. 2019/81, Schedule 5 para. 10";
const GRDC20 = "GRDC Grains Research Update (2020) 'Budgeting phosphorus in medium and lower rainfall zones of southern NSW', take-home messages";
const ANDERSON = "Anderson, Peverill & Brennan (2013) 'Soil sulfur—crop response calibration relationships and criteria for field crops grown in Australia', Crop & Pasture Science 64:523-530, abstract";
const HAVLIN = "Havlin et al. (1999) Soil Fertility and Fertilizers, 6th ed., and Herrera (2005), as reproduced in J. Ecology and Environment (2019) s41610-019-0104-9, Table 12";
const RUTGERS = "Rutgers NJAES Soil Testing Laboratory, 'Relative levels of nutrients', micronutrient table (Mehlich-3)";
const UGA_SRC = "Plank, C. O., Plant Analysis Handbook for Georgia, UGA AESL, 'Alfalfa' (top 4 to 6 inches, prior to or at 1/10 bloom)";
const PSU = "Penn State Extension, Forages, 'Boron and Forages'";
const OMAFA_SRC = "Yin & Vyn (2002), as tabulated by OMAFA Field Crop News (2025) 'Plant tissue analysis', Table 1 Interpretation of Tissue Analysis for Soybeans";
const JONES_SRC = "Jones, Ruckman, Williams & Koenigs (1980) 'Sulfur diagnostic criteria as affected by age and defoliation of subclover', Agronomy Journal 72:1043-1046, abstract";

const RE = (url: string) => `re-read: ${url}`;
const SARE_NOT = "not re-read (no stored copy of the SARE page was found this time); as recorded seen in shared/reference/published-values.md, row SUF-15";
const critLabels = "labels: the project's words for a critical level the source prints";

/** id → the source's printed values. One row per built-in table. */
const PRINTED: Record<string, Printed> = {
  "sare-bray1-p": { source: SARE, printed: "Bray-1 P: low 0-15, optimum 15-24, high 24-31, very high > 31 ppm", checked: SARE_NOT, unit: "mg/kg", limits: [15, 24, 31], atLimit: ["below", "below", "below"], labels: ["Low", "Optimum", "High", "Very high"] },
  "tristate1995-bray1-p-corn-soybean": { source: TRI95, printed: "'less than 15 PPM (30 lbs/A) Bray P1 ... in a corn/soybean rotation'", checked: `${RE("agbmps.osu.edu/scenario/soil-test-p-levels-less-50-ppm-or-p-risk-index-low-medium")}; ${critLabels}`, unit: "mg/kg", limits: [15], atLimit: ["above"], labels: CRIT2 },
  "tristate1995-bray1-p-wheat-alfalfa": { source: TRI95, printed: "'If the crop rotation includes wheat or alfalfa ... STP less than 25 PPM (50 lbs/A) Bray P1'", checked: `${RE("agbmps.osu.edu/scenario/soil-test-p-levels-less-50-ppm-or-p-risk-index-low-medium")}; ${critLabels}`, unit: "mg/kg", limits: [25], atLimit: ["above"], labels: CRIT2 },
  "mmfs-bray1-p-pasture": { source: MMFS_SRC, printed: "Bray P (mg P/kg): responsive < 12, marginal response 12-15, generally non responsive > 15", checked: RE("makingmorefromsheep.com.au/grow-more-pasture/tool_7.3.htm"), unit: "mg/kg", limits: [12, 15], atLimit: ["above", "below"], labels: MMFS, depthCm: 10 },
  "tristate2020-m3-p-corn-soybean": { source: TRI20P, printed: "'less than 20 PPM (40 lbs/A) Mehlich III ... corn/soybean rotation'; 'above the critical level to 50 PPM is called the maintenance range'; 'Once STP level reach 50 PPM, no additional fertilizer'", checked: `${RE("agbmps.osu.edu/scenario/soil-test-p-value-less-50-ppm-or-lower-p-risk-assessment")}; labels from OSU Agronomic Crops Team 'Phosphorus and Potassium' (deficient, optimal, sufficient; re-read agcrops.osu.edu/node/3478)`, unit: "mg/kg", limits: [20, 50], atLimit: ["above", "above"], labels: TRI },
  "tristate2020-m3-p-wheat-alfalfa": { source: TRI20P, printed: "'If the crop rotation includes wheat or alfalfa ... STP less than 30 PPM (60 lbs/A) Mehlich III'; maintenance range to 50 PPM", checked: `${RE("agbmps.osu.edu/scenario/soil-test-p-value-less-50-ppm-or-lower-p-risk-assessment")}; also A&L Great Lakes: '30 ppm M3 when wheat or alfalfa are included'`, unit: "mg/kg", limits: [30, 50], atLimit: ["above", "above"], labels: TRI },
  "tristate2020-m3-k-cec-5-or-less": { source: TRI20K, printed: "'100 ppm M3 for sandy soils with a CEC of 5 meq/100g or less ... the maintenance range is 100 ppm to 130 ppm'", checked: RE("algreatlakes.com/blogs/news/release-of-new-tri-state-recommendations"), unit: "mg/kg", limits: [100, 130], atLimit: ["above", "below"], labels: TRI, cec: { max: 5 } },
  "tristate2020-m3-k-cec-above-5": { source: TRI20K, printed: "'120 ppm for soils with a CEC greater than 5 ... widens from 120 ppm to 170 ppm'", checked: RE("algreatlakes.com/blogs/news/release-of-new-tri-state-recommendations"), unit: "mg/kg", limits: [120, 170], atLimit: ["above", "below"], labels: TRI, cec: { above: 5 } },
  "ni2019-olsen-p-index": { source: NI, printed: "Soil phosphorus index, Olsen extractable P (mg P/l): 0: 0-9; 1: 10-15; 2-: 16-20; 2+: 21-25; 3: 26-45; 4: 46-70", checked: `${RE("legislation.gov.uk/nisr/2019/81/schedule/5/paragraph/10/made")}; mg P/l is per litre of soil, written mg/dm3`, unit: "mg/dm3", limits: [10, 16, 21, 26, 46], atLimit: ["above", "above", "above", "above", "above"], labels: ["Index 0", "Index 1", "Index 2-", "Index 2+", "Index 3", "Index 4"], scaleTop: 71 },
  "mmfs-olsen-p-pasture": { source: MMFS_SRC, printed: "Olsen P (mg P/kg): responsive < 12, marginal response 12-15, generally non responsive > 15", checked: RE("makingmorefromsheep.com.au/grow-more-pasture/tool_7.3.htm"), unit: "mg/kg", limits: [12, 15], atLimit: ["above", "below"], labels: MMFS, depthCm: 10 },
  "grdc2020-colwell-p-wheat": { source: GRDC20, printed: "'critical values of wheat and canola to achieve 90 to 95% of maximum yield in southern NSW are 35 to 42 and 22 to 27 mg P/kg'", checked: `${RE("grdc.com.au/.../2020/03/budgeting-phosphorus-in-medium-and-lower-rainfall-zones-of-southern-nsw")}; ${critLabels}`, unit: "mg/kg", limits: [35, 42], atLimit: ["above", "below"], labels: CRIT3 },
  "grdc2020-colwell-p-canola": { source: GRDC20, printed: "as the wheat row: canola 22 to 27 mg P/kg", checked: `${RE("grdc.com.au/.../2020/03/budgeting-phosphorus-in-medium-and-lower-rainfall-zones-of-southern-nsw")}; ${critLabels}`, unit: "mg/kg", limits: [22, 27], atLimit: ["above", "below"], labels: CRIT3 },
  "anderson2013-kcl40-s-wheat": { source: ANDERSON, printed: "WA-grown wheat KCl-40 S CSTV, sampling depth to 30 cm, 2.8 mg/kg, CSTR 2.4-3.2 mg/kg", checked: `${RE("publish.csiro.au/cp/CP13244")}; ${critLabels}`, unit: "mg/kg", limits: [2.4, 3.2], atLimit: ["above", "below"], labels: S3, depthCm: 30 },
  "anderson2013-kcl40-s-canola": { source: ANDERSON, printed: "canola KCl-40 S CSTV, sampling depth to 30 cm, 7.2 mg/kg, CSTR 6.8-7.5", checked: `${RE("publish.csiro.au/cp/CP13244")}; ${critLabels}`, unit: "mg/kg", limits: [6.8, 7.5], atLimit: ["above", "below"], labels: S3, depthCm: 30 },
  "havlin1999-dtpa-zn": { source: HAVLIN, printed: "Zn: low (deficient) 0-0.5, marginal 0.6-1, high (sufficient) > 1 mg/kg", checked: RE("jecoenv.biomedcentral.com/articles/10.1186/s41610-019-0104-9/tables/12"), unit: "mg/kg", limits: [0.5, 1], atLimit: ["below", "below"], labels: DTPA3 },
  "havlin1999-dtpa-cu": { source: HAVLIN, printed: "Cu: low 0-0.4, marginal 0.4-0.6, high > 0.6 mg/kg", checked: RE("jecoenv.biomedcentral.com/articles/10.1186/s41610-019-0104-9/tables/12"), unit: "mg/kg", limits: [0.4, 0.6], atLimit: ["below", "below"], labels: DTPA3 },
  "havlin1999-dtpa-mn": { source: HAVLIN, printed: "Mn: low < 1, marginal –, high > 1 mg/kg", checked: RE("jecoenv.biomedcentral.com/articles/10.1186/s41610-019-0104-9/tables/12"), unit: "mg/kg", limits: [1], atLimit: ["none"], labels: ["Low (deficient)", "High (sufficient)"] },
  "havlin1999-dtpa-fe": { source: HAVLIN, printed: "Fe: low 0-2.5, marginal 2.6-4.5, high > 4.5 mg/kg", checked: RE("jecoenv.biomedcentral.com/articles/10.1186/s41610-019-0104-9/tables/12"), unit: "mg/kg", limits: [2.5, 4.5], atLimit: ["below", "below"], labels: DTPA3 },
  "rutgers-m3-zn": { source: RUTGERS, printed: "Zinc, ppm soil: critical level 1.0, high 50", checked: RE("njaes.rutgers.edu/soil-testing-lab/relative-levels-of-nutrients.php"), unit: "mg/kg", limits: [1, 50], atLimit: ["above", "below"], labels: RUT },
  "rutgers-m3-cu": { source: RUTGERS, printed: "Copper, ppm soil: critical level 0.5, high 20", checked: RE("njaes.rutgers.edu/soil-testing-lab/relative-levels-of-nutrients.php"), unit: "mg/kg", limits: [0.5, 20], atLimit: ["above", "below"], labels: RUT },
  "rutgers-m3-b": { source: RUTGERS, printed: "Boron, ppm soil: critical level 0.5, high 20", checked: RE("njaes.rutgers.edu/soil-testing-lab/relative-levels-of-nutrients.php"), unit: "mg/kg", limits: [0.5, 20], atLimit: ["above", "below"], labels: RUT },
  "rutgers-m3-fe": { source: RUTGERS, printed: "Iron, ppm soil: critical level 50, high 100", checked: RE("njaes.rutgers.edu/soil-testing-lab/relative-levels-of-nutrients.php"), unit: "mg/kg", limits: [50, 100], atLimit: ["above", "below"], labels: RUT },
  "uga-alfalfa-tissue-n": { source: UGA_SRC, printed: "Nitrogen (N) 3.00-5.00%", checked: RE("aesl.ces.uga.edu/publications/plant/Alfalfa.html"), unit: "%", limits: [3, 5], atLimit: ["above", "below"], labels: UGA },
  "uga-alfalfa-tissue-p": { source: UGA_SRC, printed: "Phosphorus (P) 0.25-0.70%", checked: RE("aesl.ces.uga.edu/publications/plant/Alfalfa.html"), unit: "%", limits: [0.25, 0.7], atLimit: ["above", "below"], labels: UGA },
  "uga-alfalfa-tissue-k": { source: UGA_SRC, printed: "Potassium (K) 2.00-3.50%", checked: RE("aesl.ces.uga.edu/publications/plant/Alfalfa.html"), unit: "%", limits: [2, 3.5], atLimit: ["above", "below"], labels: UGA },
  "uga-alfalfa-tissue-ca": { source: UGA_SRC, printed: "Calcium (Ca) 0.80-3.00%", checked: RE("aesl.ces.uga.edu/publications/plant/Alfalfa.html"), unit: "%", limits: [0.8, 3], atLimit: ["above", "below"], labels: UGA },
  "uga-alfalfa-tissue-mg": { source: UGA_SRC, printed: "Magnesium (Mg) 0.25-1.00%", checked: RE("aesl.ces.uga.edu/publications/plant/Alfalfa.html"), unit: "%", limits: [0.25, 1], atLimit: ["above", "below"], labels: UGA },
  "psu-alfalfa-tissue-b": { source: PSU, printed: "'the sufficiency level for plant analysis for boron in the top one-third of the alfalfa plant, sampled between bud and one-tenth bloom stage is 30 ppm'", checked: `${RE("forages.psu.edu/topics/soil_fertility/maintenance/boron.html")}; labels: the project's words for a sufficiency level`, unit: "mg/kg", limits: [30], atLimit: ["above"], labels: LEVEL },
  "psu-clover-tissue-b": { source: PSU, printed: "'the sufficiency level for clover which is 20 ppm boron in the tissue'", checked: `${RE("forages.psu.edu/topics/soil_fertility/maintenance/boron.html")}; labels: the project's words for a sufficiency level`, unit: "mg/kg", limits: [20], atLimit: ["above"], labels: LEVEL },
  "yinvyn2002-soybean-tissue-n": { source: OMAFA_SRC, printed: "Nitrogen (N) critical 4.0%, maximum normal 6.0%", checked: RE("fieldcropnews.com/2025/05/plant-tissue-analysis"), unit: "%", limits: [4, 6], atLimit: ["below", "below"], labels: OMAFA },
  "yinvyn2002-soybean-tissue-p": { source: OMAFA_SRC, printed: "Phosphorus (P) 0.35%, 0.5%", checked: RE("fieldcropnews.com/2025/05/plant-tissue-analysis"), unit: "%", limits: [0.35, 0.5], atLimit: ["below", "below"], labels: OMAFA },
  "yinvyn2002-soybean-tissue-k": { source: OMAFA_SRC, printed: "Potassium (K) 2.0%, 3.0%", checked: RE("fieldcropnews.com/2025/05/plant-tissue-analysis"), unit: "%", limits: [2, 3], atLimit: ["below", "below"], labels: OMAFA },
  "yinvyn2002-soybean-tissue-mg": { source: OMAFA_SRC, printed: "Magnesium (Mg) 0.10%, 2.0%", checked: RE("fieldcropnews.com/2025/05/plant-tissue-analysis"), unit: "%", limits: [0.1, 2], atLimit: ["below", "below"], labels: OMAFA },
  "yinvyn2002-soybean-tissue-b": { source: OMAFA_SRC, printed: "Boron (B) 20.0%, 55.0% (the % sign is a misprint for mg/kg)", checked: RE("fieldcropnews.com/2025/05/plant-tissue-analysis"), unit: "mg/kg", limits: [20, 55], atLimit: ["below", "below"], labels: OMAFA },
  "yinvyn2002-soybean-tissue-cu": { source: OMAFA_SRC, printed: "Copper (Cu) 4.0%, 30.0% (read as mg/kg)", checked: RE("fieldcropnews.com/2025/05/plant-tissue-analysis"), unit: "mg/kg", limits: [4, 30], atLimit: ["below", "below"], labels: OMAFA },
  "yinvyn2002-soybean-tissue-mn": { source: OMAFA_SRC, printed: "Manganese (Mn) 14.0%, 100.0% (read as mg/kg)", checked: RE("fieldcropnews.com/2025/05/plant-tissue-analysis"), unit: "mg/kg", limits: [14, 100], atLimit: ["below", "below"], labels: OMAFA },
  "yinvyn2002-soybean-tissue-mo": { source: OMAFA_SRC, printed: "Molybdenum (Mo) 0.5%, 5.0% (read as mg/kg)", checked: RE("fieldcropnews.com/2025/05/plant-tissue-analysis"), unit: "mg/kg", limits: [0.5, 5], atLimit: ["below", "below"], labels: OMAFA },
  "yinvyn2002-soybean-tissue-zn": { source: OMAFA_SRC, printed: "Zinc (Zn) 12.0%, 80.0% (read as mg/kg)", checked: RE("fieldcropnews.com/2025/05/plant-tissue-analysis"), unit: "mg/kg", limits: [12, 80], atLimit: ["below", "below"], labels: OMAFA },
  "jones1980-subclover-tissue-s-60d": { source: JONES_SRC, printed: "critical levels of total S 'decreasing from 0.20 to 0.08% S ... at 60 and 133 days from planting'", checked: `${RE("dl.sciencesocieties.org/publications/aj/abstracts/72/6/AJ0720061043")}; ${critLabels}`, unit: "%", limits: [0.2], atLimit: ["above"], labels: JONES },
  "jones1980-subclover-tissue-s-133d": { source: JONES_SRC, printed: "as the 60-day row: 0.08 % S at 133 days", checked: `${RE("dl.sciencesocieties.org/publications/aj/abstracts/72/6/AJ0720061043")}; ${critLabels}`, unit: "%", limits: [0.08], atLimit: ["above"], labels: JONES },
};

describe("every built-in table holds the numbers its source prints (source named on each row)", () => {
  it("each table has a printed row here, and each printed row a table", () => {
    expect(SUFFICIENCY_ROWS.map((r) => r.id).sort()).toEqual(Object.keys(PRINTED).sort());
  });
  it.each(SUFFICIENCY_ROWS.map((r) => [r.id, r] as const))("%s: limits, edge sides, labels, unit, depth, CEC and scale as printed", (id, row) => {
    const p = PRINTED[id]!;
    expect({ id, unit: row.unit, limits: row.limits, atLimit: row.at_limit, labels: row.labels, depthCm: row.depth_cm, cec: row.cec, scaleTop: row.scale_top }).toEqual({
      id,
      unit: p.unit,
      limits: p.limits,
      atLimit: p.atLimit,
      labels: p.labels,
      depthCm: p.depthCm,
      cec: p.cec,
      scaleTop: p.scaleTop,
    });
  });
  it("every printed row names its source and how it was checked", () => {
    for (const [id, p] of Object.entries(PRINTED)) {
      expect({ id, source: p.source.length > 40 }).toEqual({ id, source: true });
      expect(p.printed.length).toBeGreaterThan(10);
      expect(p.checked).toMatch(/^(re-read|not re-read)/);
    }
  });
});

// Removal coefficients, kg of nutrient per t of harvested product, as each source prints them:
// a range [low, high] where it prints one, else the single value (SOIL.REMOVAL uses the midpoint).
const OMAFA_REMOVAL = "OMAFA Field Crop News (2025) 'Crop Removal Values', Table 1 Average nutrient removal by common field crops in Ontario, grains and oilseeds at marketing moisture, kg/t; re-read: fieldcropnews.com/2025/05/crop-removal-values";
const PDA = "Potash Development Association (March 2020) 'Nutrients in crop material' (= AHDB RB209 2020), kg/t of fresh material; re-read: pda.org.uk/pda_leaflets/nutrients-in-crop-material";
const AGVIC = "Agriculture Victoria (2017) Sheep Notes, 'Replacing nutrients removed from cutting hay', Table 1, kg per t of dry matter; re-read: agriculture.vic.gov.au/.../replacing-nutrients-removed-from-cutting-hay";
type Coeff = number | readonly [number, number];
const REMOVAL_PRINTED: Record<string, { source: string; printed: string; kgPerT: Record<string, Coeff> }> = {
  corn: { source: OMAFA_REMOVAL, printed: "grain corn: N 11.5–17.7, P2O5 6.6–7.9, K2O 4.6–5.2, Ca 0.12, Mg 1.55, S 1.2–1.3", kgPerT: { N: [11.5, 17.7], P2O5: [6.6, 7.9], K2O: [4.6, 5.2], Ca: 0.12, Mg: 1.55, S: [1.2, 1.3] } },
  soybean: { source: OMAFA_REMOVAL, printed: "soybean: N 62.3–66.7, P2O5 13.3–14.7, K2O 23.0–23.3, Ca 3.0–3.7, Mg 2.3–3.0, S 0.67", kgPerT: { N: [62.3, 66.7], P2O5: [13.3, 14.7], K2O: [23.0, 23.3], Ca: [3.0, 3.7], Mg: [2.3, 3.0], S: 0.67 } },
  wheat: { source: OMAFA_REMOVAL, printed: "winter wheat: N 19.1–20.9, P2O5 9.1–10.4, K2O 5.78–6.22, Ca 0.44, Mg 2.67, S 1.33", kgPerT: { N: [19.1, 20.9], P2O5: [9.1, 10.4], K2O: [5.78, 6.22], Ca: 0.44, Mg: 2.67, S: 1.33 } },
  barley: { source: OMAFA_REMOVAL, printed: "barley: N 17.3–23.1, P2O5 5.21–8.33, K2O 4.79–7.22, Ca 0.56, Mg 1.11, S 1.67", kgPerT: { N: [17.3, 23.1], P2O5: [5.21, 8.33], K2O: [4.79, 7.22], Ca: 0.56, Mg: 1.11, S: 1.67 } },
  oats: { source: OMAFA_REMOVAL, printed: "oat: N 18.0-24.0, P2O5 7.5, K2O 5.83–6.25, Ca 0.833, Mg 1.25, S 2.08", kgPerT: { N: [18.0, 24.0], P2O5: 7.5, K2O: [5.83, 6.25], Ca: 0.833, Mg: 1.25, S: 2.08 } },
  rye: { source: OMAFA_REMOVAL, printed: "cereal rye: N 19.3–21.8, P2O5 6.07–8.93, K2O 6.07–7.14, Ca 1.07, Mg 1.43, S 1.79–3.57", kgPerT: { N: [19.3, 21.8], P2O5: [6.07, 8.93], K2O: [6.07, 7.14], Ca: 1.07, Mg: 1.43, S: [1.79, 3.57] } },
  "dry bean": { source: OMAFA_REMOVAL, printed: "dry beans: N 41.6, P2O5 13.8, K2O 13.8, Ca 1.12, Mg 1.12, S 2.78", kgPerT: { N: 41.6, P2O5: 13.8, K2O: 13.8, Ca: 1.12, Mg: 1.12, S: 2.78 } },
  canola: { source: OMAFA_REMOVAL, printed: "canola: N 40.0–44.4, P2O5 22.2–26.7, K2O 11.1–13.3, Ca 4.0–5.3, Mg 5.33–6.67, S 6.67", kgPerT: { N: [40.0, 44.4], P2O5: [22.2, 26.7], K2O: [11.1, 13.3], Ca: [4.0, 5.3], Mg: [5.33, 6.67], S: 6.67 } },
  "oilseed rape": { source: PDA, printed: "Oilseed rape seed only: P2O5 14.0, K2O 11.0, MgO 2.0", kgPerT: { P2O5: 14.0, K2O: 11.0, MgO: 2.0 } },
  peas: { source: PDA, printed: "Peas dried: P2O5 9.0, K2O 10.0, MgO 3.0", kgPerT: { P2O5: 9.0, K2O: 10.0, MgO: 3.0 } },
  "faba bean": { source: PDA, printed: "Field beans seed only: P2O5 11.0, K2O 12.0, MgO 2.5", kgPerT: { P2O5: 11.0, K2O: 12.0, MgO: 2.5 } },
  "grass hay": { source: PDA, printed: "Grass hay @ 86% DM: P2O5 5.9, K2O 18, MgO n/d", kgPerT: { P2O5: 5.9, K2O: 18 } },
  "grass silage": { source: PDA, printed: "Grass silage @ 25% DM: P2O5 1.7, K2O 6.0, MgO n/d", kgPerT: { P2O5: 1.7, K2O: 6.0 } },
  "maize silage": { source: PDA, printed: "Forage maize silage @ 30% DM: P2O5 1.4, K2O 4.4, MgO 1.2", kgPerT: { P2O5: 1.4, K2O: 4.4, MgO: 1.2 } },
  potatoes: { source: PDA, printed: "Potatoes tubers: P2O5 1.0, K2O 5.8, MgO 0.5", kgPerT: { P2O5: 1.0, K2O: 5.8, MgO: 0.5 } },
  "sugar beet": { source: PDA, printed: "Sugar beet roots only: P2O5 0.8, K2O 1.7, MgO 0.5", kgPerT: { P2O5: 0.8, K2O: 1.7, MgO: 0.5 } },
  "lucerne hay": { source: AGVIC, printed: "Lucerne/clover hay: phosphorus 2.5–3.5, potassium 20–30, sulfur 3.5", kgPerT: { P: [2.5, 3.5], K: [20, 30], S: 3.5 } },
  "oaten hay": { source: AGVIC, printed: "Oaten hay: phosphorus 2, potassium 15–20, sulfur 2", kgPerT: { P: 2, K: [15, 20], S: 2 } },
};

// Standard bushel weights, lb per bushel (secondary sources, recorded as seen; not re-read here).
const BUSHELS_PRINTED: Record<string, number> = { corn: 56, soybean: 60, wheat: 60, barley: 48, oats: 32, rye: 56, canola: 50, "dry bean": 60, peas: 60 };

describe("every removal coefficient and bushel weight holds the number its source prints (source named on each row)", () => {
  const crops = removal.crops as unknown as { id: string; kg_per_t: Record<string, Coeff> }[];
  it("each crop has a printed row here, and each printed row a crop", () => {
    expect(crops.map((c) => c.id).sort()).toEqual(Object.keys(REMOVAL_PRINTED).sort());
  });
  it.each(crops.map((c) => [c.id, c] as const))("%s: every coefficient as printed", (id, crop) => {
    expect({ id, kgPerT: crop.kg_per_t }).toEqual({ id, kgPerT: REMOVAL_PRINTED[id]!.kgPerT });
    expect(REMOVAL_PRINTED[id]!.source).toMatch(/re-read: /);
  });
  it("bushel weights (Source: USGSA standard weights as listed in 'Test weight'; agriconverter.com for canola; John Deere operator's manual for dry bean and peas; secondary, not re-read here)", () => {
    const got = Object.fromEntries((bushels.crops as { crop: string; lb_per_bu: number }[]).map((c) => [c.crop, c.lb_per_bu]));
    expect(got).toEqual(BUSHELS_PRINTED);
  });
});
