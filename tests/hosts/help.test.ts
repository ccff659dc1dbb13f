/**
 * The help site in dist/help, as Excel's function help would open it: Debian's Chromium (driven by
 * playwright-core, never a downloaded browser) loads the index from a local static server and
 * follows every link. Every link must resolve, every function in dist/functions.json must have a
 * page (its helpUrl) reachable from the index, and no page may fetch anything from another host
 * (every request is intercepted; the pages also carry a Content-Security-Policy that forbids it).
 * The generator's own rules (pages for functions added later, grouping by task) are checked
 * without a browser. No science here; the worked examples are checked in tests/functions.
 */
import fs from "fs";
import path from "path";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { CHROMIUM, CHROMIUM_ARGS, DIST, ROOT, StaticServer, describeHost, ensureDist, findProgram, serveDirectory } from "./harness";

// eslint-disable-next-line @typescript-eslint/no-require-imports
const help = require("../../scripts/help.js") as {
  renderHelpSite(input: unknown): Record<string, string>;
  readBindingDocs(dir?: string): { module: string; functionName: string; params: { name: string; text: string }[] }[];
  helpSiteFromRepo(root?: string): Record<string, string>;
  GROUPS: { key: string; title: string }[];
  CSP: string;
};

interface Meta {
  id: string;
  name: string;
  description?: string;
  helpUrl?: string;
  parameters: { name: string; optional?: boolean; description?: string }[];
}

const chromiumPath = findProgram(CHROMIUM);

