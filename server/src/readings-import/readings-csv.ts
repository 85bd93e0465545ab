import {
  type AddRun,
  AddRunSchema,
  type AmplitudeUnit,
  formatPath,
  READINGS_CSV_COLUMNS,
  READINGS_CSV_MAX_ROWS,
  READINGS_CSV_REQUIRED_COLUMNS,
  READINGS_CSV_TRIAL_COLUMNS,
  type ReadingsCsvColumn,
  type ReadingsCsvRow,
  ReadingsCsvRowSchema,
  type ReadingsImportError,
} from '@counterpoise/api';
import Papa from 'papaparse';

/*
 * Reads a readings file (docs/readings-csv.md) into the runs it holds, each as the AddRun body a technician
 * would have typed, and every row at fault. Nothing here knows the job beyond its unit: the jobs service
 * judges the runs against the job as it stands.
 */

/** A run of the file whose every row is right, as an AddRun body, with the lines its rows are on. */
export interface FileRun {
  /** The run's number in the file. */
  readonly fileRun: number;
  /** The lines of its rows, in the file's order. */
  readonly rows: readonly number[];
  readonly body: AddRun;
  /** The line of each repeat: `lines[sensor][repeat]`, in the order of `body.readings`. */
  readonly lines: readonly (readonly number[])[];
}

/** What a file holds: its runs (the good ones, by number) and everything wrong with it. */
export interface ReadingsFile {
  /** The data rows read (empty lines and comments not counted). */
  readonly rowCount: number;
  readonly runs: readonly FileRun[];
  readonly errors: readonly ReadingsImportError[];
}

const NUMERIC_COLUMNS: ReadonlySet<ReadingsCsvColumn> = new Set([
  'run',
  'amplitude',
  'phaseDeg',
  'speedRpm',
  'trialPlaneIndex',
  'trialMassGrams',
  'trialAngleDeg',
]);

/** A number as the format writes it: a decimal point, no thousands separator, an exponent allowed. */
const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

const UNIT_WORDS: Readonly<Record<AmplitudeUnit, string>> = {
  'in/s-pk': 'in/s peak (in/s-pk)',
  'mm/s-rms': 'mm/s RMS (mm/s-rms)',
};

/** The longest cell quoted back in an error. */
const VALUE_SHOWN = 40;

function shown(value: string): string {
  return value.length > VALUE_SHOWN ? `${value.slice(0, VALUE_SHOWN - 1)}…` : value;
}

function fileError(
  path: 'file' | 'columns',
  message: string,
  value: string | null = null,
): ReadingsImportError {
  return { path, message, row: null, column: null, value };
}

function rowError(
  line: number,
  column: ReadingsCsvColumn | null,
  value: string | null,
  message: string,
): ReadingsImportError {
  return {
    path: column === null ? formatPath(['rows', line]) : formatPath(['rows', line, column]),
    message,
    row: line,
    column,
    value: value === null ? null : shown(value),
  };
}

/** Bytes that are not text: a NUL, or a sequence that is not UTF-8. */
function decodeText(bytes: Uint8Array): string | null {
  if (bytes.includes(0)) return null;
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return null;
  }
}

/**
 * The delimiter the header line uses: a comma, or a semicolon when the header has semicolons and no comma
 * (what spreadsheets set to a decimal comma write). Anything else is read with commas, and fails on its
 * columns.
 */
function delimiterOf(text: string): ',' | ';' {
  const header = text.split(/\r\n|\n|\r/).find((line) => line.trim() !== '' && !line.startsWith('#')) ?? '';
  return header.includes(';') && !header.includes(',') ? ';' : ',';
}

/** Counts lines as the parser moves on, so each row gets the line it ends on (the header is line 1). */
function lineCounter(text: string) {
  let position = 0;
  let line = 1;
  return (cursor: number): number => {
    let end = cursor;
    // The cursor stands after the row's line break; the row itself ends before it.
    if (text[end - 1] === '\n') end--;
    if (text[end - 1] === '\r') end--;
    for (; position < end; position++) {
      const char = text[position];
      if (char === '\n' || (char === '\r' && text[position + 1] !== '\n')) line++;
    }
    return line;
  };
}

