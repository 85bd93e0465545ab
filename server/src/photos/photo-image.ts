import { createHash } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import sharp, { type SharpOptions } from 'sharp';
import {
  PHOTO_FIELD,
  PHOTO_LONG_SIDE_PX,
  PHOTO_MAX_INPUT_PIXELS,
  type PhotoMediaType,
  PHOTOS_PROBLEM_CODES,
  THUMBNAIL_LONG_SIDE_PX,
} from '@counterpoise/api';
import { HttpProblem } from '../http/problem';

/** One stored image: its bytes, their SHA-256 (hex) and its media type. */
export interface EncodedImage {
  readonly bytes: Buffer;
  readonly sha256: string;
  readonly mediaType: PhotoMediaType | 'image/webp';
  readonly widthPx: number;
  readonly heightPx: number;
}

/** A photo ready to store: the re-encoded image and its thumbnail (always WebP). */
export interface ProcessedPhoto {
  readonly image: EncodedImage & { readonly mediaType: PhotoMediaType };
  readonly thumbnail: EncodedImage;
}

/** The file extension a stored image of a media type carries. */
export const EXTENSIONS: Readonly<Record<PhotoMediaType, string>> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
};

const ALLOWED = new Set<string>(Object.keys(EXTENSIONS));

function sha256Of(bytes: Buffer): string {
  return createHash('sha256').update(bytes).digest('hex');
}

function refused(status: number, code: string, message: string): HttpProblem {
  return new HttpProblem(
    status,
    status === 415 ? 'Unsupported Media Type' : 'Bad Request',
    `${PHOTO_FIELD}: ${message}`,
    [{ path: PHOTO_FIELD, message }],
    'about:blank',
    code,
  );
}

/**
 * The media type of an upload, read from its first bytes (file-type's signatures), never from its file
 * name or declared Content-Type: a program or a script named `photo.jpg` is refused here. SVG is refused
 * too (it is text that can carry script, and file-type does not claim it).
 */
export async function sniffPhotoType(bytes: Buffer): Promise<PhotoMediaType> {
  const found = await fileTypeFromBuffer(bytes);
  if (found === undefined || !ALLOWED.has(found.mime)) {
    const what = found
      ? `a ${found.ext.toUpperCase()} file (${found.mime})`
      : 'not an image this server reads';
    throw refused(
      415,
      PHOTOS_PROBLEM_CODES.unsupportedType,
      `The file is ${what}; send a JPEG, PNG or WebP photo.`,
    );
  }
  return found.mime as PhotoMediaType;
}

/** sharp's reading options: the whole image must decode (a truncated one fails), within a pixel budget. */
const INPUT_OPTIONS = {
  failOn: 'error',
  limitInputPixels: PHOTO_MAX_INPUT_PIXELS,
} as const satisfies SharpOptions;

/**
 * Re-encodes an upload: turned upright from its EXIF orientation, scaled so that its long side is at most
 * `PHOTO_LONG_SIDE_PX`, and written again in its own format without any metadata (sharp keeps EXIF, GPS,
 * XMP and ICC only when asked with `withMetadata`/`keep*`, which is never done here), plus a WebP thumbnail
 * of `THUMBNAIL_LONG_SIDE_PX`. An image that does not decode whole (truncated, corrupt) or declares more
 * than `PHOTO_MAX_INPUT_PIXELS` is refused with a 400 naming `photo`.
 */
export async function processPhoto(bytes: Buffer, mediaType: PhotoMediaType): Promise<ProcessedPhoto> {
  try {
    const upright = sharp(bytes, INPUT_OPTIONS).rotate().resize({
      width: PHOTO_LONG_SIDE_PX,
      height: PHOTO_LONG_SIDE_PX,
      fit: 'inside',
      withoutEnlargement: true,
    });
    const encoder =
      mediaType === 'image/jpeg'
        ? upright.jpeg({ quality: 85, mozjpeg: true })
        : mediaType === 'image/png'
          ? upright.png({ compressionLevel: 9 })
          : upright.webp({ quality: 85 });
    const image = await encoder.toBuffer({ resolveWithObject: true });
    const thumbnail = await sharp(image.data, INPUT_OPTIONS)
      .resize({
        width: THUMBNAIL_LONG_SIDE_PX,
        height: THUMBNAIL_LONG_SIDE_PX,
        fit: 'inside',
        withoutEnlargement: true,
      })
      .webp({ quality: 80 })
      .toBuffer({ resolveWithObject: true });
    return {
      image: {
        bytes: image.data,
        sha256: sha256Of(image.data),
        mediaType,
        widthPx: image.info.width,
        heightPx: image.info.height,
      },
      thumbnail: {
        bytes: thumbnail.data,
        sha256: sha256Of(thumbnail.data),
        mediaType: 'image/webp',
        widthPx: thumbnail.info.width,
        heightPx: thumbnail.info.height,
      },
    };
  } catch (error) {
    const message = error instanceof Error ? error.message : '';
    throw refused(
      400,
      PHOTOS_PROBLEM_CODES.unreadable,
      /pixel limit/i.test(message)
        ? `The image has more than ${PHOTO_MAX_INPUT_PIXELS.toLocaleString('en')} pixels; send a smaller photo.`
        : 'The image is truncated or corrupt and cannot be read whole; take or send the photo again.',
    );
  }
}
