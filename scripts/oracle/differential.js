#!/usr/bin/env node
/**
 * Differential fuzzer: the engine's native Excel functions against LibreOffice Calc.
 *
 * From a seed, generates random formulas over the functions the engine implements (the table of
 * src/engine/formula/functions, read from the build), nested 1 to 3 deep, with arguments of every
 * kind: numbers (negative, zero, fractions, very large and very small), text, numeric text,
 * logical values, blank cells, errors, cell references and ranges over a small invented data block
 * (A1:E6 of sheet S), array constants, arguments left empty (f(x,)) or left out, and the operators
 * + - * / ^ & = < > <> <= >= % and unary minus. Each formula goes into a workbook twice: as a
 * legacy formula (column H, implicitly intersected) and as a dynamic-array formula (Excel's
 * stored form: cm="1", t="array", anchored in column J, 10 rows apart so it can spill). Functions
 * that Excel stores with the _xlfn. prefix are written with it, so LibreOffice reads them.
 *
 * Each workbook (a few hundred formulas) is recalculated by LibreOffice (scripts/oracle/lo.js: one
 * soffice run per workbook, recalculation forced on load, Excel's text conversion, en-US) and by
 * the engine in this process (build/: read the package, plan, compute every formula cell with the
 * recalculation host, as tests/helpers/sheet-eval.ts does). Every formula cell caches a sentinel
 * that must not come back from LibreOffice.
 *
 * A mismatch: numbers that differ (relative 1e-12), different text or logical values, values of
 * different types, a value on one side and an error on the other. Not mismatches: the engine
 * refusing ("not computed headless", written as #VALUE! with its reason), and two different error
 * codes (counted; listed with --error-codes). Known deliberate differences from LibreOffice (the
 * "MS:" cases of tests/engine/formula/functions/*.test.ts, where Microsoft's documentation says
 * Excel does otherwise) are matched by ALLOW below, each with its reason, counted and listed with
 * --allowed.
 *
 * Needs the build (`npm run build:node`) and LibreOffice (soffice).
 * Usage: node scripts/oracle/differential.js [--seed N] [--count N] [--per-book N] [--allowed]
 *          [--error-codes] [--refusals] [--keep DIR] [--only NAME,NAME] [--json FILE]
 *   --seed      PRNG seed (default 1); the same seed gives the same formulas
 *   --count     formulas in all (default 1000); each is compared as legacy and dynamic-array formula
 *   --per-book  formulas per workbook, i.e. per soffice run (default 300)
 *   --only      generate only formulas whose outermost function is one of these
 *   --keep      keep the workbooks (input and LibreOffice's output) in DIR
 *   --json      write every compared cell (formula, LibreOffice, engine, verdict) to FILE
 *   --formula F compare the formula F (no "="; repeatable) instead of random ones
 *   --all       print every compared cell, not only the mismatches
 *   --no-allow  apply no allow-list entry
 * Exit status: 1 when there is a mismatch not allowed, else 0.
 */
"use strict";
const fs = require("fs");
const os = require("os");
const path = require("path");
const { buildXlsx } = require("./xlsx-build");
const { convertAll } = require("./lo");
const { readWorkbookCells, plain, parseA1 } = require("./xlsx-cells");

const ROOT = path.resolve(__dirname, "../..");
const B = (p) => require(path.join(ROOT, "build/src/engine", p));

const SENTINEL = -987654.321;

