import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import type { EditComparison } from './record-fields';

/** What the dialog shows: both versions, field by field. */
export interface ChangedMeanwhileData {
  /** The kind of record, as a sentence names it: "customer". */
  readonly noun: string;
  /** Who saved the version stored now, when the history says; null when unknown. */
  readonly changedBy: string | null;
  /** When the version stored now was saved. */
  readonly changedAt: string;
  /** The fields either of you changed. */
  readonly rows: readonly EditComparison[];
}

/**
 * "Keep mine on top of theirs": send your changed fields again on their version (their other changes stay).
 * "Take theirs": show their version in the form, dropping your changes. Closing the dialog any other way
 * keeps your edit in the form, unsaved.
 */
export type ChangedMeanwhileChoice = 'mine' | 'theirs';

/**
 * Shown when a save is refused because someone else changed the record while you edited it: their version
 * beside yours, field by field, and the choice between keeping yours on top of theirs or taking theirs.
 * Neither edit is lost without the person choosing it.
 */
@Component({
  selector: 'app-changed-meanwhile-dialog',
  imports: [DatePipe, MatButtonModule, MatDialogModule, MatIconModule],
  template: `
    <h2 mat-dialog-title>Changed by someone else meanwhile</h2>
    <mat-dialog-content>
      <p class="lead">
        {{ data.changedBy ?? 'Someone' }} saved this {{ data.noun }} at
        {{ data.changedAt | date: 'HH:mm, d MMM y' }}, while you were editing it. Nothing of yours is saved
        yet. Compare the two versions, then choose.
      </p>
      <ul class="rows">
        @for (row of data.rows; track row.field) {
          <li class="row" [class.row--both]="row.changedBy === 'both'">
            <h3>
              {{ capitalised(row.label) }}
              @if (row.changedBy === 'both') {
                <span class="tag"><mat-icon aria-hidden="true" svgIcon="warning" />changed by both</span>
              }
            </h3>
            <dl>
              <div>
                <dt>Theirs (saved)</dt>
                <dd>{{ row.theirs }}</dd>
              </div>
              <div>
                <dt>Yours</dt>
                <dd>{{ row.mine ?? 'not changed by you: theirs stays either way' }}</dd>
              </div>
            </dl>
          </li>
        }
      </ul>
      <p class="help">
        <strong>Keep mine on top of theirs</strong> saves the fields you changed over their version; their
        changes to other fields stay. <strong>Take theirs</strong> shows their version in the form and drops
        your changes.
      </p>
    </mat-dialog-content>
    <mat-dialog-actions>
      <button matButton type="button" mat-dialog-close>Back to my edit</button>
      <button matButton="outlined" type="button" [mat-dialog-close]="'theirs'">Take theirs</button>
      <button matButton="filled" type="button" [mat-dialog-close]="'mine'">Keep mine on top of theirs</button>
    </mat-dialog-actions>
  `,
  styles: `
    .lead,
    .help {
      margin: 0 0 16px;
    }
    .help {
      color: var(--mat-sys-on-surface-variant);
    }
    .rows {
      list-style: none;
      margin: 0 0 16px;
      padding: 0;
    }
    .row {
      padding: 12px 16px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-medium);
    }
    .row + .row {
      margin-top: 8px;
    }
    .row--both {
      border: 2px solid var(--mat-sys-tertiary);
    }
    h3 {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 8px;
      margin: 0 0 8px;
      font: var(--mat-sys-title-small);
      color: var(--mat-sys-on-surface);
    }
    .tag {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      padding: 2px 8px;
      border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
      font: var(--mat-sys-label-medium);
    }
    .tag mat-icon {
      width: 18px;
      height: 18px;
      font-size: 18px;
    }
    dl {
      display: grid;
      grid-template-columns: repeat(auto-fit, minmax(12rem, 1fr));
      gap: 8px 16px;
      margin: 0;
    }
    dt {
      font: var(--mat-sys-label-large);
      color: var(--mat-sys-on-surface-variant);
    }
    dd {
      margin: 0;
      color: var(--mat-sys-on-surface);
      overflow-wrap: anywhere;
    }
    mat-dialog-actions {
      flex-wrap: wrap;
      justify-content: flex-end;
      gap: 8px;
      --mat-button-filled-container-height: 48px;
      --mat-button-outlined-container-height: 48px;
      --mat-button-text-container-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ChangedMeanwhileDialog {
  protected readonly data = inject<ChangedMeanwhileData>(MAT_DIALOG_DATA);

  protected capitalised(text: string): string {
    return text.charAt(0).toUpperCase() + text.slice(1);
  }
}
