/*
 * What customers, machine families and machines do alike, driven through the real app: who may call
 * each route, what another organisation sees, versions (428, 412, parallel changes), hostile input, and
 * the history. The specs of each feature test its own rules, search and sort.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RECORDS_PROBLEM_CODES, ROLES, type Role } from '@counterpoise/api';
import {
  as,
  customerBody,
  familyBody,
  machineBody,
  type RecordsTestApp,
  rowCount,
  startRecordsTestApp,
} from './records.test-app';

let test: RecordsTestApp;
let counter = 0;
beforeAll(async () => (test = await startRecordsTestApp()));
afterAll(async () => test.close());

type Scope = 'own' | 'other';
type Stored = { id: number; version: number } & Record<string, unknown>;

/** One kind of record, as these specs create and change it. */
interface Kind {
  readonly path: string;
  readonly table: string;
  /** The roles that may create and change it. */
  readonly writers: readonly Role[];
  /** A valid body for a new record of the organisation. */
  body(scope: Scope): Promise<Record<string, unknown>>;
  /** A valid change, different for each `n`. */
  change(n: number): Record<string, unknown>;
  /** The field `change` sets, and the value it sets for `n`. */
  readonly changed: { readonly field: string; value(n: number): unknown };
}

const tokenOf = (scope: Scope) => (scope === 'own' ? test.tokens.owner : test.otherOwner);

async function createCustomer(scope: Scope): Promise<Stored> {
  const response = await as(test.app, tokenOf(scope)).post(
    '/api/v1/customers',
    customerBody(`c${++counter}`),
  );
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return response.body as Stored;
}

const KINDS: Record<'customers' | 'machine-families' | 'machines', Kind> = {
  customers: {
    path: '/api/v1/customers',
    table: 'customers',
    writers: ['owner', 'manager', 'technician'],
    body: async () => customerBody(`c${++counter}`),
    change: (n) => ({ notes: `Call ahead, visit ${n}.` }),
    changed: { field: 'notes', value: (n) => `Call ahead, visit ${n}.` },
  },
  'machine-families': {
    path: '/api/v1/machine-families',
    table: 'machine_families',
    writers: ['owner', 'manager'],
    body: async () => familyBody(`f${++counter}`),
    change: (n) => ({ nominalSpeedRpm: 2000 + n }),
    changed: { field: 'nominalSpeedRpm', value: (n) => 2000 + n },
  },
  machines: {
    path: '/api/v1/machines',
    table: 'machines',
    writers: ['owner', 'manager', 'technician'],
    body: async (scope) => machineBody((await createCustomer(scope)).id, { serialNumber: `SN-${++counter}` }),
    change: (n) => ({ hours: 1000 + n }),
    changed: { field: 'hours', value: (n) => 1000 + n },
  },
};
const KIND_NAMES = Object.keys(KINDS) as (keyof typeof KINDS)[];

/** A new record of the kind, created by the organisation's owner. */
async function create(kind: Kind, scope: Scope = 'own'): Promise<Stored> {
  const response = await as(test.app, tokenOf(scope)).post(kind.path, await kind.body(scope));
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return response.body as Stored;
}

/** A new record of the kind, archived by the owner. */
async function createArchived(kind: Kind, scope: Scope = 'own'): Promise<Stored> {
  const record = await create(kind, scope);
  const response = await as(test.app, tokenOf(scope)).change(
    `${kind.path}/${record.id}/archive`,
    `"${record.version}"`,
  );
  expect(response.status).toBe(200);
  return response.body as Stored;
}

/** The record as stored, read by the own organisation's owner. */
async function stored(kind: Kind, id: number): Promise<Stored> {
  return (await as(test.app, test.tokens.owner).get(`${kind.path}/${id}`).expect(200)).body as Stored;
}

type RouteName = 'list' | 'create' | 'get' | 'change' | 'archive' | 'restore' | 'history';