describe("the help generator", () => {
  const metadata = JSON.parse(fs.readFileSync(path.join(ROOT, "generated", "functions.json"), "utf8")) as { functions: Meta[] };
  const associations = JSON.parse(fs.readFileSync(path.join(ROOT, "generated", "associations.json"), "utf8")) as { id: string; functionName: string; module: string }[];
  const docs = help.readBindingDocs(path.join(ROOT, "src", "functions"));
  const base = { metadata, associations, docs, caution: "Results are estimates.", version: "soilcell test" };

  it("makes one page per function in the metadata, an index and a stylesheet, and nothing else", () => {
    const files = help.renderHelpSite(base);
    expect(Object.keys(files).sort()).toEqual([...metadata.functions.map((f) => `${f.id}.html`), "index.html", "style.css"].sort());
  });

  it("a function added later (a new module, no JSDoc yet) gets a page and an index entry without anyone listing it", () => {
    const extra: Meta = { id: "NODSCORE", name: "NODSCORE", description: "An invented function for this test.", parameters: [{ name: "plants", description: "Plants dug." }] };
    const files = help.renderHelpSite({
      ...base,
      metadata: { functions: [...metadata.functions, extra] },
      associations: [...associations, { id: "NODSCORE", functionName: "nodscore", module: "legume-checks" }],
    });
    expect(files["NODSCORE.html"]).toContain("SOIL.NODSCORE");
    expect(files["NODSCORE.html"]).toContain("No worked example with a published source has been written for this function yet.");
    const index = files["index.html"]!;
    expect(index).toContain('href="NODSCORE.html"');
    // It lands in the legume-checks group, which sits between bands and legume nitrogen.
    expect(index.indexOf('id="legume-checks"')).toBeGreaterThan(index.indexOf('id="bands"'));
    expect(index.indexOf('id="legume-checks"')).toBeLessThan(index.indexOf('id="nitrogen"'));
    expect(index.indexOf('href="NODSCORE.html"')).toBeGreaterThan(index.indexOf('id="legume-checks"'));
  });

  describe("each argument shows what it truly takes and whether the function needs it (from the declarations)", () => {
    let site: Record<string, string>;
    beforeAll(() => {
      ensureDist(); // build/ holds the declare() specs the generator reads
      site = help.helpSiteFromRepo(ROOT);
    });
    /** The note after an argument's name on its function's page: "required · number, …". */
    const noteOf = (id: string, arg: string) => {
      const m = new RegExp(`<dt><code>${arg}</code> <span class="note">([^<]*)</span></dt>`).exec(site[`${id}.html`] ?? "");
      if (!m) throw new Error(`${id}.html has no argument ${arg}`);
      return m[1]!.replace(/&amp;/g, "&");
    };
    it("FIXSOIL's readings are numbers whose blank cell means not measured, not texts", () => {
      for (const id of ["FIXSOIL", "FIXSOILCOUNT"]) {
        expect(noteOf(id, "nitrate_kg_ha")).toBe("optional · number, or a range of numbers; a blank cell means not measured");
        expect(noteOf(id, "hot_water_b_mg_kg")).toBe("optional · number, or a range of numbers; a blank cell means not measured");
        expect(noteOf(id, "ph")).toBe("required · number, or a range of numbers");
      }
      expect(noteOf("NODRATING", "nodules")).toBe("optional · number, or a range of numbers; a blank cell means not measured");
      expect(site["FIXSOIL.html"]).toContain("except where the argument says a blank cell means not measured");
    });
    it("SUFFICIENCY's method is needed (unless a table is named), not optional; its unit and depth_cm are shown", () => {
      expect(noteOf("SUFFICIENCY", "method")).toBe("needed unless table names a built-in table or is your own · text, or a range of texts");
      expect(noteOf("SUFFICIENCY", "unit")).toBe("optional · text, or a range of texts");
      expect(noteOf("SUFFICIENCY", "depth_cm")).toBe("optional · number, or a range of numbers");
    });
    it("NFIXED's root_factor and NFIXDM's kg_n_per_t are needed numbers or words", () => {
      expect(noteOf("NFIXED", "root_factor")).toBe("needed always: there is no default factor · number or word, or a range of them");
      expect(noteOf("NFIXDM", "kg_n_per_t")).toBe("needed always: there is no default rule · number or word, or a range of them");
      expect(noteOf("NFIXDM", "root_factor")).toBe("optional · number or word, or a range of them");
    });
    it("no argument whose own text says it is needed or required is shown as optional", () => {
      for (const d of docs) {
        const id = associations.find((a) => a.functionName === d.functionName && a.module === d.module)?.id;
        if (!id) continue;
        for (const p of d.params) {
          if (/^(needed|required)\b/i.test(p.text)) expect({ id, arg: p.name, note: noteOf(id, p.name) }).toEqual({ id, arg: p.name, note: expect.stringMatching(/^(needed|required)/) });
        }
      }
    });
  });

  it("an unknown module gets a group of its own rather than being dropped", () => {
    const extra: Meta = { id: "ZZTEST", name: "ZZTEST", description: "Invented.", parameters: [] };
    const files = help.renderHelpSite({ ...base, metadata: { functions: [...metadata.functions, extra] }, associations: [...associations, { id: "ZZTEST", functionName: "zztest", module: "salinity" }] });
    expect(files["index.html"]).toMatch(/<h2 id="salinity">Salinity<\/h2>/);
  });

  it("every page forbids loading from another origin and runs no script", () => {
    const files = help.renderHelpSite(base);
    for (const [name, html] of Object.entries(files).filter(([n]) => n.endsWith(".html"))) {
      expect({ name, csp: html.includes(`content="${help.CSP}"`) }).toEqual({ name, csp: true });
      expect({ name, script: /<script/i.test(html) }).toEqual({ name, script: false });
    }
    expect(help.CSP).toMatch(/default-src 'none'/);
  });

  it("text from the declarations is escaped (an argument text with < & \" stays text)", () => {
    const extra: Meta = { id: "ESCTEST", name: "ESCTEST", description: 'a < b & "c"', parameters: [{ name: "x", description: "<img src=x>" }] };
    const files = help.renderHelpSite({ ...base, metadata: { functions: [extra] }, associations: [] });
    expect(files["ESCTEST.html"]).toContain("a &lt; b &amp; &quot;c&quot;");
    expect(files["ESCTEST.html"]).toContain("&lt;img src=x&gt;");
    expect(files["ESCTEST.html"]).not.toContain("<img");
  });
});

interface Visit {
  url: string;
  status: number;
  links: string[];
  h1: string;
  headings: string[];
  text: string;
}

