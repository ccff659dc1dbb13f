/**
 * The workbook reader (src/engine/book.ts and the cell store of src/engine/store.ts): cell values
 * by type, formulas by stored form, shared formulas and their masters, inline and shared strings,
 * merges, dates, defined names, chartsheets, and every refusal of a sheet part with its exact words.
 * Sheet parts are hand-written (invented contents).
 *
 * Expected readings: ECMA-376 Part 1 §18.3.1.4 c (cell; r, t, cm), §18.18.11 ST_CellType (b, d, e,
 * inlineStr, n, s, str), §18.3.1.40 f (t normal/array/dataTable/shared, ref, si), §18.3.1.73 row
 * (r is 1-based, rows ascending), §18.4.8 si / §18.4.6 rPh (phonetic runs are not text),
 * §18.3.1.55 mergeCell, §18.17.6 (ST_CellRef); sheet limits 1,048,576 rows and XFD (16,384) columns.
 * Serial dates: Microsoft, "Date systems in Excel" (1900 system: 1 is 1900-01-01 and the
 * non-existent 1900-02-29 is 60; 1904 system: 0 is 1904-01-01). The refusals are behaviour
 * (header of src/engine/recalc.ts: a file that cannot be read faithfully is refused).
 */
import { Book, Form, formulaText, isoToSerial, localSerial, readBook } from "../../src/engine/book";
import { XlError } from "../../src/engine/formula/values";
import { SOIL_NAMES } from "../../src/engine/soil";
import { WorkbookFileError, openPackage } from "../../src/engine/xlsx-package";
import { BookSpec, xlsxBytes } from "../helpers/xlsx";

const NS = 'xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"';

async function bookWith(sheetXml: string | undefined, spec: Partial<BookSpec> = {}, parts: Record<string, string> = {}): Promise<Book> {
  const pkg = await openPackage(xlsxBytes({ sheets: [{ name: "Lab", rows: "" }], ...spec }));
  if (sheetXml !== undefined) pkg.write("xl/worksheets/sheet1.xml", sheetXml);
  for (const [p, t] of Object.entries(parts)) pkg.write(p, t);
  return readBook(await openPackage(pkg.toBuffer()), SOIL_NAMES);
}
const sheetOf = (sheetData: string, after = "") => `<worksheet ${NS}>${sheetData}${after}</worksheet>`;
const rows = (inner: string) => sheetOf(`<sheetData>${inner}</sheetData>`);

async function refusal(sheetXml: string, parts: Record<string, string> = {}): Promise<string> {
  try {
    await bookWith(sheetXml, {}, parts);
  } catch (e) {
    expect(e).toBeInstanceOf(WorkbookFileError);
    return (e as Error).message;
  }
  throw new Error("read a sheet that should be refused");
}

/** A cell's cached value at an A1 position of the first sheet (undefined: no such cell; "-": no cached value). */
function at(book: Book, ref: string): unknown {
  const m = /^([A-Z]+)(\d+)$/.exec(ref)!;
  let col = 0;
  for (const ch of m[1]!) col = col * 26 + ch.charCodeAt(0) - 64;
  const cells = book.sheets[0]!.cells;
  const k = cells.find(Number(m[2]) - 1, col - 1);
  if (k < 0) return undefined;
  if (!cells.cached(k)) return "-";
  const v = cells.value(k);
  return v instanceof XlError ? v.code : v;
}