/**
 * Reads a readings file. `unit` is the job's set-up unit, which every row must name (null when the job has
 * no set-up yet: the unit is then not compared, and the job refuses the runs anyway).
 */
export function readReadingsCsv(bytes: Uint8Array, unit: AmplitudeUnit | null): ReadingsFile {
  const decoded = decodeText(bytes);
  if (decoded === null) {
    return {
      rowCount: 0,
      runs: [],
      errors: [
        fileError(
          'file',
          'The file is not text: it holds bytes that are not UTF-8 (a spreadsheet workbook, an image, a program?). ' +
            'Save the readings as CSV (UTF-8) and choose that file.',
        ),
      ],
    };
  }
  const text = decoded.replace(/^\uFEFF/, '');
  if (text.trim() === '') {
    return {
      rowCount: 0,
      runs: [],
      errors: [fileError('file', 'The file is empty: it needs a header row and one row per reading.')],
    };
  }

  const lineOf = lineCounter(text);
  const rows: { line: number; data: Record<string, unknown>; mismatch: string | null }[] = [];
  let tooMany = false;
  let fields: string[] = [];
  Papa.parse<Record<string, unknown>>(text, {
    header: true,
    delimiter: delimiterOf(text),
    comments: '#',
    skipEmptyLines: 'greedy',
    // Keyed by position as well, so that a name given twice stays two columns (and is refused as such).
    transformHeader: (header, index) => keyOf(index, header),
    step: (result, parser) => {
      fields = result.meta.fields ?? fields;
      if (rows.length === READINGS_CSV_MAX_ROWS) {
        tooMany = true;
        parser.abort();
        return;
      }
      const mismatch = result.errors.find((error) => error.type === 'FieldMismatch');
      rows.push({
        line: lineOf(result.meta.cursor),
        data: result.data,
        mismatch: mismatch === undefined ? null : mismatch.message,
      });
    },
  });
  if (fields.length === 0) {
    // A file of a header alone: the step never ran, so read the header by itself.
    fields =
      Papa.parse<string[]>(text, { delimiter: delimiterOf(text), comments: '#', preview: 1 }).data[0] ?? [];
    fields = fields.map((field, index) => keyOf(index, field));
  }

  const header = readHeader(fields);
  if (header.errors.length > 0) return { rowCount: rows.length, runs: [], errors: header.errors };
  if (tooMany) {
    return {
      rowCount: rows.length,
      runs: [],
      errors: [
        fileError(
          'file',
          `The file has more than ${READINGS_CSV_MAX_ROWS} readings: import it in parts of up to ${READINGS_CSV_MAX_ROWS} rows.`,
        ),
      ],
    };
  }
  if (rows.length === 0) {
    return {
      rowCount: 0,
      runs: [],
      errors: [fileError('file', 'The file has its header but no readings: add one row per reading.')],
    };
  }

  const errors: ReadingsImportError[] = [];
  const good: { line: number; row: ReadingsCsvRow }[] = [];
  const badRuns = new Set<number>();
  for (const { line, data, mismatch } of rows) {
    const checked = readRow(line, data, header.names, unit);
    if (mismatch !== null) {
      checked.errors.unshift(
        rowError(line, null, null, `The row does not have one value per column of the header (${mismatch}).`),
      );
    }
    if (checked.errors.length > 0) {
      errors.push(...checked.errors);
      if (checked.run !== undefined) badRuns.add(checked.run);
    } else {
      good.push({ line, row: checked.row! });
    }
  }

  const runs: FileRun[] = [];
  const numbers = [...new Set(good.map(({ row }) => row.run))].sort((a, b) => a - b);
  for (const number of numbers) {
    // A run with a bad row is not put together: its rules across rows are judged once every row is right.
    if (badRuns.has(number)) continue;
    const assembled = assembleRun(
      number,
      good.filter(({ row }) => row.run === number),
    );
    if ('errors' in assembled) errors.push(...assembled.errors);
    else runs.push(assembled);
  }
  return { rowCount: rows.length, runs, errors: errors.sort(byPlace) };
}

