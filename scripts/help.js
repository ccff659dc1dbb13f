#!/usr/bin/env node
/**
 * The add-in's help site, generated at build time from the same declarations that feed
 * functions.json: the metadata (ids, argument names, optional flags), the JSDoc of each binding in
 * src/functions (summary, arguments with units and ranges, result, @throws, @example with its
 * Source line), the binding's declare() table (argument kinds and defaults) and the SOIL.ABOUT line
 * (method and source). Nothing here lists functions by hand: a function added to src/functions gets
 * a page and an index entry the next time the add-in is built.
 *
 * Pages are plain static HTML with one local stylesheet, no script, and a Content-Security-Policy
 * that forbids loading anything from another origin.
 *
 * Usage as a script: node scripts/help.js [outDir]   (default: help-preview/; run `npm run build:node` first)
 */
const fs = require("fs");
const path = require("path");

const ROOT = path.join(__dirname, "..");
const FUNCTIONS_DIR = path.join(ROOT, "src", "functions");

// ---------------------------------------------------------------------------------------------
// Reading the declarations

/**
 * Splits a doc comment into its description and tags. Continuation lines belong to the tag above.
 * @param {string} raw the comment including its delimiters
 * @returns {{ description: string, tags: { tag: string, text: string }[] }}
 */
function parseDocComment(raw) {
  const lines = raw
    .replace(/^\/\*\*/, "")
    .replace(/\*\/$/, "")
    .split("\n")
    .map((l) => l.replace(/^\s*\* ?/, "").replace(/\s+$/, ""));
  const description = [];
  const tags = [];
  for (const line of lines) {
    const m = /^@(\w+)\s*(.*)$/.exec(line);
    if (m) tags.push({ tag: m[1], text: m[2] });
    else if (tags.length) tags[tags.length - 1].text += (tags[tags.length - 1].text ? "\n" : "") + line;
    else description.push(line);
  }
  for (const t of tags) t.text = t.text.trim();
  return { description: description.join("\n").trim(), tags };
}

/** `{type} [name] text` or `{type} name text` of a @param tag. */
function parseParamTag(text) {
  const m = /^(?:\{[^}]*\}\s*)?(\[)?([A-Za-z_][A-Za-z0-9_]*)(?:=[^\]]*)?\]?\s*([\s\S]*)$/.exec(text);
  if (!m) return undefined;
  return { name: m[2], optional: Boolean(m[1]), text: m[3].replace(/\s+/g, " ").trim() };
}

/**
 * `=SOIL.X(...) //=> value` on the first line; the lines after it (starting "Source:") name where
 * the numbers come from.
 */
function parseExampleTag(text) {
  const [first, ...rest] = text.split("\n");
  const m = /^(.+?)\s*\/\/=>\s*(.+)$/.exec(first.trim());
  if (!m) return { formula: first.trim(), expected: undefined, source: rest.join(" ").replace(/\s+/g, " ").trim() };
  const source = rest.join(" ").replace(/\s+/g, " ").trim().replace(/^Source:\s*/i, "");
  return { formula: m[1].trim(), expected: m[2].trim(), source };
}

/**
 * The JSDoc of every exported function in the binding modules, in source order.
 * @returns {{ module: string, functionName: string, description: string, customFunctionId?: string,
 *   params: { name: string, optional: boolean, text: string }[], returns?: string, throws: string[],
 *   examples: { formula: string, expected?: string, source: string }[] }[]}
 */
