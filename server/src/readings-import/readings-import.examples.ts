import type { ReadingsImportPreview } from '@counterpoise/api';

/*
 * The examples of the readings import in the OpenAPI document: a short file of the format
 * (docs/readings-csv.md; the full samples are in docs/samples) and what its preview answers on an invented
 * job whose initial run is stored, with one row mistyped. Figures are made up for the demo.
 */

/** A trial run of one sensor, as a file holds it. */
export const SAMPLE_CSV_EXAMPLE =
  'run,kind,sensorSide,amplitude,phaseDeg,speedRpm,amplitudeUnit,trialPlaneIndex,trialMassGrams,trialAngleDeg\n' +
  '2,trial,left,0.29,207,2151,in/s-pk,0,120,0\n' +
  '2,trial,left,0.30,206,2150,in/s-pk,0,120,0\n' +
  '3,trial,left,0.45,412,2149,in/s-pk,1,120,0\n';

export const PREVIEW_EXAMPLE: ReadingsImportPreview = {
  jobId: 58,
  jobVersion: 5,
  amplitudeUnit: 'in/s-pk',
  rowCount: 3,
  runs: [
    {
      fileRun: 2,
      rows: [2, 3],
      sequence: 2,
      kind: 'trial',
      amplitudeOnly: false,
      trialWeight: { planeIndex: 0, massGrams: 120, angleDeg: 0 },
      weightsOnRotor: [],
      readings: [
        {
          sensorSide: 'left',
          repeats: [
            { amplitude: 0.29, phaseDeg: 207, speedRpm: 2151 },
            { amplitude: 0.3, phaseDeg: 206, speedRpm: 2150 },
          ],
          average: { amplitude: 0.295, phaseDeg: 206.5 },
          spread: 0.005,
          spreadRatio: 0.017,
          trusted: true,
          speedRpm: 2150.5,
        },
      ],
      warnings: [],
    },
  ],
  errors: [
    {
      path: 'rows[4].phaseDeg',
      row: 4,
      column: 'phaseDeg',
      value: '412',
      message: 'The phase is from 0 to 359.9 degrees.',
    },
  ],
};
