/**
 * One declaration feeds Excel and the engine: the generated metadata, the bindings, the engine
 * registry and the catalogue agree. Source of the expected names: ../shared/design/functions.md.
 * The disagreement probes at the end use invented ids and tables to exercise the checks; no published name.
 */
import fs from "fs";
import path from "path";
import metadata from "../../generated/functions.json";
import associations from "../../generated/associations.json";
import * as bindings from "../../src/functions";
import { specOf } from "../../src/functions/_binding";
import { MetaFunction, REGISTRY, buildRegistry, registered, storedName } from "../../src/engine/registry";
import { aboutFunction } from "../../src/core/about";

const catalogue = (() => {
  const file = [path.join(__dirname, "../../../shared/design/functions.md"), path.join(__dirname, "../../docs/functions.md")].find((f) =>
    fs.existsSync(f),
  );
  if (!file) return undefined;
  const text = fs.readFileSync(file, "utf8");
  const entries = new Map<string, string[]>();
  for (const m of text.matchAll(/^\| `SOIL\.([A-Z]+)\(([^`]*)\)`/gm)) {
    const args = m[2]!.split(",").map((a) => a.trim().replace(/^\[|\]$/g, "")).filter(Boolean);
    if (!entries.has(m[1]!)) entries.set(m[1]!, args);
  }
  return entries;
})();

describe("registry", () => {
  const ids = (metadata.functions as { id: string }[]).map((f) => f.id).sort();
  it("metadata, associations and engine registry hold the same functions", () => {
    expect((associations as { id: string }[]).map((a) => a.id).sort()).toEqual(ids);
    expect(REGISTRY.map((f) => f.id).sort()).toEqual(ids);
  });
  it("every exported binding is declared and in the metadata", () => {
    const exported = Object.entries(bindings).filter(([, v]) => typeof v === "function");
    for (const [name, fn] of exported) {
      expect(specOf(fn as Function)).toBeDefined();
      expect((associations as { functionName: string }[]).some((a) => a.functionName === name)).toBe(true);
    }
  });
  it("parameter names and optional flags agree between metadata and declarations", () => {
    for (const f of REGISTRY) {
      expect(f.meta.parameters.map((p) => p.name)).toEqual(f.spec.params.map((p) => p.name));
      expect(f.meta.parameters.map((p) => Boolean(p.optional))).toEqual(f.spec.params.map((p) => p.optional));
    }
  });
  it("the README's generated function list is up to date (npm run docs)", () => {
    const readme = fs.readFileSync(path.join(__dirname, "../../README.md"), "utf8");
    for (const f of REGISTRY) {
      const args = f.meta.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ");
      expect(readme).toContain(`\`SOIL.${f.id}(${args})\``);
    }
  });
  it("every function has an ABOUT line", () => {
    for (const f of REGISTRY) expect(aboutFunction(f.id).length).toBeGreaterThan(20);
  });
  it("every description's summary fits Excel's 128 characters", () => {
    for (const f of REGISTRY) expect((f.meta.description ?? "").split("\n")[0]!.length).toBeLessThanOrEqual(128);
  });
  // Names JavaScript cannot carry: `yield` is reserved in strict mode, and the metadata generator
  // takes Excel's parameter names from the TypeScript signature.
  const RESERVED: Record<string, Record<string, string>> = { REMOVAL: { yield: "crop_yield" } };
  it("every binding declares the metadata's argument names, in order, optional where Excel shows them optional", () => {
    // The declared names are the ones refusal messages use ("ca must be ..."), so they must be the
    // names Excel shows the user for the same arguments.
    for (const f of REGISTRY) {
      expect([f.id, f.spec.params.map((p) => p.name)]).toEqual([f.id, f.meta.parameters.map((p) => p.name)]);
      expect([f.id, f.spec.params.map((p) => p.optional)]).toEqual([f.id, f.meta.parameters.map((p) => p.optional === true)]);
    }
  });
  (catalogue ? it : it.skip)("every built function keeps the catalogue's argument names and order", () => {
    for (const f of REGISTRY) {
      const expected = catalogue!.get(f.id)?.map((n) => RESERVED[f.id]?.[n] ?? n);
      if (!expected) continue; // functions added beyond the catalogue
      expect(f.meta.parameters.map((p) => p.name).slice(0, expected.length)).toEqual(expected);
    }
  });
});

describe("registry lookups and consistency checks", () => {
  const cmolMeta = (metadata.functions as MetaFunction[]).find((f) => f.id === "CMOL")!;
  const link = { id: "CMOL", functionName: "cmol" };
  it("a consistent table builds, with the namespace in the formula name", () => {
    const [f] = buildRegistry([cmolMeta], [link], bindings);
    expect([f!.id, f!.formulaName, f!.meta]).toEqual(["CMOL", "SOIL.CMOL", cmolMeta]);
    expect(f!.binding).toBe(bindings.cmol);
  });
  it("an association without a binding or without metadata is refused, naming the id", () => {
    expect(() => buildRegistry([cmolMeta], [{ id: "CMOL", functionName: "nosuchbinding" }], bindings)).toThrow("metadata and bindings disagree about CMOL");
    expect(() => buildRegistry([cmolMeta], [{ id: "ZZTOP", functionName: "cmol" }], bindings)).toThrow("metadata and bindings disagree about ZZTOP");
  });
  it("an export that is no declared binding is refused, naming it", () => {
    expect(() => buildRegistry([cmolMeta], [link], { cmol: () => [[1]] })).toThrow("binding cmol has no declaration");
  });
  it("a parameter count that differs is refused, giving both counts", () => {
    const short = { ...cmolMeta, parameters: cmolMeta.parameters.slice(1) };
    expect(() => buildRegistry([short], [link], bindings)).toThrow(
      `CMOL: metadata has ${cmolMeta.parameters.length - 1} parameters, the binding declares ${cmolMeta.parameters.length}`,
    );
  });
  it("registered finds an id or formula name in any case, dropping only a leading SOIL.", () => {
    expect(registered("CMOL")?.id).toBe("CMOL");
    expect(registered("soil.cmol")?.id).toBe("CMOL");
    expect(registered("Soil.Cmol")?.formulaName).toBe("SOIL.CMOL");
    expect(registered("CMSOIL.OL")).toBeUndefined(); // "SOIL." inside the name is not the namespace
    expect(registered("SOIL.NOPE")).toBeUndefined();
  });
  it("storedName writes the namespace and every dot of the id as _", () => {
    expect(storedName("CMOL")).toBe("_xldudf_SOIL_CMOL");
    expect(storedName("LIME.BUFFER.X")).toBe("_xldudf_SOIL_LIME_BUFFER_X"); // invented dotted id
  });
});
