/**
 * The command line: `soilcell recalc | eval | list | help`. Talks to people: plain messages, no
 * stack traces for expected failures, progress on standard error, results on standard output.
 * Each command lives in src/cli/commands/ with its own help.
 */
import { CAUTION } from "../core/about";
import { Command, Io } from "./command";
import { COMMANDS } from "./commands";

export type { Io } from "./command";

function overview(): string {
  const width = Math.max(...COMMANDS.map((c) => c.name.length));
  return [
    "soilcell: soil-test interpretation functions for Excel, and their headless recalculator",
    "",
    "usage: soilcell COMMAND [ARGS]",
    "",
    ...COMMANDS.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`),
    `  ${"help".padEnd(width)}  this list; soilcell help COMMAND (or COMMAND --help) for one command`,
    "",
    "Examples:",
    "  soilcell recalc season/ --values          every workbook under season/, with copies anyone can open",
    "  soilcell eval '=SOIL.CONVERT(10,\"mg/kg\",\"kg/ha\",15,1.3)'",
    "  soilcell list SOIL.LIMEBUFFER",
    "",
    CAUTION,
  ].join("\n");
}

const find = (name: string | undefined): Command | undefined => COMMANDS.find((c) => c.name === name);

export async function main(argv: string[], io: Io): Promise<number> {
  const [name, ...args] = argv;
  if (name === undefined) {
    io.err(overview());
    return 2;
  }
  if (name === "help" || name === "--help" || name === "-h") {
    if (!args.length) {
      io.out(overview());
      return 0;
    }
    const c = find(args[0]);
    if (!c) {
      io.err(`soilcell: there is no command ${args[0]}\n\n${overview()}`);
      return 2;
    }
    io.out(c.help);
    return 0;
  }
  const c = find(name);
  if (!c) {
    io.err(`soilcell: there is no command ${name}\n\n${overview()}`);
    return 2;
  }
  if (args.includes("--help") || args.includes("-h")) {
    io.out(c.help);
    return 0;
  }
  return c.run(args, io);
}

/** Standard streams as the CLI's Io; the exit code is set, not forced, so piped output drains whole. */
export function runFromProcess(argv: string[]): void {
  const io: Io = {
    out: (l) => process.stdout.write(`${l}\n`),
    err: (l) => process.stderr.write(`${l}\n`),
    errIsTty: process.stderr.isTTY === true,
    errStream: process.stderr,
  };
  process.stdout.on("error", (e: NodeJS.ErrnoException) => {
    if (e.code === "EPIPE") process.exit(0);
  });
  main(argv, io).then(
    (code) => {
      process.exitCode = code;
    },
    (e) => {
      process.stderr.write(`soilcell: unexpected failure: ${(e as Error)?.message ?? String(e)}\n`);
      process.exitCode = 3;
    },
  );
}

if (require.main === module) runFromProcess(process.argv.slice(2));
