/**
 * `soilcell recalc` over a season: many workbooks, folders and globs, worker threads, the season
 * summary (text, CSV, JSON), exit codes over the whole run, and a CLI that explains itself. Run as
 * a user would, through bin/soilcell.js (needs `npm run build:node`, which `npm test` runs).
 * Workbooks are invented (a made-up lab's samples). Expected SOIL values: Source: IUPAC/CIAAW
 * atomic weights (Ca 40.078, so 200.39 mg/kg Ca = 1 cmol(+)/kg), as in tests/core.
 */
import { spawn, spawnSync } from "child_process";
import fs from "fs";
import path from "path";
import { tempDir } from "../helpers/workbook";
import { c, cachedValues, f, row, xlsxBytes } from "../helpers/xlsx";

const BIN = path.join(__dirname, "../../bin/soilcell.js");
const run = (args: string[], cwd?: string) => spawnSync(process.execPath, [BIN, ...args], { encoding: "utf8", cwd, maxBuffer: 64 * 1024 ** 2 });

/** An invented lab sheet: `n` samples of Ca (mg/kg) with a SOIL.CMOL column and a native column over it. */
function labBook(n: number, caBase: number, bad = false): Buffer {
  const rows = [row(1, c("A1", "Sample"), c("B1", "Ca mg/kg"), c("C1", "Ca cmol(+)/kg"), c("D1", "twice"))];
  for (let i = 0; i < n; i++) {
    const r = i + 2;
    const ca = bad && i === 0 ? c(`B${r}`, "<0.5") : c(`B${r}`, caBase + 200.39 * i);
    rows.push(row(r, c(`A${r}`, `S${i + 1}`), ca, f(`C${r}`, `_xldudf_SOIL_CMOL(B${r},"Ca")`, 0), f(`D${r}`, `C${r}*2`, 0)));
  }
  return xlsxBytes({ sheets: [{ name: "Lab", rows: rows.join("") }] });
}

/** 30 workbooks in two farm folders, two of them broken (not a zip; a bad CRC), one with a lab "<0.5". */
function season(dir: string): void {
  for (let i = 0; i < 30; i++) {
    const farm = path.join(dir, i < 15 ? "north farm" : "south", i % 2 ? "2025" : "");
    fs.mkdirSync(farm, { recursive: true });
    const file = path.join(farm, `paddock-${String(i + 1).padStart(2, "0")}.xlsx`);
    if (i === 7) fs.writeFileSync(file, "this is not a workbook");
    else if (i === 21) {
      const bytes = labBook(3, 200.39);
      // Change one byte of the sheet's compressed data: the part is damaged.
      const at = bytes.indexOf(Buffer.from("xl/worksheets/sheet1.xml")) + 40;
      bytes[at] = (bytes[at] as number) ^ 0xff;
      fs.writeFileSync(file, bytes);
    } else fs.writeFileSync(file, labBook(3, 200.39 * (i + 1), i === 3));
  }
  // Not inputs: an Office lock file, an earlier output, a text file.
  fs.writeFileSync(path.join(dir, "south", "~$paddock-16.xlsx"), "lock");
  fs.writeFileSync(path.join(dir, "south", "paddock-16.recalc.xlsx"), labBook(1, 1));
  fs.writeFileSync(path.join(dir, "south", "notes.txt"), "not a workbook");
}

