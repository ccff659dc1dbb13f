/**
 * The built-in calibration list: what `soilcell list` shows, the not-shipped refusal, the depth
 * refusal, and the checks on the data files themselves (run against invented replacement files).
 *
 * Ids, sources, units and depths are read from the data files (the published values are checked in
 * buffer.test.ts); the replacement files below are invented to reach the data checks.
 */
import sikoraData from "../../../src/data/lime/sikora-or2025.json";
import smpData from "../../../src/data/lime/smp.json";
import mehlichData from "../../../src/data/lime/mehlich-ncda.json";
import { limeCalibration, limeCalibrationDepthCm, limeCalibrationTables } from "../../../src/core/lime/calibrations";
import { errorCode as codeOf, errorMessage as messageOf } from "../../helpers/errors";

describe("limeCalibrationTables (for soilcell list)", () => {
  it("one entry per built-in, in file order, with its source, unit, depth and whether its table is shipped", () => {
    expect(limeCalibrationTables()).toEqual([
      { id: "SMP", source: smpData.source, unit: "ton/ac", depthCm: undefined, shipped: false },
      { id: "SIKORA-OR2025", source: sikoraData.source, unit: "ton/ac", depthCm: 15.24, shipped: true },
      { id: "MEHLICH", source: mehlichData.source, unit: "ton/ac", depthCm: undefined, shipped: true },
    ]);
  });
});

describe("refusals", () => {
  it("SMP: the not-shipped message gives the file's reason and what to do", () => {
    expect(messageOf(() => limeCalibration("SMP"))).toBe(`the SMP table is not shipped (${smpData.reason}). ${smpData.what_to_do}`);
  });
  it("MEHLICH has no stated depth: NOT_APPLICABLE naming it", () => {
    expect(codeOf(() => limeCalibrationDepthCm("MEHLICH"))).toBe("NOT_APPLICABLE");
    expect(messageOf(() => limeCalibrationDepthCm("MEHLICH"))).toBe("the MEHLICH source does not state the depth its rates are for");
  });
});

describe("checks on the data files (invented replacement files)", () => {
  const SMP = "../../../src/data/lime/smp.json";
  const SIKORA = "../../../src/data/lime/sikora-or2025.json";
  /** Loads calibrations.ts afresh with one data file replaced. */
  function withFile(path: string, file: object): typeof import("../../../src/core/lime/calibrations") {
    let mod: typeof import("../../../src/core/lime/calibrations") | undefined;
    jest.isolateModules(() => {
      jest.doMock(path, () => file);
      // eslint-disable-next-line @typescript-eslint/no-var-requires
      mod = require("../../../src/core/lime/calibrations");
    });
    jest.dontMock(path);
    return mod!;
  }
  const table = { id: "INVENTED", source: "invented", status: "invented", unit: "ton/ac", depth_cm: 15, target_ph: [6.0, 6.5] };
  it("a row with the wrong number of rates stops the module from loading, naming the row", () => {
    const bad = { ...table, basis: { neutralizing_value_pct: 100 }, rows: [{ buffer_ph: 6.0, rates: [1, 2] }, { buffer_ph: 6.5, rates: [1] }] };
    expect(() => withFile(SIKORA, bad)).toThrow("INVENTED: row 6.5 has 1 rates");
  });
  it.each([null, 0, -5])("a table without a positive basis neutralizing value (%s) stops the module from loading", (nv) => {
    const bad = { ...table, basis: { neutralizing_value_pct: nv }, rows: [{ buffer_ph: 6.0, rates: [1, 2] }] };
    expect(() => withFile(SIKORA, bad)).toThrow("INVENTED: a table needs its basis neutralizing value");
  });
  it("rows listed downwards are sorted so the buffer axis ascends", () => {
    const file = {
      ...table,
      basis: { neutralizing_value_pct: 100 },
      rows: [{ buffer_ph: 6.5, rates: [0, 1] }, { buffer_ph: 6.0, rates: [2, 3] }],
    };
    const c = withFile(SIKORA, file).limeCalibration("INVENTED");
    expect(c.kind === "table" && c.table).toEqual({ name: "the INVENTED table", bufferPh: [6.0, 6.5], targetPh: [6.0, 6.5], rates: [[2, 3], [0, 1]] });
  });
  it("an unshipped table without a reason or advice says 'not verified', with no trailing space", () => {
    const file = { ...table, id: "SMP", basis: { neutralizing_value_pct: 100 }, target_ph: [], rows: [] };
    const m = withFile(SMP, file);
    expect(messageOf(() => m.limeCalibration("SMP"))).toBe("the SMP table is not shipped (not verified).");
    expect(m.limeCalibrationTables()[0]).toEqual({ id: "SMP", source: "invented", unit: "ton/ac", depthCm: 15, shipped: false });
  });
});
