/**
 * The engine reads Excel's literals as Excel writes them (found by the fuzzer against an earlier
 * engine: Excel saves exponents upper-case, e.g. 1E-05; TRUE and FALSE are literals; "" escapes a
 * quote in a string; a backslash is itself), and recalc writes the file's own formula text back.
 * Source of the stored forms: Excel's formula grammar as documented (MS-XLSX formulas), from
 * memory; workbook contents are invented.
 */
import path from "path";
import { evaluateFormula } from "../../src/engine/evaluate";
import { recalcWorkbook } from "../../src/engine/recalc";
import { readPart, tempDir, writeWorkbook } from "../helpers/workbook";

describe("Excel literals the engine reads", () => {
  it.each([
    ["=1E-05*2", 2e-5],
    ["=1.5E+3+1", 1501],
    ["=.5E2", 50],
    ["=IF(TRUE,1,2)", 1],
    ["=SUM({TRUE,1;FALSE,2})", 3],
    ['=LEN("say ""hi""")', 8],
    ['=LEN("C:\\data")', 7],
  ])("%s", (formula, want) => {
    expect(evaluateFormula(formula).value).toBeCloseTo(want as number, 12);
  });

  it.each([
    ["a name that only looks like an exponent is a name (eval has no workbook to define it)", "=x1E5", "#REF!"],
    ["a cell reference is not a literal", "=AE15", "#REF!"],
  ])("%s", (_, formula, code) => {
    expect(evaluateFormula(formula).error).toBe(code);
  });

  it.each([
    ['=SOIL.CMOL(2.0039E+3,"Ca")', 10], // Source: IUPAC/CIAAW atomic weights, 200.39 mg/kg per cmol(+)/kg
    ["=IF(TRUE,1,2)", 1],
    ['=LEN("a""b")', 3],
    ['=LEN("\\")', 1],
  ])("%s evaluates", (formula, want) => {
    expect(evaluateFormula(formula).value).toBeCloseTo(want, 9);
  });
});

describe("recalc keeps the file's own formula text", () => {
  it("writes 1E-05, TRUE and \"\" back as the file had them", async () => {
    const dir = tempDir();
    const input = await writeWorkbook(path.join(dir, "lit.xlsx"), (wb) => {
      const ws = wb.addWorksheet("S");
      ws.getCell("A1").value = 400.78;
      ws.getCell("B1").value = { formula: 'SOIL.CMOL(A1*1E+0,IF(TRUE,"Ca","Mg"))' } as never;
      ws.getCell("C1").value = { formula: 'IF(TRUE,"say ""hi""","")' } as never;
    });
    const out = path.join(dir, "out.xlsx");
    const s = await recalcWorkbook(input, out);
    expect(s.errors).toEqual([]);
    const xml = (await readPart(out, "xl/worksheets/sheet1.xml"))!;
    expect(xml).toContain('<f t="array" ref="B1">_xldudf_SOIL_CMOL(A1*1E+0,IF(TRUE,&quot;Ca&quot;,&quot;Mg&quot;))</f><v>1.9999999999999998</v>');
    expect(xml).toMatch(/<c r="C1"[^>]*t="str"><f>IF\(TRUE,&quot;say &quot;&quot;hi&quot;&quot;&quot;,&quot;&quot;\)<\/f><v>say &quot;hi&quot;<\/v>/);
  });
});
