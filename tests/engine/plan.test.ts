/**
 * The planner (src/engine/plan.ts): which formula cells a recalculation computes and why, the area
 * each is predicted to fill, and the order and levels they are computed in. Each case is a small
 * hand-written workbook (invented contents) and the exact plan: per planned cell its mode, its
 * predicted area, its reason (1 SOIL, 2 depends, 3 no cached value, 4 run-time references,
 * 5 untraceable), "?" when the size is uncertain, "soil" and its level.
 *
 * Expected plans are behaviour: the rule in the header of src/engine/plan.ts and
 * /work/shared/design/architecture.md (SOIL cells and what depends on them are computed, the rest
 * kept; dynamic-array sizes predicted from argument shapes, Excel 365 broadcasting: Microsoft,
 * "Dynamic array formulas and spilled array behavior"). Stored forms: ECMA-376 Part 1 §18.3.1.40
 * (f: t="array" with ref, shared formulas), §18.17.2 (defined names; table structured references).
 */
import { readBook } from "../../src/engine/book";
import { a1, rangeA1 } from "../../src/engine/cellref";
import { planRecalc, PlanOptions, readsSpillOf } from "../../src/engine/plan";
import { SOIL_NAMES, SOIL_SIGNATURES } from "../../src/engine/soil";
import { openPackage } from "../../src/engine/xlsx-package";
import { BookSpec, c, da, f, row, xlsxBytes } from "../helpers/xlsx";

async function bookOf(spec: BookSpec, parts: Record<string, string> = {}) {
  let bytes = xlsxBytes(spec);
  if (Object.keys(parts).length) {
    const pkg = await openPackage(bytes);
    for (const [p, text] of Object.entries(parts)) pkg.write(p, text);
    bytes = pkg.toBuffer();
  }
  return readBook(await openPackage(bytes), SOIL_NAMES);
}

async function planOf(spec: BookSpec, options?: PlanOptions, parts: Record<string, string> = {}) {
  const book = await bookOf(spec, parts);
  const plan = planRecalc(book, SOIL_SIGNATURES, options);
  const cells: Record<string, string> = {};
  const names: string[] = [];
  for (let i = 0; i < plan.n; i++) {
    const a = plan.area(i);
    const name = `${book.sheets[plan.sheet[i]!]!.name}!${a1({ row: a.r1, col: a.c1 })}`;
    names.push(name);
    cells[name] = `${["single", "spill", "fixed"][plan.mode[i]!]} ${rangeA1({ row: a.r1, col: a.c1 }, a.r2 - a.r1 + 1, a.c2 - a.c1 + 1)} r${plan.reason[i]}${plan.uncertain[i] ? " ?" : ""}${plan.soil[i] ? " soil" : ""} L${plan.level[i]}`;
  }
  const order = [...plan.order].map((i) => names[i]);
  return { plan, book, cells, order };
}

const S = (rows: string, extra: Partial<BookSpec> = {}): BookSpec => ({ dynamic: true, sheets: [{ name: "Lab", rows }], ...extra });

