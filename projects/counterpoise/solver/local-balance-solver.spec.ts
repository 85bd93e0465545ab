import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { describe, expect, it } from 'vitest';
import { CALC_ROUTE_NAMES, CALC_ROUTES, calculate, type CalcRouteName } from '@counterpoise/api';
import { BalanceSolverError } from './balance-solver-error';
import { LocalBalanceSolver } from './local-balance-solver';

describe('LocalBalanceSolver', () => {
  const solver = TestBed.inject(LocalBalanceSolver);

  it.each(CALC_ROUTE_NAMES)(
    'answers the %s example exactly as calculate() does',
    async (route: CalcRouteName) => {
      const example = CALC_ROUTES[route].example;
      const expected = calculate(route, example);
      expect(expected.status).toBe(200);
      const result = await firstValueFrom(solver.calculate(route, example as never));
      expect(result).toEqual(expected.status === 200 ? expected.result : undefined);
    },
  );

  it('refuses invalid values with the field at fault, as the API would', async () => {
    const request = {
      initial: { amplitude: 0.52, phaseDeg: 74 },
      trialWeight: { mass: -60, angleDeg: 0 },
      withTrial: { amplitude: 0.31, phaseDeg: 141 },
    };
    const error = await firstValueFrom(solver.calculate('single-plane', request)).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(BalanceSolverError);
    const failure = error as BalanceSolverError;
    expect(failure.reason).toBe('invalid');
    expect(failure.problem?.errors?.[0]?.path).toBe('trialWeight.mass');
    const expected = calculate('single-plane', request);
    expect(failure.problem).toEqual(expected.status === 400 ? expected.problem : undefined);
  });

  it("passes on the engine's own refusal, such as a trial weight that changed nothing", async () => {
    const request = {
      initial: { amplitude: 0.52, phaseDeg: 74 },
      trialWeight: { mass: 60, angleDeg: 0 },
      withTrial: { amplitude: 0.52, phaseDeg: 74 },
    };
    const error = (await firstValueFrom(solver.calculate('single-plane', request)).catch(
      (e: unknown) => e,
    )) as BalanceSolverError;
    expect(error.reason).toBe('invalid');
    expect(error.problem?.code).toBe('ZERO_TRIAL_EFFECT');
  });
});
