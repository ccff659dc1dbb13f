/**
 * The sheet writer (src/engine/sheet-patch.ts): a cell's markup for each kind of write (values of
 * every type, constants, cleared cells, formulas kept or rewritten as dynamic arrays, from the fast
 * path and from the cell's own markup), start tags rewritten, and whole-sheet patches that insert
 * cells and rows where they belong and keep every other byte. Sheets are hand-written (invented).
 *
 * Expected markup: ECMA-376 Part 1 §18.3.1.4 c (r, s, t, cm, vm), §18.18.11 ST_CellType (b, e, str,
 * inlineStr; n is the default and not written), §18.3.1.96 v, §18.3.1.53 is / §18.4.12 t with
 * xml:space="preserve" (XML 1.0 §2.10), §18.3.1.40 f (t="array" ref=), §18.3.1.73 row (r, spans is
 * an optimisation hint, §18.3.1.73 "spans … optional"), cells in column order and rows in row order
 * (§18.3.1.73, §18.3.1.4). Numbers as the shortest round-trip decimal (ECMAScript Number::toString,
 * which Excel reads, exponent form included). The rest is behaviour (the header of sheet-patch.ts).
 */
import { Sheet, readBook } from "../../src/engine/book";
import { Scalar, XlError } from "../../src/engine/formula/values";
import { CellWrite, Utf8Writer, cellXml, patchSheetXml, rewriteSheet, rewriteStartTag } from "../../src/engine/sheet-patch";
import { SOIL_NAMES } from "../../src/engine/soil";
import { openPackage } from "../../src/engine/xlsx-package";
import { xlsxBytes } from "../helpers/xlsx";

const NS = 'xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"';

async function sheetOf(xml: string): Promise<Sheet> {
  const pkg = await openPackage(xlsxBytes({ sheets: [{ name: "Lab", rows: "" }] }));
  pkg.write("xl/worksheets/sheet1.xml", xml);
  return readBook(await openPackage(pkg.toBuffer()), SOIL_NAMES).sheets[0]!;
}
const ws = (data: string, tail = "") => `<worksheet ${NS}>${data}${tail}</worksheet>`;
const patched = async (xml: string, writes: CellWrite[]) => patchSheetXml(await sheetOf(xml), writes).toString("utf8");

describe("rewriteStartTag", () => {
  it("drops the named attributes, keeps the others exactly as written (quotes, order), and appends", () => {
    expect(rewriteStartTag('<c r="A1" s="2" t="s" cm="1">', (n) => n === "t" || n === "cm", ' t="str"')).toBe('<c r="A1" s="2" t="str">');
    expect(rewriteStartTag("<c r='A1'  t=\"e\"\ts='3'>", (n) => n === "t", "")).toBe("<c r='A1' s='3'>");
    expect(rewriteStartTag('<x:c r="B2" vm = "1" >', (n) => n === "vm", ' cm="1"')).toBe('<x:c r="B2" cm="1">');
    expect(rewriteStartTag("<c>", () => true, ' r="A1"')).toBe('<c r="A1">');
    expect(rewriteStartTag('<c r="A1"/>', () => false, "")).toBe('<c r="A1">');
    expect(rewriteStartTag('<c a="x>y" b="2">', (n) => n === "b", "")).toBe('<c a="x>y">');
  });
});