describe("cell values by type (ECMA-376 §18.18.11)", () => {
  it("numbers, shared and inline strings, str, booleans, errors, dates, blanks", async () => {
    const sst = `<sst ${NS}><si><t>Ca</t></si><si><r><t>M</t></r><r><t>g</t></r><rPh><t>ignored</t></rPh></si><si/><si><t xml:space="preserve"> K </t><phoneticPr fontId="1"/></si></sst>`;
    const book = await bookWith(
      rows(
        '<row r="1"><c r="A1"><v>1.5</v></c><c r="B1"><v> 2e3 </v></c><c r="C1"><v></v></c><c r="D1"/><c r="E1" t="n"><v>-0</v></c></row>' +
          '<row r="2"><c r="A2" t="s"><v>0</v></c><c r="B2" t="s"><v> 1 </v></c><c r="C2" t="s"><v>2</v></c><c r="D2" t="s"><v>3</v></c></row>' +
          '<row r="3"><c r="A3" t="inlineStr"><is><t>in</t><r><t>line</t></r><rPh><t>x</t></rPh><phoneticPr/></is></c><c r="B3" t="inlineStr"><is/></c><c r="C3" t="inlineStr"/><c r="D3" t="str"><v> a b </v></c></row>' +
          '<row r="4"><c r="A4" t="b"><v>1</v></c><c r="B4" t="b"><v>0</v></c><c r="C4" t="b"><v> TRUE </v></c><c r="D4" t="b"><v>false</v></c></row>' +
          '<row r="5"><c r="A5" t="e"><v>#N/A</v></c><c r="B5" t="e"><v> #div/0! </v></c><c r="C5" t="e"><v>#BOGUS!</v></c></row>' +
          '<row r="6"><c r="A6" t="d"><v>2024-01-01</v></c><c r="B6" t="d"><v>2024-01-01T12:00:00Z</v></c><c r="C6" t="d"><v>1900-02-28</v></c><c r="D6" t="d"><v>1900-03-01T06:00</v></c><c r="E6" t="d"><v>2024-01-01T00:00:30.5</v></c></row>',
      ),
      {},
      {
        "xl/sharedStrings.xml": sst,
        "xl/_rels/workbook.xml.rels":
          '<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sharedStrings" Target="sharedStrings.xml"/></Relationships>',
      },
    );
    expect(["A1", "B1", "C1", "D1", "E1"].map((r) => at(book, r))).toEqual([1.5, 2000, "-", "-", -0]);
    expect(["A2", "B2", "C2", "D2"].map((r) => at(book, r))).toEqual(["Ca", "Mg", "", " K "]);
    expect(["A3", "B3", "C3", "D3"].map((r) => at(book, r))).toEqual(["inline", "", "-", " a b "]);
    expect(["A4", "B4", "C4", "D4"].map((r) => at(book, r))).toEqual([true, false, true, false]);
    expect(["A5", "B5", "C5"].map((r) => at(book, r))).toEqual(["#N/A", "#DIV/0!", "#VALUE!"]);
    // 2024-01-01 is serial 45292 (Microsoft, DATE(2024,1,1) = 45292); 1900-02-28 is 59 and 1900-03-01 is 61
    expect(["A6", "B6", "C6", "D6", "E6"].map((r) => at(book, r))).toEqual([45292, 45292.5, 59, 61.25, 45292 + 30.5 / 86400]);
    expect(at(book, "F6")).toBeUndefined();
  });
  it("the 1904 date system (workbookPr date1904)", async () => {
    const book = await bookWith(rows('<row r="1"><c r="A1" t="d"><v>1904-01-02</v></c><c r="B1" t="d"><v>1904-01-01</v></c></row>'), { date1904: true });
    expect(book.date1904).toBe(true);
    expect([at(book, "A1"), at(book, "B1")]).toEqual([1, 0]);
  });
  it("cells without r follow the one before; rows without r follow the row before", async () => {
    const book = await bookWith(rows('<row><c><v>1</v></c><c r="C1"><v>3</v></c><c><v>4</v></c></row><row r="3"><c><v>5</v></c></row><row><c r="B4"><v>6</v></c></row>'));
    expect(["A1", "B1", "C1", "D1", "A3", "B4"].map((r) => at(book, r))).toEqual([1, undefined, 3, 4, 5, 6]);
  });
  it("cell references in lower case and with three letters (XFD is the last column)", async () => {
    const book = await bookWith(rows('<row r="7"><c r="b7"><v>1</v></c><c r="XFD7"><v>2</v></c></row>'));
    expect(at(book, "B7")).toBe(1);
    expect(at(book, "XFD7")).toBe(2);
    expect(book.sheets[0]!.cells.maxCol).toBe(16383);
    expect(book.sheets[0]!.cells.maxRow).toBe(6);
  });
  it("row 1,048,576 is the last row", async () => {
    const book = await bookWith(rows('<row r="1048576"><c r="A1048576"><v>9</v></c></row>'));
    expect(at(book, "A1048576")).toBe(9);
  });
  it("elements of other namespaces in a row or cell are skipped; comments and extLst keep the cell from being simple", async () => {
    const book = await bookWith(
      sheetOf(
        '<sheetData><!-- c --><row r="1"><x:ext xmlns:x="urn:invented"><c r="Z1"><v>7</v></c></x:ext><c r="A1"><f>1+1</f><v>2</v><!-- kept --></c><c r="B1"><f>2+2</f><v>4</v><extLst><ext uri="x"/></extLst></c><c r="C1"><f>3</f><v>3</v><x:y xmlns:x="urn:invented"/></c><c r="D1"><f>4</f><v>4</v></c>\n</row>\n</sheetData>',
        '<x:after xmlns:x="urn:invented"><sheetData/></x:after>',
      ),
    );
    const fs = book.sheets[0]!.formulas;
    expect(at(book, "Z1")).toBeUndefined();
    expect(Array.from(fs.simple.subarray(0, fs.n))).toEqual([0, 0, 0, 1]);
  });
});

