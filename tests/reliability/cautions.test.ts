/**
 * Cautions surfaced: lime and fertiliser rates can hurt crops, soils, water and people, so every
 * ABOUT line of a lime or fertiliser function carries the caution, and `soilcell recalc` ends its
 * summary with it, whether or not cells failed. Workbook contents are invented.
 */
import { spawnSync } from "child_process";
import path from "path";
import { CAUTION, aboutFunction, aboutNames } from "../../src/core/about";
import { REGISTRY } from "../../src/engine/registry";
import { tempDir, writeWorkbook } from "../helpers/workbook";

const BIN = path.join(__dirname, "../../bin/soilcell.js");

/** Functions that give lime or fertiliser rates or interpret them: LIME*, REMOVAL, BUILDUP, SUFFICIENCY. */
const RATE_FUNCTIONS = (ids: readonly string[]) => ids.filter((id) => /^LIME/.test(id) || ["REMOVAL", "BUILDUP", "SUFFICIENCY"].includes(id));

describe("ABOUT lines of lime and fertiliser functions carry the caution", () => {
  const ids = [...new Set([...REGISTRY.map((f) => f.id), ...aboutNames()])].sort();
  const rate = RATE_FUNCTIONS(ids);

  it("the lime and fertiliser functions are registered", () => {
    expect(rate).toEqual(expect.arrayContaining(["LIMEBUFFER", "REMOVAL", "BUILDUP", "SUFFICIENCY"]));
  });

  it.each(rate.map((id) => [id]))("%s", (id) => {
    expect(aboutFunction(id)).toContain(CAUTION);
  });
});

describe("soilcell recalc ends with the caution", () => {
  const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { encoding: "utf8" });

  it.each([
    ["a clean run", 400.78, 0],
    ["a run with a failing cell", -1, 1],
  ] as const)("%s", async (_, ca, status) => {
    const dir = tempDir();
    const input = await writeWorkbook(path.join(dir, "in.xlsx"), (wb) => {
      const ws = wb.addWorksheet("S");
      ws.getCell("A1").value = ca;
      ws.getCell("B1").value = { formula: 'SOIL.CMOL(A1,"Ca")' } as never;
    });
    const r = run("recalc", input, "-o", path.join(dir, "out.xlsx"));
    expect(r.status).toBe(status);
    const lines = r.stdout.trimEnd().split("\n");
    expect(lines[lines.length - 1]).toBe(CAUTION);
    expect(lines.filter((l) => l === CAUTION)).toHaveLength(1); // one line, once
  });
});