/** Sends one route of a kind as a role, on a record of `scope` made for the occasion. */
async function send(kind: Kind, route: RouteName, token: string | undefined, scope: Scope = 'own') {
  const client = as(test.app, token ?? '');
  const strip = <T extends { unset(field: string): T }>(r: T) =>
    token === undefined ? r.unset('Authorization') : r;
  switch (route) {
    case 'list':
      return strip(client.get(kind.path));
    case 'create':
      return strip(client.post(kind.path, await kind.body('own')));
    case 'get':
      return strip(client.get(`${kind.path}/${(await create(kind, scope)).id}`));
    case 'history':
      return strip(client.get(`${kind.path}/${(await create(kind, scope)).id}/history`));
    case 'change': {
      const record = await create(kind, scope);
      return strip(client.patch(`${kind.path}/${record.id}`, kind.change(++counter), `"${record.version}"`));
    }
    case 'archive': {
      const record = await create(kind, scope);
      return strip(client.change(`${kind.path}/${record.id}/archive`, `"${record.version}"`));
    }
    case 'restore': {
      const record = await createArchived(kind, scope);
      return strip(client.change(`${kind.path}/${record.id}/restore`, `"${record.version}"`));
    }
  }
}

const OK: Record<RouteName, number> = {
  list: 200,
  create: 201,
  get: 200,
  change: 200,
  archive: 200,
  restore: 200,
  history: 200,
};
const READERS: readonly Role[] = ['owner', 'manager', 'technician', 'viewer'];
const ARCHIVERS: readonly Role[] = ['owner', 'manager'];

function allowed(kind: Kind, route: RouteName): readonly Role[] {
  if (route === 'create' || route === 'change') return kind.writers;
  if (route === 'archive' || route === 'restore') return ARCHIVERS;
  return READERS;
}

const ROUTES = Object.keys(OK) as RouteName[];
const ROLE_CASES = KIND_NAMES.flatMap((kind) =>
  ROUTES.flatMap((route) =>
    ROLES.map(
      (role) => [kind, route, role, allowed(KINDS[kind], route).includes(role) ? OK[route] : 403] as const,
    ),
  ),
);

describe('who may call each route', () => {
  it.each(ROLE_CASES)('%s %s as %s answers %i', async (kindName, route, role, status) => {
    const kind = KINDS[kindName];
    const before = rowCount(test, 'record_changes');
    const response = await send(kind, route, test.tokens[role]);
    expect(response.status, JSON.stringify(response.body)).toBe(status);
    if (status === 403) {
      expect(response.headers['content-type']).toContain('application/problem+json');
      // The records made for the case are logged; the refused request adds nothing.
      const made = route === 'list' || route === 'create' ? 0 : route === 'restore' ? 2 : 1;
      const customers = kindName === 'machines' && route !== 'list' ? 1 : 0;
      expect(rowCount(test, 'record_changes')).toBe(before + made + customers);
    }
  });

  it.each(KIND_NAMES.flatMap((kind) => ROUTES.map((route) => [kind, route] as const)))(
    '%s %s without a token answers 401',
    async (kindName, route) => {
      const response = await send(KINDS[kindName], route, undefined);
      expect(response.status).toBe(401);
      expect(response.headers['www-authenticate']).toMatch(/^Bearer/);
    },
  );
});

