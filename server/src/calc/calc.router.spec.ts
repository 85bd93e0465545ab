import { CALC_ROUTE_NAMES, CALC_ROUTES, ProblemSchema } from '@counterpoise/api';
import { singlePlaneBalance } from '@counterpoise/engine';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { calcTestApp } from './calc.test-app';

const post = (path: string, body: unknown, app = calcTestApp().app) =>
  request(app)
    .post(`/api/v1/calc/${path}`)
    .send(body as object);

function expectProblem(response: request.Response, status: number) {
  expect(response.status).toBe(status);
  expect(response.headers['content-type']).toMatch(/^application\/problem\+json/);
  return ProblemSchema.parse(response.body);
}

describe('every calculator route', () => {
  it.each(CALC_ROUTE_NAMES)('%s answers its documented example in its documented shape', async (name) => {
    const route = CALC_ROUTES[name];
    const response = await post(name, route.example).expect(200);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    const parsed = route.response.safeParse(response.body);
    expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
    expect(response.body.warnings).toBeInstanceOf(Array);
  });

  it.each(CALC_ROUTE_NAMES)('%s answers GET with 405 and the Allow header', async (name) => {
    const response = await request(calcTestApp().app).get(`/api/v1/calc/${name}`);
    expectProblem(response, 405);
    expect(response.headers['allow']).toBe('POST');
  });
});

describe('POST /api/v1/calc/single-plane', () => {
  const example = CALC_ROUTES['single-plane'].example;

  it('gives what the engine gives for the same readings', async () => {
    const response = await post('single-plane', example).expect(200);
    const engine = singlePlaneBalance(example);
    expect(response.body.correction.mass).toBeCloseTo(engine.correction.mass, 12);
    expect(response.body.correction.angleDeg).toBeCloseTo(engine.correction.angleDeg, 12);
    expect(response.body.influenceCoefficient).toEqual(engine.influenceCoefficient);
    expect(response.body.predictedResidual.amplitude).toBeLessThan(1e-9);
  });

  it('with the trial weight left on, gives what to add to it', async () => {
    const body = { ...example, trialWeightRemoved: false };
    const response = await post('single-plane', body).expect(200);
    expect(response.body.correction).toEqual(singlePlaneBalance(body).correction);
    expect(response.body.correction).not.toEqual(response.body.totalCorrection);
  });

  it('names a misspelt field and the field it should have been', async () => {
    const response = await post('single-plane', { ...example, initial: { amplitude: 0.5, phase: 74 } });
    const problem = expectProblem(response, 400);
    expect(problem.code).toBe('INVALID_REQUEST');
    expect(problem.errors?.map((error) => error.path).sort()).toEqual(['initial.phase', 'initial.phaseDeg']);
  });

  it('refuses a negative mass, naming the field', async () => {
    const response = await post('single-plane', { ...example, trialWeight: { mass: -60, angleDeg: 0 } });
    const problem = expectProblem(response, 400);
    expect(problem.errors).toEqual([
      { path: 'trialWeight.mass', message: expect.stringMatching(/cannot be negative/) },
    ]);
  });

  it('explains a trial weight that changed nothing, instead of dividing by zero', async () => {
    const response = await post('single-plane', { ...example, withTrial: example.initial });
    const problem = expectProblem(response, 400);
    expect(problem.code).toBe('ZERO_TRIAL_EFFECT');
    expect(problem.detail).toBeTruthy();
    expect(problem.instance).toBe('/api/v1/calc/single-plane');
  });
});

