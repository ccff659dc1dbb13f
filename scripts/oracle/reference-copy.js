/**
 * The copy of a workbook LibreOffice computes as the reference for cells downstream of SOIL
 * cells: each SOIL cell (and each element of its spill) is replaced by the value `soilcell eval`
 * gives for it, and `_xlfn.ANCHORARRAY(X)` (Excel's stored `X#`, unknown to LibreOffice 7.4) by
 * the range X's array formula covers. Sheet XML is patched through the tokenizer of xml.js: only
 * the replaced <c> elements and <f> texts change.
 */
"use strict";
const JSZip = require("jszip");
const { parse, textOf, escapeXml } = require("./xml");
const { readWorkbookCells, parseA1, a1, MAIN_NS } = require("./xlsx-cells");

function valueCellXml(prefix, addr, v, options = {}) {
  const p = prefix ? `${prefix}:` : "";
  if (v === null || v === undefined) return `<${p}c r="${addr}"/>`;
  // LibreOffice reads an empty text constant as a blank cell; a formula ="" keeps it text (as Excel holds a SOIL blank result, "")
  if (v === "" && options.emptyTextAsFormula) return `<${p}c r="${addr}" t="str"><${p}f>""</${p}f><${p}v></${p}v></${p}c>`;
  if (typeof v === "number") return `<${p}c r="${addr}"><${p}v>${String(v)}</${p}v></${p}c>`;
  if (typeof v === "boolean") return `<${p}c r="${addr}" t="b"><${p}v>${v ? 1 : 0}</${p}v></${p}c>`;
  if (typeof v === "string") return `<${p}c r="${addr}" t="inlineStr"><${p}is><${p}t xml:space="preserve">${escapeXml(v)}</${p}t></${p}is></${p}c>`;
  if (v.error) return `<${p}c r="${addr}" t="e"><${p}v>${escapeXml(v.error)}</${p}v></${p}c>`;
  throw new Error(`no cell for ${JSON.stringify(v)}`);
}

/** Replaces _xlfn.ANCHORARRAY(X) outside string literals by X's spill range (from `refs`: "Sheet!A1" → ref). */
function withoutSpillOperator(formula, sheetName, refs) {
  return formula
    .split(/("(?:[^"]|"")*")/)
    .map((part, i) =>
      i % 2
        ? part
        : part.replace(/_xlfn\.ANCHORARRAY\(((?:'(?:[^']|'')+'|[^'!(),\s]+)!)?\$?([A-Za-z]+)\$?(\d+)\)/gi, (m, qual, col, row) => {
            const target = qual ? qual.slice(0, -1).replace(/^'|'$/g, "").replace(/''/g, "'") : sheetName;
            const ref = refs.get(`${target}!${col.toUpperCase()}${row}`);
            if (!ref) throw new Error(`${m}: no array formula at ${target}!${col}${row}`);
            const end = ref.split(":")[1];
            return `${qual ?? ""}${col}${row}${end ? `:${end}` : ""}`;
          }),
    )
    .join("");
}

/**
 * The reference copy's bytes. `replacements`: { sheet: { A1: value } } (number, string, boolean,
 * { error }, null) for every SOIL cell and spill element; each must exist as a <c> in the sheet.
 * `options.emptyTextAsFormula`: an empty text value becomes the formula ="" (LibreOffice reads an
 * empty text constant as a blank cell).
 */
async function referenceCopy(bytes, replacements, options = {}) {
  const book = await readWorkbookCells(bytes);
  const refs = new Map();
  for (const s of book.sheets) for (const c of s.cells.values()) if (c.f && c.f.t === "array" && c.f.ref) refs.set(`${s.name}!${c.r}`, c.f.ref);
  const zip = await JSZip.loadAsync(bytes);
  for (const sheet of book.sheets) {
    const want = replacements[sheet.name] ?? {};
    const xml = await zip.file(sheet.path).async("string");
    const root = parse(xml);
    const cuts = [];
    const done = new Set();
    const data = root.children.find((c) => c.local === "sheetData" && MAIN_NS.has(c.ns));
    let rowIndex = -1;
    for (const row of data ? data.children.filter((c) => c.local === "row") : []) {
      const r = row.attrs.get("r");
      rowIndex = r ? Number(r) - 1 : rowIndex + 1;
      let col = -1;
      for (const c of row.children.filter((x) => x.local === "c")) {
        const ref = c.attrs.get("r");
        const at = ref ? parseA1(ref) : { row: rowIndex, col: col + 1 };
        col = at.col;
        const addr = a1(at.row, at.col);
        const prefix = c.name.includes(":") ? c.name.split(":")[0] : "";
        if (Object.prototype.hasOwnProperty.call(want, addr)) {
          cuts.push([c.start, c.end, valueCellXml(prefix, addr, want[addr], options)]);
          done.add(addr);
          continue;
        }
        const f = c.children.find((x) => x.local === "f");
        if (f && /_xlfn\.ANCHORARRAY\(/i.test(textOf(f)) && f.close) {
          const text = withoutSpillOperator(textOf(f), sheet.name, refs);
          cuts.push([f.open.end, f.close.start, escapeXml(text)]);
        }
      }
    }
    const missing = Object.keys(want).filter((a) => !done.has(a));
    if (missing.length) throw new Error(`${sheet.name}: no <c> for ${missing.join(", ")} to replace`);
    if (!cuts.length) continue;
    cuts.sort((p, q) => p[0] - q[0]);
    const parts = [];
    let at = 0;
    for (const [s, e, rep] of cuts) {
      parts.push(xml.slice(at, s), rep);
      at = e;
    }
    parts.push(xml.slice(at));
    zip.file(sheet.path, parts.join(""), { createFolders: false });
  }
  return zip.generateAsync({ type: "nodebuffer", compression: "DEFLATE" });
}

module.exports = { referenceCopy, withoutSpillOperator, valueCellXml };
