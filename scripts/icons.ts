// Renders the app's icons from one SVG (our own mark: the gaff — a climber's spur — in copper,
// with the crossarm, on the ink tile). Run: node --import tsx scripts/icons.ts
// Writes public/favicon.ico (a 32 px PNG inside an ICO container; PNG-in-ICO is read by every
// current browser), public/icons/icon.svg, icon-{16,32,180,192,512}.png and a maskable 512 px
// variant whose mark stays inside the safe zone (the central 80 %).
import { mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import sharp from "sharp";

const INK = "#16232b";
const COPPER = "#a85a24";
const PAPER = "#f6f4ef";

/** The mark on a 24-unit grid, scaled into a tile; `inset` is the share of the tile kept clear around it. */
export function iconSvg({ rounded = true, inset = 0.16 } = {}): string {
  const size = 512;
  const pad = size * inset;
  const scale = (size - 2 * pad) / 24;
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${size} ${size}" width="${size}" height="${size}">
  <rect width="${size}" height="${size}" rx="${rounded ? 96 : 0}" fill="${INK}"/>
  <g transform="translate(${pad} ${pad}) scale(${scale})">
    <path d="M7 2h4v12l-5 8H4l3-8z" fill="${COPPER}"/>
    <path d="M13 6h7v3h-7z" fill="${PAPER}"/>
  </g>
</svg>
`;
}

/** An ICO file holding one PNG image (ICONDIR + one ICONDIRENTRY + the PNG bytes). */
export function icoFromPng(png: Buffer, px: number): Buffer {
  const head = Buffer.alloc(6 + 16);
  head.writeUInt16LE(0, 0); // reserved
  head.writeUInt16LE(1, 2); // type: icon
  head.writeUInt16LE(1, 4); // one image
  head.writeUInt8(px >= 256 ? 0 : px, 6); // width (0 = 256)
  head.writeUInt8(px >= 256 ? 0 : px, 7); // height
  head.writeUInt8(0, 8); // no palette
  head.writeUInt8(0, 9); // reserved
  head.writeUInt16LE(1, 10); // colour planes
  head.writeUInt16LE(32, 12); // bits per pixel
  head.writeUInt32LE(png.length, 14); // image size
  head.writeUInt32LE(22, 18); // image offset
  return Buffer.concat([head, png]);
}

async function main() {
  const root = join(process.cwd(), "public");
  const dir = join(root, "icons");
  mkdirSync(dir, { recursive: true });
  const svg = iconSvg();
  writeFileSync(join(dir, "icon.svg"), svg);
  for (const px of [16, 32, 180, 192, 512]) {
    await sharp(Buffer.from(svg)).resize(px, px).png().toFile(join(dir, `icon-${px}.png`));
  }
  // Maskable: full-bleed tile, the mark well inside the safe zone.
  await sharp(Buffer.from(iconSvg({ rounded: false, inset: 0.26 }))).resize(512, 512).png().toFile(join(dir, "icon-maskable-512.png"));
  const png32 = await sharp(Buffer.from(svg)).resize(32, 32).png().toBuffer();
  writeFileSync(join(root, "favicon.ico"), icoFromPng(png32, 32));
  console.log("icons written to public/ and public/icons/");
}

if (process.argv[1]?.endsWith("icons.ts")) main();
