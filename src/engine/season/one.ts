/**
 * One workbook of a season, recalculated where it runs (in the main thread or a worker): every
 * outcome is returned as data, so one file's refusal or failure never stops the others.
 */
import fs from "fs";
import path from "path";
import { RecalcRefused, RecalcSummary, recalcWorkbook } from "../recalc";
import { WorkbookFileError } from "../xlsx-package";
import { SeasonItem } from "./inputs";

export type Outcome =
  | { readonly kind: "recalculated"; readonly summary: RecalcSummary }
  /** Refused or unreadable (RecalcRefused, WorkbookFileError): the reason is for the user. */
  | { readonly kind: "refused"; readonly reason: string; readonly seconds: number }
  /** Something went wrong in soilcell itself (a bug, or the worker died): worth reporting. */
  | { readonly kind: "failed"; readonly reason: string; readonly seconds: number };

export interface OneOptions {
  readonly maxCells?: number;
  readonly progress?: (line: string) => void;
}

export async function recalcOne(item: SeasonItem, options: OneOptions = {}): Promise<Outcome> {
  const started = process.hrtime.bigint();
  const seconds = () => Number(process.hrtime.bigint() - started) / 1e9;
  try {
    // An output folder of -o DIR/ is made as the tree is mirrored; nothing else is created.
    const dir = path.dirname(item.output);
    if (!fs.existsSync(dir)) fs.mkdirSync(dir, { recursive: true });
    const summary = await recalcWorkbook(item.input, item.output, {
      ...(options.progress ? { progress: options.progress } : {}),
      ...(options.maxCells !== undefined ? { maxCells: options.maxCells } : {}),
      ...(item.valuesCopy !== undefined ? { valuesCopy: item.valuesCopy } : {}),
    });
    return { kind: "recalculated", summary };
  } catch (e) {
    if (e instanceof RecalcRefused || e instanceof WorkbookFileError) return { kind: "refused", reason: e.message, seconds: seconds() };
    const code = (e as NodeJS.ErrnoException).code;
    if (code && typeof code === "string" && /^E[A-Z]+$/.test(code)) {
      // The file system said no (making the output folder, say): the user's to fix, not a bug.
      return { kind: "refused", reason: `cannot write under ${path.dirname(item.output)}: ${code}`, seconds: seconds() };
    }
    return { kind: "failed", reason: `unexpected failure: ${e instanceof Error ? e.message : String(e)}`, seconds: seconds() };
  }
}
