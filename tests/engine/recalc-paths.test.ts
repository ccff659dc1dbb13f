/**
 * recalc.ts, the paths the main recalc test does not take: file and output checks with their exact
 * refusals, progress lines, the values copy and its custom-properties part (new, replaced, added
 * to, or left alone), the calculation chain dropped when a formula's stored form changes, names
 * rewritten into Excel's stored form, cleared cells of a shrunk spill, the resource limit, long
 * messages cut, and the atomic writer. Workbook contents are invented.
 *
 * Expected forms: ECMA-376 Part 1 (custom properties §22.3, relationships and content types of
 * Part 2 OPC §9/§10, calcChain §18.6, array formulas t="array" ref= §18.3.1.40); SOIL values from
 * IUPAC/CIAAW atomic weights (source: 400.78 mg/kg Ca is 2 cmol(+)/kg, as tests/core); the rest is
 * behaviour: the refusals and summaries documented in /work/shared/design/architecture.md and the
 * header of src/engine/recalc.ts.
 */
import fs from "fs";
import path from "path";
import { RecalcRefused, customPropertiesXml, defaultOutputPath, recalcBytes, recalcWorkbook, valuesCopyPath, valuesStamp, writable, writeAtomically } from "../../src/engine/recalc";
import { XlError } from "../../src/engine/formula/values";
import { WorkbookFileError, openPackage } from "../../src/engine/xlsx-package";
import { BookSpec, c, da, f, row, xlsxBytes } from "../helpers/xlsx";
import { tempDir } from "../helpers/workbook";

const SHEET = "xl/worksheets/sheet1.xml";
const CUSTOM_NS = "http://schemas.openxmlformats.org/officeDocument/2006/custom-properties";
const VT_NS = "http://schemas.openxmlformats.org/officeDocument/2006/docPropsVTypes";
const FMTID = "{D5CDD505-2E9C-101B-9397-08002B2CF9AE}";

/** A1 = 400.78 mg/kg Ca, B1 = SOIL.CMOL(A1,"Ca") typed (plain form), C1 = B1*2. */
const SIMPLE: BookSpec = { sheets: [{ name: "Lab", rows: row(1, c("A1", 400.78), f("B1", 'SOIL.CMOL(A1,"Ca")', 0), f("C1", "B1*2", 0)) }] };

const sheetData = (xml: string | undefined) => (xml ?? "").replace(/^[\s\S]*<sheetData>|<\/sheetData>[\s\S]*$/g, "");

/** Bytes of a spec with extra parts written in (or replaced). */
async function withParts(spec: BookSpec, parts: Record<string, string>): Promise<Buffer> {
  const pkg = await openPackage(xlsxBytes(spec));
  for (const [p, text] of Object.entries(parts)) pkg.write(p, text);
  return pkg.toBuffer();
}

async function refusalOf(p: Promise<unknown>): Promise<Error> {
  try {
    await p;
  } catch (e) {
    return e as Error;
  }
  throw new Error("expected a refusal");
}

describe("output names (behaviour: beside the input, a suffix before the extension)", () => {
  it("adds .recalc, and .xlsx when the input has no extension", () => {
    expect(defaultOutputPath("/a/b/season.xlsx")).toBe("/a/b/season.recalc.xlsx");
    expect(defaultOutputPath("/a/b/season.xlsm")).toBe("/a/b/season.recalc.xlsm");
    expect(defaultOutputPath("/a/b/season")).toBe("/a/b/season.recalc.xlsx");
  });
  it("the values copy adds .values", () => {
    expect(valuesCopyPath("/a/out.xlsx")).toBe("/a/out.values.xlsx");
    expect(valuesCopyPath("out")).toBe("out.values.xlsx");
  });
});

