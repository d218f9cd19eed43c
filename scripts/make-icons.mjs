// Writes the app icons (public/icons/*.png) from a small vector description, with no image tools:
// shapes are sampled 4×4 per pixel for anti-aliasing and encoded as PNG (RFC 2083: signature,
// IHDR, one zlib IDAT, IEND; CRC-32 per chunk). Original design: a plume of nested bands drifting
// right from a source block, under a water-table line. Run: node scripts/make-icons.mjs
import { deflateSync } from 'node:zlib';
import { writeFileSync, mkdirSync } from 'node:fs';

const CRC_TABLE = new Uint32Array(256).map((_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(buf) {
  let c = 0xffffffff;
  for (const b of buf) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
function chunk(type, data) {
  const out = Buffer.alloc(12 + data.length);
  out.writeUInt32BE(data.length, 0);
  out.write(type, 4, 'ascii');
  data.copy(out, 8);
  out.writeUInt32BE(crc32(out.subarray(4, 8 + data.length)), 8 + data.length);
  return out;
}
function png(size, rgba) {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // colour type RGBA
  const raw = Buffer.alloc(size * (size * 4 + 1));
  for (let y = 0; y < size; y++) {
    raw[y * (size * 4 + 1)] = 0; // filter: none
    rgba.copy(raw, y * (size * 4 + 1) + 1, y * size * 4, (y + 1) * size * 4);
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

const hex = (h) => [parseInt(h.slice(1, 3), 16), parseInt(h.slice(3, 5), 16), parseInt(h.slice(5, 7), 16)];
const BG = hex('#0b4f6c');
const BANDS = [hex('#2a8fb0'), hex('#7cc6d9'), hex('#f2c14e')];
const LINE = hex('#e8f4f8');

// Scene in unit coordinates (0..1 across the artwork box), painted back to front.
function paint(u, v) {
  let col = null;
  // water-table line: a gentle wave near the top
  const wt = 0.3 + 0.025 * Math.sin(u * Math.PI * 3);
  if (Math.abs(v - wt) < 0.022 && u > 0.08 && u < 0.92) col = LINE;
  // plume bands: ellipses elongated downgradient (to the right), each smaller one nearer the source
  const bands = [
    { cx: 0.55, cy: 0.6, rx: 0.38, ry: 0.17 },
    { cx: 0.45, cy: 0.6, rx: 0.27, ry: 0.12 },
    { cx: 0.34, cy: 0.6, rx: 0.15, ry: 0.07 },
  ];
  bands.forEach((b, i) => {
    const d = ((u - b.cx) / b.rx) ** 2 + ((v - b.cy) / b.ry) ** 2;
    if (d <= 1) col = BANDS[i];
  });
  // source block at the upgradient end
  if (u > 0.14 && u < 0.24 && v > 0.5 && v < 0.7) col = LINE;
  return col;
}

/** size px; inset: fraction of the side the artwork box leaves free on each edge; round: corner radius */
function render(size, { inset, round }) {
  const buf = Buffer.alloc(size * size * 4);
  const S = 4;
  for (let y = 0; y < size; y++) {
    for (let x = 0; x < size; x++) {
      let r = 0, g = 0, b = 0, a = 0;
      for (let sy = 0; sy < S; sy++) {
        for (let sx = 0; sx < S; sx++) {
          const px = (x + (sx + 0.5) / S) / size;
          const py = (y + (sy + 0.5) / S) / size;
          // background: a rounded square (round > 0) or full bleed (maskable)
          const qx = Math.max(Math.abs(px - 0.5) - (0.5 - round), 0);
          const qy = Math.max(Math.abs(py - 0.5) - (0.5 - round), 0);
          if (round > 0 && qx * qx + qy * qy > round * round) continue;
          const u = (px - inset) / (1 - 2 * inset);
          const v = (py - inset) / (1 - 2 * inset);
          const c = paint(u, v) ?? BG;
          r += c[0]; g += c[1]; b += c[2]; a += 255;
        }
      }
      const n = S * S;
      const o = (y * size + x) * 4;
      const cov = a / 255;
      buf[o] = cov ? Math.round(r / cov) : 0;
      buf[o + 1] = cov ? Math.round(g / cov) : 0;
      buf[o + 2] = cov ? Math.round(b / cov) : 0;
      buf[o + 3] = Math.round(a / n);
    }
  }
  return png(size, buf);
}

mkdirSync('public/icons', { recursive: true });
// "any" icons: rounded square, artwork nearly to the edge
for (const s of [192, 512]) writeFileSync(`public/icons/icon-${s}.png`, render(s, { inset: 0.04, round: 0.18 }));
// maskable icons: full-bleed background, artwork inside the central 80 % safe zone (W3C manifest
// "maskable" purpose: the safe zone is a circle of radius 40 % of the icon's size)
for (const s of [192, 512]) writeFileSync(`public/icons/maskable-${s}.png`, render(s, { inset: 0.16, round: 0 }));
// Apple touch icon (iOS ignores the manifest icons): 180 px, full bleed (iOS rounds the corners)
writeFileSync('public/icons/apple-touch-icon-180.png', render(180, { inset: 0.08, round: 0 }));
console.log('icons written to public/icons/');
