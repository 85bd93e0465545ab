import { CALC_ROUTE_NAMES, CALC_ROUTES, ProblemSchema } from '@counterpoise/api';
import fc from 'fast-check';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { calcTestApp } from './calc.test-app';

/*
 * Random and hostile JSON at every calculator route: whatever comes in, the answer is a result in the
 * documented shape (no NaN or Infinity leaking out as null) or a 4xx problem, never a 5xx or a hang.
 */

const { app } = calcTestApp();

/** Numbers that break naive arithmetic. */
const nastyNumber = fc.oneof(
  fc.constantFrom(0, -0, 1e-308, 5e-324, 1e308, -1e308, 1e9, -1e9, 3600, -3600, 360, 180, 1e-12),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer(),
);

/** Any JSON value, with a bias towards numbers and objects that look like readings. */
const anyJson = fc.oneof(
  fc.jsonValue(),
  nastyNumber,
  fc.record({ amplitude: nastyNumber, phaseDeg: nastyNumber }),
  fc.constantFrom({ __proto__: { polluted: true } }, { constructor: { prototype: {} } }, '', null, []),
);

type Path = (string | number)[];

/** Every path to a value inside `value`. */
function pathsOf(value: unknown, prefix: Path = []): Path[] {
  if (value === null || typeof value !== 'object') return [prefix];
  const entries = Array.isArray(value) ? value.map((v, i) => [i, v] as const) : Object.entries(value);
  return [prefix, ...entries.flatMap(([key, child]) => pathsOf(child, [...prefix, key]))];
}

/** A copy of `value` with the value at `path` replaced (or removed when `replacement` is undefined). */
function replaceAt(value: unknown, path: Path, replacement: unknown): unknown {
  if (path.length === 0) return replacement;
  const copy = structuredClone(value) as Record<string | number, unknown>;
  let target = copy;
  for (const key of path.slice(0, -1)) target = target[key] as Record<string | number, unknown>;
  const last = path[path.length - 1]!;
  if (replacement === undefined && !Array.isArray(target)) delete target[last];
  else target[last] = replacement;
  return copy;
}

/** The route's example with one value somewhere inside replaced by random JSON, or removed. */
const mutatedExample = (example: unknown) =>
  fc
    .tuple(fc.constantFrom(...pathsOf(example)), fc.option(anyJson, { nil: undefined }))
    .map(([path, replacement]) => replaceAt(example, path, replacement));

async function expectSafeAnswer(route: string, body: unknown) {
  const response = await request(app).post(`/api/v1/calc/${route}`).type('json').send(JSON.stringify(body));
  expect(response.status, JSON.stringify(body)).toBeLessThan(500);
  if (response.status === 200) {
    const schema = route === 'batch' ? null : CALC_ROUTES[route as keyof typeof CALC_ROUTES].response;
    if (schema) {
      const parsed = schema.safeParse(response.body);
      expect(parsed.success, `${JSON.stringify(body)} -> ${response.text}`).toBe(true);
    }
  } else {
    expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(ProblemSchema.safeParse(response.body).success).toBe(true);
  }
}

describe('hostile input at every calculator route', () => {
  it.each(CALC_ROUTE_NAMES)('%s: random JSON gets a result or a 4xx problem', async (route) => {
    await fc.assert(
      fc.asyncProperty(anyJson, (body) => expectSafeAnswer(route, body)),
      { numRuns: 60 },
    );
  });

  it.each(CALC_ROUTE_NAMES)(
    '%s: its example with one value broken gets a result or a 4xx problem',
    async (route) => {
      await fc.assert(
        fc.asyncProperty(mutatedExample(CALC_ROUTES[route].example), (body) => expectSafeAnswer(route, body)),
        { numRuns: 150 },
      );
    },
  );

  it('batch: random items get a result or a 4xx problem each', async () => {
    const item = fc.record({
      id: fc.option(fc.string({ maxLength: 120 }), { nil: undefined }),
      route: fc.oneof(fc.constantFrom(...CALC_ROUTE_NAMES), fc.string()),
      body: anyJson,
    });
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.record({ items: fc.array(item, { maxLength: 20 }) }), anyJson), (body) =>
        expectSafeAnswer('batch', body),
      ),
      { numRuns: 100 },
    );
  });

  it('a body that is not JSON at all gets a 400 problem', async () => {
    await fc.assert(
      fc.asyncProperty(fc.string(), async (text) => {
        fc.pre(!isJson(text));
        const response = await request(app).post('/api/v1/calc/radius').type('json').send(text);
        expect(response.status).toBe(400);
      }),
      { numRuns: 100 },
    );
  });
});

function isJson(text: string): boolean {
  try {
    JSON.parse(text);
    return true;
  } catch {
    return false;
  }
}