describe("files that are not plain files, and outputs that would overwrite (behaviour: exact refusals)", () => {
  let dir: string;
  let input: string;
  beforeAll(() => {
    dir = tempDir("soilcell-paths-");
    input = path.join(dir, "in.xlsx");
    fs.writeFileSync(input, xlsxBytes(SIMPLE));
  });
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it("a missing input: WorkbookFileError naming it and the system's code", async () => {
    const missing = path.join(dir, "missing.xlsx");
    const e = await refusalOf(recalcWorkbook(missing, path.join(dir, "o.xlsx")));
    expect(e).toBeInstanceOf(WorkbookFileError);
    expect(e.message).toBe(`cannot read ${missing}: ENOENT`);
  });
  it("a folder as input", async () => {
    const e = await refusalOf(recalcWorkbook(dir, path.join(dir, "o.xlsx")));
    expect(e).toBeInstanceOf(WorkbookFileError);
    expect(e.message).toBe(`${dir} is not a regular file (a folder, device or pipe); give a workbook file`);
  });
  it("an output that is a symbolic link (even to a harmless file)", async () => {
    const target = path.join(dir, "target.txt");
    fs.writeFileSync(target, "keep");
    const link = path.join(dir, "link.xlsx");
    fs.symlinkSync(target, link);
    const e = await refusalOf(recalcWorkbook(input, link));
    expect(e).toBeInstanceOf(RecalcRefused);
    expect(e.name).toBe("RecalcRefused");
    expect(e.message).toBe(`refusing to write to ${link}: it is a symbolic link; choose another output with -o`);
    expect(fs.readFileSync(target, "utf8")).toBe("keep");
  });
  it("an output that is a folder", async () => {
    const sub = path.join(dir, "sub.xlsx");
    fs.mkdirSync(sub);
    const e = await refusalOf(recalcWorkbook(input, sub));
    expect(e).toBeInstanceOf(RecalcRefused);
    expect(e.message).toBe(`refusing to write to ${sub}: it exists and is not a regular file; choose another output with -o`);
  });
  it("an output that is a hard link to the input (same file under another name)", async () => {
    const hard = path.join(dir, "hard.xlsx");
    fs.linkSync(input, hard);
    const e = await refusalOf(recalcWorkbook(input, hard));
    expect(e).toBeInstanceOf(RecalcRefused);
    expect(e.message).toBe(`refusing to write over the input ${input}; choose another output with -o`);
  });
  it("an existing plain output is replaced", async () => {
    const out = path.join(dir, "existing.xlsx");
    fs.writeFileSync(out, "old");
    const s = await recalcWorkbook(input, out);
    expect(s.output).toBe(out);
    expect(fs.readFileSync(out).readUInt32LE(0)).toBe(0x04034b50); // PKWARE APPNOTE 4.3.7: a local file header
  });
  it("a values copy named like the output", async () => {
    const out = path.join(dir, "same.xlsx");
    const e = await refusalOf(recalcWorkbook(input, out, { valuesCopy: path.join(dir, ".", "same.xlsx") }));
    expect(e).toBeInstanceOf(RecalcRefused);
    expect(e.message).toBe(`refusing to write the values copy over the recalculated workbook ${out}; choose another name`);
    expect(fs.existsSync(out)).toBe(false);
  });
  it("a values copy over the input", async () => {
    const e = await refusalOf(recalcWorkbook(input, path.join(dir, "o2.xlsx"), { valuesCopy: input }));
    expect(e.message).toBe(`refusing to write over the input ${input}; choose another output with -o`);
  });
  it("with values set, a values copy is neither checked nor written", async () => {
    const out = path.join(dir, "v.xlsx");
    const s = await recalcWorkbook(input, out, { values: true, valuesCopy: input });
    expect(s.valuesCopy).toBeUndefined();
    expect("valuesCopy" in s).toBe(false);
    const pkg = await openPackage(fs.readFileSync(out));
    expect(sheetData(pkg.text(SHEET))).toBe('<row r="1"><c r="A1"><v>400.78</v></c><c r="B1"><v>1.9999999999999998</v></c><c r="C1"><f>B1*2</f><v>3.9999999999999996</v></c></row>');
  });
  it("writes the output and the values copy, saying so in its progress lines", async () => {
    const out = path.join(dir, "both.xlsx");
    const copy = path.join(dir, "both.values.xlsx");
    const lines: string[] = [];
    const s = await recalcWorkbook(input, out, { valuesCopy: copy, progress: (l) => lines.push(l) });
    expect(lines).toEqual(["reading in.xlsx (1 sheets)", "computing 2 of 2 formula cells", "writing both.xlsx", "writing both.values.xlsx"]);
    expect(s.valuesCopy).toBe(copy);
    expect(s.input).toBe(input);
    expect(s.sheets).toBe(1);
    expect(s.formulaCells).toBe(2);
    expect(s.computedCells).toBe(2);
    expect(s.keptCells).toBe(0);
    expect(s.soilFormulaCells).toBe(1);
    expect(s.seconds).toBeGreaterThan(0);
    const formulas = await openPackage(fs.readFileSync(out));
    const values = await openPackage(fs.readFileSync(copy));
    expect(sheetData(formulas.text(SHEET))).toContain('<c r="B1" cm="1"><f t="array" ref="B1">_xldudf_SOIL_CMOL(A1,&quot;Ca&quot;)</f><v>1.9999999999999998</v></c>');
    expect(sheetData(values.text(SHEET))).toContain('<c r="B1"><v>1.9999999999999998</v></c>');
    expect(formulas.has("docProps/custom.xml")).toBe(false);
    expect(values.has("docProps/custom.xml")).toBe(true);
  });
});

