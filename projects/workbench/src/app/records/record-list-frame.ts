import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { ErrorBanner } from '../forms/error-banner';
import type { RecordList } from './record-list';

/**
 * The search field and archived filter above a records list, with the list's own filters projected
 * between them. Its host is the flex row, so that projected filters (class `filter`) wrap with the rest.
 */
@Component({
  selector: 'app-record-list-filters',
  imports: [MatButtonToggleModule, MatFormFieldModule, MatIconModule, MatInputModule, ReactiveFormsModule],
  template: `
    <mat-form-field appearance="outline" class="search" subscriptSizing="dynamic">
      <mat-label>{{ searchLabel() }}</mat-label>
      <mat-icon matPrefix aria-hidden="true">search</mat-icon>
      <input matInput type="search" autocomplete="off" [formControl]="records().search" />
      <mat-hint>{{ searchHint() }}</mat-hint>
    </mat-form-field>
    <ng-content />
    <mat-button-toggle-group
      [value]="records().state().archived"
      (change)="records().showArchived($event.value)"
      [attr.aria-label]="archivedLabel()"
    >
      <mat-button-toggle value="false">In use</mat-button-toggle>
      <mat-button-toggle value="true">Archived</mat-button-toggle>
      <mat-button-toggle value="all">All</mat-button-toggle>
    </mat-button-toggle-group>
  `,
  styleUrl: './record-list-filters.scss',
  host: { class: 'filters' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RecordListFilters {
  readonly records = input.required<RecordList<unknown>>();
  /** "Search customers". */
  readonly searchLabel = input.required<string>();
  /** What the search looks through. */
  readonly searchHint = input.required<string>();
  /** "Which customers to show". */
  readonly archivedLabel = input.required<string>();
}

/**
 * What a records list shows around its table: why the list could not be fetched, the count sentence, the
 * loading bar, the paginator, and the spinner before the first page. The page projects its own table.
 */
@Component({
  selector: 'app-record-list-frame',
  imports: [ErrorBanner, MatPaginatorModule, MatProgressBarModule, MatProgressSpinnerModule],
  template: `
    @if (records().list.error(); as error) {
      <app-error-banner
        class="problem"
        [lead]="'The ' + noun() + ' could not be fetched.'"
        [error]="error"
        retryLabel="Try again"
        (retry)="records().list.reload()"
      />
    } @else if (records().list.page(); as page) {
      <p class="count" aria-live="polite">{{ records().countSentence(page.total) }}</p>
      <div class="table-wrap">
        @if (records().list.loading()) {
          <mat-progress-bar
            class="loading-bar"
            mode="indeterminate"
            [attr.aria-label]="'Fetching ' + noun()"
          />
        } @else {
          <div class="loading-bar"></div>
        }
        <ng-content />
        <mat-paginator
          [length]="page.total"
          [pageIndex]="records().state().page - 1"
          [pageSize]="records().state().pageSize"
          [pageSizeOptions]="records().pageSizes"
          (page)="records().turnPage($event)"
          [attr.aria-label]="'Pages of ' + noun()"
        />
      </div>
    } @else {
      <p class="state" role="status">
        <mat-spinner diameter="24" aria-hidden="true" />
        Fetching the {{ noun() }}…
      </p>
    }
  `,
  styleUrl: './record-list-frame.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RecordListFrame {
  readonly records = input.required<RecordList<unknown>>();
  /** The records as the sentences name them: "customers", "machine families". */
  readonly noun = input.required<string>();
}
