import { z } from 'zod';

const flag = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'])
  .transform((value) => value === 'true' || value === '1' || value === 'yes');

/** The server's settings, read once from the environment. */
const ConfigSchema = z.object({
  PORT: z.coerce.number().int().min(0).max(65_535).default(4300),
  HOST: z.string().min(1).default('localhost'),
  DATABASE_URL: z
    .string()
    .min(1)
    .default('data/counterpoise.sqlite')
    .transform((url) => url.replace(/^file:/, '')),
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  SEED_DEMO: flag.default(true),
  STATIC_DIR: z.string().min(1).default('dist/workbench/browser'),
});

export type Config = z.infer<typeof ConfigSchema>;

/** Thrown when the environment does not describe a server that can start. */
export class ConfigError extends Error {
  override readonly name = 'ConfigError';
}

/**
 * Reads and checks the configuration. Fails fast, naming every variable at fault, so that a mistyped
 * `PORT` stops the start-up instead of surfacing later as a puzzling error.
 */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = ConfigSchema.safeParse(env);
  if (parsed.success) return parsed.data;
  const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
  throw new ConfigError(`The configuration in the environment is not valid:\n${lines.join('\n')}`);
}
