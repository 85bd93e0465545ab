import { randomBytes } from 'node:crypto';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { InvitationPreviewSchema, PeopleSchema, ProblemSchema, SessionSchema } from '@counterpoise/api';
import type { Clock } from '../clock';
import {
  type AccountsTestApp,
  createTestOrganisation,
  linkTokenIn,
  signIn,
  startAccountsTestApp,
  type TestOrganisation,
} from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { AccountsRepo } from '../accounts/accounts.repo';
import { AuthService } from '../auth/auth.service';
import { HttpProblem } from '../http/problem';
import { INVITATION_TTL_MS, PeopleService } from './people.service';

let temporary: TemporaryDatabase;
let test: AccountsTestApp;
let shop: TestOrganisation;
let now: Date;
const clock: Clock = { now: () => now };
const tokens: Record<string, string> = {};

beforeEach(async () => {
  now = new Date('2026-05-04T08:00:00Z');
  temporary = openTemporaryDatabase();
  shop = createTestOrganisation(temporary.database, 'Hazel Flail Service', now);
  test = await startAccountsTestApp(temporary.database, { clock });
  for (const role of ['owner', 'manager'] as const) {
    tokens[role] = (await signIn(test.app, shop.people[role].email)).accessToken;
  }
});
afterEach(async () => {
  await test.close();
  temporary.dispose();
});

const invite = (as: string, body: object) =>
  request(test.app)
    .post('/api/v1/people/invitations')
    .set('Authorization', `Bearer ${tokens[as]}`)
    .send(body);
const patch = (as: string, id: number, body: object) =>
  request(test.app).patch(`/api/v1/people/${id}`).set('Authorization', `Bearer ${tokens[as]}`).send(body);
const problemOf = (response: request.Response, status: number) => {
  expect(response.status, JSON.stringify(response.body)).toBe(status);
  return ProblemSchema.parse(response.body);
};

describe('invitations', () => {
  const email = 'new.hand@hazel-flail.test';

  it('go out by e-mail with a single-use link that signs the new person in with the role', async () => {
    const invited = await invite('owner', {
      email: 'New.Hand@hazel-flail.test',
      role: 'developer',
      name: 'Rowan Ashby',
    });
    expect(invited.status).toBe(201);
    expect(invited.body).toMatchObject({
      email,
      role: 'developer',
      invitedBy: shop.people.owner.name,
      acceptedAt: null,
    });

    const [message] = test.mail.listTo(email);
    expect(message?.subject).toBe(
      `${shop.people.owner.name} invites you to Hazel Flail Service on Counterpoise`,
    );
    expect(message?.text).toMatch(/^Hello Rowan Ashby,/);
    const token = linkTokenIn(test.mail, email, 'http://workbench.test:4300/accept-invitation');

    const preview = InvitationPreviewSchema.parse(
      (await request(test.app).get(`/api/v1/invitations/${token}`).expect(200)).body,
    );
    expect(preview).toEqual({
      email,
      role: 'developer',
      organisationName: 'Hazel Flail Service',
      expiresAt: new Date(now.getTime() + INVITATION_TTL_MS).toISOString(),
    });

    const weak = await request(test.app)
      .post(`/api/v1/invitations/${token}/accept`)
      .send({ name: 'Rowan Ashby', password: 'qwertyuiopasdfghjkl' });
    expect(problemOf(weak, 400).errors?.[0]?.path).toBe('password');

    const accepted = await request(test.app)
      .post(`/api/v1/invitations/${token}/accept`)
      .send({ name: 'Rowan Ashby', password: 'the mill wheel turns at dusk' })
      .expect(201);
    const session = SessionSchema.parse(accepted.body);
    expect(session.user).toMatchObject({ email, role: 'developer', organisation: { id: shop.id } });
    expect(String(accepted.headers['set-cookie'])).toContain('cp_refresh=');
    await signIn(test.app, email, 'the mill wheel turns at dusk');

    expect(problemOf(await request(test.app).get(`/api/v1/invitations/${token}`), 410).detail).toMatch(
      /already accepted/,
    );
    await request(test.app)
      .post(`/api/v1/invitations/${token}/accept`)
      .send({ name: 'Someone else', password: 'the mill wheel turns at dusk' })
      .expect(410);
    await request(test.app).get('/api/v1/invitations/not-a-token').expect(404);
  });

  it('expire after seven days, and a newer one replaces the older', async () => {
    await invite('manager', { email, role: 'technician' }).expect(201);
    const first = linkTokenIn(test.mail, email, '/accept-invitation');
    await invite('manager', { email, role: 'viewer' }).expect(201);
    const second = linkTokenIn(test.mail, email, '/accept-invitation');
    expect(problemOf(await request(test.app).get(`/api/v1/invitations/${first}`), 410).detail).toMatch(
      /replaced/,
    );
    const people = PeopleSchema.parse(
      (await request(test.app).get('/api/v1/people').set('Authorization', `Bearer ${tokens['manager']}`))
        .body,
    );
    expect(people.invitations.map((invitation) => invitation.role)).toEqual(['viewer']);

    now = new Date(now.getTime() + INVITATION_TTL_MS);
    expect(problemOf(await request(test.app).get(`/api/v1/invitations/${second}`), 410).detail).toMatch(
      /expired/,
    );
  });

  it('by a manager are for technicians and viewers only; nobody invites an existing account', async () => {
    const refused = problemOf(await invite('manager', { email, role: 'owner' }), 403);
    expect(refused.errors?.[0]?.path).toBe('role');
    const taken = problemOf(await invite('owner', { email: shop.people.viewer.email, role: 'viewer' }), 409);
    expect(taken.errors?.[0]?.path).toBe('email');
    const bad = problemOf(await invite('owner', { email: 'not an address', role: 'chief' }), 400);
    expect(bad.errors?.map((error) => error.path).sort()).toEqual(['email', 'role']);
    expect(test.mail.listTo(email)).toEqual([]);
  });
});

