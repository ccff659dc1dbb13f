/**
 * What a season run shows while it works: on a terminal, a progress bar (drawn by cli-progress)
 * that is cleared before the summary; refusals printed after it. The terminal is util-linux's
 * `script`, which gives the command a pseudo-terminal. Workbooks are generated (invented values).
 */
import { spawnSync } from "child_process";
import path from "path";
import { tempDir } from "../helpers/workbook";
import { BIN, farmBook, put } from "../helpers/season";
import { findProgram } from "../hosts/harness";

const script = findProgram("script");
const describeTty = script ? describe : describe.skip;
if (!script) {
  // eslint-disable-next-line no-console
  console.warn("SKIPPED the terminal progress test: util-linux's script is not installed");
}

/** The command run on a pseudo-terminal (stdout and stderr both the terminal), as the terminal received it. */
function onTerminal(cwd: string, args: string[]): string {
  const command = [process.execPath, BIN, ...args].map((a) => `'${a.replace(/'/g, "'\\''")}'`).join(" ");
  const r = spawnSync(script!, ["-qec", command, "/dev/null"], { cwd, encoding: "utf8", timeout: 120_000, env: { ...process.env, COLUMNS: "100" } });
  return r.stdout;
}

describeTty("the progress bar on a terminal", () => {
  it("shows workbooks done of the total, cells, elapsed time and the estimate, then clears it for the summary", () => {
    const root = tempDir("soilcell-tty-");
    for (let i = 1; i <= 6; i++) put(path.join(root, "season", `farm-${i}.xlsx`), farmBook(20));
    put(path.join(root, "season", "broken.xlsx"), "not a workbook");
    const seen = onTerminal(root, ["recalc", "season", "-o", "out/"]);
    const frames = seen.split("\u001b[1G").map((f) => f.replace(/\u001b\[[0-9;?]*[A-Za-z]|\u001b[78]/g, ""));
    expect(frames.some((f) => /^[█░]{16} 0\/7 workbooks \| 0 cells \| 0:\d\d elapsed, estimating/.test(f))).toBe(true);
    expect(frames.some((f) => /^█{16} 7\/7 workbooks \| 120 cells \| 0:\d\d elapsed, 0:00 to go/.test(f))).toBe(true);
    // Cleared (erase line), then the refusal and the summary as plain lines.
    const after = seen.slice(seen.lastIndexOf("\u001b[2K") + 4).replace(/\r/g, "");
    expect(after).toMatch(/^soilcell: season\/broken\.xlsx: not an \.xlsx workbook/m);
    expect(after).toMatch(/^6 of 7 workbooks recalculated, 1 refused/m);
    expect(after).not.toMatch(/\[\d+\/7\]/); // no plain progress lines on a terminal
  });

  it("--json on a terminal: the JSON alone, no bar", () => {
    const root = tempDir("soilcell-tty-json-");
    put(path.join(root, "a.xlsx"), farmBook(2));
    const seen = onTerminal(root, ["recalc", "a.xlsx", "--json"]);
    expect(seen).not.toContain("workbooks |");
    expect(JSON.parse(seen.replace(/\r/g, "")).totals.recalculated).toBe(1);
  });
});
