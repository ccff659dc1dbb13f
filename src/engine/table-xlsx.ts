/**
 * A plain workbook of tables (an index, a list of problems): sheets of rows, the first row bold
 * and frozen, numbers in the number format given, text as inline strings. For output the engine
 * writes itself, so the engine needs no workbook library.
 */
import { a1 } from "./cellref";
import { Scalar, isError } from "./formula/values";
import { encodeXmlText } from "./xml";
import { writeZip } from "./zip";

export interface TableSheet {
  readonly name: string;
  readonly rows: readonly (readonly Scalar[])[];
  /** A number format per cell (row, column), e.g. "0.0"; undefined: General. */
  readonly format?: (row: number, col: number) => string | undefined;
  /** Column widths in characters. */
  readonly widths?: readonly number[];
}

const MAIN = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
const REL = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";

function cellXml(ref: string, v: Scalar, style: number): string {
  const s = style ? ` s="${style}"` : "";
  if (v === null || v === "") return style ? `<c r="${ref}"${s}/>` : "";
  if (typeof v === "number") return Number.isFinite(v) ? `<c r="${ref}"${s}><v>${String(v)}</v></c>` : "";
  if (typeof v === "boolean") return `<c r="${ref}"${s} t="b"><v>${v ? 1 : 0}</v></c>`;
  if (isError(v)) return `<c r="${ref}"${s} t="e"><v>${encodeXmlText(v.code)}</v></c>`;
  return `<c r="${ref}"${s} t="inlineStr"><is><t xml:space="preserve">${encodeXmlText(v)}</t></is></c>`;
}

/** Writes the sheets as an .xlsx. */
export function tableWorkbook(sheets: readonly TableSheet[]): Buffer {
  // Styles: 0 normal, 1 bold header, then one per number format used.
  const formats: string[] = [];
  const styleOf = (code: string | undefined) => {
    if (!code || code === "General") return 0;
    let i = formats.indexOf(code);
    if (i < 0) i = formats.push(code) - 1;
    return 2 + i;
  };
  const sheetXml = sheets.map((sh) => {
    const rows = sh.rows
      .map((r, ri) => {
        const cells = r.map((v, ci) => cellXml(a1({ row: ri, col: ci }), v, ri === 0 ? 1 : typeof v === "number" ? styleOf(sh.format?.(ri, ci)) : 0)).join("");
        return `<row r="${ri + 1}">${cells}</row>`;
      })
      .join("");
    const cols = sh.widths?.length ? `<cols>${sh.widths.map((w, i) => `<col min="${i + 1}" max="${i + 1}" width="${w}" customWidth="1"/>`).join("")}</cols>` : "";
    return (
      `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet xmlns="${MAIN}" xmlns:r="${REL}">` +
      `<sheetViews><sheetView workbookViewId="0"><pane ySplit="1" topLeftCell="A2" activePane="bottomLeft" state="frozen"/></sheetView></sheetViews>` +
      `${cols}<sheetData>${rows}</sheetData></worksheet>`
    );
  });
  const styles =
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<styleSheet xmlns="${MAIN}">` +
    (formats.length ? `<numFmts count="${formats.length}">${formats.map((f, i) => `<numFmt numFmtId="${164 + i}" formatCode="${encodeXmlText(f)}"/>`).join("")}</numFmts>` : "") +
    '<fonts count="2"><font><sz val="11"/><name val="Calibri"/></font><font><b/><sz val="11"/><name val="Calibri"/></font></fonts>' +
    '<fills count="2"><fill><patternFill patternType="none"/></fill><fill><patternFill patternType="gray125"/></fill></fills>' +
    '<borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders>' +
    '<cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs>' +
    `<cellXfs count="${2 + formats.length}"><xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/><xf numFmtId="0" fontId="1" fillId="0" borderId="0" xfId="0" applyFont="1"/>` +
    formats.map((_, i) => `<xf numFmtId="${164 + i}" fontId="0" fillId="0" borderId="0" xfId="0" applyNumberFormat="1"/>`).join("") +
    '</cellXfs><cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/></cellStyles></styleSheet>';
  const workbook =
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<workbook xmlns="${MAIN}" xmlns:r="${REL}"><bookViews><workbookView activeTab="0"/></bookViews><sheets>` +
    sheets.map((s, i) => `<sheet name="${encodeXmlText(s.name)}" sheetId="${i + 1}" r:id="rId${i + 1}"/>`).join("") +
    "</sheets></workbook>";
  const wbRels =
    '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">' +
    sheets.map((_, i) => `<Relationship Id="rId${i + 1}" Type="${REL}/worksheet" Target="worksheets/sheet${i + 1}.xml"/>`).join("") +
    `<Relationship Id="rIdS" Type="${REL}/styles" Target="styles.xml"/></Relationships>`;
  const types =
    '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/>' +
    '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/><Override PartName="/xl/styles.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"/>' +
    sheets.map((_, i) => `<Override PartName="/xl/worksheets/sheet${i + 1}.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>`).join("") +
    "</Types>";
  const rootRels = `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${REL}/officeDocument" Target="xl/workbook.xml"/></Relationships>`;
  const b = (s: string) => Buffer.from(s, "utf8");
  return writeZip([
    { name: "[Content_Types].xml", data: b(types) },
    { name: "_rels/.rels", data: b(rootRels) },
    { name: "xl/workbook.xml", data: b(workbook) },
    { name: "xl/_rels/workbook.xml.rels", data: b(wbRels) },
    { name: "xl/styles.xml", data: b(styles) },
    ...sheetXml.map((x, i) => ({ name: `xl/worksheets/sheet${i + 1}.xml`, data: b(x) })),
  ]);
}
