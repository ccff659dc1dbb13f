/**
 * Reads the PNG files pdftoppm writes (8-bit greyscale or RGB, not interlaced) into pixels, so a
 * test can look at a rendered page as a person would: where the colours are. Implements the PNG
 * specification's filters (W3C, Portable Network Graphics Specification, 2nd ed., section 9;
 * from memory); anything else is refused.
 */
import fs from "fs";
import zlib from "zlib";

export interface Image {
  readonly width: number;
  readonly height: number;
  /** Samples per pixel: 1 (grey) or 3 (RGB). */
  readonly channels: number;
  readonly data: Uint8Array;
}

export function readPng(file: string): Image {
  const buf = fs.readFileSync(file);
  if (buf.readUInt32BE(0) !== 0x89504e47) throw new Error(`${file} is not a PNG`);
  let p = 8;
  let width = 0;
  let height = 0;
  let channels = 0;
  const idat: Buffer[] = [];
  while (p < buf.length) {
    const len = buf.readUInt32BE(p);
    const type = buf.toString("latin1", p + 4, p + 8);
    const body = buf.subarray(p + 8, p + 8 + len);
    if (type === "IHDR") {
      width = body.readUInt32BE(0);
      height = body.readUInt32BE(4);
      const depth = body[8];
      const colour = body[9];
      if (depth !== 8 || body[12] !== 0 || (colour !== 0 && colour !== 2)) throw new Error(`${file}: only 8-bit grey or RGB, not interlaced`);
      channels = colour === 2 ? 3 : 1;
    } else if (type === "IDAT") idat.push(body);
    else if (type === "IEND") break;
    p += 12 + len;
  }
  const raw = zlib.inflateSync(Buffer.concat(idat));
  const stride = width * channels;
  const out = new Uint8Array(stride * height);
  for (let y = 0; y < height; y++) {
    const filter = raw[y * (stride + 1)] as number;
    const line = raw.subarray(y * (stride + 1) + 1, (y + 1) * (stride + 1));
    for (let x = 0; x < stride; x++) {
      const a = x >= channels ? (out[y * stride + x - channels] as number) : 0;
      const b = y > 0 ? (out[(y - 1) * stride + x] as number) : 0;
      const c = x >= channels && y > 0 ? (out[(y - 1) * stride + x - channels] as number) : 0;
      let v = line[x] as number;
      if (filter === 1) v += a;
      else if (filter === 2) v += b;
      else if (filter === 3) v += (a + b) >> 1;
      else if (filter === 4) {
        const pp = a + b - c;
        const pa = Math.abs(pp - a);
        const pb = Math.abs(pp - b);
        const pc = Math.abs(pp - c);
        v += pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
      } else if (filter !== 0) throw new Error(`unknown PNG filter ${filter}`);
      out[y * stride + x] = v & 255;
    }
  }
  return { width, height, channels, data: out };
}

/** The RGB value of a pixel as "#rrggbb". */
export function pixel(img: Image, x: number, y: number): string {
  const i = (y * img.width + x) * img.channels;
  const hex = (n: number) => (img.data[i + n] as number).toString(16).padStart(2, "0");
  return img.channels === 3 ? `#${hex(0)}${hex(1)}${hex(2)}` : `#${hex(0)}${hex(0)}${hex(0)}`;
}
