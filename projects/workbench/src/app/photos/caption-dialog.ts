import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { PHOTO_CAPTION_MAX_LENGTH } from './photo-labels';
import { type Photo, PhotosApi } from './photos.api';
import { formErrorOf } from '../shell/server-errors';

/** Changes a photo's caption (empty removes it); closes with the photo as stored. */
@Component({
  selector: 'app-caption-dialog',
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  template: `
    <h2 mat-dialog-title>Caption</h2>
    <mat-dialog-content>
      <mat-form-field class="caption">
        <mat-label>What the photo shows</mat-label>
        <input matInput [formControl]="caption" [maxlength]="max" (keydown.enter)="save()" />
        <mat-hint align="end">{{ caption.value.length }} / {{ max }}</mat-hint>
        @if (caption.hasError('server')) {
          <mat-error>{{ caption.getError('server') }}</mat-error>
        }
      </mat-form-field>
      @if (error(); as message) {
        <p class="problem" role="alert">{{ message }}</p>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button matButton type="button" mat-dialog-close>Cancel</button>
      <button matButton="filled" type="button" [disabled]="saving()" (click)="save()">
        {{ saving() ? 'Saving…' : 'Save' }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    .caption {
      width: 100%;
    }
    .problem {
      margin: 0;
      color: var(--mat-sys-error);
    }
    mat-dialog-actions {
      gap: 8px;
      --mat-button-filled-container-height: 48px;
      --mat-button-text-container-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CaptionDialog {
  private readonly photo = inject<Photo>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<CaptionDialog, Photo>>(MatDialogRef);
  private readonly api = inject(PhotosApi);
  protected readonly max = PHOTO_CAPTION_MAX_LENGTH;
  protected readonly caption = new FormControl(this.photo.caption ?? '', {
    nonNullable: true,
    validators: [Validators.maxLength(PHOTO_CAPTION_MAX_LENGTH)],
  });
  protected readonly saving = signal(false);
  protected readonly error = signal<string | null>(null);

  protected save(): void {
    if (this.saving()) return;
    this.saving.set(true);
    this.error.set(null);
    this.api.changeCaption(this.photo.id, this.caption.value.trim()).subscribe({
      next: (photo) => this.ref.close(photo),
      error: (error: unknown) => {
        this.saving.set(false);
        this.error.set(formErrorOf(this.caption, error));
      },
    });
  }
}
