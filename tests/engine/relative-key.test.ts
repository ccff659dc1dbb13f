/**
 * Formulas filled down share one syntax tree through a key in which relative references are
 * offsets. Two formulas may share a key only when one is the other shifted: these cases would
 * give wrong numbers if the key were looser than the lexer. Formulas invented.
 */
import fc from "fast-check";
import { SharedTrees, relativeKey } from "../../src/engine/shared-trees";
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
  // Excel's grid: columns A to XFD (16,384), rows 1 to 1,048,576 (Microsoft, "Excel specifications
  // and limits"). A word just outside it is a name, left literal; the last cell still shifts.
  it.each([
    ["XFE1", 0, 0],
    ["A1048577", 0, 0],
    ["A0", 0, 0],
    ["ABCD1", 0, 0],
    ["A12345678", 0, 0],
    ["$$A1", 0, 0],
    ["A$$1", 0, 0],
    ["A1B", 0, 0],
    ["A1(2)", 0, 0],
    ["A1!B", 0, 0],
    ["A1[x]", 0, 0],
  ])("%s is no cell reference: the key is the text itself", (text, row, col) => {
    expect(relativeKey(text, row, col)).toBe(text);
  });
  it.each([
    ["XFD1048576", 1048575, 16383, "\u00010,0\u0001"],
    ["A1", 0, 0, "\u00010,0\u0001"],
    ["$B$3", 0, 0, "\u0001$1,$2\u0001"],
    ["b3", 1, 0, "\u00011,1\u0001"],
    ["A0000002", 0, 0, "\u00010,1\u0001"],
    ["-C$2+'Q 1'!A1", 5, 1, "-\u00011,$1\u0001+'Q 1'!\u0001-1,-5\u0001"], // another sheet's relative cell shifts too
  ])("%s at (%i, %i) keys as offsets", (text, row, col, key) => {
    expect(relativeKey(text, row, col)).toBe(key);
  });
  it("a non-breaking space ends a word, as in the lexer (A1\u00a0B1 is two cells)", () => {
    expect(relativeKey("A1\u00a0B1", 0, 0)).toBe("\u00010,0\u0001\u00a0\u00011,0\u0001");
    expect(relativeKey("A1\u00a0B1", 0, 0)).not.toBe(relativeKey("A1\u00a0B1", 1, 0));
  });
  it("a whole column or row in any form marks the key with its cell", () => {
    expect(relativeKey("SUM($A:B)", 3, 4)).toBe("SUM($A:B)\u00023,4");
    expect(relativeKey("SUM(1:$3)", 3, 4)).toBe("SUM(1:$3)\u00023,4");
    expect(relativeKey("SUM(A1:B2)", 0, 0)).toBe("SUM(\u00010,0\u0001:\u00011,1\u0001)");
    expect(relativeKey('"unclosed', 0, 0)).toBe('"unclosed');
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

describe("SharedTrees", () => {
  it("formulas of one shape get one tree, equal to parsing each; other shapes in the column get theirs", () => {
    const trees = new SharedTrees(SOIL_NAMES);
    const a = trees.tree("=A1+1", 0, 1);
    expect(trees.tree("A2+1", 1, 1)).toBe(a); // filled down
    const b = trees.tree("A3*2", 2, 1);
    expect(b).not.toBe(a);
    expect(trees.tree("A4+1", 3, 1)).toBe(a); // after another shape
    expect(trees.tree("B9+1", 8, 2)).toBe(a); // another column, same shape
    for (const [t, r, c] of [["A2+1", 1, 1], ["A3*2", 2, 1], ["A4+1", 3, 1]] as const) expect(trees.tree(t, r, c)).toEqual(parseFormula(t, r, c, SOIL_NAMES));
    expect(() => trees.tree("A1+", 0, 1)).toThrow();
  });
});
