/**
 * A season's inputs: files, folders (walked recursively) and glob patterns (expanded here, so a
 * quoted pattern works the same in every shell) turned into one list of workbooks, each with the
 * path it will be written to. Nothing is read or written here but folder listings.
 *
 * Folders and patterns yield only .xlsx and .xlsm files and skip, without a word, what is not a
 * workbook of the user's: soilcell's own outputs (`NAME.recalc.xlsx`, `NAME.recalc.values.xlsx`),
 * Office's lock files (`~$NAME.xlsx`, left while a workbook is open), and hidden names (`.NAME`:
 * our temporary files, and the `._NAME.xlsx` companions macOS leaves on shared drives, which are
 * not workbooks). Folders reached through a symbolic link are not entered (a link can make a loop);
 * a linked file is taken. A file named on the command line is taken as it is.
 */
import fs from "fs";
import path from "path";
import { globSync, isDynamicPattern } from "tinyglobby";
import { defaultOutputPath, valuesCopyPath } from "../recalc";

/** The values copy's name beside an output: `NAME.recalc.xlsx` → `NAME.recalc.values.xlsx`. */
export { valuesCopyPath };

/** One workbook of the run, and where its results go. */
export interface SeasonItem {
  /** The input as given or found (relative to the working folder when the argument was). */
  readonly input: string;
  readonly output: string;
  /** The copy with SOIL results as plain values, when asked for. */
  readonly valuesCopy?: string;
}

/** An argument or a workbook refused before anything is computed, with the reason. */
export interface InputRefusal {
  readonly input: string;
  readonly reason: string;
}

export interface SeasonInputs {
  readonly items: readonly SeasonItem[];
  readonly refused: readonly InputRefusal[];
}

export interface InputOptions {
  /**
   * `-o`: one output file (one workbook only), or a folder (a trailing "/", or a folder that
   * exists) under which outputs mirror the inputs' folder tree.
   */
  readonly output?: string;
  /** Also write a values copy beside each output. */
  readonly values?: boolean;
}

/** An argument that cannot be run at all (the CLI shows it as a usage error). */
export class InputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "InputError";
  }
}

const WORKBOOK = /\.xls[xm]$/i;
const OWN_OUTPUT = /\.recalc(\.values)?\.xls[xm]$/i;

/** Whether a file found in a folder or by a pattern is a workbook to recalculate. */
export function isSeasonWorkbook(name: string): boolean {
  const base = path.basename(name);
  return WORKBOOK.test(base) && !OWN_OUTPUT.test(base) && !base.startsWith("~$") && !base.startsWith(".");
}

interface Found {
  readonly file: string;
  /** The folder the output tree mirrors from. */
  readonly base: string;
}

/** Every workbook under `dir`, sorted, hidden folders and linked folders not entered. */
function walk(dir: string, into: string[]): void {
  let entries: fs.Dirent[];
  try {
    entries = fs.readdirSync(dir, { withFileTypes: true });
  } catch {
    return; // an unreadable subfolder: its workbooks cannot be listed (the top folder is checked by the caller)
  }
  entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  for (const e of entries) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) {
      if (!e.name.startsWith(".")) walk(p, into);
    } else if (isSeasonWorkbook(e.name) && (e.isFile() || (e.isSymbolicLink() && isFile(p)))) into.push(p);
  }
}

function isFile(p: string): boolean {
  try {
    return fs.statSync(p).isFile();
  } catch {
    return false;
  }
}

/** The folder part of a pattern before its first wildcard segment. */
function staticBase(pattern: string): string {
  const parts = pattern.split(/[\\/]/);
  const fixed: string[] = [];
  for (const part of parts.slice(0, -1)) {
    if (isDynamicPattern(part)) break;
    fixed.push(part);
  }
  if (fixed.length === 1 && fixed[0] === "") return path.sep; // "/…"
  return fixed.length ? fixed.join(path.sep) : ".";
}

