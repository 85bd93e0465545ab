import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { AuthSession } from '../auth/auth-session';
import { RecordHistorySection } from '../records/record-history-section';
import { RecordPageHeader } from '../records/record-page-header';
import { type Machine, MachinesApi } from '../machines/machines.api';
import { idFromRoute, recordView } from '../records/record-page';
import { CUSTOMER_FIELDS } from './customer-form-model';
import { CustomersApi } from './customers.api';
import { ErrorBanner } from '../forms/error-banner';

/** How many of a customer's machines the page lists; a customer with more is searched in Machines. */
const MACHINES_SHOWN = 100;

/**
 * One customer: how to reach them, their contact persons, their machines and the history of the record;
 * editing, archiving and adding a machine for those whose role allows it.
 */
@Component({
  selector: 'app-customer-page',
  imports: [
    ErrorBanner,
    RecordHistorySection,
    RecordPageHeader,
    DatePipe,
    MatButtonModule,
    MatIconModule,
    MatProgressSpinnerModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './customer-page.html',
  styleUrl: './customer-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomerPage {
  /** The customer's id, from the address. */
  readonly id = input<string>();

  protected readonly session = inject(AuthSession);
  private readonly machinesApi = inject(MachinesApi);
  protected readonly view = recordView({
    api: inject(CustomersApi),
    id: () => idFromRoute(this.id()),
    noun: 'customer',
  });
  protected readonly customer = this.view.record;
  protected readonly machines = rxResource({
    params: () => idFromRoute(this.id()) ?? undefined,
    stream: ({ params }) =>
      this.machinesApi.list({
        customerId: params,
        archived: 'all',
        pageSize: MACHINES_SHOWN,
        sort: 'serialNumber',
      }),
  });
  protected readonly machineRows = computed<readonly Machine[]>(() =>
    this.machines.hasValue() ? this.machines.value().items : [],
  );
  protected readonly fields = CUSTOMER_FIELDS;
  protected readonly machineColumns = ['serialNumber', 'machine'];

  protected asMachine(row: Machine): Machine {
    return row;
  }

  protected archiveOrRestore(): void {
    const customer = this.customer();
    if (customer) this.view.archiveOrRestore(customer.name, 'Its machines and their history stay.');
  }
}
