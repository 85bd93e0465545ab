import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from './config';

describe('loadConfig', () => {
  it('starts on port 4300 with the SQLite file under data/ when nothing is set', () => {
    const config = loadConfig({});
    expect(config.PORT).toBe(4300);
    expect(config.DATABASE_URL).toBe('data/counterpoise.sqlite');
    expect(config.SEED_DEMO).toBe(true);
  });

  it('takes PORT and DATABASE_URL from the environment, with or without a file: prefix', () => {
    const config = loadConfig({ PORT: '8080', DATABASE_URL: 'file:/var/lib/cp/shop.sqlite' });
    expect(config.PORT).toBe(8080);
    expect(config.DATABASE_URL).toBe('/var/lib/cp/shop.sqlite');
    expect(loadConfig({ SEED_DEMO: 'false' }).SEED_DEMO).toBe(false);
  });

  it('names every variable at fault instead of starting with a bad value', () => {
    const read = () => loadConfig({ PORT: 'eighty', SEED_DEMO: 'maybe' });
    expect(read).toThrow(ConfigError);
    expect(read).toThrow(/PORT/);
    expect(read).toThrow(/SEED_DEMO/);
  });
});
