import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { ApiKeySummary } from '@counterpoise/api';
import { BusyButton } from '../forms/busy-button';
import { ErrorBanner } from '../forms/error-banner';
import { FormRequest } from '../forms/form-request';
import { errorMessage } from '../shell/validators';
import { KeysApi } from './keys.api';
import { MAX_ORIGINS, originsFromText, originsText, validOrigins } from './web-origins';

/**
 * Changing the web origins a key may be used from: the whole list at once, one origin a line; emptying it
 * lifts the limit. Closes with the key as the server stored it.
 */
@Component({
  selector: 'app-edit-origins-dialog',
  imports: [
    BusyButton,
    ErrorBanner,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  template: `
    <h2 mat-dialog-title>Web origins of “{{ key.name }}”</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content>
        <p class="lead">
          Pages of these origins may use the key, and no other; requests without an origin are refused too.
          Empty the list to let the key work from anywhere, as for a key kept on a server.
        </p>
        @if (request.formError(); as message) {
          <app-error-banner class="form-error" [message]="message" />
        }
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Allowed web origins</mat-label>
          <textarea
            matInput
            formControlName="allowedOrigins"
            rows="4"
            autocomplete="off"
            spellcheck="false"
            placeholder="https://portal.example.com"
          ></textarea>
          <mat-hint
            >One origin a line, such as https://portal.example.com; at most {{ maxOrigins }}.</mat-hint
          >
          <mat-error>{{ errorMessage(form.controls.allowedOrigins) }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button matButton type="button" mat-dialog-close>Cancel</button>
        <app-busy-button type="submit" [busy]="request.busy()" label="Save the origins" busyLabel="Saving…" />
      </mat-dialog-actions>
    </form>
  `,
  styleUrl: './create-key-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EditOriginsDialog {
  protected readonly key = inject<ApiKeySummary>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<EditOriginsDialog, ApiKeySummary>>(MatDialogRef);
  private readonly api = inject(KeysApi);
  protected readonly form = inject(NonNullableFormBuilder).group({
    allowedOrigins: [originsText(this.key.allowedOrigins), validOrigins],
  });
  protected readonly request = new FormRequest();
  protected readonly maxOrigins = MAX_ORIGINS;
  protected readonly errorMessage = errorMessage;

  protected submit(): void {
    const origins = originsFromText(this.form.getRawValue().allowedOrigins);
    this.request.send(this.form, () => this.api.changeOrigins(this.key.id, origins), {
      sent: (key) => this.dialogRef.close(key),
    });
  }
}
