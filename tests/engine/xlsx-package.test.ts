/**
 * The package layer (src/engine/xlsx-package.ts): size limits checked from the zip directory before
 * anything is inflated, text decoding, how the workbook part and its sheets are found, the refusals
 * of a damaged workbook with their exact words, the package's read/write API, relationship helpers,
 * and the dynamic-array metadata part. Packages are hand-built (invented contents).
 *
 * Expected forms: ECMA-376 Part 2 (OPC) §9.3 relationships (Id, Type, Target, TargetMode; targets
 * resolved against the source part's folder, §9.3.2 / RFC 3986 §5.2), §10.1.2 content types;
 * ECMA-376 Part 1 §18.2.20 sheet (r:id in the relationships namespace), §18.2.28 workbookPr
 * date1904, §18.2.5 definedName (localSheetId), §18.9 metadata (metadataTypes, cellMetadata bk/rc:
 * rc t is a 1-based index into metadataTypes); XLDAPR is Excel's dynamic-array type (from memory of
 * files Excel saves, as xlsx-package.ts says). UTF-8/UTF-16 byte-order marks: Unicode §23.8. The
 * limits and the refusals' words are behaviour (PACKAGE_LIMITS and the file's header).
 */
import { METADATA_XML, PACKAGE_LIMITS, WorkbookFileError, asFileError, dynamicArrayCms, dynamicArrayIndex, openPackage, readRelationships, relsPathOf, resolveTarget } from "../../src/engine/xlsx-package";
import { XmlError } from "../../src/engine/xml";
import { readZipDirectory } from "../../src/engine/zip";
import { xlsxBytes } from "../helpers/xlsx";
import { writeZip as writeTestZip, Entry } from "../reliability/zip-writer";
import { partsOf } from "../reliability/hostile-files";

const REL_NS = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
const PKG_RELS = "http://schemas.openxmlformats.org/package/2006/relationships";
const MAIN = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
const rel = (id: string, type: string, target: string, extra = "") => `<Relationship Id="${id}" Type="${REL_NS}/${type}" Target="${target}"${extra}/>`;
const rels = (...items: string[]) => `<Relationships xmlns="${PKG_RELS}">${items.join("")}</Relationships>`;
const SHEET = `<worksheet xmlns="${MAIN}"><sheetData/></worksheet>`;

/** A package of parts given as text (or buffers), each entry's zip options overridable. */
function pkgBytes(parts: Record<string, string | Buffer>, options: Record<string, Partial<Entry>> = {}): Buffer {
  return writeTestZip(Object.entries(parts).map(([name, data]) => ({ name, data: Buffer.isBuffer(data) ? data : Buffer.from(data, "utf8"), ...options[name] })));
}
const minimal = (workbook: string, wbRels: string, extra: Record<string, string | Buffer> = {}) => ({
  "_rels/.rels": rels(rel("rId1", "officeDocument", "xl/workbook.xml")),
  "xl/workbook.xml": workbook,
  "xl/_rels/workbook.xml.rels": wbRels,
  ...extra,
});
const wbXml = (sheets: string, extra = "") => `<workbook xmlns="${MAIN}" xmlns:r="${REL_NS}">${extra}<sheets>${sheets}</sheets></workbook>`;

async function refusal(bytes: Buffer): Promise<string> {
  try {
    await openPackage(bytes);
  } catch (e) {
    expect(e).toBeInstanceOf(WorkbookFileError);
    expect((e as Error).name).toBe("WorkbookFileError");
    return (e as Error).message;
  }
  throw new Error("opened a package that should be refused");
}

