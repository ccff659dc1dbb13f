/**
 * In Excel's runtime (a global CustomFunctions), host errors are CustomFunctions.Error with the
 * matching code: #N/A for missing reference data, #VALUE! for every other refusal. The runtime is
 * stood in for by a small fake; the module is loaded fresh so it picks the factory up. Values are
 * invented: they exercise the binding layer only, no published numbers.
 */
class FakeExcelError {
  constructor(
    readonly code: string,
    readonly message: string,
  ) {}
}
const fakeRuntime = { Error: FakeExcelError, ErrorCode: { notAvailable: "#N/A", invalidValue: "#VALUE!" } };

describe("host errors inside Excel", () => {
  beforeEach(() => {
    (globalThis as Record<string, unknown>).CustomFunctions = fakeRuntime;
  });
  afterEach(() => {
    delete (globalThis as Record<string, unknown>).CustomFunctions;
  });
  it("refusals become CustomFunctions.Error with notAvailable for #N/A and invalidValue otherwise, message kept", () => {
    jest.isolateModules(() => {
      const { hostErrorFor } = require("../../src/functions/_binding") as typeof import("../../src/functions/_binding");
      const { SoilError } = require("../../src/core/errors") as typeof import("../../src/core/errors");
      const na = hostErrorFor(new SoilError("NO_REFERENCE_DATA", "no table for this crop"));
      expect(na).toBeInstanceOf(FakeExcelError);
      expect(na).toEqual(new FakeExcelError("#N/A", "no table for this crop"));
      expect(hostErrorFor(new SoilError("OUT_OF_RANGE", "pH must be 0 to 14"))).toEqual(new FakeExcelError("#VALUE!", "pH must be 0 to 14"));
    });
  });
  it("an Excel error in a cell is recognised and passed through unchanged", () => {
    jest.isolateModules(() => {
      const { cmol } = require("../../src/functions/units") as typeof import("../../src/functions/units");
      const inCell = new FakeExcelError("#N/A", "from another formula");
      const out = cmol([[inCell], [200.39]], [["Ca"]]);
      expect(out[0]![0]).toBe(inCell);
      expect(out[1]![0]).toBeCloseTo(1, 10);
      // Outside Excel's own class, an object is no error value: it is refused as not a number.
      expect(cmol([[{ code: "#N/A" }]], [["Ca"]])[0]![0]).toEqual(new FakeExcelError("#VALUE!", "mg_per_kg: [object Object] is not a number"));
    });
  });
});
