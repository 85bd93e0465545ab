import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  effect,
  inject,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  FormControl,
  FormGroup,
  ReactiveFormsModule,
  type ValidationErrors,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { can, type User } from '@counterpoise/api';
import { AuthSession } from '../auth/auth-session';
import { type CustomerChoice, CustomerPicker, isCustomerRef } from '../customers/customer-picker';
import { CustomersApi } from '../customers/customers.api';
import { JobsExport } from '../machine-history/jobs-export';
import { PeopleApi } from '../people/people.api';
import { PAGE_SIZES } from '../records/list-query';
import { pagedList } from '../records/paged-list';
import { ListPage, type ListPaging, type ListSource } from '../shell/list-page';
import { errorMessage } from '../shell/validators';
import { wideTable } from '../shell/wide-table';
import { AssignJobDialog } from './assign-job-dialog';
import { jobDate } from './job-dates';
import { JOB_STATUS_LABELS, machineTitle } from './job-labels';
import { type Job, JobsApi, type JobSummary } from './jobs.api';
import { JOB_STATUS_FILTERS, jobsApiQuery, jobsFiltered, jobsQuery } from './jobs-query';
import { JobStarter } from './start-job-dialog';

/** A date typed in a filter: empty, or a real day. */
function filterDate(control: AbstractControl<string>): ValidationErrors | null {
  const value = control.value;
  return !value || !Number.isNaN(Date.parse(value))
    ? null
    : { date: 'Enter a real date, or leave it empty.' };
}

/** The last day is not before the first. */
function datesInOrder(group: AbstractControl): ValidationErrors | null {
  const from = group.get('from')?.value as string;
  const to = group.get('to');
  if (!to) return null;
  const wrong = !!from && !!to.value && to.value < from;
  const errors = { ...(to.errors ?? {}) } as ValidationErrors;
  if (wrong) errors['order'] = 'The last day is before the first.';
  else delete errors['order'];
  to.setErrors(Object.keys(errors).length > 0 ? errors : null);
  return null;
}

/**
 * The shop's jobs, newest date first: filtered by state, technician, customer and dates, paged by the
 * server, the filters kept in the address so that a reload or the back button shows the same page. Each
 * row opens the job; a manager gives a job to another technician from its row.
 */
