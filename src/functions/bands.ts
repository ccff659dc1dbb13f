/** Excel bindings: bands. Argument shaping only; the science is in src/core. */
export {};
