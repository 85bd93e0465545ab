import type { AmplitudeUnit, MachineSide, StoredSensitivity } from '@counterpoise/api';
import { splitWeight, suggestStockWeights } from '@counterpoise/engine';
import type { MachineFamily } from '../../machine-families/machine-families.api';
import type { Machine, PlaneLayout } from '../../machines/machines.api';
import { AMPLITUDE_UNIT_LABELS, formatDeg, formatNumber, planeName } from '../../records/record-labels';
import type { CorrectionMethod, Job, JobCorrection, JobRun } from '../jobs.api';
import { planeCountOf } from '../job-labels';

/*
 * What the correction step reads off a stored job: which methods its runs allow, in words; the runs and
 * basis of a correction; a planned weight split onto the places a plane allows and made up from the shop's
 * stock. The server decides and computes; these only explain its figures and place them.
 */

/** The methods in the technician's words, simplest first, with what each one needs. */
export const METHOD_WORDS: Readonly<Record<CorrectionMethod, { label: string; needs: string }>> = {
  'one-run': {
    label: 'Stored sensitivity, one run',
    needs: 'the family’s stored sensitivity for the worse side’s sensor: the shop’s rule of thumb',
  },
  'single-plane': {
    label: 'Trial weight, one plane',
    needs: 'a trial run in the plane, or, once a correction is fitted and verified, a trim from it',
  },
  'multi-plane': {
    label: 'Two planes',
    needs: 'both sensors and a trial run in each plane; more runs than planes are fitted by least squares',
  },
  'four-run': {
    label: 'Amplitude only, trial at three positions',
    needs:
      'runs read without phase: the initial run, then the same trial weight at three positions in the worse ' +
      'side’s plane (0°, 120°, 240°)',
  },
};

/** The trial positions the step offers for amplitude-only balancing, in degrees from the reference mark. */
export const FOUR_RUN_POSITIONS_DEG = [0, 120, 240] as const;

/** Angles closer than this are one trial position (the server's rule, docs/jobs.md). */
const SAME_POSITION_DEG = 0.05;

/** The next run amplitude-only balancing needs: the initial run, or a trial run at a position. */
export interface AmplitudeRunNeeded {
  readonly kind: 'initial' | 'trial';
  /** For a trial run: its plane and position, and the mass of the trial runs before it (null for the first). */
  readonly trialWeight: { planeIndex: number; angleDeg: number; massGrams: number | null } | null;
  /** Which one of the runs it is, in words: "Trial run at 120° (2 of 3)". */
  readonly title: string;
  /** The key of its draft: one per base run and position, so that each keeps its own typing. */
  readonly key: string;
}

/** Where a correction came from, in words. */
export const BASIS_WORDS: Readonly<Record<JobCorrection['basis'], string>> = {
  sensitivity: 'From the family’s stored sensitivity',
  trial: 'From the trial runs',
  trim: 'A trim: from the weights fitted and the verification run',
};

/** A method as the step offers it: whether this job's runs allow it, and why. */
export interface MethodOption {
  readonly method: CorrectionMethod;
  readonly label: string;
  readonly needs: string;
  readonly possible: boolean;
  /** What this job has for it, or what it lacks. */
  readonly status: string;
  /** The plane whose trial run is missing, when a trial run would make the method possible. */
  readonly trialPlane: number | null;
  /** For amplitude only: the next run read without phase that it needs, when one is missing. */
  readonly amplitudeRun: AmplitudeRunNeeded | null;
}

/** The unit of the job's amplitudes as read on screen. */
export function unitLabel(job: Job): string {
  return job.setup ? AMPLITUDE_UNIT_LABELS[job.setup.amplitudeUnit] : '';
}

/** The last run without a trial weight: the initial run or the latest verification. */
export function baseRunOf(job: Job): JobRun | undefined {
  return [...job.runs].reverse().find((run) => run.kind !== 'trial');
}

/** How many weights this job has fitted, over all its corrections. */
export function fittedCount(job: Job): number {
  return job.corrections.reduce((count, correction) => count + (correction.installed?.length ?? 0), 0);
}

function worseSide(run: JobRun): MachineSide | undefined {
  return [...run.readings].sort((a, b) => b.average.amplitude - a.average.amplitude)[0]?.sensorSide;
}

/** The plane a side's sensor answers most: its own on a two-plane rotor, the only one otherwise. */
function planeOfSide(side: MachineSide, planeCount: number): number {
  return planeCount === 2 && side === 'right' ? 1 : 0;
}

