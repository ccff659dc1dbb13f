/**
 * LibreOffice Calc headless as an outside reference: one run converts a whole list of workbooks
 * to .xlsx, in a private throw-away profile whose settings make Calc a faithful oracle:
 *
 * - OOXMLRecalcMode = 0 ("always recalculate" when loading an Excel 2007+ file; the shipped
 *   default 1 keeps the cached values). Checked by the oracle itself: every corpus formula cell
 *   caches a sentinel value that must not come back.
 * - StringConversion = 3 (text → number conversion "locale dependent", Excel's behaviour: the
 *   text "12.5" in =A1*2 is converted, under en-US rules); Calc's default (2) converts only
 *   unambiguous integers and ISO dates.
 * - Locale en-US, so number, currency, date and time texts read as Excel en-US reads them.
 *
 * Values of the settings: LibreOffice's configuration schema (officecfg Calc.xcs, group
 * Formula/Load and Formula/Syntax), as installed in /usr/lib/libreoffice/share/registry/main.xcd.
 */
"use strict";
const { execFileSync } = require("child_process");
const fs = require("fs");
const os = require("os");
const path = require("path");

const CANDIDATES = ["/usr/bin/libreoffice", "/usr/bin/soffice", "/usr/lib/libreoffice/program/soffice"];

function findLibreOffice() {
  if (process.env.SOILCELL_LIBREOFFICE) return fs.existsSync(process.env.SOILCELL_LIBREOFFICE) ? process.env.SOILCELL_LIBREOFFICE : undefined;
  for (const c of CANDIDATES) if (fs.existsSync(c)) return c;
  for (const dir of (process.env.PATH ?? "").split(path.delimiter)) {
    for (const n of ["libreoffice", "soffice"]) {
      const p = path.join(dir, n);
      if (dir && fs.existsSync(p)) return p;
    }
  }
  return undefined;
}

function libreOfficeVersion(bin = findLibreOffice()) {
  if (!bin) return undefined;
  return execFileSync(bin, ["--version"], { encoding: "utf8" }).trim();
}

const XCU = (items) =>
  '<?xml version="1.0" encoding="UTF-8"?>\n' +
  '<oor:items xmlns:oor="http://openoffice.org/2001/registry" xmlns:xs="http://www.w3.org/2001/XMLSchema" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">\n' +
  items.map(([p, name, value]) => `<item oor:path="${p}"><prop oor:name="${name}" oor:op="fuse"><value>${value}</value></prop></item>`).join("\n") +
  "\n</oor:items>\n";

/** Creates a private profile with the oracle's settings; returns its directory. */
function makeProfile(dir = fs.mkdtempSync(path.join(os.tmpdir(), "soilcell-lo-profile-"))) {
  const user = path.join(dir, "user");
  fs.mkdirSync(user, { recursive: true });
  fs.writeFileSync(
    path.join(user, "registrymodifications.xcu"),
    XCU([
      ["/org.openoffice.Office.Calc/Formula/Load", "OOXMLRecalcMode", 0],
      ["/org.openoffice.Office.Calc/Formula/Load", "ODFRecalcMode", 0],
      ["/org.openoffice.Office.Calc/Formula/Syntax", "StringConversion", 3],
      ["/org.openoffice.Setup/L10N", "ooSetupSystemLocale", "en-US"],
      ["/org.openoffice.Setup/L10N", "ooLocale", "en-US"],
      ["/org.openoffice.Office.Linguistic/General", "DefaultLocale", "en-US"],
    ]),
  );
  return dir;
}

/**
 * Converts every input to .xlsx in `outDir` in one LibreOffice run (recalculated on load, by the
 * profile). Returns LibreOffice's output lines. Throws when LibreOffice fails or an output is
 * missing.
 */
function convertAll(inputs, outDir, options = {}) {
  const bin = options.bin ?? findLibreOffice();
  if (!bin) throw new Error("LibreOffice is not installed (looked for libreoffice / soffice)");
  const profile = options.profile ?? makeProfile();
  fs.mkdirSync(outDir, { recursive: true });
  const format = options.format ?? 'xlsx:Calc MS Excel 2007 XML';
  let out;
  try {
    out = execFileSync(bin, [`-env:UserInstallation=file://${profile}`, "--headless", "--norestore", "--nolockcheck", "--convert-to", format, "--outdir", outDir, ...inputs], {
      encoding: "utf8",
      stdio: ["ignore", "pipe", "pipe"],
      timeout: options.timeoutMs ?? 600000,
      env: { ...process.env, LANG: "en_US.UTF-8", LC_ALL: "en_US.UTF-8", TZ: "UTC" },
    });
  } catch (e) {
    throw new Error(`libreoffice failed: ${e.message}\n${e.stdout ?? ""}\n${e.stderr ?? ""}`);
  } finally {
    if (!options.profile) fs.rmSync(profile, { recursive: true, force: true });
  }
  const ext = format.split(":")[0];
  const missing = inputs.filter((f) => !fs.existsSync(path.join(outDir, `${path.basename(f, path.extname(f))}.${ext}`)));
  if (missing.length && !options.allowMissing) throw new Error(`LibreOffice wrote no output for ${missing.join(", ")}\n${out}`);
  return out.split("\n").filter(Boolean);
}

module.exports = { findLibreOffice, libreOfficeVersion, makeProfile, convertAll };