describe("predicted sizes of dynamic arrays that read a SOIL spill (B1 = SOIL.CMOL(A1:A3): 3×1)", () => {
  // Each formula is a dynamic array (cm="1") in its own row of column D, reading B1 so it is planned.
  const cases: [string, string][] = [
    ["B1#", "spill D10:D12 r2"],
    ["TRANSPOSE(B1#)", "spill D10:F10 r2"],
    ["ROW(A1:A3)+B1", "spill D10:D12 r2"],
    ["COLUMN(A1:C1)+B1", "spill D10:F10 r2"],
    ["ROW()+B1", "spill D10 r2"],
    ["INDEX(B1#,2)", "spill D10 r2"],
    ["INDEX(B1#,0)", "spill D10:D12 r2"],
    ["INDEX(A1:C3*B1,0)", "spill D10:F12 r2"],
    ["INDEX(A1:C3*B1,2)", "spill D10:F10 r2"],
    ["INDEX(A1:C3*B1,0,2)", "spill D10:D12 r2"],
    ["INDEX(A1:C3*B1,2,0)", "spill D10:F10 r2"],
    ["INDEX(A1:C3*B1,0,0)", "spill D10:F12 r2"],
    ["INDEX(A1:C3*B1,2,3)", "spill D10 r2"],
    ["INDEX(A1:C3*B1,A1)", "spill D10 r2 ?"],
    ["INDEX(A1:C3*B1,1,A1)", "spill D10 r2 ?"],
    ["INDEX(B1,A1)", "spill D10 r2"],
    ["INDEX(A1:C3*B1,{1;2})", "spill D10:D11 r2"],
    ["INDEX(A1:C3*B1,1,{1,2})", "spill D10:E10 r2"],
    ["IF(B1>1,A1:A3,A1:A2)", "spill D10:D12 r2 ?"],
    ["IF(A1:A3>B1,1,2)", "spill D10:D12 r2"],
    ["IF(A1:A2>B1,A1:A3,2)", "spill D10:D12 r2"],
    ["IF(B1>1,A1:A3,A1:A3)", "spill D10:D12 r2 ?"], // the condition, one value, may be an error: one cell
    ["CHOOSE(B1,A1:A3,A1:A2)", "spill D10:D12 r2 ?"],
    ["CHOOSE(A1:A2*B1,A1:A3,A1:A2)", "spill D10:D12 r2 ?"],
    ["IFERROR(A1:A3/B1,)", "spill D10:D12 r2"],
    ["OFFSET(B1,0,0,2)", "spill D10 r4 ?"],
    ["A1:A3+B1", "spill D10:D12 r2"],
    ["$A$1:$A$3+B1", "spill D10:D12 r2"],
    ["A3:A1+B1", "spill D10:D12 r2"],
    ["B1:INDEX(A1:A3,2)", "spill D10 r2 ?"],
    ["(A1:A3,A1:B1)", "spill D10 r2 ?"],
    ["A1:B3 B1:B2", "spill D10 r2 ?"],
    ["calc+B1", "spill D10:D12 r2"],
    ["nothing+B1", "spill D10 r2"],
    ["-A1:A3*B1", "spill D10:D12 r2"],
    ["+A1:A3+B1", "spill D10:D12 r2"],
    ["A1:A3%+B1", "spill D10:D12 r2"],
    ["@A1:A3+B1", "spill D10 r2"],
    ["{1,2;3,4}+B1", "spill D10:E11 r2"],
    ["LEN(A1:A3)&B1", "spill D10:D12 r2"],
    ["SUM(A1:A3*B1)", "spill D10 r2"],
    ["COUNTIF(A1:A3,B1)", "spill D10 r2"],
    ["FOO(A1:A3)+B1", "spill D10 r2"],
    ["Lab!B1#+1", "spill D10:D12 r2"],
    ["Gone!B1#+B1", "spill D10 r2"],
    ["X1#+B1", "spill D10 r2"],
    ["SOIL.BAND(A1:A2,{1,2,3})", "spill D10:D11 r1 soil"],
    ["SOIL.BAND(A1:A2,A1:A3)", "spill D10:D11 r1 soil"],
    ["SOIL.CMOL(E1:G1,)", "spill D10:F10 r1 soil"],
  ];
  it.each(cases)("%s → %s", async (formula, expected) => {
    const p = await planOf(S(row(1, c("A1", 400.78), f("B1", 'SOIL.CMOL(A1:A3,"Ca")', 0)) + row(10, da("D10", "D10", formula, 0)), { names: [{ name: "calc", text: "Lab!$A$1:$A$3" }] }));
    expect(p.cells["Lab!B1"]).toBe("spill B1:B3 r1 soil L0");
    expect(p.cells["Lab!D10"]).toBe(`${expected} L${expected.endsWith("soil") ? 0 : 1}`);
  });

  it("a dynamic array calling a function with too few arguments (TRANSPOSE(), INDEX()) is predicted as one cell, not a crash (found by scripts/oracle/differential.js; behaviour: such a cell is refused when computed)", async () => {
    const p = await planOf(S(row(1, da("D1", "D1", "TRANSPOSE()"), da("E1", "E1", "INDEX()"), da("F1", "F1", "TRANSPOSE(A1:A3,A1)"))));
    expect(p.cells).toEqual({ "Lab!D1": "spill D1 r3 L0", "Lab!E1": "spill E1 r3 L0", "Lab!F1": "spill F1 r3 L0" });
  });

  it("a spill read from a formula that is not recomputed: the range the file records, or one cell", async () => {
    const p = await planOf(S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1,"Ca")', 0), da("G1", "G1:G5", "SEQUENCE(5)", 1), da("H1", "H1", "G1#+B1", 0), da("I1", "I1", "C9#+B1", 0)) + row(9, f("C9", "1", 1))));
    expect(p.cells).toEqual({ "Lab!B1": "spill B1 r1 soil L0", "Lab!H1": "spill H1:H5 r2 L1", "Lab!I1": "spill I1 r2 L1" });
  });

  it("a spill of a spill: the inner prediction is followed, once per anchor", async () => {
    const p = await planOf(S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1:A4,"Ca")', 0), da("C1", "C1", "TRANSPOSE(B1#)", 0)) + row(5, da("D5", "D5", "C1#*2", 0), da("E5", "E5", "TRANSPOSE(C1#)", 0))));
    expect(p.cells).toEqual({ "Lab!B1": "spill B1:B4 r1 soil L0", "Lab!C1": "spill C1:F1 r2 L1", "Lab!D5": "spill D5:G5 r2 L2", "Lab!E5": "spill E5:E8 r2 L2" });
  });

  it("formulas without cached values: a spill read before its anchor is predicted is predicted from the anchor's formula; a loop of spills falls back to the recorded range", async () => {
    const p = await planOf(S(row(1, c("A1", 1), da("D1", "D1", "C5#*2"), da("E1", "E1:E2", "F1#"), da("F1", "F1:H1", "E1#")) + row(5, da("C5", "C5", "TRANSPOSE(A1:A3)"))));
    // D1 reads C5# before C5 is predicted: C5's own formula gives 1×3. E1 and F1 read each other's spill:
    // E1 follows F1's formula back to itself and takes its own recorded E1:E2; a loop, so circular.
    expect(p.cells).toEqual({ "Lab!D1": "spill D1:F1 r3 L1", "Lab!E1": "spill E1:E2 r3 L-1", "Lab!F1": "spill F1:F2 r3 L-1", "Lab!C5": "spill C5:E5 r3 L0" });
  });

  it("a spill past the sheet's last row is cut at row 1,048,576 and marked uncertain (ECMA-376 §18.3.1.73: rows 1…1048576)", async () => {
    const p = await planOf(S(row(1048574, f("B1048574", 'SOIL.CMOL(A1:A5,"Ca")', 0)) + row(1048576, f("C1048576", 'SOIL.CMOL(A1:A1,"Ca")', 0))));
    expect(p.cells).toEqual({ "Lab!B1048574": "spill B1048574:B1048576 r1 ? soil L0", "Lab!C1048576": "spill C1048576 r1 soil L0" });
  });

  it("a spill past column XFD is cut at XFD and uncertain (ECMA-376: 16,384 columns)", async () => {
    const p = await planOf(S(row(1, f("XFC1", 'SOIL.CMOL(A1:C1,"Ca")', 0))));
    expect(p.cells).toEqual({ "Lab!XFC1": "spill XFC1:XFD1 r1 ? soil L0" });
  });

  it("a fixed (CSE) array fills the range its file records; a SOIL one becomes a dynamic array", async () => {
    const p = await planOf(
      S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1,"Ca")', 0), '<c r="C1"><f t="array" ref="C1:C3">B1*{1;2;3}</f><v>0</v></c>', f("D1", "SUM(C2:C3)", 0), '<c r="E1"><f t="array" ref="E1:E2">SOIL.CMOL(A1:A3,"Ca")</f><v>0</v></c>') + row(2, c("C2", 0)) + row(3, c("C3", 0))),
    );
    expect(p.cells).toEqual({ "Lab!B1": "spill B1 r1 soil L0", "Lab!C1": "fixed C1:C3 r2 L1", "Lab!D1": "single D1 r2 L2", "Lab!E1": "spill E1:E3 r1 soil L0" });
    expect(p.plan.areaOwner(0, 2, 2)).toBe(1); // C3 belongs to C1's fixed range
    expect(p.plan.owner(0, 1, 4)).toBe(3); // E2: in E1's spill and in its old range
  });
});

