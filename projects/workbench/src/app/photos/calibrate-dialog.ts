import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import type { RotationDirection } from '@counterpoise/ng/core';
import {
  CpCorrectionOverlay,
  type PhotoCalibration,
  type RotorPhoto,
} from '@counterpoise/ng/correction-overlay';
import { ErrorBanner } from '../forms/error-banner';
import { httpErrorMessage, problemOf } from '../shell/server-errors';
import { photoAlt } from './photo-labels';
import { type Photo, PhotosApi } from './photos.api';
import { PhotoUrls } from './photo-urls';

/** What the calibration asks for: the machine, its photo, and how its rotor turns in the photo's view. */
export interface CalibrateRequest {
  readonly machineId: number;
  readonly photo: Photo;
  readonly rotation: RotationDirection;
}

/** Where the handles start on a photo never calibrated: the centre in the middle, the rim to the right, the mark above. */
export const STARTING_CALIBRATION: PhotoCalibration = {
  centre: { x: 0.5, y: 0.5 },
  rim: { x: 0.78, y: 0.5 },
  referenceMark: { x: 0.5, y: 0.16 },
};

/**
 * Makes a machine's photo the correction overlay's background: the library's overlay lies over the photo in
 * calibration mode, the technician drags (or moves with the arrow keys) its centre, rim and reference-mark
 * handles onto the rotor, and Save stores the photo as the background with that calibration. Closes with the
 * photo as stored.
 */
@Component({
  selector: 'app-calibrate-dialog',
  imports: [CpCorrectionOverlay, ErrorBanner, MatButtonModule, MatDialogModule, MatProgressSpinnerModule],
  providers: [PhotoUrls],
  template: `
    <h2 mat-dialog-title>Use as the overlay’s background</h2>
    <mat-dialog-content>
      <p class="lead">
        Put the three handles on the rotor: the <strong>centre</strong> on the shaft, the
        <strong>rim</strong> on the circle where weights go, the <strong>reference mark</strong> on the tape.
        Drag them, or tab to one and move it with the arrow keys.
      </p>
      @if (rotorPhoto(); as photo) {
        <cp-correction-overlay
          class="overlay"
          [photo]="photo"
          [rotation]="data.rotation"
          calibrating
          [legend]="false"
          [label]="'Calibrating ' + alt"
          (calibrationChange)="draft.set($event)"
        />
      } @else if (urls.state(data.photo.id, 'image')?.state === 'failed') {
        <app-error-banner message="The photo could not be fetched. Check the connection and try again." />
      } @else {
        <p class="loading" role="status">
          <mat-spinner diameter="24" aria-hidden="true" /> Fetching the photo…
        </p>
      }
      @if (error(); as message) {
        <app-error-banner class="problem" lead="The background was not saved." [message]="message" />
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button matButton type="button" mat-dialog-close>Cancel</button>
      <button
        matButton="filled"
        type="button"
        [disabled]="saving() || !urls.url(data.photo.id, 'image')"
        (click)="save()"
      >
        {{ saving() ? 'Saving…' : 'Save as background' }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    .lead {
      margin: 0 0 12px;
    }
    .overlay {
      display: block;
      width: min(100%, 44rem);
      margin: 0 auto;
    }
    .loading {
      display: flex;
      align-items: center;
      gap: 8px;
    }
    .problem {
      margin-top: 12px;
    }
    mat-dialog-actions {
      gap: 8px;
      --mat-button-filled-container-height: 48px;
      --mat-button-text-container-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CalibrateDialog {
  protected readonly data = inject<CalibrateRequest>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<CalibrateDialog, Photo>>(MatDialogRef);
  private readonly api = inject(PhotosApi);
  protected readonly urls = inject(PhotoUrls);
  protected readonly alt = photoAlt(this.data.photo);
  private readonly start = this.data.photo.calibration ?? STARTING_CALIBRATION;
  /** Where the handles are: the stored calibration, else the starting one, until a handle moves. */
  protected readonly draft = signal<PhotoCalibration>(this.data.photo.calibration ?? STARTING_CALIBRATION);
  protected readonly saving = signal(false);
  protected readonly error = signal<string | null>(null);

  constructor() {
    this.urls.load([this.data.photo.id], 'image');
  }

  /**
   * The photo as the overlay takes it, its calibration where the handles start. One object for as long as the
   * image is the same: a new one would put the handles back where they started.
   */
  protected readonly rotorPhoto = computed<RotorPhoto | null>(() => {
    const src = this.urls.url(this.data.photo.id, 'image');
    const { photo } = this.data;
    return src ? { src, calibration: this.start, aspectRatio: photo.widthPx / photo.heightPx } : null;
  });

  protected save(): void {
    this.saving.set(true);
    this.error.set(null);
    this.api.useAsOverlayBackground(this.data.machineId, this.data.photo.id, this.draft()).subscribe({
      next: (photo) => this.ref.close(photo),
      error: (error: unknown) => {
        this.saving.set(false);
        const fields = problemOf(error)?.errors ?? [];
        this.error.set(
          fields.length > 0 ? fields.map((field) => field.message).join(' ') : httpErrorMessage(error),
        );
      },
    });
  }
}
