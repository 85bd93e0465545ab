import { BreakpointObserver } from '@angular/cdk/layout';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { map } from 'rxjs';
import { AuthSession } from '../auth/auth-session';
import { apiListQuery, ARCHIVED_NOUNS, listCount, listQuery, PAGE_SIZES } from '../records/list-query';
import { pagedList } from '../records/paged-list';
import type { ArchivedFilter } from '../records/records-api';
import { searchBox } from '../records/search-box';
import { httpErrorMessage } from '../shell/server-errors';
import { type Customer, CustomersApi, type CustomerSortField } from './customers.api';

/** Below this width the e-mail address and phone move under the name, so that the table fits a phone. */
const WIDE_TABLE = '(min-width: 720px)';

/**
 * The shop's customers: searched, filtered, sorted and paged by the server, with the query kept in the
 * address so that a reload or the back button shows the same page. Each row's name is a link to the
 * customer's page.
 */
@Component({
  selector: 'app-customers-page',
  imports: [
    DatePipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatProgressSpinnerModule,
    MatSortModule,
    MatTableModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './customers-page.html',
  styleUrl: './customers-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomersPage {
  protected readonly session = inject(AuthSession);
  private readonly api = inject(CustomersApi);

  protected readonly query = listQuery<CustomerSortField>({ sortFields: ['name', 'updatedAt', 'createdAt'] });
  protected readonly state = this.query.state;
  protected readonly list = pagedList(
    () => apiListQuery(this.state()),
    (query) => this.api.list(query),
  );
  protected readonly search = searchBox(
    computed(() => this.state().q),
    (q) => this.query.change({ q }, { replaceUrl: true }),
  );
  protected readonly rows = computed<readonly Customer[]>(() => this.list.page()?.items ?? []);

  private readonly wide = toSignal(
    inject(BreakpointObserver)
      .observe(WIDE_TABLE)
      .pipe(map((state) => state.matches)),
    { initialValue: true },
  );
  protected readonly columns = computed(() =>
    this.wide() ? ['name', 'email', 'phone', 'machineCount', 'updatedAt'] : ['name', 'machineCount'],
  );
  protected readonly pageSizes = PAGE_SIZES;
  protected readonly httpErrorMessage = httpErrorMessage;
  protected readonly archivedNoun = computed(() => ARCHIVED_NOUNS[this.state().archived]);

  protected countSentence(total: number): string {
    return listCount(total, ['customer', 'customers'], this.state());
  }

  protected sortBy(sort: Sort): void {
    this.query.change({
      sort: sort.active as CustomerSortField,
      order: sort.direction === 'desc' ? 'desc' : 'asc',
    });
  }

  protected showArchived(archived: ArchivedFilter): void {
    this.query.change({ archived });
  }

  protected turnPage(event: PageEvent): void {
    this.query.change({ page: event.pageIndex + 1, pageSize: event.pageSize });
  }

  // The table's row templates are untyped; this gives their rows a type again.
  protected asCustomer(row: Customer): Customer {
    return row;
  }

  protected readonly trackById = (_index: number, customer: Customer): number => customer.id;
}