describe('another organisation’s records', () => {
  const NAMED: RouteName[] = ['get', 'change', 'archive', 'restore', 'history'];
  it.each(KIND_NAMES.flatMap((kind) => NAMED.map((route) => [kind, route] as const)))(
    '%s %s of another organisation answers 404 and changes nothing',
    async (kindName, route) => {
      const kind = KINDS[kindName];
      const response = await send(kind, route, test.tokens.owner, 'other');
      expect(response.status).toBe(404);
      expect(response.headers['content-type']).toContain('application/problem+json');
      expect(JSON.stringify(response.body)).not.toContain('Birch');
    },
  );

  it.each(KIND_NAMES)('%s are never listed to another organisation', async (kindName) => {
    const kind = KINDS[kindName];
    const theirs = await create(kind, 'other');
    const theirArchived = await createArchived(kind, 'other');
    const ours = await create(kind, 'own');
    const listed = await as(test.app, test.tokens.owner)
      .get(`${kind.path}?archived=all&pageSize=100`)
      .expect(200);
    const ids = (listed.body.items as Stored[]).map((item) => item.id);
    expect(ids).toContain(ours.id);
    expect(ids).not.toContain(theirs.id);
    expect(ids).not.toContain(theirArchived.id);
    const all = Number(
      (
        test.temporary.database.sqlite
          .prepare(`SELECT count(*) AS count FROM ${kind.table} WHERE organisation_id = ?`)
          .get(test.own.id) as { count: number }
      ).count,
    );
    expect(listed.body.total).toBe(all);
  });
});

