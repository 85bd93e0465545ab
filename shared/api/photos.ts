import * as z from 'zod';
import { HIDDEN_CHARACTERS } from './display-name';

/*
 * Photos of a rotor, on a machine or on a job: the contract between the server and the workbench.
 * Uploads are `multipart/form-data` (field `photo`, optional `caption`); the type is read from the
 * content, the image is re-encoded (which drops location and camera data) and a thumbnail made. One photo
 * of a machine may be the correction overlay's background, with where the rotor sits on it. docs/photos.md
 * describes the routes and the limits.
 */

/** The image types a photo may be, read from its content (never from its name or declared type). */
export const PHOTO_MEDIA_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export type PhotoMediaType = (typeof PHOTO_MEDIA_TYPES)[number];

/** The largest upload accepted, in bytes: a phone camera's full-size JPEG fits with room to spare. */
export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;
/** Photos kept on one machine or one job (removed ones do not count). */
export const PHOTO_LIMIT_PER_SUBJECT = 40;
/** The longest side of a stored photo, in pixels: larger uploads are scaled down. */
export const PHOTO_LONG_SIDE_PX = 2560;
/** The longest side of a thumbnail, in pixels. */
export const THUMBNAIL_LONG_SIDE_PX = 320;
/** The most pixels an upload may declare (width × height), against decompression bombs. */
export const PHOTO_MAX_INPUT_PIXELS = 50_000_000;
/** The longest caption. */
export const PHOTO_CAPTION_MAX = 200;
/** The form field that carries the image. */
export const PHOTO_FIELD = 'photo';

/** The `code` of the photos' own problems. */
export const PHOTOS_PROBLEM_CODES = {
  /** The content is not a JPEG, PNG or WebP image (whatever its name or declared type): 415. */
  unsupportedType: 'PHOTO_TYPE_NOT_ALLOWED',
  /** The image is truncated, corrupt or too many pixels: 400. */
  unreadable: 'PHOTO_UNREADABLE',
  /** The file is larger than `PHOTO_MAX_BYTES`: 413. */
  tooLarge: 'PHOTO_TOO_LARGE',
  /** No file in the field `photo`, a file in another field, or a field too long: 400. */
  badForm: 'PHOTO_FORM_INVALID',
  /** The machine or job already holds `PHOTO_LIMIT_PER_SUBJECT` photos: 409. */
  tooMany: 'TOO_MANY_PHOTOS',
} as const;

/** A caption: trimmed, at most `PHOTO_CAPTION_MAX` characters, no invisible characters; empty means none. */
export const PhotoCaptionSchema = z
  .string({ error: 'The caption is text.' })
  .trim()
  .max(PHOTO_CAPTION_MAX, { error: `Keep the caption to ${PHOTO_CAPTION_MAX} characters.` })
  .refine((text) => !HIDDEN_CHARACTERS.test(text), {
    error: 'The caption holds an invisible control or text-direction character.',
  })
  .transform((text) => (text === '' ? null : text));

/** The text fields of an upload besides the file. */
export const PhotoUploadFieldsSchema = z.strictObject(
  { caption: PhotoCaptionSchema.optional() },
  { error: (issue) => (issue.code === 'unrecognized_keys' ? 'Send only `photo` and `caption`.' : undefined) },
);

/** A point on a photo, as fractions of its width (`x`) and height (`y`) from the top-left corner. */
export const PhotoPointSchema = z
  .object({
    x: z
      .number({ error: 'x is a fraction of the photo’s width, 0 to 1.' })
      .min(0, { error: 'The point is inside the photo: x is 0 or more.' })
      .max(1, { error: 'The point is inside the photo: x is 1 or less.' }),
    y: z
      .number({ error: 'y is a fraction of the photo’s height, 0 to 1.' })
      .min(0, { error: 'The point is inside the photo: y is 0 or more.' })
      .max(1, { error: 'The point is inside the photo: y is 1 or less.' }),
  })
  .meta({ id: 'PhotoPoint' });
export type PhotoPoint = z.infer<typeof PhotoPointSchema>;

/** How far apart (as a fraction of the photo) the rim or the reference mark must be from the centre. */
export const CALIBRATION_MIN_DISTANCE = 0.02;

function apart(a: PhotoPoint, b: PhotoPoint): boolean {
  return Math.hypot(a.x - b.x, a.y - b.y) >= CALIBRATION_MIN_DISTANCE;
}

/** Where the rotor sits on a photo: its centre, a point on the weight circle, and the reference mark. */
export const PhotoCalibrationSchema = z
  .object({
    centre: PhotoPointSchema,
    rim: PhotoPointSchema,
    referenceMark: PhotoPointSchema,
  })
  .superRefine((calibration, context) => {
    if (!apart(calibration.centre, calibration.rim)) {
      context.addIssue({
        code: 'custom',
        path: ['rim'],
        message: 'The rim is on the centre: drag it out to the circle where weights go.',
      });
    }
    if (!apart(calibration.centre, calibration.referenceMark)) {
      context.addIssue({
        code: 'custom',
        path: ['referenceMark'],
        message: 'The reference mark is on the centre: drag it to the mark on the rotor.',
      });
    }
  })
  .meta({
    id: 'PhotoCalibration',
    example: { centre: { x: 0.5, y: 0.52 }, rim: { x: 0.82, y: 0.52 }, referenceMark: { x: 0.5, y: 0.2 } },
  });
export type PhotoCalibration = z.infer<typeof PhotoCalibrationSchema>;

/** A photo as the API answers it; its image and thumbnail are at `/api/v1/photos/{id}` and `…/thumbnail`. */
export const PhotoSchema = z
  .object({
    id: z.number().int().positive(),
    machineId: z.number().int().positive().nullable(),
    jobId: z.number().int().positive().nullable(),
    mediaType: z.enum(PHOTO_MEDIA_TYPES),
    widthPx: z.number().int().positive(),
    heightPx: z.number().int().positive(),
    byteSize: z.number().int().positive(),
    caption: z.string().nullable(),
    /** Where the rotor sits on the photo, once calibrated. */
    calibration: PhotoCalibrationSchema.nullable(),
    /** Whether the photo is the machine's correction-overlay background. */
    overlayBackground: z.boolean(),
    createdById: z.number().int().positive(),
    createdByName: z.string(),
    createdAt: z.iso.datetime(),
  })
  .meta({ id: 'Photo' });
export type Photo = z.infer<typeof PhotoSchema>;

/** The photos of one machine or job, oldest first, with how many it may hold. */
export const PhotoListSchema = z
  .object({
    photos: z.array(PhotoSchema),
    limit: z.number().int().positive(),
  })
  .meta({ id: 'PhotoList' });
export type PhotoList = z.infer<typeof PhotoListSchema>;

/** A caption changed (null or empty removes it). */
export const ChangePhotoSchema = z
  .strictObject({ caption: PhotoCaptionSchema.nullable() })
  .meta({ id: 'ChangePhoto' });
export type ChangePhoto = z.input<typeof ChangePhotoSchema>;

/** A machine's photo made the overlay's background, with where the rotor sits on it. */
export const SetOverlayBackgroundSchema = z
  .strictObject({ calibration: PhotoCalibrationSchema })
  .meta({ id: 'SetOverlayBackground' });
export type SetOverlayBackground = z.infer<typeof SetOverlayBackgroundSchema>;
