import { computed, inject, type Signal, signal } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { RecordChange } from '@counterpoise/api';
import { filter, switchMap } from 'rxjs';
import { askToConfirm } from '../shell/confirm-dialog';
import { httpErrorMessage } from '../shell/server-errors';
import type { RecordsApi, StoredRecord, Versioned } from './records-api';

/** A record's page: the record with its ETag and its history, both fetched by id. */
export interface RecordView<T extends StoredRecord> {
  /** The record and its ETag, once fetched. */
  readonly versioned: Signal<Versioned<T> | undefined>;
  /** The record, once fetched. */
  readonly record: Signal<T | undefined>;
  /** Why the record could not be fetched, in words; null otherwise. */
  readonly error: Signal<string | null>;
  /** The changes, newest first; null while they are fetched or when that failed. */
  readonly changes: Signal<readonly RecordChange[] | null>;
  /** Why the history could not be fetched, in words; null otherwise. */
  readonly historyError: Signal<string | null>;
  /** True while the record is being archived or restored. */
  readonly archiving: Signal<boolean>;
  /** Fetches the record again. */
  reload(): void;
  /** Fetches the history again. */
  reloadHistory(): void;
  /**
   * Archives the record in use, or restores the archived one, after asking. `consequence` says what archiving
   * means for this kind of record ("Its machines stay.").
   */
  archiveOrRestore(name: string, consequence: string): void;
}

/** What a record's page passes to `recordView`. */
export interface RecordViewOptions<T extends StoredRecord> {
  readonly api: RecordsApi<T, unknown, object, unknown, unknown>;
  /** The record's id from the address; null when the address holds none. */
  readonly id: () => number | null;
  /** The kind of record, as a sentence names it: "customer". */
  readonly noun: string;
}

/**
 * The data of a record's page (call it in an injection context). The history follows the record's version,
 * so that it shows an archiving or a change as soon as the page does. A change refused because someone else
 * changed the record meanwhile shows their version, and says so, rather than acting on one nobody has seen.
 */
export function recordView<T extends StoredRecord>(options: RecordViewOptions<T>): RecordView<T> {
  const { api, noun } = options;
  const dialog = inject(MatDialog);
  const snackBar = inject(MatSnackBar);
  const archiving = signal(false);

  const resource = rxResource({
    params: () => options.id() ?? undefined,
    stream: ({ params }) => api.get(params),
  });
  const versioned = computed(() => (resource.hasValue() ? resource.value() : undefined));
  const record = computed(() => versioned()?.record);
  const history = rxResource({
    params: () => {
      const current = record();
      return current ? { id: current.id, version: current.version } : undefined;
    },
    stream: ({ params }) => api.history(params.id),
  });

  function archiveOrRestore(name: string, consequence: string): void {
    const current = versioned();
    if (!current || archiving()) return;
    const archive = current.record.archivedAt === null;
    askToConfirm(
      dialog,
      archive
        ? {
            title: `Archive ${name}?`,
            message: `The ${noun} leaves the lists of what is in use. ${consequence} Nothing is deleted: it can be restored at any time.`,
            confirm: 'Archive',
            destructive: true,
          }
        : {
            title: `Restore ${name}?`,
            message: `The ${noun} is in use again and shows in the lists.`,
            confirm: 'Restore',
          },
    )
      .pipe(
        filter(Boolean),
        switchMap(() => {
          archiving.set(true);
          return archive
            ? api.archive(current.record.id, current.etag)
            : api.restore(current.record.id, current.etag);
        }),
      )
      .subscribe({
        next: (next) => {
          archiving.set(false);
          resource.set(next);
          snackBar.open(archive ? `Archived ${name}.` : `Restored ${name}.`, 'Close', { duration: 6_000 });
        },
        error: (error: unknown) => {
          archiving.set(false);
          const meanwhile = api.changedMeanwhile(error);
          if (meanwhile) {
            resource.set(meanwhile);
            snackBar.open(
              `Someone changed this ${noun} meanwhile. The page now shows their version: look it over, then try again if you still mean to.`,
              'Close',
              { duration: 15_000 },
            );
            return;
          }
          snackBar.open(
            `${name} was not ${archive ? 'archived' : 'restored'}. ${httpErrorMessage(error)}`,
            'Close',
            { duration: 10_000 },
          );
        },
      });
  }

  return {
    versioned,
    record,
    error: computed(() => {
      if (options.id() === null) return `This address names no ${noun}.`;
      return resource.error() ? httpErrorMessage(resource.error()) : null;
    }),
    changes: computed(() => (history.hasValue() ? history.value().changes : null)),
    historyError: computed(() => (history.error() ? httpErrorMessage(history.error()) : null)),
    archiving: archiving.asReadonly(),
    reload: () => resource.reload(),
    reloadHistory: () => history.reload(),
    archiveOrRestore,
  };
}

/** A record id from the address (`/customers/12`), or null for anything else. */
export function idFromRoute(value: string | undefined): number | null {
  return value !== undefined && /^[1-9]\d{0,15}$/.test(value) ? Number(value) : null;
}
