/**
 * Functions added beyond the catalogue (SOIL.ESPSAR, SOIL.CCE) through the headless engine:
 * spills, ranges, chaining into SOIL.LIMEPRODUCT, errors with messages. Sources as in
 * tests/core/cations/esp-sar.test.ts (USDA Handbook 60 regression via OAC 165:10, secondary; the
 * values are arithmetic on it, derived) and tests/core/lime/cce.test.ts (UNL PASSEL Table 4.4 and
 * the MN Dept. of Agriculture dolomite composition, seen; CCE derived).
 */
import { evaluateFormula } from "../../src/engine/evaluate";

const value = (f: string) => evaluateFormula(f).value;

describe("SOIL.ESPSAR", () => {
  it("a column of SARs spills a column of estimated ESPs", () => {
    const v = value("=SOIL.ESPSAR({10;13})") as number[][];
    expect(v[0]![0]).toBeCloseTo(11.8865, 4);
    expect(v[1]![0]).toBeCloseTo(15.193, 3);
  });
  it("chains from SOIL.SAR of the extract (Na 15, Ca 6, Mg 4 mmolc/L): 7.95 %", () => {
    expect(value('=SOIL.ESPSAR(SOIL.SAR(15,6,4,"mmolc/L"))') as number).toBeCloseTo(7.948, 3);
  });
  it("a negative SAR is #VALUE! with the range", () => {
    const r = evaluateFormula("=SOIL.ESPSAR(-1)");
    expect(r.error).toBe("#VALUE!");
    expect(r.message).toMatch(/sar must be at least 0/);
  });
});

describe("SOIL.CCE", () => {
  it("dolomite as 21.7 % Ca and 13.1 % Mg: 108.1 %", () => {
    expect(value('=SOIL.CCE({21.7,13.1},{"Ca","Mg"})') as number).toBeCloseTo(108.14, 2);
  });
  it("feeds SOIL.LIMEPRODUCT: 5 t/ha CaCO3 as a 90 % CaCO3 + 5 % MgCO3 product is 5.21 t/ha", () => {
    expect(value('=SOIL.LIMEPRODUCT(5,SOIL.CCE({90,5},{"CaCO3","MgCO3"}))') as number).toBeCloseTo(5.212, 3);
  });
  it("an element counted twice is #VALUE! saying so", () => {
    const r = evaluateFormula('=SOIL.CCE({30,20},{"Ca","CaCO3"})');
    expect(r.error).toBe("#VALUE!");
    expect(r.message).toMatch(/both count Ca/);
  });
});
