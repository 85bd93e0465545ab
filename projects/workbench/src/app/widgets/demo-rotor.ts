/**
 * One rotor of the invented demo scenario: a forestry-mulcher drum with 36 tooth holders, its readings at
 * the drive-end bearing and a correction that had to be split between two holders. Demo data only.
 */
export const DEMO_ROTOR = {
  name: 'Mulcher drum, demo unit 4',
  speedRpm: 2150,
  amplitudeUnit: 'in/s',
  massUnit: 'g',
  initial: { amplitude: 0.52, phaseDeg: 74 },
  trialWeight: { mass: 60, angleDeg: 0 },
  withTrial: { amplitude: 0.31, phaseDeg: 141 },
  afterCorrection: { amplitude: 0.06, phaseDeg: 212 },
  heavySpotDeg: 216,
  holders: { count: 36, firstDeg: 5 },
  corrections: [
    { mass: 41, angleDeg: 35, unit: 'g', label: 'Holder 4' },
    { mass: 23, angleDeg: 45, unit: 'g', label: 'Holder 5' },
  ],
  existingWeights: [{ mass: 30, angleDeg: 250, unit: 'g', label: 'Earlier weight' }],
  blockedSectors: [
    { fromDeg: 80, toDeg: 100, label: 'Drive pulley bolts' },
    { fromDeg: 170, toDeg: 190, label: 'Repair weld' },
  ],
} as const;
