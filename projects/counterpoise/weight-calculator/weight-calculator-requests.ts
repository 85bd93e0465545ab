import type { CalcRequest } from '@counterpoise/ng/api';
import {
  type DialPositions,
  type RotationCounting,
  _expandPositions as expandPositions,
  _normalizeDeg as normalizeDeg,
} from '@counterpoise/ng/core';
import type { BlockedSector } from '@counterpoise/ng/correction-overlay';
import type {
  CalcMethod,
  FourRunDraft,
  MethodRequest,
  MultiPlaneDraft,
  OneRunDraft,
  ReadingDraft,
  SinglePlaneDraft,
  WeightCalculatorDraft,
  WeightDraft,
} from './weight-calculator-model';

/*
 * From what the technician typed to what the engine takes, and from the engine's field paths back to the
 * form's controls. Framework-free, so it is tested without TestBed.
 */

/** A value the form has already checked; an empty one here is a bug in the form, not the technician's slip. */
function given(value: number | null, path: string): number {
  if (value === null)
    throw new Error(`The calculator sent an empty ${path}; the form should have refused it.`);
  return value;
}

function reading(draft: ReadingDraft, path: string) {
  return {
    amplitude: given(draft.amplitude, `${path}.amplitude`),
    phaseDeg: given(draft.phaseDeg, `${path}.phaseDeg`),
  };
}

function weight(draft: WeightDraft, path: string) {
  return { mass: given(draft.mass, `${path}.mass`), angleDeg: given(draft.angleDeg, `${path}.angleDeg`) };
}

/** The one-run request; weight angles are counted the way the calculator counts angles. */
export function oneRunRequest(draft: OneRunDraft, counting: RotationCounting): CalcRequest<'one-run'> {
  const { massPerAmplitude, offsetDeg } = draft.sensitivity;
  return {
    reading: reading(draft.reading, 'reading'),
    sensitivity: {
      massPerAmplitude: given(massPerAmplitude, 'sensitivity.massPerAmplitude'),
      ...(offsetDeg === null ? {} : { offsetDeg }),
    },
    weightAngles: counting,
  };
}

/** The single-plane request. */
export function singlePlaneRequest(
  draft: SinglePlaneDraft,
  counting: RotationCounting,
): CalcRequest<'single-plane'> {
  return {
    initial: reading(draft.initial, 'initial'),
    trialWeight: weight(draft.trialWeight, 'trialWeight'),
    withTrial: reading(draft.withTrial, 'withTrial'),
    trialWeightRemoved: draft.trialWeightRemoved,
    weightAngles: counting,
  };
}

/**
 * The multi-plane request in its two-plane case: run 1 with the trial weight in plane 1, run 2 in plane 2.
 * Each run lists every weight on the rotor during it, so a trial weight left on for the next run is
 * listed again.
 */
export function multiPlaneRequest(
  draft: MultiPlaneDraft,
  counting: RotationCounting,
): CalcRequest<'multi-plane'> {
  const trials = draft.runs.map((run, index) => ({
    plane: index + 1,
    ...weight(run.trialWeight, `runs[${index}].trialWeight`),
  }));
  return {
    planes: 2,
    initial: draft.initial.map((one, sensor) => reading(one, `initial[${sensor}]`)),
    runs: draft.runs.map((run, index) => ({
      weights: draft.trialWeightsRemoved ? [trials[index]!] : trials.slice(0, index + 1),
      readings: run.readings.map((one, sensor) => reading(one, `runs[${index}].readings[${sensor}]`)),
    })),
    weightAngles: counting,
  };
}

/** The amplitude-only request; its angles are in and out in the same convention, so it needs none. */
export function fourRunRequest(draft: FourRunDraft): CalcRequest<'four-run'> {
  return {
    initialAmplitude: given(draft.initialAmplitude, 'initialAmplitude'),
    trialMass: given(draft.trialMass, 'trialMass'),
    trialRuns: draft.trialRuns.map((run, index) => ({
      angleDeg: given(run.angleDeg, `trialRuns[${index}].angleDeg`),
      amplitude: given(run.amplitude, `trialRuns[${index}].amplitude`),
    })),
  };
}

/** The request of a method, from the draft of the whole calculator. */
export function buildRequest<M extends CalcMethod>(
  method: M,
  draft: WeightCalculatorDraft,
  counting: RotationCounting,
): MethodRequest<M> {
  const requests: { [K in CalcMethod]: () => MethodRequest<K> } = {
    'one-run': () => oneRunRequest(draft.oneRun, counting),
    'single-plane': () => singlePlaneRequest(draft.singlePlane, counting),
    'multi-plane': () => multiPlaneRequest(draft.multiPlane, counting),
    'four-run': () => fourRunRequest(draft.fourRun),
  };
  return requests[method]() as MethodRequest<M>;
}

/** The value with the keys of every object in order, so that two equal values write the same text. */
function canonical(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(canonical);
  if (value === null || typeof value !== 'object') return value;
  return Object.fromEntries(
    Object.keys(value)
      .sort()
      .map((key) => [key, canonical((value as Record<string, unknown>)[key])]),
  );
}

/**
 * Whether `request` is the one the draft gives for a method: a kept calculation still matches what is
 * typed. A draft with empty fields matches nothing.
 */
