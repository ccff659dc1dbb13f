/**
 * A small, strict XML tokenizer for the parts of an .xlsx package (no DTDs, no external
 * entities). It reports every markup item with its byte offsets in the string, so a caller can
 * read a part as XML and cut or replace exact spans of it (the oracle strips cached values this
 * way) without regular expressions over raw text. Comments, CDATA sections and processing
 * instructions are tokens of their own, never mistaken for elements. Malformed input throws.
 *
 * Namespaces: `walk` resolves element prefixes against the xmlns declarations in scope, so an
 * `x:`-prefixed SpreadsheetML part reads like an unprefixed one.
 */
"use strict";

class XmlError extends Error {
  constructor(message, at) {
    super(`${message} at offset ${at}`);
    this.name = "XmlError";
  }
}

const NAME = /[A-Za-z_:\u00C0-\uFFFF][\w.:\-\u00B7\u00C0-\uFFFF]*/y;

/** Decodes the five predefined entities and character references; anything else is an error. */
function decodeEntities(s, at = 0) {
  if (!s.includes("&")) return s;
  return s.replace(/&([^;&\s]*);?/g, (m, body) => {
    if (!m.endsWith(";")) throw new XmlError(`bare "&" in text`, at);
    switch (body) {
      case "lt":
        return "<";
      case "gt":
        return ">";
      case "amp":
        return "&";
      case "quot":
        return '"';
      case "apos":
        return "'";
    }
    let code;
    if (/^#x[0-9a-fA-F]+$/.test(body)) code = parseInt(body.slice(2), 16);
    else if (/^#[0-9]+$/.test(body)) code = parseInt(body.slice(1), 10);
    else throw new XmlError(`unknown entity &${body};`, at);
    if (code > 0x10ffff) throw new XmlError(`character reference out of range`, at);
    return String.fromCodePoint(code);
  });
}

/**
 * Tokens of an XML document, in order. Each has `kind` ("open", "close", "empty", "text",
 * "cdata", "comment", "pi", "decl"), `start` and `end` offsets (end exclusive); open/empty tags
 * carry `name` and `attrs` (each `{ name, value, start, end }`, value decoded); text and cdata
 * carry `text` (decoded). Checks that tags nest and close.
 */
function tokenize(xml) {
  const tokens = [];
  const stack = [];
  let roots = 0;
  let i = xml.charCodeAt(0) === 0xfeff ? 1 : 0;
  const n = xml.length;
  while (i < n) {
    const lt = xml.indexOf("<", i);
    if (lt !== i) {
      const end = lt < 0 ? n : lt;
      const raw = xml.slice(i, end);
      if (raw.includes("]]>")) throw new XmlError(`"]]>" in text`, i);
      if (!stack.length && raw.trim()) throw new XmlError("text outside the root element", i);
      tokens.push({ kind: "text", start: i, end, text: decodeEntities(raw, i) });
      i = end;
      continue;
    }
    if (xml.startsWith("<!--", i)) {
      const close = xml.indexOf("-->", i + 4);
      if (close < 0) throw new XmlError("unclosed comment", i);
      const body = xml.slice(i + 4, close);
      if (body.includes("--")) throw new XmlError(`"--" inside a comment`, i);
      tokens.push({ kind: "comment", start: i, end: close + 3, text: body });
      i = close + 3;
      continue;
    }
    if (xml.startsWith("<![CDATA[", i)) {
      const close = xml.indexOf("]]>", i + 9);
      if (close < 0) throw new XmlError("unclosed CDATA section", i);
      if (!stack.length) throw new XmlError("CDATA outside the root element", i);
      tokens.push({ kind: "cdata", start: i, end: close + 3, text: xml.slice(i + 9, close) });
      i = close + 3;
      continue;
    }
    if (xml.startsWith("<!", i)) throw new XmlError("DOCTYPE and other declarations are not accepted", i);
    if (xml.startsWith("<?", i)) {
      const close = xml.indexOf("?>", i + 2);
      if (close < 0) throw new XmlError("unclosed processing instruction", i);
      const target = /^[^\s?]+/.exec(xml.slice(i + 2, close))?.[0] ?? "";
      tokens.push({ kind: target.toLowerCase() === "xml" ? "decl" : "pi", start: i, end: close + 2, text: xml.slice(i + 2, close) });
      i = close + 2;
      continue;
    }
    if (xml[i + 1] === "/") {
      NAME.lastIndex = i + 2;
      const m = NAME.exec(xml);
      if (!m) throw new XmlError("bad end tag", i);
      let j = NAME.lastIndex;
      while (/\s/.test(xml[j] ?? "")) j++;
      if (xml[j] !== ">") throw new XmlError(`bad end tag </${m[0]}`, i);
      const open = stack.pop();
      if (open !== m[0]) throw new XmlError(`</${m[0]}> closes <${open ?? "nothing"}>`, i);
      tokens.push({ kind: "close", start: i, end: j + 1, name: m[0] });
      i = j + 1;
      continue;
    }
    NAME.lastIndex = i + 1;
    const m = NAME.exec(xml);
    if (!m) throw new XmlError(`"<" not followed by a name`, i);
    let j = NAME.lastIndex;
    const attrs = [];
    const seen = new Set();
    for (;;) {
      const ws = j;
      while (/\s/.test(xml[j] ?? "")) j++;
      if (xml[j] === ">" || xml.startsWith("/>", j)) break;
      if (j === ws) throw new XmlError(`attributes of <${m[0]}> need white space between them`, j);
      NAME.lastIndex = j;
      const a = NAME.exec(xml);
      if (!a) throw new XmlError(`bad attribute in <${m[0]}>`, j);
      const aStart = j;
      j = NAME.lastIndex;
      while (/\s/.test(xml[j] ?? "")) j++;
      if (xml[j] !== "=") throw new XmlError(`attribute ${a[0]} has no value`, j);
      j++;
      while (/\s/.test(xml[j] ?? "")) j++;
      const q = xml[j];
      if (q !== '"' && q !== "'") throw new XmlError(`attribute ${a[0]} value is not quoted`, j);
      const close = xml.indexOf(q, j + 1);
      if (close < 0) throw new XmlError(`unclosed attribute value`, j);
      const raw = xml.slice(j + 1, close);
      if (raw.includes("<")) throw new XmlError(`"<" in attribute value`, j);
      if (seen.has(a[0])) throw new XmlError(`attribute ${a[0]} repeated`, aStart);
      seen.add(a[0]);
      // Attribute value normalisation: white space characters become spaces (XML 1.0 §3.3.3).
      attrs.push({ name: a[0], value: decodeEntities(raw.replace(/[\t\n\r]/g, " "), j), start: aStart, end: close + 1 });
      j = close + 1;
    }
    if (!stack.length) roots++;
    if (xml[j] === ">") {
      tokens.push({ kind: "open", start: i, end: j + 1, name: m[0], attrs });
      stack.push(m[0]);
      i = j + 1;
    } else {
      tokens.push({ kind: "empty", start: i, end: j + 2, name: m[0], attrs });
      i = j + 2;
    }
  }
  if (stack.length) throw new XmlError(`<${stack[stack.length - 1]}> is never closed`, n);
  if (roots !== 1) throw new XmlError(`${roots} root elements`, 0);
  return tokens;
}

/**
 * A tree of elements (comments, PIs dropped; text and CDATA kept as `text` children), with
 * namespace-resolved names: each element has `ns` (namespace URI or ""), `local`, `attrs` (a Map
 * of qualified name → value), `children`, `start`/`end` (the whole element's span), `open`
 * (the start tag token) and, for non-empty elements, `close`.
 */
function parse(xml) {
  const tokens = tokenize(xml);
  const root = { children: [] };
  const stack = [{ el: root, ns: new Map([["xml", "http://www.w3.org/XML/1998/namespace"]]) }];
  for (const t of tokens) {
    const top = stack[stack.length - 1];
    if (t.kind === "open" || t.kind === "empty") {
      let ns = top.ns;
      for (const a of t.attrs) {
        if (a.name !== "xmlns" && !a.name.startsWith("xmlns:")) continue;
        if (ns === top.ns) ns = new Map(top.ns);
        ns.set(a.name === "xmlns" ? "" : a.name.slice(6), a.value);
      }
      const colon = t.name.indexOf(":");
      const prefix = colon < 0 ? "" : t.name.slice(0, colon);
      const uri = ns.get(prefix);
      if (prefix && uri === undefined) throw new XmlError(`undeclared prefix ${prefix}:`, t.start);
      const el = {
        name: t.name,
        ns: uri ?? "",
        local: colon < 0 ? t.name : t.name.slice(colon + 1),
        attrs: new Map(t.attrs.map((a) => [a.name, a.value])),
        attrTokens: t.attrs,
        children: [],
        start: t.start,
        end: t.end,
        open: t,
        close: undefined,
        nsMap: ns,
      };
      top.el.children.push(el);
      if (t.kind === "open") stack.push({ el, ns });
    } else if (t.kind === "close") {
      const done = stack.pop();
      done.el.close = t;
      done.el.end = t.end;
    } else if (t.kind === "text" || t.kind === "cdata") {
      top.el.children.push({ text: t.text, start: t.start, end: t.end, cdata: t.kind === "cdata" });
    }
  }
  return root.children.find((c) => c.text === undefined);
}

/** Concatenated text of an element's direct text children. */
function textOf(el) {
  return el.children.filter((c) => c.text !== undefined).map((c) => c.text).join("");
}

/** Child elements with this local name (in the parent's namespace, or `ns` when given). */
function childrenNamed(el, local, ns = el.ns) {
  return el.children.filter((c) => c.local === local && c.ns === ns);
}

/** Encodes text for element content or a double-quoted attribute. */
function escapeXml(s) {
  return String(s).replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

module.exports = { tokenize, parse, textOf, childrenNamed, escapeXml, decodeEntities, XmlError };
