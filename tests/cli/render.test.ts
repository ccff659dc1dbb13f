/**
 * The season summary's renderings (src/cli/render/season.ts): numbers the same on every machine,
 * and the CSV table safe to open in a spreadsheet. Figures are invented.
 */
import { seasonSummary } from "../../src/engine/season/summary";
import { count, renderSeason, seasonCsv } from "../../src/cli/render/season";

describe("season renderings", () => {
  it("counts group thousands with a comma whatever the machine's locale", () => {
    expect([0, 999, 1000, 1234567].map(count)).toEqual(["0", "999", "1,000", "1,234,567"]);
  });

  it("CSV: RFC 4180 quoting, and a text a spreadsheet would run as a formula is prefixed with '", () => {
    const s = seasonSummary(
      [
        { input: "=HYPERLINK(\"x\").xlsx", reason: 'say "no", then stop' },
        { input: "-1.xlsx", reason: "a,b" },
      ],
      [],
      { seconds: 0, jobs: 1 },
    );
    const rows = seasonCsv(s).split("\r\n");
    expect(rows[1]).toBe(`"'=HYPERLINK(""x"").xlsx",refused,"say ""no"", then stop",,,0,0,0,0,0,0,0,0,0`);
    expect(rows[2]).toBe(`'-1.xlsx,refused,"a,b",,,0,0,0,0,0,0,0,0,0`);
    expect(rows[3]).toBe("");
  });

  it("one refused workbook prints nothing on stdout (its one line on stderr says it); the caution closes any recalculated run", () => {
    const lines: string[] = [];
    renderSeason(seasonSummary([{ input: "x.xlsx", reason: "r" }], [], { seconds: 0, jobs: 1 }), (l) => lines.push(l));
    expect(lines).toEqual([]);
  });
});
