/**
 * A small, strict XML tokenizer over a string, for the parts of a workbook the engine reads and
 * patches. It reports every token with its offsets, so a writer can copy untouched bytes exactly
 * and replace only the elements it recomputes. Comments, CDATA and processing instructions are
 * tokens of their own, never mistaken for markup; a DOCTYPE (entity definitions, the classic
 * expansion bombs) is refused, since no spreadsheet part has one.
 */

export class XmlError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "XmlError";
  }
}

export const enum Tok {
  End,
  Open,
  Close,
  Text,
  Comment,
  CData,
  Pi,
}

const LT = 60; // <
const GT = 62; // >
const SLASH = 47;
const BANG = 33;
const QUESTION = 63;
const DQ = 34;
const SQ = 39;
const COLON = 58;

function isSpace(c: number): boolean {
  return c === 32 || c === 10 || c === 13 || c === 9;
}

function isNameChar(c: number): boolean {
  return !(isSpace(c) || c === GT || c === SLASH || c === 61 /* = */ || c === LT || c === DQ || c === SQ) && c === c;
}

/**
 * Walks an XML string token by token. After `next()`:
 * - Open: `name` (qualified), `local`, `prefix`, `selfClosing`; attributes through `attrs()`;
 *   `start`..`end` spans the whole tag.
 * - Close: `name`, `local`, `prefix`; `start`..`end` spans `</name>`.
 * - Text / CData: `text()` gives the decoded text.
 */
export class XmlScanner {
  pos = 0;
  start = 0;
  end = 0;
  name = "";
  prefix = "";
  local = "";
  selfClosing = false;
  private nameEnd = 0;

  constructor(readonly xml: string) {}

  next(): Tok {
    const xml = this.xml;
    const n = xml.length;
    const p = this.pos;
    if (p >= n) return Tok.End;
    this.start = p;
    if (xml.charCodeAt(p) !== LT) {
      let q = xml.indexOf("<", p);
      if (q < 0) q = n;
      this.end = this.pos = q;
      return Tok.Text;
    }
    const c1 = xml.charCodeAt(p + 1);
    if (c1 === BANG) {
      if (xml.startsWith("<!--", p)) {
        const q = xml.indexOf("-->", p + 4);
        if (q < 0) throw new XmlError("unterminated comment");
        this.end = this.pos = q + 3;
        return Tok.Comment;
      }
      if (xml.startsWith("<![CDATA[", p)) {
        const q = xml.indexOf("]]>", p + 9);
        if (q < 0) throw new XmlError("unterminated CDATA section");
        this.end = this.pos = q + 3;
        return Tok.CData;
      }
      throw new XmlError("a DOCTYPE or declaration is not allowed in a workbook part");
    }
    if (c1 === QUESTION) {
      const q = xml.indexOf("?>", p + 2);
      if (q < 0) throw new XmlError("unterminated processing instruction");
      this.end = this.pos = q + 2;
      return Tok.Pi;
    }
    if (c1 === SLASH) {
      const q = xml.indexOf(">", p + 2);
      if (q < 0) throw new XmlError("unterminated end tag");
      let e = q;
      while (e > p + 2 && isSpace(xml.charCodeAt(e - 1))) e--;
      this.setName(p + 2, e);
      this.end = this.pos = q + 1;
      return Tok.Close;
    }
    // A start tag: the name, then attributes, whose quoted values may hold '>'.
    let q = p + 1;
    while (q < n && isNameChar(xml.charCodeAt(q))) q++;
    if (q === p + 1) throw new XmlError(`malformed markup at offset ${p}`);
    this.setName(p + 1, q);
    this.nameEnd = q;
    for (;;) {
      while (q < n && isSpace(xml.charCodeAt(q))) q++;
      if (q >= n) throw new XmlError("unterminated start tag");
      const c = xml.charCodeAt(q);
      if (c === GT) {
        this.selfClosing = false;
        this.end = this.pos = q + 1;
        return Tok.Open;
      }
      if (c === SLASH) {
        if (xml.charCodeAt(q + 1) !== GT) throw new XmlError(`malformed start tag at offset ${p}`);
        this.selfClosing = true;
        this.end = this.pos = q + 2;
        return Tok.Open;
      }
      // attribute name = quoted value
      const a = q;
      while (q < n && isNameChar(xml.charCodeAt(q))) q++;
      if (q === a) throw new XmlError(`malformed attribute at offset ${q}`);
      while (q < n && isSpace(xml.charCodeAt(q))) q++;
      if (xml.charCodeAt(q) !== 61) throw new XmlError(`attribute without a value at offset ${a}`);
      q++;
      while (q < n && isSpace(xml.charCodeAt(q))) q++;
      const quote = xml.charCodeAt(q);
      if (quote !== DQ && quote !== SQ) throw new XmlError(`unquoted attribute value at offset ${q}`);
      const close = xml.indexOf(quote === DQ ? '"' : "'", q + 1);
      if (close < 0) throw new XmlError("unterminated attribute value");
      if (xml.indexOf("<", q + 1) >= 0 && xml.indexOf("<", q + 1) < close) throw new XmlError(`'<' inside an attribute value at offset ${q}`);
      q = close + 1;
    }
  }

