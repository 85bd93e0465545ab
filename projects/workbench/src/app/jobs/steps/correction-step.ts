import { HttpErrorResponse } from '@angular/common/http';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import {
  FormArray,
  FormControl,
  FormGroup,
  type AbstractControl,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import {
  CpCorrectionOverlay,
  type OverlayWeight,
  type RotorPhoto,
} from '@counterpoise/ng/correction-overlay';
import { BusyButton } from '../../forms/busy-button';
import { ErrorBanner } from '../../forms/error-banner';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import type { Machine } from '../../machines/machines.api';
import {
  formatDeg,
  formatNumber,
  opposite,
  planeName,
  planeSide,
  SIDE_LABELS,
} from '../../records/record-labels';
import { formErrorOf, httpErrorMessage, problemOf } from '../../shell/server-errors';
import { JobDrafts } from '../job-drafts';
import { JobSession } from '../job-session';
import { type CorrectionDisagreement, OfflineJobs } from '../../offline/offline-jobs';
import { type Photo, PhotosApi } from '../../photos/photos.api';
import { PhotoUrls } from '../../photos/photo-urls';
import { RunEntry } from '../run-entry';
import type { CorrectionMethod, InstalledWeight, Job, JobCorrection } from '../jobs.api';
import {
  BASIS_WORDS,
  baseRunOf,
  disagreementRows,
  inThePlane,
  METHOD_WORDS,
  methodOptions,
  placePlanned,
  type PlanePlacement,
  refusalText,
  runsUsed,
  unitLabel,
} from './correction-view';
import { planeCountOf } from '../job-labels';

type WeightForm = FormGroup<{
  planeIndex: FormControl<number>;
  massGrams: FormControl<number | null>;
  angleDeg: FormControl<number | null>;
  radiusMm: FormControl<number | null>;
  fixing: FormControl<InstalledWeight['fixing']>;
}>;
type InstalledForm = FormGroup<{ weights: FormArray<WeightForm> }>;

/** A weight as the form holds it, and as the draft keeps it. */
interface WeightDraft {
  planeIndex: number;
  massGrams: number | null;
  angleDeg: number | null;
  radiusMm: number | null;
  fixing: InstalledWeight['fixing'];
}

/** A mass as typed and shown: a tenth of a gram is finer than any scale in a workshop. */
function roundTenth(value: number): number {
  return Math.round(value * 10) / 10;
}

/**
 * Step 5 of a job: the correction. The technician picks a method (each says what it needs and whether the
 * job has it), the server works it out from the stored runs, and the step shows its plan per plane, where
 * it can really go (split onto the plane's free positions, from the shop's stock sizes, drawn on the
 * plane's end view), then takes what was really fitted and shows the reading the model expects from it.
 */
@Component({
  selector: 'app-job-correction-step',
  imports: [
    BusyButton,
    CpCorrectionOverlay,
    ErrorBanner,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatRadioModule,
    MatSelectModule,
    ReactiveFormsModule,
    RunEntry,
  ],
  templateUrl: './correction-step.html',
  styleUrl: './correction-step.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [PhotoUrls],
})
export class JobCorrectionStep {
  readonly job = input.required<Job>();
  readonly machine = input<Machine>();
  readonly family = input<MachineFamily>();
  readonly editable = input(false);

  protected readonly session = inject(JobSession);
  private readonly offline = inject(OfflineJobs);
  private readonly drafts = inject(JobDrafts);
  private readonly destroyRef = inject(DestroyRef);
  private readonly photos = inject(PhotosApi);
  private readonly photoUrls = inject(PhotoUrls);

  /** The machine's overlay background (a photo of its rotor, calibrated on the machine's page), if it has one. */
  private readonly background = signal<Photo | null>(null);
  /**
   * The background as the overlay takes it, once its image is here. It is a photo of one end, drawn under the
   * first plane's view (the left end's on a two-plane rotor, as the calibration dialog assumes).
   */
  protected readonly backgroundPhoto = computed<RotorPhoto | null>(() => {
    const photo = this.background();
    const src = photo && this.photoUrls.url(photo.id, 'image');
    if (!photo || !src) return null;
    return {
      src,
      aspectRatio: photo.widthPx / photo.heightPx,
      ...(photo.calibration ? { calibration: photo.calibration } : {}),
    };
  });
  private readonly machineId = computed(() => this.job().machine.id);

  protected readonly formatNumber = formatNumber;
  protected readonly formatDeg = formatDeg;
  protected readonly abs = Math.abs;
  protected readonly sideLabels = SIDE_LABELS;
  protected readonly basisWords = BASIS_WORDS;
  protected readonly methodWords = METHOD_WORDS;

  protected readonly unit = computed(() => unitLabel(this.job()));
  protected readonly planeCount = computed(() => planeCountOf(this.job(), this.machine(), this.family()));
  protected readonly options = computed(() => methodOptions(this.job(), this.machine(), this.family()));
  /** The method the technician picked, if any. */
  private readonly picked = signal<CorrectionMethod | null>(null);
  /**
   * The method chosen: the technician's pick; after a verification run above the level, the one that refines
   * the last correction from what the rotor has shown (as many planes as it, by trim), else the first this job
   * allows; before any, the latest correction's, else the first this job allows.
   */
  protected readonly method = computed((): CorrectionMethod | null => {
    const picked = this.picked();
    if (picked !== null) return picked;
    const options = this.options();
    const possible = (method: CorrectionMethod) =>
      options.some((option) => option.method === method && option.possible);
    const last = this.job().corrections.at(-1);
    if (last && this.superseded()) {
      const refining: CorrectionMethod[] =
        last.method === 'four-run'
          ? ['four-run']
          : last.method === 'multi-plane'
            ? ['multi-plane', 'single-plane']
            : ['single-plane', 'multi-plane'];
      return refining.find(possible) ?? options.find((option) => option.possible)?.method ?? last.method;
    }
    const first = options.find((option) => option.possible)?.method;
    // Runs read without phase leave amplitude only: it is the method to go on with, runs missing or not.
    const amplitudeOnly = baseRunOf(this.job())?.amplitudeOnly === true ? 'four-run' : null;
    return last?.method ?? first ?? amplitudeOnly;
  });
  /** The last verification run's verdict when it is above the acceptance level; null otherwise. */
  protected readonly notYetAccepted = computed(() => {
    const verification = this.job().verification;
    const run = this.job().runs.find((candidate) => candidate.id === verification?.runId);
    return verification && !verification.accepted && run?.kind === 'verification'
      ? { ...verification, sequence: run.sequence }
      : null;
  });
  /** True while this step's own "Work it out" is on its way (another change only holds the button). */
  protected readonly computing = signal(false);
  protected readonly chosen = computed(() =>
    this.options().find((option) => option.method === this.method()),
  );
  /** Why the last "Work it out" was refused; null otherwise. */
  protected readonly computeError = signal<string | null>(null);

  /** The latest correction: the one that can be fitted, until a run is taken after it. */
  protected readonly correction = computed(() => this.job().corrections.at(-1));
  /**
   * Whether the latest correction was computed on this device and waits to be sent: the server gives every
   * correction it stores an id of its own, the device a negative one until then.
   */
  protected readonly computedOnDevice = computed(() => {
    const correction = this.correction();
    if (!correction) return false;
    return (
      correction.id < 0 ||
      this.offline
        .pendingFor(this.job().id)()
        .some(
          (pending) =>
            pending.change.kind === 'compute-correction' &&
            pending.after.corrections.at(-1)?.sequence === correction.sequence,
        )
    );
  });
  /**
   * The corrections of this job that the server computed differently from this device, latest first, each
   * with both results plane by plane. The server's is the one stored (and shown in the plan).
   */
  protected readonly disagreements = computed(() =>
    this.offline
      .disagreementsFor(this.job().id)()
      .map((disagreement) => ({
        disagreement,
        rows: disagreementRows(disagreement.device, disagreement.server),
      }))
      .sort((a, b) => b.disagreement.correctionSequence - a.disagreement.correctionSequence),
  );
  /** True while a disagreement is being dismissed. */
  protected readonly dismissing = signal(false);
  /** Whether a run was taken after the correction (it is history then: a new one is worked out). */
  protected readonly superseded = computed(() => {
    const correction = this.correction();
    if (!correction) return false;
    const job = this.job();
    const used = job.runs.filter((run) => correction.runIds.includes(run.id)).map((run) => run.sequence);
    const last = Math.max(...used);
    return job.runs.some((run) => run.sequence > last);
  });
  protected readonly runsUsed = computed(() => {
    const correction = this.correction();
    return correction ? runsUsed(this.job(), correction, this.planeCount()) : '';
  });
  /** Each plane of the plan, placed where a weight can go, with its end view. */
  protected readonly placements = computed(() => {
    const correction = this.correction();
    const machine = this.machine();
    if (!correction || !machine) return [];
    return correction.plan.map((planned) => {
      const plane = machine.planes[planned.planeIndex];
      const placement = placePlanned(planned, plane, machine.stockWeightsGrams);
      return { planned, plane, placement, view: this.endView(machine, correction, placement) };
    });
  });

  /** The weights to prefill: the split onto the planes' free positions, else the plan as it stands. */
  protected readonly suggested = computed(() => {
    const placements = this.placements();
    if (placements.length > 0) {
      return placements.flatMap(({ planned, placement }) =>
        placement.parts.map((part) => ({
          planeIndex: planned.planeIndex,
          massGrams: part.massGrams,
          angleDeg: part.angleDeg,
        })),
      );
    }
    return this.correction()?.plan ?? [];
  });

  /** What was really fitted for the latest correction, as typed. */
  protected readonly installed = signal<{
    readonly correctionId: number;
    readonly form: InstalledForm;
  } | null>(null);
  protected readonly installedError = signal<string | null>(null);
  /** Whether the stored weights are opened again for a change (allowed until a run is taken with them). */
  protected readonly changingInstalled = signal(false);
  protected readonly mayFit = computed(
    () =>
      this.editable() &&
      this.correction() !== undefined &&
      !this.superseded() &&
      this.job().status === 'open',
  );

  constructor() {
    // Without a background (or when it cannot be fetched) the overlay draws the plain end view.
    effect(() => {
      const machineId = this.machineId();
      untracked(() =>
        this.photos
          .list({ kind: 'machine', id: machineId })
          .pipe(takeUntilDestroyed(this.destroyRef))
          .subscribe({
            next: (list) => {
              const photo = list.photos.find((each) => each.overlayBackground) ?? null;
              this.background.set(photo);
              if (photo) this.photoUrls.load([photo.id], 'image');
            },
            error: () => this.background.set(null),
          }),
      );
    });
    // A form per correction, filled from the device's draft, else from what was stored, else from the plan.
    effect(() => {
      const job = this.job();
      const correction = this.correction();
      const machine = this.machine();
      untracked(() => {
        if (!correction) {
          this.installed.set(null);
          return;
        }
        if (this.installed()?.correctionId === correction.id) return;
        // The radii come with the machine: the form waits for it unless the weights are stored already.
        if (!machine && correction.installed === null) return;
        this.installed.set({
          correctionId: correction.id,
          form: this.buildInstalledForm(job.id, correction),
        });
      });
    });
  }

  /** An amplitude as read on screen: small residuals keep a figure that is not 0. */
  protected amplitude(value: number): string {
    return formatNumber(value, value < 0.01 ? 4 : 3);
  }

  /** The trial run is stored: the method it was missing for can be worked out now. */
  protected trialSaved(): void {
    this.computeError.set(null);
  }

  protected pick(method: CorrectionMethod): void {
    this.picked.set(method);
  }

  /** "in the left plane", or "in the plane" on a rotor with one. */
  protected inPlane(index: number): string {
    return inThePlane(index, this.planeCount());
  }

  protected planeLabel(index: number): string {
    return planeName(index, this.planeCount());
  }

  protected weights(form: InstalledForm): WeightForm[] {
    return form.controls.weights.controls;
  }

  /**
   * Forgets a disagreement once the technician has checked the weights against the stored correction, and
   * takes the focus to the correction's heading (the button it came from is gone).
   */
  protected async checked(disagreement: CorrectionDisagreement, heading: HTMLElement): Promise<void> {
    this.dismissing.set(true);
    try {
      await this.offline.dismissDisagreement(disagreement);
      heading.focus();
    } finally {
      this.dismissing.set(false);
    }
  }

  protected async workItOut(): Promise<void> {
    const method = this.method();
    if (method === null) return;
    this.computeError.set(null);
    this.computing.set(true);
    const outcome = await this.session
      .save(`Correction by ${METHOD_WORDS[method].label.toLowerCase()}`, (api, id, etag) =>
        api.computeCorrection(id, method, etag),
      )
      .finally(() => this.computing.set(false));
    if (outcome.ok) return;
    // A 412 shows the job as stored, and the save line says so.
    if (outcome.error instanceof HttpErrorResponse && outcome.error.status === 412) return;
    const problem = problemOf(outcome.error);
    this.computeError.set(refusalText(problem?.code, problem?.detail) ?? httpErrorMessage(outcome.error));
  }

  /** Fills the list from the server's plan, one weight per plane. */
  protected fillFromPlan(form: InstalledForm): void {
    const correction = this.correction();
    if (!correction) return;
    this.fill(
      form,
      correction.plan.map((planned) => ({
        planeIndex: planned.planeIndex,
        massGrams: planned.massGrams,
        angleDeg: planned.angleDeg,
      })),
    );
  }

  /** Fills the list from the split: each part at its position. */
  protected fillFromSplit(form: InstalledForm): void {
    this.fill(form, this.suggested());
  }

  protected addWeight(form: InstalledForm): void {
    const last = form.controls.weights.controls.at(-1)?.getRawValue();
    form.controls.weights.push(
      this.weightForm({
        planeIndex: last?.planeIndex ?? 0,
        massGrams: null,
        angleDeg: null,
        radiusMm: this.radiusOf(last?.planeIndex ?? 0),
        fixing: last?.fixing ?? 'welded',
      }),
    );
    form.markAsDirty();
  }

  protected removeWeight(form: InstalledForm, index: number): void {
    form.controls.weights.removeAt(index);
    form.markAsDirty();
  }

  /** A plane chosen for a weight: its radius follows the plane's, unless typed otherwise before. */
  protected planeChanged(weight: WeightForm): void {
    const radius = weight.controls.radiusMm;
    if (!radius.dirty) radius.setValue(this.radiusOf(weight.controls.planeIndex.value));
  }

  protected async recordInstalled(form: InstalledForm): Promise<void> {
    const correction = this.correction();
    if (!correction) return;
    this.installedError.set(null);
    if (form.invalid) {
      form.markAllAsTouched();
      return;
    }
    const weights = form.controls.weights.getRawValue().map((weight): InstalledWeight => ({
      planeIndex: weight.planeIndex,
      massGrams: weight.massGrams!,
      angleDeg: weight.angleDeg!,
      radiusMm: weight.radiusMm!,
      fixing: weight.fixing,
    }));
    const jobId = this.job().id;
    const outcome = await this.session.save('Weights fitted', (api, id, etag) =>
      api.recordInstalled(id, correction.id, { weights }, etag),
    );
    if (outcome.ok) {
      this.drafts.clear(jobId, installedKey(correction));
      form.markAsPristine();
      this.changingInstalled.set(false);
      return;
    }
    if (outcome.error instanceof HttpErrorResponse && outcome.error.status === 412) return;
    this.installedError.set(formErrorOf(form, outcome.error));
  }

  protected errorOf(control: AbstractControl, what: string): string | null {
    if (!control.invalid || !control.touched) return null;
    const errors = control.errors ?? {};
    if (typeof errors['server'] === 'string') return errors['server'];
    if (errors['required']) return `Enter the ${what}.`;
    if (errors['min'] || errors['max']) {
      if (what === 'angle') return 'The angle is from 0 to 359.9°.';
      return `The ${what} is above 0.`;
    }
    return `Check the ${what}.`;
  }

  private fill(
    form: InstalledForm,
    weights: { planeIndex: number; massGrams: number; angleDeg: number }[],
  ): void {
    const previous = form.controls.weights.getRawValue();
    form.controls.weights.clear();
    for (const weight of weights) {
      form.controls.weights.push(
        this.weightForm({
          planeIndex: weight.planeIndex,
          massGrams: roundTenth(weight.massGrams),
          angleDeg: Math.round(weight.angleDeg) % 360,
          radiusMm: this.radiusOf(weight.planeIndex),
          fixing: previous.find((one) => one.planeIndex === weight.planeIndex)?.fixing ?? 'welded',
        }),
      );
    }
    form.markAsDirty();
  }

  private radiusOf(planeIndex: number): number | null {
    return (
      this.machine()?.planes[planeIndex]?.correctionRadiusMm ??
      this.family()?.correctionRadiiMm[planeIndex] ??
      null
    );
  }

  private weightForm(weight: WeightDraft): WeightForm {
    return new FormGroup({
      planeIndex: new FormControl(weight.planeIndex, { nonNullable: true }),
      massGrams: new FormControl(weight.massGrams, [
        Validators.required,
        Validators.min(0.1),
        Validators.max(50_000),
      ]),
      angleDeg: new FormControl(weight.angleDeg, [
        Validators.required,
        Validators.min(0),
        Validators.max(359.9),
      ]),
      radiusMm: new FormControl(weight.radiusMm, [
        Validators.required,
        Validators.min(1),
        Validators.max(5_000),
      ]),
      fixing: new FormControl(weight.fixing, { nonNullable: true }),
    });
  }

  private buildInstalledForm(jobId: number, correction: JobCorrection): InstalledForm {
    const key = installedKey(correction);
    const draft = this.drafts.read<{ weights?: WeightDraft[] }>(jobId, key);
    const start: WeightDraft[] =
      draft?.weights && draft.weights.length > 0
        ? draft.weights
        : correction.installed
          ? correction.installed.map((weight) => ({ ...weight }))
          : this.suggested().map((weight) => ({
              planeIndex: weight.planeIndex,
              massGrams: roundTenth(weight.massGrams),
              angleDeg: Math.round(weight.angleDeg) % 360,
              radiusMm: this.radiusOf(weight.planeIndex),
              fixing: 'welded' as const,
            }));
    const form: InstalledForm = new FormGroup({
      weights: new FormArray(start.map((weight) => this.weightForm(weight))),
    });
    this.drafts.keep(form, jobId, key, this.destroyRef);
    return form;
  }

  private endView(machine: Machine, correction: JobCorrection, placement: PlanePlacement) {
    const planeIndex = placement.planeIndex;
    const side = planeSide(planeIndex, machine.planes.length);
    const rotation = side === 'left' ? machine.rotationSeenFromLeft : opposite(machine.rotationSeenFromLeft);
    const plane = machine.planes[planeIndex];
    const corrections: OverlayWeight[] = placement.parts.map((part) => ({
      mass: roundTenth(part.massGrams),
      angleDeg: Math.round(part.angleDeg) % 360,
      unit: 'g',
      label: part.label === 'Whole weight' ? 'Correction' : part.label,
    }));
    const earlier: OverlayWeight[] = this.job()
      .corrections.filter((other) => other.id !== correction.id)
      .flatMap((other) => other.installed ?? [])
      .filter((weight) => weight.planeIndex === planeIndex)
      .map((weight) => ({ mass: weight.massGrams, angleDeg: weight.angleDeg, unit: 'g', label: 'Fitted' }));
    return {
      side,
      rotation,
      counting: this.job().setup?.weightAngles ?? 'againstRotation',
      positions: plane?.positions
        ? { count: plane.positions.count, firstDeg: plane.positions.firstDeg }
        : null,
      blocked: plane?.blockedSectors ?? [],
      corrections,
      earlier,
      label: `${planeName(planeIndex, machine.planes.length)}, seen from the ${side} end: where the correction goes`,
    };
  }
}

function installedKey(correction: JobCorrection): string {
  return `installed-${correction.id}`;
}
