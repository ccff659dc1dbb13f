/**
 * Workbooks made from a report template's report sheet: one sheet (or, for the office engine, many
 * reports as the sheets of one workbook), every cell a value, with the template's styles, theme,
 * page setup, print area and the parts the sheet points at (drawings, images, comments). Nothing
 * else of the template goes with it: no other sheet, no shared strings (the text of every sheet
 * would travel with each client's report), no defined names beyond the print area and titles.
 */
import path from "path";
import type { Sheet } from "./book";
import { columnIndex } from "./cellref";
import { customPropertiesXml, valuesStamp } from "./recalc";
import { rewriteStartTag } from "./sheet-patch";
import { Tok, XmlScanner, encodeXmlText } from "./xml";
import { XlsxPackage, readRelationships, relsPathOf, resolveTarget } from "./xlsx-package";
import { ZipEntry, ZipOut, writeZip } from "./zip";

const MAIN = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
const REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
const PKG_REL = "http://schemas.openxmlformats.org/package/2006/relationships";
const CT = {
  workbook: "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml",
  worksheet: "application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml",
  styles: "application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml",
  theme: "application/vnd.openxmlformats-officedocument.theme+xml",
  core: "application/vnd.openxmlformats-package.core-properties+xml",
  custom: "application/vnd.openxmlformats-officedocument.custom-properties+xml",
  rels: "application/vnd.openxmlformats-package.relationships+xml",
};
/** Relationship types of a report sheet that a values copy cannot keep (they need workbook parts or names). */
const DROPPED = [/\/table$/, /\/pivotTable$/, /\/queryTable$/, /\/slicer$/, /\/timeline$/];

interface Part {
  readonly name: string;
  /** New contents, or the template's entry (its compressed bytes copied: nothing deflated again). */
  readonly data: Buffer | string | ZipEntry;
}

export interface ReportSheet {
  /** The sheet's XML, values only. */
  readonly xml: string;
  /** The sheet's name in the workbook (at most 31 characters, unique within it). */
  readonly name: string;
}

/** Everything a report workbook takes from its template, read once. */
export class ReportPackager {
  private readonly defaults: [string, string][] = [];
  private readonly overrides = new Map<string, string>();
  private readonly styles?: string;
  private readonly theme?: string;
  private readonly date1904: boolean;
  private readonly printNames: { name: string; text: string }[];
  /** Whether the sheet holds charts (their caches hold the template's values: said in the summary). */
  readonly hasCharts: boolean;
  /** Relationship types left out of the copies (tables, pivot tables). */
  readonly dropped: string[] = [];

