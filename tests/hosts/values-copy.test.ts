/**
 * `soilcell recalc --values` writes, beside each recalculated workbook, a copy in which every
 * SOIL result is a plain value, proven by opening it in another real spreadsheet program:
 * LibreOffice Calc headless (Debian's libreoffice-calc) shows no #NAME? anywhere, and every cell
 * shows exactly the value soilcell computed (the recalculated workbook's cached values). Styles,
 * other formulas and the note saying what computed the copy are checked in the file itself.
 *
 * Inputs: the invented workbook of tests/hosts/libreoffice-files.ts (spills, text, an error, a
 * native formula over a SOIL cell), one with a native formula reading a SOIL spill through the
 * spill operator and a styled SOIL cell (invented), and the invented sample workbooks. The
 * expected values are our own results; LibreOffice is the independent check of what a person sees.
 */
import { spawnSync } from "child_process";
import fs from "fs";
import path from "path";
import { openPackage } from "../../src/engine/xlsx-package";
import { tempDir, writeWorkbook } from "../helpers/workbook";
import { describeHost, ROOT } from "./harness";
import { CSV_FILTER, LoRun, csvCell, libreoffice, madeWorkbook, parseCsv, readCached, sampleWorkbooks, shows, soffice, troubles } from "./libreoffice-files";

const BIN = path.join(ROOT, "bin/soilcell.js");

async function spillReader(file: string): Promise<string> {
  return writeWorkbook(file, (wb) => {
    const ws = wb.addWorksheet("Spill");
    ws.addRow(["Ca mg/kg", "Ca cmol(+)/kg", "sum", "double", "styled"]);
    ws.addRow([400.78]);
    ws.addRow([200.39]);
    ws.getCell("B2").value = { formula: 'SOIL.CMOL(A2:A3,"Ca")' } as never; // spills B2:B3 (2 and 1)
    ws.getCell("C2").value = { formula: "SUM(_xlfn.ANCHORARRAY(B2))" } as never; // B2# in Excel: reads the spill
    ws.getCell("D2").value = { formula: "B2*2" } as never; // a native formula over a SOIL cell: stays a formula
    ws.getCell("E2").value = { formula: 'SOIL.CMOL(A2,"Ca")' } as never;
    ws.getCell("E2").numFmt = "0.000";
    ws.getCell("E2").font = { bold: true };
  });
}

