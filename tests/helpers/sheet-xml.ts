/**
 * (A helper: no reference values of its own; the workbooks it reads are invented.)
 * A sheet part's cells as raw XML, for byte-for-byte checks: each <c> element exactly as it
 * stands in the part, its formula by meaning (type, ref, shared index, decoded text), and what
 * surrounds <sheetData> (with <dimension> left out: a spill may widen it). Parsed with the
 * oracle's strict tokenizer (scripts/oracle/xml.js), namespace prefixes resolved.
 */
import fs from "fs";
import JSZip from "jszip";
import { Element, parse, textOf } from "../../scripts/oracle/xml";
import { a1, parseA1 } from "../../scripts/oracle/xlsx-cells";

export interface RawCell {
  readonly raw: string;
  /** JSON of [t, ref, si, text] of the cell's <f>, when it has one. */
  readonly f?: string;
}

const kids = (e: Element | undefined, local: string): Element[] => (e ? (e.children.filter((x) => "local" in x && x.local === local) as Element[]) : []);

export function rawCells(xml: string): { cells: Map<string, RawCell>; head: string; tail: string } {
  const root = parse(xml);
  const cells = new Map<string, RawCell>();
  const data = kids(root, "sheetData")[0];
  let row = -1;
  for (const r of kids(data, "row")) {
    row = r.attrs.get("r") ? Number(r.attrs.get("r")) - 1 : row + 1;
    let col = -1;
    for (const c of kids(r, "c")) {
      const at = c.attrs.get("r") ? parseA1(c.attrs.get("r")!) : { row, col: col + 1 };
      col = at.col;
      const f = kids(c, "f")[0];
      const formula = f ? JSON.stringify([f.attrs.get("t") ?? "normal", f.attrs.get("ref") ?? "", f.attrs.get("si") ?? "", textOf(f)]) : undefined;
      cells.set(a1(at.row, at.col), { raw: xml.slice(c.start, c.end), f: formula });
    }
  }
  const dimensionless = (s: string) => s.replace(/<([A-Za-z_][\w.-]*:)?dimension\b[^>]*\/>/, "");
  return { cells, head: dimensionless(data ? xml.slice(0, data.start) : xml), tail: data ? xml.slice(data.end) : "" };
}

/** Every part of a package, decompressed, with CRCs checked. */
export async function zipParts(file: string): Promise<Map<string, Buffer>> {
  const zip = await JSZip.loadAsync(fs.readFileSync(file), { checkCRC32: true });
  const out = new Map<string, Buffer>();
  for (const [name, entry] of Object.entries(zip.files)) if (!entry.dir) out.set(name, await entry.async("nodebuffer"));
  return out;
}
