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
