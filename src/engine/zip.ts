/**
 * The zip container of an .xlsx, read and written without a library: every entry is located
 * through the central directory, inflated at most to the size its header declares, and checked
 * against its CRC-32 before anything reads it. Writing copies the compressed bytes of entries
 * nobody changed, so every part the engine does not touch leaves exactly as it came.
 */
import zlib from "zlib";

export class ZipError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ZipError";
  }
}

export interface ZipEntry {
  readonly name: string;
  /** 0 stored, 8 deflated. */
  readonly method: number;
  readonly crc: number;
  readonly compressedSize: number;
  readonly size: number;
  /** The compressed bytes as they are in the file. */
  readonly raw: Buffer;
  readonly dosTime: number;
  readonly dosDate: number;
  readonly flags: number;
}

const EOCD = 0x06054b50;
const CEN = 0x02014b50;
const LOC = 0x04034b50;

/** Reads the central directory. Throws ZipError for anything that is not a plain zip. */
export function readZipDirectory(buf: Buffer, limits: { maxEntries: number }): ZipEntry[] {
  if (buf.length < 22) throw new ZipError("the file is too short to be a zip package");
  // The end record is within the last 22 + 65535 bytes (its comment is at most 65535 bytes).
  let eocd = -1;
  for (let i = buf.length - 22; i >= Math.max(0, buf.length - 22 - 65535); i--) {
    if (buf.readUInt32LE(i) === EOCD) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0) throw new ZipError("the zip directory is missing: the file is damaged or truncated");
  const count = buf.readUInt16LE(eocd + 10);
  const dirSize = buf.readUInt32LE(eocd + 12);
  const dirOffset = buf.readUInt32LE(eocd + 16);
  if (count === 0xffff || dirOffset === 0xffffffff) throw new ZipError("ZIP64 packages are not read (no workbook needs one)");
  if (buf.readUInt16LE(eocd + 4) !== 0 || buf.readUInt16LE(eocd + 6) !== 0) throw new ZipError("multi-part zip packages are not read");
  if (count > limits.maxEntries) throw new ZipError(`the file has ${count} parts, more than ${limits.maxEntries}`);
  if (dirOffset + dirSize > eocd) throw new ZipError("the zip directory points outside the file: the file is damaged");
  const entries: ZipEntry[] = [];
  const seen = new Set<string>();
  let p = dirOffset;
  for (let k = 0; k < count; k++) {
    if (p + 46 > buf.length || buf.readUInt32LE(p) !== CEN) throw new ZipError("the zip directory is damaged");
    const flags = buf.readUInt16LE(p + 8);
    const method = buf.readUInt16LE(p + 10);
    const dosTime = buf.readUInt16LE(p + 12);
    const dosDate = buf.readUInt16LE(p + 14);
    const crc = buf.readUInt32LE(p + 16);
    const compressedSize = buf.readUInt32LE(p + 20);
    const size = buf.readUInt32LE(p + 24);
    const nameLen = buf.readUInt16LE(p + 28);
    const extraLen = buf.readUInt16LE(p + 30);
    const commentLen = buf.readUInt16LE(p + 32);
    const local = buf.readUInt32LE(p + 42);
    const name = buf.toString("utf8", p + 46, p + 46 + nameLen);
    p += 46 + nameLen + extraLen + commentLen;
    if (flags & 1) throw new ZipError(`part ${name} is encrypted; open the workbook in Excel and save it without a password`);
    if (name.endsWith("/")) continue; // a folder entry
    if (seen.has(name)) throw new ZipError(`part ${name} appears twice in the package`);
    seen.add(name);
    if (local + 30 > buf.length || buf.readUInt32LE(local) !== LOC) throw new ZipError(`part ${name}: its local header is missing; the file is damaged`);
    const dataStart = local + 30 + buf.readUInt16LE(local + 26) + buf.readUInt16LE(local + 28);
    if (dataStart + compressedSize > buf.length) throw new ZipError(`part ${name} runs past the end of the file: the file is truncated`);
    if (method !== 0 && method !== 8) throw new ZipError(`part ${name} uses compression method ${method}, which workbooks do not use`);
    entries.push({ name, method, crc, compressedSize, size, raw: buf.subarray(dataStart, dataStart + compressedSize), dosTime, dosDate, flags });
  }
  return entries;
}

/**
 * The uncompressed bytes of an entry, inflated to at most the size its header declares and
 * checked against its CRC-32.
 */
