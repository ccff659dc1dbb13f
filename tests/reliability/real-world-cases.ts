/**
 * (A helper: the expected outcomes are data, in tests/fixtures/real-world/cases.json, each with
 * its source; the workbooks are invented.)
 * What a recalc of one real-world or hostile workbook must do (exit code, messages, output parts
 * byte for byte, cells, values), shared by the test that runs the command as a user would and the
 * one that runs it in process (which mutation testing can see).
 */
import fs from "fs";
import path from "path";
import { tokenize } from "../../scripts/oracle/xml";
import { readWorkbookCells, CachedValue } from "../../scripts/oracle/xlsx-cells";
import { rawCells, zipParts } from "../helpers/sheet-xml";
import { sameValue, show } from "../helpers/cached-values";
import { Run, messages } from "./cli-run";

export const FIXTURES = path.join(__dirname, "../fixtures/real-world");

export interface Case {
  file: string;
  issue: string;
  what: string;
  madeBy: string;
  exit: 0 | 1 | 2;
  output: boolean;
  message?: string;
  stdoutHas?: string;
  maxSeconds: number;
  maxRssMB: number;
  maxLineLength?: number;
  mayChange?: string[];
  computed?: Record<string, string[]>;
  formulaMayChange?: Record<string, string[]>;
  onlyCells?: Record<string, string[]>;
  values?: Record<string, Record<string, CachedValue>>;
  sources?: Record<string, Record<string, string>>;
}

export const CASES: Case[] = JSON.parse(fs.readFileSync(path.join(FIXTURES, "cases.json"), "utf8")).cases;

/**
 * Every way the run of case `c` (input copied to `input`, output asked at `output`) differs from
 * its expectation. `inProcess`: the run was `main` called in this process, so its time and memory
 * are not the command's and are not judged.
 */
export async function caseProblems(c: Case, run: Run, input: string, output: string, inProcess = false): Promise<string[]> {
    const problems: string[] = [];
    const say = (p: string) => problems.push(p);
    if (run.timedOut) say(`still running after ${c.maxSeconds + 15} s: killed`);
    if (run.signal) say(`ended by ${run.signal}`);
    if (run.status !== c.exit) say(`exit ${run.status}, expected ${c.exit}; stderr: ${messages(run.stderr).join(" | ").slice(0, 300)}`);
    if (/\n\s+at .+:\d+:\d+/.test(run.stderr)) say("a stack trace on stderr");
    if (!inProcess && run.seconds > c.maxSeconds) say(`took ${run.seconds.toFixed(1)} s (limit ${c.maxSeconds} s)`);
    if (!inProcess && run.rssMB > c.maxRssMB) say(`peak memory ${Math.round(run.rssMB)} MB (limit ${c.maxRssMB} MB)`);
    if (c.maxLineLength) {
      const long = `${run.stdout}\n${run.stderr}`.split("\n").filter((l) => l.length > c.maxLineLength!);
      if (long.length) say(`${long.length} output lines longer than ${c.maxLineLength} characters (longest ${Math.max(...long.map((l) => l.length))})`);
    }
    if (c.stdoutHas && !new RegExp(c.stdoutHas).test(run.stdout)) say(`stdout does not mention ${c.stdoutHas}`);
    const exists = fs.existsSync(output);
    if (exists !== c.output) say(c.output ? "no output written" : "an output was written for a refused file");
    if (c.exit === 2) {
      const lines = messages(run.stderr);
      if (lines.length !== 1 || !/^soilcell: /.test(lines[0]!) || !new RegExp(c.message ?? ".", "i").test(lines[0]!)) {
        say(`refusal should be one line "soilcell: …" matching /${c.message}/i, got ${JSON.stringify(lines)}`);
      }
    } else if (messages(run.stderr).length) {
      say(`unexpected stderr: ${messages(run.stderr).join(" | ").slice(0, 300)}`);
    }
    if (exists && c.output) await checkOutput(c, input, output, say);
  return problems;
}

