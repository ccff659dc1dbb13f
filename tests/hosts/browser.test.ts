/**
 * The built add-in (dist/) in a real browser engine: Debian's Chromium, driven by playwright-core,
 * loads dist/functions.html from a local static server on 127.0.0.1. Excel's runtime script is
 * replaced by tests/hosts/excel-runtime-shim.js, which records CustomFunctions.associate and
 * supplies CustomFunctions.Error/ErrorCode; every case of the shared table (tests/hosts/cases.ts,
 * each naming its Source) is then called as Excel calls it and must give the expected value and
 * exactly what the headless engine gives. A second page loads Office's real runtime copy from
 * dist/ to show the bundle associates every id into it. Every request is intercepted: any host
 * other than the local server fails the test. Workbook-free: no invented data beyond the table.
 */
import fs from "fs";
import path from "path";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { CASES, HostCase, Result, ResultCell, excelArgsOf, formulaOf, mismatches, unwrap } from "./cases";
import { CHROMIUM, CHROMIUM_ARGS, DIST, StaticServer, describeHost, distMetadata, engineResult, ensureDist, findProgram, serveDirectory } from "./harness";

const SHIM = fs.readFileSync(path.join(__dirname, "excel-runtime-shim.js"), "utf8");
const NETWORK_APIS = ["fetch(", "XMLHttpRequest", "WebSocket", "sendBeacon", "EventSource", "importScripts", "RTCPeerConnection", "new Worker("];

interface PageLog {
  /** Requests to any host but the local server (all are aborted). */
  outside: string[];
  /** Every request the page made. */
  all: string[];
  errors: string[];
}

async function openPage(context: BrowserContext, server: StaticServer, opts: { shim: boolean }): Promise<{ page: Page; log: PageLog }> {
  const log: PageLog = { outside: [], all: [], errors: [] };
  const local = new URL(server.origin).host;
  await context.route("**/*", async (route) => {
    const url = route.request().url();
    log.all.push(url);
    const u = new URL(url);
    if (u.host !== local) {
      log.outside.push(url);
      return route.abort("blockedbyclient");
    }
    if (opts.shim && u.pathname === "/custom-functions-runtime.js") {
      return route.fulfill({ status: 200, contentType: "text/javascript; charset=utf-8", body: SHIM });
    }
    return route.continue();
  });
  const page = await context.newPage();
  page.on("websocket", (ws) => log.outside.push(`websocket ${ws.url()}`));
  page.on("pageerror", (e) => log.errors.push(`page error: ${e.message}`));
  page.on("console", (m) => {
    if (m.type() === "error") log.errors.push(`console error: ${m.text()} ${m.location().url}`);
  });
  await page.goto(`${server.origin}/functions.html`, { waitUntil: "load" });
  return { page, log };
}

interface BrowserAnswer {
  rows?: (ResultCell | { error: string; message: string; isCustomFunctionsError: boolean } | { unexpected: string })[][];
  notAssociated?: string;
  threw?: string;
  notMatrix?: string;
  unexpected?: string;
}

/** One case's arguments with blanks as null (what the engine passes as "" is checked too). */
function withBlanksAs(args: ReturnType<typeof excelArgsOf>, blank: null | ""): ReturnType<typeof excelArgsOf> {
  return args.map((a) => (a === null ? null : a.map((r) => r.map((c) => (c === null ? blank : c)))));
}

function browserResult(a: BrowserAnswer): { ok: Result } | { problem: string } {
  if (!a.rows) return { problem: `no result: ${JSON.stringify(a)}` };
  const bad: string[] = [];
  const rows = a.rows.map((r) =>
    r.map((c) => {
      if (typeof c === "object" && c !== null && "unexpected" in c) {
        bad.push(c.unexpected);
        return "";
      }
      if (typeof c === "object" && c !== null && "error" in c) {
        if (!(c as { isCustomFunctionsError?: boolean }).isCustomFunctionsError) bad.push(`an error that is not a CustomFunctions.Error: ${JSON.stringify(c)}`);
        return { error: c.error, message: c.message };
      }
      return c as ResultCell;
    }),
  );
  return bad.length ? { problem: `unexpected cells: ${bad.join("; ")}` } : { ok: unwrap(rows) };
}

const chromiumPath = findProgram(CHROMIUM);

