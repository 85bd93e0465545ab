import { ChangeDetectionStrategy, Component, inject, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import type { Permission } from '@counterpoise/api';
import { AuthSession } from '../auth/auth-session';
import { BusyButton } from '../forms/busy-button';

/**
 * The top of a record's page (a customer, a machine family, a machine): the breadcrumb the page projects,
 * the record's name with its "Archived" badge, and Edit and Archive or Restore for those whose role allows
 * them. The page asks before archiving, so it gets `archiveOrRestore` rather than doing it here.
 */
@Component({
  selector: 'app-record-page-header',
  imports: [BusyButton, MatButtonModule, MatIconModule, RouterLink],
  template: `
    <header class="header">
      <div>
        <p class="breadcrumb"><ng-content /></p>
        <h1>
          {{ name() }}
          @if (archived()) {
            <span class="badge">Archived</span>
          }
        </h1>
      </div>
      <div class="actions">
        @if (session.can(editPermission())) {
          <a matButton="filled" [routerLink]="editLink()">
            <mat-icon aria-hidden="true" svgIcon="edit" />
            Edit
          </a>
        }
        @if (session.can('records:archive')) {
          <app-busy-button
            appearance="outlined"
            [icon]="archived() ? 'unarchive' : 'archive'"
            [busy]="archiving()"
            [label]="archived() ? 'Restore' : 'Archive'"
            (click)="archiveOrRestore.emit()"
          />
        }
      </div>
    </header>
  `,
  styleUrl: './record-page-header.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RecordPageHeader {
  protected readonly session = inject(AuthSession);
  /** The record's name as its page's heading. */
  readonly name = input.required<string>();
  readonly archived = input.required<boolean>();
  /** Who may see Edit: `customers:write`. */
  readonly editPermission = input.required<Permission>();
  /** The record's form, `['/customers', 7, 'edit']`. */
  readonly editLink = input.required<readonly (string | number)[]>();
  /** Whether an archiving or restoring is on its way, so that it is not asked twice. */
  readonly archiving = input(false);
  /** Archive or Restore was pressed. */
  readonly archiveOrRestore = output();
}
