/**
 * PDF through a real office engine: LibreOffice headless converts workbooks to PDF (pages laid
 * out by the sheets' own page setup, fonts embedded), poppler's tools count, split and join the
 * pages. Each conversion starts LibreOffice once, with a throw-away profile, for all its files.
 */
import { spawn, execFileSync } from "child_process";
import fs from "fs";
import os from "os";
import path from "path";

export interface OfficeTools {
  /** LibreOffice's soffice (or libreoffice) program. */
  readonly soffice?: string;
  readonly pdfinfo?: string;
  readonly pdfseparate?: string;
  readonly pdfunite?: string;
}

/** The first of `names` on PATH (or an absolute path that exists), or undefined. */
export function findProgram(...names: string[]): string | undefined {
  for (const n of names) {
    if (path.isAbsolute(n)) {
      if (fs.existsSync(n)) return n;
      continue;
    }
    for (const dir of (process.env.PATH ?? "").split(path.delimiter)) {
      if (!dir) continue;
      const p = path.join(dir, n);
      try {
        fs.accessSync(p, fs.constants.X_OK);
        if (fs.statSync(p).isFile()) return p;
      } catch {
        // not here
      }
    }
  }
  return undefined;
}

/** The office tools on this machine (SOILCELL_SOFFICE names a LibreOffice program elsewhere). */
export function findOfficeTools(): OfficeTools {
  const soffice = process.env.SOILCELL_SOFFICE ? findProgram(process.env.SOILCELL_SOFFICE) : findProgram("soffice", "libreoffice");
  return { soffice, pdfinfo: findProgram("pdfinfo"), pdfseparate: findProgram("pdfseparate"), pdfunite: findProgram("pdfunite") };
}

/** What to install for what is missing, in one line. */
export function missingToolsMessage(t: OfficeTools): string | undefined {
  if (!t.soffice) return "LibreOffice is not installed (Debian: apt-get install libreoffice-calc), so no PDF was written; the workbooks are.";
  const poppler = [t.pdfinfo ? "" : "pdfinfo", t.pdfseparate ? "" : "pdfseparate", t.pdfunite ? "" : "pdfunite"].filter(Boolean);
  if (poppler.length) return `poppler's ${poppler.join(", ")} not installed (Debian: apt-get install poppler-utils), so no PDF was written; the workbooks are.`;
  return undefined;
}

export class OfficeError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "OfficeError";
  }
}

export interface ConvertResult {
  /** The PDFs written, in the order of the inputs (undefined where LibreOffice wrote none). */
  readonly pdfs: (string | undefined)[];
  readonly seconds: number;
  /** LibreOffice's lines that are not its usual chatter. */
  readonly notes: string[];
}

/** LibreOffice's version line ("LibreOffice 7.4.7.2 …"). */
export function officeVersion(t: OfficeTools): string {
  if (!t.soffice) return "";
  try {
    return execFileSync(t.soffice, ["--version"], { encoding: "utf8", timeout: 60_000, stdio: ["ignore", "pipe", "ignore"] }).trim();
  } catch {
    return "LibreOffice (version not known)";
  }
}

/**
 * Converts workbooks to PDF with one LibreOffice process (a fresh profile of its own, so runs
 * side by side do not meet). Resolves when it exits; files it did not convert are undefined.
 */
export async function convertToPdf(t: OfficeTools, files: readonly string[], outDir: string, timeoutSeconds = 900): Promise<ConvertResult> {
  if (!t.soffice) throw new OfficeError("LibreOffice is not installed");
  const started = Date.now();
  fs.mkdirSync(outDir, { recursive: true });
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), "soilcell-office-"));
  const args = [`-env:UserInstallation=file://${profile}`, "--headless", "--norestore", "--nologo", "--nodefault", "--nolockcheck", "--convert-to", "pdf", "--outdir", outDir, ...files];
  let out = "";
  try {
    await new Promise<void>((resolve, reject) => {
      const child = spawn(t.soffice as string, args, { stdio: ["ignore", "pipe", "pipe"] });
      const timer = setTimeout(() => {
        child.kill("SIGKILL");
        reject(new OfficeError(`LibreOffice did not finish within ${timeoutSeconds} s`));
      }, timeoutSeconds * 1000);
      child.stdout.on("data", (d: Buffer) => (out += d.toString("utf8")));
      child.stderr.on("data", (d: Buffer) => (out += d.toString("utf8")));
      child.on("error", (e) => {
        clearTimeout(timer);
        reject(new OfficeError(`LibreOffice could not start: ${e.message}`));
      });
      child.on("close", (code) => {
        clearTimeout(timer);
        if (code === 0) resolve();
        else reject(new OfficeError(`LibreOffice exited with ${code}: ${lastLines(out)}`));
      });
    });
  } finally {
    fs.rmSync(profile, { recursive: true, force: true });
  }
  const pdfs = files.map((f) => {
    const pdf = path.join(outDir, `${path.basename(f, path.extname(f))}.pdf`);
    return fs.existsSync(pdf) ? pdf : undefined;
  });
  const notes = out
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter((l) => l && !/^convert .* using filter/.test(l) && !/failed to launch javaldx/.test(l));
  return { pdfs, seconds: (Date.now() - started) / 1000, notes };
}

function lastLines(s: string): string {
  return s.trim().split(/\r?\n/).slice(-3).join(" | ") || "no output";
}

function run(program: string | undefined, what: string, args: string[]): string {
  if (!program) throw new OfficeError(`${what} is not installed (poppler-utils)`);
  try {
    return execFileSync(program, args, { encoding: "utf8", timeout: 300_000, stdio: ["ignore", "pipe", "pipe"], maxBuffer: 64 * 1024 * 1024 });
  } catch (e) {
    const err = e as { stderr?: string; message: string };
    throw new OfficeError(`${what} failed: ${(err.stderr ?? err.message).trim().split(/\r?\n/)[0]}`);
  }
}

/** A PDF's page count (pdfinfo). */
export function pdfPageCount(t: OfficeTools, file: string): number {
  const info = run(t.pdfinfo, "pdfinfo", [file]);
  const m = /^Pages:\s+(\d+)/m.exec(info);
  if (!m) throw new OfficeError(`pdfinfo gave no page count for ${file}`);
  return Number(m[1]);
}

/** Splits a PDF into one file per page: `pattern` holds %d for the page number (pdfseparate). */
export function splitPdf(t: OfficeTools, file: string, pattern: string): void {
  run(t.pdfseparate, "pdfseparate", [file, pattern]);
}

/** Joins PDFs into one, in order (pdfunite). */
export function unitePdfs(t: OfficeTools, files: readonly string[], out: string): void {
  if (files.length === 1) {
    fs.copyFileSync(files[0] as string, out);
    return;
  }
  run(t.pdfunite, "pdfunite", [...files, out]);
}
