/**
 * Evaluates one formula headless, with the same engine and bindings `recalc` uses: for
 * `soilcell eval` and the formula tests. The formula is evaluated as a dynamic-array formula in
 * an empty workbook, so a reference to a cell has nothing to read: it is refused with a message
 * (tests may ask for references to read as blank cells instead).
 */
import { Book, localSerial } from "./book";
import { a1 } from "./cellref";
import { Ctx, Host, NotComputed, ResourceLimit, arityProblem, ev, toArray } from "./formula/evaluate";
import "./formula/functions";
import { FormulaSyntaxError } from "./formula/lexer";
import { Node, parseFormula } from "./formula/parser";
import { Scalar, err, isError } from "./formula/values";
import { SOIL_NAMES, soilCall } from "./soil";

export type EvalValue = number | string | boolean | null;

export interface EvalResult {
  /** A single value, or rows of values when the formula spills (an element in error reads "#VALUE! message"). */
  readonly value?: EvalValue | EvalValue[][];
  /** "#VALUE!", "#N/A", … when the formula's top-left result is an error. */
  readonly error?: string;
  readonly message?: string;
}

// Stryker disable ArrayDeclaration,BooleanLiteral: equivalent: eval reads its stand-in book only through sheetIndex and definedName (the date system is the host's), so these fields are never read
const EMPTY_BOOK: Book = {
  sheets: [],
  names: [],
  tables: new Map(),
  date1904: false,
  // Stryker restore ArrayDeclaration,BooleanLiteral
  sheetIndex: () => undefined,
  definedName: () => undefined,
};

/** Thrown where a formula builds a reference while computing (INDIRECT) and then reads it. */
class NoWorkbook extends NotComputed {}

const noWorkbook = (): never => {
  throw new NoWorkbook("eval has no workbook, so a reference the formula builds while computing (as INDIRECT does) has nothing to read");
};

function host(blankReferences: boolean): Host {
  return {
    book: EMPTY_BOOK,
    date1904: false,
    maxCells: 4_000_000,
    // Read as blank only when asked: otherwise INDIRECT("A1") would read 0 from a cell that is not there.
    value: blankReferences ? () => null : noWorkbook,
    // Stryker disable next-line ObjectLiteral,UnaryOperator: equivalent: every blank cell reads null, so the bounds only spare reads
    bounds: blankReferences ? () => ({ rows: -1, cols: -1 }) : noWorkbook,
    forEach: blankReferences ? () => undefined : noWorkbook,
    spill: () => err("#REF!", "eval has no workbook"),
    soil: (name) => soilCall(name),
    now: () => localSerial(Date.now(), new Date().getTimezoneOffset()),
  };
}

function plain(v: Scalar): EvalValue {
  if (isError(v)) return `${v.code}${v.message ? ` ${v.message}` : ""}`;
  return v;
}

/** The first reference or name in a tree, for the "no workbook" message. */
function firstReference(n: Node): string | undefined {
  const stack: Node[] = [n];
  while (stack.length) {
    const x = stack.pop() as Node;
    if (x.k === "name") return `the name ${x.name}`;
    if (x.k === "spill") return "a spill reference (#)";
    if (x.k === "ref") {
      // Parsed at A1, so relative offsets are the positions typed.
      const top = a1({ row: x.r1, col: x.c1 });
      const text = x.r2 === x.r1 && x.c2 === x.c1 ? top : `${top}:${a1({ row: x.r2, col: x.c2 })}`;
      return `the reference ${x.sheet === undefined ? "" : `${x.sheet}!`}${text}`;
    }
    // Children pushed last-first, so the one typed first is met first.
    if (x.k === "fn") stack.push(...[...x.args].reverse());
    else if (x.k === "bin" || x.k === "range" || x.k === "isect") stack.push(x.b, x.a);
    else if (x.k === "neg" || x.k === "plus" || x.k === "at" || x.k === "pct") stack.push(x.x);
    else if (x.k === "union") stack.push(...[...x.items].reverse());
  }
  return undefined;
}

