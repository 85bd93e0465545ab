import { CALC_ROUTES, type CalcRouteName } from '@counterpoise/api';
import fastJson from 'fast-json-stringify';
import * as z from 'zod';

/** Writes one value as JSON text. */
export type Serializer = (value: unknown) => string;

/**
 * A serializer compiled by fast-json-stringify from the JSON Schema that zod gives for `schema` (its
 * output side). It walks only the properties the schema declares, with their types known in advance,
 * which is cheaper than `JSON.stringify` discovering them on every answer; what it writes parses back to
 * what `JSON.stringify` writes for every value the schema accepts (`serializers.spec.ts`).
 */
export function compileSerializer(schema: z.ZodType): Serializer {
  const jsonSchema = z.toJSONSchema(schema, { io: 'output', unrepresentable: 'any' });
  return fastJson(jsonSchema as Parameters<typeof fastJson>[0]) as Serializer;
}

const compiled = new Map<CalcRouteName, Serializer>();

/** The serializer of a calculator route's answer, compiled from its response schema on first use. */
export function answerSerializer(name: CalcRouteName): Serializer {
  let serializer = compiled.get(name);
  if (serializer === undefined) {
    serializer = compileSerializer(CALC_ROUTES[name].response);
    compiled.set(name, serializer);
  }
  return serializer;
}
