import { dirname, join, resolve, sep } from 'node:path';
import { createRequire } from 'node:module';
import type { AcceptanceLevel, AmplitudeUnit, MachineSide } from '@counterpoise/api';
import { countingSeen, ISO_10816_3_ZONE_LIMITS_MM_S_RMS } from '@counterpoise/engine';
import pdfMake from 'pdfmake';
import type { Content, TableCell, TDocumentDefinitions } from 'pdfmake/interfaces';
import { type Counting, endViewSvg, formatFigure, polarPlotSvg } from './report-drawings';
import type { ReportReading, ReportSource } from './report-source';

/*
 * The service report as a PDF, built with pdfmake from a `ReportSource`. Its fonts are pdfmake's own
 * Roboto files, read from the installed package; pdfmake may read no other file and fetch nothing.
 */

const FONT_DIR = join(
  dirname(createRequire(import.meta.url).resolve('pdfmake/package.json')),
  'fonts',
  'Roboto',
);

pdfMake.setFonts({
  Roboto: {
    normal: join(FONT_DIR, 'Roboto-Regular.ttf'),
    bold: join(FONT_DIR, 'Roboto-Medium.ttf'),
    italics: join(FONT_DIR, 'Roboto-Italic.ttf'),
    bolditalics: join(FONT_DIR, 'Roboto-MediumItalic.ttf'),
  },
});
pdfMake.setUrlAccessPolicy(() => false);
pdfMake.setLocalAccessPolicy((path) => resolve(path).startsWith(FONT_DIR + sep));

/** The signature printed on a signed revision. */
export interface ReportSignature {
  readonly revision: number;
  readonly signerName: string;
  /** ISO time of the signing. */
  readonly signedAt: string;
  readonly png: Buffer;
}

/** The words printed on every page of a report nobody has signed. */
export const DRAFT_MARK = 'Draft, not signed';

/** The safety notice of every report: it defers to the manufacturer, the site and the law. */
export const REPORT_SAFETY_NOTICE =
  'This report records the balancing work described above. It does not replace the machine ' +
  'manufacturer’s operator and service manuals, the rules of the site, local codes and regulations, ' +
  'or the judgement of licensed and qualified people. Lock out the machine before any work on the rotor, ' +
  'keep guards in place and people clear of the rotor’s plane while it turns, and check every weight ' +
  'and its fixing before the machine runs again.';

const UNIT_LABELS: Readonly<Record<AmplitudeUnit, string>> = {
  'in/s-pk': 'in/s peak',
  'mm/s-rms': 'mm/s RMS',
};
const SIDE_LABELS: Readonly<Record<MachineSide, string>> = { left: 'Left', right: 'Right' };
const SAFETY_TOPIC_LABELS: Readonly<Record<string, string>> = {
  lockout: 'lock-out and tag-out',
  running: 'guards on and people clear of a turning rotor',
  'hot-work': 'hot work near fuel and debris',
  weights: 'checking every weight and its fixing',
  protection: 'eye and hearing protection',
};
const CHECK_LABELS: Readonly<Record<string, string>> = {
  teethOrKnives: 'Teeth, knives or hammers',
  buildUpCleaned: 'Build-up and wrapped material',
  welds: 'Welds',
  beltsAndPulleys: 'Belts and pulleys',
};
const CHECK_VALUES: Readonly<Record<string, string>> = {
  ok: 'OK as found',
  fixed: 'Fixed',
  fault: 'Fault left',
};

