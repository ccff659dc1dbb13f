/**
 * The manifest asks for exactly the requirement sets the built add-in uses. The Office APIs that
 * dist/functions.js touches are read from the bundle itself; each is looked up in the table below
 * (API → requirement set, each row citing Office's API reference page where that set is stated);
 * the highest version per set is what dist/manifest.xml must declare, no more and no less. So the
 * bundle and the manifest cannot drift apart: a new API in the bindings either has a row here and
 * raises the manifest, or fails this test.
 *
 * Sources (Office's own reference, seen December 2026):
 * - "CustomFunctions.Error class" (learn.microsoft.com/javascript/api/custom-functions-runtime/customfunctions.error):
 *   [API set: CustomFunctionsRuntime 1.2].
 * - "CustomFunctions.ErrorCode enum" (…/customfunctions.errorcode): every member, invalidValue and
 *   notAvailable included, is marked [API set: CustomFunctionsRuntime 1.3]. The requirement-set
 *   history says 1.2 added CustomFunctions.Error and 1.3 added "new ErrorCode options"; the member
 *   pages are the more specific statement, so the bundle (which uses ErrorCode.invalidValue and
 *   ErrorCode.notAvailable) needs 1.3.
 * - "Custom Functions requirement sets" (…/requirement-sets/excel/custom-functions-requirement-sets):
 *   1.1 is the first version of the API (CustomFunctions.associate carries no later set); 1.4 adds
 *   the allowCustomDataForDataTypeAny metadata property.
 * The same [Api set] annotations ship in @types/custom-functions-runtime (Microsoft's typings);
 * the last test checks the table against them.
 */
import fs from "fs";
import path from "path";
import { XMLParser } from "fast-xml-parser";
import { DIST, ROOT, ensureDist } from "./harness";

const REF = "https://learn.microsoft.com/javascript/api";
const SETS_PAGE = `${REF}/requirement-sets/excel/custom-functions-requirement-sets`;

interface ApiRow {
  /** As written in code: a namespace member path. */
  readonly api: string;
  readonly set: string;
  readonly version: string;
  /** Office's reference page that states the set. */
  readonly ref: string;
}

const ERROR_CODES = ["invalidValue", "notAvailable", "divisionByZero", "invalidNumber", "nullReference", "invalidName", "invalidReference"];

export const API_SETS: readonly ApiRow[] = [
  { api: "CustomFunctions.associate", set: "CustomFunctionsRuntime", version: "1.1", ref: SETS_PAGE },
  { api: "CustomFunctions.Error", set: "CustomFunctionsRuntime", version: "1.2", ref: `${REF}/custom-functions-runtime/customfunctions.error` },
  ...ERROR_CODES.map((m) => ({ api: `CustomFunctions.ErrorCode.${m}`, set: "CustomFunctionsRuntime", version: "1.3", ref: `${REF}/custom-functions-runtime/customfunctions.errorcode` })),
];

/** Properties of functions.json that need a set of their own. */
const METADATA_SETS = [{ property: "allowCustomDataForDataTypeAny", set: "CustomFunctionsRuntime", version: "1.4", ref: SETS_PAGE }];

/** Office's global namespaces a bundle could touch. */
const NAMESPACES = ["CustomFunctions", "Office", "Excel", "OfficeRuntime", "OfficeExtension"];

const compareVersions = (a: string, b: string) => {
  const pa = a.split(".").map(Number);
  const pb = b.split(".").map(Number);
  for (let i = 0; i < Math.max(pa.length, pb.length); i++) if ((pa[i] ?? 0) !== (pb[i] ?? 0)) return (pa[i] ?? 0) - (pb[i] ?? 0);
  return 0;
};

/** Member paths of Office's namespaces used in a script, and bare uses that hide which member. */
export function officeApisIn(source: string): { apis: string[]; opaque: string[] } {
  // Text inside string literals and comments (the bundled data tables, licence notes) is not code.
  const code = source
    .replace(/"(?:[^"\\\n]|\\.)*"|'(?:[^'\\\n]|\\.)*'|`(?:[^`\\]|\\.)*`/g, '""')
    .replace(/\/\*[\s\S]*?\*\//g, "");
  const apis = new Set<string>();
  const opaque: string[] = [];
  for (const ns of NAMESPACES) {
    const re = new RegExp(`(?<![\\w$.])${ns}(?![\\w$])((?:\\.[A-Za-z_$][\\w$]*)*)`, "g");
    for (const m of code.matchAll(re)) {
      const before = code.slice(Math.max(0, m.index! - 7), m.index);
      if (!m[1]) {
        // `typeof CustomFunctions` only asks whether the runtime is there.
        if (!/typeof\s*$/.test(before)) opaque.push(code.slice(Math.max(0, m.index! - 20), m.index! + ns.length + 20));
        continue;
      }
      const parts = `${ns}${m[1]}`.split(".");
      // The longest path the table knows, or the whole path (then it is reported as unknown).
      let found = parts.join(".");
      for (let n = parts.length; n >= 2; n--) {
        const candidate = parts.slice(0, n).join(".");
        if (API_SETS.some((r) => r.api === candidate)) {
          found = candidate;
          break;
        }
      }
      apis.add(found);
    }
  }
  return { apis: [...apis].sort(), opaque };
}

