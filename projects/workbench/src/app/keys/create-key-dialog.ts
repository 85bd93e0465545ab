import {
  afterRenderEffect,
  ChangeDetectionStrategy,
  Component,
  inject,
  signal,
  viewChild,
} from '@angular/core';
import {
  type AbstractControl,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  type ValidationErrors,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import {
  type ApiKeySummary,
  ApiKeyNameSchema,
  LimitPerMinuteSchema,
  MAX_LIMIT_PER_MINUTE,
} from '@counterpoise/api';
import type { CreatedApiKey } from '../auth/api-types';
import { errorMessage, requiredWith, schemaError, schemaValidator } from '../shell/validators';
import { type CreateApiKeyRequest, KeysApi } from './keys.api';
import { ErrorBanner } from '../forms/error-banner';
import { MAX_ORIGINS, originsFromText, validOrigins } from './web-origins';
import { BusyButton } from '../forms/busy-button';
import { CopyButton } from '../forms/copy-button';
import { FormRequest } from '../forms/form-request';

/**
 * Creating an API key, then showing it the one time the server ever answers it, with a copy button. Once
 * the key is on screen the dialog no longer closes on Escape or a tap beside it: only the button that says
 * the key is kept closes it, so that a stray tap cannot lose it.
 */
@Component({
  selector: 'app-create-key-dialog',
  imports: [
    BusyButton,
    CopyButton,
    ErrorBanner,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  templateUrl: './create-key-dialog.html',
  styleUrl: './create-key-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CreateKeyDialog {
  private readonly dialogRef = inject<MatDialogRef<CreateKeyDialog, ApiKeySummary>>(MatDialogRef);
  private readonly api = inject(KeysApi);
  private readonly copyButton = viewChild(CopyButton);

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [
      '',
      [requiredWith('Give the key a name that says who or what uses it.'), schemaValidator(ApiKeyNameSchema)],
    ],
    // Empty means the server's default limit; the field holds text so that a half-typed number is kept.
    limitPerMinute: ['', validLimit],
    allowedOrigins: ['', validOrigins],
  });
  protected readonly request = new FormRequest();
  /** The new key, present from the server's answer until the dialog closes. */
  protected readonly created = signal<CreatedApiKey | null>(null);
  protected readonly maxLimit = MAX_LIMIT_PER_MINUTE;
  protected readonly maxOrigins = MAX_ORIGINS;
  protected readonly errorMessage = errorMessage;
  private copyButtonFocused = false;

  constructor() {
    // When the new key is shown, the focused submit button has gone with the form; the copy button is the
    // next step. Focused after the render that put it on the page, however late that render comes.
    afterRenderEffect(() => {
      const copyButton = this.copyButton();
      if (copyButton === undefined || this.copyButtonFocused) return;
      this.copyButtonFocused = true;
      copyButton.focus();
    });
  }

  protected submit(): void {
    const { name, limitPerMinute, allowedOrigins } = this.form.getRawValue();
    const limit = limitPerMinute.trim();
    const origins = originsFromText(allowedOrigins);
    const request: CreateApiKeyRequest = {
      name: name.trim(),
      ...(limit ? { limitPerMinute: Number(limit) } : {}),
      ...(origins.length > 0 ? { allowedOrigins: origins } : {}),
    };
    this.request.send(this.form, () => this.api.create(request), {
      sent: (created) => {
        this.dialogRef.disableClose = true;
        this.created.set(created);
      },
    });
  }

  protected close(): void {
    this.dialogRef.close(this.created()?.summary);
  }
}

/** The typed limit, checked as the number it stands for with the contract's rule; empty is allowed. */
function validLimit(control: AbstractControl<string>): ValidationErrors | null {
  const typed = control.value.trim();
  if (typed === '') return null;
  if (!/^\d+$/.test(typed))
    return { number: 'Enter a whole number of calculations per minute, or leave it empty.' };
  return schemaError(LimitPerMinuteSchema, Number(typed));
}