describe('versions', () => {
  it.each(KIND_NAMES)('%s answers with the ETag of its version, and Location on create', async (kindName) => {
    const kind = KINDS[kindName];
    const response = await as(test.app, test.tokens.owner)
      .post(kind.path, await kind.body('own'))
      .expect(201);
    expect(response.body.version).toBe(1);
    expect(response.headers['etag']).toBe('"1"');
    expect(response.headers['location']).toBe(`${kind.path}/${response.body.id}`);
    const read = await as(test.app, test.tokens.viewer).get(response.headers['location']!).expect(200);
    expect(read.headers['etag']).toBe('"1"');
    expect(read.body).toEqual(response.body);
  });

  it.each(KIND_NAMES)('%s: a change, an archive and a restore each make a new version', async (kindName) => {
    const kind = KINDS[kindName];
    const owner = as(test.app, test.tokens.owner);
    const record = await create(kind);
    const changed = await owner.patch(`${kind.path}/${record.id}`, kind.change(1), '"1"').expect(200);
    expect(changed.headers['etag']).toBe('"2"');
    expect(changed.body[kind.changed.field]).toEqual(kind.changed.value(1));
    const archived = await owner.change(`${kind.path}/${record.id}/archive`, '"2"').expect(200);
    expect(archived.headers['etag']).toBe('"3"');
    expect(archived.body.archivedAt).not.toBeNull();
    const restored = await owner.change(`${kind.path}/${record.id}/restore`, '"3"').expect(200);
    expect(restored.body).toMatchObject({ version: 4, archivedAt: null });
  });

  it.each(KIND_NAMES)(
    '%s: a change that changes nothing keeps the version and logs nothing',
    async (kindName) => {
      const kind = KINDS[kindName];
      const owner = as(test.app, test.tokens.owner);
      const record = await create(kind);
      await owner.patch(`${kind.path}/${record.id}`, kind.change(7), '"1"').expect(200);
      const before = rowCount(test, 'record_changes');
      const again = await owner.patch(`${kind.path}/${record.id}`, kind.change(7), '"2"').expect(200);
      expect(again.body.version).toBe(2);
      expect(rowCount(test, 'record_changes')).toBe(before);
    },
  );

  const CHANGES = ['patch', 'archive', 'restore'] as const;
  const changeOf = async (kind: Kind, change: (typeof CHANGES)[number], ifMatch?: string) => {
    const record = change === 'restore' ? await createArchived(kind) : await create(kind);
    const owner = as(test.app, test.tokens.owner);
    const response =
      change === 'patch'
        ? await owner.patch(`${kind.path}/${record.id}`, kind.change(++counter), ifMatch)
        : await owner.change(`${kind.path}/${record.id}/${change}`, ifMatch);
    return { record, response };
  };
  const VERSION_CASES = KIND_NAMES.flatMap((kind) => CHANGES.map((change) => [kind, change] as const));

  it.each(VERSION_CASES)(
    '%s %s without If-Match answers 428 and changes nothing',
    async (kindName, change) => {
      const kind = KINDS[kindName];
      for (const ifMatch of [undefined, '*', ' ']) {
        const { record, response } = await changeOf(kind, change, ifMatch);
        expect(response.status).toBe(428);
        expect(response.headers['content-type']).toContain('application/problem+json');
        expect(response.body.code).toBe(RECORDS_PROBLEM_CODES.versionRequired);
        expect(await stored(kind, record.id)).toEqual(record);
      }
    },
  );

  it.each(VERSION_CASES)(
    '%s %s with a malformed If-Match answers 400 naming it',
    async (kindName, change) => {
      const kind = KINDS[kindName];
      for (const ifMatch of ['1', '"1', 'W/1', '"1" "2"']) {
        const { record, response } = await changeOf(kind, change, ifMatch);
        expect(response.status, ifMatch).toBe(400);
        expect(response.body.errors).toEqual([{ path: 'If-Match', message: expect.any(String) }]);
        expect(await stored(kind, record.id)).toEqual(record);
      }
    },
  );

  it.each(VERSION_CASES)(
    '%s %s on another version answers 412 with the stored record',
    async (kindName, change) => {
      const kind = KINDS[kindName];
      for (const ifMatch of ['"7"', 'W/"1"', '"abc"']) {
        const { record, response } = await changeOf(kind, change, ifMatch);
        expect(response.status, ifMatch).toBe(412);
        expect(response.headers['content-type']).toContain('application/problem+json');
        expect(response.body.code).toBe(RECORDS_PROBLEM_CODES.changedMeanwhile);
        expect(response.body.current).toEqual(record);
        expect(response.headers['etag']).toBe(`"${record.version}"`);
        expect(await stored(kind, record.id)).toEqual(record);
      }
    },
  );

  it.each(KIND_NAMES)(
    '%s: a list of ETags that names the stored version lets the change through',
    async (kindName) => {
      const kind = KINDS[kindName];
      const record = await create(kind);
      await as(test.app, test.tokens.owner)
        .patch(`${kind.path}/${record.id}`, kind.change(3), '"5", "1"')
        .expect(200);
    },
  );

  it.each(KIND_NAMES)('%s: of 20 parallel changes on one version exactly one wins', async (kindName) => {
    const kind = KINDS[kindName];
    const record = await create(kind);
    const owner = as(test.app, test.tokens.owner);
    const before = rowCount(test, 'record_changes');
    const responses = await Promise.all(
      Array.from({ length: 20 }, (_, n) =>
        owner.patch(`${kind.path}/${record.id}`, kind.change(100 + n), '"1"'),
      ),
    );
    const statuses = responses.map((response) => response.status).sort();
    expect(statuses).toEqual([200, ...Array<number>(19).fill(412)]);
    const winner = responses.findIndex((response) => response.status === 200);
    const now = await stored(kind, record.id);
    expect(now.version).toBe(2);
    expect(now[kind.changed.field]).toEqual(kind.changed.value(100 + winner));
    expect(now).toEqual(responses[winner]!.body);
    for (const loser of responses.filter((response) => response.status === 412)) {
      expect(loser.body.current).toEqual(now);
    }
    expect(rowCount(test, 'record_changes')).toBe(before + 1);
  });
});