describe("why a cell is computed (reasons)", () => {
  it("without SOIL cells: only a formula with no cached value; run-time references and unreadable formulas keep their values", async () => {
    const p = await planOf(S(row(1, c("A1", 1), f("B1", "OFFSET(A1,0,0)", 1), f("C1", "A1+", 1), f("D1", "A1*2"), f("E1", "A1*3", 3), f("F1", "TODAY()", 1))));
    expect(p.cells).toEqual({ "Lab!D1": "single D1 r3 L0" });
    expect(p.plan.formulaCells).toBe(5);
  });
  it("with a SOIL cell: run-time references (4) and unreadable formulas (5) are computed too", async () => {
    const p = await planOf(S(row(1, c("A1", 1), f("B1", "OFFSET(A1,0,0)", 1), f("C1", "A1+", 1), f("D1", "A1*2"), f("E1", "A1*3", 3), f("F1", 'SOIL.CMOL(A1,"Ca")', 0), f("G1", "TODAY()", 1), f("H1", "INDIRECT(\"A1\")", 1))));
    expect(p.cells).toEqual({
      "Lab!B1": "single B1 r4 L0",
      "Lab!C1": "single C1 r5 L0",
      "Lab!D1": "single D1 r3 L0",
      "Lab!F1": "spill F1 r1 soil L0",
      "Lab!G1": "single G1 r4 L0",
      "Lab!H1": "single H1 r4 L0",
    });
  });
  it("defined names: followed to what they read, their SOIL calls and run-time references; an unreadable name is untraceable", async () => {
    const p = await planOf(
      S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1,"Ca")', 0), f("C1", "caVal*2", 0), f("D1", "Lab!local+1", 0), f("E1", "deep", 0), f("F1", "bad+1", 1), f("G1", "off", 1), f("H1", "viaSoil+1", 0), f("I1", "unknownName+1", 1)), {
        names: [
          { name: "caVal", text: "Lab!$B$1" },
          { name: "local", text: "Lab!$A$1", localSheetId: 0 },
          { name: "deep", text: "caVal" },
          { name: "bad", text: "Lab!A1+" },
          { name: "off", text: "OFFSET(Lab!$A$1,0,0)" },
          { name: "viaSoil", text: 'SOIL.CMOL(Lab!$A$1,"Ca")' },
        ],
      }),
    );
    expect(p.cells).toEqual({
      "Lab!B1": "spill B1 r1 soil L0",
      "Lab!C1": "single C1 r2 L1",
      "Lab!E1": "single E1 r2 L1",
      "Lab!F1": "single F1 r5 L0",
      "Lab!G1": "single G1 r4 L0",
      "Lab!H1": "spill H1 r1 soil L0",
    });
  });
  it("a name scoped to another sheet is not the one read; a sheet-qualified name on a missing sheet reads nothing", async () => {
    const p = await planOf({
      dynamic: true,
      names: [{ name: "ca", text: "Lab!$B$1", localSheetId: 1 }],
      sheets: [
        { name: "Lab", rows: row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1,"Ca")', 0), f("C1", "ca+1", 0), f("D1", "Other!ca+1", 0), f("E1", "Gone!ca+1", 0)) },
        { name: "Other", rows: row(1, f("A1", "ca+1", 0)) },
      ],
    });
    expect(p.cells).toEqual({ "Lab!B1": "spill B1 r1 soil L0", "Lab!D1": "single D1 r2 L1", "Other!A1": "single A1 r2 L1" });
  });
  it("a name whose definition is a SOIL call at depth beyond 32 names is not followed for SOIL, but counts as untraceable", async () => {
    const names = Array.from({ length: 34 }, (_, i) => ({ name: `lvl${i}x`, text: i === 33 ? 'SOIL.CMOL(Lab!$A$1,"Ca")' : `lvl${i + 1}x` }));
    const p = await planOf(S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1,"Ca")', 0), f("C1", "lvl0x", 5), f("D1", "lvl2x", 5)), { names }));
    // D1 reaches the SOIL call after 31 names (followed); C1 would need 33 (not followed): untraceable
    expect(p.cells).toEqual({ "Lab!B1": "spill B1 r1 soil L0", "Lab!C1": "single C1 r5 L0", "Lab!D1": "spill D1 r1 soil L0" });
  });
  it("a report's changed cells with SOIL seeds off: only the readers of the changed cells, SOIL cells that do not read them kept", async () => {
    const p = await planOf(S(row(1, c("A1", 1), f("B1", "A1*2", 2), f("C1", "B1+1", 3), f("D1", 'SOIL.CMOL(A2,"Ca")', 0), f("E1", "D1*2", 0), f("F1", "OFFSET(A2,0,0)", 0))), {
      changed: [{ sheet: 0, rect: { r1: 0, c1: 0, r2: 0, c2: 0 } }],
      soil: false,
    });
    expect(p.cells).toEqual({ "Lab!B1": "single B1 r2 L0", "Lab!C1": "single C1 r2 L1", "Lab!F1": "single F1 r4 L0" });
  });
  it("SOIL seeds off and nothing changed: run-time references are kept, only uncached formulas computed", async () => {
    const p = await planOf(S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1,"Ca")', 0), f("C1", "OFFSET(A1,0,0)", 0), f("D1", "A1+1"))), { soil: false, changed: [] });
    expect(p.cells).toEqual({ "Lab!D1": "single D1 r3 L0" });
  });
});

