#!/usr/bin/env node
/**
 * Draws soilcell's own icons (three soil layers under a leaf) as PNGs into assets/.
 * Run once; the PNGs are committed. Pure Node: zlib + a minimal PNG writer.
 */
const fs = require("fs");
const path = require("path");
const zlib = require("zlib");

function crc32(buf) {
  let c, crc = 0xffffffff;
  for (let n = 0; n < buf.length; n++) {
    c = (crc ^ buf[n]) & 0xff;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    crc = (crc >>> 8) ^ c;
  }
  return (crc ^ 0xffffffff) >>> 0;
}

function chunk(type, data) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(td));
  return Buffer.concat([len, td, crc]);
}

function png(size, pixel) {
  const raw = Buffer.alloc((size * 4 + 1) * size);
  for (let y = 0; y < size; y++) {
    raw[y * (size * 4 + 1)] = 0;
    for (let x = 0; x < size; x++) {
      const [r, g, b, a] = pixel(x / size, y / size);
      const o = y * (size * 4 + 1) + 1 + x * 4;
      raw[o] = r; raw[o + 1] = g; raw[o + 2] = b; raw[o + 3] = a;
    }
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; ihdr[9] = 6; ihdr[10] = 0; ihdr[11] = 0; ihdr[12] = 0;
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", ihdr),
    chunk("IDAT", zlib.deflateSync(raw)),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

// Colour-blind-safe pairing: blue-green leaf over warm browns of differing lightness.
function pixel(x, y) {
  const leaf = Math.hypot((x - 0.5) / 0.22, (y - 0.3) / 0.16) <= 1 && y < 0.42;
  if (leaf) return [0, 114, 178, 255];
  if (y >= 0.45 && y < 0.62) return [153, 102, 51, 255];
  if (y >= 0.62 && y < 0.79) return [115, 76, 38, 255];
  if (y >= 0.79 && y < 0.96) return [77, 51, 25, 255];
  return [0, 0, 0, 0];
}

const out = path.join(__dirname, "..", "assets");
fs.mkdirSync(out, { recursive: true });
for (const s of [16, 32, 64, 80, 128]) fs.writeFileSync(path.join(out, `icon-${s}.png`), png(s, pixel));
console.log("icons written to assets/");
