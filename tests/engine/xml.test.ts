/**
 * The XML tokenizer and text codec (src/engine/xml.ts): token kinds and offsets, names and
 * prefixes, attributes (quotes, spaces, '>' inside values, duplicates), entities and character
 * references, CDATA, comments, processing instructions, and every refusal with its exact words.
 *
 * Source of the expected tokens and decodings: XML 1.0 (Fifth Edition), W3C 2008: §2.4 character data (CDATA
 * sections §2.7 are literal), §2.5 comments, §2.6 processing instructions, §2.11 end-of-line
 * handling (CR LF and lone CR become LF), §3.1 start tags (attribute values in ' or ", no '<'
 * inside, an attribute name at most once), §4.1 character and entity references, §4.6 the five
 * predefined entities, §2.2 Char (what XML 1.0 can carry at all). Namespace prefixes: Namespaces in
 * XML 1.0 §3. The SpreadsheetML namespaces: ECMA-376 Part 1 §8 (transitional) and the strict URI.
 * The DOCTYPE refusal is behaviour (header of src/engine/xml.ts: no spreadsheet part has one).
 */
import { MAIN_NS, Tok, XmlError, XmlScanner, decodeXmlText, encodeXmlText, prefixFor } from "../../src/engine/xml";

/** Every token as [kind, start, end, name-or-text]. */
function tokens(xml: string): [string, number, number, string][] {
  const s = new XmlScanner(xml);
  const out: [string, number, number, string][] = [];
  const kinds = ["End", "Open", "Close", "Text", "Comment", "CData", "Pi"];
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    const extra = t === Tok.Open ? `${s.name}${s.selfClosing ? "/" : ""}` : t === Tok.Close ? s.name : t === Tok.Text || t === Tok.CData ? s.text() : xml.slice(s.start, s.end);
    out.push([kinds[t]!, s.start, s.end, extra]);
  }
  return out;
}

function refusal(xml: string): string {
  const s = new XmlScanner(xml);
  try {
    for (let t = s.next(); t !== Tok.End; t = s.next()) {
      if (t === Tok.Open) s.attrs();
    }
  } catch (e) {
    expect(e).toBeInstanceOf(XmlError);
    expect((e as Error).name).toBe("XmlError");
    return (e as Error).message;
  }
  throw new Error(`accepted ${xml}`);
}

describe("tokens and offsets (XML 1.0 §2.4–2.7, §3.1)", () => {
  it("a small document: declaration, open, text, self-closing, comment, CDATA, close", () => {
    const xml = '<?xml version="1.0"?><a x="1">t&amp;u<b/><!-- c --><![CDATA[<raw>&amp;]]></a>';
    expect(tokens(xml)).toEqual([
      ["Pi", 0, 21, '<?xml version="1.0"?>'],
      ["Open", 21, 30, "a"],
      ["Text", 30, 37, "t&u"],
      ["Open", 37, 41, "b/"],
      ["Comment", 41, 51, "<!-- c -->"],
      ["CData", 51, 73, "<raw>&amp;"],
      ["Close", 73, 77, "a"],
    ]);
  });
  it("text to the end of the input is one token; an empty input has none", () => {
    expect(tokens("abc")).toEqual([["Text", 0, 3, "abc"]]);
    expect(tokens("")).toEqual([]);
    const s = new XmlScanner("");
    expect(s.next()).toBe(Tok.End);
    expect(s.next()).toBe(Tok.End);
  });
  it("an end tag may have spaces before '>' (§3.1 ETag: '</' Name S? '>'); they are not part of the name", () => {
    expect(tokens("<a></a \t\r\n>")).toEqual([
      ["Open", 0, 3, "a"],
      ["Close", 3, 11, "a"],
    ]);
  });
  it("a start tag with spaces before '>' and '/>'", () => {
    expect(tokens('<a x="1" ><b y="2" /></a>')).toEqual([
      ["Open", 0, 10, "a"],
      ["Open", 10, 21, "b/"],
      ["Close", 21, 25, "a"],
    ]);
  });
  it("a comment holding '<' and '>' is one token; so is a PI holding '>'", () => {
    expect(tokens("<!--<a>--><?p a>b?>")).toEqual([
      ["Comment", 0, 10, "<!--<a>-->"],
      ["Pi", 10, 19, "<?p a>b?>"],
    ]);
  });
  it("'>' inside a quoted attribute value does not end the tag (§3.1: AttValue excludes only '<' and the quote)", () => {
    const s = new XmlScanner("<a x='>' y=\"a>b\">z</a>");
    expect(s.next()).toBe(Tok.Open);
    expect(s.end).toBe(17);
    expect([...s.attrs()]).toEqual([
      ["x", ">"],
      ["y", "a>b"],
    ]);
    expect(s.next()).toBe(Tok.Text);
    expect(s.text()).toBe("z");
  });
  it("attribute names, '=' and values separated by any XML space (§2.3 S: space, tab, CR, LF)", () => {
    const s = new XmlScanner('<a\tx \n=\r"1"\n y= \'2\'/>');
    expect(s.next()).toBe(Tok.Open);
    expect(s.selfClosing).toBe(true);
    expect([...s.attrs()]).toEqual([
      ["x", "1"],
      ["y", "2"],
    ]);
    expect(s.attr("x")).toBe("1");
    expect(s.attr("y")).toBe("2");
    expect(s.attr("z")).toBeUndefined();
  });
});

