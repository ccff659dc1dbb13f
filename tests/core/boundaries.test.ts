/**
 * Every declared bound probed at the limit, just inside and just outside (issue 21 point 2): pH
 * 0–14, bulk density above 0 to 2.65 g/cm3, depth above 0 to 300 cm, the lime tables' edge slack
 * (1e-9), band limits and their edge rules, the 2 ‰ isotope gap and Cochrane's factor switch.
 * "Just" is 1e-6 for the declared ranges (far below any lab's resolution) and 1e-8 past a table
 * edge (well above the 1e-9 slack, which only forgives floating-point noise). Sources: pH scale
 * 0–14 (common practice); 2.65 g/cm3, the particle density of quartz (common practice, as
 * validate.ts); the 2 ‰ gap (common practice, nitrogen/checks.json); Cochrane, Salinas & Sánchez
 * (1980), abstract seen: factor 1.5, 2.0 when the estimate exceeds the Al. Inputs invented.
 */
import { BOUNDS, check } from "../../src/core/validate";
import { convertUnit } from "../../src/core/units";
import { limeAlSatCmol, limeExchAl, limePhBc } from "../../src/core/lime/methods";
import { limeRangeRate } from "../../src/core/lime/table";
import { bandIndex, bandIndexAt, bandLabel } from "../../src/core/bands/bands";
import { nfixNdfa } from "../../src/core/nitrogen/isotope";
import { errorCode, errorMessage } from "../helpers/errors";

const EPS = 1e-6;
const accepted = (f: () => unknown) => expect(errorCode(f)).toBeUndefined();
const refused = (f: () => unknown, code = "OUT_OF_RANGE") => expect(errorCode(f)).toBe(code);

describe("pH 0 to 14", () => {
  const ph = BOUNDS.ph("soil_ph");
  it.each([0, EPS, 7, 14 - EPS, 14])("accepts %d", (v) => accepted(() => check(v, ph)));
  it.each([-EPS, 14 + EPS, -1, 15])("refuses %d", (v) => refused(() => check(v, ph)));
  it("through LIMEPHBC: soil pH 14 and target 14 are read, 14 + 1e-6 is refused naming the range", () => {
    expect(limePhBc(14, 14, 1, { depthCm: 10, bulkDensity: 1.3 })).toBe(0);
    expect(limePhBc(0, 0, 1, { depthCm: 10, bulkDensity: 1.3 })).toBe(0);
    expect(errorMessage(() => limePhBc(14 + EPS, 14, 1, { depthCm: 10, bulkDensity: 1.3 }))).toMatch(/^soil_ph must be from 0 to 14 \(got 14\.000001\)/);
    refused(() => limePhBc(5, -EPS, 1, { depthCm: 10, bulkDensity: 1.3 }));
  });
});

describe("bulk density above 0 to 2.65 g/cm3", () => {
  const bd = BOUNDS.bulkDensity();
  it.each([EPS, 1.3, 2.65 - EPS, 2.65])("accepts %d", (v) => accepted(() => check(v, bd)));
  it.each([0, -EPS, 2.65 + EPS, 2.7])("refuses %d", (v) => refused(() => check(v, bd)));
  it("through CONVERT: 10 mg/kg over 15 cm at 2.65 is 39.75 kg/ha (derived: mg/kg × cm × g/cm3 × 0.1, UNIT-16); 2.65 + 1e-6 is refused", () => {
    expect(convertUnit(10, "mg/kg", "kg/ha", { depthCm: 15, bulkDensity: 2.65 })).toBeCloseTo(39.75, 10);
    expect(errorMessage(() => convertUnit(10, "mg/kg", "kg/ha", { depthCm: 15, bulkDensity: 2.65 + EPS }))).toMatch(/^bulk_density must be above 0 to 2\.65 g\/cm3/);
    refused(() => convertUnit(10, "mg/kg", "kg/ha", { depthCm: 15, bulkDensity: 0 }));
  });
});

describe("depth above 0 to 300 cm", () => {
  const depth = BOUNDS.depth();
  it.each([EPS, 15, 300 - EPS, 300])("accepts %d", (v) => accepted(() => check(v, depth)));
  it.each([0, -EPS, 300 + EPS])("refuses %d", (v) => refused(() => check(v, depth)));
  it("through LIMEAL: 300 cm is read (Kamprath 1.5 × 1 cmol over 300 cm at 1.0 = 22.5195 t/ha, derived), 300 + 1e-6 is refused", () => {
    expect(limeExchAl(1, { depthCm: 300, bulkDensity: 1 })).toBeCloseTo(1.5 * 500.43 * 300 * 1 * 0.1 / 1000, 6);
    refused(() => limeExchAl(1, { depthCm: 300 + EPS, bulkDensity: 1 }));
  });
});

