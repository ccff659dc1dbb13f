/**
 * The add-in manifest (dist/manifest.xml as the build writes it), checked offline. No npm package
 * ships Microsoft's add-in manifest XSDs (office-addin-manifest 3.0.0 has none and validates
 * through an online service), so the rules are checked here one by one. Rules marked "from
 * memory" come from the Office add-in manifest reference and its XSD (element order, length
 * limits, icon sizes) as remembered, not seen while writing; the rest are stated in
 * /work/shared/design/platform-facts.md (Source: tried against custom-functions-metadata and
 * Excel's documented requirements for custom functions).
 */
import fs from "fs";
import path from "path";
import { XMLParser, XMLValidator } from "fast-xml-parser";
import { DIST, ROOT, distMetadata, ensureDist } from "./harness";

type Node = Record<string, unknown>;

const asList = <T>(v: T | T[] | undefined): T[] => (v === undefined ? [] : Array.isArray(v) ? v : [v]);

function pngSize(file: string): { width: number; height: number } {
  const b = fs.readFileSync(file);
  if (b.readUInt32BE(0) !== 0x89504e47 || b.toString("ascii", 12, 16) !== "IHDR") throw new Error(`${file} is not a PNG`);
  return { width: b.readUInt32BE(16), height: b.readUInt32BE(20) };
}