/** File-level errors first, then by line and by the columns' order. */
function byPlace(a: ReadingsImportError, b: ReadingsImportError): number {
  return (
    (a.row ?? 0) - (b.row ?? 0) ||
    columnIndex(a.column) - columnIndex(b.column) ||
    a.message.localeCompare(b.message)
  );
}

function columnIndex(column: ReadingsCsvColumn | null): number {
  return column === null ? -1 : READINGS_CSV_COLUMNS.indexOf(column);
}

/** The key of a header cell: its position and its name, trimmed (`3:amplitude`). */
function keyOf(index: number, header: string): string {
  return `${index}:${header.trim()}`;
}

/** The name of a header cell from its key. */
function nameOf(key: string): string {
  return key.slice(key.indexOf(':') + 1);
}

/** The header's names mapped to the format's columns (any case), or what is wrong with it. */
function readHeader(fields: readonly string[]): {
  names: Map<string, ReadingsCsvColumn>;
  errors: ReadingsImportError[];
} {
  const names = new Map<string, ReadingsCsvColumn>();
  const errors: ReadingsImportError[] = [];
  const known = new Map(READINGS_CSV_COLUMNS.map((column) => [column.toLowerCase(), column]));
  const seen = new Set<ReadingsCsvColumn>();
  for (const key of fields) {
    const field = nameOf(key);
    const column = known.get(field.toLowerCase());
    if (column === undefined) {
      errors.push(
        fileError(
          'columns',
          field === ''
            ? 'The header has a column without a name: name every column, or remove the empty one.'
            : field.includes('\t')
              ? 'The header is separated by tabs: separate the columns with commas.'
              : `“${shown(field)}” is not a column of a readings file: the columns are ${READINGS_CSV_COLUMNS.join(', ')}.`,
          field === '' ? null : shown(field),
        ),
      );
      continue;
    }
    if (seen.has(column)) {
      errors.push(fileError('columns', `The column ${column} is named twice: keep one.`, shown(field)));
      continue;
    }
    seen.add(column);
    names.set(key, column);
  }
  for (const column of READINGS_CSV_REQUIRED_COLUMNS) {
    if (!seen.has(column) && !errors.some((error) => error.value?.toLowerCase() === column.toLowerCase())) {
      errors.push(
        fileError(
          'columns',
          column === 'phaseDeg'
            ? 'The header has no phaseDeg column: add it (leave its cells empty for readings without phase).'
            : `The header has no ${column} column: every file has ${READINGS_CSV_REQUIRED_COLUMNS.join(', ')}.`,
        ),
      );
    }
  }
  const trial = READINGS_CSV_TRIAL_COLUMNS.filter((column) => seen.has(column));
  if (trial.length > 0 && trial.length < READINGS_CSV_TRIAL_COLUMNS.length) {
    const missing = READINGS_CSV_TRIAL_COLUMNS.filter((column) => !seen.has(column));
    errors.push(
      fileError(
        'columns',
        `The trial weight takes three columns: add ${missing.join(' and ')} beside ${trial.join(' and ')}.`,
      ),
    );
  }
  return { names, errors };
}

