/**
 * Writes an .xlsx from a plain description, with hand-templated XML so the stored form is exactly
 * what the caller asks for (shared formulas, legacy and dynamic array formulas, cached values or
 * none, odd namespace prefixes, raw cell XML). Zipped with JSZip (no folder entries).
 *
 * A workbook: { sheets: [{ name, cells, merges?, after?, prefix? }], names?: [{ name, value, sheet? }],
 *   date1904?, sentinel? }.
 * A cell (keyed by A1 address in `cells`):
 *   number | string (a shared string) | { inline: text } | { b: bool } | { e: "#N/A" } | { raw: "<c …/>" }
 *   | { n: number, s: style } | { f: formula text as stored (no "="), v?: cached value, t?: "array" | "shared", ref?, si?, cm?: true, s?: style }
 * Extras for real-world shapes: `sheet.rels` (relationships of the sheet part), `book.parts`
 * ({ path: { content, contentType } }, added with their content types), `book.workbookRels`
 * (more workbook relationships) and `book.externalReferences` (their ids).
 * `sentinel`: a number cached in every formula cell (and every array element) given no value of
 * its own, so a reader can tell a recomputed value from a cached one.
 * Styles: 0 general, 1 a date (numFmtId 14), 2 percent (numFmtId 10).
 */
"use strict";
const JSZip = require("jszip");
const { escapeXml } = require("./xml");
const { parseA1, addressesOf } = require("./xlsx-cells");

const NS = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
const R_NS = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
const HEAD = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n';

const STYLES =
  `${HEAD}<styleSheet xmlns="${NS}"><fonts count="1"><font><sz val="11"/><name val="Calibri"/></font></fonts>` +
  '<fills count="2"><fill><patternFill patternType="none"/></fill><fill><patternFill patternType="gray125"/></fill></fills>' +
  '<borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders>' +
  '<cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs>' +
  '<cellXfs count="3"><xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/><xf numFmtId="14" fontId="0" fillId="0" borderId="0" xfId="0" applyNumberFormat="1"/><xf numFmtId="10" fontId="0" fillId="0" borderId="0" xfId="0" applyNumberFormat="1"/></cellXfs>' +
  '<cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/></cellStyles></styleSheet>';

/** The dynamic-array metadata part in the form Excel writes it (one XLDAPR block, cm="1"). */
const METADATA =
  `${HEAD}<metadata xmlns="${NS}" xmlns:xda="http://schemas.microsoft.com/office/spreadsheetml/2017/dynamicarray">` +
  '<metadataTypes count="1"><metadataType name="XLDAPR" minSupportedVersion="120000" copy="1" pasteAll="1" pasteValues="1" merge="1" splitFirst="1" rowColShift="1" clearFormats="1" clearComments="1" assign="1" coerce="1" cellMeta="1"/></metadataTypes>' +
  '<futureMetadata name="XLDAPR" count="1"><bk><extLst><ext uri="{bdbb8cdc-fa1e-496e-a857-3c3f30c029c3}"><xda:dynamicArrayProperties fDynamic="1" fCollapsed="0"/></ext></extLst></bk></futureMetadata>' +
  '<cellMetadata count="1"><bk><rc t="1" v="0"/></bk></cellMetadata></metadata>';

function order(a, b) {
  const p = parseA1(a);
  const q = parseA1(b);
  return p.row - q.row || p.col - q.col;
}

function valueXml(v, p, sst) {
  // → [t attribute, inner XML]
  if (v === undefined || v === null) return ["", ""];
  if (typeof v === "number") return ["", `<${p}v>${String(v)}</${p}v>`];
  if (typeof v === "boolean") return [' t="b"', `<${p}v>${v ? 1 : 0}</${p}v>`];
  if (typeof v === "string") return [' t="str"', `<${p}v>${escapeXml(v)}</${p}v>`];
  if (v.e) return [' t="e"', `<${p}v>${escapeXml(v.e)}</${p}v>`];
  if (v.s !== undefined) return [' t="s"', `<${p}v>${sst(v.s)}</${p}v>`];
  throw new Error(`unknown cached value ${JSON.stringify(v)}`);
}

