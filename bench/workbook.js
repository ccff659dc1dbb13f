/**
 * Synthetic season workbooks for the benchmark: one sheet, a header row, one row per sample with
 * a demo-like column layout and 12 SOIL formula cells per sample. All lab values are invented
 * (a seeded random generator, so every run sees the same file).
 *
 * Layout: A sample id, B Ca, C Mg, D K, E Na (mg/kg, written as the unit argument of every cation
 * formula), F acidity (cmol(+)/kg), G pH, H buffer pH,
 * I P (mg/kg); J… the formulas below. The same formulas are also written out as native
 * arithmetic (the CEC divisors come from core's equivalent weights, not typed in), for the
 * comparison of SOIL cells against native cells in the same engine.
 */
"use strict";
const fs = require("fs");
const path = require("path");
const JSZip = require("jszip");

// SOILCELL_BENCH_BUILD points at another compiled tree (a what-if copy) to measure instead of build/.
const BUILD = process.env.SOILCELL_BENCH_BUILD ? path.resolve(process.env.SOILCELL_BENCH_BUILD, "src") : path.join(__dirname, "..", "build", "src");
const { mgPerCmol, formFactor } = require(path.join(BUILD, "core", "chemistry.js"));
const { toStoredFormula } = require(path.join(BUILD, "engine", "formula-text.js"));
const { columnLetters: colLetters } = require(path.join(BUILD, "engine", "cellref.js"));

const DATA_COLUMNS = ["Sample", "Ca mg/kg", "Mg mg/kg", "K mg/kg", "Na mg/kg", "Acidity cmol(+)/kg", "pH", "Buffer pH", "P mg/kg"];
const FIRST_FORMULA_COL = DATA_COLUMNS.length; // J

// Equivalent weights and factors from core, so the native formulas compute the same thing.
const EQ = { Ca: mgPerCmol("Ca"), Mg: mgPerCmol("Mg"), K: mgPerCmol("K"), Na: mgPerCmol("Na") };
const P2O5 = formFactor("P", "P2O5");
const cCa = `@B/${EQ.Ca}`;
const cMg = `@C/${EQ.Mg}`;
const cK = `@D/${EQ.K}`;
const cNa = `@E/${EQ.Na}`;
const BASES = `(${cCa}+${cMg}+${cK}+${cNa})`;
const SUM = `(${cCa}+${cMg}+${cK}+${cNa}+@F)`;

/**
 * The formula columns: `soil` and `native` are templates in which @X stands for column X of the
 * same row (or, for a spilling formula, the whole column range).
 */
const FORMULAS = [
  { header: "CEC", soil: 'SOIL.CEC(@B,@C,@D,@E,"mg/kg",@F)', native: `${cCa}+${cMg}+${cK}+${cNa}+@F` },
  { header: "Ca sat %", soil: 'SOIL.SATURATION("Ca",@B,@C,@D,@E,"mg/kg",@F)', native: `100*(${cCa})/${SUM}` },
  { header: "Mg sat %", soil: 'SOIL.SATURATION("Mg",@B,@C,@D,@E,"mg/kg",@F)', native: `100*(${cMg})/${SUM}` },
  { header: "K sat %", soil: 'SOIL.SATURATION("K",@B,@C,@D,@E,"mg/kg",@F)', native: `100*(${cK})/${SUM}` },
  { header: "Na sat %", soil: 'SOIL.SATURATION("Na",@B,@C,@D,@E,"mg/kg",@F)', native: `100*(${cNa})/${SUM}` },
  { header: "Base sat %", soil: 'SOIL.SATURATION("bases",@B,@C,@D,@E,"mg/kg",@F)', native: `100*${BASES}/${SUM}` },
  { header: "Acid sat %", soil: 'SOIL.SATURATION("acidity",@B,@C,@D,@E,"mg/kg",@F)', native: `100*@F/${SUM}` },
  { header: "Ca:Mg", soil: 'SOIL.CAMG(@B,@C,"mg/kg")', native: `(${cCa})/(${cMg})` },
  { header: "ESP %", soil: 'SOIL.ESP(@E,@J,"mg/kg")', native: `100*(${cNa})/@J` },
  { header: "K cmol/kg", soil: 'SOIL.CMOL(@D,"K")', native: `${cK}` },
  { header: "P kg/ha", soil: 'SOIL.CONVERT(@I,"mg/kg","kg/ha",15,1.3)', native: "@I*15*1.3*0.1" },
  { header: "P2O5 mg/kg", soil: 'SOIL.OXIDE(@I,"P","P2O5")', native: `@I*${P2O5}` },
];

