/** Excel bindings: nitrogen. Argument shaping only; the science is in src/core. */
export {};
