import { signal } from '@angular/core';
import type { AbstractControl } from '@angular/forms';
import type { Observable } from 'rxjs';
import { formErrorOf } from '../shell/server-errors';

/** What a form does with its request's answer. */
export interface FormRequestHandlers<T> {
  /** The server took the request. */
  readonly sent: (answer: T) => void;
  /**
   * Our words for a refusal particular to this form, or null for the usual reading (messages on their
   * fields, the rest above the form); `'handled'` when the page dealt with it itself (a dialog closed).
   */
  readonly refused?: (error: unknown) => string | null | 'handled';
  /** Whether the page leaves on success (it navigates or closes), so that the button stays busy till then. */
  readonly leaves?: boolean;
}

/**
 * The request of a form that sends once (signing in, asking for a link, inviting, creating a key): it is
 * sent only when the form is valid and no other is on its way; meanwhile `busy` is true (for BusyButton),
 * and a refusal ends in `formError` (for ErrorBanner) with the field messages on their fields and what was
 * typed kept.
 */
export class FormRequest {
  /** Whether the request is on its way. */
  readonly busy = signal(false);
  /** Why the server refused it, as a whole; null when nothing is to be said. */
  readonly formError = signal<string | null>(null);

  /** Checks the form and sends `request()`; returns whether it was sent. */
  send<T>(form: AbstractControl, request: () => Observable<T>, handlers: FormRequestHandlers<T>): boolean {
    if (this.busy()) return false;
    form.markAllAsTouched();
    if (form.invalid) return false;
    this.busy.set(true);
    this.formError.set(null);
    request().subscribe({
      next: (answer) => {
        handlers.sent(answer);
        if (!handlers.leaves) this.busy.set(false);
      },
      error: (error: unknown) => {
        const own = handlers.refused?.(error) ?? null;
        if (own === 'handled') return;
        // The typed values stay in the form whatever went wrong.
        this.formError.set(own ?? formErrorOf(form, error));
        this.busy.set(false);
      },
    });
    return true;
  }
}
