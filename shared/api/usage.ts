import * as z from 'zod';

/** The ways the usage report can be broken down. */
export const USAGE_GROUPINGS = ['day', 'route', 'key'] as const;

/** The longest span one usage report covers, so that a report stays a bounded query. */
export const MAX_USAGE_SPAN_DAYS = 366;

const DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const DATE_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,9})?)?(Z|[+-]\d{2}:\d{2})$/;
const DAY_MS = 86_400_000;

/**
 * Reads a calendar date (`2026-05-01`, a whole UTC day) or a date-time with its zone
 * (`2026-05-01T08:00:00Z`) as an instant. A date means the start of its day for `from` and the end of
 * it for `to`, so that `from=2026-05-01&to=2026-05-31` covers the whole of May. A date-time with no
 * zone is refused: the caller's clock and ours need not agree.
 */
function instant(bound: 'from' | 'to') {
  return z
    .string()
    .transform((text, context) => {
      const date = DATE.exec(text);
      if (date) {
        const [, year, month, day] = date.map(Number) as [number, number, number, number];
        const ms = Date.UTC(year, month - 1, day);
        const check = new Date(ms);
        if (
          check.getUTCFullYear() === year &&
          check.getUTCMonth() === month - 1 &&
          check.getUTCDate() === day
        ) {
          return new Date(bound === 'from' ? ms : ms + DAY_MS);
        }
      } else if (DATE_TIME.test(text)) {
        const ms = Date.parse(text);
        if (!Number.isNaN(ms)) return new Date(ms);
      }
      context.issues.push({
        code: 'custom',
        input: text,
        message: 'Expected a date (2026-05-01) or a date-time with its zone (2026-05-01T08:00:00Z).',
      });
      return z.NEVER;
    })
    .meta({
      description:
        bound === 'from'
          ? 'Start of the report, included: a date (start of that UTC day) or a date-time with its zone. ' +
            `Defaults to 30 days before \`to\`.`
          : 'End of the report, excluded: a date (the report then includes that whole UTC day) or a ' +
            'date-time with its zone. Defaults to now.',
      example: bound === 'from' ? '2026-05-01' : '2026-05-31',
    });
}

/** The query of `GET /api/v1/usage`; unknown parameters are refused, so that a typo is not ignored. */
export const UsageQuerySchema = z.strictObject(
  {
    from: instant('from').optional(),
    to: instant('to').optional(),
    groupBy: z
      .enum(USAGE_GROUPINGS, { error: 'Expected day, route or key.' })
      .default('day')
      .meta({ description: 'Sum per UTC day, per route, or per API key.' }),
  },
  {
    error: (issue) =>
      issue.code === 'unrecognized_keys'
        ? 'Unknown parameter: this route takes from, to and groupBy.'
        : undefined,
  },
);

/** How many answers had one error status. */
export const UsageStatusCountSchema = z
  .object({
    status: z.number().int().min(400).max(599).meta({ description: 'The HTTP status.', example: 422 }),
    answers: z.number().int().positive().meta({ description: 'Answers with that status.', example: 3 }),
  })
  .meta({ id: 'UsageStatusCount' });

/** The sums over a set of keyed requests. */
export const UsageFiguresSchema = z
  .object({
    requests: z
      .number()
      .int()
      .nonnegative()
      .meta({ description: 'HTTP requests made with the key; a batch is one request, whatever it holds.' }),
    calculations: z
      .number()
      .int()
      .nonnegative()
      .meta({
        description:
          'Calculations asked for, as the key’s limit counts them: each call of a calculator route is one and ' +
          'each item of a batch is one (a batch of n counts n). A batch refused whole (over the limit, or a ' +
          'body that does not fit) asked for none.',
      }),
    clientErrors: z
      .number()
      .int()
      .nonnegative()
      .meta({ description: 'Answers with a 4xx status: of requests, and of each item of a batch.' }),
    serverErrors: z
      .number()
      .int()
      .nonnegative()
      .meta({ description: 'Answers with a 5xx status: of requests, and of each item of a batch.' }),
    rateLimited: z
      .number()
      .int()
      .nonnegative()
      .meta({ description: 'Answers with 429: over the limit of the key (counted in clientErrors too).' }),
    errorsByStatus: z.array(UsageStatusCountSchema).meta({
      description:
        'The answers with an error status (400 or more), counted per status, statuses in order; a batch’s ' +
        'items count each with its own status. Empty when every answer succeeded.',
    }),
    bytes: z.number().int().nonnegative().meta({ description: 'Bytes of the response bodies.' }),
    meanDurationMs: z.number().nonnegative().meta({
      description:
        'Mean time to answer a request (a batch timed whole), in milliseconds; 0 when there were no requests.',
    }),
    maxDurationMs: z.number().nonnegative().meta({ description: 'The longest time to answer a request.' }),
  })
  .meta({ id: 'UsageFigures' });