describeHost("values copies in LibreOffice", soffice, "libreoffice", () => {
  let dir: string;
  /** Short name → { recalc: the .recalc.xlsx, values: the .recalc.values.xlsx } */
  const books = new Map<string, { recalc: string; values: string }>();
  let run: ReturnType<typeof spawnSync>;
  let csvRun: LoRun;

  beforeAll(async () => {
    dir = tempDir("soilcell-values-");
    const season = path.join(dir, "season");
    fs.mkdirSync(path.join(season, "more"), { recursive: true });
    await madeWorkbook(path.join(season, "made.xlsx"));
    await spillReader(path.join(season, "more", "spill.xlsx"));
    for (const s of sampleWorkbooks()) fs.copyFileSync(s, path.join(season, path.basename(s)));
    run = spawnSync(process.execPath, [BIN, "recalc", season, "--values", "-o", path.join(dir, "out") + path.sep], { encoding: "utf8", timeout: 240_000 });
    for (const f of walk(path.join(dir, "out"))) {
      if (!f.endsWith(".recalc.values.xlsx")) continue;
      const name = path.basename(f, ".recalc.values.xlsx");
      books.set(name, { recalc: f.replace(/\.values\.xlsx$/, ".xlsx"), values: f });
    }
    csvRun = libreoffice(path.join(dir, "profile"), ["--convert-to", CSV_FILTER, "--outdir", path.join(dir, "csv"), ...[...books.values()].map((b) => b.values)]);
  }, 300_000);

  it("the run writes a values copy beside every recalculated workbook, mirroring the tree", () => {
    expect(run.stderr).not.toMatch(/soilcell: /);
    expect([0, 1]).toContain(run.status);
    expect([...books.keys()].sort()).toEqual(["made", "spill", ...sampleWorkbooks().map((s) => path.basename(s, ".xlsx"))].sort());
    expect(books.get("spill")!.values).toBe(path.join(dir, "out", "more", "spill.recalc.values.xlsx"));
    for (const b of books.values()) expect(fs.existsSync(b.recalc)).toBe(true);
  });

  it(`LibreOffice opens every copy with no load error or repair notice (${soffice})`, () => {
    expect(troubles(csvRun)).toEqual([]);
  });

  it("no cell of any sheet shows #NAME? in LibreOffice", async () => {
    const named: string[] = [];
    let sheets = 0;
    for (const [name, b] of books) {
      for (const sheet of (await readCached(b.values)).keys()) {
        sheets += 1;
        const rows = parseCsv(fs.readFileSync(path.join(dir, "csv", `${name}.recalc.values-${sheet}.csv`), "utf8"));
        rows.forEach((row, r) => row.forEach((text, c) => text.includes("#NAME?") && named.push(`${name} ${sheet} row ${r + 1} col ${c + 1}`)));
      }
    }
    expect(sheets).toBeGreaterThanOrEqual(4);
    expect(named).toEqual([]);
  });

  it("every cell LibreOffice shows is the value soilcell computed (SOIL cells included)", async () => {
    let compared = 0;
    let soilCompared = 0;
    const wrong: string[] = [];
    for (const [name, b] of books) {
      const ours = await readCached(b.recalc);
      for (const [sheet, cells] of await readCached(b.values)) {
        const rows = parseCsv(fs.readFileSync(path.join(dir, "csv", `${name}.recalc.values-${sheet}.csv`), "utf8"));
        const computed = ours.get(sheet)!;
        for (const [addr, v] of cells.values) {
          const mine = computed.values.get(addr) ?? null;
          if (JSON.stringify(mine) !== JSON.stringify(v)) wrong.push(`${name} ${sheet}!${addr}: recalculated ${JSON.stringify(mine)}, values copy ${JSON.stringify(v)}`);
          const text = csvCell(rows, addr);
          if (!shows(text, v)) wrong.push(`${name} ${sheet}!${addr}: ours ${JSON.stringify(v)}, LibreOffice shows ${JSON.stringify(text)}`);
          compared += 1;
          if (computed.soil.has(addr)) soilCompared += 1;
        }
      }
    }
    expect(wrong).toEqual([]);
    expect(compared).toBeGreaterThan(1000);
    expect(soilCompared).toBeGreaterThan(500);
  });

  it("SOIL formulas are gone from the copy, every other formula and every style kept", async () => {
    for (const b of books.values()) {
      const ours = await readCached(b.recalc);
      const copy = await readCached(b.values);
      for (const [sheet, cells] of ours) {
        const c = copy.get(sheet)!;
        for (const [addr, f] of c.formulas) expect({ sheet, addr, f, soil: /_xldudf_|SOIL\./i.test(f.replace(/"(?:[^"]|"")*"/g, '""')) }).toEqual({ sheet, addr, f, soil: false });
        for (const [addr, f] of cells.formulas) {
          if (cells.soil.has(addr) || /ANCHORARRAY/i.test(f)) continue;
          expect({ sheet, addr, kept: c.formulas.get(addr) }).toEqual({ sheet, addr, kept: f });
        }
        expect(Object.fromEntries(c.styles)).toEqual(Object.fromEntries(cells.styles));
      }
    }
  });

  it("a formula reading a SOIL spill through the spill operator becomes its value (it would be #REF! over a plain cell)", async () => {
    const b = books.get("spill")!;
    const spill = (await readCached(b.values)).get("Spill")!;
    // SOIL.CMOL of 400.78 and 200.39 mg/kg Ca: 2 and 1 cmol(+)/kg (Source: IUPAC/CIAAW atomic weight of Ca, 200.39 mg/kg per cmol(+)/kg).
    expect(spill.values.get("B2")).toBeCloseTo(2, 12);
    expect(spill.values.get("B3")).toBeCloseTo(1, 12);
    expect(spill.values.get("C2")).toBeCloseTo(3, 12);
    expect(spill.formulas.has("C2")).toBe(false);
    expect(spill.formulas.get("D2")).toBe("B2*2");
    expect(spill.values.get("D2")).toBeCloseTo(4, 12);
    expect(spill.styles.get("E2")).toBeGreaterThan(0);
  });

  it("the copy's properties say which soilcell version computed it, and when", async () => {
    const version = JSON.parse(fs.readFileSync(path.join(ROOT, "package.json"), "utf8")).version as string;
    for (const b of books.values()) {
      const pkg = await openPackage(fs.readFileSync(b.values));
      const custom = pkg.text("docProps/custom.xml") ?? "";
      expect(custom).toMatch(new RegExp(`name="soilcell"><vt:lpwstr>SOIL results written as values by soilcell ${version.replace(/\./g, "\\.")} on \\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\dZ`));
      expect(pkg.text("[Content_Types].xml")).toContain('PartName="/docProps/custom.xml"');
      const recalc = await openPackage(fs.readFileSync(b.recalc));
      expect(recalc.text("docProps/custom.xml") ?? "").not.toContain('name="soilcell"');
    }
  });
});

function walk(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? walk(path.join(dir, e.name)) : [path.join(dir, e.name)]));
}
