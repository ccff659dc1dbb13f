/**
 * Workbooks opened by LibreOffice Calc headless, for the host tests: what each cell of a workbook
 * caches (read from the sheet XML itself), LibreOffice's CSV of every sheet, and the workbook the
 * tests build (invented sample contents: a spilled column, a spilled row, a text result, an error
 * cell, a native formula over a SOIL cell, a second sheet). Expected SOIL values and their sources
 * are in the tests that use these.
 */
import { execFileSync } from "child_process";
import fs from "fs";
import path from "path";
import { openPackage } from "../../src/engine/xlsx-package";
import { callsSoil } from "../../src/engine/formula-text";
import { parseRange, a1 } from "../../src/engine/cellref";
import { writeWorkbook } from "../helpers/workbook";
import { ROOT, findProgram } from "./harness";

/** The LibreOffice program on PATH, if any. */
export const soffice = findProgram("libreoffice", "soffice");

// CSV: comma, double quote, UTF-8, from line 1, standard cell format, no "as shown" (full
// precision), every sheet to its own file (LibreOffice 7.2 and later: sheet -1).
export const CSV_FILTER = "csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1";

export type Shown = number | string | { error: string } | null;

export interface SheetCells {
  values: Map<string, Shown>;
  /** Cells covered by a formula calling SOIL functions (the whole spill range of each). */
  soil: Set<string>;
  /** Of those, the cells of formulas whose outermost call is a SOIL function. */
  direct: Set<string>;
  /** Stored formula text by cell, for the cells that have one. */
  formulas: Map<string, string>;
  /** The style index (s=) of every cell that has one. */
  styles: Map<string, number>;
}