/** One line of the report: a day, a route or a key, with its sums. */
export const UsageGroupSchema = UsageFiguresSchema.extend({
  group: z.string().meta({
    description:
      'The UTC day (`2026-05-01`), the route (`POST /api/v1/calc/single-plane`) or the key prefix. A path ' +
      'that no route documents is grouped under its method and `(unknown route)`, e.g. `GET (unknown route)`.',
  }),
  keyName: z.string().optional().meta({ description: 'The name of the key, when grouped by key.' }),
}).meta({ id: 'UsageGroup' });

/** The answer of `GET /api/v1/usage`. */
export const UsageReportSchema = z
  .object({
    key: z
      .object({ id: z.number().int().positive(), name: z.string(), prefix: z.string() })
      .meta({ description: 'The key the report was asked with.' }),
    from: z.iso.datetime().meta({ description: 'Start of the report, included.' }),
    to: z.iso.datetime().meta({ description: 'End of the report, excluded.' }),
    groupBy: z.enum(USAGE_GROUPINGS),
    groups: z.array(UsageGroupSchema).meta({
      description:
        'Only groups with requests: days in order, routes and keys from the busiest. Requests reach the ' +
        'report within about a tenth of a second.',
    }),
    total: UsageFiguresSchema,
  })
  .meta({
    id: 'UsageReport',
    description: 'How much the calling key used the API over a span, and how it went.',
    example: {
      key: { id: 1, name: 'Dealer portal', prefix: 'cpk_Q2xvY2s5' },
      from: '2026-05-01T00:00:00.000Z',
      to: '2026-05-03T00:00:00.000Z',
      groupBy: 'day',
      groups: [
        {
          group: '2026-05-01',
          requests: 1150,
          calculations: 1200,
          clientErrors: 14,
          serverErrors: 0,
          rateLimited: 2,
          errorsByStatus: [
            { status: 422, answers: 12 },
            { status: 429, answers: 2 },
          ],
          bytes: 402_000,
          meanDurationMs: 0.84,
          maxDurationMs: 12.5,
        },
        {
          group: '2026-05-02',
          requests: 800,
          calculations: 790,
          clientErrors: 6,
          serverErrors: 0,
          rateLimited: 0,
          errorsByStatus: [
            { status: 400, answers: 1 },
            { status: 422, answers: 5 },
          ],
          bytes: 268_500,
          meanDurationMs: 0.79,
          maxDurationMs: 9.25,
        },
      ],
      total: {
        requests: 1950,
        calculations: 1990,
        clientErrors: 20,
        serverErrors: 0,
        rateLimited: 2,
        errorsByStatus: [
          { status: 400, answers: 1 },
          { status: 422, answers: 17 },
          { status: 429, answers: 2 },
        ],
        bytes: 670_500,
        meanDurationMs: 0.82,
        maxDurationMs: 12.5,
      },
    },
  });

export type UsageGrouping = (typeof USAGE_GROUPINGS)[number];
export type UsageQuery = z.output<typeof UsageQuerySchema>;
export type UsageQueryInput = z.input<typeof UsageQuerySchema>;
export type UsageFigures = z.infer<typeof UsageFiguresSchema>;
export type UsageStatusCount = z.infer<typeof UsageStatusCountSchema>;
export type UsageGroup = z.infer<typeof UsageGroupSchema>;
export type UsageReport = z.infer<typeof UsageReportSchema>;
