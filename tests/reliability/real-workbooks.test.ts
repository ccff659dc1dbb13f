/**
 * Real-world and hostile workbooks through `soilcell recalc`, run as a user would (issue 14).
 * The files and their expected outcomes are data: tests/fixtures/real-world/*.xlsx and
 * cases.json, made by scripts/fixtures/make-real-world.js (hand-written XML in Excel's stored
 * form, ExcelJS, openpyxl, LibreOffice). For each case this checks the exit code, the one-line
 * message of a refusal, whether an output exists, that every part not allowed to change is byte
 * for byte the input's, that every cell outside the computed ones keeps its XML byte for byte
 * (formulas, shared formulas and cached values), that no cell appears from nowhere, and every
 * formula cell's cached value (the input's own where the cell does not depend on SOIL cells;
 * `soilcell eval` or LibreOffice's where it does; see `sources` in cases.json).
 *
 * Then the unsafe writes of issue 14 point 8: a planted symlink at the temporary name, an output
 * that is a symlink, a FIFO or a device node, an input that is a FIFO or /dev/zero, and input
 * and output that are one file under two paths (a bind mount, or a hard link where mounting is
 * not allowed). Each run has a time limit, so a hang fails fast.
 *
 * Workbook contents are invented. Needs the build (`npm test` builds first).
 */
import { spawnSync } from "child_process";
import fs from "fs";
import path from "path";
import { tokenize } from "../../scripts/oracle/xml";
import { readWorkbookCells, CachedValue } from "../../scripts/oracle/xlsx-cells";
import { rawCells, zipParts } from "../helpers/sheet-xml";
import { sameValue, show } from "../helpers/cached-values";
import { tempDir, writeWorkbook } from "../helpers/workbook";
import { BIN, Run, messages, soilcell } from "./cli-run";

const FIXTURES = path.join(__dirname, "../fixtures/real-world");

