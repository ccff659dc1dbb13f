/** A worker thread of a season run: recalculates the workbooks it is sent, one at a time. */
import { parentPort } from "worker_threads";
import type { SeasonJob } from "./jobs";
import { runJob } from "./run-one";

parentPort?.on("message", (job: SeasonJob) => {
  runJob(job).then(
    (outcome) => parentPort?.postMessage(outcome),
    (e) => parentPort?.postMessage({ kind: "failed", job, reason: `unexpected failure: ${(e as Error)?.message ?? String(e)}`, seconds: 0 }),
  );
});
