/**
 * Writes computed values into a worksheet's XML without touching anything else: only the cells
 * named in `writes` are re-serialised; every other byte of the part is kept as it was.
 */
import { CellAddress, a1, parseA1 } from "./cellref";
import { encodeXml } from "./xlsx-package";

export type CachedValue = number | string | boolean | { error: string } | null;

export interface CellWrite {
  readonly address: CellAddress;
  readonly value: CachedValue;
  /**
   * For a formula cell written in Excel's add-in form: the stored formula text (no "="), the spill
   * range it covers, and the dynamic-array metadata index. Absent: keep the cell's own <f>.
   */
  readonly arrayFormula?: { readonly text: string; readonly ref: string; readonly cm?: number };
  /** A value-only cell (a spilled element, or a cell a spill no longer covers). */
  readonly valueOnly?: boolean;
}

const CELL = /<c\b[^>]*?(?:\/>|>[\s\S]*?<\/c>)/g;
const ROW = /<row\b[^>]*?(?:\/>|>[\s\S]*?<\/row>)/g;

function cellStyle(xml: string | undefined): string {
  if (!xml) return "";
  const m = /^<c\b[^>]*?\ss=["'](\d+)["']/.exec(xml);
  return m ? ` s="${m[1]}"` : "";
}

function existingFormula(xml: string | undefined): string | undefined {
  if (!xml) return undefined;
  const m = /<f\b[^>]*?(?:\/>|>[\s\S]*?<\/f>)/.exec(xml);
  return m ? m[0] : undefined;
}

function existingCm(xml: string | undefined): string {
  if (!xml) return "";
  const m = /^<c\b[^>]*?\scm=["'](\d+)["']/.exec(xml);
  return m ? ` cm="${m[1]}"` : "";
}

function formatNumber(n: number): string {
  // Shortest round-trip representation; Excel reads exponent form.
  return String(n);
}

/** Serialises one cell. */
export function cellXml(write: CellWrite, old: string | undefined): string {
  const r = a1(write.address);
  const s = cellStyle(old);
  const v = write.value;
  if (write.valueOnly) {
    if (v === null || v === "") return `<c r="${r}"${s}/>`;
    if (typeof v === "number") return `<c r="${r}"${s}><v>${formatNumber(v)}</v></c>`;
    if (typeof v === "boolean") return `<c r="${r}"${s} t="b"><v>${v ? 1 : 0}</v></c>`;
    if (typeof v === "string") return `<c r="${r}"${s} t="inlineStr"><is><t xml:space="preserve">${encodeXml(v)}</t></is></c>`;
    return `<c r="${r}"${s} t="e"><v>${encodeXml(v.error)}</v></c>`;
  }
  let f: string;
  let cm = existingCm(old);
  if (write.arrayFormula) {
    f = `<f t="array" ref="${write.arrayFormula.ref}">${encodeXml(write.arrayFormula.text)}</f>`;
    if (write.arrayFormula.cm !== undefined) cm = ` cm="${write.arrayFormula.cm}"`;
  } else {
    const kept = existingFormula(old);
    if (!kept) throw new Error(`cell ${r} has no formula to keep`);
    f = kept;
  }
  if (v === null) return `<c r="${r}"${s}${cm}>${f}</c>`;
  if (typeof v === "number") return `<c r="${r}"${s}${cm}>${f}<v>${formatNumber(v)}</v></c>`;
  if (typeof v === "boolean") return `<c r="${r}"${s}${cm} t="b">${f}<v>${v ? 1 : 0}</v></c>`;
  if (typeof v === "string") return `<c r="${r}"${s}${cm} t="str">${f}<v>${encodeXml(v)}</v></c>`;
  return `<c r="${r}"${s}${cm} t="e">${f}<v>${encodeXml(v.error)}</v></c>`;
}

// The r attribute is optional in the file format: a row or cell without one follows the previous.
function cellRef(xml: string, previousCol: number): CellAddress {
  const m = /^<c\b[^>]*?\sr=["']([A-Z]+\d+)["']/.exec(xml);
  return m ? parseA1(m[1] as string) : { row: -1, col: previousCol + 1 };
}

function rowNumber(xml: string, previousRow: number): number {
  const m = /^<row\b[^>]*?\sr=["'](\d+)["']/.exec(xml);
  return m ? Number(m[1]) - 1 : previousRow + 1;
}

/** Applies `writes` to a worksheet part's XML. */
export function patchSheetXml(xml: string, writes: readonly CellWrite[]): string {
  if (writes.length === 0) return xml;
  const open = /<sheetData\b[^>]*?(\/>|>)/.exec(xml);
  if (!open) throw new Error("worksheet has no sheetData");
  const start = open.index;
  const selfClosing = open[1] === "/>";
  const bodyStart = start + open[0].length;
  const end = selfClosing ? bodyStart : xml.indexOf("</sheetData>", bodyStart);
  const body = selfClosing ? "" : xml.slice(bodyStart, end);
  const tail = selfClosing ? xml.slice(bodyStart) : xml.slice(end + "</sheetData>".length);

  const byRow = new Map<number, CellWrite[]>();
  for (const w of writes) {
    const list = byRow.get(w.address.row) ?? [];
    list.push(w);
    byRow.set(w.address.row, list);
  }

  const out: string[] = [];
  let last = 0;
  const pending = [...byRow.keys()].sort((a, b) => a - b);
  let p = 0;
  let r = -1;
  for (const m of body.matchAll(ROW)) {
    const rowXml = m[0];
    r = rowNumber(rowXml, r);
    while (p < pending.length && (pending[p] as number) < r) {
      out.push(body.slice(last, m.index));
      last = m.index as number;
      out.push(newRow(pending[p] as number, byRow.get(pending[p] as number) as CellWrite[]));
      p += 1;
    }
    if (p < pending.length && pending[p] === r) {
      out.push(body.slice(last, m.index));
      out.push(patchRow(rowXml, byRow.get(r) as CellWrite[]));
      last = (m.index as number) + rowXml.length;
      p += 1;
    }
  }
  out.push(body.slice(last));
  while (p < pending.length) {
    out.push(newRow(pending[p] as number, byRow.get(pending[p] as number) as CellWrite[]));
    p += 1;
  }
  return `${xml.slice(0, start)}<sheetData>${out.join("")}</sheetData>${tail}`;
}

function newRow(row: number, writes: CellWrite[]): string {
  const cells = [...writes].sort((a, b) => a.address.col - b.address.col).map((w) => cellXml(w, undefined));
  return `<row r="${row + 1}">${cells.join("")}</row>`;
}

function patchRow(rowXml: string, writes: CellWrite[]): string {
  const openEnd = rowXml.indexOf(">");
  const selfClosing = rowXml[openEnd - 1] === "/";
  // A row's optional spans attribute is only a hint; drop it since cells may be added.
  const openTag = (selfClosing ? rowXml.slice(0, openEnd - 1) : rowXml.slice(0, openEnd)).replace(/\sspans=(?:"[^"]*"|'[^']*')/, "");
  const inner = selfClosing ? "" : rowXml.slice(openEnd + 1, rowXml.length - "</row>".length);
  const byCol = new Map(writes.map((w) => [w.address.col, w]));
  const pending = [...byCol.keys()].sort((a, b) => a - b);
  const out: string[] = [];
  let last = 0;
  let p = 0;
  let c = -1;
  for (const m of inner.matchAll(CELL)) {
    c = cellRef(m[0], c).col;
    while (p < pending.length && (pending[p] as number) < c) {
      out.push(inner.slice(last, m.index));
      last = m.index as number;
      out.push(cellXml(byCol.get(pending[p] as number) as CellWrite, undefined));
      p += 1;
    }
    if (p < pending.length && pending[p] === c) {
      out.push(inner.slice(last, m.index));
      out.push(cellXml(byCol.get(c) as CellWrite, m[0]));
      last = (m.index as number) + m[0].length;
      p += 1;
    }
  }
  out.push(inner.slice(last));
  while (p < pending.length) {
    out.push(cellXml(byCol.get(pending[p] as number) as CellWrite, undefined));
    p += 1;
  }
  return `${openTag}>${out.join("")}</row>`;
}
