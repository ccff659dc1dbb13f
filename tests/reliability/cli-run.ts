/**
 * (A helper: no reference values of its own; the workbooks it runs are invented.)
 * Runs the soilcell command as a user would (node bin/soilcell.js …), with its peak memory
 * recorded by rusage-hook.js, a time limit (a hang fails fast) and optionally a capped heap.
 * Shared by the reliability tests.
 */
import { spawnSync } from "child_process";
import fs from "fs";
import path from "path";
import { tempDir } from "../helpers/workbook";

export const ROOT = path.join(__dirname, "../..");
export const BIN = path.join(ROOT, "bin/soilcell.js");
const HOOK = path.join(__dirname, "rusage-hook.js");
const PROGRESS = /^(reading|computing|writing) /;

export interface Run {
  status: number | null;
  signal: string | null;
  stdout: string;
  stderr: string;
  seconds: number;
  /** Peak resident set size of the child, MB (NaN when the child was killed). */
  rssMB: number;
  /** True when the time limit killed it. */
  timedOut: boolean;
}

/** Runs the soilcell command with its peak memory recorded; `heapMB` caps the child's heap. */
export function soilcell(args: string[], heapMB?: number, timeoutMs = 120000, extraNodeArgs: string[] = []): Run {
  const dir = tempDir("soilcell-rusage-");
  const usage = path.join(dir, "usage.json");
  const started = process.hrtime.bigint();
  const r = spawnSync(process.execPath, [...(heapMB ? [`--max-old-space-size=${heapMB}`] : []), "-r", HOOK, ...extraNodeArgs, BIN, ...args], {
    encoding: "utf8",
    timeout: timeoutMs,
    killSignal: "SIGKILL",
    env: { ...process.env, SOILCELL_RUSAGE_FILE: usage },
    maxBuffer: 64 * 1024 * 1024,
  });
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  const rssMB = fs.existsSync(usage) ? JSON.parse(fs.readFileSync(usage, "utf8")).maxRSS / 1024 : NaN;
  fs.rmSync(dir, { recursive: true, force: true });
  const timedOut = (r.error as NodeJS.ErrnoException | undefined)?.code === "ETIMEDOUT";
  return { status: r.status, signal: r.signal, stdout: r.stdout ?? "", stderr: r.stderr ?? "", seconds, rssMB, timedOut };
}

/** The stderr lines that are not progress lines. */
export const messages = (stderr: string): string[] => stderr.split("\n").filter((l) => l.trim() && !PROGRESS.test(l));

/**
 * Runs the command's `main` from src in this process (stdout and stderr collected as lines), for
 * tests that mutation testing must see: it changes src, never the build the command runs. Time is
 * measured; peak memory is not the command's own here (NaN).
 */
export async function soilcellInProcess(args: string[]): Promise<Run> {
  // Loaded here, not at the top: the tests that spawn the command must not need src compiled.
  const { main } = await import("../../src/cli/main");
  const out: string[] = [];
  const err: string[] = [];
  const started = process.hrtime.bigint();
  let status: number;
  try {
    status = await main(args, { out: (l) => void out.push(l), err: (l) => void err.push(l) });
  } catch (e) {
    // as runAsProcess reports it
    err.push(`soilcell: unexpected failure: ${e instanceof Error ? e.message : String(e)}`);
    status = 3;
  }
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  const lines = (a: string[]) => (a.length ? `${a.join("\n")}\n` : "");
  return { status, signal: null, stdout: lines(out), stderr: lines(err), seconds, rssMB: NaN, timedOut: false };
}