export function requestMatches(
  method: CalcMethod,
  draft: WeightCalculatorDraft,
  counting: RotationCounting,
  request: unknown,
): boolean {
  let built: unknown;
  try {
    built = buildRequest(method, draft, counting);
  } catch {
    return false;
  }
  return JSON.stringify(canonical(built)) === JSON.stringify(canonical(request));
}

/** A path such as `runs[1].readings[0].amplitude` as its segments: `['runs', 1, 'readings', 0, 'amplitude']`. */
export function pathSegments(path: string): (string | number)[] {
  const segments: (string | number)[] = [];
  for (const match of path.matchAll(/([^.[\]]+)|\[(\d+)\]/g)) {
    if (match[2] !== undefined) segments.push(Number(match[2]));
    else if (match[1] !== undefined) segments.push(/^\d+$/.test(match[1]) ? Number(match[1]) : match[1]);
  }
  return segments;
}

/**
 * The form control, as a dotted path inside the method's group, that a solver's field path names; null
 * when the path names nothing the technician typed (the whole body, a setting of the calculator).
 * The multi-plane runs list their trial weights again when they stay on, so a weight is traced back to
 * the run of its plane through the request that was sent.
 */
export function controlPathFor(
  method: CalcMethod,
  apiPath: string,
  request?: CalcRequest<'multi-plane'>,
): string | null {
  const segments = pathSegments(apiPath);
  if (segments.length === 0 || segments[0] === 'weightAngles' || segments[0] === 'planes') return null;
  if (method === 'multi-plane' && segments[0] === 'runs' && segments[2] === 'weights') {
    const run = segments[1];
    const index = segments[3];
    if (typeof run !== 'number' || typeof index !== 'number') return 'runs';
    const plane = request?.runs[run]?.weights[index]?.plane ?? run + 1;
    const field = segments[4] === 'mass' || segments[4] === 'angleDeg' ? `.${segments[4]}` : '';
    return `runs.${plane - 1}.trialWeight${field}`;
  }
  return segments.join('.');
}

/** How a correction can be moved to where a weight can really go. */
export type PlacementPlan =
  | { readonly kind: 'anywhere' }
  | { readonly kind: 'split'; readonly places: Pick<CalcRequest<'split'>, 'positionsDeg' | 'sectors'> }
  | { readonly kind: 'nowhere'; readonly reason: string };

/**
 * The arcs where a weight can go: the circle without the blocked sectors, merged where they overlap.
 * A sector runs from `fromDeg` to `toDeg` the way angles increase; one whose ends coincide blocks nothing.
 */
export function freeSectors(blocked: readonly BlockedSector[]): { fromDeg: number; toDeg: number }[] {
  const arcs = blocked
    .map((sector) => {
      const from = normalizeDeg(sector.fromDeg);
      return { from, to: from + normalizeDeg(sector.toDeg - sector.fromDeg) };
    })
    .filter((arc) => arc.to > arc.from)
    .sort((a, b) => a.from - b.from);
  if (arcs.length === 0) return [{ fromDeg: 0, toDeg: 360 }];
  const merged: { from: number; to: number }[] = [];
  for (const arc of arcs) {
    const last = merged[merged.length - 1];
    if (last && arc.from <= last.to) last.to = Math.max(last.to, arc.to);
    else merged.push({ ...arc });
  }
  // An arc that runs past 360 degrees may cover the first ones again.
  while (merged.length > 1 && merged[merged.length - 1]!.to - 360 >= merged[0]!.from) {
    const last = merged[merged.length - 1]!;
    last.to = Math.max(last.to, merged.shift()!.to + 360);
  }
  const free: { fromDeg: number; toDeg: number }[] = [];
  for (let index = 0; index < merged.length; index++) {
    const end = merged[index]!.to;
    const next = index + 1 < merged.length ? merged[index + 1]!.from : merged[0]!.from + 360;
    if (next > end) free.push({ fromDeg: normalizeDeg(end), toDeg: normalizeDeg(next) });
  }
  return free;
}

/** Whether an angle lies inside a blocked sector (its ends are still free, as the weight can sit beside it). */
export function isBlocked(angleDeg: number, blocked: readonly BlockedSector[]): boolean {
  return blocked.some((sector) => {
    const length = normalizeDeg(sector.toDeg - sector.fromDeg);
    const offset = normalizeDeg(angleDeg - sector.fromDeg);
    return offset > 1e-9 && offset < length - 1e-9;
  });
}

/**
 * Where a correction may go: onto the allowed positions that no sector blocks, or anywhere outside the
 * blocked sectors, or anywhere at all when neither is given.
 */
export function placementPlan(
  allowedPositions: DialPositions | null,
  blockedSectors: readonly BlockedSector[],
): PlacementPlan {
  const positions = expandPositions(allowedPositions);
  if (positions.length > 0) {
    const open = positions.filter((angle) => !isBlocked(angle, blockedSectors));
    if (open.length < 2) {
      return {
        kind: 'nowhere',
        reason:
          open.length === 0
            ? 'Every allowed position is blocked; no place is left for the weight.'
            : `Only one allowed position is free (${open[0]}°); a correction elsewhere cannot be split onto it.`,
      };
    }
    return { kind: 'split', places: { positionsDeg: open } };
  }
  if (blockedSectors.length === 0) return { kind: 'anywhere' };
  const sectors = freeSectors(blockedSectors);
  if (sectors.length === 0) return { kind: 'nowhere', reason: 'The blocked sectors cover the whole rim.' };
  return { kind: 'split', places: { sectors } };
}