  private setName(a: number, b: number): void {
    const name = this.xml.slice(a, b);
    this.name = name;
    let colon = -1;
    for (let i = 0; i < name.length; i++) {
      if (name.charCodeAt(i) === COLON) {
        colon = i;
        break;
      }
    }
    if (colon < 0) {
      this.prefix = "";
      this.local = name;
    } else {
      this.prefix = name.slice(0, colon);
      this.local = name.slice(colon + 1);
    }
  }

  /** The current start tag's attributes, decoded, in order (qualified names as written). */
  attrs(): Map<string, string> {
    return parseAttributes(this.xml, this.nameEnd, this.end);
  }

  /** One attribute of the current start tag, decoded; undefined when absent. */
  attr(name: string): string | undefined {
    const xml = this.xml;
    let q = this.nameEnd;
    const limit = this.end;
    for (;;) {
      while (q < limit && isSpace(xml.charCodeAt(q))) q++;
      const c = xml.charCodeAt(q);
      if (q >= limit || c === GT || c === SLASH) return undefined;
      const a = q;
      while (isNameChar(xml.charCodeAt(q))) q++;
      const isIt = q - a === name.length && xml.startsWith(name, a);
      while (isSpace(xml.charCodeAt(q))) q++;
      q++; // =
      while (isSpace(xml.charCodeAt(q))) q++;
      const quote = xml[q] as string;
      const close = xml.indexOf(quote, q + 1);
      if (isIt) return decodeXmlText(xml.slice(q + 1, close));
      q = close + 1;
    }
  }

  /** Text of the current Text or CData token, decoded. */
  text(): string {
    const raw = this.xml.slice(this.start, this.end);
    if (raw.startsWith("<![CDATA[")) return raw.slice(9, -3);
    return decodeXmlText(raw);
  }

  /**
   * Skips to the end of the element whose start tag was just read, returning the offset after
   * its end tag. Nested elements of any name are balanced; comments and CDATA are skipped.
   */
  skipElement(): number {
    if (this.selfClosing) return this.end;
    let depth = 1;
    for (;;) {
      const t = this.next();
      if (t === Tok.End) throw new XmlError("unexpected end of part inside an element");
      if (t === Tok.Open && !this.selfClosing) depth++;
      else if (t === Tok.Close && --depth === 0) return this.end;
    }
  }

  /**
   * Reads the text content of the element whose start tag was just read (Text and CData joined,
   * comments skipped). Throws when the element holds child elements.
   */
  elementText(): string {
    if (this.selfClosing) return "";
    let out = "";
    for (;;) {
      const t = this.next();
      if (t === Tok.Text || t === Tok.CData) out += this.text();
      else if (t === Tok.Close) return out;
      else if (t === Tok.End) throw new XmlError("unexpected end of part inside an element");
      else if (t === Tok.Open) throw new XmlError(`unexpected element <${this.name}> inside a text element`);
    }
  }
}

