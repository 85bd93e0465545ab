// The fonts of the first page, preloaded from the built `index.html`: without it the browser finds them
// only once the app has drawn text, one round trip after the app's script, which on a slow link puts a
// font download between the script and the page's largest paint. The faces are named here by the file
// name @fontsource gives them; the build hashes the name, so the links are written after `ng build`.
//
// `index.html` changes, so its hash in the service worker's manifest (`ngsw.json`) is written again:
// the worker refuses a file whose hash does not match.
import { createHash } from 'node:crypto';
import { readdir, readFile, writeFile } from 'node:fs/promises';
import { join } from 'node:path';

/**
 * The faces the sign-in page and the toolbar draw with: Roboto, Latin, regular (text) and medium (labels,
 * buttons, titles). Bold is used further in and left to load when needed.
 */
export const FIRST_PAGE_FONTS = ['roboto-latin-400-normal', 'roboto-latin-500-normal'];

/** The `<link rel="preload">` of each font, written before the first style sheet of `html`. */
export function withFontPreloads(html, fontPaths) {
  const links = fontPaths
    .map((path) => `<link rel="preload" href="${path}" as="font" type="font/woff2" crossorigin>`)
    .join('');
  const at = html.indexOf('<link rel="stylesheet"');
  if (at < 0) throw new Error('index.html links no style sheet to put the font preloads before');
  return html.slice(0, at) + links + html.slice(at);
}

/** Adds the preloads to `<browserDir>/index.html` and its hash to `ngsw.json`; returns the fonts' paths. */
export async function preloadFirstPageFonts(browserDir, faces = FIRST_PAGE_FONTS) {
  const media = await readdir(join(browserDir, 'media'));
  const paths = faces.map((face) => {
    // `face-HASH.woff2` in a production build, `face.woff2` in a development one.
    const file = media.find(
      (name) => name === `${face}.woff2` || (name.startsWith(`${face}-`) && name.endsWith('.woff2')),
    );
    if (!file) throw new Error(`No ${face} woff2 file in ${join(browserDir, 'media')} to preload`);
    return `media/${file}`;
  });
  const indexPath = join(browserDir, 'index.html');
  const html = withFontPreloads(await readFile(indexPath, 'utf8'), paths);
  await writeFile(indexPath, html);

  const manifestPath = join(browserDir, 'ngsw.json');
  const manifest = JSON.parse(await readFile(manifestPath, 'utf8').catch(() => 'null'));
  if (manifest?.hashTable?.['/index.html']) {
    manifest.hashTable['/index.html'] = createHash('sha1').update(html).digest('hex');
    await writeFile(manifestPath, JSON.stringify(manifest, null, 2));
  }
  return paths;
}
