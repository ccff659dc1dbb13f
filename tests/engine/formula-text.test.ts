/** Excel's stored form of add-in formulas (platform-facts.md: `_xldudf_SOIL_CEC(`), from memory of Excel files; not verified against Excel here. */
import { toEngineFormula, toStoredFormula, callsSoil } from "../../src/engine/formula-text";

describe("stored form ↔ typed form", () => {
  it("rewrites our functions only, outside strings", () => {
    expect(toEngineFormula('_xldudf_SOIL_CMOL(A1,"_xldudf_SOIL_CMOL(")+_xlfn.XLOOKUP(1,A:A,B:B)')).toBe(
      'SOIL.CMOL(A1,"_xldudf_SOIL_CMOL(")+XLOOKUP(1,A:A,B:B)',
    );
    expect(toStoredFormula('=soil.cmol(A1,"SOIL.CMOL(")*2')).toBe('_xldudf_SOIL_CMOL(A1,"SOIL.CMOL(")*2');
    expect(toEngineFormula("_xldudf_OTHER_THING(1)")).toBe("_xldudf_OTHER_THING(1)");
    // LibreOffice saves our stored names in lower case; they are written back in Excel's case
    expect(toStoredFormula('_xldudf_soil_cmol(A1,"Ca")')).toBe('_xldudf_SOIL_CMOL(A1,"Ca")');
  });
  it("round trip for every registered id", () => {
    expect(toEngineFormula(toStoredFormula('=SOIL.CONVERT(1,"t/ha","kg/ha")'))).toBe('SOIL.CONVERT(1,"t/ha","kg/ha")');
  });
  it("detects SOIL calls", () => {
    expect(callsSoil("SUM(A1:A3)")).toBe(false);
    expect(callsSoil('"SOIL.CEC(" & A1')).toBe(false);
    expect(callsSoil("_xldudf_SOIL_CMOL(A1,\"Ca\")")).toBe(true);
  });
});
