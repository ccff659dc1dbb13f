/**
 * Source of what is checked: the README itself and the Microsoft documentation pages it cites.
 * The README's install and hosting guides are there, as numbered steps, each citing Microsoft's
 * page for it, and say plainly that they could not be tried here. This checks presence and shape,
 * not that Excel behaves as described (no Excel on the machines these tests run on).
 */
import fs from "fs";
import path from "path";
import { ROOT } from "./harness";

const readme = fs.readFileSync(path.join(ROOT, "README.md"), "utf8");

/** Link reference definitions: [name]: url */
const refs = new Map([...readme.matchAll(/^\[([^\]]+)\]: (\S+)$/gm)].map((m) => [m[1]!, m[2]!]));

/** The text from a bold guide heading to the next bold guide heading or section heading. */
function guide(title: RegExp): string {
  const m = title.exec(readme);
  if (!m) throw new Error(`no guide matching ${title}`);
  const rest = readme.slice(m.index + m[0].length);
  const end = rest.search(/\n\*\*[A-Z][^*]+\*\* \(|\n#{2,4} /);
  return m[0] + (end === -1 ? rest : rest.slice(0, end));
}

function numberedSteps(text: string): number[] {
  return [...text.matchAll(/^(\d+)\. /gm)].map((m) => Number(m[1]));
}

function citedPages(text: string): string[] {
  const inline = [...text.matchAll(/\]\((https:\/\/[^)]+)\)/g)].map((m) => m[1]!);
  const byRef = [...text.matchAll(/\]\[([^\]]+)\]/g)].map((m) => refs.get(m[1]!)).filter((u): u is string => Boolean(u));
  return [...inline, ...byRef];
}

describe("README install guides", () => {
  it.each([
    ["Excel on the web", /\*\*Excel on the web \(upload a manifest\)\*\*/, /sideload-office-add-ins-for-testing/, ["Upload My Add-in"]],
    ["Excel on Windows", /\*\*Excel on Windows \(shared-folder catalogue\)\*\*/, /create-a-network-shared-folder-catalog/, ["Trusted Add-in Catalogs", "SHARED FOLDER"]],
    ["Excel on Mac", /\*\*Excel on Mac \(the manifest folder\)\*\*/, /sideload-an-office-add-in-on-mac/, ["com.microsoft.Excel/Data/Documents/wef"]],
    ["organisation-wide", /\*\*Organisation-wide, by an administrator\*\*/, /microsoft-365\/admin\/manage\//, ["Integrated apps", "Upload custom apps"]],
  ])("%s: numbered steps 1…n citing Microsoft's page, with what the user sees", (_name, title, page, words) => {
    const text = guide(title);
    const steps = numberedSteps(text);
    expect(steps.length).toBeGreaterThanOrEqual(4);
    expect(steps).toEqual(steps.map((_, i) => i + 1));
    const pages = citedPages(text);
    expect(pages.some((u) => page.test(u) && u.startsWith("https://learn.microsoft.com/"))).toBe(true);
    for (const w of words) expect(text).toContain(w);
    expect(text).toMatch(/manifest\.xml/);
  });

  it("says plainly that the steps could not be tried here, and why", () => {
    expect(readme).toMatch(/None of these steps could be tried here: there is no Excel/);
  });

  it("states the requirement set the manifest declares and where it is supported", () => {
    expect(readme).toMatch(/CustomFunctionsRuntime 1\.3/);
    expect(citedPages(readme)).toContain("https://learn.microsoft.com/javascript/api/requirement-sets/excel/custom-functions-requirement-sets");
  });
});

describe("README hosting guide", () => {
  const hosting = guide(/#### 2\. Put `dist\/` on a web server/);

  it("states what the server must do: HTTPS, the cross-origin header on functions.json, content types", () => {
    expect(hosting).toMatch(/HTTPS/);
    expect(hosting).toMatch(/Access-Control-Allow-Origin: \*/);
    expect(hosting).toMatch(/`\.json` as `application\/json`/);
    expect(hosting).toMatch(/`\.css` as `text\/css`/);
    expect(citedPages(hosting).some((u) => /publish-add-in-vs-code/.test(u))).toBe(true);
  });

  it("documents a plain static web server and a static-site service, and the check command", () => {
    expect(hosting).toMatch(/\*\*\(a\) A plain static web server\*\*/);
    expect(hosting).toMatch(/add_header Access-Control-Allow-Origin/);
    expect(hosting).toMatch(/\*\*\(b\) A static-site service of your choice\*\*/);
    expect(numberedSteps(hosting.slice(hosting.indexOf("(b)"))).length).toBeGreaterThanOrEqual(3);
    expect(hosting).toMatch(/npm run check-host -- https:\/\//);
  });

  it("the commands it names exist in package.json", () => {
    const scripts = (JSON.parse(fs.readFileSync(path.join(ROOT, "package.json"), "utf8")) as { scripts: Record<string, string> }).scripts;
    for (const cmd of ["build", "build:deploy", "check-host", "sideload", "help"]) expect(Object.keys(scripts)).toContain(cmd);
  });
});
