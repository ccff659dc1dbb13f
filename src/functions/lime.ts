/** Excel bindings: lime. Argument shaping only; the science is in src/core. */
export {};
