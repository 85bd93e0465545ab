import { wideTable } from '../shell/wide-table';
import { DatePipe } from '@angular/common';
import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  DOCUMENT,
  Injector,
  inject,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { invitableRoles, mayChangeRole, mayChangeStatus, type User } from '@counterpoise/api';
import { filter, switchMap, tap } from 'rxjs';
import type { Invitation, UpdatePerson } from '../auth/api-types';
import { AuthSession } from '../auth/auth-session';
import { ROLE_LABELS } from '../auth/roles';
import { askToConfirm } from '../shell/confirm-dialog';
import { ListPage, resourceSource } from '../shell/list-page';
import { httpErrorMessage } from '../shell/server-errors';
import { ChangeRoleDialog } from './change-role-dialog';
import { InviteDialog, type InviteDialogData, type InviteOutcome } from './invite-dialog';
import { sortAndFilterPeople, STATUS_LABELS } from './people-rules';
import { PeopleApi } from './people.api';

/**
 * The people of the organisation: a sortable, filterable table, the pending invitations, and for those
 * whose role allows it, inviting, changing roles, and deactivating or reactivating.
 */
@Component({
  selector: 'app-people-page',
  imports: [
    ListPage,
    DatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatProgressSpinnerModule,
    MatSortModule,
    MatTableModule,
  ],
  templateUrl: './people-page.html',
  styleUrl: './people-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PeoplePage {
  protected readonly session = inject(AuthSession);
  private readonly api = inject(PeopleApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly document = inject(DOCUMENT);
  private readonly injector = inject(Injector);

  // value() throws while the resource is in error: everything derived from it asks hasValue() first.
  protected readonly people = this.api.listResource();
  protected readonly filter = signal('');
  protected readonly sort = signal<Sort>({ active: 'name', direction: 'asc' });
  protected readonly rows = computed(() =>
    sortAndFilterPeople(this.people.hasValue() ? this.people.value().people : [], this.filter(), this.sort()),
  );
  /** The people list as ListPage frames it. */
  protected readonly source = resourceSource(this.people);
  protected readonly count = computed(() => {
    const shown = this.rows().length;
    if (this.filter().trim()) {
      const all = this.people.hasValue() ? this.people.value().people.length : 0;
      return `${shown} of ${all} people match.`;
    }
    return `${shown} ${shown === 1 ? 'person' : 'people'}.`;
  });
  protected readonly pendingInvitations = computed(() =>
    (this.people.hasValue() ? this.people.value().invitations : []).filter(
      (invitation) => invitation.acceptedAt === null,
    ),
  );

  /** Below the wide-table width the e-mail address and the status move under the name, so that the table fits a phone. */
  private readonly wide = wideTable();
  protected readonly columns = computed(() =>
    this.wide() ? ['name', 'email', 'role', 'status', 'actions'] : ['name', 'role', 'actions'],
  );
  protected readonly invitationColumns = computed(() =>
    this.wide() ? ['email', 'role', 'invitedBy', 'expiresAt'] : ['email', 'role', 'expiresAt'],
  );

  protected readonly invitable = computed(() => {
    const me = this.session.user();
    return me === null ? [] : invitableRoles(me.role);
  });
  /** The id of the person whose status is being changed, to show the row busy. */
  protected readonly updating = signal<number | null>(null);

  // The table's row templates are untyped; these give their values a type again.
  protected roleLabel(row: User | Invitation): string {
    return ROLE_LABELS[row.role];
  }

  protected statusLabel(person: User): string {
    return STATUS_LABELS[person.status];
  }

  protected mayChangeRole(person: User): boolean {
    const me = this.session.user();
    return me !== null && mayChangeRole(me, person);
  }

  protected mayChangeStatus(person: User): boolean {
    const me = this.session.user();
    return me !== null && mayChangeStatus(me, person);
  }

  /** Rows are kept across reloads, so that the focus stays where it was. */
  protected readonly trackById = (_index: number, person: User): number => person.id;

  protected isExpired(invitation: Invitation): boolean {
    return Date.parse(invitation.expiresAt) <= Date.now();
  }

  protected invite(): void {
    this.dialog
      .open<InviteDialog, InviteDialogData, InviteOutcome>(InviteDialog, {
        data: { roles: this.invitable() },
        width: '32rem',
        maxWidth: 'calc(100vw - 32px)',
      })
      .afterClosed()
      .pipe(filter((outcome) => outcome !== undefined))
      .subscribe(({ email, mailProblem }) => {
        this.snackBar.open(
          mailProblem === null
            ? `Invitation sent to ${email}.`
            : `The invitation to ${email} is saved, but its e-mail was not sent. ${mailProblem}`,
          'Close',
          { duration: mailProblem === null ? 6_000 : 15_000 },
        );
        this.people.reload();
      });
  }

  protected changeRole(person: User): void {
    this.dialog
      .open<ChangeRoleDialog, User, User>(ChangeRoleDialog, {
        data: person,
        width: '32rem',
        maxWidth: 'calc(100vw - 32px)',
        restoreFocus: false,
      })
      .afterClosed()
      .pipe(
        tap(() => this.focusActionsOf(person)),
        filter((updated) => updated !== undefined),
      )
      .subscribe((updated) => {
        this.snackBar.open(`${updated.name} is now ${ROLE_LABELS[updated.role].toLowerCase()}.`, 'Close', {
          duration: 6_000,
        });
        this.people.reload();
      });
  }

  protected changeStatus(person: User): void {
    const deactivate = person.status === 'active';
    askToConfirm(
      this.dialog,
      deactivate
        ? {
            title: `Deactivate ${person.name}?`,
            message: `${person.name} can no longer sign in. Their jobs and reports stay, and you can reactivate them at any time.`,
            confirm: 'Deactivate',
            destructive: true,
          }
        : {
            title: `Reactivate ${person.name}?`,
            message: `${person.name} can sign in again, as ${ROLE_LABELS[person.role].toLowerCase()}.`,
            confirm: 'Reactivate',
          },
      { restoreFocus: false },
    )
      .pipe(
        tap((confirmed) => {
          if (!confirmed) this.focusActionsOf(person);
        }),
        filter(Boolean),
        switchMap(() => {
          this.updating.set(person.id);
          const change: UpdatePerson = { status: deactivate ? 'deactivated' : 'active' };
          return this.api.update(person.id, change);
        }),
      )
      .subscribe({
        next: (updated) => {
          this.updating.set(null);
          this.focusActionsOf(person);
          this.snackBar.open(
            updated.status === 'active'
              ? `${updated.name} can sign in again.`
              : `${updated.name} can no longer sign in.`,
            'Close',
            { duration: 6_000 },
          );
          this.people.reload();
        },
        error: (error: unknown) => {
          this.updating.set(null);
          this.focusActionsOf(person);
          this.snackBar.open(
            `${person.name} was not ${deactivate ? 'deactivated' : 'reactivated'}. ${httpErrorMessage(error)}`,
            'Close',
            { duration: 10_000 },
          );
        },
      });
  }

  /**
   * Puts the focus back on a person's actions button once a dialog opened from its menu has closed: the
   * menu item that opened it is gone, and the button itself is replaced while a change is saved.
   */
  private focusActionsOf(person: User): void {
    afterNextRender(() => this.document.getElementById(`actions-${person.id}`)?.focus(), {
      injector: this.injector,
    });
  }
}
