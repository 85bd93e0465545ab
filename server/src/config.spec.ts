import { describe, expect, it } from 'vitest';
import { ConfigError, demoDataNotice, loadConfig } from './config';

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

  it('allows no cross-origin caller and 600 calculations a minute for a new key by default', () => {
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

  it('believes no proxy about the client unless TRUST_PROXY names them', () => {
    expect(loadConfig({}).TRUST_PROXY).toBe(false);
    expect(loadConfig({ TRUST_PROXY: 'false' }).TRUST_PROXY).toBe(false);
    expect(loadConfig({ TRUST_PROXY: '1' }).TRUST_PROXY).toBe(1);
    expect(loadConfig({ TRUST_PROXY: 'loopback, 10.0.0.0/8' }).TRUST_PROXY).toBe('loopback, 10.0.0.0/8');
    expect(loadConfig({ TRUST_PROXY: 'fd00::/8' }).TRUST_PROXY).toBe('fd00::/8');
    expect(() => loadConfig({ TRUST_PROXY: 'yes' })).toThrow(/TRUST_PROXY: "yes" is not a proxy address/);
    expect(() => loadConfig({ TRUST_PROXY: '10.0.0.0/40' })).toThrow(/TRUST_PROXY/);
  });

  it('seeds no demo data in production unless SEED_DEMO asks for it', () => {
    expect(loadConfig({ NODE_ENV: 'production' }).SEED_DEMO).toBe(false);
    expect(loadConfig({ NODE_ENV: 'production', SEED_DEMO: 'true' }).SEED_DEMO).toBe(true);
    expect(loadConfig({ NODE_ENV: 'production', SEED_DEMO: '1' }).SEED_DEMO).toBe(true);
  });

  it('seeds the demo data in development and tests unless SEED_DEMO says no', () => {
    expect(loadConfig({ NODE_ENV: 'development' }).SEED_DEMO).toBe(true);
    expect(loadConfig({ NODE_ENV: 'test' }).SEED_DEMO).toBe(true);
    expect(loadConfig({ NODE_ENV: 'development', SEED_DEMO: 'no' }).SEED_DEMO).toBe(false);
  });
});

describe('demoDataNotice', () => {
  const notice = (env: NodeJS.ProcessEnv, present: boolean) => demoDataNotice(loadConfig(env), present);

  it('says why the demo data is off in production, and how to turn it on', () => {
    expect(notice({ NODE_ENV: 'production' }, false)).toEqual({
      status: 'off (NODE_ENV=production; set SEED_DEMO=true to seed it)',
    });
  });

  it('says the demo data is on by default outside production, without a warning', () => {
    expect(notice({}, true)).toEqual({
      status: 'on (NODE_ENV=development; set SEED_DEMO=false to start without it)',
    });
    expect(notice({ NODE_ENV: 'test', SEED_DEMO: 'false' }, false)).toEqual({
      status: 'off (SEED_DEMO=false)',
    });
  });

  it('warns when a production server is given the demo data', () => {
    const { status, warning } = notice({ NODE_ENV: 'production', SEED_DEMO: 'true' }, true);
    expect(status).toBe('on (SEED_DEMO=true)');
    expect(warning).toMatch(/^WARNING: .*NODE_ENV=production and holds the demo data/);
    expect(warning).toContain('password published in the README');
  });

  it('warns when a production server holds the demo data of an earlier start, even with seeding off', () => {
    const { status, warning } = notice({ NODE_ENV: 'production' }, true);
    expect(status).toBe(
      'off (NODE_ENV=production; set SEED_DEMO=true to seed it), ' +
        'but the database holds the demo data of an earlier start',
    );
    expect(warning).toMatch(/^WARNING: /);
  });
});
