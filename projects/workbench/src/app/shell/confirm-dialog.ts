import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, type MatDialog, MatDialogModule } from '@angular/material/dialog';
import { map, type Observable } from 'rxjs';

/** What a confirmation asks. */
export interface Confirmation {
  /** The question, as the dialog's heading. */
  readonly title: string;
  /** What will happen, and whether it can be undone. */
  readonly message: string;
  /** The label of the button that goes ahead, naming the action ("Revoke the key"). */
  readonly confirm: string;
  /** True when the action takes something away, so that the button reads as a warning. */
  readonly destructive?: boolean;
}

/**
 * A question before an action that is hard to take back. The safe answer holds the first focus, so that
 * an Enter pressed by habit changes nothing; the dialog answers true only for the named action.
 */
@Component({
  selector: 'app-confirm-dialog',
  imports: [MatButtonModule, MatDialogModule],
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <mat-dialog-content>
      <p>{{ data.message }}</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button matButton type="button" [mat-dialog-close]="false">Cancel</button>
      <button
        matButton="filled"
        type="button"
        [class.destructive]="data.destructive"
        [mat-dialog-close]="true"
      >
        {{ data.confirm }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    p {
      margin: 0;
    }
    mat-dialog-actions {
      gap: 8px;
      --mat-button-filled-container-height: 48px;
      --mat-button-text-container-height: 48px;
    }
    .destructive {
      --mat-button-filled-container-color: var(--mat-sys-error);
      --mat-button-filled-label-text-color: var(--mat-sys-on-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ConfirmDialog {
  protected readonly data = inject<Confirmation>(MAT_DIALOG_DATA);
}

/**
 * Asks a confirmation; emits true once if the person goes ahead, false otherwise. Pass `restoreFocus:
 * false` when the element that had the focus (a menu item) is gone by the time the dialog closes, and put
 * the focus back yourself.
 */
export function askToConfirm(
  dialog: MatDialog,
  confirmation: Confirmation,
  options: { restoreFocus?: boolean } = {},
): Observable<boolean> {
  return dialog
    .open<ConfirmDialog, Confirmation, boolean>(ConfirmDialog, {
      data: confirmation,
      restoreFocus: options.restoreFocus ?? true,
      maxWidth: '32rem',
      role: 'alertdialog',
      // Cancel comes first, so that it is the button that holds the first focus.
      autoFocus: 'first-tabbable',
    })
    .afterClosed()
    .pipe(map((answer) => answer === true));
}
