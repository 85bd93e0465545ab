/*
 * The customers' own behaviour through the real app: search, filters, sort and paging on the server,
 * the machine count, and how their fields are stored.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Customer } from '@counterpoise/api';
import {
  as,
  machineBody,
  ManualClock,
  type RecordsTestApp,
  startRecordsTestApp,
} from '../records/records.test-app';

let test: RecordsTestApp;
const clock = new ManualClock();
const owner = () => as(test.app, test.tokens.owner);

/** The customers of the list specs, made a second apart in this order. */
const NAMES = [
  'dunmore Fencing',
  'Alder Creek',
  'Östberg Mowing',
  'birch Hollow',
  'Cedar_Line 100%',
  'Ember Vale',
];
const byName: Record<string, Customer> = {};

beforeAll(async () => {
  test = await startRecordsTestApp({ clock });
  for (const [index, name] of NAMES.entries()) {
    clock.advance(1000);
    const response = await owner().post('/api/v1/customers', {
      name,
      email: `Office${index}@Example.TEST`,
      phone: `+1 555 01${10 + index}`,
      siteAddress: index === 3 ? '9 Kiln Lane, Marshwick' : null,
      contacts: index === 5 ? [{ name: 'Rosalind Quayle', role: 'Foreman' }] : [],
    });
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    byName[name] = response.body as Customer;
  }
  // Another organisation's customer with a name every search below would find.
  await as(test.app, test.otherOwner).post('/api/v1/customers', {
    name: 'Alder Birch Cedar Östberg %_ Ember',
  });
});
afterAll(async () => test.close());

/** The names a list query answers, in order, and its total. */
async function list(
  query: string,
): Promise<{ names: string[]; total: number; body: Record<string, unknown> }> {
  const response = await owner().get(`/api/v1/customers?${query}`);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return {
    names: (response.body.items as Customer[]).map((customer) => customer.name),
    total: response.body.total as number,
    body: response.body as Record<string, unknown>,
  };
}

const ALPHABETICAL = [
  'Alder Creek',
  'birch Hollow',
  'Cedar_Line 100%',
  'dunmore Fencing',
  'Ember Vale',
  'Östberg Mowing',
];

describe('the list of customers', () => {
  it('sorts by name without regard to case, both ways, by default ascending', async () => {
    expect((await list('')).names).toEqual(ALPHABETICAL);
    expect((await list('sort=name&order=desc')).names).toEqual([...ALPHABETICAL].reverse());
  });

  it('sorts by when they were created and last changed', async () => {
    expect((await list('sort=createdAt')).names).toEqual(NAMES);
    expect((await list('sort=createdAt&order=desc')).names).toEqual([...NAMES].reverse());
    clock.advance(1000);
    const alder = byName['Alder Creek']!;
    const changed = await owner().patch(
      `/api/v1/customers/${alder.id}`,
      { notes: 'Gate code 4417.' },
      `"${alder.version}"`,
    );
    expect(changed.status).toBe(200);
    byName['Alder Creek'] = changed.body as Customer;
    const updated = (await list('sort=updatedAt')).names;
    expect(updated.at(-1)).toBe('Alder Creek');
    expect((await list('sort=updatedAt&order=desc')).names[0]).toBe('Alder Creek');
  });

  it('pages on the server, and answers no items past the last page', async () => {
    const first = await list('pageSize=4');
    expect(first).toMatchObject({ names: ALPHABETICAL.slice(0, 4), total: 6 });
    expect(first.body).toMatchObject({ page: 1, pageSize: 4 });
    const second = await list('pageSize=4&page=2');
    expect(second).toMatchObject({ names: ALPHABETICAL.slice(4), total: 6 });
    const beyond = await list('pageSize=4&page=3');
    expect(beyond).toMatchObject({ names: [], total: 6 });
    expect(beyond.body).toMatchObject({ page: 3, pageSize: 4 });
  });

  it.each([
    ['hollow', ['birch Hollow']],
    ['HOLLOW', ['birch Hollow']],
    ['östb', ['Östberg Mowing']],
    ['ÖSTBERG', ['Östberg Mowing']],
    ['office2@example', ['Östberg Mowing']],
    ['555 0114', ['Cedar_Line 100%']],
    ['kiln lane', ['birch Hollow']],
    ['rosalind', ['Ember Vale']],
    ['100%', ['Cedar_Line 100%']],
    ['%', ['Cedar_Line 100%']],
    ['_', ['Cedar_Line 100%']],
    ['e_f', []],
    ['\\', []],
    ['nowhere at all', []],
  ])('finds “%s” in names, e-mails, phones, addresses and contacts', async (q, names) => {
    const found = await list(`q=${encodeURIComponent(q)}`);
    expect(found.names).toEqual(names);
    expect(found.total).toBe(names.length);
  });

  it('lists in-use customers by default, archived ones or all on request', async () => {
    const ember = byName['Ember Vale']!;
    await owner().change(`/api/v1/customers/${ember.id}/archive`, `"${ember.version}"`).expect(200);
    expect((await list('')).names).toEqual(ALPHABETICAL.filter((name) => name !== 'Ember Vale'));
    expect(await list('archived=true')).toMatchObject({ names: ['Ember Vale'], total: 1 });
    expect(await list('archived=all')).toMatchObject({ names: ALPHABETICAL, total: 6 });
    expect(await list('archived=true&q=alder')).toMatchObject({ names: [], total: 0 });
  });
});

