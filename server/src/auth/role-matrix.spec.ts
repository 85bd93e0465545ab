/*
 * The role matrix: every route for signed-in people, for every role, on its own organisation's data and
 * on another's. The expected statuses are the table of DEVELOPERS.md ("Roles"); a route of another
 * organisation's row answers 404 to a role that may use the route, so that nothing tells it exists.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '@counterpoise/api';
import { ApiKeysRepo } from '../keys/keys.repo';
import { ApiKeyService } from '../keys/keys.service';
import {
  type AccountsTestApp,
  createTestOrganisation,
  signIn,
  startAccountsTestApp,
  type TestOrganisation,
} from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';

let temporary: TemporaryDatabase;
let test: AccountsTestApp;
let own: TestOrganisation;
let other: TestOrganisation;
const tokens = {} as Record<Role, string>;
let counter = 0;

beforeAll(async () => {
  temporary = openTemporaryDatabase();
  own = createTestOrganisation(temporary.database, 'Alder Fan Works');
  other = createTestOrganisation(temporary.database, 'Birch Mulcher Repair');
  test = await startAccountsTestApp(temporary.database);
  for (const role of ROLES) tokens[role] = (await signIn(test.app, own.people[role].email)).accessToken;
});
afterAll(async () => {
  await test.close();
  temporary.dispose();
});

/** A fresh key of an organisation, to revoke. */
function keyOf(organisation: TestOrganisation): number {
  const keys = new ApiKeyService(new ApiKeysRepo(temporary.database.orm));
  return keys.create({ name: `Key ${++counter}`, limitPerMinute: 100 }, new Date(), organisation.id).record
    .id;
}

type Scope = 'own' | 'other';
interface Route {
  readonly name: string;
  /** Sends the request with the token (none when undefined) against an organisation's data. */
  send(token: string | undefined, scope: Scope): request.Test;
  /** The roles allowed; every other role gets 403. */
  readonly allowed: readonly Role[] | 'all';
  /** The status of an allowed role on its own organisation's data. */
  readonly ok: number;
  /** Whether the route names a row (so that another organisation's row is a 404). */
  readonly namesRow: boolean;
}

const auth = (r: request.Test, token: string | undefined) =>
  token ? r.set('Authorization', `Bearer ${token}`) : r;
const target = (scope: Scope) => (scope === 'own' ? own : other);

const ROUTES: Route[] = [
  {
    name: 'GET /api/v1/me',
    send: (t) => auth(request(test.app).get('/api/v1/me'), t),
    allowed: 'all',
    ok: 200,
    namesRow: false,
  },
  {
    name: 'GET /api/v1/people',
    send: (t) => auth(request(test.app).get('/api/v1/people'), t),
    allowed: ['owner', 'manager'],
    ok: 200,
    namesRow: false,
  },
  {
    name: 'POST /api/v1/people/invitations',
    send: (t) =>
      auth(request(test.app).post('/api/v1/people/invitations'), t).send({
        email: `invitee-${++counter}@alder-fan-works.test`,
        role: 'viewer',
      }),
    allowed: ['owner', 'manager'],
    ok: 201,
    namesRow: false,
  },
  {
    name: 'PATCH /api/v1/people/{id}',
    send: (t, scope) =>
      auth(request(test.app).patch(`/api/v1/people/${target(scope).people.viewer.id}`), t).send({
        status: 'active',
      }),
    allowed: ['owner', 'manager'],
    ok: 200,
    namesRow: true,
  },
  {
    name: 'GET /api/v1/outbox',
    send: (t) => auth(request(test.app).get('/api/v1/outbox'), t),
    allowed: ['owner'],
    ok: 200,
    namesRow: false,
  },
  {
    name: 'GET /api/v1/keys',
    send: (t) => auth(request(test.app).get('/api/v1/keys'), t),
    allowed: ['owner', 'developer'],
    ok: 200,
    namesRow: false,
  },
  {
    name: 'POST /api/v1/keys',
    send: (t) => auth(request(test.app).post('/api/v1/keys'), t).send({ name: `Portal ${++counter}` }),
    allowed: ['owner', 'developer'],
    ok: 201,
    namesRow: false,
  },
  {
    name: 'DELETE /api/v1/keys/{id}',
    send: (t, scope) => auth(request(test.app).delete(`/api/v1/keys/${keyOf(target(scope))}`), t),
    allowed: ['owner', 'developer'],
    ok: 204,
    namesRow: true,
  },
  {
    name: 'GET /api/v1/usage',
    send: (t) => auth(request(test.app).get('/api/v1/usage'), t),
    allowed: ['owner', 'developer'],
    ok: 200,
    namesRow: false,
  },
  {
    name: 'POST /api/v1/calc/radius',
    send: (t) =>
      auth(request(test.app).post('/api/v1/calc/radius'), t).send({
        mass: 120,
        fromRadius: 180,
        toRadius: 240,
      }),
    allowed: 'all',
    ok: 200,
    namesRow: false,
  },
];

