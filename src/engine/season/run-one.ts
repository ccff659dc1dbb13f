/**
 * Runs one workbook of a season and turns every ending into a JobOutcome: a refusal or an
 * unreadable file is an outcome, never an exception, so one workbook cannot stop the others.
 */
import { RecalcRefused, recalcWorkbook } from "../recalc";
import { WorkbookFileError } from "../xlsx-package";
import type { JobOutcome, SeasonJob } from "./jobs";

export async function runJob(job: SeasonJob): Promise<JobOutcome> {
  const started = process.hrtime.bigint();
  const seconds = () => Number(process.hrtime.bigint() - started) / 1e9;
  try {
    const summary = await recalcWorkbook(job.input, job.output, job.valuesOutput === undefined ? {} : { valuesOutput: job.valuesOutput });
    return { kind: "recalculated", job, summary };
  } catch (e) {
    if (e instanceof RecalcRefused || e instanceof WorkbookFileError) return { kind: "refused", job, reason: e.message, seconds: seconds() };
    return { kind: "failed", job, reason: `unexpected failure: ${(e as Error)?.message ?? String(e)}`, seconds: seconds() };
  }
}
