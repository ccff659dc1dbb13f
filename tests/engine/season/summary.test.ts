/**
 * The season summary as data (src/engine/season/summary.ts): rows, totals, cells in error grouped
 * by message, and the exit code over the whole run. The per-file figures are invented.
 */
import { RecalcSummary } from "../../../src/engine/recalc";
import { FileResult } from "../../../src/engine/season/pool";
import { seasonSummary, sheetCell } from "../../../src/engine/season/summary";

function done(input: string, errors: { sheet: string; cell: string; message: string }[] = []): FileResult {
  const summary: RecalcSummary = {
    input,
    output: input.replace(".xlsx", ".recalc.xlsx"),
    sheets: 1,
    formulaCells: 10,
    computedCells: 8,
    keptCells: 2,
    soilFormulaCells: 6,
    spilledCells: 3,
    errors: errors.map((e) => ({ ...e, formula: "=SOIL.CMOL(A1,\"Xx\")", error: "#VALUE!" })),
    kept: [],
    seconds: 0.5,
  };
  return { item: { input, output: summary.output }, outcome: { kind: "recalculated", summary } };
}

describe("seasonSummary", () => {
  it("totals the rows and groups cells in error by message, most frequent first, each as file!sheet!cell", () => {
    const s = seasonSummary([], [done("a.xlsx", [{ sheet: "Lab", cell: "B2", message: "m1" }, { sheet: "Lab A", cell: "B3", message: "m2" }]), done("b.xlsx", [{ sheet: "Lab", cell: "C9", message: "m2" }])], { seconds: 0.6, jobs: 2 });
    expect(s.totals).toMatchObject({ workbooks: 2, recalculated: 2, refused: 0, formulaCells: 20, computedCells: 16, keptCells: 4, soilFormulaCells: 12, spilledCells: 6, cellsInError: 3, withErrors: 2 });
    expect(s.errorGroups.map((g) => [g.message, g.count, g.workbooks, g.cells])).toEqual([
      ["m2", 2, 2, ["a.xlsx!'Lab A'!B3", "b.xlsx!Lab!C9"]],
      ["m1", 1, 1, ["a.xlsx!Lab!B2"]],
    ]);
    expect(s.errors.map((e) => e.file)).toEqual(["a.xlsx", "a.xlsx", "b.xlsx"]);
    expect(s.workbookSeconds).toBe(1);
    expect(s.exitCode).toBe(1);
  });

  it("exit code over the run: 0 clean, 1 cells in error, 2 a workbook refused, 3 a failure in soilcell", () => {
    const refused = { item: { input: "r.xlsx", output: "r.recalc.xlsx" }, outcome: { kind: "refused" as const, reason: "not a workbook", seconds: 0 } };
    const failed = { item: { input: "f.xlsx", output: "f.recalc.xlsx" }, outcome: { kind: "failed" as const, reason: "unexpected failure: x", seconds: 0 } };
    const run = { seconds: 1, jobs: 1 };
    expect(seasonSummary([], [done("a.xlsx")], run).exitCode).toBe(0);
    expect(seasonSummary([], [done("a.xlsx", [{ sheet: "S", cell: "A1", message: "m" }])], run).exitCode).toBe(1);
    expect(seasonSummary([], [done("a.xlsx", [{ sheet: "S", cell: "A1", message: "m" }]), refused], run).exitCode).toBe(2);
    expect(seasonSummary([{ input: "empty/", reason: "no workbooks" }], [], run).exitCode).toBe(2);
    expect(seasonSummary([], [refused, failed], run).exitCode).toBe(3);
    const s = seasonSummary([{ input: "empty/", reason: "no workbooks" }], [refused], run);
    expect(s.files.map((f) => [f.input, f.status, f.reason])).toEqual([
      ["empty/", "refused", "no workbooks"],
      ["r.xlsx", "refused", "not a workbook"],
    ]);
  });

  it("sheet names are quoted as Excel quotes them in a reference", () => {
    expect(sheetCell("Lab", "A1")).toBe("Lab!A1");
    expect(sheetCell("Lab A", "A1")).toBe("'Lab A'!A1");
    expect(sheetCell("O'Brien", "A1")).toBe("'O''Brien'!A1");
    expect(sheetCell("2025", "A1")).toBe("'2025'!A1");
  });
});

