import { describe, expect, it } from 'vitest';
import { calcRouteUrl, checkCounterpoiseConfig, type CounterpoiseConfig } from './counterpoise-config';

describe('checkCounterpoiseConfig', () => {
  it('accepts the local solver alone, and the remote one with an address and one credential', () => {
    expect(checkCounterpoiseConfig({ solver: 'local' })).toEqual({ solver: 'local' });
    const remote = { solver: 'remote', apiBaseUrl: '', apiKey: 'cpk_portal' } as const;
    expect(checkCounterpoiseConfig(remote)).toBe(remote);
    const token = {
      solver: 'remote',
      apiBaseUrl: 'https://calc.example.net',
      accessToken: () => null,
    } as const;
    expect(checkCounterpoiseConfig(token)).toBe(token);
  });

  it.each<[CounterpoiseConfig, RegExp]>([
    [{ solver: 'cloud' as 'remote' }, /solver is 'remote' or 'local'/],
    [{ solver: 'remote', apiKey: 'cpk_x' }, /needs apiBaseUrl/],
    [{ solver: 'remote', apiBaseUrl: '' }, /apiKey or accessToken, and neither was given/],
    [{ solver: 'remote', apiBaseUrl: 'calc.example.net', apiKey: 'k' }, /not a whole web address/],
    [{ solver: 'remote', apiBaseUrl: 'localhost:4300', apiKey: 'k' }, /with its scheme/],
    [{ solver: 'remote', apiBaseUrl: 'ftp://calc.example.net', apiKey: 'k' }, /not a whole web address/],
    [{ solver: 'remote', apiBaseUrl: '', apiKey: 'k', accessToken: () => 't' }, /not both/],
    [{ solver: 'remote', apiBaseUrl: '', apiKey: ' ' }, /apiKey is empty/],
    [{ solver: 'local', timeoutMs: 0 }, /timeoutMs/],
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
