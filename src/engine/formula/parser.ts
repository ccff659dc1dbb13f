/**
 * Excel formulas into a syntax tree that does not depend on where the formula sits: a relative
 * reference is stored as an offset from the formula's own cell, an absolute one as a position.
 * So a formula filled down a column (and every member of a shared formula) has one tree, and
 * evaluating that tree at another cell shifts exactly the references Excel would shift, never
 * text. Function names are read in both Excel's stored form (`_xlfn.`, `_xldudf_SOIL_CEC`) and
 * the typed form.
 */
import { FormulaSyntaxError, T, Token, tokenize } from "./lexer";
import { ErrorCode, MAX_COLS, MAX_ROWS, Scalar, XlArray, XlError } from "./values";

/** One corner coordinate: a position when absolute, an offset from the formula's cell when relative. */
export interface RefNode {
  readonly k: "ref";
  readonly sheet?: string;
  readonly r1: number;
  readonly c1: number;
  readonly r2: number;
  readonly c2: number;
  /** Bit flags: 1 r1 absolute, 2 c1 absolute, 4 r2 absolute, 8 c2 absolute. */
  readonly abs: number;
}

export type Node =
  | { readonly k: "num"; readonly v: number }
  | { readonly k: "str"; readonly v: string }
  | { readonly k: "bool"; readonly v: boolean }
  | { readonly k: "err"; readonly v: ErrorCode }
  | { readonly k: "arr"; readonly v: XlArray }
  | RefNode
  | { readonly k: "name"; readonly name: string; readonly sheet?: string }
  | { readonly k: "fn"; readonly name: string; readonly args: readonly Node[] }
  | { readonly k: "neg"; readonly x: Node }
  | { readonly k: "plus"; readonly x: Node }
  | { readonly k: "at"; readonly x: Node }
  | { readonly k: "pct"; readonly x: Node }
  | { readonly k: "bin"; readonly op: BinOp; readonly a: Node; readonly b: Node }
  | { readonly k: "range"; readonly a: Node; readonly b: Node }
  | { readonly k: "isect"; readonly a: Node; readonly b: Node }
  | { readonly k: "union"; readonly items: readonly Node[] }
  | { readonly k: "spill"; readonly x: Node }
  | { readonly k: "miss" }
  | UnsupNode;

/**
 * Something the engine does not evaluate. What it reads is still known where it can be, so the
 * planner can tell whether a recomputed cell feeds it: a structured reference names its table,
 * LET and LAMBDA keep their arguments; a reference to another workbook reads nothing here.
 * Anything else (a 3-D reference, a table-relative [@Col]) is `opaque`: its reads are unknown.
 */
export interface UnsupNode {
  readonly k: "unsup";
  readonly what: string;
  readonly table?: string;
  readonly args?: readonly Node[];
  readonly opaque: boolean;
}

export type BinOp = "+" | "-" | "*" | "/" | "^" | "&" | "=" | "<>" | "<" | ">" | "<=" | ">=";

/** How function names in a file map to the names the engine knows. */
export interface NameMap {
  /** `_xldudf_SOIL_CEC` (any case) → "SOIL.CEC", or undefined for another add-in's function. */
  addinFunction(stored: string): string | undefined;
}

/** Deepest nesting the parser follows (Excel allows 64 levels of nested functions). */
export const MAX_DEPTH = 256;

/**
 * The canonical name of a function as written: stored-form prefixes removed, upper case, our
 * add-in's stored names mapped back (`_xldudf_SOIL_CEC` → `SOIL.CEC`).
 */
export function canonicalFunctionName(written: string, names: NameMap): string {
  let s = written;
  for (;;) {
    const u = s.toUpperCase();
    if (u.startsWith("_XLFN.")) s = s.slice(6);
    else if (u.startsWith("_XLWS.")) s = s.slice(6);
    else break;
  }
  // Stryker disable next-line ConditionalExpression,StringLiteral: equivalent: addinFunction gives undefined for a name without the prefix, which is then upper-cased either way
  if (s.toUpperCase().startsWith("_XLDUDF_")) return names.addinFunction(s) ?? s.toUpperCase();
  return s.toUpperCase();
}

