import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom, toArray } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { PhotosApi, type UploadProgress } from './photos.api';
import { aPhoto } from './photos-testing';

describe('PhotosApi', () => {
  let http: HttpTestingController;
  let api: PhotosApi;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    api = TestBed.inject(PhotosApi);
  });

  afterEach(() => http.verify());

  it('lists a machine’s and a job’s photos at their own addresses', async () => {
    const machine = firstValueFrom(api.list({ kind: 'machine', id: 12 }));
    http
      .expectOne({ method: 'GET', url: '/api/v1/machines/12/photos' })
      .flush({ photos: [aPhoto()], limit: 40 });
    expect((await machine).photos[0]?.id).toBe(5);
    const job = firstValueFrom(api.list({ kind: 'job', id: 118 }));
    http.expectOne({ method: 'GET', url: '/api/v1/jobs/118/photos' }).flush({ photos: [], limit: 40 });
    expect(await job).toEqual({ photos: [], limit: 40 });
  });

  it('sends a photo as a form in the field photo with its caption, and reports progress then the photo', async () => {
    const file = new Blob(['jpeg bytes'], { type: 'image/jpeg' });
    const events = firstValueFrom(
      api.upload({ kind: 'machine', id: 12 }, file, 'drum.jpg', '  Left end  ').pipe(toArray()),
    );
    const request = http.expectOne({ method: 'POST', url: '/api/v1/machines/12/photos' });
    expect(request.request.reportProgress).toBe(true);
    const form = request.request.body as FormData;
    expect(form.get('caption')).toBe('Left end');
    const sent = form.get('photo') as File;
    expect(sent.name).toBe('drum.jpg');
    expect(sent.size).toBe(file.size);
    request.event({ type: HttpEventType.UploadProgress, loaded: 50, total: 200 });
    request.event({ type: HttpEventType.UploadProgress, loaded: 10 });
    request.flush(aPhoto({ caption: 'Left end' }), { status: 201, statusText: 'Created' });
    expect(await events).toEqual<UploadProgress[]>([
      { state: 'sending', fraction: 0.25 },
      { state: 'sending', fraction: null },
      { state: 'stored', photo: aPhoto({ caption: 'Left end' }) },
    ]);
  });

  it('leaves out an empty caption', () => {
    api.upload({ kind: 'job', id: 118 }, new Blob(['x']), 'found.png', '   ').subscribe();
    const request = http.expectOne('/api/v1/jobs/118/photos');
    expect((request.request.body as FormData).has('caption')).toBe(false);
    request.flush(aPhoto({ jobId: 118, machineId: null }));
  });

  it('fetches image and thumbnail as blobs, through the HTTP client that signs requests', async () => {
    const image = firstValueFrom(api.image(5));
    const imageRequest = http.expectOne('/api/v1/photos/5');
    expect(imageRequest.request.responseType).toBe('blob');
    imageRequest.flush(new Blob(['a']));
    expect(await image).toBeInstanceOf(Blob);
    const thumbnail = firstValueFrom(api.thumbnail(5));
    http.expectOne({ method: 'GET', url: '/api/v1/photos/5/thumbnail' }).flush(new Blob(['b']));
    expect(await thumbnail).toBeInstanceOf(Blob);
  });

  it('changes a caption, removes a photo, and sets and clears the overlay background', async () => {
    const calibration = {
      centre: { x: 0.5, y: 0.5 },
      rim: { x: 0.8, y: 0.5 },
      referenceMark: { x: 0.5, y: 0.2 },
    };
    api.changeCaption(5, 'Right end').subscribe();
    const patch = http.expectOne({ method: 'PATCH', url: '/api/v1/photos/5' });
    expect(patch.request.body).toEqual({ caption: 'Right end' });
    patch.flush(aPhoto({ caption: 'Right end' }));
    api.remove(5).subscribe();
    http
      .expectOne({ method: 'DELETE', url: '/api/v1/photos/5' })
      .flush(null, { status: 204, statusText: 'No Content' });
    const stored = firstValueFrom(api.useAsOverlayBackground(12, 5, calibration));
    const put = http.expectOne({ method: 'PUT', url: '/api/v1/machines/12/photos/5/overlay' });
    expect(put.request.body).toEqual({ calibration });
    put.flush(aPhoto({ calibration, overlayBackground: true }));
    expect((await stored).overlayBackground).toBe(true);
    api.stopOverlayBackground(12, 5).subscribe();
    http
      .expectOne({ method: 'DELETE', url: '/api/v1/machines/12/photos/5/overlay' })
      .flush(null, { status: 204, statusText: 'No Content' });
  });
});
