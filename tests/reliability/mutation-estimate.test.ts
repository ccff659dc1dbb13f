/**
 * The estimate the mutation table gives for a folder's sampled parts (mutation/estimate.js): the
 * ratio estimator for spans drawn as clusters without replacement (Cochran 1977, "Sampling
 * Techniques", 3rd ed.: from memory), checked on a case worked by hand.
 */
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { clusterRatio } = require("../../mutation/estimate.js");

describe("clusterRatio", () => {
  it("gives the ratio and its standard error on a hand-worked sample", () => {
    // 4 spans of 40: (d, v) = (1,1) (2,2) (0,1) (2,2). p = 5/6; v̄ = 1.5; residuals 1/6, 1/3, −5/6,
    // 1/3, squares summing to 34/36, s² = 34/108; var = 0.9 × (34/108) / (4 × 2.25) = 0.0314815.
    const r = clusterRatio([[1, 1], [2, 2], [0, 1], [2, 2]], 40);
    expect(r.p).toBeCloseTo(5 / 6, 12);
    expect(r.sd).toBeCloseTo(Math.sqrt((0.9 * (34 / 108)) / 9), 12);
    expect(r.sd).toBeCloseTo(0.177430, 5);
  });
  it("has no spread when every span is fully detected, and none when every span was drawn", () => {
    expect(clusterRatio([[2, 2], [1, 1], [3, 3]], 100).sd).toBe(0);
    expect(clusterRatio([[1, 1], [0, 2], [3, 3]], 3).sd).toBe(0);
  });
  it("refuses what it cannot estimate: no valid mutant, or more spans drawn than there are", () => {
    expect(clusterRatio([], 10).p).toBeNaN();
    expect(clusterRatio([[0, 0]], 10).p).toBeNaN();
    expect(clusterRatio([[1, 1], [1, 1]], 1).p).toBeNaN();
  });
});
