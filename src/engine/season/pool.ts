/**
 * A season's workbooks recalculated on every core: worker threads that each take the next
 * workbook as they finish one (files differ in size, so a fixed split would leave a core idle).
 * One worker, or one workbook, runs in this thread. A worker that dies (out of memory, say) fails
 * only the workbook it held; a fresh one takes its place for the rest.
 */
import fs from "fs";
import os from "os";
import path from "path";
import { Worker } from "worker_threads";
import type { JobOutcome, SeasonJob } from "./jobs";
import { runJob } from "./run-one";

export interface PoolOptions {
  /** Worker threads; default the machine's cores. */
  readonly jobs?: number;
  /** Called as each workbook ends, in the order they end. */
  readonly onOutcome?: (outcome: JobOutcome, done: number, total: number) => void;
}

/** Cores available to this process (what `--jobs` defaults to). */
export function defaultJobs(): number {
  return typeof os.availableParallelism === "function" ? os.availableParallelism() : os.cpus().length;
}

/** The compiled worker script (tests running from TypeScript sources use the build's copy). */
function workerScript(): string {
  const beside = path.join(__dirname, "worker.js");
  if (fs.existsSync(beside)) return beside;
  const built = path.join(__dirname, "..", "..", "..", "build", "src", "engine", "season", "worker.js");
  if (fs.existsSync(built)) return built;
  throw new Error("the season worker is not built; run `npm run build:node`");
}

/** Outcomes in the order of `jobs`, whatever order they finished in. */
export async function runSeason(jobs: readonly SeasonJob[], options: PoolOptions = {}): Promise<JobOutcome[]> {
  const outcomes: JobOutcome[] = new Array(jobs.length);
  let done = 0;
  const record = (i: number, o: JobOutcome) => {
    outcomes[i] = o;
    done++;
    options.onOutcome?.(o, done, jobs.length);
  };
  const threads = Math.max(1, Math.min(options.jobs ?? defaultJobs(), jobs.length));
  if (threads === 1) {
    for (let i = 0; i < jobs.length; i++) record(i, await runJob(jobs[i] as SeasonJob));
    return outcomes;
  }
  const script = workerScript();
  let next = 0;
  await new Promise<void>((resolve) => {
    let running = 0;
    const start = () => {
      if (next >= jobs.length) {
        if (running === 0) resolve();
        return;
      }
      running++;
      const w = new Worker(script);
      let current = -1;
      const give = () => {
        if (next >= jobs.length) {
          current = -1;
          void w.terminate();
          return;
        }
        current = next++;
        w.postMessage(jobs[current]);
      };
      w.on("message", (o: JobOutcome) => {
        record(current, o);
        give();
      });
      w.on("error", (e) => {
        // The workbook it held fails; the exit handler starts a replacement.
        if (current >= 0) record(current, { kind: "failed", job: jobs[current] as SeasonJob, reason: `unexpected failure: ${e.message}`, seconds: 0 });
        current = -1;
      });
      w.on("exit", (code) => {
        if (current >= 0) record(current, { kind: "failed", job: jobs[current] as SeasonJob, reason: `the worker stopped (exit code ${code}) while recalculating it`, seconds: 0 });
        running--;
        if (next < jobs.length) start();
        else if (running === 0) resolve();
      });
      give();
    };
    for (let k = 0; k < threads; k++) start();
  });
  return outcomes;
}
