/**
 * %Ndfa by 15N natural abundance and N fixed by N difference. Source beside each check;
 * property-test inputs are invented.
 */
import fc from "fast-check";
import { MAX_CROP_N_KG_HA, nfixNdfa, nfixNDifference } from "../../../src/core/nitrogen/isotope";
import { errorCode as code, errorMessage as message } from "../../helpers/errors";


describe("nfixNdfa: %Ndfa = 100 (δref − δleg)/(δref − B)", () => {
  // Equation: Ledgard (1989) Proc. XVI Int. Grassland Congress; Peoples et al. (1989) ACIAR
  // Monograph 11 (published-values NFIX-01, seen). The worked value is arithmetic on it (NFIX-02, derived).
  it("δref 6.0, δleg 1.0, B −1.0 ‰ gives 71.43 % (NFIX-02, derived)", () => {
    expect(nfixNdfa(6, 1, -1)).toBeCloseTo(71.43, 2);
  });
  it("legume at B is 100 %, legume at the reference is 0 % (derived from the equation's end points)", () => {
    expect(nfixNdfa(5.2, -1.5, -1.5)).toBeCloseTo(100, 10);
    expect(nfixNdfa(5.2, 5.2, -1.5)).toBe(0);
  });
  it("faba bean B values from +0.5 to −1.9 ‰ (NFIX-05, faba-bean B-value study, Jimma University repository): a lower B lowers %Ndfa for the same samples (derived)", () => {
    const highB = nfixNdfa(6, 1.5, 0.5);
    const lowB = nfixNdfa(6, 1.5, -1.9);
    expect(highB).toBeCloseTo((100 * 4.5) / 5.5, 10);
    expect(lowB).toBeCloseTo((100 * 4.5) / 7.9, 10);
    expect(lowB).toBeLessThan(highB);
  });
  it("results a little outside 0–100 % (measurement error) are returned as computed, not clamped", () => {
    expect(nfixNdfa(6, 6.5, -1)).toBeCloseTo(-7.142857, 5);
    expect(nfixNdfa(6, -1.5, -1)).toBeCloseTo(107.142857, 5);
  });
  it("reference equal to B: NOT_APPLICABLE", () => {
    expect(code(() => nfixNdfa(-1, -1, -1))).toBe("NOT_APPLICABLE");
  });
  it("reference below B (arguments swapped?): NOT_APPLICABLE with the order in the message", () => {
    expect(code(() => nfixNdfa(-2, 1, -1))).toBe("NOT_APPLICABLE");
    expect(message(() => nfixNdfa(-2, 1, -1))).toMatch(/reference, legume, B/);
  });
  it("reference less than 2 ‰ above B: NOT_APPLICABLE (common practice; the 15N difference must be significant, Shearer & Kohl 1986)", () => {
    expect(code(() => nfixNdfa(0.5, 0, -1))).toBe("NOT_APPLICABLE");
    expect(message(() => nfixNdfa(0.5, 0, -1))).toMatch(/only 1.5 ‰ above b_value/);
    expect(nfixNdfa(1, 0, -1)).toBeCloseTo(50, 10); // exactly 2 ‰ is accepted
  });
  it("min_gap tightens or relaxes the margin (0 leaves only the equality check)", () => {
    expect(nfixNdfa(0.5, 0, -1, 0)).toBeCloseTo(33.3333, 3);
    expect(code(() => nfixNdfa(4, 1, -1, 8))).toBe("NOT_APPLICABLE");
    expect(code(() => nfixNdfa(4, 1, -1, -1))).toBe("OUT_OF_RANGE");
  });
  it("results below −20 % or above 120 % are OUT_OF_RANGE saying why", () => {
    expect(code(() => nfixNdfa(4, 8, -1))).toBe("OUT_OF_RANGE");
    expect(message(() => nfixNdfa(4, 8, -1))).toMatch(/more 15N-enriched than the reference/);
    expect(code(() => nfixNdfa(4, -3, -1))).toBe("OUT_OF_RANGE");
    expect(message(() => nfixNdfa(4, -3, -1))).toMatch(/below the B value/);
  });
  it("δ15N outside ±100 ‰ is OUT_OF_RANGE (guard; natural values lie far inside)", () => {
    expect(code(() => nfixNdfa(150, 1, -1))).toBe("OUT_OF_RANGE");
  });
  it("a typical lupin at the group mean %Ndfa 74 % (Peoples et al. 2021, NFIX-14): δleg = δref − 0.74 (δref − B) round-trips (derived)", () => {
    const ref = 5;
    const b = -0.8;
    expect(nfixNdfa(ref, ref - 0.74 * (ref - b), b)).toBeCloseTo(74, 10);
  });
});

