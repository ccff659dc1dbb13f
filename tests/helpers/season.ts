/**
 * Test helpers for season runs: small generated workbooks (invented lab values: Ca in mg/kg with
 * SOIL.CMOL beside it, optionally cells in error), folders of them, and the soilcell command run
 * as a user runs it, from a working folder.
 */
import { spawnSync } from "child_process";
import fs from "fs";
import path from "path";
import { c, f, row, xlsxBytes } from "./xlsx";

export const BIN = path.join(__dirname, "../../bin/soilcell.js");

/**
 * A farm's workbook: `samples` rows of Ca (400.78 mg/kg times the row number, invented) with
 * `=SOIL.CMOL(Ax,"Ca")` beside each, and `errors` rows asking for an unknown ion.
 */
export function farmBook(samples: number, errors = 0, sheet = "Lab"): Buffer {
  const rows: string[] = [row(1, c("A1", "Ca mg/kg"), c("B1", "Ca cmol(+)/kg"))];
  for (let i = 0; i < samples; i++) {
    const r = i + 2;
    rows.push(row(r, c(`A${r}`, 400.78 * (i + 1)), f(`B${r}`, `_xldudf_SOIL_CMOL(A${r},"Ca")`)));
  }
  for (let i = 0; i < errors; i++) {
    const r = samples + i + 2;
    rows.push(row(r, c(`A${r}`, 100), f(`B${r}`, `_xldudf_SOIL_CMOL(A${r},"Xx")`)));
  }
  return xlsxBytes({ sheets: [{ name: sheet, rows: rows.join("") }] });
}

export function put(file: string, bytes: Buffer | string): string {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, bytes);
  return file;
}

export interface CliRun {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** `soilcell ARGS` from the folder `cwd`, standard output and error piped (not a terminal). */
export function soilcellIn(cwd: string, ...args: string[]): CliRun {
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd, encoding: "utf8", maxBuffer: 256 * 1024 * 1024, timeout: 180_000 });
  return { status: r.status, stdout: r.stdout ?? "", stderr: r.stderr ?? "" };
}

/** Every file under a folder, as paths relative to it, sorted. */
export function filesUnder(dir: string): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    for (const e of fs.readdirSync(d, { withFileTypes: true })) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) walk(p);
      else out.push(path.relative(dir, p));
    }
  };
  if (fs.existsSync(dir)) walk(dir);
  return out.sort();
}
