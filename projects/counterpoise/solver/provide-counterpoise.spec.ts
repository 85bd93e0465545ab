import { provideHttpClient } from '@angular/common/http';
import { TestBed } from '@angular/core/testing';
import { describe, expect, it } from 'vitest';
import { BALANCE_SOLVER, LOCAL_BALANCE_SOLVER } from './balance-solver';
import { LocalBalanceSolver } from './local-balance-solver';
import { provideCounterpoise } from './provide-counterpoise';
import { RemoteBalanceSolver } from './remote-balance-solver';

const KEY = 'cpk_AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA';

describe('provideCounterpoise', () => {
  it('makes the local solver the solver, and the fallback, when asked for', () => {
    TestBed.configureTestingModule({ providers: [provideCounterpoise({ solver: 'local' })] });
    expect(TestBed.inject(BALANCE_SOLVER)).toBe(TestBed.inject(LocalBalanceSolver));
    expect(TestBed.inject(LOCAL_BALANCE_SOLVER)).toBe(TestBed.inject(LocalBalanceSolver));
  });

  it('keeps the local solver reachable beside the remote one', () => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideCounterpoise({ solver: 'remote', apiBaseUrl: '', apiKey: KEY }),
      ],
    });
    const solver = TestBed.inject(BALANCE_SOLVER);
    const local = TestBed.inject(LOCAL_BALANCE_SOLVER);
    expect(solver).toBeInstanceOf(RemoteBalanceSolver);
    expect(local).toBeInstanceOf(LocalBalanceSolver);
  });

  it('computes on the device when nothing is configured', () => {
    expect(TestBed.inject(BALANCE_SOLVER).kind).toBe('local');
  });

  it('fails at start-up on a configuration mistake', () => {
    expect(() => provideCounterpoise({ solver: 'remote', apiBaseUrl: '' })).toThrow(/apiKey or accessToken/);
  });
});
