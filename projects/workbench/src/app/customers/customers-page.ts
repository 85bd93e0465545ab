import { wideTable } from '../shell/wide-table';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { AuthSession } from '../auth/auth-session';
import { LastChangedColumn } from '../records/last-changed-column';
import { recordList } from '../records/record-list';
import { RecordListFilters } from '../records/record-list-filters';
import { ListPage } from '../shell/list-page';
import { type Customer, CustomersApi, type CustomerSortField } from './customers.api';

/**
 * The shop's customers: searched, filtered, sorted and paged by the server, with the query kept in the
 * address so that a reload or the back button shows the same page. Each row's name is a link to the
 * customer's page.
 */
@Component({
  selector: 'app-customers-page',
  imports: [
    LastChangedColumn,
    ListPage,
    MatButtonModule,
    MatIconModule,
    MatSortModule,
    MatTableModule,
    RecordListFilters,
    RouterLink,
  ],
  templateUrl: './customers-page.html',
  styleUrl: './customers-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomersPage {
  protected readonly session = inject(AuthSession);
  private readonly api = inject(CustomersApi);

  protected readonly records = recordList<Customer, CustomerSortField>({
    sortFields: ['name', 'updatedAt', 'createdAt'],
    load: (query) => this.api.list(query),
    nouns: ['customer', 'customers'],
  });
  protected readonly state = this.records.state;

  /** Below the wide-table width the e-mail address and phone move under the name, so that the table fits a phone. */
  private readonly wide = wideTable();
  protected readonly columns = computed(() =>
    this.wide() ? ['name', 'email', 'phone', 'machineCount', 'updatedAt'] : ['name', 'machineCount'],
  );

  // The table's row templates are untyped; this gives their rows a type again.
  protected asCustomer(row: Customer): Customer {
    return row;
  }
}
