/**
 * The core error type: its closed set of codes, its name, how a code maps to a spreadsheet error,
 * and the list wording of messages. Only the code's own behaviour is checked here (no sources).
 */
import { SOIL_ERROR_CODES, SoilError, errorKindOf, isSoilError, listWords } from "../../src/core/errors";

describe("SoilError", () => {
  it("the closed vocabulary of codes, in its documented order", () => {
    expect(SOIL_ERROR_CODES).toEqual([
      "UNKNOWN_NAME",
      "UNIT_MISMATCH",
      "OUT_OF_RANGE",
      "MISSING_INPUT",
      "NOT_A_NUMBER",
      "SHAPE_MISMATCH",
      "NOT_APPLICABLE",
      "NO_REFERENCE_DATA",
    ]);
  });
  it("is an Error named SoilError carrying its code and message", () => {
    const e = new SoilError("OUT_OF_RANGE", "x must be at least 0 (got -1)");
    expect(e).toBeInstanceOf(Error);
    expect(e.name).toBe("SoilError");
    expect(String(e)).toBe("SoilError: x must be at least 0 (got -1)");
    expect(e.code).toBe("OUT_OF_RANGE");
    expect(isSoilError(e)).toBe(true);
    expect(isSoilError(new Error("x"))).toBe(false);
  });
  it("only NO_REFERENCE_DATA becomes #N/A; every other code is #VALUE!", () => {
    for (const c of SOIL_ERROR_CODES) expect(errorKindOf(c)).toBe(c === "NO_REFERENCE_DATA" ? "#N/A" : "#VALUE!");
  });
});

describe("listWords", () => {
  it("none, one, two and more words", () => {
    expect(listWords([])).toBe("");
    expect(listWords(["a"])).toBe("a");
    expect(listWords(["a", "b"])).toBe("a or b");
    expect(listWords(["a", "b", "c"])).toBe("a, b or c");
  });
});
