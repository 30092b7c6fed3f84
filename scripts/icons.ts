/**
 * Draws the app's icons from Baywright's own mark (public/icon.svg): the PNG sizes a phone uses
 * for its home screen, a maskable version with the mark inside the safe circle, the 180 px
 * touch icon, and favicon.ico (an ICO container holding PNG images, which every current browser
 * reads). Run `npm run icons` after changing the mark; the results are committed.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import sharp from "sharp";

const PUBLIC = join(import.meta.dirname, "..", "public");
const BAY_700 = "#0e5a54";
const mark = readFileSync(join(PUBLIC, "icon.svg"));

/** The mark drawn square at `size` px, its 2 px margin kept (a plain icon). */
function plain(size: number) {
  return sharp(mark, { density: (72 * size) / 32 }).resize(size, size).png({ compressionLevel: 9 }).toBuffer();
}

/** Full-bleed teal with the mark at 70 %, inside the 80 % safe circle a launcher may crop to. */
async function maskable(size: number) {
  const inner = Math.round(size * 0.7);
  const art = await plain(inner);
  return sharp({ create: { width: size, height: size, channels: 4, background: BAY_700 } })
    .composite([{ input: art, top: Math.round((size - inner) / 2), left: Math.round((size - inner) / 2) }])
    .png({ compressionLevel: 9 })
    .toBuffer();
}

/** Apple's touch icon is shown without transparency: the mark on the shop's paper colour. */
async function touch(size: number) {
  const art = await plain(size);
  return sharp(art).flatten({ background: "#f5f3ee" }).png({ compressionLevel: 9 }).toBuffer();
}

/** ICO: a 6-byte header, one 16-byte entry per image, then the PNG bytes themselves. */
function ico(images: { size: number; png: Buffer }[]) {
  const header = Buffer.alloc(6);
  header.writeUInt16LE(0, 0);
  header.writeUInt16LE(1, 2);
  header.writeUInt16LE(images.length, 4);
  let offset = 6 + 16 * images.length;
  const entries = images.map(({ size, png }) => {
    const e = Buffer.alloc(16);
    e.writeUInt8(size >= 256 ? 0 : size, 0);
    e.writeUInt8(size >= 256 ? 0 : size, 1);
    e.writeUInt8(0, 2);
    e.writeUInt8(0, 3);
    e.writeUInt16LE(1, 4);
    e.writeUInt16LE(32, 6);
    e.writeUInt32LE(png.length, 8);
    e.writeUInt32LE(offset, 12);
    offset += png.length;
    return e;
  });
  return Buffer.concat([header, ...entries, ...images.map((i) => i.png)]);
}

async function main() {
  const out: Record<string, Buffer> = {
    "icon-192.png": await plain(192),
    "icon-512.png": await plain(512),
    "icon-maskable-512.png": await maskable(512),
    "apple-touch-icon.png": await touch(180),
    "favicon.ico": ico([
      { size: 16, png: await plain(16) },
      { size: 32, png: await plain(32) },
      { size: 48, png: await plain(48) },
    ]),
  };
  for (const [name, bytes] of Object.entries(out)) {
    writeFileSync(join(PUBLIC, name), bytes);
    console.log(`public/${name}: ${bytes.length} bytes`);
  }
}

await main();
