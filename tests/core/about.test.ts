/**
 * SOIL.ABOUT in core: names in any case and with or without the SOIL. prefix, refusals read whole,
 * and the caution text (rules: reused by every output that shows rates). The ABOUT lines' own
 * sources are in src/data/about; nothing numeric is checked here (common practice).
 */
import { aboutFunction, aboutNames, CAUTION } from "../../src/core/about";
import { errorCode, errorMessage } from "../helpers/errors";

describe("aboutFunction", () => {
  it("reads CMOL, SOIL.CMOL, soil_cmol and ' Soil.Cmol ' as the same function", () => {
    const line = aboutFunction("CMOL");
    expect(line).toMatch(/^Exchangeable cation from mg\/kg to cmol\(\+\)/);
    for (const n of ["SOIL.CMOL", "soil_cmol", " Soil.Cmol "]) expect(aboutFunction(n)).toBe(line);
  });
  it("the prefix is taken off only at the start: FIXSOIL is its own function", () => {
    expect(aboutFunction("FIXSOIL")).toBe(aboutFunction("SOIL.FIXSOIL"));
    expect(errorCode(() => aboutFunction("CMSOIL.OL"))).toBe("UNKNOWN_NAME"); // not CMOL with "SOIL." cut from its middle
  });
  it("an unknown name lists every known one", () => {
    const m = errorMessage(() => aboutFunction("nope"));
    expect(m).toMatch(/^unknown function "nope"; use ABOUT, BAND, BANDPOS, /);
    for (const n of aboutNames()) expect(m).toContain(n);
  });
  it("the names are sorted and include VERSION", () => {
    const names = aboutNames();
    expect([...names].sort()).toEqual(names);
    expect(names).toContain("VERSION");
  });
  it("the caution says results are estimates to check against local calibrations, regulations and licensed advice", () => {
    expect(CAUTION).toBe("Results are estimates: check them against local calibrations, regulations and licensed advice.");
  });
});
