/**
 * Date cells read and written in both of Excel's date systems. A cell stored as an ISO date
 * (t="d") is read as its serial number in the workbook's own system; a SOIL-dependent formula
 * over it computes with that serial and writes a plain number; the date cell itself is written
 * back unchanged. Serials: the 1900 system counts 1 January 1900 as 1 and a 29 February 1900 that
 * did not exist (60); the 1904 system counts 1 January 1904 as 0, 1,462 days after the 1900
 * system's (Microsoft, "Date systems in Excel", from memory). Source of every serial below:
 * LibreOffice 7.4 headless, recalculating `=A2+0` over the same date cells in a 1900 and a 1904
 * workbook, except the 1900 system before 1 March 1900, where LibreOffice is one higher than Excel
 * by design (tests/fixtures/corpus/excel-overrides.json, DATE(1900,1,1): Excel 1, LibreOffice 2).
 * Dates before 1904 in a 1904 workbook are left out: Excel's answer there was not seen.
 * Contents invented.
 */
import { isoToSerial } from "../../src/engine/book";
import { c, f, recalcSpec, row } from "../helpers/xlsx";
import { readPart } from "../helpers/workbook";

const d = (ref: string, iso: string) => `<c r="${ref}" t="d"><v>${iso}</v></c>`;
// B1 is a SOIL cell worth 0 (0 t/ha in kg/ha), so every formula adding it is recomputed.
const zero = f("B1", '_xldudf_SOIL_CONVERT(0,"t/ha","kg/ha")', 0);

const SYSTEMS: [string, boolean, [string, number][]][] = [
  [
    "1900",
    false,
    [
      ["2024-03-01", 45352],
      ["2024-03-01T12:00:00", 45352.5],
      ["2024-02-29T06:00:00Z", 45351.25],
      ["1904-01-01", 1462],
      ["1904-01-02", 1463],
      ["1900-03-01", 61],
      ["1900-02-28", 59], // LibreOffice 60
      ["1900-01-01", 1], // LibreOffice 2
    ],
  ],
  [
    "1904",
    true,
    [
      ["2024-03-01", 43890],
      ["2024-03-01T12:00:00", 43890.5],
      ["2024-02-29T06:00:00Z", 43889.25],
      ["1904-01-01", 0],
      ["1904-01-02", 1],
    ],
  ],
];

describe.each(SYSTEMS)("the %s date system", (_name, date1904, dates) => {
  it.each(dates)("isoToSerial(%s) is %d", (iso, serial) => {
    expect(isoToSerial(iso, date1904)).toBe(serial);
  });

  it("a date cell is read as its serial, a formula over it writes the serial, the date cell is written back unchanged", async () => {
    const rows = [row(1, c("A1", 0), zero), ...dates.map(([iso], i) => row(i + 2, d(`A${i + 2}`, iso), f(`C${i + 2}`, `A${i + 2}+B1`, -999)))].join("");
    const { summary, values, output } = await recalcSpec({ date1904, sheets: [{ name: "S", rows }] });
    expect(summary.errors).toEqual([]);
    expect(dates.map(([iso], i) => [iso, values.get(`S!C${i + 2}`)])).toEqual(dates);
    const xml = (await readPart(output, "xl/worksheets/sheet1.xml"))!;
    for (const [iso] of dates) expect(xml).toContain(`t="d"><v>${iso}</v></c>`);
    expect(xml).toContain(`<c r="C2"><f>A2+B1</f><v>${dates[0]![1]}</v></c>`);
  });
});

describe("the two systems side by side", () => {
  it("from 1 January 1904 on, a date's 1900 serial is its 1904 serial + 1,462", () => {
    for (const iso of ["1904-01-01", "2024-03-01", "2024-03-01T12:00:00"]) expect(isoToSerial(iso, false)! - isoToSerial(iso, true)!).toBe(1462);
  });
  it("the 1900 system's 29 February 1900: 28 February to 1 March is 2 serials, 1 March to 2 March is 1", () => {
    expect(isoToSerial("1900-03-01", false)! - isoToSerial("1900-02-28", false)!).toBe(2);
    expect(isoToSerial("1900-03-02", false)! - isoToSerial("1900-03-01", false)!).toBe(1);
  });
  it("text that is not an ISO date is not read as one", () => {
    expect(isoToSerial("01/03/2024", false)).toBeUndefined();
    expect(isoToSerial("2024-3-1", true)).toBeUndefined();
  });
});

describe("TODAY() in each system", () => {
  it.each([
    ["1900", false],
    ["1904", true],
  ] as const)("the %s system counts today from its own epoch (the local date, whatever the time zone)", async (_name, date1904) => {
    const t = Date.UTC(2024, 2, 1, 12, 0, 0);
    const local = new Date(t);
    const pad = (n: number) => String(n).padStart(2, "0");
    const today = isoToSerial(`${local.getFullYear()}-${pad(local.getMonth() + 1)}-${pad(local.getDate())}`, date1904)!;
    const spy = jest.spyOn(Date, "now").mockReturnValue(t);
    try {
      const { summary, values } = await recalcSpec({ date1904, sheets: [{ name: "S", rows: row(1, c("A1", 0), zero, f("C1", "TODAY()+B1", -999)) }] });
      expect(summary.errors).toEqual([]);
      expect(values.get("S!C1")).toBe(today);
      // 2024-03-01 (or the day either side of it, by time zone): 45352 or 43890 in UTC
      expect(Math.abs(today - (date1904 ? 43890 : 45352))).toBeLessThanOrEqual(1);
    } finally {
      spy.mockRestore();
    }
  });
});
