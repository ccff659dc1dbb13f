/**
 * The name tables behind every typed word (units, ions, forms, policies): normalising, aliases,
 * and the refusal of a table that would read one word two ways. Only the code's own behaviour is
 * checked here (no sources); the words are invented.
 */
import { nameTable, normaliseWord } from "../../src/core/names";
import { errorCode, errorMessage } from "../helpers/errors";

describe("normaliseWord", () => {
  it("trims, lower-cases, removes inner spaces and reads the Greek mu (U+03BC) as the micro sign (U+00B5)", () => {
    expect(normaliseWord("  Kg  Ha-1 ")).toBe("kgha-1");
    expect(normaliseWord("\u03bcg/g")).toBe("\u00b5g/g");
  });
});

describe("nameTable", () => {
  const table = nameTable([
    { id: "Alpha", aliases: ["a", "first one"], value: 1 },
    { id: "Beta", value: 2 },
  ]);
  it("finds ids and aliases in any case and spacing, and lists the ids in table order", () => {
    expect(table.lookup(" ALPHA ", "word")).toBe(1);
    expect(table.lookup("FirstOne", "word")).toBe(1);
    expect(table.has("beta")).toBe(true);
    expect(table.has("gamma")).toBe(false);
    expect(table.ids).toEqual(["Alpha", "Beta"]);
  });
  it("an unknown word is UNKNOWN_NAME naming what was looked for and the ids", () => {
    expect(errorCode(() => table.lookup("gamma", "letter"))).toBe("UNKNOWN_NAME");
    expect(errorMessage(() => table.lookup("gamma", "letter"))).toBe('unknown letter "gamma"; use Alpha or Beta');
  });
  it("a table that would read one word two ways is refused when built", () => {
    expect(() => nameTable([{ id: "x", value: 1 }, { id: "Y", aliases: ["X "], value: 2 }])).toThrow(/^duplicate name in table: X $/);
  });
  it("the same word twice for the same value is allowed", () => {
    expect(nameTable([{ id: "x", aliases: ["X"], value: 1 }]).lookup("x", "word")).toBe(1);
  });
});
