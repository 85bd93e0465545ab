import { BatchRequestSchema, CALC_ROUTE_NAMES, CALC_ROUTES } from '@counterpoise/api';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import * as z from 'zod';
import { compileJsonAcceptor, isTakenAsIs } from './json-acceptor';

/** The part of JSON Schema that zod writes for the schemas an acceptor is compiled for. */
interface JsonSchema {
  type?: string;
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  enum?: unknown[];
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minLength?: number;
  maxLength?: number;
  minItems?: number;
  maxItems?: number;
  $ref?: string;
  $defs?: Record<string, JsonSchema>;
}

/** Values of the wrong type, one of which any place may get instead of its own. */
const WRONG_TYPES = fc.constantFrom<unknown>(null, true, 'text', 7, 0.5, [], {}, [1], { a: 1 });

/** Keys an object may get beyond its own: a typo, and the names that reach an object's prototype. */
const EXTRA_KEYS = ['extra', 'amplitud', '__proto__', 'constructor', 'toString', 'hasOwnProperty'];

/** `arbitrary`'s values, or `null` with the chance given. */
function sometimes<T>(arbitrary: fc.Arbitrary<T>, chanceOfNull: number): fc.Arbitrary<T | null> {
  const weight = Math.round(chanceOfNull * 120);
  return fc.oneof({ arbitrary, weight: 120 - weight }, { arbitrary: fc.constant(null), weight });
}

/** Numbers at, just inside and just outside a bound. */
function around(bound: number): number[] {
  const step = Math.max(1, Math.abs(bound)) * 1e-12;
  return [bound, bound - step, bound + step, bound - 1, bound + 1, Math.trunc(bound) + 0.5];
}

/**
 * Bodies near what `schema` accepts: its own shape with values at and beyond every bound, keys left out or
 * added, and now and then a value of the wrong type. Built from zod's JSON Schema, so the same generator
 * serves every schema. Objects are built with `Object.fromEntries`, which makes `__proto__` an own key, as
 * `JSON.parse` does.
 */
