/**
 * Command-line arguments: each command declares its options once (name, value, help line); the
 * same declaration parses the arguments and writes the help text.
 */

export interface OptionSpec {
  /** "--jobs" */
  readonly name: string;
  /** "-j" */
  readonly short?: string;
  /** The value's placeholder ("N", "FILE"); absent for a flag. */
  readonly value?: string;
  readonly about: string;
}

export interface Parsed {
  readonly positional: readonly string[];
  /** By long name: the value given, or true for a flag. */
  readonly options: ReadonlyMap<string, string | true>;
}

/** A command line that cannot be run as written; the message says what to change. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "UsageError";
  }
}

export const HELP_OPTION: OptionSpec = { name: "--help", short: "-h", about: "this help" };

/**
 * Parses `args` against `specs` (plus --help): `--name value`, `--name=value`, `-x value`; "--"
 * ends the options; a lone "-" and anything not starting with "-" are positional.
 * @throws UsageError for an unknown option or a missing value
 */
export function parseArgs(args: readonly string[], specs: readonly OptionSpec[]): Parsed {
  const all = [...specs, HELP_OPTION];
  const positional: string[] = [];
  const options = new Map<string, string | true>();
  for (let i = 0; i < args.length; i++) {
    const a = args[i] as string;
    if (a === "--") {
      positional.push(...args.slice(i + 1));
      break;
    }
    if (!a.startsWith("-") || a === "-") {
      positional.push(a);
      continue;
    }
    const eq = a.startsWith("--") ? a.indexOf("=") : -1;
    const key = eq > 0 ? a.slice(0, eq) : a;
    const spec = all.find((s) => s.name === key || s.short === key);
    if (!spec) {
      const near = all.find((s) => s.name.slice(2) === key.replace(/^-+/, ""));
      throw new UsageError(`unknown option ${key}${near ? `; did you mean ${near.name}?` : ""}`);
    }
    if (!spec.value) {
      if (eq > 0) throw new UsageError(`${spec.name} takes no value`);
      options.set(spec.name, true);
      continue;
    }
    const value = eq > 0 ? a.slice(eq + 1) : args[++i];
    if (value === undefined || value === "") throw new UsageError(`${spec.name} needs a value (${spec.name} ${spec.value})`);
    options.set(spec.name, value);
  }
  return { positional, options };
}

/** The help lines for a list of options, aligned. */
export function optionLines(specs: readonly OptionSpec[]): string[] {
  const all = [...specs, HELP_OPTION];
  const left = all.map((s) => `${s.short ? `${s.short}, ` : "    "}${s.name}${s.value ? ` ${s.value}` : ""}`);
  const width = Math.max(...left.map((l) => l.length));
  return all.map((s, i) => `  ${(left[i] as string).padEnd(width)}  ${s.about}`);
}
