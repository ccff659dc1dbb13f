/**
 * Excel's stored form of add-in formulas (platform-facts.md: `_xldudf_SOIL_CEC(`, `_xlfn.` prefixes,
 * `_xlfn.ANCHORARRAY(B1)` for B1#), from memory of Excel files; not verified against Excel here.
 * Rewrites are token-based: only function names change, never strings or sheet names.
 */
import { toTypedFormula, toStoredFormula, callsSoil } from "../../src/engine/formula-text";

describe("stored form ↔ typed form", () => {
  it("rewrites function names only, outside strings", () => {
    expect(toTypedFormula('_xldudf_SOIL_CMOL(A1,"_xldudf_SOIL_CMOL(")+_xlfn.XLOOKUP(1,A:A,B:B)')).toBe('SOIL.CMOL(A1,"_xldudf_SOIL_CMOL(")+XLOOKUP(1,A:A,B:B)');
    expect(toStoredFormula('=soil.cmol(A1,"SOIL.CMOL(")*2')).toBe('_xldudf_SOIL_CMOL(A1,"SOIL.CMOL(")*2');
    expect(toTypedFormula("_xldudf_OTHER_THING(1)")).toBe("_XLDUDF_OTHER_THING(1)");
  });
  it("writes LibreOffice's lower-case stored names back in Excel's case", () => {
    expect(toStoredFormula('_xldudf_soil_cmol(A1,"Ca")')).toBe('_xldudf_SOIL_CMOL(A1,"Ca")');
  });
  it("round trip for a registered id", () => {
    expect(toTypedFormula(toStoredFormula('=SOIL.CONVERT(1,"t/ha","kg/ha")'))).toBe('SOIL.CONVERT(1,"t/ha","kg/ha")');
  });
  it("leaves sheet names that look like the namespace alone", () => {
    const f = "'Soil.Band (2025)'!A1+Soil.Data!B2+SOIL.CMOL(Soil.Data!C3,\"Ca\")";
    expect(toStoredFormula(f)).toBe("'Soil.Band (2025)'!A1+Soil.Data!B2+_xldudf_SOIL_CMOL(Soil.Data!C3,\"Ca\")");
  });
  it("writes the spill operator in stored form and reads it back", () => {
    expect(toStoredFormula("SUM(B2#)*2")).toBe("SUM(_xlfn.ANCHORARRAY(B2))*2");
    expect(toTypedFormula("SUM(_xlfn.ANCHORARRAY(B2))*2")).toBe("SUM(B2#)*2");
  });
  it("detects SOIL calls, not text", () => {
    expect(callsSoil("SUM(A1:A3)")).toBe(false);
    expect(callsSoil('"SOIL.CEC(" & A1')).toBe(false);
    expect(callsSoil("'Soil.Cec'!A1")).toBe(false);
    expect(callsSoil('_xldudf_SOIL_CMOL(A1,"Ca")')).toBe(true);
  });
});