describe("cellXml: values (ECMA-376 §18.18.11 cell types)", () => {
  const v = (value: Scalar, old?: string, prefix = "") => cellXml({ kind: "value", row: 1, col: 2, value }, old, prefix);
  it("numbers, booleans, errors, formula strings and blanks, on a new cell", () => {
    expect(v(2.5)).toBe('<c r="C2"><v>2.5</v></c>');
    expect(v(-0)).toBe('<c r="C2"><v>0</v></c>');
    expect(v(1e21)).toBe('<c r="C2"><v>1e+21</v></c>');
    expect(v(1.5e-7)).toBe('<c r="C2"><v>1.5e-7</v></c>');
    expect(v(0.1 + 0.2)).toBe('<c r="C2"><v>0.30000000000000004</v></c>');
    expect(v(true)).toBe('<c r="C2" t="b"><v>1</v></c>');
    expect(v(false)).toBe('<c r="C2" t="b"><v>0</v></c>');
    expect(v(new XlError("#DIV/0!"))).toBe('<c r="C2" t="e"><v>#DIV/0!</v></c>');
    expect(v('a<b & "c"')).toBe('<c r="C2" t="str"><v>a&lt;b &amp; &quot;c&quot;</v></c>');
    expect(v("")).toBe('<c r="C2" t="str"><v></v></c>');
    expect(v(null)).toBe('<c r="C2"/>');
  });
  it("over an existing cell: its style and other attributes kept, t, cm and vm recomputed, its r kept as written", () => {
    expect(v(3, '<c r="C2" s="4" t="s" cm="1" vm="2" x14ac:dyDescent="0.25"><v>7</v></c>')).toBe('<c r="C2" s="4" x14ac:dyDescent="0.25"><v>3</v></c>');
    expect(v(true, '<c s="4"><v>7</v></c>')).toBe('<c s="4" r="C2" t="b"><v>1</v></c>');
    expect(v(null, '<c r="C2" s="1" t="n"/>')).toBe('<c r="C2" s="1"/>');
  });
  it("a namespace prefix goes on every element", () => {
    expect(v(1, undefined, "x")).toBe('<x:c r="C2"><x:v>1</x:v></x:c>');
    expect(v("t", undefined, "x")).toBe('<x:c r="C2" t="str"><x:v>t</x:v></x:c>');
  });
  it("constants: text as an inline string that keeps its spaces; an empty text stays empty text (ISBLANK, COUNTA and \"\"+\"\" tell it from a blank); a given inline body is used as is", () => {
    expect(cellXml({ kind: "constant", row: 0, col: 0, value: " Ca " }, undefined, "")).toBe('<c r="A1" t="inlineStr"><is><t xml:space="preserve"> Ca </t></is></c>');
    expect(cellXml({ kind: "constant", row: 0, col: 0, value: "" }, undefined, "")).toBe('<c r="A1" t="inlineStr"><is><t xml:space="preserve"></t></is></c>');
    expect(cellXml({ kind: "constant", row: 0, col: 0, value: 4 }, '<c r="A1" t="s"><v>0</v></c>', "")).toBe('<c r="A1"><v>4</v></c>');
    expect(cellXml({ kind: "constant", row: 0, col: 0, value: "Mg", inline: "<r><t>M</t></r><r><t>g</t></r>" }, '<c r="A1" s="2" t="s"><v>0</v></c>', "p")).toBe('<p:c r="A1" s="2" t="inlineStr"><p:is><r><t>M</t></r><r><t>g</t></r></p:is></p:c>');
  });
  it("clear: the cell stays with its attributes but without type or value", () => {
    expect(cellXml({ kind: "clear", row: 0, col: 1 }, '<c r="B1" s="3" t="e" cm="1"><f>1/0</f><v>#DIV/0!</v></c>', "")).toBe('<c r="B1" s="3"/>');
    expect(cellXml({ kind: "clear", row: 0, col: 1 }, undefined, "x")).toBe('<x:c r="B1"/>');
  });
});

