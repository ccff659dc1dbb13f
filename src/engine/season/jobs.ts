/**
 * One workbook of a season run and how it ended: the data a season summary is built from.
 * Plain values only, so a result crosses a worker-thread boundary unchanged.
 */
import type { CellProblem, RecalcSummary } from "../recalc";

export interface SeasonJob {
  readonly input: string;
  readonly output: string;
  /** A values copy written beside the workbook, when asked for. */
  readonly valuesOutput?: string;
}

/** How a workbook's run ended. */
export type JobOutcome =
  | { readonly kind: "recalculated"; readonly job: SeasonJob; readonly summary: RecalcSummary }
  /** Refused or unreadable (the CLI's exit 2): nothing was written for it. */
  | { readonly kind: "refused"; readonly job: SeasonJob; readonly reason: string; readonly seconds: number }
  /** Something the tool did not expect (exit 3): reported, the other workbooks still run. */
  | { readonly kind: "failed"; readonly job: SeasonJob; readonly reason: string; readonly seconds: number };

export type { CellProblem };
