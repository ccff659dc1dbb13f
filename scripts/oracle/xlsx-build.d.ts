/** Types for xlsx-build.js (hand-templated .xlsx writer). Cells are described in xlsx-build.js. */
export interface BuildSheet {
  name: string;
  cells?: Record<string, unknown>;
  merges?: string[];
  before?: string;
  after?: string;
  prefix?: string;
  rels?: { Id: string; Type: string; Target: string; TargetMode?: string }[];
}

export interface BuildBook {
  sheets: BuildSheet[];
  names?: { name: string; value: string; sheet?: string }[];
  date1904?: boolean;
  sentinel?: number;
  parts?: Record<string, { content: string; contentType?: string }>;
  workbookRels?: { Id: string; Type: string; Target: string; TargetMode?: string }[];
  externalReferences?: string[];
}

export function buildXlsx(book: BuildBook): Promise<Buffer>;
export const METADATA: string;
export const STYLES: string;
export const NS: string;
export const R_NS: string;
