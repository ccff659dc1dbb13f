/**
 * What `soilcell recalc` was given, as a list of workbooks: files as named, folders walked
 * recursively (.xlsx and .xlsm only), and glob patterns expanded by the tool itself (so a quoted
 * pattern works the same in every shell). In folders and globs, the tool's own outputs
 * (NAME.recalc.xlsx, NAME.values.xlsx) and Office's lock files (~$NAME.xlsx) are skipped.
 * Outputs go beside each input, or under an output folder mirroring the tree.
 */
import fs from "fs";
import path from "path";
import { globSync } from "tinyglobby";
import { defaultOutputPath } from "../engine/recalc";
import type { SeasonJob } from "../engine/season/jobs";
import type { Skipped } from "../engine/season/summary";

const WORKBOOK = /\.xls[xm]$/i;
const OWN_OUTPUT = /\.(recalc|values)\.xls[xm]$/i;
const LOCK = /^~\$/;
const GLOB = /[*?[\]{}]/;

export interface Expanded {
  readonly jobs: SeasonJob[];
  /** Inputs that cannot be run (a pattern matching nothing, two inputs writing one output): refused. */
  readonly refused: { readonly input: string; readonly reason: string }[];
  /** Files passed over on purpose (lock files, the tool's own outputs named explicitly). */
  readonly skipped: Skipped[];
}

/** NAME.values.xlsx beside a recalculated workbook's path. */
export function valuesPathFor(output: string): string {
  const ext = path.extname(output);
  const base = path.basename(output, ext).replace(/\.recalc$/i, "");
  return path.join(path.dirname(output), `${base}.values${ext || ".xlsx"}`);
}

function walk(dir: string, out: string[]): void {
  const entries = fs.readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name));
  for (const e of entries) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) walk(p, out);
    else if (e.isFile() && WORKBOOK.test(e.name)) out.push(p);
  }
}

/** The folder a glob's matches are relative to: its segments before the first with a wildcard. */
function globBase(pattern: string): string {
  const parts = pattern.split(/[\\/]/);
  const fixed: string[] = [];
  for (const p of parts) {
    if (GLOB.test(p)) break;
    fixed.push(p);
  }
  return fixed.length ? fixed.join("/") || "/" : ".";
}

/**
 * @param args files, folders and glob patterns, in the order given
 * @param outDir an output folder to mirror the tree under, or undefined for beside each input
 */
export function expandInputs(args: readonly string[], outDir: string | undefined, values: boolean): Expanded {
  const found: { file: string; base?: string }[] = [];
  const refused: Expanded["refused"] = [];
  const skipped: Skipped[] = [];
  const takeFromSet = (files: string[], base: string) => {
    for (const f of files) {
      const name = path.basename(f);
      if (LOCK.test(name)) skipped.push({ input: f, reason: "an Office lock file (the workbook is open somewhere)" });
      else if (OWN_OUTPUT.test(name)) continue; // our own earlier outputs: not inputs, not worth a line each
      else found.push({ file: f, base });
    }
  };
  for (const a of args) {
    let st: fs.Stats | undefined;
    try {
      st = fs.statSync(a);
    } catch {
      st = undefined;
    }
    if (st?.isDirectory()) {
      const files: string[] = [];
      walk(a, files);
      if (!files.length) refused.push({ input: a, reason: "the folder holds no .xlsx or .xlsm workbook" });
      takeFromSet(files, a);
    } else if (!st && GLOB.test(a)) {
      const files = globSync([a], { onlyFiles: true, dot: false, expandDirectories: false }).filter((f) => WORKBOOK.test(f)).sort();
      if (!files.length) refused.push({ input: a, reason: "no .xlsx or .xlsm workbook matches this pattern" });
      takeFromSet(files, globBase(a));
    } else if (st && LOCK.test(path.basename(a))) {
      skipped.push({ input: a, reason: "an Office lock file (the workbook is open somewhere)" });
    } else {
      // A file as named (recalc refuses what is not a workbook), or a path that does not exist.
      found.push({ file: a });
    }
  }
  // The same workbook reached twice (a file and its folder) runs once.
  const seen = new Set<string>();
  const claimed = new Map<string, string>();
  const jobs: SeasonJob[] = [];
  for (const f of found) {
    let id: string;
    try {
      const s = fs.statSync(f.file);
      id = `${s.dev}:${s.ino}`;
    } catch {
      id = path.resolve(f.file);
    }
    if (seen.has(id)) continue;
    seen.add(id);
    const beside = defaultOutputPath(f.file);
    const output = outDir === undefined ? beside : path.join(outDir, f.base === undefined ? path.basename(beside) : path.relative(f.base, beside));
    const key = path.resolve(output);
    const other = claimed.get(key);
    if (other !== undefined) {
      refused.push({ input: f.file, reason: `its output ${output} would be the output of ${other} too; run them separately or rename one` });
      continue;
    }
    claimed.set(key, f.file);
    jobs.push(values ? { input: f.file, output, valuesOutput: valuesPathFor(output) } : { input: f.file, output });
  }
  return { jobs, refused, skipped };
}
