/**
 * What a season run shows while it works, on standard error:
 * - on a terminal, a progress bar (cli-progress): workbooks done of the total, formula cells
 *   computed, time elapsed and the estimate, and what is being done now; refusals after it;
 * - otherwise plain lines: for one workbook the engine's own (reading…, computing…, writing…),
 *   for several one line per workbook as it finishes;
 * - with --json, nothing (standard output is the JSON alone; refusals are in it).
 * A refusal is always one line "soilcell: …" (naming the workbook when there are several).
 */
import cliProgress from "cli-progress";
import { SeasonItem } from "../engine/season/inputs";
import { FileResult } from "../engine/season/pool";
import { Io } from "./io";
import { count } from "./render/season";

export interface Progress {
  progress(item: SeasonItem, line: string): void;
  done(result: FileResult): void;
  /** Ends the display (the bar is cleared) and prints what waited for it. */
  stop(): void;
}

export type ProgressMode = "quiet" | "bar" | "lines";

/** The refusal line for a workbook. */
function refusalLine(r: FileResult, several: boolean): string | undefined {
  const o = r.outcome;
  if (o.kind === "recalculated") return undefined;
  const what = o.kind === "failed" ? `${o.reason} (a failure in soilcell itself: please report it)` : o.reason;
  return several ? `soilcell: ${r.item.input}: ${what}` : `soilcell: ${what}`;
}

/** Seconds as m:ss. */
function clock(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, "0")}`;
}

export function progressFor(io: Io, mode: ProgressMode, total: number): Progress {
  const several = total > 1;
  if (mode === "quiet") return { progress: () => undefined, done: () => undefined, stop: () => undefined };
  if (mode === "lines" || !io.tty) {
    let finished = 0;
    return {
      progress: (_item, line) => {
        if (!several) io.err(line);
      },
      done: (r) => {
        finished += 1;
        const refusal = refusalLine(r, several);
        if (refusal) io.err(refusal);
        else if (several && r.outcome.kind === "recalculated") {
          const s = r.outcome.summary;
          io.err(`[${finished}/${total}] ${r.item.input}: ${count(s.computedCells)} formula cells, ${count(s.errors.length)} in error, ${s.seconds.toFixed(1)} s`);
        }
      },
      stop: () => undefined,
    };
  }
  const bar = new cliProgress.SingleBar(
    {
      stream: io.tty,
      format: (options, params, payload: { cells: string; now: string }) => {
        const bar = cliProgress.Format.BarFormat(params.progress, options);
        const elapsed = (Date.now() - params.startTime) / 1000;
        // No estimate before the first workbook is done (the library would print "NF").
        const eta = params.value > 0 && Number.isFinite(params.eta) ? `${clock(params.eta)} to go` : "estimating";
        // What matters first: an 80-column terminal shows up to the estimate.
        return `${bar} ${params.value}/${params.total} workbooks | ${payload.cells} cells | ${clock(elapsed)} elapsed, ${eta} | ${payload.now}`;
      },
      barsize: 16,
      // The line is cut to the terminal's width and the cursor left alone, so a run stopped with
      // Ctrl-C leaves the terminal as it was.
      hideCursor: false,
      linewrap: true,
      clearOnComplete: true,
      etaBuffer: 8,
      fps: 5,
    },
    cliProgress.Presets.shades_classic,
  );
  const waiting: string[] = [];
  let cells = 0;
  let value = 0;
  bar.start(total, 0, { cells: "0", now: "starting" });
  return {
    progress: (item, line) => bar.update(value, { now: `${item.input}: ${line}`.slice(0, 60) }),
    done: (r) => {
      value += 1;
      if (r.outcome.kind === "recalculated") cells += r.outcome.summary.computedCells;
      const refusal = refusalLine(r, several);
      if (refusal) waiting.push(refusal);
      bar.update(value, { cells: count(cells), now: `done ${r.item.input}`.slice(0, 60) });
    },
    stop: () => {
      bar.stop();
      for (const l of waiting) io.err(l);
    },
  };
}
