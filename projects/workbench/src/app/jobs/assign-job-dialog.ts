import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatRadioModule } from '@angular/material/radio';
import { BusyButton } from '../forms/busy-button';
import { ErrorBanner } from '../forms/error-banner';
import { PeopleApi } from '../people/people.api';
import { httpErrorMessage } from '../shell/server-errors';
import { jobDate } from './job-dates';
import { JOB_STATUS_LABELS, machineTitle } from './job-labels';
import { type Job, JobsApi, type JobSummary } from './jobs.api';
import { jobPeople } from './start-job-dialog';

/**
 * Giving a job to another technician (managers): the job is read first for its ETag, the choice is among
 * the shop's active people who do jobs, and the change is sent on that ETag. When someone changed the job
 * meanwhile (412), the dialog shows it as stored now and lets the manager choose again on it. It closes
 * with the job as assigned.
 */
@Component({
  selector: 'app-assign-job-dialog',
  imports: [
    BusyButton,
    ErrorBanner,
    MatButtonModule,
    MatDialogModule,
    MatProgressSpinnerModule,
    MatRadioModule,
    ReactiveFormsModule,
  ],
  template: `
    <h2 mat-dialog-title>Give the job to someone else</h2>
    <mat-dialog-content>
      <p class="lead">
        {{ title }}, {{ summary.machine.customerName }}, {{ date }}. Now with
        <strong>{{ current()?.technician?.name ?? summary.technician.name }}</strong>.
      </p>
      @if (notice(); as message) {
        <app-error-banner class="form-error" [message]="message" politeness="polite" />
      }
      @if (sendError(); as message) {
        <app-error-banner class="form-error" [message]="message" />
      }
      @if (loadError()) {
        <app-error-banner
          class="form-error"
          lead="The job or the people could not be fetched."
          [error]="loadError()"
          retryLabel="Try again"
          (retry)="reload()"
        />
      } @else if (!ready()) {
        <p class="loading" role="status">
          <mat-spinner diameter="20" aria-hidden="true" />
          Fetching the job and the people…
        </p>
      } @else {
        <mat-radio-group class="people" aria-label="Technician" [formControl]="chosen">
          @for (person of people(); track person.id) {
            <mat-radio-button class="person" [value]="person.id">
              {{ person.name }}
              @if (person.id === current()?.technician?.id) {
                <span class="person__current">(has it now)</span>
              }
            </mat-radio-button>
          } @empty {
            <p>No one else in the shop does jobs.</p>
          }
        </mat-radio-group>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button matButton type="button" mat-dialog-close>Cancel</button>
      <app-busy-button
        appearance="filled"
        [busy]="busy()"
        [disabled]="!ready() || chosen.value === null || chosen.value === current()?.technician?.id"
        [label]="'Give it to ' + (chosenName() ?? '…')"
        busyLabel="Saving…"
        (click)="assign()"
      />
    </mat-dialog-actions>
  `,
  styleUrl: '../people/dialog.scss',
  styles: `
    .people {
      display: grid;
      gap: 4px;
    }
    .person {
      --mat-radio-touch-target-size: 48px;
      min-height: 48px;
    }
    .person__current {
      color: var(--mat-sys-on-surface-variant);
    }
    .loading {
      display: flex;
      align-items: center;
      gap: 8px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AssignJobDialog {
  protected readonly summary = inject<JobSummary>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<AssignJobDialog, Job>>(MatDialogRef);
  private readonly api = inject(JobsApi);

  protected readonly title = machineTitle(this.summary.machine);
  protected readonly date = jobDate(this.summary.scheduledFor);
  private readonly job = rxResource({ stream: () => this.api.get(this.summary.id) });
  private readonly peopleList = inject(PeopleApi).listResource();
  /** The job as last read or as the 412 answered it, with its ETag. */
  private readonly stored = signal<{ job: Job; etag: string } | null>(null);
  protected readonly current = computed(
    () => this.stored()?.job ?? (this.job.hasValue() ? this.job.value().record : null),
  );
  private readonly etag = computed(
    () => this.stored()?.etag ?? (this.job.hasValue() ? this.job.value().etag : null),
  );
  protected readonly people = computed(() =>
    this.peopleList.hasValue() ? jobPeople(this.peopleList.value()?.people ?? []) : [],
  );
  protected readonly ready = computed(() => this.current() !== null && this.peopleList.hasValue());
  protected readonly loadError = computed(() => this.job.error() ?? this.peopleList.error());

  protected readonly chosen = new FormControl<number | null>(null);
  private readonly chosenId = signal<number | null>(null);
  protected readonly chosenName = computed(
    () => this.people().find((person) => person.id === this.chosenId())?.name ?? null,
  );
  protected readonly busy = signal(false);
  protected readonly sendError = signal<string | null>(null);
  protected readonly notice = signal<string | null>(null);

  constructor() {
    this.chosen.valueChanges.subscribe((id) => this.chosenId.set(id));
  }

  protected reload(): void {
    if (this.job.error()) this.job.reload();
    if (this.peopleList.error()) this.peopleList.reload();
  }

  protected assign(): void {
    const technicianId = this.chosen.value;
    const etag = this.etag();
    if (this.busy() || technicianId === null || etag === null) return;
    this.busy.set(true);
    this.sendError.set(null);
    this.notice.set(null);
    this.api.assign(this.summary.id, technicianId, etag).subscribe({
      next: ({ record }) => this.dialogRef.close(record),
      error: (error: unknown) => {
        this.busy.set(false);
        const meanwhile = this.api.changedMeanwhile(error);
        if (meanwhile) {
          this.stored.set({ job: meanwhile.record, etag: meanwhile.etag });
          this.notice.set(
            `Someone changed this job meanwhile: it is now with ${meanwhile.record.technician.name}, ` +
              `${JOB_STATUS_LABELS[meanwhile.record.status].toLowerCase()}. Nothing was saved; choose again if it should still move.`,
          );
          return;
        }
        this.sendError.set(httpErrorMessage(error));
      },
    });
  }
}
