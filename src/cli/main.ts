/**
 * The command line: `soilcell COMMAND …`, each command a module of src/cli/commands. Talks to
 * people: plain messages, no stack traces for expected failures, progress on stderr, results on
 * stdout. `main` returns the exit code; it never ends the process itself.
 */
import { soilcellVersion } from "../core/about";
import { parseArgs, UsageError } from "./args";
import { helpText, usageText } from "./commands/command";
import { COMMAND_NAMES, findCommand } from "./commands/index";
import { overview } from "./commands/help";
import { Io, runAsProcess } from "./io";

export type { Io } from "./io";

export async function main(argv: string[], io: Io): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined) {
    overview({ out: io.err, err: io.err });
    return 2;
  }
  if (name === "--help" || name === "-h") {
    overview(io);
    return 0;
  }
  if (name === "--version" || name === "-V") {
    io.out(soilcellVersion());
    return 0;
  }
  const command = findCommand(name);
  if (!command) {
    io.err(`soilcell: no command "${name}"; the commands are ${COMMAND_NAMES.join(", ")} (soilcell help)`);
    return 2;
  }
  if (command.raw) return await command.raw(rest, io);
  try {
    const args = parseArgs(rest, command.options);
    if (args.options.has("--help")) {
      io.out(helpText(command));
      return 0;
    }
    return await command.run(args, io);
  } catch (e) {
    if (!(e instanceof UsageError)) throw e;
    io.err(`soilcell ${command.name}: ${e.message}`);
    io.err(usageText(command));
    io.err(`(soilcell ${command.name} --help explains it)`);
    return 2;
  }
}

if (require.main === module) runAsProcess(main);
