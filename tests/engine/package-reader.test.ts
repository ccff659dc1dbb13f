/**
 * The package reader (openPackage) on damaged zip packages, in process: a corrupt compressed
 * part, a CRC that does not match, sizes that do not match what the headers declare, and the
 * 10,000-part limit, at the limit and one past it. Each is one WorkbookFileError naming the part;
 * nothing is read from a part that fails. Workbook contents are invented.
 */
import { openPackage, PACKAGE_LIMITS, WorkbookFileError } from "../../src/engine/xlsx-package";
import { baseWorkbook, partsOf, Parts, zipOf } from "../reliability/hostile-files";
import { writeZip } from "../reliability/zip-writer";

const SHEET = "xl/worksheets/sheet1.xml";
let parts: Parts;
beforeAll(async () => {
  parts = await partsOf(await baseWorkbook());
});

async function refusal(bytes: Buffer): Promise<string> {
  try {
    await openPackage(bytes);
  } catch (e) {
    expect(e).toBeInstanceOf(WorkbookFileError);
    return (e as Error).message;
  }
  throw new Error("opened a package that should have been refused");
}

describe("a valid package opens (the baseline for every damaged one below)", () => {
  it("deflated and stored", async () => {
    expect((await openPackage(zipOf(parts))).sheets.map((s) => s.name)).toEqual(["Lab"]);
    const stored = Object.fromEntries([...parts.keys()].map((n) => [n, { store: true }]));
    expect((await openPackage(zipOf(parts, stored))).sheets.map((s) => s.name)).toEqual(["Lab"]);
  });
});

describe("corrupt compressed parts", () => {
  it("a deflate stream that is not one: cannot be decompressed, naming the part", async () => {
    const msg = await refusal(zipOf(parts, { [SHEET]: { damage: (b) => b.fill(0xff, 0, 4) } }));
    expect(msg).toMatch(new RegExp(`^part ${SHEET} cannot be decompressed: the file is damaged \\(`));
  });
  it("a stream that inflates but to other bytes: fails its CRC check", async () => {
    // Stored bytes changed after the CRC was taken: the same length, other content.
    const msg = await refusal(zipOf(parts, { [SHEET]: { store: true, damage: (b) => (b[b.length - 3] ^= 0x01, b) } }));
    expect(msg).toBe(`part ${SHEET} fails its CRC check: the file is damaged`);
  });
  it("a CRC in the headers that does not match good bytes: refused the same way", async () => {
    const msg = await refusal(zipOf(parts, { [SHEET]: { declaredCrc: 0x12345678 } }));
    expect(msg).toBe(`part ${SHEET} fails its CRC check: the file is damaged`);
  });
});

describe("sizes that do not match the headers", () => {
  const real = () => parts.get(SHEET)!.length;
  it("declared one byte larger than the part (deflated): holds fewer bytes than declared", async () => {
    const msg = await refusal(zipOf(parts, { [SHEET]: { declaredSize: real() + 1 } }));
    expect(msg).toBe(`part ${SHEET} holds ${real()} bytes but its header declares ${real() + 1}: the file is damaged`);
  });
  // Inflating stops one byte past the declared size: one byte over is a plain mismatch, more is
  // refused as a zip bomb without inflating the rest.
  it("declared one byte smaller (deflated): a mismatch", async () => {
    const msg = await refusal(zipOf(parts, { [SHEET]: { declaredSize: real() - 1 } }));
    expect(msg).toBe(`part ${SHEET} holds ${real()} bytes but its header declares ${real() - 1}: the file is damaged`);
  });
  it("declared two bytes smaller (deflated): expands beyond the declared size, refused as a zip bomb", async () => {
    const msg = await refusal(zipOf(parts, { [SHEET]: { declaredSize: real() - 2 } }));
    expect(msg).toBe(`part ${SHEET} expands beyond the ${real() - 2} bytes its header declares, which looks like a zip bomb; refused`);
  });
  it("declared smaller than a stored part: a mismatch", async () => {
    const msg = await refusal(zipOf(parts, { [SHEET]: { store: true, declaredSize: real() - 5 } }));
    expect(msg).toBe(`part ${SHEET} holds ${real()} bytes but its header declares ${real() - 5}: the file is damaged`);
  });
  it("declared larger than a stored part: the same mismatch", async () => {
    const msg = await refusal(zipOf(parts, { [SHEET]: { store: true, declaredSize: real() + 7 } }));
    expect(msg).toBe(`part ${SHEET} holds ${real()} bytes but its header declares ${real() + 7}: the file is damaged`);
  });
  it("declared exactly: opens", async () => {
    await expect(openPackage(zipOf(parts, { [SHEET]: { declaredSize: real() } }))).resolves.toBeDefined();
  });
});

describe("the number of parts", () => {
  const padded = (n: number) => {
    const entries = [...parts].map(([name, data]) => ({ name, data, store: true }));
    for (let i = entries.length; i < n; i++) entries.push({ name: `customXml/pad${i}.bin`, data: Buffer.alloc(0), store: true });
    return writeZip(entries);
  };
  it(`the limit is ${PACKAGE_LIMITS.maxParts} parts (common practice: far above any workbook's count, below a memory problem)`, () => {
    expect(PACKAGE_LIMITS.maxParts).toBe(10000);
  });
  it("exactly 10,000 parts: read", async () => {
    expect((await openPackage(padded(10000))).sheets.map((s) => s.name)).toEqual(["Lab"]);
  });
  it("10,001 parts: refused from the directory, before any part is expanded", async () => {
    expect(await refusal(padded(10001))).toBe("the file has 10001 parts, more than 10000");
  });
});