describe('bad ids and queries', () => {
  const BAD_IDS = ['0', '-1', '1e3', 'abc', '1.5', '99999999999999999999', '%20'];
  it.each(KIND_NAMES.flatMap((kind) => BAD_IDS.map((id) => [kind, id] as const)))(
    '%s/%s answers 400 naming the id',
    async (kindName, id) => {
      const kind = KINDS[kindName];
      const owner = as(test.app, test.tokens.owner);
      for (const response of [
        await owner.get(`${kind.path}/${id}`),
        await owner.get(`${kind.path}/${id}/history`),
        await owner.patch(`${kind.path}/${id}`, kind.change(1), '"1"'),
        await owner.change(`${kind.path}/${id}/archive`, '"1"'),
      ]) {
        expect(response.status).toBe(400);
        expect(response.headers['content-type']).toContain('application/problem+json');
        expect(response.body.errors[0].path).toBe('id');
      }
    },
  );

  it.each(KIND_NAMES)('%s: an id that names nothing answers 404', async (kindName) => {
    await as(test.app, test.tokens.owner).get(`${KINDS[kindName].path}/987654`).expect(404);
  });

  const BAD_QUERIES: [string, string][] = [
    ['page=0', 'page'],
    ['page=-1', 'page'],
    ['page=1e3', 'page'],
    ['page=abc', 'page'],
    ['page=100001', 'page'],
    ['pageSize=0', 'pageSize'],
    ['pageSize=101', 'pageSize'],
    ['pageSize=2.5', 'pageSize'],
    ['page=1&page=2', 'page'],
    ['sort=password', 'sort'],
    ['order=sideways', 'order'],
    ['archived=maybe', 'archived'],
    [`q=${'x'.repeat(101)}`, 'q'],
    ['q=a%07b', 'q'],
    ['q=a%E2%80%AEb', 'q'],
  ];
  it.each(KIND_NAMES.flatMap((kind) => BAD_QUERIES.map(([query, path]) => [kind, query, path] as const)))(
    '%s?%s answers 400 naming %s',
    async (kindName, query, path) => {
      const response = await as(test.app, test.tokens.owner).get(`${KINDS[kindName].path}?${query}`);
      expect(response.status).toBe(400);
      expect(response.body.errors.map((error: { path: string }) => error.path)).toContain(path);
    },
  );

  it.each([
    ['customerId=0', 'customerId'],
    ['customerId=1e3', 'customerId'],
    ['customerId=abc', 'customerId'],
    ['familyId=-1', 'familyId'],
    ['familyId=', 'familyId'],
  ])('machines?%s answers 400 naming %s', async (query, path) => {
    const response = await as(test.app, test.tokens.owner).get(`/api/v1/machines?${query}`);
    expect(response.status).toBe(400);
    expect(response.body.errors[0].path).toBe(path);
  });
});