function readBindingDocs(dir = FUNCTIONS_DIR) {
  const ts = require("typescript");
  const out = [];
  const files = fs
    .readdirSync(dir)
    .filter((f) => f.endsWith(".ts") && !f.startsWith("_") && f !== "index.ts")
    .sort();
  for (const f of files) {
    const text = fs.readFileSync(path.join(dir, f), "utf8");
    const source = ts.createSourceFile(f, text, ts.ScriptTarget.Latest, true);
    for (const node of source.statements) {
      if (!ts.isFunctionDeclaration(node) || !node.name) continue;
      if (!(node.modifiers ?? []).some((m) => m.kind === ts.SyntaxKind.ExportKeyword)) continue;
      const docs = ts.getJSDocCommentsAndTags(node).filter((d) => d.kind === ts.SyntaxKind.JSDoc);
      const doc = docs[docs.length - 1];
      if (!doc) continue;
      const parsed = parseDocComment(text.slice(doc.pos, doc.end));
      const cf = parsed.tags.find((t) => t.tag === "customfunction");
      if (!cf) continue;
      out.push({
        module: f.replace(/\.ts$/, ""),
        functionName: node.name.text,
        description: parsed.description.replace(/\s+/g, " ").trim(),
        customFunctionId: cf.text.split(/\s+/)[0] || undefined,
        params: parsed.tags.filter((t) => t.tag === "param").map((t) => parseParamTag(t.text)).filter(Boolean),
        returns: parsed.tags.filter((t) => t.tag === "returns" || t.tag === "return").map((t) => t.text.replace(/^\{[^}]*\}\s*/, "").replace(/\s+/g, " ").trim())[0],
        throws: parsed.tags.filter((t) => t.tag === "throws").map((t) => t.text.replace(/\s+/g, " ").trim()),
        examples: parsed.tags.filter((t) => t.tag === "example").map((t) => parseExampleTag(t.text)),
      });
    }
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Groups on the index page: by task, from the binding module a function is declared in

const GROUPS = [
  { key: "units", title: "Units and chemistry", intro: "Convert lab values between units, charge and chemical forms.", match: /unit|chem/ },
  { key: "cations", title: "Cation exchange", intro: "Exchange capacity, saturation of each cation, Ca:Mg, sodium.", match: /cation/ },
  { key: "lime", title: "Lime", intro: "Lime requirement by several published methods, and the product to spread.", match: /lime/ },
  { key: "bands", title: "Nutrient bands and fertility", intro: "Place a test value in a band, look up reference tables, removal and build-up.", match: /band|suffic|fertil/ },
  { key: "legume-checks", title: "Legume checks", intro: "Screening aids for legume crops and pastures: nodulation and the soil conditions for fixation.", match: /legume|nodul/ },
  { key: "nitrogen", title: "Legume nitrogen", intro: "Nitrogen fixed by legumes, %Ndfa and what is left for the next crop.", match: /nitrogen|nfix/ },
  { key: "meta", title: "About the add-in", intro: "What each function computes and which version computed a workbook.", match: /meta|about/ },
];

function groupOf(moduleName) {
  const g = GROUPS.find((x) => x.match.test(moduleName));
  if (g) return g;
  const title = moduleName.replace(/[-_]+/g, " ").replace(/^\w/, (c) => c.toUpperCase());
  return { key: moduleName, title, intro: "", match: new RegExp(`^${moduleName}$`) };
}

// ---------------------------------------------------------------------------------------------
// Rendering

const esc = (s) => String(s).replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");

/** Escaped text with every SOIL.ID that has a page turned into a link. */
function linked(text, ids, self) {
  return esc(text).replace(/\bSOIL\.([A-Za-z][A-Za-z0-9_]*(?:\.[A-Za-z0-9_]+)*)/g, (whole, id) => {
    const key = [...ids].find((i) => i.toUpperCase() === id.toUpperCase());
    if (!key || key === self) return whole;
    return `<a href="${esc(pageName(key))}">${whole}</a>`;
  });
}

function pageName(id) {
  return `${id}.html`;
}

const CSP = "default-src 'none'; style-src 'self'; img-src 'self'; base-uri 'none'; form-action 'none'";

function page({ title, crumb, body, version }) {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="${CSP}">
<title>${esc(title)}</title>
<link rel="stylesheet" href="style.css">
</head>
<body>
<nav>${crumb}</nav>
<main>
${body}
</main>
<footer>${esc(version)}. These pages are generated from the function declarations when the add-in is built.</footer>
</body>
</html>
`;
}

const STYLE = `/* soilcell help: plain and readable in a narrow pane. */
body { font: 15px/1.5 system-ui, sans-serif; margin: 0; color: #1d1d1d; background: #fff; }
nav, main, footer { max-width: 46rem; margin: 0 auto; padding: 0.6rem 1rem; }
nav { border-bottom: 1px solid #ccc; font-size: 0.9rem; }
footer { border-top: 1px solid #ccc; font-size: 0.8rem; color: #555; margin-top: 2rem; }
h1 { font-size: 1.4rem; margin: 0.8rem 0 0.2rem; }
h1 code { font-size: inherit; }
dt { margin-top: 0.6rem; }
dd { margin: 0.1rem 0 0 1.2rem; }
h2 { font-size: 1.05rem; margin: 1.4rem 0 0.4rem; }
code, pre { font-family: ui-monospace, monospace; font-size: 0.9rem; }
pre { background: #f4f4f4; padding: 0.5rem; overflow-x: auto; white-space: pre-wrap; }
table { border-collapse: collapse; width: 100%; }
th, td { text-align: left; vertical-align: top; padding: 0.3rem 0.4rem; border-bottom: 1px solid #e2e2e2; }
th { font-weight: 600; }
.note { font-size: 0.9rem; color: #444; }
.caution { border-left: 3px solid #777; padding-left: 0.7rem; }
`;

/** Cautionary sentences of a text (the result and ABOUT lines carry the function's own). */
function cautionSentences(text) {
  if (!text) return [];
  return text
    .split(/(?<=[.!?])\s+(?=[A-Z])/)
    .map((s) => s.trim())
    .filter((s) => /estimate|caution|split|caustic|handle|dust|regional|screening|not a (fertili[sz]er )?recommendation|weak|check (them )?against|licensed|regulation/i.test(s));
}

/** What an argument takes, from its declaration (kind, and what a number-or-word or a reading accepts). */
function kindWords(p) {
  if (p.kind === "number") return p.blank === "not measured" ? "number, or a range of numbers; a blank cell means not measured" : "number, or a range of numbers";
  if (p.kind === "text") return p.accepts === "number or word" ? "number or word, or a range of them" : "text, or a range of texts";
  if (p.kind === "range") return "one value, or a range taken as a whole";
  if (p.kind === "cell") return "number or text as the lab printed it, or a range of them";
  return "value";
}

/**
 * Whether the argument must be given, as the function (not Excel's metadata) sees it: an argument
 * after an optional one is optional in the metadata even where the function needs it.
 */
function needWords(p) {
  if (!p.optional) return "required";
  if (p.needed) return `needed ${p.needed}`;
  return "optional";
}

/** The refusals every function shares, from its arguments' kinds (the conventions in the README). */
function commonErrors(params) {
  const out = [];
  if (params.some((p) => p.kind === "number" || p.accepts === "number or word")) {
    out.push(["#VALUE!", "a number argument holds text that is not a number (\"12,5\", \"<0.5\", \"n.d.\"); numbers typed as text (\"12.5\") are accepted"]);
    out.push(["#VALUE!", "two range arguments have different shapes (a single cell pairs with every element)"]);
  }
  if (params.some((p) => p.kind === "text")) out.push(["#VALUE!", "a word (unit, ion, method, crop…) is not one the function knows; the message lists the accepted words"]);
  out.push(["#VALUE!", "a value lies outside its physical or published range; the message gives the range. Nothing is clamped"]);
  return out;
}

/**
 * The whole help site as { relative path → file content }.
 * @param {{ metadata: { functions: { id: string, name: string, description?: string, parameters: { name: string, optional?: boolean }[] }[] },
 *   associations: { id: string, functionName: string, module: string }[], docs: ReturnType<typeof readBindingDocs>,
 *   specOf?: (functionName: string) => ({ params: { name: string, kind: string, optional: boolean, default?: unknown }[] } | undefined),
 *   aboutOf?: (id: string) => string | undefined, caution: string, version: string, namespace?: string }} input
 */
function renderHelpSite(input) {
  const ns = input.namespace ?? "SOIL";
  const fns = input.metadata.functions;
  const ids = new Set(fns.map((f) => f.id));
  const assoc = new Map(input.associations.map((a) => [a.id, a]));
  const docByName = new Map(input.docs.map((d, i) => [`${d.module}:${d.functionName}`, { ...d, order: i }]));
  const files = { "style.css": STYLE };
  const entries = [];

  for (const f of fns) {
    const a = assoc.get(f.id);
    const doc = a ? docByName.get(`${a.module}:${a.functionName}`) : undefined;
    const spec = a && input.specOf ? input.specOf(a.functionName) : undefined;
    const about = input.aboutOf ? input.aboutOf(f.id) : undefined;
    const summary = (f.description ?? doc?.description ?? "").trim();
    const group = groupOf(a?.module ?? doc?.module ?? "other");
    entries.push({ id: f.id, summary, group, order: doc ? doc.order : Number.MAX_SAFE_INTEGER });

    const params = f.parameters.map((p) => {
      const d = doc?.params.find((x) => x.name === p.name);
      const s = spec?.params.find((x) => x.name === p.name);
      return { name: p.name, optional: Boolean(p.optional), text: d?.text ?? p.description ?? "", kind: s?.kind, default: s?.default, needed: s?.needed, blank: s?.blank, accepts: s?.accepts };
    });
    const call = `=${ns}.${f.name}(${params.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ")})`;

    const items = params
      .map((p) => {
        const dflt = p.default !== undefined ? ` Default when left out: ${esc(String(p.default))}.` : "";
        return `<dt><code>${esc(p.name)}</code> <span class="note">${esc(needWords(p))} · ${esc(kindWords(p))}</span></dt>\n<dd>${linked(p.text, ids, f.id)}${dflt}</dd>`;
      })
      .join("\n");
    const argsBlock = params.length
      ? `<dl>\n${items}\n</dl>
<p class="note">Leave an optional argument out, or empty between commas (<code>=${esc(ns)}.${esc(f.name)}(a,,c)</code>), to take its default; a required or needed argument left out is <code>#VALUE!</code> naming it. A blank cell in a number argument gives a blank result for that element${params.some((p) => p.blank === "not measured") ? ", except where the argument says a blank cell means not measured" : ""}.</p>`
      : "<p>None.</p>";

    const specific = (doc?.throws ?? []).map((t) => {
      const m = /^(#VALUE!|#N\/A)\s+(.*)$/.exec(t);
      return m ? [m[1], m[2]] : ["", t];
    });
    const errors = [...specific, ...commonErrors(params)];
    const errorsBlock = `<ul>\n${errors.map(([code, text]) => `<li>${code ? `<code>${esc(code)}</code> ` : ""}${linked(text, ids, f.id)}</li>`).join("\n")}\n</ul>
<p class="note">Excel shows the message when you point at the error flag of the cell. In a spilled result each element is refused on its own; the others are computed.</p>`;

    const examples = doc?.examples ?? [];
    const exampleBlock = examples.length
      ? examples
          .map(
            (e) => `<pre>${esc(e.formula)}</pre>
<p>gives <strong>${esc(e.expected ?? "")}</strong></p>
<p class="note">Source: ${linked(e.source || "not stated", ids, f.id)}</p>`,
          )
          .join("\n")
      : "<p>No worked example with a published source has been written for this function yet.</p>";

    const cautions = [...new Set([...cautionSentences(doc?.returns), ...cautionSentences(about)])].filter((c) => c !== input.caution);
    const cautionBlock = `<div class="caution">
<p>${esc(input.caution)} Where a local code or regulation says otherwise, it governs.</p>
${cautions.map((c) => `<p>${linked(c, ids, f.id)}</p>`).join("\n")}
</div>`;

    const body = `<h1><code>${esc(ns)}.${esc(f.name)}</code></h1>
<p>${linked(summary, ids, f.id)}</p>
<h2>Formula</h2>
<pre>${esc(call)}</pre>
<h2>Arguments</h2>
${argsBlock}
<h2>Result</h2>
<p>${linked(doc?.returns ?? "See the summary above.", ids, f.id)}</p>
<p class="note">Every number argument takes one cell or a range; ranges pair element by element and the result spills.</p>
<h2>When it refuses</h2>
${errorsBlock}
<h2>Worked example</h2>
${exampleBlock}
<h2>Method and source</h2>
<p>${about ? linked(about, ids, f.id) : "No method line is recorded for this function."}</p>
<h2>Caution</h2>
${cautionBlock}
<p><a href="index.html">All functions</a></p>`;
    files[pageName(f.id)] = page({ title: `${ns}.${f.name} · soilcell help`, crumb: `<a href="index.html">soilcell functions</a> › ${esc(ns)}.${esc(f.name)}`, body, version: input.version });
  }

  // Index: groups in task order, functions in declaration order within a group.
  const order = [...GROUPS.map((g) => g.key)];
  const groups = new Map();
  for (const e of entries) {
    if (!groups.has(e.group.key)) groups.set(e.group.key, { group: e.group, items: [] });
    groups.get(e.group.key).items.push(e);
  }
  const keys = [...groups.keys()].sort((x, y) => {
    const ix = order.indexOf(x) === -1 ? order.length - 1 : order.indexOf(x);
    const iy = order.indexOf(y) === -1 ? order.length - 1 : order.indexOf(y);
    return ix - iy || x.localeCompare(y);
  });
  const sections = keys
    .map((k) => {
      const { group, items } = groups.get(k);
      items.sort((a, b) => a.order - b.order || a.id.localeCompare(b.id));
      const list = items.map((e) => `<tr><td><a href="${esc(pageName(e.id))}"><code>${esc(ns)}.${esc(e.id)}</code></a></td><td>${esc(e.summary)}</td></tr>`).join("\n");
      return `<h2 id="${esc(group.key)}">${esc(group.title)}</h2>
${group.intro ? `<p class="note">${esc(group.intro)}</p>\n` : ""}<table>
${list}
</table>`;
    })
    .join("\n");
  const indexBody = `<h1>soilcell functions</h1>
<p>Spreadsheet functions for soil-test interpretation, in the <code>${esc(ns)}</code> namespace: type
<code>=${esc(ns)}.</code> in a cell and Excel lists them. ${fns.length} functions, grouped by task. Each page gives the
arguments with their units and ranges, the defaults, when the function refuses, a worked example
with its published source, and the cautions.</p>
<p>Every number argument takes one cell or a range (a season's column spills in one formula); a
blank cell gives a blank result; a wrong unit or an out-of-range value gives <code>#VALUE!</code>
with a message saying what to do, and missing reference data gives <code>#N/A</code>. Nothing is
guessed or clamped.</p>
<div class="caution"><p>${esc(input.caution)} Lime, fertiliser and amendment rates can hurt crops, soils,
water and people. Where a local code or regulation says otherwise, it governs.</p></div>
<p class="note">Contents: ${keys.map((k) => `<a href="#${esc(groups.get(k).group.key)}">${esc(groups.get(k).group.title)}</a>`).join(" · ")}</p>
${sections}`;
  files["index.html"] = page({ title: "soilcell help", crumb: "soilcell functions", body: indexBody, version: input.version });
  return files;
}

/**
 * The site from the files of this repository: generated/ (metadata and associations), src/functions
 * (the JSDoc) and build/ (declare() specs, ABOUT lines, version) as `npm run build:node` leaves them.
 */
function helpSiteFromRepo(root = ROOT) {
  const metadata = JSON.parse(fs.readFileSync(path.join(root, "generated", "functions.json"), "utf8"));
  const associations = JSON.parse(fs.readFileSync(path.join(root, "generated", "associations.json"), "utf8"));
  const docs = readBindingDocs(path.join(root, "src", "functions"));
  const built = path.join(root, "build", "src");
  if (!fs.existsSync(path.join(built, "functions", "index.js"))) throw new Error("build/ is missing: run `npm run build:node` first");
  const bindings = require(path.join(built, "functions", "index.js"));
  const { specOf } = require(path.join(built, "functions", "_binding.js"));
  const about = require(path.join(built, "core", "about.js"));
  return renderHelpSite({
    metadata,
    associations,
    docs,
    specOf: (name) => (bindings[name] ? specOf(bindings[name]) : undefined),
    aboutOf: (id) => {
      try {
        return about.aboutFunction(id);
      } catch {
        return undefined;
      }
    },
    caution: about.CAUTION,
    version: about.soilcellVersion(),
  });
}

/** functions.json as shipped: each function's helpUrl set to its page under `host`. */
function withHelpUrls(metadata, host) {
  return { ...metadata, functions: metadata.functions.map((f) => ({ ...f, helpUrl: `${host}/help/${pageName(f.id)}` })) };
}

module.exports = { GROUPS, groupOf, parseDocComment, parseExampleTag, readBindingDocs, renderHelpSite, helpSiteFromRepo, withHelpUrls, pageName, CSP };

if (require.main === module) {
  const out = path.resolve(process.argv[2] || path.join(ROOT, "help-preview"));
  const files = helpSiteFromRepo();
  fs.mkdirSync(out, { recursive: true });
  for (const [name, content] of Object.entries(files)) fs.writeFileSync(path.join(out, name), content);
  console.error(`help: ${Object.keys(files).length} files → ${path.relative(ROOT, out) || "."}`);
}