function latestTrialIn(job: Job, planeIndex: number): JobRun | undefined {
  return [...job.runs]
    .reverse()
    .find((run) => run.kind === 'trial' && run.trialWeight?.planeIndex === planeIndex);
}

/** "in the left plane", or "in the plane" on a rotor with one. */
export function inThePlane(planeIndex: number, planeCount: number): string {
  return planeCount <= 1 ? 'in the plane' : `in the ${planeName(planeIndex, planeCount).toLowerCase()}`;
}

function apartDeg(a: number, b: number): number {
  const apart = (((a - b) % 360) + 360) % 360;
  return Math.min(apart, 360 - apart);
}

function runName(run: JobRun): string {
  return run.kind === 'initial' ? `the initial run (run ${run.sequence})` : `run ${run.sequence}`;
}

/**
 * Amplitude only (`four-run`), as the server picks its runs (docs/jobs.md): the base run read without
 * phase, and after it the latest trial runs read without phase in the worse side's plane, with the latest
 * mass, at three distinct angles. Says what this job has, and the next run it needs.
 */
function fourRunOption(
  job: Job,
  base: JobRun | undefined,
  side: MachineSide | undefined,
  planeIndex: number,
  planeCount: number,
): { possible: boolean; status: string; next: AmplitudeRunNeeded | null } {
  if (base === undefined) {
    return {
      possible: false,
      status: 'Missing: the initial run, read without phase.',
      next: {
        kind: 'initial',
        trialWeight: null,
        title: 'Initial run, amplitude only',
        key: 'four-run-initial',
      },
    };
  }
  if (!base.amplitudeOnly) {
    return {
      possible: false,
      status: `${capitalise(runName(base))} was read with phase: amplitude only needs it read without phase. Use a method with phase.`,
      next: null,
    };
  }
  const inPlaneWords = inThePlane(planeIndex, planeCount);
  const trials = job.runs.filter(
    (run) =>
      run.kind === 'trial' &&
      run.sequence > base.sequence &&
      run.amplitudeOnly === true &&
      run.trialWeight?.planeIndex === planeIndex &&
      run.readings.some((reading) => reading.sensorSide === side),
  );
  const mass = trials.at(-1)?.trialWeight?.massGrams ?? null;
  const chosen: JobRun[] = [];
  for (const run of [...trials].reverse()) {
    if (run.trialWeight!.massGrams !== mass || chosen.length === 3) continue;
    if (
      !chosen.some(
        (other) => apartDeg(other.trialWeight!.angleDeg, run.trialWeight!.angleDeg) < SAME_POSITION_DEG,
      )
    )
      chosen.push(run);
  }
  chosen.reverse();
  const list = chosen
    .map((run) => `${formatDeg(run.trialWeight!.angleDeg)} (run ${run.sequence})`)
    .join(', ');
  if (chosen.length === 3) {
    return {
      possible: true,
      status: `This job has it: ${runName(base)} and ${formatNumber(mass!, 1)} g at ${list} ${inPlaneWords}.`,
      next: null,
    };
  }
  const taken = chosen.map((run) => run.trialWeight!.angleDeg);
  const angleDeg =
    FOUR_RUN_POSITIONS_DEG.find((position) => taken.every((angle) => apartDeg(angle, position) >= 1)) ??
    (taken.at(-1)! + 120) % 360;
  const have =
    chosen.length === 0
      ? `${capitalise(runName(base))}; no trial run read without phase yet.`
      : `${capitalise(runName(base))} and ${formatNumber(mass!, 1)} g at ${list}.`;
  return {
    possible: false,
    status: `${have} Missing: ${3 - chosen.length} more trial run${chosen.length === 2 ? '' : 's'} ${inPlaneWords}.`,
    next: {
      kind: 'trial',
      trialWeight: { planeIndex, angleDeg, massGrams: mass },
      title: `Trial run at ${formatDeg(angleDeg)} (${chosen.length + 1} of 3), amplitude only`,
      key: `four-run-after-${base.sequence}-trial-${planeIndex}-${angleDeg}`,
    },
  };
}

function capitalise(text: string): string {
  return `${text[0]!.toUpperCase()}${text.slice(1)}`;
}