export function inflateEntry(e: ZipEntry): Buffer {
  let out: Buffer;
  if (e.method === 0) {
    out = e.raw;
  } else {
    try {
      // One output chunk of the declared size (the default 16 KB chunks cost a copy of every part).
      out = zlib.inflateRawSync(e.raw, { maxOutputLength: Math.max(1, e.size + 1), chunkSize: Math.max(64, Math.min(e.size + 1, 1 << 30)) });
    } catch (err) {
      const tooLarge = (err as NodeJS.ErrnoException).code === "ERR_BUFFER_TOO_LARGE";
      throw new ZipError(
        tooLarge
          ? `part ${e.name} expands beyond the ${e.size} bytes its header declares, which looks like a zip bomb; refused`
          : `part ${e.name} cannot be decompressed: the file is damaged (${(err as Error).message})`,
      );
    }
  }
  if (out.length !== e.size) throw new ZipError(`part ${e.name} holds ${out.length} bytes but its header declares ${e.size}: the file is damaged`);
  if ((zlib.crc32(out) >>> 0) !== e.crc) throw new ZipError(`part ${e.name} fails its CRC check: the file is damaged`);
  return out;
}

export interface ZipOut {
  readonly name: string;
  /** An entry copied as it was (compressed bytes, CRC and sizes kept)… */
  readonly copy?: ZipEntry;
  /** …or new contents, deflated here. */
  readonly data?: Buffer;
}

/** Writes a zip package: copied entries keep their compressed bytes, new ones are deflated. */
export function writeZip(entries: readonly ZipOut[]): Buffer {
  const chunks: Buffer[] = [];
  const central: Buffer[] = [];
  let offset = 0;
  for (const e of entries) {
    const name = Buffer.from(e.name, "utf8");
    let method: number, crc: number, size: number, raw: Buffer, time: number, date: number;
    if (e.copy) {
      ({ method, crc, size, raw } = e.copy);
      time = e.copy.dosTime;
      date = e.copy.dosDate;
    } else {
      const data = e.data as Buffer;
      crc = zlib.crc32(data) >>> 0;
      size = data.length;
      // Large parts at the fastest level: a season sheet deflates about three times faster for
      // about a sixth more bytes (measured on a 200 MB sheet); small parts at the usual level.
      raw = zlib.deflateRawSync(data, { level: data.length > 1 << 20 ? 1 : 6, chunkSize: Math.max(64, Math.min(data.length, 1 << 26)) });
      method = 8;
      if (raw.length >= data.length) {
        raw = data;
        method = 0;
      }
      time = 0;
      date = (1980 - 1980) << 9 | (1 << 5) | 1; // 1980-01-01: no clock in the file, so output is reproducible
    }
    if (size > 0xfffffffe || raw.length > 0xfffffffe || offset > 0xfffffffe) throw new ZipError("the workbook is too large to write without ZIP64");
    const flags = 0x0800; // names are UTF-8
    const loc = Buffer.alloc(30);
    loc.writeUInt32LE(LOC, 0);
    loc.writeUInt16LE(20, 4);
    loc.writeUInt16LE(flags, 6);
    loc.writeUInt16LE(method, 8);
    loc.writeUInt16LE(time, 10);
    loc.writeUInt16LE(date, 12);
    loc.writeUInt32LE(crc, 14);
    loc.writeUInt32LE(raw.length, 18);
    loc.writeUInt32LE(size, 22);
    loc.writeUInt16LE(name.length, 26);
    loc.writeUInt16LE(0, 28);
    const cen = Buffer.alloc(46);
    cen.writeUInt32LE(CEN, 0);
    cen.writeUInt16LE(20, 4);
    cen.writeUInt16LE(20, 6);
    cen.writeUInt16LE(flags, 8);
    cen.writeUInt16LE(method, 10);
    cen.writeUInt16LE(time, 12);
    cen.writeUInt16LE(date, 14);
    cen.writeUInt32LE(crc, 16);
    cen.writeUInt32LE(raw.length, 20);
    cen.writeUInt32LE(size, 24);
    cen.writeUInt16LE(name.length, 28);
    cen.writeUInt32LE(offset, 42);
    chunks.push(loc, name, raw);
    central.push(cen, name);
    offset += 30 + name.length + raw.length;
  }
  const dirSize = central.reduce((s, b) => s + b.length, 0);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(EOCD, 0);
  end.writeUInt16LE(entries.length, 8);
  end.writeUInt16LE(entries.length, 10);
  end.writeUInt32LE(dirSize, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...chunks, ...central, end]);
}
