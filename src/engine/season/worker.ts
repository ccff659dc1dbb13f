/**
 * A worker thread of a season run: recalculates the workbooks the main thread sends, one at a
 * time, and answers each with its outcome (and progress lines while it works).
 */
import { parentPort } from "worker_threads";
import { SeasonItem } from "./inputs";
import { recalcOne } from "./one";

export interface Job {
  readonly id: number;
  readonly item: SeasonItem;
  readonly maxCells?: number;
}

const port = parentPort;
if (port) {
  port.on("message", (job: Job) => {
    void recalcOne(job.item, {
      ...(job.maxCells !== undefined ? { maxCells: job.maxCells } : {}),
      progress: (line) => port.postMessage({ id: job.id, progress: line }),
    }).then((outcome) => port.postMessage({ id: job.id, outcome }));
  });
}