class Parser {
  private i = 0;
  private depth = 0;
  constructor(
    private readonly toks: Token[],
    private readonly originRow: number,
    private readonly originCol: number,
    private readonly names: NameMap,
  ) {}

  private peek(): Token {
    return this.toks[this.i] as Token;
  }
  private take(): Token {
    return this.toks[this.i++] as Token;
  }
  private isOp(tok: Token, op: string): boolean {
    return tok.t === T.Op && tok.value === op;
  }
  private fail(message: string): never {
    throw new FormulaSyntaxError(message);
  }

  parseFormula(): Node {
    const node = this.expr();
    if (this.peek().t !== T.End) this.fail(`unexpected text at ${this.peek().start + 1}`);
    return node;
  }

  private enter(): void {
    if (++this.depth > MAX_DEPTH) this.fail(`the formula nests deeper than ${MAX_DEPTH} levels`);
  }
  private leave(): void {
    this.depth--;
  }

  /** Comparisons, the loosest operators. Chains are read in loops, so a long sum is not deep recursion. */
  expr(): Node {
    this.enter();
    let a = this.concat();
    for (;;) {
      const t = this.peek();
      if (t.t === T.Op && (t.value === "=" || t.value === "<>" || t.value === "<" || t.value === ">" || t.value === "<=" || t.value === ">=")) {
        this.take();
        a = { k: "bin", op: t.value as BinOp, a, b: this.concat() };
      } else break;
    }
    this.leave();
    return a;
  }

  private concat(): Node {
    let a = this.additive();
    while (this.isOp(this.peek(), "&")) {
      this.take();
      a = { k: "bin", op: "&", a, b: this.additive() };
    }
    return a;
  }

  private additive(): Node {
    let a = this.multiplicative();
    for (;;) {
      const t = this.peek();
      if (t.t === T.Op && (t.value === "+" || t.value === "-")) {
        this.take();
        a = { k: "bin", op: t.value as BinOp, a, b: this.multiplicative() };
      } else break;
    }
    return a;
  }

  private multiplicative(): Node {
    let a = this.power();
    for (;;) {
      const t = this.peek();
      if (t.t === T.Op && (t.value === "*" || t.value === "/")) {
        this.take();
        a = { k: "bin", op: t.value as BinOp, a, b: this.power() };
      } else break;
    }
    return a;
  }

  /** ^ is left-associative in Excel: 2^3^2 = 64. */
  private power(): Node {
    let a = this.percent();
    while (this.isOp(this.peek(), "^")) {
      this.take();
      a = { k: "bin", op: "^", a, b: this.percent() };
    }
    return a;
  }

  private percent(): Node {
    let a = this.prefix();
    while (this.isOp(this.peek(), "%")) {
      this.take();
      a = { k: "pct", x: a };
    }
    return a;
  }

  /** Negation binds tighter than ^ in Excel: -2^2 = 4. */
  private prefix(): Node {
    const t = this.peek();
    if (t.t === T.Op && (t.value === "-" || t.value === "+" || t.value === "@")) {
      this.take();
      this.enter();
      const x = this.prefix();
      this.leave();
      if (t.value === "-") return { k: "neg", x };
      if (t.value === "+") return { k: "plus", x };
      return { k: "at", x };
    }
    return this.intersection();
  }

  /** The intersection operator is a space between two references. */
  private intersection(): Node {
    let a = this.rangeExpr();
    for (;;) {
      const t = this.peek();
      if (t.space && (t.t === T.Ref || t.t === T.Name || t.t === T.LParen || (t.t === T.Func && isReferenceFunction(t.value as string, this.names)))) {
        a = { k: "isect", a, b: this.rangeExpr() };
      } else break;
    }
    return a;
  }