/** One data row read and checked with the run's rules; `run` is its run number when that could be read. */
function readRow(
  line: number,
  data: Record<string, unknown>,
  names: ReadonlyMap<string, ReadingsCsvColumn>,
  unit: AmplitudeUnit | null,
): { row?: ReadingsCsvRow; run?: number; errors: ReadingsImportError[] } {
  const errors: ReadingsImportError[] = [];
  const values: Partial<Record<ReadingsCsvColumn, unknown>> = {};
  const cells: Partial<Record<ReadingsCsvColumn, string>> = {};
  for (const [field, column] of names) {
    const raw = data[field];
    const cell = typeof raw === 'string' ? raw.trim() : '';
    cells[column] = cell;
    if (cell === '') continue;
    if (NUMERIC_COLUMNS.has(column)) {
      if (!DECIMAL.test(cell)) {
        errors.push(
          rowError(
            line,
            column,
            cell,
            /^[+-]?\d*,\d+$/.test(cell)
              ? `“${shown(cell)}” has a decimal comma: write numbers with a decimal point (${cell.replace(',', '.')}).`
              : `“${shown(cell)}” is not a number: write the ${describe(column)} as a number with a decimal point, such as ${exampleOf(column)}.`,
          ),
        );
        continue;
      }
      values[column] = Number(cell);
    } else {
      values[column] = cell.toLowerCase();
    }
  }
  const run = typeof values.run === 'number' && Number.isInteger(values.run) ? values.run : undefined;
  const parsed = ReadingsCsvRowSchema.safeParse(values);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const column = issue.path[0] as ReadingsCsvColumn;
      // A cell already refused as no number is not refused again as missing.
      if (errors.some((error) => error.column === column)) continue;
      const cell = cells[column] ?? '';
      errors.push(rowError(line, column, cell === '' ? null : cell, issue.message));
    }
  }
  const trialGiven = READINGS_CSV_TRIAL_COLUMNS.filter((column) => (cells[column] ?? '') !== '');
  if (trialGiven.length > 0 && trialGiven.length < READINGS_CSV_TRIAL_COLUMNS.length) {
    for (const column of READINGS_CSV_TRIAL_COLUMNS) {
      if (trialGiven.includes(column) || errors.some((error) => error.column === column)) continue;
      errors.push(
        rowError(
          line,
          column,
          null,
          'Give the trial weight whole: its plane, mass in grams and angle in degrees.',
        ),
      );
    }
  }
  if (parsed.success && unit !== null && parsed.data.amplitudeUnit !== unit) {
    errors.push(
      rowError(
        line,
        'amplitudeUnit',
        cells.amplitudeUnit ?? null,
        `The job’s set-up reads amplitudes in ${UNIT_WORDS[unit]}, not ${UNIT_WORDS[parsed.data.amplitudeUnit]}: ` +
          'export the readings in the job’s unit.',
      ),
    );
  }
  return errors.length > 0 || !parsed.success ? { run, errors } : { row: parsed.data, run, errors };
}

function describe(column: ReadingsCsvColumn): string {
  return {
    run: 'run number',
    kind: 'kind',
    sensorSide: 'side',
    amplitude: 'amplitude',
    phaseDeg: 'phase in degrees',
    speedRpm: 'speed in rpm',
    amplitudeUnit: 'unit',
    trialPlaneIndex: 'trial plane (0 or 1)',
    trialMassGrams: 'trial mass in grams',
    trialAngleDeg: 'trial angle in degrees',
  }[column];
}

function exampleOf(column: ReadingsCsvColumn): string {
  return (
    (
      { run: '1', amplitude: '0.31', phaseDeg: '212', speedRpm: '2150', trialPlaneIndex: '0' } as Partial<
        Record<ReadingsCsvColumn, string>
      >
    )[column] ?? '40'
  );
}

