import { HttpErrorResponse } from '@angular/common/http';
import type { AbstractControl } from '@angular/forms';
import type { Problem } from '@counterpoise/api';

/** The RFC 9457 problem an error answer carries, or null when it carries none (no server, a proxy page). */
export function problemOf(error: unknown): Problem | null {
  if (!(error instanceof HttpErrorResponse)) return null;
  const body: unknown = error.error;
  if (typeof body !== 'object' || body === null) return null;
  const candidate = body as Partial<Problem>;
  return typeof candidate.title === 'string' && typeof candidate.status === 'number'
    ? (body as Problem)
    : null;
}

/**
 * One sentence for a failed request, for a page or a form as a whole. Statuses whose cause we know get our
 * own words; other refusals keep the server's explanation of this occurrence.
 */
export function httpErrorMessage(error: unknown): string {
  const status = error instanceof HttpErrorResponse ? error.status : -1;
  if (status === 0) {
    return 'The server cannot be reached. Check the connection; what you typed is kept here.';
  }
  if (status === 401) return 'Your session has ended. Sign in again to carry on.';
  if (status === 403) return 'Your role does not allow this.';
  if (status === 429) return 'Too many attempts in a short time. Wait a minute, then try again.';
  const problem = problemOf(error);
  // A server error with a code was raised on purpose and explains itself; any other is not for people.
  if (status >= 500)
    return problem?.code && problem.detail
      ? problem.detail
      : 'The server ran into a problem. Try again in a moment.';
  if (problem?.detail) return problem.detail;
  if (status === 404) return 'This is no longer here. It may have been removed.';
  return problem?.title ?? 'Something went wrong. Try again.';
}

/**
 * Puts each of the problem's field messages on the control its `path` names (`email`, `limitPerMinute`,
 * `address.city` or `/address/city`), so that the person reads it where the fix is. Returns the messages
 * that name no control, to show with the form as a whole.
 */
export function applyServerErrors(form: AbstractControl, problem: Problem | null): string[] {
  const unplaced: string[] = [];
  for (const { path, message } of problem?.errors ?? []) {
    const name = path
      .replace(/^[/$.]+/, '')
      .replace(/\[(\d+)\]/g, '.$1')
      .replaceAll('/', '.');
    const control = name === '' ? null : form.get(name);
    if (control) {
      control.setErrors({ ...control.errors, server: message });
      control.markAsTouched();
    } else {
      unplaced.push(message);
    }
  }
  return unplaced;
}

/**
 * Shows a failed submission on its form: field messages go on their fields, and the returned sentence,
 * if any, belongs above the form (null when every message found its field).
 */
export function formErrorOf(form: AbstractControl, error: unknown): string | null {
  const problem = problemOf(error);
  const unplaced = applyServerErrors(form, problem);
  if (unplaced.length > 0) return unplaced.join(' ');
  return (problem?.errors?.length ?? 0) > 0 ? null : httpErrorMessage(error);
}
