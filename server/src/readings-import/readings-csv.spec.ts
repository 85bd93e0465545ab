/*
 * Reading a readings file (docs/readings-csv.md) without a job: what the format accepts (a BOM, CRLF, a
 * semicolon, notes, any case in names and words), and every row at fault named by its line and column with
 * the run schemas' own messages.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { READINGS_CSV_MAX_ROWS } from '@counterpoise/api';
import { describe, expect, it } from 'vitest';
import { readReadingsCsv } from './readings-csv';

const HEADER =
  'run,kind,sensorSide,amplitude,phaseDeg,speedRpm,amplitudeUnit,trialPlaneIndex,trialMassGrams,trialAngleDeg';

const bytes = (text: string) => new TextEncoder().encode(text);
const read = (text: string, unit: 'in/s-pk' | 'mm/s-rms' | null = 'in/s-pk') =>
  readReadingsCsv(bytes(text), unit);
const file = (...lines: string[]) => [HEADER, ...lines].join('\n');
const sample = (name: string) => readFileSync(resolve(__dirname, '../../../docs/samples', name));

describe('the sample files of docs/samples', () => {
  it('readings.csv holds three runs of two sensors, three repeats each, with no error', () => {
    const parsed = readReadingsCsv(sample('readings.csv'), 'in/s-pk');
    expect(parsed.errors).toEqual([]);
    expect(parsed.rowCount).toBe(18);
    expect(parsed.runs.map((run) => [run.fileRun, run.body.kind, run.body.trialWeight ?? null])).toEqual([
      [1, 'initial', null],
      [2, 'trial', { planeIndex: 0, massGrams: 120, angleDeg: 0 }],
      [3, 'trial', { planeIndex: 1, massGrams: 120, angleDeg: 0 }],
    ]);
    const first = parsed.runs[0]!;
    expect(first.body.readings.map((reading) => reading.sensorSide)).toEqual(['left', 'right']);
    expect(first.body.readings[0]!.repeats[0]).toEqual({ amplitude: 0.48, phaseDeg: 212, speedRpm: 2150 });
    // The notes are lines 1 and 2, the header line 3: the first reading is on line 4.
    expect(first.rows).toEqual([4, 5, 6, 7, 8, 9]);
    expect(parsed.runs[1]!.rows[0]).toBe(11);
  });

  it('readings-amplitude-only.csv holds four runs read without phase', () => {
    const parsed = readReadingsCsv(sample('readings-amplitude-only.csv'), 'in/s-pk');
    expect(parsed.errors).toEqual([]);
    expect(parsed.runs).toHaveLength(4);
    for (const run of parsed.runs) {
      for (const repeat of run.body.readings[0]!.repeats) expect(repeat).not.toHaveProperty('phaseDeg');
    }
    expect(parsed.runs.map((run) => run.body.trialWeight?.angleDeg ?? null)).toEqual([null, 0, 120, 240]);
  });
});

describe('what the format accepts', () => {
  it('a UTF-8 BOM, CRLF line ends, empty lines and notes', () => {
    const parsed = read(
      '\uFEFF# exported on the tailgate\r\n' +
        `${HEADER}\r\n` +
        '1,initial,left,0.5,60,2150,in/s-pk,,,\r\n' +
        '\r\n' +
        '# second repeat\r\n' +
        '1,initial,left,0.52,61,2151,in/s-pk,,,\r\n',
    );
    expect(parsed.errors).toEqual([]);
    expect(parsed.runs[0]!.rows).toEqual([3, 6]);
  });

  it('semicolons between the columns, names in any case, words in any case, cells with spaces', () => {
    const parsed = read(
      'RUN;Kind;sensorside;Amplitude;PHASEDEG;speedRpm;amplitudeUnit\n' +
        '1; Initial ;LEFT;0.5;60;2150;IN/S-PK\n',
    );
    expect(parsed.errors).toEqual([]);
    expect(parsed.runs[0]!.body).toEqual({
      kind: 'initial',
      readings: [{ sensorSide: 'left', repeats: [{ amplitude: 0.5, phaseDeg: 60, speedRpm: 2150 }] }],
    });
  });

  it('a file without the trial columns, for runs without a trial weight', () => {
    const parsed = read(
      'run,kind,sensorSide,amplitude,phaseDeg,speedRpm,amplitudeUnit\n1,initial,right,0.3,,2150,in/s-pk\n',
    );
    expect(parsed.errors).toEqual([]);
    expect(parsed.runs[0]!.body.readings[0]!.repeats[0]).toEqual({ amplitude: 0.3, speedRpm: 2150 });
  });

  it('runs in the order of their numbers, whatever order their rows come in', () => {
    const parsed = read(
      file(
        '2,trial,left,0.4,50,2150,in/s-pk,0,50,0',
        '1,initial,left,0.5,60,2150,in/s-pk,,,',
        '2,trial,left,0.41,51,2150,in/s-pk,0,50,0',
      ),
    );
    expect(parsed.errors).toEqual([]);
    expect(parsed.runs.map((run) => [run.fileRun, run.rows])).toEqual([
      [1, [3]],
      [2, [2, 4]],
    ]);
  });
});

describe('every bad row named, by its line and column, with the run schemas’ messages', () => {
  it('values out of range, text in a number, an unknown side or kind, a decimal comma', () => {
    const parsed = read(
      file(
        '1,initial,left,0.5,412,2150,in/s-pk,,,',
        '1,initial,left,abc,60,2150,in/s-pk,,,',
        '1,initial,middle,0.5,60,2150,in/s-pk,,,',
        '1,start,left,0.5,60,2150,in/s-pk,,,',
        '1,initial,left,"0,5",60,2150,in/s-pk,,,',
        '1,initial,left,0.5,60,-5,in/s-pk,,,',
      ),
    );
    expect(parsed.runs).toEqual([]);
    expect(parsed.errors).toEqual([
      {
        path: 'rows[2].phaseDeg',
        row: 2,
        column: 'phaseDeg',
        value: '412',
        message: 'The phase is from 0 to 359.9 degrees.',
      },
      expect.objectContaining({
        path: 'rows[3].amplitude',
        value: 'abc',
        message: expect.stringMatching(/not a number/),
      }),
      {
        path: 'rows[4].sensorSide',
        row: 4,
        column: 'sensorSide',
        value: 'middle',
        message: 'The side is left or right.',
      },
      expect.objectContaining({
        path: 'rows[5].kind',
        value: 'start',
        message: 'The run is one of initial, trial, verification.',
      }),
      expect.objectContaining({
        path: 'rows[6].amplitude',
        value: '0,5',
        message: expect.stringMatching(/decimal comma.*0\.5/),
      }),
      expect.objectContaining({ path: 'rows[7].speedRpm', message: 'The speed is above 0 rpm.' }),
    ]);
  });

  it('a missing value, a row with too few cells', () => {
    const parsed = read(file('1,initial,left,,60,2150,in/s-pk,,,', '1,initial,left,0.5'));
    expect(parsed.errors.map((error) => [error.path, error.message])).toEqual([
      ['rows[2].amplitude', 'Enter the amplitude.'],
      ['rows[3]', expect.stringMatching(/one value per column/)],
      ['rows[3].speedRpm', 'Enter the speed in rpm.'],
      ['rows[3].amplitudeUnit', 'The unit is in/s-pk or mm/s-rms.'],
    ]);
  });

  it('a unit other than the job’s, row by row', () => {
    const parsed = read(
      file('1,initial,left,12.1,60,2150,mm/s-rms,,,', '1,initial,left,0.5,60,2150,in/s-pk,,,'),
    );
    expect(parsed.errors).toEqual([
      expect.objectContaining({
        path: 'rows[2].amplitudeUnit',
        value: 'mm/s-rms',
        message: expect.stringMatching(/in\/s peak.*not mm\/s RMS/),
      }),
    ]);
  });

  it('a run read partly without phase: AddRun’s rule, on the rows without it', () => {
    const parsed = read(file('1,initial,left,0.5,60,2150,in/s-pk,,,', '1,initial,left,0.5,,2150,in/s-pk,,,'));
    expect(parsed.errors).toEqual([
      expect.objectContaining({
        path: 'rows[3].phaseDeg',
        message: expect.stringMatching(/Other readings of this run have a phase/),
      }),
    ]);
  });

  it('trial weights: missing, half given, on a run of another kind, differing within a run', () => {
    const parsed = read(
      file(
        '1,initial,left,0.5,60,2150,in/s-pk,0,50,0',
        '2,trial,left,0.4,50,2150,in/s-pk,,,',
        '3,trial,left,0.4,50,2150,in/s-pk,0,50,',
        '4,trial,left,0.4,50,2150,in/s-pk,0,50,0',
        '4,trial,left,0.4,50,2150,in/s-pk,0,60,0',
        '5,trial,left,0.4,50,2150,in/s-pk,0,50,90',
        '5,verification,left,0.4,50,2150,in/s-pk,0,50,90',
      ),
    );
    expect(parsed.errors.map((error) => [error.path, error.message])).toEqual([
      ['rows[2].trialMassGrams', 'Only a trial run has a trial weight.'],
      ['rows[3].trialMassGrams', 'A trial run names its trial weight.'],
      ['rows[4].trialAngleDeg', expect.stringMatching(/trial weight whole/)],
      ['rows[6].trialMassGrams', expect.stringMatching(/Line 5 of run 4 names another trial weight/)],
      ['rows[8].kind', expect.stringMatching(/every row of a run names the same kind/)],
    ]);
  });

  it('more than 20 repeats of one sensor in a run', () => {
    const rows = Array.from({ length: 21 }, () => '1,initial,left,0.5,60,2150,in/s-pk,,,');
    const parsed = read(file(...rows));
    expect(parsed.errors).toEqual([
      expect.objectContaining({
        path: 'rows[22].sensorSide',
        message: 'Run 1: At most 20 repeats a sensor.',
      }),
    ]);
  });
});

describe('a file that cannot be read as readings', () => {
  it('an empty file, a file of blank lines, a header without rows', () => {
    for (const text of ['', '\n\n  \n']) {
      expect(read(text).errors).toEqual([
        expect.objectContaining({ path: 'file', row: null, message: expect.stringMatching(/empty/) }),
      ]);
    }
    expect(read(`${HEADER}\n`).errors).toEqual([
      expect.objectContaining({ path: 'file', message: expect.stringMatching(/no readings/) }),
    ]);
  });

  it('bytes that are not UTF-8 text: an image, a NUL', () => {
    const png = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0xff, 0xfe]);
    expect(readReadingsCsv(png, 'in/s-pk').errors).toEqual([
      expect.objectContaining({ path: 'file', message: expect.stringMatching(/not text/) }),
    ]);
    expect(read(`${HEADER}\n1,initial,left,0.5,60,2150,in/s-pk\0,,,\n`).errors[0]!.path).toBe('file');
  });

  it('a missing column, an unknown one, one named twice, a trial weight without all three', () => {
    expect(
      read('run,kind,sensorSide,amplitude,phaseDeg,amplitudeUnit\n1,initial,left,0.5,60,in/s-pk\n').errors,
    ).toEqual([
      expect.objectContaining({ path: 'columns', message: expect.stringMatching(/no speedRpm column/) }),
    ]);
    expect(
      read('run,kind,sensorSide,amplitude,phase,speedRpm,amplitudeUnit,run\n').errors.map((e) => e.message),
    ).toEqual([
      expect.stringMatching(/“phase” is not a column/),
      'The column run is named twice: keep one.',
      expect.stringMatching(/no phaseDeg column: add it/),
    ]);
    expect(
      read('run,kind,sensorSide,amplitude,phaseDeg,speedRpm,amplitudeUnit,trialMassGrams\n').errors,
    ).toEqual([
      expect.objectContaining({ message: expect.stringMatching(/add trialPlaneIndex and trialAngleDeg/) }),
    ]);
    expect(read('run\tkind\tsensorSide\n1\tinitial\tleft\n').errors[0]!.message).toMatch(/tabs/);
  });

  it(`more than ${READINGS_CSV_MAX_ROWS} rows`, () => {
    const rows = Array.from(
      { length: READINGS_CSV_MAX_ROWS + 1 },
      (_, index) => `${index + 1},initial,left,0.5,60,2150,in/s-pk,,,`,
    );
    expect(read(file(...rows)).errors).toEqual([
      expect.objectContaining({ path: 'file', message: expect.stringMatching(/more than 1000 readings/) }),
    ]);
  });
});
