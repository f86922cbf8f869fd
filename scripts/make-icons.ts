/**
 * Draws Reshuffle's icon (our own design: a rounded tile with the bars of a shuffled
 * null distribution and a marker for the observed value) and writes PNGs of the sizes
 * the manifest uses into assets/. Run: node scripts/run-ts.js scripts/make-icons.ts
 */
import * as fs from "fs";
import * as zlib from "zlib";

type RGBA = [number, number, number, number];
const TILE: RGBA = [28, 94, 84, 255];
const BAR: RGBA = [233, 244, 238, 255];
const MARK: RGBA = [244, 177, 61, 255];

function shade(x: number, y: number): RGBA | null {
  // Unit square coordinates; rounded tile.
  const r = 0.18;
  const dx = Math.max(r - x, 0, x - (1 - r));
  const dy = Math.max(r - y, 0, y - (1 - r));
  if (dx * dx + dy * dy > r * r) return null;
  const bars = [0.35, 0.7, 0.55, 0.28];
  const x0 = 0.13, w = 0.13, gap = 0.03, base = 0.82;
  for (let i = 0; i < bars.length; i++) {
    const bx = x0 + i * (w + gap);
    if (x >= bx && x < bx + w && y <= base && y >= base - bars[i] * 0.75) return BAR;
  }
  if (x >= 0.8 && x <= 0.86 && y >= 0.14 && y <= 0.86) return MARK;
  return TILE;
}

function png(size: number): Buffer {
  const ss = 4;
  const raw = Buffer.alloc(size * (size * 4 + 1));
  for (let py = 0; py < size; py++) {
    raw[py * (size * 4 + 1)] = 0;
    for (let px = 0; px < size; px++) {
      let r = 0, g = 0, b = 0, a = 0;
      for (let sy = 0; sy < ss; sy++)
        for (let sx = 0; sx < ss; sx++) {
          const c = shade((px + (sx + 0.5) / ss) / size, (py + (sy + 0.5) / ss) / size);
          if (c) { r += c[0] * c[3]; g += c[1] * c[3]; b += c[2] * c[3]; a += c[3]; }
        }
      const o = py * (size * 4 + 1) + 1 + px * 4;
      raw[o] = a ? Math.round(r / a) : 0;
      raw[o + 1] = a ? Math.round(g / a) : 0;
      raw[o + 2] = a ? Math.round(b / a) : 0;
      raw[o + 3] = Math.round(a / (ss * ss));
    }
  }
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(data.length);
    const td = Buffer.concat([Buffer.from(type, "ascii"), data]);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(crc32(td));
    return Buffer.concat([len, td, crc]);
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; ihdr[9] = 6; ihdr[10] = 0; ihdr[11] = 0; ihdr[12] = 0;
  return Buffer.concat([
    Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]),
    chunk("IHDR", ihdr),
    chunk("IDAT", zlib.deflateSync(raw)),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

function crc32(buf: Buffer): number {
  let c = ~0;
  for (let i = 0; i < buf.length; i++) {
    c ^= buf[i];
    for (let k = 0; k < 8; k++) c = c & 1 ? (c >>> 1) ^ 0xedb88320 : c >>> 1;
  }
  return ~c >>> 0;
}

fs.mkdirSync("assets", { recursive: true });
for (const s of [16, 32, 64, 80, 128]) fs.writeFileSync(`assets/icon-${s}.png`, png(s));
console.log("icons written to assets/");
