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
import { tempDir, writeWorkbook } from "../helpers/workbook";
import { BIN, Run, messages, soilcell } from "./cli-run";
import { CASES, FIXTURES, caseProblems } from "./real-world-cases";

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
    const problems = await caseProblems(c, run, input, output);
    expect({ file: c.file, problems }).toEqual({ file: c.file, problems: [] });
  }, 180000);
});

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