describe("formulas by stored form (ECMA-376 §18.3.1.40)", () => {
  it("normal, array (fixed), dynamic (cm to XLDAPR metadata), data table, shared", async () => {
    const book = await bookWith(
      rows(
        '<row r="1"><c r="A1"><f>1+2</f><v>3</v></c><c r="B1"><f t="array" ref="B1:B2">{1;2}</f><v>1</v></c><c r="C1" cm="1"><f t="array" ref="C1:C2">{1;2}</f><v>1</v></c><c r="D1" cm="2"><f t="array" ref="D1">1</f><v>1</v></c><c r="E1"><f t="dataTable" ref="E1:E2" dt2D="0" dtr="0" r1="A1"/><v>0</v></c><c r="F1"><f t="shared" ref="F1:F2" si="0">A1*2</f><v>6</v></c><c r="G1"><f/></c></row>' +
          '<row r="2"><c r="F2"><f t="shared" si="0"/><v>0</v></c></row>',
      ),
      { dynamic: true },
    );
    const fs = book.sheets[0]!.formulas;
    expect(Array.from(fs.form.subarray(0, fs.n))).toEqual([Form.Plain, Form.Array, Form.Dynamic, Form.Array, Form.Table, Form.Shared, Form.Plain, Form.Shared]);
    expect(fs.ref.get(1)).toEqual({ r1: 0, c1: 1, r2: 1, c2: 1 });
    expect(fs.ref.get(3)).toEqual({ r1: 0, c1: 3, r2: 0, c2: 3 });
    expect(fs.node[4]).toBeUndefined(); // a data table has no tree
    expect(fs.syntaxError.has(4)).toBe(false);
    // the shared member takes its master's text, tree and origin
    expect(fs.master[7]).toBe(5);
    expect(fs.master[5]).toBe(-1);
    expect(formulaText(book.sheets[0]!, 7)).toBe("A1*2");
    expect(fs.node[7]).toBe(fs.node[5]);
    expect([fs.originRow[7], fs.originCol[7]]).toEqual([0, 5]);
    expect(formulaText(book.sheets[0]!, 0)).toBe("1+2");
    expect(formulaText(book.sheets[0]!, 6)).toBe("");
  });
  it("a formula's text is decoded; one that does not parse keeps its error", async () => {
    const book = await bookWith(rows('<row r="1"><c r="A1" t="str"><f>"a&amp;b"&amp;"c"</f><v>x</v></c><c r="B1"><f>1+</f><v>0</v></c></row>'));
    expect(formulaText(book.sheets[0]!, 0)).toBe('"a&b"&"c"');
    expect(book.sheets[0]!.formulas.syntaxError.get(1)).toMatch(/./);
    expect(book.sheets[0]!.formulas.node[1]).toBeUndefined();
  });
  it("a shared member without a master, and one whose master does not parse", async () => {
    const book = await bookWith(rows('<row r="1"><c r="A1"><f t="shared" si="7"/><v>1</v></c><c r="B1"><f t="shared" ref="B1:C1" si="3">1+</f><v>0</v></c><c r="C1"><f t="shared" si="3"/><v>0</v></c></row>'));
    const fs = book.sheets[0]!.formulas;
    expect(fs.syntaxError.get(0)).toBe("shared formula 7 has no master cell");
    expect(fs.syntaxError.get(2)).toBe(fs.syntaxError.get(1));
    expect(fs.syntaxError.get(2)).toMatch(/./);
  });
});

