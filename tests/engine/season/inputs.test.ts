/**
 * A season's inputs (src/engine/season/inputs.ts): what a folder or a pattern yields, where each
 * output goes, and what is refused before anything runs. File contents are invented (only names
 * matter here; nothing is recalculated).
 */
import fs from "fs";
import path from "path";
import { InputError, isSeasonWorkbook, seasonInputs, valuesCopyPath } from "../../../src/engine/season/inputs";
import { tempDir } from "../../helpers/workbook";

const touch = (p: string) => {
  fs.mkdirSync(path.dirname(p), { recursive: true });
  fs.writeFileSync(p, "x");
  return p;
};

describe("which files a folder or a pattern yields", () => {
  it.each([
    ["farm.xlsx", true],
    ["FARM.XLSM", true],
    ["farm.xls", false],
    ["farm.xlsb", false],
    ["farm.csv", false],
    ["~$farm.xlsx", false],
    ["farm.recalc.xlsx", false],
    ["farm.recalc.values.xlsx", false],
    ["farm.RECALC.xlsm", false],
    ["farm.recalculated.xlsx", true],
    [".farm.xlsx.0123abcd.partial", false],
    ["._farm.xlsx", false],
  ])("%s → %s", (name, yes) => {
    expect(isSeasonWorkbook(name)).toBe(yes);
  });

  it("the values copy is named beside its output, keeping the extension", () => {
    expect(valuesCopyPath(path.join("out", "a.recalc.xlsx"))).toBe(path.join("out", "a.recalc.values.xlsx"));
    expect(valuesCopyPath("client.xlsm")).toBe("client.values.xlsm");
  });
});

describe("seasonInputs", () => {
  let dir: string;
  const rel = (p: string) => path.relative(dir, p);
  beforeAll(() => {
    dir = tempDir("soilcell-inputs-");
    touch(path.join(dir, "s", "b.xlsx"));
    touch(path.join(dir, "s", "a.xlsm"));
    touch(path.join(dir, "s", "deep", "er", "c.xlsx"));
    touch(path.join(dir, "s", "~$b.xlsx"));
    touch(path.join(dir, "s", ".hidden", "d.xlsx"));
    touch(path.join(dir, "elsewhere", "e.xlsx"));
    fs.symlinkSync(path.join(dir, "elsewhere"), path.join(dir, "s", "linked-folder"));
    fs.symlinkSync(path.join(dir, "elsewhere", "e.xlsx"), path.join(dir, "s", "linked-file.xlsx"));
  });

  it("a folder: its workbooks and its subfolders', sorted; hidden and linked folders not entered, linked files taken", () => {
    const r = seasonInputs([path.join(dir, "s")]);
    expect(r.items.map((i) => rel(i.input))).toEqual(["s/a.xlsm", "s/b.xlsx", "s/deep/er/c.xlsx", "s/linked-file.xlsx"].map((p) => path.normalize(p)));
    expect(r.items.map((i) => rel(i.output))).toEqual(["s/a.recalc.xlsm", "s/b.recalc.xlsx", "s/deep/er/c.recalc.xlsx", "s/linked-file.recalc.xlsx"].map((p) => path.normalize(p)));
    expect(r.refused).toEqual([]);
  });

  it("-o DIR/ mirrors the tree below each argument's folder; --values adds a copy beside each output", () => {
    const out = path.join(dir, "out") + path.sep;
    const r = seasonInputs([path.join(dir, "s", "deep"), path.join(dir, "s", "b.xlsx")], { output: out, values: true });
    expect(r.items.map((i) => [rel(i.output), rel(i.valuesCopy!)])).toEqual([
      [path.join("out", "er", "c.recalc.xlsx"), path.join("out", "er", "c.recalc.values.xlsx")],
      [path.join("out", "b.recalc.xlsx"), path.join("out", "b.recalc.values.xlsx")],
    ]);
  });

  it("a pattern mirrors from its fixed folder; ** crosses folders", () => {
    const r = seasonInputs([`${path.join(dir, "s")}/**/*.xlsx`], { output: path.join(dir, "o") + path.sep });
    expect(r.items.map((i) => rel(i.output))).toEqual([path.join("o", "b.recalc.xlsx"), path.join("o", "deep", "er", "c.recalc.xlsx")]);
  });

  it("the same workbook named twice (directly, by a link, by a pattern) runs once", () => {
    const r = seasonInputs([path.join(dir, "elsewhere", "e.xlsx"), path.join(dir, "s", "linked-file.xlsx"), `${path.join(dir, "elsewhere")}/*.xlsx`]);
    expect(r.items.map((i) => rel(i.input))).toEqual([path.join("elsewhere", "e.xlsx")]);
  });

  it("a workbook whose output is another input of the run is refused; the other runs", () => {
    const a = touch(path.join(dir, "clash", "a.xlsx"));
    const earlier = touch(path.join(dir, "clash", "a.recalc.xlsx")); // named on the command line: taken as given
    const r = seasonInputs([a, earlier]);
    expect(r.items.map((i) => rel(i.input))).toEqual([path.join("clash", "a.recalc.xlsx")]);
    expect(r.refused).toEqual([{ input: a, reason: `refusing to write ${earlier}: it is another input of this run; run them separately or choose another output with -o` }]);
  });

  it("-o naming one file with several workbooks is an InputError; with one workbook it is the output", () => {
    expect(() => seasonInputs([path.join(dir, "s")], { output: path.join(dir, "one.xlsx") })).toThrow(InputError);
    const r = seasonInputs([path.join(dir, "s", "b.xlsx")], { output: path.join(dir, "one.xlsx") });
    expect(r.items.map((i) => rel(i.output))).toEqual(["one.xlsx"]);
  });

  it("an argument naming nothing: a refusal with its reason; a missing file is left for the run to refuse", () => {
    fs.mkdirSync(path.join(dir, "empty"), { recursive: true });
    const r = seasonInputs([path.join(dir, "empty"), `${path.join(dir, "s")}/*.xlsb`, path.join(dir, "missing.xlsx")]);
    expect(r.refused.map((x) => x.reason)).toEqual([
      `no .xlsx or .xlsm workbooks in the folder ${path.join(dir, "empty")} (soilcell's own .recalc. outputs and ~$ lock files are skipped)`,
      `no .xlsx or .xlsm workbook matches ${path.join(dir, "s")}/*.xlsb`,
    ]);
    expect(r.items.map((i) => rel(i.input))).toEqual(["missing.xlsx"]);
  });
});

