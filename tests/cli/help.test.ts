/**
 * A command line that explains itself: `soilcell help`, `soilcell COMMAND --help`, usage errors
 * that say what to change, `soilcell list NAME`, and `eval` explaining what it cannot do (cell
 * references, ";" separators). Expected values: Source as in tests/core (UNIT-16 layer mass:
 * 10 mg/kg over 15 cm at 1.3 g/cm3 is 19.5 kg/ha).
 */
import fs from "fs";
import path from "path";
import { spawnSync } from "child_process";
import { COMMAND_NAMES, allCommands } from "../../src/cli/commands/index";
import { helpText } from "../../src/cli/commands/command";
import { REGISTRY } from "../../src/engine/registry";

const BIN = path.join(__dirname, "../../bin/soilcell.js");
const run = (...args: string[]) => spawnSync(process.execPath, [BIN, ...args], { encoding: "utf8" });

describe("soilcell help", () => {
  it("lists every command with one line each, and how to read more", () => {
    const r = run("help");
    expect(r.status).toBe(0);
    for (const c of allCommands()) expect(r.stdout).toContain(`  ${c.name.padEnd(6)}  ${c.summary}`);
    expect(r.stdout).toMatch(/soilcell COMMAND --help/);
    expect(r.stdout).toMatch(/exit codes: 0 .* 1 .* 2 .* 3 /);
    expect(run("--help").stdout).toBe(r.stdout);
  });

  it.each(COMMAND_NAMES.map((n) => [n]))("soilcell %s --help: usage, what it does, every option; the same as soilcell help %s", (name) => {
    const r = run(name, "--help");
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(new RegExp(`^soilcell ${name}: `));
    expect(r.stdout).toMatch(new RegExp(`usage:\\n {2}soilcell ${name}`));
    const c = allCommands().find((x) => x.name === name)!;
    for (const o of c.options) expect(r.stdout).toContain(o.name);
    expect(r.stdout).toContain("--help");
    expect(run("help", name).stdout).toBe(r.stdout);
    expect(run(name, "-h").stdout).toBe(r.stdout);
  });

  it("recalc --help documents folders, patterns, -o DIR/, --values, --jobs, --summary and the exit codes", () => {
    const text = run("recalc", "--help").stdout;
    for (const w of ["~$NAME.xlsx", "'season/**/*.xlsx'", "-o DIR/", "NAME.recalc.values.xlsx", "--jobs", "--summary FILE", "Exit code over the whole run"]) expect(text).toContain(w);
  });

  it("no command prints the overview on stderr (exit 2); an unknown command names the commands", () => {
    const none = run();
    expect(none.status).toBe(2);
    expect(none.stdout).toBe("");
    expect(none.stderr).toMatch(/commands:/);
    const bogus = run("bogus");
    expect(bogus.status).toBe(2);
    expect(bogus.stderr.trim()).toBe(`soilcell: no command "bogus"; the commands are ${COMMAND_NAMES.join(", ")} (soilcell help)`);
  });

  it("an unknown or misspelt option is a usage error with the command's usage and where to read more", () => {
    const r = run("recalc", "x.xlsx", "--value");
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^soilcell recalc: unknown option --value\n/);
    expect(r.stderr).toMatch(/usage:\n {2}soilcell recalc /);
    expect(r.stderr).toMatch(/soilcell recalc --help explains it/);
    expect(run("recalc", "x.xlsx", "--jobs").stderr).toMatch(/--jobs needs a value \(--jobs N\)/);
    expect(run("eval", "--json=1", "=1").stderr).toMatch(/--json takes no value/);
  });

  it("--version prints the version", () => {
    const version = JSON.parse(fs.readFileSync(path.join(__dirname, "../../package.json"), "utf8")).version as string;
    expect(run("--version").stdout.trim()).toBe(`soilcell ${version}`);
  });
});

describe("commands are registered by name", () => {
  it("every module in src/cli/commands is a registered command, and every name has its module", () => {
    const dir = path.join(__dirname, "../../src/cli/commands");
    const modules = fs
      .readdirSync(dir)
      .filter((f) => f.endsWith(".ts") && f !== "command.ts" && f !== "index.ts")
      .map((f) => f.replace(/\.ts$/, ""))
      .sort();
    expect([...COMMAND_NAMES].sort()).toEqual(modules);
    for (const c of allCommands()) {
      expect(c.summary.length).toBeGreaterThan(10);
      expect(c.usage.every((u) => u.startsWith(c.name))).toBe(true);
      expect(helpText(c)).toContain(`soilcell ${c.name}: ${c.summary}`);
    }
  });
});