describe("refusals of a sheet part, word for word (behaviour)", () => {
  const P = 'sheet "Lab" cannot be read: ';
  it.each([
    [`<chartsheet ${NS}/>`, "the part is not a worksheet"],
    ["<!-- nothing -->", "the part is not a worksheet"],
    ['<worksheet xmlns="http://example.invalid/"><sheetData/></worksheet>', "the worksheet is not in the SpreadsheetML namespace"],
    [`<worksheet ${NS}><sheetData><row r="1"></row>`, "sheetData is not closed"],
    [rows("x"), "text directly inside sheetData"],
    [rows("<foo/>"), "unexpected element <foo> in sheetData"],
    [rows('<x:row xmlns:x="urn:invented"/>'), "unexpected element <x:row> in sheetData"],
    [rows('<row r="0"/>'), "row number 0 is out of range"],
    [rows('<row r="1048577"/>'), "row number 1048577 is out of range"],
    [rows('<row r="1.5"/>'), "row number 1.5 is out of range"],
    [rows('<row r="x"/>'), "row number x is out of range"],
    [rows('<row r="2"/><row r="1"/>'), "row 1 comes after row 2; rows must be in order"],
    [rows('<row r="2"/><row r="2"/>'), "row 2 comes after row 2; rows must be in order"],
    [`<worksheet ${NS}><sheetData><row r="1"><c r="A1"/>`, "a row is not closed"],
    [rows('<row r="1">x</row>'), "text directly inside row 1"],
    [rows('<row r="3"><v>1</v></row>'), "unexpected element <v> in row 3"],
    [rows('<row r="1"><c r="1A"/></row>'), 'cell reference "1A" is not a cell'],
    [rows('<row r="1"><c r="A"/></row>'), 'cell reference "A" is not a cell'],
    [rows('<row r="1"><c r="AAAA1"/></row>'), 'cell reference "AAAA1" is not a cell'],
    [rows('<row r="1"><c r="A0"/></row>'), 'cell reference "A0" is not a cell'],
    [rows('<row r="1"><c r="A1x"/></row>'), 'cell reference "A1x" is not a cell'],
    [rows('<row r="1"><c r="$A$1"/></row>'), 'cell reference "$A$1" is not a cell'],
    [rows('<row r="1"><c r="C2"/></row>'), "cell C2 is inside row 1"],
    [rows('<row r="1"><c r="XFE1"/></row>'), "cell column beyond XFD in row 1"],
    [rows('<row r="1"><c r="XFD1"/><c/></row>'), "cell column beyond XFD in row 1"],
    [rows('<row r="1"><c r="B1"/><c r="A1"/></row>'), "cells of row 1 are out of order"],
    [rows('<row r="1"><c r="B1"/><c r="B1"/></row>'), "cells of row 1 are out of order"],
    [`<worksheet ${NS}><sheetData><row r="1"><c r="B1"><v>1</v>`, "cell B1 is not closed"],
    [rows('<row r="1"><c r="B1">x</c></row>'), "text directly inside cell B1"],
    [rows('<row r="1"><c r="B1"><f>1</f><f>2</f></c></row>'), "cell B1 has two formulas"],
    [rows('<row r="1"><c r="B1"><v>1</v><v>2</v></c></row>'), "cell B1 has two values"],
    [rows('<row r="1"><c r="B1"><r/></c></row>'), "unexpected element <r> in cell B1"],
    [`<worksheet ${NS}><sheetData><row r="1"><c r="B1" t="inlineStr"><is><t>a</t>`, "an inline string is not closed"],
    [rows('<row r="1"><c r="B1"><v>abc</v></c></row>'), 'cell B1 holds "abc", which is not a number'],
    [rows('<row r="1"><c r="B1"><v>Infinity</v></c></row>'), 'cell B1 holds "Infinity", which is not a number'],
    [rows('<row r="1"><c r="B1" t="s"><v>0</v></c></row>'), "cell B1 points at shared string 0, which does not exist"],
    [rows('<row r="1"><c r="B1" t="s"><v>-1</v></c></row>'), "cell B1 points at shared string -1, which does not exist"],
    [rows('<row r="1"><c r="B1" t="s"><v>0.5</v></c></row>'), "cell B1 points at shared string 0.5, which does not exist"],
    [rows('<row r="1"><c r="B1" t="d"><v>1 Jan 2024</v></c></row>'), 'cell B1 holds the date "1 Jan 2024", which is not ISO 8601'],
    [rows('<row r="1"><c r="B1" t="q"><v>1</v></c></row>'), 'cell B1 has an unknown type "q"'],
    [rows('<row r="1"><c r="B1"><f t="odd">1</f></c></row>'), 'cell B1 has a formula of unknown type "odd"'],
    [rows('<row r="1"><c r="B1"><f t="array" ref="A1:B2">1</f></c></row>'), 'the array formula in B1 covers "A1:B2", which does not start at its cell'],
    [rows('<row r="1"><c r="B1"><f t="array" ref="B2:B3">1</f></c></row>'), 'the array formula in B1 covers "B2:B3", which does not start at its cell'],
    [rows('<row r="1"><c r="B1"><f t="array">1</f></c></row>'), 'the array formula in B1 covers "", which does not start at its cell'],
    [rows('<row r="1"><c r="B1"><f t="array" ref="B1:A1">1</f></c></row>'), 'the array formula in B1 covers "B1:A1", which does not start at its cell'],
    [rows('<row r="1"><c r="B1"><f t="shared" si="0">1</f></c><c r="C1"><f t="shared" si="0">2</f></c></row>'), "shared formula 0 has two masters"],
  ])("%s → %s", async (xml, message) => {
    expect(await refusal(xml)).toBe(P + message);
  });
  it("an inline string's unknown element is skipped; an empty <t/> is empty text", async () => {
    const book = await bookWith(rows('<row r="1"><c r="A1" t="inlineStr"><is><t/><x>ignored<t>y</t></x></is></c></row>'));
    expect(at(book, "A1")).toBe("y");
  });
  it("shared strings that cannot be read, and cell metadata that cannot be read, are file errors", async () => {
    const rels = (target: string, type: string) =>
      `<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/${type}" Target="${target}"/></Relationships>`;
    await expect(bookWith(undefined, {}, { "xl/_rels/workbook.xml.rels": rels("sharedStrings.xml", "sharedStrings"), "xl/sharedStrings.xml": "<sst><si><t>a<b/></t></si></sst>" })).rejects.toThrow(
      new WorkbookFileError("the shared strings cannot be read: unexpected element <b> inside a text element"),
    );
    await expect(bookWith(undefined, {}, { "xl/_rels/workbook.xml.rels": rels("metadata.xml", "sheetMetadata"), "xl/metadata.xml": "<metadata><bk" })).rejects.toThrow(new WorkbookFileError("the cell metadata cannot be read: unterminated start tag"));
  });
});

