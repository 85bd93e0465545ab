import { ChangeDetectionStrategy, Component, computed, input, type Signal } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { ErrorBanner } from '../forms/error-banner';

/** What a list page's frame reads of its list, however the page fetches it. */
export interface ListSource {
  /** Why the last fetch failed, or undefined. */
  readonly error: Signal<unknown>;
  /** Whether a fetch is on its way. */
  readonly loading: Signal<boolean>;
  /** Whether there is a list to show (kept while the next one loads). */
  readonly ready: Signal<boolean>;
  /** Asks for the list again. */
  reload(): void;
}

/** A server-paged list's paginator. */
export interface ListPaging {
  readonly length: number;
  readonly pageIndex: number;
  readonly pageSize: number;
  readonly pageSizes: readonly number[];
  turnPage(event: PageEvent): void;
}

/** The frame's reading of a resource (`httpResource`, `rxResource`): shown once it has a value. */
export function resourceSource(resource: {
  error(): unknown;
  isLoading(): boolean;
  hasValue(): boolean;
  reload(): unknown;
}): ListSource {
  return {
    error: computed(() => resource.error()),
    loading: computed(() => resource.isLoading()),
    ready: computed(() => resource.hasValue()),
    reload: () => void resource.reload(),
  };
}

/**
 * A list page: its heading with the page's lead (`listLead`) and main action (`listAction`), the filters
 * (`listFilters`, always shown), and then one of: why the list could not be fetched with a retry, the
 * spinner before the first answer, or the list — what the page puts before it (`listBefore`), the count
 * sentence, the table (the page's default content) in a frame with a loading bar and the paginator, or
 * `listEmpty` instead of the table, and what comes after it (`listAfter`).
 */
@Component({
  selector: 'app-list-page',
  imports: [ErrorBanner, MatIconModule, MatPaginatorModule, MatProgressBarModule, MatProgressSpinnerModule],
  template: `
    <header class="header">
      <div>
        <h1>{{ heading() }}</h1>
        <ng-content select="[listLead]" />
      </div>
      <ng-content select="[listAction]" />
    </header>
    <ng-content select="[listFilters]" />

    @if (list().error() && !list().ready()) {
      <app-error-banner
        class="problem"
        [lead]="problemLead() ?? 'The ' + noun() + ' could not be fetched.'"
        [error]="list().error()"
        retryLabel="Try again"
        (retry)="list().reload()"
      />
    } @else if (list().ready()) {
      <ng-content select="[listBefore]" />
      @if (count() !== null) {
        <p class="count" aria-live="polite">{{ count() }}</p>
      }
      @if (empty()) {
        <ng-content select="[listEmpty]" />
      } @else {
        <div class="table-wrap">
          @if (list().loading()) {
            <mat-progress-bar
              class="loading-bar"
              mode="indeterminate"
              [attr.aria-label]="'Fetching ' + noun()"
            />
          } @else {
            <div class="loading-bar"></div>
          }
          <ng-content />
          @if (paging(); as paging) {
            <mat-paginator
              [length]="paging.length"
              [pageIndex]="paging.pageIndex"
              [pageSize]="paging.pageSize"
              [pageSizeOptions]="paging.pageSizes"
              (page)="paging.turnPage($event)"
              [attr.aria-label]="'Pages of ' + noun()"
            />
          }
        </div>
      }
      <ng-content select="[listAfter]" />
    } @else {
      <p class="state" role="status">
        <mat-spinner diameter="24" aria-hidden="true" />
        {{ fetching() ?? 'Fetching the ' + noun() + '…' }}
      </p>
    }
  `,
  styleUrl: './list-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ListPage {
  /** The page's heading: "Customers". */
  readonly heading = input.required<string>();
  /** The list as the sentences name it: "customers", "machine families". */
  readonly noun = input.required<string>();
  /** The list's state and its retry. */
  readonly list = input.required<ListSource>();
  /** The sentence above the table ("12 customers."), polite for screen readers; none when null. */
  readonly count = input<string | null>(null);
  /** The paginator of a server-paged list; none when null. */
  readonly paging = input<ListPaging | null>(null);
  /** Whether the list is empty, so that `listEmpty` shows instead of the table. */
  readonly empty = input(false);
  /** What could not be fetched, when "The <noun> could not be fetched." does not say it well. */
  readonly problemLead = input<string | null>(null);
  /** What the spinner says, when "Fetching the <noun>…" does not say it well. */
  readonly fetching = input<string | null>(null);
}
