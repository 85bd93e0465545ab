import { inject } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import type { CanDeactivateFn } from '@angular/router';
import { askToConfirm } from '../shell/confirm-dialog';

/** A page that holds typed input not yet saved. */
export interface HoldsUnsavedInput {
  /** Whether leaving now would lose something the person typed. */
  hasUnsavedInput(): boolean;
}

/**
 * Asks before leaving a form with unsaved input (a tap on the navigation with a gloved hand is easy to make),
 * so that typed readings and layouts are never lost by accident.
 */
export const confirmLeavingUnsaved: CanDeactivateFn<HoldsUnsavedInput> = (page) =>
  !page.hasUnsavedInput() ||
  askToConfirm(inject(MatDialog), {
    title: 'Leave without saving?',
    message: 'What you typed on this page is not saved yet. Leaving drops it.',
    confirm: 'Leave without saving',
    destructive: true,
  });