@Component({
  selector: 'app-jobs-page',
  imports: [
    CustomerPicker,
    JobsExport,
    ListPage,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    MatTableModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './jobs-page.html',
  styleUrl: './jobs-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobsPage {
  protected readonly session = inject(AuthSession);
  private readonly api = inject(JobsApi);
  private readonly customersApi = inject(CustomersApi);
  private readonly dialog = inject(MatDialog);
  protected readonly starter = inject(JobStarter);

  protected readonly query = jobsQuery();
  protected readonly state = this.query.state;
  private readonly list = pagedList(
    () => jobsApiQuery(this.state()),
    (query) => this.api.list(query),
  );

  protected readonly source: ListSource = {
    error: this.list.error,
    loading: this.list.loading,
    ready: computed(() => this.list.page() !== null),
    reload: () => this.list.reload(),
  };
  protected readonly rows = computed<readonly JobSummary[]>(() => this.list.page()?.items ?? []);
  protected readonly filtered = computed(() => jobsFiltered(this.state()));
  protected readonly count = computed(() => {
    const page = this.list.page();
    if (!page) return null;
    const counted = `${page.total} ${page.total === 1 ? 'job' : 'jobs'}`;
    return this.filtered()
      ? `${counted} ${page.total === 1 ? 'matches' : 'match'} the filters.`
      : `${counted}.`;
  });
  protected readonly paging = computed<ListPaging | null>(() => {
    const page = this.list.page();
    return page
      ? {
          length: page.total,
          pageIndex: this.state().page - 1,
          pageSize: this.state().pageSize,
          pageSizes: PAGE_SIZES,
          turnPage: (event) => this.query.change({ page: event.pageIndex + 1, pageSize: event.pageSize }),
        }
      : null;
  });

  protected readonly statuses = JOB_STATUS_FILTERS;
  protected readonly statusLabels = JOB_STATUS_LABELS;
  protected readonly canAssign = computed(() => this.session.can('jobs:write-any'));

  /** The people the technician filter offers: the shop's for those who may see them, else oneself. */
  private readonly people = this.session.can('people:read') ? inject(PeopleApi).listResource() : null;
  protected readonly technicianOptions = computed<readonly Pick<User, 'id' | 'name'>[]>(() => {
    const listed = this.people?.hasValue()
      ? (this.people.value()?.people ?? [])
          .filter((person) => can(person.role, 'jobs:write'))
          .sort((a, b) => a.name.localeCompare(b.name))
      : [];
    const me = this.session.user();
    return me && !listed.some((person) => person.id === me.id) ? [me, ...listed] : listed;
  });
  protected readonly meId = computed(() => this.session.user()?.id ?? null);

  /** The customer filter: the customer chosen, or text while finding one. */
  protected readonly customerFilter = new FormControl<CustomerChoice>(null);
  protected readonly dates = new FormGroup(
    {
      from: new FormControl('', { nonNullable: true, validators: filterDate }),
      to: new FormControl('', { nonNullable: true, validators: filterDate }),
    },
    { validators: datesInOrder },
  );
  protected readonly errorMessage = errorMessage;

  /** What the last assignment did, for the polite line above the table. */
  protected readonly assigned = signal<string | null>(null);

  /** Below the wide-table width the customer, date and technician move under the machine and state. */
  private readonly wide = wideTable();
  protected readonly columns = computed(() => {
    const columns = this.wide()
      ? ['machine', 'customer', 'scheduledFor', 'technician', 'status']
      : ['machine', 'status'];
    return this.canAssign() ? [...columns, 'assign'] : columns;
  });

  constructor() {
    // The customer filter shows the customer the address names (a reload, a shared link).
    effect(() => {
      const id = this.state().customerId;
      const shown = this.customerFilter.value;
      if (id === null) {
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
    // The date fields show the dates the address holds.
    effect(() => {
      const { from, to } = this.state();
      const shown = this.dates.getRawValue();
      if (shown.from !== from || shown.to !== to) {
        if (this.dates.valid || (from === '' && to === ''))
          this.dates.setValue({ from, to }, { emitEvent: false });
      }
    });
    const destroyRef = inject(DestroyRef);
    this.customerFilter.valueChanges.pipe(takeUntilDestroyed(destroyRef)).subscribe((choice) => {
      const current = this.state().customerId;
      if (isCustomerRef(choice) && choice.id !== current) this.query.change({ customerId: choice.id });
      if (choice === null && current !== null) this.query.change({ customerId: null });
    });
    this.dates.valueChanges.pipe(takeUntilDestroyed(destroyRef)).subscribe(() => {
      if (this.dates.invalid) {
        this.dates.markAllAsTouched();
        return;
      }
      const { from, to } = this.dates.getRawValue();
      if (from !== this.state().from || to !== this.state().to) this.query.change({ from, to });
    });
  }

  protected filterByStatus(status: Job['status'] | null): void {
    this.query.change({ status });
  }

  protected filterByTechnician(technicianId: number | null): void {
    this.query.change({ technicianId });
  }

  protected assign(job: JobSummary): void {
    this.assigned.set(null);
    this.dialog
      .open<AssignJobDialog, JobSummary, Job>(AssignJobDialog, {
        data: job,
        width: '30rem',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((updated) => {
        if (!updated) return;
        this.assigned.set(
          `The job on ${machineTitle(updated.machine)} is now with ${updated.technician.name}.`,
        );
        this.list.reload();
      });
  }

  protected readonly machineTitle = machineTitle;
  protected readonly jobDate = jobDate;

  // The table's row templates are untyped; this gives their rows a type again.
  protected asJob(row: JobSummary): JobSummary {
    return row;
  }

  protected trackById(_index: number, job: JobSummary): number {
    return job.id;
  }
}
