/**
 * The sheet writer's byte collector gives exactly the UTF-8 of its pieces joined, whatever their
 * sizes and scripts (pieces are joined in 64 K-character runs before encoding). Texts invented.
 */
import fc from "fast-check";
import { Utf8Writer } from "../../src/engine/sheet-patch";

describe("Utf8Writer", () => {
  it("writes the UTF-8 of the joined pieces (property, pieces of any size and script)", () => {
    const piece = fc.oneof(fc.string({ unit: "grapheme", maxLength: 40 }), fc.constant(""), fc.nat({ max: 70000 }).map((n) => "é".repeat(n)), fc.nat({ max: 3 }).map((n) => "😀ā".repeat(n * 9000)));
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 30 }), fc.integer({ min: 1, max: 1 << 20 }), (pieces, expected) => {
        const w = new Utf8Writer(expected);
        for (const p of pieces) w.add(p);
        expect(w.toBuffer().equals(Buffer.from(pieces.join(""), "utf8"))).toBe(true);
      }),
      { numRuns: 60 },
    );
  });
  it("grows past its first guess and keeps what was written before", () => {
    const w = new Utf8Writer(1);
    const big = "<c r=\"A1\"><v>1</v></c>".repeat(10000);
    w.add(big);
    w.add("ü");
    w.add(big);
    expect(w.toBuffer().toString("utf8")).toBe(`${big}ü${big}`);
    expect(w.toBuffer().toString("utf8")).toBe(`${big}ü${big}`); // asked twice: the same bytes
  });
});
