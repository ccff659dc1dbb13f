/**
 * The zip reader and writer (src/engine/zip.ts) on hand-built archives: the end record and its
 * search window, entry-count and size limits, encrypted, ZIP64, multi-disk, duplicate and folder
 * entries, local headers, compression methods, corrupt deflate data, sizes and CRCs; and the exact
 * bytes the writer produces (headers, stored versus deflated, copied entries).
 *
 * Layouts and fields: PKWARE APPNOTE.TXT 6.3.x: §4.3.7 local file header (signature 0x04034b50,
 * 30 bytes + name + extra), §4.3.12 central directory header (0x02014b50, 46 bytes + name + extra +
 * comment), §4.3.16 end of central directory record (0x06054b50, 22 bytes + a comment of at most
 * 65,535 bytes), §4.4.4 general purpose flags (bit 0 encrypted, bit 11 UTF-8 names), §4.4.5
 * compression methods (0 stored, 8 deflated), §4.4.6 MS-DOS date (year since 1980 << 9 | month << 5
 * | day), §4.4.7 CRC-32, §4.3.14/§4.4.1 ZIP64 markers 0xFFFF / 0xFFFFFFFF. Deflate streams: RFC 1951
 * (a block header of type 11 is an error, §3.2.3; a stored block's LEN/NLEN must be complements,
 * §3.2.4). Refusal wording and the limits are behaviour (src/engine/zip.ts header, xlsx-package.ts
 * PACKAGE_LIMITS).
 */
import zlib from "zlib";
import { ZipEntry, ZipError, inflateEntry, readZipDirectory, writeZip } from "../../src/engine/zip";

interface Raw {
  name: string;
  data: Buffer;
  method?: number;
  flags?: number;
  crc?: number;
  size?: number;
  body?: Buffer;
  extra?: Buffer;
  localExtra?: Buffer;
  comment?: Buffer;
}

/** An archive laid out field by field (APPNOTE §4.3.6), every field overridable. */
function build(entries: Raw[], end: { count?: number; disk?: number; dirDisk?: number; dirOffset?: number; dirSize?: number; comment?: Buffer; localOffset?: (i: number, real: number) => number } = {}): Buffer {
  const locals: Buffer[] = [];
  const centrals: Buffer[] = [];
  let offset = 0;
  entries.forEach((e, i) => {
    const name = Buffer.from(e.name, "utf8");
    const method = e.method ?? 0;
    const body = e.body ?? (method === 8 ? zlib.deflateRawSync(e.data) : e.data);
    const crc = e.crc ?? zlib.crc32(e.data) >>> 0;
    const size = e.size ?? e.data.length;
    const localExtra = e.localExtra ?? Buffer.alloc(0);
    const loc = Buffer.alloc(30);
    loc.writeUInt32LE(0x04034b50, 0);
    loc.writeUInt16LE(20, 4);
    loc.writeUInt16LE(e.flags ?? 0x0800, 6);
    loc.writeUInt16LE(method, 8);
    loc.writeUInt32LE(crc, 14);
    loc.writeUInt32LE(body.length, 18);
    loc.writeUInt32LE(size, 22);
    loc.writeUInt16LE(name.length, 26);
    loc.writeUInt16LE(localExtra.length, 28);
    const extra = e.extra ?? Buffer.alloc(0);
    const comment = e.comment ?? Buffer.alloc(0);
    const cen = Buffer.alloc(46);
    cen.writeUInt32LE(0x02014b50, 0);
    cen.writeUInt16LE(20, 4);
    cen.writeUInt16LE(20, 6);
    cen.writeUInt16LE(e.flags ?? 0x0800, 8);
    cen.writeUInt16LE(method, 10);
    cen.writeUInt16LE(0x1234, 12);
    cen.writeUInt16LE(0x5678, 14);
    cen.writeUInt32LE(crc, 16);
    cen.writeUInt32LE(body.length, 20);
    cen.writeUInt32LE(size, 24);
    cen.writeUInt16LE(name.length, 28);
    cen.writeUInt16LE(extra.length, 30);
    cen.writeUInt16LE(comment.length, 32);
    cen.writeUInt32LE(end.localOffset ? end.localOffset(i, offset) : offset, 42);
    locals.push(loc, name, localExtra, body);
    centrals.push(cen, name, extra, comment);
    offset += 30 + name.length + localExtra.length + body.length;
  });
  const dir = Buffer.concat(centrals);
  const comment = end.comment ?? Buffer.alloc(0);
  const eocd = Buffer.alloc(22);
  eocd.writeUInt32LE(0x06054b50, 0);
  eocd.writeUInt16LE(end.disk ?? 0, 4);
  eocd.writeUInt16LE(end.dirDisk ?? 0, 6);
  eocd.writeUInt16LE(end.count ?? entries.length, 8);
  eocd.writeUInt16LE(end.count ?? entries.length, 10);
  eocd.writeUInt32LE(end.dirSize ?? dir.length, 12);
  eocd.writeUInt32LE(end.dirOffset ?? offset, 16);
  eocd.writeUInt16LE(comment.length, 20);
  return Buffer.concat([...locals, dir, eocd, comment]);
}

