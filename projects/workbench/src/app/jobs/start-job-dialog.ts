import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  inject,
  Injectable,
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
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { Router } from '@angular/router';
import { can, type User } from '@counterpoise/api';
import { catchError, debounceTime, map, type Observable, of, Subject, switchMap } from 'rxjs';
import { AuthSession } from '../auth/auth-session';
import { BusyButton } from '../forms/busy-button';
import { ErrorBanner } from '../forms/error-banner';
import { FormRequest } from '../forms/form-request';
import { type Machine, MachinesApi } from '../machines/machines.api';
import { PeopleApi } from '../people/people.api';
import { SEARCH_DEBOUNCE_MS } from '../records/list-query';
import { errorMessage, requiredWith } from '../shell/validators';
import { todayIso } from './job-dates';
import { machineTitle } from './job-labels';
import { type CreateJob, JobsApi, type VersionedJob } from './jobs.api';

/** The people a job can be given to: active, in a role that does jobs. */
export function jobPeople(people: readonly User[]): User[] {
  return people
    .filter((person) => person.status === 'active' && can(person.role, 'jobs:write'))
    .sort((a, b) => a.name.localeCompare(b.name));
}

/** A machine as the picker holds it: its id and the words that name it. */
interface MachineRef {
  readonly id: number;
  readonly title: string;
  readonly customerName: string;
}

type MachineChoice = MachineRef | string | null;

function isMachineRef(value: MachineChoice): value is MachineRef {
  return typeof value === 'object' && value !== null;
}

/** Refuses an empty field and typed text that is not a machine chosen from the list. */
function chosenMachine(control: AbstractControl<MachineChoice>): ValidationErrors | null {
  const value = control.value;
  if (value === null || value === '') return { machineMissing: 'Choose the machine to balance.' };
  return isMachineRef(value) ? null : { machine: 'Choose the machine from the list that opens as you type.' };
}

/** A date written as the API takes it, and a real one. */
function isoDate(control: AbstractControl<string>): ValidationErrors | null {
  const value = control.value;
  if (!value) return { dateMissing: 'Enter the date of the job.' };
  const valid = /^\d{4}-\d{2}-\d{2}$/.test(value) && !Number.isNaN(Date.parse(value));
  return valid ? null : { date: 'Enter a real date.' };
}

/** How many machines the list under the field offers at a time. */
const SUGGESTIONS = 10;

/**
 * Starting a job: the machine found by what is typed (serial number, make, model, customer) among the
 * shop's machines in use, the date (today unless changed) and, for a manager, the technician (themself
 * unless changed). The server's refusals land on their fields; on success the dialog closes with the job.
 */
