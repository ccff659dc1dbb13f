/**
 * (A helper: it holds no reference values of its own, and no invented ones. The expected values are LibreOffice's, from
 * tests/fixtures/corpus/expected, or Excel's published ones from excel-overrides.json.)
 * The corpus oracle's comparison, shared by the test that runs the built CLI on each workbook and
 * the one that runs the engine in process (which mutation testing can see).
 */
import fs from "fs";
import path from "path";
import { CachedValue, readWorkbookCells } from "../../scripts/oracle/xlsx-cells";
import { Expected } from "../../scripts/oracle/libreoffice-values";
import { sameValue, show } from "./cached-values";

export const CORPUS = path.join(__dirname, "../fixtures/corpus");
export const EXPECTED = path.join(CORPUS, "expected");

/** The corpus workbooks that have an expected file, sorted. */
export const corpusNames = (): string[] =>
  fs
    .readdirSync(EXPECTED)
    .filter((f) => f.endsWith(".json"))
    .map((f) => f.replace(/\.json$/, ""))
    .sort();

export const expectedOf = (name: string): Expected => JSON.parse(fs.readFileSync(path.join(EXPECTED, `${name}.json`), "utf8"));

/** Cells soilcell refuses on purpose (a locale-dependent reading), each with its reason. */
const REFUSALS = JSON.parse(fs.readFileSync(path.join(CORPUS, "soilcell-refusals.json"), "utf8")) as Record<string, Record<string, Record<string, string>> | string>;
const refusalOf = (name: string, sheet: string, addr: string): string | undefined => {
  const book = REFUSALS[name];
  return typeof book === "object" ? book[sheet]?.[addr] : undefined;
};

/** The parts of a recalc summary the comparison reads. */
export interface OracleSummary {
  readonly errors?: readonly { sheet: string; cell: string; message: string }[];
  readonly kept?: readonly { sheet: string; cell: string; message: string }[];
}

/** Every expected cell the recalculated workbook gets wrong, as readable lines, and how many were compared. */
export async function oracleDifferences(name: string, output: Buffer, summary: OracleSummary): Promise<{ compared: number; wrong: string[] }> {
  const want = expectedOf(name);
  const got = await readWorkbookCells(output);
  const wrong: string[] = [];
  let compared = 0;
  for (const [sheet, cells] of Object.entries(want.cells)) {
    const out = got.sheets.find((s) => s.name === sheet);
    for (const [addr, value] of Object.entries(cells)) {
      compared += 1;
      const v: CachedValue = out ? (out.cells.get(addr)?.value ?? null) : null;
      const refused = refusalOf(name, sheet, addr);
      if (refused) {
        // Refused: an error with its message, or (a formula the file held without a value, which
        // nothing recomputed feeds) left without a value and listed with the reason.
        const listed = summary.errors?.find((e) => e.sheet === sheet && e.cell === addr);
        const keptBlank = summary.kept?.find((e) => e.sheet === sheet && e.cell === addr);
        const isError = typeof v === "object" && v !== null && "error" in v;
        if (!((isError && listed?.message) || (v === null && keptBlank?.message))) wrong.push(`${sheet}!${addr}: a refusal with a message was expected (${refused}), got ${show(v)}`);
        continue;
      }
      if (!sameValue(value, v)) {
        const soil = want.fromSoilcell?.[sheet]?.[addr];
        const excel = want.excelOverrides?.[sheet]?.[addr];
        const why = soil ? ` (SOIL element, as ${soil})` : excel ? " (Excel's value; LibreOffice differs by design)" : "";
        wrong.push(`${sheet}!${addr}: expected ${show(value)}${why}, got ${show(v)}`);
      }
    }
  }
  return { compared, wrong };
}
