import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  effect,
  type ElementRef,
  inject,
  input,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import type { RotationDirection } from '@counterpoise/ng/core';
import type { Subscription } from 'rxjs';
import { ErrorBanner } from '../forms/error-banner';
import { askToConfirm } from '../shell/confirm-dialog';
import { httpErrorMessage, problemOf } from '../shell/server-errors';
import { CalibrateDialog, type CalibrateRequest } from './calibrate-dialog';
import { CaptionDialog } from './caption-dialog';
import { formatBytes, PHOTO_CAPTION_MAX_LENGTH, photoAlt } from './photo-labels';
import { PhotoUrls } from './photo-urls';
import { PhotoViewDialog } from './photo-view-dialog';
import { PHOTO_ACCEPT, type Photo, type PhotoList, PhotosApi, type PhotoSubject } from './photos.api';

/** An upload under way: the file's name and how much is sent. */
interface Sending {
  readonly fileName: string;
  readonly fraction: number | null;
}

let nextId = 0;

/**
 * The photos of a machine or a job: thumbnails in a grid (each a button that shows the photo large), and for
 * those who may change them, an upload from the tablet's camera or its files with its progress and the
 * server's refusal in words, and per photo a menu to change the caption, remove it, and (on a machine) make it
 * the correction overlay's background by calibrating it.
 */