/** The status a role should get on a route, for its own or another organisation's row. */
function expected(route: Route, role: Role, scope: Scope): number {
  const allowed = route.allowed === 'all' || route.allowed.includes(role);
  if (!allowed) return 403;
  return scope === 'other' && route.namesRow ? 404 : route.ok;
}

const CASES = ROUTES.flatMap((route) =>
  ROLES.flatMap((role) =>
    (route.namesRow ? (['own', 'other'] as const) : (['own'] as const)).map(
      (scope) => [route.name, role, scope, expected(route, role, scope)] as const,
    ),
  ),
);

describe('the role matrix', () => {
  it.each(CASES)('%s as %s on the %s organisation answers %i', async (name, role, scope, status) => {
    const route = ROUTES.find((candidate) => candidate.name === name)!;
    const response = await route.send(tokens[role], scope);
    expect(response.status, JSON.stringify(response.body)).toBe(status);
    if (status >= 400) expect(response.headers['content-type']).toContain('application/problem+json');
  });

  it.each(ROUTES.map((route) => [route.name]))('%s without a token answers 401', async (name) => {
    const route = ROUTES.find((candidate) => candidate.name === name)!;
    const response = await route.send(undefined, 'own');
    expect(response.status).toBe(401);
    expect(response.headers['www-authenticate']).toMatch(/^Bearer/);
  });
});

describe('what one organisation sees of another', () => {
  it('lists only its own people, invitations, keys and mail', async () => {
    const owner = tokens.owner;
    const people = await request(test.app)
      .get('/api/v1/people')
      .set('Authorization', `Bearer ${owner}`)
      .expect(200);
    const emails = (people.body.people as { email: string }[]).map((person) => person.email);
    expect(emails.sort()).toEqual(
      Object.values(own.people)
        .map((person) => person.email)
        .sort(),
    );

    keyOf(other);
    const keys = await request(test.app)
      .get('/api/v1/keys')
      .set('Authorization', `Bearer ${owner}`)
      .expect(200);
    const ownKeyIds = new ApiKeyService(new ApiKeysRepo(temporary.database.orm))
      .listForOrganisation(own.id)
      .map((key) => key.id);
    expect((keys.body.keys as { id: number }[]).map((key) => key.id)).toEqual(ownKeyIds);

    const otherOwner = (await signIn(test.app, other.people.owner.email)).accessToken;
    await request(test.app)
      .post('/api/v1/people/invitations')
      .set('Authorization', `Bearer ${otherOwner}`)
      .send({ email: 'secret-hire@birch-mulcher-repair.test', role: 'technician' })
      .expect(201);
    const outbox = await request(test.app)
      .get('/api/v1/outbox')
      .set('Authorization', `Bearer ${owner}`)
      .expect(200);
    const recipients = (outbox.body.messages as { to: string[] }[]).flatMap((message) => message.to);
    expect(recipients).not.toContain('secret-hire@birch-mulcher-repair.test');
    const theirs = await request(test.app).get('/api/v1/outbox').set('Authorization', `Bearer ${otherOwner}`);
    expect((theirs.body.messages as { to: string[] }[])[0]?.to).toEqual([
      'secret-hire@birch-mulcher-repair.test',
    ]);
  });
});
