/**
 * No network, least privilege. tests/hosts already checks that the bundle uses no fetch,
 * XMLHttpRequest, WebSocket, beacon, event source or worker, that the page requests nothing from
 * any other host, and that the manifest asks for Restricted. The two text checks below (no network
 * API in the bundle, Permissions is Restricted) are made here too, always: they are cheap, and a
 * check that skips itself when another file's wording changes could never fail. Added here: other ways a bundle can
 * reach the network, and that every web address in it comes from our own sources (citations in
 * data files), not from a library. Source for the permission levels: Office add-in manifest
 * reference (Restricted, ReadDocument, ReadAllDocument, WriteDocument, ReadWriteDocument), from memory.
 */
import fs from "fs";
import path from "path";
import { DIST, ensureDist } from "../hosts/harness";

const ROOT = path.join(__dirname, "../..");
function filesUnder(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? filesUnder(path.join(dir, e.name)) : [path.join(dir, e.name)]));
}

describe("the add-in bundle reaches no network", () => {
  let code: string;
  beforeAll(() => {
    ensureDist();
    code = fs.readFileSync(path.join(DIST, "functions.js"), "utf8");
  });

  it("uses no other way to load or send anything: dynamic import, script or image elements, WebTransport, window.open, navigation", () => {
    const ways = [/\bimport\(/, /createElement\(\s*["'`](script|img|iframe|link)["'`]/i, /\bnew Image\(/, /\bWebTransport\b/, /\bwindow\.open\(/, /location\.(assign|replace)\(/, /location\.href\s*=/, /document\.write\(/, /\bnavigator\.sendBeacon\b/];
    expect(ways.filter((w) => w.test(code)).map(String)).toEqual([]);
  });

  it("holds no web address that is not in our own sources (the citations of data files)", () => {
    const ours = filesUnder(path.join(ROOT, "src"))
      .filter((f) => /\.(ts|json|html)$/.test(f))
      .map((f) => fs.readFileSync(f, "utf8"))
      .join("\n");
    const urls = [...new Set([...code.matchAll(/https?:\/\/[^\s"'`)<>\\]+/g)].map((m) => m[0]))];
    // XML namespace names are identifiers, never fetched
    const foreign = urls.filter((u) => !ours.includes(u) && !/^http:\/\/(www\.w3\.org|schemas\.(openxmlformats|microsoft)\.(org|com))\//.test(u));
    expect(foreign).toEqual([]);
  });

  it("uses no fetch, XMLHttpRequest, WebSocket, EventSource or worker", () => {
    expect(["fetch(", "XMLHttpRequest", "WebSocket", "EventSource", "new Worker(", "importScripts"].filter((api) => code.includes(api))).toEqual([]);
  });
});

describe("manifest.xml asks for the least privilege", () => {
  it("Permissions is Restricted, in source and as built", () => {
    for (const file of [path.join(ROOT, "manifest.xml"), path.join(DIST, "manifest.xml")]) {
      const xml = fs.readFileSync(file, "utf8");
      expect(xml.match(/<Permissions>([^<]*)<\/Permissions>/g)).toEqual(["<Permissions>Restricted</Permissions>"]);
    }
  });

  it("no other permission word appears anywhere in it (in source or as built)", () => {
    for (const file of [path.join(ROOT, "manifest.xml"), path.join(DIST, "manifest.xml")]) {
      const xml = fs.readFileSync(file, "utf8");
      expect(xml.match(/\b(ReadDocument|ReadAllDocument|WriteDocument|ReadWriteDocument|ReadWriteMailbox|ReadWriteItem|ReadItem)\b/g)).toBeNull();
    }
  });
});