  private rangeExpr(): Node {
    let a = this.postfix();
    while (this.isOp(this.peek(), ":")) {
      this.take();
      a = { k: "range", a, b: this.postfix() };
    }
    return a;
  }

  private postfix(): Node {
    let a = this.primary();
    while (this.peek().t === T.Hash) {
      this.take();
      a = { k: "spill", x: a };
    }
    return a;
  }

  private primary(): Node {
    const t = this.take();
    switch (t.t) {
      case T.Num:
        return { k: "num", v: t.value as number };
      case T.Str:
        return { k: "str", v: t.value as string };
      case T.Bool:
        return { k: "bool", v: t.value as boolean };
      case T.Err:
        return { k: "err", v: t.value as ErrorCode };
      case T.Ref:
        return this.refNode(t);
      case T.Name:
        return t.sheet === undefined ? { k: "name", name: t.value as string } : { k: "name", name: t.value as string, sheet: t.sheet };
      case T.Unsupported: {
        const what = t.value as string;
        if (t.table !== undefined) return { k: "unsup", what, table: t.table, opaque: false };
        return { k: "unsup", what, opaque: !what.includes("another workbook") };
      }
      case T.Func:
        return this.call(t);
      case T.LParen: {
        this.enter();
        const first = this.expr();
        if (this.peek().t === T.Comma) {
          const items = [first];
          while (this.peek().t === T.Comma) {
            this.take();
            items.push(this.expr());
          }
          this.expect(T.RParen, ")");
          this.leave();
          return { k: "union", items };
        }
        this.expect(T.RParen, ")");
        this.leave();
        return first;
      }
      case T.LBrace:
        return this.arrayConstant();
      case T.End:
        return this.fail("the formula ends too early");
      default:
        return this.fail(`unexpected "${tokenText(t)}" at ${t.start + 1}`);
    }
  }

  private expect(type: T, what: string): void {
    const t = this.take();
    if (t.t !== type) this.fail(`expected "${what}" at ${t.start + 1}`);
  }

  private call(t: Token): Node {
    const name = canonicalFunctionName(t.value as string, this.names);
    // Stryker disable next-line StringLiteral: equivalent: the lexer makes a function token only before "(", so this never fails
    this.expect(T.LParen, "(");
    this.enter();
    const args: Node[] = [];
    if (this.peek().t === T.RParen) {
      this.take();
    } else {
      for (;;) {
        const p = this.peek();
        if (p.t === T.Comma || p.t === T.RParen) args.push({ k: "miss" });
        else args.push(this.expr());
        const sep = this.take();
        if (sep.t === T.RParen) break;
        if (sep.t !== T.Comma) this.fail(`expected "," or ")" at ${sep.start + 1}`);
      }
    }
    this.leave();
    if (name === "ANCHORARRAY" && args.length === 1) return { k: "spill", x: args[0] as Node };
    if (name === "SINGLE" && args.length === 1) return { k: "at", x: args[0] as Node };
    // Stryker disable next-line Regex: equivalent: the name was just checked to start with _XLPM., so the first match is at 0 either way
    if (name.startsWith("_XLPM.") || name === "LAMBDA" || name === "LET") return { k: "unsup", what: `${name.replace(/^_XLPM\./, "")} (LET and LAMBDA)`, args, opaque: false };
    return { k: "fn", name, args };
  }

