/**
 * The fuzzer's own checks catch what they are meant to (invented results), and its generators
 * reach every registered function with words of its own.
 */
import fc from "fast-check";
import { PlainHostError } from "../../src/functions/_binding";
import { FUNCTIONS, argsFor, declaredRange, listedChoices, nearMisses, resultProblems, wordsOf } from "./kit";

describe("resultProblems", () => {
  it("accepts numbers, text, blanks and errors with a kind and a message", () => {
    expect(resultProblems([[1, "Low", ""], [new PlainHostError("#N/A", "no table"), 0, new PlainHostError("#VALUE!", "x")]])).toEqual([]);
  });
  it.each([
    ["NaN", [[NaN]]],
    ["Infinity", [[Infinity]]],
    ["-0", [[-0]]],
    ["undefined", [[undefined]]],
    ["null", [[null]]],
    ["a plain object", [[{}]]],
    ["a boolean", [[true]]],
    ["an error without a message", [[new PlainHostError("#VALUE!", " ")]]],
    ["an error of another kind", [[new PlainHostError("#NUM!" as never, "x")]]],
    ["an internal error", [[new PlainHostError("#VALUE!", "internal error: x is undefined")]]],
    ["ragged rows", [[1, 2], [3]]],
    ["no rows", []],
    ["not rows", 5],
  ])("flags %s", (_, result) => {
    expect(resultProblems(result).length).toBeGreaterThan(0);
  });
});

describe("generators", () => {
  it("read the choices an UNKNOWN_NAME message lists", () => {
    expect(listedChoices('unknown ion "Fe"; use Ca, Mg, K, Na, NH4, H, Al or Mn')).toEqual(["Ca", "Mg", "K", "Na", "NH4", "H", "Al", "Mn"]);
  });
  it("make near-misses that differ from the word", () => {
    const near = nearMisses("mg/kg");
    expect(near).toEqual(expect.arrayContaining(["MG/KG", " mg/kg ", "g/kg", "mg/k", "mg∕kg"]));
    expect(near).not.toContain("mg/kg");
  });
  it("read a declared range from a parameter description", () => {
    expect(declaredRange("Soil pH (0 to 14).")).toEqual([0, 14]);
    expect(declaredRange("Depth in cm (0–300); needed")).toEqual([0, 300]);
    expect(declaredRange("% of dry matter (above 0, at most 250).")).toEqual([0, 250]);
  });
  it("give every function with a text argument words it accepts", () => {
    for (const fn of FUNCTIONS) {
      const words = wordsOf(fn);
      fn.spec.params.forEach((p, i) => {
        if (p.kind === "text") expect({ fn: fn.id, param: p.name, words: (words.byParam.get(i) ?? []).length > 0 }).toEqual({ fn: fn.id, param: p.name, words: true });
      });
    }
  });
  it("make argument lists of every length around the declared one", () => {
    const fn = FUNCTIONS.find((f) => f.spec.params.length >= 3)!;
    const lengths = new Set(fc.sample(argsFor(fn, wordsOf(fn)), { numRuns: 300, seed: 7 }).map((a) => a.length));
    expect([...lengths].sort()).toEqual([fn.spec.params.length - 1, fn.spec.params.length, fn.spec.params.length + 1].sort());
  });
});
