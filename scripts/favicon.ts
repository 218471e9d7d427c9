/**
 * Writes app/favicon.ico from app/icon.svg (Beadline's mark): 16, 32 and 48 px PNG images in one
 * ICO container (an ICO may hold PNG data since Windows Vista; every current browser reads it).
 * Run again after changing the mark: `npx tsx scripts/favicon.ts`.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';

const root = path.join(import.meta.dirname, '..');
const svg = readFileSync(path.join(root, 'app/icon.svg'));
const sizes = [16, 32, 48];

async function main() {
  const images = await Promise.all(
    sizes.map((size) =>
      sharp(svg, { density: 72 * (size / 32) * 4 })
        .resize(size, size)
        .png()
        .toBuffer(),
    ),
  );
  const header = Buffer.alloc(6);
  header.writeUInt16LE(0, 0); // reserved
  header.writeUInt16LE(1, 2); // type: icon
  header.writeUInt16LE(images.length, 4);
  const entries: Buffer[] = [];
  let offset = 6 + 16 * images.length;
  images.forEach((png, i) => {
    const entry = Buffer.alloc(16);
    entry.writeUInt8(sizes[i] % 256, 0); // width (0 means 256)
    entry.writeUInt8(sizes[i] % 256, 1); // height
    entry.writeUInt8(0, 2); // colours in palette
    entry.writeUInt8(0, 3); // reserved
    entry.writeUInt16LE(1, 4); // colour planes
    entry.writeUInt16LE(32, 6); // bits per pixel
    entry.writeUInt32LE(png.length, 8);
    entry.writeUInt32LE(offset, 12);
    offset += png.length;
    entries.push(entry);
  });
  writeFileSync(path.join(root, 'app/favicon.ico'), Buffer.concat([header, ...entries, ...images]));
}

void main();
