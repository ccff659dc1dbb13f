/**
 * What a command may do with the terminal: lines to standard output (results) and standard error
 * (progress, refusals), and, when standard error is a terminal, that stream itself for a
 * redrawn progress bar. Tests pass plain collectors.
 */
export interface Io {
  out(line: string): void;
  err(line: string): void;
  /** Standard error when it is a terminal (a progress bar may redraw it); absent otherwise. */
  readonly tty?: NodeJS.WriteStream;
}

/**
 * The process's own streams. Nothing here ends the process: the caller sets process.exitCode and
 * lets Node exit once standard output has drained, so piped output of any size arrives whole
 * (process.exit would cut it at the pipe's buffer, 64 KB on Linux).
 */
export function processIo(): Io {
  const tty = process.stderr.isTTY ? process.stderr : undefined;
  return {
    out: (l) => void process.stdout.write(`${l}\n`),
    err: (l) => void process.stderr.write(`${l}\n`),
    ...(tty ? { tty } : {}),
  };
}

/** Runs `main` as the process: exit code set, never process.exit, a reader gone away is no error. */
export function runAsProcess(main: (argv: string[], io: Io) => Promise<number>): void {
  process.stdout.on("error", (e: NodeJS.ErrnoException) => {
    if (e.code === "EPIPE") process.exit(0); // the reader stopped reading (| head): nothing left to say
  });
  main(process.argv.slice(2), processIo()).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      process.stderr.write(`soilcell: unexpected failure: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 3;
    },
  );
}