  constructor(
    private readonly pkg: XlsxPackage,
    private readonly sheet: Sheet,
  ) {
    const types = pkg.text("[Content_Types].xml") ?? "";
    const s = new XmlScanner(types);
    for (let t = s.next(); t !== Tok.End; t = s.next()) {
      if (t !== Tok.Open) continue;
      if (s.local === "Default") this.defaults.push([s.attr("Extension") ?? "", s.attr("ContentType") ?? ""]);
      else if (s.local === "Override") this.overrides.set((s.attr("PartName") ?? "").replace(/^\//, ""), s.attr("ContentType") ?? "");
    }
    const rels = readRelationships(pkg.text(relsPathOf(pkg.workbookPath)));
    const target = (type: string) => {
      const r = rels.find((x) => x.type.endsWith(type) && !x.external);
      return r ? resolveTarget(pkg.workbookPath, r.target) : undefined;
    };
    this.styles = target("/styles");
    this.theme = target("/theme");
    this.date1904 = pkg.date1904;
    this.printNames = pkg.definedNames
      .filter((d) => d.localSheetId === sheet.index && /^_xlnm\.(Print_Area|Print_Titles)$/i.test(d.name))
      .map((d) => ({ name: d.name, text: d.text }));
    this.hasCharts = this.closureHas(sheet.path, /\/chart$/);
    // Known before any copy is made, so a batch can say so up front.
    this.findDropped(sheet.path);
  }

  /** A workbook of one report (the sheet keeps the template's name). */
  single(sheetXml: string, title: string, note: string): Buffer {
    return this.build([{ xml: sheetXml, name: this.sheet.name }], title, note, "");
  }

  /**
   * One workbook whose sheets are many reports, for one pass of the office engine. A sheet set to
   * fit one page is given the fixed scale that fits it (`fitScale`): LibreOffice takes about 2.5
   * times as long to lay out a page it must fit itself (measured, 100 reports: 7.1 s against 2.8 s).
   */
  combined(sheets: readonly ReportSheet[], title: string): Buffer {
    const fixed = this.fixedScale;
    const xmls = sheets.map((s) => {
      // Cells outside the print area are not printed, but LibreOffice still writes the text of
      // hidden helper cells into the PDF's text layer (clipped): they are left out of this pass.
      let xml = this.forPdf(s.xml);
      if (fixed) xml = xml.split(fixed.from).join(fixed.to).split(fixed.prFrom).join(fixed.prTo);
      return { name: s.name, xml };
    });
    return this.build(xmls, title, `reports from a template, for conversion (${valuesStamp()})`, ".r");
  }

  /** A report sheet as the office engine should see it: without the cells outside the print area. */
  forPdf(xml: string): string {
    const area = this.printArea();
    return area ? clipToArea(xml, area) : xml;
  }

  private fixedScaleMemo: { from: string; to: string; prFrom: string; prTo: string; scale: number } | null | undefined;

  /** The page setup with a fixed scale in place of "fit to one page", found once; null when the sheet is not set to fit one page. */
  get fixedScale(): { from: string; to: string; prFrom: string; prTo: string; scale: number } | null {
    if (this.fixedScaleMemo === undefined) this.fixedScaleMemo = fitScale(this.sheet.xml, this.printArea());
    return this.fixedScaleMemo;
  }

  private printArea(): { r1: number; c1: number; r2: number; c2: number } | undefined {
    const p = this.printNames.find((n) => /Print_Area$/i.test(n.name));
    const m = p ? /\$?([A-Z]{1,3})\$?(\d+):\$?([A-Z]{1,3})\$?(\d+)$/.exec(p.text.trim()) : null;
    if (!m || p!.text.includes(",")) return undefined;
    return { c1: columnIndex(m[1]!), r1: Number(m[2]) - 1, c2: columnIndex(m[3]!), r2: Number(m[4]) - 1 };
  }

  private build(sheets: readonly ReportSheet[], title: string, note: string, suffixStem: string): Buffer {
    const parts: Part[] = [];
    const overrides = new Map<string, string>();
    const copied = new Map<string, string>();
    const wbRels: string[] = [];
    const sheetEls: string[] = [];
    const names: string[] = [];
    sheets.forEach((sh, i) => {
      const n = i + 1;
      const partName = `xl/worksheets/sheet${n}.xml`;
      const suffix = suffixStem ? `${suffixStem}${n}` : "";
      parts.push({ name: partName, data: i === 0 || !suffixStem ? sh.xml : unselect(sh.xml) });
      overrides.set(partName, CT.worksheet);
      const rels = this.copyRels(this.sheet.path, partName, suffix, parts, overrides, copied);
      if (rels) parts.push({ name: relsPathOf(partName), data: rels });
      wbRels.push(`<Relationship Id="rIdS${n}" Type="${REL}/worksheet" Target="worksheets/sheet${n}.xml"/>`);
      sheetEls.push(`<sheet name="${encodeXmlText(sh.name)}" sheetId="${n}" r:id="rIdS${n}"/>`);
      for (const p of this.printNames) names.push(`<definedName name="${p.name}" localSheetId="${i}">${encodeXmlText(renameSheet(p.text, this.sheet.name, sh.name))}</definedName>`);
    });
    if (this.styles) {
      parts.push({ name: "xl/styles.xml", data: this.pkg.entry(this.styles) ?? this.pkg.text(this.styles) ?? "" });
      overrides.set("xl/styles.xml", CT.styles);
      wbRels.push(`<Relationship Id="rIdStyles" Type="${REL}/styles" Target="styles.xml"/>`);
    }
    if (this.theme) {
      parts.push({ name: "xl/theme/theme1.xml", data: this.pkg.entry(this.theme) ?? this.pkg.text(this.theme) ?? "" });
      overrides.set("xl/theme/theme1.xml", CT.theme);
      wbRels.push(`<Relationship Id="rIdTheme" Type="${REL}/theme" Target="theme/theme1.xml"/>`);
    }
    const workbook =
      `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<workbook xmlns="${MAIN}" xmlns:r="${REL}">` +
      `<workbookPr${this.date1904 ? ' date1904="1"' : ""}/><bookViews><workbookView activeTab="0"/></bookViews>` +
      `<sheets>${sheetEls.join("")}</sheets>${names.length ? `<definedNames>${names.join("")}</definedNames>` : ""}</workbook>`;
    parts.push({ name: "xl/workbook.xml", data: workbook });
    overrides.set("xl/workbook.xml", CT.workbook);
    parts.push({ name: "xl/_rels/workbook.xml.rels", data: relsXml(wbRels) });
    const now = new Date().toISOString().replace(/\.\d+Z$/, "Z");
    parts.push({
      name: "docProps/core.xml",
      data:
        '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<cp:coreProperties xmlns:cp="http://schemas.openxmlformats.org/package/2006/metadata/core-properties" xmlns:dc="http://purl.org/dc/elements/1.1/" xmlns:dcterms="http://purl.org/dc/terms/" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">' +
        `<dc:title>${encodeXmlText(title)}</dc:title><dcterms:created xsi:type="dcterms:W3CDTF">${now}</dcterms:created></cp:coreProperties>`,
    });
    overrides.set("docProps/core.xml", CT.core);
    parts.push({ name: "docProps/custom.xml", data: customPropertiesXml(note) });
    overrides.set("docProps/custom.xml", CT.custom);
    parts.push({
      name: "_rels/.rels",
      data: relsXml([
        `<Relationship Id="rId1" Type="${REL}/officeDocument" Target="xl/workbook.xml"/>`,
        `<Relationship Id="rId2" Type="${PKG_REL}/metadata/core-properties" Target="docProps/core.xml"/>`,
        `<Relationship Id="rId3" Type="${REL}/custom-properties" Target="docProps/custom.xml"/>`,
      ]),
    });
    const defaults = new Map<string, string>([
      ["rels", CT.rels],
      ["xml", "application/xml"],
    ]);
    for (const [ext, type] of this.defaults) if (!defaults.has(ext.toLowerCase())) defaults.set(ext.toLowerCase(), type);
    const types =
      '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">' +
      [...defaults].map(([e, t]) => `<Default Extension="${encodeXmlText(e)}" ContentType="${encodeXmlText(t)}"/>`).join("") +
      [...overrides].map(([p, t]) => `<Override PartName="/${encodeXmlText(p)}" ContentType="${encodeXmlText(t)}"/>`).join("") +
      "</Types>";
    const out: ZipOut[] = [{ name: "[Content_Types].xml", data: Buffer.from(types, "utf8") }, ...parts.map((p) => (typeof p.data === "string" ? { name: p.name, data: Buffer.from(p.data, "utf8") } : Buffer.isBuffer(p.data) ? { name: p.name, data: p.data } : { name: p.name, copy: p.data }))];
    return writeZip(out);
  }

  /** The relationships of a copied part, its targets copied too (XML parts renamed by `suffix`, binary parts shared). */
  private copyRels(src: string, dst: string, suffix: string, parts: Part[], overrides: Map<string, string>, copied: Map<string, string>): string | undefined {
    const rels = readRelationships(this.pkg.text(relsPathOf(src)));
    if (!rels.length) return undefined;
    const lines: string[] = [];
    for (const r of rels) {
      if (r.external) {
        lines.push(`<Relationship Id="${encodeXmlText(r.id)}" Type="${encodeXmlText(r.type)}" Target="${encodeXmlText(r.target)}" TargetMode="External"/>`);
        continue;
      }
      if (DROPPED.some((d) => d.test(r.type))) continue; // listed in `dropped` by the constructor
      const from = resolveTarget(src, r.target);
      const to = this.copyPart(from, suffix, parts, overrides, copied);
      if (to === undefined) continue;
      lines.push(`<Relationship Id="${encodeXmlText(r.id)}" Type="${encodeXmlText(r.type)}" Target="${encodeXmlText(path.posix.relative(path.posix.dirname(dst), to))}"/>`);
    }
    return relsXml(lines);
  }

  private copyPart(src: string, suffix: string, parts: Part[], overrides: Map<string, string>, copied: Map<string, string>): string | undefined {
    const key = `${suffix}|${src}`;
    const known = copied.get(key);
    if (known !== undefined) return known;
    const isXml = /\.(xml|vml)$/i.test(src);
    const name = isXml && suffix ? src.replace(/(\.[^./]+)$/, `${suffix}$1`) : src;
    if (!isXml && copied.has(`|${src}`)) return name;
    const data = this.pkg.entry(src) ?? (isXml ? this.pkg.text(src) : this.pkg.bytes(src));
    if (data === undefined) return undefined;
    copied.set(key, name);
    if (!isXml) copied.set(`|${src}`, name);
    parts.push({ name, data });
    const type = this.overrides.get(src);
    if (type) overrides.set(name, type);
    const rels = this.copyRels(src, name, suffix, parts, overrides, copied);
    if (rels) parts.push({ name: relsPathOf(name), data: rels });
    return name;
  }

  /** The relationship types of the parts the sheet points at (directly or not) that a copy leaves out. */
  private findDropped(src: string, seen = new Set<string>()): void {
    if (seen.has(src)) return;
    seen.add(src);
    for (const r of readRelationships(this.pkg.text(relsPathOf(src)))) {
      if (r.external) continue;
      if (DROPPED.some((d) => d.test(r.type))) {
        if (!this.dropped.includes(r.type)) this.dropped.push(r.type);
      } else this.findDropped(resolveTarget(src, r.target), seen);
    }
  }

  private closureHas(src: string, type: RegExp, seen = new Set<string>()): boolean {
    if (seen.has(src)) return false;
    seen.add(src);
    for (const r of readRelationships(this.pkg.text(relsPathOf(src)))) {
      if (r.external) continue;
      if (type.test(r.type)) return true;
      if (this.closureHas(resolveTarget(src, r.target), type, seen)) return true;
    }
    return false;
  }
}

function relsXml(lines: readonly string[]): string {
  return `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="${PKG_REL}">${lines.join("")}</Relationships>`;
}

/** A sheet name as a formula writes it before "!". */
function quoteSheet(name: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(name) && !/^[A-Za-z]{1,3}[0-9]+$/.test(name) ? name : `'${name.replace(/'/g, "''")}'`;
}

/** A print area's text with the template sheet's name replaced (quoted or not, as written). */
function renameSheet(text: string, from: string, to: string): string {
  if (from === to) return text;
  const quoted = `'${from.replace(/'/g, "''")}'!`;
  let out = text.split(quoted).join(`${quoteSheet(to)}!`);
  if (/^[A-Za-z_][A-Za-z0-9_.]*$/.test(from)) out = out.replace(new RegExp(`(^|[,(])${from.replace(/\./g, "\\.")}!`, "g"), `$1${quoteSheet(to)}!`);
  return out;
}

/** A sheet that is not the first of a workbook is not selected (LibreOffice would group selected sheets). */
function unselect(xml: string): string {
  const s = new XmlScanner(xml);
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t === Tok.Open && s.local === "sheetView") {
      if (s.attr("tabSelected") === undefined) return xml;
      const tag = xml.slice(s.start, s.end);
      const self = tag.endsWith("/>");
      const open = rewriteStartTag(self ? `${tag.slice(0, -2)}>` : tag, (n) => n === "tabSelected", "");
      return xml.slice(0, s.start) + (self ? `${open.slice(0, -1)}/>` : open) + xml.slice(s.end);
    }
    if (t === Tok.Open && s.local === "sheetData") return xml;
  }
  return xml;
}

