/**
 * The headless engine computes what Excel 365 computes, or a visible error: the cases found on
 * real and hand-made workbooks (issues on silent wrong numbers and on real client workbooks),
 * each reproduced here in its exact stored form. Expected values: Excel 365's documented
 * semantics (dynamic arrays, implicit intersection of legacy formulas, text stays text), from
 * memory of Microsoft's function reference; the native ones are also checked against LibreOffice
 * in tests/engine/oracle.test.ts. SOIL values from core (Source: IUPAC/CIAAW atomic weights:
 * 200.39 mg/kg Ca per cmol(+)/kg; kg/ha = mg/kg × depth cm × bulk density × 0.1). Contents invented.
 */
import { formFactor } from "../../src/core/chemistry";
import { c, da, f, recalcSpec, row } from "../helpers/xlsx";

const CA = 200.39; // mg/kg Ca per cmol(+)/kg (derived from IUPAC atomic weights)

describe("array arithmetic and spills (Excel 365 dynamic arrays)", () => {
  it("SUM over an array expression, SUMPRODUCT over a range expression, in formulas that read SOIL cells", async () => {
    const { values, summary } = await recalcSpec({
      dynamic: true,
      sheets: [
        {
          name: "S",
          rows: [
            row(1, c("A1", 400.78), f("B1", '_xldudf_SOIL_CMOL(A1,"Ca")', 0)),
            row(2, c("A2", 1), f("C2", "SUM({10;20;30}*B1)", 0), f("D2", "SUMPRODUCT(A2:A4*B1)", 0)),
            row(3, c("A3", 2)),
            row(4, c("A4", 3)),
          ].join(""),
        },
      ],
    });
    expect(summary.errors).toEqual([]);
    expect(values.get("S!C2")).toBeCloseTo(120, 12);
    expect(values.get("S!D2")).toBeCloseTo(12, 12);
  });

  it("a SOIL function over an array expression spills element by element", async () => {
    const { values, summary } = await recalcSpec({
      dynamic: true,
      sheets: [{ name: "S", rows: [row(2, c("A2", 5), da("B2", "B2", '_xldudf_SOIL_CONVERT(A2:A4*2,"mg/kg","kg/ha",15,1.3)', 0)), row(3, c("A3", 10)), row(4, c("A4", 20))].join("") }],
    });
    expect(summary.errors).toEqual([]);
    expect(values.get("S!B2")).toBeCloseTo(19.5, 12);
    expect(values.get("S!B3")).toBeCloseTo(39, 12);
    expect(values.get("S!B4")).toBeCloseTo(78, 12);
  });

  it("IF(ISNUMBER(range), range, 0) passed to a SOIL function is taken element by element", async () => {
    const { values } = await recalcSpec({
      dynamic: true,
      sheets: [{ name: "S", rows: [row(2, c("E2", 400.78), da("F2", "F2", '_xldudf_SOIL_CMOL(IF(ISNUMBER(E2:E4),E2:E4,0),"Ca")')), row(3, c("E3", "n.d.")), row(4, c("E4", 200.39))].join("") }],
    });
    expect(values.get("S!F2")).toBeCloseTo(2, 12);
    expect(values.get("S!F3")).toBe(0);
    expect(values.get("S!F4")).toBeCloseTo(1, 12);
  });

  it("the spill operator B1# (stored as _xlfn.ANCHORARRAY) reads the recomputed SOIL spill", async () => {
    const { values, summary } = await recalcSpec({
      dynamic: true,
      sheets: [
        {
          name: "S",
          rows: [
            row(1, c("A1", 400.78), da("B1", "B1:B2", '_xldudf_SOIL_CMOL(A1:A2,"Ca")', 0), f("C1", "SUM(_xlfn.ANCHORARRAY(B1))", 0), da("D1", "D1:D2", "_xlfn.ANCHORARRAY(B1)*2", 0)),
            row(2, c("A2", 601.17), c("B2", 0), c("D2", 0)),
          ].join(""),
        },
      ],
    });
    expect(summary.errors).toEqual([]);
    expect(values.get("S!B2")).toBeCloseTo(601.17 / CA, 12);
    expect(values.get("S!C1")).toBeCloseTo(5, 12);
    expect(values.get("S!D1")).toBeCloseTo(4, 12);
    expect(values.get("S!D2")).toBeCloseTo(6, 12);
  });

  it("a plain reference to a range spills when dynamic, and is implicitly intersected when legacy", async () => {
    const { values } = await recalcSpec({
      dynamic: true,
      sheets: [
        { name: "Results", rows: [row(7, c("A7", 400.78), f("B7", '_xldudf_SOIL_CMOL(A7:A9,"Ca")', 0)), row(8, c("A8", 200.39)), row(9, c("A9", 601.17))].join("") },
        { name: "R", rows: [row(1, da("A1", "A1", "Results!B7:B9")), row(8, f("C8", "Results!B7:B9+0"))].join("") },
      ],
    });
    // Results!B7 is a legacy (plain) SOIL formula typed without the add-in: written as a dynamic array, it spills.
    expect(values.get("Results!B8")).toBeCloseTo(1, 12);
    expect(values.get("R!A1")).toBeCloseTo(2, 12);
    expect(values.get("R!A3")).toBeCloseTo(3, 12);
    // C8 is a legacy formula in row 8: Results!B7:B9 intersects to B8.
    expect(values.get("R!C8")).toBeCloseTo(1, 12);
  });

  it("an error in the first element of a spill stays in that element; the rest compute; every errored cell is listed", async () => {
    const { values, summary } = await recalcSpec({
      dynamic: true,
      sheets: [{ name: "S", rows: row(1, da("A1", "A1", '_xldudf_SOIL_CMOL({"<0.05";400.78;"x"},"Ca")')) }],
    });
    expect(values.get("S!A1")).toBe("#VALUE!");
    expect(values.get("S!A2")).toBeCloseTo(2, 12);
    expect(values.get("S!A3")).toBe("#VALUE!");
    expect(summary.errors.map((e) => e.cell)).toEqual(["A1", "A3"]);
    expect(summary.errors[0]!.message).toMatch(/<0\.05/);
  });

  it("a spill into occupied cells is #SPILL! with the blocking cell named, and the blocking value kept", async () => {
    const { values, summary } = await recalcSpec({
      dynamic: true,
      sheets: [{ name: "S", rows: [row(1, da("A1", "A1", '_xldudf_SOIL_CMOL({400.78;200.39},"Ca")')), row(2, c("A2", "typed by hand"))].join("") }],
    });
    expect(values.get("S!A1")).toBe("#SPILL!");
    expect(values.get("S!A2")).toBe("typed by hand");
    expect(summary.errors[0]!.message).toMatch(/A2/);
  });

  it("a spill through merged cells is #SPILL!", async () => {
    const { values } = await recalcSpec({
      dynamic: true,
      sheets: [{ name: "S", rows: row(1, da("A1", "A1", '_xldudf_SOIL_CMOL({400.78;200.39;601.17},"Ca")')), after: '<mergeCells count="1"><mergeCell ref="A3:B3"/></mergeCells>' }],
    });
    expect(values.get("S!A1")).toBe("#SPILL!");
  });
});

