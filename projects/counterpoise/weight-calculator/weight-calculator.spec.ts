import { manualChangeDetection } from '@angular/cdk/testing';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { TestBed } from '@angular/core/testing';
import { type Observable, Subject, of, throwError } from 'rxjs';
import { describe, expect, it, vi } from 'vitest';
import { CALC_ROUTES, type CalcRequest, type CalcRouteName, calculate } from '@counterpoise/api';
import type { DialPositions } from '@counterpoise/ng/core';
import type { BlockedSector } from '@counterpoise/ng/correction-overlay';
import {
  BALANCE_SOLVER,
  type BalanceSolver,
  BalanceSolverError,
  LocalBalanceSolver,
  provideCounterpoise,
} from '@counterpoise/ng/solver';
// Internals of the solver entry point, read by their paths: a spec is no dealer.
import { API_RUNTIME_LOADER, loadApiRuntime } from '../solver/api-runtime';
import { solverErrorFromProblem } from '../solver/solver-errors';
import { CpWeightCalculatorHarness } from '@counterpoise/ng/weight-calculator/testing';
import { CpWeightCalculator } from './weight-calculator';
import {
  amplitudeOnlyJob,
  harnessFields,
  jobDraft,
  trialWeightJob,
  twoPlaneJob,
} from './weight-calculator.fixtures';
import type {
  CalcMethod,
  SensitivityPreset,
  WeightCalculation,
  WeightCalculatorDraft,
  WeightCalculatorValue,
} from './weight-calculator-model';

/** A test double of the solver: answers through `calculate()` unless told otherwise, and records calls. */
class FakeSolver implements BalanceSolver {
  readonly calls: { route: CalcRouteName; request: unknown }[] = [];
  respond: (route: CalcRouteName, request: unknown) => Observable<unknown> = (route, request) => {
    const outcome = calculate(route, request);
    return outcome.status === 200
      ? of(outcome.result)
      : throwError(() => solverErrorFromProblem(outcome.problem));
  };

  constructor(readonly kind: 'remote' | 'local' = 'remote') {}

  calculate<N extends CalcRouteName>(route: N, request: CalcRequest<N>): Observable<never> {
    this.calls.push({ route, request });
    return this.respond(route, request) as Observable<never>;
  }
}