function parseAttributes(xml: string, from: number, to: number): Map<string, string> {
  const out = new Map<string, string>();
  let q = from;
  for (;;) {
    while (q < to && isSpace(xml.charCodeAt(q))) q++;
    const c = xml.charCodeAt(q);
    if (q >= to || c === GT || c === SLASH) return out;
    const a = q;
    while (isNameChar(xml.charCodeAt(q))) q++;
    const name = xml.slice(a, q);
    while (isSpace(xml.charCodeAt(q))) q++;
    q++;
    while (isSpace(xml.charCodeAt(q))) q++;
    const quote = xml[q] as string;
    const close = xml.indexOf(quote, q + 1);
    if (out.has(name)) throw new XmlError(`attribute ${name} appears twice`);
    out.set(name, decodeXmlText(xml.slice(q + 1, close)));
    q = close + 1;
  }
}

const NAMED: Record<string, string> = { lt: "<", gt: ">", amp: "&", quot: '"', apos: "'" };

/** Decodes XML character and entity references; an unknown entity is an error, not text. */
export function decodeXmlText(s: string): string {
  if (s.indexOf("&") < 0) return normaliseNewlines(s);
  // The entities formulas hold by the thousand, without a regular expression.
  if (s.indexOf("&#") < 0 && s.indexOf("\r") < 0) {
    let out = "";
    let last = 0;
    let i = s.indexOf("&");
    while (i >= 0) {
      const semi = s.indexOf(";", i);
      const name = semi > i ? s.slice(i + 1, semi) : "";
      const v = NAMED[name];
      if (v === undefined) throw new XmlError(`unknown entity &${name.slice(0, 12)};`);
      out += s.slice(last, i) + v;
      last = semi + 1;
      i = s.indexOf("&", last);
    }
    return out + s.slice(last);
  }
  // Line ends are normalised in the text as written, before references are replaced: a CR written
  // as &#13; is a CR in the value (XML 1.0 §2.11 applies to literal line ends only).
  return normaliseNewlines(s).replace(/&([^;]{0,12});/g, (m, body: string) => {
    if (body.startsWith("#x") || body.startsWith("#X")) return codePoint(parseInt(body.slice(2), 16), m);
    if (body.startsWith("#")) return codePoint(parseInt(body.slice(1), 10), m);
    const v = NAMED[body];
    if (v === undefined) throw new XmlError(`unknown entity ${m}`);
    return v;
  });
}

function codePoint(n: number, raw: string): string {
  if (!Number.isFinite(n) || n < 0 || n > 0x10ffff) throw new XmlError(`invalid character reference ${raw}`);
  return String.fromCodePoint(n);
}

/** XML parsers turn CR LF and lone CR into LF. */
function normaliseNewlines(s: string): string {
  return s.indexOf("\r") < 0 ? s : s.replace(/\r\n?/g, "\n");
}

/** Encodes text for an element's content or a double-quoted attribute. */
export function encodeXmlText(s: string): string {
  // Characters XML 1.0 cannot carry at all are dropped rather than written as invalid XML.
  return s
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, "")
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;");
}

/** Namespace URIs of the SpreadsheetML main schema (transitional and strict). */
export const MAIN_NS = new Set([
  "http://schemas.openxmlformats.org/spreadsheetml/2006/main",
  "http://purl.oclc.org/ooxml/spreadsheetml/main",
]);

/** The prefix ("" for the default namespace) an element's attributes bind to a namespace URI set. */
export function prefixFor(attrs: Map<string, string>, uris: Set<string>): string | undefined {
  for (const [k, v] of attrs) {
    if (!uris.has(v)) continue;
    if (k === "xmlns") return "";
    if (k.startsWith("xmlns:")) return k.slice(6);
  }
  return undefined;
}
