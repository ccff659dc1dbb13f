/**
 * Case-insensitive lookup of the words users type (units, ions, forms, methods), with aliases.
 * Unknown words raise UNKNOWN_NAME with the accepted words listed.
 */
import { SoilError, listWords } from "./errors";

export interface NameTable<T> {
  /** Canonical ids in their display spelling, in table order. */
  readonly ids: readonly string[];
  lookup(word: string, what: string): T;
  has(word: string): boolean;
}

/** Normalises a typed word: trims, lower-cases, removes inner spaces and the micro sign variants. */
export function normaliseWord(word: string): string {
  return word.trim().toLowerCase().replace(/\s+/g, "").replace(/μ/g, "µ");
}

export function nameTable<T>(entries: readonly { id: string; aliases?: readonly string[]; value: T }[]): NameTable<T> {
  const map = new Map<string, T>();
  for (const e of entries) {
    for (const w of [e.id, ...(e.aliases ?? [])]) {
      const key = normaliseWord(w);
      const prior = map.get(key);
      if (prior !== undefined && prior !== e.value) throw new Error(`duplicate name in table: ${w}`);
      map.set(key, e.value);
    }
  }
  const ids = entries.map((e) => e.id);
  // Words as typed are few (a unit column repeats one word); remember their normal form.
  const seen = new Map<string, string>();
  const key = (word: string): string => {
    let k = seen.get(word);
    if (k === undefined) {
      k = normaliseWord(word);
      // Stryker disable next-line ConditionalExpression,EqualityOperator: equivalent: the cap only bounds the memo's memory; a word not remembered is normalised again to the same key
      if (seen.size < 4096) seen.set(word, k);
    }
    return k;
  };
  return {
    ids,
    has: (word) => map.has(key(word)),
    lookup(word, what) {
      const found = map.get(key(word));
      if (found === undefined) {
        throw new SoilError("UNKNOWN_NAME", `unknown ${what} "${word}"; use ${listWords(ids)}`);
      }
      return found;
    },
  };
}