/** The sets a bundle and its metadata need: the highest version per set name. */
export function requiredSets(apis: string[], metadata: Record<string, unknown>): Map<string, string> {
  const need = new Map<string, string>();
  const add = (set: string, version: string) => {
    if (!need.has(set) || compareVersions(version, need.get(set)!) > 0) need.set(set, version);
  };
  for (const api of apis) {
    const row = API_SETS.find((r) => r.api === api);
    if (row) add(row.set, row.version);
  }
  for (const m of METADATA_SETS) if (metadata[m.property] !== undefined) add(m.set, m.version);
  return need;
}

describe("requirement sets: dist/manifest.xml asks for what dist/functions.js uses", () => {
  let code: string;
  let declared: Map<string, string>;
  let metadata: Record<string, unknown>;

  beforeAll(() => {
    ensureDist();
    code = fs.readFileSync(path.join(DIST, "functions.js"), "utf8");
    metadata = JSON.parse(fs.readFileSync(path.join(DIST, "functions.json"), "utf8")) as Record<string, unknown>;
    const xml = fs.readFileSync(path.join(DIST, "manifest.xml"), "utf8");
    const app = (new XMLParser({ ignoreAttributes: false, attributeNamePrefix: "@" }).parse(xml) as { OfficeApp: Record<string, unknown> }).OfficeApp;
    const sets = ((app.Requirements as Record<string, unknown>).Sets as Record<string, unknown>).Set;
    declared = new Map((Array.isArray(sets) ? sets : [sets]).map((s) => [String((s as Record<string, string>)["@Name"]), String((s as Record<string, string>)["@MinVersion"])]));
  });

  it("finds the Office APIs the bundle touches (it does touch some: associate, Error, ErrorCode)", () => {
    const { apis } = officeApisIn(code);
    expect(apis).toEqual(expect.arrayContaining(["CustomFunctions.associate", "CustomFunctions.Error"]));
  });

  it("every Office API in the bundle has a row in the table (add the row, citing Office's reference page)", () => {
    const { apis } = officeApisIn(code);
    expect(apis.filter((a) => !API_SETS.some((r) => r.api === a))).toEqual([]);
  });

  it("the bundle never uses an Office namespace as a bare value (which would hide the members it reaches)", () => {
    expect(officeApisIn(code).opaque).toEqual([]);
  });

  it("the manifest declares exactly the sets derived from the bundle and the metadata, at the versions derived", () => {
    const need = requiredSets(officeApisIn(code).apis, metadata);
    expect(Object.fromEntries(declared)).toEqual(Object.fromEntries(need));
  });

  it("today that is CustomFunctionsRuntime 1.3 (ErrorCode members are 1.3 in Office's reference)", () => {
    expect(Object.fromEntries(declared)).toEqual({ CustomFunctionsRuntime: "1.3" });
  });

  it("each table row cites an Office reference page", () => {
    for (const r of [...API_SETS, ...METADATA_SETS]) expect(r.ref).toMatch(/^https:\/\/learn\.microsoft\.com\/javascript\/api\//);
  });

  it("the table agrees with the [Api set] annotations in Microsoft's typings (@types/custom-functions-runtime)", () => {
    const dts = fs.readFileSync(path.join(ROOT, "node_modules", "@types", "custom-functions-runtime", "index.d.ts"), "utf8");
    const annotated = new Map<string, string>();
    const cls = /\[Api set: (\w+) ([\d.]+)\]\s*\*\/\s*class (\w+)/.exec(dts);
    if (cls) annotated.set(`CustomFunctions.${cls[3]}`, `${cls[1]} ${cls[2]}`);
    const enumBody = /enum ErrorCode \{([\s\S]*?)\n {4}\}/.exec(dts)?.[1] ?? "";
    for (const m of enumBody.matchAll(/\[Api set: (\w+) ([\d.]+)\]\s*\*\/\s*(\w+)\s*=/g)) annotated.set(`CustomFunctions.ErrorCode.${m[3]}`, `${m[1]} ${m[2]}`);
    expect(annotated.size).toBeGreaterThanOrEqual(8);
    for (const [api, set] of annotated) {
      const row = API_SETS.find((r) => r.api === api);
      expect({ api, set: row ? `${row.set} ${row.version}` : "no row" }).toEqual({ api, set });
    }
  });
});

describe("deriving sets (the rules themselves)", () => {
  it("takes the highest version per set and adds the metadata's own needs", () => {
    expect(Object.fromEntries(requiredSets(["CustomFunctions.associate", "CustomFunctions.Error"], {}))).toEqual({ CustomFunctionsRuntime: "1.2" });
    expect(Object.fromEntries(requiredSets(["CustomFunctions.associate"], { allowCustomDataForDataTypeAny: true }))).toEqual({ CustomFunctionsRuntime: "1.4" });
  });
  it("reads member paths from minified code, ignores typeof checks and flags aliasing", () => {
    const r = officeApisIn('if("undefined"!=typeof CustomFunctions)new CustomFunctions.Error(CustomFunctions.ErrorCode.notAvailable,"Office Excel");const o=CustomFunctions;');
    expect(r.apis).toEqual(["CustomFunctions.Error", "CustomFunctions.ErrorCode.notAvailable"]);
    expect(r.opaque).toHaveLength(1);
  });
  it("an API the table does not know is reported as itself", () => {
    expect(officeApisIn("Excel.run(()=>0)").apis).toEqual(["Excel.run"]);
  });
});
