/** The commands, in the order `soilcell help` lists them. A new command is one line here. */
import type { Command } from "../command";
import { evalCommand } from "./eval";
import { listCommand } from "./list";
import { recalcCommand } from "./recalc";

export const COMMANDS: readonly Command[] = [recalcCommand, evalCommand, listCommand];