describe("recalcBytes: counts, progress and results", () => {
  it("a cell with a cached value and no SOIL input is kept; an uncomputable uncached one is listed as kept", async () => {
    const spec: BookSpec = { sheets: [{ name: "Lab", rows: row(1, c("A1", 400.78), f("B1", 'SOIL.CMOL(A1,"Ca")', 0), f("C1", "B1*2", 0), f("D1", 'LEN("ab")', 2), f("E1", 'WEBSERVICE("x")')) }] };
    const lines: string[] = [];
    const r = await recalcBytes(xlsxBytes(spec), "in.xlsx", { progress: (l) => lines.push(l) }, "out.xlsx");
    expect(lines).toEqual(["reading in.xlsx (1 sheets)", "computing 3 of 4 formula cells", "writing out.xlsx"]);
    expect(r.summary).toEqual({
      sheets: 1,
      formulaCells: 4,
      computedCells: 2,
      keptCells: 2,
      soilFormulaCells: 1,
      spilledCells: 0,
      errors: [],
      kept: [{ sheet: "Lab", cell: "E1", formula: '=WEBSERVICE("x")', error: "#VALUE!", message: "WEBSERVICE is not computed headless" }],
    });
    expect(r.valuesBytes).toBeUndefined();
    const xml = sheetData((await openPackage(r.bytes)).text(SHEET));
    expect(xml).toBe(
      '<row r="1"><c r="A1"><v>400.78</v></c><c r="B1" cm="1"><f t="array" ref="B1">_xldudf_SOIL_CMOL(A1,&quot;Ca&quot;)</f><v>1.9999999999999998</v></c><c r="C1"><f>B1*2</f><v>3.9999999999999996</v></c><c r="D1"><f>LEN(&quot;ab&quot;)</f><v>2</v></c><c r="E1"><f>WEBSERVICE(&quot;x&quot;)</f></c></row>',
    );
  });

  it("a workbook without SOIL cells and nothing uncached: no sheet is rewritten", async () => {
    const spec: BookSpec = { sheets: [{ name: "Lab", rows: row(1, c("A1", 1), f("B1", "A1*2", 2)) }] };
    const bytes = xlsxBytes(spec);
    const r = await recalcBytes(bytes, "in.xlsx");
    expect(r.summary.computedCells).toBe(0);
    expect(r.summary.keptCells).toBe(1);
    const before = await openPackage(bytes);
    const after = await openPackage(r.bytes);
    expect(after.text(SHEET)).toBe(before.text(SHEET));
    expect(after.parts()).toEqual(before.parts());
  });

  it("a formula longer than 200 characters is cut in the summary, with its length", async () => {
    const long = `${"A1+".repeat(80)}WEBSERVICE("x")`;
    const r = await recalcBytes(xlsxBytes({ sheets: [{ name: "Lab", rows: row(1, c("A1", 1), f("B1", long)) }] }), "in.xlsx");
    const typed = `=${long}`;
    expect(r.summary.kept).toEqual([{ sheet: "Lab", cell: "B1", formula: `${typed.slice(0, 200)}… (${typed.length} characters)`, error: "#VALUE!", message: "WEBSERVICE is not computed headless" }]);
    expect(typed.length).toBe(256);
  });

  it("a formula of exactly 200 characters is not cut", async () => {
    const text = `${"A1+".repeat(61)}WEBSERVICE("${"x".repeat(2)}")`;
    expect(`=${text}`.length).toBe(200);
    const r = await recalcBytes(xlsxBytes({ sheets: [{ name: "Lab", rows: row(1, c("A1", 1), f("B1", text)) }] }), "in.xlsx");
    expect(r.summary.kept[0]!.formula).toBe(`=${text}`);
  });

  it("a SOIL error's message reaches the summary; the cell holds Excel's code only", async () => {
    const spec: BookSpec = { sheets: [{ name: "Lab", rows: row(1, c("A1", -5), f("B1", 'SOIL.CMOL(A1,"Ca")', 0)) }] };
    const r = await recalcBytes(xlsxBytes(spec), "in.xlsx");
    expect(r.summary.errors).toEqual([{ sheet: "Lab", cell: "B1", formula: '=SOIL.CMOL(A1,"Ca")', error: "#VALUE!", message: "mg_per_kg must be at least 0 mg/kg (got -5 mg/kg)" }]);
    expect(sheetData((await openPackage(r.bytes)).text(SHEET))).toContain('<c r="B1" cm="1" t="e"><f t="array" ref="B1">_xldudf_SOIL_CMOL(A1,&quot;Ca&quot;)</f><v>#VALUE!</v></c>');
  });

  it("errors are listed by sheet, then row, then column, spilled elements included", async () => {
    const spec: BookSpec = {
      sheets: [
        { name: "Two", rows: row(1, c("A1", -1), f("B1", 'SOIL.CMOL(A1,"Ca")', 0)) },
        { name: "One", rows: row(1, c("A1", -1), f("B1", 'SOIL.CMOL(A1:A2,"Ca")', 0), f("C1", 'SOIL.CMOL(A1,"Ca")', 0)) + row(2, c("A2", -2)) },
      ],
    };
    const r = await recalcBytes(xlsxBytes(spec), "in.xlsx");
    expect(r.summary.errors.map((e) => `${e.sheet}!${e.cell}`)).toEqual(["Two!B1", "One!B1", "One!C1", "One!B2"]);
    expect(r.summary.spilledCells).toBe(1);
  });

  it("the resource limit: a range one cell larger than maxCells is refused naming the cell; at the limit it computes", async () => {
    const spec: BookSpec = { sheets: [{ name: "Lab", rows: row(1, c("A1", 400.78), f("B1", 'SOIL.CMOL(A1:A4,"Ca")', 0)) + row(4, c("A4", 200.39)) }] };
    const e = await refusalOf(recalcBytes(xlsxBytes(spec), "in.xlsx", { maxCells: 3 }));
    expect(e).toBeInstanceOf(WorkbookFileError);
    expect(e.message).toBe("a formula asks for a range of 4×1 cells, more than the 3 cells soilcell takes in one formula; refused (in Lab!B1)");
    const ok = await recalcBytes(xlsxBytes(spec), "in.xlsx", { maxCells: 4 });
    expect(ok.summary.spilledCells).toBe(3);
  });

  it("bytes that are not a zip are refused before anything is read (PKWARE APPNOTE 4.3.7: a zip starts with a local header)", async () => {
    const e = await refusalOf(recalcBytes(Buffer.from("not a zip"), "x.xlsx"));
    expect(e).toBeInstanceOf(WorkbookFileError);
    expect(e.message).toBe("not an .xlsx workbook (the file is not a zip package)");
  });
});

