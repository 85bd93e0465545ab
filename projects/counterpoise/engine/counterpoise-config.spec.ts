import { describe, expect, it } from 'vitest';
import { calcRouteUrl, checkCounterpoiseConfig, type CounterpoiseConfig } from './counterpoise-config';

describe('checkCounterpoiseConfig', () => {
  it('accepts the local engine alone, and the remote one with an address and one credential', () => {
    expect(checkCounterpoiseConfig({ engine: 'local' })).toEqual({ engine: 'local' });
    const remote = { engine: 'remote', apiBaseUrl: '', apiKey: 'cpk_portal' } as const;
    expect(checkCounterpoiseConfig(remote)).toBe(remote);
    const token = {
      engine: 'remote',
      apiBaseUrl: 'https://calc.example.net',
      accessToken: () => null,
    } as const;
    expect(checkCounterpoiseConfig(token)).toBe(token);
  });

  it.each<[CounterpoiseConfig, RegExp]>([
    [{ engine: 'cloud' as 'remote' }, /engine is 'remote' or 'local'/],
    [{ engine: 'remote', apiKey: 'cpk_x' }, /needs apiBaseUrl/],
    [{ engine: 'remote', apiBaseUrl: '' }, /either apiKey or accessToken/],
    [{ engine: 'remote', apiBaseUrl: '', apiKey: 'k', accessToken: () => 't' }, /not both/],
    [{ engine: 'remote', apiBaseUrl: '', apiKey: ' ' }, /apiKey is empty/],
    [{ engine: 'local', timeoutMs: 0 }, /timeoutMs/],
  ])('refuses %o with a message that says what to change', (config, message) => {
    expect(() => checkCounterpoiseConfig(config)).toThrow(message);
  });
});

describe('calcRouteUrl', () => {
  it('puts the route under /api/v1/calc of the base address, with or without a closing slash', () => {
    expect(calcRouteUrl('https://calc.example.net/', 'single-plane')).toBe(
      'https://calc.example.net/api/v1/calc/single-plane',
    );
    expect(calcRouteUrl('', 'split')).toBe('/api/v1/calc/split');
  });
});
