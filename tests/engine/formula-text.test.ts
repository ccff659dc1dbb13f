/**
 * Excel's stored form of add-in formulas (platform-facts.md: `_xldudf_SOIL_CEC(`, `_xlfn.` prefixes,
 * `_xlfn.ANCHORARRAY(B1)` for B1#), from memory of Excel files; not verified against Excel here.
 * Rewrites are token-based: only function names change, never strings or sheet names. The edge
 * cases at the end (names, odd spill operands, unreadable text) are invented to exercise the code's
 * logic; no published form.
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

describe("stored form ↔ typed form: edges", () => {
  it("a leading = is kept by toTypedFormula and dropped by toStoredFormula; only a leading one", () => {
    expect(toTypedFormula('=_xldudf_SOIL_CMOL(1,"Ca")')).toBe('=SOIL.CMOL(1,"Ca")');
    expect(toTypedFormula("2=_xlfn.XLOOKUP(1,A:A,B:B)")).toBe("2=XLOOKUP(1,A:A,B:B)");
    expect(toStoredFormula('=SOIL.CMOL(1,"Ca")')).toBe('_xldudf_SOIL_CMOL(1,"Ca")');
    expect(toStoredFormula('2=SOIL.CMOL(1,"Ca")')).toBe('2=_xldudf_SOIL_CMOL(1,"Ca")');
  });
  it("two rewrites in one formula are both made, in place", () => {
    expect(toTypedFormula('_xlfn.XLOOKUP(1,A:A,B:B)+_xldudf_SOIL_CMOL(2,"Mg")')).toBe('XLOOKUP(1,A:A,B:B)+SOIL.CMOL(2,"Mg")');
    expect(toStoredFormula('SOIL.CMOL(A1#,"Ca")+SOIL.CMOL(2,"Mg")')).toBe('_xldudf_SOIL_CMOL(_xlfn.ANCHORARRAY(A1),"Ca")+_xldudf_SOIL_CMOL(2,"Mg")');
  });
  it("functions without a stored prefix keep the case they were written in", () => {
    expect(toTypedFormula("sum(1,2)")).toBe("sum(1,2)");
    expect(toTypedFormula("my_xlsum(1)")).toBe("my_xlsum(1)"); // _xl not at the start is no prefix
  });
  it("_xlfn.ANCHORARRAY becomes # only around a single reference or name", () => {
    expect(toTypedFormula("_xlfn.ANCHORARRAY(B2)")).toBe("B2#");
    expect(toTypedFormula("_xlfn.ANCHORARRAY(plot_rows)")).toBe("plot_rows#");
    expect(toTypedFormula("_xlfn.ANCHORARRAY(1)")).toBe("ANCHORARRAY(1)");
    expect(toTypedFormula("_xlfn.ANCHORARRAY(B2,C3)")).toBe("ANCHORARRAY(B2,C3)");
    expect(toTypedFormula("_xlfn.ANCHORARRAY(B2")).toBe("ANCHORARRAY(B2");
    expect(toTypedFormula("_xlfn.SINGLE(B2)")).toBe("SINGLE(B2)"); // another function around a reference
  });
  it("# becomes _xlfn.ANCHORARRAY only after a reference or name", () => {
    expect(toStoredFormula("plot_rows#")).toBe("_xlfn.ANCHORARRAY(plot_rows)");
    expect(toStoredFormula("SUM(1)#")).toBe("SUM(1)#");
    expect(toStoredFormula("#")).toBe("#");
  });
  it("text the lexer cannot read is left as it is", () => {
    expect(toTypedFormula('=_xldudf_SOIL_CMOL(1,"Ca')).toBe('=_xldudf_SOIL_CMOL(1,"Ca');
    expect(toStoredFormula('=SOIL.CMOL(1,"Ca')).toBe('SOIL.CMOL(1,"Ca');
    expect(callsSoil('=SOIL.CMOL(1,"Ca')).toBe(false);
  });
  it("callsSoil reads either form, with or without =, and only function calls", () => {
    expect(callsSoil('=SOIL.CMOL(1,"Ca")')).toBe(true);
    expect(callsSoil('A1=SOIL.CMOL(1,"Ca")')).toBe(true);
    expect(callsSoil('="SOIL.CMOL"')).toBe(false);
    expect(callsSoil("SOIL.CMOL+1")).toBe(false); // a name, not a call
    expect(callsSoil("=SUM(1,2)")).toBe(false);
  });
});
