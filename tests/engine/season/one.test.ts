/**
 * One workbook of a season (src/engine/season/one.ts): every outcome returned as data, never
 * thrown: recalculated (with its options passed on), refused (the engine's refusals and the file
 * system's), failed (anything else, a fault in soilcell). Behaviour: the season's documented
 * outcomes. Workbook contents are invented (tests/helpers/season.ts: 400.78 mg/kg Ca is 2
 * cmol(+)/kg, IUPAC/CIAAW standard atomic weights, as in tests/core).
 */
import fs from "fs";
import path from "path";
import { recalcOne } from "../../../src/engine/season/one";
import { farmBook, put } from "../../helpers/season";
import { c, f, row, xlsxBytes } from "../../helpers/xlsx";
import { tempDir } from "../../helpers/workbook";

describe("recalcOne", () => {
  const dir = tempDir("soilcell-one-");

  it("recalculated: the output's folder made as needed, the summary returned, progress and the values copy passed on", async () => {
    const input = put(path.join(dir, "farm.xlsx"), farmBook(2));
    const output = path.join(dir, "out", "deep", "farm.recalc.xlsx");
    const valuesCopy = path.join(dir, "out", "deep", "farm.recalc.values.xlsx");
    const lines: string[] = [];
    const o = await recalcOne({ input, output, valuesCopy }, { progress: (l) => lines.push(l) });
    expect(o.kind).toBe("recalculated");
    if (o.kind !== "recalculated") return;
    expect(o.summary).toMatchObject({ input, output, valuesCopy, sheets: 1, formulaCells: 2, soilFormulaCells: 2, errors: [], kept: [] });
    expect(fs.existsSync(output)).toBe(true);
    expect(fs.existsSync(valuesCopy)).toBe(true);
    expect(lines[0]).toBe("reading farm.xlsx (1 sheets)");
    expect(lines).toContain("writing farm.recalc.values.xlsx");
  });

  it("without options: no values copy, the output beside an existing folder", async () => {
    const input = put(path.join(dir, "plain.xlsx"), farmBook(1, 1));
    const output = path.join(dir, "plain.recalc.xlsx");
    const o = await recalcOne({ input, output });
    expect(o.kind).toBe("recalculated");
    if (o.kind !== "recalculated") return;
    expect(o.summary.valuesCopy).toBeUndefined();
    expect(o.summary.errors.map((e) => [e.cell, e.error])).toEqual([["B3", "#VALUE!"]]);
  });

  it("refused: not a workbook, with the reader's reason and the time taken", async () => {
    const input = put(path.join(dir, "notes.xlsx"), "not a zip");
    const o = await recalcOne({ input, output: path.join(dir, "notes.recalc.xlsx") });
    expect(o).toEqual({ kind: "refused", reason: "not an .xlsx workbook (the file is not a zip package)", seconds: expect.any(Number) });
    if (o.kind === "refused") expect(o.seconds).toBeGreaterThanOrEqual(0);
    expect(fs.existsSync(path.join(dir, "notes.recalc.xlsx"))).toBe(false);
  });

  it("refused: the engine's own refusal (a values copy over the output)", async () => {
    const input = put(path.join(dir, "same.xlsx"), farmBook(1));
    const output = path.join(dir, "same.recalc.xlsx");
    const o = await recalcOne({ input, output, valuesCopy: output });
    expect(o).toEqual({ kind: "refused", reason: `refusing to write the values copy over the recalculated workbook ${output}; choose another name`, seconds: expect.any(Number) });
  });

  it("refused: a formula over the cell limit given (maxCells passed on)", async () => {
    const input = put(path.join(dir, "big.xlsx"), xlsxBytes({ sheets: [{ name: "Lab", rows: row(1, c("A1", 1), f("B1", "SUMPRODUCT(A1:A500)")) }] }));
    const o = await recalcOne({ input, output: path.join(dir, "big.recalc.xlsx") }, { maxCells: 100 });
    expect(o).toEqual({ kind: "refused", reason: "a formula asks for a range of 500×1 cells, more than the 100 cells soilcell takes in one formula; refused (in Lab!B1)", seconds: expect.any(Number) });
    expect((await recalcOne({ input, output: path.join(dir, "big.recalc.xlsx") })).kind).toBe("recalculated");
  });

  it("refused: the output's folder cannot be made (a file stands in its way), with the system's code", async () => {
    const input = put(path.join(dir, "blocked.xlsx"), farmBook(1));
    put(path.join(dir, "a-file"), "x");
    const output = path.join(dir, "a-file", "sub", "blocked.recalc.xlsx");
    const o = await recalcOne({ input, output });
    expect(o).toEqual({ kind: "refused", reason: `cannot write under ${path.join(dir, "a-file", "sub")}: ENOTDIR`, seconds: expect.any(Number) });
  });

  /** An item whose input throws `thrown` when read (inside the run, after the output's folder is made). */
  const throwing = (thrown: unknown) => ({
    get input(): string {
      throw thrown;
    },
    output: path.join(dir, "thrown.recalc.xlsx"),
  });

  it("failed or refused by what was thrown: an Error's message, anything else as text; a system code E… is the file system's", async () => {
    expect(await recalcOne(throwing(new Error("boom")))).toEqual({ kind: "failed", reason: "unexpected failure: boom", seconds: expect.any(Number) });
    expect(await recalcOne(throwing({ message: "m", toString: () => "as text" }))).toEqual({ kind: "failed", reason: "unexpected failure: as text", seconds: expect.any(Number) });
    expect(await recalcOne(throwing(Object.assign(new Error("no"), { code: "EACCES" })))).toEqual({ kind: "refused", reason: `cannot write under ${dir}: EACCES`, seconds: expect.any(Number) });
    for (const code of ["E_ACCES", "ERR_X", "eacces", "EACCES1", 13, "E"]) {
      expect({ code, o: await recalcOne(throwing(Object.assign(new Error("no"), { code }))) }).toEqual({ code, o: { kind: "failed", reason: "unexpected failure: no", seconds: expect.any(Number) } });
    }
  });

  it("failed: anything else is a fault in soilcell, said as such", async () => {
    const o = await recalcOne({ input: path.join(dir, "farm.xlsx"), output: undefined as unknown as string });
    expect(o.kind).toBe("failed");
    if (o.kind !== "failed") return;
    // Node's own error (under Jest it comes from another realm, so it is written whole, with its name).
    expect(o.reason).toMatch(/^unexpected failure: (TypeError \[ERR_INVALID_ARG_TYPE\]: )?The "path" argument must be of type string\. Received undefined$/);
    expect(o.seconds).toBeGreaterThanOrEqual(0);
  });
});