async function checkOutput(c: Case, input: string, output: string, say: (p: string) => void): Promise<void> {
  let before: Map<string, Buffer>;
  let after: Map<string, Buffer>;
  try {
    before = await zipParts(input);
    after = await zipParts(output);
  } catch (e) {
    say(`output is not a readable zip: ${(e as Error).message}`);
    return;
  }
  const mayChange = new Set(c.mayChange ?? []);
  for (const [name, bytes] of before) {
    const out = after.get(name);
    if (!out) say(`part ${name} is missing from the output`);
    else if (!mayChange.has(name) && !out.equals(bytes)) say(`part ${name} changed`);
  }
  for (const name of after.keys()) if (!before.has(name) && !mayChange.has(name)) say(`new part ${name}`);
  for (const [name, bytes] of after) {
    if (!/\.(xml|rels)$/.test(name)) continue;
    try {
      tokenize(bytes.toString("utf8"));
    } catch (e) {
      say(`part ${name} is not well-formed XML: ${(e as Error).message}`);
    }
  }
  let inBook;
  let outBook;
  try {
    inBook = await readWorkbookCells(fs.readFileSync(input));
    outBook = await readWorkbookCells(fs.readFileSync(output));
  } catch (e) {
    say(`output cannot be read: ${(e as Error).message}`);
    return;
  }
  for (const sheet of inBook.sheets) {
    const computed = new Set(c.computed?.[sheet.name] ?? []);
    const outSheet = outBook.sheets.find((s) => s.name === sheet.name);
    if (!outSheet) {
      say(`sheet ${sheet.name} is missing from the output`);
      continue;
    }
    if (mayChange.has(sheet.path)) {
      const a = rawCells(before.get(sheet.path)!.toString("utf8"));
      const b = rawCells(after.get(outSheet.path)!.toString("utf8"));
      if (a.head !== b.head) say(`${sheet.name}: the sheet part before <sheetData> changed`);
      if (a.tail !== b.tail) say(`${sheet.name}: the sheet part after <sheetData> changed`);
      const mayRewrite = new Set(c.formulaMayChange?.[sheet.name] ?? []);
      for (const [addr, cell] of a.cells) {
        const o = b.cells.get(addr);
        if (!computed.has(addr)) {
          if (!o) say(`${sheet.name}!${addr}: cell dropped`);
          else if (o.raw !== cell.raw) say(`${sheet.name}!${addr}: does not depend on SOIL cells but its XML changed: ${cell.raw.slice(0, 120)} → ${o.raw.slice(0, 120)}`);
        } else if (cell.f && !mayRewrite.has(addr) && o?.f !== cell.f) {
          say(`${sheet.name}!${addr}: formula rewritten: ${cell.f.slice(0, 120)} → ${(o?.f ?? "(none)").slice(0, 120)}`);
        }
      }
      for (const addr of b.cells.keys()) if (!a.cells.has(addr) && !computed.has(addr)) say(`${sheet.name}!${addr}: a cell that was not in the input`);
      const only = c.onlyCells?.[sheet.name];
      if (only) {
        const extra = [...b.cells.keys()].filter((x) => !only.includes(x));
        if (extra.length) say(`${sheet.name}: cells ${extra.join(", ")} appeared (hidden markup became cells?)`);
      }
    }
    for (const [addr, want] of Object.entries(c.values?.[sheet.name] ?? {})) {
      const got = outSheet.cells.get(addr)?.value ?? null;
      // { error: "*" }: any error value (a cell the engine may refuse, but must not leave stale)
      const anyError = want !== null && typeof want === "object" && "error" in want && want.error === "*";
      if (anyError ? !(got !== null && typeof got === "object" && "error" in got) : !sameValue(want, got)) {
        const src = c.sources?.[sheet.name]?.[addr];
        say(`${sheet.name}!${addr}: expected ${show(want)}${src ? ` (${src.slice(0, 80)})` : " (the input's cached value)"}, got ${show(got)}`);
      }
    }
  }
}