describe('PATCH /api/v1/people/{id}', () => {
  it('lets an owner change roles and status, but not their own', async () => {
    const changed = await patch('owner', shop.people.manager.id, { role: 'technician' }).expect(200);
    expect(changed.body).toMatchObject({ id: shop.people.manager.id, role: 'technician' });
    const self = problemOf(await patch('owner', shop.people.owner.id, { role: 'viewer' }), 409);
    expect(self.errors?.[0]?.path).toBe('role');
  });

  it('lets a manager change the status of technicians and viewers only, and never a role', async () => {
    await patch('manager', shop.people.technician.id, { status: 'deactivated' }).expect(200);
    await patch('manager', shop.people.technician.id, { status: 'active' }).expect(200);
    expect(
      problemOf(await patch('manager', shop.people.viewer.id, { role: 'technician' }), 403).errors?.[0]?.path,
    ).toBe('role');
    expect(
      problemOf(await patch('manager', shop.people.developer.id, { status: 'deactivated' }), 403).errors?.[0]
        ?.path,
    ).toBe('status');
  });

  it('refuses an empty change, an unknown field and an id that is not a number, changing nothing', async () => {
    problemOf(await patch('owner', shop.people.viewer.id, {}), 400);
    expect(
      problemOf(await patch('owner', shop.people.viewer.id, { colour: 'red' }), 400).errors?.[0]?.path,
    ).toBe('colour');
    expect(problemOf(await patch('owner', 0, { status: 'active' }), 400).errors?.[0]?.path).toBe('id');
    await patch('owner', 999, { status: 'active' }).expect(404);
    const row = temporary.database.sqlite
      .prepare('SELECT role, status FROM users WHERE id = ?')
      .get(shop.people.viewer.id);
    expect(row).toEqual({ role: 'viewer', status: 'active' });
  });
});

describe('owners changing each other at the same moment', () => {
  const activeOwners = () =>
    temporary.database.sqlite
      .prepare(
        "SELECT count(*) FROM users WHERE role = 'owner' AND status = 'active' AND organisation_id = ?",
      )
      .pluck()
      .get(shop.id);

  it('never both succeed: a change is checked against the actor as they are when it is made', () => {
    const repo = new AccountsRepo(temporary.database.orm);
    repo.updateUser(shop.id, shop.people.manager.id, { role: 'owner' });
    const auth = new AuthService(
      repo,
      {
        signingKey: randomBytes(48),
        passwordCost: { log2N: 10 },
        secureCookie: false,
        publicUrl: 'http://x',
      },
      clock,
      { send: () => Promise.resolve() },
      () => undefined,
    );
    const service = new PeopleService(repo, auth, clock, { send: () => Promise.resolve() });
    for (const change of [{ role: 'technician' as const }, { status: 'deactivated' as const }]) {
      // Both access tokens were checked, and both people read as owners, before either change is made.
      const first = repo.findUserById(shop.people.owner.id)!;
      const second = repo.findUserById(shop.people.manager.id)!;
      service.update(first, second.id, change);
      let refused: unknown;
      try {
        service.update(second, first.id, change);
      } catch (error) {
        refused = error;
      }
      expect(refused).toBeInstanceOf(HttpProblem);
      expect(refused).toMatchObject({ status: 403, errors: [{ path: Object.keys(change)[0] }] });
      expect(activeOwners()).toBe(1);
      repo.updateUser(shop.id, shop.people.manager.id, { role: 'owner', status: 'active' });
    }
  });

  it('sent in parallel, leave the organisation one active owner', async () => {
    await patch('owner', shop.people.manager.id, { role: 'owner' }).expect(200);
    for (const change of [{ role: 'technician' }, { status: 'deactivated' }]) {
      tokens['owner'] = (await signIn(test.app, shop.people.owner.email)).accessToken;
      tokens['second'] = (await signIn(test.app, shop.people.manager.email)).accessToken;
      const answers = await Promise.all([
        patch('owner', shop.people.manager.id, change),
        patch('second', shop.people.owner.id, change),
      ]);
      // The other is refused: 403 for a demoted owner, 401 for a deactivated one (its token no longer
      // works), whichever step of the request meets the change first.
      const statuses = answers.map((answer) => answer.status).sort();
      expect(statuses[0]).toBe(200);
      expect(change.role ? [403] : [401, 403]).toContain(statuses[1]);
      expect(activeOwners()).toBe(1);
      temporary.database.sqlite
        .prepare("UPDATE users SET role = 'owner', status = 'active' WHERE id IN (?, ?)")
        .run(shop.people.owner.id, shop.people.manager.id);
    }
  });
});
