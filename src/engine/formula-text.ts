/**
 * Formula text as Excel stores it in .xlsx versus as a user types it (and the engine parses it).
 *
 * Excel saves an add-in function call `=SOIL.CEC(A2,…)` as `_xldudf_SOIL_CEC(A2,…)` (the dot of
 * the id becomes `_`), and newer built-in functions with `_xlfn.` / `_xlws.` prefixes. The engine's
 * parser accepts neither, so formulas are rewritten on the way in and back on the way out.
 */
import { NAMESPACE, REGISTRY } from "./registry";

/** Stored-name → id, built from the registry so only our functions are rewritten. */
const STORED = new Map(REGISTRY.map((f) => [`_XLDUDF_${NAMESPACE}_${f.id.replace(/\./g, "_")}`, f.id]));

const STORED_CALL = /_xldudf_[A-Za-z0-9_]+(?=\s*\()/g;
const TYPED_CALL = new RegExp(`(?<![A-Za-z0-9_.])${NAMESPACE}\\.([A-Za-z][A-Za-z0-9_.]*)(?=\\s*\\()`, "gi");

/** Applies `fn` to the parts of a formula outside string literals. */
function outsideStrings(formula: string, fn: (part: string) => string): string {
  return formula
    .split(/("(?:[^"]|"")*")/)
    .map((part, i) => (i % 2 === 1 ? part : fn(part)))
    .join("");
}

/** Excel's stored form → the form a user types (our names, no _xlfn. prefixes). Keeps a leading "=". */
export function toTypedFormula(formula: string): string {
  return outsideStrings(formula, (part) =>
    part
      .replace(STORED_CALL, (m) => {
        const id = STORED.get(m.toUpperCase());
        return id ? `${NAMESPACE}.${id}` : m;
      })
      .replace(/_xlfn\._xlws\.|_xlfn\.|_xlws\./gi, ""),
  );
}

/**
 * Excel's literals the engine's parser does not read, rewritten to ones it does: an upper-case
 * exponent (Excel saves 1E-05), TRUE/FALSE without brackets, and "" or \ inside a string. Text in
 * quotes ("strings", 'sheet names') is left alone apart from those two characters.
 */
function engineLiterals(formula: string): string {
  return formula
    .split(/("(?:[^"]|"")*"|'(?:[^']|'')*')/)
    .map((part, i) => {
      if (i % 2 === 1) {
        // The engine's strings take no "" and treat \ as an escape: both become CHAR().
        const text = part.startsWith('"') ? part.slice(1, -1).replace(/""/g, '"') : "";
        if (!/["\\]/.test(text)) return part;
        return `(${text.split(/(["\\])/).map((p) => (p === '"' ? "CHAR(34)" : p === "\\" ? "CHAR(92)" : `"${p}"`)).join("&")})`;
      }
      return part
        .replace(/(?<![A-Za-z0-9_.$!\]])(\d+\.?\d*|\.\d+)E([+-]?\d+)(?![A-Za-z0-9_.(])/g, "$1e$2")
        .replace(/(?<![A-Za-z0-9_.$!\]])(TRUE|FALSE)(?![A-Za-z0-9_.(!:])/gi, "$1()");
    })
    .join("");
}

/** Excel's stored form (or typed form) → the form the engine parses. Keeps a leading "=" if present. */
export function toEngineFormula(formula: string): string {
  return engineLiterals(toTypedFormula(formula));
}

/**
 * Typed form → Excel's stored form for our functions (other text unchanged). No leading "=".
 * Stored names in another letter case (LibreOffice saves `_xldudf_soil_cmol`) are written in
 * Excel's own case.
 */
export function toStoredFormula(formula: string): string {
  const body = formula.replace(/^=/, "");
  return outsideStrings(body, (part) =>
    part
      .replace(TYPED_CALL, (m, id: string) => {
        const known = REGISTRY.find((f) => f.id === id.toUpperCase());
        return known ? `_xldudf_${NAMESPACE}_${known.id.replace(/\./g, "_")}` : m;
      })
      .replace(STORED_CALL, (m) => {
        const id = STORED.get(m.toUpperCase());
        return id ? `_xldudf_${NAMESPACE}_${id.replace(/\./g, "_")}` : m;
      }),
  );
}

const SOIL_CALL = new RegExp(`(?<![A-Za-z0-9_.])${NAMESPACE}\\.[A-Za-z]`, "i");

/** True when a formula calls one of our functions, in either form. */
export function callsSoil(formula: string): boolean {
  return engineFormulaCallsSoil(toEngineFormula(formula));
}

/** callsSoil for a formula already in the engine's form (what toEngineFormula returned). */
export function engineFormulaCallsSoil(engine: string): boolean {
  let found = false;
  outsideStrings(engine, (part) => {
    if (SOIL_CALL.test(part)) found = true;
    return part;
  });
  return found;
}
