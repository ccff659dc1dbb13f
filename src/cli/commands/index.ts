/**
 * The commands, in the order `soilcell help` lists them. Each is src/cli/commands/NAME.ts
 * exporting `command`; adding a command is adding its NAME to this list. Modules load when used,
 * so `soilcell eval` does not load what `recalc` needs.
 */
import { Command } from "./command";

export const COMMAND_NAMES: readonly string[] = ["eval", "recalc", "report", "list", "help"];

function load(name: string): Command {
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  const mod = require(`./${name}`) as { command?: Command };
  if (!mod.command || mod.command.name !== name) throw new Error(`src/cli/commands/${name} does not export the command "${name}"`);
  return mod.command;
}

/** The command of that name, or undefined. */
export function findCommand(name: string): Command | undefined {
  return COMMAND_NAMES.includes(name) ? load(name) : undefined;
}

/** Every command, in order. */
export function allCommands(): Command[] {
  return COMMAND_NAMES.map(load);
}