/**
 * Where a formula separates arguments with ";" (as Excel shows formulas under many European
 * regional settings), the refusal and the same formula as Excel stores it. Not accepted as typed:
 * whether "1,3" is a decimal or two arguments depends on the settings, which eval does not guess;
 * the rewrite is shown for the user to check and run. Undefined when there is no such ";".
 */
function semicolonHint(text: string): string | undefined {
  let quote: string | undefined;
  let braces = 0;
  let semis = false;
  let commas = false;
  let out = "";
  for (const ch of text) {
    if (quote) {
      if (ch === quote) quote = undefined; // a doubled quote re-opens at once: same text either way
      out += ch;
      continue;
    }
    if (ch === '"' || ch === "'") quote = ch;
    else if (ch === "{") braces += 1;
    else if (ch === "}") braces -= 1;
    else if (braces === 0 && ch === ";") {
      semis = true;
      out += ",";
      continue;
    } else if (braces === 0 && ch === ",") {
      commas = true;
      out += ".";
      continue;
    }
    out += ch;
  }
  if (!semis) return undefined;
  const said = 'the formula separates its arguments with ";", as Excel shows formulas under some regional settings; soilcell reads formulas as Excel stores them, with ","';
  const decimals = commas ? ' and "." for decimals' : "";
  if (braces !== 0 || text.includes("{")) return `${said}${decimals}: write it with "," between arguments${decimals}`;
  return `${said}${decimals}; as stored it reads =${out} (check it, then run that)`;
}

/**
 * Evaluates `formula` (typed form "=SOIL.CEC(…)" or Excel's stored form) on its own.
 * @example evaluateFormula('=SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)') //=> { value: 19.5 }
 */
export function evaluateFormula(formula: string, options: { blankReferences?: boolean } = {}): EvalResult {
  const text = formula.trim().replace(/^=/, "");
  const semicolons = semicolonHint(text);
  if (semicolons) return { error: "#VALUE!", message: semicolons };
  let node: Node;
  try {
    node = parseFormula(text, 0, 0, SOIL_NAMES);
  } catch (e) {
    if (!(e instanceof FormulaSyntaxError)) throw e;
    return { error: "#VALUE!", message: `the formula cannot be read: ${e.message}` };
  }
  const ref = options.blankReferences ? undefined : firstReference(node);
  if (ref) return { error: "#REF!", message: `eval has no workbook, so ${ref} has nothing to read; give the values themselves (e.g. {1;2;3} for a column), or put the formula in a workbook and use soilcell recalc` };
  // A wrong argument count anywhere is refused before anything is computed, as in a workbook.
  const arity = arityProblem(node);
  if (arity) return { error: "#VALUE!", message: arity };
  const ctx: Ctx = { host: host(options.blankReferences === true), sheet: 0, row: 0, col: 0, arrays: true, depth: 0 };
  let a: ReturnType<typeof toArray>;
  try {
    // A returned reference is read whole; a union of ranges is refused (a cell cannot show one).
    // Stryker disable next-line BooleanLiteral: equivalent: a reference returned as a value is read as toArray reads it
    a = toArray(ev(node, ctx, true), ctx);
  } catch (e) {
    if (e instanceof NoWorkbook) return { error: "#REF!", message: `${e.message}; give the values themselves, or put the formula in a workbook and use soilcell recalc` };
    if (e instanceof NotComputed || e instanceof ResourceLimit) return { error: "#VALUE!", message: e.message };
    throw e;
  }
  if (isError(a)) return { error: a.code, message: a.message };
  if (a.rows === 1 && a.cols === 1) {
    const s = a.at(0, 0) ?? 0;
    return isError(s) ? { error: s.code, message: s.message } : { value: s };
  }
  const rows: EvalValue[][] = [];
  for (let r = 0; r < a.rows; r++) {
    const row: EvalValue[] = [];
    for (let c = 0; c < a.cols; c++) row.push(plain(a.at(r, c) ?? 0));
    rows.push(row);
  }
  const top = a.at(0, 0);
  return isError(top) ? { value: rows, error: top.code, message: top.message } : { value: rows };
}