describe("limits read from the zip directory, before inflating (behaviour: PACKAGE_LIMITS)", () => {
  it("the limits", () => {
    expect(PACKAGE_LIMITS.maxTotalBytes).toBe(2 * 1024 ** 3);
    expect(PACKAGE_LIMITS.maxPartBytes).toBe(512 * 1024 ** 2 - 64);
    expect(PACKAGE_LIMITS.maxRatio).toBe(200);
    expect(PACKAGE_LIMITS.ratioFloorBytes).toBe(16 * 1024 ** 2);
  });
  it("not a zip: fewer than 4 bytes, or no local header signature first (PKWARE APPNOTE §4.3.7)", async () => {
    expect(await refusal(Buffer.from("PK\x03"))).toBe("not an .xlsx workbook (the file is not a zip package)");
    expect(await refusal(Buffer.from("PK\x05\x06" + "\0".repeat(18), "latin1"))).toBe("not an .xlsx workbook (the file is not a zip package)");
  });
  it("a zip error passes its own words", async () => {
    expect(await refusal(Buffer.from("PK\x03\x04 and nothing else, 30 bytes", "latin1"))).toBe("the zip directory is missing: the file is damaged or truncated");
  });
  it("a part declared one byte over the part limit is refused; at the limit the next check speaks", async () => {
    const over = PACKAGE_LIMITS.maxPartBytes + 1;
    const big = pkgBytes({ "xl/big.bin": Buffer.alloc(8) }, { "xl/big.bin": { store: true, declaredSize: over } });
    expect(await refusal(big)).toBe(`part xl/big.bin would expand to ${over} bytes, beyond the ${PACKAGE_LIMITS.maxPartBytes}-byte limit`);
    const at = pkgBytes({ "xl/big.bin": Buffer.alloc(8) }, { "xl/big.bin": { store: true, declaredSize: PACKAGE_LIMITS.maxPartBytes } });
    expect(await refusal(at)).toBe(`part xl/big.bin expands ${Math.round(PACKAGE_LIMITS.maxPartBytes / 8)}:1, which looks like a zip bomb; refused`);
  });
  it("the ratio check: above 16 MiB a part may expand at most 200:1", async () => {
    const floor = PACKAGE_LIMITS.ratioFloorBytes;
    // 16 MiB exactly at any ratio: not checked (then the sizes do not match)
    const atFloor = pkgBytes({ "a.bin": Buffer.alloc(1) }, { "a.bin": { store: true, declaredSize: floor } });
    expect(await refusal(atFloor)).toBe(`part a.bin holds 1 bytes but its header declares ${floor}: the file is damaged`);
    const just = pkgBytes({ "a.bin": Buffer.alloc(1) }, { "a.bin": { store: true, declaredSize: floor + 1 } });
    expect(await refusal(just)).toBe(`part a.bin expands ${floor + 1}:1, which looks like a zip bomb; refused`);
    // exactly 200:1 is accepted by this check (83,887 × 200 = 16,777,400 bytes, just over 16 MiB)
    const size = 83887 * 200;
    expect(size).toBeGreaterThan(floor);
    const exact = pkgBytes({ "a.bin": Buffer.alloc(83887) }, { "a.bin": { store: true, declaredSize: size } });
    expect(await refusal(exact)).toBe(`part a.bin holds 83887 bytes but its header declares ${size}: the file is damaged`);
    const past = pkgBytes({ "a.bin": Buffer.alloc(83886) }, { "a.bin": { store: true, declaredSize: size } });
    expect(await refusal(past)).toBe("part a.bin expands 200:1, which looks like a zip bomb; refused"); // 200.002 rounded
  });
  it("the total: parts within their own limits that together exceed 2 GiB", async () => {
    const each = 500 * 1024 ** 2;
    const body = Buffer.alloc(Math.ceil(each / 200));
    const parts: Record<string, Buffer> = {};
    const options: Record<string, Partial<Entry>> = {};
    for (let i = 0; i < 5; i++) {
      parts[`p${i}.bin`] = body;
      options[`p${i}.bin`] = { store: true, declaredSize: each };
    }
    expect(await refusal(pkgBytes(parts, options))).toBe(`the file would expand to ${5 * each} bytes, beyond the ${2 * 1024 ** 3}-byte limit`);
  });
});

