#!/usr/bin/env node
/**
 * The host a deploy build writes into dist/manifest.xml and the help links, checked before anything
 * is built: an absolute https:// URL of a real host (not localhost, with or without a trailing dot,
 * not a loopback, private-use, link-local or shared IPv4 or IPv6 address, nor an IPv6 form carrying
 * one), no trailing dot on the name, no user name or password, no query or fragment. A trailing
 * slash is dropped.
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

/** The four octets of a dotted IPv4 address (as the URL parser normalises it), or undefined. */
function ipv4Octets(h) {
  const m = /^(\d{1,3})\.(\d{1,3})\.(\d{1,3})\.(\d{1,3})$/.exec(h);
  if (!m) return undefined;
  const o = m.slice(1).map(Number);
  return o.every((x) => x <= 255) ? o : undefined;
}

/**
 * IPv4 addresses that reach no one else's network: "this network" 0/8, private use 10/8,
 * 172.16/12 and 192.168/16 (RFC 1918), shared address space 100.64/10 (RFC 6598), loopback 127/8,
 * link-local 169.254/16 (RFC 3927).
 */
function isLocalIpv4(o) {
  const [a, b] = o;
  return a === 0 || a === 10 || a === 127 || (a === 100 && b >= 64 && b <= 127) || (a === 169 && b === 254) || (a === 172 && b >= 16 && b <= 31) || (a === 192 && b === 168);
}

/** The eight 16-bit groups of an IPv6 address (compressed "::" and a dotted IPv4 tail allowed), or undefined. */
function ipv6Groups(h) {
  let text = h;
  const tail = /(\d{1,3}(?:\.\d{1,3}){3})$/.exec(text);
  let v4 = [];
  if (tail) {
    const o = ipv4Octets(tail[1]);
    if (!o) return undefined;
    v4 = [((o[0] << 8) | o[1]).toString(16), ((o[2] << 8) | o[3]).toString(16)];
    text = text.slice(0, -tail[1].length) + v4.join(":");
  }
  const halves = text.split("::");
  if (halves.length > 2) return undefined;
  const part = (x) => (x === "" ? [] : x.split(":"));
  const head = part(halves[0]);
  const rest = halves.length === 2 ? part(halves[1]) : [];
  const fill = halves.length === 2 ? 8 - head.length - rest.length : 0;
  if (fill < 0 || (halves.length === 1 && head.length !== 8)) return undefined;
  const groups = [...head, ...Array(fill).fill("0"), ...rest];
  if (groups.length !== 8 || !groups.every((g) => /^[0-9a-f]{1,4}$/.test(g))) return undefined;
  return groups.map((g) => parseInt(g, 16));
}

/**
 * IPv6 addresses that reach no one else's network: unspecified and loopback (::, ::1), unique
 * local fc00::/7 (RFC 4193), link-local fe80::/10 and the old site-local fec0::/10 (RFC 4291,
 * RFC 3879), and the forms that carry an IPv4 address (mapped ::ffff:0:0/96, compatible ::/96,
 * the NAT64 prefix 64:ff9b::/96 of RFC 6052, 6to4 2002::/16 of RFC 3056) when that address is local.
 */
function isLocalIpv6(g) {
  const zeros = (from, to) => g.slice(from, to).every((x) => x === 0);
  const v4At = (i) => [g[i] >> 8, g[i] & 255, g[i + 1] >> 8, g[i + 1] & 255];
  if (zeros(0, 7) && g[7] <= 1) return true; // :: and ::1
  if ((g[0] & 0xfe00) === 0xfc00 || (g[0] & 0xffc0) === 0xfe80 || (g[0] & 0xffc0) === 0xfec0) return true;
  if (zeros(0, 5) && (g[5] === 0xffff || g[5] === 0) && isLocalIpv4(v4At(6))) return true;
  if (g[0] === 0x64 && g[1] === 0xff9b && zeros(2, 6) && isLocalIpv4(v4At(6))) return true;
  if (g[0] === 0x2002 && isLocalIpv4(v4At(1))) return true;
  return false;
}

/**
 * True for a host name no one else can reach: localhost and its subdomains (RFC 6761), with or
 * without the root's trailing dot, and the local IPv4 and IPv6 addresses above.
 */
function isLoopbackOrLocal(hostname) {
  const h = hostname.toLowerCase().replace(/^\[|\]$/g, "").replace(/\.+$/, "");
  if (h === "localhost" || h.endsWith(".localhost")) return true;
  const v4 = ipv4Octets(h);
  if (v4) return isLocalIpv4(v4);
  if (h.includes(":")) {
    const v6 = ipv6Groups(h);
    // An address the parser accepted but this reading cannot: refused rather than let through.
    return v6 === undefined || isLocalIpv6(v6);
  }
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
  if (url.hostname.endsWith(".")) {
    throw new DeployHostError(`SOILCELL_HOST "${raw}" ends its host name with a dot; give it without ("${url.hostname.replace(/\.+$/, "")}"): certificates and Office's checks expect the plain name`);
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

module.exports = { DEV_HOST, DeployHostError, checkDeployHost, isLoopbackOrLocal, isUnder, urlsInXml, urlsOutsideHost };

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