function sensitivityText(figure: StoredSensitivity): string {
  const jobs =
    figure.jobCount === 0 ? 'typed in' : `from ${figure.jobCount} job${figure.jobCount === 1 ? '' : 's'}`;
  return `${formatNumber(figure.gramsPerUnit, 0)} g per ${AMPLITUDE_UNIT_LABELS[figure.unit as AmplitudeUnit]}, ${jobs}`;
}

/**
 * The four methods, simplest first (amplitude only last: it needs the most runs), each with whether this job's stored runs allow it. The words follow
 * the server's rules (docs/jobs.md), which stay the judge: "Work it out" asks the server either way.
 */
export function methodOptions(
  job: Job,
  machine: Machine | undefined,
  family: MachineFamily | undefined,
): MethodOption[] {
  const planeCount = planeCountOf(job, machine, family);
  const base = baseRunOf(job);
  const side = base && worseSide(base);
  const planeIndex = side ? planeOfSide(side, planeCount) : 0;
  const planeWords = planeName(planeIndex, planeCount).toLowerCase();
  const inPlaneWords = inThePlane(planeIndex, planeCount);
  const waiting = base !== undefined && base.weightsOnRotor.length !== fittedCount(job);
  const blocked =
    base === undefined
      ? 'Take the initial run first.'
      : 'Weights were fitted since the last run: take a verification run with them on first.';
  const option = (
    method: CorrectionMethod,
    possible: boolean,
    status: string,
    trialPlane: number | null = null,
    amplitudeRun: AmplitudeRunNeeded | null = null,
  ): MethodOption => ({ method, ...METHOD_WORDS[method], possible, status, trialPlane, amplitudeRun });

  if (base === undefined || waiting) {
    const fourRun = fourRunOption(job, undefined, side, planeIndex, planeCount);
    return [
      ...(['one-run', 'single-plane', 'multi-plane'] as const).map((method) =>
        option(method, false, blocked),
      ),
      base === undefined
        ? option('four-run', false, fourRun.status, null, fourRun.next)
        : option('four-run', false, blocked),
    ];
  }

  const four = fourRunOption(job, base, side, planeIndex, planeCount);
  const fourRun = option('four-run', four.possible, four.status, null, four.next);
  // The methods with phase cannot use a run read without it (the server refuses it the same way).
  if (base.amplitudeOnly) {
    const withoutPhase = `${capitalise(runName(base))} was read without phase: this method needs the phase.`;
    return [
      option('one-run', false, withoutPhase),
      option('single-plane', false, withoutPhase),
      option('multi-plane', false, withoutPhase),
      fourRun,
    ];
  }

  const sideWords = side === 'right' ? 'right' : 'left';
  const figure = family?.sensitivities.find((f) => f.sensorSide === side && f.planeIndex === planeIndex);
  const oneRun = !family
    ? option('one-run', false, 'The machine has no family, so no stored sensitivity.')
    : figure
      ? option(
          'one-run',
          true,
          `This job has it: the ${sideWords} sensor and ${planeWords}, ${sensitivityText(figure)}.`,
        )
      : option(
          'one-run',
          false,
          `${family.name} has no stored sensitivity for the ${sideWords} sensor and ${planeWords}.`,
        );

  let singlePlane: MethodOption;
  if (base.kind === 'verification') {
    const before = [...job.runs]
      .reverse()
      .find((run) => run.kind !== 'trial' && run.sequence < base.sequence);
    const inPlane = (run: JobRun | undefined) =>
      JSON.stringify((run?.weightsOnRotor ?? []).filter((weight) => weight.planeIndex === planeIndex));
    singlePlane =
      inPlane(before) !== inPlane(base)
        ? option(
            'single-plane',
            true,
            `A trim on the ${sideWords} side: the weights fitted ${inPlaneWords} between run ${before?.sequence ?? 1} and verification run ${base.sequence}.`,
          )
        : option(
            'single-plane',
            false,
            `A trim needs weights fitted ${inPlaneWords} between run ${before?.sequence ?? 1} and verification run ${base.sequence}; none were. Work the ${sideWords} side with two planes.`,
          );
  } else {
    const trial = latestTrialIn(job, planeIndex);
    singlePlane = trial?.amplitudeOnly
      ? option(
          'single-plane',
          false,
          `Trial run ${trial.sequence} was read without phase: take a trial run ${inPlaneWords} with phase.`,
          planeIndex,
        )
      : trial
        ? option(
            'single-plane',
            true,
            `This job has it: trial run ${trial.sequence} ${inPlaneWords}, read by the ${sideWords} sensor.`,
          )
        : option(
            'single-plane',
            false,
            `Missing: a trial run ${inPlaneWords} (the ${sideWords} side reads higher).`,
            planeIndex,
          );
  }

  let multiPlane: MethodOption;
  const initial = job.runs.find((run) => run.kind === 'initial');
  if (planeCount < 2) {
    multiPlane = option('multi-plane', false, 'The machine has one correction plane.');
  } else if ((initial?.readings.length ?? 0) < 2) {
    multiPlane = option('multi-plane', false, 'Two planes need both sensors read in the initial run.');
  } else {
    const have = [0, 1].map((plane) => latestTrialIn(job, plane));
    const missing = have.findIndex((trial) => trial === undefined);
    const verifications = job.runs.filter((run) => run.kind === 'verification').length;
    multiPlane =
      missing === -1
        ? option(
            'multi-plane',
            true,
            `This job has it: trial runs ${have.map((trial) => trial!.sequence).join(' and ')}` +
              (verifications > 0
                ? `, and ${verifications} verification run${verifications === 1 ? '' : 's'} to refine them.`
                : '.'),
          )
        : option(
            'multi-plane',
            false,
            `Missing: a trial run in the ${planeName(missing, planeCount).toLowerCase()}` +
              (have[1 - missing]
                ? ` (run ${have[1 - missing]!.sequence} is in the other).`
                : ' and in the other.'),
            missing,
          );
  }
  return [oneRun, singlePlane, multiPlane, fourRun];
}

