#!/usr/bin/env node
/**
 * The host a deploy build writes into dist/manifest.xml and the help links, checked before anything
 * is built: an absolute https:// URL of a real host (not localhost, not a loopback or private-use
 * address), no user name or password, no query or fragment. A trailing slash is dropped.
 *
 * Also the check run on the emitted files: every URL in the manifest and every helpUrl in
 * functions.json must lie under that host.
 *
 * As a script (`npm run build:deploy` runs it first): reads SOILCELL_HOST and exits 1 with the
 * reason when it is missing or not acceptable.
 */

const DEV_HOST = "https://localhost:3000";

/** A refusal the build prints as it is. */
class DeployHostError extends Error {}

function isLoopbackOrLocal(hostname) {
  const h = hostname.toLowerCase().replace(/^\[|\]$/g, "");
  if (h === "localhost" || h.endsWith(".localhost") || h === "0.0.0.0" || h === "::" || h === "::1") return true;
  if (/^127\./.test(h)) return true;
  // Private-use IPv4 ranges (RFC 1918) and link-local: a manifest pointing there works for no one else.
  if (/^10\./.test(h) || /^192\.168\./.test(h) || /^169\.254\./.test(h)) return true;
  const m = /^172\.(\d+)\./.exec(h);
  if (m && Number(m[1]) >= 16 && Number(m[1]) <= 31) return true;
  return false;
}

/**
 * The normalised host URL (no trailing slash), or a DeployHostError saying what to give instead.
 * @param {string | undefined} value
 * @returns {string}
 */
function checkDeployHost(value) {
  const example = "SOILCELL_HOST=https://addins.example.org/soilcell npm run build:deploy";
  if (value === undefined || String(value).trim() === "") {
    throw new DeployHostError(`build:deploy needs the address the add-in will be served from, as an https:// URL; for example\n  ${example}`);
  }
  const raw = String(value).trim();
  let url;
  try {
    url = new URL(raw);
  } catch {
    throw new DeployHostError(`SOILCELL_HOST "${raw}" is not a URL; give the full https:// address, for example\n  ${example}`);
  }
  if (url.protocol !== "https:") {
    throw new DeployHostError(`SOILCELL_HOST "${raw}" is not https: Office loads add-ins only over HTTPS with a trusted certificate`);
  }
  if (isLoopbackOrLocal(url.hostname)) {
    throw new DeployHostError(
      `SOILCELL_HOST "${raw}" is a local address; a deploy build is for a host your users can reach. For a local trial use \`npm run build\` (https://localhost:3000)`,
    );
  }
  if (!url.hostname.includes(".") && !url.hostname.includes(":")) {
    throw new DeployHostError(`SOILCELL_HOST "${raw}" has no domain (a bare name such as "${url.hostname}" resolves only on one network); give the full host name`);
  }
  if (url.username || url.password) throw new DeployHostError(`SOILCELL_HOST "${raw}" carries a user name or password; never put credentials in a manifest`);
  if (url.search || url.hash || raw.includes("?") || raw.includes("#")) {
    throw new DeployHostError(`SOILCELL_HOST "${raw}" has a query or fragment; give the folder the files are served from`);
  }
  return `${url.origin}${url.pathname}`.replace(/\/+$/, "");
}

/** Every absolute URL an XML text holds in an attribute value or as element text. */
function urlsInXml(xml) {
  const urls = [];
  for (const m of xml.matchAll(/(?:="|>)\s*([a-z][a-z0-9+.-]*:\/\/[^"<\s]*)/gi)) urls.push(m[1]);
  return urls;
}

/** True when `url` is the host itself or lies under its path. */
function isUnder(url, host) {
  let u;
  let h;
  try {
    u = new URL(url);
    h = new URL(host + "/");
  } catch {
    return false;
  }
  return u.protocol === h.protocol && u.host === h.host && !u.username && !u.password && u.pathname.startsWith(h.pathname);
}

/**
 * What in the emitted manifest and metadata is not under `host`, one line per URL ([] when all is).
 * XML namespace URIs (xmlns attributes) are names, not addresses, and are left out.
 * @param {string} manifestXml
 * @param {{ functions: { id: string, helpUrl?: string }[] }} metadata
 * @param {string} host
 */
function urlsOutsideHost(manifestXml, metadata, host) {
  const bad = [];
  const withoutNamespaces = manifestXml.replace(/<!--[\s\S]*?-->/g, "").replace(/\sxmlns(?::[A-Za-z0-9_]+)?="[^"]*"/g, "");
  const urls = urlsInXml(withoutNamespaces);
  if (urls.length === 0) bad.push("manifest.xml holds no URL at all");
  for (const u of urls) if (!isUnder(u, host)) bad.push(`manifest.xml: ${u}`);
  for (const f of metadata.functions) {
    if (f.helpUrl === undefined) bad.push(`functions.json: ${f.id} has no helpUrl`);
    else if (!isUnder(f.helpUrl, host)) bad.push(`functions.json: ${f.id} helpUrl ${f.helpUrl}`);
  }
  return bad;
}

module.exports = { DEV_HOST, DeployHostError, checkDeployHost, isUnder, urlsInXml, urlsOutsideHost };

if (require.main === module) {
  try {
    const host = checkDeployHost(process.env.SOILCELL_HOST);
    console.error(`build:deploy: host ${host}`);
  } catch (e) {
    if (!(e instanceof DeployHostError)) throw e;
    console.error(`build:deploy refused: ${e.message}`);
    process.exit(1);
  }
}
