import type { Reading } from '@counterpoise/engine';
import request from 'supertest';
import { expect } from 'vitest';
import { AccountsRepo } from '../accounts/accounts.repo';
import { hashPasswordSync } from '../auth/passwords';
import { as, customerBody, familyBody, machineBody, type RecordsTestApp } from '../records/records.test-app';
import { signIn, TEST_HASH_COST, TEST_PASSWORD } from '../testing/accounts';

export { type ModelRotor, modelReadings } from './model-rotor';

/*
 * What the jobs' specs share: a machine of a family to balance, a second technician, the steps before
 * the runs, and readings made from a modelled rotor (an initial unbalance and influence coefficients),
 * so that a computed correction can be checked against the rotor it came from.
 */

export type Stored = { id: number; version: number } & Record<string, unknown>;

/** A job as the specs read it. */
export interface JobBody {
  id: number;
  version: number;
  status: string;
  nextStep: string;
  runs: {
    id: number;
    kind: string;
    amplitudeOnly: boolean;
    readings: { average: { amplitude: number; phaseDeg: number | null }; sensorSide: string }[];
    warnings: string[];
  }[];
  corrections: {
    id: number;
    method: string;
    basis: string;
    calc: { route: string; request: object; sensorSides: string[] };
    result: Record<string, unknown>;
    plan: { planeIndex: number; massGrams: number; angleDeg: number }[];
    predicted: { sensorSide: string; reading: { amplitude: number; phaseDeg: number | null } }[] | null;
  }[];
  verification: { accepted: boolean; nextSide: string | null; why: string } | null;
  completion: Record<string, unknown> | null;
  [key: string]: unknown;
}

/** A second technician of the own organisation, signed in. */
export async function secondTechnician(test: RecordsTestApp): Promise<{ id: number; token: string }> {
  const repo = new AccountsRepo(test.temporary.database.orm);
  const email = `technician-2-${Date.now()}-${Math.round(Math.random() * 1e6)}@alder-fan-works.test`;
  const person = repo.insertUser({
    organisationId: test.own.id,
    email,
    name: 'Second technician',
    role: 'technician',
    passwordHash: hashPasswordSync(TEST_PASSWORD, { log2N: TEST_HASH_COST }),
    createdAt: new Date(),
  });
  return { id: person.id, token: (await signIn(test.app, email)).accessToken };
}

let counter = 0;

/** A customer, a family (with or without stored sensitivities) and a machine of it, made by `token`'s organisation. */
export async function machineOfFamily(
  test: RecordsTestApp,
  token: string,
  options: { planeCount?: 1 | 2; sensitivities?: unknown[]; acceptance?: object } = {},
): Promise<{ machineId: number; familyId: number }> {
  const planeCount = options.planeCount ?? 1;
  const owner = as(test.app, token);
  const tag = `j${++counter}-${Math.round(Math.random() * 1e6)}`;
  const customer = await owner.post('/api/v1/customers', customerBody(tag));
  expect(customer.status, JSON.stringify(customer.body)).toBe(201);
  const family = await owner.post('/api/v1/machine-families', {
    ...familyBody(tag, planeCount),
    correctionRadiiMm: planeCount === 2 ? [210, 210] : [210],
    sensitivities: options.sensitivities ?? [],
    ...(options.acceptance ? { acceptance: options.acceptance } : {}),
  });
  expect(family.status, JSON.stringify(family.body)).toBe(201);
  const machine = await owner.post('/api/v1/machines', {
    ...machineBody(customer.body.id as number, {
      familyId: family.body.id,
      serialNumber: `SN-${tag}`,
      planeCount,
    }),
    rotorMassKg: 300,
  });
  expect(machine.status, JSON.stringify(machine.body)).toBe(201);
  return { machineId: machine.body.id as number, familyId: family.body.id as number };
}

/** Requests of one signed-in person on jobs, each change with the If-Match of `version`. */
export function jobsAs(test: RecordsTestApp, token: string) {
  const bearer = `Bearer ${token}`;
  const send = (method: 'post' | 'put', path: string, body: object | undefined, version?: number) => {
    const call = request(test.app)[method](path).set('Authorization', bearer);
    if (version !== undefined) call.set('If-Match', `"${version}"`);
    return body === undefined ? call : call.send(body);
  };
  return {
    get: (path: string) => request(test.app).get(path).set('Authorization', bearer),
    create: (body: object) => request(test.app).post('/api/v1/jobs').set('Authorization', bearer).send(body),
    post: (path: string, body: object | undefined, version?: number) => send('post', path, body, version),
    put: (path: string, body: object, version?: number) => send('put', path, body, version),
  };
}

/** Acknowledges safety, passes the inspection and records a set-up; returns the job after them. */
export async function readyForRuns(
  test: RecordsTestApp,
  token: string,
  jobId: number,
  version: number,
  sides: ('left' | 'right')[] = ['left'],
): Promise<JobBody> {
  const jobs = jobsAs(test, token);
  const path = `/api/v1/jobs/${jobId}`;
  const safety = await jobs.put(
    `${path}/safety`,
    { topicIds: ['lockout', 'running', 'hot-work', 'weights', 'protection'] },
    version,
  );
  expect(safety.status, JSON.stringify(safety.body)).toBe(200);
  const inspection = await jobs.put(`${path}/inspection`, passingInspection(), safety.body.version);
  expect(inspection.status, JSON.stringify(inspection.body)).toBe(200);
  const setup = await jobs.put(`${path}/setup`, setupBody(sides), inspection.body.version);
  expect(setup.status, JSON.stringify(setup.body)).toBe(200);
  return setup.body as JobBody;
}

export function passingInspection(): object {
  return {
    bearingEndPlayMm: 0.1,
    shaftRunoutMm: 0.05,
    checks: { teethOrKnives: 'ok', buildUpCleaned: 'fixed', welds: 'ok', beltsAndPulleys: 'ok' },
  };
}

export function setupBody(sides: ('left' | 'right')[]): object {
  return {
    sensors: sides.map((side) => ({ side, position: `${side} bearing housing` })),
    tachometer: 'On the skid',
    referenceMark: 'Tape on the end plate',
    rotationSeenFromLeft: 'counterClockwise',
    operatingSpeedRpm: 2150,
    amplitudeUnit: 'in/s-pk',
    phaseSense: 'lag',
    weightAngles: 'againstRotation',
  };
}

/** The readings of a run body: each sensor's reading, repeated `repeats` times at `speedRpm`. */
export function runReadings(
  sides: readonly ('left' | 'right')[],
  readings: readonly Reading[],
  options: { repeats?: number; speedRpm?: number } = {},
): object[] {
  return sides.map((side, index) => ({
    sensorSide: side,
    repeats: Array.from({ length: options.repeats ?? 2 }, () => ({
      amplitude: readings[index]!.amplitude,
      phaseDeg: readings[index]!.phaseDeg,
      speedRpm: options.speedRpm ?? 2150,
    })),
  }));
}

/** The readings of an amplitude-only run body: each sensor's amplitude alone (no phase), repeated. */
export function amplitudeReadings(
  sides: readonly ('left' | 'right')[],
  readings: readonly Reading[],
  options: { repeats?: number; speedRpm?: number } = {},
): object[] {
  return sides.map((side, index) => ({
    sensorSide: side,
    repeats: Array.from({ length: options.repeats ?? 2 }, () => ({
      amplitude: readings[index]!.amplitude,
      speedRpm: options.speedRpm ?? 2150,
    })),
  }));
}