describe("dist/*.js network APIs", () => {
  beforeAll(() => ensureDist());
  it("functions.js (the add-in bundle) uses none: no fetch, XMLHttpRequest, WebSocket, sendBeacon, EventSource, workers", () => {
    const code = fs.readFileSync(path.join(DIST, "functions.js"), "utf8");
    expect(NETWORK_APIS.filter((api) => code.includes(api))).toEqual([]);
  });
  it("the only other script is Office's runtime copy, and its network APIs are exactly those of Office's own file", () => {
    // Any other .js in dist/ would be code of ours (or a library's) not covered by the test above.
    expect(fs.readdirSync(DIST).filter((n) => n.endsWith(".js")).sort()).toEqual(["custom-functions-runtime.js", "functions.js"]);
    const inDist = fs.readFileSync(path.join(DIST, "custom-functions-runtime.js"), "utf8");
    const office = fs.readFileSync(require.resolve("@microsoft/office-js/dist/custom-functions-runtime.js"), "utf8");
    const apis = (code: string) => NETWORK_APIS.filter((api) => code.includes(api));
    // The build minifies the copy, so it is compared by what it uses, not byte for byte; the page
    // test below shows it requests nothing from another host.
    expect(apis(inDist)).toEqual(apis(office));
  });
});

describeHost("the built add-in in Chromium", chromiumPath, CHROMIUM, () => {
  let browser: Browser;
  let server: StaticServer;

  beforeAll(async () => {
    ensureDist();
    const { chromium } = await import("playwright-core");
    server = await serveDirectory(DIST);
    browser = await chromium.launch({ executablePath: chromiumPath, args: CHROMIUM_ARGS });
  }, 120_000);

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  describe("with a stand-in for Excel's runtime", () => {
    let context: BrowserContext;
    let page: Page;
    let log: PageLog;
    let associated: { calls: string[]; ids: string[]; problems: string[] };
    const answers = new Map<HostCase, { nullBlanks: BrowserAnswer; textBlanks: BrowserAnswer }>();

    beforeAll(async () => {
      context = await browser.newContext({ serviceWorkers: "block" });
      ({ page, log } = await openPage(context, server, { shim: true }));
      await page.waitForFunction(() => (window as unknown as { __soilHost?: { calls: string[] } }).__soilHost?.calls.length, undefined, { timeout: 20_000 });
      associated = await page.evaluate(() => {
        const h = (window as unknown as { __soilHost: { calls: string[]; ids(): string[]; problems: string[] } }).__soilHost;
        return { calls: [...h.calls], ids: h.ids(), problems: [...h.problems] };
      });
      const meta = distMetadata();
      const calls = CASES.map((c) => {
        const m = meta.find((f) => f.id === c.id);
        const args = excelArgsOf(c, m ? m.parameters.length : c.args.length);
        return { id: c.id, nullBlanks: withBlanksAs(args, null), textBlanks: withBlanksAs(args, "") };
      });
      const out = await page.evaluate((list) => {
        const h = (window as unknown as { __soilHost: { call(id: string, args: unknown[]): unknown } }).__soilHost;
        return list.map((c) => ({ nullBlanks: h.call(c.id, c.nullBlanks), textBlanks: h.call(c.id, c.textBlanks) }));
      }, calls);
      CASES.forEach((c, i) => answers.set(c, out[i] as { nullBlanks: BrowserAnswer; textBlanks: BrowserAnswer }));
    }, 120_000);

    afterAll(async () => {
      await context?.close();
    });

    it("the page loads functions.html, the runtime and functions.js with no error", () => {
      expect(log.errors).toEqual([]);
      const paths = log.all.map((u) => new URL(u).pathname);
      expect(paths).toEqual(expect.arrayContaining(["/functions.html", "/custom-functions-runtime.js", "/functions.js"]));
    });

    it("every id in dist/functions.json is associated, once, with a function", () => {
      const ids = distMetadata().map((f) => f.id).sort();
      expect(associated.problems).toEqual([]);
      expect(associated.ids).toEqual(ids);
      expect([...associated.calls].sort()).toEqual(ids);
    });

    it.each(CASES.map((c) => [formulaOf(c), c] as const))("%s gives the expected value, as headless", (_f, c) => {
      const a = answers.get(c)!;
      const r = browserResult(a.nullBlanks);
      if ("problem" in r) throw new Error(r.problem);
      expect(mismatches(c, r.ok)).toEqual([]);
      expect(r.ok).toEqual(engineResult(c)); // exactly the engine's numbers, texts and messages
      expect(browserResult(a.textBlanks)).toEqual(r); // a blank passed as "" is a blank too
    });

    it("errors arrive as CustomFunctions.Error with the code of their kind", () => {
      const kinds = new Set<string>();
      for (const c of CASES) {
        for (const r of answers.get(c)!.nullBlanks.rows ?? []) {
          for (const cell of r) {
            if (typeof cell === "object" && cell !== null && "error" in cell) {
              expect(cell).toMatchObject({ isCustomFunctionsError: true });
              expect(["#VALUE!", "#N/A"]).toContain(cell.error);
              expect(cell.message.length).toBeGreaterThan(0);
              kinds.add(cell.error);
            }
          }
        }
      }
      expect([...kinds].sort()).toEqual(["#N/A", "#VALUE!"]);
    });

    it("an error value passed in comes back as the same error", async () => {
      const same = await page.evaluate(() => {
        const w = window as unknown as {
          CustomFunctions: { Error: new (code: string, message: string) => Error; ErrorCode: Record<string, string> };
          __soilHost: { call(id: string, args: unknown[]): { rows?: unknown[][] } };
        };
        const e = new w.CustomFunctions.Error(w.CustomFunctions.ErrorCode.notAvailable, "upstream");
        return w.__soilHost.call("CMOL", [[[e], [200.39]], [["Ca"]]]).rows;
      });
      expect(same).toEqual([[{ error: "#N/A", message: "upstream", isCustomFunctionsError: true }], [expect.closeTo(1, 9)]]);
    });

    it("the page asked nothing of any host but the local server", () => {
      expect(log.outside).toEqual([]);
      for (const u of log.all) expect(new URL(u).origin).toBe(server.origin);
    });
  });

  describe("with Office's own runtime copy from dist/", () => {
    let context: BrowserContext;
    let log: PageLog;
    let state: { mapped: string[] | null; errorCodes: Record<string, string>; errorIsReal: boolean[]; office: string };

    beforeAll(async () => {
      context = await browser.newContext({ serviceWorkers: "block" });
      let page: Page;
      ({ page, log } = await openPage(context, server, { shim: false }));
      await page.waitForLoadState("networkidle");
      state = await page.evaluate(() => {
        const w = window as unknown as {
          Office?: unknown;
          CustomFunctions: {
            Error: new (...a: unknown[]) => Error;
            ErrorCode: Record<string, string>;
            _association?: { m_mappings?: Record<string, (...a: unknown[]) => unknown[][]> };
          };
        };
        const m = w.CustomFunctions._association?.m_mappings;
        const errorIsReal: boolean[] = [];
        if (m && m.CMOL && m.SUFFICIENCY) {
          // The bindings make their errors with the real runtime's CustomFunctions.Error class.
          const a = m.CMOL([[-1]], [["Ca"]])[0]![0];
          const b = m.SUFFICIENCY([["P"]], [[30]], [["corn"]], [["Colwell"]], null)[0]![0];
          for (const [v, code] of [
            [a, w.CustomFunctions.ErrorCode.invalidValue],
            [b, w.CustomFunctions.ErrorCode.notAvailable],
          ] as const) {
            errorIsReal.push(v instanceof w.CustomFunctions.Error && (v as unknown as { code: string }).code === code);
          }
        }
        return { mapped: m ? Object.keys(m).sort() : null, errorCodes: { ...w.CustomFunctions.ErrorCode }, errorIsReal, office: typeof w.Office };
      });
    }, 120_000);

    afterAll(async () => {
      await context?.close();
    });

    it("the bundle associates every id into the real runtime (its internal mapping table, office-js 1.1.110)", () => {
      expect(state.mapped).toEqual(distMetadata().map((f) => f.id).sort());
    });

    it("errors are the real runtime's CustomFunctions.Error, #VALUE! and #N/A", () => {
      expect(state.errorCodes).toMatchObject({ invalidValue: "#VALUE!", notAvailable: "#N/A" });
      expect(state.errorIsReal).toEqual([true, true]);
    });

    it("no page error, and no request to any host but the local server", () => {
      expect(log.errors.filter((e) => !/o15apptofilemappingtable\.js/.test(e))).toEqual([]);
      expect(log.outside).toEqual([]);
      // Outside Office the runtime's loader also asks for its host mapping table next to itself
      // (not shipped, so a local 404); that is the only other request it makes.
      const paths = log.all.map((u) => new URL(u).pathname).sort();
      expect(paths.filter((p) => !["/functions.html", "/custom-functions-runtime.js", "/functions.js"].includes(p))).toEqual(
        paths.includes("/o15apptofilemappingtable.js") ? ["/o15apptofilemappingtable.js"] : [],
      );
    });
  });
});