function cellXml(addr, spec, p, sst, sentinel) {
  if (spec && typeof spec === "object" && spec.raw !== undefined) return spec.raw;
  const s = spec && typeof spec === "object" && spec.s !== undefined ? ` s="${spec.s}"` : "";
  if (typeof spec === "number") return `<${p}c r="${addr}"${s}><${p}v>${String(spec)}</${p}v></${p}c>`;
  if (typeof spec === "string") return `<${p}c r="${addr}" t="s"><${p}v>${sst(spec)}</${p}v></${p}c>`;
  if (spec === null) return `<${p}c r="${addr}"/>`;
  if (spec.inline !== undefined) return `<${p}c r="${addr}" t="inlineStr"><${p}is><${p}t xml:space="preserve">${escapeXml(spec.inline)}</${p}t></${p}is></${p}c>`;
  if (spec.b !== undefined) return `<${p}c r="${addr}" t="b"><${p}v>${spec.b ? 1 : 0}</${p}v></${p}c>`;
  if (spec.e !== undefined) return `<${p}c r="${addr}" t="e"><${p}v>${escapeXml(spec.e)}</${p}v></${p}c>`;
  if (spec.n !== undefined) return `<${p}c r="${addr}"${s}><${p}v>${String(spec.n)}</${p}v></${p}c>`;
  if (spec.f === undefined) throw new Error(`cell ${addr}: unknown spec ${JSON.stringify(spec)}`);
  const cached = spec.v !== undefined ? spec.v : sentinel;
  const [t, v] = valueXml(cached, p, sst);
  const cm = spec.cm ? ' cm="1"' : "";
  let fAttrs = "";
  if (spec.t === "array") fAttrs = ` t="array" ref="${spec.ref}"`;
  else if (spec.t === "shared") fAttrs = ` t="shared"${spec.ref ? ` ref="${spec.ref}"` : ""} si="${spec.si}"`;
  if (spec.aca) fAttrs += ` aca="1"`;
  const f = spec.f === "" ? `<${p}f${fAttrs}/>` : `<${p}f${fAttrs}>${escapeXml(spec.f)}</${p}f>`;
  return `<${p}c r="${addr}"${s}${t}${cm}>${f}${v}</${p}c>`;
}

function relXml(r) {
  return `<Relationship Id="${r.Id}" Type="${r.Type}" Target="${escapeXml(r.Target)}"${r.TargetMode ? ` TargetMode="${r.TargetMode}"` : ""}/>`;
}

