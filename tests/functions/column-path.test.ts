/**
 * A binding with a column kernel gives every element of a column exactly what the same element
 * gives on its own (one cell, which takes the element path): numbers, blanks, text, errors in
 * cells, refusals. Inputs are generated (property tests); invented values.
 */
import fc from "fast-check";
import * as bindings from "../../src/functions";
import { PlainHostError } from "../../src/functions/_binding";

const cellArb = fc.oneof(
  { weight: 6, arbitrary: fc.double({ min: -5, max: 4000, noNaN: true }) },
  { weight: 1, arbitrary: fc.constantFrom("", "12.5", "<0.5", "n.d.", null) },
  { weight: 1, arbitrary: fc.constant(new PlainHostError("#N/A", "an error in a cell")) },
);
const unitArb = fc.constantFrom("mg/kg", "meq/100g", "mmolc/kg", "mg/dm3", "cmol/kg", "");
const show = (v: unknown) => (v instanceof PlainHostError ? `${v.kind} ${v.message}` : v);

describe("column kernels through the bindings", () => {
  it("SOIL.CEC over a column = SOIL.CEC cell by cell", () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(cellArb, cellArb, cellArb, cellArb, cellArb), { minLength: 16, maxLength: 40 }), unitArb, fc.boolean(), (rows, unit, withAcid) => {
        const col = (j: number) => rows.map((r) => [r[j]]);
        const whole = bindings.cec(col(0), col(1), col(2), col(3), [[unit]], withAcid ? col(4) : (undefined as never)).map((r) => show(r[0]));
        const single = rows.map((r) => show(bindings.cec([[r[0]]], [[r[1]]], [[r[2]]], [[r[3]]], [[unit]], withAcid ? [[r[4]]] : (undefined as never))[0]![0]));
        expect(whole).toEqual(single);
      }),
      { numRuns: 200 },
    );
  });
  it("SOIL.SATURATION over a column = SOIL.SATURATION cell by cell", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(cellArb, cellArb, cellArb, cellArb, cellArb, cellArb), { minLength: 16, maxLength: 40 }),
        unitArb,
        fc.constantFrom("Ca", "bases", "acidity", "K", "x"),
        fc.boolean(),
        fc.boolean(),
        (rows, unit, part, withAcid, withCec) => {
          const col = (j: number) => rows.map((r) => [r[j]]);
          const whole = bindings
            .saturation([[part]], col(0), col(1), col(2), col(3), [[unit]], withAcid ? col(4) : (undefined as never), withCec ? col(5) : (undefined as never))
            .map((r) => show(r[0]));
          const single = rows.map((r) =>
            show(bindings.saturation([[part]], [[r[0]]], [[r[1]]], [[r[2]]], [[r[3]]], [[unit]], withAcid ? [[r[4]]] : (undefined as never), withCec ? [[r[5]]] : (undefined as never))[0]![0]),
          );
          expect(whole).toEqual(single);
        },
      ),
      { numRuns: 200 },
    );
  });
});
