import type { Photo } from './photos.api';

/** The text alternative of a photo: its caption, or what it is when it has none. */
export function photoAlt(photo: Photo): string {
  if (photo.caption) return photo.caption;
  return `Photo ${photo.id} of the ${photo.machineId !== null ? 'machine' : 'job'}, without a caption`;
}

/** A size in words: `612 kB`, `2.4 MB`. */
export function formatBytes(bytes: number): string {
  if (bytes < 1024 * 1024) return `${Math.max(1, Math.round(bytes / 1024))} kB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

/** The longest caption the server keeps (`PHOTO_CAPTION_MAX` in the shared schemas). */
export const PHOTO_CAPTION_MAX_LENGTH = 200;