/** Bodies each kind must refuse, with the field the answer must name. */
const HOSTILE: Record<keyof typeof KINDS, [string, unknown, string][]> = {
  customers: [
    ['a number for a name', { name: 42 }, 'name'],
    ['an empty name', { name: '   ' }, 'name'],
    ['a huge name', { name: 'x'.repeat(10_000) }, 'name'],
    ['huge notes', { name: 'A', notes: 'x'.repeat(4001) }, 'notes'],
    ['an unknown field', { name: 'A', colour: 'red' }, 'colour'],
    ['a bell in the name', { name: 'Acme\u0007' }, 'name'],
    ['a right-to-left override in the name', { name: 'Acme\u202Eexe' }, 'name'],
    ['a NUL in the notes', { name: 'A', notes: 'line\u0000' }, 'notes'],
    ['a bad e-mail', { name: 'A', email: 'not-an-address' }, 'email'],
    ['letters in the phone', { name: 'A', phone: 'call me' }, 'phone'],
    ['a contact without a name', { name: 'A', contacts: [{ role: 'Foreman' }] }, 'contacts[0].name'],
    ['an unknown contact field', { name: 'A', contacts: [{ name: 'B', age: 3 }] }, 'contacts[0].age'],
    ['21 contacts', { name: 'A', contacts: Array.from({ length: 21 }, () => ({ name: 'B' })) }, 'contacts'],
    ['an array', [{ name: 'A' }], ''],
    ['a prototype key', JSON.parse('{"name":"A","__proto__":{"polluted":true}}'), '__proto__'],
  ],
  'machine-families': [
    ['three planes', { ...familyBody('h'), planeCount: 3 }, 'planeCount'],
    ['one radius for two planes', { ...familyBody('h'), correctionRadiiMm: [210] }, 'correctionRadiiMm'],
    ['a negative speed', { ...familyBody('h'), nominalSpeedRpm: -5 }, 'nominalSpeedRpm'],
    ['a speed as text', { ...familyBody('h'), nominalSpeedRpm: '2200' }, 'nominalSpeedRpm'],
    ['an unknown rotor type', { ...familyBody('h'), rotorType: 'turbine' }, 'rotorType'],
    ['an unknown acceptance', { ...familyBody('h'), acceptance: { kind: 'vibes' } }, 'acceptance.kind'],
    [
      'an acceptance with an extra field',
      { ...familyBody('h'), acceptance: { kind: 'balance-grade', grade: 'G16', extra: 1 } },
      'acceptance.extra',
    ],
    [
      'two figures for one sensor and plane',
      {
        ...familyBody('h'),
        sensitivities: [
          { sensorSide: 'left', planeIndex: 0, gramsPerUnit: 1, unit: 'in/s-pk', phaseLagDeg: 1 },
          { sensorSide: 'left', planeIndex: 0, gramsPerUnit: 2, unit: 'in/s-pk', phaseLagDeg: 2 },
        ],
      },
      'sensitivities[1]',
    ],
    [
      'a phase lag of 360°',
      {
        ...familyBody('h'),
        sensitivities: [
          { sensorSide: 'left', planeIndex: 0, gramsPerUnit: 1, unit: 'in/s-pk', phaseLagDeg: 360 },
        ],
      },
      'sensitivities[0].phaseLagDeg',
    ],
    ['a huge name', { ...familyBody('h'), name: 'x'.repeat(121) }, 'name'],
    ['a tab in the name', { ...familyBody('h'), name: 'Drum\tA' }, 'name'],
  ],
  machines: [
    ['no planes', { planes: [] }, 'planes'],
    [
      'three planes',
      { planes: [{ correctionRadiusMm: 1 }, { correctionRadiusMm: 1 }, { correctionRadiusMm: 1 }] },
      'planes',
    ],
    [
      'one position',
      { planes: [{ correctionRadiusMm: 210, positions: { count: 1, firstDeg: 0 } }] },
      'planes[0].positions.count',
    ],
    [
      'a sector past 360°',
      { planes: [{ correctionRadiusMm: 210, blockedSectors: [{ fromDeg: 360, toDeg: 10, label: 'Bolt' }] }] },
      'planes[0].blockedSectors[0].fromDeg',
    ],
    ['negative hours', { hours: -1 }, 'hours'],
    ['hours as text', { hours: '1460' }, 'hours'],
    ['a customer id as text', { customerId: '1' }, 'customerId'],
    ['a customer id of 0', { customerId: 0 }, 'customerId'],
    ['the same side twice', { sensorSides: ['left', 'left'] }, 'sensorSides'],
    ['an unknown rotation', { rotationSeenFromLeft: 'both' }, 'rotationSeenFromLeft'],
    ['a huge serial number', { serialNumber: 'S'.repeat(61) }, 'serialNumber'],
    ['an escape in the serial number', { serialNumber: 'SN\u001b[31m' }, 'serialNumber'],
    ['a stock weight of 0 g', { stockWeightsGrams: [0] }, 'stockWeightsGrams[0]'],
    ['an unknown field', { colour: 'red' }, 'colour'],
  ],
};