interface Case {
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

const CASES: Case[] = JSON.parse(fs.readFileSync(path.join(FIXTURES, "cases.json"), "utf8")).cases;

const figures: string[] = [];
afterAll(() => {
  if (process.env.RELIABILITY_REPORT) process.stdout.write(`${figures.join("\n")}\n`);
});

describe("soilcell recalc on real-world and hostile workbooks (tests/fixtures/real-world/cases.json)", () => {
  let dir: string;
  beforeAll(() => {
    dir = tempDir("soilcell-real-");
  });
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it("every workbook in the folder has a case, and every case a workbook", () => {
    const files = fs.readdirSync(FIXTURES).filter((f) => f.endsWith(".xlsx")).sort();
    expect(CASES.map((c) => c.file).sort()).toEqual(files);
  });

  it.each(CASES.map((c) => [`${c.file} (${c.issue}): ${c.what}`, c] as const))("%s", async (_, c) => {
    const input = path.join(dir, c.file);
    fs.copyFileSync(path.join(FIXTURES, c.file), input);
    const output = path.join(dir, `out-${c.file}`);
    const run = soilcell(["recalc", input, "-o", output], undefined, (c.maxSeconds + 15) * 1000);
    figures.push(`${c.file}\texit ${run.status}\t${run.seconds.toFixed(2)} s\t${Math.round(run.rssMB)} MB\t${messages(run.stderr).join(" | ").slice(0, 200)}`);
    const problems: string[] = [];
    const say = (p: string) => problems.push(p);
    if (run.timedOut) say(`still running after ${c.maxSeconds + 15} s: killed`);
    if (run.signal) say(`ended by ${run.signal}`);
    if (run.status !== c.exit) say(`exit ${run.status}, expected ${c.exit}; stderr: ${messages(run.stderr).join(" | ").slice(0, 300)}`);
    if (/\n\s+at .+:\d+:\d+/.test(run.stderr)) say("a stack trace on stderr");
    if (run.seconds > c.maxSeconds) say(`took ${run.seconds.toFixed(1)} s (limit ${c.maxSeconds} s)`);
    if (run.rssMB > c.maxRssMB) say(`peak memory ${Math.round(run.rssMB)} MB (limit ${c.maxRssMB} MB)`);
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
    expect({ file: c.file, problems }).toEqual({ file: c.file, problems: [] });
  }, 180000);
});

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

// ---------------------------------------------------------------------------------------------
// Unsafe writes (issue 14 point 8)

const NODE = process.execPath;

/** A small valid workbook (one SOIL cell) to recalculate. */
async function small(file: string): Promise<string> {
  return writeWorkbook(file, (wb) => {
    const ws = wb.addWorksheet("Lab");
    ws.getCell("A1").value = 400.78;
    ws.getCell("B1").value = { formula: 'SOIL.CMOL(A1,"Ca")' } as never;
  });
}

function refused(run: Run): void {
  expect({ timedOut: run.timedOut, status: run.status }).toEqual({ timedOut: false, status: 2 });
  const lines = messages(run.stderr);
  expect(lines).toHaveLength(1);
  expect(lines[0]).toMatch(/^soilcell: /);
}

describe("recalc never writes through or over anything but a new regular file (issue 14 point 8)", () => {
  let dir: string;
  let input: string;
  beforeAll(async () => {
    dir = tempDir("soilcell-unsafe-");
    input = await small(path.join(dir, "in.xlsx"));
  });
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it("a symlink planted at the temporary file's name is not followed: the file it points to is untouched", () => {
    const victim = path.join(dir, "victim.txt");
    fs.writeFileSync(victim, "unrelated file");
    const out = path.join(dir, "planted.xlsx");
    // The planting runs inside the recalculating process, so it knows its pid, as an attacker
    // watching the process table would; the names are the ones a predictable scheme might use.
    const plant = `
      const fs = require("fs"), path = require("path");
      const out = ${JSON.stringify(out)}, victim = ${JSON.stringify(victim)};
      const base = path.basename(out), dir = path.dirname(out), pid = process.pid;
      for (const n of ["." + base + "." + pid + ".partial", base + ".tmp", "." + base + ".tmp", base + ".partial", base + "~", "." + base + "." + pid + ".tmp"]) {
        try { fs.symlinkSync(victim, path.join(dir, n)); } catch {}
      }
      process.argv = [process.argv[0], ${JSON.stringify(BIN)}, "recalc", ${JSON.stringify(input)}, "-o", out];
      require(${JSON.stringify(BIN)});`;
    const r = spawnSync(NODE, ["-e", plant], { encoding: "utf8", timeout: 60000, killSignal: "SIGKILL" });
    expect(r.status === 0 || r.status === 1 || r.status === 2).toBe(true);
    const after = fs.readFileSync(victim);
    expect({ victimIntact: after.equals(Buffer.from("unrelated file")), victimBytes: after.length }).toEqual({ victimIntact: true, victimBytes: 14 });
    expect(fs.lstatSync(victim).isFile()).toBe(true);
    if (fs.existsSync(out)) expect(fs.lstatSync(out).isFile()).toBe(true);
  });

  it("-o naming a symlink to a regular file: refused, the link and its target as they were", () => {
    const target = path.join(dir, "target.txt");
    fs.writeFileSync(target, "kept");
    const link = path.join(dir, "link-out.xlsx");
    fs.symlinkSync(target, link);
    const run = soilcell(["recalc", input, "-o", link], undefined, 30000);
    refused(run);
    expect(fs.lstatSync(link).isSymbolicLink()).toBe(true);
    expect(fs.readFileSync(target, "utf8")).toBe("kept");
  });

  it("-o naming a dangling symlink: refused, nothing created where it points", () => {
    const link = path.join(dir, "dangling.xlsx");
    const nowhere = path.join(dir, "created-through-link.xlsx");
    fs.symlinkSync(nowhere, link);
    const run = soilcell(["recalc", input, "-o", link], undefined, 30000);
    refused(run);
    expect(fs.lstatSync(link).isSymbolicLink()).toBe(true);
    expect(fs.existsSync(path.join(dir, "created-through-link.xlsx"))).toBe(false);
  });

  it("-o naming a FIFO: refused within the time limit, the FIFO still a FIFO", () => {
    const fifo = path.join(dir, "out.fifo");
    expect(spawnSync("mkfifo", [fifo]).status).toBe(0);
    const run = soilcell(["recalc", input, "-o", fifo], undefined, 20000);
    refused(run);
    expect(fs.lstatSync(fifo).isFIFO()).toBe(true);
  });

  it("-o naming a device node: refused, the node still a device", () => {
    const dev = path.join(dir, "null-device");
    // A private character device like /dev/null (1,3), so nothing outside the test directory is at stake.
    const made = spawnSync("mknod", [dev, "c", "1", "3"]);
    if (made.status !== 0) {
      // eslint-disable-next-line no-console
      console.warn(`SKIPPED -o device node: mknod not permitted here (${made.stderr.toString().trim()})`);
      return;
    }
    const run = soilcell(["recalc", input, "-o", dev], undefined, 20000);
    refused(run);
    expect(fs.lstatSync(dev).isCharacterDevice()).toBe(true);
  });

  it("an input that is a FIFO: refused within the time limit, no output", () => {
    const fifo = path.join(dir, "in.fifo");
    expect(spawnSync("mkfifo", [fifo]).status).toBe(0);
    const out = path.join(dir, "from-fifo.xlsx");
    const run = soilcell(["recalc", fifo, "-o", out], undefined, 20000);
    refused(run);
    expect(fs.existsSync(out)).toBe(false);
  });

  it("/dev/zero as input: refused within the time limit and bounded memory, no output", () => {
    const out = path.join(dir, "from-zero.xlsx");
    const run = soilcell(["recalc", "/dev/zero", "-o", out], undefined, 20000);
    refused(run);
    expect(run.rssMB).toBeLessThan(500);
    expect(fs.existsSync(out)).toBe(false);
  });

  it("input and output that are one file under two paths (a bind mount, else a hard link): refused, the input's bytes unchanged", () => {
    const a = path.join(dir, "mount-a");
    const b = path.join(dir, "mount-b");
    fs.mkdirSync(a);
    fs.mkdirSync(b);
    const file = path.join(a, "book.xlsx");
    fs.copyFileSync(input, file);
    const bytes = fs.readFileSync(file);
    const mounted = spawnSync("mount", ["--bind", a, b]).status === 0;
    let other: string;
    if (mounted) other = path.join(b, "book.xlsx");
    else {
      other = path.join(dir, "hard-link.xlsx");
      fs.linkSync(file, other);
    }
    try {
      const run = soilcell(["recalc", file, "-o", other], undefined, 30000);
      refused(run);
      expect(fs.readFileSync(file).equals(bytes)).toBe(true);
      expect(fs.statSync(other).ino).toBe(fs.statSync(file).ino);
    } finally {
      if (mounted) spawnSync("umount", [b]);
    }
  });
});