  private refNode(t: Token): RefNode {
    const r = t.ref!;
    const rowOf = (v: number | undefined, abs: boolean, open: number) => (v === undefined ? open : abs ? v : v - this.originRow);
    const colOf = (v: number | undefined, abs: boolean, open: number) => (v === undefined ? open : abs ? v : v - this.originCol);
    // Whole columns (A:B) and whole rows (1:3) have absolute open sides.
    // Stryker disable next-line ConditionalExpression: equivalent: the lexer marks a whole column's row sides absolute (ra1, ra2) itself
    const wholeCols = r.r1 === undefined;
    // Stryker disable next-line ConditionalExpression: equivalent: the lexer marks a whole row's column sides absolute (ca1, ca2) itself
    const wholeRows = r.c1 === undefined;
    const abs =
      (wholeCols || r.ra1 ? 1 : 0) | (wholeRows || r.ca1 ? 2 : 0) | (wholeCols || r.ra2 ? 4 : 0) | (wholeRows || r.ca2 ? 8 : 0);
    const node: RefNode = {
      k: "ref",
      r1: rowOf(r.r1, r.ra1, 0),
      c1: colOf(r.c1, r.ca1, 0),
      r2: rowOf(r.r2, r.ra2, MAX_ROWS - 1),
      c2: colOf(r.c2, r.ca2, MAX_COLS - 1),
      abs,
      // Stryker disable next-line ConditionalExpression: equivalent: a sheet property holding undefined reads as no sheet (every reader tests n.sheet === undefined)
      ...(r.sheet !== undefined ? { sheet: r.sheet } : {}),
    };
    return node;
  }

  private arrayConstant(): Node {
    const rows: Scalar[][] = [[]];
    for (;;) {
      const t = this.take();
      let v: Scalar;
      if (t.t === T.Num) v = t.value as number;
      else if (t.t === T.Op && (t.value === "-" || t.value === "+") && this.peek().t === T.Num) {
        const num = this.take().value as number;
        v = t.value === "-" ? -num : num;
      } else if (t.t === T.Str) v = t.value as string;
      else if (t.t === T.Bool) v = t.value as boolean;
      else if (t.t === T.Err) v = new XlError(t.value as ErrorCode);
      else this.fail(`an array constant holds only numbers, text, TRUE/FALSE and errors (at ${t.start + 1})`);
      (rows[rows.length - 1] as Scalar[]).push(v);
      const sep = this.take();
      if (sep.t === T.RBrace) break;
      if (sep.t === T.Comma) continue;
      if (sep.t === T.Semi) {
        rows.push([]);
        continue;
      }
      this.fail(`expected ",", ";" or "}" in an array constant at ${sep.start + 1}`);
    }
    const width = (rows[0] as Scalar[]).length;
    if (rows.some((r) => r.length !== width)) this.fail("the rows of an array constant differ in length");
    return { k: "arr", v: XlArray.of(rows) };
  }
}

function tokenText(t: Token): string {
  if (t.t === T.Comma) return ",";
  if (t.t === T.RParen) return ")";
  if (t.t === T.RBrace) return "}";
  // Stryker disable next-line ConditionalExpression: equivalent: unreachable, a ";" outside an array constant is refused first with its own message (";" is not an argument separator)
  if (t.t === T.Semi) return ";";
  // Stryker disable next-line ConditionalExpression: equivalent: unreachable, the lexer makes a spill "#" only right after a reference, a name or ")", where the parser reads it as the spill operator
  if (t.t === T.Hash) return "#";
  return String(t.value ?? "");
}

/** Functions whose result can be a reference (so a space before them may be the intersection operator). */
function isReferenceFunction(written: string, names: NameMap): boolean {
  const n = canonicalFunctionName(written, names);
  return n === "INDEX" || n === "OFFSET" || n === "INDIRECT" || n === "CHOOSE" || n === "IF";
}

/**
 * Parses a formula (without "=") written in the cell at (originRow, originCol), 0-based.
 * @throws FormulaSyntaxError for text that is not a formula.
 */
export function parseFormula(text: string, originRow: number, originCol: number, names: NameMap): Node {
  const body = text.startsWith("=") ? text.slice(1) : text;
  return parseTokens(tokenize(body), originRow, originCol, names);
}

/** Parses tokens already read by `tokenize`. */
export function parseTokens(tokens: Token[], originRow: number, originCol: number, names: NameMap): Node {
  return new Parser(tokens, originRow, originCol, names).parseFormula();
}
