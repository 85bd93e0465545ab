import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ApiKeyListSchema, PeopleSchema, ProblemSchema } from '@counterpoise/api';
import {
  type AccountsTestApp,
  createTestOrganisation,
  linkTokenIn,
  signIn,
  startAccountsTestApp,
  type TestOrganisation,
} from '../testing/accounts';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';

/*
 * Names with characters that reorder or hide text, sent to the API as an attacker would (several at
 * once): each is refused 400 naming the field, and nothing is stored or sent.
 */

let temporary: TemporaryDatabase;
let test: AccountsTestApp;
let shop: TestOrganisation;
let owner: string;

beforeEach(async () => {
  temporary = openTemporaryDatabase();
  shop = createTestOrganisation(temporary.database, 'Juniper Drum Balancing');
  test = await startAccountsTestApp(temporary.database);
  owner = (await signIn(test.app, shop.people.owner.email)).accessToken;
});
afterEach(async () => {
  await test.close();
  temporary.dispose();
});

const HIDDEN = [
  'Portal\u202Etxt.exe',
  'Ada\u2067 Reyes',
  'Kit\u200BAmberley',
  'Rowan\u001B[2J',
  'Ines\u0085',
];

const refusedNaming = (response: request.Response, field: string) => {
  expect(response.status, JSON.stringify(response.body)).toBe(400);
  expect(response.headers['content-type']).toContain('application/problem+json');
  const problem = ProblemSchema.parse(response.body);
  expect(problem.errors).toEqual([
    {
      path: field,
      message: expect.stringMatching(/holds U\+[0-9A-F]{4}, an invisible control or text-direction/),
    },
  ]);
};

describe('names with hidden characters', () => {
  it('are refused for a new API key, and no key is stored', async () => {
    const answers = await Promise.all(
      HIDDEN.map((name) =>
        request(test.app).post('/api/v1/keys').set('Authorization', `Bearer ${owner}`).send({ name }),
      ),
    );
    for (const answer of answers) refusedNaming(answer, 'name');
    const list = await request(test.app)
      .get('/api/v1/keys')
      .set('Authorization', `Bearer ${owner}`)
      .expect(200);
    expect(ApiKeyListSchema.parse(list.body).keys).toEqual([]);
  });

  it('are refused in an invitation, which is neither stored nor mailed', async () => {
    const answers = await Promise.all(
      HIDDEN.map((name, index) =>
        request(test.app)
          .post('/api/v1/people/invitations')
          .set('Authorization', `Bearer ${owner}`)
          .send({ email: `new.${index}@juniper-drum.test`, role: 'viewer', name }),
      ),
    );
    for (const answer of answers) refusedNaming(answer, 'name');
    const people = await request(test.app)
      .get('/api/v1/people')
      .set('Authorization', `Bearer ${owner}`)
      .expect(200);
    expect(PeopleSchema.parse(people.body).invitations).toEqual([]);
    HIDDEN.forEach((_, index) => expect(test.mail.listTo(`new.${index}@juniper-drum.test`)).toEqual([]));
  });

  it('are refused when an invitation is accepted, which stays open for a clean name', async () => {
    const email = 'new.hand@juniper-drum.test';
    await request(test.app)
      .post('/api/v1/people/invitations')
      .set('Authorization', `Bearer ${owner}`)
      .send({ email, role: 'technician' })
      .expect(201);
    const token = linkTokenIn(test.mail, email, '/accept-invitation');
    const password = 'the mill wheel turns at dusk';

    const answers = await Promise.all(
      HIDDEN.map((name) =>
        request(test.app).post(`/api/v1/invitations/${token}/accept`).send({ name, password }),
      ),
    );
    for (const answer of answers) refusedNaming(answer, 'name');
    const people = await request(test.app)
      .get('/api/v1/people')
      .set('Authorization', `Bearer ${owner}`)
      .expect(200);
    expect(PeopleSchema.parse(people.body).people.map((person) => person.email)).not.toContain(email);

    await request(test.app).get(`/api/v1/invitations/${token}`).expect(200);
    const accepted = await request(test.app)
      .post(`/api/v1/invitations/${token}/accept`)
      .send({ name: 'Rowan Ashby', password })
      .expect(201);
    expect(accepted.body.user).toMatchObject({ email, name: 'Rowan Ashby' });
  });
});
