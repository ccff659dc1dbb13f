/** What every soilcell command is: a name, one line for the command list, its help, and its run. */
export interface Io {
  out(line: string): void;
  err(line: string): void;
  /** True when standard error is a terminal a progress bar can redraw. */
  readonly errIsTty?: boolean;
  /** Where a progress bar writes (standard error). */
  readonly errStream?: NodeJS.WritableStream;
}

export interface Command {
  readonly name: string;
  /** One line for `soilcell help`. */
  readonly summary: string;
  /** Usage line(s) and options, for `soilcell help NAME` and `soilcell NAME --help`. */
  readonly help: string;
  run(args: string[], io: Io): number | Promise<number>;
}

/** A usage error: the command's own help on standard error, exit 2. */
export function usage(cmd: Command, io: Io, why?: string): number {
  if (why) io.err(`soilcell ${cmd.name}: ${why}`);
  io.err(cmd.help);
  return 2;
}

/** Takes `--name VALUE` (or `-x VALUE`) out of args; null when the flag has no value. */
export function takeValue(args: string[], ...flags: string[]): string | undefined | null {
  const i = args.findIndex((a) => flags.includes(a));
  if (i < 0) {
    const j = args.findIndex((a) => flags.some((f) => f.startsWith("--") && a.startsWith(`${f}=`)));
    if (j < 0) return undefined;
    const v = (args[j] as string).slice((args[j] as string).indexOf("=") + 1);
    args.splice(j, 1);
    return v === "" ? null : v;
  }
  const v = args[i + 1];
  if (v === undefined || v.startsWith("-")) {
    args.splice(i, 1);
    return null;
  }
  args.splice(i, 2);
  return v;
}

/** Takes a bare `--flag` out of args. */
export function takeFlag(args: string[], ...flags: string[]): boolean {
  let found = false;
  for (let i = args.length - 1; i >= 0; i--) {
    if (flags.includes(args[i] as string)) {
      args.splice(i, 1);
      found = true;
    }
  }
  return found;
}