describe("dist/manifest.xml, offline", () => {
  let xml: string;
  let app: Node;
  let overrides: Node;
  let resources: { id: string; value: string; kind: "bt:Image" | "bt:Url" | "bt:String" }[];

  beforeAll(() => {
    ensureDist();
    xml = fs.readFileSync(path.join(DIST, "manifest.xml"), "utf8");
    const parsed = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: "@", parseTagValue: false }).parse(xml) as Node;
    app = parsed.OfficeApp as Node;
    overrides = app.VersionOverrides as Node;
    const res = overrides.Resources as Node;
    const pick = (group: string, kind: "bt:Image" | "bt:Url" | "bt:String") =>
      asList((res[group] as Node | undefined)?.[kind] as Node | Node[] | undefined).map((n) => ({ id: String(n["@id"]), value: String(n["@DefaultValue"]), kind }));
    resources = [...pick("bt:Images", "bt:Image"), ...pick("bt:Urls", "bt:Url"), ...pick("bt:ShortStrings", "bt:String"), ...pick("bt:LongStrings", "bt:String")];
  });

  it("is well-formed XML, the same as manifest.xml at the default development host", () => {
    expect(XMLValidator.validate(xml)).toBe(true);
    expect(xml).toBe(fs.readFileSync(path.join(ROOT, "manifest.xml"), "utf8"));
  });

  it("is a task-pane-type OfficeApp in the 1.1 manifest namespace, with the override namespaces", () => {
    expect(xml).toMatch(/<OfficeApp[^>]*xmlns="http:\/\/schemas\.microsoft\.com\/office\/appforoffice\/1\.1"/);
    expect(xml).toMatch(/xmlns:bt="http:\/\/schemas\.microsoft\.com\/office\/officeappbasictypes\/1\.0"/);
    expect(app["@xsi:type"]).toBe("TaskPaneApp");
    expect(overrides["@xmlns"]).toBe("http://schemas.microsoft.com/office/taskpaneappversionoverrides");
    expect(overrides["@xsi:type"]).toBe("VersionOverridesV1_0");
  });

  it("has the top-level elements in the schema's order (from memory: the TaskPaneApp sequence)", () => {
    const order = ["Id", "AlternateId", "Version", "ProviderName", "DefaultLocale", "DisplayName", "Description", "IconUrl", "HighResolutionIconUrl", "SupportUrl", "AppDomains", "Hosts", "Requirements", "DefaultSettings", "Permissions", "Rule", "DisableEntityHighlighting", "Dictionary", "VersionOverrides"];
    const ordered = new XMLParser({ ignoreAttributes: true, preserveOrder: true }).parse(xml) as Node[];
    const root = ordered.find((n) => "OfficeApp" in n) as { OfficeApp: Node[] };
    const names = root.OfficeApp.map((n) => Object.keys(n).find((k) => k !== ":@")!).filter((k) => !k.startsWith("#"));
    const unknown = names.filter((n) => !order.includes(n));
    expect(unknown).toEqual([]);
    expect(names.map((n) => order.indexOf(n))).toEqual([...names.map((n) => order.indexOf(n))].sort((a, b) => a - b));
    for (const required of ["Id", "Version", "ProviderName", "DefaultLocale", "DisplayName", "Description", "DefaultSettings", "Permissions"]) {
      expect(names).toContain(required);
    }
  });

  it("Id is a GUID, Version is n.n.n.n and matches package.json, DefaultLocale is a language tag", () => {
    expect(String(app.Id)).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i);
    expect(String(app.Version)).toMatch(/^\d{1,5}(\.\d{1,5}){3}$/);
    const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, "package.json"), "utf8")) as { version: string };
    expect(String(app.Version)).toBe(`${pkg.version.replace(/[-+].*$/, "")}.0`);
    expect(String(app.DefaultLocale)).toMatch(/^[a-z]{2,3}-[A-Z]{2}$/);
  });

  it("display name and description fit their limits (from memory: 125 and 250 characters)", () => {
    const name = String((app.DisplayName as Node)["@DefaultValue"]);
    const description = String((app.Description as Node)["@DefaultValue"]);
    expect(name.length).toBeGreaterThan(0);
    expect(name.length).toBeLessThanOrEqual(125);
    expect(description.length).toBeLessThanOrEqual(250);
    expect(description).toMatch(/estimates/); // the caution the rate functions carry
  });

  it("runs in Excel only (Hosts/Host Name=Workbook) and asks for the CustomFunctionsRuntime set (its version is derived from the bundle in requirement-sets.test.ts)", () => {
    expect(asList((app.Hosts as Node).Host as Node | Node[]).map((h) => h["@Name"])).toEqual(["Workbook"]);
    const sets = asList(((app.Requirements as Node).Sets as Node).Set as Node | Node[]);
    expect(sets.map((s) => s["@Name"])).toContain("CustomFunctionsRuntime");
    for (const s of sets) expect(String(s["@MinVersion"])).toMatch(/^1\.\d+$/);
  });

  it("asks for the least permission there is (Restricted)", () => {
    expect(app.Permissions).toBe("Restricted");
  });

  it("has a CustomFunctions extension point with Script, Page, Metadata and Namespace", () => {
    const hosts = asList((overrides.Hosts as Node).Host as Node | Node[]);
    expect(hosts.map((h) => h["@xsi:type"])).toEqual(["Workbook"]);
    const points = asList(((hosts[0] as Node).AllFormFactors as Node).ExtensionPoint as Node | Node[]);
    const cf = points.find((p) => p["@xsi:type"] === "CustomFunctions") as Node;
    expect(cf).toBeDefined();
    for (const part of ["Script", "Page", "Metadata"]) {
      expect(((cf[part] as Node).SourceLocation as Node)["@resid"]).toEqual(expect.any(String));
    }
    expect((cf.Namespace as Node)["@resid"]).toEqual(expect.any(String));
  });

  it("resource ids are unique, at most 32 characters (from memory), and every resid resolves to its kind", () => {
    const ids = resources.map((r) => r.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const id of ids) expect(id.length).toBeLessThanOrEqual(32);
    const resids = [...xml.matchAll(/resid="([^"]*)"/g)].map((m) => m[1]!);
    expect(resids.length).toBeGreaterThanOrEqual(4);
    for (const resid of resids) expect(ids).toContain(resid);
    const kindOf = (resid: string) => resources.find((r) => r.id === resid)!.kind;
    const cf = xml.slice(xml.indexOf('xsi:type="CustomFunctions"'));
    const residIn = (tag: string) => new RegExp(`<${tag}>\\s*<SourceLocation resid="([^"]+)"`).exec(cf)![1]!;
    expect(kindOf(residIn("Script"))).toBe("bt:Url");
    expect(kindOf(residIn("Page"))).toBe("bt:Url");
    expect(kindOf(residIn("Metadata"))).toBe("bt:Url");
    expect(kindOf(/<Namespace resid="([^"]+)"/.exec(cf)![1]!)).toBe("bt:String");
  });

  it("the namespace is SOIL, and every function id in dist/functions.json is a valid name under it", () => {
    const ns = resources.find((r) => r.id === /<Namespace resid="([^"]+)"/.exec(xml)![1])!.value;
    expect(ns).toBe("SOIL");
    expect(ns.length).toBeLessThanOrEqual(32);
    const ids = distMetadata().map((f) => f.id);
    expect(ids.length).toBeGreaterThan(0);
    expect(new Set(ids.map((i) => i.toUpperCase())).size).toBe(ids.length);
    for (const id of ids) expect(id).toMatch(/^[A-Za-z][A-Za-z0-9._]{2,}$/);
  });

  it("script, page and metadata URLs point at functions.js, functions.html and functions.json", () => {
    const url = (resid: string) => resources.find((r) => r.id === resid)!.value;
    const cf = xml.slice(xml.indexOf('xsi:type="CustomFunctions"'));
    const residIn = (tag: string) => new RegExp(`<${tag}>\\s*<SourceLocation resid="([^"]+)"`).exec(cf)![1]!;
    expect(url(residIn("Script"))).toMatch(/\/functions\.js$/);
    expect(url(residIn("Page"))).toMatch(/\/functions\.html$/);
    expect(url(residIn("Metadata"))).toMatch(/\/functions\.json$/);
    expect((((app.DefaultSettings as Node).SourceLocation as Node)["@DefaultValue"] as string)).toMatch(/\/functions\.html$/);
  });

  it("every URL is https on one host and names a file the build emits in dist/", () => {
    const urls = [...xml.matchAll(/DefaultValue="(https?:\/\/[^"]*)"/g)].map((m) => m[1]!);
    expect(urls.length).toBeGreaterThanOrEqual(8);
    const origins = new Set(urls.map((u) => new URL(u).origin));
    expect(origins.size).toBe(1);
    for (const u of urls) {
      const parsed = new URL(u);
      expect(parsed.protocol).toBe("https:");
      const file = path.join(DIST, decodeURIComponent(parsed.pathname));
      expect({ url: u, exists: fs.existsSync(file) && fs.statSync(file).isFile() }).toEqual({ url: u, exists: true });
    }
  });

  it("every function in dist/functions.json has a helpUrl: https, on the manifest's host, naming a help page the build emits", () => {
    const origin = new URL(resources.find((r) => r.kind === "bt:Url")!.value).origin;
    const fns = JSON.parse(fs.readFileSync(path.join(DIST, "functions.json"), "utf8")).functions as { id: string; helpUrl?: string }[];
    expect(fns.length).toBeGreaterThan(0);
    for (const f of fns) {
      expect({ id: f.id, hasHelpUrl: typeof f.helpUrl === "string" }).toEqual({ id: f.id, hasHelpUrl: true });
      const u = new URL(f.helpUrl!);
      expect(u.protocol).toBe("https:");
      expect(u.origin).toBe(origin);
      expect(u.pathname).toBe(`/help/${f.id}.html`);
      expect(fs.existsSync(path.join(DIST, decodeURIComponent(u.pathname)))).toBe(true);
    }
  });

  it("SupportUrl is the help index", () => {
    expect(new URL(String((app.SupportUrl as Node)["@DefaultValue"])).pathname).toBe("/help/index.html");
  });

  it("icons are PNGs of the sizes their places ask for (from memory: IconUrl 32, HighResolutionIconUrl 64, Icon.NxN N)", () => {
    const file = (u: string) => path.join(DIST, new URL(u).pathname);
    expect(pngSize(file(String((app.IconUrl as Node)["@DefaultValue"])))).toEqual({ width: 32, height: 32 });
    expect(pngSize(file(String((app.HighResolutionIconUrl as Node)["@DefaultValue"])))).toEqual({ width: 64, height: 64 });
    for (const img of resources.filter((r) => r.kind === "bt:Image")) {
      const n = Number(/(\d+)x\1$/.exec(img.id)?.[1]);
      expect(pngSize(file(img.value))).toEqual({ width: n, height: n });
    }
  });

  it("dist/functions.html loads only local scripts: the runtime copy, then functions.js", () => {
    const html = fs.readFileSync(path.join(DIST, "functions.html"), "utf8");
    const scripts = [...html.matchAll(/<script[^>]*\ssrc=["']?([^"' >]+)/g)].map((m) => m[1]!);
    expect(scripts).toEqual(["custom-functions-runtime.js", "functions.js"]);
    for (const s of scripts) expect(fs.existsSync(path.join(DIST, s))).toBe(true);
  });
});