// ---------------------------------------------------------------- the data block (invented)
const DATA = {
  A1: 1, A2: 2.5, A3: -3, A4: 0, A5: 1e10, A6: 0.001,
  B1: "x", B2: "4", B3: "abc", B4: "Abc def", B5: " a  b ", /* B6 blank */
  C1: 10, /* C2 blank */ C3: 20, C4: -0.5, C5: 30, C6: "y",
  D1: { e: "#N/A" }, D2: 3, D3: 45000, D4: 45678.25, D5: "x", D6: 1,
  E1: { b: true }, E2: { b: false }, E3: 2, /* E4 blank */ E5: "TRUE", E6: 5,
};
const CELLS = ["A1", "A2", "A3", "A4", "A5", "A6", "B1", "B2", "B3", "B4", "B5", "B6", "C1", "C2", "C3", "C4", "C5", "C6", "D1", "D2", "D3", "D4", "D5", "D6", "E1", "E2", "E3", "E4", "E5", "E6", "Z9"];
const NUM_CELLS = ["A1", "A2", "A3", "A4", "A5", "A6", "C1", "C3", "C4", "C5", "D2", "D3", "D4", "D6", "E3", "E6", "B6", "C2", "B2"];
const TEXT_CELLS = ["B1", "B2", "B3", "B4", "B5", "C6", "D5", "E5", "B6"];
const RANGES = ["A1:A6", "B1:B6", "C1:C6", "D2:D6", "E1:E6", "A1:C3", "A1:E6", "A1:B2", "C1:C3", "A2:A4", "B1:C2", "A1:A3", "C3:E3", "A4:E4", "D1:D3", "Z1:Z3"];
const ARRAYS = ["{1,2,3}", "{1;2;3}", "{1,2;3,4}", "{1,\"a\";TRUE,#N/A}", "{-1.5,0,2.5}", "{\"x\";\"abc\";\"4\"}", "{TRUE,FALSE}", "{0}", "{3,1,2}", "{10;20;30}"];
const NUMBERS = ["0", "1", "-1", "2", "3", "2.5", "-2.5", "0.5", "-0.25", "10", "100", "1E+10", "1E-10", "123456.789", "1E+300", "-1E+300", "4.5", "7", "12", "31", "45000", "45678.5", "0.1", "1900", "2025", "-7", "255", "13", "60"];
const TEXTS = ["\"abc\"", "\"\"", "\"x\"", "\" a b \"", "\"3\"", "\"1.5\"", "\"-2\"", "\"TRUE\"", "\"Abc def\"", "\"a*\"", "\"?b\"", "\"~*\"", "\"1E3\"", "\"x y z\"", "\"b\"", "\"ab\"", "\"A1\""];
const CRITERIA = ["\">2\"", "\"<=0\"", "\"x\"", "\"a*\"", "\"<>x\"", "\"=\"", "\"\"", "\">=abc\"", "\"?b*\"", "\"4\"", "\"TRUE\"", "\"<>\"", "2", "0", "TRUE", "\"<10\"", "\">=2.5\"", "\"*\"", "B1", "A2"];
const ERRORS = ["#N/A", "#DIV/0!", "#VALUE!", "#REF!", "#NUM!", "#NAME?", "NA()", "1/0"];
const REF_TEXTS = ["\"A1\"", "\"B2:C3\"", "\"C1\"", "\"Z99\"", "\"A1:A3\"", "\"S!D2\"", "\"R1C1\"", "\"x\"", "\"\""];

/** Functions Excel stores with the _xlfn. prefix (added after Excel 2007), among those generated. */
const XLFN = new Set(["IFS", "SWITCH", "XOR", "CONCAT", "TEXTJOIN", "MINIFS", "MAXIFS", "DAYS", "IFNA", "VAR.S", "VAR.P", "STDEV.S", "STDEV.P"]);

// ---------------------------------------------------------------- function signatures
// kinds: n number, s text, b logical, x anything, r number-or-range (aggregates), a array or range,
// g a range reference, c a criterion, i a reference text (INDIRECT), d a date serial.
// "?" after a kind: optional; "*" after the last: repeats.
const SIG = {
  SUM: "n:r,r*", PRODUCT: "n:r,r*", SUMSQ: "n:r,r*", SUMPRODUCT: "n:a,a*",
  ROUND: "n:n,n", ROUNDUP: "n:n,n", ROUNDDOWN: "n:n,n", TRUNC: "n:n,n?", INT: "n:n", ABS: "n:n", SIGN: "n:n",
  SQRT: "n:n", EXP: "n:n", LN: "n:n", LOG10: "n:n", LOG: "n:n,n?", POWER: "n:n,n", MOD: "n:n,n", PI: "n:",
  EVEN: "n:n", ODD: "n:n", AVERAGE: "n:r,r*", MIN: "n:r,r*", MAX: "n:r,r*", MEDIAN: "n:r,r*",
  VAR: "n:r,r*", "VAR.S": "n:r,r*", VARP: "n:r,r*", "VAR.P": "n:r,r*", STDEV: "n:r,r*", "STDEV.S": "n:r,r*", STDEVP: "n:r,r*", "STDEV.P": "n:r,r*",
  LARGE: "n:a,n", SMALL: "n:a,n", COUNT: "n:r,r*", COUNTA: "n:r,r*", COUNTBLANK: "n:g", ROWS: "n:a", COLUMNS: "n:a",
  IF: "x:b,x,x?", IFERROR: "x:x,x", IFNA: "x:x,x", IFS: "x:b,x,b?,x?", SWITCH: "x:x,x,x,x?,x?", CHOOSE: "x:n,x,x*",
  AND: "b:b,b*", OR: "b:b,b*", XOR: "b:b,b*", NOT: "b:b", TRUE: "b:", FALSE: "b:",
  ISNUMBER: "b:x", ISTEXT: "b:x", ISNONTEXT: "b:x", ISLOGICAL: "b:x", ISBLANK: "b:x", ISERROR: "b:x", ISERR: "b:x", ISNA: "b:x", ISREF: "b:x",
  ISEVEN: "b:n", ISODD: "b:n", NA: "x:", "ERROR.TYPE": "n:x", N: "n:x", T: "s:x",
  INDEX: "x:a,n,n?", MATCH: "n:x,a,n?", VLOOKUP: "x:x,a,n,b?", HLOOKUP: "x:x,a,n,b?", ROW: "n:g?", COLUMN: "n:g?",
  OFFSET: "x:g,n,n,n?,n?", INDIRECT: "x:i,b?", TRANSPOSE: "x:a",
  COUNTIF: "n:g,c", COUNTIFS: "n:g,c,g?,c?", SUMIF: "n:g,c,g?", AVERAGEIF: "n:g,c,g?",
  SUMIFS: "n:g,g,c,g?,c?", AVERAGEIFS: "n:g,g,c,g?,c?", MINIFS: "n:g,g,c,g?,c?", MAXIFS: "n:g,g,c,g?,c?",
  LEN: "n:s", UPPER: "s:s", LOWER: "s:s", TRIM: "s:s", CLEAN: "s:s", LEFT: "s:s,n?", RIGHT: "s:s,n?", MID: "s:s,n,n",
  REPT: "s:s,n", EXACT: "b:s,s", SUBSTITUTE: "s:s,s,s,n?", FIND: "n:s,s,n?", SEARCH: "n:s,s,n?",
  CONCATENATE: "s:s,s*", CONCAT: "s:r,r*", TEXTJOIN: "s:s,b,r,r*", VALUE: "n:s", CHAR: "s:n", CODE: "n:s", TEXT: "s:n,s",
  DATE: "n:n,n,n", YEAR: "n:d", MONTH: "n:d", DAY: "n:d", DATEVALUE: "n:s", TIME: "n:n,n,n", HOUR: "n:d", MINUTE: "n:d", SECOND: "n:d",
  WEEKDAY: "n:d,n?", EDATE: "n:d,n", EOMONTH: "n:d,n", DAYS: "n:d,d", DATEDIF: "n:d,d,s",
};
/** Not generated: volatile (the clock differs between the two runs). */
const SKIP = new Set(["TODAY", "NOW"]);