describe("sheetData, rows, merges (ECMA-376 §18.3.1.80 sheetData, §18.3.1.55 mergeCell)", () => {
  it("a self-closing sheetData; row spans of plain and self-closing rows", async () => {
    const emptyXml = sheetOf("<sheetData/>");
    const empty = await bookWith(emptyXml);
    const at0 = emptyXml.indexOf("<sheetData/>");
    expect(empty.sheets[0]!.sheetData).toEqual({ start: at0, openEnd: at0 + 12, closeStart: at0 + 12, selfClosing: true, prefix: "" });
    const xml = rows('<row r="2"/><row r="4" spans="1:1"><c r="A4"><v>1</v></c></row>');
    const book = await bookWith(xml);
    const rs = book.sheets[0]!.rowSpans;
    expect(rs.n).toBe(2);
    expect([rs.row[0], rs.selfClosing[0], rs.start[0], rs.openEnd[0], rs.closeStart[0], rs.end[0]]).toEqual([1, 1, xml.indexOf('<row r="2"/>'), xml.indexOf('<row r="4"'), xml.indexOf('<row r="4"'), xml.indexOf('<row r="4"')]);
    expect([rs.row[1], rs.selfClosing[1], rs.closeStart[1], rs.end[1]]).toEqual([3, 0, xml.indexOf("</row>"), xml.indexOf("</row>") + 6]);
    expect(book.sheets[0]!.sheetData).toEqual({ start: xml.indexOf("<sheetData>"), openEnd: xml.indexOf("<sheetData>") + 11, closeStart: xml.indexOf("</sheetData>"), selfClosing: false, prefix: "" });
  });
  it("a prefixed SpreadsheetML namespace (the strict URI too): elements of that prefix are read", async () => {
    const xml = '<x:worksheet xmlns:x="http://purl.oclc.org/ooxml/spreadsheetml/main"><x:sheetData><x:row r="1"><x:c r="A1"><x:v>5</x:v></x:c></x:row></x:sheetData></x:worksheet>';
    const book = await bookWith(xml);
    expect(at(book, "A1")).toBe(5);
    expect(book.sheets[0]!.sheetData!.prefix).toBe("x");
  });
  it("merges: valid ranges kept, a reversed, malformed or off-sheet one dropped", async () => {
    const book = await bookWith(sheetOf("<sheetData/>", '<mergeCells count="5"><mergeCell ref="A1:B2"/><mergeCell ref="C3"/><mergeCell ref="D4:C3"/><mergeCell ref="nope"/><mergeCell ref="A1:A1048577"/><mergeCell/></mergeCells>'));
    expect(book.sheets[0]!.merges).toEqual([
      { r1: 0, c1: 0, r2: 1, c2: 1 },
      { r1: 2, c1: 2, r2: 2, c2: 2 },
    ]);
  });
  it("a chartsheet is a sheet without cells", async () => {
    const pkg = await openPackage(xlsxBytes({ sheets: [{ name: "Lab", rows: "" }, { name: "Chart", rows: "" }] }));
    pkg.write("xl/_rels/workbook.xml.rels", pkg.text("xl/_rels/workbook.xml.rels")!.replace(/worksheet"( Target="worksheets\/sheet2)/, 'chartsheet"$1'));
    const book = readBook(await openPackage(pkg.toBuffer()), SOIL_NAMES);
    expect(book.sheets.map((s) => [s.name, s.isWorksheet, s.xml, s.cells.n, s.formulas.n])).toEqual([
      ["Lab", true, expect.any(String), 0, 0],
      ["Chart", false, "", 0, 0],
    ]);
    expect(book.sheets[1]!.cells.find(0, 0)).toBe(-1);
  });
});

