/**
 * The shared reading of legume-checks.json: optional measurements as typed, the legume word and the
 * load-time checks of the data file. Values here are invented: they exercise the code only (no published numbers).
 */
import { measured, legumeOf } from "../../../src/core/nitrogen/legumes";
import { errorCode as code, errorMessage as message } from "../../helpers/errors";
import table from "../../../src/data/nitrogen/legume-checks.json";

const bound = { name: "nitrate", unit: "kg N/ha", min: 0, max: 1000 };
const DATA = "../../../src/data/nitrogen/legume-checks.json";
const MODULE = "../../../src/core/nitrogen/legumes";

describe("measured: an optional reading as typed", () => {
  it("blank or omitted is not measured; numbers and numeric text are read", () => {
    expect(measured(undefined, bound)).toBeUndefined();
    expect(measured("  ", bound)).toBeUndefined();
    expect(measured(" 12.5 ", bound)).toBe(12.5);
    expect(measured(12.5, bound)).toBe(12.5);
  });
  it("a censored value (starting < or >) gets the detection hint; other text with < or > inside does not", () => {
    expect(message(() => measured("<5", bound))).toBe(
      'nitrate: "<5" is not a number (a below- or above-detection value is your call: enter a number or leave the cell blank)',
    );
    expect(message(() => measured(">200", bound))).toContain("above-detection value is your call");
    expect(message(() => measured("5<", bound))).toBe('nitrate: "5<" is not a number');
  });
  it("a decimal comma between digits gets the full-stop hint; a comma beside a letter does not", () => {
    expect(code(() => measured("12,5", bound))).toBe("NOT_A_NUMBER");
    expect(message(() => measured("12,5", bound))).toBe('nitrate: "12,5" is not a number (use a full stop as the decimal separator)');
    expect(message(() => measured("a,5", bound))).toBe('nitrate: "a,5" is not a number');
    expect(message(() => measured("5,a", bound))).toBe('nitrate: "5,a" is not a number');
  });
  it("other text is NOT_A_NUMBER with no hint", () => {
    expect(message(() => measured("high", bound))).toBe('nitrate: "high" is not a number');
  });
});

describe("legumeOf: the legume word", () => {
  it("a blank word is MISSING_INPUT naming the argument, 'legume' by default", () => {
    expect(code(() => legumeOf(" "))).toBe("MISSING_INPUT");
    expect(message(() => legumeOf(" "))).toBe('legume is required: name the legume (e.g. "field pea") or inoculant group (e.g. "group N")');
    expect(message(() => legumeOf("", "crop"))).toMatch(/^crop is required/);
  });
  it("an unknown word is UNKNOWN_NAME naming the argument", () => {
    expect(code(() => legumeOf("turnip"))).toBe("UNKNOWN_NAME");
    expect(message(() => legumeOf("turnip"))).toMatch(/^unknown legume "turnip"; use field pea, faba bean/);
    expect(message(() => legumeOf("turnip", "crop"))).toMatch(/^unknown crop "turnip"/);
  });
});

describe("load-time checks of legume-checks.json (a broken copy of the file, mocked)", () => {
  const loadWith = (edit: (t: typeof table) => void): (() => unknown) => {
    const copy = JSON.parse(JSON.stringify(table)) as typeof table;
    edit(copy);
    return () =>
      jest.isolateModules(() => {
        jest.doMock(DATA, () => copy);
        require(MODULE);
      });
  };
  afterEach(() => jest.dontMock(DATA));
  it("the real file loads", () => {
    expect(loadWith(() => undefined)).not.toThrow();
  });
  it("a level with no number, no meaning or an unknown comparison is malformed", () => {
    expect(loadWith((t) => delete (t.ph_levels[0] as { level?: number }).level)).toThrow("legume-checks.json: level pulse-acid is malformed");
    expect(loadWith((t) => delete (t.count_levels[0] as { per_plant?: number }).per_plant)).toThrow("level pea-vetch-faba is malformed");
    expect(loadWith((t) => delete (t.nitrate_levels[0] as { meaning?: string }).meaning)).toThrow("level pea-start is malformed");
    expect(loadWith((t) => delete (t.count_levels[0] as { met_meaning?: string }).met_meaning)).toThrow("level pea-vetch-faba is malformed");
    expect(loadWith((t) => (t.boron_levels[0]!.flag_when = "under"))).toThrow("level lucerne-hot-water is malformed");
  });
  it("a legume naming a level that does not exist fails at load, naming both", () => {
    expect(loadWith((t) => (t.legumes[0]!.ph = "no-such-level"))).toThrow('legume-checks.json: field pea names an unknown level "no-such-level"');
    expect(loadWith((t) => (t.legumes[0]!.nitrate = ["pea-start", "nope"]))).toThrow('field pea names an unknown level "nope"');
  });
});
