#!/usr/bin/env node
/**
 * Checks a deployed copy of dist/ the way Office will read it, before anyone installs the manifest:
 *   - the manifest is there, and every URL in it lies under the address given;
 *   - every file the manifest and functions.json name answers 200 with the right content type;
 *   - functions.json may be read from another origin (Excel on the web fetches it across origins:
 *     Access-Control-Allow-Origin must be * or Excel's origin);
 *   - the address is https.
 * Prints one line per problem and exits 1 when there is any; makes only GET requests to that host.
 *
 * Usage: npm run check-host -- https://addins.example.org/soilcell
 * (--allow-http is for the project's own tests against a local server.)
 */
const { urlsOutsideHost } = require("./deploy-host");

const EXCEL_WEB_ORIGIN = "https://excel.officeapps.live.com";
const TYPES = {
  ".json": /^application\/json\b/i,
  ".js": /^(text|application)\/(javascript|x-javascript|ecmascript)\b/i,
  ".html": /^text\/html\b/i,
  ".css": /^text\/css\b/i,
  ".png": /^image\/png\b/i,
  ".xml": /^(application|text)\/xml\b/i,
};

function extOf(url) {
  const m = /\.[a-z0-9]+$/i.exec(new URL(url).pathname);
  return m ? m[0].toLowerCase() : "";
}

/**
 * @param {string} base the address dist/ is served from
 * @param {{ allowHttp?: boolean, fetchImpl?: typeof fetch }} [opts]
 * @returns {Promise<{ problems: string[], checked: number }>}
 */
async function checkHost(base, opts = {}) {
  const f = opts.fetchImpl ?? fetch;
  const host = base.replace(/\/+$/, "");
  const problems = [];
  if (!host.startsWith("https://") && !opts.allowHttp) problems.push(`${host} is not https: Office loads add-ins only over HTTPS`);
  const get = async (url, headers = {}) => {
    try {
      return await f(url, { headers, redirect: "manual" });
    } catch (e) {
      problems.push(`${url}: ${e.cause?.code ?? e.message}`);
      return undefined;
    }
  };
  const manifestRes = await get(`${host}/manifest.xml`);
  if (!manifestRes || manifestRes.status !== 200) {
    if (manifestRes) problems.push(`${host}/manifest.xml → ${manifestRes.status}`);
    return { problems, checked: 1 };
  }
  const manifest = await manifestRes.text();
  const metaRes = await get(`${host}/functions.json`, { Origin: EXCEL_WEB_ORIGIN });
  let metadata = { functions: [] };
  if (metaRes && metaRes.status === 200) {
    const acao = metaRes.headers.get("access-control-allow-origin");
    if (acao !== "*" && acao !== EXCEL_WEB_ORIGIN) {
      problems.push(`${host}/functions.json has no Access-Control-Allow-Origin for ${EXCEL_WEB_ORIGIN} (got ${acao ?? "none"}): Excel on the web cannot read the functions`);
    }
    try {
      metadata = JSON.parse(await metaRes.text());
    } catch {
      problems.push(`${host}/functions.json is not JSON`);
    }
  } else if (metaRes) {
    problems.push(`${host}/functions.json → ${metaRes.status}`);
  }
  for (const p of urlsOutsideHost(manifest, metadata, host)) problems.push(`not under ${host}: ${p}`);
  const urls = new Set([...manifest.replace(/<!--[\s\S]*?-->/g, "").matchAll(/DefaultValue="(https?:\/\/[^"]+)"/g)].map((m) => m[1]));
  for (const fn of metadata.functions ?? []) if (fn.helpUrl) urls.add(fn.helpUrl);
  urls.add(`${host}/help/style.css`);
  let checked = 2;
  for (const url of urls) {
    if (!url.startsWith(host + "/")) continue; // reported above
    const res = await get(url);
    checked++;
    if (!res) continue;
    if (res.status !== 200) {
      problems.push(`${url} → ${res.status}`);
      continue;
    }
    const type = res.headers.get("content-type") ?? "";
    const want = TYPES[extOf(url)];
    if (want && !want.test(type)) problems.push(`${url} is served as "${type || "no content type"}"`);
    await res.arrayBuffer();
  }
  return { problems, checked };
}

module.exports = { checkHost, EXCEL_WEB_ORIGIN };

if (require.main === module) {
  const args = process.argv.slice(2);
  const base = args.find((a) => !a.startsWith("--"));
  if (!base) {
    console.error("usage: npm run check-host -- https://your.host/path");
    process.exit(2);
  }
  checkHost(base, { allowHttp: args.includes("--allow-http") }).then(({ problems, checked }) => {
    for (const p of problems) console.log(p);
    console.log(problems.length ? `${problems.length} problem(s) in ${checked} requests` : `ok: ${checked} requests, everything Office reads is there`);
    process.exit(problems.length ? 1 : 0);
  });
}