describe("cellXml: formulas from the cell's own markup", () => {
  const old = '<c r="B1" s="5" cm="2" t="str"><f ca="1">A1&amp;"x"</f><v>old</v><extLst><ext uri="u"/></extLst></c>';
  it("the formula element kept byte for byte, cm kept, the value replaced, other children kept after it", () => {
    expect(cellXml({ kind: "formula", row: 0, col: 1, value: 2 }, old, "")).toBe('<c r="B1" s="5" cm="2"><f ca="1">A1&amp;"x"</f><v>2</v><extLst><ext uri="u"/></extLst></c>');
    expect(cellXml({ kind: "formula", row: 0, col: 1, value: "t" }, old, "")).toBe('<c r="B1" s="5" cm="2" t="str"><f ca="1">A1&amp;"x"</f><v>t</v><extLst><ext uri="u"/></extLst></c>');
  });
  it("no value: none written (Excel computes the cell when the file is opened)", () => {
    expect(cellXml({ kind: "formula", row: 0, col: 1, value: undefined }, old, "")).toBe('<c r="B1" s="5" cm="2"><f ca="1">A1&amp;"x"</f><extLst><ext uri="u"/></extLst></c>');
  });
  it("rewritten as a dynamic array: t=array with its range, the text given (encoded) or the old text, cm set", () => {
    expect(cellXml({ kind: "formula", row: 0, col: 1, value: 1, dynamic: { ref: "B1:B3", cm: 1 } }, old, "")).toBe('<c r="B1" s="5" cm="1"><f t="array" ref="B1:B3">A1&amp;"x"</f><v>1</v><extLst><ext uri="u"/></extLst></c>');
    expect(cellXml({ kind: "formula", row: 0, col: 1, value: 1, dynamic: { ref: "B1", text: 'A1&"y"' } }, old, "")).toBe('<c r="B1" s="5"><f t="array" ref="B1">A1&amp;&quot;y&quot;</f><v>1</v><extLst><ext uri="u"/></extLst></c>');
    expect(cellXml({ kind: "formula", row: 0, col: 1, value: 1, dynamic: { ref: "B1" } }, '<c r="B1"><f t="shared" si="0"/><v>0</v></c>', "")).toBe('<c r="B1"><f t="array" ref="B1"></f><v>1</v></c>');
    expect(cellXml({ kind: "formula", row: 0, col: 1, value: 1, dynamic: { ref: "B1" } }, undefined, "")).toBe('<c r="B1"><f t="array" ref="B1"></f><v>1</v></c>');
  });
  it("a formula to keep where the cell has none is an error naming the cell", () => {
    expect(() => cellXml({ kind: "formula", row: 0, col: 1, value: 1 }, '<c r="B1"><v>1</v></c>', "")).toThrow(new Error("cell B1 has no formula to keep"));
    expect(() => cellXml({ kind: "formula", row: 4, col: 0, value: 1 }, undefined, "")).toThrow(new Error("cell A5 has no formula to keep"));
  });
});

describe("cellXml: formulas through the fast path (the cell's offsets in its sheet)", () => {
  it("a simple formula cell: start tag kept, t recomputed, cm kept unless rewritten, r written when the file has none", async () => {
    const sheet = await sheetOf(ws('<sheetData><row r="1"><c r="A1" s="1" t="str" cm="3"><f>B1&amp;"x"</f><v>a</v></c><c s="2"><f>1+1</f><v>2</v></c><c r="C1" vm="1"><f t="shared" ref="C1:C2" si="0">A1</f><v>1</v></c><c r="D1"/></row></sheetData>'));
    const w = (k: number, col: number, value: Scalar | undefined, dynamic?: { ref: string; text?: string; cm?: number }) => cellXml({ kind: "formula", row: 0, col, value, k, ...(dynamic ? { dynamic } : {}) }, undefined, "", sheet);
    expect(w(0, 0, 5)).toBe('<c r="A1" s="1" cm="3"><f>B1&amp;"x"</f><v>5</v></c>');
    expect(w(0, 0, "z")).toBe('<c r="A1" s="1" cm="3" t="str"><f>B1&amp;"x"</f><v>z</v></c>');
    expect(w(0, 0, undefined)).toBe('<c r="A1" s="1" cm="3"><f>B1&amp;"x"</f></c>');
    expect(w(0, 0, new XlError("#N/A"), { ref: "A1:A2", cm: 1 })).toBe('<c r="A1" s="1" cm="1" t="e"><f t="array" ref="A1:A2">B1&amp;"x"</f><v>#N/A</v></c>');
    expect(w(0, 0, 1, { ref: "A1", text: "_xldudf_SOIL_CMOL(B1,\"Ca\")" })).toBe('<c r="A1" s="1"><f t="array" ref="A1">_xldudf_SOIL_CMOL(B1,&quot;Ca&quot;)</f><v>1</v></c>');
    expect(w(1, 1, 2)).toBe('<c s="2" r="B1"><f>1+1</f><v>2</v></c>');
    expect(w(2, 2, true)).toBe('<c r="C1" t="b"><f t="shared" ref="C1:C2" si="0">A1</f><v>1</v></c>');
  });
  it("a cell with more than <f> and <v> (a comment, an extension) goes through its markup instead, keeping them", async () => {
    const sheet = await sheetOf(ws('<sheetData><row r="1"><c r="A1"><f>1</f><v>1</v><!-- note --><extLst><ext uri="u"/></extLst></c></row></sheetData>'));
    expect(sheet.formulas.simple[0]).toBe(0);
    expect(cellXml({ kind: "formula", row: 0, col: 0, value: 9, k: 0 }, undefined, "", sheet)).toBe('<c r="A1"><f>1</f><v>9</v><extLst><ext uri="u"/></extLst></c>');
  });
});