/** `2026-05-04 09:12 UTC`. */
export function formatTime(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

/** An amplitude as the report prints it, with its unit: `0.231 in/s peak`. */
export function formatAmplitude(value: number, unit: AmplitudeUnit): string {
  return `${formatFigure(value)} ${UNIT_LABELS[unit]}`;
}

const degrees = (value: number | null) => (value === null ? 'no phase' : `${formatFigure(value, 4)}°`);
const text = (value: string | number | null | undefined) =>
  value === null || value === undefined || value === '' ? '–' : String(value);

function planeName(index: number, count: number): string {
  if (count <= 1) return 'Plane';
  return index === 0 ? 'Left plane' : 'Right plane';
}

/** The end a plane is seen from: the left plane from the left end, the right plane from the right end. */
function planeSide(index: number, count: number): MachineSide {
  return count > 1 && index === 1 ? 'right' : 'left';
}

function rotationSeenFrom(side: MachineSide, seenFromLeft: Counting): Counting {
  if (side === 'left') return seenFromLeft;
  return seenFromLeft === 'clockwise' ? 'counterClockwise' : 'clockwise';
}

/** The acceptance level in words, with its standard. */
export function describeLevel(level: AcceptanceLevel): string {
  switch (level.kind) {
    case 'shop-target':
      return `Shop target: ${formatAmplitude(level.amplitude, level.unit)} or less on each side`;
    case 'balance-grade':
      return `Balance quality grade ${level.grade} (ISO 21940-11)`;
    case 'severity-zone': {
      const [ab, bc] = ISO_10816_3_ZONE_LIMITS_MM_S_RMS[level.group][level.foundation];
      return (
        `Zone ${level.zone} or better, machine group ${level.group}, ${level.foundation} foundation ` +
        `(ISO 10816-3 / 20816-3; zone limit ${formatFigure(level.zone === 'A' ? ab : bc)} mm/s RMS), ` +
        'as guidance only: mobile machines are outside the scope of these zones'
      );
    }
  }
}

/** A section's title; it never stands alone at the foot of a page (see `pageBreakBefore`). */
const section = (title: string): Content => ({ text: title, style: 'section', headlineLevel: 1 });

function keyValues(rows: readonly (readonly [string, string])[]): Content {
  return {
    table: {
      widths: [110, '*'],
      body: rows.map(([key, value]) => [
        { text: key, style: 'key' },
        { text: value, style: 'value' },
      ]),
    },
    layout: 'noBorders',
  };
}

function readingCells(reading: ReportReading): TableCell[] {
  return [
    { text: formatFigure(reading.amplitude), alignment: 'right' },
    { text: degrees(reading.phaseDeg), alignment: 'right' },
    { text: reading.speedRpm === null ? '–' : formatFigure(reading.speedRpm, 5), alignment: 'right' },
  ];
}

function readingsSection(source: ReportSource): Content[] {
  const unit = source.setup?.unit ?? 'in/s-pk';
  if (source.readings.length === 0) return [{ text: 'No readings were recorded.', style: 'value' }];
  const header: TableCell[] = [
    { text: 'Side', style: 'th' },
    { text: `Before (${UNIT_LABELS[unit]})`, style: 'th', alignment: 'right' },
    { text: 'Phase', style: 'th', alignment: 'right' },
    { text: 'Speed (rpm)', style: 'th', alignment: 'right' },
    { text: `After (${UNIT_LABELS[unit]})`, style: 'th', alignment: 'right' },
    { text: 'Phase', style: 'th', alignment: 'right' },
    { text: 'Speed (rpm)', style: 'th', alignment: 'right' },
    { text: 'Change', style: 'th', alignment: 'right' },
  ];
  const body: TableCell[][] = [
    header,
    ...source.readings.map((side) => {
      const change =
        side.before.amplitude > 0
          ? `${formatFigure(((side.after.amplitude - side.before.amplitude) / side.before.amplitude) * 100, 2)} %`
          : '–';
      return [
        { text: SIDE_LABELS[side.sensorSide] },
        ...readingCells(side.before),
        ...readingCells(side.after),
        { text: change, alignment: 'right' },
      ] as TableCell[];
    }),
  ];
  const phaseNote = source.setup
    ? `Amplitude at 1× running speed in ${UNIT_LABELS[unit]}; phase as the instrument read it (a ${source.setup.phaseSense} of the reference mark). ` +
      'Before: the initial run. After: the last run of the job.'
    : '';
  const plots: Content[] = source.readings.map((side) => {
    const counting = source.setup
      ? countingSeen({
          rotation: rotationSeenFrom(side.sensorSide, source.setup.rotationSeenFromLeft),
          counting: source.setup.weightAngles,
        })
      : 'clockwise';
    return {
      stack: [
        { text: `${SIDE_LABELS[side.sensorSide]} side`, style: 'figureTitle' },
        {
          svg: polarPlotSvg({
            size: 220,
            unit: UNIT_LABELS[unit],
            counting,
            points: [
              {
                label: 'before',
                kind: 'before',
                amplitude: side.before.amplitude,
                phaseDeg: side.before.phaseDeg,
              },
              {
                label: 'after',
                kind: 'after',
                amplitude: side.after.amplitude,
                phaseDeg: side.after.phaseDeg,
              },
            ],
          }),
          width: 220,
        },
        {
          text: `0° at the reference mark; angles increase ${counting === 'clockwise' ? 'clockwise' : 'counter-clockwise'} as seen from the ${side.sensorSide} end.`,
          style: 'caption',
        },
      ],
      width: '*',
    };
  });
  return [
    {
      table: { headerRows: 1, widths: [40, '*', 40, 48, '*', 40, 48, 44], body },
      layout: 'lightHorizontalLines',
      style: 'table',
    },
    { text: phaseNote, style: 'caption' },
    { columns: plots, columnGap: 16, margin: [0, 8, 0, 0], unbreakable: true } as Content,
  ];
}

function weightsSection(source: ReportSource): Content[] {
  const count = source.machine.planeCount;
  const content: Content[] = [];
  if (source.weights.length === 0) {
    content.push({ text: 'No weight was fitted on this job.', style: 'value' });
  } else {
    content.push({
      table: {
        headerRows: 1,
        widths: [22, '*', 60, 60, 70, 60],
        body: [
          [
            { text: 'No.', style: 'th' },
            { text: 'Plane', style: 'th' },
            { text: 'Mass (g)', style: 'th', alignment: 'right' },
            { text: 'Angle', style: 'th', alignment: 'right' },
            { text: 'Radius (mm)', style: 'th', alignment: 'right' },
            { text: 'Fixed by', style: 'th' },
          ],
          ...source.weights.map((weight, index) => [
            { text: `W${index + 1}` },
            { text: `${planeName(weight.planeIndex, count)} (correction ${weight.correction})` },
            { text: formatFigure(weight.massGrams, 4), alignment: 'right' },
            { text: `${formatFigure(weight.angleDeg, 4)}°`, alignment: 'right' },
            { text: formatFigure(weight.radiusMm, 4), alignment: 'right' },
            { text: weight.fixing === 'welded' ? 'Welded' : 'Bolted' },
          ]),
        ] as TableCell[][],
      },
      layout: 'lightHorizontalLines',
      style: 'table',
    });
  }
  if (source.setup) {
    const setup = source.setup;
    const views: Content[] = Array.from({ length: count }, (_, planeIndex) => {
      const side = planeSide(planeIndex, count);
      const rotation = rotationSeenFrom(side, setup.rotationSeenFromLeft);
      const counting = countingSeen({ rotation, counting: setup.weightAngles });
      const weights = source.weights
        .map((weight, index) => ({ weight, index }))
        .filter(({ weight }) => weight.planeIndex === planeIndex)
        .map(({ weight, index }) => ({
          label: `W${index + 1}`,
          angleDeg: weight.angleDeg,
          legend:
            `W${index + 1}: ${formatFigure(weight.massGrams, 4)} g at ${formatFigure(weight.angleDeg, 4)}°, ` +
            `${formatFigure(weight.radiusMm, 4)} mm, ${weight.fixing}`,
        }));
      return {
        stack: [
          { text: `${planeName(planeIndex, count)}, seen from the ${side} end`, style: 'figureTitle' },
          { svg: endViewSvg({ size: 230, rotation, counting, weights }), width: 230 },
          ...(weights.length === 0
            ? [{ text: 'No weight fitted in this plane.', style: 'value' } as Content]
            : weights.map((weight) => ({ text: weight.legend, style: 'value' }) as Content)),
          {
            text:
              `The rotor turns ${rotation === 'clockwise' ? 'clockwise' : 'counter-clockwise'} seen from here (arrow); ` +
              `weight angles count ${setup.weightAngles === 'againstRotation' ? 'against' : 'with'} the rotation from the reference mark.`,
            style: 'caption',
          },
        ],
        width: '*',
      };
    });
    content.push({ columns: views, columnGap: 16, margin: [0, 8, 0, 0], unbreakable: true } as Content);
  }
  if (source.earlierWeights.length > 0) {
    content.push({
      text:
        'Weights earlier jobs left on the rotor: ' +
        source.earlierWeights
          .map(
            (weight) =>
              `${planeName(weight.planeIndex, count).toLowerCase()} ${formatFigure(weight.massGrams, 4)} g at ` +
              `${formatFigure(weight.angleDeg, 4)}°, ${formatFigure(weight.radiusMm, 4)} mm, ${weight.fixing}`,
          )
          .join('; ') +
        '.',
      style: 'caption',
    });
  }
  return content;
}

function acceptanceSection(source: ReportSource): Content[] {
  const acceptance = source.acceptance;
  const unit = source.setup?.unit ?? 'in/s-pk';
  if (acceptance === null) {
    return [{ text: 'No acceptance level is set for this machine or its family.', style: 'value' }];
  }
  const origin =
    acceptance.source === 'machine'
      ? 'set on this machine'
      : `set for the machine family${source.machine.familyName ? ` “${source.machine.familyName}”` : ''}`;
  const rows: [string, string][] = [
    ['Level', describeLevel(acceptance.level)],
    ['Where it comes from', origin],
  ];
  if (acceptance.permissible) {
    const p = acceptance.permissible;
    rows.push([
      'Permissible residual unbalance',
      `${formatFigure(p.totalGmm, 4)} g·mm for the rotor (${formatFigure(p.rotorMassKg, 4)} kg at ` +
        `${formatFigure(p.speedRpm, 5)} rpm)` +
        (p.perPlaneGmm.length > 1
          ? `, ${p.perPlaneGmm.map((value) => formatFigure(value, 4)).join(' and ')} g·mm per plane`
          : ''),
    ]);
  } else if (acceptance.level.kind === 'balance-grade') {
    rows.push(['Permissible residual unbalance', 'Not computed: the machine record has no rotor mass.']);
  }
  rows.push(['Result', acceptance.accepted ? 'Met on every side' : 'Not met']);
  const body: TableCell[][] = [
    [
      { text: 'Side', style: 'th' },
      { text: `Last run (${UNIT_LABELS[unit]})`, style: 'th', alignment: 'right' },
      { text: `Limit (${UNIT_LABELS[unit]})`, style: 'th', alignment: 'right' },
      { text: 'Within', style: 'th' },
    ],
    ...acceptance.sides.map((side) => [
      { text: SIDE_LABELS[side.sensorSide] },
      { text: formatFigure(side.amplitude), alignment: 'right' },
      {
        text: side.limit === null ? 'cannot be read as an amplitude' : formatFigure(side.limit),
        alignment: 'right',
      },
      { text: side.accepted ? 'Yes' : 'No' },
    ]),
  ] as TableCell[][];
  return [
    keyValues(rows),
    ...(acceptance.sides.length > 0
      ? [
          {
            table: { headerRows: 1, widths: [50, '*', '*', 50], body },
            layout: 'lightHorizontalLines',
            style: 'table',
          } as Content,
        ]
      : []),
  ];
}

function inspectionSection(source: ReportSource): Content[] {
  const inspection = source.inspection;
  if (inspection === null) return [{ text: 'No inspection was recorded.', style: 'value' }];
  const judged = (measured: number, limit: number) => (measured <= limit ? 'Within' : 'Over the limit');
  const content: Content[] = [
    {
      table: {
        headerRows: 1,
        widths: ['*', 70, 70, 80],
        body: [
          [
            { text: 'Measured', style: 'th' },
            { text: 'Value (mm)', style: 'th', alignment: 'right' },
            { text: 'Limit (mm)', style: 'th', alignment: 'right' },
            { text: 'Result', style: 'th' },
          ],
          [
            'Bearing end play',
            { text: formatFigure(inspection.bearingEndPlayMm, 4), alignment: 'right' },
            { text: formatFigure(inspection.limits.bearingEndPlayMm, 4), alignment: 'right' },
            judged(inspection.bearingEndPlayMm, inspection.limits.bearingEndPlayMm),
          ],
          [
            'Shaft runout',
            { text: formatFigure(inspection.shaftRunoutMm, 4), alignment: 'right' },
            { text: formatFigure(inspection.limits.shaftRunoutMm, 4), alignment: 'right' },
            judged(inspection.shaftRunoutMm, inspection.limits.shaftRunoutMm),
          ],
          ...Object.entries(inspection.checks).map(([check, value]) => [
            CHECK_LABELS[check] ?? check,
            { text: '', alignment: 'right' },
            { text: '', alignment: 'right' },
            CHECK_VALUES[value] ?? value,
          ]),
        ] as TableCell[][],
      },
      layout: 'lightHorizontalLines',
      style: 'table',
    },
    {
      text: `Measured ${formatTime(inspection.at)} by ${inspection.by}. ${
        inspection.passed
          ? 'The inspection passed.'
          : `The inspection did not pass: ${inspection.reasons.join(' ')}`
      }`,
      style: 'caption',
    },
  ];
  if (inspection.notes) content.push({ text: `Notes: ${inspection.notes}`, style: 'caption' });
  if (inspection.override) {
    content.push({
      table: {
        widths: ['*'],
        body: [
          [
            {
              stack: [
                { text: 'Manager’s override', bold: true },
                {
                  text: `${inspection.override.by} let the job go on, ${formatTime(inspection.override.at)}. Reason: ${inspection.override.reason}`,
                },
              ],
              fillColor: '#fff4e5',
              margin: [6, 4, 6, 4],
            },
          ],
        ],
      },
      layout: 'noBorders',
      margin: [0, 4, 0, 0],
    });
  }
  return content;
}

function signatureSection(signature: ReportSignature | null): Content {
  if (signature === null) {
    return {
      table: {
        widths: ['*'],
        heights: [70],
        body: [[{ text: `${DRAFT_MARK}: the customer has not signed this report.`, style: 'draftBox' }]],
      },
    };
  }
  return {
    stack: [
      { image: `data:image/png;base64,${signature.png.toString('base64')}`, fit: [240, 90] },
      {
        canvas: [{ type: 'line', x1: 0, y1: 2, x2: 240, y2: 2, lineWidth: 0.8, lineColor: '#1f2933' }],
      },
      {
        text: `Signed by ${signature.signerName}, ${formatTime(signature.signedAt)}`,
        style: 'value',
        margin: [0, 3, 0, 0],
      },
    ],
    unbreakable: true,
  };
}

/** The pdfmake document of a report; `signature` null for a draft. */
export function reportDocument(
  source: ReportSource,
  signature: ReportSignature | null,
): TDocumentDefinitions {
  const unit = source.setup?.unit ?? null;
  const machineName = [source.machine.make, source.machine.model].filter(Boolean).join(' ') || '–';
  const contact = source.customer.contacts[0];
  const mark = signature === null ? DRAFT_MARK : `Revision ${signature.revision}`;
  return {
    pageSize: 'A4',
    pageMargins: [40, 56, 40, 48],
    info: {
      title: `Service report ${source.jobNumber}`,
      author: source.shopName,
      subject: `Field balancing of ${machineName}`,
      creator: 'Counterpoise',
      producer: 'Counterpoise',
    },
    ...(signature === null
      ? { watermark: { text: DRAFT_MARK, color: '#c4320a', opacity: 0.12, bold: true } }
      : {}),
    header: () => ({
      columns: [
        { text: source.shopName, style: 'running' },
        { text: `Service report ${source.jobNumber} · ${mark}`, style: 'running', alignment: 'right' },
      ],
      margin: [40, 24, 40, 0],
    }),
    footer: (currentPage: number, pageCount: number) => ({
      columns: [
        {
          text: `${source.jobNumber} · ${signature === null ? DRAFT_MARK : `signed revision ${signature.revision}`}`,
          style: 'running',
        },
        { text: `Page ${currentPage} of ${pageCount}`, style: 'running', alignment: 'right' },
      ],
      margin: [40, 16, 40, 0],
    }),
    content: [
      { text: 'Service report: field balancing', style: 'title' },
      {
        text: [
          { text: `${source.shopName} · Job ${source.jobNumber}`, bold: true },
          signature === null
            ? { text: ` · ${DRAFT_MARK}`, color: '#c4320a', bold: true }
            : ` · revision ${signature.revision}`,
        ],
        margin: [0, 0, 0, 8],
      },
      {
        columns: [
          {
            stack: [
              section('Customer'),
              keyValues([
                ['Name', source.customer.name],
                ['Site', text(source.customer.siteAddress)],
                ['Contact', contact ? [contact.name, contact.role].filter(Boolean).join(', ') : '–'],
                ['E-mail', text(source.customer.email)],
                ['Phone', text(source.customer.phone)],
              ]),
            ],
          },
          {
            stack: [
              section('Machine'),
              keyValues([
                ['Make and model', machineName],
                ['Serial number', text(source.machine.serialNumber)],
                ['Hours', source.machine.hours === null ? '–' : formatFigure(source.machine.hours, 7)],
                ['Family', text(source.machine.familyName)],
                [
                  'Rotor mass',
                  source.machine.rotorMassKg === null
                    ? '–'
                    : `${formatFigure(source.machine.rotorMassKg, 5)} kg`,
                ],
              ]),
            ],
          },
        ],
        columnGap: 20,
      },
      section('Work'),
      keyValues([
        ['Technician', source.technician],
        ['Scheduled for', source.scheduledFor],
        [
          'Completed',
          source.completedAt === null
            ? 'Not completed'
            : `${formatTime(source.completedAt)} by ${text(source.completedBy)}`,
        ],
        [
          'Signed',
          signature === null ? DRAFT_MARK : `${formatTime(signature.signedAt)} by ${signature.signerName}`,
        ],
        ['Amplitude unit', unit === null ? '–' : UNIT_LABELS[unit]],
        [
          'Set-up',
          source.setup
            ? `${source.setup.sensors.map((sensor) => `${SIDE_LABELS[sensor.side]} sensor: ${sensor.position || '–'}`).join('; ')}. ` +
              `Tachometer: ${text(source.setup.tachometer)}. Reference mark: ${text(source.setup.referenceMark)}. ` +
              `Operating speed ${formatFigure(source.setup.operatingSpeedRpm, 5)} rpm.`
            : '–',
        ],
      ]),
      section('Safety acknowledgement'),
      source.safety
        ? {
            text:
              `${source.safety.by} acknowledged the safety cautions, ${formatTime(source.safety.at)}: ` +
              `${source.safety.topicIds.map((topic) => SAFETY_TOPIC_LABELS[topic] ?? topic).join('; ')}.`,
            style: 'value',
          }
        : { text: 'Not recorded.', style: 'value' },
      section('Pre-balance inspection'),
      ...inspectionSection(source),
      section('Readings before and after'),
      ...readingsSection(source),
      section('Weights fitted'),
      ...weightsSection(source),
      { stack: [section('Acceptance'), ...acceptanceSection(source)], unbreakable: true },
      {
        stack: [
          section('Safety notice'),
          { text: REPORT_SAFETY_NOTICE, style: 'caption' },
          section('Customer’s signature'),
          signatureSection(signature),
        ],
        unbreakable: true,
      },
    ],
    pageBreakBefore: (node, queries) =>
      node.headlineLevel === 1 && queries.getFollowingNodesOnPage().length === 0,
    defaultStyle: { font: 'Roboto', fontSize: 9, lineHeight: 1.15, color: '#1f2933' },
    styles: {
      title: { fontSize: 17, bold: true, margin: [0, 0, 0, 2] },
      section: { fontSize: 11.5, bold: true, margin: [0, 12, 0, 4], color: '#102a43' },
      key: { color: '#52606d' },
      value: {},
      th: { bold: true, color: '#334e68' },
      table: { margin: [0, 2, 0, 2] },
      caption: { fontSize: 8, color: '#52606d', margin: [0, 3, 0, 0] },
      figureTitle: { bold: true, margin: [0, 0, 0, 2] },
      running: { fontSize: 8, color: '#52606d' },
      draftBox: { color: '#c4320a', bold: true, alignment: 'center', margin: [0, 26, 0, 0] },
    },
  };
}

/** Builds the report's PDF; `signature` null for a draft marked as such on every page. */
export function buildReportPdf(source: ReportSource, signature: ReportSignature | null): Promise<Buffer> {
  return pdfMake.createPdf(reportDocument(source, signature)).getBuffer();
}
