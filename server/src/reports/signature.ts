import { REPORTS_PROBLEM_CODES } from '@counterpoise/api';
import sharp, { type Metadata, type OutputInfo } from 'sharp';
import { HttpProblem } from '../http/problem';

/** The largest signature PNG taken, decoded from its data URL. */
export const SIGNATURE_MAX_BYTES = 1024 * 1024;
/** The most pixels a signature may have (a tablet's canvas at twice its CSS size is about 1.2 million). */
export const SIGNATURE_MAX_PIXELS = 4_000_000;
/** The widest or tallest a signature may be, in pixels. */
export const SIGNATURE_MAX_SIDE_PX = 4096;

const FIELD = 'signaturePng';

function badSignature(message: string): HttpProblem {
  return new HttpProblem(
    400,
    'Bad Request',
    `${FIELD}: ${message}`,
    [{ path: FIELD, message }],
    'about:blank',
    REPORTS_PROBLEM_CODES.badSignature,
  );
}

/**
 * The customer's signature as the report keeps it, from the data URL signature_pad gives: the bytes must
 * be a PNG (read from the content, not the data URL's label), of at most `SIGNATURE_MAX_BYTES`,
 * `SIGNATURE_MAX_SIDE_PX` a side and `SIGNATURE_MAX_PIXELS`, and hold a drawing (a canvas left
 * transparent, or of one colour, is refused). It is decoded and encoded again, which drops whatever
 * else the file carried (text chunks, metadata). Each refusal is a 400 on `signaturePng`.
 */
export async function readSignature(dataUrl: string): Promise<Buffer> {
  const base64 = dataUrl.slice(dataUrl.indexOf(',') + 1);
  const bytes = Buffer.from(base64, 'base64');
  if (bytes.length === 0) throw badSignature('The signature is empty: draw it on the pad.');
  if (bytes.length > SIGNATURE_MAX_BYTES) {
    throw badSignature(
      `The signature is larger than ${SIGNATURE_MAX_BYTES / 1024} kB: clear it and sign once more.`,
    );
  }
  let metadata: Metadata;
  try {
    metadata = await sharp(bytes, { limitInputPixels: SIGNATURE_MAX_PIXELS }).metadata();
  } catch {
    throw badSignature('The signature is not an image the server can read: sign once more.');
  }
  if (metadata.format !== 'png') {
    throw badSignature(`The signature is a ${metadata.format ?? 'file of another kind'}, not a PNG image.`);
  }
  const width = metadata.width ?? 0;
  const height = metadata.height ?? 0;
  if (
    width > SIGNATURE_MAX_SIDE_PX ||
    height > SIGNATURE_MAX_SIDE_PX ||
    width * height > SIGNATURE_MAX_PIXELS
  ) {
    throw badSignature(
      `The signature is ${width} × ${height} pixels: at most ${SIGNATURE_MAX_SIDE_PX} a side and ` +
        `${SIGNATURE_MAX_PIXELS.toLocaleString('en-GB')} in all.`,
    );
  }
  let decoded: { data: Buffer; info: OutputInfo };
  try {
    decoded = await sharp(bytes, { limitInputPixels: SIGNATURE_MAX_PIXELS })
      .ensureAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true });
  } catch {
    throw badSignature('The signature PNG is damaged or cut short: sign once more.');
  }
  if (!holdsDrawing(decoded.data, decoded.info.channels)) {
    throw badSignature('The signature pad is empty: the customer draws their signature before signing.');
  }
  return sharp(bytes, { limitInputPixels: SIGNATURE_MAX_PIXELS }).png({ compressionLevel: 9 }).toBuffer();
}

/**
 * Whether raw RGBA pixels hold a drawing: some pixel is visible (alpha above 0) and differs from the
 * first visible one, or visible pixels sit on transparent ones (ink on a transparent pad).
 */
export function holdsDrawing(pixels: Buffer, channels: number): boolean {
  let visible = 0;
  let transparent = 0;
  let first: number[] | null = null;
  let differs = false;
  for (let offset = 0; offset + channels <= pixels.length; offset += channels) {
    const alpha = pixels[offset + channels - 1]!;
    if (alpha === 0) {
      transparent++;
      continue;
    }
    visible++;
    const colour = [pixels[offset]!, pixels[offset + 1]!, pixels[offset + 2]!, alpha];
    if (first === null) first = colour;
    else if (!differs && colour.some((value, index) => Math.abs(value - first![index]!) > 8)) differs = true;
  }
  return visible > 0 && (transparent > 0 || differs);
}