/** Fills a template for one row (excelRow is 1-based). */
function forRow(template, excelRow) {
  return template.replace(/@([A-Z])/g, (_, c) => `${c}${excelRow}`);
}

/** Fills a template with whole-column ranges from row `first` to `last` (1-based). */
function forColumn(template, first, last) {
  return template.replace(/@([A-Z])/g, (_, c) => `${c}${first}:${c}${last}`);
}

/** A seeded generator, so the invented data are the same every run. */
const random = require("../scripts/seeded-random").seededRandom;

const round = (x, d) => Math.round(x * 10 ** d) / 10 ** d;

/** Invented lab values for `n` samples (rows of the data columns after the id). */
function samples(n, seed = 9) {
  const r = random(seed);
  const out = [];
  for (let i = 0; i < n; i++) {
    out.push([
      `S-${String(i + 1).padStart(6, "0")}`,
      round(400 + 3600 * r(), 0), // Ca
      round(50 + 450 * r(), 0), // Mg
      round(40 + 360 * r(), 0), // K
      round(5 + 145 * r(), 0), // Na
      round(4 * r(), 2), // acidity
      round(4.8 + 2.7 * r(), 1), // pH
      round(5.5 + 1.4 * r(), 1), // buffer pH
      round(5 + 75 * r(), 1), // P
    ]);
  }
  return out;
}

const esc = (s) => String(s).replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

const NS = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
const RNS = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";

/**
 * Writes an .xlsx of `n` samples, text in shared strings, as a spreadsheet application saves it,
 * with the formulas of `form` and no cached values (so the engine computes every formula):
 * - "soil": the SOIL formulas per row, in Excel's stored form (the default);
 * - "native": the same results as native arithmetic per row;
 * - "spill": one SOIL formula per column over the whole column, as a dynamic array;
 * - "nativeSpill": one native dynamic-array formula per column;
 * - "data": the data alone (the cost every form pays);
 * - "single": one SOIL.CMOL formula per row and no other formula column (for a million rows).
 * Returns the file's size in bytes.
 */
