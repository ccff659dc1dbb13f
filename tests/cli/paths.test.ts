/**
 * The command's less travelled paths, through the command as a person runs it (bin/soilcell.js):
 * help, the plain-text list, usage errors, a missing input, the cap on listed cell errors and an
 * unexpected failure (exit 3). Workbook contents are invented; values are not checked here.
 */
import { spawnSync } from "child_process";
import fs from "fs";
import path from "path";
import { CAUTION } from "../../src/core/about";
import { tempDir, writeWorkbook } from "../helpers/workbook";

const BIN = path.join(__dirname, "../../bin/soilcell.js");
const run = (args: string[], nodeArgs: string[] = []) => spawnSync(process.execPath, [...nodeArgs, BIN, ...args], { encoding: "utf8" });
const noStack = (text: string) => expect(text).not.toMatch(/\n\s+at .*:\d+:\d+/);

describe("help", () => {
  it.each([["help"], ["-h"], ["--help"]])("`soilcell %s` prints the usage on stdout and exits 0", (word) => {
    const r = run([word]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^soilcell \d+\.\d+\.\d+: .*\n\nusage: soilcell COMMAND/);
    for (const c of ["eval", "recalc", "report", "list", "help"]) expect(r.stdout).toMatch(new RegExp(`^ {2}${c} +\\S`, "m"));
    expect(r.stderr).toBe("");
  });
  it("no command at all is a usage error: the usage on stderr, exit 2, nothing on stdout", () => {
    const r = run([]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/\nusage: soilcell COMMAND/);
    expect(r.stdout).toBe("");
  });
});