describe("text parts (behaviour: UTF-8, a byte-order mark allowed, UTF-16 refused)", () => {
  const base = () => minimal(wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/>'), rels(rel("rId1", "worksheet", "worksheets/sheet1.xml")), { "xl/worksheets/sheet1.xml": SHEET });
  it("a UTF-8 byte-order mark is dropped", async () => {
    const pkg = await openPackage(pkgBytes({ ...base(), "xl/workbook.xml": Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/>'))]) }));
    expect(pkg.text("xl/workbook.xml")!.startsWith("<workbook")).toBe(true);
    expect(pkg.sheets.map((s) => s.name)).toEqual(["Lab"]);
  });
  it("UTF-16 in either byte order is refused naming the part", async () => {
    for (const bom of [[0xff, 0xfe], [0xfe, 0xff]]) {
      const bytes = pkgBytes({ ...base(), "xl/styles.xml": Buffer.concat([Buffer.from(bom), Buffer.from("<x/>", "utf16le")]) });
      expect(await refusal(bytes)).toBe("part xl/styles.xml is UTF-16; re-save the workbook from Excel");
    }
  });
  it("parts that are not .xml or .rels are not decoded (a binary part starting like UTF-16 is fine)", async () => {
    const pkg = await openPackage(pkgBytes({ ...base(), "xl/media/image1.png": Buffer.from([0xff, 0xfe, 1, 2]), "xl/x.XML": "<a/>" }));
    expect(pkg.text("xl/media/image1.png")).toBeUndefined();
    expect(pkg.bytes("xl/media/image1.png")).toEqual(Buffer.from([0xff, 0xfe, 1, 2]));
    expect(pkg.text("xl/x.XML")).toBe("<a/>");
  });
  it("a part that fails to inflate is refused with the zip reader's words", async () => {
    const bytes = pkgBytes(base(), { "xl/worksheets/sheet1.xml": { declaredCrc: 1 } });
    expect(await refusal(bytes)).toBe("part xl/worksheets/sheet1.xml fails its CRC check: the file is damaged");
  });
});

describe("finding the workbook and its sheets (ECMA-376 Part 2 §9.3, Part 1 §18.2.20)", () => {
  it("the officeDocument relationship names the workbook part; an absolute target is from the package root", async () => {
    const bytes = pkgBytes({
      "_rels/.rels": rels(rel("rId9", "officeDocument", "/book/main.xml")),
      "book/main.xml": wbXml('<sheet name="Lab" sheetId="1" r:id="rIdA"/><sheet name="Chart" sheetId="2" r:id="rIdB"/><sheet name="Dialog" sheetId="3" r:id="rIdC"/>', '<workbookPr date1904="true"/>'),
      "book/_rels/main.xml.rels": rels(rel("rIdA", "worksheet", "../sheets/one.xml"), rel("rIdB", "chartsheet", "./charts/c.xml"), rel("rIdC", "dialogsheet", "d.xml")),
      "sheets/one.xml": SHEET,
      "book/charts/c.xml": "<chartsheet/>",
      "book/d.xml": "<dialogsheet/>",
    });
    const pkg = await openPackage(bytes);
    expect(pkg.workbookPath).toBe("book/main.xml");
    expect(pkg.date1904).toBe(true);
    expect(pkg.sheets).toEqual([
      { name: "Lab", path: "sheets/one.xml", kind: "worksheet", index: 0 },
      { name: "Chart", path: "book/charts/c.xml", kind: "chartsheet", index: 1 },
      { name: "Dialog", path: "book/d.xml", kind: "other", index: 2 },
    ]);
  });
  it("no officeDocument relationship (or only an external one): xl/workbook.xml", async () => {
    const parts = minimal(wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/>'), rels(rel("rId1", "worksheet", "worksheets/sheet1.xml")), { "xl/worksheets/sheet1.xml": SHEET });
    parts["_rels/.rels"] = rels(rel("rId1", "officeDocument", "http://example.invalid/book.xml", ' TargetMode="External"'));
    expect((await openPackage(pkgBytes(parts))).workbookPath).toBe("xl/workbook.xml");
    delete (parts as Record<string, string>)["_rels/.rels"];
    expect((await openPackage(pkgBytes(parts))).workbookPath).toBe("xl/workbook.xml");
  });
  it("date1904: 1 and true are the 1904 system; 0, false and absent are not", async () => {
    for (const [v, want] of [["1", true], ["true", true], ["0", false], ["false", false]] as const) {
      const parts = minimal(wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/>', `<workbookPr date1904="${v}"/>`), rels(rel("rId1", "worksheet", "worksheets/sheet1.xml")), { "xl/worksheets/sheet1.xml": SHEET });
      expect((await openPackage(pkgBytes(parts))).date1904).toBe(want);
    }
    const none = minimal(wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/>', "<workbookPr/>"), rels(rel("rId1", "worksheet", "worksheets/sheet1.xml")), { "xl/worksheets/sheet1.xml": SHEET });
    expect((await openPackage(pkgBytes(none))).date1904).toBe(false);
  });
  it("the relationship id is the id attribute of the relationships namespace's prefix, whatever it is called", async () => {
    const wb = `<workbook xmlns="${MAIN}" xmlns:rel="${REL_NS}" xmlns:o="urn:other"><sheets><sheet name="Lab" sheetId="1" o:id="rIdX" rel:id="rId1"/></sheets></workbook>`;
    const pkg = await openPackage(pkgBytes(minimal(wb, rels(rel("rId1", "worksheet", "worksheets/sheet1.xml"), rel("rIdX", "worksheet", "worksheets/other.xml")), { "xl/worksheets/sheet1.xml": SHEET, "xl/worksheets/other.xml": SHEET })));
    expect(pkg.sheets[0]!.path).toBe("xl/worksheets/sheet1.xml");
    // no relationships namespace declared: any prefix's id is taken
    const loose = `<workbook xmlns="${MAIN}"><sheets><sheet name="Lab" sheetId="1" q:id="rId1"/></sheets></workbook>`;
    expect((await openPackage(pkgBytes(minimal(loose, rels(rel("rId1", "worksheet", "worksheets/sheet1.xml")), { "xl/worksheets/sheet1.xml": SHEET })))).sheets[0]!.path).toBe("xl/worksheets/sheet1.xml");
  });
  it("defined names with and without a sheet scope, decoded", async () => {
    const wb = wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/>') .replace("</workbook>", '<definedNames><definedName name="ca">Lab!$A$1</definedName><definedName name="mg" localSheetId="0">Lab!$B$1&amp;""</definedName><definedName>x</definedName></definedNames></workbook>');
    const pkg = await openPackage(pkgBytes(minimal(wb, rels(rel("rId1", "worksheet", "worksheets/sheet1.xml")), { "xl/worksheets/sheet1.xml": SHEET })));
    expect(pkg.definedNames).toEqual([
      { name: "ca", text: "Lab!$A$1" },
      { name: "mg", text: 'Lab!$B$1&""', localSheetId: 0 },
      { name: "", text: "x" },
    ]);
  });
  it.each([
    ["the workbook part is missing", { "_rels/.rels": rels(rel("rId1", "officeDocument", "xl/workbook.xml")) }, "not an Excel workbook (xl/workbook.xml is missing)"],
    ["the workbook part is not XML", minimal("<workbook><sheets", rels()), "the workbook part cannot be read: unterminated start tag"],
    ["a sheet without a name", minimal(wbXml('<sheet sheetId="1" r:id="rId1"/>'), rels(rel("rId1", "worksheet", "worksheets/sheet1.xml")), { "xl/worksheets/sheet1.xml": SHEET }), "a sheet has no name: the file is damaged"],
    ["a sheet without an id", minimal(wbXml('<sheet name="Lab" sheetId="1"/>'), rels()), 'sheet "Lab" has no part in the package: the file is damaged'],
    ["a sheet whose id has no relationship", minimal(wbXml('<sheet name="Lab" sheetId="1" r:id="rId7"/>'), rels(rel("rId1", "worksheet", "worksheets/sheet1.xml"))), 'sheet "Lab" has no part in the package: the file is damaged'],
    ["a sheet whose relationship is external", minimal(wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/>'), rels(rel("rId1", "worksheet", "http://example.invalid/s.xml", ' TargetMode="External"'))), 'sheet "Lab" has no part in the package: the file is damaged'],
    ["a sheet whose part is missing", minimal(wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/>'), rels(rel("rId1", "worksheet", "worksheets/sheet9.xml"))), 'sheet "Lab" is declared but its part xl/worksheets/sheet9.xml is missing: the file is damaged'],
    [
      "two sheets named alike but for case",
      minimal(wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/><sheet name="LAB" sheetId="2" r:id="rId2"/>'), rels(rel("rId1", "worksheet", "worksheets/sheet1.xml"), rel("rId2", "worksheet", "worksheets/sheet1.xml")), { "xl/worksheets/sheet1.xml": SHEET }),
      'two sheets are named "LAB": the file is damaged',
    ],
  ])("%s", async (_, parts, message) => {
    expect(await refusal(pkgBytes(parts as Record<string, string>))).toBe(message);
  });
});

describe("the package API: text, bytes, entry, parts, write, remove, toBuffer", () => {
  it("replacing, adding and removing parts; untouched parts keep their compressed bytes", async () => {
    const input = xlsxBytes({ sheets: [{ name: "Lab", rows: '<row r="1"><c r="A1"><v>1</v></c></row>' }] });
    const pkg = await openPackage(input);
    const before = pkg.parts();
    expect(before).toEqual(["[Content_Types].xml", "_rels/.rels", "xl/workbook.xml", "xl/_rels/workbook.xml.rels", "xl/worksheets/sheet1.xml"]);
    expect(pkg.has("xl/workbook.xml")).toBe(true);
    expect(pkg.has("nope.xml")).toBe(false);
    expect(pkg.text("nope.xml")).toBeUndefined();
    expect(pkg.bytes("nope.xml")).toBeUndefined();
    expect(pkg.entry("nope.xml")).toBeUndefined();
    const sheetEntry = pkg.entry("xl/worksheets/sheet1.xml")!;
    expect(sheetEntry.name).toBe("xl/worksheets/sheet1.xml");
    pkg.write("xl/worksheets/sheet1.xml", Buffer.from("<worksheet/>"));
    expect(pkg.text("xl/worksheets/sheet1.xml")).toBe("<worksheet/>");
    expect(pkg.bytes("xl/worksheets/sheet1.xml")!.toString()).toBe("<worksheet/>");
    expect(pkg.entry("xl/worksheets/sheet1.xml")).toBeUndefined();
    pkg.write("docProps/new.xml", "<new/>");
    expect(pkg.has("docProps/new.xml")).toBe(true);
    pkg.remove("xl/workbook.xml");
    expect(pkg.has("xl/workbook.xml")).toBe(false);
    expect(pkg.text("xl/workbook.xml")).toBeUndefined();
    expect(pkg.bytes("xl/workbook.xml")).toBeUndefined();
    expect(pkg.entry("xl/workbook.xml")).toBeUndefined();
    pkg.write("gone.xml", "x");
    pkg.remove("gone.xml");
    expect(pkg.has("gone.xml")).toBe(false);
    expect(pkg.parts()).toEqual(["[Content_Types].xml", "_rels/.rels", "xl/_rels/workbook.xml.rels", "xl/worksheets/sheet1.xml", "docProps/new.xml"]);
    const out = readZipDirectory(pkg.toBuffer(), { maxEntries: 100 });
    expect(out.map((e) => e.name)).toEqual(["[Content_Types].xml", "_rels/.rels", "xl/_rels/workbook.xml.rels", "xl/worksheets/sheet1.xml", "docProps/new.xml"]);
    const original = readZipDirectory(input, { maxEntries: 100 });
    expect(out[0]!.raw.equals(original[0]!.raw)).toBe(true); // copied as it was
    expect(out[3]!.raw.toString()).toBe("<worksheet/>"); // rewritten (stored: deflating 12 bytes does not help)
    // a removed part written again is back
    pkg.write("xl/workbook.xml", "<w/>");
    expect(pkg.text("xl/workbook.xml")).toBe("<w/>");
    expect(pkg.parts()).toContain("xl/workbook.xml");
  });
  it("cellXmlBytes: the uncompressed bytes of worksheets and shared strings", async () => {
    const sheet = `<worksheet xmlns="${MAIN}"><sheetData/></worksheet>`;
    const sst = `<sst xmlns="${MAIN}"><si><t>a</t></si></sst>`;
    const parts = minimal(wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/><sheet name="C" sheetId="2" r:id="rId2"/>'), rels(rel("rId1", "worksheet", "worksheets/sheet1.xml"), rel("rId2", "chartsheet", "charts/c.xml"), rel("rId3", "sharedStrings", "sharedStrings.xml")), {
      "xl/worksheets/sheet1.xml": sheet,
      "xl/charts/c.xml": "<chartsheet>not counted</chartsheet>",
      "xl/sharedStrings.xml": sst,
    });
    expect((await openPackage(pkgBytes(parts))).cellXmlBytes).toBe(sheet.length + sst.length);
    delete (parts as Record<string, string>)["xl/sharedStrings.xml"];
    expect((await openPackage(pkgBytes(parts))).cellXmlBytes).toBe(sheet.length);
  });
});

describe("relationship helpers (ECMA-376 Part 2 §9.3)", () => {
  it("resolveTarget against the source part's folder", () => {
    expect(resolveTarget("xl/workbook.xml", "worksheets/sheet1.xml")).toBe("xl/worksheets/sheet1.xml");
    expect(resolveTarget("xl/worksheets/sheet1.xml", "../tables/table1.xml")).toBe("xl/tables/table1.xml");
    expect(resolveTarget("xl/workbook.xml", "./a/./b.xml")).toBe("xl/a/b.xml");
    expect(resolveTarget("xl/workbook.xml", "/docProps/core.xml")).toBe("docProps/core.xml");
    expect(resolveTarget("workbook.xml", "sheet.xml")).toBe("sheet.xml");
    expect(resolveTarget("", "xl/workbook.xml")).toBe("xl/workbook.xml");
    expect(resolveTarget("xl/workbook.xml", "../../x.xml")).toBe("x.xml");
    expect(resolveTarget("xl/workbook.xml", "a//b.xml")).toBe("xl/a/b.xml");
  });
  it("relsPathOf: the _rels folder beside the part", () => {
    expect(relsPathOf("xl/workbook.xml")).toBe("xl/_rels/workbook.xml.rels");
    expect(relsPathOf("xl/worksheets/sheet1.xml")).toBe("xl/worksheets/_rels/sheet1.xml.rels");
    expect(relsPathOf("workbook.xml")).toBe("_rels/workbook.xml.rels");
  });
  it("readRelationships: Id and Target required, Type optional, TargetMode External marks an outside target", () => {
    expect(readRelationships(undefined)).toEqual([]);
    expect(readRelationships("")).toEqual([]);
    expect(
      readRelationships(
        `<Relationships xmlns="${PKG_RELS}"><Relationship Id="a" Type="t" Target="x.xml"/><Relationship Id="b" Target=""/><Relationship Target="y"/><Relationship Id="c" Type="u"/><Relationship Id="d" Type="v" Target="http://example.invalid/" TargetMode="External"/><Relationship Id="e" Type="w" Target="z" TargetMode="Internal"></Relationship><Other Id="f" Target="q"/></Relationships>`,
      ),
    ).toEqual([
      { id: "a", type: "t", target: "x.xml", external: false },
      { id: "b", type: "", target: "", external: false },
      { id: "d", type: "v", target: "http://example.invalid/", external: true },
      { id: "e", type: "w", target: "z", external: false },
    ]);
  });
  it("asFileError: a WorkbookFileError passes, an XmlError is joined with a colon, anything else in brackets", () => {
    expect(asFileError("x", () => 5)).toBe(5);
    const own = new WorkbookFileError("own words");
    expect(() =>
      asFileError("x", () => {
        throw own;
      }),
    ).toThrow(own);
    expect(() =>
      asFileError("the part", () => {
        throw new XmlError("bad markup");
      }),
    ).toThrow(new WorkbookFileError("the part: bad markup"));
    expect(() =>
      asFileError("the part", () => {
        throw new RangeError("too deep");
      }),
    ).toThrow(new WorkbookFileError("the part (too deep)"));
    try {
      asFileError("the part", () => {
        throw new TypeError("t");
      });
    } catch (e) {
      expect(e).toBeInstanceOf(WorkbookFileError);
    }
  });
});

describe("dynamic-array metadata (ECMA-376 Part 1 §18.9; XLDAPR from memory of Excel's files)", () => {
  const meta = (types: string[], blocks: string[], selfClosing = false) =>
    `<metadata xmlns="${MAIN}"><metadataTypes count="${types.length}">${types.map((t) => `<metadataType name="${t}"/>`).join("")}</metadataTypes>${selfClosing ? "<cellMetadata/>" : `<cellMetadata count="${blocks.length}">${blocks.join("")}</cellMetadata>`}<valueMetadata><bk><rc t="1" v="0"/></bk></valueMetadata></metadata>`;
  it("dynamicArrayCms: the 1-based blocks whose record type is XLDAPR", () => {
    expect([...dynamicArrayCms(undefined)]).toEqual([]);
    expect([...dynamicArrayCms(METADATA_XML)]).toEqual([1]);
    expect([...dynamicArrayCms(meta(["OTHER", "XLDAPR"], ['<bk><rc t="1" v="0"/></bk>', '<bk><rc t="2" v="0"/></bk>', '<bk><rc t="2" v="1"/></bk>']))]).toEqual([2, 3]);
    expect([...dynamicArrayCms(meta(["XLDAPR"], ['<bk><rc t="2" v="0"/></bk>']))]).toEqual([]);
    // blocks of valueMetadata are not cell metadata; a self-closing cellMetadata has none
    expect([...dynamicArrayCms(meta(["XLDAPR"], [], true))]).toEqual([]);
    expect([...dynamicArrayCms(`<metadata><metadataTypes><metadataType/></metadataTypes><cellMetadata><bk><rc t="1"/></bk></cellMetadata></metadata>`)]).toEqual([]);
  });
  const book = (extraRels: string[], extra: Record<string, string> = {}, types?: string) =>
    pkgBytes({
      "[Content_Types].xml": types ?? `<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="xml" ContentType="application/xml"/></Types>`,
      ...minimal(wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/>'), rels(rel("rId1", "worksheet", "worksheets/sheet1.xml"), ...extraRels), { "xl/worksheets/sheet1.xml": SHEET, ...extra }),
    });
  it("dynamicArrayIndex: the smallest XLDAPR block of the workbook's metadata part; undefined when it has none", async () => {
    const pkg = await openPackage(book([rel("rId2", "sheetMetadata", "meta/m.xml")], { "xl/meta/m.xml": meta(["OTHER", "XLDAPR"], ['<bk><rc t="1" v="0"/></bk>', '<bk><rc t="2" v="0"/></bk>', '<bk><rc t="2" v="0"/></bk>']) }));
    expect(dynamicArrayIndex(pkg)).toBe(2);
    const none = await openPackage(book([rel("rId2", "sheetMetadata", "m.xml")], { "xl/m.xml": meta(["OTHER"], ['<bk><rc t="1" v="0"/></bk>']) }));
    expect(dynamicArrayIndex(none)).toBeUndefined();
    expect(none.parts()).not.toContain("xl/metadata.xml");
  });
  it("a metadata.xml the workbook does not point at is left alone", async () => {
    const pkg = await openPackage(book([], { "xl/metadata.xml": "<metadata/>" }));
    expect(dynamicArrayIndex(pkg)).toBeUndefined();
    expect(pkg.text("xl/metadata.xml")).toBe("<metadata/>");
    expect(pkg.text("xl/_rels/workbook.xml.rels")).not.toContain("sheetMetadata");
  });
  it("none yet: the part, its content type and its relationship (the next free rId) are added; cm 1", async () => {
    const pkg = await openPackage(book([rel("rId3", "styles", "styles.xml")]));
    expect(dynamicArrayIndex(pkg)).toBe(1);
    expect(pkg.text("xl/metadata.xml")).toBe(METADATA_XML);
    expect(pkg.text("[Content_Types].xml")).toBe(
      '<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/metadata.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheetMetadata+xml"/></Types>',
    );
    // ids rId1 and rId3 taken: two relationships, so rId3 first, taken, then rId4
    expect(pkg.text("xl/_rels/workbook.xml.rels")).toBe(rels(rel("rId1", "worksheet", "worksheets/sheet1.xml"), rel("rId3", "styles", "styles.xml"), rel("rId4", "sheetMetadata", "metadata.xml")));
  });
  it("content types that already name the part are not changed; content types without an end tag are a damaged file", async () => {
    const types = `<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Override PartName="/xl/metadata.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheetMetadata+xml"/></Types>`;
    const pkg = await openPackage(book([], {}, types));
    expect(dynamicArrayIndex(pkg)).toBe(1);
    expect(pkg.text("[Content_Types].xml")).toBe(types);
    const broken = await openPackage(book([], {}, `<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">`));
    expect(() => dynamicArrayIndex(broken)).toThrow(new WorkbookFileError("the Types part has no end tag: the file is damaged"));
  });
  it("a workbook part at the package root puts metadata.xml at the root too", async () => {
    const bytes = pkgBytes({
      "[Content_Types].xml": `<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"></Types>`,
      "_rels/.rels": rels(rel("rId1", "officeDocument", "workbook.xml")),
      "workbook.xml": wbXml('<sheet name="Lab" sheetId="1" r:id="rId1"/>'),
      "_rels/workbook.xml.rels": rels(rel("rId1", "worksheet", "s.xml")),
      "s.xml": SHEET,
    });
    const pkg = await openPackage(bytes);
    expect(dynamicArrayIndex(pkg)).toBe(1);
    expect(pkg.has("metadata.xml")).toBe(true);
    expect(pkg.text("[Content_Types].xml")).toContain('<Override PartName="/metadata.xml"');
    expect(pkg.text("_rels/workbook.xml.rels")).toContain(rel("rId2", "sheetMetadata", "metadata.xml"));
  });
});

describe("an unchanged package round-trips (behaviour: untouched parts leave as they came)", () => {
  it("every part of a hand-built workbook comes back byte for byte after toBuffer", async () => {
    const input = xlsxBytes({ sheets: [{ name: "Lab", rows: '<row r="1"><c r="A1"><v>1</v></c></row>' }], names: [{ name: "x", text: "Lab!$A$1" }] });
    const again = await partsOf((await openPackage(input)).toBuffer());
    const first = await partsOf(input);
    expect([...again.keys()]).toEqual([...first.keys()]);
    for (const [k, v] of first) expect(again.get(k)!.equals(v)).toBe(true);
  });
});
