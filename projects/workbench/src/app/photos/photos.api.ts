import { HttpClient, type HttpEvent, HttpEventType } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Photo, PhotoCalibration, PhotoList } from '@counterpoise/api';
import { filter, map, type Observable } from 'rxjs';

/*
 * The shapes of the photo routes come from the shared schemas by type alone, so that pages never load zod.
 * docs/photos.md describes the routes and their limits.
 */
export type { Photo, PhotoCalibration, PhotoList, PhotoPoint } from '@counterpoise/api';

/** What photos hang on: a machine or a balancing job. */
export interface PhotoSubject {
  readonly kind: 'machine' | 'job';
  readonly id: number;
}

/** The image types the server takes (it reads the type from the content, whatever the file's name). */
export const PHOTO_ACCEPT = 'image/jpeg,image/png,image/webp';

/** How far an upload has got: sending (a fraction, when known), then the photo as stored. */
export type UploadProgress =
  | { readonly state: 'sending'; readonly fraction: number | null }
  | { readonly state: 'stored'; readonly photo: Photo };

/**
 * The photos on the server: a machine's or a job's list, uploads with their progress, the image and thumbnail
 * as blobs (the API needs the session's access token, which an `<img src>` cannot carry), captions, removal,
 * and the machine's overlay background.
 */
@Injectable({ providedIn: 'root' })
export class PhotosApi {
  private readonly http = inject(HttpClient);

  /** The subject's photos, oldest first, with how many it may hold. */
  list(subject: PhotoSubject): Observable<PhotoList> {
    return this.http.get<PhotoList>(this.subjectUrl(subject));
  }

  /** Sends a photo (and its caption) as a form, reporting progress until the server answers. */
  upload(subject: PhotoSubject, file: Blob, fileName: string, caption = ''): Observable<UploadProgress> {
    const form = new FormData();
    form.append('photo', file, fileName);
    if (caption.trim() !== '') form.append('caption', caption.trim());
    return this.http
      .post<Photo>(this.subjectUrl(subject), form, { observe: 'events', reportProgress: true })
      .pipe(
        map((event: HttpEvent<Photo>): UploadProgress | null => {
          if (event.type === HttpEventType.UploadProgress) {
            return { state: 'sending', fraction: event.total ? event.loaded / event.total : null };
          }
          if (event.type === HttpEventType.Response && event.body)
            return { state: 'stored', photo: event.body };
          return null;
        }),
        filter((progress): progress is UploadProgress => progress !== null),
      );
  }

  /** The photo's image (at most 2560 px on its long side). */
  image(id: number): Observable<Blob> {
    return this.http.get(`/api/v1/photos/${id}`, { responseType: 'blob' });
  }

  /** The photo's thumbnail (a WebP of at most 320 px). */
  thumbnail(id: number): Observable<Blob> {
    return this.http.get(`/api/v1/photos/${id}/thumbnail`, { responseType: 'blob' });
  }

  /** Changes the caption; an empty one removes it. */
  changeCaption(id: number, caption: string): Observable<Photo> {
    return this.http.patch<Photo>(`/api/v1/photos/${id}`, { caption });
  }

  /** Removes the photo from its machine or job (the server keeps its record). */
  remove(id: number): Observable<void> {
    return this.http.delete<void>(`/api/v1/photos/${id}`);
  }

  /** Makes a machine's photo its correction overlay's background, with where the rotor sits on it. */
  useAsOverlayBackground(
    machineId: number,
    photoId: number,
    calibration: PhotoCalibration,
  ): Observable<Photo> {
    return this.http.put<Photo>(this.overlayUrl(machineId, photoId), { calibration });
  }

  /** The overlay draws without a photo again. */
  stopOverlayBackground(machineId: number, photoId: number): Observable<void> {
    return this.http.delete<void>(this.overlayUrl(machineId, photoId));
  }

  private subjectUrl(subject: PhotoSubject): string {
    return `/api/v1/${subject.kind === 'machine' ? 'machines' : 'jobs'}/${subject.id}/photos`;
  }

  private overlayUrl(machineId: number, photoId: number): string {
    return `/api/v1/machines/${machineId}/photos/${photoId}/overlay`;
  }
}