const LIMITS = { maxEntries: 10 };
const A = { name: "a.xml", data: Buffer.from("<a>invented</a>") };
const read = (buf: Buffer, limits = LIMITS) => readZipDirectory(buf, limits);
const refusal = (f: () => unknown): string => {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(ZipError);
    expect((e as Error).name).toBe("ZipError");
    return (e as Error).message;
  }
  throw new Error("accepted");
};

describe("the end record (APPNOTE §4.3.16)", () => {
  it("fewer than 22 bytes: too short; 22 bytes of an empty archive: no entries", () => {
    expect(refusal(() => read(Buffer.alloc(21)))).toBe("the file is too short to be a zip package");
    expect(read(build([]))).toEqual([]);
    expect(build([]).length).toBe(22);
  });
  it("no end record in the last 22 + 65,535 bytes: the directory is missing", () => {
    expect(refusal(() => read(Buffer.alloc(100)))).toBe("the zip directory is missing: the file is damaged or truncated");
  });
  it("found behind a comment of the largest size, 65,535 bytes", () => {
    const buf = build([A], { comment: Buffer.alloc(65535, 0x20) });
    expect(read(buf).map((e) => e.name)).toEqual(["a.xml"]);
  });
  it("an end record one byte further back than a 65,535-byte comment allows is not found", () => {
    const buf = Buffer.concat([build([A]), Buffer.alloc(65536, 0x20)]);
    expect(refusal(() => read(buf))).toBe("the zip directory is missing: the file is damaged or truncated");
    const justIn = Buffer.concat([build([A]), Buffer.alloc(65535, 0x20)]);
    expect(read(justIn).map((e) => e.name)).toEqual(["a.xml"]);
  });
  it("an end record at offset 0 (the whole file is the record)", () => {
    expect(read(build([]))).toEqual([]);
    expect(read(Buffer.concat([build([]), Buffer.alloc(3)]))).toEqual([]);
  });
  it("ZIP64 markers (§4.4.1: 0xFFFF entries or offset 0xFFFFFFFF) are refused", () => {
    expect(refusal(() => read(build([A], { count: 0xffff })))).toBe("ZIP64 packages are not read (no workbook needs one)");
    expect(refusal(() => read(build([A], { dirOffset: 0xffffffff })))).toBe("ZIP64 packages are not read (no workbook needs one)");
  });
  it("a disk number other than 0 (split archives, §8) is refused", () => {
    expect(refusal(() => read(build([A], { disk: 1 })))).toBe("multi-part zip packages are not read");
    expect(refusal(() => read(build([A], { dirDisk: 1 })))).toBe("multi-part zip packages are not read");
  });
  it("the entry limit: at the limit read, one past refused before any entry is looked at", () => {
    const ten = Array.from({ length: 10 }, (_, i) => ({ name: `p${i}.xml`, data: Buffer.from(`${i}`) }));
    expect(read(build(ten))).toHaveLength(10);
    expect(refusal(() => read(build([...ten, A])))).toBe("the file has 11 parts, more than 10");
    expect(refusal(() => read(build([A], { count: 11 })))).toBe("the file has 11 parts, more than 10");
  });
  it("a directory that ends past the end record points outside the file", () => {
    const ok = build([A]);
    const dirSize = ok.readUInt32LE(ok.length - 22 + 12);
    const dirOffset = ok.readUInt32LE(ok.length - 22 + 16);
    expect(dirOffset + dirSize).toBe(ok.length - 22); // exactly up to the end record: read
    expect(refusal(() => read(build([A], { dirSize: dirSize + 1 })))).toBe("the zip directory points outside the file: the file is damaged");
    expect(refusal(() => read(build([A], { dirOffset: dirOffset + 1 })))).toBe("the zip directory points outside the file: the file is damaged");
    expect(refusal(() => read(build([A], { dirOffset: dirOffset - 1 })))).toBe("the zip directory is damaged"); // no central header signature there
  });
  it("more entries declared than the directory holds: damaged", () => {
    expect(refusal(() => read(build([A], { count: 2 })))).toBe("the zip directory is damaged");
  });
});