describe("what the reader skips", () => {
  it("SpreadsheetML elements other than sheetData and merges are skipped with all they hold; spaces between cell parts are not text", async () => {
    const xml = sheetOf('<dimension ref="A1"/><extLst><ext uri="x"><sheetData><row r="1"><c r="A1"><v>99</v></c></row></sheetData></ext></extLst><sheetData><row r="2">\n <c r="A2">\n <v>1</v>\n </c>\n</row></sheetData>');
    const book = await bookWith(xml);
    expect(at(book, "A1")).toBeUndefined();
    expect(at(book, "A2")).toBe(1);
    expect(book.sheets[0]!.formulas.n).toBe(0);
  });
});

describe("the cell store (src/engine/store.ts): lookups and growth past its first 256 formulas and rows", () => {
  it("300 rows with a formula each: every formula and row recorded; find, rowRange and firstAtOrAfter", async () => {
    const body = Array.from({ length: 300 }, (_, i) => `<row r="${i + 1}"><c r="B${i + 1}"><f>${i}+1</f><v>${i + 1}</v></c><c r="D${i + 1}" t="b"><v>1</v></c></row>`).join("");
    const book = await bookWith(rows(body));
    const sh = book.sheets[0]!;
    expect(sh.formulas.n).toBe(300);
    expect(sh.rowSpans.n).toBe(300);
    expect(sh.rowSpans.row[299]).toBe(299);
    expect(sh.formulas.cell[299]).toBe(598);
    expect(sh.formulas.master[299]).toBe(-1);
    expect(formulaText(sh, 299)).toBe("299+1");
    expect(at(book, "B300")).toBe(300);
    expect(at(book, "D300")).toBe(true);
    const cells = sh.cells;
    expect(cells.find(299, 1)).toBe(598);
    expect(cells.find(299, 3)).toBe(599);
    expect(cells.find(299, 2)).toBe(-1);
    expect(cells.find(300, 1)).toBe(-1);
    expect(cells.find(-1, 1)).toBe(-1);
    expect(cells.rowRange(5)).toEqual([10, 12]);
    expect(cells.rowRange(300)).toEqual([0, 0]);
    expect(cells.rowRange(-1)).toEqual([0, 0]);
    expect([0, 1, 2, 3, 4].map((c) => cells.firstAtOrAfter(5, c))).toEqual([10, 10, 11, 11, 12]);
    expect(cells.firstAtOrAfter(400, 0)).toBe(0);
    expect(cells.formula[598]).toBe(299);
    expect(cells.formula[599]).toBe(-1);
    expect(cells.planId[598]).toBe(-1);
  });
  it("a row with no cells between rows that have some", async () => {
    const book = await bookWith(rows('<row r="1"><c r="A1"><v>1</v></c></row><row r="3"><c r="A3"><v>3</v></c><c r="C3"><v>4</v></c></row>'));
    const cells = book.sheets[0]!.cells;
    expect(cells.rowRange(1)).toEqual([1, 1]);
    expect(cells.rowRange(2)).toEqual([1, 3]);
    expect(cells.find(1, 0)).toBe(-1);
    expect(cells.find(2, 2)).toBe(2);
    expect(cells.find(2, 1)).toBe(-1);
    expect(cells.find(2, 3)).toBe(-1);
    expect([cells.start[2], cells.end[2]]).toEqual([book.sheets[0]!.xml.indexOf('<c r="C3">'), book.sheets[0]!.xml.indexOf("</row></sheetData>")]);
  });
});