describe("names and prefixes (Namespaces in XML 1.0 §3: prefix ':' local part)", () => {
  it("open and close tags split at the first colon", () => {
    const s = new XmlScanner("<x:row r='1'></x:row><c></c><a:b:c/>");
    s.next();
    expect([s.name, s.prefix, s.local]).toEqual(["x:row", "x", "row"]);
    s.next();
    expect([s.name, s.prefix, s.local]).toEqual(["x:row", "x", "row"]);
    s.next();
    expect([s.name, s.prefix, s.local]).toEqual(["c", "", "c"]);
    s.next();
    expect([s.name, s.prefix, s.local]).toEqual(["c", "", "c"]);
    s.next();
    expect([s.name, s.prefix, s.local]).toEqual(["a:b:c", "a", "b:c"]);
  });
  it("attr matches the qualified name exactly, not a longer or shorter one", () => {
    const s = new XmlScanner('<c rr="1" r:id="2" r="3"/>');
    s.next();
    expect(s.attr("r")).toBe("3");
    expect(s.attr("rr")).toBe("1");
    expect(s.attr("r:id")).toBe("2");
    expect(s.attr("id")).toBeUndefined();
    expect(s.attr("rrr")).toBeUndefined();
  });
  it("attr and attrs decode the value's references", () => {
    const s = new XmlScanner('<f t="a&amp;b&#65;&#x42;&lt;"/>');
    s.next();
    expect(s.attr("t")).toBe("a&bAB<");
    expect(s.attrs().get("t")).toBe("a&bAB<");
  });
  it("a tag without attributes: attr is undefined and attrs is empty", () => {
    const s = new XmlScanner("<a>");
    s.next();
    expect(s.attr("a")).toBeUndefined();
    expect(s.attrs().size).toBe(0);
    const t = new XmlScanner("<a/>");
    t.next();
    expect(t.attr("a")).toBeUndefined();
    expect(t.attrs().size).toBe(0);
  });
});

describe("refusals, word for word (XML 1.0 well-formedness; DOCTYPE: behaviour)", () => {
  it.each([
    ["<!-- no end", "unterminated comment"],
    ["<![CDATA[ no end", "unterminated CDATA section"],
    ["<!DOCTYPE a [<!ENTITY x 'y'>]><a/>", "a DOCTYPE or declaration is not allowed in a workbook part"],
    ["<!ELEMENT a ANY>", "a DOCTYPE or declaration is not allowed in a workbook part"],
    ["<?pi no end", "unterminated processing instruction"],
    ["<a></a", "unterminated end tag"],
    ["< a/>", "malformed markup at offset 0"],
    ["x<>", "malformed markup at offset 1"],
    ["<a", "unterminated start tag"],
    ['<a x="1" ', "unterminated start tag"],
    ["<a /b>", "malformed start tag at offset 0"],
    ["<a/ >", "malformed start tag at offset 0"],
    ['<a ="1">', "malformed attribute at offset 3"],
    ["<a x>", "attribute without a value at offset 3"],
    ["<a x y='1'>", "attribute without a value at offset 3"],
    ["<a x=1>", "unquoted attribute value at offset 5"],
    ["<a x= >", "unquoted attribute value at offset 6"],
    ['<a x="1>', "unterminated attribute value"],
    ["<a x='1\">", "unterminated attribute value"],
    ['<a x="<">', "'<' inside an attribute value at offset 5"],
    ['<a x="1" x="2">', "attribute x appears twice"],
  ])("%j → %s", (xml, message) => {
    expect(refusal(xml)).toBe(message);
  });
  it("'<' after the attribute's closing quote is not inside it", () => {
    const s = new XmlScanner('<a x="1"><b/></a>');
    expect(s.next()).toBe(Tok.Open);
    expect(s.attr("x")).toBe("1");
  });
  it("the same name with another prefix is another attribute (Namespaces §6.3 is not checked here)", () => {
    const s = new XmlScanner('<a x="1" p:x="2"/>');
    s.next();
    expect([...s.attrs()]).toEqual([
      ["x", "1"],
      ["p:x", "2"],
    ]);
  });
});

