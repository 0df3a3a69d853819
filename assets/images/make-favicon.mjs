// Writes assets/images/favicon.png: Plumbline's plumb line (brass) on paper, 64×64, drawn by
// 4×4 supersampling and encoded with zlib. Run: node assets/images/make-favicon.mjs
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { fileURLToPath } from 'node:url';

const size = 64;
const paper = [0xf6, 0xf3, 0xec];
const brass = [0xb0, 0x7d, 0x2b];
const ink = [0x1b, 0x2a, 0x3a];

// Shapes in a 64-unit square: the suspension bar, the line and the bob (a diamond).
function colourAt(x, y) {
  if (y >= 8 && y <= 12 && x >= 18 && x <= 46) return ink;
  if (x >= 30.5 && x <= 33.5 && y >= 12 && y <= 40) return brass;
  if (Math.abs(x - 32) / 8 + Math.abs(y - 47) / 10 <= 1) return brass;
  return paper;
}

const sub = 4;
const raw = Buffer.alloc(size * (size * 3 + 1));
for (let py = 0; py < size; py++) {
  raw[py * (size * 3 + 1)] = 0; // filter: none
  for (let px = 0; px < size; px++) {
    const sum = [0, 0, 0];
    for (let sy = 0; sy < sub; sy++) {
      for (let sx = 0; sx < sub; sx++) {
        const c = colourAt(px + (sx + 0.5) / sub, py + (sy + 0.5) / sub);
        for (let k = 0; k < 3; k++) sum[k] += c[k];
      }
    }
    const offset = py * (size * 3 + 1) + 1 + px * 3;
    for (let k = 0; k < 3; k++) raw[offset + k] = Math.round(sum[k] / (sub * sub));
  }
}

const crcTable = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(buf) {
  let c = 0xffffffff;
  for (const byte of buf) c = crcTable[(c ^ byte) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
function chunk(type, data) {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

const header = Buffer.alloc(13);
header.writeUInt32BE(size, 0);
header.writeUInt32BE(size, 4);
header[8] = 8; // bit depth
header[9] = 2; // colour type: RGB
const png = Buffer.concat([
  Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
  chunk('IHDR', header),
  chunk('IDAT', zlib.deflateSync(raw, { level: 9 })),
  chunk('IEND', Buffer.alloc(0)),
]);
const out = path.join(path.dirname(fileURLToPath(import.meta.url)), 'favicon.png');
fs.writeFileSync(out, png);
console.log(`wrote ${out} (${png.length} bytes)`);
