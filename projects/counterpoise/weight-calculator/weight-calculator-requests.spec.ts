import { describe, expect, it } from 'vitest';
import { CALC_ROUTES, calculate } from '@counterpoise/api';
import { CALC_METHODS } from './weight-calculator-model';
import { filledDraft } from './weight-calculator.fixtures';
import {
  buildRequest,
  controlPathFor,
  freeSectors,
  isBlocked,
  multiPlaneRequest,
  pathSegments,
  placementPlan,
  requestMatches,
} from './weight-calculator-requests';

describe('buildRequest', () => {
  it('builds requests the engine accepts, for every method', () => {
    const draft = filledDraft();
    expect(calculate('one-run', buildRequest('one-run', draft, 'againstRotation')).status).toBe(200);
    expect(calculate('single-plane', buildRequest('single-plane', draft, 'againstRotation')).status).toBe(
      200,
    );
    expect(calculate('multi-plane', buildRequest('multi-plane', draft, 'withRotation')).status).toBe(200);
    expect(calculate('four-run', buildRequest('four-run', draft, 'againstRotation')).status).toBe(200);
  });

  it("sends the calculator API's own examples for the demo jobs", () => {
    const draft = filledDraft();
    for (const method of CALC_METHODS) {
      expect(buildRequest(method, draft, 'againstRotation'), method).toMatchObject(
        CALC_ROUTES[method].example,
      );
    }
  });

  it('sends weight angles counted the way the calculator counts them', () => {
    const draft = filledDraft();
    expect(buildRequest('single-plane', draft, 'withRotation')).toMatchObject({
      weightAngles: 'withRotation',
    });
    expect(buildRequest('one-run', draft, 'againstRotation')).toEqual({
      reading: { amplitude: 0.38, phaseDeg: 212 },
      sensitivity: { massPerAmplitude: 200 },
      weightAngles: 'againstRotation',
    });
  });

  it('lists a trial weight left on again in the next run', () => {
    const draft = filledDraft();
    const removed = multiPlaneRequest(draft.multiPlane, 'againstRotation');
    expect(removed.runs.map((run) => run.weights.map((weight) => weight.plane))).toEqual([[1], [2]]);
    const leftOn = multiPlaneRequest({ ...draft.multiPlane, trialWeightsRemoved: false }, 'againstRotation');
    expect(leftOn.runs.map((run) => run.weights.map((weight) => weight.plane))).toEqual([[1], [1, 2]]);
  });

  it('refuses to build from an empty field, which the form should have caught', () => {
    const draft = filledDraft();
    draft.singlePlane.withTrial.phaseDeg = null;
    expect(() => buildRequest('single-plane', draft, 'againstRotation')).toThrow(/withTrial\.phaseDeg/);
  });
});

describe('requestMatches', () => {
  it('tells whether a kept request is still the one the draft gives, whatever the order of its keys', () => {
    const draft = filledDraft();
    const { weightAngles, ...rest } = buildRequest('single-plane', draft, 'againstRotation');
    const reordered = { weightAngles, ...rest };
    expect(requestMatches('single-plane', draft, 'againstRotation', reordered)).toBe(true);
    expect(requestMatches('single-plane', draft, 'withRotation', reordered)).toBe(false);
    draft.singlePlane.withTrial.amplitude = 0.33;
    expect(requestMatches('single-plane', draft, 'againstRotation', reordered)).toBe(false);
    draft.singlePlane.withTrial.amplitude = null;
    expect(requestMatches('single-plane', draft, 'againstRotation', reordered)).toBe(false);
  });
});

describe('controlPathFor', () => {
  it('reads the paths the engine writes', () => {
    expect(pathSegments('runs[1].readings[0].amplitude')).toEqual(['runs', 1, 'readings', 0, 'amplitude']);
    expect(pathSegments('')).toEqual([]);
  });

  it("maps the engine's field paths onto the form's controls", () => {
    expect(controlPathFor('single-plane', 'initial.phaseDeg')).toBe('initial.phaseDeg');
    expect(controlPathFor('four-run', 'trialRuns[2].amplitude')).toBe('trialRuns.2.amplitude');
    expect(controlPathFor('multi-plane', 'runs[1].readings[0].amplitude')).toBe(
      'runs.1.readings.0.amplitude',
    );
    expect(controlPathFor('one-run', 'weightAngles')).toBeNull();
    expect(controlPathFor('one-run', '')).toBeNull();
  });

  it('traces a trial weight listed again back to the run of its plane', () => {
    const request = multiPlaneRequest(
      { ...filledDraft().multiPlane, trialWeightsRemoved: false },
      'againstRotation',
    );
    expect(controlPathFor('multi-plane', 'runs[1].weights[0].mass', request)).toBe('runs.0.trialWeight.mass');
    expect(controlPathFor('multi-plane', 'runs[1].weights[1].angleDeg', request)).toBe(
      'runs.1.trialWeight.angleDeg',
    );
    expect(controlPathFor('multi-plane', 'runs[1].weights[1]', request)).toBe('runs.1.trialWeight');
  });
});

describe('placement', () => {
  const holder = (fromDeg: number, toDeg: number) => ({ fromDeg, toDeg, label: 'holder' });

  it('frees the rim between blocked sectors, merging those that overlap or wrap past 0', () => {
    expect(freeSectors([holder(10, 40), holder(30, 60), holder(200, 220)])).toEqual([
      { fromDeg: 60, toDeg: 200 },
      { fromDeg: 220, toDeg: 10 },
    ]);
    expect(freeSectors([holder(350, 20), holder(10, 30)])).toEqual([{ fromDeg: 30, toDeg: 350 }]);
    expect(freeSectors([holder(0, 180), holder(180, 0)])).toEqual([]);
  });

  it('tells a blocked angle from one beside a sector', () => {
    expect(isBlocked(25, [holder(10, 40)])).toBe(true);
    expect(isBlocked(40, [holder(10, 40)])).toBe(false);
    expect(isBlocked(5, [holder(350, 20)])).toBe(true);
  });

  it('splits onto the free allowed positions, or outside blocked sectors, or not at all', () => {
    expect(placementPlan(null, [])).toEqual({ kind: 'anywhere' });
    expect(placementPlan({ count: 4, firstDeg: 0 }, [holder(80, 100)])).toEqual({
      kind: 'split',
      places: { positionsDeg: [0, 180, 270] },
    });
    expect(placementPlan(null, [holder(80, 100)])).toEqual({
      kind: 'split',
      places: { sectors: [{ fromDeg: 100, toDeg: 80 }] },
    });
    expect(placementPlan([90], [])).toMatchObject({ kind: 'nowhere' });
    expect(placementPlan(null, [holder(0, 180), holder(180, 0)])).toMatchObject({ kind: 'nowhere' });
  });

  it('gives split requests the engine accepts', () => {
    const plan = placementPlan(null, [holder(80, 100), holder(250, 260)]);
    if (plan.kind !== 'split') throw new Error('expected a split');
    const outcome = calculate('split', { weight: { mass: 84, angleDeg: 90 }, ...plan.places });
    expect(outcome.status).toBe(200);
    if (outcome.status === 200) expect(outcome.result.weights).toHaveLength(2);
  });
});
