import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatRadioModule } from '@angular/material/radio';
import { type Role, ROLES, type User } from '@counterpoise/api';
import type { UpdatePerson } from '../auth/api-types';
import { ROLE_LABELS, ROLE_SUMMARIES } from '../auth/roles';
import { httpErrorMessage, problemOf } from '../shell/server-errors';
import { PeopleApi } from './people.api';
import { ErrorBanner } from '../forms/error-banner';
import { BusyButton } from '../forms/busy-button';

/**
 * Giving a person another role, each role with what it does, so that the choice is made knowingly. The
 * change is saved from inside the dialog; it closes with the updated person.
 */
@Component({
  selector: 'app-change-role-dialog',
  imports: [BusyButton, ErrorBanner, FormsModule, MatButtonModule, MatDialogModule, MatRadioModule],
  template: `
    <h2 mat-dialog-title>Change the role of {{ person.name }}</h2>
    <mat-dialog-content>
      <p class="lead">Their jobs and reports stay as they are; what they may do from now on changes.</p>
      @if (formError(); as message) {
        <app-error-banner class="form-error" [message]="message" />
      }
      <mat-radio-group class="roles" aria-label="Role" [(ngModel)]="chosen">
        @for (role of roles; track role) {
          <mat-radio-button [value]="role" class="role">
            <span class="role__name">
              {{ roleLabels[role] }}
              @if (role === person.role) {
                <span class="role__current">(current)</span>
              }
            </span>
            <span class="role__summary">{{ roleSummaries[role] }}</span>
          </mat-radio-button>
        }
      </mat-radio-group>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button matButton type="button" mat-dialog-close>Cancel</button>
      <app-busy-button
        [busy]="busy()"
        [disabled]="chosen() === person.role"
        [label]="'Make ' + roleLabels[chosen()].toLowerCase()"
        busyLabel="Saving…"
        (click)="save()"
      />
    </mat-dialog-actions>
  `,
  styleUrl: './dialog.scss',
  styles: `
    .roles {
      display: grid;
      gap: 4px;
    }
    .role {
      --mat-radio-touch-target-size: 48px;
    }
    .role__name {
      display: block;
      font: var(--mat-sys-title-small);
    }
    .role__current {
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-medium);
    }
    .role__summary {
      display: block;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-medium);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ChangeRoleDialog {
  protected readonly person = inject<User>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<ChangeRoleDialog, User>>(MatDialogRef);
  private readonly api = inject(PeopleApi);

  protected readonly roles = ROLES;
  protected readonly chosen = signal<Role>(this.person.role);
  protected readonly busy = signal(false);
  protected readonly formError = signal<string | null>(null);
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly roleSummaries = ROLE_SUMMARIES;

  protected save(): void {
    if (this.busy()) return;
    this.busy.set(true);
    this.formError.set(null);
    const change: UpdatePerson = { role: this.chosen() };
    this.api.update(this.person.id, change).subscribe({
      next: (updated) => this.dialogRef.close(updated),
      error: (error: unknown) => {
        const fieldMessages = problemOf(error)?.errors?.map((field) => field.message) ?? [];
        this.formError.set(fieldMessages.length > 0 ? fieldMessages.join(' ') : httpErrorMessage(error));
        this.busy.set(false);
      },
    });
  }
}