describe('bodies the routes do not take', () => {
  it('answers 415 when the body is not JSON', async () => {
    const response = await request(calcTestApp().app)
      .post('/api/v1/calc/radius')
      .set('Content-Type', 'text/plain')
      .send('mass=120');
    expect(expectProblem(response, 415).detail).toMatch(/application\/json/);
  });

  it('answers 400 when the JSON is broken', async () => {
    const response = await request(calcTestApp().app)
      .post('/api/v1/calc/radius')
      .set('Content-Type', 'application/json')
      .send('{"mass": 120,');
    expect(expectProblem(response, 400).detail).toMatch(/not valid JSON/);
  });

  it('answers 413 above 64 kB', async () => {
    const weights = Array.from({ length: 3000 }, (_, i) => ({ mass: 10, angleDeg: i % 360, radius: 200 }));
    const response = await post('combine', { weights });
    expectProblem(response, 413);
  });

  it('answers 400 naming the body when it is not an object', async () => {
    const response = await post('radius', [1, 2, 3]);
    const problem = expectProblem(response, 400);
    expect(problem.errors?.[0]?.path).toBe('');
  });

  it('answers 404 for a route that does not exist', async () => {
    const problem = expectProblem(await post('three-plane', {}), 404);
    expect(problem.detail).toBe('No route POST /api/v1/calc/three-plane.');
  });

  it('finds a route whatever the case of its path, and with a trailing slash, as Express routes do', async () => {
    const example = CALC_ROUTES.radius.example;
    for (const path of ['radius/', 'Radius', 'RADIUS/']) {
      expect((await post(path, example).expect(200)).body).toEqual({ mass: 90, warnings: [] });
    }
  });

  it('answers 415 to a body not sent as JSON', async () => {
    const response = await request(calcTestApp().app)
      .post('/api/v1/calc/radius')
      .set('Content-Type', 'text/plain')
      .send('mass=1');
    expectProblem(response, 415);
  });
});

describe('POST /api/v1/calc/batch', () => {
  it('answers every item on its own, in order, and logs one usage row with its calculations and its items’ errors', async () => {
    const { app, rows } = calcTestApp();
    const response = await post(
      'batch',
      {
        items: [
          { id: 'drum-7', route: 'single-plane', body: CALC_ROUTES['single-plane'].example },
          { route: 'radius', body: { mass: 120, fromRadius: 180, toRadius: -1 } },
          { id: 'x', route: 'three-plane', body: {} },
          { route: 'trial-weight', body: CALC_ROUTES['trial-weight'].example },
        ],
      },
      app,
    ).expect(200);

    const items = response.body.items as {
      id: string;
      status: number;
      result?: unknown;
      problem?: unknown;
    }[];
    expect(items.map((item) => [item.id, item.status])).toEqual([
      ['drum-7', 200],
      ['1', 400],
      ['x', 404],
      ['3', 200],
    ]);
    expect(ProblemSchema.parse(items[1]?.problem).errors?.[0]?.path).toBe('toRadius');
    expect(CALC_ROUTES['trial-weight'].response.safeParse(items[3]?.result).success).toBe(true);

    // One row for the request: four calculations, the refused item and the unknown route by status.
    expect(rows.map((row) => [row.keyId, row.route, row.status, row.calculations, row.itemErrors])).toEqual([
      [7, 'POST /api/v1/calc/batch', 200, 4, { 400: 1, 404: 1 }],
    ]);
    expect(rows[0]?.bytes).toBe(Number(response.headers['content-length']));
  });

  it('refuses more than 1,000 items, naming the list', async () => {
    const item = { route: 'radius', body: CALC_ROUTES.radius.example };
    const response = await post('batch', { items: Array.from({ length: 1001 }, () => item) });
    expect(expectProblem(response, 400).errors?.[0]?.path).toBe('items');
  });

  it('takes 1,000 items in one request', async () => {
    const { app, rows } = calcTestApp();
    const item = { route: 'single-plane', body: CALC_ROUTES['single-plane'].example };
    const response = await post('batch', { items: Array.from({ length: 1000 }, () => item) }, app).expect(
      200,
    );
    expect(response.body.items).toHaveLength(1000);
    expect(rows.map((row) => [row.route, row.calculations, row.itemErrors])).toEqual([
      ['POST /api/v1/calc/batch', 1000, undefined],
    ]);
  });

  it('logs a batch refused whole as a request that asked for no calculation', async () => {
    const { app, rows } = calcTestApp();
    await post('batch', { items: [] }, app).expect(400);
    expect(rows.map((row) => [row.route, row.status, row.calculations])).toEqual([
      ['POST /api/v1/calc/batch', 400, 0],
    ]);
  });
});
