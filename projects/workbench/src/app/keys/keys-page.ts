import { wideTable } from '../shell/wide-table';
import { DatePipe, NgTemplateOutlet } from '@angular/common';
import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  DOCUMENT,
  ElementRef,
  Injector,
  inject,
  signal,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import type { ApiKeySummary } from '@counterpoise/api';
import { filter, switchMap } from 'rxjs';
import { AuthSession } from '../auth/auth-session';
import { askToConfirm } from '../shell/confirm-dialog';
import { httpErrorMessage } from '../shell/server-errors';
import { API_REFERENCE_URL } from '../status/health.api';
import { CreateKeyDialog } from './create-key-dialog';
import { EditOriginsDialog } from './edit-origins-dialog';
import { KeysApi } from './keys.api';
import { ListPage, resourceSource } from '../shell/list-page';
import { KeyUsage } from './key-usage';
import { QuickStart } from './quick-start';

/**
 * The developer portal: the organisation's API keys (creating one, shown once with a copy button; what each
 * is called, how it starts, when it was created and last used, its limit; revoking it after a
 * confirmation), a quick start with a ready command for a key, and what the keys were used for.
 */
@Component({
  selector: 'app-keys-page',
  imports: [
    KeyUsage,
    ListPage,
    QuickStart,
    DatePipe,
    MatButtonModule,
    MatIconModule,
    MatProgressSpinnerModule,
    MatTableModule,
    NgTemplateOutlet,
  ],
  templateUrl: './keys-page.html',
  styleUrl: './keys-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class KeysPage {
  protected readonly session = inject(AuthSession);
  private readonly api = inject(KeysApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly document = inject(DOCUMENT);
  private readonly injector = inject(Injector);

  protected readonly list = this.api.listResource();
  /** The keys as ListPage frames them. */
  protected readonly source = resourceSource(this.list);
  /** Keys in use first, the newest at the top; revoked keys after them, kept for the record. */
  protected readonly keys = computed(() =>
    // value() throws while the resource is in error, hence hasValue() first.
    [...(this.list.hasValue() ? this.list.value().keys : [])].sort(
      (a, b) =>
        Number(a.revokedAt !== null) - Number(b.revokedAt !== null) ||
        Date.parse(b.createdAt) - Date.parse(a.createdAt),
    ),
  );
  /** Below the wide-table width a key's details stack in one column, so that the table fits a phone. */
  private readonly wide = wideTable();
  protected readonly columns = computed(() =>
    this.wide() ? ['name', 'prefix', 'createdAt', 'lastUsedAt', 'limitPerMinute', 'actions'] : ['summary'],
  );
  private readonly createButton = viewChild.required('createButton', { read: ElementRef<HTMLButtonElement> });
  /** The id of the key being revoked, to show its row busy. */
  protected readonly revoking = signal<number | null>(null);
  protected readonly apiReferenceUrl = API_REFERENCE_URL;

  protected create(): void {
    this.dialog
      .open<CreateKeyDialog, void, ApiKeySummary>(CreateKeyDialog, {
        width: '34rem',
        maxWidth: 'calc(100vw - 32px)',
      })
      .afterClosed()
      .pipe(filter((summary) => summary !== undefined))
      .subscribe(() => this.list.reload());
  }

  protected changeOrigins(key: ApiKeySummary): void {
    this.dialog
      .open<EditOriginsDialog, ApiKeySummary, ApiKeySummary>(EditOriginsDialog, {
        data: key,
        width: '34rem',
        maxWidth: 'calc(100vw - 32px)',
      })
      .afterClosed()
      .subscribe((changed) => {
        if (changed !== undefined) {
          this.snackBar.open(`The web origins of “${key.name}” are saved.`, 'Close', { duration: 6_000 });
          this.list.reload();
        }
        afterNextRender(() => this.document.getElementById(`origins-${key.id}`)?.focus(), {
          injector: this.injector,
        });
      });
  }

  protected revoke(key: ApiKeySummary): void {
    askToConfirm(this.dialog, {
      title: `Revoke the key “${key.name}”?`,
      message:
        'Software that uses it is refused from its next request. A revoked key cannot be brought back; create a new one if it is needed again.',
      confirm: 'Revoke the key',
      destructive: true,
    })
      .pipe(
        filter(Boolean),
        switchMap(() => {
          this.revoking.set(key.id);
          return this.api.revoke(key.id);
        }),
      )
      .subscribe({
        next: () => {
          this.revoking.set(null);
          // The revoke button is gone with the key; the next thing to do is most likely a new key.
          this.createButton().nativeElement.focus();
          this.snackBar.open(`The key “${key.name}” is revoked.`, 'Close', { duration: 6_000 });
          this.list.reload();
        },
        error: (error: unknown) => {
          this.revoking.set(null);
          // The button was replaced by a spinner while the request was out; it is back, and so is the focus.
          afterNextRender(() => this.document.getElementById(`revoke-${key.id}`)?.focus(), {
            injector: this.injector,
          });
          this.snackBar.open(`The key “${key.name}” was not revoked. ${httpErrorMessage(error)}`, 'Close', {
            duration: 10_000,
          });
        },
      });
  }
}