function nearBodies(root: JsonSchema): fc.Arbitrary<unknown> {
  const resolve = (schema: JsonSchema): JsonSchema =>
    schema.$ref ? resolve(root.$defs![schema.$ref.replace('#/$defs/', '')]!) : schema;

  const near = (given: JsonSchema, depth: number): fc.Arbitrary<unknown> => {
    const schema = resolve(given);
    const own = ownValues(schema, depth);
    return fc.oneof({ arbitrary: own, weight: 40 }, { arbitrary: WRONG_TYPES, weight: 1 });
  };

  const ownValues = (schema: JsonSchema, depth: number): fc.Arbitrary<unknown> => {
    if (schema.enum) {
      const words = schema.enum.filter((value): value is string => typeof value === 'string');
      return fc.oneof(
        fc.constantFrom(...schema.enum),
        fc.constantFrom(...words.map((word) => word.toUpperCase()), ''),
      );
    }
    switch (schema.type) {
      case 'number':
      case 'integer': {
        const bounds = [schema.minimum, schema.maximum, schema.exclusiveMinimum, schema.exclusiveMaximum];
        const edges = bounds.filter((bound): bound is number => bound !== undefined).flatMap(around);
        const low = schema.minimum ?? schema.exclusiveMinimum ?? -1e6;
        const high = schema.maximum ?? schema.exclusiveMaximum ?? 1e6;
        const inside =
          schema.type === 'integer'
            ? fc.integer({ min: Math.max(low, -1e6), max: Math.min(high, 1e6) })
            : fc.double({ min: low, max: high, noNaN: true, minExcluded: true, maxExcluded: true });
        return fc.oneof(
          { arbitrary: inside, weight: 12 },
          fc.constantFrom(
            ...edges,
            0,
            -0,
            1.5,
            -2,
            1e300,
            -1e300,
            Number.MAX_SAFE_INTEGER,
            Number.MAX_SAFE_INTEGER + 1,
            -Number.MAX_SAFE_INTEGER - 1,
          ),
          fc.double({ noNaN: true, noDefaultInfinity: true }),
        );
      }
      case 'string': {
        const lengths = [schema.minLength, schema.maxLength].filter((n): n is number => n !== undefined);
        const plain = fc.string({ unit: 'grapheme', maxLength: 12 });
        if (lengths.length === 0) return plain;
        return fc.oneof(
          plain,
          // At and beyond each bound, in characters of one and of two UTF-16 code units.
          fc
            .constantFrom(...lengths.flatMap((n) => [n - 1, n, n + 1].filter((length) => length >= 0)))
            .chain((length) =>
              fc.constantFrom(
                'a'.repeat(length),
                '🔧'.repeat(Math.ceil(length / 2)),
                `${'a'.repeat(length - 1)}🔧`,
              ),
            ),
        );
      }
      case 'boolean':
        return fc.boolean();
      case 'array': {
        const element = near(schema.items ?? {}, depth + 1);
        const min = schema.minItems ?? 0;
        const max = schema.maxItems ?? 4;
        const small = fc.array(element, { minLength: Math.max(0, min - 1), maxLength: Math.min(max + 1, 4) });
        // A long array at and past its largest size: one value repeated, to keep the runs short.
        const atMost = fc
          .tuple(element, fc.constantFrom(max, max + 1))
          .map(([value, length]) => Array.from({ length }, () => value));
        return fc.oneof({ arbitrary: small, weight: 4 }, { arbitrary: atMost, weight: 1 });
      }
      case 'object': {
        const properties = Object.entries(schema.properties ?? {});
        // A required key is left out now and then, an optional one half of the time.
        const entries = properties.map(([key, value]) =>
          sometimes(
            near(value, depth + 1).map((v) => [key, v] as const),
            schema.required?.includes(key) ? 1 / 40 : 1 / 2,
          ),
        );
        const extra = sometimes(fc.tuple(fc.constantFrom(...EXTRA_KEYS), WRONG_TYPES), 29 / 30);
        return fc
          .tuple(fc.tuple(...entries), extra)
          .map(([own, added]) =>
            Object.fromEntries([...own, added].filter((entry) => entry !== null) as [string, unknown][]),
          );
      }
      default:
        // `unknown`: any JSON value, shallow.
        return depth > 4 ? fc.constant(null) : fc.jsonValue({ maxDepth: 2 });
    }
  };
  return near(root, 0);
}

/** Holds an acceptor to its schema on bodies near it: its yes is zod's yes, with zod's output the body. */
function holdsToSchema(schema: z.ZodType, runs = 1000): { accepted: number; refused: number } {
  const accept = compileJsonAcceptor(schema);
  expect(accept).toBeDefined();
  const jsonSchema = z.toJSONSchema(schema, { io: 'input' }) as JsonSchema;
  let accepted = 0;
  let refused = 0;
  fc.assert(
    fc.property(nearBodies(jsonSchema), (generated) => {
      // What the server gets: the body as JSON.parse gives it.
      const body: unknown = JSON.parse(JSON.stringify(generated));
      const parsed = schema.safeParse(body);
      const yes = accept!(body);
      expect(yes).toBe(parsed.success);
      if (yes) {
        expect(parsed.data).toStrictEqual(body);
        accepted++;
      } else {
        refused++;
      }
    }),
    { numRuns: runs, seed: 20261205 },
  );
  return { accepted, refused };
}