describe("soilcell recalc over a season folder", () => {
  let dir: string;
  let out: string;
  let r: ReturnType<typeof run>;
  beforeAll(() => {
    dir = tempDir("soilcell-season-");
    season(path.join(dir, "season"));
    out = path.join(dir, "out");
    r = run(["recalc", path.join(dir, "season"), "-o", out, "--jobs", "2", "--summary", path.join(dir, "summary.csv")]);
  }, 120_000);

  it("recalculates the 28 good workbooks, refuses the 2 broken ones with their reasons, exit 2", () => {
    expect(r.status).toBe(2);
    expect(r.stdout).toMatch(/^soilcell recalc: 30 workbooks, 28 recalculated, 2 refused, 1 skipped, in [\d.]+ s on 2 workers$/m);
    expect(r.stdout).toMatch(/paddock-08\.xlsx: .*not an \.xlsx workbook/);
    expect(r.stdout).toMatch(/paddock-22\.xlsx: .*the file is damaged/);
    expect(r.stdout).toMatch(/~\$paddock-16\.xlsx: an Office lock file/);
    expect(r.stdout).toMatch(/estimates/);
  });

  it("mirrors the folder tree under -o, one NAME.recalc.xlsx per good workbook, nothing for the broken ones", () => {
    const written: string[] = [];
    const walk = (d: string) => {
      for (const e of fs.readdirSync(d, { withFileTypes: true })) e.isDirectory() ? walk(path.join(d, e.name)) : written.push(path.relative(out, path.join(d, e.name)));
    };
    walk(out);
    expect(written.length).toBe(28);
    expect(written).toContain(path.join("north farm", "paddock-01.recalc.xlsx"));
    expect(written).toContain(path.join("north farm", "2025", "paddock-02.recalc.xlsx"));
    expect(written).toContain(path.join("south", "2025", "paddock-30.recalc.xlsx"));
    expect(written.some((w) => /paddock-08|paddock-22|~\$/.test(w))).toBe(false);
    // nothing written beside the inputs
    expect(fs.existsSync(path.join(dir, "season", "north farm", "paddock-01.recalc.xlsx"))).toBe(false);
  });

  it("computes every SOIL cell and the native cells over them", async () => {
    const v = await cachedValues(path.join(out, "north farm", "paddock-01.recalc.xlsx"));
    expect(v.get("Lab!C2")).toBeCloseTo(1, 12); // 200.39 mg/kg Ca = 1 cmol(+)/kg (IUPAC weights; source above)
    expect(v.get("Lab!D3")).toBeCloseTo(4, 12);
  });

  it("groups the cells in error by message with file!sheet!cell", () => {
    expect(r.stdout).toMatch(/cells in error: 2, by message:/);
    expect(r.stdout).toMatch(/2 × #VALUE! .*"<0\.5" is not a number/);
    expect(r.stdout).toMatch(/'.*north farm[/\\]2025[/\\]paddock-04\.xlsx'!Lab!C2, '.*north farm[/\\]2025[/\\]paddock-04\.xlsx'!Lab!D2/);
  });

  it("writes the summary as CSV, one row per workbook", () => {
    const lines = fs.readFileSync(path.join(dir, "summary.csv"), "utf8").trim().split(/\r\n/);
    expect(lines[0]).toBe("input,status,reason,output,values_output,formula_cells,computed_cells,kept_cells,soil_formula_cells,cells_in_error,seconds");
    expect(lines.length).toBe(1 + 30 + 1);
    expect(lines.filter((l) => l.includes(",recalculated,")).length).toBe(28);
    expect(lines.filter((l) => l.includes(",refused,")).length).toBe(2);
    expect(lines.filter((l) => l.includes(",skipped,")).length).toBe(1);
    const p4 = lines.find((l) => l.includes("paddock-04.xlsx"))!;
    expect(p4).toMatch(/,recalculated,,.*,6,6,0,3,2,/);
  });

  it("plain progress lines on standard error when it is not a terminal", () => {
    const lines = r.stderr.trim().split("\n");
    expect(lines.length).toBe(30);
    expect(lines.every((l) => /^\[\d+\/30\] /.test(l))).toBe(true);
  });
});

describe("soilcell recalc: inputs, outputs and exit codes", () => {
  it("takes several files, a glob it expands itself, and writes beside each input", () => {
    const dir = tempDir("soilcell-glob-");
    for (const n of ["a", "b", "c"]) fs.writeFileSync(path.join(dir, `${n}.xlsx`), labBook(2, 200.39));
    fs.writeFileSync(path.join(dir, "c.recalc.xlsx"), labBook(1, 1)); // an earlier output: not matched
    const g = run(["recalc", "*.xlsx"], dir);
    expect(g.status).toBe(0);
    expect(g.stdout).toMatch(/3 workbooks, 3 recalculated/);
    for (const n of ["a", "b", "c"]) expect(fs.existsSync(path.join(dir, `${n}.recalc.xlsx`))).toBe(true);
    const two = run(["recalc", path.join(dir, "a.xlsx"), path.join(dir, "b.xlsx"), "-o", path.join(dir, "two")]);
    expect(two.status).toBe(0);
    expect(fs.readdirSync(path.join(dir, "two")).sort()).toEqual(["a.recalc.xlsx", "b.recalc.xlsx"]);
    const none = run(["recalc", path.join(dir, "nothing-*.xlsx")]);
    expect(none.status).toBe(2);
    expect(none.stdout).toMatch(/no \.xlsx or \.xlsm workbook matches this pattern/);
  });

  it("--values writes a values copy beside each workbook: SOIL cells as plain values, other formulas kept", async () => {
    const dir = tempDir("soilcell-values-");
    fs.writeFileSync(path.join(dir, "lab.xlsx"), labBook(2, 200.39));
    const v = run(["recalc", path.join(dir, "lab.xlsx"), "--values"]);
    expect(v.status).toBe(0);
    expect(v.stdout).toMatch(/and the values copy .*lab\.values\.xlsx/);
    const xml = spawnSync("unzip", ["-p", path.join(dir, "lab.values.xlsx"), "xl/worksheets/sheet1.xml"], { encoding: "utf8" }).stdout;
    expect(xml).not.toMatch(/SOIL/);
    expect(xml).toMatch(/<c r="D2"><f>C2\*2<\/f><v>1\.9999999999999998<\/v><\/c>/); // 2 within the last bit of a double
    const props = spawnSync("unzip", ["-p", path.join(dir, "lab.values.xlsx"), "docProps/custom.xml"], { encoding: "utf8" }).stdout;
    expect(props).toMatch(/SOIL results written as values by soilcell \d+\.\d+\.\d+ on \d{4}-\d\d-\d\dT/);
    expect((await cachedValues(path.join(dir, "lab.values.xlsx"))).get("Lab!C3")).toBeCloseTo(2, 12);
  });

  it("exit 1 when cells are in error and nothing is refused; --summary .json holds the whole summary", () => {
    const dir = tempDir("soilcell-exit1-");
    fs.writeFileSync(path.join(dir, "a.xlsx"), labBook(2, 200.39, true));
    fs.writeFileSync(path.join(dir, "b.xlsx"), labBook(2, 200.39));
    const r = run(["recalc", dir, "--summary", path.join(dir, "s.json"), "--jobs", "1"]);
    expect(r.status).toBe(1);
    const s = JSON.parse(fs.readFileSync(path.join(dir, "s.json"), "utf8"));
    expect(s.exitCode).toBe(1);
    expect(s.recalculated).toBe(2);
    expect(s.workers).toBe(1);
    expect(s.errorGroups[0].count).toBe(2);
  });

  it("refuses usage mistakes with the command's help (exit 2)", () => {
    const bad = [["recalc"], ["recalc", "x.xlsx", "-o"], ["recalc", "x.xlsx", "--jobs", "0"], ["recalc", "x.xlsx", "--summary", "s.txt"], ["recalc", "x.xlsx", "--frobnicate"]];
    for (const a of bad) {
      const r = run(a);
      expect({ a, status: r.status }).toEqual({ a, status: 2 });
      expect(r.stderr).toMatch(/usage: soilcell recalc INPUT/);
    }
  });

  it("--json prints only JSON, complete when piped even past 1 MB", async () => {
    const dir = tempDir("soilcell-json-");
    // 4,000 samples each in error: a summary of well over 1 MB.
    const rows = [row(1, c("A1", "Ca"), c("B1", "cmol"))];
    for (let i = 2; i <= 4001; i++) rows.push(row(i, c(`A${i}`, `<0.${i}`), f(`B${i}`, `_xldudf_SOIL_CMOL(A${i},"Ca")`, 0)));
    fs.writeFileSync(path.join(dir, "big.xlsx"), xlsxBytes({ sheets: [{ name: "Lab", rows: rows.join("") }] }));
    fs.copyFileSync(path.join(dir, "big.xlsx"), path.join(dir, "big2.xlsx"));
    const text = await new Promise<{ out: string; code: number | null }>((resolve) => {
      const p = spawn(process.execPath, [BIN, "recalc", dir, "--json"], { stdio: ["ignore", "pipe", "pipe"] });
      let out = "";
      p.stdout.setEncoding("utf8");
      p.stdout.on("data", (d: string) => (out += d));
      p.on("close", (code) => resolve({ out, code }));
    });
    expect(text.code).toBe(1);
    expect(text.out.length).toBeGreaterThan(1024 * 1024);
    const s = JSON.parse(text.out);
    expect(s.cellsInError).toBe(8000);
    expect(s.errorGroups.reduce((a: number, g: { cells: string[] }) => a + g.cells.length, 0)).toBe(8000);
    expect(s.caution).toMatch(/estimates/);
  }, 60_000);
});

describe("progress on a terminal", () => {
  // util-linux's `script` gives the command a terminal, as a person at a shell has.
  const script = spawnSync("sh", ["-c", "command -v script"], { encoding: "utf8" }).stdout.trim();
  (script ? it : it.skip)("draws a bar (workbooks done / total, formula cells, elapsed, time left) and then the summary", () => {
    const dir = tempDir("soilcell-tty-");
    for (const n of ["a", "b", "c"]) fs.writeFileSync(path.join(dir, `${n}.xlsx`), labBook(2, 200.39));
    const log = path.join(dir, "tty.log");
    spawnSync(script, ["-qfc", `${process.execPath} ${BIN} recalc ${dir} --jobs 2`, log], { encoding: "utf8" });
    const seen = fs.readFileSync(log, "utf8");
    expect(seen).toMatch(/recalc =+ 3\/3 workbooks \| 12 formula cells \| \d+s elapsed \| about \d+s left/);
    expect(seen).toMatch(/soilcell recalc: 3 workbooks, 3 recalculated, in [\d.]+ s on 2 workers/);
    expect(seen).not.toMatch(/\[1\/3\]/); // no plain progress lines on a terminal
  });
});

describe("a CLI that explains itself", () => {
  it("soilcell help lists the commands; help COMMAND and COMMAND --help show one", () => {
    const h = run(["help"]);
    expect(h.status).toBe(0);
    for (const cmd of ["recalc", "eval", "list", "help"]) expect(h.stdout).toMatch(new RegExp(`^  ${cmd} +\\S`, "m"));
    for (const cmd of ["recalc", "eval", "list"]) {
      const a = run(["help", cmd]);
      const b = run([cmd, "--help"]);
      expect(a.status).toBe(0);
      expect(a.stdout).toBe(b.stdout);
      expect(a.stdout).toMatch(new RegExp(`^usage: soilcell ${cmd}`));
    }
    expect(run(["-h"]).stdout).toBe(h.stdout);
    expect(run(["help", "nope"]).status).toBe(2);
    expect(run([]).status).toBe(2);
  });

  it("soilcell list NAME shows one function with its arguments, their descriptions and its source", () => {
    const r = run(["list", "soil.limebuffer"]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^SOIL\.LIMEBUFFER\(buffer_ph, target_ph, calibration, \[soil_ph\], \[depth_cm\], \[unit\]\)/);
    expect(r.stdout).toMatch(/^ {2}calibration +\S/m);
    expect(r.stdout).toMatch(/Method and source:\n {2}.*Sikora/);
    const j = JSON.parse(run(["list", "CEC", "--json"]).stdout);
    expect(j.parameters.map((p: { name: string }) => p.name)).toEqual(["ca", "mg", "k", "na", "unit", "acidity", "bulk_density"]);
    const none = run(["list", "SOIL.NOPE"]);
    expect(none.status).toBe(2);
    expect(none.stderr).toMatch(/there is no function SOIL\.NOPE; the functions are SOIL\./);
  });

  it("eval prints every element of a spilled result, an error in its own row", () => {
    const r = run(["eval", '=SOIL.LABVALUE({"n.d.";1;"<0.05"})']);
    expect(r.status).toBe(1);
    const lines = r.stdout.trim().split("\n");
    expect(lines.length).toBe(3);
    expect(lines[0]).toMatch(/^#VALUE! value "n\.d\." is below detection/);
    expect(lines[1]).toBe("1");
    expect(lines[2]).toMatch(/^#VALUE! value "<0\.05" is below detection/);
  });

  it("eval explains a formula that needs a workbook, and a ';' separator", () => {
    const cells = run(["eval", '=SOIL.CMOL(A1,"Ca")']);
    expect(cells.status).toBe(1);
    expect(cells.stdout).toMatch(/eval has no workbook/);
    const semi = run(["eval", '=SOIL.CMOL(200.39;"Ca")']);
    expect(semi.status).toBe(1);
    expect(semi.stdout).toMatch(/";" is not an argument separator .*use ","/);
  });
});