describe("Excel's stored form of our names (ECMA-376 §18.17.2.3 user-defined functions are stored as _xldudf_…; behaviour: only our own names are rewritten)", () => {
  const stored = async (text: string, extra = "") => {
    const spec: BookSpec = { sheets: [{ name: "Lab", rows: row(1, c("A1", 400.78), f("B1", text, 0), extra) + row(2, c("C2", 2)) }] };
    const r = await recalcBytes(xlsxBytes(spec), "in.xlsx");
    return /<c r="B1"[^>]*><f[^>]*>([^<]*)<\/f>/.exec(sheetData((await openPackage(r.bytes)).text(SHEET)))![1];
  };
  it.each([
    ['soil.cmol(A1,"Ca")', "typed, lower case"],
    ['SOIL.CMOL(A1,"Ca")', "typed"],
    ['_xldudf_soil_cmol(A1,"Ca")', "stored prefix, our name in lower case"],
    ['_xldudf_SOIL_Cmol(A1,"Ca")', "stored, mixed case after SOIL_"],
    ['_xldudf_SOIL_CMOl(A1,"Ca")', "stored, one lower-case letter after several capitals"],
    ['_xldudf_Soil_CMOL(A1,"Ca")', "stored prefix, SOIL in mixed case"],
    ['_xldudf_SOIL_CMOL(A1,"Ca")', "already stored"],
  ])("%s (%s) → _xldudf_SOIL_CMOL", async (text) => {
    expect(await stored(text)).toBe("_xldudf_SOIL_CMOL(A1,&quot;Ca&quot;)");
  });
  it("a spill operator is written as _xlfn.ANCHORARRAY (ECMA-376 future functions, Excel's stored form)", async () => {
    expect(await stored('_xldudf_SOIL_CMOL(C1#,"Ca")', da("C1", "C1:C2", "SEQUENCE(2)", 1))).toBe("_xldudf_SOIL_CMOL(_xlfn.ANCHORARRAY(C1),&quot;Ca&quot;)");
  });
});