/** Builds the workbook's bytes. */
async function buildXlsx(book) {
  const strings = [];
  const index = new Map();
  const sst = (text) => {
    if (!index.has(text)) {
      index.set(text, strings.length);
      strings.push(text);
    }
    return index.get(text);
  };
  let anyCm = false;
  const sheetXml = book.sheets.map((sheet) => {
    const p = sheet.prefix ? `${sheet.prefix}:` : "";
    const cells = new Map(Object.entries(sheet.cells ?? {}));
    // elements of array formulas get the sentinel when not given
    if (book.sentinel !== undefined) {
      for (const [addr, spec] of [...cells]) {
        if (spec && typeof spec === "object" && spec.t === "array" && spec.ref) {
          for (const a of addressesOf(spec.ref)) if (a !== addr && !cells.has(a)) cells.set(a, book.sentinel);
        }
      }
    }
    const rows = new Map();
    for (const addr of [...cells.keys()].sort(order)) {
      const spec = cells.get(addr);
      if (spec && typeof spec === "object" && spec.cm) anyCm = true;
      const r = parseA1(addr).row + 1;
      if (!rows.has(r)) rows.set(r, []);
      rows.get(r).push(cellXml(addr, spec, p, sst, book.sentinel));
    }
    const data = [...rows].map(([r, xs]) => `<${p}row r="${r}">${xs.join("")}</${p}row>`).join("");
    const merges = sheet.merges?.length ? `<${p}mergeCells count="${sheet.merges.length}">${sheet.merges.map((m) => `<${p}mergeCell ref="${m}"/>`).join("")}</${p}mergeCells>` : "";
    const xmlns = sheet.prefix ? `xmlns:${sheet.prefix}="${NS}"` : `xmlns="${NS}"`;
    return `${HEAD}<${p}worksheet ${xmlns} xmlns:r="${R_NS}">${sheet.before ?? ""}<${p}sheetData>${data}</${p}sheetData>${merges}${sheet.after ?? ""}</${p}worksheet>`;
  });
  const sheetIndex = new Map(book.sheets.map((s, i) => [s.name, i]));
  const names = (book.names ?? [])
    .map((n) => {
      const local = n.sheet !== undefined ? ` localSheetId="${sheetIndex.get(n.sheet)}"` : "";
      return `<definedName name="${escapeXml(n.name)}"${local}>${escapeXml(n.value)}</definedName>`;
    })
    .join("");
  const workbook =
    `${HEAD}<workbook xmlns="${NS}" xmlns:r="${R_NS}">` +
    `<workbookPr${book.date1904 ? ' date1904="1"' : ""}/>` +
    '<bookViews><workbookView xWindow="0" yWindow="0" windowWidth="16000" windowHeight="9000"/></bookViews>' +
    `<sheets>${book.sheets.map((s, i) => `<sheet name="${escapeXml(s.name)}" sheetId="${i + 1}" r:id="rId${i + 1}"/>`).join("")}</sheets>` +
    (book.externalReferences?.length ? `<externalReferences>${book.externalReferences.map((id) => `<externalReference r:id="${id}"/>`).join("")}</externalReferences>` : "") +
    (names ? `<definedNames>${names}</definedNames>` : "") +
    '<calcPr calcId="191029"/></workbook>';
  const n = book.sheets.length;
  const rels = [
    ...book.sheets.map((_, i) => `<Relationship Id="rId${i + 1}" Type="${R_NS}/worksheet" Target="worksheets/sheet${i + 1}.xml"/>`),
    `<Relationship Id="rId${n + 1}" Type="${R_NS}/styles" Target="styles.xml"/>`,
    `<Relationship Id="rId${n + 2}" Type="${R_NS}/sharedStrings" Target="sharedStrings.xml"/>`,
    ...(anyCm ? [`<Relationship Id="rId${n + 3}" Type="${R_NS}/sheetMetadata" Target="metadata.xml"/>`] : []),
    ...(book.workbookRels ?? []).map((r) => relXml(r)),
  ];
  const extra = Object.entries(book.parts ?? {});
  const types =
    `${HEAD}<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">` +
    '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/>' +
    '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>' +
    book.sheets.map((_, i) => `<Override PartName="/xl/worksheets/sheet${i + 1}.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>`).join("") +
    '<Override PartName="/xl/styles.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"/>' +
    '<Override PartName="/xl/sharedStrings.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml"/>' +
    (anyCm ? '<Override PartName="/xl/metadata.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheetMetadata+xml"/>' : "") +
    extra.filter(([, p]) => p.contentType).map(([path, p]) => `<Override PartName="/${path}" ContentType="${p.contentType}"/>`).join("") +
    "</Types>";
  const zip = new JSZip();
  const opts = { createFolders: false, date: new Date(Date.UTC(2025, 0, 1)) };
  zip.file("[Content_Types].xml", types, opts);
  zip.file(
    "_rels/.rels",
    `${HEAD}<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${R_NS}/officeDocument" Target="xl/workbook.xml"/></Relationships>`,
    opts,
  );
  zip.file("xl/workbook.xml", workbook, opts);
  zip.file("xl/_rels/workbook.xml.rels", `${HEAD}<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">${rels.join("")}</Relationships>`, opts);
  sheetXml.forEach((x, i) => zip.file(`xl/worksheets/sheet${i + 1}.xml`, x, opts));
  book.sheets.forEach((sheet, i) => {
    if (sheet.rels?.length) {
      zip.file(`xl/worksheets/_rels/sheet${i + 1}.xml.rels`, `${HEAD}<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">${sheet.rels.map(relXml).join("")}</Relationships>`, opts);
    }
  });
  for (const [path, p] of extra) zip.file(path, p.content, opts);
  zip.file("xl/styles.xml", STYLES, opts);
  zip.file(
    "xl/sharedStrings.xml",
    `${HEAD}<sst xmlns="${NS}" count="${strings.length}" uniqueCount="${strings.length}">${strings.map((s) => `<si><t xml:space="preserve">${escapeXml(s)}</t></si>`).join("")}</sst>`,
    opts,
  );
  if (anyCm) zip.file("xl/metadata.xml", METADATA, opts);
  return zip.generateAsync({ type: "nodebuffer", compression: "DEFLATE", compressionOptions: { level: 6 } });
}

module.exports = { buildXlsx, METADATA, STYLES, NS, R_NS };