describe("a lime table's edges: 1e-9 of floating-point slack, no more", () => {
  // invented 2 × 2 table: buffer pH 6.0 and 6.5 (rows), target pH 6.0 and 6.5 (columns)
  const table = [
    ["", 6.0, 6.5],
    [6.0, 2.0, 3.0],
    [6.5, 0.5, 1.0],
  ];
  it("buffer pH at each edge, and within the slack of it, reads the edge row", () => {
    expect(limeRangeRate(table, 6.5, 6.0)).toBe(0.5);
    expect(limeRangeRate(table, 6.5 + 5e-10, 6.0)).toBe(0.5);
    expect(limeRangeRate(table, 6.0, 6.0)).toBe(2);
    expect(limeRangeRate(table, 6.0 - 5e-10, 6.0)).toBe(2);
  });
  it("buffer pH 1e-8 past either edge is refused: the table is not extrapolated", () => {
    expect(errorMessage(() => limeRangeRate(table, 6.5 + 1e-8, 6.0))).toMatch(/outside the calibration range \(buffer pH 6 to 6\.5\); the table is not extrapolated/);
    refused(() => limeRangeRate(table, 6.0 - 1e-8, 6.0));
  });
  it("target pH the same way: within the slack reads the edge column, 1e-8 past is refused", () => {
    expect(limeRangeRate(table, 6.25, 6.5 + 5e-10)).toBeCloseTo(2, 12);
    expect(limeRangeRate(table, 6.25, 6.0 - 5e-10)).toBeCloseTo(1.25, 12);
    expect(errorMessage(() => limeRangeRate(table, 6.25, 6.5 + 1e-8))).toMatch(/target_ph .* is outside the calibration range \(target pH 6 to 6\.5\)/);
    refused(() => limeRangeRate(table, 6.25, 6.0 - 1e-8));
  });
  it("just inside an edge interpolates from the edge (invented: 1e-6 in from 6.5 is 0.5 + 1.5 × 1e-6 / 0.5)", () => {
    expect(limeRangeRate(table, 6.5 - EPS, 6.0)).toBeCloseTo(0.5 + (1.5 * EPS) / 0.5, 12);
  });
});

describe("band limits: a value equal to a limit is in the band above (SOIL.BAND's rule)", () => {
  const limits = [10, 20, 30, 40];
  it.each([
    [10 - EPS, 0],
    [10, 1],
    [10 + EPS, 1],
    [20 - EPS, 1],
    [20, 2],
    [20 + EPS, 2],
    [40 - EPS, 3],
    [40, 4],
    [40 + EPS, 4],
  ])("bandIndex(%d) is %d", (v, k) => expect(bandIndex(v, limits)).toBe(k));
  it("the label changes exactly at the limit", () => {
    expect(bandLabel(20 - EPS, limits)).not.toBe(bandLabel(20, limits));
    expect(bandLabel(20, limits)).toBe(bandLabel(20 + EPS, limits));
  });
  it("a table's own rule: 'below' keeps the limit in the band below, 'none' leaves it unclassified, 'above' opens the band above", () => {
    const l = [10, 20, 30];
    expect(bandIndexAt(20, l, ["above", "below", "above"])).toBe(1);
    expect(bandIndexAt(20 + EPS, l, ["above", "below", "above"])).toBe(2);
    expect(bandIndexAt(20 - EPS, l, ["above", "below", "above"])).toBe(1);
    expect(bandIndexAt(20, l, ["above", "none", "above"])).toBeNull();
    expect(bandIndexAt(20 - EPS, l, ["above", "none", "above"])).toBe(1);
    expect(bandIndexAt(20 + EPS, l, ["above", "none", "above"])).toBe(2);
    expect(bandIndexAt(20, l, ["above", "above", "above"])).toBe(2);
    expect(bandIndexAt(10, l, ["below", "above", "above"])).toBe(0);
    expect(bandIndexAt(30, l, ["above", "above", "below"])).toBe(2);
    expect(bandIndexAt(30, l, ["above", "above", "above"])).toBe(3);
  });
});

describe("the 2 ‰ isotope gap: reference − B of exactly 2 ‰ is accepted", () => {
  // %Ndfa = 100 × (reference − legume) / (reference − B)
  it("at 2 ‰: 100 × (1 − 0) / 2 = 50 %", () => {
    expect(nfixNdfa(1, 0, -1)).toBeCloseTo(50, 10);
  });
  it("just inside (2 + 1e-6 ‰) is computed, just outside (2 − 1e-6 ‰) is NOT_APPLICABLE naming the gap", () => {
    expect(nfixNdfa(1 + EPS, 0, -1)).toBeCloseTo((100 * (1 + EPS)) / (2 + EPS), 9);
    refused(() => nfixNdfa(1 - EPS, 0, -1), "NOT_APPLICABLE");
  });
  it("a min_gap of 3 moves the limit to 3 ‰", () => {
    expect(nfixNdfa(2, 0, -1, 3)).toBeCloseTo(66.6667, 4);
    refused(() => nfixNdfa(2 - EPS, 0, -1, 3), "NOT_APPLICABLE");
  });
});

describe("Cochrane's switch: 1.5 × excess while it does not exceed the Al, 2.0 × excess above it", () => {
  // Al 3, Ca 5, Mg 2 cmol(+)/kg (invented), so Al + Ca + Mg = 10 and excess = 3 − RAS / 10.
  it("at the switch: RAS 10 gives excess 2 and 1.5 × 2 = 3 = Al, still the 1.5 factor", () => {
    expect(limeAlSatCmol(3, 5, 2, 10)).toBe(3);
  });
  it("just inside: RAS 10 + 1e-6 gives 1.5 × (2 − 1e-7), just below the Al", () => {
    expect(limeAlSatCmol(3, 5, 2, 10 + EPS)).toBeCloseTo(1.5 * (2 - EPS / 10), 12);
  });
  it("just outside: RAS 10 − 1e-6 makes 1.5 × excess exceed the Al, so 2.0 × (2 + 1e-7), about 4", () => {
    expect(limeAlSatCmol(3, 5, 2, 10 - EPS)).toBeCloseTo(2 * (2 + EPS / 10), 12);
  });
});