describe("the values copy's custom properties (ECMA-376 Part 1 §22.3 custom file properties; fmtid from the same part)", () => {
  const copyOf = async (bytes: Buffer) => {
    const r = await recalcBytes(bytes, "in.xlsx", { valuesCopy: "copy.xlsx" });
    return openPackage(r.valuesBytes!);
  };
  const NOTE = /^SOIL results written as values by soilcell \d+\.\d+\.\d+ on \d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ; the formulas are in the recalculated workbook\.$/;

  it("customPropertiesXml: one lpwstr property named soilcell, pid 2, the note encoded", () => {
    expect(customPropertiesXml("a<b & \"c\"")).toBe(
      `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Properties xmlns="${CUSTOM_NS}" xmlns:vt="${VT_NS}"><property fmtid="${FMTID}" pid="2" name="soilcell"><vt:lpwstr>a&lt;b &amp; &quot;c&quot;</vt:lpwstr></property></Properties>`,
    );
  });
  it("valuesStamp: version and UTC time to the second", () => {
    expect(valuesStamp()).toMatch(/^soilcell \d+\.\d+\.\d+ on \d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ$/);
  });
  it("a workbook without custom properties gets the part, its relationship (next free rId) and its content type", async () => {
    const pkg = await copyOf(xlsxBytes(SIMPLE));
    const xml = pkg.text("docProps/custom.xml")!;
    const note = /<vt:lpwstr>([^<]*)<\/vt:lpwstr>/.exec(xml)![1]!;
    expect(note).toMatch(NOTE);
    expect(xml).toBe(customPropertiesXml(note));
    expect(pkg.text("_rels/.rels")).toBe(
      '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/><Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/custom-properties" Target="docProps/custom.xml"/></Relationships>',
    );
    expect(pkg.text("[Content_Types].xml")).toMatch(/<Override PartName="\/docProps\/custom.xml" ContentType="application\/vnd.openxmlformats-officedocument.custom-properties\+xml"\/><\/Types>$/);
    expect(pkg.text("[Content_Types].xml")!.match(/docProps\/custom.xml/g)).toHaveLength(1);
  });
  it("the new relationship's id skips ids already taken (rId2 taken, one relationship: rId3)", async () => {
    const rels = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>';
    const pkg = await copyOf(await withParts(SIMPLE, { "_rels/.rels": rels }));
    expect(pkg.text("_rels/.rels")).toContain('<Relationship Id="rId3" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/custom-properties" Target="docProps/custom.xml"/></Relationships>');
    expect(pkg.text("_rels/.rels")).not.toContain('Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/custom');
  });
  it("an existing soilcell property is replaced in place, keeping its pid and the other properties", async () => {
    const existing = `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Properties xmlns="${CUSTOM_NS}" xmlns:vt="${VT_NS}"><property fmtid="${FMTID}" pid="2" name="farm"><vt:lpwstr>Invented Acres</vt:lpwstr></property><property fmtid="${FMTID}" pid="5" name="soilcell"><vt:lpwstr>old note</vt:lpwstr></property><property fmtid="${FMTID}" pid="3" name="x"><vt:i4>1</vt:i4></property></Properties>`;
    const pkg = await copyOf(await withParts(SIMPLE, { "docProps/custom.xml": existing }));
    const xml = pkg.text("docProps/custom.xml")!;
    const note = /name="soilcell"><vt:lpwstr>([^<]*)</.exec(xml)![1]!;
    expect(note).toMatch(NOTE);
    expect(xml).toBe(existing.replace('pid="5" name="soilcell"><vt:lpwstr>old note', `pid="5" name="soilcell"><vt:lpwstr>${note}`));
  });
  it("other properties only: the soilcell property is added before </Properties> with the next pid", async () => {
    const existing = `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Properties xmlns="${CUSTOM_NS}" xmlns:vt="${VT_NS}"><property fmtid="${FMTID}" pid="7" name="farm"><vt:lpwstr>Invented Acres</vt:lpwstr></property><property fmtid="${FMTID}" pid="3" name="x"><vt:i4>1</vt:i4></property></Properties>`;
    const pkg = await copyOf(await withParts(SIMPLE, { "docProps/custom.xml": existing }));
    const xml = pkg.text("docProps/custom.xml")!;
    const note = /name="soilcell"><vt:lpwstr>([^<]*)</.exec(xml)![1]!;
    expect(xml).toBe(existing.replace("</Properties>", `<property fmtid="${FMTID}" pid="8" name="soilcell"><vt:lpwstr>${note}</vt:lpwstr></property></Properties>`));
    // the part was there: relationships and content types are not touched
    expect(pkg.text("_rels/.rels")).not.toContain("custom");
  });
  it("a properties part with no property and no pid: the first soilcell property gets pid 2", async () => {
    const existing = `<Properties xmlns="${CUSTOM_NS}" xmlns:vt="${VT_NS}"></Properties>`;
    const pkg = await copyOf(await withParts(SIMPLE, { "docProps/custom.xml": existing }));
    expect(pkg.text("docProps/custom.xml")).toMatch(new RegExp(`^<Properties xmlns="${CUSTOM_NS}" xmlns:vt="${VT_NS}"><property fmtid="\\${FMTID.slice(0, -1)}\\}" pid="2" name="soilcell"><vt:lpwstr>[^<]+</vt:lpwstr></property></Properties>$`));
  });
  it("a properties part without the vt namespace, or without an end tag, is left alone", async () => {
    const noVt = `<Properties xmlns="${CUSTOM_NS}"><property fmtid="${FMTID}" pid="2" name="farm"/></Properties>`;
    expect((await copyOf(await withParts(SIMPLE, { "docProps/custom.xml": noVt }))).text("docProps/custom.xml")).toBe(noVt);
    const selfClosed = `<Properties xmlns="${CUSTOM_NS}" xmlns:vt="${VT_NS}"/>`;
    expect((await copyOf(await withParts(SIMPLE, { "docProps/custom.xml": selfClosed }))).text("docProps/custom.xml")).toBe(selfClosed);
  });
  it("relationships and content types that already name the part are not changed", async () => {
    const base = await openPackage(xlsxBytes(SIMPLE));
    const rels = base.text("_rels/.rels")!.replace("</Relationships>", '<Relationship Id="rId9" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/custom-properties" Target="docProps/custom.xml"/></Relationships>');
    const types = base.text("[Content_Types].xml")!.replace("</Types>", '<Override PartName="/docProps/custom.xml" ContentType="application/vnd.openxmlformats-officedocument.custom-properties+xml"/></Types>');
    const pkg = await copyOf(await withParts(SIMPLE, { "_rels/.rels": rels, "[Content_Types].xml": types }));
    expect(pkg.text("_rels/.rels")).toBe(rels);
    // only the dynamic-array metadata part's own content type is added (the SOIL formula spills)
    expect(pkg.text("[Content_Types].xml")).toBe(types.replace("</Types>", '<Override PartName="/xl/metadata.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheetMetadata+xml"/></Types>'));
    expect(pkg.has("docProps/custom.xml")).toBe(true);
  });
});

