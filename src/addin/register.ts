/**
 * The add-in's entry point in Excel: associates every function id in the generated metadata with
 * its binding. The same associations list drives the headless engine's registry.
 */
import associations from "../../generated/associations.json";
import * as bindings from "../functions";

const table = bindings as unknown as Record<string, (...args: unknown[]) => unknown>;

for (const a of associations as { id: string; functionName: string }[]) {
  const fn = table[a.functionName];
  if (fn) CustomFunctions.associate(a.id, fn);
}
