/*
 * Renders the demo photos in a process of its own: the demo seeders run synchronously inside one
 * transaction, and sharp answers only asynchronously, so the seed runs this script and waits for it. It
 * reads a JSON array of SVG texts on stdin and writes, for each, the processed image and thumbnail (base64,
 * with their hashes and sizes) as JSON on stdout, through the very pipeline an upload takes.
 */
import { processPhoto } from './photo-image';

const chunks: Buffer[] = [];
for await (const chunk of process.stdin) chunks.push(chunk as Buffer);
const svgs = JSON.parse(Buffer.concat(chunks).toString('utf8')) as string[];
const sharp = (await import('sharp')).default;
const rendered = [];
for (const svg of svgs) {
  const jpeg = await sharp(Buffer.from(svg)).jpeg({ quality: 90 }).toBuffer();
  const { image, thumbnail } = await processPhoto(jpeg, 'image/jpeg');
  rendered.push({
    image: { ...image, bytes: image.bytes.toString('base64') },
    thumbnail: { ...thumbnail, bytes: thumbnail.bytes.toString('base64') },
  });
}
process.stdout.write(JSON.stringify(rendered));