describe("which cells a values copy writes as values (behaviour: recalc.ts valuesCopyCells)", () => {
  it("SOIL formulas and the formulas reading their spill (B1#); a plain range over the same cells stays a formula", async () => {
    const spec: BookSpec = {
      sheets: [{ name: "Lab", rows: row(1, c("A1", 400.78), f("B1", 'SOIL.CMOL(A1:A2,"Ca")', 0), f("C1", "SUM(B1#)", 0), f("D1", "SUM(B1:B2)", 0), f("E1", "SUM(C1#)", 0)) + row(2, c("A2", 200.39)) }],
    };
    const r = await recalcBytes(xlsxBytes(spec), "in.xlsx", { valuesCopy: "v.xlsx" });
    const xml = sheetData((await openPackage(r.valuesBytes!)).text(SHEET));
    expect(xml).toBe(
      '<row r="1"><c r="A1"><v>400.78</v></c><c r="B1"><v>1.9999999999999998</v></c><c r="C1"><v>2.9999999999999996</v></c><c r="D1"><f>SUM(B1:B2)</f><v>2.9999999999999996</v></c><c r="E1" t="e"><v>#REF!</v></c></row><row r="2"><c r="A2"><v>200.39</v></c><c r="B2"><v>0.9999999999999999</v></c></row>',
    );
    // E1 reads C1#, and C1 holds no spill: #REF! (Microsoft, "Spilled range operator": a reference to a
    // cell without a dynamic array is #REF!); C1 is a value in the copy, so E1 is written as one too.
  });
  it("a SOIL result that is empty text (a blank lab value) stays empty text in the copy, not a blank cell", async () => {
    // Behaviour (style: never a blank where the result was ""): ISBLANK, COUNTA and ""+"" tell them
    // apart (Microsoft Support, ISBLANK: a cell holding "" is not blank).
    const spec: BookSpec = { sheets: [{ name: "Lab", rows: row(1, f("B1", 'SOIL.CMOL(A1,"Ca")', 0)) }] };
    const r = await recalcBytes(xlsxBytes(spec), "in.xlsx", { valuesCopy: "v.xlsx" });
    const xml = sheetData((await openPackage(r.valuesBytes!)).text(SHEET));
    expect(xml).toBe('<row r="1"><c r="B1" t="inlineStr"><is><t xml:space="preserve"></t></is></c></row>');
  });
});