describe("order, levels and cycles", () => {
  it("a loop through a SOIL cell and a SOIL cell reading itself: circular, level -1, after the rest", async () => {
    const p = await planOf(S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(C1,"Ca")', 0), f("C1", "B1+1", 0), f("D1", "C1+1", 0), f("E1", 'SOIL.CMOL(E1,"Ca")', 0), f("F1", 'SOIL.CMOL(A1,"Ca")', 0), f("G1", "F1*2", 0))));
    expect(p.cells).toEqual({
      "Lab!B1": "spill B1 r1 soil L-1",
      "Lab!C1": "single C1 r2 L-1",
      "Lab!D1": "single D1 r2 L-1",
      "Lab!E1": "spill E1 r1 soil L-1",
      "Lab!F1": "spill F1 r1 soil L0",
      "Lab!G1": "single G1 r2 L1",
    });
    expect(p.order).toEqual(["Lab!F1", "Lab!G1", "Lab!B1", "Lab!C1", "Lab!D1", "Lab!E1"]);
    expect([...p.plan.circular]).toEqual([1, 1, 1, 1, 0, 0]);
  });
  it("a chain of 20 cells, each reading the one below (more than the 12 passes): every cell planned, levels 0…19, then a wide reader", async () => {
    const chain = Array.from({ length: 20 }, (_, i) => row(i + 1, i === 19 ? f("A20", 'SOIL.CMOL(B20,"Ca")', 0) : f(`A${i + 1}`, `A${i + 2}+1`, 0), c(`B${i + 1}`, 1))).join("");
    const p = await planOf(S(chain + row(30, f("C30", "SUM(A1:A100)", 0), f("D30", "SUM(E1:E5)", 0), f("E30", "SUM(A1:B40)", 0), f("F30", "SUM(B1:B100)", 0))));
    const expected: Record<string, string> = {};
    for (let r = 1; r <= 19; r++) expected[`Lab!A${r}`] = `single A${r} r2 L${20 - r}`;
    expected["Lab!A20"] = "spill A20 r1 soil L0";
    expected["Lab!C30"] = "single C30 r2 L20";
    expected["Lab!E30"] = "single E30 r2 L20";
    expect(p.cells).toEqual(expected);
    expect(p.order.slice(0, 3)).toEqual(["Lab!A20", "Lab!A19", "Lab!A18"]);
    expect(p.order.slice(-2).sort()).toEqual(["Lab!C30", "Lab!E30"]);
  });
  it("a chain of 14 across two columns: the index walk marks readers of single cells and of large ranges", async () => {
    // Column A: A14 is SOIL, A13 = A14+1 … ; G1 reads a 100-row range holding A1 (large), H1 reads A1 alone.
    // Only A1 is marked by the index walk (the passes reach A2); G20 reads a 104-cell row range holding
    // A1 (a large read), H20 reads A1 alone, I20 reads a large range with nothing changed in it.
    const chain = Array.from({ length: 14 }, (_, i) => row(i + 1, i === 13 ? f("A14", 'SOIL.CMOL(2,"Ca")', 0) : f(`A${i + 1}`, `A${i + 2}+1`, 0))).join("");
    const p = await planOf(S(chain + row(20, f("G20", "SUM(A1:CZ1)", 0), f("H20", "A1*2", 0), f("I20", "SUM(Z1:Z100)", 0), f("J20", "G20+1", 0))));
    expect(p.cells["Lab!A1"]).toBe("single A1 r2 L13");
    expect(p.cells["Lab!A2"]).toBe("single A2 r2 L12");
    expect(p.cells["Lab!G20"]).toBe("single G20 r2 L14");
    expect(p.cells["Lab!H20"]).toBe("single H20 r2 L14");
    expect(p.cells["Lab!J20"]).toBe("single J20 r2 L15");
    expect(p.cells["Lab!I20"]).toBeUndefined();
    expect(Object.keys(p.cells)).toHaveLength(17);
  });
  it("the index walk and an old range over a million cells: every reader on that sheet is marked (a safe superset), other sheets' are not", async () => {
    // A chain upwards: A7 is SOIL, A8 = A7+1 … A20 = A19+1; A20, marked last by the index walk, is a
    // dynamic array that covered A20:XFD1048576 in the file. K3 reads M5, outside every changed area.
    const chain = Array.from({ length: 14 }, (_, i) => row(i + 7, i === 0 ? f("A7", 'SOIL.CMOL(2,"Ca")', 0) : i === 13 ? da("A20", "A20:XFD1048576", "A19+1", 0) : f(`A${i + 7}`, `A${i + 6}+1`, 0))).join("");
    const p = await planOf({ dynamic: true, sheets: [{ name: "Lab", rows: row(3, f("K3", "M5*2", 0)) + chain }, { name: "Other", rows: row(1, f("A1", "M5*2", 0)) }] });
    expect(p.cells["Lab!A20"]).toBe("spill A20 r2 L13");
    expect(p.cells["Lab!K3"]).toBe("single K3 r2 L0");
    expect(p.cells["Other!A1"]).toBeUndefined();
  });
  it("wide reads: a row range, a whole column and a 700-column range each find the changed cell", async () => {
    const p = await planOf(S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1,"Ca")', 0)) + row(2, f("C2", "SUM(A1:ZZ1)", 0), f("D2", "SUM(B1:B1048576)", 0), f("E2", "SUM(1:1)", 0), f("F2", "SUM(C1:ZZ1)", 0), f("G2", "SUM(A:A)", 0), f("H2", "SUM(B:B)", 0))));
    expect(p.cells).toEqual({ "Lab!B1": "spill B1 r1 soil L0", "Lab!C2": "single C2 r2 L1", "Lab!D2": "single D2 r2 L1", "Lab!E2": "single E2 r2 L1", "Lab!H2": "single H2 r2 L1" });
  });
  it("a wide read over many single-cell producers (more than a quarter of the width): each is an edge", async () => {
    const producers = Array.from({ length: 80 }, (_, i) => f(a1({ row: 0, col: i + 1 }), `SOIL.CMOL(${i},"Ca")`, 0)).join("");
    const p = await planOf(S(row(1, c("A1", 1), producers) + row(2, f("A2", "SUM(A1:CZ1)", 0))));
    expect(p.cells["Lab!A2"]).toBe("single A2 r2 L1");
    expect(p.order[p.order.length - 1]).toBe("Lab!A2");
  });
  it("a reader of a spill's area (not its anchor) comes after the spill", async () => {
    const p = await planOf(S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1:A3,"Ca")', 0), f("E1", "B3*2", 0), f("F1", "SUM(C1:C3)", 0)) + row(3, c("A3", 3))));
    expect(p.cells).toEqual({ "Lab!B1": "spill B1:B3 r1 soil L0", "Lab!E1": "single E1 r2 L1" });
    expect(p.order).toEqual(["Lab!B1", "Lab!E1"]);
  });
  it("a reader of the range a dynamic array covered in the file (its old range) depends on it", async () => {
    const p = await planOf(S(row(1, c("A1", 1), da("B1", "B1:B5", '_xldudf_SOIL_CMOL(A1:A2,"Ca")', 0), f("C1", "B5*2", 0), f("D1", "B6*2", 0))));
    expect(p.cells).toEqual({ "Lab!B1": "spill B1:B2 r1 soil L0", "Lab!C1": "single C1 r2 L1" });
  });
});

describe("plan lookups: at, owner, areaOwner, area", () => {
  it("by position, on and off the planned cells and sheets", async () => {
    const p = await planOf(S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1:A3,"Ca")', 0), f("C1", "B1*2", 0)) + row(2, c("B2", 0))));
    const { plan } = p;
    expect(plan.at(0, 0, 1)).toBe(0);
    expect(plan.at(0, 0, 2)).toBe(1);
    expect(plan.at(0, 0, 0)).toBe(-1); // A1 is a value
    expect(plan.at(0, 5, 5)).toBe(-1); // no cell
    expect(plan.at(3, 0, 1)).toBe(-1); // no such sheet
    expect(plan.owner(0, 1, 1)).toBe(0); // B2, in B1's spill (a cell the file has)
    expect(plan.owner(0, 2, 1)).toBe(0); // B3, in the spill (no cell in the file)
    expect(plan.owner(0, 3, 1)).toBe(-1);
    expect(plan.owner(0, 0, 2)).toBe(1);
    expect(plan.owner(2, 0, 0)).toBe(-1);
    expect(plan.areaOwner(0, 2, 1)).toBe(0);
    expect(plan.areaOwner(0, 0, 2)).toBe(-1); // a single cell owns no area
    expect(plan.areaOwner(1, 0, 0)).toBe(-1);
    expect(plan.area(0)).toEqual({ r1: 0, c1: 1, r2: 2, c2: 1 });
  });
});

describe("structured references (ECMA-376 §18.5 tables: a reference reads within its table's area)", () => {
  const TABLE_REL = '<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/table" Target="../tables/table1.xml"/></Relationships>';
  const table = (ref: string) => `<?xml version="1.0" encoding="UTF-8"?><table xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" id="1" name="Samples" displayName="SamplesShown" ref="${ref}"><tableColumns count="2"><tableColumn id="1" name="Ca"/><tableColumn id="2" name="cmol"/></tableColumns></table>`;
  const spec = S(row(1, c("A1", "Ca"), c("B1", "cmol")) + row(2, c("A2", 400.78), f("B2", 'SOIL.CMOL(A2,"Ca")', 0), f("D2", "SUM(Samples[cmol])", 0), f("E2", "SUM(SamplesShown[cmol])", 0), f("F2", "SUM(Other[cmol])", 0)));
  it("a table holding the SOIL cell: its readers (by name or display name) are planned; an unknown table is untraceable", async () => {
    const p = await planOf(spec, undefined, { "xl/worksheets/_rels/sheet1.xml.rels": TABLE_REL, "xl/tables/table1.xml": table("A1:B2") });
    expect(p.cells).toEqual({ "Lab!B2": "spill B2 r1 soil L0", "Lab!D2": "single D2 r2 L1", "Lab!E2": "single E2 r2 L1", "Lab!F2": "single F2 r5 L0" });
  });
  it("a table away from the SOIL cell: its readers keep their values", async () => {
    const p = await planOf(spec, undefined, { "xl/worksheets/_rels/sheet1.xml.rels": TABLE_REL, "xl/tables/table1.xml": table("G1:H2") });
    expect(p.cells).toEqual({ "Lab!B2": "spill B2 r1 soil L0", "Lab!F2": "single F2 r5 L0" });
  });
  it("a table part that cannot be read is left out: every structured reference to it is untraceable", async () => {
    const p = await planOf(spec, undefined, { "xl/worksheets/_rels/sheet1.xml.rels": TABLE_REL, "xl/tables/table1.xml": "<table name='Samples' ref='A1:B2'" });
    expect(p.cells).toEqual({ "Lab!B2": "spill B2 r1 soil L0", "Lab!D2": "single D2 r5 L0", "Lab!E2": "single E2 r5 L0", "Lab!F2": "single F2 r5 L0" });
  });
});

describe("readsSpillOf (what a values copy must turn into values)", () => {
  it("through a spill operator, a name, or over something that is not a reference", async () => {
    const book = await bookOf(
      S(row(1, c("A1", 1), f("B1", 'SOIL.CMOL(A1:A2,"Ca")', 0), f("C1", "SUM(B1#)", 0), f("D1", "SUM(sp)", 0), f("E1", "SUM(INDEX(B1:B2,1)#)", 0), f("F1", "SUM(B1:B2)", 0), f("G1", "SUM(Gone!B1#)", 0), f("H1", "SUM(Other!sp)", 0)), {
        names: [{ name: "sp", text: "Lab!$B$1#" }],
      }),
    );
    const sheet = book.sheets[0]!;
    const isB1 = (s: number, r: number, col: number) => s === 0 && r === 0 && col === 1;
    const reads = (col: number) => readsSpillOf(book, sheet.formulas.node[sheet.cells.formula[sheet.cells.find(0, col)]!]!, 0, 0, col, isB1);
    expect([2, 3, 4, 5, 6, 7].map(reads)).toEqual([true, true, true, false, false, false]);
  });
});

describe("a workbook saved with manual calculation (calcPr calcMode=\"manual\", ECMA-376 Part 1 calcPr; behaviour)", () => {
  // A2 (pH) was edited after the last recalculation: C2 caches "Apply lime" that A2 no longer gives.
  const rows = row(2, c("A2", 6.0), f("B2", 'SOIL.CMOL(A2,"Ca")', 0), f("C2", 'IF(A2<5.5,"Apply lime","No lime")', 1), f("D2", 'IF(C2="Apply lime",B2*4,0)', 1)) + row(3, f("E3", "A2*2", 1));
  const withCalc = (calcPr: string) => ({ "xl/workbook.xml": `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><sheets><sheet name="Lab" sheetId="1" r:id="rId1"/></sheets>${calcPr}</workbook>` });
  it("plans every formula, so no stale cached value feeds a recomputed cell (a consultant-style workbook run: D2 spread a lime rate from a stale \"Apply lime\"; Excel computes every formula on F9)", async () => {
    const p = await planOf(S(rows), undefined, withCalc('<calcPr calcId="191029" calcMode="manual"/>'));
    expect(Object.keys(p.cells).sort()).toEqual(["Lab!B2", "Lab!C2", "Lab!D2", "Lab!E3"]);
    expect(p.cells["Lab!C2"]).toBe("single C2 r2 L0");
  });
  it("with automatic calculation (stated or by default) only the SOIL cells and their dependents are planned", async () => {
    for (const calcPr of ['<calcPr calcId="191029" calcMode="auto"/>', '<calcPr calcId="191029"/>', ""]) {
      const p = await planOf(S(rows), undefined, withCalc(calcPr));
      expect(Object.keys(p.cells).sort()).toEqual(["Lab!B2", "Lab!D2"]);
    }
  });
});

describe("what reads a formula saved without a cached value is computed too", () => {
  it("A2 has no cached value, so C2 = A2+1 and D2 = SUM(A2:A3), which cache what A2 gave before, are planned (found by a consultant-style workbook run: recalc computed A2 as 10 and kept C2's 999; behaviour: Excel computes a formula's readers from its new value)", async () => {
    const rows = row(1, c("A1", 400.78), f("B1", 'SOIL.CMOL(A1,"Ca")', 2)) + row(2, f("A2", "B2*2"), c("B2", 5), f("C2", "A2+1", 999), f("D2", "SUM(A2:A3)", 999), f("E2", "B2+1", 6));
    const p = await planOf(S(rows));
    expect(p.cells).toEqual({ "Lab!B1": "spill B1 r1 soil L0", "Lab!A2": "single A2 r3 L0", "Lab!C2": "single C2 r2 L1", "Lab!D2": "single D2 r2 L1" });
    // without any SOIL formula too
    const q = await planOf(S(row(2, f("A2", "B2*2"), c("B2", 5), f("C2", "A2+1", 999), f("E2", "B2+1", 6))));
    expect(q.cells).toEqual({ "Lab!A2": "single A2 r3 L0", "Lab!C2": "single C2 r2 L1" });
  });
});