describe("skipElement and elementText", () => {
  it("skipElement balances nested elements of any name, skipping comments and CDATA that look like tags", () => {
    const xml = "<a><b><a/><!--</a>--><![CDATA[</a>]]></b><c></c></a><z/>";
    const s = new XmlScanner(xml);
    s.next();
    expect(s.skipElement()).toBe(xml.indexOf("<z/>"));
    expect(s.next()).toBe(Tok.Open);
    expect(s.name).toBe("z");
  });
  it("skipElement of a self-closing element returns its own end", () => {
    const s = new XmlScanner("<a/><b/>");
    s.next();
    expect(s.skipElement()).toBe(4);
    s.next();
    expect(s.name).toBe("b");
  });
  it("skipElement at the end of the part", () => {
    const s = new XmlScanner("<a><b></b>");
    s.next();
    expect(() => s.skipElement()).toThrow(new XmlError("unexpected end of part inside an element"));
  });
  it("elementText joins text and CDATA, skips comments and PIs, decodes references", () => {
    const s = new XmlScanner("<t>a&lt;<!--x--><![CDATA[&lt;]]><?p?>b</t>rest");
    s.next();
    expect(s.elementText()).toBe("a<&lt;b");
    expect(s.next()).toBe(Tok.Text);
    expect(s.text()).toBe("rest");
  });
  it("elementText of an empty and a self-closing element", () => {
    const e = new XmlScanner("<t></t>");
    e.next();
    expect(e.elementText()).toBe("");
    const sc = new XmlScanner("<t/>x");
    sc.next();
    expect(sc.elementText()).toBe("");
    expect(sc.next()).toBe(Tok.Text);
  });
  it("elementText refuses a child element, naming it, and the end of the part", () => {
    const s = new XmlScanner("<t>a<x:b/></t>");
    s.next();
    expect(() => s.elementText()).toThrow(new XmlError("unexpected element <x:b> inside a text element"));
    const e = new XmlScanner("<t>abc");
    e.next();
    expect(() => e.elementText()).toThrow(new XmlError("unexpected end of part inside an element"));
  });
});