describe("central directory entries (APPNOTE §4.3.12)", () => {
  it("fields are read as written: method, CRC, sizes, DOS time and date, flags, the stored bytes", () => {
    const [e] = read(build([{ ...A, method: 8 }]));
    const deflated = zlib.deflateRawSync(A.data);
    expect(e).toEqual({ name: "a.xml", method: 8, crc: zlib.crc32(A.data) >>> 0, compressedSize: deflated.length, size: A.data.length, raw: deflated, dosTime: 0x1234, dosDate: 0x5678, flags: 0x0800 });
  });
  it("extra fields and comments are skipped to reach the next entry; local extra fields to reach the data", () => {
    const b = { name: "b.xml", data: Buffer.from("bee") };
    const entries = read(build([{ ...A, extra: Buffer.alloc(7, 1), comment: Buffer.from("note"), localExtra: Buffer.alloc(5, 2) }, b]));
    expect(entries.map((e) => [e.name, e.raw.toString()])).toEqual([
      ["a.xml", "<a>invented</a>"],
      ["b.xml", "bee"],
    ]);
  });
  it("names are UTF-8 (§4.4.4 bit 11)", () => {
    expect(read(build([{ name: "xl/Bodenprobe-ü.xml", data: Buffer.from("x") }]))[0]!.name).toBe("xl/Bodenprobe-ü.xml");
  });
  it("an encrypted entry (flag bit 0) is refused by name, even a folder", () => {
    expect(refusal(() => read(build([{ ...A, flags: 0x0801 }])))).toBe("part a.xml is encrypted; open the workbook in Excel and save it without a password");
    expect(refusal(() => read(build([{ name: "xl/", data: Buffer.alloc(0), flags: 1 }])))).toBe("part xl/ is encrypted; open the workbook in Excel and save it without a password");
  });
  it("other flag bits (a data descriptor, bit 3) are kept and do not refuse", () => {
    expect(read(build([{ ...A, flags: 0x0808 }]))[0]!.flags).toBe(0x0808);
  });
  it("folder entries (a name ending in /) are left out, even twice, and need no local header", () => {
    const entries = read(build([{ name: "xl/", data: Buffer.alloc(0) }, A, { name: "xl/", data: Buffer.alloc(0) }], { localOffset: (i, real) => (i === 0 ? 999999 : real) }));
    expect(entries.map((e) => e.name)).toEqual(["a.xml"]);
  });
  it("a name twice is refused", () => {
    expect(refusal(() => read(build([A, A])))).toBe("part a.xml appears twice in the package");
  });
  it("a local header that is missing or not one (§4.3.7 signature)", () => {
    expect(refusal(() => read(build([A], { localOffset: () => 1 })))).toBe("part a.xml: its local header is missing; the file is damaged");
    const buf = build([A]);
    const beyond = build([A], { localOffset: () => buf.length - 29 });
    expect(refusal(() => read(beyond))).toBe("part a.xml: its local header is missing; the file is damaged");
  });
  it("data running past the end of the file: truncated", () => {
    const buf = build([{ ...A }]);
    // claim one byte more of compressed data than the file holds before its end
    const bad = Buffer.from(buf);
    const cen = bad.indexOf(Buffer.from([0x50, 0x4b, 0x01, 0x02]));
    bad.writeUInt32LE(bad.length - 30 - 5 + 1, cen + 20);
    expect(refusal(() => read(bad))).toBe("part a.xml runs past the end of the file: the file is truncated");
    bad.writeUInt32LE(bad.length - 30 - 5, cen + 20); // exactly to the end: read
    expect(read(bad)[0]!.compressedSize).toBe(bad.length - 35);
  });
  it("a compression method other than 0 and 8 (§4.4.5: 12 is bzip2, 14 LZMA) is refused", () => {
    expect(refusal(() => read(build([{ ...A, method: 12 }])))).toBe("part a.xml uses compression method 12, which workbooks do not use");
    expect(refusal(() => read(build([{ ...A, method: 1, body: A.data }])))).toBe("part a.xml uses compression method 1, which workbooks do not use");
  });
});

