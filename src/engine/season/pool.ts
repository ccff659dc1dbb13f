/**
 * Runs a season's workbooks: one after another in this thread (one job), or in worker threads,
 * one workbook per worker at a time, each worker taking the next as it finishes, largest file
 * first (so one big workbook does not start last and keep the run waiting). A worker that dies
 * (out of memory, say) fails only its own workbook; a new worker takes up the rest.
 */
import fs from "fs";
import os from "os";
import path from "path";
import { Worker } from "worker_threads";
import { SeasonItem } from "./inputs";
import { Outcome, recalcOne } from "./one";
import type { Job } from "./worker";

export interface FileResult {
  readonly item: SeasonItem;
  readonly outcome: Outcome;
}

export interface PoolOptions {
  /** Workbooks recalculated at once; 1 runs them in this thread. */
  readonly jobs: number;
  readonly maxCells?: number;
  /** A workbook's engine progress line ("reading …", "computing …", "writing …"). */
  readonly onProgress?: (item: SeasonItem, line: string) => void;
  /** A workbook finished, in the order they finish. */
  readonly onDone?: (result: FileResult) => void;
}

/** The number of cores Node may use: the default number of jobs. */
export function defaultJobs(): number {
  return typeof os.availableParallelism === "function" ? os.availableParallelism() : Math.max(1, os.cpus().length);
}

/** The compiled worker script (tests run the TypeScript sources, which a worker cannot load). */
function workerScript(): string {
  const here = path.join(__dirname, "worker.js");
  if (fs.existsSync(here)) return here;
  const built = path.join(__dirname, "..", "..", "..", "build", "src", "engine", "season", "worker.js");
  if (fs.existsSync(built)) return built;
  throw new Error("the season worker is not built; run `npm run build:node`");
}

function sizeOf(item: SeasonItem): number {
  try {
    return fs.statSync(item.input).size;
  } catch {
    return 0; // refused when its turn comes, with the reason
  }
}

/** Recalculates every item; results in the items' order, whatever order they finish in. */
export async function runSeason(items: readonly SeasonItem[], options: PoolOptions): Promise<FileResult[]> {
  const jobs = Math.max(1, Math.min(Math.floor(options.jobs), items.length));
  const results: FileResult[] = new Array(items.length);
  const finish = (i: number, outcome: Outcome) => {
    const r = { item: items[i] as SeasonItem, outcome };
    results[i] = r;
    options.onDone?.(r);
  };
  if (jobs <= 1) {
    for (let i = 0; i < items.length; i++) {
      const item = items[i] as SeasonItem;
      const progress = options.onProgress;
      finish(i, await recalcOne(item, { ...(options.maxCells !== undefined ? { maxCells: options.maxCells } : {}), ...(progress ? { progress: (l: string) => progress(item, l) } : {}) }));
    }
    return results;
  }
  const script = workerScript();
  const order = items.map((_, i) => i).sort((a, b) => sizeOf(items[b] as SeasonItem) - sizeOf(items[a] as SeasonItem) || a - b);
  let next = 0;
  await new Promise<void>((resolve) => {
    let running = 0;
    const start = () => {
      if (next >= items.length) {
        if (running === 0) resolve();
        return;
      }
      running += 1;
      const worker = new Worker(script);
      let current = -1;
      let started = 0n;
      const give = () => {
        if (next >= items.length) {
          current = -1;
          void worker.terminate();
          return;
        }
        current = order[next++] as number;
        started = process.hrtime.bigint();
        const job: Job = { id: current, item: items[current] as SeasonItem, ...(options.maxCells !== undefined ? { maxCells: options.maxCells } : {}) };
        worker.postMessage(job);
      };
      worker.on("message", (m: { id: number; progress?: string; outcome?: Outcome }) => {
        if (m.id !== current) return;
        if (m.progress !== undefined) options.onProgress?.(items[current] as SeasonItem, m.progress);
        else if (m.outcome) {
          finish(current, m.outcome);
          give();
        }
      });
      let ended = false;
      const died = (why: string) => {
        if (ended) return;
        ended = true;
        if (current >= 0 && !results[current]) {
          finish(current, { kind: "failed", reason: why, seconds: Number(process.hrtime.bigint() - started) / 1e9 });
        }
        current = -1;
        running -= 1;
        start(); // a fresh worker for the rest, if any
      };
      worker.on("error", (e: Error & { code?: string }) => {
        died(e.code === "ERR_WORKER_OUT_OF_MEMORY" ? "the workbook needs more memory than a worker has; run it on its own (one file, or --jobs 1)" : `unexpected failure: ${e.message}`);
      });
      worker.on("exit", (code) => died(`unexpected failure: the worker stopped (exit ${code})`));
      give();
    };
    for (let w = 0; w < jobs; w++) start();
  });
  return results;
}
