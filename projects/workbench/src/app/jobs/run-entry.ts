import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  effect,
  ElementRef,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import {
  type AbstractControl,
  FormArray,
  FormControl,
  FormGroup,
  ReactiveFormsModule,
  type ValidationErrors,
  type ValidatorFn,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { MachineSide } from '@counterpoise/api';
import { averageAmplitudes, averageReadings } from '@counterpoise/engine';
import { BusyButton } from '../forms/busy-button';
import { ErrorBanner } from '../forms/error-banner';
import type { Machine } from '../machines/machines.api';
import {
  AMPLITUDE_UNIT_LABELS,
  formatDeg,
  formatNumber,
  planeName,
  SIDE_LABELS,
} from '../records/record-labels';
import { formErrorOf } from '../shell/server-errors';
import { JobDrafts } from './job-drafts';
import { type JobChange, JobSession } from './job-session';
import type { AddRun, Job, JobRun, RunKind } from './jobs.api';
import { planeCountOf } from './job-labels';

/** Repeats that spread by more than this fraction of their average are not trusted (docs/jobs.md). */
export const MAX_SPREAD_RATIO = 0.2;

/** How each kind of run is named in headings and on the save line. */
export const RUN_KIND_LABELS: Readonly<Record<RunKind, string>> = {
  initial: 'Initial run',
  trial: 'Trial run',
  verification: 'Verification run',
};

/** One repeat as typed: the texts of its fields, so that a half-typed "0," survives a reload. */
type RepeatForm = FormGroup<{
  amplitude: FormControl<string>;
  phaseDeg: FormControl<string>;
  speedRpm: FormControl<string>;
}>;
type ReadingForm = FormGroup<{ sensorSide: FormControl<MachineSide>; repeats: FormArray<RepeatForm> }>;
type TrialWeightForm = FormGroup<{
  planeIndex: FormControl<number | null>;
  massGrams: FormControl<string>;
  angleDeg: FormControl<string>;
}>;
type RunForm = FormGroup<{
  /** Read without phase: the phase fields are hidden and the repeats go without it. */
  amplitudeOnly: FormControl<boolean>;
  trialWeight: TrialWeightForm;
  readings: FormArray<ReadingForm>;
}>;

/** The draft of a run form, as `JobDrafts` keeps it. */
interface RunDraft {
  readonly readings?: readonly { readonly repeats?: readonly unknown[] }[];
}

/** A number as typed on a keypad: a dot or a comma for the decimals, spaces ignored; null when it is none. */
export function parseTypedNumber(text: string | null | undefined): number | null {
  const cleaned = (text ?? '').replace(/\s/g, '').replace(',', '.');
  if (cleaned === '' || !/^[-+]?(\d+\.?\d*|\.\d+)$/.test(cleaned)) return null;
  const value = Number(cleaned);
  return Number.isFinite(value) ? value : null;
}

/**
 * A typed number within a range, with the same words as the server's check (shared/api/jobs.ts), so that a
 * field says the same thing whichever refuses it first.
 */
function typedNumber(rule: {
  readonly missing: string;
  readonly min: number;
  readonly minInclusive: boolean;
  readonly max: number;
  readonly maxInclusive: boolean;
  readonly range: string;
}): ValidatorFn {
  return (control: AbstractControl<string>): ValidationErrors | null => {
    const text = (control.value ?? '').trim();
    if (text === '') return { message: rule.missing };
    const value = parseTypedNumber(text);
    if (value === null) return { message: `Type a number. ${rule.missing}` };
    const low = rule.minInclusive ? value < rule.min : value <= rule.min;
    const high = rule.maxInclusive ? value > rule.max : value >= rule.max;
    return low || high ? { message: rule.range } : null;
  };
}

const AMPLITUDE_RULE = typedNumber({
  missing: 'Enter the amplitude.',
  min: 0,
  minInclusive: true,
  max: 1000,
  maxInclusive: true,
  range: 'The amplitude is from 0 to 1000.',
});
const PHASE_RULE = typedNumber({
  missing: 'Enter the phase in degrees.',
  min: 0,
  minInclusive: true,
  max: 360,
  maxInclusive: false,
  range: 'The phase is from 0 to 359.9 degrees.',
});
const SPEED_RULE = typedNumber({
  missing: 'Enter the speed in rpm.',
  min: 0,
  minInclusive: false,
  max: 30_000,
  maxInclusive: true,
  range: 'The speed is above 0 and at most 30000 rpm.',
});
const MASS_RULE = typedNumber({
  missing: 'Enter the mass in grams.',
  min: 0,
  minInclusive: false,
  max: 50_000,
  maxInclusive: true,
  range: 'The mass is above 0 and at most 50000 g.',
});
const ANGLE_RULE = typedNumber({
  missing: 'Enter the angle in degrees.',
  min: 0,
  minInclusive: true,
  max: 360,
  maxInclusive: false,
  range: 'The angle is from 0 to 359.9 degrees.',
});

/** What the repeats of one sensor typed so far come to, as the server will work it out. */
export interface SensorSummary {
  readonly sensorSide: MachineSide;
  /** How many repeats have an amplitude and a phase (only an amplitude, read without phase) that read as numbers. */
  readonly counted: number;
  /**
   * The vector average (the plain mean of the amplitudes, phase null, read without phase), the spread and
   * whether it is trusted; null before a repeat can be counted.
   */
  readonly average: {
    readonly amplitude: number;
    readonly phaseDeg: number | null;
    readonly spread: number;
    /** The spread as a fraction of the average's amplitude; null when the average is nought. */
    readonly spreadRatio: number | null;
    readonly trusted: boolean;
  } | null;
  /** The mean of the speeds typed, in rpm; null before one is. */
  readonly speedRpm: number | null;
}

/**
 * Averages the repeats of a sensor that read as numbers, with the engine the server uses: as vectors, or
 * for a run read without phase as the plain mean of the amplitudes.
 */
export function summariseRepeats(
  sensorSide: MachineSide,
  repeats: readonly { amplitude?: string; phaseDeg?: string; speedRpm?: string }[],
  amplitudeOnly = false,
): SensorSummary {
  const speeds = repeats
    .map((repeat) => parseTypedNumber(repeat.speedRpm))
    .filter((speed): speed is number => speed !== null && speed > 0);
  const speedRpm = speeds.length > 0 ? speeds.reduce((sum, speed) => sum + speed, 0) / speeds.length : null;
  if (amplitudeOnly) {
    const amplitudes = repeats
      .map((repeat) => parseTypedNumber(repeat.amplitude))
      .filter((amplitude): amplitude is number => amplitude !== null && amplitude >= 0 && amplitude <= 1000);
    if (amplitudes.length === 0) return { sensorSide, counted: 0, average: null, speedRpm };
    const result = averageAmplitudes({ amplitudes, maxSpreadRatio: MAX_SPREAD_RATIO });
    return {
      sensorSide,
      counted: amplitudes.length,
      average: {
        amplitude: result.mean,
        phaseDeg: null,
        spread: result.spread,
        spreadRatio: Number.isFinite(result.spreadRatio) ? result.spreadRatio : null,
        trusted: result.trusted,
      },
      speedRpm,
    };
  }
  const readings = repeats
    .map((repeat) => ({
      amplitude: parseTypedNumber(repeat.amplitude),
      phaseDeg: parseTypedNumber(repeat.phaseDeg),
    }))
    .filter(
      (reading): reading is { amplitude: number; phaseDeg: number } =>
        reading.amplitude !== null &&
        reading.amplitude >= 0 &&
        reading.phaseDeg !== null &&
        reading.phaseDeg >= 0 &&
        reading.phaseDeg < 360,
    );
  if (readings.length === 0) return { sensorSide, counted: 0, average: null, speedRpm };
  const result = averageReadings({ readings, maxSpreadRatio: MAX_SPREAD_RATIO });
  return {
    sensorSide,
    counted: readings.length,
    average: {
      amplitude: result.mean.amplitude,
      phaseDeg: result.mean.phaseDeg,
      spread: result.spread,
      spreadRatio: Number.isFinite(result.spreadRatio) ? result.spreadRatio : null,
      trusted: result.trusted,
    },
    speedRpm,
  };
}

function repeatForm(withPhase = true): RepeatForm {
  return new FormGroup({
    amplitude: new FormControl('', { nonNullable: true, validators: AMPLITUDE_RULE }),
    // Read without phase, the field is disabled: it neither checks nor goes to the server.
    phaseDeg: new FormControl(
      { value: '', disabled: !withPhase },
      { nonNullable: true, validators: PHASE_RULE },
    ),
    speedRpm: new FormControl('', { nonNullable: true, validators: SPEED_RULE }),
  });
}

function typed(value: number): string {
  return String(value);
}

/**
 * The form of one run of a job: for each sensor of the set-up, the repeats read off the meter (amplitude in
 * the set-up's unit, phase as the instrument counts it, speed), averaged as vectors while they are typed with
 * the engine the server uses, and a warning when they disagree; a trial run also names its trial weight. What
 * is typed stays on the device until the server stores the run; the server's word on a field lands on it.
 * When the phase cannot be read, the run is typed as amplitude only (a toggle, or the page decides with
 * `amplitudeOnly`): the phase fields go, the repeats are sent without phase and average as a plain mean.
 *
 * `<app-run-entry [job]="job" kind="trial" [machine]="machine" (saved)="..." />`
 */
@Component({
  selector: 'app-run-entry',
  imports: [
    BusyButton,
    ErrorBanner,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  templateUrl: './run-entry.html',
  styleUrl: './run-entry.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RunEntry {
  /** The job the run belongs to; its set-up names the sensors and the unit. */
  readonly job = input.required<Job>();
  /** The kind of run typed here. */
  readonly kind = input.required<RunKind>();
  /** The job's machine, for the names of its planes; undefined while it is fetched. */
  readonly machine = input<Machine | undefined>(undefined);
  /** A stored run to start from (its repeats typed in again), when its readings are being corrected. */
  readonly prefill = input<JobRun | undefined>(undefined);
  /** The draft's key; `run-<kind>` unless the page names another. */
  readonly draftKey = input<string | undefined>(undefined);
  /** How the save line names this change; "Readings of the <kind> run" unless the page names another. */
  readonly what = input<string | undefined>(undefined);
  /** What the save button says. */
  readonly saveLabel = input<string | undefined>(undefined);
  /**
   * How the run is stored; by default it is added to the job (`addRun`). A page that corrects a stored run
   * passes its own change.
   */
  readonly store = input<((run: AddRun) => JobChange) | undefined>(undefined);
  /**
   * Whether the run is read without phase, when the page decides it (the correction step's amplitude-only
   * runs); left out, the technician chooses with a toggle.
   */
  readonly amplitudeOnly = input<boolean | undefined>(undefined);
  /**
   * A trial weight to start from (the correction step's next position, with the mass of the trial runs
   * before it); a mass left null is typed here.
   */
  readonly trialWeight = input<
    { planeIndex: number; massGrams: number | null; angleDeg: number } | undefined
  >(undefined);
  /** The run as the server stored it. */
  readonly saved = output<JobRun>();

  protected readonly session = inject(JobSession);
  private readonly drafts = inject(JobDrafts);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly sideLabels = SIDE_LABELS;
  protected readonly formatNumber = formatNumber;
  protected readonly formatDeg = formatDeg;
  protected readonly maxSpreadPercent = MAX_SPREAD_RATIO * 100;

  protected readonly form: RunForm = new FormGroup({
    amplitudeOnly: new FormControl(false, { nonNullable: true }),
    trialWeight: new FormGroup({
      planeIndex: new FormControl<number | null>(null, { validators: Validators.required }),
      massGrams: new FormControl('', { nonNullable: true, validators: MASS_RULE }),
      angleDeg: new FormControl('', { nonNullable: true, validators: ANGLE_RULE }),
    }),
    readings: new FormArray<ReadingForm>([]),
  });

  /** The form's value, as a signal for the averages. */
  private readonly value = signal(this.form.getRawValue());
  /** The sentence for what the server refused that no field could show. */
  protected readonly formError = signal<string | null>(null);

  protected readonly sensors = computed(() => this.job().setup?.sensors ?? []);
  protected readonly unit = computed(() => {
    const unit = this.job().setup?.amplitudeUnit;
    return unit ? AMPLITUDE_UNIT_LABELS[unit] : '';
  });
  protected readonly phaseSense = computed(() => (this.job().setup?.phaseSense === 'lead' ? 'lead' : 'lag'));
  /** The draft's key, which also names the form's fields (two forms on a page never share an id). */
  protected readonly key = computed(() => this.draftKey() ?? `run-${this.kind()}`);
  protected readonly kindLabel = computed(() => RUN_KIND_LABELS[this.kind()]);
  protected readonly planes = computed(() => {
    const count = planeCountOf(this.job(), this.machine());
    return Array.from({ length: count }, (_, index) => ({ index, name: planeName(index, count) }));
  });
  /** Whether this run is read without phase: as the page says, else as the toggle stands. */
  protected readonly noPhase = computed(() => this.amplitudeOnly() ?? this.value().amplitudeOnly);
  /** Each sensor's average and spread of the repeats typed so far. */
  protected readonly summaries = computed(() =>
    this.value().readings.map((reading) =>
      summariseRepeats(reading.sensorSide, reading.repeats, this.noPhase()),
    ),
  );
  protected readonly buttonLabel = computed(
    () => this.saveLabel() ?? `Save the ${this.kindLabel().toLowerCase()}`,
  );

  constructor() {
    this.form.valueChanges.subscribe(() => this.value.set(this.form.getRawValue()));
    this.form.controls.amplitudeOnly.valueChanges.subscribe(() => this.applyPhaseMode());
    // Built once the inputs are known: the sensors of the set-up, the kind, the draft or the run to correct.
    effect(() => {
      const job = this.job();
      const kind = this.kind();
      const prefill = this.prefill();
      const key = this.key();
      untracked(() => this.build(job, kind, prefill, key));
    });
  }

  private built = false;

  private build(job: Job, kind: RunKind, prefill: JobRun | undefined, key: string): void {
    if (this.built) return;
    this.built = true;
    if (kind !== 'trial') this.form.controls.trialWeight.disable({ emitEvent: false });
    const sensors = job.setup?.sensors ?? [];
    const draft = this.drafts.read<RunDraft>(job.id, key);
    const readings = this.form.controls.readings;
    sensors.forEach((sensor, index) => {
      const stored = prefill?.readings.find((reading) => reading.sensorSide === sensor.side);
      const count = Math.max(1, draft?.readings?.[index]?.repeats?.length ?? stored?.repeats.length ?? 1);
      const repeats = new FormArray(Array.from({ length: count }, () => repeatForm()));
      stored?.repeats.forEach((repeat, at) =>
        repeats.at(at)?.setValue({
          amplitude: typed(repeat.amplitude),
          phaseDeg: repeat.phaseDeg === undefined ? '' : typed(repeat.phaseDeg),
          speedRpm: typed(repeat.speedRpm),
        }),
      );
      readings.push(
        new FormGroup({
          sensorSide: new FormControl(sensor.side, { nonNullable: true }),
          repeats,
        }),
        { emitEvent: false },
      );
    });
    // A run typed again keeps its way of reading; a new one starts as the job's last run was read.
    const readWithoutPhase = prefill
      ? prefill.amplitudeOnly === true
      : job.runs.at(-1)?.amplitudeOnly === true;
    if (readWithoutPhase) this.form.controls.amplitudeOnly.setValue(true, { emitEvent: false });
    const start = this.trialWeight();
    if (start && kind === 'trial' && !prefill) {
      this.form.controls.trialWeight.setValue({
        planeIndex: start.planeIndex,
        massGrams: start.massGrams === null ? '' : typed(start.massGrams),
        angleDeg: typed(start.angleDeg),
      });
    }
    if (prefill?.trialWeight && kind === 'trial') {
      this.form.controls.trialWeight.setValue({
        planeIndex: prefill.trialWeight.planeIndex,
        massGrams: typed(prefill.trialWeight.massGrams),
        angleDeg: typed(prefill.trialWeight.angleDeg),
      });
    }
    this.drafts.keep(this.form, job.id, key, this.destroyRef);
    this.applyPhaseMode();
    this.value.set(this.form.getRawValue());
  }

  /** Enables the phase fields for a run read with phase, disables them (no check, not sent) without. */
  private applyPhaseMode(): void {
    const noPhase = this.amplitudeOnly() ?? this.form.controls.amplitudeOnly.value;
    for (const reading of this.form.controls.readings.controls) {
      for (const repeat of reading.controls.repeats.controls) {
        const phase = repeat.controls.phaseDeg;
        if (noPhase && phase.enabled) phase.disable({ emitEvent: false });
        if (!noPhase && phase.disabled) phase.enable({ emitEvent: false });
      }
    }
    this.value.set(this.form.getRawValue());
  }

  protected repeatsOf(sensorIndex: number): FormArray<RepeatForm> {
    return this.form.controls.readings.at(sensorIndex).controls.repeats;
  }

  /** Adds an empty repeat to a sensor and puts the cursor in its amplitude. */
  protected addRepeat(sensorIndex: number): void {
    const repeats = this.repeatsOf(sensorIndex);
    repeats.push(repeatForm(!this.noPhase()));
    this.focusLater(`#${this.fieldId(sensorIndex, repeats.length - 1, 'amplitude')}`);
  }

  /** Removes a repeat (a sensor keeps at least one) and keeps the cursor nearby. */
  protected removeRepeat(sensorIndex: number, repeatIndex: number): void {
    const repeats = this.repeatsOf(sensorIndex);
    if (repeats.length <= 1) return;
    repeats.removeAt(repeatIndex);
    this.focusLater(`#${this.key()}-add-repeat-${sensorIndex}`);
  }

  /** The id of a repeat's field, for labels and focus. */
  protected fieldId(sensorIndex: number, repeatIndex: number, field: string): string {
    return `${this.key()}-s${sensorIndex}-r${repeatIndex}-${field}`;
  }

  /** A field's message: the server's word on it, else the rule it breaks. */
  protected errorOf(control: AbstractControl): string {
    const errors = control.errors ?? {};
    if (typeof errors['server'] === 'string') return errors['server'];
    if (typeof errors['message'] === 'string') return errors['message'];
    if (errors['required']) return 'Choose the plane of the trial weight.';
    return '';
  }

  /** The run as the server takes it; only called on a valid form. */
  private runOf(): AddRun {
    const value = this.form.getRawValue();
    const run: AddRun = {
      kind: this.kind(),
      readings: value.readings.map((reading) => ({
        sensorSide: reading.sensorSide,
        repeats: reading.repeats.map((repeat) => ({
          amplitude: parseTypedNumber(repeat.amplitude) as number,
          ...(this.noPhase() ? {} : { phaseDeg: parseTypedNumber(repeat.phaseDeg) as number }),
          speedRpm: parseTypedNumber(repeat.speedRpm) as number,
        })),
      })),
    };
    if (this.kind() === 'trial') {
      run.trialWeight = {
        planeIndex: value.trialWeight.planeIndex as number,
        massGrams: parseTypedNumber(value.trialWeight.massGrams) as number,
        angleDeg: parseTypedNumber(value.trialWeight.angleDeg) as number,
      };
    }
    return run;
  }

  protected async submit(): Promise<void> {
    this.formError.set(null);
    if (this.session.busy()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      this.focusLater('input.ng-invalid, mat-select.ng-invalid');
      return;
    }
    const run = this.runOf();
    const job = this.job();
    const key = this.key();
    const before = new Set(job.runs.map((stored) => stored.id));
    const store = this.store();
    const outcome = await this.session.save(
      this.what() ?? `Readings of the ${this.kindLabel().toLowerCase()}`,
      store ? store(run) : (api, id, etag) => api.addRun(id, run, etag),
    );
    if (outcome.ok) {
      this.drafts.clear(job.id, key);
      const stored =
        outcome.job.runs.find((candidate) => !before.has(candidate.id)) ??
        [...outcome.job.runs].sort((a, b) => b.sequence - a.sequence)[0];
      if (stored) this.saved.emit(stored);
      return;
    }
    this.formError.set(formErrorOf(this.form, outcome.error));
    this.focusLater(this.formError() ? '.run-entry__error' : 'input.ng-invalid, mat-select.ng-invalid');
  }

  private focusLater(selector: string): void {
    // After the next render, so that the field just added (or the message just shown) is there.
    setTimeout(() => {
      const element = this.host.nativeElement.querySelector<HTMLElement>(selector);
      element?.focus();
    });
  }
}
