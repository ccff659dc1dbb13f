/**
 * `soilcell recalc` over a season, run as a user runs it (the built command, from a working
 * folder, output piped): folders, patterns, mixed inputs, -o DIR/ mirroring the tree, lock files
 * and earlier outputs skipped, one broken workbook never stopping the others, the summary (text,
 * JSON, CSV), exit codes over the whole run, and JSON of any size arriving whole through a pipe.
 *
 * Workbooks are generated (tests/helpers/season.ts): invented Ca values of 400.78 mg/kg times the
 * row number; SOIL.CMOL gives 2 cmol(+)/kg per 400.78 mg/kg (Source: IUPAC/CIAAW standard atomic
 * weight of Ca, 40.078, so 200.39 mg/kg per cmol(+)/kg, as tests/core).
 */
import fs from "fs";
import path from "path";
import { cachedValues } from "../helpers/xlsx";
import { tempDir } from "../helpers/workbook";
import { farmBook, filesUnder, put, soilcellIn } from "../helpers/season";

interface Summary {
  totals: { workbooks: number; recalculated: number; refused: number; failed: number; computedCells: number; soilFormulaCells: number; cellsInError: number; withErrors: number };
  files: { input: string; status: string; reason: string; output: string; valuesCopy: string; cellsInError: number; formulaCells: number }[];
  errorGroups: { error: string; message: string; count: number; workbooks: number; cells: string[]; formula: string }[];
  errors: { file: string; sheet: string; cell: string; error: string; message: string; formula: string }[];
  exitCode: number;
  caution: string;
}

/** 28 good workbooks in a tree of folders, two broken ones, and what must be skipped. */
function makeSeason(root: string): { good: string[]; broken: string[] } {
  const good: string[] = [];
  for (let i = 1; i <= 28; i++) {
    const folder = i <= 10 ? "north" : i <= 20 ? path.join("south", "paddocks") : "";
    const name = path.join("season", folder, `farm-${String(i).padStart(2, "0")}.xlsx`);
    put(path.join(root, name), farmBook(5, i % 7 === 0 ? 1 : 0));
    good.push(name);
  }
  const broken = [path.join("season", "north", "broken-text.xlsx"), path.join("season", "south", "broken-truncated.xlsx")];
  put(path.join(root, broken[0]!), "this is not a workbook\n");
  put(path.join(root, broken[1]!), farmBook(40).subarray(0, 300));
  // Never inputs: an Office lock file, an earlier output, the values copy of one, a macOS
  // companion file, a hidden folder, and files that are not workbooks.
  put(path.join(root, "season", "north", "~$farm-01.xlsx"), "lock");
  put(path.join(root, "season", "north", "farm-01.recalc.xlsx"), farmBook(1));
  put(path.join(root, "season", "north", "farm-01.recalc.values.xlsx"), farmBook(1));
  put(path.join(root, "season", "._farm-21.xlsx"), "AppleDouble");
  put(path.join(root, "season", ".cache", "old.xlsx"), "cache");
  put(path.join(root, "season", "notes.csv"), "a,b\n");
  put(path.join(root, "season", "farm-list.xls"), "old binary format");
  return { good: good.sort(), broken };
}

const recalcName = (p: string) => p.replace(/\.xlsx$/, ".recalc.xlsx");

