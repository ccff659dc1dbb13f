/** Excel bindings: cations. Argument shaping only; the science is in src/core. */
export {};