describe("inflateEntry (RFC 1951, APPNOTE §4.4.7 CRC-32)", () => {
  const entry = (over: Partial<ZipEntry>): ZipEntry => ({ name: "p.xml", method: 8, crc: zlib.crc32(A.data) >>> 0, compressedSize: 0, size: A.data.length, raw: zlib.deflateRawSync(A.data), dosTime: 0, dosDate: 0, flags: 0, ...over });
  it("stored and deflated entries come back as their bytes", () => {
    expect(inflateEntry(entry({})).toString()).toBe("<a>invented</a>");
    expect(inflateEntry(entry({ method: 0, raw: A.data })).toString()).toBe("<a>invented</a>");
  });
  it("an empty part, stored or deflated", () => {
    const empty = Buffer.alloc(0);
    expect(inflateEntry(entry({ method: 0, raw: empty, size: 0, crc: 0 })).length).toBe(0);
    expect(inflateEntry(entry({ raw: zlib.deflateRawSync(empty), size: 0, crc: 0 })).length).toBe(0);
  });
  it("a block of reserved type 11 (RFC 1951 §3.2.3) cannot be decompressed", () => {
    // first byte 0x07: BFINAL 1, BTYPE 11
    expect(refusal(() => inflateEntry(entry({ raw: Buffer.from([0x07, 0, 0, 0]) })))).toMatch(/^part p\.xml cannot be decompressed: the file is damaged \(.+\)$/);
  });
  it("a stored block whose NLEN is not LEN's complement (RFC 1951 §3.2.4) cannot be decompressed", () => {
    expect(refusal(() => inflateEntry(entry({ raw: Buffer.from([0x01, 0x03, 0x00, 0x00, 0x00, 0x61, 0x62, 0x63]) })))).toMatch(/^part p\.xml cannot be decompressed: the file is damaged \(/);
  });
  it("a stream cut short is refused as damaged, not padded", () => {
    const raw = zlib.deflateRawSync(Buffer.alloc(5000, "abc"));
    expect(refusal(() => inflateEntry(entry({ raw: raw.subarray(0, raw.length - 3), size: 5000 })))).toMatch(/^part p\.xml (cannot be decompressed: the file is damaged \(|holds \d+ bytes but its header declares 5000)/);
  });
  it("inflating stops one byte past the declared size: one byte more is a mismatch, two a zip bomb", () => {
    const data = Buffer.alloc(1000, 0x41);
    const raw = zlib.deflateRawSync(data);
    const crc = zlib.crc32(data) >>> 0;
    expect(inflateEntry(entry({ raw, size: 1000, crc })).equals(data)).toBe(true);
    expect(refusal(() => inflateEntry(entry({ raw, size: 999, crc })))).toBe("part p.xml holds 1000 bytes but its header declares 999: the file is damaged");
    expect(refusal(() => inflateEntry(entry({ raw, size: 998, crc })))).toBe("part p.xml expands beyond the 998 bytes its header declares, which looks like a zip bomb; refused");
    expect(refusal(() => inflateEntry(entry({ raw, size: 0, crc })))).toBe("part p.xml expands beyond the 0 bytes its header declares, which looks like a zip bomb; refused");
    expect(refusal(() => inflateEntry(entry({ raw, size: 1001, crc })))).toBe("part p.xml holds 1000 bytes but its header declares 1001: the file is damaged");
  });
  it("a stored entry whose size differs from its header, and a CRC that does not match", () => {
    expect(refusal(() => inflateEntry(entry({ method: 0, raw: A.data, size: 14 })))).toBe("part p.xml holds 15 bytes but its header declares 14: the file is damaged");
    expect(refusal(() => inflateEntry(entry({ crc: (zlib.crc32(A.data) ^ 1) >>> 0 })))).toBe("part p.xml fails its CRC check: the file is damaged");
    expect(refusal(() => inflateEntry(entry({ method: 0, raw: A.data, crc: 0 })))).toBe("part p.xml fails its CRC check: the file is damaged");
  });
  it("a CRC with the top bit set is compared unsigned (APPNOTE §4.4.7 is a 4-byte unsigned field)", () => {
    let data = Buffer.from("x");
    for (let i = 0; (zlib.crc32(data) >>> 0) < 0x80000000; i++) data = Buffer.from(`x${i}`);
    const crc = zlib.crc32(data) >>> 0;
    expect(inflateEntry(entry({ method: 0, raw: data, size: data.length, crc })).equals(data)).toBe(true);
  });
});

describe("writeZip: the exact bytes (APPNOTE §4.3.7, §4.3.12, §4.3.16)", () => {
  it("one small entry that does not shrink is stored: every header field", () => {
    const data = Buffer.from("ab");
    const out = writeZip([{ name: "x.txt", data }]);
    const crc = zlib.crc32(data) >>> 0;
    const loc = out.subarray(0, 30);
    expect(loc.readUInt32LE(0)).toBe(0x04034b50);
    expect(loc.readUInt16LE(4)).toBe(20); // version needed 2.0
    expect(loc.readUInt16LE(6)).toBe(0x0800); // UTF-8 names
    expect(loc.readUInt16LE(8)).toBe(0); // stored: deflate would not be shorter
    expect(loc.readUInt16LE(10)).toBe(0); // time 00:00:00
    expect(loc.readUInt16LE(12)).toBe((0 << 9) | (1 << 5) | 1); // 1980-01-01 (§4.4.6)
    expect(loc.readUInt32LE(14)).toBe(crc);
    expect(loc.readUInt32LE(18)).toBe(2);
    expect(loc.readUInt32LE(22)).toBe(2);
    expect(loc.readUInt16LE(26)).toBe(5);
    expect(loc.readUInt16LE(28)).toBe(0);
    expect(out.subarray(30, 35).toString()).toBe("x.txt");
    expect(out.subarray(35, 37).toString()).toBe("ab");
    const cen = out.subarray(37, 37 + 46);
    expect(cen.readUInt32LE(0)).toBe(0x02014b50);
    expect(cen.readUInt16LE(4)).toBe(20);
    expect(cen.readUInt16LE(6)).toBe(20);
    expect(cen.readUInt16LE(8)).toBe(0x0800);
    expect(cen.readUInt16LE(10)).toBe(0);
    expect(cen.readUInt16LE(12)).toBe(0);
    expect(cen.readUInt16LE(14)).toBe(33);
    expect(cen.readUInt32LE(16)).toBe(crc);
    expect(cen.readUInt32LE(20)).toBe(2);
    expect(cen.readUInt32LE(24)).toBe(2);
    expect(cen.readUInt16LE(28)).toBe(5);
    expect(cen.subarray(30, 42)).toEqual(Buffer.alloc(12)); // extra, comment, disk, attributes
    expect(cen.readUInt32LE(42)).toBe(0);
    expect(out.subarray(83, 88).toString()).toBe("x.txt");
    const end = out.subarray(88);
    expect(end.length).toBe(22);
    expect(end.readUInt32LE(0)).toBe(0x06054b50);
    expect(end.readUInt16LE(4)).toBe(0);
    expect(end.readUInt16LE(6)).toBe(0);
    expect(end.readUInt16LE(8)).toBe(1);
    expect(end.readUInt16LE(10)).toBe(1);
    expect(end.readUInt32LE(12)).toBe(51);
    expect(end.readUInt32LE(16)).toBe(37);
    expect(end.readUInt16LE(20)).toBe(0);
  });
  it("a part that shrinks is deflated (method 8) and reads back", () => {
    const data = Buffer.from("<row/>".repeat(200));
    const out = writeZip([{ name: "s.xml", data }]);
    expect(out.readUInt16LE(8)).toBe(8);
    const [e] = readZipDirectory(out, LIMITS);
    expect(e!.compressedSize).toBeLessThan(data.length);
    expect(e!.raw.equals(zlib.deflateRawSync(data, { level: 6 }))).toBe(true); // the usual level for small parts
    expect(inflateEntry(e!).equals(data)).toBe(true);
  });
  it("a part over 1 MiB is deflated at level 1; at exactly 1 MiB at level 6", () => {
    const big = Buffer.alloc((1 << 20) + 1);
    for (let i = 0; i < big.length; i++) big[i] = (i * 7919) % 251 < 200 ? 0x61 : i % 256;
    const [e] = readZipDirectory(writeZip([{ name: "b", data: big }]), LIMITS);
    expect(e!.raw.equals(zlib.deflateRawSync(big, { level: 1 }))).toBe(true);
    const mib = big.subarray(0, 1 << 20);
    const [m] = readZipDirectory(writeZip([{ name: "m", data: mib }]), LIMITS);
    expect(m!.raw.equals(zlib.deflateRawSync(mib, { level: 6 }))).toBe(true);
  });
  it("an empty part is stored (deflate's 2 bytes are not shorter than 0)", () => {
    const out = writeZip([{ name: "e", data: Buffer.alloc(0) }]);
    const [e] = readZipDirectory(out, LIMITS);
    expect([e!.method, e!.size, e!.compressedSize, e!.crc]).toEqual([0, 0, 0, 0]);
  });
  it("copied entries keep method, CRC, sizes, time and date and their compressed bytes; offsets add up", () => {
    const src = build([{ ...A, method: 8 }]);
    const [copy] = readZipDirectory(src, LIMITS);
    const out = writeZip([{ name: "new.txt", data: Buffer.from("ab") }, { name: "a.xml", copy: copy! }]);
    const entries = readZipDirectory(out, LIMITS);
    expect(entries.map((e) => [e.name, e.method, e.dosTime, e.dosDate, e.crc, e.size, e.compressedSize])).toEqual([
      ["new.txt", 0, 0, 33, zlib.crc32(Buffer.from("ab")) >>> 0, 2, 2],
      ["a.xml", 8, 0x1234, 0x5678, copy!.crc, copy!.size, copy!.compressedSize],
    ]);
    expect(entries[1]!.raw.equals(copy!.raw)).toBe(true);
    expect(entries[1]!.flags).toBe(0x0800);
    // the second local header starts after the first: 30 + 7 + 2
    expect(out.readUInt32LE(39)).toBe(0x04034b50);
    const end = out.subarray(out.length - 22);
    expect(end.readUInt16LE(8)).toBe(2);
    expect(end.readUInt32LE(16)).toBe(39 + 30 + 5 + copy!.compressedSize);
    expect(end.readUInt32LE(12)).toBe(46 * 2 + 7 + 5);
    expect(inflateEntry(entries[1]!).toString()).toBe("<a>invented</a>");
  });
  it("UTF-8 names are written as bytes, their byte length in the headers", () => {
    const out = writeZip([{ name: "ü", data: Buffer.from("x") }]);
    expect(out.readUInt16LE(26)).toBe(2);
    expect(readZipDirectory(out, LIMITS)[0]!.name).toBe("ü");
  });
  it("an empty archive is the end record alone", () => {
    expect(writeZip([]).equals(Buffer.from("504b0506" + "00".repeat(18), "hex"))).toBe(true);
  });
});
