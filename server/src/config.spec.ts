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

  it('allows no cross-origin caller and 600 requests a minute for a new key by default', () => {
    const config = loadConfig({});
    expect(config.CORS_ORIGINS).toEqual([]);
    expect(config.API_KEY_DEFAULT_LIMIT).toBe(600);
  });

  it('reads CORS_ORIGINS as a comma-separated list of origins, as browsers write them', () => {
    const config = loadConfig({ CORS_ORIGINS: ' https://Portal.example , http://localhost:8080,' });
    expect(config.CORS_ORIGINS).toEqual(['https://portal.example', 'http://localhost:8080']);
    expect(loadConfig({ API_KEY_DEFAULT_LIMIT: '120' }).API_KEY_DEFAULT_LIMIT).toBe(120);
  });

  it('refuses an origin with a path or without a scheme, and a limit below 1', () => {
    expect(() => loadConfig({ CORS_ORIGINS: 'https://portal.example/app' })).toThrow(
      /CORS_ORIGINS: "https:\/\/portal.example\/app" is not an origin/,
    );
    expect(() => loadConfig({ CORS_ORIGINS: 'portal.example' })).toThrow(/CORS_ORIGINS/);
    expect(() => loadConfig({ API_KEY_DEFAULT_LIMIT: '0' })).toThrow(/API_KEY_DEFAULT_LIMIT/);
  });
});