/** Paper sizes by SpreadsheetML paperSize code, in points (ECMA-376 Part 1, 18.3.1.64 pageSetup; from memory). */
const PAPER: Record<number, [number, number]> = {
  1: [612, 792], // Letter
  5: [612, 1008], // Legal
  8: [841.89, 1190.55], // A3
  9: [595.28, 841.89], // A4
  11: [419.53, 595.28], // A5
};

/** Excel's column width (characters of the default font's digit, 7 px for 11-point Calibri) in points, at 96 px an inch. */
function widthPoints(w: number): number {
  return Math.trunc(((256 * w + Math.trunc(128 / 7)) / 256) * 7) * 0.75;
}

/**
 * The scale at which a sheet's print area fits one page, from its column widths, row heights,
 * paper and margins, with 4 % to spare for the office engine's own measures; the page-setup tags
 * to swap. Null unless the sheet is set to fit one page wide and one tall and every row of the
 * print area that has cells has a height of its own (others grow to fit their text).
 */
function fitScale(xml: string, area: { r1: number; c1: number; r2: number; c2: number } | undefined): { from: string; to: string; prFrom: string; prTo: string; scale: number } | null {
  if (!area) return null;
  const s = new XmlScanner(xml);
  let defaultRow = 15;
  let defaultCol = 8.43;
  const cols: { min: number; max: number; width: number; hidden: boolean }[] = [];
  const rows = new Map<number, { ht?: number; hidden: boolean }>();
  let setup: { tag: string; attrs: Map<string, string> } | undefined;
  let pr: string | undefined;
  let margins = { left: 0.7, right: 0.7, top: 0.75, bottom: 0.75 };
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t !== Tok.Open) continue;
    switch (s.local) {
      case "sheetFormatPr":
        defaultRow = Number(s.attr("defaultRowHeight") ?? defaultRow);
        if (s.attr("defaultColWidth")) defaultCol = Number(s.attr("defaultColWidth"));
        break;
      case "col":
        cols.push({ min: Number(s.attr("min")), max: Number(s.attr("max")), width: Number(s.attr("width") ?? defaultCol), hidden: s.attr("hidden") === "1" || s.attr("hidden") === "true" });
        break;
      case "row": {
        const r = Number(s.attr("r")) - 1;
        const custom = s.attr("customHeight") === "1" || s.attr("customHeight") === "true";
        rows.set(r, { ...(custom && s.attr("ht") ? { ht: Number(s.attr("ht")) } : {}), hidden: s.attr("hidden") === "1" || s.attr("hidden") === "true" });
        break;
      }
      case "c":
      case "f":
      case "v":
      case "is":
        break;
      case "pageSetUpPr":
        if (s.attr("fitToPage") === "1" || s.attr("fitToPage") === "true") pr = xml.slice(s.start, s.end);
        break;
      case "pageMargins":
        margins = { left: Number(s.attr("left") ?? 0.7), right: Number(s.attr("right") ?? 0.7), top: Number(s.attr("top") ?? 0.75), bottom: Number(s.attr("bottom") ?? 0.75) };
        break;
      case "pageSetup":
        setup = { tag: xml.slice(s.start, s.end), attrs: s.attrs() };
        break;
      default:
        break;
    }
  }
  if (!pr || !setup) return null;
  const a = setup.attrs;
  if ((a.get("fitToWidth") ?? "1") !== "1" || (a.get("fitToHeight") ?? "1") !== "1") return null;
  const paper = PAPER[Number(a.get("paperSize") ?? 9)];
  if (!paper) return null;
  const [pw, ph] = a.get("orientation") === "landscape" ? [paper[1], paper[0]] : paper;
  let width = 0;
  for (let c = area.c1; c <= area.c2; c++) {
    const col = cols.find((x) => c + 1 >= x.min && c + 1 <= x.max);
    if (col?.hidden) continue;
    width += widthPoints(col ? col.width : defaultCol);
  }
  let height = 0;
  for (let r = area.r1; r <= area.r2; r++) {
    const row = rows.get(r);
    if (row?.hidden) continue;
    // A row of its own height only: LibreOffice grows other rows to fit their text, which no scale fixed here can know.
    if (row && row.ht === undefined) return null;
    height += row?.ht ?? defaultRow;
  }
  const availW = pw - (margins.left + margins.right) * 72;
  const availH = ph - (margins.top + margins.bottom) * 72;
  if (width <= 0 || height <= 0 || availW <= 0 || availH <= 0) return null;
  const scale = Math.max(10, Math.min(100, Math.floor(100 * Math.min(1, availW / width, availH / height) * 0.96)));
  const to = rewriteStartTag(setup.tag.endsWith("/>") ? `${setup.tag.slice(0, -2)}>` : setup.tag, (n) => n === "scale" || n === "fitToWidth" || n === "fitToHeight", ` scale="${scale}"`);
  const prTo = rewriteStartTag(pr.endsWith("/>") ? `${pr.slice(0, -2)}>` : pr, (n) => n === "fitToPage", "");
  const close = (tag: string, orig: string) => (orig.endsWith("/>") ? `${tag.slice(0, -1)}/>` : tag);
  return { from: setup.tag, to: close(to, setup.tag), prFrom: pr, prTo: close(prTo, pr), scale };
}

/** A sheet's XML without the cells outside a rectangle. */
function clipToArea(xml: string, area: { r1: number; c1: number; r2: number; c2: number }): string {
  const s = new XmlScanner(xml);
  let out = "";
  let at = 0;
  for (let t = s.next(); t !== Tok.End; t = s.next()) {
    if (t !== Tok.Open) continue;
    if (s.local === "c") {
      const start = s.start;
      const ref = s.attr("r");
      const end = s.selfClosing ? s.end : s.skipElement();
      const m = ref ? /^([A-Z]{1,3})(\d+)$/.exec(ref) : null;
      if (!m) continue;
      const row = Number(m[2]) - 1;
      const col = columnIndex(m[1]!);
      if (row < area.r1 || row > area.r2 || col < area.c1 || col > area.c2) {
        out += xml.slice(at, start);
        at = end;
      }
    } else if (s.local !== "sheetData" && s.local !== "row" && s.local !== "worksheet" && !s.selfClosing) s.skipElement();
  }
  return out + xml.slice(at);
}
