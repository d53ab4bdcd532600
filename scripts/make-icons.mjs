// Draws the app icon (the mark of app/icon.svg: a copper gauge needle over a graphite arc on a
// graphite tile) as PNG files and a favicon.ico, so browsers and home screens that take no SVG get
// the same mark. The shapes are few and simple, so they are drawn here from their distance
// functions with 4×4 supersampling; no image library is needed. Run: node scripts/make-icons.mjs
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { crc32, deflateSync } from 'node:zlib';

const root = path.resolve(import.meta.dirname, '..');
// Keep in step with app/icon.svg (viewBox 0 0 32 32).
const TILE = [0x25, 0x29, 0x2d];
const ARC = [0xa9, 0xaf, 0xb6];
const COPPER = [0xd0, 0x7a, 0x3e];

const clamp = (v, lo, hi) => Math.min(hi, Math.max(lo, v));
function segmentDistance(px, py, ax, ay, bx, by) {
  const dx = bx - ax;
  const dy = by - ay;
  const t = clamp(((px - ax) * dx + (py - ay) * dy) / (dx * dx + dy * dy), 0, 1);
  return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}
// The upper half circle of radius 11 around (16, 23), with round caps at both ends.
function arcDistance(px, py) {
  if (py <= 23) return Math.abs(Math.hypot(px - 16, py - 23) - 11);
  return Math.min(Math.hypot(px - 5, py - 23), Math.hypot(px - 27, py - 23));
}
function roundedTile(px, py) {
  const r = 7;
  const qx = Math.max(Math.abs(px - 16) - (16 - r), 0);
  const qy = Math.max(Math.abs(py - 16) - (16 - r), 0);
  return Math.hypot(qx, qy) <= r;
}

/** The colour (RGBA) of one point of the 32-unit drawing, painted back to front as the SVG does. */
function paint(x, y) {
  if (!roundedTile(x, y)) return [0, 0, 0, 0];
  let c = TILE;
  if (arcDistance(x, y) <= 1.5) c = ARC;
  if (segmentDistance(x, y, 16, 23, 23.5, 11.5) <= 1.75) c = COPPER;
  if (Math.hypot(x - 16, y - 23) <= 3.4) c = COPPER;
  return [...c, 255];
}

function render(size) {
  const n = 4;
  const pixels = Buffer.alloc(size * size * 4);
  for (let j = 0; j < size; j++) {
    for (let i = 0; i < size; i++) {
      const sum = [0, 0, 0, 0];
      for (let sj = 0; sj < n; sj++) {
        for (let si = 0; si < n; si++) {
          const [r, g, b, a] = paint(((i + (si + 0.5) / n) * 32) / size, ((j + (sj + 0.5) / n) * 32) / size);
          sum[0] += r * a;
          sum[1] += g * a;
          sum[2] += b * a;
          sum[3] += a;
        }
      }
      const o = (j * size + i) * 4;
      const alpha = sum[3] / (n * n);
      pixels[o] = sum[3] ? Math.round(sum[0] / sum[3]) : 0;
      pixels[o + 1] = sum[3] ? Math.round(sum[1] / sum[3]) : 0;
      pixels[o + 2] = sum[3] ? Math.round(sum[2] / sum[3]) : 0;
      pixels[o + 3] = Math.round(alpha);
    }
  }
  return pixels;
}

function chunk(type, data) {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** A PNG (RFC 2083): 8-bit RGBA, no interlace, each row with filter type 0. */
function png(size) {
  const pixels = render(size);
  const raw = Buffer.alloc(size * (size * 4 + 1));
  for (let j = 0; j < size; j++) pixels.copy(raw, j * (size * 4 + 1) + 1, j * size * 4, (j + 1) * size * 4);
  const header = Buffer.alloc(13);
  header.writeUInt32BE(size, 0);
  header.writeUInt32BE(size, 4);
  header.set([8, 6, 0, 0, 0], 8);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', deflateSync(raw, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** An ICO holding PNG images, which every current browser reads. */
function ico(sizes) {
  const images = sizes.map(png);
  const head = Buffer.alloc(6 + 16 * images.length);
  head.writeUInt16LE(0, 0);
  head.writeUInt16LE(1, 2);
  head.writeUInt16LE(images.length, 4);
  let offset = head.length;
  images.forEach((image, k) => {
    const e = 6 + 16 * k;
    head.writeUInt8(sizes[k] >= 256 ? 0 : sizes[k], e);
    head.writeUInt8(sizes[k] >= 256 ? 0 : sizes[k], e + 1);
    head.writeUInt16LE(1, e + 4);
    head.writeUInt16LE(32, e + 6);
    head.writeUInt32LE(image.length, e + 8);
    head.writeUInt32LE(offset, e + 12);
    offset += image.length;
  });
  return Buffer.concat([head, ...images]);
}

const out = [
  ['app/favicon.ico', ico([16, 32, 48])],
  ['app/apple-icon.png', png(180)],
  ['public/icon-192.png', png(192)],
  ['public/icon-512.png', png(512)],
];
for (const [file, data] of out) {
  writeFileSync(path.join(root, file), data);
  console.log(`${file}: ${data.length} bytes`);
}
