import * as z from 'zod';

/** The state of the SQLite database behind the server. */
export const DatabaseHealthSchema = z
  .object({
    status: z.enum(['ok', 'error']).meta({ description: 'Whether a query succeeded just now.' }),
    migrations: z.number().int().nonnegative().meta({ description: 'How many migrations are applied.' }),
    detail: z.string().optional().meta({ description: 'Why the database is not usable, when it is not.' }),
  })
  .meta({ id: 'DatabaseHealth' });

/** The answer of `GET /api/health`. */
export const HealthSchema = z
  .object({
    status: z.enum(['ok', 'degraded']).meta({ description: '`ok` when every part answers.' }),
    version: z.string().meta({ description: 'The version of the Counterpoise server.' }),
    uptimeSeconds: z.number().nonnegative(),
    database: DatabaseHealthSchema,
  })
  .meta({
    id: 'Health',
    description: 'Whether the server and its database are working.',
    example: {
      status: 'ok',
      version: '0.1.0',
      uptimeSeconds: 42.5,
      database: { status: 'ok', migrations: 1 },
    },
  });

export type DatabaseHealth = z.infer<typeof DatabaseHealthSchema>;
export type Health = z.infer<typeof HealthSchema>;
