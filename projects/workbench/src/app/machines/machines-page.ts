import { BreakpointObserver } from '@angular/cdk/layout';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, DestroyRef, effect, inject } from '@angular/core';
import { rxResource, takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { map } from 'rxjs';
import { AuthSession } from '../auth/auth-session';
import { type CustomerChoice, CustomerPicker, isCustomerRef } from '../customers/customer-picker';
import { CustomersApi } from '../customers/customers.api';
import { MachineFamiliesApi } from '../machine-families/machine-families.api';
import { apiListQuery, ARCHIVED_NOUNS, listCount, listQuery, PAGE_SIZES } from '../records/list-query';
import { pagedList } from '../records/paged-list';
import type { ArchivedFilter } from '../records/records-api';
import { searchBox } from '../records/search-box';
import { httpErrorMessage } from '../shell/server-errors';
import { type Machine, MachinesApi, type MachineSortField } from './machines.api';

/** Below this width the customer and family move under the serial number, so that the table fits a phone. */
const WIDE_TABLE = '(min-width: 720px)';

/** The families the filter offers. */
const FAMILIES_OFFERED = 100;

/**
 * The shop's machines: searched (serial number, make, model, customer), filtered by customer and family,
 * sorted and paged by the server, the query kept in the address. Each row's serial number links to the
 * machine's page.
 */
@Component({
  selector: 'app-machines-page',
  imports: [
    CustomerPicker,
    DatePipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatProgressSpinnerModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './machines-page.html',
  styleUrl: './machines-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MachinesPage {
  protected readonly session = inject(AuthSession);
  private readonly api = inject(MachinesApi);
  private readonly customersApi = inject(CustomersApi);
  private readonly familiesApi = inject(MachineFamiliesApi);

  protected readonly query = listQuery<MachineSortField>({
    sortFields: ['serialNumber', 'customerName', 'make', 'updatedAt'],
    idFilters: ['customerId', 'familyId'],
  });
  protected readonly state = this.query.state;
  protected readonly list = pagedList(
    () => apiListQuery(this.state()),
    (query) => this.api.list(query),
  );
  protected readonly search = searchBox(
    computed(() => this.state().q),
    (q) => this.query.change({ q }, { replaceUrl: true }),
  );
  protected readonly rows = computed<readonly Machine[]>(() => this.list.page()?.items ?? []);

  /** The customer filter: the customer chosen, or text while finding one. */
  protected readonly customerFilter = new FormControl<CustomerChoice>(null);
  private readonly families = rxResource({
    stream: () => this.familiesApi.list({ pageSize: FAMILIES_OFFERED, sort: 'name', archived: 'all' }),
  });
  protected readonly familyOptions = computed(() =>
    this.families.hasValue() ? this.families.value().items : [],
  );
  protected readonly familyFilter = computed(() => this.state().filters['familyId'] ?? null);

  private readonly wide = toSignal(
    inject(BreakpointObserver)
      .observe(WIDE_TABLE)
      .pipe(map((state) => state.matches)),
    { initialValue: true },
  );
  protected readonly columns = computed(() =>
    this.wide()
      ? ['serialNumber', 'makeModel', 'customerName', 'familyName', 'updatedAt']
      : ['serialNumber', 'customerName'],
  );
  protected readonly pageSizes = PAGE_SIZES;
  protected readonly httpErrorMessage = httpErrorMessage;
  protected readonly archivedNoun = computed(() => ARCHIVED_NOUNS[this.state().archived]);

  protected countSentence(total: number): string {
    return listCount(total, ['machine', 'machines'], this.state());
  }
  protected readonly filtered = computed(
    () => Object.keys(this.state().filters).length > 0 || this.state().q !== '',
  );

  constructor() {
    // The customer filter shows the customer the address names (a reload, a link from the customer's page).
    effect(() => {
      const id = this.state().filters['customerId'];
      const shown = this.customerFilter.value;
      if (id === undefined) {
        if (isCustomerRef(shown)) this.customerFilter.setValue(null, { emitEvent: false });
        return;
      }
      if (isCustomerRef(shown) && shown.id === id) return;
      this.customersApi.get(id).subscribe({
        next: ({ record }) =>
          this.customerFilter.setValue({ id: record.id, name: record.name }, { emitEvent: false }),
        error: () => this.customerFilter.setValue({ id, name: `Customer no. ${id}` }, { emitEvent: false }),
      });
    });
    this.customerFilter.valueChanges.pipe(takeUntilDestroyed(inject(DestroyRef))).subscribe((choice) => {
      const current = this.state().filters['customerId'];
      if (isCustomerRef(choice) && choice.id !== current) this.filterBy({ customerId: choice.id });
      if (choice === null && current !== undefined) this.filterBy({ customerId: undefined });
    });
  }

  protected filterBy(change: {
    customerId?: number | undefined;
    familyId?: number | null | undefined;
  }): void {
    const filters: Record<string, number> = { ...this.state().filters };
    for (const [name, value] of Object.entries(change)) {
      if (value === undefined || value === null) delete filters[name];
      else filters[name] = value;
    }
    this.query.change({ filters });
  }

  protected sortBy(sort: Sort): void {
    this.query.change({
      sort: sort.active as MachineSortField,
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
  protected asMachine(row: Machine): Machine {
    return row;
  }

  protected makeModel(machine: Machine): string {
    return [machine.make, machine.model].filter(Boolean).join(' ');
  }

  protected readonly trackById = (_index: number, machine: Machine): number => machine.id;
}
