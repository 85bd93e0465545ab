import type { Photo, PhotoList } from '@counterpoise/api';

/*
 * The examples of the photo routes in the OpenAPI document: an invented photo of the demo shop's invented
 * mulcher drum (no real brand, person or company).
 */

export const PHOTO_EXAMPLE: Photo = {
  id: 5,
  machineId: 31,
  jobId: null,
  mediaType: 'image/jpeg',
  widthPx: 2560,
  heightPx: 1920,
  byteSize: 612_408,
  caption: 'Left end plate, tape at 12 o’clock',
  calibration: { centre: { x: 0.5, y: 0.52 }, rim: { x: 0.82, y: 0.52 }, referenceMark: { x: 0.5, y: 0.2 } },
  overlayBackground: true,
  createdById: 7,
  createdByName: 'Rowan Tally',
  createdAt: '2026-04-14T09:12:00.000Z',
};

export const PHOTO_LIST_EXAMPLE: PhotoList = { photos: [PHOTO_EXAMPLE], limit: 40 };

export const CALIBRATION_EXAMPLE = {
  calibration: PHOTO_EXAMPLE.calibration!,
};