@Component({
  selector: 'app-photo-gallery',
  imports: [
    ErrorBanner,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatProgressBarModule,
    MatProgressSpinnerModule,
    ReactiveFormsModule,
  ],
  providers: [PhotoUrls],
  templateUrl: './photo-gallery.html',
  styleUrl: './photo-gallery.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotoGallery {
  /** The machine or job whose photos these are. */
  readonly subject = input.required<PhotoSubject>();
  /** The section's heading. */
  readonly heading = input('Photos');
  /** The heading's level: 2 on a page, 3 inside a job's step. */
  readonly headingLevel = input<2 | 3>(2);
  /** A sentence under the heading: what the photos are for. */
  readonly lead = input('');
  /** Whether the signed-in person may add, caption and remove photos here. */
  readonly canChange = input(false);
  /** How the rotor turns in the photos' view (a machine's, for the overlay's calibration). */
  readonly rotation = input<RotationDirection>('clockwise');

  private readonly api = inject(PhotosApi);
  private readonly dialog = inject(MatDialog);
  protected readonly urls = inject(PhotoUrls);
  private readonly picker = viewChild<ElementRef<HTMLInputElement>>('picker');

  protected readonly headingId = `photos-heading-${++nextId}`;
  protected readonly accept = PHOTO_ACCEPT;
  protected readonly captionMax = PHOTO_CAPTION_MAX_LENGTH;
  protected readonly list = signal<PhotoList | null>(null);
  protected readonly loadError = signal<unknown>(null);
  protected readonly sending = signal<Sending | null>(null);
  protected readonly uploadError = signal<string | null>(null);
  protected readonly actionError = signal<string | null>(null);
  /** The caption the next upload is sent with. */
  protected readonly caption = new FormControl('', { nonNullable: true });
  protected readonly photos = computed(() => this.list()?.photos ?? []);
  protected readonly full = computed(() => {
    const list = this.list();
    return list !== null && list.photos.length >= list.limit;
  });
  protected readonly alt = photoAlt;
  protected readonly formatBytes = formatBytes;
  private uploading: Subscription | null = null;

  constructor() {
    effect(() => {
      const subject = this.subject();
      untracked(() => this.load(subject));
    });
    inject(DestroyRef).onDestroy(() => this.uploading?.unsubscribe());
  }

  /** Fetches the list again (after a failure). */
  protected load(subject = this.subject()): void {
    this.loadError.set(null);
    this.api.list(subject).subscribe({
      next: (list) => this.show(list),
      error: (error: unknown) => this.loadError.set(error),
    });
  }

  /** Opens the device's camera or file chooser. */
  protected choose(): void {
    this.picker()?.nativeElement.click();
  }

  /** Sends the chosen file. */
  protected picked(event: Event): void {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    this.uploadError.set(null);
    this.sending.set({ fileName: file.name, fraction: 0 });
    this.uploading = this.api.upload(this.subject(), file, file.name, this.caption.value).subscribe({
      next: (progress) => {
        if (progress.state === 'sending')
          this.sending.set({ fileName: file.name, fraction: progress.fraction });
        else {
          this.caption.reset();
          this.replace(progress.photo, true);
        }
      },
      error: (error: unknown) => {
        this.sending.set(null);
        this.uploadError.set(uploadRefusal(error, file.name));
      },
      complete: () => this.sending.set(null),
    });
  }

  protected view(photo: Photo): void {
    this.dialog.open(PhotoViewDialog, { data: photo, maxWidth: '96vw', width: '60rem', autoFocus: 'dialog' });
  }

  protected editCaption(photo: Photo): void {
    this.dialog
      .open<CaptionDialog, Photo, Photo>(CaptionDialog, { data: photo, width: '32rem', maxWidth: '96vw' })
      .afterClosed()
      .subscribe((changed) => changed && this.replace(changed));
  }

  protected calibrate(photo: Photo): void {
    const subject = this.subject();
    if (subject.kind !== 'machine') return;
    this.dialog
      .open<CalibrateDialog, CalibrateRequest, Photo>(CalibrateDialog, {
        data: { machineId: subject.id, photo, rotation: this.rotation() },
        width: '48rem',
        maxWidth: '96vw',
        autoFocus: 'dialog',
      })
      .afterClosed()
      .subscribe((stored) => {
        // One background per machine: the one before stopped being it on the server.
        if (stored) this.load();
      });
  }

  protected stopBackground(photo: Photo): void {
    const subject = this.subject();
    this.actionError.set(null);
    this.api.stopOverlayBackground(subject.id, photo.id).subscribe({
      next: () => this.replace({ ...photo, overlayBackground: false }),
      error: (error: unknown) => this.actionError.set(httpErrorMessage(error)),
    });
  }

  protected remove(photo: Photo): void {
    askToConfirm(
      this.dialog,
      {
        title: 'Remove this photo?',
        message: `“${photoAlt(photo)}” leaves the list${photo.overlayBackground ? ' and stops being the overlay’s background' : ''}. The shop’s record keeps it.`,
        confirm: 'Remove the photo',
        destructive: true,
      },
      { restoreFocus: false },
    ).subscribe((confirmed) => {
      if (!confirmed) return;
      this.actionError.set(null);
      this.api.remove(photo.id).subscribe({
        next: () => {
          const list = this.list();
          if (list) this.show({ ...list, photos: list.photos.filter((each) => each.id !== photo.id) });
        },
        error: (error: unknown) => this.actionError.set(httpErrorMessage(error)),
      });
    });
  }

  private show(list: PhotoList): void {
    this.list.set(list);
    const ids = list.photos.map((photo) => photo.id);
    this.urls.forget(ids);
    this.urls.load(ids, 'thumbnail');
  }

  private replace(photo: Photo, added = false): void {
    const list = this.list() ?? { photos: [], limit: 40 };
    this.show({
      ...list,
      photos: added
        ? [...list.photos, photo]
        : list.photos.map((each) => (each.id === photo.id ? photo : each)),
    });
  }
}

/** A refused upload in words: the server's reason for the file, or what went wrong on the way. */
export function uploadRefusal(error: unknown, fileName: string): string {
  const problem = problemOf(error);
  const reasons = problem?.errors?.map((field) => field.message) ?? [];
  if (reasons.length > 0) return `${fileName}: ${reasons.join(' ')}`;
  return `${fileName}: ${httpErrorMessage(error)}`;
}
