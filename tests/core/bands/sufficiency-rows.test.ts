/**
 * The words and texts of the built-in sufficiency tables (sufficiency-rows.ts): a crop argument
 * read as a crop or a rotation, and the words a row is described by in messages and lists. The
 * rows used are the built-in ones, read by id (their sources are in their data files and in
 * sufficiency.test.ts); a row varied here (a CEC condition added) is marked invented.
 */
import { listWords } from "../../../src/core/errors";
import {
  CROPS,
  SufficiencyRow,
  cecMatches,
  cecText,
  coverText,
  describeRow,
  knownCombinations,
  readCrop,
  rowById,
  samplingText,
} from "../../../src/core/bands/sufficiency-rows";
import { errorCode as code, errorMessage } from "../../helpers/errors";

const row = (id: string): SufficiencyRow => {
  const r = rowById(id);
  if (!r) throw new Error(`no row ${id}`);
  return r;
};
const K_SANDY = row("tristate2020-m3-k-cec-5-or-less");
const K_OTHER = row("tristate2020-m3-k-cec-above-5");
const BRAY_ANY = row("sare-bray1-p");
const BRAY_CS = row("tristate1995-bray1-p-corn-soybean");
const BRAY_WA = row("tristate1995-bray1-p-wheat-alfalfa");
const BRAY_PASTURE = row("mmfs-bray1-p-pasture");
const COLWELL_WHEAT = row("grdc2020-colwell-p-wheat");
const SOY_K = row("yinvyn2002-soybean-tissue-k");

describe("a crop argument", () => {
  it("omitted, blank or 'any' is no crop", () => {
    for (const w of [undefined, "", "   ", "any", " Any "]) expect(readCrop(w)).toBeUndefined();
  });
  it("one crop word (or alias) is that crop, the word kept as typed but trimmed", () => {
    expect(readCrop(" maize ")).toEqual({ crops: ["corn"], rotation: false, word: "maize" });
  });
  it("crops joined by a separator are a rotation; blank parts from a doubled or trailing separator are dropped", () => {
    expect(readCrop(" corn - soybean ")).toEqual({ crops: ["corn", "soybean"], rotation: true, word: "corn - soybean" });
    expect(readCrop("corn--soybean")).toEqual({ crops: ["corn", "soybean"], rotation: true, word: "corn--soybean" });
    expect(readCrop("corn+soybean,")).toEqual({ crops: ["corn", "soybean"], rotation: true, word: "corn+soybean," });
  });
  it("an unknown single word is refused with the crops listed", () => {
    expect(code(() => readCrop("rice"))).toBe("UNKNOWN_NAME");
    expect(errorMessage(() => readCrop("rice"))).toBe(`unknown crop "rice"; use ${listWords(CROPS.ids)}`);
    expect(errorMessage(() => readCrop("corn-"))).toBe(`unknown crop "corn-"; use ${listWords(CROPS.ids)}`);
  });
  it("an unknown crop in a rotation is refused naming it, the rotation and how to write one", () => {
    const tail = `; use a crop (${listWords(CROPS.ids)}) or a rotation of them joined by "-", e.g. corn-soybean-wheat`;
    expect(code(() => readCrop(" corn-rice "))).toBe("UNKNOWN_NAME");
    expect(errorMessage(() => readCrop(" corn-rice "))).toBe(`unknown crop "rice" in "corn-rice"${tail}`);
    expect(errorMessage(() => readCrop(" rice - corn"))).toBe(`unknown crop "rice" in "rice - corn"${tail}`);
  });
  it("'any' cannot be part of a rotation", () => {
    expect(code(() => readCrop(" corn-any "))).toBe("UNKNOWN_NAME");
    expect(errorMessage(() => readCrop(" corn-any "))).toBe('"any" cannot be part of a rotation ("corn-any"); name the crops');
  });
});

describe("a row in words", () => {
  it("its CEC condition", () => {
    expect(cecText(K_SANDY)).toBe("CEC ≤ 5 cmol(+)/kg");
    expect(cecText(K_OTHER)).toBe("CEC > 5 cmol(+)/kg");
    expect(cecText(BRAY_ANY)).toBe("");
  });
  it("what it covers: any crop, a rotation, or its crops", () => {
    expect(coverText(BRAY_ANY)).toBe("any crop");
    expect(coverText(BRAY_CS)).toBe("rotation of corn and soybean only");
    expect(coverText(BRAY_WA)).toBe("rotation including wheat or alfalfa");
    expect(coverText(K_SANDY)).toBe("corn, soybean, wheat, alfalfa");
    expect(coverText(COLWELL_WHEAT)).toBe("wheat");
  });
  it("its sampling: depth, or plant part and stage", () => {
    expect(samplingText(BRAY_PASTURE)).toBe("0-10 cm");
    expect(samplingText(SOY_K)).toBe(`${SOY_K.part}, ${SOY_K.stage}`);
    expect(samplingText(BRAY_ANY)).toBe("");
  });
  it("in a message: nutrient, method, then what it covers, its CEC and sampling, and its unit", () => {
    expect(describeRow(BRAY_ANY)).toBe("P Bray-1 (any crop; mg/kg)");
    expect(describeRow(BRAY_PASTURE)).toBe("P Bray-1 (pasture; 0-10 cm; mg/kg)");
    expect(describeRow(K_OTHER)).toBe("K Mehlich-3 (corn, soybean, wheat, alfalfa; CEC > 5 cmol(+)/kg; mg/kg)");
  });
  it("the combinations that exist: one per table, the CEC rows of a test once, 'by CEC'", () => {
    expect(knownCombinations([K_SANDY, K_OTHER])).toBe("K Mehlich-3 (corn, soybean, wheat, alfalfa; mg/kg; by CEC)");
    expect(knownCombinations([BRAY_ANY, BRAY_PASTURE, BRAY_ANY])).toBe("P Bray-1 (any crop; mg/kg); P Bray-1 (pasture; 0-10 cm; mg/kg)");
    // Invented: a CEC condition added to a tissue row whose part has brackets of its own; 'by CEC' closes the whole.
    const invented = { ...SOY_K, cec: { max: 5 } };
    expect(knownCombinations([invented])).toBe(`K tissue (soybean; ${SOY_K.part}, ${SOY_K.stage}; %; by CEC)`);
  });
});

describe("a CEC condition", () => {
  it("a row without one fits any CEC", () => {
    expect(cecMatches(BRAY_ANY, 3)).toBe(true);
  });
  it("'at most' includes its limit, 'above' excludes it", () => {
    expect([cecMatches(K_SANDY, 5), cecMatches(K_SANDY, 5.01)]).toEqual([true, false]);
    expect([cecMatches(K_OTHER, 5), cecMatches(K_OTHER, 5.01)]).toEqual([false, true]);
  });
});

describe("a row by its id", () => {
  it("is found whatever the case and spaces around it; an unknown id is undefined", () => {
    expect(rowById(" SARE-Bray1-P ")).toBe(BRAY_ANY);
    expect(rowById("sare-bray1")).toBeUndefined();
  });
});