describe("plain-text list", () => {
  const r = run(["list"]);
  const lines = r.stdout.split("\n");
  it("exits 0 and shows each function with its arguments, optional ones in brackets, then its summary", () => {
    expect(r.status).toBe(0);
    const at = lines.indexOf("SOIL.CONVERT(value, from_unit, to_unit, [depth_cm], [bulk_density])");
    expect(at).toBeGreaterThanOrEqual(0);
    expect(lines[at + 1]).toMatch(/^ {4}Converts a value between units/);
    expect(lines).toContain("SOIL.VERSION()");
  });
  it("lists the lime calibrations with unit, depth and shipping, the removal crops with their source, and ends with the caution", () => {
    const lime = lines.indexOf("Lime calibrations (SOIL.LIMEBUFFER):");
    expect(lime).toBeGreaterThan(0);
    expect(lines.slice(lime).find((l) => /^ {2}SMP /.test(l))).toMatch(/NOT SHIPPED \(answers #N\/A\)/);
    expect(lines.slice(lime).find((l) => /^ {2}SIKORA-OR2025 /.test(l))).toMatch(/ton\/ac, 15\.24 cm {2}— /);
    const removal = lines.indexOf("Removal coefficients (SOIL.REMOVAL):");
    expect(removal).toBeGreaterThan(lime);
    expect(lines.slice(removal).find((l) => l.startsWith("  corn "))).toMatch(/: N, P2O5, K2O, Ca, Mg, S {2}— .*OMAFA/);
    expect(r.stdout.trimEnd().endsWith(CAUTION)).toBe(true);
  });
});

describe("recalc usage errors and a missing input", () => {
  let dir: string;
  let input: string;
  beforeAll(async () => {
    dir = tempDir();
    input = await writeWorkbook(path.join(dir, "in.xlsx"), (wb) => {
      wb.addWorksheet("S").getCell("A1").value = { formula: 'SOIL.CMOL(400.78,"Ca")' } as never;
    });
  });
  it.each([
    ["-o without a value", ["-o"]],
    ["--output without a value", ["--output"]],
    ["an unknown option", ["--frobnicate"]],
  ])("%s: the usage on stderr, exit 2, nothing written", (_what, extra) => {
    const r = run(["recalc", input, ...extra]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^soilcell recalc: .*\nusage:\n {2}soilcell recalc /);
    expect(r.stdout).toBe("");
    expect(fs.readdirSync(dir)).toEqual(["in.xlsx"]);
  });
  it("no input at all: usage, exit 2", () => {
    const r = run(["recalc"]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/\nusage:\n {2}soilcell recalc /);
  });
  it("an input that does not exist: one plain line naming it and why, exit 2, nothing written", () => {
    const missing = path.join(dir, "no-such-season.xlsx");
    const r = run(["recalc", missing]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim()).toBe(`soilcell: cannot read ${missing}: ENOENT`);
    expect(r.stdout).toBe("");
    expect(fs.existsSync(path.join(dir, "no-such-season.recalc.xlsx"))).toBe(false);
  });
});

describe("the list of cells in error stops at 50", () => {
  let dir: string;
  let input: string;
  const ERRORS = 53;
  beforeAll(async () => {
    dir = tempDir();
    input = await writeWorkbook(path.join(dir, "errors.xlsx"), (wb) => {
      const ws = wb.addWorksheet("Lab");
      for (let r = 1; r <= ERRORS; r++) ws.getCell(r, 1).value = { formula: `SOIL.CMOL(${r},"Fe")` } as never; // unknown ion: #VALUE!
      ws.getCell(ERRORS + 1, 1).value = { formula: 'SOIL.CMOL(400.78,"Ca")' } as never;
    });
  });
  it("shows the first 50 and says how many more, exit 1", () => {
    const r = run(["recalc", input, "-o", path.join(dir, "out.xlsx")]);
    expect(r.status).toBe(1);
    const listed = r.stdout.split("\n").filter((l) => /^ {2}Lab!A\d+ {2}#VALUE!/.test(l));
    expect(listed).toHaveLength(50);
    expect(listed[0]).toMatch(/^ {2}Lab!A1 {2}#VALUE! unknown ion "Fe"/);
    expect(listed[49]).toMatch(/^ {2}Lab!A50 /);
    expect(r.stdout).toContain(`${ERRORS} cells in error`);
    expect(r.stdout).toContain(`  … and ${ERRORS - 50} more (use --json or --summary FILE.json for the full list)`);
  });
  it("exactly 50 errors: all shown, no 'more' line", async () => {
    const fifty = await writeWorkbook(path.join(dir, "fifty.xlsx"), (wb) => {
      const ws = wb.addWorksheet("Lab");
      for (let r = 1; r <= 50; r++) ws.getCell(r, 1).value = { formula: `SOIL.CMOL(${r},"Fe")` } as never;
    });
    const r = run(["recalc", fifty, "-o", path.join(dir, "fifty-out.xlsx")]);
    expect(r.stdout.split("\n").filter((l) => /^ {2}Lab!A\d+ {2}#VALUE!/.test(l))).toHaveLength(50);
    expect(r.stdout).not.toMatch(/… and \d+ more/);
  });
  it("--json lists every one of them", () => {
    const r = run(["recalc", input, "-o", path.join(dir, "out-json.xlsx"), "--json"]);
    expect(r.status).toBe(1);
    const summary = JSON.parse(r.stdout) as { errors: { cell: string }[] };
    expect(summary.errors.map((e) => e.cell)).toEqual(Array.from({ length: ERRORS }, (_, i) => `A${i + 1}`));
  });
});

describe("exit 3: a failure the command does not expect", () => {
  it("says so in one line without a stack trace, and writes no output", async () => {
    const dir = tempDir();
    const input = await writeWorkbook(path.join(dir, "in.xlsx"), (wb) => {
      wb.addWorksheet("S").getCell("A1").value = { formula: 'SOIL.CMOL(400.78,"Ca")' } as never;
    });
    const r = run(["recalc", input], ["-r", path.join(__dirname, "fault-hook.js")]);
    expect(r.status).toBe(3);
    expect(r.stderr).toContain("soilcell: unexpected failure: injected fault for the test");
    noStack(r.stderr);
    expect(fs.readdirSync(dir)).toEqual(["in.xlsx"]);
  });
  it("a copy of the command without its compiled sources says how to build them", () => {
    const dir = tempDir();
    fs.mkdirSync(path.join(dir, "bin"));
    fs.copyFileSync(BIN, path.join(dir, "bin", "soilcell.js"));
    const r = spawnSync(process.execPath, [path.join(dir, "bin", "soilcell.js"), "list"], { encoding: "utf8" });
    expect(r.status).toBe(3);
    expect(r.stderr.trim()).toBe("soilcell: not built yet; run `npm run build:node` in the soilcell folder first");
  });
});