describeHost("the help site in Chromium", chromiumPath, CHROMIUM, () => {
  let browser: Browser;
  let context: BrowserContext;
  let server: StaticServer;
  const outside: string[] = [];
  const consoleErrors: string[] = [];
  const visits = new Map<string, Visit>();
  const broken: string[] = [];
  let fns: Meta[];

  async function visit(page: Page, url: string): Promise<Visit> {
    const res = await page.goto(url, { waitUntil: "load" });
    const status = res?.status() ?? 0;
    const data = await page.evaluate(() => ({
      links: Array.from(document.querySelectorAll("a[href]")).map((a) => (a as HTMLAnchorElement).href),
      rawLinks: Array.from(document.querySelectorAll("a[href]")).map((a) => a.getAttribute("href") ?? ""),
      h1: document.querySelector("h1")?.textContent ?? "",
      headings: Array.from(document.querySelectorAll("h2")).map((h) => h.textContent ?? ""),
      text: document.body.innerText,
      ids: Array.from(document.querySelectorAll("[id]")).map((e) => e.id),
      styled: getComputedStyle(document.body).margin === "0px",
    }));
    if (!data.styled) consoleErrors.push(`${url}: the stylesheet did not apply`);
    for (const raw of data.rawLinks) if (/^[a-z]+:/i.test(raw) || raw.startsWith("//")) broken.push(`${url}: link to another place ${raw}`);
    for (const l of data.links) {
      const u = new URL(l);
      if (u.hash && u.pathname === new URL(url).pathname && !data.ids.includes(u.hash.slice(1))) broken.push(`${url}: anchor ${u.hash} not on the page`);
    }
    return { url, status, links: data.links, h1: data.h1, headings: data.headings, text: data.text };
  }

  beforeAll(async () => {
    ensureDist();
    fns = (JSON.parse(fs.readFileSync(path.join(DIST, "functions.json"), "utf8")) as { functions: Meta[] }).functions;
    server = await serveDirectory(DIST);
    const { chromium } = await import("playwright-core");
    browser = await chromium.launch({ executablePath: chromiumPath, args: CHROMIUM_ARGS });
    context = await browser.newContext();
    const local = new URL(server.origin).host;
    await context.route("**/*", (route) => {
      const u = new URL(route.request().url());
      if (u.host !== local) {
        outside.push(route.request().url());
        return route.abort("blockedbyclient");
      }
      return route.continue();
    });
    const page = await context.newPage();
    page.on("console", (m) => {
      if (m.type() === "error") consoleErrors.push(`${m.text()} ${m.location().url}`);
    });
    page.on("pageerror", (e) => consoleErrors.push(`page error: ${e.message}`));
    // Crawl from the index and from every helpUrl (rewritten to the local server).
    const start = `${server.origin}/help/index.html`;
    const queue = [start, ...fns.map((f) => server.origin + new URL(f.helpUrl!).pathname)];
    while (queue.length) {
      const url = queue.shift()!;
      const key = url.split("#")[0]!;
      if (visits.has(key)) continue;
      const v = await visit(page, key);
      visits.set(key, v);
      if (v.status !== 200) broken.push(`${key} → ${v.status}`);
      for (const l of v.links) {
        const u = new URL(l);
        if (u.origin === server.origin && u.pathname.startsWith("/help/")) queue.push(l);
      }
    }
  }, 180_000);

  afterAll(async () => {
    await context?.close();
    await browser?.close();
    await server?.close();
  });

  it("crawled the index and a page per function", () => {
    expect(visits.size).toBeGreaterThanOrEqual(fns.length + 1);
  });

  it("every link resolves (status 200, anchors present) and none leads to another site", () => {
    expect(broken).toEqual([]);
  });

  it("no page fetched anything from another host, and nothing was blocked by the pages' own policy", () => {
    expect(outside).toEqual([]);
    expect(consoleErrors).toEqual([]);
  });

  it("every function in dist/functions.json has a page at its helpUrl, titled with its name", () => {
    for (const f of fns) {
      const v = visits.get(server.origin + new URL(f.helpUrl!).pathname);
      expect({ id: f.id, status: v?.status, h1: v?.h1 }).toEqual({ id: f.id, status: 200, h1: `SOIL.${f.name}` });
    }
  });

  it("the index links every function exactly once", () => {
    const index = visits.get(`${server.origin}/help/index.html`)!;
    for (const f of fns) {
      const n = index.links.filter((l) => new URL(l).pathname === `/help/${f.id}.html`).length;
      expect({ id: f.id, links: n }).toEqual({ id: f.id, links: 1 });
    }
  });

  it("the index groups functions by task, in task order", () => {
    const index = visits.get(`${server.origin}/help/index.html`)!;
    const known = help.GROUPS.map((g) => g.title);
    const present = index.headings.filter((h) => known.includes(h));
    expect(present).toEqual(known.filter((t) => present.includes(t)));
    expect(present).toEqual(expect.arrayContaining(["Units and chemistry", "Cation exchange", "Lime", "Nutrient bands and fertility", "Legume nitrogen"]));
  });

  it("every function page has its sections: arguments, result, refusals, a worked example with its source, method and source, caution", () => {
    for (const f of fns) {
      const v = visits.get(server.origin + new URL(f.helpUrl!).pathname)!;
      expect({ id: f.id, headings: v.headings }).toEqual({
        id: f.id,
        headings: ["Formula", "Arguments", "Result", "When it refuses", "Worked example", "Method and source", "Caution"],
      });
      expect({ id: f.id, source: /Source: \S/.test(v.text) }).toEqual({ id: f.id, source: true });
      expect({ id: f.id, caution: /estimates/i.test(v.text) }).toEqual({ id: f.id, caution: true });
      for (const p of f.parameters) expect({ id: f.id, arg: v.text.includes(p.name) }).toEqual({ id: f.id, arg: true });
    }
  });
});
