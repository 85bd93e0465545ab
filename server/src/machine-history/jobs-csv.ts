import type { AcceptanceLevel, InstalledWeight, Job, MachineHistoryJob } from '@counterpoise/api';
import Papa from 'papaparse';
import type { SignedReport } from './machine-history.repo';

/*
 * The shop's jobs as a CSV file a spreadsheet opens as it is: UTF-8 with a byte order mark (so accents
 * read right), CRLF line ends, fields quoted where they hold a comma, a quote or a line break (papaparse's
 * `unparse`), and text that a spreadsheet would run as a formula (beginning with =, +, -, @, a tab or a
 * carriage return) prefixed with an apostrophe (papaparse's `escapeFormulae`, which leaves numbers alone,
 * so a negative number stays a number). The columns: docs/machine-history.md.
 */

/** The byte order mark that tells a spreadsheet the file is UTF-8. */
export const UTF8_BOM = '\uFEFF';

/** The columns of the export, in order: names of our own. */
export const JOBS_CSV_COLUMNS = [
  'Job no.',
  'Scheduled for',
  'Completed on',
  'Customer',
  'Make',
  'Model',
  'Serial number',
  'Family',
  'Technician',
  'State',
  'Methods',
  'Unit',
  'Left before',
  'Left after',
  'Right before',
  'Right after',
  'Acceptance level',
  'Within acceptance',
  'Weights fitted',
  'Report signed',
  'Report signed on',
] as const;

type Cell = string | number;

/** An amplitude to four significant digits, as a number; an empty cell when there is none. */
function amplitudeCell(value: number | null | undefined): Cell {
  return value === null || value === undefined ? '' : Number(value.toPrecision(4));
}

function yesNo(value: boolean | null): string {
  return value === null ? '' : value ? 'yes' : 'no';
}

/** The acceptance level in words, with the source it comes from. */
export function acceptanceText(level: AcceptanceLevel | null): string {
  if (level === null) return '';
  switch (level.kind) {
    case 'shop-target':
      return `Shop target ${level.amplitude} ${level.unit}`;
    case 'balance-grade':
      return `Balance grade ${level.grade} (ISO 21940-11)`;
    case 'severity-zone':
      return (
        `Zone ${level.zone}, group ${level.group}, ${level.foundation} foundation ` +
        '(ISO 10816-3 / 20816-3, guidance)'
      );
  }
}

/** The weights a job fitted, in one cell: "plane 1: 42 g at 118°, 210 mm, welded; plane 2: …". */
export function weightsText(weights: readonly InstalledWeight[]): string {
  return weights
    .map(
      (weight) =>
        `plane ${weight.planeIndex + 1}: ${Number(weight.massGrams.toPrecision(4))} g at ` +
        `${Number(weight.angleDeg.toFixed(1))}°, ${Number(weight.radiusMm.toFixed(1))} mm, ${weight.fixing}`,
    )
    .join('; ');
}

/** One job's row. */
function rowOf(job: Job, figures: MachineHistoryJob, report: SignedReport | undefined): Cell[] {
  const side = (name: 'left' | 'right') => figures.sides.find((figure) => figure.sensorSide === name);
  return [
    job.id,
    job.scheduledFor,
    figures.completedAt?.slice(0, 10) ?? '',
    job.machine.customerName,
    job.machine.make ?? '',
    job.machine.model ?? '',
    job.machine.serialNumber ?? '',
    job.machine.familyName ?? '',
    job.technician.name,
    job.status,
    figures.methods.join('; '),
    figures.unit ?? '',
    amplitudeCell(side('left')?.before?.amplitude),
    amplitudeCell(side('left')?.after?.amplitude),
    amplitudeCell(side('right')?.before?.amplitude),
    amplitudeCell(side('right')?.after?.amplitude),
    acceptanceText(figures.acceptance),
    yesNo(figures.accepted),
    weightsText(figures.weightsFitted),
    report === undefined ? 'no' : 'yes',
    report === undefined ? '' : report.signedAt.toISOString().slice(0, 10),
  ];
}

/** The CSV text of the jobs (with their figures and signed reports), BOM first, one row per job. */
export function jobsCsv(
  jobs: readonly { job: Job; figures: MachineHistoryJob }[],
  reports: ReadonlyMap<number, SignedReport>,
): string {
  const text = Papa.unparse(
    {
      fields: [...JOBS_CSV_COLUMNS],
      data: jobs.map(({ job, figures }) => rowOf(job, figures, reports.get(job.id))),
    },
    { newline: '\r\n', escapeFormulae: true, quotes: false },
  );
  // Every line ends in CRLF, the last one too (papaparse ends a file of the header alone so already).
  return `${UTF8_BOM}${text}${text.endsWith('\r\n') ? '' : '\r\n'}`;
}
