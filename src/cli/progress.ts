/**
 * Progress of a season run on standard error: a bar (cli-progress) redrawn in place on a terminal,
 * one plain line per workbook otherwise (a log, a CI job), nothing at all with --json.
 */
import { SingleBar } from "cli-progress";
import type { JobOutcome } from "../engine/season/jobs";
import type { Io } from "./command";

export interface Progress {
  update(o: JobOutcome, done: number, total: number): void;
  stop(): void;
}

const n = (x: number) => x.toLocaleString("en-US");

function line(o: JobOutcome, done: number, total: number): string {
  const at = `[${done}/${total}] ${o.job.input}:`;
  if (o.kind !== "recalculated") return `${at} ${o.kind} — ${o.reason}`;
  const s = o.summary;
  return `${at} ${n(s.formulaCells)} formula cells, ${n(s.errors.length)} in error, ${s.seconds.toFixed(1)} s`;
}

export function progressFor(io: Io, total: number, quiet: boolean): Progress {
  if (quiet) return { update: () => undefined, stop: () => undefined };
  if (io.errIsTty && io.errStream) {
    let cells = 0;
    const bar = new SingleBar({
      stream: io.errStream,
      format: "recalc {bar} {value}/{total} workbooks | {cells} formula cells | {duration_formatted} elapsed | about {eta_formatted} left",
      barsize: 24,
      hideCursor: true,
      clearOnComplete: true,
      etaBuffer: 8,
    });
    bar.start(total, 0, { cells: "0" });
    return {
      update(o, done) {
        if (o.kind === "recalculated") cells += o.summary.formulaCells;
        bar.update(done, { cells: n(cells) });
      },
      stop: () => bar.stop(),
    };
  }
  return { update: (o, done, t) => io.err(line(o, done, t)), stop: () => undefined };
}
