import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { describe, expect, it, vi } from 'vitest';
import { CALC_ROUTES } from '@counterpoise/api';
import { API_RUNTIME_LOADER, type ApiRuntime, loadApiRuntime, RUNTIME_LOAD_MESSAGE } from './api-runtime';
import { BALANCE_ENGINE } from './balance-engine';
import { BalanceEngineError } from './balance-engine-error';
import { LocalBalanceEngine } from './local-balance-engine';
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

  it('starts loading when an engine is made in a browser, before any calculation', async () => {
    const loader = offlineLoader();
    loader.online();
    TestBed.configureTestingModule({ providers: [{ provide: API_RUNTIME_LOADER, useValue: loader.load }] });
    TestBed.inject(LocalBalanceEngine);
    await vi.waitFor(() => expect(loader.load).toHaveBeenCalled());
  });

  it('tells the technician when the on-device engine cannot load, and computes on the next try', async () => {
    const loader = offlineLoader();
    TestBed.configureTestingModule({ providers: [{ provide: API_RUNTIME_LOADER, useValue: loader.load }] });
    const engine = TestBed.inject(LocalBalanceEngine);
    const request = CALC_ROUTES.radius.example;
    const failure = await firstValueFrom(engine.calculate('radius', request)).catch(
      (error: unknown) => error,
    );
    expect(failure).toBeInstanceOf(BalanceEngineError);
    expect((failure as BalanceEngineError).reason).toBe('unreachable');
    expect((failure as BalanceEngineError).message).toBe(RUNTIME_LOAD_MESSAGE);

    loader.online();
    expect(await firstValueFrom(engine.calculate('radius', request))).toEqual({ mass: 90, warnings: [] });
  });

  it('lets the remote engine speak from the status alone when the schemas cannot load', async () => {
    const loader = offlineLoader();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideCounterpoise({ engine: 'remote', apiBaseUrl: 'https://calc.example.net', apiKey: 'cpk_x' }),
        { provide: API_RUNTIME_LOADER, useValue: loader.load },
      ],
    });
    const engine = TestBed.inject(BALANCE_ENGINE);
    const http = TestBed.inject(HttpTestingController);

    const refused = firstValueFrom(engine.calculate('radius', CALC_ROUTES.radius.example)).catch(
      (error: unknown) => error as BalanceEngineError,
    );
    http
      .expectOne('https://calc.example.net/api/v1/calc/radius')
      .flush({ type: 'about:blank', title: 'Unauthorized', status: 401 }, { status: 401, statusText: 'No' });
    const failure = (await refused) as BalanceEngineError;
    expect(failure.reason).toBe('unauthorized');
    expect(failure.problem).toBeUndefined();

    const answered = firstValueFrom(engine.calculate('radius', CALC_ROUTES.radius.example)).catch(
      (error: unknown) => error as BalanceEngineError,
    );
    http.expectOne('https://calc.example.net/api/v1/calc/radius').flush({ mass: 90, warnings: [] });
    const unchecked = (await answered) as BalanceEngineError;
    expect(unchecked.reason).toBe('unreachable');
    expect(unchecked.message).toBe(RUNTIME_LOAD_MESSAGE);
    http.verify();
  });
});