/** The runs a correction used, in words: "run 1 (initial), run 2 (trial, 120 g at 0° in the left plane)". */
export function runsUsed(job: Job, correction: JobCorrection, planeCount: number): string {
  return job.runs
    .filter((run) => correction.runIds.includes(run.id))
    .map((run) => {
      if (run.kind === 'trial' && run.trialWeight) {
        const weight = run.trialWeight;
        return `run ${run.sequence} (trial, ${formatNumber(weight.massGrams, 1)} g at ${formatDeg(weight.angleDeg)} ${inThePlane(weight.planeIndex, planeCount)})`;
      }
      return `run ${run.sequence} (${run.kind})`;
    })
    .join(', ');
}

/** The engine's refusals and the server's, in plain words; the server's own detail follows them. */
const REFUSALS: Readonly<Record<string, string>> = {
  ZERO_TRIAL_EFFECT:
    'The trial weight changed nothing the meter could tell. Fit a heavier trial weight, or move it, and take the trial run again.',
  RUNS_DO_NOT_SEPARATE_PLANES:
    'The runs cannot tell the two planes apart: each trial weight moved both sensors the same way. Take a trial run with the weight in the other plane, or farther from the middle.',
  ILL_CONDITIONED:
    'The runs barely tell the two planes apart, so the weights would be guesswork. Take another trial run with a heavier weight in one plane.',
  METHOD_NOT_POSSIBLE: 'This job’s runs do not allow this method yet.',
  TOO_FEW_RUNS: 'There are not enough runs for this method.',
  TOO_FEW_SENSORS: 'This method needs more sensors read.',
  NO_SOLUTION: 'The readings give no correction.',
};

/** Why a correction was refused, in plain words, from the problem's code and detail. */
export function refusalText(code: string | undefined, detail: string | undefined): string | null {
  const words = code ? REFUSALS[code] : undefined;
  if (!words) return null;
  return detail ? `${words} ${detail}` : words;
}

/** A weight, and the stock pieces that make it up. */
export interface PlacedPart {
  /** "Part A", or "Whole weight" when no split is needed. */
  readonly label: string;
  readonly massGrams: number;
  readonly angleDeg: number;
  /** The stock pieces nearest the mass (grams each), stacked at the angle; empty without stock sizes. */
  readonly stockGrams: readonly number[];
  /** The stock's mass less the part's: positive when the pieces weigh more. */
  readonly stockDifferenceGrams: number | null;
}

/** A plane's planned weight as it can really go: whole or split, each part from the shop's stock. */
export interface PlanePlacement {
  readonly planeIndex: number;
  readonly parts: readonly PlacedPart[];
  /** Mass placed over the planned mass (more than 1 when split). */
  readonly massRatio: number;
  readonly notes: readonly string[];
}

