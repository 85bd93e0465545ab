import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import type { RecordChange } from '@counterpoise/api';
import { ErrorBanner } from '../forms/error-banner';
import { type FieldDescriptions, fieldLabel, fieldValue, isEmptyValue } from './record-fields';

/** One change in words: who did what, and each field's before and after. */
export interface ChangeInWords {
  /** "Dagny Fairbrook changed the phone from “…” to “…”.", or "Dagny Fairbrook changed 3 fields:". */
  readonly headline: string;
  /** One line per field when several changed: "the phone from “…” to “…”". */
  readonly details: readonly string[];
}

/** What happened to one field, completing "Dagny Fairbrook …". */
function fieldSentence(field: RecordChange['fields'][number], fields: FieldDescriptions): string {
  const label = fieldLabel(field.field, fields);
  const after = fieldValue(field.field, field.after, fields);
  if (isEmptyValue(field.before)) return `set the ${label} to ${after}`;
  const before = fieldValue(field.field, field.before, fields);
  if (isEmptyValue(field.after)) return `cleared the ${label} (it was ${before})`;
  return `changed the ${label} from ${before} to ${after}`;
}

/**
 * A change of the record's history as sentences a service manager reads months later: "Dagny Fairbrook
 * changed the phone from “…” to “…”." `noun` names the kind of record ("customer").
 */
export function describeChange(change: RecordChange, noun: string, fields: FieldDescriptions): ChangeInWords {
  const who = change.by.name;
  switch (change.action) {
    case 'created':
      return { headline: `${who} added this ${noun}.`, details: [] };
    case 'archived':
      return { headline: `${who} archived this ${noun}.`, details: [] };
    case 'restored':
      return { headline: `${who} restored this ${noun}.`, details: [] };
    case 'updated': {
      const sentences = change.fields.map((field) => fieldSentence(field, fields));
      if (sentences.length === 0) return { headline: `${who} saved this ${noun} unchanged.`, details: [] };
      if (sentences.length === 1) return { headline: `${who} ${sentences[0]}.`, details: [] };
      return { headline: `${who} changed ${sentences.length} fields:`, details: sentences };
    }
  }
}

/**
 * A record's change history, newest first: who changed what and when, in sentences, so that the shop can
 * answer a warranty question months later from the record alone.
 */
@Component({
  selector: 'app-change-history',
  imports: [DatePipe, ErrorBanner, MatProgressSpinnerModule],
  template: `
    @if (failed(); as message) {
      <app-error-banner
        lead="The history could not be fetched."
        [message]="message"
        retryLabel="Try again"
        (retry)="retry.emit()"
      />
    } @else if (entries(); as entries) {
      @if (entries.length === 0) {
        <p class="empty">No changes recorded yet.</p>
      } @else {
        <ol class="history">
          @for (entry of entries; track entry.change.id) {
            <li>
              <p class="headline">{{ entry.words.headline }}</p>
              @if (entry.words.details.length > 0) {
                <ul class="details">
                  @for (line of entry.words.details; track $index) {
                    <li>{{ line }}</li>
                  }
                </ul>
              }
              <p class="when">
                <time [attr.datetime]="entry.change.at">{{ entry.change.at | date: 'd MMM y, HH:mm' }}</time>
                · version {{ entry.change.version }}
              </p>
            </li>
          }
        </ol>
      }
    } @else {
      <p class="empty" role="status">
        <mat-spinner diameter="20" aria-hidden="true" />
        Fetching the history…
      </p>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .history {
      list-style: none;
      margin: 0;
      padding: 0;
    }
    .history > li {
      padding: 12px 0 12px 16px;
      border-inline-start: 3px solid var(--mat-sys-outline-variant);
    }
    .history > li + li {
      margin-top: 4px;
    }
    .headline,
    .details {
      margin: 0;
      overflow-wrap: anywhere;
    }
    .details {
      padding-inline-start: 20px;
    }
    .when {
      margin: 4px 0 0;
      font: var(--mat-sys-body-medium);
      color: var(--mat-sys-on-surface-variant);
    }
    .empty {
      display: flex;
      align-items: center;
      gap: 12px;
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ChangeHistory {
  /** The changes, newest first; null while they are being fetched. */
  readonly changes = input.required<readonly RecordChange[] | null>();
  /** Why the history could not be fetched, or null. */
  readonly failed = input<string | null>(null);
  /** The kind of record, as a sentence names it: "customer", "machine". */
  readonly noun = input.required<string>();
  /** How the record's fields read. */
  readonly fields = input<FieldDescriptions>({});
  /** The person asks to fetch the history again. */
  readonly retry = output();

  protected readonly entries = computed(() =>
    this.changes()?.map((change) => ({ change, words: describeChange(change, this.noun(), this.fields()) })),
  );
}