describe("seasonInputs: refusals and edges", () => {
  let dir: string;
  const rel = (p: string) => path.relative(dir, p);
  beforeAll(() => {
    dir = tempDir("soilcell-inputs2-");
    touch(path.join(dir, "d1", "x.xlsx"));
    touch(path.join(dir, "d2", "x.xlsx"));
    touch(path.join(dir, "w", "a.xlsx"));
    touch(path.join(dir, "w", "b.xlsx"));
    fs.symlinkSync(path.join(dir, "nowhere.xlsx"), path.join(dir, "w", "broken.xlsx"));
    fs.mkdirSync(path.join(dir, "outdir"));
  });

  it("a link to nothing found in a folder is not a workbook", () => {
    expect(seasonInputs([path.join(dir, "w")]).items.map((i) => rel(i.input))).toEqual([path.join("w", "a.xlsx"), path.join("w", "b.xlsx")]);
  });

  it("-o naming one file with several workbooks: the message says how many and suggests a folder", () => {
    expect(() => seasonInputs([path.join(dir, "w")], { output: "all.xlsx" })).toThrow(new InputError("-o all.xlsx names one output file, but there are 2 workbooks; give a folder (-o all/) to write them under it"));
    expect(() => seasonInputs([path.join(dir, "w")], { output: "all.XLSM" })).toThrow("give a folder (-o all/) to write");
    expect(new InputError("m").name).toBe("InputError");
  });

  it("-o naming a folder that exists (no trailing /) writes under it", () => {
    const r = seasonInputs([path.join(dir, "w")], { output: path.join(dir, "outdir") });
    expect(r.items.map((i) => rel(i.output))).toEqual([path.join("outdir", "a.recalc.xlsx"), path.join("outdir", "b.recalc.xlsx")]);
  });

  it("two workbooks whose outputs would be one file: the second is refused", () => {
    const out = path.join(dir, "o") + path.sep;
    const r = seasonInputs([path.join(dir, "d1", "x.xlsx"), path.join(dir, "d2", "x.xlsx")], { output: out });
    expect(r.items.map((i) => rel(i.input))).toEqual([path.join("d1", "x.xlsx")]);
    expect(r.refused).toEqual([{ input: path.join(dir, "d2", "x.xlsx"), reason: `refusing to write ${path.join(dir, "o", "x.recalc.xlsx")}: it is written by another workbook of this run; run them separately or choose another output with -o` }]);
  });

  it("a values copy that would be another workbook's output is refused too", () => {
    const a = touch(path.join(dir, "v", "a.xlsx"));
    const b = touch(path.join(dir, "v", "a.recalc.values.xlsx")); // named on the command line: its output is a.recalc.values.recalc.xlsx
    const r = seasonInputs([a, b], { values: true });
    expect(r.items.map((i) => [rel(i.input), rel(i.output), rel(i.valuesCopy!)])).toEqual([[path.join("v", "a.recalc.values.xlsx"), path.join("v", "a.recalc.values.recalc.xlsx"), path.join("v", "a.recalc.values.recalc.values.xlsx")]]);
    expect(r.refused).toEqual([{ input: a, reason: `refusing to write ${b}: it is another input of this run; run them separately or choose another output with -o` }]);
  });

  it("a pattern's outputs mirror from its fixed folder: none (\".\") when the pattern starts with a wildcard", () => {
    const cwd = process.cwd();
    try {
      process.chdir(path.join(dir, "w"));
      const r = seasonInputs(["*.xlsx"], { output: path.join(dir, "pat") + path.sep });
      expect(r.items.map((i) => [i.input, rel(i.output)])).toEqual([
        ["a.xlsx", path.join("pat", "a.recalc.xlsx")],
        ["b.xlsx", path.join("pat", "b.recalc.xlsx")],
      ]);
      process.chdir(dir);
      const r2 = seasonInputs(["w/*.xlsx", "d*/x.xlsx"], { output: path.join(dir, "pat2") + path.sep });
      expect(r2.items.map((i) => [i.input, rel(i.output)])).toEqual([
        [path.join("w", "a.xlsx"), path.join("pat2", "a.recalc.xlsx")],
        [path.join("w", "b.xlsx"), path.join("pat2", "b.recalc.xlsx")],
        [path.join("d1", "x.xlsx"), path.join("pat2", "d1", "x.recalc.xlsx")],
        [path.join("d2", "x.xlsx"), path.join("pat2", "d2", "x.recalc.xlsx")],
      ]);
    } finally {
      process.chdir(cwd);
    }
  });

  it("an absolute pattern: from its fixed folder; a wildcard in the first folder mirrors from the root", () => {
    const r = seasonInputs([`${dir}/w/*.xlsx`], { output: path.join(dir, "abs") + path.sep });
    expect(r.items.map((i) => rel(i.output))).toEqual([path.join("abs", "a.recalc.xlsx"), path.join("abs", "b.recalc.xlsx")]);
    const [, top, ...rest] = dir.split("/"); // "/tmp/soilcell-…" → "tmp", "soilcell-…"
    const pattern = ["", `?${top!.slice(1)}`, ...rest, "w", "*.xlsx"].join("/");
    const out = path.join(dir, "root") + path.sep;
    const r2 = seasonInputs([pattern], { output: out });
    expect(r2.items.map((i) => i.output)).toEqual(["a", "b"].map((n) => path.join(out, top!, ...rest, "w", `${n}.recalc.xlsx`)));
  });

  it("an absolute pattern finds the same files whatever the working folder (the root, the test's folder, one deeper)", () => {
    const [, top, ...rest] = dir.split("/");
    const pattern = ["", `?${top!.slice(1)}`, ...rest, "w", "*.xlsx"].join("/");
    const cwd = process.cwd();
    fs.mkdirSync(path.join(dir, "deep", "er"), { recursive: true });
    try {
      for (const at of [path.sep, dir, path.join(dir, "deep", "er")]) {
        process.chdir(at);
        expect([at, seasonInputs([pattern]).items.map((i) => i.input)]).toEqual([at, [path.join(dir, "w", "a.xlsx"), path.join(dir, "w", "b.xlsx")]]);
      }
    } finally {
      process.chdir(cwd);
    }
  });
});
