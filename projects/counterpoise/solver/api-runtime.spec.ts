import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { describe, expect, it, vi } from 'vitest';
import { CALC_ROUTES, calculate } from '@counterpoise/api';
import { API_RUNTIME_LOADER, type ApiRuntime, loadApiRuntime, RUNTIME_LOAD_MESSAGE } from './api-runtime';
import { BALANCE_SOLVER } from './balance-solver';
import { BalanceSolverError } from './balance-solver-error';
import { LocalBalanceSolver } from './local-balance-solver';
import { provideCounterpoise } from './provide-counterpoise';

/** A loader that fails as a device offline before the runtime ever came, until `online()`. */
function offlineLoader() {
  let connected = false;
  const load = vi.fn(() =>
    connected
      ? loadApiRuntime()
      : Promise.reject<ApiRuntime>(new TypeError('Failed to fetch dynamically imported module')),
  );
  return { load, online: () => (connected = true) };
}

describe('the API runtime, loaded on first use', () => {
  it('is loaded once and shared', async () => {
    const first = loadApiRuntime();
    expect(loadApiRuntime()).toBe(first);
    expect((await first).CALC_ROUTES.radius.example).toEqual(CALC_ROUTES.radius.example);
  });

  it('starts loading when a solver is made in a browser, before any calculation', async () => {
    const loader = offlineLoader();
    loader.online();
    TestBed.configureTestingModule({ providers: [{ provide: API_RUNTIME_LOADER, useValue: loader.load }] });
    TestBed.inject(LocalBalanceSolver);
    await vi.waitFor(() => expect(loader.load).toHaveBeenCalled());
  });

  it('tells the technician when the on-device solver cannot load, and computes on the next try', async () => {
    const loader = offlineLoader();
    TestBed.configureTestingModule({ providers: [{ provide: API_RUNTIME_LOADER, useValue: loader.load }] });
    const solver = TestBed.inject(LocalBalanceSolver);
    const request = CALC_ROUTES.radius.example;
    const failure = await firstValueFrom(solver.calculate('radius', request)).catch(
      (error: unknown) => error,
    );
    expect(failure).toBeInstanceOf(BalanceSolverError);
    expect((failure as BalanceSolverError).reason).toBe('unreachable');
    expect((failure as BalanceSolverError).message).toBe(RUNTIME_LOAD_MESSAGE);

    loader.online();
    expect(await firstValueFrom(solver.calculate('radius', request))).toEqual({ mass: 90, warnings: [] });
  });

  it('is never loaded by the remote solver: its answers are trusted and its problems read by hand', async () => {
    const loader = offlineLoader();
    loader.online();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideCounterpoise({ solver: 'remote', apiBaseUrl: 'https://calc.example.net', apiKey: 'cpk_x' }),
        { provide: API_RUNTIME_LOADER, useValue: loader.load },
      ],
    });
    const solver = TestBed.inject(BALANCE_SOLVER);
    const http = TestBed.inject(HttpTestingController);
    const url = 'https://calc.example.net/api/v1/calc/radius';

    const refused = firstValueFrom(solver.calculate('radius', CALC_ROUTES.radius.example)).catch(
      (error: unknown) => error as BalanceSolverError,
    );
    const problem = { type: 'about:blank', title: 'Unauthorized', status: 401, code: 'API_KEY_UNKNOWN' };
    (await vi.waitFor(() => http.expectOne(url))).flush(problem, { status: 401, statusText: 'No' });
    const failure = (await refused) as BalanceSolverError;
    expect(failure.reason).toBe('unauthorized');
    expect(failure.problem).toEqual(problem);

    const answered = firstValueFrom(solver.calculate('radius', CALC_ROUTES.radius.example));
    const answer = calculate('radius', CALC_ROUTES.radius.example);
    (await vi.waitFor(() => http.expectOne(url))).flush(answer.status === 200 ? answer.result : null);
    expect(await answered).toEqual({ mass: 90, warnings: [] });
    // Past the idle time in which a solver would have started loading it.
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(loader.load).not.toHaveBeenCalled();
    http.verify();
  });
});