describe('compileJsonAcceptor', () => {
  const routesWithAcceptor = CALC_ROUTE_NAMES.filter((name) => isTakenAsIs(CALC_ROUTES[name].request));

  it('compiles for every calculator route but those with a refinement, and for the batch', () => {
    // split and severity check a rule across fields (`.refine`), which JSON Schema does not carry.
    expect(CALC_ROUTE_NAMES.filter((name) => !routesWithAcceptor.includes(name))).toEqual([
      'split',
      'severity',
    ]);
    expect(compileJsonAcceptor(BatchRequestSchema)).toBeDefined();
  });

  it('accepts every route’s documented example, as JSON gives it', () => {
    for (const name of routesWithAcceptor) {
      const example: unknown = JSON.parse(JSON.stringify(CALC_ROUTES[name].example));
      expect(compileJsonAcceptor(CALC_ROUTES[name].request)!(example), name).toBe(true);
    }
  });

  it.each(CALC_ROUTE_NAMES.filter((name) => isTakenAsIs(CALC_ROUTES[name].request)))(
    'says yes to exactly what zod accepts, unchanged, near the %s request',
    (name) => {
      const { accepted, refused } = holdsToSchema(CALC_ROUTES[name].request);
      // Both answers were given, so both were compared.
      expect(accepted).toBeGreaterThan(0);
      expect(refused).toBeGreaterThan(0);
    },
  );

  it('says yes to exactly what zod accepts, unchanged, near a batch', () => {
    const { accepted, refused } = holdsToSchema(BatchRequestSchema, 300);
    expect(accepted).toBeGreaterThan(0);
    expect(refused).toBeGreaterThan(0);
  });

  it('counts a string’s length in code points, as zod does', () => {
    const schema = z.strictObject({ id: z.string().min(2).max(4) });
    const accept = compileJsonAcceptor(schema)!;
    // Four code points in six UTF-16 units; five code points.
    expect(accept({ id: '🔧🔧ab' })).toBe(true);
    expect(schema.safeParse({ id: '🔧🔧ab' }).success).toBe(true);
    expect(accept({ id: '🔧🔧abc' })).toBe(false);
    expect(schema.safeParse({ id: '🔧🔧abc' }).success).toBe(false);
    // One code point in two units is too short.
    expect(accept({ id: '🔧' })).toBe(false);
    holdsToSchema(schema);
  });

  it('holds to safe integers, exclusive bounds, enums and nested arrays', () => {
    holdsToSchema(
      z.strictObject({
        count: z.number().int().min(2).max(360),
        ratio: z.number().positive().lt(1),
        side: z.enum(['left', 'right']).optional(),
        runs: z
          .array(z.strictObject({ flag: z.boolean(), size: z.number().int() }))
          .min(1)
          .max(3),
      }),
    );
  });

  it('refuses NaN and the infinities, which zod refuses too', () => {
    const accept = compileJsonAcceptor(z.strictObject({ x: z.number() }))!;
    for (const x of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
      expect(accept({ x })).toBe(false);
    }
    expect(accept({ x: 1 })).toBe(true);
  });

  it.each([
    ['a refinement', z.strictObject({ a: z.number() }).refine((body) => body.a > 0)],
    ['a refined field', z.strictObject({ a: z.number().refine((a) => a > 0) })],
    ['a transform', z.strictObject({ a: z.string().transform((a) => a.length) })],
    ['a default', z.strictObject({ a: z.number().default(1) })],
    ['an object that strips unknown keys', z.object({ a: z.number() })],
    ['an object that keeps them', z.looseObject({ a: z.number() })],
    ['a trimmed string', z.strictObject({ a: z.string().trim() })],
    ['a string format', z.strictObject({ a: z.email() })],
    ['a pattern', z.strictObject({ a: z.string().regex(/^a+$/) })],
    ['a union', z.strictObject({ a: z.union([z.number(), z.string()]) })],
    ['a multiple', z.strictObject({ a: z.number().multipleOf(0.1) })],
    ['a nullable', z.strictObject({ a: z.number().nullable() })],
  ])('compiles nothing for a schema with %s', (_what, schema) => {
    expect(isTakenAsIs(schema)).toBe(false);
    expect(compileJsonAcceptor(schema)).toBeUndefined();
  });
});
