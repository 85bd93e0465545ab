import { wideTable } from '../shell/wide-table';
import { ChangeDetectionStrategy, Component, computed, DestroyRef, effect, inject } from '@angular/core';
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { AuthSession } from '../auth/auth-session';
import { LastChangedColumn } from '../records/last-changed-column';
import { recordList } from '../records/record-list';
import { RecordListFilters } from '../records/record-list-filters';
import { ListPage } from '../shell/list-page';
import { type CustomerChoice, CustomerPicker, isCustomerRef } from '../customers/customer-picker';
import { CustomersApi } from '../customers/customers.api';
import { MachineFamiliesApi } from '../machine-families/machine-families.api';
import { type Machine, MachinesApi, type MachineSortField } from './machines.api';

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
    LastChangedColumn,
    ListPage,
    CustomerPicker,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    RecordListFilters,
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

  protected readonly records = recordList<Machine, MachineSortField>({
    sortFields: ['serialNumber', 'customerName', 'make', 'updatedAt'],
    idFilters: ['customerId', 'familyId'],
    load: (query) => this.api.list(query),
    nouns: ['machine', 'machines'],
  });
  protected readonly query = this.records.query;
  protected readonly state = this.records.state;

  /** The customer filter: the customer chosen, or text while finding one. */
  protected readonly customerFilter = new FormControl<CustomerChoice>(null);
  private readonly families = rxResource({
    stream: () => this.familiesApi.list({ pageSize: FAMILIES_OFFERED, sort: 'name', archived: 'all' }),
  });
  protected readonly familyOptions = computed(() =>
    this.families.hasValue() ? this.families.value().items : [],
  );
  protected readonly familyFilter = computed(() => this.state().filters['familyId'] ?? null);

  /** Below the wide-table width the customer and family move under the serial number, so that the table fits a phone. */
  private readonly wide = wideTable();
  protected readonly columns = computed(() =>
    this.wide()
      ? ['serialNumber', 'makeModel', 'customerName', 'familyName', 'updatedAt']
      : ['serialNumber', 'customerName'],
  );

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

  // The table's row templates are untyped; this gives their rows a type again.
  protected asMachine(row: Machine): Machine {
    return row;
  }

  protected makeModel(machine: Machine): string {
    return [machine.make, machine.model].filter(Boolean).join(' ');
  }
}