describe("a season folder of 30 generated workbooks, two of them broken", () => {
  let root: string;
  let good: string[];
  let broken: string[];
  let run: ReturnType<typeof soilcellIn>;

  beforeAll(() => {
    root = tempDir("soilcell-season-");
    ({ good, broken } = makeSeason(root));
    run = soilcellIn(root, "recalc", "season", "-o", "out/", "--summary", "season.csv");
  });

  it("exits 2: some workbook was refused", () => {
    expect(run.status).toBe(2);
  });

  it("writes the 28 good outputs under out/, mirroring the folder tree, and nothing for the broken ones", () => {
    expect(filesUnder(path.join(root, "out"))).toEqual(good.map((g) => recalcName(path.relative("season", g))).sort());
    expect(filesUnder(path.join(root, "out")).some((f) => /broken/.test(f))).toBe(false);
  });

  it("computes every workbook (spot check: 400.78 mg/kg Ca is 2 cmol(+)/kg)", async () => {
    const values = await cachedValues(path.join(root, "out", "north", "farm-03.recalc.xlsx"));
    expect(values.get("Lab!B2") as number).toBeCloseTo(2, 12);
    expect(values.get("Lab!B6") as number).toBeCloseTo(10, 12);
  });

  it("says which workbooks were refused and why, one line each, and summarises the season", () => {
    const refusals = run.stderr.split("\n").filter((l) => l.startsWith("soilcell: "));
    expect(refusals.sort()).toEqual([
      `soilcell: ${broken[0]}: not an .xlsx workbook (the file is not a zip package)`,
      expect.stringMatching(new RegExp(`^soilcell: ${broken[1]!.replace(/[/\\.]/g, "\\$&")}: .*(damaged|truncated)`)),
    ]);
    expect(run.stdout).toMatch(/^28 of 30 workbooks recalculated, 2 refused, in \d+\.\d s \(\d+ jobs?; /m);
    expect(run.stdout).toMatch(/^ {2}144 formula cells computed \(144 SOIL formulas, 0 spilled cells\)/m);
    expect(run.stdout).toMatch(/^ {2}4 cells in error, in 4 workbooks$/m);
    expect(run.stdout).toContain("not recalculated (nothing written for them):");
    expect(run.stdout).toContain(`  ${broken[0]}: not an .xlsx workbook`);
    // Cells in error grouped by message, each as file!sheet!cell.
    expect(run.stdout).toContain('cells in error, by message (1 kind):\n  #VALUE! unknown ion "Xx"; use Ca, Mg, K, Na, NH4, H, Al or Mn\n    4 cells in 4 workbooks, e.g. =SOIL.CMOL(A7,"Xx")');
    expect(run.stdout).toContain(`${path.join("season", "north", "farm-07.xlsx")}!Lab!B7`);
    expect(run.stdout.trimEnd().split("\n").pop()).toMatch(/^Results are estimates/);
  });

  it("prints one plain progress line per workbook when standard error is not a terminal", () => {
    // [done/total]: the broken two are counted as they are refused, in their own lines.
    const lines = run.stderr.split("\n").filter((l) => /^\[\d+\/30\] /.test(l));
    expect(lines).toHaveLength(28);
    expect(lines.join("\n")).toMatch(/\[\d+\/30\] season\/farm-22\.xlsx: 5 formula cells, 0 in error, \d+\.\d s/);
  });

  it("--summary FILE.csv writes one row per workbook, lock files, hidden files and earlier outputs not among them", () => {
    const rows = fs.readFileSync(path.join(root, "season.csv"), "utf8").trimEnd().split("\r\n");
    expect(rows[0]).toBe("file,status,reason,output,values_copy,sheets,formula_cells,computed_cells,kept_cells,soil_formula_cells,spilled_cells,cells_in_error,without_value,seconds");
    expect(rows).toHaveLength(31);
    const byFile = new Map(rows.slice(1).map((r) => [r.split(",")[0], r]));
    expect([...byFile.keys()].sort()).toEqual([...good, ...broken].sort());
    expect(byFile.get(path.join("season", "farm-22.xlsx"))).toMatch(/^season\/farm-22\.xlsx,recalculated,,out\/farm-22\.recalc\.xlsx,,1,5,5,0,5,0,0,0,\d+(\.\d+)?$/);
    expect(byFile.get(path.join("season", "farm-21.xlsx"))).toMatch(/^season\/farm-21\.xlsx,recalculated,,out\/farm-21\.recalc\.xlsx,,1,6,6,0,6,0,1,0,/);
    // The last column is the seconds spent, rounded to 1 ms: a refusal on a loaded machine can take a few.
    const refusal = byFile.get(broken[0]!)!;
    expect(refusal.replace(/,\d+(\.\d+)?$/, ",<seconds>")).toBe(`${broken[0]},refused,not an .xlsx workbook (the file is not a zip package),,,0,0,0,0,0,0,0,0,<seconds>`);
    expect(Number(refusal.split(",").pop())).toBeLessThan(5);
  });

  it("the same season in one job writes the same bytes (parallel runs change nothing in the files)", () => {
    const serial = soilcellIn(root, "recalc", "season", "-o", "out-serial/", "--jobs", "1");
    expect(serial.status).toBe(2);
    for (const f of filesUnder(path.join(root, "out"))) {
      expect({ f, same: fs.readFileSync(path.join(root, "out", f)).equals(fs.readFileSync(path.join(root, "out-serial", f))) }).toEqual({ f, same: true });
    }
  });

  it("--json prints the whole summary and nothing else; outputs go beside the inputs without -o", () => {
    const r = soilcellIn(root, "recalc", "season", "--json");
    expect(r.status).toBe(2);
    expect(r.stderr).toBe("");
    const s = JSON.parse(r.stdout) as Summary;
    expect(s.exitCode).toBe(2);
    expect(s.totals).toMatchObject({ workbooks: 30, recalculated: 28, refused: 2, failed: 0, computedCells: 144, cellsInError: 4, withErrors: 4 });
    expect(s.files.find((f) => f.input === good[5])!.output).toBe(recalcName(good[5]!));
    for (const g of good) expect(fs.existsSync(path.join(root, recalcName(g)))).toBe(true);
    expect(s.errorGroups).toEqual([
      { error: "#VALUE!", message: 'unknown ion "Xx"; use Ca, Mg, K, Na, NH4, H, Al or Mn', count: 4, workbooks: 4, cells: expect.arrayContaining([`${path.join("season", "north", "farm-07.xlsx")}!Lab!B7`]), formula: '=SOIL.CMOL(A7,"Xx")' },
    ]);
    expect(s.caution).toMatch(/estimates/);
    // A second run finds the outputs of the first beside the inputs and skips them.
    const again = JSON.parse(soilcellIn(root, "recalc", "season", "--json").stdout) as Summary;
    expect(again.totals.workbooks).toBe(30);
  });
});

describe("exit codes over the whole run", () => {
  it("0 when every workbook is clean, 1 when some cell is in error", () => {
    const root = tempDir("soilcell-exit-");
    for (const n of [1, 2, 3]) put(path.join(root, "clean", `f${n}.xlsx`), farmBook(3));
    expect(soilcellIn(root, "recalc", "clean").status).toBe(0);
    put(path.join(root, "clean", "f4.xlsx"), farmBook(3, 2));
    const r = soilcellIn(root, "recalc", "clean", "--json");
    expect(r.status).toBe(1);
    expect((JSON.parse(r.stdout) as Summary).totals.cellsInError).toBe(2);
  });

  it("2 when there is nothing to recalculate, saying why", () => {
    const root = tempDir("soilcell-empty-");
    fs.mkdirSync(path.join(root, "empty"));
    put(path.join(root, "empty", "~$open.xlsx"), "lock");
    const r = soilcellIn(root, "recalc", "empty");
    expect(r.status).toBe(2);
    expect(r.stderr.trim()).toBe("soilcell: no .xlsx or .xlsm workbooks in the folder empty (soilcell's own .recalc. outputs and ~$ lock files are skipped)");
  });
});

describe("inputs: patterns, mixed arguments, -o", () => {
  let root: string;
  beforeAll(() => {
    root = tempDir("soilcell-glob-");
    makeSeason(root);
  });

  it("a quoted pattern is expanded by soilcell (** across folders), skipping lock files and outputs", () => {
    const r = soilcellIn(root, "recalc", "season/**/*.xlsx", "-o", "g/", "--json");
    const s = JSON.parse(r.stdout) as Summary;
    expect(s.totals.workbooks).toBe(30);
    expect(s.files.map((f) => f.input).filter((f) => /~\$|\.recalc\.|\._|\.cache/.test(f))).toEqual([]);
    // The tree under -o mirrors the pattern's fixed folder (season/).
    expect(fs.existsSync(path.join(root, "g", "south", "paddocks", "farm-11.recalc.xlsx"))).toBe(true);
  });

  it("a pattern within one folder takes that folder's workbooks only", () => {
    const s = JSON.parse(soilcellIn(root, "recalc", "season/north/farm-0*.xlsx", "-o", "n/", "--json").stdout) as Summary;
    expect(s.files.map((f) => f.input)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9].map((i) => path.join("season", "north", `farm-0${i}.xlsx`)));
    expect(filesUnder(path.join(root, "n"))).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9].map((i) => `farm-0${i}.recalc.xlsx`));
  });

  it("a pattern that matches nothing is refused with its reason (exit 2)", () => {
    const r = soilcellIn(root, "recalc", "season/*.xlsb");
    expect(r.status).toBe(2);
    expect(r.stderr.trim()).toBe("soilcell: no .xlsx or .xlsm workbook matches season/*.xlsb");
  });

  it("files, folders and patterns mixed: each workbook once, whichever way it was named", () => {
    const s = JSON.parse(soilcellIn(root, "recalc", "season/north", "season/north/farm-02.xlsx", "./season/north/farm-0[12].xlsx", "season/farm-21.xlsx", "-o", "mixed/", "--json").stdout) as Summary;
    const inputs = s.files.map((f) => f.input);
    expect(inputs).toHaveLength(12); // 10 farms + 1 broken in north, and farm-21
    expect(new Set(inputs).size).toBe(12);
    expect(inputs).toContain(path.join("season", "farm-21.xlsx"));
  });

  it("-o FILE with several workbooks is a usage error that says to give a folder", () => {
    const r = soilcellIn(root, "recalc", "season/north", "-o", "all.xlsx");
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^soilcell recalc: -o all\.xlsx names one output file, but there are 11 workbooks; give a folder \(-o all\/\)/);
    expect(fs.existsSync(path.join(root, "all.xlsx"))).toBe(false);
  });

  it("-o naming a folder that exists (no trailing slash) writes under it; -o FILE with one workbook names the file", () => {
    fs.mkdirSync(path.join(root, "existing"));
    expect(soilcellIn(root, "recalc", "season/farm-22.xlsx", "-o", "existing").status).toBe(0);
    expect(filesUnder(path.join(root, "existing"))).toEqual(["farm-22.recalc.xlsx"]);
    expect(soilcellIn(root, "recalc", "season/farm-22.xlsx", "-o", "client.xlsx").status).toBe(0);
    expect(fs.existsSync(path.join(root, "client.xlsx"))).toBe(true);
  });

  it("two workbooks that would write one output: the second is refused, the first written", () => {
    put(path.join(root, "a", "same.xlsx"), farmBook(2));
    put(path.join(root, "b", "same.xlsx"), farmBook(2));
    const r = soilcellIn(root, "recalc", "a", "b", "-o", "clash/", "--json");
    const s = JSON.parse(r.stdout) as Summary;
    expect(r.status).toBe(2);
    expect(s.files.find((f) => f.input === path.join("b", "same.xlsx"))!.reason).toMatch(/^refusing to write clash\/same\.recalc\.xlsx: it is written by another workbook of this run/);
    expect(filesUnder(path.join(root, "clash"))).toEqual(["same.recalc.xlsx"]);
  });

  it("--values writes the values copies beside the outputs, and a later run skips them", () => {
    const r = soilcellIn(root, "recalc", "season/south", "--values", "-o", "v/", "--json");
    const s = JSON.parse(r.stdout) as Summary;
    expect(s.totals.recalculated).toBe(10);
    expect(filesUnder(path.join(root, "v")).filter((f) => f.endsWith(".recalc.values.xlsx"))).toHaveLength(10);
    expect(s.files.find((f) => f.status === "recalculated")!.valuesCopy).toMatch(/^v\/paddocks\/farm-\d\d\.recalc\.values\.xlsx$/);
    const again = JSON.parse(soilcellIn(root, "recalc", "v", "--json").stdout) as Summary;
    expect(again.totals.workbooks).toBe(1); // only the folder's refusal: no workbook of its own there
    expect(again.files[0]!.reason).toMatch(/^no \.xlsx or \.xlsm workbooks in the folder v/);
  });

  it("--summary with another extension, and --jobs that is not a whole number, are usage errors", () => {
    expect(soilcellIn(root, "recalc", "season", "--summary", "s.txt").stderr).toMatch(/--summary writes a \.csv or a \.json file/);
    const r = soilcellIn(root, "recalc", "season", "--jobs", "0");
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--jobs takes a whole number of 1 or more/);
  });

  it("--summary FILE.json holds what --json prints", () => {
    soilcellIn(root, "recalc", "season/north", "-o", "sj/", "--summary", "s.json");
    const s = JSON.parse(fs.readFileSync(path.join(root, "s.json"), "utf8")) as Summary;
    expect(s.totals.workbooks).toBe(11);
    expect(s.files).toHaveLength(11);
  });
});

describe("--json through a pipe arrives whole, however large", () => {
  it("over 1 MB of JSON (10,000 cells in error) parses whole", () => {
    const root = tempDir("soilcell-big-json-");
    put(path.join(root, "errors.xlsx"), farmBook(10, 10_000));
    const r = soilcellIn(root, "recalc", "errors.xlsx", "--json");
    expect(r.status).toBe(1);
    expect(Buffer.byteLength(r.stdout)).toBeGreaterThan(1024 * 1024);
    const s = JSON.parse(r.stdout) as Summary;
    expect(s.errors).toHaveLength(10_000);
    expect(s.errorGroups[0]!.count).toBe(10_000);
    expect(s.errors[9_999]!.cell).toBe("B10011");
  });
});