describe("defined names (ECMA-376 §18.2.5 definedName; localSheetId scopes a name to a sheet)", () => {
  it("workbook and sheet scope, case-insensitive; _xlnm names left out; a name that does not parse keeps its error", async () => {
    const book = await bookWith(undefined, {
      sheets: [
        { name: "Lab", rows: "" },
        { name: "Field", rows: "" },
      ],
      names: [
        { name: "ca", text: "Lab!$A$1" },
        { name: "CA", text: "Field!$B$2", localSheetId: 1 },
        { name: "_xlnm.Print_Area", text: "Lab!$A$1:$B$2" },
        { name: "broken", text: "Lab!A1+" },
      ],
    });
    expect(book.names.map((n) => n.name)).toEqual(["ca", "CA", "broken"]);
    expect(book.definedName("Ca", 0)?.text).toBe("Lab!$A$1");
    expect(book.definedName("ca", 1)?.text).toBe("Field!$B$2");
    expect(book.definedName("ca", 1)?.scope).toBe(1);
    expect(book.definedName("ca", 0)?.scope).toBeUndefined();
    expect(book.definedName("missing", 0)).toBeUndefined();
    expect(book.definedName("broken", 0)?.node).toBeUndefined();
    expect(book.definedName("broken", 0)?.syntaxError).toMatch(/./);
    expect(book.definedName("ca", 0)?.node?.k).toBe("ref");
    expect(book.sheetIndex("field")).toBe(1);
    expect(book.sheetIndex("LAB")).toBe(0);
    expect(book.sheetIndex("Gone")).toBeUndefined();
  });
});