describe("the calculation chain (ECMA-376 Part 1 §18.6: Excel rebuilds an absent calcChain)", () => {
  const CHAIN_REL = '<Relationship Id="rId9" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/calcChain" Target="calcChain.xml"/>';
  const CHAIN_TYPE = '<Override PartName="/xl/calcChain.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.calcChain+xml"/>';
  const withChain = async (spec: BookSpec) => {
    const base = await openPackage(xlsxBytes(spec));
    return withParts(spec, {
      "xl/calcChain.xml": '<calcChain xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><c r="B1" i="1"/></calcChain>',
      "xl/_rels/workbook.xml.rels": base.text("xl/_rels/workbook.xml.rels")!.replace("</Relationships>", `${CHAIN_REL}</Relationships>`),
      "[Content_Types].xml": base.text("[Content_Types].xml")!.replace("</Types>", `${CHAIN_TYPE}</Types>`),
    });
  };
  it("a SOIL formula typed plain becomes a dynamic array: the chain, its relationship and content type go", async () => {
    const r = await recalcBytes(await withChain(SIMPLE), "in.xlsx");
    const pkg = await openPackage(r.bytes);
    expect(pkg.has("xl/calcChain.xml")).toBe(false);
    expect(pkg.text("xl/_rels/workbook.xml.rels")).not.toContain("calcChain");
    expect(pkg.text("xl/_rels/workbook.xml.rels")).toContain('Target="worksheets/sheet1.xml"/>');
    expect(pkg.text("[Content_Types].xml")).not.toContain("calcChain");
    expect(pkg.text("[Content_Types].xml")).toContain('<Override PartName="/xl/worksheets/sheet1.xml"');
  });
  it("a values copy (a formula becomes a value) drops it too", async () => {
    const spec: BookSpec = { dynamic: true, sheets: [{ name: "Lab", rows: row(1, c("A1", 400.78), da("B1", "B1", '_xldudf_SOIL_CMOL(A1,"Ca")', 2)) }] };
    const r = await recalcBytes(await withChain(spec), "in.xlsx", { valuesCopy: "v.xlsx" });
    expect((await openPackage(r.bytes)).has("xl/calcChain.xml")).toBe(true);
    expect((await openPackage(r.valuesBytes!)).has("xl/calcChain.xml")).toBe(false);
  });
  it("every formula already in its stored form with the same range: the chain stays, byte for byte", async () => {
    const spec: BookSpec = { dynamic: true, sheets: [{ name: "Lab", rows: row(1, c("A1", 400.78), da("B1", "B1", '_xldudf_SOIL_CMOL(A1,"Ca")', 2)) }] };
    const input = await withChain(spec);
    const r = await recalcBytes(input, "in.xlsx");
    const pkg = await openPackage(r.bytes);
    const before = await openPackage(input);
    expect(pkg.text("xl/calcChain.xml")).toBe(before.text("xl/calcChain.xml"));
    expect(pkg.text("xl/_rels/workbook.xml.rels")).toBe(before.text("xl/_rels/workbook.xml.rels"));
    expect(pkg.text("[Content_Types].xml")).toBe(before.text("[Content_Types].xml"));
    expect(sheetData(pkg.text(SHEET))).toBe('<row r="1"><c r="A1"><v>400.78</v></c><c r="B1" cm="1"><f t="array" ref="B1">_xldudf_SOIL_CMOL(A1,&quot;Ca&quot;)</f><v>1.9999999999999998</v></c></row>');
  });
  it("a chain without a content-type override: the part and its relationship go, the content types stay as they were", async () => {
    const base = await openPackage(xlsxBytes(SIMPLE));
    const input = await withParts(SIMPLE, {
      "xl/calcChain.xml": '<calcChain xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><c r="B1" i="1"/></calcChain>',
      "xl/_rels/workbook.xml.rels": base.text("xl/_rels/workbook.xml.rels")!.replace("</Relationships>", `${CHAIN_REL}</Relationships>`),
    });
    const pkg = await openPackage((await recalcBytes(input, "in.xlsx")).bytes);
    expect(pkg.has("xl/calcChain.xml")).toBe(false);
    expect(pkg.text("xl/_rels/workbook.xml.rels")).toBe(base.text("xl/_rels/workbook.xml.rels")!.replace("</Relationships>", '<Relationship Id="rId3" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sheetMetadata" Target="metadata.xml"/></Relationships>'));
    // (rId3: the metadata relationship was numbered while rId1 and rId9 were both taken)
    expect(pkg.text("[Content_Types].xml")).toBe(base.text("[Content_Types].xml")!.replace("</Types>", '<Override PartName="/xl/metadata.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheetMetadata+xml"/></Types>'));
  });
  it("the stored range grows: the chain goes", async () => {
    const spec: BookSpec = { dynamic: true, sheets: [{ name: "Lab", rows: row(1, c("A1", 400.78), da("B1", "B1", '_xldudf_SOIL_CMOL(A1:A2,"Ca")', 2)) + row(2, c("A2", 200.39)) }] };
    const r = await recalcBytes(await withChain(spec), "in.xlsx");
    expect((await openPackage(r.bytes)).has("xl/calcChain.xml")).toBe(false);
  });
});