describe("seasonSummary, whole", () => {
  it("every field: rows (a refused row all 0), totals, kept cells, groups with their first formula, ties in run order", () => {
    const a = done("a.xlsx", [{ sheet: "Lab", cell: "B2", message: "m1" }]);
    const kept = { sheet: "Lab", cell: "C1", formula: "=XLOOKUP(1,A:A,B:B)", error: "", message: "not computed" };
    const b: FileResult = {
      item: { input: "b.xlsx", output: "b.recalc.xlsx", valuesCopy: "b.recalc.values.xlsx" },
      outcome: {
        kind: "recalculated",
        summary: {
          input: "b.xlsx",
          output: "b.recalc.xlsx",
          valuesCopy: "b.recalc.values.xlsx",
          sheets: 2,
          formulaCells: 5,
          computedCells: 4,
          keptCells: 1,
          soilFormulaCells: 3,
          spilledCells: 0,
          errors: [{ sheet: "Lab B", cell: "D4", formula: "=SOIL.CMOL(9,\"Qq\")", error: "#N/A", message: "m3" }],
          kept: [kept],
          seconds: 0.25,
        },
      },
    };
    const failed: FileResult = { item: { input: "f.xlsx", output: "f.recalc.xlsx" }, outcome: { kind: "failed", reason: "unexpected failure: x", seconds: 0.125 } };
    const s = seasonSummary([{ input: "gone/", reason: "no workbooks" }], [a, b, failed], { seconds: 2, jobs: 3 });
    const zero = { sheets: 0, formulaCells: 0, computedCells: 0, keptCells: 0, soilFormulaCells: 0, spilledCells: 0, cellsInError: 0, withoutValue: 0 };
    expect(s).toEqual({
      computedBy: expect.stringMatching(/^soilcell \d+\.\d+\.\d+/),
      finished: expect.stringMatching(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/),
      seconds: 2,
      workbookSeconds: 0.875,
      jobs: 3,
      totals: { workbooks: 4, recalculated: 2, refused: 1, failed: 1, withErrors: 2, sheets: 3, formulaCells: 15, computedCells: 12, keptCells: 3, soilFormulaCells: 9, spilledCells: 3, cellsInError: 2, withoutValue: 1 },
      files: [
        { input: "gone/", status: "refused", reason: "no workbooks", output: "", valuesCopy: "", ...zero, seconds: 0 },
        { input: "a.xlsx", status: "recalculated", reason: "", output: "a.recalc.xlsx", valuesCopy: "", sheets: 1, formulaCells: 10, computedCells: 8, keptCells: 2, soilFormulaCells: 6, spilledCells: 3, cellsInError: 1, withoutValue: 0, seconds: 0.5 },
        { input: "b.xlsx", status: "recalculated", reason: "", output: "b.recalc.xlsx", valuesCopy: "b.recalc.values.xlsx", sheets: 2, formulaCells: 5, computedCells: 4, keptCells: 1, soilFormulaCells: 3, spilledCells: 0, cellsInError: 1, withoutValue: 1, seconds: 0.25 },
        { input: "f.xlsx", status: "failed", reason: "unexpected failure: x", output: "", valuesCopy: "", ...zero, seconds: 0.125 },
      ],
      errorGroups: [
        { error: "#VALUE!", message: "m1", count: 1, workbooks: 1, cells: ["a.xlsx!Lab!B2"], formula: '=SOIL.CMOL(A1,"Xx")' },
        { error: "#N/A", message: "m3", count: 1, workbooks: 1, cells: ["b.xlsx!'Lab B'!D4"], formula: '=SOIL.CMOL(9,"Qq")' },
      ],
      errors: [
        { file: "a.xlsx", sheet: "Lab", cell: "B2", formula: '=SOIL.CMOL(A1,"Xx")', error: "#VALUE!", message: "m1" },
        { file: "b.xlsx", sheet: "Lab B", cell: "D4", formula: '=SOIL.CMOL(9,"Qq")', error: "#N/A", message: "m3" },
      ],
      kept: [{ file: "b.xlsx", ...kept }],
      exitCode: 3,
      caution: "Results are estimates: check them against local calibrations, regulations and licensed advice.",
    });
  });

  it("one message under two errors is two groups; the same in one workbook twice counts one workbook", () => {
    const s = seasonSummary([], [done("a.xlsx", [{ sheet: "S", cell: "A1", message: "m" }, { sheet: "S", cell: "A2", message: "m" }])], { seconds: 1, jobs: 1 });
    expect(s.errorGroups.map((g) => [g.count, g.workbooks])).toEqual([[2, 1]]);
    const base = done("b.xlsx", [{ sheet: "S", cell: "A1", message: "m" }]);
    if (base.outcome.kind !== "recalculated") throw new Error("a recalculated result");
    const mixed: FileResult = { item: base.item, outcome: { kind: "recalculated", summary: { ...base.outcome.summary, errors: base.outcome.summary.errors.map((e) => ({ ...e, error: "#N/A" })) } } };
    const t = seasonSummary([], [done("a.xlsx", [{ sheet: "S", cell: "A1", message: "m" }]), mixed], { seconds: 1, jobs: 1 });
    expect(t.errorGroups.map((g) => [g.error, g.count])).toEqual([
      ["#VALUE!", 1],
      ["#N/A", 1],
    ]);
  });
});
