/** Types for libreoffice-values.js (the oracle run). */
import { CachedValue } from "./xlsx-cells";

export interface Expected {
  readonly file: string;
  readonly what: string;
  readonly reference: string;
  readonly cells: Record<string, Record<string, CachedValue>>;
  readonly fromSoilcell?: Record<string, Record<string, string>>;
  readonly excelOverrides?: Record<string, Record<string, { excel: CachedValue; libreoffice: CachedValue; reason: string; source: string }>>;
}

export function computeExpected(corpus?: string): Promise<{ result: Record<string, Expected>; problems: string[] }>;
export function differences(name: string, want: Expected, got: Expected): string[];
