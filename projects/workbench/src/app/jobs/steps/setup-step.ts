import { BreakpointObserver } from '@angular/cdk/layout';
import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  ElementRef,
  effect,
  inject,
  input,
  type OnInit,
  signal,
  untracked,
} from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  FormControl,
  FormGroup,
  ReactiveFormsModule,
  type ValidationErrors,
} from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_FORM_FIELD_DEFAULT_OPTIONS, MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import type { AcceptanceLevel, AmplitudeUnit, MachineSide } from '@counterpoise/api';
import { map } from 'rxjs';
import { BusyButton } from '../../forms/busy-button';
import { ErrorBanner } from '../../forms/error-banner';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import type { Machine } from '../../machines/machines.api';
import { FORM_FIELD_OPTIONS } from '../../records/record-form';
import {
  AMPLITUDE_UNIT_LABELS,
  formatNumber,
  opposite,
  type RotationDirection,
  ROTATION_LABELS,
  SIDE_LABELS,
} from '../../records/record-labels';
import {
  maxChars,
  numberOrNull,
  numberWithin,
  RECORD_RULES,
  requiredNumber,
} from '../../records/record-rules';
import { applyServerErrors, httpErrorMessage, problemOf } from '../../shell/server-errors';
import { errorMessage } from '../../shell/validators';
import { JobDrafts } from '../job-drafts';
import { JobSession } from '../job-session';
import type { Job, RecordSetup } from '../jobs.api';
import { focusFirstInvalid } from './step-forms';

/** How the instrument's phase counts. */
export type PhaseSense = RecordSetup['phaseSense'];
/** How weight angles are counted from the reference mark. */
export type WeightAngles = RecordSetup['weightAngles'];

/** The two ways a meter counts phase, in plain words. */
export const PHASE_SENSE_OPTIONS: readonly { value: PhaseSense; label: string; explanation: string }[] = [
  {
    value: 'lag',
    label: 'Lag (the usual)',
    explanation:
      'The meter’s phase is how far the rotor turns from the moment the reference mark passes the tachometer until the vibration peaks.',
  },
  {
    value: 'lead',
    label: 'Lead',
    explanation:
      'The meter counts the same angle the other way round, as a lead on the reference mark. Counterpoise turns it into a lag for the calculations.',
  },
];

/** The two ways weight angles are counted, in plain words. */
export const WEIGHT_ANGLE_OPTIONS: readonly { value: WeightAngles; label: string; explanation: string }[] = [
  {
    value: 'againstRotation',
    label: 'Against rotation',
    explanation:
      'A weight at 90° sits a quarter turn from the reference mark, counted the opposite way to the rotor’s turning.',
  },
  {
    value: 'withRotation',
    label: 'With rotation',
    explanation:
      'A weight at 90° sits a quarter turn from the reference mark, counted the way the rotor turns.',
  },
];

const SIDES: readonly MachineSide[] = ['left', 'right'];
/** Below this width the two directions of rotation stand one under the other, their words whole. */
const NARROW = '(max-width: 599.98px)';
const TEXT_MAX = 200;

/** The unit an acceptance level is read in, if it names one: a shop target's, or mm/s RMS for a severity zone. */
export function unitOfAcceptance(level: AcceptanceLevel | null | undefined): AmplitudeUnit | null {
  if (!level) return null;
  if (level.kind === 'shop-target') return level.unit;
  if (level.kind === 'severity-zone') return 'mm/s-rms';
  return null;
}

function sensorGroup() {
  return new FormGroup({
    used: new FormControl(false, { nonNullable: true }),
    position: new FormControl('', {
      nonNullable: true,
      validators: maxChars(TEXT_MAX, `Keep the position to ${TEXT_MAX} characters.`),
    }),
  });
}

/** At least one side carries a sensor. */
function someSensor(group: AbstractControl): ValidationErrors | null {
  const value = group.value as Record<MachineSide, { used: boolean }>;
  return SIDES.some((side) => value[side]?.used) ? null : { required: 'Place at least one sensor.' };
}

function setupForm() {
  return new FormGroup({
    sensors: new FormGroup({ left: sensorGroup(), right: sensorGroup() }, { validators: someSensor }),
    tachometer: new FormControl('', {
      nonNullable: true,
      validators: maxChars(TEXT_MAX, `Keep the tachometer note to ${TEXT_MAX} characters.`),
    }),
    referenceMark: new FormControl('', {
      nonNullable: true,
      validators: maxChars(TEXT_MAX, `Keep the reference mark to ${TEXT_MAX} characters.`),
    }),
    rotationSeenFromLeft: new FormControl<RotationDirection>('clockwise', { nonNullable: true }),
    operatingSpeedRpm: new FormControl<number | null>(null, [
      requiredNumber('Enter the operating speed in rpm.'),
      numberWithin(
        { above: 0, max: RECORD_RULES.maxSpeedRpm },
        `The speed is above 0 and at most ${RECORD_RULES.maxSpeedRpm} rpm.`,
      ),
    ]),
    amplitudeUnit: new FormControl<AmplitudeUnit>('in/s-pk', { nonNullable: true }),
    phaseSense: new FormControl<PhaseSense>('lag', { nonNullable: true }),
    weightAngles: new FormControl<WeightAngles>('againstRotation', { nonNullable: true }),
  });
}
type SetupForm = ReturnType<typeof setupForm>;
type SetupValue = ReturnType<SetupForm['getRawValue']>;