async function writeSeasonWorkbook(file, n, form = "soil") {
  const strings = [];
  const stringIndex = new Map();
  const sst = (s) => {
    if (!stringIndex.has(s)) {
      stringIndex.set(s, strings.length);
      strings.push(s);
    }
    return stringIndex.get(s);
  };
  const formulas = form === "single" ? [{ header: "Ca cmol", soil: 'SOIL.CMOL(@B,"Ca")', native: cCa }] : FORMULAS;
  const cols = DATA_COLUMNS.length + formulas.length;
  const parts = [];
  const header = [...DATA_COLUMNS, ...formulas.map((f) => f.header)];
  parts.push(`<row r="1">${header.map((h, c) => `<c r="${colLetters(c)}1" t="s"><v>${sst(h)}</v></c>`).join("")}</row>`);
  const data = samples(n);
  const text = formulas.map((f) => (form === "native" || form === "nativeSpill" ? f.native : toStoredFormula(`=${f.soil}`)));
  const dynamic = form === "spill" || form === "nativeSpill";
  for (let i = 0; i < n; i++) {
    const r = i + 2;
    const d = data[i];
    let xml = `<row r="${r}"><c r="A${r}" t="s"><v>${sst(d[0])}</v></c>`;
    const lastData = form === "single" ? 2 : d.length;
    for (let c = 1; c < lastData; c++) xml += `<c r="${colLetters(c)}${r}"><v>${d[c]}</v></c>`;
    if (form === "soil" || form === "native" || form === "single") {
      text.forEach((s, j) => {
        xml += `<c r="${colLetters(FIRST_FORMULA_COL + j)}${r}"><f>${esc(forRow(s, r))}</f></c>`;
      });
    } else if (dynamic && i === 0) {
      // One formula per column over all rows; its elements spill into the cells below.
      text.forEach((s, j) => {
        const c = colLetters(FIRST_FORMULA_COL + j);
        xml += `<c r="${c}2" cm="1"><f t="array" ref="${c}2:${c}${n + 1}">${esc(forColumn(s, 2, n + 1))}</f></c>`;
      });
    }
    parts.push(`${xml}</row>`);
  }
  const sheet =
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet xmlns="${NS}" xmlns:r="${RNS}">` +
    `<dimension ref="A1:${colLetters(cols - 1)}${n + 1}"/><sheetData>${parts.join("")}</sheetData></worksheet>`;
  const zip = new JSZip();
  zip.file(
    "[Content_Types].xml",
    '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">' +
      '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/>' +
      '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>' +
      '<Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>' +
      '<Override PartName="/xl/sharedStrings.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml"/>' +
      (dynamic ? '<Override PartName="/xl/metadata.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheetMetadata+xml"/>' : "") +
      "</Types>",
  );
  zip.file(
    "_rels/.rels",
    '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">' +
      '<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>',
  );
  zip.file(
    "xl/workbook.xml",
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<workbook xmlns="${NS}" xmlns:r="${RNS}"><sheets><sheet name="Season" sheetId="1" r:id="rId1"/></sheets></workbook>`,
  );
  zip.file(
    "xl/_rels/workbook.xml.rels",
    '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">' +
      '<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/>' +
      '<Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sharedStrings" Target="sharedStrings.xml"/>' +
      (dynamic ? '<Relationship Id="rId3" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sheetMetadata" Target="metadata.xml"/>' : "") +
      "</Relationships>",
  );
  if (dynamic) {
    zip.file(
      "xl/metadata.xml",
      `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<metadata xmlns="${NS}" xmlns:xda="http://schemas.microsoft.com/office/spreadsheetml/2017/dynamicarray"><metadataTypes count="1"><metadataType name="XLDAPR" minSupportedVersion="120000" copy="1" pasteAll="1" pasteValues="1" merge="1" splitFirst="1" rowColShift="1" clearFormats="1" clearComments="1" assign="1" coerce="1" cellMeta="1"/></metadataTypes><futureMetadata name="XLDAPR" count="1"><bk><extLst><ext uri="{bdbb8cdc-fa1e-496e-a857-3c3f30c029c3}"><xda:dynamicArrayProperties fDynamic="1" fCollapsed="0"/></ext></extLst></bk></futureMetadata><cellMetadata count="1"><bk><rc t="1" v="0"/></bk></cellMetadata></metadata>`,
    );
  }
  zip.file(
    "xl/sharedStrings.xml",
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<sst xmlns="${NS}" count="${strings.length}" uniqueCount="${strings.length}">` +
      strings.map((s) => `<si><t>${esc(s)}</t></si>`).join("") +
      "</sst>",
  );
  zip.file("xl/worksheets/sheet1.xml", sheet);
  const bytes = await zip.generateAsync({ type: "nodebuffer", compression: "DEFLATE", compressionOptions: { level: 6 } });
  fs.writeFileSync(file, bytes);
  return bytes.length;
}

module.exports = { DATA_COLUMNS, FORMULAS, FIRST_FORMULA_COL, samples, writeSeasonWorkbook, forRow, forColumn };
