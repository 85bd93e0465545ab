/**
 * Test data of the phase dial, shared by its specs and its stories so both show the same job. Invented
 * demo data; not part of the public API.
 */
import type { DialPositions } from '@counterpoise/ng/core';
import type { PhaseDialMarker } from './phase-dial-values';

/**
 * The left bearing of a mulcher drum, balanced in one plane with a trial weight: the reading of run 1, the
 * heavy spot the influence coefficient puts behind it, the 40 g trial weight of run 2 and the correction
 * weight the calculation asks for.
 */
export const TRIAL_RUN_MARKERS: readonly PhaseDialMarker[] = [
  { kind: 'reading', angleDeg: 212, label: 'Run 1' },
  { kind: 'heavySpot', angleDeg: 247 },
  { kind: 'trialWeight', angleDeg: 90, label: '40 g' },
  { kind: 'correction', angleDeg: 67, label: '58 g' },
];

/** Six weight holders round a flail mower's rotor, the first at the reference mark. */
export const SIX_HOLDERS: DialPositions = { count: 6, firstDeg: 0 };

/** A page's own message for an empty phase, as the weight calculator gives one through `errorText`. */
export const INITIAL_RUN_PHASE_MESSAGE = 'Enter the phase of the initial run';

/** The smallest compact dial a thumb can work on a tablet, in CSS pixels. */
export const THUMB_DIAL_MIN_PX = 144;

/** The smallest scale label that stays legible at arm's length, in CSS pixels. */
export const SCALE_LABEL_MIN_PX = 12;
