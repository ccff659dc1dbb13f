/**
 * Whole consultant-style workbooks through the recalculation (recalcBytes from src), the native
 * formulas downstream of SOIL cells checked against an outside reference. Two invented workbooks
 * (farms, paddocks, lab and products invented), made by scripts/oracle/consultant-attack.js
 * (workbooks in scripts/oracle/consultant-workbooks.js):
 * - ardlow-downs-2025: a lab sheet in mg/kg, per-row SOIL CEC, saturations, Ca:Mg, a Sikora lime
 *   rate and a product rate read through VLOOKUP from a product table (a defined name), then IF /
 *   IFS decisions, ROUNDUP to quarter tonnes, INDEX/MATCH costs, retest dates, report lines, and a
 *   per-farm summary (SUMIF over whole columns, COUNTIFS with a wildcard, AVERAGEIF(S), MAXIFS,
 *   MINIFS, SUMPRODUCT, TEXTJOIN);
 * - ninemile-bands: SOIL.SUFFICIENCY and SOIL.BAND labels feeding IFS, SWITCH, MATCH into an array
 *   constant, COUNTIF wildcards, CONCAT, TEXTJOIN over IF, and the left lookup
 *   VLOOKUP(x,CHOOSE({1,2},…),2,FALSE) (legacy and dynamic-array forms).
 * Each input is self-consistent as Excel would have saved it before the season's new SOIL results
 * (every native formula caches what LibreOffice computes from the SOIL cells' stale values), so a
 * downstream cell the recalculation missed would keep a value that differs from the reference.
 * Expected values ("LO 7.4 headless"): LibreOffice 7.4.7 headless (oracle profile of
 * scripts/oracle/lo.js) on a copy where every SOIL cell holds the value soilcell computed for it;
 * where LibreOffice is not the reference the JSON gives soilcell's value and the reason (TEXT is
 * refused headless: behaviour).
 */
import fs from "fs";
import path from "path";
import { recalcBytes } from "../../src/engine/recalc";
import { readWorkbookCells } from "../../scripts/oracle/xlsx-cells";
import { sameValue, show } from "../helpers/cached-values";

const DIR = path.join(__dirname, "../fixtures/consultant");

interface Expected {
  file: string;
  exit: number;
  native: Record<string, Record<string, { value: unknown; source: string }>>;
  soil: Record<string, Record<string, unknown>>;
}

describe("consultant workbooks: native formulas downstream of SOIL cells against LibreOffice", () => {
  it.each(["ardlow-downs-2025", "ninemile-bands"])("%s", async (name) => {
    const want = JSON.parse(fs.readFileSync(path.join(DIR, `${name}.json`), "utf8")) as Expected;
    const run = await recalcBytes(fs.readFileSync(path.join(DIR, want.file)), want.file);
    const book = await readWorkbookCells(run.bytes);
    const wrong: string[] = [];
    let compared = 0;
    for (const [sheet, cells] of Object.entries(want.native)) {
      const s = book.sheets.find((x) => x.name === sheet);
      for (const [addr, e] of Object.entries(cells)) {
        compared++;
        const got = s?.cells.get(addr)?.value ?? null;
        if (!sameValue(e.value as never, got as never)) wrong.push(`${sheet}!${addr}: want ${show(e.value as never)} (${e.source}), got ${show(got as never)}`);
      }
    }
    // the SOIL cells hold what they held when the expected values were made (soilcell's own)
    for (const [sheet, cells] of Object.entries(want.soil)) {
      const s = book.sheets.find((x) => x.name === sheet);
      for (const [addr, v] of Object.entries(cells)) {
        const got = s?.cells.get(addr)?.value ?? null;
        if (!sameValue(v as never, got as never)) wrong.push(`SOIL ${sheet}!${addr}: was ${show(v as never)}, now ${show(got as never)}`);
      }
    }
    expect(compared).toBeGreaterThan(50);
    expect(wrong).toEqual([]);
    expect(run.summary.errors.length > 0 ? 1 : 0).toBe(want.exit);
  });
});