/**
 * Step 3 of a job: the instrument and where it sits. The sensors and their sides, the tachometer and the
 * reference mark, the rotation, speed and unit start from the machine's record; how the meter counts phase
 * and how weight angles are counted are said in plain words. Sensors that do not fit the machine's planes
 * are warned about, not refused. Once a run is read the set-up is fixed, and shown read-only.
 */
@Component({
  selector: 'app-job-setup-step',
  imports: [
    BusyButton,
    DatePipe,
    ErrorBanner,
    MatButtonToggleModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  templateUrl: './setup-step.html',
  styleUrl: './setup-step.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [{ provide: MAT_FORM_FIELD_DEFAULT_OPTIONS, useValue: FORM_FIELD_OPTIONS }],
})
export class JobSetupStep implements OnInit {
  readonly job = input.required<Job>();
  readonly machine = input<Machine>();
  /** The machine's family, whose acceptance level may name the unit when the machine's own does not. */
  readonly family = input<MachineFamily>();
  readonly editable = input(false);

  protected readonly session = inject(JobSession);
  private readonly drafts = inject(JobDrafts);
  private readonly destroyRef = inject(DestroyRef);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  protected readonly sides = SIDES;
  protected readonly sideLabels = SIDE_LABELS;
  protected readonly rotationLabels = ROTATION_LABELS;
  protected readonly unitLabels = AMPLITUDE_UNIT_LABELS;
  protected readonly phaseOptions = PHASE_SENSE_OPTIONS;
  protected readonly angleOptions = WEIGHT_ANGLE_OPTIONS;
  protected readonly errorMessage = errorMessage;
  protected readonly formatNumber = formatNumber;

  protected readonly narrow = toSignal(
    inject(BreakpointObserver)
      .observe(NARROW)
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );

  protected readonly form = setupForm();
  protected readonly value = signal<SetupValue>(this.form.getRawValue());
  protected readonly formError = signal<string | null>(null);
  /** Whether the form holds the person's own values (a draft, a stored set-up, or typing) over the defaults. */
  private readonly ownValues = signal(false);

  protected readonly stored = computed(() => this.job().setup);
  /** Runs are read with the stored set-up: the server refuses a change from then on. */
  protected readonly fixed = computed(() => this.job().runs.length > 0);
  protected readonly formOpen = computed(() => this.editable() && !this.fixed());

  /** The unit the machine's (or its family's) acceptance level is read in, with where it comes from. */
  protected readonly unitDefault = computed<{ unit: AmplitudeUnit; from: string }>(() => {
    const machineUnit = unitOfAcceptance(this.machine()?.acceptance);
    if (machineUnit) return { unit: machineUnit, from: 'the machine’s acceptance level' };
    const familyUnit = unitOfAcceptance(this.family()?.acceptance);
    if (familyUnit) return { unit: familyUnit, from: 'the family’s acceptance level' };
    return { unit: 'in/s-pk', from: '' };
  });

  /** Warnings on sensors that do not fit the machine: they do not stop the set-up. */
  protected readonly warnings = computed(() => {
    const machine = this.machine();
    const sensors = this.value().sensors;
    const used = SIDES.filter((side) => sensors[side].used);
    if (!machine || used.length === 0) return [];
    const warnings: string[] = [];
    if (machine.planes.length === 2 && used.length < 2) {
      warnings.push(
        `This rotor has two correction planes, and two-plane correction needs a sensor on each side. With the ${SIDE_LABELS[used[0]!].toLowerCase()} sensor alone, only one plane can be corrected at a time.`,
      );
    }
    const expected = machine.sensorSides;
    // Said once: the planes' warning already names the missing side.
    if (
      warnings.length === 0 &&
      expected.length > 0 &&
      (expected.length !== used.length || expected.some((side) => !used.includes(side)))
    ) {
      warnings.push(
        `The machine’s record has sensors on ${expected.map((side) => `the ${side} side`).join(' and ')}: check that the readings will match earlier jobs.`,
      );
    }
    return warnings;
  });

  protected readonly seenFromRight = computed(() =>
    ROTATION_LABELS[opposite(this.value().rotationSeenFromLeft)].toLowerCase(),
  );

  constructor() {
    // The machine's record arrives after the step opens: its defaults fill the form unless the person's own
    // values are in it.
    effect(() => {
      const machine = this.machine();
      const unit = this.unitDefault();
      if (!machine) return;
      untracked(() => {
        if (this.ownValues() || this.form.dirty) return;
        this.fill({
          sensors: {
            left: { used: machine.sensorSides.includes('left'), position: '' },
            right: { used: machine.sensorSides.includes('right'), position: '' },
          },
          tachometer: '',
          referenceMark: '',
          rotationSeenFromLeft: machine.rotationSeenFromLeft,
          operatingSpeedRpm: machine.operatingSpeedRpm,
          amplitudeUnit: unit.unit,
          phaseSense: 'lag',
          weightAngles: 'againstRotation',
        });
      });
    });
  }

  ngOnInit(): void {
    const restored = this.drafts.keep(this.form, this.job().id, 'setup', this.destroyRef);
    const stored = this.stored();
    if (restored) {
      this.ownValues.set(true);
    } else if (stored) {
      this.fill({
        sensors: {
          left: sensorValue(stored.sensors, 'left'),
          right: sensorValue(stored.sensors, 'right'),
        },
        tachometer: stored.tachometer,
        referenceMark: stored.referenceMark,
        rotationSeenFromLeft: stored.rotationSeenFromLeft,
        operatingSpeedRpm: stored.operatingSpeedRpm,
        amplitudeUnit: stored.amplitudeUnit,
        phaseSense: stored.phaseSense,
        weightAngles: stored.weightAngles,
      });
      this.ownValues.set(true);
    }
    this.value.set(this.form.getRawValue());
    this.form.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(() => this.value.set(this.form.getRawValue()));
  }

  protected phaseExplanation(sense: PhaseSense): string {
    return PHASE_SENSE_OPTIONS.find((option) => option.value === sense)?.explanation ?? '';
  }

  protected angleExplanation(angles: WeightAngles): string {
    return WEIGHT_ANGLE_OPTIONS.find((option) => option.value === angles)?.explanation ?? '';
  }

  protected phaseLabel(sense: PhaseSense): string {
    return PHASE_SENSE_OPTIONS.find((option) => option.value === sense)?.label ?? sense;
  }

  protected angleLabel(angles: WeightAngles): string {
    return WEIGHT_ANGLE_OPTIONS.find((option) => option.value === angles)?.label ?? angles;
  }

  protected async record(): Promise<void> {
    this.formError.set(null);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      focusFirstInvalid(this.host.nativeElement);
      return;
    }
    const setup = setupRequest(this.form.getRawValue());
    const outcome = await this.session.save('Set-up', (api, id, etag) => api.recordSetup(id, setup, etag));
    if (outcome.ok) {
      this.drafts.clear(outcome.job.id, 'setup');
      this.form.markAsPristine();
    } else {
      this.formError.set(this.placeErrors(outcome.error, setup));
    }
  }

  /**
   * Puts the server's messages on their fields: a sensor's path names its place in the list sent, which is
   * its side's group here. Returns the sentence for the form as a whole, or null.
   */
  private placeErrors(error: unknown, sent: RecordSetup): string | null {
    const problem = problemOf(error);
    if (!problem?.errors?.length) return httpErrorMessage(error);
    const errors = problem.errors.map(({ path, message }) => {
      const name = path
        .replace(/^[/$.]+/, '')
        .replace(/\[(\d+)\]/g, '.$1')
        .replaceAll('/', '.');
      const sensor = /^sensors\.(\d+)(\..+)?$/.exec(name);
      const side = sensor ? sent.sensors[Number(sensor[1])]?.side : undefined;
      return { path: side ? `sensors.${side}${sensor?.[2] ?? ''}` : name, message };
    });
    const unplaced = applyServerErrors(this.form, { ...problem, errors });
    return unplaced.length > 0 ? unplaced.join(' ') : null;
  }

  private fill(value: SetupValue): void {
    this.form.reset(value, { emitEvent: false });
    this.value.set(this.form.getRawValue());
  }
}

function sensorValue(
  sensors: RecordSetup['sensors'],
  side: MachineSide,
): { used: boolean; position: string } {
  const sensor = sensors.find((candidate) => candidate.side === side);
  return { used: sensor !== undefined, position: sensor?.position ?? '' };
}

/** The set-up as the API takes it: the sensors used, in side order, and the texts trimmed. */
export function setupRequest(value: SetupValue): RecordSetup {
  return {
    sensors: SIDES.filter((side) => value.sensors[side].used).map((side) => ({
      side,
      position: value.sensors[side].position.trim(),
    })),
    tachometer: value.tachometer.trim(),
    referenceMark: value.referenceMark.trim(),
    rotationSeenFromLeft: value.rotationSeenFromLeft,
    operatingSpeedRpm: numberOrNull(value.operatingSpeedRpm)!,
    amplitudeUnit: value.amplitudeUnit,
    phaseSense: value.phaseSense,
    weightAngles: value.weightAngles,
  };
}
