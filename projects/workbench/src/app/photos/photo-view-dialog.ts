import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { DatePipe } from '@angular/common';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { photoAlt } from './photo-labels';
import type { Photo } from './photos.api';
import { PhotoUrls } from './photo-urls';

/** A photo shown large, with its caption and who took it when. */
@Component({
  selector: 'app-photo-view-dialog',
  imports: [DatePipe, MatButtonModule, MatDialogModule, MatProgressSpinnerModule],
  providers: [PhotoUrls],
  template: `
    <h2 mat-dialog-title>{{ photo.caption ?? 'Photo' }}</h2>
    <mat-dialog-content>
      @let state = urls.state(photo.id, 'image');
      @if (state?.state === 'ready') {
        <img class="large" [src]="urls.url(photo.id, 'image')" [alt]="alt" />
      } @else if (state?.state === 'failed') {
        <p role="alert">The photo could not be fetched. Check the connection and open it again.</p>
      } @else {
        <p class="loading" role="status">
          <mat-spinner diameter="24" aria-hidden="true" /> Fetching the photo…
        </p>
      }
      <p class="meta">
        {{ photo.widthPx }} × {{ photo.heightPx }} px · added by {{ photo.createdByName }} on
        {{ photo.createdAt | date: 'd MMM y, HH:mm' }}
      </p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button matButton="filled" type="button" mat-dialog-close>Close</button>
    </mat-dialog-actions>
  `,
  styles: `
    .large {
      display: block;
      max-width: 100%;
      max-height: 70vh;
      margin: 0 auto;
      border-radius: var(--mat-sys-corner-small);
    }
    .loading {
      display: flex;
      align-items: center;
      gap: 8px;
    }
    .meta {
      margin: 8px 0 0;
      color: var(--mat-sys-on-surface-variant);
    }
    mat-dialog-actions {
      --mat-button-filled-container-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotoViewDialog {
  protected readonly photo = inject<Photo>(MAT_DIALOG_DATA);
  protected readonly urls = inject(PhotoUrls);
  protected readonly alt = photoAlt(this.photo);

  constructor() {
    this.urls.load([this.photo.id], 'image');
  }
}