describe("soilcell list NAME", () => {
  it("shows one function: every argument with its description, optional ones marked, and its source", () => {
    const r = run("list", "SOIL.LIMEBUFFER");
    expect(r.status).toBe(0);
    const f = REGISTRY.find((x) => x.id === "LIMEBUFFER")!;
    expect(r.stdout.split("\n")[0]).toBe("SOIL.LIMEBUFFER(buffer_ph, target_ph, calibration, [soil_ph], [depth_cm], [unit])");
    for (const p of f.meta.parameters) {
      expect(r.stdout).toMatch(new RegExp(`^ {2}${p.optional ? `\\[${p.name}\\]` : p.name} {2}${p.optional ? "optional" : "required"}, `, "m"));
    }
    // Descriptions carry units, ranges and defaults ("t/ha (default)").
    expect(r.stdout.replace(/\s+/g, " ")).toContain("t/ha (default), ton/ac, kg/ha or lb/ac");
    expect(r.stdout).toMatch(/^source:\n {2}Lime requirement from a single-buffer test/m);
    expect(r.stdout.replace(/\s+/g, " ")).toContain("Moore (2025)");
  });

  it("takes the name in any case, with or without SOIL., and as JSON", () => {
    expect(run("list", "cec").stdout).toBe(run("list", "SOIL.CEC").stdout);
    const j = JSON.parse(run("list", "convert", "--json").stdout) as { name: string; arguments: { name: string; optional: boolean; description: string }[]; source: string };
    expect(j.name).toBe("SOIL.CONVERT");
    expect(j.arguments.map((a) => a.name)).toEqual(REGISTRY.find((x) => x.id === "CONVERT")!.meta.parameters.map((p) => p.name));
    expect(j.arguments.every((a) => a.description.length > 0)).toBe(true);
    expect(j.source).toMatch(/NIST/);
  });

  it("an unknown name is a usage error suggesting near names", () => {
    const r = run("list", "SOIL.LIMEBUF");
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^soilcell list: no function "SOIL.LIMEBUF"; did you mean SOIL.LIMEBUFFER/);
  });

  it("list without a name still lists every function and points to list NAME", () => {
    const r = run("list");
    expect(r.stdout).toMatch(/soilcell list NAME shows one function/);
    for (const f of REGISTRY) expect(r.stdout).toContain(`${f.formulaName}(`);
  });
});

describe("soilcell eval prints a whole spill", () => {
  // LABVALUE's refusals of censored values without a policy (tests/core/lab-value.test.ts; invented values).
  it("every element of a spilled result, an error in its own row", () => {
    const r = run("eval", '=SOIL.LABVALUE({"n.d.";1;"<0.05"})');
    expect(r.status).toBe(1);
    const lines = r.stdout.trim().split("\n");
    expect(lines.length).toBe(3);
    expect(lines[0]).toMatch(/^#VALUE! value "n\.d\." is below detection/);
    expect(lines[1]).toBe("1");
    expect(lines[2]).toMatch(/^#VALUE! value "<0\.05" is below detection/);
  });
});

describe("soilcell eval explains what it cannot do", () => {
  it("a formula referring to cells says there is no workbook, naming the reference (not #CYCLE!)", () => {
    const r = run("eval", '=SOIL.CMOL(A1,"Ca")');
    expect(r.status).toBe(1);
    expect(r.stdout.trim()).toBe('#REF! eval has no workbook, so the reference A1 has nothing to read; give the values themselves (e.g. {1;2;3} for a column), or put the formula in a workbook and use soilcell recalc');
    expect(run("eval", "=SUM(Lab!B2:B9)").stdout).toMatch(/so the reference Lab!B2:B9 has nothing to read/);
    expect(run("eval", "=Settings_depth*2").stdout).toMatch(/so the name Settings_depth has nothing to read/);
    expect(run("eval", "=A1").stdout).not.toMatch(/#CYCLE!/);
  });

  it('";" between arguments is refused with the formula as Excel stores it', () => {
    const r = run("eval", '=SOIL.CONVERT(10;"mg/kg";"kg/ha";15;1.3)');
    expect(r.status).toBe(1);
    expect(r.stdout.trim()).toBe(
      '#VALUE! the formula separates its arguments with ";", as Excel shows formulas under some regional settings; soilcell reads formulas as Excel stores them, with ","; as stored it reads =SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3) (check it, then run that)',
    );
    // The rewrite it offers computes (19.5 kg/ha, UNIT-16).
    expect(run("eval", '=SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)').stdout.trim()).toBe("19.5");
  });

  it('with decimal commas as well, both are rewritten; ";" inside a string or an array constant is left alone', () => {
    expect(run("eval", '=SOIL.CONVERT(10;"mg/kg";"kg/ha";15;1,3)').stdout).toContain('as stored it reads =SOIL.CONVERT(10,"mg/kg","kg/ha",15,1.3)');
    expect(run("eval", '=SOIL.CONVERT(10;"a;b")').stdout).toContain('as stored it reads =SOIL.CONVERT(10,"a;b")');
    // A column constant {a;b} is Excel's stored form: computed, not refused (Source: IUPAC/CIAAW, 200.39 mg/kg Ca per cmol(+)/kg).
    expect(run("eval", '=SOIL.CMOL({200.39;400.78},"Ca")').stdout.trim().split("\n").map(Number).map((n) => Math.round(n * 1e9) / 1e9)).toEqual([1, 2]);
    expect(run("eval", '=SUM({1;2};3)').stdout).toMatch(/write it with "," between arguments$/m);
  });
});
