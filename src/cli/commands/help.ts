/** `soilcell help [COMMAND]`: the commands, or one command's help. */
import { soilcellVersion } from "../../core/about";
import { UsageError } from "../args";
import { Io } from "../io";
import { Command, helpText } from "./command";
import { allCommands, findCommand } from "./index";

/** The overview: what soilcell is, each command on one line, where to read more. */
export function overview(io: Io): void {
  const commands = allCommands();
  const width = Math.max(...commands.map((c) => c.name.length));
  io.out(`${soilcellVersion()}: SOIL functions for soil-test workbooks, headless.`);
  io.out("");
  io.out("usage: soilcell COMMAND [ARGUMENTS] [OPTIONS]");
  io.out("");
  io.out("commands:");
  for (const c of commands) io.out(`  ${c.name.padEnd(width)}  ${c.summary}`);
  io.out("");
  io.out("soilcell COMMAND --help (or soilcell help COMMAND) explains one command.");
  io.out("exit codes: 0 done, 1 some cells or results in error, 2 refused (a file, or the command line), 3 a failure in soilcell itself.");
}

export const command: Command = {
  name: "help",
  summary: "this overview, or one command's help",
  usage: ["help [COMMAND]"],
  about: ["Lists the commands, or shows one command's usage, options and examples (the same as soilcell COMMAND --help)."],
  options: [],
  examples: ["soilcell help recalc"],
  run(args, io) {
    const name = args.positional[0];
    if (name === undefined) {
      overview(io);
      return 0;
    }
    const c: Command | undefined = findCommand(name);
    if (!c) throw new UsageError(`no command "${name}"`);
    io.out(helpText(c));
    return 0;
  },
};