/** The rows of one run, every one right, as the AddRun body they make, or the rules across rows it breaks. */
function assembleRun(
  fileRun: number,
  rows: readonly { line: number; row: ReadingsCsvRow }[],
): FileRun | { errors: ReadingsImportError[] } {
  const errors: ReadingsImportError[] = [];
  const first = rows[0]!;
  const label = `run ${fileRun}`;
  for (const { line, row } of rows.slice(1)) {
    if (row.kind !== first.row.kind) {
      errors.push(
        rowError(
          line,
          'kind',
          row.kind,
          `The first row of ${label} (line ${first.line}) says ${first.row.kind}: every row of a run names the same kind.`,
        ),
      );
    }
  }
  const trialOf = (row: ReadingsCsvRow) =>
    row.trialMassGrams === undefined
      ? undefined
      : { planeIndex: row.trialPlaneIndex!, massGrams: row.trialMassGrams, angleDeg: row.trialAngleDeg! };
  const withTrial = rows.find(({ row }) => trialOf(row) !== undefined);
  const trialWeight = withTrial === undefined ? undefined : trialOf(withTrial.row)!;
  if (first.row.kind === 'trial' && withTrial !== undefined && trialWeight !== undefined) {
    for (const { line, row } of rows) {
      const own = trialOf(row);
      if (own === undefined) {
        errors.push(
          rowError(line, 'trialMassGrams', null, `Name the trial weight of ${label} on each of its rows.`),
        );
      } else if (
        own.planeIndex !== trialWeight.planeIndex ||
        own.massGrams !== trialWeight.massGrams ||
        own.angleDeg !== trialWeight.angleDeg
      ) {
        errors.push(
          rowError(
            line,
            'trialMassGrams',
            String(own.massGrams),
            `Line ${withTrial.line} of ${label} names another trial weight ` +
              `(${trialWeight.massGrams} g at ${trialWeight.angleDeg}° in plane ${trialWeight.planeIndex}): ` +
              'a run has one trial weight.',
          ),
        );
      }
    }
  }
  if (errors.length > 0) return { errors };

  const sides: ReadingsCsvRow['sensorSide'][] = [];
  for (const { row } of rows) if (!sides.includes(row.sensorSide)) sides.push(row.sensorSide);
  const bySide = sides.map((side) => rows.filter(({ row }) => row.sensorSide === side));
  const body: AddRun = {
    kind: first.row.kind,
    ...(trialWeight === undefined ? {} : { trialWeight }),
    readings: bySide.map((sensorRows, index) => ({
      sensorSide: sides[index]!,
      repeats: sensorRows.map(({ row }) => ({
        amplitude: row.amplitude,
        ...(row.phaseDeg === undefined ? {} : { phaseDeg: row.phaseDeg }),
        speedRpm: row.speedRpm,
      })),
    })),
  };
  const lines = bySide.map((sensorRows) => sensorRows.map(({ line }) => line));

  // The rules across the rows of a run are AddRun's own: one phase rule, the trial weight, the repeats.
  const checked = AddRunSchema.safeParse(body);
  if (!checked.success) {
    for (const issue of checked.error.issues) {
      errors.push(
        runIssue(issue.path, issue.message, {
          fileRun,
          first: first.line,
          lines,
          withTrial: withTrial?.line,
        }),
      );
    }
    return { errors };
  }
  return { fileRun, rows: rows.map(({ line }) => line), body, lines };
}

/** An AddRun issue (`readings[1].repeats[2].phaseDeg`) put on the row and column it came from. */
function runIssue(
  path: readonly PropertyKey[],
  message: string,
  run: {
    fileRun: number;
    first: number;
    lines: readonly (readonly number[])[];
    withTrial: number | undefined;
  },
): ReadingsImportError {
  if (path[0] === 'readings' && typeof path[1] === 'number') {
    const sensorLines = run.lines[path[1]] ?? [];
    if (path[2] === 'repeats' && typeof path[3] === 'number') {
      const field = path[4];
      const column: ReadingsCsvColumn =
        field === 'phaseDeg' || field === 'amplitude' || field === 'speedRpm' ? field : 'sensorSide';
      return rowError(sensorLines[path[3]] ?? run.first, column, null, message);
    }
    // Too many repeats of one sensor: the first row over the limit.
    return rowError(sensorLines.at(-1) ?? run.first, 'sensorSide', null, `Run ${run.fileRun}: ${message}`);
  }
  if (path[0] === 'trialWeight') {
    return rowError(run.withTrial ?? run.first, 'trialMassGrams', null, message);
  }
  return rowError(run.first, null, null, `Run ${run.fileRun}: ${message}`);
}