describe("nfixNDifference: N-difference method (Peoples et al. 1989, published-values NFIX-07)", () => {
  it("legume N 250 − reference N 90 = 160 kg N/ha (derived)", () => {
    expect(nfixNDifference(250, 90)).toBe(160);
  });
  it("adds the soil mineral N difference when both soil values are given (NFIX-07 formula)", () => {
    expect(nfixNDifference(250, 90, 40, 60)).toBe(140);
  });
  it("only one soil value: MISSING_INPUT naming the other", () => {
    expect(code(() => nfixNDifference(250, 90, 40, undefined))).toBe("MISSING_INPUT");
    expect(message(() => nfixNDifference(250, 90, undefined, 40))).toMatch(/legume_soil_n is needed/);
  });
  it("a negative difference is returned as computed (the method's assumption failed)", () => {
    expect(nfixNDifference(80, 95)).toBe(-15);
  });
  it("negative N yields are OUT_OF_RANGE", () => {
    expect(code(() => nfixNDifference(-1, 0))).toBe("OUT_OF_RANGE");
    expect(code(() => nfixNDifference(10, 0, -5, 0))).toBe("OUT_OF_RANGE");
  });
});

describe("properties (inputs invented)", () => {
  it("%Ndfa falls as the legume's δ15N rises, for a fixed reference and B", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 2, max: 12, noNaN: true }),
        fc.double({ min: -3, max: 0, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (ref, b, u, v) => {
          // Legume δ15N between B and the reference keeps the result within 0–100 %.
          const [lo, hi] = u < v ? [u, v] : [v, u];
          const d1 = b + lo * (ref - b);
          const d2 = b + hi * (ref - b);
          return nfixNdfa(ref, d1, b, 0) >= nfixNdfa(ref, d2, b, 0) - 1e-9;
        },
      ),
    );
  });
  it("N difference is antisymmetric in the two crops", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 500, noNaN: true }), fc.double({ min: 0, max: 500, noNaN: true }), (a, b) => {
        return Math.abs(nfixNDifference(a, b) + nfixNDifference(b, a)) <= 1e-9;
      }),
    );
  });
});


