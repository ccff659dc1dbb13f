/**
 * A minimal zip writer for building hostile test packages (invented contents): entries are
 * deflated with Node's own zlib, so a 300 MB entry of zeros takes about a second, and the sizes
 * a header declares can be made to lie. Only what the tests need: no zip64, no extra fields.
 */
import zlib from "zlib";

export interface Entry {
  readonly name: string;
  readonly data: Buffer;
  /** Store instead of deflate. */
  readonly store?: boolean;
  /** The uncompressed size the headers claim (default: the real one). */
  readonly declaredSize?: number;
  /** The CRC-32 the headers claim (default: the real one). */
  readonly declaredCrc?: number;
  /** Changes the stored (compressed) bytes before they are written, e.g. to damage them. */
  readonly damage?: (body: Buffer) => Buffer;
}

export function writeZip(entries: readonly Entry[]): Buffer {
  const locals: Buffer[] = [];
  const centrals: Buffer[] = [];
  let offset = 0;
  for (const e of entries) {
    const name = Buffer.from(e.name, "utf8");
    const packed = e.store ? e.data : zlib.deflateRawSync(e.data, { level: 9 });
    const body = e.damage ? e.damage(Buffer.from(packed)) : packed;
    const crc = e.declaredCrc ?? zlib.crc32(e.data) >>> 0;
    const size = e.declaredSize ?? e.data.length;
    const method = e.store ? 0 : 8;
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4); // version needed
    local.writeUInt16LE(0x0800, 6); // UTF-8 names
    local.writeUInt16LE(method, 8);
    local.writeUInt32LE(0, 10); // time, date
    local.writeUInt32LE(crc, 14);
    local.writeUInt32LE(body.length, 18);
    local.writeUInt32LE(size, 22);
    local.writeUInt16LE(name.length, 26);
    local.writeUInt16LE(0, 28);
    locals.push(local, name, body);
    const central = Buffer.alloc(46);
    central.writeUInt32LE(0x02014b50, 0);
    central.writeUInt16LE(20, 4);
    central.writeUInt16LE(20, 6);
    central.writeUInt16LE(0x0800, 8);
    central.writeUInt16LE(method, 10);
    central.writeUInt32LE(0, 12);
    central.writeUInt32LE(crc, 16);
    central.writeUInt32LE(body.length, 20);
    central.writeUInt32LE(size, 24);
    central.writeUInt16LE(name.length, 28);
    central.writeUInt32LE(offset, 42);
    centrals.push(central, name);
    offset += local.length + name.length + body.length;
  }
  const dir = Buffer.concat(centrals);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(entries.length, 8);
  end.writeUInt16LE(entries.length, 10);
  end.writeUInt32LE(dir.length, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...locals, dir, end]);
}
