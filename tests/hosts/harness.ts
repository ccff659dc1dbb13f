/**
 * Shared helpers for the host tests: the built dist/ (built once if missing or stale), a local
 * static server, the engine's answer for a case, and skipping when a host program is missing
 * (only outside CI: with CI set, a missing host is a failure). Nothing here is science; case
 * values and their sources are in cases.ts (invented workbook contents are marked there).
 */
import { execFileSync } from "child_process";
import fs from "fs";
import http from "http";
import os from "os";
import path from "path";
import { AddressInfo } from "net";
import { evaluateFormula } from "../../src/engine/evaluate";
import { HostCase, Result, ResultCell, formulaOf, unwrap } from "./cases";

export const ROOT = path.resolve(__dirname, "..", "..");
export const DIST = path.join(ROOT, "dist");

// ---------------------------------------------------------------------------------------------
// Host programs

export const CHROMIUM = "/usr/bin/chromium";
export const CHROMIUM_ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

/** The first of `names` found on PATH (or as an absolute path), or undefined: the engine's own lookup. */
export { findProgram } from "../../src/engine/office-pdf";

/**
 * `describe` when the host program is there. Missing outside CI: one skipped test saying how to
 * install it. Missing with CI set: one failing test, so CI never passes without the host.
 */
export function describeHost(title: string, program: string | undefined, what: string, body: () => void): void {
  if (program) {
    describe(title, body);
    return;
  }
  const hint = `${what} not found; install it with .ci/system-packages (Debian: apt-get install chromium libreoffice-calc)`;
  if (process.env.CI) {
    describe(title, () => {
      it(`needs ${what} (CI is set, so a missing host fails)`, () => {
        throw new Error(hint);
      });
    });
  } else {
    // eslint-disable-next-line no-console
    console.warn(`SKIPPED ${title}: ${hint}`);
    describe(title, () => {
      it.skip(`SKIPPED: ${hint}`, () => undefined);
    });
  }
}

// ---------------------------------------------------------------------------------------------
// dist/

const BUILD_INPUTS = ["src", "generated", "assets", "scripts", "manifest.xml", "webpack.config.js", "package.json"];

function newestMtime(p: string): number {
  if (!fs.existsSync(p)) return 0;
  const st = fs.statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = 0;
  for (const e of fs.readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, e)));
  return newest;
}

function distIsFresh(): boolean {
  const out = path.join(DIST, "functions.js");
  if (!fs.existsSync(out) || !fs.existsSync(path.join(DIST, "functions.json")) || !fs.existsSync(path.join(DIST, "manifest.xml"))) return false;
  const built = fs.statSync(out).mtimeMs;
  // generated/ is rewritten by the build itself (before webpack), so it never looks newer.
  return BUILD_INPUTS.every((i) => newestMtime(path.join(ROOT, i)) <= built);
}

function sleep(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/**
 * Makes sure dist/ holds a build of the current sources. `npm test` builds first, so this only
 * builds when a host test is run on its own after an edit. A lock keeps parallel test files
 * from building at once.
 */
export function ensureDist(): void {
  if (distIsFresh()) return;
  const lock = path.join(os.tmpdir(), `soilcell-dist-${Buffer.from(ROOT).toString("hex").slice(-24)}.lock`);
  const started = Date.now();
  for (;;) {
    try {
      fs.mkdirSync(lock);
      break;
    } catch {
      if (Date.now() - started > 240_000) throw new Error(`waited 4 minutes for ${lock}; remove it if no build is running`);
      sleep(250);
    }
  }
  try {
    if (distIsFresh()) return;
    execFileSync("npm", ["run", "build", "--silent"], { cwd: ROOT, stdio: ["ignore", "pipe", "pipe"], timeout: 240_000 });
  } catch (e) {
    const err = e as { stdout?: Buffer; stderr?: Buffer; message: string };
    throw new Error(`npm run build failed: ${err.message}\n${err.stdout?.toString() ?? ""}\n${err.stderr?.toString() ?? ""}`);
  } finally {
    fs.rmdirSync(lock);
  }
}

/** dist/functions.json: the metadata Excel reads. */
export interface FunctionMeta {
  id: string;
  name: string;
  parameters: { name: string; optional?: boolean; dimensionality?: string }[];
  result: { dimensionality?: string };
}
export function distMetadata(): FunctionMeta[] {
  return (JSON.parse(fs.readFileSync(path.join(DIST, "functions.json"), "utf8")) as { functions: FunctionMeta[] }).functions;
}

// ---------------------------------------------------------------------------------------------
// A static server for dist/, on 127.0.0.1 only

const TYPES: Record<string, string> = {
  ".html": "text/html; charset=utf-8",
  ".css": "text/css; charset=utf-8",
  ".js": "text/javascript; charset=utf-8",
  ".json": "application/json",
  ".xml": "application/xml",
  ".png": "image/png",
  ".map": "application/json",
  ".txt": "text/plain",
};

export interface StaticServer {
  readonly origin: string;
  /** Paths asked for, in order. */
  readonly served: string[];
  close(): Promise<void>;
}

/** A plain static server for `dir`; `headers` are added to every successful response (as a host's header rules would). */
export async function serveDirectory(dir: string, headers: Record<string, string> = {}): Promise<StaticServer> {
  const served: string[] = [];
  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", "http://127.0.0.1");
    served.push(url.pathname);
    const file = path.join(dir, decodeURIComponent(url.pathname));
    if (!file.startsWith(dir + path.sep) || !fs.existsSync(file) || fs.statSync(file).isDirectory()) {
      res.writeHead(404, { "content-type": "text/plain" });
      res.end("not found");
      return;
    }
    res.writeHead(200, { "content-type": TYPES[path.extname(file)] ?? "application/octet-stream", "cache-control": "no-store", ...headers });
    res.end(fs.readFileSync(file));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  return {
    origin: `http://127.0.0.1:${port}`,
    served,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

// ---------------------------------------------------------------------------------------------
// The headless engine's answer for a case

const ELEMENT_ERROR = /^(#VALUE!|#N\/A)(?: ([\s\S]*))?$/;

function engineCell(v: unknown): ResultCell {
  if (v === null || v === undefined) return "";
  if (typeof v === "string") {
    const m = ELEMENT_ERROR.exec(v);
    if (m) return { error: m[1]!, message: m[2] ?? "" };
    return v;
  }
  if (typeof v === "number") return v;
  return String(v);
}

/** The case typed as a formula and evaluated headless, as a host-neutral result. */
export function engineResult(c: HostCase): Result {
  const r = evaluateFormula(formulaOf(c));
  if (r.error !== undefined) return { error: r.error, message: r.message ?? "" };
  if (Array.isArray(r.value)) return unwrap(r.value.map((row) => row.map(engineCell)));
  return engineCell(r.value);
}