describe("boundaries and refusal messages (probes of the code's own guards; values invented)", () => {
  it("a result of exactly −20 % or 120 % is returned; just beyond is OUT_OF_RANGE", () => {
    // spread 5 ‰: %Ndfa = 20 × (4 − legume)
    expect(nfixNdfa(4, 5, -1)).toBe(-20);
    expect(nfixNdfa(4, -2, -1)).toBe(120);
    expect(code(() => nfixNdfa(4, 5.01, -1))).toBe("OUT_OF_RANGE");
    expect(code(() => nfixNdfa(4, -2.01, -1))).toBe("OUT_OF_RANGE");
  });
  it("the far-below and far-above messages give the result and the δ15N values", () => {
    expect(message(() => nfixNdfa(4, 8, -1))).toBe(
      "%Ndfa is -80 %, far below 0: the legume (8 ‰) is much more 15N-enriched than the reference (4 ‰); check the reference plant and the samples",
    );
    expect(message(() => nfixNdfa(4, -3, -1))).toBe(
      "%Ndfa is 140 %, far above 100: the legume (-3 ‰) is well below the B value (-1 ‰); the B value does not fit this legume or a sample is wrong",
    );
  });
  it("the NOT_APPLICABLE messages give the values", () => {
    expect(message(() => nfixNdfa(-1, -1, -1))).toBe(
      "d15n_reference equals b_value (-1 ‰): the natural abundance method cannot tell soil N from fixed N here",
    );
    expect(message(() => nfixNdfa(-2, 1, -1))).toBe(
      "d15n_reference (-2 ‰) is below b_value (-1 ‰): the reference must be more 15N-enriched than B; check the order (reference, legume, B)",
    );
    expect(message(() => nfixNdfa(0.5, 0, -1))).toBe(
      "d15n_reference is only 1.5 ‰ above b_value (less than 2 ‰): too little natural 15N enrichment for a reliable %Ndfa",
    );
  });
  it("a spread so small that the quotient overflows (min_gap 0) is refused as not computable", () => {
    expect(code(() => nfixNdfa(5e-324, -1, 0, 0))).toBe("OUT_OF_RANGE");
    expect(message(() => nfixNdfa(5e-324, -1, 0, 0))).toBe("%Ndfa cannot be computed for these inputs (result is not finite)");
  });
  it("N-difference refusals name the offending argument", () => {
    expect(message(() => nfixNDifference(-1, 0))).toContain("legume_n must be");
    expect(message(() => nfixNDifference(0, -1))).toContain("reference_n must be");
    expect(message(() => nfixNDifference(10, 0, -5, 0))).toContain("legume_soil_n must be");
    expect(message(() => nfixNDifference(10, 0, 0, -5))).toContain("reference_soil_n must be");
  });
  it("only one soil value, either one: MISSING_INPUT naming the missing one, whatever the given value", () => {
    expect(message(() => nfixNDifference(250, 90, 40, undefined))).toBe(
      "reference_soil_n is needed: the soil N term takes both legume_soil_n and reference_soil_n, or neither",
    );
    expect(code(() => nfixNDifference(250, 90, undefined, 40))).toBe("MISSING_INPUT");
    expect(code(() => nfixNDifference(250, 90, undefined, -40))).toBe("MISSING_INPUT");
    expect(code(() => nfixNDifference(250, 90, -40, undefined))).toBe("MISSING_INPUT");
  });
  it("N yields so large that the sum would overflow are refused by their bound first", () => {
    expect(message(() => nfixNDifference(1.7e308, 0, 1.7e308, 0))).toBe("legume_n must be from 0 to 9600 kg N/ha (got 1.7e+308 kg N/ha)");
  });
});

describe("the N-difference bound: no crop holds more than the largest shoot DM at the largest tissue N %", () => {
  // 60 t/ha × 1000 kg/t × 16 % = 9600 kg N/ha, derived from the two guards in checks.json (values invented here).
  it("is derived from the shoot-DM and tissue-N guards", () => {
    expect(MAX_CROP_N_KG_HA).toBe(9600);
  });
  it.each([
    ["legume_n", [9600.001, 0]],
    ["reference_n", [0, 9600.001]],
    ["legume_soil_n", [100, 50, 9600.001, 0]],
    ["reference_soil_n", [100, 50, 0, 9600.001]],
  ] as const)("%s: 9600 is read, just above is refused naming the argument and the bound", (name, args) => {
    const at = args.map((v) => (v > 9600 ? 9600 : v)) as [number, number, number?, number?];
    expect(Number.isFinite(nfixNDifference(...at))).toBe(true);
    expect(code(() => nfixNDifference(...(args as unknown as [number, number, number?, number?])))).toBe("OUT_OF_RANGE");
    expect(message(() => nfixNDifference(...(args as unknown as [number, number, number?, number?])))).toBe(
      `${name} must be from 0 to 9600 kg N/ha (got 9600.001 kg N/ha)`,
    );
  });
  it("a g/ha figure or an overflowing cell is refused, never a fixed N in the millions", () => {
    expect(code(() => nfixNDifference(250000, 90000))).toBe("OUT_OF_RANGE");
    expect(code(() => nfixNDifference(1e308, 0))).toBe("OUT_OF_RANGE");
  });
});
