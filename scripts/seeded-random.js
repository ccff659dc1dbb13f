/**
 * mulberry32: a small seeded generator of numbers in [0, 1), the same on every machine, for the
 * invented benchmark data (bench/workbook.js), the fuzzer's formulas (scripts/oracle/differential.js)
 * and the mutation sample (scripts/mutation-sample.mjs).
 */
function seededRandom(seed) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
module.exports = { seededRandom };
