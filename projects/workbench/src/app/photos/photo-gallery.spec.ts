import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { CpCorrectionOverlayHarness } from '@counterpoise/ng/correction-overlay/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { settle } from '../shell/testing';
import { PhotoGallery } from './photo-gallery';
import type { PhotoSubject } from './photos.api';
import { aPhoto, fakeObjectUrls } from './photos-testing';

@Component({
  imports: [PhotoGallery],
  template: `@if (shown()) {
    <app-photo-gallery [subject]="subject" [canChange]="canChange()" rotation="counterClockwise" />
  }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly subject: PhotoSubject = { kind: 'machine', id: 12 };
  readonly canChange = signal(true);
  readonly shown = signal(true);
}

describe('PhotoGallery', { timeout: 30_000 }, () => {
  let http: HttpTestingController;
  let urls: ReturnType<typeof fakeObjectUrls>;

  beforeEach(() => {
    urls = fakeObjectUrls();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    http.verify();
    urls.restore();
  });

  async function render(
    canChange = true,
    photos = [aPhoto(), aPhoto({ id: 6, caption: null, overlayBackground: true })],
  ) {
    const fixture = TestBed.createComponent(Host);
    fixture.componentInstance.canChange.set(canChange);
    fixture.detectChanges();
    http.expectOne('/api/v1/machines/12/photos').flush({ photos, limit: 40 });
    for (const photo of photos)
      http.expectOne(`/api/v1/photos/${photo.id}/thumbnail`).flush(new Blob(['webp']));
    await settle(fixture);
    return {
      fixture,
      element: fixture.nativeElement as HTMLElement,
      overlays: TestbedHarnessEnvironment.documentRootLoader(fixture),
      loader: TestbedHarnessEnvironment.loader(fixture),
    };
  }

  it('shows the thumbnails as buttons, with the caption as their text alternative, and the background marked', async () => {
    const { element } = await render();
    const images = [...element.querySelectorAll<HTMLImageElement>('.photo__thumb img')];
    expect(images.map((image) => [image.getAttribute('src'), image.alt])).toEqual([
      ['blob:photo-1', 'Left end plate, tape by the first tooth row'],
      ['blob:photo-2', 'Photo 6 of the machine, without a caption'],
    ]);
    const buttons = [...element.querySelectorAll('button.photo__thumb')];
    expect(buttons.map((button) => button.getAttribute('aria-label'))).toEqual([
      'Show large: Left end plate, tape by the first tooth row',
      'Show large: Photo 6 of the machine, without a caption',
    ]);
    expect(element.querySelectorAll('.photo__badge')).toHaveLength(1);
    expect(element.querySelector('.photos__head')?.textContent).toContain('2 of 40');
  });

  it('offers no upload and no menu to someone who may not change the photos', async () => {
    const { element } = await render(false);
    expect(element.querySelector('.photos__add-button')).toBeNull();
    expect(element.querySelector('.photo__menu')).toBeNull();
    expect(element.querySelectorAll('.photo__thumb img')).toHaveLength(2);
  });

  it('sends a chosen file with its caption, shows the progress, and adds the photo stored', async () => {
    const { fixture, element } = await render(true, []);
    const picker = element.querySelector<HTMLInputElement>('input[type=file]')!;
    expect(picker.accept).toBe('image/jpeg,image/png,image/webp');
    expect(picker.getAttribute('capture')).toBe('environment');
    const caption = element.querySelector<HTMLInputElement>('.photos__caption input')!;
    caption.value = 'Rotor as found';
    caption.dispatchEvent(new Event('input'));
    const file = new File(['jpeg'], 'drum.jpg', { type: 'image/jpeg' });
    Object.defineProperty(picker, 'files', { value: [file], configurable: true });
    picker.dispatchEvent(new Event('change'));
    fixture.detectChanges();
    const request = http.expectOne({ method: 'POST', url: '/api/v1/machines/12/photos' });
    expect((request.request.body as FormData).get('caption')).toBe('Rotor as found');
    request.event({ type: 1, loaded: 30, total: 100 });
    fixture.detectChanges();
    expect(element.querySelector('.photos__progress')?.textContent?.replace(/\s+/g, ' ')).toContain(
      'Sending drum.jpg… 30 %',
    );
    request.flush(aPhoto({ id: 9, caption: 'Rotor as found' }), { status: 201, statusText: 'Created' });
    http.expectOne('/api/v1/photos/9/thumbnail').flush(new Blob(['webp']));
    await settle(fixture);
    expect(element.querySelector('.photos__progress')).toBeNull();
    expect(element.querySelector<HTMLImageElement>('.photo__thumb img')?.alt).toBe('Rotor as found');
    expect(caption.value).toBe('');
  });

  it('says in words why the server refused a file, naming it', async () => {
    const { fixture, element } = await render(true, []);
    const picker = element.querySelector<HTMLInputElement>('input[type=file]')!;
    Object.defineProperty(picker, 'files', {
      value: [new File(['#!/bin/sh'], 'photo.jpg')],
      configurable: true,
    });
    picker.dispatchEvent(new Event('change'));
    http.expectOne('/api/v1/machines/12/photos').flush(
      {
        type: 'about:blank',
        title: 'Unsupported Media Type',
        status: 415,
        code: 'PHOTO_TYPE_NOT_ALLOWED',
        errors: [
          {
            path: 'photo',
            message: 'The file is not an image this server reads; send a JPEG, PNG or WebP photo.',
          },
        ],
      },
      { status: 415, statusText: 'Unsupported Media Type' },
    );
    await settle(fixture);
    const banner = element.querySelector('.photos__problem')?.textContent?.replace(/\s+/g, ' ');
    expect(banner).toContain('The photo was not stored.');
    expect(banner).toContain(
      'photo.jpg: The file is not an image this server reads; send a JPEG, PNG or WebP photo.',
    );
    expect(element.querySelectorAll('.photo')).toHaveLength(0);
  });

  it('shows a photo large in a dialog', async () => {
    const { fixture, element, overlays } = await render();
    element.querySelector<HTMLButtonElement>('button.photo__thumb')!.click();
    await settle(fixture);
    http.expectOne('/api/v1/photos/5').flush(new Blob(['jpeg']));
    await settle(fixture);
    const dialog = await overlays.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Left end plate, tape by the first tooth row');
    const large = document.querySelector<HTMLImageElement>('.large');
    expect(large?.getAttribute('src')).toBe('blob:photo-3');
    await dialog.close();
  });

  it('calibrates a photo over the correction overlay and saves it as the background', async () => {
    const { fixture, element, loader, overlays } = await render();
    const menu = await loader.getHarness(MatMenuHarness.with({ selector: '.photo__menu' }));
    await menu.clickItem({ text: /Use as overlay background/ });
    await settle(fixture);
    http.expectOne('/api/v1/photos/5').flush(new Blob(['jpeg']));
    await settle(fixture);
    const overlay = await overlays.getHarness(CpCorrectionOverlayHarness);
    expect(await overlay.isCalibrating()).toBe(true);
    // With the keyboard alone: the rim handle two steps right, the reference mark one step up.
    await overlay.moveHandle('rim', 2);
    await overlay.moveHandle('referenceMark', 0, -1);
    const save = [...document.querySelectorAll<HTMLButtonElement>('mat-dialog-actions button')].find(
      (button) => button.textContent?.includes('Save as background'),
    )!;
    save.click();
    const put = http.expectOne({ method: 'PUT', url: '/api/v1/machines/12/photos/5/overlay' });
    const sent = (put.request.body as { calibration: Record<string, { x: number; y: number }> }).calibration;
    expect(sent['centre']).toEqual({ x: 0.5, y: 0.5 });
    expect(sent['rim']!.x).toBeCloseTo(0.79, 3);
    expect(sent['rim']!.y).toBeCloseTo(0.5, 3);
    expect(sent['referenceMark']!.x).toBeCloseTo(0.5, 3);
    expect(sent['referenceMark']!.y).toBeLessThan(0.16);
    put.flush(aPhoto({ overlayBackground: true }));
    await settle(fixture);
    // The list is read again: the machine's earlier background stopped being it on the server.
    http.expectOne('/api/v1/machines/12/photos').flush({
      photos: [aPhoto({ overlayBackground: true }), aPhoto({ id: 6, caption: null })],
      limit: 40,
    });
    await settle(fixture);
    expect(element.querySelectorAll('.photo')[0]?.querySelector('.photo__badge')).not.toBeNull();
    expect(element.querySelectorAll('.photo')[1]?.querySelector('.photo__badge')).toBeNull();
  });

  it('revokes every object URL it made when it goes', async () => {
    const { fixture } = await render();
    fixture.componentInstance.shown.set(false);
    fixture.detectChanges();
    expect(urls.revoked.sort()).toEqual(['blob:photo-1', 'blob:photo-2']);
  });
});