function parseSig(s) {
  const [ret, args] = s.split(":");
  const list = args ? args.split(",") : [];
  return {
    ret,
    args: list.map((a) => ({ kind: a[0], optional: a.includes("?"), repeat: a.includes("*") })),
  };
}

// ---------------------------------------------------------------- random formulas
const mulberry32 = require("../seeded-random").seededRandom;

class Gen {
  constructor(seed, names) {
    this.r = mulberry32(seed);
    this.names = names;
    this.byRet = {};
    for (const n of names) {
      const k = parseSig(SIG[n]).ret;
      (this.byRet[k] ??= []).push(n);
    }
  }
  p(x) {
    return this.r() < x;
  }
  pick(list) {
    return list[Math.floor(this.r() * list.length)];
  }
  /** A function of the engine's table, preferring ones whose result fits `kind`. */
  fnFor(kind) {
    const fits = kind === "x" || kind === "r" || kind === "a" ? this.names : [...(this.byRet[kind] ?? []), ...(this.byRet.x ?? [])];
    return this.pick(fits.length ? fits : this.names);
  }
  call(name, depth) {
    const sig = parseSig(SIG[name]);
    const args = [];
    for (let i = 0; i < sig.args.length; i++) {
      const a = sig.args[i];
      if (a.optional && this.p(0.4)) break; // left out (and all after it)
      args.push(this.arg(a.kind, depth));
      if (a.repeat) while (args.length < 5 && this.p(0.35)) args.push(this.arg(a.kind, depth));
    }
    // an argument written but left empty
    if (args.length && this.p(0.08)) args[Math.floor(this.r() * args.length)] = "";
    if (this.p(0.04)) args.push(""); // a trailing empty argument
    return `${XLFN.has(name) ? "_xlfn." : ""}${name}(${args.join(",")})`;
  }
  arg(kind, depth) {
    if (depth > 0 && this.p(0.3)) return this.expr(kind, depth - 1);
    return this.leaf(kind);
  }
  /** An expression of about `kind`, with at most `depth` more levels of calls. */
  expr(kind, depth) {
    const u = this.r();
    if (u < 0.6) return this.call(this.fnFor(kind), depth);
    if (u < 0.85) return this.operator(kind, depth);
    return this.leaf(kind);
  }
  operator(kind, depth) {
    const sub = (k) => (depth > 0 && this.p(0.4) ? this.expr(k, depth - 1) : this.leaf(k));
    const u = this.r();
    if (u < 0.08) return `-${sub("n")}`;
    if (u < 0.14) return `${sub("n")}%`;
    if (kind === "s" || (kind === "x" && u < 0.3)) return `${sub("x")}&${sub("x")}`;
    if (kind === "b" || (kind === "x" && u < 0.45)) return `${sub("x")}${this.pick(["=", "<", ">", "<>", "<=", ">="])}${sub("x")}`;
    const left = sub(this.pick(["n", "n", "n", "x"]));
    const right = sub(this.pick(["n", "n", "n", "x"]));
    const op = this.pick(["+", "-", "*", "/", "^"]);
    return this.p(0.3) ? `(${left}${op}${right})` : `${left}${op}${right}`;
  }
  leaf(kind) {
    const u = this.r();
    const wild = () => {
      const v = this.r();
      if (v < 0.25) return this.pick(NUMBERS);
      if (v < 0.45) return this.pick(TEXTS);
      if (v < 0.55) return this.pick(["TRUE", "FALSE"]);
      if (v < 0.63) return this.pick(ERRORS);
      if (v < 0.85) return this.pick(CELLS);
      if (v < 0.93) return this.pick(RANGES);
      return this.pick(ARRAYS);
    };
    if (u < 0.12) return wild();
    switch (kind) {
      case "n":
        return this.p(0.6) ? this.pick(NUMBERS) : this.p(0.7) ? this.pick(NUM_CELLS) : this.pick(["\"3\"", "\"-1.5\"", "TRUE", "FALSE", "B6"]);
      case "d":
        return this.p(0.6) ? this.pick(["45000", "45678.25", "45351", "1", "60", "61", "0", "-1", "44985.75", "2958465", "2958466", "36526.5", "45000.999999"]) : this.pick(["D3", "D4", "A1", "A4", "C1"]);
      case "s":
        return this.p(0.6) ? this.pick(TEXTS) : this.pick(TEXT_CELLS);
      case "b":
        return this.p(0.5) ? this.pick(["TRUE", "FALSE"]) : this.pick(["E1", "E2", "A4", "A1", "\"TRUE\"", "E5", "B1", "{TRUE,FALSE}", "A1:A3", "E1:E3"]);
      case "r":
        return this.p(0.55) ? this.pick(RANGES) : this.p(0.5) ? this.pick(ARRAYS) : this.pick([...NUMBERS.slice(0, 10), ...CELLS.slice(0, 12), "\"3\"", "TRUE", "\"x\""]);
      case "a":
        return this.p(0.65) ? this.pick(RANGES) : this.pick(ARRAYS);
      case "g":
        return this.p(0.8) ? this.pick(RANGES) : this.pick(CELLS);
      case "c":
        return this.pick(CRITERIA);
      case "i":
        return this.pick(REF_TEXTS);
      default:
        return wild();
    }
  }
  formula(only) {
    const name = only ? this.pick(only) : this.pick(this.names);
    return this.call(name, 1 + Math.floor(this.r() * 3) - 1);
  }
}

