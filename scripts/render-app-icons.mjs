// `node scripts/render-app-icons.mjs`: draws the workbench's app icons (the web app manifest's and the
// home-screen icon of iOS) from its favicon, projects/workbench/public/favicon.svg, with sharp. Run it
// again after changing the favicon; the PNGs it writes to projects/workbench/public/icons/ are committed.
//
// - icon-192.png, icon-512.png: the favicon itself ("any" purpose), its corners transparent.
// - icon-maskable-512.png: the mark on a square of the favicon's own teal, drawn within the central 80 %
//   circle that every mask leaves visible (the "maskable" purpose of the Web App Manifest spec).
// - apple-touch-icon.png (180 px): the same full square, because iOS fills transparency with black and
//   rounds the corners itself.
import { mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import sharp from 'sharp';

const publicDir = fileURLToPath(new URL('../projects/workbench/public/', import.meta.url));
const outDir = join(publicDir, 'icons');
const favicon = readFileSync(join(publicDir, 'favicon.svg'), 'utf8');

/** The favicon's 32-unit view box; its drawing is read from between its <svg> tags. */
const VIEW_BOX = 32;
const drawing = favicon.replace(/^[\s\S]*?<svg[^>]*>/, '').replace(/<\/svg>\s*$/, '');
const teal = /<circle[^>]*r="14"[^>]*fill="(#[0-9a-fA-F]{6})"/.exec(favicon)?.[1];
if (!teal) throw new Error('favicon.svg no longer has its round teal background (a circle of r="14").');

/**
 * The mark on a full square of the background's teal, scaled about the centre: the mark reaches 12
 * units from the centre (the orange weight), so 0.8 keeps it within 9.6 of 16, inside the 80 % safe zone.
 */
const fullSquare = `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${VIEW_BOX} ${VIEW_BOX}">
  <rect width="${VIEW_BOX}" height="${VIEW_BOX}" fill="${teal}"/>
  <g transform="translate(16 16) scale(0.8) translate(-16 -16)">${drawing}</g>
</svg>`;

const icons = [
  { file: 'icon-192.png', svg: favicon, size: 192 },
  { file: 'icon-512.png', svg: favicon, size: 512 },
  { file: 'icon-maskable-512.png', svg: fullSquare, size: 512 },
  { file: 'apple-touch-icon.png', svg: fullSquare, size: 180 },
];

mkdirSync(outDir, { recursive: true });
for (const { file, svg, size } of icons) {
  // The SVG is drawn at the density that makes its view box exactly `size` pixels, not scaled afterwards.
  const info = await sharp(Buffer.from(svg), { density: (72 * size) / VIEW_BOX })
    .resize(size, size)
    .png({ compressionLevel: 9, palette: true, effort: 10 })
    .toFile(join(outDir, file));
  console.log(`${file.padEnd(24)} ${info.width}×${info.height}  ${info.size} bytes`);
}