function inSector(angleDeg: number, sector: { fromDeg: number; toDeg: number }): boolean {
  const span = (((sector.toDeg - sector.fromDeg) % 360) + 360) % 360;
  const offset = (((angleDeg - sector.fromDeg) % 360) + 360) % 360;
  return offset <= span;
}

/** The stretches of the rim no blocked sector covers, each from the end of one to the start of the next. */
function freeSectors(blocked: PlaneLayout['blockedSectors']): { fromDeg: number; toDeg: number }[] {
  const sorted = [...blocked].sort((a, b) => a.fromDeg - b.fromDeg);
  return sorted
    .map((sector, index) => ({ fromDeg: sector.toDeg, toDeg: sorted[(index + 1) % sorted.length]!.fromDeg }))
    .filter((free) => {
      const span = (((free.toDeg - free.fromDeg) % 360) + 360) % 360;
      const middle = (free.fromDeg + span / 2) % 360;
      return span > 0 && !blocked.some((sector) => inSector(middle, sector));
    });
}

/**
 * A planned weight placed on its plane: split between the two free positions either side of it (the
 * engine's `splitWeight`), or moved to the edge of a blocked sector, then each part made up from the
 * shop's stock sizes (the engine's `suggestStockWeights`). The plan stays the reference; this says how
 * to fit it.
 */
export function placePlanned(
  planned: { planeIndex: number; massGrams: number; angleDeg: number },
  plane: PlaneLayout | undefined,
  stockGrams: readonly number[],
): PlanePlacement {
  const notes: string[] = [];
  let weights: { mass: number; angleDeg: number }[] = [
    { mass: planned.massGrams, angleDeg: planned.angleDeg },
  ];
  let massRatio = 1;
  const blocked = plane?.blockedSectors ?? [];
  if (plane?.positions) {
    const { count, firstDeg } = plane.positions;
    const open = Array.from({ length: count }, (_, i) => (firstDeg + (360 * i) / count) % 360).filter(
      (angle) => !blocked.some((sector) => inSector(angle, sector)),
    );
    if (open.length >= 2) {
      const split = splitWeight({ weight: weights[0]!, positionsDeg: open });
      weights = split.weights;
      massRatio = split.massRatio;
      notes.push(...split.warnings);
    } else {
      notes.push('Fewer than two positions are free on this plane: the weight cannot be split onto them.');
    }
  } else if (blocked.length > 0) {
    const sectors = freeSectors(blocked);
    if (sectors.length > 0) {
      const split = splitWeight({ weight: weights[0]!, sectors });
      weights = split.weights;
      massRatio = split.massRatio;
      notes.push(...split.warnings);
    }
  }
  const parts = weights
    .filter((weight) => weight.mass > 0.05)
    .map((weight, index, all): PlacedPart => {
      const stock =
        stockGrams.length > 0 ? suggestStockWeights({ weight, stockMasses: [...stockGrams] }) : null;
      return {
        label: all.length > 1 ? `Part ${String.fromCharCode(65 + index)}` : 'Whole weight',
        massGrams: weight.mass,
        angleDeg: weight.angleDeg,
        stockGrams: stock?.pieces.map((piece) => piece.mass) ?? [],
        stockDifferenceGrams: stock ? stock.placed.mass - weight.mass : null,
      };
    });
  return { planeIndex: planned.planeIndex, parts, massRatio, notes };
}

/** One plane of a correction the server and this device computed differently, side by side. */
export interface DisagreementRow {
  readonly planeIndex: number;
  /** "120.4 g at 35.0°", or a dash where that side has no weight in the plane. */
  readonly server: string;
  readonly device: string;
}

/** The planes of both results of a disagreement, in plane order, each as the step writes a weight. */
export function disagreementRows(
  device: Pick<JobCorrection, 'plan'>,
  server: Pick<JobCorrection, 'plan'>,
): DisagreementRow[] {
  const planes = [...new Set([...server.plan, ...device.plan].map((weight) => weight.planeIndex))].sort(
    (a, b) => a - b,
  );
  const written = (correction: Pick<JobCorrection, 'plan'>, planeIndex: number) => {
    const weight = correction.plan.find((each) => each.planeIndex === planeIndex);
    return weight ? `${formatNumber(weight.massGrams, 1)} g at ${formatDeg(weight.angleDeg)}` : '—';
  };
  return planes.map((planeIndex) => ({
    planeIndex,
    server: written(server, planeIndex),
    device: written(device, planeIndex),
  }));
}
