// Writes app/favicon.ico from public/icon.svg (the one drawing of the app icon), so that browsers and
// tools asking for /favicon.ico get the icon instead of a 404. Next's App Router serves app/favicon.ico
// at /favicon.ico by its file convention. Run `node scripts/favicon.mjs` after changing the icon.
// The .ico holds 16, 32 and 48 px PNG images (PNG inside ICO is read by every current browser). sharp
// comes with Next (its image optimiser's dependency).
import sharp from "sharp";
import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const svg = readFileSync(path.join(root, "public", "icon.svg"));
const sizes = [16, 32, 48];
const images = await Promise.all(sizes.map((s) => sharp(svg, { density: (72 * s) / 32 }).resize(s, s).png({ compressionLevel: 9 }).toBuffer()));

// ICONDIR (6 bytes), one ICONDIRENTRY (16 bytes) per image, then the images.
const head = Buffer.alloc(6 + 16 * images.length);
head.writeUInt16LE(0, 0); // reserved
head.writeUInt16LE(1, 2); // 1 = icon
head.writeUInt16LE(images.length, 4);
let offset = head.length;
images.forEach((png, i) => {
  const e = 6 + 16 * i;
  head.writeUInt8(sizes[i] % 256, e); // width (0 would mean 256)
  head.writeUInt8(sizes[i] % 256, e + 1); // height
  head.writeUInt8(0, e + 2); // no palette
  head.writeUInt8(0, e + 3); // reserved
  head.writeUInt16LE(1, e + 4); // colour planes
  head.writeUInt16LE(32, e + 6); // bits per pixel
  head.writeUInt32LE(png.length, e + 8);
  head.writeUInt32LE(offset, e + 12);
  offset += png.length;
});
const out = path.join(root, "app", "favicon.ico");
writeFileSync(out, Buffer.concat([head, ...images]));
console.error(`favicon: wrote ${path.relative(root, out)} (${sizes.join(", ")} px)`);
