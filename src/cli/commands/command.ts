/**
 * What a command is: its name, a one-line summary for `soilcell help`, its usage lines and help
 * text for `soilcell NAME --help`, its declared options, and what it does. A command talks to
 * people only; what it computes comes from the engine and core.
 */
import { OptionSpec, Parsed, optionLines } from "../args";
import { Io } from "../io";

export interface Command {
  readonly name: string;
  /** One line, for the list of commands. */
  readonly summary: string;
  /** Usage lines, without the leading "soilcell ". */
  readonly usage: readonly string[];
  /** Paragraphs explaining the command, for its --help. */
  readonly about: readonly string[];
  readonly options: readonly OptionSpec[];
  readonly examples?: readonly string[];
  /** Runs the command; resolves to the exit code. */
  run(args: Parsed, io: Io): number | Promise<number>;
  /** A command that reads its own arguments (repeatable options) gets them as typed, --help included. */
  readonly raw?: (args: readonly string[], io: Io) => number | Promise<number>;
  /** Its help as written, for a command whose options are not declared above. */
  readonly fullHelp?: string;
}

/** The usage lines of a command, as printed after a mistake. */
export function usageText(c: Command): string {
  return ["usage:", ...c.usage.map((u) => `  soilcell ${u}`)].join("\n");
}

/** The full help of a command. */
export function helpText(c: Command): string {
  if (c.fullHelp !== undefined) return c.fullHelp;
  const lines = [`soilcell ${c.name}: ${c.summary}`, "", usageText(c), ""];
  for (const p of c.about) lines.push(...wrap(p, 96), "");
  lines.push("options:", ...optionLines(c.options));
  if (c.examples?.length) lines.push("", "examples:", ...c.examples.map((e) => `  ${e}`));
  return lines.join("\n");
}

/** Words wrapped at `width` columns. */
export function wrap(text: string, width: number): string[] {
  const out: string[] = [];
  let line = "";
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line && line.length + 1 + word.length > width) {
      out.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) out.push(line);
  return out;
}
