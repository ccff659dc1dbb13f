/**
 * How close a doc example's number must be: a relative 5e-6, so an example is written with six
 * significant digits (or exactly). Half a unit in the last written place would let `//=> 1` pass
 * anything from 0.5 to 1.5. Shared by the core and binding doc-example tests (common practice).
 */
export const DOC_RELATIVE = 5e-6;
export const docTolerance = (expected: number): number => DOC_RELATIVE * Math.abs(expected) + 1e-12;