describe("patchSheetXml: every other byte kept; cells and rows inserted in order (ECMA-376 §18.3.1.73)", () => {
  const XML = ws(
    '<dimension ref="A1:C5"/><sheetData><row r="2" spans="1:3" ht="15"><c r="A2"><v>1</v></c><c r="C2"><v>3</v></c></row><row r="4" spans="2:2"/><row r="5"><c r="B5" s="1"><v>5</v></c></row></sheetData>',
    '<mergeCells count="1"><mergeCell ref="E1:F1"/></mergeCells>',
  );
  it("no writes: the part itself", async () => {
    expect(await patched(XML, [])).toBe(XML);
  });
  it("a value over an existing cell: only that cell changes (the row keeps its spans)", async () => {
    expect(await patched(XML, [{ kind: "value", row: 1, col: 2, value: 9 }])).toBe(XML.replace('<c r="C2"><v>3</v></c>', '<c r="C2"><v>9</v></c>'));
  });
  it("a new cell between two cells, and one after the last: in column order, the spans hint dropped", async () => {
    const out = await patched(XML, [
      { kind: "value", row: 1, col: 3, value: 4 },
      { kind: "value", row: 1, col: 1, value: 2 },
    ]);
    expect(out).toBe(XML.replace('<row r="2" spans="1:3" ht="15"><c r="A2"><v>1</v></c><c r="C2"><v>3</v></c></row>', '<row r="2" ht="15"><c r="A2"><v>1</v></c><c r="B2"><v>2</v></c><c r="C2"><v>3</v></c><c r="D2"><v>4</v></c></row>'));
  });
  it("two new cells before the same existing cell keep their order", async () => {
    const out = await patched(XML, [
      { kind: "value", row: 4, col: 0, value: "b" },
      { kind: "value", row: 1, col: 1, value: 7 },
    ]);
    expect(out).toContain('<row r="5"><c r="A5" t="str"><v>b</v></c><c r="B5" s="1"><v>5</v></c></row>');
    const two = await patched(ws('<sheetData><row r="1"><c r="D1"><v>4</v></c></row></sheetData>'), [
      { kind: "value", row: 0, col: 1, value: 2 },
      { kind: "value", row: 0, col: 0, value: 1 },
    ]);
    expect(two).toBe(ws('<sheetData><row r="1"><c r="A1"><v>1</v></c><c r="B1"><v>2</v></c><c r="D1"><v>4</v></c></row></sheetData>'));
  });
  it("a self-closing row gets its cells and an end tag", async () => {
    expect(await patched(XML, [{ kind: "value", row: 3, col: 0, value: 1 }])).toBe(XML.replace('<row r="4" spans="2:2"/>', '<row r="4"><c r="A4"><v>1</v></c></row>'));
  });
  it("new rows before the first, between rows and after the last, in row order", async () => {
    const out = await patched(XML, [
      { kind: "value", row: 6, col: 0, value: 7 },
      { kind: "value", row: 0, col: 0, value: 1 },
      { kind: "value", row: 2, col: 1, value: 3 },
      { kind: "value", row: 0, col: 2, value: 2 },
      { kind: "value", row: 5, col: 0, value: 6 },
    ]);
    expect(out).toBe(
      XML.replace('<sheetData><row r="2"', '<sheetData><row r="1"><c r="A1"><v>1</v></c><c r="C1"><v>2</v></c></row><row r="2"')
        .replace('<row r="4" spans', '<row r="3"><c r="B3"><v>3</v></c></row><row r="4" spans')
        .replace("</row></sheetData>", '</row><row r="6"><c r="A6"><v>6</v></c></row><row r="7"><c r="A7"><v>7</v></c></row></sheetData>'),
    );
  });
  it("clearing: an existing cell keeps its attributes; a cell or row that is not there is not created", async () => {
    const out = await patched(XML, [
      { kind: "clear", row: 4, col: 1 },
      { kind: "clear", row: 4, col: 3 },
      { kind: "clear", row: 8, col: 0 },
    ]);
    expect(out).toBe(XML.replace('<c r="B5" s="1"><v>5</v></c>', '<c r="B5" s="1"/>'));
  });
  it("a self-closing sheetData becomes a full one holding the new rows", async () => {
    const xml = ws('<sheetData/>', "<pageMargins/>");
    expect(await patched(xml, [{ kind: "value", row: 1, col: 0, value: 1 }, { kind: "clear", row: 3, col: 0 }])).toBe(ws('<sheetData><row r="2"><c r="A2"><v>1</v></c></row></sheetData>', "<pageMargins/>"));
  });
  it("a prefixed sheet writes its prefix on new rows and cells", async () => {
    const xml = '<x:worksheet xmlns:x="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><x:sheetData><x:row r="1"><x:c r="A1"><x:v>1</x:v></x:c></x:row></x:sheetData></x:worksheet>';
    expect(await patched(xml, [{ kind: "value", row: 0, col: 1, value: 2 }, { kind: "value", row: 2, col: 0, value: 3 }])).toBe(
      '<x:worksheet xmlns:x="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><x:sheetData><x:row r="1"><x:c r="A1"><x:v>1</x:v></x:c><x:c r="B1"><x:v>2</x:v></x:c></x:row><x:row r="3"><x:c r="A3"><x:v>3</x:v></x:c></x:row></x:sheetData></x:worksheet>',
    );
  });
  it("a sheet part without sheetData cannot be patched", async () => {
    const sheet = await sheetOf(ws(""));
    expect(() => patchSheetXml(sheet, [{ kind: "value", row: 0, col: 0, value: 1 }])).toThrow(new Error("worksheet has no sheetData"));
    expect(() => rewriteSheet(sheet, () => undefined, [])).toThrow(new Error("worksheet has no sheetData"));
  });
});