describe("real client workbooks", () => {
  it("shared formulas shift references, never text in strings (NH3 stays NH3), and stay shared", async () => {
    const rows = [1, 2, 3].map((r) =>
      row(r, c(`A${r}`, 10 * r), r === 1 ? `<c r="B1"><f t="shared" ref="B1:B3" si="0">_xldudf_SOIL_OXIDE(A1,"N","NH3")&amp;"|SIKORA-OR2025|mg/DM3"</f><v>0</v></c>` : `<c r="B${r}"><f t="shared" si="0"/><v>0</v></c>`),
    );
    const { values, output } = await recalcSpec({ sheets: [{ name: "S", rows: rows.join("") }] });
    const k = formFactor("N", "NH3");
    for (const r of [1, 2, 3]) {
      const [n, s1, s2] = String(values.get(`S!B${r}`)).split("|");
      expect(Number(n)).toBeCloseTo(10 * r * k, 10);
      expect([s1, s2]).toEqual(["SIKORA-OR2025", "mg/DM3"]);
    }
    const xml = (await (await import("../helpers/workbook")).readPart(output, "xl/worksheets/sheet1.xml"))!;
    expect(xml).toContain('<f t="shared" si="0"/>');
  });

  it("defined names: a constant, an expression, a range on a sheet whose name has spaces, sheet-scoped names of the same name", async () => {
    const { values, summary } = await recalcSpec({
      names: [
        { name: "Depth", text: "15" },
        { name: "Density", text: "Params!$A$2/10" },
        { name: "LabCa", text: "'Lab data (2025) é'!$A$1" },
        { name: "Target", text: "S!$D$1", localSheetId: 0 },
        { name: "Target", text: "T!$D$1", localSheetId: 2 },
      ],
      sheets: [
        { name: "S", rows: row(1, f("A1", '_xldudf_SOIL_CONVERT(10,"mg/kg","kg/ha",Depth,Density)', 0), f("B1", '_xldudf_SOIL_CMOL(LabCa,"Ca")', 0), f("C1", "Target*B1", 0), c("D1", 2)) },
        { name: "Params", rows: row(2, c("A2", 13)) },
        { name: "T", rows: row(1, f("C1", "Target*S!B1", 0), c("D1", 3)) },
        { name: "Lab data (2025) é", rows: row(1, c("A1", 400.78)) },
      ],
    });
    expect(summary.errors).toEqual([]);
    expect(values.get("S!A1")).toBeCloseTo(19.5, 12);
    expect(values.get("S!B1")).toBeCloseTo(2, 12);
    expect(values.get("S!C1")).toBeCloseTo(4, 12);
    expect(values.get("T!C1")).toBeCloseTo(6, 12);
  });

  it("the 1904 date system: DATE and YEAR in a SOIL-dependent cell use the workbook's own epoch", async () => {
    const { values } = await recalcSpec({
      date1904: true,
      sheets: [{ name: "S", rows: row(1, c("A1", 400.78), f("B1", '_xldudf_SOIL_CMOL(A1,"Ca")', 0), f("C1", "DATE(2025,1,1)+B1", 0), f("D1", "YEAR(C1)", 0)) }],
    });
    // 1904 system: serial 0 is 1 January 1904; 2025-01-01 is 44196 days later (Microsoft, "Date systems in Excel").
    expect(values.get("S!C1")).toBeCloseTo(44196 + 2, 12);
    expect(values.get("S!D1")).toBe(2025);
  });

  it("text in a cell stays text: not counted by SUM/COUNT, ISTEXT is TRUE, and a SOIL argument refuses it", async () => {
    const { values } = await recalcSpec({
      sheets: [
        {
          name: "S",
          rows: [
            row(1, c("A1", "12.5"), c("B1", 400.78), f("C1", '_xldudf_SOIL_CMOL(B1,"Ca")', 0)),
            row(2, c("A2", "50%"), f("C2", "SUM(A1:A3)+C1", 0), f("D2", "COUNT(A1:A3)+C1", 0), f("E2", "ISTEXT(A1)=(C1>0)", 0)),
            row(3, c("A3", 7), f("C3", '_xldudf_SOIL_CMOL(A2,"Ca")', 0)),
          ].join(""),
        },
      ],
    });
    expect(values.get("S!C2")).toBeCloseTo(9, 12);
    expect(values.get("S!D2")).toBeCloseTo(3, 12);
    expect(values.get("S!E2")).toBe(true);
    expect(values.get("S!C3")).toBe("#VALUE!");
  });

  it("INT rounds down, a reference to an empty cell is 0, and the cached values of cells that do not read SOIL cells are kept", async () => {
    const { values, summary } = await recalcSpec({
      sheets: [
        {
          name: "S",
          rows: [
            row(1, c("A1", 400.78), f("B1", '_xldudf_SOIL_CMOL(A1,"Ca")', 0), f("C1", "INT(-2.5)+B1", 0), f("D1", "A20+B1", 99)),
            row(2, f("A2", "DATE(1900,1,1)", 777), f("B2", "INT(-2.5)", 42)),
          ].join(""),
        },
      ],
    });
    expect(values.get("S!C1")).toBeCloseTo(-1, 12);
    expect(values.get("S!D1")).toBeCloseTo(2, 12);
    // Not reading a SOIL cell: the file's own cached values, untouched, whatever they are.
    expect(values.get("S!A2")).toBe(777);
    expect(values.get("S!B2")).toBe(42);
    expect(summary.keptCells).toBe(2);
  });

  it("legacy array (CSE) formulas fill their fixed range", async () => {
    const { values } = await recalcSpec({
      sheets: [
        {
          name: "S",
          rows: [
            row(1, c("A1", 1), f("B1", "A1:A3*2", undefined, ' t="array" ref="B1:B3"'), f("C1", "SUM(A1:A3*A1:A3)", undefined, ' t="array" ref="C1"'), f("D1", "5", undefined, ' t="array" ref="D1:D2"')),
            row(2, c("A2", 2)),
            row(3, c("A3", 3)),
          ].join(""),
        },
      ],
    });
    expect([values.get("S!B1"), values.get("S!B2"), values.get("S!B3")]).toEqual([2, 4, 6]);
    expect(values.get("S!C1")).toBe(14);
    expect([values.get("S!D1"), values.get("S!D2")]).toEqual([5, 5]);
  });

  it("sheets named like the namespace are references, not function calls", async () => {
    const { values, summary } = await recalcSpec({
      sheets: [
        { name: "S", rows: row(1, f("A1", "'Soil.Band (2025)'!A1*2", 0), f("B1", '_xldudf_SOIL_CMOL(Soil.Data!A1,"Ca")', 0)) },
        { name: "Soil.Band (2025)", rows: row(1, c("A1", 21)) },
        { name: "Soil.Data", rows: row(1, c("A1", 400.78)) },
      ],
    });
    expect(summary.errors).toEqual([]);
    expect(values.get("S!A1")).toBe(0); // kept: it reads no SOIL cell
    expect(values.get("S!B1")).toBeCloseTo(2, 12);
  });

  it("markup hidden in an XML comment or CDATA inside a cell never becomes a formula", async () => {
    const hidden = '<!--</c><c r="B1"><f>HYPERLINK("http://example.invalid","x")</f><v>1</v></c>-->';
    const { values, output } = await recalcSpec({
      sheets: [{ name: "S", rows: row(1, `<c r="A1">${hidden}<v>400.78</v></c>`, f("C1", '_xldudf_SOIL_CMOL(A1,"Ca")', 0)) }],
    });
    expect(values.get("S!A1")).toBe(400.78);
    expect(values.has("S!B1")).toBe(false);
    expect(values.get("S!C1")).toBeCloseTo(2, 12);
    const xml = (await (await import("../helpers/workbook")).readPart(output, "xl/worksheets/sheet1.xml"))!;
    expect(xml).toContain(hidden); // kept exactly, still a comment
  });

  it("a native cell the engine cannot compute that reads a SOIL cell is an error with a message, never its stale value", async () => {
    const { values, summary } = await recalcSpec({
      sheets: [{ name: "S", rows: row(1, c("A1", 400.78), f("B1", '_xldudf_SOIL_CMOL(A1,"Ca")', 0), f("C1", 'TEXT(B1,"0.0")', "stale")) }],
    });
    expect(values.get("S!C1")).toBe("#VALUE!");
    expect(summary.errors).toEqual([expect.objectContaining({ cell: "C1", message: expect.stringMatching(/TEXT.*not computed headless/) })]);
  });

  it("a formula of 1,159 terms (3,476 characters) is read and computed", async () => {
    const terms = Array.from({ length: 1159 }, (_, i) => `B${(i % 3) + 1}`).join("+");
    const { values } = await recalcSpec({
      sheets: [{ name: "S", rows: [row(1, c("A1", 400.78), f("B1", '_xldudf_SOIL_CMOL(A1,"Ca")', 0), f("C1", terms, 0)), row(2, c("B2", 1)), row(3, c("B3", 1))].join("") }],
    });
    expect(values.get("S!C1")).toBeCloseTo(387 * 2 + 386 + 386, 9);
  });
});