describe("decodeXmlText (XML 1.0 §4.1 references, §4.6 predefined entities, §2.11 line ends)", () => {
  it("the five predefined entities, in the fast path and beside a character reference", () => {
    expect(decodeXmlText("&lt;&gt;&amp;&quot;&apos;")).toBe("<>&\"'");
    expect(decodeXmlText("&lt;&gt;&amp;&quot;&apos;&#33;")).toBe("<>&\"'!");
    expect(decodeXmlText("a&amp;b&amp;c")).toBe("a&b&c");
    expect(decodeXmlText("&amp;amp;")).toBe("&amp;"); // one level only
  });
  it("decimal and hexadecimal character references, x or X, beyond the BMP", () => {
    expect(decodeXmlText("&#65;&#x42;&#X43;&#x1F331;&#128512;")).toBe("ABC\u{1F331}\u{1F600}");
    expect(decodeXmlText("&#x10FFFF;")).toBe("\u{10FFFF}");
    expect(decodeXmlText("&#0;")).toBe("\u0000");
  });
  it("a reference past U+10FFFF, or not a number, is refused with its text", () => {
    expect(() => decodeXmlText("&#x110000;")).toThrow(new XmlError("invalid character reference &#x110000;"));
    expect(() => decodeXmlText("&#1114112;")).toThrow(new XmlError("invalid character reference &#1114112;"));
    expect(() => decodeXmlText("&#xZZ;")).toThrow(new XmlError("invalid character reference &#xZZ;"));
    expect(() => decodeXmlText("&#;")).toThrow(new XmlError("invalid character reference &#;"));
  });
  it("an unknown entity is an error, not text; its name is cut to 12 characters in the fast path", () => {
    expect(() => decodeXmlText("a&nbsp;b")).toThrow(new XmlError("unknown entity &nbsp;"));
    expect(() => decodeXmlText("a&averyveryverylongname;")).toThrow(new XmlError("unknown entity &averyveryver;"));
    expect(() => decodeXmlText("&nbsp;&#65;")).toThrow(new XmlError("unknown entity &nbsp;"));
    expect(() => decodeXmlText("a & b")).toThrow(new XmlError("unknown entity &;"));
    expect(() => decodeXmlText("a&")).toThrow(new XmlError("unknown entity &;"));
  });
  it("CR LF and lone CR become LF, in plain text and beside references", () => {
    expect(decodeXmlText("a\r\nb\rc\n")).toBe("a\nb\nc\n");
    expect(decodeXmlText("a\r\n&amp;\rb")).toBe("a\n&\nb");
    // A reference to CR is a CR in the value: §2.11 normalises the line ends written in the text,
    // before references are expanded (a bug until this test: &#13; came out as LF).
    expect(decodeXmlText("&#13;")).toBe("\r");
    expect(decodeXmlText("a&#13;\nb")).toBe("a\r\nb");
    expect(decodeXmlText("a&#xD;&#xA;b\r\n")).toBe("a\r\nb\n");
    expect(decodeXmlText("plain")).toBe("plain");
  });
  it("text of a Text token is decoded; of a CDATA token it is literal", () => {
    const s = new XmlScanner("a&#x26;b<![CDATA[a&#x26;b\r\n]]>");
    s.next();
    expect(s.text()).toBe("a&b");
    s.next();
    expect(s.text()).toBe("a&#x26;b\r\n");
  });
});

describe("encodeXmlText (XML 1.0 §2.4 and §3.1: '&' and '<' escaped, '\"' for attributes; §2.2 Char)", () => {
  it("escapes &, <, > and \" and leaves ' alone", () => {
    expect(encodeXmlText(`a&b<c>d"e'f`)).toBe("a&amp;b&lt;c&gt;d&quot;e'f");
    expect(encodeXmlText("&amp;")).toBe("&amp;amp;");
  });
  it("drops the characters XML 1.0 cannot carry; keeps tab, LF, CR and everything from U+0020", () => {
    expect(encodeXmlText("\u0000\u0001\u0008|\t\n\r|\u000B\u000C|\u000E\u001F|\u0020\uD7FF\uE000\uFFFD|\uFFFE\uFFFF")).toBe("|\t\n\r|||\u0020\uD7FF\uE000\uFFFD|");
    expect(encodeXmlText("\u{1F331}")).toBe("\u{1F331}");
  });
  it("round-trips through decodeXmlText", () => {
    const s = `Ca & Mg < 5 > "K" 'Na'`;
    expect(decodeXmlText(encodeXmlText(s))).toBe(s);
  });
});

describe("prefixFor and MAIN_NS (ECMA-376 Part 1 §8.1 and the strict namespace)", () => {
  const T = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
  const STRICT = "http://purl.oclc.org/ooxml/spreadsheetml/main";
  it("the two SpreadsheetML main namespaces", () => {
    expect([...MAIN_NS].sort()).toEqual([T, STRICT].sort());
  });
  it("the default namespace is '', a prefixed one its prefix; an unbound one undefined", () => {
    expect(prefixFor(new Map([["xmlns", T]]), MAIN_NS)).toBe("");
    expect(prefixFor(new Map([["xmlns:x", STRICT]]), MAIN_NS)).toBe("x");
    expect(prefixFor(new Map([["xmlns:r", "http://example.invalid/r"], ["xmlns:s", T]]), MAIN_NS)).toBe("s");
    expect(prefixFor(new Map([["xmlns", "http://example.invalid/"]]), MAIN_NS)).toBeUndefined();
    expect(prefixFor(new Map(), MAIN_NS)).toBeUndefined();
  });
  it("an ordinary attribute whose value happens to be the URI is not a binding", () => {
    expect(prefixFor(new Map([["href", T]]), MAIN_NS)).toBeUndefined();
    expect(prefixFor(new Map([["href", T], ["xmlns:m", T]]), MAIN_NS)).toBe("m");
    expect(prefixFor(new Map([["xmlnsx", T]]), MAIN_NS)).toBeUndefined();
  });
});
