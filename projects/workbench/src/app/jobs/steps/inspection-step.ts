import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  ElementRef,
  inject,
  input,
  type OnInit,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MAT_FORM_FIELD_DEFAULT_OPTIONS, MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { COMMON_PRACTICE_INSPECTION_LIMITS_IN } from '@counterpoise/engine';
import { AuthSession } from '../../auth/auth-session';
import { BusyButton } from '../../forms/busy-button';
import { ErrorBanner } from '../../forms/error-banner';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import { FORM_FIELD_OPTIONS } from '../../records/record-form';
import { formatNumber } from '../../records/record-labels';
import {
  maxChars,
  numberOrNull,
  numberWithin,
  RECORD_RULES,
  requiredNumber,
} from '../../records/record-rules';
import { formErrorOf } from '../../shell/server-errors';
import { errorMessage } from '../../shell/validators';
import { JobDrafts } from '../job-drafts';
import { JobSession } from '../job-session';
import { PhotoGallery } from '../../photos/photo-gallery';
import type { Job, RecordInspection } from '../jobs.api';
import { askForReason } from '../reason-dialog';
import { focusFirstInvalid } from './step-forms';
import type { AppIconName } from '../../icons/app-icons';

/** The outcome of one visual check. */
export type CheckOutcome = RecordInspection['checks'][keyof RecordInspection['checks']];
/** The visual checks of the inspection, by their keys in the API. */
export type VisualCheck = keyof RecordInspection['checks'];
/** The inspection's limits in mm, as the server judges with them. */
export type InspectionLimitsMm = NonNullable<Job['inspection']>['limits'];

/** The visual checks in the order a technician walks round the rotor, with what each looks at. */
export const VISUAL_CHECKS: readonly {
  readonly key: VisualCheck;
  readonly label: string;
  readonly hint: string;
}[] = [
  {
    key: 'teethOrKnives',
    label: 'Teeth or knives',
    hint: 'None missing, broken or worn unevenly; holders and bolts tight',
  },
  {
    key: 'buildUpCleaned',
    label: 'Build-up cleaned',
    hint: 'Wrapped material and caked debris removed from the rotor',
  },
  { key: 'welds', label: 'Welds', hint: 'No cracks at the holders, end plates or old weights' },
  { key: 'beltsAndPulleys', label: 'Belts and pulleys', hint: 'Belts tight, pulleys not worn or loose' },
];

/** The outcomes a check can have, with the words and icons of its toggle buttons. */
export const CHECK_OUTCOMES: readonly {
  readonly value: CheckOutcome;
  readonly label: string;
  readonly icon: AppIconName;
}[] = [
  { value: 'ok', label: 'OK', icon: 'check_circle' },
  { value: 'fixed', label: 'Fixed', icon: 'build' },
  { value: 'fault', label: 'Fault left', icon: 'report' },
];

const MM_PER_IN = 25.4;

/**
 * The limits the server uses for a machine without a family: the engine's common-practice limits in inches,
 * converted to mm as the server converts them.
 */
export const COMMON_PRACTICE_LIMITS_MM: InspectionLimitsMm = {
  bearingEndPlayMm: COMMON_PRACTICE_INSPECTION_LIMITS_IN.bearingEndPlay * MM_PER_IN,
  shaftRunoutMm: COMMON_PRACTICE_INSPECTION_LIMITS_IN.stubShaftRunout * MM_PER_IN,
};

const NOTES_MAX = 2000;

function checkControl(): FormControl<CheckOutcome | null> {
  return new FormControl<CheckOutcome | null>(null, {
    validators: requiredNumber('Choose OK, fixed or fault left.'),
  });
}

/**
 * Step 2 of a job: bearing end play and shaft runout against their limits (the family's, or common practice
 * without a family), and the visual checks, each OK, fixed or a fault left. The server judges it: a limit
 * over or a fault left puts the job on hold, shown here with the reasons; a re-measure after the repair
 * opens it again, or a manager lets it go on with a reason that stays with the job.
 */
@Component({
  selector: 'app-job-inspection-step',
  imports: [
    BusyButton,
    DatePipe,
    ErrorBanner,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    PhotoGallery,
    ReactiveFormsModule,
  ],
  templateUrl: './inspection-step.html',
  styleUrl: './inspection-step.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [{ provide: MAT_FORM_FIELD_DEFAULT_OPTIONS, useValue: FORM_FIELD_OPTIONS }],
})
export class JobInspectionStep implements OnInit {
  readonly job = input.required<Job>();
  readonly family = input<MachineFamily>();
  readonly editable = input(false);

  protected readonly session = inject(JobSession);
  private readonly auth = inject(AuthSession);
  private readonly dialog = inject(MatDialog);
  private readonly drafts = inject(JobDrafts);
  private readonly destroyRef = inject(DestroyRef);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  protected readonly checks = VISUAL_CHECKS;
  protected readonly outcomes = CHECK_OUTCOMES;
  protected readonly errorMessage = errorMessage;
  protected readonly formatNumber = formatNumber;
  protected readonly notesMax = NOTES_MAX;

