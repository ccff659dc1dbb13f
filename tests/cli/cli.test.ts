/**
 * The soilcell command, run as a user would (needs `npm run build:node`, which `npm test` runs).
 * Expected values: Source as in tests/core (UNIT-16 layer mass: 19.5 kg/ha; IUPAC/CIAAW weights:
 * 100 P2O5 is 100 × 2P / P2O5 = 100 × 61.948 / 141.943 = 43.6429 P, derived from the abridged
 * weights, from memory; Virginia Tech SPES-201NP, seen, prints the rounded factor 0.4365).
 */
import { spawnSync } from "child_process";
import fs from "fs";
import path from "path";
import { tempDir, writeWorkbook } from "../helpers/workbook";

const BIN = path.join(__dirname, "../../bin/soilcell.js");
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { encoding: "utf8" });

describe("soilcell eval", () => {
  it("prints the value and exits 0", () => {
    const r = run("eval", '=SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)');
    expect(r.stdout.trim()).toBe("19.5");
    expect(r.status).toBe(0);
  });
  it("prints the error and message and exits non-zero", () => {
    const r = run("eval", '=SOIL.CMOL(100,"Fe")');
    expect(r.stdout.trim()).toBe('#VALUE! unknown ion "Fe"; use Ca, Mg, K, Na, NH4, H, Al or Mn');
    expect(r.status).toBe(1);
  });
  it("--json gives machine-readable output", () => {
    const r = run("eval", "--json", '=SOIL.OXIDE(100,"P2O5","P")');
    expect(JSON.parse(r.stdout).value).toBeCloseTo(43.6429, 4);
  });
  it("spilled results print as rows", () => {
    const r = run("eval", '=SOIL.CMOL({200.39;400.78},"Ca")');
    expect(r.stdout.trim().split("\n").map(Number).map((n) => Math.round(n * 1e6) / 1e6)).toEqual([1, 2]);
  });
  it("no formula is a usage error (exit 2)", () => {
    expect(run("eval").status).toBe(2);
    expect(run("bogus").status).toBe(2);
  });
});

describe("soilcell list", () => {
  it("lists every function with its arguments and source", () => {
    const r = run("list", "--json");
    const listed = JSON.parse(r.stdout) as { functions: { name: string; about: string }[]; tables: Record<string, { source: string }[]> };
    const rows = listed.functions;
    expect(rows.map((x) => x.name)).toEqual(expect.arrayContaining(["SOIL.CONVERT", "SOIL.CMOL", "SOIL.MGKG", "SOIL.OXIDE", "SOIL.ABOUT", "SOIL.VERSION"]));
    expect(rows.find((x) => x.name === "SOIL.CONVERT")!.about).toMatch(/NIST/);
    // every reference table row names its source
    for (const kind of ["lime", "sufficiency", "removal"]) {
      expect(listed.tables[kind]!.length).toBeGreaterThan(0);
      for (const t of listed.tables[kind]!) expect(t.source.length).toBeGreaterThan(5);
    }
  });
  it("shows each sufficiency table with its source and its edge rule", () => {
    const r = run("list");
    expect(r.status).toBe(0);
    const lines = r.stdout.split("\n");
    const at = lines.findIndex((l) => l.startsWith("  sare-bray1-p:"));
    expect(at).toBeGreaterThan(0);
    expect(lines[at + 1]).toMatch(/^ {6}edge rule: .*31 High/);
    expect(lines[at + 2]).toMatch(/^ {6}source: Magdoff/);
  });
});

describe("soilcell recalc", () => {
  it("writes beside the input, prints a summary and the caution, refuses to overwrite", async () => {
    const dir = tempDir();
    const input = await writeWorkbook(path.join(dir, "in.xlsx"), (wb) => {
      const ws = wb.addWorksheet("S");
      ws.getCell("A1").value = 400.78;
      ws.getCell("B1").value = { formula: 'SOIL.CMOL(A1,"Ca")' } as never;
    });
    const r = run("recalc", input);
    expect(r.status).toBe(0);
    expect(fs.existsSync(path.join(dir, "in.recalc.xlsx"))).toBe(true);
    expect(r.stdout).toMatch(/1 formula cells recalculated \(1 SOIL formulas/);
    expect(r.stdout).toMatch(/0 cells in error/);
    expect(r.stdout).toMatch(/estimates/);
    const again = run("recalc", input, "-o", input);
    expect(again.status).toBe(2);
    expect(again.stderr).toMatch(/refusing to write over the input/);
    const notXlsx = path.join(dir, "x.xlsx");
    fs.writeFileSync(notXlsx, "hello");
    const bad = run("recalc", notXlsx);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/not an .xlsx workbook/);
    expect(bad.stderr).not.toMatch(/at .*\.js:\d+/); // no stack trace
  });
});

