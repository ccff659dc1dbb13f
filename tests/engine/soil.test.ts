/**
 * How the engine reaches our functions: stored names in any letter case, which parameters take a
 * whole range, and error values in and out of a binding. Values are invented to exercise the code's
 * logic; no published number (the one CMOL value, 200.39 mg/kg Ca = 1 cmol(+)/kg, is the same
 * IUPAC/CIAAW atomic-weight figure as tests/core, from memory).
 */
import { SOIL_NAMES, SOIL_SIGNATURES, soilCall } from "../../src/engine/soil";
import { evaluateFormula } from "../../src/engine/evaluate";
import { XlError } from "../../src/engine/formula/values";
import { PlainHostError, setHostErrors } from "../../src/functions/_binding";

describe("the engine's view of our functions", () => {
  it("a stored name in any case maps to the formula name; others to nothing", () => {
    expect(SOIL_NAMES.addinFunction!("_xldudf_SOIL_CMOL")).toBe("SOIL.CMOL");
    expect(SOIL_NAMES.addinFunction!("_xldudf_soil_cmol")).toBe("SOIL.CMOL");
    expect(SOIL_NAMES.addinFunction!("_XLDUDF_SOIL_LIMEBUFFER")).toBe("SOIL.LIMEBUFFER");
    expect(SOIL_NAMES.addinFunction!("_xldudf_SOIL_NOPE")).toBeUndefined();
    expect(SOIL_NAMES.addinFunction!("SOIL.CMOL")).toBeUndefined(); // the typed name is not a stored one
  });
  it("soilCall knows the canonical (upper-case) formula names", () => {
    expect(soilCall("SOIL.CMOL")).toBeDefined();
    expect(soilCall("SOIL.LIMEBUFFER")).toBeDefined();
    expect(soilCall("CMOL")).toBeUndefined();
  });
  it("wholeRange marks the parameters that take a whole range", () => {
    expect(SOIL_SIGNATURES.wholeRange("SOIL.BANDPOS")).toEqual([false, true]); // value, limits
    expect(SOIL_SIGNATURES.wholeRange("SOIL.CMOL")).toEqual([false, false]);
    expect(SOIL_SIGNATURES.wholeRange("SOIL.NOPE")).toBeUndefined();
  });
  it("an error value given to a binding comes out as the same error, element by element", () => {
    const r = evaluateFormula('=SOIL.CMOL({200.39,#N/A,#DIV/0!},"Ca")');
    const row = (r.value as unknown[][])[0]!;
    expect(row[0]).toBeCloseTo(1, 10);
    expect(row.slice(1)).toEqual(["#N/A", "#DIV/0!"]);
  });
  it("the engine's errors are used even after another host set its own", () => {
    setHostErrors({ make: (kind, message) => new PlainHostError(kind, message), is: (v) => v instanceof PlainHostError });
    const call = soilCall("SOIL.CMOL")!;
    const v = call([[[-1]], [["Ca"]]]);
    expect(v).toBeInstanceOf(XlError);
    expect([(v as XlError).code, (v as XlError).message]).toEqual(["#VALUE!", "mg_per_kg must be at least 0 mg/kg (got -1 mg/kg)"]);
  });
});
