/**
 * The mutation score of a random sample of spans (scripts/mutation-sample.mjs) and its standard
 * error: spans are clusters of mutants drawn without replacement, so the score is the ratio
 * estimator p = Σd / Σv (d detected and v valid mutants of each drawn span) with variance
 * (1 − f) / (n · v̄²) · Σ(dᵢ − p·vᵢ)² / (n − 1), f = n / N the share of spans drawn
 * (Cochran 1977, "Sampling Techniques", 3rd ed., ch. 6 and 9, the ratio estimator and cluster
 * sampling: from memory).
 * @param {[number, number][]} perSpan [detected, valid] of each drawn span
 * @param {number} populationSpans N, the spans the sample was drawn from
 * @returns {{ p: number, sd: number, detected: number, valid: number }}
 */
function clusterRatio(perSpan, populationSpans) {
  const n = perSpan.length;
  const detected = perSpan.reduce((a, x) => a + x[0], 0);
  const valid = perSpan.reduce((a, x) => a + x[1], 0);
  if (!n || !valid || !(populationSpans >= n)) return { p: NaN, sd: NaN, detected, valid };
  const p = detected / valid;
  const f = n / populationSpans;
  const vbar = valid / n;
  const s2 = n > 1 ? perSpan.reduce((a, [d, v]) => a + (d - p * v) ** 2, 0) / (n - 1) : NaN;
  return { p, sd: Math.sqrt(((1 - f) * s2) / (n * vbar * vbar)), detected, valid };
}
module.exports = { clusterRatio };