const decode = (s: string) =>
  s
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">")
    .replace(/&#(\d+);/g, (_m, d: string) => String.fromCodePoint(Number(d)))
    .replace(/&#x([0-9a-f]+);/gi, (_m, h: string) => String.fromCodePoint(parseInt(h, 16)))
    .replace(/&amp;/g, "&");

/** The text of every <t> inside a fragment (a shared string's runs, an inline string). */
const textOf = (fragment: string) => [...fragment.matchAll(/<t\b[^>]*>([\s\S]*?)<\/t>|<t\b[^>]*\/>/g)].map((m) => decode(m[1] ?? "")).join("");

/**
 * What each cell of a workbook caches, read from the sheet XML itself (ExcelJS drops a cached
 * formula result of 0), and which cells a SOIL formula covers. Dates and booleans are left out:
 * LibreOffice shows those per locale.
 */
export async function readCached(file: string): Promise<Map<string, SheetCells>> {
  const pkg = await openPackage(fs.readFileSync(file));
  const sst = ((pkg.text("xl/sharedStrings.xml")) ?? "").match(/<si\b[^>]*>[\s\S]*?<\/si>|<si\/>/g)?.map(textOf) ?? [];
  const styles = (pkg.text("xl/styles.xml")) ?? "";
  const xfs = /<cellXfs\b[^>]*>([\s\S]*?)<\/cellXfs>/.exec(styles)?.[1]?.match(/<xf\b[^>]*>/g) ?? [];
  const customFormats = new Map([...styles.matchAll(/<numFmt\b[^>]*numFmtId="(\d+)"[^>]*formatCode="([^"]*)"/g)].map((m) => [Number(m[1]), decode(m[2]!)]));
  const isDateStyle = (s: number) => {
    const id = Number(/numFmtId="(\d+)"/.exec(xfs[s] ?? "")?.[1] ?? 0);
    if ((id >= 14 && id <= 22) || (id >= 45 && id <= 47)) return true;
    const code = customFormats.get(id);
    return code !== undefined && /[dmyhs]/i.test(code.replace(/"[^"]*"|\[[^\]]*\]/g, ""));
  };
  const out = new Map<string, SheetCells>();
  for (const sheet of pkg.sheets) {
    const xml = (pkg.text(sheet.path)) as string;
    const soil = new Set<string>();
    const direct = new Set<string>();
    const formulas = new Map<string, string>();
    const values = new Map<string, Shown>();
    const styles = new Map<string, number>();
    for (const m of xml.matchAll(/<c\b([^>]*?)(?:\/>|>([\s\S]*?)<\/c>)/g)) {
      const attrs = m[1]!;
      const body = m[2] ?? "";
      const addr = /\sr="([A-Z]+\d+)"/.exec(attrs)![1]!;
      const t = /\st="([^"]+)"/.exec(attrs)?.[1] ?? "n";
      const style = Number(/\ss="(\d+)"/.exec(attrs)?.[1] ?? 0);
      if (style) styles.set(addr, style);
      const f = /<f\b([^>]*)>([\s\S]*?)<\/f>/.exec(body);
      if (f) {
        const text = decode(f[2]!);
        formulas.set(addr, text);
        if (callsSoil(text)) {
          const r = parseRange(/\sref="([^"]+)"/.exec(f[1]!)?.[1] ?? addr);
          const outer = /^_xldudf_SOIL_/i.test(text.trim());
          for (let dr = 0; dr < r.rows; dr++) {
            for (let dc = 0; dc < r.cols; dc++) {
              const at = a1({ row: r.top.row + dr, col: r.top.col + dc });
              soil.add(at);
              if (outer) direct.add(at);
            }
          }
        }
      }
      const v = /<v>([\s\S]*?)<\/v>/.exec(body)?.[1];
      if (t === "b" || (t === "n" && v !== undefined && isDateStyle(style))) continue;
      if (t === "inlineStr") values.set(addr, textOf(/<is>([\s\S]*?)<\/is>/.exec(body)?.[1] ?? ""));
      else if (v === undefined) values.set(addr, null);
      else if (t === "s") values.set(addr, sst[Number(v)] ?? "");
      else if (t === "str") values.set(addr, decode(v));
      else if (t === "e") values.set(addr, { error: decode(v) });
      else values.set(addr, Number(v));
    }
    out.set(sheet.name, { values, soil, direct, formulas, styles });
  }
  return out;
}

/** RFC 4180 CSV, as LibreOffice writes it (one parser for every test). */
export { parseCsv } from "../helpers/csv";

export function csvCell(rows: string[][], address: string): string {
  const { top } = parseRange(address);
  return rows[top.row]?.[top.col] ?? "";
}

/** Whether LibreOffice's text for a cell shows the value we cached. */
export function shows(text: string, v: Shown): boolean {
  if (v === null) return text === "";
  if (typeof v === "number") {
    const n = Number(text);
    return text.trim() !== "" && Number.isFinite(n) && Math.abs(n - v) <= 1e-12 * Math.max(1, Math.abs(v));
  }
  if (typeof v === "string") return text === v;
  return text === v.error;
}

export interface LoRun {
  stdout: string;
  stderr: string;
}

export function libreoffice(profile: string, args: string[]): LoRun {
  // LibreOffice prints its conversion lines on stdout and warnings on stderr; both are returned.
  const res = { stdout: "", stderr: "" };
  try {
    res.stdout = execFileSync(soffice!, [`-env:UserInstallation=file://${profile}`, "--headless", "--norestore", ...args], {
      encoding: "utf8",
      stdio: ["ignore", "pipe", "pipe"],
      timeout: 180_000,
    });
  } catch (e) {
    const err = e as { stdout?: string; stderr?: string; message: string };
    throw new Error(`libreoffice failed: ${err.message}\n${err.stdout ?? ""}\n${err.stderr ?? ""}`);
  }
  return res;
}

/** Lines that are not LibreOffice's normal chatter: load errors, repair notices. */
export function troubles(run: LoRun): string[] {
  return `${run.stdout}\n${run.stderr}`
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter((l) => l && !/^convert .* using filter/.test(l) && !/^Writing sheet /.test(l) && !/failed to launch javaldx/.test(l));
}

export async function madeWorkbook(file: string): Promise<string> {
  return writeWorkbook(file, (wb) => {
    const ws = wb.addWorksheet("Lab");
    ws.addRow(["sample", "Ca mg/kg", "Ca cmol(+)/kg", "version", "bad ion", "double", "P kg/ha", "band"]);
    ws.addRow(["S1", 2003.9]);
    ws.addRow(["S2", 1001.95]);
    ws.addRow(["S3", null]);
    ws.addRow(["S4", -5]);
    ws.getCell("C2").value = { formula: 'SOIL.CMOL(B2:B5,"Ca")' } as never; // spills C2:C5
    ws.getCell("D2").value = { formula: "SOIL.VERSION()" } as never; // text
    ws.getCell("E2").value = { formula: 'SOIL.CMOL(1,"Xx")' } as never; // error
    ws.getCell("F2").value = { formula: "C2*2" } as never; // native, over a SOIL cell
    ws.getCell("G2").value = { formula: 'SOIL.CONVERT({10;20},"mg/kg",{"kg/ha";"lb/ac"},15,1.3)' } as never;
    ws.getCell("H2").value = { formula: "SOIL.BAND(B2:B5,{500,1000,2500,3000})" } as never; // text spill
    ws.getCell("A8").value = "saturation, %";
    ws.getCell("B8").value = { formula: 'SOIL.SATURATION({"Ca","Mg","K","Na","acidity"},2000,180,150,30,"mg/kg",2)' } as never; // spills a row
    const notes = wb.addWorksheet("Notes");
    notes.getCell("A1").value = "untouched text, with a comma";
    notes.getCell("B1").value = { formula: "LEN(A1)" } as never;
    notes.getCell("A2").value = 3.25;
  });
}

export function sampleWorkbooks(): string[] {
  const dir = path.join(ROOT, "sample-workbooks");
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir)
    .filter((n) => /\.xlsx$/i.test(n) && !n.startsWith("~$"))
    .map((n) => path.join(dir, n));
}

