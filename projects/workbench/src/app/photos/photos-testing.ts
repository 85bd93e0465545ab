import type { Photo } from './photos.api';

/** A machine's photo as the demo server answers it; `changes` overrides its fields. */
export function aPhoto(changes: Partial<Photo> = {}): Photo {
  return {
    id: 5,
    machineId: 12,
    jobId: null,
    mediaType: 'image/jpeg',
    widthPx: 1600,
    heightPx: 1200,
    byteSize: 231_400,
    caption: 'Left end plate, tape by the first tooth row',
    calibration: null,
    overlayBackground: false,
    createdById: 7,
    createdByName: 'Rowan Tally',
    createdAt: '2026-04-14T09:12:00.000Z',
    ...changes,
  };
}

/**
 * jsdom has no object URLs: a stand-in that hands out `blob:` names and remembers which were revoked, so that
 * specs can check that a component lets go of every image it made.
 */
export function fakeObjectUrls(): { created: string[]; revoked: string[]; restore(): void } {
  const created: string[] = [];
  const revoked: string[] = [];
  const { createObjectURL, revokeObjectURL } = URL;
  URL.createObjectURL = () => {
    const url = `blob:photo-${created.length + 1}`;
    created.push(url);
    return url;
  };
  URL.revokeObjectURL = (url: string) => {
    revoked.push(url);
  };
  return {
    created,
    revoked,
    restore: () => {
      URL.createObjectURL = createObjectURL;
      URL.revokeObjectURL = revokeObjectURL;
    },
  };
}
