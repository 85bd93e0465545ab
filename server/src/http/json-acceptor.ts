import { Ajv2020 } from 'ajv/dist/2020.js';
import * as z from 'zod';

/**
 * Says yes, quickly, to a parsed JSON body that a zod schema takes exactly as it is. Its yes means: the
 * schema's `safeParse` succeeds, and its output equals the body. It never says why not: a body it does not
 * take goes to the schema, whose messages the caller answers with.
 */
export type JsonAcceptor = (body: unknown) => boolean;

/** The kinds of zod check whose JSON Schema says exactly what the check does. */
const EXACT_CHECKS: ReadonlySet<string> = new Set([
  'greater_than',
  'less_than',
  'min_length',
  'max_length',
  'length_equals',
]);

/** Whether every check of a zod schema is one that its JSON Schema states exactly. */
function checksAreExact(def: z.core.$ZodTypeDef): boolean {
  for (const check of def.checks ?? []) {
    const checkDef = check._zod.def as z.core.$ZodCheckDef & { format?: string };
    const exact =
      EXACT_CHECKS.has(checkDef.check) ||
      (checkDef.check === 'number_format' && checkDef.format === 'safeint');
    if (!exact) return false;
  }
  return true;
}

/**
 * Whether zod's JSON Schema of `schema` accepts exactly the JSON values that `schema` accepts, and the
 * schema gives back every one unchanged. That holds for plain data types with bounds: strict objects (an
 * object that strips unknown keys changes its input; one that keeps them is looser than its JSON Schema
 * says), arrays, optional keys, numbers, safe integers, strings, booleans, enums and `unknown`. It does not
 * hold for a refinement (absent from the JSON Schema), a transform, a default, a string format or pattern,
 * a union (zod takes its first match, JSON Schema may take another) or anything else; for those, `false`.
 */
export function isTakenAsIs(schema: z.core.$ZodType): boolean {
  const def = schema._zod.def as z.core.$ZodTypeDef & Record<string, unknown>;
  // A string format (`z.email()`, …) is a string schema that is a check itself.
  if (!checksAreExact(def) || 'check' in def || 'format' in def) return false;
  switch (def.type) {
    case 'number':
    case 'string':
    case 'boolean':
    case 'enum':
    case 'unknown':
      return true;
    case 'optional':
      return isTakenAsIs(def['innerType'] as z.core.$ZodType);
    case 'array':
      return isTakenAsIs(def['element'] as z.core.$ZodType);
    case 'object': {
      const catchall = def['catchall'] as z.core.$ZodType | undefined;
      const shape = def['shape'] as Record<string, z.core.$ZodType>;
      return catchall?._zod.def.type === 'never' && Object.values(shape).every(isTakenAsIs);
    }
    default:
      return false;
  }
}

/**
 * One Ajv for every acceptor. `strictNumbers` refuses NaN and the infinities, as `z.number()` does (JSON
 * carries neither, but the bound checks must not rely on that). Both count a string's length in code
 * points (`"🔧".length` is 2, its length for either is 1). `example` is zod's metadata, a word Ajv must know
 * to stay strict about every other.
 */
const ajv = new Ajv2020({ strict: true, strictNumbers: true, allErrors: false, keywords: ['example'] });

/**
 * An acceptor of `schema` compiled by Ajv from zod's own JSON Schema of it, so the zod schema stays the one
 * source of truth; or `undefined` when the schema is not one its JSON Schema states exactly
 * (`isTakenAsIs`). Ajv's compiled check runs about ten times faster than zod's parse and allocates nothing,
 * which is what the calculator's busiest requests, the batches, spend most on (`npm run bench:api`). Meant
 * for bodies parsed from JSON, where no value is `undefined`, a function or a class instance.
 * `json-acceptor.spec.ts` holds every acceptor to its schema on generated bodies, valid and not.
 */
export function compileJsonAcceptor(schema: z.ZodType): JsonAcceptor | undefined {
  if (!isTakenAsIs(schema)) return undefined;
  const jsonSchema = z.toJSONSchema(schema, {
    io: 'input',
    unrepresentable: 'throw',
    target: 'draft-2020-12',
  });
  const check = ajv.compile(jsonSchema);
  return (body) => check(body) === true;
}
