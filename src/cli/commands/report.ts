/** `soilcell report`: one finished report per key from the consultant's own template (src/cli/report.ts). */
import { Command } from "./command";
import { REPORT_HELP, runReport } from "../report";

const SUMMARY = "one values-only workbook and PDF per sample, paddock or farm, from your report template";

export const command: Command = {
  name: "report",
  summary: SUMMARY,
  usage: ["report TEMPLATE.xlsx [-o DIR] [--keys K1,K2,…] [--format xlsx,pdf] [--json] …"],
  about: [],
  options: [],
  fullHelp: `soilcell report: ${SUMMARY}\n\n${REPORT_HELP}`,
  run: (args, io) => runReport(args.positional, io),
  raw: (args, io) => {
    if (args.includes("--help") || args.includes("-h")) {
      io.out(command.fullHelp as string);
      return 0;
    }
    return runReport(args, io);
  },
};
