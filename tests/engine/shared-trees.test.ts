/**
 * The exact keys of src/engine/shared-trees.ts (relative references as offsets from the formula's
 * cell, absolute parts as $-numbers, quoted text skipped whole) and the tree cache that serves a
 * column filled down from one parse. Formulas invented.
 *
 * Expected keys are behaviour (the header of shared-trees.ts: two formulas share a key only when one
 * is the other shifted). Reference forms: ECMA-376 Part 1 §18.17.2 (A1 references, $ absolute
 * markers, 'quoted sheet names' with '' for a quote, "strings" with "" for a quote); the grid is
 * A…XFD and 1…1,048,576 (Microsoft, "Excel specifications and limits").
 */
import { SharedTrees, relativeKey } from "../../src/engine/shared-trees";
import { SOIL_NAMES } from "../../src/engine/soil";

const R = (col: number | string, row: number | string) => `\u0001${col},${row}\u0001`;

describe("relativeKey: the exact key", () => {
  it("relative parts are offsets from the formula's cell; absolute parts are $ and the 0-based index", () => {
    expect(relativeKey("B2", 0, 0)).toBe(R(1, 1));
    expect(relativeKey("B2", 1, 1)).toBe(R(0, 0));
    expect(relativeKey("A1", 4, 2)).toBe(R(-2, -4));
    expect(relativeKey("$C3", 1, 0)).toBe(R("$2", 1));
    expect(relativeKey("C$3", 0, 1)).toBe(R(1, "$2"));
    expect(relativeKey("$XFD$1048576", 7, 7)).toBe(R("$16383", "$1048575"));
    expect(relativeKey("xfd1048576", 0, 0)).toBe(R(16383, 1048575));
    expect(relativeKey("A1+B2*Lab!C3", 0, 0)).toBe(`${R(0, 0)}+${R(1, 1)}*Lab!${R(2, 2)}`);
  });
  it("words that are not cells are kept as written: functions, sheet names, table names, names outside the grid", () => {
    expect(relativeKey("LOG10(A1)", 0, 0)).toBe(`LOG10(${R(0, 0)})`);
    expect(relativeKey("AB12!A1", 0, 0)).toBe(`AB12!${R(0, 0)}`);
    expect(relativeKey("T1[Ca]", 0, 0)).toBe("T1[Ca]");
    expect(relativeKey("XFE1+A0+A1048577+ABCD1", 0, 0)).toBe("XFE1+A0+A1048577+ABCD1");
    expect(relativeKey("A12345678", 0, 0)).toBe("A12345678");
  });
  it("strings and quoted sheet names are skipped whole, doubled quotes inside them included", () => {
    expect(relativeKey('"A1"&B1', 0, 0)).toBe(`"A1"&${R(1, 0)}`);
    expect(relativeKey('"say ""A1"""&B1', 0, 0)).toBe(`"say ""A1"""&${R(1, 0)}`);
    expect(relativeKey("'It''s A1'!B1", 0, 0)).toBe(`'It''s A1'!${R(1, 0)}`);
  });
  it("an unterminated string or quoted name: the text itself (no sharing)", () => {
    expect(relativeKey('"A1&B1', 0, 0)).toBe('"A1&B1');
    expect(relativeKey("'Lab!A1", 3, 3)).toBe("'Lab!A1");
    expect(relativeKey('"a""', 0, 0)).toBe('"a""');
  });
  it("whole columns and rows mark the key with the formula's own position (no sharing across cells)", () => {
    expect(relativeKey("SUM(A:A)", 2, 3)).toBe("SUM(A:A)\u00022,3");
    expect(relativeKey("SUM(1:1)", 0, 0)).toBe("SUM(1:1)\u00020,0");
    expect(relativeKey("SUM(A1:B2)", 0, 0)).toBe(`SUM(${R(0, 0)}:${R(1, 1)})`);
    expect(relativeKey("A+1", 5, 5)).toBe("A+1"); // a lone word is a name, not a column
  });
});

describe("SharedTrees: one parse per relative shape", () => {
  it("a column filled down shares one tree; a leading = is ignored; another shape is another tree", () => {
    const trees = new SharedTrees(SOIL_NAMES);
    const a = trees.tree('=SOIL.CMOL(A1,"Ca")', 0, 1);
    const b = trees.tree('SOIL.CMOL(A2,"Ca")', 1, 1);
    const c = trees.tree('SOIL.CMOL(A1,"Ca")', 1, 1);
    expect(b).toBe(a);
    expect(c).not.toBe(a);
    expect(a.k).toBe("fn");
    expect(trees.tree("SUM(A:A)", 0, 0)).not.toBe(trees.tree("SUM(A:A)", 1, 0));
  });
  it("a formula that does not parse throws the parser's error, every time", () => {
    const trees = new SharedTrees(SOIL_NAMES);
    expect(() => trees.tree("1+", 0, 0)).toThrow("the formula ends too early");
    expect(() => trees.tree("=1+", 5, 5)).toThrow("the formula ends too early");
  });
});