describe("a spill that shrinks (ECMA-376 §18.3.1.40: ref is the range the array formula fills)", () => {
  it("cells the old range covered and the new result does not are cleared; cells outside it stay", async () => {
    const spec: BookSpec = {
      dynamic: true,
      sheets: [{ name: "Lab", rows: row(1, c("A1", 400.78), da("B1", "B1:B4", '_xldudf_SOIL_CMOL(A1:A2,"Ca")', 2)) + row(2, c("A2", 200.39), c("B2", 1)) + row(3, c("B3", 9)) + row(4, c("B4", 9), c("C4", 5)) }],
    };
    const r = await recalcBytes(xlsxBytes(spec), "in.xlsx");
    expect(sheetData((await openPackage(r.bytes)).text(SHEET))).toBe(
      '<row r="1"><c r="A1"><v>400.78</v></c><c r="B1" cm="1"><f t="array" ref="B1:B2">_xldudf_SOIL_CMOL(A1:A2,&quot;Ca&quot;)</f><v>1.9999999999999998</v></c></row>' +
        '<row r="2"><c r="A2"><v>200.39</v></c><c r="B2"><v>0.9999999999999999</v></c></row><row r="3"><c r="B3"/></row><row r="4"><c r="B4"/><c r="C4"><v>5</v></c></row>',
    );
    expect(r.summary.spilledCells).toBe(1);
  });
  it("a spill that shrinks to one cell clears the rest of its old range", async () => {
    const spec: BookSpec = { dynamic: true, sheets: [{ name: "Lab", rows: row(1, c("A1", 400.78), da("B1", "B1:C1", '_xldudf_SOIL_CMOL(A1,"Ca")', 2), c("C1", 3), c("D1", 4)) }] };
    const r = await recalcBytes(xlsxBytes(spec), "in.xlsx");
    expect(sheetData((await openPackage(r.bytes)).text(SHEET))).toBe(
      '<row r="1"><c r="A1"><v>400.78</v></c><c r="B1" cm="1"><f t="array" ref="B1">_xldudf_SOIL_CMOL(A1,&quot;Ca&quot;)</f><v>1.9999999999999998</v></c><c r="C1"/><c r="D1"><v>4</v></c></row>',
    );
  });
});

describe("writable (ECMA-376 §18.18.21 ST_CellErrorType lists the error codes a cell may hold)", () => {
  it("Excel's codes pass without their message; others become #VALUE!; values pass unchanged", () => {
    for (const code of ["#NULL!", "#DIV/0!", "#VALUE!", "#REF!", "#NAME?", "#NUM!", "#N/A", "#SPILL!", "#CALC!", "#GETTING_DATA"] as const) {
      const w = writable(new XlError(code, "why")) as XlError;
      expect(w).toBeInstanceOf(XlError);
      expect([w.code, w.message]).toEqual([code, ""]);
    }
    for (const code of ["#FIELD!", "#BLOCKED!", "#CONNECT!", "#BUSY!", "#UNKNOWN!", "#PYTHON!"] as const) expect((writable(new XlError(code, "why")) as XlError).code).toBe("#VALUE!");
    expect(writable(2.5)).toBe(2.5);
    expect(writable("text")).toBe("text");
    expect(writable(false)).toBe(false);
    expect(writable(null)).toBeNull();
  });
});

describe("writeAtomically (behaviour: a temporary file beside the target, renamed into place)", () => {
  let dir: string;
  beforeAll(() => {
    dir = tempDir("soilcell-atomic-");
  });
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));
  it("writes the bytes, durable or not, and leaves no temporary file", () => {
    const t = path.join(dir, "a.bin");
    writeAtomically(t, Buffer.from("abc"));
    writeAtomically(path.join(dir, "b.bin"), Buffer.from("de"), { durable: false });
    expect(fs.readFileSync(t, "utf8")).toBe("abc");
    expect(fs.readFileSync(path.join(dir, "b.bin"), "utf8")).toBe("de");
    expect(fs.readdirSync(dir).sort()).toEqual(["a.bin", "b.bin"]);
  });
  it("a folder that does not exist: WorkbookFileError with the system's code", () => {
    const t = path.join(dir, "no", "c.bin");
    expect(() => writeAtomically(t, Buffer.from("x"))).toThrow(WorkbookFileError);
    expect(() => writeAtomically(t, Buffer.from("x"))).toThrow(`cannot write ${t}: ENOENT`);
  });
  it("a target that is a folder: the rename fails, the temporary file is removed", () => {
    const t = path.join(dir, "folder");
    fs.mkdirSync(t);
    fs.writeFileSync(path.join(t, "inside"), "x");
    expect(() => writeAtomically(t, Buffer.from("x"))).toThrow(/^cannot write .*folder: (EISDIR|ENOTEMPTY|EEXIST)$/);
    expect(fs.readdirSync(dir).filter((n) => n.endsWith(".partial"))).toEqual([]);
  });
});
