import { inject, Injector } from '@angular/core';
import type { CanDeactivateFn } from '@angular/router';
import { firstValueFrom } from 'rxjs';

/** A page that holds typed input not yet saved. */
export interface HoldsUnsavedInput {
  /** Whether leaving now would lose something the person typed. */
  hasUnsavedInput(): boolean;
}

/**
 * Asks before leaving a form with unsaved input (a tap on the navigation with a gloved hand is easy to make),
 * so that typed readings and layouts are never lost by accident.
 *
 * The routes declare this guard, so it is part of the app's first load; the dialog's code (Material's
 * dialog and the confirmation) is imported only when there is something to confirm, and stays out of it.
 */
export const confirmLeavingUnsaved: CanDeactivateFn<HoldsUnsavedInput> = async (page) => {
  if (!page.hasUnsavedInput()) return true;
  const injector = inject(Injector);
  const [{ MatDialog }, { askToConfirm }] = await Promise.all([
    import('@angular/material/dialog'),
    import('../shell/confirm-dialog'),
  ]);
  return firstValueFrom(
    askToConfirm(injector.get(MatDialog), {
      title: 'Leave without saving?',
      message: 'What you typed on this page is not saved yet. Leaving drops it.',
      confirm: 'Leave without saving',
      destructive: true,
    }),
  );
};
