import type { MatDialog } from '@angular/material/dialog';
import { catchError, map, type Observable, of, switchMap, throwError } from 'rxjs';
import {
  ChangedMeanwhileDialog,
  type ChangedMeanwhileChoice,
  type ChangedMeanwhileData,
} from './changed-meanwhile-dialog';
import { compareEdits, type FieldDescriptions } from './record-fields';
import type { RecordsApi, StoredRecord, Versioned } from './records-api';

/** How a change ended: saved, replaced in the form by the other person's version, or left to edit further. */
export type UpdateOutcome<T> =
  | { readonly kind: 'saved'; readonly versioned: Versioned<T> }
  | { readonly kind: 'took-theirs'; readonly versioned: Versioned<T> }
  | { readonly kind: 'kept-editing' };

/** What a form page passes to save a change. */
export interface UpdateRequest<T extends StoredRecord, U> {
  readonly api: RecordsApi<T, unknown, object, unknown, U>;
  readonly dialog: MatDialog;
  /** The kind of record, as a sentence names it: "customer". */
  readonly noun: string;
  /** How the record's fields read, for the comparison. */
  readonly fields: FieldDescriptions;
  /** The version the person started editing from. */
  readonly base: Versioned<T>;
  /** The fields they changed, as the API takes them. */
  readonly change: U;
  /** The same fields of a stored version, as the API takes them, to compare with theirs. */
  readonly fieldsOf: (record: T) => object;
}

/**
 * Sends a change with the ETag of the version it was made on. If someone changed the record meanwhile
 * (412), shows both versions and asks: keeping yours sends the same fields again on their version (and asks
 * again should a third change have come in), taking theirs answers their version for the form. Any other
 * refusal is passed on, so that the form shows it on its fields with nothing typed lost.
 */
export function updateMindingOthers<T extends StoredRecord, U>(
  request: UpdateRequest<T, U>,
): Observable<UpdateOutcome<T>> {
  const { api, base, change } = request;
  return api.update(base.record.id, change, base.etag).pipe(
    map((versioned): UpdateOutcome<T> => ({ kind: 'saved', versioned })),
    catchError((error: unknown) => {
      const meanwhile = api.changedMeanwhile(error);
      if (!meanwhile) return throwError(() => error);
      return api.history(base.record.id).pipe(
        map((history) => history.changes[0]?.by.name ?? null),
        catchError(() => of(null)),
        switchMap((changedBy) =>
          request.dialog
            .open<ChangedMeanwhileDialog, ChangedMeanwhileData, ChangedMeanwhileChoice>(
              ChangedMeanwhileDialog,
              {
                data: {
                  noun: request.noun,
                  changedBy,
                  changedAt: meanwhile.record.updatedAt,
                  rows: compareEdits(
                    request.fieldsOf(base.record),
                    request.fieldsOf(meanwhile.record),
                    change as object,
                    request.fields,
                  ),
                },
                width: '44rem',
                maxWidth: 'calc(100vw - 32px)',
                autoFocus: 'first-heading',
              },
            )
            .afterClosed(),
        ),
        switchMap((choice): Observable<UpdateOutcome<T>> => {
          const theirs: Versioned<T> = { record: meanwhile.record, etag: meanwhile.etag };
          if (choice === 'mine') return updateMindingOthers({ ...request, base: theirs });
          if (choice === 'theirs') return of({ kind: 'took-theirs', versioned: theirs });
          return of({ kind: 'kept-editing' });
        }),
      );
    }),
  );
}
