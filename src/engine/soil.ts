/**
 * Our add-in's functions as the headless engine calls them: the very bindings Excel runs, given
 * arguments as Excel passes them (rows of cells) and their results turned into engine values. A
 * binding's error for one element stays in that element.
 */
import { HostErrors, setHostErrors } from "../functions/_binding";
import { SpreadsheetErrorKind } from "../core/errors";
import { SoilCall } from "./formula/evaluate";
import { NameMap } from "./formula/parser";
import { Scalar, XlArray, XlError, err } from "./formula/values";
import { REGISTRY, RegisteredFunction, storedName } from "./registry";
import { SoilSignatures } from "./plan";

/** The engine's host error is its own error value, with the binding's message. */
function hostError(kind: SpreadsheetErrorKind, message: string): XlError {
  return new XlError(kind === "#N/A" ? "#N/A" : "#VALUE!", message);
}

const ENGINE_ERRORS: HostErrors = { make: hostError, is: (v) => v instanceof XlError };

const BY_NAME = new Map<string, RegisteredFunction>(REGISTRY.map((f) => [f.formulaName.toUpperCase(), f]));
const STORED = new Map<string, string>(REGISTRY.map((f) => [storedName(f.id).toUpperCase(), f.formulaName.toUpperCase()]));

/** Maps Excel's stored names of our functions (any case) back to their formula names. */
export const SOIL_NAMES: NameMap = {
  addinFunction: (stored) => STORED.get(stored.toUpperCase()),
};

function toScalar(v: unknown): Scalar {
  if (typeof v === "number") return Number.isFinite(v) ? v : err("#NUM!", "a result was not a finite number");
  if (typeof v === "string" || typeof v === "boolean") return v;
  if (v instanceof XlError) return v;
  return err("#VALUE!", "internal error: a result was neither number nor text");
}

/** The engine's call for one of our functions by canonical name ("SOIL.CEC"), or undefined. */
export function soilCall(name: string): SoilCall | undefined {
  const fn = BY_NAME.get(name);
  if (!fn) return undefined;
  return (args) => {
    // Set at each call, not once: another host (a test of the bindings) may have set its own since.
    setHostErrors(ENGINE_ERRORS);
    const rows = fn.binding(...args);
    if (rows.length === 1 && (rows[0] as unknown[]).length === 1) return toScalar((rows[0] as unknown[])[0]);
    const r = rows.length;
    const c = r ? (rows[0] as unknown[]).length : 0;
    const data: Scalar[] = [];
    for (let i = 0; i < r; i++) {
      const row = rows[i] as unknown[];
      for (let j = 0; j < c; j++) data.push(toScalar(row[j]));
    }
    return new XlArray(r, c, data);
  };
}

/** Which parameters of each of our functions take a whole range (not broadcast). */
export const SOIL_SIGNATURES: SoilSignatures = {
  wholeRange(name) {
    const fn = BY_NAME.get(name);
    return fn ? fn.spec.params.map((p) => p.kind === "range") : undefined;
  },
};
