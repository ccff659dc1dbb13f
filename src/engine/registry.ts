/**
 * The engine's function table, built from the generated Excel metadata (functions.json and the
 * id → exported-name associations) and the binding modules themselves. There is no second list:
 * a function exists headless exactly when Excel's metadata declares it.
 */
import metadata from "../../generated/functions.json";
import associations from "../../generated/associations.json";
import * as bindings from "../functions";
import { BindingSpec, specOf } from "../functions/_binding";

export interface MetaParam {
  readonly name: string;
  readonly optional?: boolean;
  readonly dimensionality?: string;
  readonly description?: string;
}

export interface MetaFunction {
  readonly id: string;
  readonly name: string;
  readonly description?: string;
  readonly parameters: readonly MetaParam[];
}

export interface RegisteredFunction {
  /** The id as Excel declares it, e.g. "CEC". */
  readonly id: string;
  /** The formula name, e.g. "SOIL.CEC". */
  readonly formulaName: string;
  readonly meta: MetaFunction;
  readonly binding: (...args: unknown[]) => unknown[][];
  readonly spec: BindingSpec;
}

export const NAMESPACE = "SOIL";

/**
 * The table from the metadata's functions, the id → exported-name associations and the binding
 * modules' exports; throws where they disagree (a build that would run the wrong binding).
 */
export function buildRegistry(
  functions: readonly MetaFunction[],
  links: readonly { id: string; functionName: string }[],
  exported: Readonly<Record<string, unknown>>,
): RegisteredFunction[] {
  const metaById = new Map(functions.map((f) => [f.id, f]));
  return links.map((a) => {
    const binding = exported[a.functionName] as ((...args: unknown[]) => unknown[][]) | undefined;
    const meta = metaById.get(a.id);
    if (!binding || !meta) throw new Error(`metadata and bindings disagree about ${a.id}`);
    const spec = specOf(binding);
    if (!spec) throw new Error(`binding ${a.functionName} has no declaration`);
    if (spec.params.length !== meta.parameters.length) {
      throw new Error(`${a.id}: metadata has ${meta.parameters.length} parameters, the binding declares ${spec.params.length}`);
    }
    return { id: a.id, formulaName: `${NAMESPACE}.${a.id}`, meta, binding, spec };
  });
}

export const REGISTRY: readonly RegisteredFunction[] = buildRegistry(metadata.functions as MetaFunction[], associations, bindings);

/** Excel's stored name of an add-in function: `_xldudf_SOIL_CEC` for SOIL.CEC (a dot in an id becomes "_" too). */
export function storedName(id: string): string {
  return `_xldudf_${NAMESPACE}_${id.replace(/\./g, "_")}`;
}

/** Looks up a function by id ("CEC") or formula name ("SOIL.CEC"), any case. */
export function registered(name: string): RegisteredFunction | undefined {
  const id = name.toUpperCase().replace(/^SOIL\./, "");
  return REGISTRY.find((f) => f.id === id);
}
