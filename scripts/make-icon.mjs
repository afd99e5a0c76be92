// Draws the extension icon (icons/tessera.png, 128×128): a small mosaic of tiles, the tesserae
// the project is named after. Run by hand: node scripts/make-icon.mjs
import { writeFileSync } from 'node:fs';
import { deflateSync } from 'node:zlib';

const size = 128;
const pixels = Buffer.alloc(size * size * 4);
const background = [0x1e, 0x29, 0x3b, 255];
// Tile colours: three quantum-tier tiles (amber) on correlated (teal) and mean-field (slate) ones.
const palette = { q: [0xf5, 0xa6, 0x23, 255], c: [0x14, 0xb8, 0xa6, 255], m: [0x64, 0x74, 0x8b, 255] };
const layout = ['mcm', 'cqc', 'mqq'];

function inRoundedRect(x, y, x0, y0, w, h, r) {
  const cx = Math.min(Math.max(x, x0 + r), x0 + w - r);
  const cy = Math.min(Math.max(y, y0 + r), y0 + h - r);
  return (x - cx) ** 2 + (y - cy) ** 2 <= r * r;
}

for (let y = 0; y < size; y++) {
  for (let x = 0; x < size; x++) {
    let colour = inRoundedRect(x, y, 0, 0, size, size, 22) ? background : [0, 0, 0, 0];
    for (let row = 0; row < 3; row++) {
      for (let column = 0; column < 3; column++) {
        if (inRoundedRect(x + 0.5, y + 0.5, 14 + column * 34, 14 + row * 34, 30, 30, 5)) colour = palette[layout[row][column]];
      }
    }
    pixels.set(colour, (y * size + x) * 4);
  }
}

function crc32(buffer) {
  let crc = ~0;
  for (const byte of buffer) {
    crc ^= byte;
    for (let k = 0; k < 8; k++) crc = (crc >>> 1) ^ (0xedb88320 & -(crc & 1));
  }
  return ~crc >>> 0;
}

function chunk(type, data) {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

const header = Buffer.alloc(13);
header.writeUInt32BE(size, 0);
header.writeUInt32BE(size, 4);
header.set([8, 6, 0, 0, 0], 8); // 8-bit RGBA
const raw = Buffer.alloc(size * (size * 4 + 1));
for (let y = 0; y < size; y++) pixels.copy(raw, y * (size * 4 + 1) + 1, y * size * 4, (y + 1) * size * 4);
const png = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', header), chunk('IDAT', deflateSync(raw)), chunk('IEND', Buffer.alloc(0))]);
writeFileSync(new URL('../icons/tessera.png', import.meta.url), png);
