import type { Express } from 'express';
import request from 'supertest';
import { ROLES, type Role } from '@counterpoise/api';
import type { Clock } from '../clock';
import {
  type AccountsTestApp,
  createTestOrganisation,
  signIn,
  startAccountsTestApp,
  type TestOrganisation,
} from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';

/*
 * The records' specs drive the real app over a temporary SQLite file, with two organisations and one
 * signed-in person per role in each: what one organisation stores, the other must never reach.
 */

/** The app, the two organisations and the access token of each of their people. */
export interface RecordsTestApp {
  readonly app: Express;
  readonly temporary: TemporaryDatabase;
  readonly own: TestOrganisation;
  readonly other: TestOrganisation;
  /** The access tokens of the own organisation's people, by role. */
  readonly tokens: Readonly<Record<Role, string>>;
  /** The access token of the other organisation's owner. */
  readonly otherOwner: string;
  close(): Promise<void>;
}

/**
 * A clock a spec sets by hand, so that records made one after the other have distinct times to sort
 * by. Access tokens live 10 minutes by it: a spec moves it by seconds.
 */
export class ManualClock implements Clock {
  constructor(private at = new Date('2026-03-02T08:00:00.000Z')) {}

  now(): Date {
    return new Date(this.at);
  }

  /** Moves the clock on. */
  advance(milliseconds: number): void {
    this.at = new Date(this.at.getTime() + milliseconds);
  }
}

/** Builds the app over a fresh database and signs in everyone of both organisations. */
export async function startRecordsTestApp(options: { clock?: Clock } = {}): Promise<RecordsTestApp> {
  const temporary = openTemporaryDatabase();
  const own = createTestOrganisation(temporary.database, 'Alder Fan Works');
  const other = createTestOrganisation(temporary.database, 'Birch Mulcher Repair');
  const test: AccountsTestApp = await startAccountsTestApp(
    temporary.database,
    options.clock === undefined ? {} : { clock: options.clock },
  );
  const tokens = {} as Record<Role, string>;
  for (const role of ROLES) tokens[role] = (await signIn(test.app, own.people[role].email)).accessToken;
  const otherOwner = (await signIn(test.app, other.people.owner.email)).accessToken;
  return {
    app: test.app,
    temporary,
    own,
    other,
    tokens,
    otherOwner,
    close: async () => {
      await test.close();
      temporary.dispose();
    },
  };
}

/** Requests of one signed-in person. */
export function as(app: Express, token: string) {
  const bearer = `Bearer ${token}`;
  return {
    get: (path: string) => request(app).get(path).set('Authorization', bearer),
    post: (path: string, body?: object) => {
      const test = request(app).post(path).set('Authorization', bearer);
      return body === undefined ? test : test.send(body);
    },
    patch: (path: string, body: unknown, ifMatch?: string) => {
      const test = request(app).patch(path).set('Authorization', bearer);
      if (ifMatch !== undefined) test.set('If-Match', ifMatch);
      return test.send(body as object);
    },
    /** Archive or restore, with the If-Match given. */
    change: (path: string, ifMatch?: string) => {
      const test = request(app).post(path).set('Authorization', bearer);
      return ifMatch === undefined ? test : test.set('If-Match', ifMatch);
    },
  };
}

/** A customer body, unique by `tag`. */
export function customerBody(tag: string): Record<string, unknown> {
  return {
    name: `Fernhollow Clearing ${tag}`,
    email: `office-${tag}@fernhollow.test`,
    phone: '+1 555 0142',
    siteAddress: '14 Sawmill Road, Fernhollow',
    contacts: [{ name: 'Juno Hartwell', role: 'Fleet foreman' }],
  };
}

/** A two-plane mulcher family body. */
export function familyBody(tag: string, planeCount: 1 | 2 = 2): Record<string, unknown> {
  return {
    name: `Mulcher drum ${tag}`,
    rotorType: planeCount === 2 ? 'fixed-tooth-drum' : 'fan',
    nominalSpeedRpm: 2200,
    planeCount,
    correctionRadiiMm: planeCount === 2 ? [210, 210] : [520],
    inspectionLimits: { bearingEndPlayMm: 0.3, shaftRunoutMm: 0.2 },
    acceptance: { kind: 'shop-target', amplitude: 0.15, unit: 'in/s-pk' },
    sensitivities: [
      { sensorSide: 'left', planeIndex: 0, gramsPerUnit: 620, unit: 'in/s-pk', phaseLagDeg: 40 },
    ],
  };
}

/** A machine body of a customer (and a family), with as many planes as asked. */
export function machineBody(
  customerId: number,
  options: { familyId?: number | null; serialNumber?: string; planeCount?: 1 | 2 } = {},
): Record<string, unknown> {
  const plane = { correctionRadiusMm: 210, positions: { count: 12, firstDeg: 15 } };
  return {
    customerId,
    familyId: options.familyId ?? null,
    make: 'Brackenfold',
    model: 'BF-220',
    serialNumber: options.serialNumber ?? 'BF220-0001',
    hours: 1460,
    rotationSeenFromLeft: 'counterClockwise',
    planes: options.planeCount === 1 ? [plane] : [plane, plane],
    stockWeightsGrams: [25, 50, 100],
  };
}

/** How many rows a table holds: to show that a refused request stored nothing. */
export function rowCount(test: RecordsTestApp, table: string): number {
  const row = test.temporary.database.sqlite.prepare(`SELECT count(*) AS count FROM ${table}`).get() as {
    count: number;
  };
  return row.count;
}
