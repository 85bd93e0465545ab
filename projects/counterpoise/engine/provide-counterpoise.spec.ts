import { provideHttpClient } from '@angular/common/http';
import { TestBed } from '@angular/core/testing';
import { describe, expect, it } from 'vitest';
import { BALANCE_ENGINE, LOCAL_BALANCE_ENGINE } from './balance-engine';
import { LocalBalanceEngine } from './local-balance-engine';
import { provideCounterpoise } from './provide-counterpoise';
import { RemoteBalanceEngine } from './remote-balance-engine';

const KEY = 'cpk_AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA';

describe('provideCounterpoise', () => {
  it('makes the local engine the engine, and the fallback, when asked for', () => {
    TestBed.configureTestingModule({ providers: [provideCounterpoise({ engine: 'local' })] });
    expect(TestBed.inject(BALANCE_ENGINE)).toBe(TestBed.inject(LocalBalanceEngine));
    expect(TestBed.inject(LOCAL_BALANCE_ENGINE)).toBe(TestBed.inject(LocalBalanceEngine));
  });

  it('keeps the local engine reachable beside the remote one', () => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideCounterpoise({ engine: 'remote', apiBaseUrl: '', apiKey: KEY }),
      ],
    });
    const engine = TestBed.inject(BALANCE_ENGINE);
    const local = TestBed.inject(LOCAL_BALANCE_ENGINE);
    expect(engine).toBeInstanceOf(RemoteBalanceEngine);
    expect(local).toBeInstanceOf(LocalBalanceEngine);
  });

  it('computes on the device when nothing is configured', () => {
    expect(TestBed.inject(BALANCE_ENGINE).kind).toBe('local');
  });

  it('fails at start-up on a configuration mistake', () => {
    expect(() => provideCounterpoise({ engine: 'remote', apiBaseUrl: '' })).toThrow(/apiKey or accessToken/);
  });
});
