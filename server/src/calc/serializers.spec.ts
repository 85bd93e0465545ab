/*
 * The calculator's answers are written by serializers compiled from their response schemas
 * (serializers.ts). Whatever they write must parse back to exactly what JSON.stringify writes: for the
 * answer of every route's documented example, and for every answer made from it by setting one value to
 * an edge (extreme and awkward numbers, strings that need escaping, lists filled) that the route's
 * response schema still accepts, since those are the answers the route could give.
 */
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { CALC_ROUTE_NAMES, CALC_ROUTES, calculate } from '@counterpoise/api';
import { calcTestApp } from './calc.test-app';
import { answerSerializer } from './serializers';

const EDGE_NUMBERS = [
  0,
  -0,
  1,
  -1,
  7,
  0.1 + 0.2,
  -123456.789,
  1e21,
  1e-7,
  5e-324,
  -1.7976931348623157e308,
  Number.MAX_SAFE_INTEGER,
  2 ** 31,
];
const EDGE_STRINGS = [
  '',
  'a "quoted" word \\ and a backslash',
  'line\nbreak, tab\t, return\r, bell\u0007',
  'ünïcödé 30° ± 5 %, ½ turn, 回転',
  '\u2028\u2029',
  'a lone \ud800 surrogate',
  '</script><script>',
  '😀 emoji',
];

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

/** Every copy of `value` with one leaf set to an edge value, or one empty list given one element. */
function* variants(value: Json): Generator<Json> {
  if (typeof value === 'number') {
    for (const edge of EDGE_NUMBERS) yield edge;
  } else if (typeof value === 'string') {
    for (const edge of EDGE_STRINGS) yield edge;
  } else if (typeof value === 'boolean') {
    yield !value;
  } else if (Array.isArray(value)) {
    if (value.length === 0) for (const edge of [...EDGE_STRINGS, ...EDGE_NUMBERS]) yield [edge];
    for (const [index, element] of value.entries()) {
      for (const changed of variants(element)) yield value.map((old, at) => (at === index ? changed : old));
    }
  } else if (value !== null) {
    for (const [key, element] of Object.entries(value)) {
      for (const changed of variants(element)) yield { ...value, [key]: changed };
    }
  }
}

describe('the serializers compiled from the response schemas', () => {
  it.each(CALC_ROUTE_NAMES)('write %s’s example answer as JSON.stringify does', (name) => {
    const outcome = calculate(name, CALC_ROUTES[name].example);
    expect(outcome.status).toBe(200);
    const result = (outcome as { result: unknown }).result;
    expect(JSON.parse(answerSerializer(name)(result))).toEqual(JSON.parse(JSON.stringify(result)));
  });

  it.each(CALC_ROUTE_NAMES)(
    'write every edge of %s’s answer that its schema accepts as JSON.stringify does',
    (name) => {
      const { response, example } = CALC_ROUTES[name];
      const result = (calculate(name, example) as { result: Json }).result;
      const serialize = answerSerializer(name);
      let checked = 0;
      for (const variant of variants(result)) {
        if (!response.safeParse(variant).success) continue;
        checked++;
        const written = serialize(variant);
        expect(JSON.parse(written), written).toEqual(JSON.parse(JSON.stringify(variant)));
        // Object.is tells -0 from 0: JSON.stringify writes -0 as 0, and so must the serializer.
        expect(written.includes('-0,') || written.includes('-0}'), written).toBe(false);
      }
      // Every route's answer has numbers or strings to vary; none is left unchecked.
      expect(checked).toBeGreaterThan(EDGE_NUMBERS.length);
    },
  );

  it('write each route’s answer on the wire as the route computes it, alone and in a batch', async () => {
    const { app } = calcTestApp();
    const items = CALC_ROUTE_NAMES.map((route) => ({
      id: `"${route}" ✓`,
      route,
      body: CALC_ROUTES[route].example,
    }));
    const batch = await request(app).post('/api/v1/calc/batch').send({ items }).expect(200);
    expect(batch.body).toEqual({
      items: items.map((item, index) => ({
        id: item.id,
        status: 200,
        result: JSON.parse(
          JSON.stringify((calculate(CALC_ROUTE_NAMES[index]!, item.body) as { result: unknown }).result),
        ),
      })),
    });
    for (const route of CALC_ROUTE_NAMES) {
      const alone = await request(app)
        .post(`/api/v1/calc/${route}`)
        .send(CALC_ROUTES[route].example)
        .expect(200);
      expect(alone.text).toBe(
        answerSerializer(route)((calculate(route, CALC_ROUTES[route].example) as { result: unknown }).result),
      );
      expect(alone.body).toEqual(batch.body.items[CALC_ROUTE_NAMES.indexOf(route)].result);
    }
  });
});