// ---------------------------------------------------------------- comparison
const LETTERS = (c) => {
  let s = "";
  let n = c + 1;
  while (n > 0) {
    s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
};

const isErr = (v) => v !== null && typeof v === "object" && "error" in v;
const show = (v) => (v === null ? "(blank)" : isErr(v) ? v.error + (v.message ? ` ${v.message}` : "") : typeof v === "string" ? JSON.stringify(v) : v && v.refused ? `not computed: ${v.refused}` : String(v));

function sameNumber(a, b) {
  if (a === b) return true;
  const d = Math.abs(a - b);
  return d <= 1e-12 * Math.max(Math.abs(a), Math.abs(b)) || (Math.abs(a) < 1e-300 && Math.abs(b) < 1e-300);
}

/** The verdict on one cell: "same", "refused", "error codes", or a mismatch kind. */
function verdict(lo, en) {
  if (en && en.refused) return "refused";
  const blank = (v) => v === null || v === "";
  if (blank(lo) && blank(en)) return "same";
  if (isErr(lo) && isErr(en)) return lo.error === en.error ? "same" : "error codes";
  if (isErr(lo)) return "LO error, engine value";
  if (isErr(en)) return "LO value, engine error";
  if (typeof lo === "number" && typeof en === "number") return sameNumber(lo, en) ? "same" : "numbers differ";
  if (typeof lo !== typeof en) return "types differ";
  return lo === en ? "same" : typeof lo === "string" ? "texts differ" : "logicals differ";
}

// ---------------------------------------------------------------- allow-list
/**
 * Known deliberate differences: each is a case where Microsoft's documentation says Excel does
 * otherwise than LibreOffice, and tests/engine/formula/functions/*.test.ts holds the "MS:" case.
 * `when` sees { formula, lo, en, kind }.
 */
const refersTo = (formula, cells) => {
  // any single reference or range of the formula touching one of `cells`
  const re = /\$?([A-Z]{1,3})\$?(\d+)(?::\$?([A-Z]{1,3})\$?(\d+))?/g;
  let m;
  const want = cells.map(parseA1);
  while ((m = re.exec(formula.replace(/"[^"]*"/g, "")))) {
    const a = parseA1(`${m[1]}${m[2]}`);
    const b = m[3] ? parseA1(`${m[3]}${m[4]}`) : a;
    for (const w of want) if (w.row >= Math.min(a.row, b.row) && w.row <= Math.max(a.row, b.row) && w.col >= Math.min(a.col, b.col) && w.col <= Math.max(a.col, b.col)) return true;
  }
  return false;
};
const LOGICAL_SOURCE = /\b(TRUE|FALSE)\b|\b(IS[A-Z]+|NOT|AND|OR|_xlfn\.XOR|EXACT|IF)\(|[=<>]|E[12]\b|E1:/;
const AGGREGATE = /\b(SUM|SUMSQ|PRODUCT|AVERAGE|MIN|MAX|MEDIAN|VARP?|VAR\.[SP]|STDEVP?|STDEV\.[SP]|COUNT|LARGE|SMALL)\(/;
const ALLOW = [
  {
    id: "logical-in-cell",
    reason: "LibreOffice holds TRUE/FALSE in a cell as the number 1/0, so aggregates, lookups and arithmetic over E1/E2 count or match them as numbers; Excel keeps them logical (MS: COUNT page; math.test.ts, kit.test.ts)",
    when: (m) => refersTo(m.formula, ["E1", "E2"]),
  },
  {
    id: "logical-as-number",
    reason: "LibreOffice holds logical values as the numbers 1 and 0 (LEN(TRUE) is 1, ISNUMBER(FALSE) is TRUE, an array formula's TRUE is stored as 1, arrays of logicals are summed); Excel keeps them logical (MS: COUNT, SUMPRODUCT pages; text.test.ts, math.test.ts headers)",
    when: (m) => LOGICAL_SOURCE.test(m.formula) && !(isErr(m.lo) && !isErr(m.en)),
  },
  {
    id: "lo-array-logical",
    reason: "LibreOffice writes a logical result of an array formula as the number 1 or 0 (behaviour of its .xlsx export)",
    when: (m) => m.mode === "dynamic" && typeof m.en === "boolean" && m.lo === (m.en ? 1 : 0),
  },
  {
    id: "typed-text-in-aggregate",
    reason: "Excel counts numeric text and logical values typed as arguments of SUM, AVERAGE, MIN, MAX, PRODUCT, SUMSQ, VAR, STDEV, MEDIAN, COUNT (MS: COUNT page, from memory; math.test.ts); LibreOffice refuses typed text",
    when: (m) => AGGREGATE.test(m.formula) && (/"/.test(m.formula) || LOGICAL_SOURCE.test(m.formula)),
  },
  {
    id: "iferror-array",
    reason: "Excel's IFERROR/IFNA of an array replace each error element (MS: IFERROR page: an array formula gives an array of results); LibreOffice 7.4 gives #N/A for an inline array holding an error",
    when: (m) => /\bIF(ERROR|NA)\(/.test(m.formula) && isErr(m.lo) && !isErr(m.en),
  },
  {
    id: "iseven-text",
    reason: "Excel converts numeric text and a blank for ISEVEN/ISODD (XL from memory; logic.test.ts); LibreOffice: #VALUE!",
    when: (m) => /\bIS(EVEN|ODD)\(/.test(m.formula) && isErr(m.lo) && !isErr(m.en),
  },
  {
    id: "negative-time",
    reason: "Excel's HOUR, MINUTE, SECOND, TIME of a negative time are #NUM! (XL from memory; text.test.ts); LibreOffice computes them",
    when: (m) => /\b(HOUR|MINUTE|SECOND|TIME)\(/.test(m.formula) && isErr(m.en) && m.en.error === "#NUM!" && /negative/.test(m.en.message ?? ""),
  },
  {
    id: "dates-before-march-1900",
    reason: "Excel counts 29 February 1900, so serials 1 to 60 are one day later than LibreOffice's (MS: DATE page, 1900 leap-year note; text.test.ts)",
    when: (m) => /\b(DATE|YEAR|MONTH|DAY|WEEKDAY|EDATE|EOMONTH|DATEDIF|DATEVALUE|DAYS)\(/.test(m.formula),
  },
  {
    id: "date-years-0-1899",
    reason: "Excel adds 1900 to a DATE year from 0 to 1899 and refuses 10000 or more (MS: DATE page; text.test.ts); LibreOffice reads years as they are",
    when: (m) => /\bDATE\(/.test(m.formula),
  },
  {
    id: "char-0",
    reason: "Excel's CHAR takes 1 to 255 (MS: CHAR page; text.test.ts); LibreOffice returns a character for 0",
    when: (m) => /\bCHAR\(/.test(m.formula),
  },
  {
    id: "clean-127",
    reason: "Excel's CLEAN removes codes 0 to 31 only (MS: CLEAN page; text.test.ts); LibreOffice also removes 127",
    when: (m) => /\bCLEAN\(/.test(m.formula),
  },
  {
    id: "find-empty",
    reason: "Excel's FIND/SEARCH with an empty find_text gives start_num (MS: FIND page; text.test.ts); LibreOffice: #VALUE!",
    when: (m) => /\b(FIND|SEARCH)\(/.test(m.formula) && m.kind === "LO error, engine value",
  },
  {
    id: "counta-empty-text",
    reason: "Excel's COUNTA counts empty text \"\"; COUNTBLANK counts the empty cells of a range beyond the used area (MS: COUNTA, COUNTBLANK pages; math.test.ts)",
    when: (m) => /\bCOUNT(A|BLANK)\(/.test(m.formula),
  },
  {
    id: "text-length-limit",
    reason: "Excel's text results stop at 32,767 characters: #VALUE! (MS: REPT, CONCAT pages; text.test.ts); LibreOffice has no limit",
    when: (m) => /\b(REPT|CONCAT|CONCATENATE|TEXTJOIN)\(|&/.test(m.formula) && isErr(m.en) && /32,767/.test(m.en.message ?? ""),
  },
  {
    id: "error-type-codes",
    reason: "ERROR.TYPE numbers #NULL! 1, #REF! 4, #NUM! 6 (MS: ERROR.TYPE table; logic.test.ts); LibreOffice gives #N/A for its own errors",
    when: (m) => /\bERROR\.TYPE\(/.test(m.formula),
  },
  {
    id: "weekday-negative",
    reason: "Excel's WEEKDAY of a negative serial is #NUM! (MS: WEEKDAY page; text.test.ts); LibreOffice computes it",
    when: (m) => /\bWEEKDAY\(/.test(m.formula) && isErr(m.en) && m.en.error === "#NUM!",
  },
  {
    id: "sumproduct-logical",
    reason: "Excel's SUMPRODUCT treats non-numeric array entries as zeros (MS: SUMPRODUCT page; math.test.ts); LibreOffice counts TRUE as 1",
    when: (m) => /\bSUMPRODUCT\(/.test(m.formula) && /TRUE|FALSE/.test(m.formula),
  },
  {
    id: "typed-logical-text",
    reason: "Excel's AND, OR, XOR count text typed directly that reads as a logical value (\"TRUE\") (XL from memory; logic.test.ts); LibreOffice: #VALUE!",
    when: (m) => /\b(AND|OR|_xlfn\.XOR)\(/.test(m.formula) && /"(TRUE|FALSE)"|E5\b/i.test(m.formula),
  },
  {
    id: "wildcard-star-numbers",
    reason: "The criteria wildcard * matches text only, never numbers (XL from memory; lookup.test.ts); LibreOffice matches numbers too",
    when: (m) => /IFS?\(/.test(m.formula) && /"[^"]*[*?][^"]*"/.test(m.formula),
  },
  {
    id: "error-criterion",
    reason: "An error as criterion counts the cells holding that error (XL from memory; lookup.test.ts); LibreOffice gives the error",
    when: (m) => /IFS?\(/.test(m.formula) && isErr(m.lo) && !isErr(m.en),
  },
  {
    id: "code-empty",
    reason: "CODE(\"\") is #VALUE! (XL from memory; text.test.ts); LibreOffice: 0",
    when: (m) => /\bCODE\(/.test(m.formula) && isErr(m.en) && /empty text/.test(m.en.message ?? ""),
  },
  {
    id: "time-truncates",
    reason: "TIME truncates its arguments to whole numbers (XL from memory; text.test.ts); LibreOffice keeps the fractions",
    when: (m) => /\bTIME\(/.test(m.formula) && typeof m.lo === "number" && typeof m.en === "number",
  },
  {
    id: "lo-inline-array-error",
    reason: "LibreOffice 7.4 gives #N/A for a whole formula over an inline array that holds #N/A (ROWS({1;#N/A}), N({1,#N/A})); Excel reads the array's elements (MS: ROWS, N pages: behaviour of arrays)",
    when: (m) => /\{[^}]*#N\/A[^}]*\}/.test(m.formula) && isErr(m.lo) && m.lo.error === "#N/A" && !isErr(m.en),
  },
  {
    id: "lo-int-range",
    reason: "LibreOffice gives #VALUE! for a count or digits argument beyond its internal integer range (ROUND(x,45000), LEFT(s,1E+10), MID(s,1E+10,1), SUBSTITUTE(…,1E+10)); Microsoft's pages give the result: more digits leave the number as it is, more characters than the text give all of it, a start past the end gives \"\"",
    when: (m) => /\b(ROUND|ROUNDUP|ROUNDDOWN|TRUNC|LEFT|RIGHT|MID|SUBSTITUTE|REPT)\(/.test(m.formula) && isErr(m.lo) && m.lo.error === "#VALUE!" && !isErr(m.en) && /1E\+300|1E\+10|123456\.789|4500\d|45678|A5|D3|D4/.test(m.formula),
  },
  {
    id: "lo-text-true",
    reason: "LibreOffice reads the text \"TRUE\" as the number 1 in arithmetic; Excel's arithmetic on text that is no number is #VALUE! (behaviour of both, as the engine's coercion tests record; from memory for Excel)",
    when: (m) => /E5\b|"TRUE"/.test(m.formula) && isErr(m.en) && /text "TRUE" is not a number/.test(m.en.message ?? ""),
  },
  {
    id: "implicit-intersection",
    reason: "A legacy formula reading a range that does not share a row or column with its cell is #VALUE! in Excel (MS: implicit intersection operator page); LibreOffice 7.4 computes some of these (IFS, SWITCH) over the whole range",
    when: (m) => m.mode === "legacy" && isErr(m.en) && /implicit intersection/.test(m.en.message ?? ""),
  },
];
// "when" picks the candidates, "test" (default: any mismatch) decides
for (const a of ALLOW) a.test ??= () => true;

// ---------------------------------------------------------------- one workbook
async function engineValues(bytes) {
  const { readBook } = B("book.js");
  const { RecalcHost } = B("host.js");
  const { NotComputed, Uncomputable } = B("formula/evaluate.js");
  const { XlError } = B("formula/values.js");
  const { planRecalc } = B("plan.js");
  const { SOIL_NAMES, SOIL_SIGNATURES } = B("soil.js");
  const { openPackage } = B("xlsx-package.js");
  const book = readBook(await openPackage(bytes), SOIL_NAMES);
  const host = new RecalcHost(book, planRecalc(book, SOIL_SIGNATURES), 4_000_000);
  try {
    host.computeAll();
  } catch (e) {
    if (!(e instanceof NotComputed)) throw e;
  }
  return (addr) => {
    const p = parseA1(addr);
    let v;
    try {
      v = host.value(0, p.row, p.col);
    } catch (e) {
      if (e instanceof NotComputed) return { refused: e.message };
      return { error: "(crash)", message: String(e && e.stack ? e.stack.split("\n").slice(0, 3).join(" | ") : e) };
    }
    if (v instanceof Uncomputable) return { refused: v.message };
    if (v instanceof XlError) return { error: v.code, message: v.message };
    return v;
  };
}

async function runBook(formulas, work, index) {
  const cells = { ...DATA };
  const places = []; // { formula, mode, anchor }
  formulas.forEach((f, i) => {
    const legacy = `H${i + 1}`;
    cells[legacy] = { f, v: SENTINEL };
    places.push({ formula: f, mode: "legacy", anchor: legacy });
    const anchor = `J${1 + 10 * i}`;
    cells[anchor] = { f, v: SENTINEL, t: "array", ref: `J${1 + 10 * i}:L${3 + 10 * i}`, cm: true };
    places.push({ formula: f, mode: "dynamic", anchor });
  });
  const bytes = await buildXlsx({ sheets: [{ name: "S", cells }] });
  // the engine keeps a formula's cached value unless a SOIL cell feeds it: its copy caches nothing
  const bare = {};
  for (const [k, v] of Object.entries(cells)) bare[k] = v && typeof v === "object" && v.f !== undefined ? { ...v, v: undefined } : v;
  const engineBytes = await buildXlsx({ sheets: [{ name: "S", cells: bare }] });
  const input = path.join(work, `diff${index}.xlsx`);
  fs.writeFileSync(input, bytes);
  const outDir = path.join(work, "out");
  convertAll([input], outDir);
  const lo = (await readWorkbookCells(fs.readFileSync(path.join(outDir, `diff${index}.xlsx`)))).sheets[0].cells;
  let en;
  try {
    en = await engineValues(engineBytes);
  } catch (e) {
    // the engine crashed on the workbook: find the formulas that crash it alone, report them, and
    // compare the rest
    const crashers = [];
    for (const f of formulas) {
      for (const dyn of [false, true]) {
        const one = { A1: 1, H1: dyn ? { f, t: "array", ref: "H1:J3", cm: true } : { f } };
        try {
          await engineValues(await buildXlsx({ sheets: [{ name: "S", cells: one }] }));
        } catch (x) {
          crashers.push({ formula: f, mode: dyn ? "dynamic" : "legacy", cell: "H1", lo: null, en: { error: "(crash)", message: String(x).slice(0, 200) }, kind: "engine crash" });
        }
      }
    }
    if (!crashers.length) throw e;
    const bad = new Set(crashers.map((c) => c.formula));
    process.stderr.write(`  the engine crashes on ${bad.size} formula(s); comparing the rest\n`);
    return [...crashers, ...(await runBook(formulas.filter((f) => !bad.has(f)), work, `${index}b`))];
  }
  // OOXML escapes control characters in text as _xHHHH_ (ECMA-376 Part 1, 22.9.2.19 ST_Xstring)
  const unescape = (v) => (typeof v === "string" ? v.replace(/_x([0-9A-Fa-f]{4})_/g, (_, h) => String.fromCharCode(parseInt(h, 16))) : v);
  const loAt = (a) => unescape(plain(lo.get(a)) ?? null);
  const results = [];
  for (const p of places) {
    const a = parseA1(p.anchor);
    const targets = [p.anchor];
    if (p.mode === "dynamic") {
      // the elements the engine spilled into, inside the 3×3 LibreOffice computes
      for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) if (r || c) {
        const addr = `${LETTERS(a.col + c)}${a.row + r + 1}`;
        const v = en(addr);
        if (v !== null) targets.push(addr);
      }
    }
    for (const t of targets) {
      const l = loAt(t);
      if (l === SENTINEL) throw new Error(`${t}: LibreOffice gave back the sentinel: it did not recalculate`);
      const e = en(t);
      results.push({ formula: p.formula, mode: p.mode, cell: t, lo: l, en: e, kind: verdict(l, e) });
    }
  }
  return results;
}

// ---------------------------------------------------------------- main
function option(name, dflt) {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : dflt;
}

async function main() {
  const seed = Number(option("seed", "1"));
  const count = Number(option("count", "1000"));
  const perBook = Number(option("per-book", "300"));
  const { NATIVE_FUNCTIONS } = B("formula/functions/index.js");
  const names = [...NATIVE_FUNCTIONS.keys()].filter((n) => !SKIP.has(n));
  const missing = names.filter((n) => !SIG[n]);
  if (missing.length) throw new Error(`no signature for ${missing.join(", ")}: add them to SIG`);
  const only = option("only") ? option("only").split(",") : undefined;
  const gen = new Gen(seed, names);
  const formulas = [];
  const seen = new Set();
  const given = process.argv.flatMap((a, i) => (a === "--formula" ? [process.argv[i + 1]] : []));
  if (given.length) formulas.push(...given);
  for (let tries = 0; !given.length && formulas.length < count && tries < count * 20; tries++) {
    const f = gen.formula(only);
    if (f.length > 400 || seen.has(f)) continue;
    seen.add(f);
    formulas.push(f);
  }
  const keep = option("keep");
  const work = keep ? path.resolve(keep) : fs.mkdtempSync(path.join(os.tmpdir(), "soilcell-diff-"));
  fs.mkdirSync(work, { recursive: true });
  const all = [];
  try {
    for (let i = 0; i * perBook < formulas.length; i++) {
      const batch = formulas.slice(i * perBook, (i + 1) * perBook);
      process.stderr.write(`workbook ${i + 1}: ${batch.length} formulas…\n`);
      all.push(...(await runBook(batch, work, i + 1)));
    }
  } finally {
    if (!keep) fs.rmSync(work, { recursive: true, force: true });
  }
  const tally = {};
  const shown = { mismatch: [], allowed: [], "error codes": [], refused: [] };
  for (const m of all) {
    let k = m.kind;
    if (k !== "same" && k !== "refused" && k !== "error codes") {
      const a = process.argv.includes("--no-allow") ? undefined : ALLOW.find((x) => x.when(m) && x.test(m));
      if (a) {
        m.allowed = a.id;
        k = `allowed (${a.id})`;
        shown.allowed.push(m);
      } else shown.mismatch.push(m);
    } else if (k === "error codes") shown["error codes"].push(m);
    else if (k === "refused") shown.refused.push(m);
    tally[k] = (tally[k] ?? 0) + 1;
  }
  const line = (m) => `  [${m.mode} ${m.cell}] =${m.formula}\n      LibreOffice: ${show(m.lo)}\n      engine:      ${show(m.en)}${m.allowed ? `\n      allowed:     ${m.allowed}` : ""}`;
  const out = [];
  out.push(`seed ${seed}: ${formulas.length} formulas, ${all.length} cells compared (legacy and dynamic-array)`);
  for (const [k, n] of Object.entries(tally).sort()) out.push(`  ${k}: ${n}`);
  if (shown.mismatch.length) {
    out.push("", "MISMATCHES:");
    const byKind = {};
    for (const m of shown.mismatch) (byKind[m.kind] ??= []).push(m);
    for (const [k, list] of Object.entries(byKind)) {
      out.push(`${k} (${list.length}):`);
      for (const m of list) out.push(line(m));
    }
  }
  if (process.argv.includes("--all")) out.push("", "ALL:", ...all.map((m) => `${line(m)}\n      verdict:     ${m.allowed ? `allowed (${m.allowed})` : m.kind}`));
  if (process.argv.includes("--allowed") && shown.allowed.length) out.push("", "ALLOWED:", ...shown.allowed.map(line));
  if (process.argv.includes("--error-codes") && shown["error codes"].length) out.push("", "ERROR CODES DIFFER:", ...shown["error codes"].map(line));
  if (process.argv.includes("--refusals") && shown.refused.length) out.push("", "REFUSED:", ...shown.refused.map(line));
  process.stdout.write(`${out.join("\n")}\n`);
  const json = option("json");
  if (json) fs.writeFileSync(json, JSON.stringify(all, null, 1));
  process.exit(shown.mismatch.length ? 1 : 0);
}

module.exports = { Gen, verdict, ALLOW, SIG };

if (require.main === module) {
  main().catch((e) => {
    process.stderr.write(`${e.stack ?? e}\n`);
    process.exit(2);
  });
}
