/**
 * Formulas filled down share one syntax tree through a key in which relative references are
 * offsets. Two formulas may share a key only when one is the other shifted: these cases would
 * give wrong numbers if the key were looser than the lexer. Formulas invented.
 */
import fc from "fast-check";
import { relativeKey } from "../../src/engine/book";
import { columnLetters } from "../../src/engine/cellref";
import { parseFormula } from "../../src/engine/formula/parser";
import { SOIL_NAMES } from "../../src/engine/soil";

describe("relative keys of formulas", () => {
  it("a formula filled down has one key", () => {
    expect(relativeKey('SOIL.CEC(B2,C2,D2,E2,"mg/kg",F2)', 1, 10)).toBe(relativeKey('SOIL.CEC(B3,C3,D3,E3,"mg/kg",F3)', 2, 10));
    expect(relativeKey("$A$1+B2", 1, 2)).toBe(relativeKey("$A$1+B3", 2, 2));
  });
  it.each([
    ["text in strings is not shifted", '"NH3"&A1', 0, 0, '"NH4"&A2', 1, 0],
    ["names and functions that look like cells are not shifted", "LOG10(A1)+XA1(2)", 0, 0, "LOG11(A2)+XA1(2)", 1, 0],
    ["a sheet name that looks like a cell is not shifted", "LAB1!A1", 0, 0, "LAB2!A2", 1, 0],
    ["whole columns are relative: the same text in two columns is two formulas", "SUM(A:A)", 0, 1, "SUM(A:A)", 0, 2],
    ["whole rows likewise", "SUM(1:1)", 1, 0, "SUM(1:1)", 2, 0],
    ["absolute parts stay absolute", "$A1", 0, 0, "$A2", 0, 1],
  ])("%s", (_what, a, ra, ca, b, rb, cb) => {
    expect(relativeKey(a as string, ra as number, ca as number)).not.toBe(relativeKey(b as string, rb as number, cb as number));
  });
  it("equal keys mean equal trees (property over shifted references)", () => {
    const ref = fc.record({ col: fc.integer({ min: 0, max: 30 }), row: fc.integer({ min: 0, max: 30 }), absC: fc.boolean(), absR: fc.boolean() });
    fc.assert(
      fc.property(fc.array(ref, { minLength: 1, maxLength: 4 }), fc.integer({ min: 0, max: 5 }), fc.integer({ min: 0, max: 5 }), (refs, dr, dc) => {
        const letters = columnLetters;
        const text = (r0: number, c0: number) =>
          refs.map((x) => `${x.absC ? "$" : ""}${letters(x.absC ? x.col : x.col + c0)}${x.absR ? "$" : ""}${(x.absR ? x.row : x.row + r0) + 1}`).join("+");
        const a = text(0, 0);
        const b = text(dr, dc);
        if (relativeKey(a, 10, 10) === relativeKey(b, 10 + dr, 10 + dc)) {
          expect(parseFormula(a, 10, 10, SOIL_NAMES)).toEqual(parseFormula(b, 10 + dr, 10 + dc, SOIL_NAMES));
        }
        expect(relativeKey(a, 10, 10)).toBe(relativeKey(b, 10 + dr, 10 + dc));
      }),
    );
  });
});
