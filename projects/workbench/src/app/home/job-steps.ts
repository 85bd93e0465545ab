import type { AppIconName } from '../icons/app-icons';

/** One stage of a field balancing job, as the home page explains it. */
export interface JobStep {
  readonly icon: AppIconName;
  readonly title: string;
  readonly summary: string;
}

/** The stages of a job, from arrival at the machine to the customer's record. */
export const JOB_STEPS: readonly JobStep[] = [
  {
    icon: 'search',
    title: 'Inspect',
    summary:
      'Check bearing end play and shaft runout against limits, and fix missing teeth, wrapped material and cracked welds before any reading.',
  },
  {
    icon: 'sensors',
    title: 'Set up',
    summary:
      'A velocity sensor on each bearing, reflective tape on the rotor, and the direction of rotation noted as seen from where you stand.',
  },
  {
    icon: 'speed',
    title: 'Read',
    summary:
      'Amplitude, phase and speed on each side at operating speed, several readings averaged, in in/s or mm/s.',
  },
  {
    icon: 'calculate',
    title: 'Correct',
    summary:
      'From a known sensitivity, a trial weight, two planes at once or amplitudes alone: the mass and angle, split onto places a weight really fits.',
  },
  {
    icon: 'published_with_changes',
    title: 'Verify',
    summary:
      'Run again, refine what the rotor has taught you, and stop when both sides are below the acceptance level.',
  },
  {
    icon: 'description',
    title: 'Record',
    summary:
      'Before and after readings, what went where, who did it and when: the customer’s report and the history for the next visit.',
  },
];