/** Expands one argument; a refusal when it names nothing to recalculate. */
function expand(arg: string): Found[] | InputRefusal {
  let stat: fs.Stats | undefined;
  try {
    stat = fs.statSync(arg);
  } catch {
    stat = undefined;
  }
  if (stat?.isDirectory()) {
    try {
      fs.readdirSync(arg);
    } catch (e) {
      return { input: arg, reason: `cannot read the folder ${arg}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}` };
    }
    const files: string[] = [];
    walk(arg, files);
    if (!files.length) return { input: arg, reason: `no .xlsx or .xlsm workbooks in the folder ${arg} (soilcell's own .recalc. outputs and ~$ lock files are skipped)` };
    return files.map((file) => ({ file, base: arg }));
  }
  // A name that exists is a file, whatever its characters; one that does not may be a pattern.
  if (stat || !isDynamicPattern(arg)) return [{ file: arg, base: path.dirname(arg) }];
  // An absolute pattern is matched from its fixed folder: given whole, the glob library reads a
  // wildcard in its first folder (/?mp/…) relative to the working folder and found nothing when
  // that folder was not at the depth it assumed.
  const absolute = path.isAbsolute(arg);
  const base = staticBase(arg);
  const pattern = absolute ? arg.split(/[\\/]/).slice(base === path.sep ? 1 : base.split(/[\\/]/).length).join("/") : arg.replace(/\\/g, "/");
  const matches = globSync([pattern], { ...(absolute ? { cwd: base } : {}), expandDirectories: false, onlyFiles: true, followSymbolicLinks: false, absolute })
    .map((m) => path.normalize(m))
    .filter(isSeasonWorkbook)
    .sort();
  if (!matches.length) return { input: arg, reason: `no .xlsx or .xlsm workbook matches ${arg}` };
  return matches.map((file) => ({ file, base }));
}

function identity(file: string): string {
  try {
    const s = fs.statSync(file);
    return `${s.dev}:${s.ino}`;
  } catch {
    return path.resolve(file);
  }
}

/**
 * Turns the command line's inputs into the run's workbooks and their outputs: each workbook once
 * (the same file reached twice is run once), outputs beside each input or under the `-o` folder.
 * A workbook whose output would be another workbook's output, or another input of the run, is
 * refused (two results must never race for one file, nor one overwrite an input).
 * @throws InputError when `-o` names one file but there are several workbooks
 */
export function seasonInputs(args: readonly string[], options: InputOptions = {}): SeasonInputs {
  const found: Found[] = [];
  const refused: InputRefusal[] = [];
  const seen = new Set<string>();
  for (const arg of args) {
    const r = expand(arg);
    if (!Array.isArray(r)) {
      refused.push(r);
      continue;
    }
    for (const f of r) {
      const id = identity(f.file);
      if (seen.has(id)) continue;
      seen.add(id);
      found.push(f);
    }
  }
  const o = options.output;
  const toFolder = o !== undefined && (/[\\/]$/.test(o) || isDirectory(o));
  if (o !== undefined && !toFolder && found.length > 1) {
    throw new InputError(`-o ${o} names one output file, but there are ${found.length} workbooks; give a folder (-o ${o.replace(/\.xls[xm]$/i, "")}/) to write them under it`);
  }
  const inputs = new Set(found.map((f) => path.resolve(f.file)));
  const taken = new Set<string>();
  const items: SeasonItem[] = [];
  for (const f of found) {
    const output = toFolder ? defaultOutputPath(path.join(o as string, path.relative(f.base, f.file))) : (o ?? defaultOutputPath(f.file));
    const valuesCopy = options.values ? valuesCopyPath(output) : undefined;
    const targets = valuesCopy ? [output, valuesCopy] : [output];
    const clash = targets.find((t) => taken.has(path.resolve(t)) || (inputs.has(path.resolve(t)) && path.resolve(t) !== path.resolve(f.file)));
    if (clash) {
      const what = inputs.has(path.resolve(clash)) ? "is another input of this run" : "is written by another workbook of this run";
      refused.push({ input: f.file, reason: `refusing to write ${clash}: it ${what}; run them separately or choose another output with -o` });
      continue;
    }
    for (const t of targets) taken.add(path.resolve(t));
    items.push(valuesCopy ? { input: f.file, output, valuesCopy } : { input: f.file, output });
  }
  return { items, refused };
}

function isDirectory(p: string): boolean {
  try {
    return fs.statSync(p).isDirectory();
  } catch {
    return false;
  }
}
