/**
 * Unit words through the headless engine (issue 22 point 5): bare cmol/kg and mmol/kg refused as
 * ambiguous between charge and moles, mg/L not read as soil volume, Mg/ha matched by case and
 * mg/ha refused. Factors: SI and NIST SP 811 (Thompson & Taylor 2008); charge units as in
 * Rayment & Lyons (2011) App. 5; inputs invented.
 */
import { evaluateFormula } from "../../src/engine/evaluate";

describe("unit words in formulas", () => {
  it.each(['=SOIL.CONVERT(1,"cmol/kg","mmolc/kg")', '=SOIL.CONVERT(1,"meq/100g","mmol/kg")'])("%s is #VALUE! (ambiguous charge or moles)", (f) => {
    const r = evaluateFormula(f);
    expect(r.error).toBe("#VALUE!");
    expect(r.message).toMatch(/is ambiguous: labs write it for .*moles of charge and for .*moles of the ion/);
  });
  it("the charge spellings convert: 1 cmol(+)/kg = 10 mmolc/kg", () => {
    expect(evaluateFormula('=SOIL.CONVERT(1,"cmol(+)/kg","mmolc/kg")').value).toBeCloseTo(10, 12);
  });
  it("mg/L is #VALUE! naming mg/dm3; mg/dm3 converts with the bulk density", () => {
    expect(evaluateFormula('=SOIL.CONVERT(26,"mg/L","mg/kg",,1.3)').message).toMatch(/^from_unit "mg\/L" is usually the concentration of an extract.*write mg\/dm3/);
    expect(evaluateFormula('=SOIL.CONVERT(26,"mg/dm3","mg/kg",,1.3)').value).toBeCloseTo(20, 10);
  });
  it("Mg/ha is a tonne per hectare; mg/ha and MG/HA are #VALUE!", () => {
    expect(evaluateFormula('=SOIL.CONVERT(2,"Mg/ha","kg/ha")').value).toBe(2000);
    expect(evaluateFormula('=SOIL.CONVERT(2,"mg/ha","kg/ha")').message).toMatch(/write Mg\/ha or t\/ha/);
    expect(evaluateFormula('=SOIL.CONVERT(2,"MG/HA","kg/ha")').error).toBe("#VALUE!");
  });
  it("a column of unit words spills, each refused or converted in its own cell", () => {
    const rows = evaluateFormula('=SOIL.CONVERT(1,{"Mg/ha";"mg/ha";"t/ha"},"kg/ha")').value as unknown[][];
    expect(rows[0]![0]).toBe(1000);
    expect(rows[1]![0]).toMatch(/^#VALUE! from_unit "mg\/ha"/);
    expect(rows[2]![0]).toBe(1000);
  });
});
