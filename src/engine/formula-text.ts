/**
 * Formula text as Excel stores it in .xlsx versus as a user types it.
 *
 * Excel saves an add-in function call `=SOIL.CEC(A2,…)` as `_xldudf_SOIL_CEC(A2,…)` (the dot of
 * the id becomes `_`), newer built-in functions with `_xlfn.` / `_xlws.` prefixes, and the spill
 * operator `B1#` as `_xlfn.ANCHORARRAY(B1)`. Rewrites work on the formula's tokens, so only
 * function names are renamed: text in strings and sheet names that merely looks like a function
 * (`'Soil.Band (2025)'!A1`, "SOIL.CEC(") is never touched.
 */
import { T, Token, tokenize } from "./formula/lexer";
import { canonicalFunctionName } from "./formula/parser";
import { REGISTRY, storedName } from "./registry";
import { SOIL_NAMES } from "./soil";

const BY_ID = new Map(REGISTRY.map((f) => [f.formulaName.toUpperCase(), f.id]));

/** Replaces token spans in `text` (tokens from `tokenize(text)`); the edits come in token order and do not overlap. */
function splice(text: string, edits: { start: number; end: number; with: string }[]): string {
  let out = "";
  let at = 0;
  for (const e of edits) {
    out += text.slice(at, e.start) + e.with;
    at = e.end;
  }
  return out + text.slice(at);
}

function tokensOf(body: string): Token[] | undefined {
  let tokens: Token[] | undefined;
  try {
    tokens = tokenize(body);
  } catch {
    // text the lexer refuses has no tokens: undefined
  }
  return tokens;
}

/**
 * Excel's stored form → the form a user types (our names, no _xlfn. prefixes). Keeps a leading "="
 * (to the lexer it is an operator token, which no edit touches).
 */
export function toTypedFormula(formula: string): string {
  const tokens = tokensOf(formula);
  if (!tokens) return formula;
  const edits: { start: number; end: number; with: string }[] = [];
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i] as Token;
    if (t.t !== T.Func) continue;
    const written = String(t.value);
    if (!/^_xl/i.test(written)) continue;
    const name = canonicalFunctionName(written, SOIL_NAMES);
    if (name === "ANCHORARRAY") {
      // _xlfn.ANCHORARRAY(B1) → B1#. The lexer makes a Func only before "(" and ends every list
      // with End, so the token after "(" exists, and so does the one after a reference.
      const a = tokens[i + 2] as Token;
      const close = tokens[i + 3] as Token;
      if ((a.t === T.Ref || a.t === T.Name) && close.t === T.RParen) {
        edits.push({ start: t.start, end: close.end, with: `${formula.slice(a.start, a.end)}#` });
        i += 3;
        continue;
      }
    }
    edits.push({ start: t.start, end: t.end, with: name });
  }
  return splice(formula, edits);
}

/**
 * Typed form → Excel's stored form for our functions (other text unchanged). No leading "=".
 * Stored names in another letter case (LibreOffice saves `_xldudf_soil_cmol`) are written in
 * Excel's own case; a typed spill operator B1# becomes _xlfn.ANCHORARRAY(B1).
 */
export function toStoredFormula(formula: string): string {
  const body = formula.replace(/^=/, "");
  const tokens = tokensOf(body);
  if (!tokens) return body;
  const edits: { start: number; end: number; with: string }[] = [];
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i] as Token;
    if (t.t === T.Func) {
      const name = canonicalFunctionName(String(t.value), SOIL_NAMES);
      const id = BY_ID.get(name);
      if (id) edits.push({ start: t.start, end: t.end, with: storedName(id) });
    } else if (t.t === T.Hash) {
      const prev = tokens[i - 1];
      if (prev && (prev.t === T.Ref || prev.t === T.Name)) {
        edits.push({ start: prev.start, end: t.end, with: `_xlfn.ANCHORARRAY(${body.slice(prev.start, prev.end)})` });
      }
    }
  }
  return splice(body, edits);
}

/** True when a formula calls one of our functions, in either form (a function call, not text). */
export function callsSoil(formula: string): boolean {
  const tokens = tokensOf(formula.replace(/^=/, ""));
  if (!tokens) return false;
  return tokens.some((t) => t.t === T.Func && BY_ID.has(canonicalFunctionName(String(t.value), SOIL_NAMES)));
}