@Component({
  imports: [CpWeightCalculator],
  template: `
    <cp-weight-calculator
      [methods]="methods()"
      [allowedPositions]="positions()"
      [blockedSectors]="blocked()"
      [sensitivity]="sensitivity()"
      [disabled]="disabled()"
      [counting]="counting()"
      [(draft)]="draft"
      [(method)]="method"
      (calculated)="calculations.push($event)"
    />
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly methods = signal<readonly CalcMethod[]>(['one-run', 'single-plane', 'multi-plane', 'four-run']);
  readonly positions = signal<DialPositions | null>(null);
  readonly blocked = signal<readonly BlockedSector[]>([]);
  readonly sensitivity = signal<SensitivityPreset | null>(null);
  readonly disabled = signal(false);
  readonly counting = signal<'withRotation' | 'againstRotation'>('againstRotation');
  readonly draft = signal<WeightCalculatorDraft | null>(null);
  readonly method = signal<CalcMethod | null>('single-plane');
  readonly calculations: WeightCalculation[] = [];
}

/** The trial-weight job as the harness types it. */
const SINGLE_PLANE = harnessFields(trialWeightJob());

/** What the calculator sends for it: the API's own example, with the calculator's settings. */
const SINGLE_PLANE_REQUEST = {
  ...CALC_ROUTES['single-plane'].example,
  trialWeightRemoved: true,
  weightAngles: 'againstRotation',
} as const;

/** Hands the calculator the trial-weight job as a kept draft, for tests whose point is not the typing. */
function withTrialWeightJob(host: Host): void {
  host.draft.set(jobDraft('single-plane'));
}

/** Sets up a host whose calculator computes with `solver`, or with the real local solver when 'local'. */
async function setUp(solver: BalanceSolver | 'local' = new FakeSolver(), configure?: (host: Host) => void) {
  TestBed.configureTestingModule({
    providers: [
      solver === 'local'
        ? { provide: BALANCE_SOLVER, useExisting: LocalBalanceSolver }
        : { provide: BALANCE_SOLVER, useValue: solver },
    ],
  });
  const fixture = TestBed.createComponent(Host);
  configure?.(fixture.componentInstance);
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const calculator = await loader.getHarness(CpWeightCalculatorHarness);
  return { fixture, host: fixture.componentInstance, calculator, solver };
}

function expected<N extends CalcRouteName>(route: N, request: unknown) {
  const outcome = calculate(route, request);
  if (outcome.status !== 200) throw new Error(`The ${route} check values must compute.`);
  return outcome.result;
}

// Each harness step renders the whole form with its dials in jsdom: a second or two per test on an idle
// machine, many more on a busy one. The limit only stops a hung test; it measures nothing.
const SLOW = { timeout: 60_000 };

describe('CpWeightCalculator with a test solver', SLOW, () => {
  it('computes the trial-weight method through the solver and shows the correction', async () => {
    const { calculator, solver, host } = await setUp();
    await calculator.fill(SINGLE_PLANE);
    await calculator.submit();

    const fake = solver as FakeSolver;
    expect(fake.calls).toEqual([{ route: 'single-plane', request: SINGLE_PLANE_REQUEST }]);
    const answer = expected('single-plane', SINGLE_PLANE_REQUEST);
    const result = await calculator.getResult();
    expect(result?.corrections).toEqual([
      {
        plane: 1,
        title: 'Correction weight',
        mass: `${answer.correction.mass.toFixed(1)} g`,
        angle: `${Math.round(answer.correction.angleDeg) % 360}°`,
        split: [],
      },
    ]);
    expect(result?.facts['Predicted residual']).toMatch(/ in\/s at \d+°$/);
    expect(result?.solver).toBe('remote');
    expect(result?.stale).toBe(false);
    expect(host.calculations).toHaveLength(1);
    expect(host.calculations[0]).toMatchObject({ method: 'single-plane', solver: 'remote', massUnit: 'g' });
  });

  it('shows progress while the solver works, and the answer when it comes', async () => {
    const solver = new FakeSolver();
    const pending = new Subject<unknown>();
    solver.respond = () => pending;
    const { calculator, fixture } = await setUp(solver, withTrialWeightJob);
    // The calculation is a pending task, so a harness waits for its answer; look while it is on its way.
    await manualChangeDetection(async () => {
      await calculator.submit();
      fixture.detectChanges();
      expect(await calculator.isComputing()).toBe(true);
      expect(await calculator.canSubmit()).toBe(false);
      expect(fixture.isStable()).toBe(false);
    });

    pending.next(expected('single-plane', SINGLE_PLANE_REQUEST));
    pending.complete();
    expect(await calculator.isComputing()).toBe(false);
    expect((await calculator.getResult())?.corrections).toHaveLength(1);
  });

  it('marks every empty field and sends nothing', async () => {
    const { calculator, solver } = await setUp();
    await calculator.submit();
    expect((solver as FakeSolver).calls).toEqual([]);
    expect(await calculator.getErrors()).toEqual([
      'Enter the initial amplitude.',
      'Enter the initial phase.',
      'Enter the trial mass.',
      'Enter the trial angle.',
      'Enter the trial run amplitude.',
      'Enter the trial run phase.',
    ]);
    expect(await calculator.getFieldError('withTrial.phaseDeg')).toBe('Enter the trial run phase.');
    // The first field that needs the technician takes the focus, so typing can start at once.
    expect(document.activeElement?.getAttribute('data-field')).toBe('initial.amplitude');
  });

  it('says what is wrong with a negative amplitude, a zero trial mass and an offset out of range', async () => {
    const { calculator } = await setUp();
    await calculator.fill({ 'initial.amplitude': -0.2, 'trialWeight.mass': 0 });
    expect(await calculator.getFieldError('initial.amplitude')).toMatch(
      /initial amplitude cannot be negative/,
    );
    expect(await calculator.getFieldError('trialWeight.mass')).toBe(
      'The trial mass must be greater than zero.',
    );
    await calculator.selectMethod('one-run');
    await calculator.setField('sensitivity.offsetDeg', 400);
    expect(await calculator.getFieldError('sensitivity.offsetDeg')).toBe(
      'The phase offset must lie between -360 and 360.',
    );
  });

  it("puts the engine's refusal on the field it names, and clears it when the field changes", async () => {
    const solver = new FakeSolver();
    const problem = {
      type: 'about:blank',
      title: 'Bad Request',
      status: 400,
      code: 'ZERO_TRIAL_EFFECT',
      detail: 'The trial weight changed the reading too little; use a heavier trial weight.',
      errors: [{ path: 'withTrial', message: 'The trial weight changed the reading too little.' }],
    };
    const fieldProblem = {
      ...problem,
      code: 'INVALID_REQUEST',
      errors: [{ path: 'withTrial.amplitude', message: 'Read the amplitude again: it cannot be right.' }],
    };
    solver.respond = () =>
      throwError(() => new BalanceSolverError('invalid', 'Read it again.', { problem: fieldProblem }));
    const { calculator } = await setUp(solver, withTrialWeightJob);
    await calculator.submit();
    expect(await calculator.getFailure()).toEqual({ reason: 'invalid', message: 'Read it again.' });
    expect(await calculator.getFieldError('withTrial.amplitude')).toBe(
      'Read the amplitude again: it cannot be right.',
    );
    expect(await calculator.canUseLocalEngine()).toBe(false);

    await calculator.setField('withTrial.amplitude', 0.33);
    expect(await calculator.getFieldError('withTrial.amplitude')).toBeNull();

    solver.respond = () => throwError(() => new BalanceSolverError('invalid', problem.detail, { problem }));
    await calculator.submit();
    expect(await calculator.getFailureDetails()).toEqual([
      'The trial weight changed the reading too little.',
    ]);
  });

  it('offers the device when the service cannot be reached, and computes the same there', async () => {
    const solver = new FakeSolver('remote');
    solver.respond = () =>
      throwError(
        () => new BalanceSolverError('unreachable', 'The calculation service could not be reached.'),
      );
    const { calculator } = await setUp(solver, withTrialWeightJob);
    await calculator.submit();

    expect(await calculator.getFailure()).toEqual({
      reason: 'unreachable',
      message: 'The calculation service could not be reached.',
    });
    expect(await calculator.getResult()).toBeNull();
    expect(await calculator.getFieldValue('initial.amplitude')).toBe('0.52');

    await calculator.useLocalEngine();
    expect(await calculator.getFailure()).toBeNull();
    const result = await calculator.getResult();
    const answer = expected('single-plane', SINGLE_PLANE_REQUEST);
    expect(result?.solver).toBe('local');
    expect(result?.corrections[0]?.mass).toBe(`${answer.correction.mass.toFixed(1)} g`);
  });

  it.each(['unauthorized', 'revoked'] as const)(
    'does not offer the device when the key is %s',
    async (reason) => {
      const solver = new FakeSolver('remote');
      solver.respond = () =>
        throwError(() => new BalanceSolverError(reason, 'Ask the portal administrator.'));
      const { calculator } = await setUp(solver, withTrialWeightJob);
      await calculator.submit();
      expect((await calculator.getFailure())?.reason).toBe(reason);
      expect(await calculator.canUseLocalEngine()).toBe(false);
    },
  );

  it('keeps what was typed across a switch of method', async () => {
    const { calculator, host } = await setUp();
    await calculator.fill({ 'initial.amplitude': 0.52, 'initial.phaseDeg': 74 });
    await calculator.selectMethod('four-run');
    expect(await calculator.getMethod()).toBe('four-run');
    expect(host.method()).toBe('four-run');
    await calculator.setField('initialAmplitude', 0.45);
    await calculator.selectMethod('single-plane');
    expect(await calculator.getFieldValue('initial.amplitude')).toBe('0.52');
    expect(await calculator.getFieldValue('initial.phaseDeg')).toBe('74');
    expect(host.draft()?.fourRun.initialAmplitude).toBe(0.45);
  });

  it('follows the unit chosen in its labels, and never changes the numbers typed', async () => {
    const { calculator, solver } = await setUp(new FakeSolver(), withTrialWeightJob);
    await calculator.setMassUnit('oz');
    await calculator.setAmplitudeUnit('mm/s');
    expect(await calculator.getMassUnit()).toBe('oz');
    expect(await calculator.getAmplitudeUnit()).toBe('mm/s');
    expect(await calculator.getFieldValue('trialWeight.mass')).toBe('60');
    await calculator.submit();
    expect((solver as FakeSolver).calls[0]?.request).toEqual(SINGLE_PLANE_REQUEST);
    const result = await calculator.getResult();
    expect(result?.corrections[0]?.mass).toMatch(/^\d+\.\d{2} oz$/);
    expect(result?.facts['Predicted residual']).toMatch(/ mm\/s at /);
  });

  it('marks a result stale when a value changes after it', async () => {
    const { calculator } = await setUp(new FakeSolver(), withTrialWeightJob);
    await calculator.submit();
    await calculator.setField('initial.amplitude', 0.6);
    expect((await calculator.getResult())?.stale).toBe(true);
  });

  it('splits the correction onto the allowed positions through the solver', async () => {
    const { calculator, solver } = await setUp(new FakeSolver(), (host) => {
      withTrialWeightJob(host);
      host.positions.set({ count: 12, firstDeg: 0 });
    });
    await calculator.submit();
    const fake = solver as FakeSolver;
    expect(fake.calls.map((call) => call.route)).toEqual(['single-plane', 'split']);
    const answer = expected('single-plane', SINGLE_PLANE_REQUEST);
    const split = expected('split', {
      weight: answer.correction,
      positionsDeg: [0, 30, 60, 90, 120, 150, 180, 210, 240, 270, 300, 330],
    });
    const result = await calculator.getResult();
    expect(result?.corrections[0]?.split).toEqual(
      split.weights.map((part) => `${part.mass.toFixed(1)} g at ${Math.round(part.angleDeg) % 360}°`),
    );
  });

  it('snaps the trial weight to the allowed positions, and refuses an angle between them', async () => {
    const { calculator } = await setUp(new FakeSolver(), (host) => host.positions.set(4));
    await calculator.setField('trialWeight.angleDeg', 45);
    expect(await calculator.getFieldError('trialWeight.angleDeg')).toBe(
      'The trial angle must be one of the allowed positions: 0°, 90°, 180°, 270°.',
    );
  });

  it('moves the correction out of a blocked sector', async () => {
    const { calculator } = await setUp(new FakeSolver(), (host) => {
      withTrialWeightJob(host);
      const at = expected('single-plane', SINGLE_PLANE_REQUEST).correction.angleDeg;
      host.blocked.set([{ fromDeg: at - 10, toDeg: at + 10, label: 'holder' }]);
    });
    await calculator.submit();
    const split = (await calculator.getResult())?.corrections[0]?.split ?? [];
    expect(split).toHaveLength(2);
  });

  it('offers only the methods asked for', async () => {
    const { calculator } = await setUp(new FakeSolver(), (host) => {
      host.methods.set(['four-run', 'single-plane']);
      host.method.set(null);
    });
    expect(await calculator.getMethodLabels()).toEqual(['Amplitude only', 'Trial weight']);
    expect(await calculator.getMethod()).toBe('four-run');
  });

  it('fills the stored sensitivity of the machine family', async () => {
    const { calculator, solver } = await setUp(new FakeSolver(), (host) => {
      host.sensitivity.set({ massPerAmplitude: 180, offsetDeg: 15 });
      host.method.set('one-run');
    });
    expect(await calculator.getFieldValue('sensitivity.massPerAmplitude')).toBe('180');
    await calculator.fill({ 'reading.amplitude': 0.38, 'reading.phaseDeg': 212 });
    await calculator.submit();
    expect((solver as FakeSolver).calls[0]?.request).toEqual({
      reading: { amplitude: 0.38, phaseDeg: 212 },
      sensitivity: { massPerAmplitude: 180, offsetDeg: 15 },
      weightAngles: 'againstRotation',
    });
    expect((await calculator.getResult())?.facts['Heavy spot']).toMatch(/^\d+°$/);
  });

  it('restores a draft the page kept, in the units it was typed in', async () => {
    const { calculator, host } = await setUp(new FakeSolver(), withTrialWeightJob);
    await calculator.setField('withTrial.amplitude', 0.29);
    const kept = host.draft();
    expect(kept?.singlePlane.withTrial).toEqual({ amplitude: 0.29, phaseDeg: 141 });
    expect(kept?.massUnit).toBe('g');
    await calculator.setField('withTrial.amplitude', null);
    await calculator.setMassUnit('oz');
    host.draft.set(kept);
    expect(await calculator.getFieldValue('withTrial.amplitude')).toBe('0.29');
    expect(await calculator.getMassUnit()).toBe('g');
  });

  it('reads a draft kept under the earlier names of the two-plane method', async () => {
    const { calculator, host } = await setUp(new FakeSolver(), (page) => page.method.set(null));
    const { multiPlane, ...rest } = jobDraft('multi-plane');
    host.draft.set({ ...rest, method: 'two-plane', twoPlane: multiPlane } as never);
    expect(await calculator.getMethod()).toBe('multi-plane');
    expect(await calculator.getFieldValue('runs.1.readings.1.phaseDeg')).toBe('355');
    expect(host.draft()?.multiPlane).toEqual(twoPlaneJob());
  });

  it('neither edits nor computes while disabled', async () => {
    const { calculator, solver, host } = await setUp(new FakeSolver(), withTrialWeightJob);
    host.disabled.set(true);
    expect(await calculator.canSubmit()).toBe(false);
    await calculator.submit();
    expect((solver as FakeSolver).calls).toEqual([]);
    expect(await calculator.getFieldValue('initial.amplitude')).toBe('0.52');
  });
});

describe('CpWeightCalculator with the local solver', SLOW, () => {
  it('balances two planes on the device', async () => {
    const { calculator } = await setUp('local', (host) => host.method.set('multi-plane'));
    await calculator.fill(harnessFields(twoPlaneJob()));
    await calculator.submit();
    const result = await calculator.getResult();
    const answer = expected('multi-plane', CALC_ROUTES['multi-plane'].example);
    expect(result?.solver).toBe('local');
    expect(result?.corrections.map((one) => [one.title, one.mass])).toEqual(
      answer.corrections.map((one) => [`Plane ${one.plane} correction`, `${one.mass.toFixed(1)} g`]),
    );
    expect(Object.keys(result?.facts ?? {})).toEqual([
      'Predicted residual, sensor 1',
      'Predicted residual, sensor 2',
      'Condition number',
    ]);
  });

  it('balances without phase, from the amplitudes at three trial positions', async () => {
    const { calculator } = await setUp('local', (host) => host.method.set('four-run'));
    await calculator.fill(harnessFields(amplitudeOnlyJob()));
    await calculator.submit();
    const answer = expected('four-run', CALC_ROUTES['four-run'].example);
    const result = await calculator.getResult();
    expect(result?.corrections[0]).toMatchObject({
      mass: `${answer.correction.mass.toFixed(1)} g`,
      angle: `${Math.round(answer.correction.angleDeg) % 360}°`,
    });
    expect(result?.facts['Disagreement between runs']).toMatch(/ %$/);
  });

  it('says why when the trial weight changed nothing, and offers no second solver', async () => {
    const { calculator } = await setUp('local', withTrialWeightJob);
    await calculator.fill({ 'withTrial.amplitude': 0.52, 'withTrial.phaseDeg': 74 });
    await calculator.submit();
    const failure = await calculator.getFailure();
    expect(failure?.reason).toBe('invalid');
    expect(failure?.message).toMatch(/trial weight/i);
    expect(await calculator.canUseLocalEngine()).toBe(false);
    expect(await calculator.getResult()).toBeNull();
  });
});

/** A dealer's page: the calculator as one control of a reactive form, beside a button outside it. */
@Component({
  imports: [CpWeightCalculator, ReactiveFormsModule],
  template: `
    <form [formGroup]="job">
      <cp-weight-calculator formControlName="correction" [methods]="methods" [disabled]="locked()" />
    </form>
    <button type="button" class="elsewhere">Elsewhere on the page</button>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class FormHost {
  readonly methods: readonly CalcMethod[] = ['single-plane', 'multi-plane'];
  readonly job = new FormGroup({ correction: new FormControl<WeightCalculatorValue | null>(null) });
  readonly locked = signal(false);
  get correction() {
    return this.job.controls.correction;
  }
}

/** The same with a lone `[formControl]`. */
@Component({
  imports: [CpWeightCalculator, ReactiveFormsModule],
  template: `<cp-weight-calculator [formControl]="correction" [methods]="['single-plane', 'multi-plane']" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class ControlHost {
  readonly correction = new FormControl<WeightCalculatorValue | null>(null);
}

async function setUpForm<T extends FormHost | ControlHost>(component: new () => T) {
  TestBed.configureTestingModule({
    providers: [{ provide: BALANCE_SOLVER, useExisting: LocalBalanceSolver }],
  });
  const fixture = TestBed.createComponent(component);
  const calculator = await TestbedHarnessEnvironment.loader(fixture).getHarness(CpWeightCalculatorHarness);
  return { fixture, host: fixture.componentInstance, calculator };
}

describe('CpWeightCalculator as a form control', SLOW, () => {
  it('gives the draft as typed, then the calculation when computed, and drops it when a value changes', async () => {
    const { host, calculator } = await setUpForm(ControlHost);
    const control = host.correction;
    expect(control.value).toBeNull();
    expect(control.pristine).toBe(true);

    await calculator.fill(SINGLE_PLANE);
    expect(control.value?.draft.method).toBe('single-plane');
    expect(control.value?.draft.singlePlane).toEqual(trialWeightJob());
    expect(control.value?.calculation).toBeNull();
    expect(control.dirty).toBe(true);

    await calculator.submit();
    const answer = expected('single-plane', SINGLE_PLANE_REQUEST);
    expect(control.value?.calculation).toMatchObject({
      method: 'single-plane',
      request: SINGLE_PLANE_REQUEST,
      result: { correction: answer.correction },
      solver: 'local',
      massUnit: 'g',
      amplitudeUnit: 'in/s',
    });
    expect(control.valid).toBe(true);

    await calculator.setField('withTrial.amplitude', 0.33);
    expect(control.value?.draft.singlePlane.withTrial.amplitude).toBe(0.33);
    expect(control.value?.calculation).toBeNull();
    expect(control.errors).toEqual({ calculatorNotComputed: true });
  });

  it('says which fields are missing, in words a page can show, and that nothing is computed', async () => {
    const { host, calculator } = await setUpForm(ControlHost);
    const control = host.correction;
    expect(control.errors).toEqual({
      calculatorFields: {
        count: 6,
        fields: expect.arrayContaining([
          {
            field: 'initial.amplitude',
            label: 'Initial amplitude',
            section: 'Run 1: no weight',
            message: 'Enter the initial amplitude.',
          },
        ]),
      },
      calculatorNotComputed: true,
    });
    await calculator.fill({ 'initial.amplitude': -0.2, 'initial.phaseDeg': 74 });
    const fields = (control.errors?.['calculatorFields'] as { fields: { field: string; message: string }[] })
      .fields;
    expect(fields.map((one) => one.field)).toEqual([
      'initial.amplitude',
      'trialWeight.mass',
      'trialWeight.angleDeg',
      'withTrial.amplitude',
      'withTrial.phaseDeg',
    ]);
    expect(fields[0]?.message).toMatch(/initial amplitude cannot be negative/);
    // A switch of method is a change of value, and the errors follow the method shown: two sensors
    // read in three runs, and two trial weights.
    await calculator.selectMethod('multi-plane');
    expect(control.value?.draft.method).toBe('multi-plane');
    expect(control.errors?.['calculatorFields']).toMatchObject({ count: 16 });
  });

  it('restores a kept value: the draft, and its calculation while it still matches', async () => {
    const { host, calculator } = await setUpForm(ControlHost);
    const control = host.correction;
    control.setValue({ draft: jobDraft('single-plane'), calculation: null });
    expect(await calculator.getFieldValue('withTrial.phaseDeg')).toBe('141');
    expect(control.pristine).toBe(true);
    expect(control.errors).toEqual({ calculatorNotComputed: true });

    await calculator.submit();
    const kept = control.value!;
    expect(kept.calculation).not.toBeNull();
    const shown = await calculator.getResult();

    control.reset();
    expect(await calculator.getFieldValue('withTrial.phaseDeg')).toBe('');
    expect(await calculator.getResult()).toBeNull();
    // A new job does not show the last one's submitted errors.
    expect(await calculator.getErrors()).toEqual([]);
    expect(control.errors?.['calculatorFields']).toMatchObject({ count: 6 });

    control.setValue(kept);
    expect(await calculator.getFieldValue('withTrial.phaseDeg')).toBe('141');
    expect(await calculator.getResult()).toEqual(shown);
    expect(control.valid).toBe(true);

    // A calculation kept beside a draft that has changed since is not shown as the answer.
    const changed = jobDraft('single-plane');
    changed.singlePlane.withTrial.amplitude = 0.29;
    control.setValue({ draft: changed, calculation: kept.calculation });
    expect(await calculator.getResult()).toBeNull();
    expect(control.errors).toEqual({ calculatorNotComputed: true });
  });

  it('restores a value kept under the earlier names of the two-plane method', async () => {
    const { host, calculator } = await setUpForm(ControlHost);
    const { multiPlane, ...rest } = jobDraft('multi-plane');
    const old = JSON.parse(JSON.stringify({ ...rest, method: 'two-plane', twoPlane: multiPlane }));
    host.correction.setValue({ draft: old, calculation: null });
    expect(await calculator.getMethod()).toBe('multi-plane');
    expect(await calculator.getFieldValue('runs.0.trialWeight.mass')).toBe('80');
    await calculator.submit();
    expect(host.correction.value?.draft.multiPlane).toEqual(twoPlaneJob());
    expect(host.correction.value?.calculation?.method).toBe('multi-plane');
  });

  it('works by formControlName in a group, disabled by the form or by its input', async () => {
    const { host, calculator, fixture } = await setUpForm(FormHost);
    await calculator.fill(SINGLE_PLANE);
    expect(host.job.value.correction?.draft.singlePlane).toEqual(trialWeightJob());
    expect(host.job.valid).toBe(false);
    await calculator.submit();
    expect(host.job.valid).toBe(true);

    host.job.disable();
    expect(await calculator.isDisabled()).toBe(true);
    expect(await calculator.canSubmit()).toBe(false);
    expect(await calculator.getFieldValue('initial.amplitude')).toBe('0.52');
    host.job.enable();
    expect(await calculator.isDisabled()).toBe(false);
    expect(await calculator.canSubmit()).toBe(true);

    host.locked.set(true);
    fixture.detectChanges();
    expect(await calculator.isDisabled()).toBe(true);
    expect(host.correction.enabled).toBe(true);
  });

  it('is touched when the focus leaves the calculator, not while it moves inside', async () => {
    const { host, calculator, fixture } = await setUpForm(FormHost);
    const element: HTMLElement = fixture.nativeElement;
    const inputs = element.querySelectorAll<HTMLInputElement>('input[data-field]');
    inputs[0]!.focus();
    inputs[1]!.focus();
    expect(host.correction.touched).toBe(false);
    element.querySelector<HTMLButtonElement>('.elsewhere')!.focus();
    expect(host.correction.touched).toBe(true);

    host.correction.markAsUntouched();
    inputs[0]!.focus();
    await calculator.blur();
    expect(host.correction.touched).toBe(true);
  });

  it('shows every missing field when the page marks its form touched, but not when the technician only passes by', async () => {
    const { host, calculator, fixture } = await setUpForm(FormHost);
    const element: HTMLElement = fixture.nativeElement;
    element.querySelector<HTMLInputElement>('input[data-field]')!.focus();
    element.querySelector<HTMLButtonElement>('.elsewhere')!.focus();
    expect(host.correction.touched).toBe(true);
    // The field the technician left shows its error, as any Material field does; the others stay quiet.
    expect(await calculator.getFieldError('initial.amplitude')).toMatch(/amplitude/i);
    expect(await calculator.getFieldError('trialWeight.mass')).toBeNull();

    host.correction.markAsUntouched();
    host.job.markAllAsTouched();
    fixture.detectChanges();
    expect(await calculator.getFieldError('initial.amplitude')).toMatch(/amplitude/i);
    expect(await calculator.getFieldError('trialWeight.mass')).toMatch(/mass/i);
  });
});

describe('CpWeightCalculator with the remote solver', SLOW, () => {
  const BASE = 'https://calc.example.net';
  const TWELVE_HOLES = [0, 30, 60, 90, 120, 150, 180, 210, 240, 270, 300, 330];

  /** A calculator that computes through the calculator API; the requests are answered by the test. */
  async function setUpRemote(configure: (host: Host) => void) {
    const loadRuntime = vi.fn(loadApiRuntime);
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideCounterpoise({ solver: 'remote', apiBaseUrl: BASE, apiKey: 'cpk_portal' }),
        { provide: API_RUNTIME_LOADER, useValue: loadRuntime },
      ],
    });
    const fixture = TestBed.createComponent(Host);
    configure(fixture.componentInstance);
    const calculator = await TestbedHarnessEnvironment.loader(fixture).getHarness(CpWeightCalculatorHarness);
    const http = TestBed.inject(HttpTestingController);
    /** The one request to a route, once the solver has sent it. */
    const sent = (route: string) => vi.waitFor(() => http.expectOne(`${BASE}/api/v1/calc/${route}`));
    return { calculator, http, sent, loadRuntime };
  }

  /** The batch answer as the server writes it: each item computed by the API's own route table. */
  function batchAnswer(items: readonly { id: string; route: CalcRouteName; body: unknown }[]) {
    return {
      items: items.map(({ id, route, body }) => {
        const outcome = calculate(route, body);
        return outcome.status === 200
          ? { id, status: 200, result: outcome.result }
          : { id, status: outcome.status, problem: outcome.problem };
      }),
    };
  }

  function twoPlanesOnTwelveHoles(host: Host): void {
    host.method.set('multi-plane');
    host.draft.set(jobDraft('multi-plane'));
    host.positions.set({ count: 12, firstDeg: 0 });
  }

  it('sends the splits of both planes as one batch request, and shows each on its plane', async () => {
    const { calculator, http, sent, loadRuntime } = await setUpRemote(twoPlanesOnTwelveHoles);
    await manualChangeDetection(() => calculator.submit());

    const calculation = await sent('multi-plane');
    const answer = expected('multi-plane', calculation.request.body);
    calculation.flush(answer);

    const batch = await sent('batch');
    expect(batch.request.body).toEqual({
      items: answer.corrections.map((correction, index) => ({
        id: String(index),
        route: 'split',
        body: {
          weight: { mass: correction.mass, angleDeg: correction.angleDeg },
          positionsDeg: TWELVE_HOLES,
        },
      })),
    });
    const splits = batchAnswer(batch.request.body.items);
    batch.flush(splits);
    // Two requests in all: the calculation, then one batch for every split.
    http.verify();

    const result = await calculator.getResult();
    expect(result?.solver).toBe('remote');
    expect(result?.corrections.map((correction) => correction.split)).toEqual(
      splits.items.map((item) =>
        (item.result as { weights: { mass: number; angleDeg: number }[] }).weights.map(
          (part) => `${part.mass.toFixed(1)} g at ${Math.round(part.angleDeg) % 360}°`,
        ),
      ),
    );
    // Nothing of the on-device engine was loaded for it.
    expect(loadRuntime).not.toHaveBeenCalled();
  });

  it("shows an item's refusal in the batch as that plane's warning, the other plane split", async () => {
    const { calculator, http, sent } = await setUpRemote(twoPlanesOnTwelveHoles);
    await manualChangeDetection(() => calculator.submit());
    const calculation = await sent('multi-plane');
    calculation.flush(expected('multi-plane', calculation.request.body));

    const batch = await sent('batch');
    const items = batch.request.body.items as { id: string; route: CalcRouteName; body: unknown }[];
    // The second item as a server of another version might refuse it: the same route, a refused body.
    const refusedBody = { ...(items[1]!.body as object), positionsDeg: [90] };
    const answer = batchAnswer([items[0]!, { ...items[1]!, body: refusedBody }]);
    const problem = answer.items[1]!.problem!;
    expect(answer.items[1]!.status).toBe(400);
    batch.flush(answer);
    http.verify();

    const result = await calculator.getResult();
    expect(result?.corrections[0]?.split).toHaveLength(2);
    expect(result?.corrections[1]?.split).toEqual([]);
    expect(result?.warnings).toContain(
      `The split onto the allowed places could not be computed: ${problem.errors![0]!.message}`,
    );
  });

  it('loads the on-device engine only when it offers it, after the service failed', async () => {
    const { calculator, sent, loadRuntime } = await setUpRemote((host) => {
      withTrialWeightJob(host);
    });
    // Past the idle time in which a solver starts loading what it needs.
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(loadRuntime).not.toHaveBeenCalled();

    await manualChangeDetection(() => calculator.submit());
    (await sent('single-plane')).flush(
      { type: 'about:blank', title: 'Service Unavailable', status: 503 },
      { status: 503, statusText: 'Service Unavailable' },
    );
    expect(await calculator.canUseLocalEngine()).toBe(true);
    await vi.waitFor(() => expect(loadRuntime).toHaveBeenCalled());
  });
});

describe('CpWeightCalculator with the local solver, as the page chose it', SLOW, () => {
  it('starts loading the on-device engine once the page is idle, before any calculation', async () => {
    const loadRuntime = vi.fn(loadApiRuntime);
    TestBed.configureTestingModule({
      providers: [
        provideCounterpoise({ solver: 'local' }),
        { provide: API_RUNTIME_LOADER, useValue: loadRuntime },
      ],
    });
    const fixture = TestBed.createComponent(Host);
    await TestbedHarnessEnvironment.loader(fixture).getHarness(CpWeightCalculatorHarness);
    await vi.waitFor(() => expect(loadRuntime).toHaveBeenCalled());
  });
});