describe('a customer', () => {
  it('counts the machines it has in use', async () => {
    const customer = (await owner().post('/api/v1/customers', { name: 'Quillmoor Estate' }).expect(201))
      .body as Customer;
    expect(customer.machineCount).toBe(0);
    const machines = [];
    for (const serialNumber of ['Q-1', 'Q-2', 'Q-3']) {
      machines.push(
        (await owner().post('/api/v1/machines', machineBody(customer.id, { serialNumber })).expect(201)).body,
      );
    }
    await owner().change(`/api/v1/machines/${machines[0].id}/archive`, '"1"').expect(200);
    const read = await owner().get(`/api/v1/customers/${customer.id}`).expect(200);
    expect(read.body.machineCount).toBe(2);
    const listed = await list('q=quillmoor');
    expect((listed.body['items'] as Customer[])[0]!.machineCount).toBe(2);
  });

  it('stores e-mail addresses in lower case and empty free text as null', async () => {
    const created = await owner()
      .post('/api/v1/customers', {
        name: '  Harlow Fen Dairy  ',
        email: 'Barn@HarlowFen.TEST',
        siteAddress: '   ',
        notes: '\n',
      })
      .expect(201);
    expect(created.body).toMatchObject({
      name: 'Harlow Fen Dairy',
      email: 'barn@harlowfen.test',
      siteAddress: null,
      notes: null,
      contacts: [],
    });
    const changed = await owner()
      .patch(
        `/api/v1/customers/${created.body.id}`,
        { notes: 'Milking at 4.\nCall first.', email: null },
        '"1"',
      )
      .expect(200);
    expect(changed.body).toMatchObject({ notes: 'Milking at 4.\nCall first.', email: null, version: 2 });
    const cleared = await owner()
      .patch(`/api/v1/customers/${created.body.id}`, { notes: '' }, '"2"')
      .expect(200);
    expect(cleared.body.notes).toBeNull();
  });

  it('keeps the fields a change leaves out', async () => {
    const created = await owner()
      .post('/api/v1/customers', {
        name: 'Stonebridge Orchards',
        email: 'info@stonebridge.test',
        contacts: [{ name: 'Ansel Brightmere', phone: '+1 555 0171' }],
      })
      .expect(201);
    const changed = await owner()
      .patch(`/api/v1/customers/${created.body.id}`, { phone: '+1 555 0186' }, '"1"')
      .expect(200);
    expect(changed.body).toEqual({
      ...created.body,
      phone: '+1 555 0186',
      version: 2,
      updatedAt: changed.body.updatedAt,
    });
  });
});