  protected readonly form = new FormGroup({
    bearingEndPlayMm: new FormControl<number | null>(null, [
      requiredNumber('Enter the bearing end play in mm.'),
      numberWithin(
        { min: 0, max: RECORD_RULES.maxEndPlayMm },
        `The end play is from 0 to ${RECORD_RULES.maxEndPlayMm} mm.`,
      ),
    ]),
    shaftRunoutMm: new FormControl<number | null>(null, [
      requiredNumber('Enter the shaft runout in mm.'),
      numberWithin(
        { min: 0, max: RECORD_RULES.maxRunoutMm },
        `The runout is from 0 to ${RECORD_RULES.maxRunoutMm} mm.`,
      ),
    ]),
    checks: new FormGroup({
      teethOrKnives: checkControl(),
      buildUpCleaned: checkControl(),
      welds: checkControl(),
      beltsAndPulleys: checkControl(),
    }),
    notes: new FormControl('', {
      nonNullable: true,
      validators: maxChars(NOTES_MAX, `Keep the notes to ${NOTES_MAX} characters.`),
    }),
  });
  /** The form's value as a signal, for the verdicts beside the fields. */
  protected readonly value = signal(this.form.getRawValue());
  protected readonly formError = signal<string | null>(null);
  /** True once the person has tried to store: the unanswered checks show their message. */
  protected readonly submitted = signal(false);

  protected readonly inspection = computed(() => this.job().inspection);
  protected readonly onHold = computed(() => this.job().status === 'on-hold');
  protected readonly canDecide = computed(() => this.editable() && this.auth.can('jobs:write-any'));
  /** Photos of the rotor as found are added by the job's technician or a manager, whatever the step. */
  protected readonly canAddPhotos = computed(
    () =>
      this.auth.can('jobs:write-any') ||
      (this.auth.can('jobs:write') && this.job().technician.id === this.auth.user()?.id),
  );
  /** The form is open before the first measure, and again while the job is on hold (after a repair). */
  protected readonly formOpen = computed(
    () => this.editable() && (this.inspection() === null || this.onHold()),
  );

  /**
   * The limits a new measure is judged against, and where they come from: the family's, common practice
   * without a family, or (while the family is still loading) those the server used last time.
   */
  protected readonly limits = computed<{ limits: InspectionLimitsMm; source: string } | null>(() => {
    const family = this.family();
    if (family) return { limits: family.inspectionLimits, source: `the limits of ${family.name}` };
    if (this.job().machine.familyId === null) {
      return {
        limits: COMMON_PRACTICE_LIMITS_MM,
        source: 'common-practice limits (the machine has no family)',
      };
    }
    const stored = this.inspection();
    return stored ? { limits: stored.limits, source: 'the limits of the last measure' } : null;
  });

  /** Whether a typed measure is within its limit (the server's rule: at most the limit); null before it is typed. */
  protected readonly endPlayWithin = computed(() =>
    this.within(this.value().bearingEndPlayMm, this.limits()?.limits.bearingEndPlayMm),
  );
  protected readonly runoutWithin = computed(() =>
    this.within(this.value().shaftRunoutMm, this.limits()?.limits.shaftRunoutMm),
  );

  ngOnInit(): void {
    const restored = this.drafts.keep(this.form, this.job().id, 'inspection', this.destroyRef);
    const stored = this.inspection();
    if (!restored && stored) {
      // Re-measuring after a repair starts from the last measure: the person changes what was repaired.
      this.form.reset(
        {
          bearingEndPlayMm: stored.bearingEndPlayMm,
          shaftRunoutMm: stored.shaftRunoutMm,
          checks: stored.checks,
          notes: stored.notes ?? '',
        },
        { emitEvent: false },
      );
    }
    this.value.set(this.form.getRawValue());
    this.form.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(() => this.value.set(this.form.getRawValue()));
  }

  protected checkLabel(key: VisualCheck): string {
    return VISUAL_CHECKS.find((check) => check.key === key)?.label ?? key;
  }

  protected outcomeLabel(outcome: CheckOutcome): string {
    return CHECK_OUTCOMES.find((option) => option.value === outcome)?.label ?? outcome;
  }

  protected async record(): Promise<void> {
    this.formError.set(null);
    this.submitted.set(true);
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      focusFirstInvalid(this.host.nativeElement);
      return;
    }
    const value = this.form.getRawValue();
    const notes = value.notes.trim();
    const inspection: RecordInspection = {
      bearingEndPlayMm: numberOrNull(value.bearingEndPlayMm)!,
      shaftRunoutMm: numberOrNull(value.shaftRunoutMm)!,
      checks: {
        teethOrKnives: value.checks.teethOrKnives!,
        buildUpCleaned: value.checks.buildUpCleaned!,
        welds: value.checks.welds!,
        beltsAndPulleys: value.checks.beltsAndPulleys!,
      },
      ...(notes === '' ? {} : { notes }),
    };
    const outcome = await this.session.save('Inspection', (api, id, etag) =>
      api.recordInspection(id, inspection, etag),
    );
    if (outcome.ok) {
      this.drafts.clear(outcome.job.id, 'inspection');
      this.submitted.set(false);
      this.form.markAsPristine();
    } else {
      this.formError.set(formErrorOf(this.form, outcome.error));
    }
  }

  /** A manager lets the job go on without the repair, giving the reason the report keeps. */
  protected letGoOn(): void {
    const inspection = this.inspection();
    if (!inspection) return;
    askForReason(this.dialog, {
      title: 'Let the job go on?',
      message:
        'The job goes on to the set-up with the inspection as measured. Your reason is kept with the inspection and printed on the report.',
      label: 'Why the job may go on',
      confirm: 'Let the job go on',
    }).subscribe((reason) => {
      if (!reason) return;
      void this.session
        .save('Decision on the inspection', (api, id, etag) => api.overrideInspection(id, reason, etag))
        .then((outcome) => {
          if (!outcome.ok) this.formError.set(formErrorOf(this.form, outcome.error));
        });
    });
  }

  private within(measured: number | null, limit: number | undefined): boolean | null {
    const value = numberOrNull(measured);
    if (value === null || limit === undefined || value < 0) return null;
    return value <= limit;
  }
}
