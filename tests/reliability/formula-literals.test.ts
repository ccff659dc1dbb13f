/**
 * Excel's literals the engine's parser does not read are rewritten for it (found by the fuzzer:
 * Excel saves exponents upper-case, e.g. 1E-05; TRUE and FALSE are literals; "" escapes a quote in
 * a string), and recalc writes the file's own formula text back, not the rewritten one.
 * Source of the stored forms: Excel's formula grammar as documented (MS-XLSX formulas), from
 * memory; workbook contents are invented. The engine reads a backslash in a string as an escape: found by the parity fuzzer.
 */
import path from "path";
import { evaluateFormula } from "../../src/engine/evaluate";
import { toEngineFormula } from "../../src/engine/formula-text";
import { recalcWorkbook } from "../../src/engine/recalc";
import { readPart, tempDir, writeWorkbook } from "../helpers/workbook";

describe("Excel literals the engine reads", () => {
  it.each([
    ["1E-05*2", "1e-05*2"],
    ["1.5E+3+A1", "1.5e+3+A1"],
    [".5E2", ".5e2"],
    ["IF(A1,TRUE,FALSE)", "IF(A1,TRUE(),FALSE())"],
    ["{TRUE,1;FALSE,2}", "{TRUE(),1;FALSE(),2}"],
    ['"say ""hi"""&A1', '("say "&CHAR(34)&"hi"&CHAR(34)&"")&A1'],
    ['"C:\\data"&A1', '("C:"&CHAR(92)&"data")&A1'],
  ])("%s → %s", (excel, engine) => {
    expect(toEngineFormula(excel)).toBe(engine);
  });

  it.each([
    ["references and names that only look like literals", "AE15+E5+Sheet1E5!A1+TRUE()+x1E5"],
    ["text in strings and sheet names", `"1E5 TRUE"&'TRUE sheet 1E5'!A1&'O''Brien'!B2`],
    ["our stored names", '_xldudf_SOIL_CMOL(A1,"Ca")'.replace("_xldudf_SOIL_CMOL", "SOIL.CMOL")],
  ])("leaves %s alone", (_, formula) => {
    expect(toEngineFormula(formula)).toBe(formula);
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