describe("rewriteSheet: planned cells replaced as the sheet is walked, extras beside them", () => {
  it("replacements in order, insertions at a cell's start go before it, extras on planned cells are left to the replacement", async () => {
    const xml = ws('<sheetData><row r="1"><c r="B1"><f>1</f><v>1</v></c><c r="D1"><f>2</f><v>2</v></c></row></sheetData>');
    const sheet = await sheetOf(xml);
    sheet.cells.planId[0] = 0;
    sheet.cells.planId[1] = 1;
    const out = rewriteSheet(sheet, (k) => (k === 0 ? '<c r="B1"><f>1</f><v>10</v></c>' : undefined), [
      { kind: "value", row: 0, col: 0, value: 5 },
      { kind: "value", row: 0, col: 2, value: 6 },
      { kind: "value", row: 0, col: 1, value: 99 }, // B1 is planned: its replacement wins
    ]).toString("utf8");
    expect(out).toBe(ws('<sheetData><row r="1"><c r="A1"><v>5</v></c><c r="B1"><f>1</f><v>10</v></c><c r="C1"><v>6</v></c><c r="D1"><f>2</f><v>2</v></c></row></sheetData>'));
  });
  it("nothing planned and no extras: the part itself", async () => {
    const xml = ws('<sheetData><row r="1"><c r="B1"><f>1</f><v>1</v></c></row></sheetData>');
    expect(rewriteSheet(await sheetOf(xml), () => "never", []).toString("utf8")).toBe(xml);
  });
});

describe("Utf8Writer (UTF-8: RFC 3629)", () => {
  it("joins pieces into UTF-8 bytes, growing past its first buffer, multi-byte characters included", () => {
    const w = new Utf8Writer(10);
    const piece = "Ca²⁺ 🌱 ".repeat(5000); // 8 UTF-16 units, 15 UTF-8 bytes each
    w.add(piece);
    w.add("");
    w.add(piece);
    w.add("end");
    const out = w.toBuffer();
    expect(out.toString("utf8")).toBe(`${piece}${piece}end`);
    expect(out.length).toBe(Buffer.byteLength(piece) * 2 + 3);
    expect(new Utf8Writer().toBuffer().length).toBe(0);
  });
});