describe('hostile input', () => {
  const TABLES = ['customers', 'machine_families', 'machines', 'record_changes'];
  const counts = () => TABLES.map((table) => rowCount(test, table));

  it.each(
    KIND_NAMES.flatMap((kind) =>
      HOSTILE[kind].map(([what, body, path]) => [kind, what, path, body] as const),
    ),
  )('%s refuses %s, naming %s, and stores nothing', async (kindName, _what, path, body) => {
    const kind = KINDS[kindName];
    const base = kindName === 'customers' ? {} : await kind.body('own');
    const record = await create(kind);
    const sent = Array.isArray(body) ? body : { ...base, ...(body as object) };
    const before = counts();
    const created = await as(test.app, test.tokens.owner).post(kind.path, sent);
    expect(created.status, JSON.stringify(created.body)).toBe(400);
    expect(created.headers['content-type']).toContain('application/problem+json');
    expect(created.body.errors.map((error: { path: string }) => error.path)).toContain(path);
    if (!Array.isArray(body)) {
      const changed = await as(test.app, test.tokens.owner).patch(`${kind.path}/${record.id}`, body, '"1"');
      expect(changed.status, JSON.stringify(changed.body)).toBe(400);
      expect(changed.body.errors.map((error: { path: string }) => error.path)).toContain(path);
    }
    expect(counts()).toEqual(before);
    expect(await stored(kind, record.id)).toEqual(record);
    expect(({} as Record<string, unknown>)['polluted']).toBeUndefined();
  });

  it.each(KIND_NAMES)('%s refuses a body that is not JSON, too large, or empty', async (kindName) => {
    const kind = KINDS[kindName];
    const record = await create(kind);
    const before = counts();
    const owner = as(test.app, test.tokens.owner);
    const notJson = await owner.post(kind.path).set('Content-Type', 'application/json').send('{"name": ');
    expect(notJson.status).toBe(400);
    const notJsonType = await owner.post(kind.path).set('Content-Type', 'text/plain').send('name=A');
    expect(notJsonType.status).toBe(415);
    const huge = await owner.post(kind.path, { name: 'A', notes: 'x'.repeat(70_000) });
    expect(huge.status).toBe(413);
    const empty = await owner.patch(`${kind.path}/${record.id}`, {}, '"1"');
    expect(empty.status).toBe(400);
    expect(counts()).toEqual(before);
  });
});

describe('the history', () => {
  it.each(KIND_NAMES)('%s lists who changed what and when, newest first', async (kindName) => {
    const kind = KINDS[kindName];
    const writer = kind.writers.includes('technician') ? 'technician' : 'manager';
    const created = await as(test.app, test.tokens.manager)
      .post(kind.path, await kind.body('own'))
      .expect(201);
    const path = `${kind.path}/${created.body.id}`;
    await as(test.app, test.tokens[writer]).patch(path, kind.change(42), '"1"').expect(200);
    const archived = await as(test.app, test.tokens.owner).change(`${path}/archive`, '"2"').expect(200);

    const history = await as(test.app, test.tokens.viewer).get(`${path}/history`).expect(200);
    const changes = history.body.changes as {
      version: number;
      action: string;
      at: string;
      by: { id: number; name: string };
      fields: { field: string; before: unknown; after: unknown }[];
    }[];
    expect(changes.map((change) => [change.version, change.action, change.by.id])).toEqual([
      [3, 'archived', test.own.people.owner.id],
      [2, 'updated', test.own.people[writer].id],
      [1, 'created', test.own.people.manager.id],
    ]);
    expect(changes[0]!.by.name).toBe(test.own.people.owner.name);
    expect(changes[0]!.at).toBe(archived.body.archivedAt);
    expect(changes[0]!.fields).toEqual([
      { field: 'archivedAt', before: null, after: archived.body.archivedAt },
    ]);
    expect(changes[1]!.fields).toEqual([
      { field: kind.changed.field, before: created.body[kind.changed.field], after: kind.changed.value(42) },
    ]);
    expect(changes[2]!.fields.length).toBeGreaterThan(1);
    for (const field of changes[2]!.fields) {
      expect(field.before).toBeNull();
      expect(field.after).toEqual(created.body[field.field]);
    }
    expect(Date.parse(changes[2]!.at)).toBeLessThanOrEqual(Date.parse(changes[0]!.at));
  });
});
