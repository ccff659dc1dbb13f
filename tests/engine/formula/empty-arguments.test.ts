/**
 * An argument written but left empty (VLOOKUP(x,t,2,), LEFT(s,)) is not the same as one left out:
 * Excel passes it as a missing value read as 0, FALSE or "", so VLOOKUP(x,t,2,) matches exactly
 * and LEFT(s,) takes no characters, while the default (TRUE, 1) applies only to an argument not
 * written at all. Before this was checked the engine took the defaults, a silently wrong number
 * (VLOOKUP(2.5,...,2,) gave 20 where Excel shows #N/A).
 *
 * Expected values: LibreOffice 7.4 headless recalculating the same cells (a one-off run of
 * scripts/oracle's builder and converter on these formulas), which agrees with Excel's reading of
 * an empty argument as 0 / FALSE (from memory: VLOOKUP(x,t,2,) is the trade's idiom for an exact
 * match). Where LibreOffice gives another error code than the engine (#VALUE! for #NUM!), both are
 * errors and Microsoft's pages name the engine's (WEEKDAY: return_type out of range is #NUM!;
 * LARGE: k <= 0 is #NUM!). Refusals are the engine's own (behaviour). Cells invented.
 */
import { compute } from "../../helpers/sheet-eval";

const CELLS = { A1: 1, B1: 10, A2: 2, B2: 20, A3: 3, B3: 30 };

const CASES: [string, number | string | boolean][] = [
  // lookups: an empty match argument is an exact match
  ["VLOOKUP(2.5,A1:B3,2,)", "#N/A"], // LO
  ["VLOOKUP(2,A1:B3,2,)", 20], // LO
  ["VLOOKUP(2.5,A1:B3,2)", 20], // left out: approximate (Microsoft Support, VLOOKUP: range_lookup omitted is TRUE)
  ["HLOOKUP(2.5,{1,2,3;10,20,30},2,)", "#N/A"], // LO
  ["MATCH(2.5,{1,2,3},)", "#N/A"], // LO
  ["MATCH(2,{1,2,3},)", 2], // LO
  ["MATCH(2.5,{1,2,3})", 2], // left out: match_type 1 (Microsoft Support, MATCH)
  // text: an empty count is 0 characters, an empty start is position 0 (outside the text)
  ['LEFT("abc",)', ""], // LO
  ['RIGHT("abc",)', ""], // LO
  ['LEFT("abc")', "a"], // left out: 1 character (Microsoft Support, LEFT)
  ['MID("abc",2,)', ""], // LO
  ['REPT("a",)', ""], // LO
  ['FIND("b","abc",)', "#VALUE!"], // LO
  ['SEARCH("b","abc",)', "#VALUE!"], // LO
  ['SUBSTITUTE("aXaX","X","-",)', "#VALUE!"], // LO: instance 0
  ['SUBSTITUTE("aXa","X",)', "aa"], // LO: new_text empty is ""
  // numbers: an empty number is 0
  ["TRUNC(2.7,)", 2], // LO
  ["ROUND(1.5,)", 2], // LO
  ["POWER(2,)", 1], // LO
  ["MOD(5,)", "#DIV/0!"], // LO
  ["LOG(8,)", "#NUM!"], // LO: an error too (#VALUE!); base 0 has no logarithm
  ["WEEKDAY(45000,)", "#NUM!"], // LO: an error too (#VALUE!); Microsoft Support, WEEKDAY: a return_type out of range is #NUM!
  ["LARGE(A1:A3,)", "#NUM!"], // LO: an error too (#VALUE!); Microsoft Support, LARGE: k <= 0 is #NUM!
  ["DATE(2020,,1)", 43800], // LO: month 0 is December of the year before
  ["TIME(1,,)", 1 / 24], // LO
  ["SUM(1,,2)", 3], // LO
  ["AVERAGE(1,,3)", 4 / 3], // LO
  ["MIN(,5)", 0], // LO
  ["PRODUCT(2,,3)", 0], // LO
  ["COUNT(1,,)", 3], // LO
  ['CONCATENATE("a",,"b")', "ab"], // LO
  ["AND(TRUE,)", false], // LO
  ['EXACT(,"")', true], // LO
  ["IF(FALSE,1,)", 0], // LO
  ["IFERROR(1/0,)", 0], // LO
  ["CHOOSE(2,1,,3)", 0], // LO
  // OFFSET keeps the reference's height and width when they are left empty (LO)
  ["ROWS(OFFSET(A1:B2,0,0,,))", 2],
  ["COLUMNS(OFFSET(A1:B2,0,0,,))", 2],
  ["OFFSET(A1,,1)", 10], // LO
];

describe("an argument left empty reads as 0, FALSE or \"\" (not as the default)", () => {
  it.each(CASES)("%s is %p", async (formula, expected) => {
    const r = await compute(CELLS, { D1: formula });
    const v = r("D1");
    if (typeof expected === "number") expect(v).toBeCloseTo(expected, 12);
    else expect(v).toBe(expected);
  });
});

describe("where Excel's reading is not established, an empty argument is refused", () => {
  it("SUMIF and AVERAGEIF with the sum range left empty (LibreOffice gives #VALUE!)", async () => {
    const r = await compute(CELLS, { D1: 'SUMIF(A1:A3,">1",)', D2: 'AVERAGEIF(A1:A3,">1",)', D3: 'SUMIF(A1:A3,">1")' });
    expect(r("D1")).toContain("(SUMIF with its third argument left empty is not computed headless (give the range, or leave the argument out))");
    expect(r("D2")).toContain("(AVERAGEIF with its third argument left empty is not computed headless (give the range, or leave the argument out))");
    expect(r("D3")).toBe(5); // left out: the criteria range is summed (Microsoft Support, SUMIF)
  });
  it("INDIRECT with a1 left empty is FALSE, so R1C1, which is not computed headless", async () => {
    const r = await compute(CELLS, { D1: 'INDIRECT("A1",)', D2: 'INDIRECT("A1")' });
    expect(r("D1")).toContain("(INDIRECT with R1C1 references is not computed headless)");
    expect(r("D2")).toBe(1);
  });
  it("an empty argument in an array-lifted call stays empty in every element", async () => {
    const r = await compute(CELLS, { D1: { da: 'LEFT({"abc","de"},)', spill: "D1:E1" }, D3: { da: "VLOOKUP({2,2.5},A1:B3,2,)", spill: "D3:E3" } });
    expect([r("D1"), r("E1")]).toEqual(["", ""]);
    expect([r("D3"), r("E3")]).toEqual([20, "#N/A"]);
  });
});