describe("tables (ECMA-376 §18.5.1.2 table: ref, name, displayName)", () => {
  const REL = (target: string) => `<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/table" Target="${target}"/><Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/hyperlink" Target="http://example.invalid/" TargetMode="External"/></Relationships>`;
  it("by name and display name, upper case; parts that are missing, not a table, without a ref, or unreadable are left out", async () => {
    const book = await bookWith(undefined, { sheets: [{ name: "Lab", rows: "" }, { name: "B", rows: "" }, { name: "C", rows: "" }, { name: "D", rows: "" }] }, {
      "xl/worksheets/_rels/sheet1.xml.rels": REL("../tables/table1.xml"),
      "xl/tables/table1.xml": `<?xml version="1.0"?><!-- c --><table ${NS} name="Samples" displayName="Shown" ref="B2:C5"/>`,
      "xl/worksheets/_rels/sheet2.xml.rels": REL("/xl/tables/table2.xml"),
      "xl/tables/table2.xml": `<notTable ${NS} name="T2" ref="A1:B2"/>`,
      "xl/worksheets/_rels/sheet3.xml.rels": REL("../tables/table3.xml"),
      "xl/tables/table3.xml": `<table ${NS} name="T3"/>`,
      "xl/worksheets/_rels/sheet4.xml.rels": REL("../tables/missing.xml"),
    });
    expect([...book.tables]).toEqual([
      ["SAMPLES", { sheet: 0, rect: { r1: 1, c1: 1, r2: 4, c2: 2 } }],
      ["SHOWN", { sheet: 0, rect: { r1: 1, c1: 1, r2: 4, c2: 2 } }],
    ]);
  });
  it("a table part that is not XML is left out", async () => {
    const book = await bookWith(undefined, {}, { "xl/worksheets/_rels/sheet1.xml.rels": REL("../tables/table1.xml"), "xl/tables/table1.xml": "<table name='T' ref='A1:B2'" });
    expect(book.tables.size).toBe(0);
  });
});

describe("serial dates (Microsoft, \"Date systems in Excel\")", () => {
  it("isoToSerial in both systems, with times, and what is not ISO 8601", () => {
    expect(isoToSerial("1900-01-01", false)).toBe(1);
    expect(isoToSerial("1900-02-28", false)).toBe(59);
    expect(isoToSerial("1900-03-01", false)).toBe(61);
    expect(isoToSerial("1899-12-31", false)).toBe(0);
    expect(isoToSerial("2024-01-01", false)).toBe(45292);
    expect(isoToSerial("2024-01-01", true)).toBe(45292 - 1462);
    expect(isoToSerial(" 2024-01-01T18:00 ", false)).toBe(45292.75);
    expect(isoToSerial("2024-01-01T00:00:01.5Z", false)).toBe(45292 + 1.5 / 86400);
    expect(isoToSerial("2024-1-1", false)).toBeUndefined();
    expect(isoToSerial("2024-01-01T10", false)).toBeUndefined();
    expect(isoToSerial("", false)).toBeUndefined();
    // The whole text is the date: a prefix is not skipped (ECMA-376 Part 1: a t="d" cell holds an ISO 8601
    // date-time, from memory); fractions of a second may have several digits.
    expect(isoToSerial("x2024-01-01", false)).toBeUndefined();
    expect(isoToSerial("12024-01-01", false)).toBeUndefined();
    expect(isoToSerial("2024-01-01T00:00:01.25Z", false)).toBe(45292 + 1.25 / 86400);
  });
  it("localSerial: milliseconds since 1970 UTC, minutes west of UTC, either system", () => {
    const noon = Date.UTC(2024, 0, 1, 12);
    expect(localSerial(noon, 0)).toBe(45292.5);
    expect(localSerial(noon, 60)).toBe(45292.5 - 1 / 24);
    expect(localSerial(noon, -120)).toBe(45292.5 + 2 / 24);
    expect(localSerial(noon, 0, true)).toBe(45292.5 - 1462);
    expect(localSerial(Date.UTC(1899, 11, 30), 0)).toBe(0);
  });
});
