import type { Injector } from '@angular/core';
import type { MatSnackBarConfig, MatSnackBarRef, TextOnlySnackBar } from '@angular/material/snack-bar';

/**
 * Shows a message in Material's snack bar, whose code is imported for it: the messages that use this (a new
 * version to reload, a sign-out that failed) are rare, so the snack bar and its overlay stay out of the
 * app's first load.
 */
export async function showSnackBarMessage(
  injector: Injector,
  message: string,
  action: string,
  config?: MatSnackBarConfig,
): Promise<MatSnackBarRef<TextOnlySnackBar>> {
  const { MatSnackBar } = await import('@angular/material/snack-bar');
  return injector.get(MatSnackBar).open(message, action, config);
}