@Component({
  selector: 'app-start-job-dialog',
  imports: [
    BusyButton,
    ErrorBanner,
    MatAutocompleteModule,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  template: `
    <h2 mat-dialog-title>Start a job</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content>
        <p class="lead">The job opens at its first step, safety; everything typed is kept as you go.</p>
        @if (request.formError(); as message) {
          <app-error-banner class="form-error" [message]="message" />
        }
        <mat-form-field appearance="outline">
          <mat-label>Machine</mat-label>
          <mat-icon matPrefix aria-hidden="true" svgIcon="agriculture" />
          <input
            matInput
            type="text"
            autocomplete="off"
            required
            formControlName="machineId"
            [matAutocomplete]="machines"
            (focus)="suggestOnFocus()"
          />
          <mat-hint>Serial number, make, model or customer</mat-hint>
          <mat-error>{{ errorMessage(form.controls.machineId) }}</mat-error>
          <mat-autocomplete #machines="matAutocomplete" [displayWith]="titleOf">
            @for (machine of options(); track machine.id) {
              <mat-option [value]="machine">
                <span class="option__title">{{ machine.title }}</span>
                <span class="option__customer">{{ machine.customerName }}</span>
              </mat-option>
            } @empty {
              @if (searched()) {
                <mat-option disabled>{{
                  searchFailed() ? 'The machines could not be fetched.' : 'No machine in use matches.'
                }}</mat-option>
              }
            }
          </mat-autocomplete>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Date</mat-label>
          <input matInput type="date" required formControlName="scheduledFor" />
          <mat-error>{{ errorMessage(form.controls.scheduledFor) }}</mat-error>
        </mat-form-field>
        @if (namesTechnician) {
          <mat-form-field appearance="outline">
            <mat-label>Technician</mat-label>
            <mat-select formControlName="technicianId">
              @for (person of technicians(); track person.id) {
                <mat-option [value]="person.id">{{ person.name }}</mat-option>
              }
            </mat-select>
            @if (people?.error()) {
              <mat-hint
                >The people could not be fetched: the job is yours unless you try again later.</mat-hint
              >
            }
            <mat-error>{{ errorMessage(form.controls.technicianId) }}</mat-error>
          </mat-form-field>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button matButton type="button" mat-dialog-close>Cancel</button>
        <app-busy-button
          appearance="filled"
          type="submit"
          icon="play_arrow"
          [busy]="request.busy()"
          label="Start the job"
          busyLabel="Starting…"
        />
      </mat-dialog-actions>
    </form>
  `,
  styleUrl: '../people/dialog.scss',
  styles: `
    .option__title {
      display: block;
    }
    .option__customer {
      display: block;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StartJobDialog {
  private readonly api = inject(JobsApi);
  private readonly machinesApi = inject(MachinesApi);
  private readonly session = inject(AuthSession);
  private readonly dialogRef = inject<MatDialogRef<StartJobDialog, VersionedJob>>(MatDialogRef);

  /** Only a manager names the technician; anyone else's job is their own. */
  protected readonly namesTechnician = this.session.can('jobs:write-any');
  protected readonly people = this.namesTechnician ? inject(PeopleApi).listResource() : null;
  protected readonly technicians = computed(() => {
    const me = this.session.user();
    const listed = this.people?.hasValue() ? jobPeople(this.people.value()?.people ?? []) : [];
    return me && !listed.some((person) => person.id === me.id) ? [me, ...listed] : listed;
  });

  protected readonly form = new FormGroup({
    machineId: new FormControl<MachineChoice>(null, { validators: chosenMachine }),
    scheduledFor: new FormControl(todayIso(), { nonNullable: true, validators: isoDate }),
    technicianId: new FormControl<number | null>(this.session.user()?.id ?? null, {
      validators: this.namesTechnician ? requiredWith('Choose who does the job.') : [],
    }),
  });
  protected readonly request = new FormRequest();
  protected readonly errorMessage = errorMessage;

  protected readonly options = signal<readonly MachineRef[]>([]);
  protected readonly searched = signal(false);
  protected readonly searchFailed = signal(false);
  private readonly searches = new Subject<string>();

  constructor() {
    const destroyRef = inject(DestroyRef);
    this.form.controls.machineId.valueChanges.pipe(takeUntilDestroyed(destroyRef)).subscribe((value) => {
      if (!isMachineRef(value)) this.searches.next(value ?? '');
    });
    this.searches
      .pipe(
        debounceTime(SEARCH_DEBOUNCE_MS),
        switchMap((text) => this.findMachines(text)),
        takeUntilDestroyed(destroyRef),
      )
      .subscribe((machines) => {
        this.searchFailed.set(machines === null);
        this.options.set(machines ?? []);
        this.searched.set(true);
      });
  }

  private findMachines(text: string): Observable<MachineRef[] | null> {
    return this.machinesApi
      .list({ q: text.trim() || undefined, archived: 'false', pageSize: SUGGESTIONS, sort: 'serialNumber' })
      .pipe(
        map((page) => page.items.map(machineRef)),
        catchError(() => of(null)),
      );
  }

  /** The first suggestions come when the field is first used. */
  protected suggestOnFocus(): void {
    if (this.searched()) return;
    const value = this.form.controls.machineId.value;
    this.searches.next(isMachineRef(value) ? '' : (value ?? ''));
  }

  protected readonly titleOf = (value: MachineChoice): string =>
    isMachineRef(value) ? value.title : (value ?? '');

  protected submit(): void {
    const { machineId, scheduledFor, technicianId } = this.form.getRawValue();
    if (!isMachineRef(machineId)) {
      this.form.markAllAsTouched();
      return;
    }
    const job: CreateJob = {
      machineId: machineId.id,
      scheduledFor,
      ...(this.namesTechnician && technicianId !== null ? { technicianId } : {}),
    };
    this.request.send(this.form, () => this.api.create(job), {
      sent: (created) => this.dialogRef.close(created),
      leaves: true,
    });
  }
}

function machineRef(machine: Machine): MachineRef {
  return { id: machine.id, title: machineTitle(machine), customerName: machine.customerName };
}

/**
 * Starting jobs from anywhere: the dialog, or straight away on a known machine (today, the person signed
 * in), each opening the new job's page. `startingOn` says which machine's start is on its way, and
 * `failure` why the last one was refused, for the page to show beside its button.
 */
@Injectable({ providedIn: 'root' })
export class JobStarter {
  private readonly dialog = inject(MatDialog);
  private readonly api = inject(JobsApi);
  private readonly router = inject(Router);

  /** The machine whose job is being started, or null. */
  readonly startingOn = signal<number | null>(null);
  /** Why the last direct start failed, with the machine it was for. */
  readonly failure = signal<{ machineId: number; error: unknown } | null>(null);

  /** Opens the dialog; a job started there opens on its page. */
  openDialog(): void {
    this.dialog
      .open<StartJobDialog, void, VersionedJob>(StartJobDialog, { width: '32rem', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((created) => {
        if (created) void this.router.navigate(['/jobs', created.record.id]);
      });
  }

  /** Starts a job today on this machine for the person signed in, and opens it. */
  startOn(machineId: number): void {
    if (this.startingOn() !== null) return;
    this.startingOn.set(machineId);
    this.failure.set(null);
    this.api.create({ machineId, scheduledFor: todayIso() }).subscribe({
      next: (created) => {
        this.startingOn.set(null);
        void this.router.navigate(['/jobs', created.record.id]);
      },
      error: (error: unknown) => {
        this.startingOn.set(null);
        this.failure.set({ machineId, error });
      },
    });
  }
}
