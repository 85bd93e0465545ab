import * as z from 'zod';
import { ProblemSchema } from './problem';

/** The most items one batch may carry. */
export const MAX_BATCH_ITEMS = 1000;

/**
 * `POST /api/v1/calc/batch`: many calculations in one request, each answered on its own. Each item is one
 * calculation of the key's limit per minute, and one row of its usage, as if it were sent alone.
 */
export const BatchRequestSchema = z
  .strictObject({
    items: z
      .array(
        z.strictObject({
          id: z
            .string({ error: 'id is a string of your own, to match answers to items.' })
            .max(100, { error: 'id is at most 100 characters.' })
            .optional()
            .meta({ description: 'Your own name for the item; the answer echoes it (default: its index).' }),
          route: z
            .string({ error: 'route names a calculator route, e.g. "single-plane".' })
            .meta({ description: 'The calculator route, e.g. `single-plane`.' }),
          body: z.unknown().meta({ description: 'The request body that route takes.' }),
        }),
      )
      .min(1, { error: 'A batch carries one item at least.' })
      .max(MAX_BATCH_ITEMS, { error: `A batch carries at most ${MAX_BATCH_ITEMS} items.` }),
  })
  .meta({ id: 'BatchRequest' });

/** The answer to one item: its result, or a problem whose field paths are relative to the item's body. */
export const BatchItemResultSchema = z
  .object({
    id: z.string(),
    status: z.number().int().meta({ description: '200, or the status the route alone would have answered.' }),
    result: z.unknown().optional().meta({ description: 'The route’s answer, when status is 200.' }),
    problem: ProblemSchema.optional(),
  })
  .meta({ id: 'BatchItemResult' });

export const BatchResponseSchema = z
  .object({ items: z.array(BatchItemResultSchema) })
  .meta({ id: 'BatchResponse' });

export type BatchRequest = z.input<typeof BatchRequestSchema>;
export type BatchItemResult = z.output<typeof BatchItemResultSchema>;
