/*
 * The machines' own behaviour through the real app: the customer and family a machine may name, its
 * planes against its family's, its defaults, and search, filters, sort and paging.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type Machine, RECORDS_PROBLEM_CODES } from '@counterpoise/api';
import {
  as,
  customerBody,
  familyBody,
  machineBody,
  ManualClock,
  type RecordsTestApp,
  rowCount,
  startRecordsTestApp,
} from '../records/records.test-app';

let test: RecordsTestApp;
const clock = new ManualClock();
const owner = () => as(test.app, test.tokens.owner);
let counter = 0;

beforeAll(async () => (test = await startRecordsTestApp({ clock })));
afterAll(async () => test.close());

async function created(path: string, body: Record<string, unknown>, token = test.tokens.owner) {
  const response = await as(test.app, token).post(path, body);
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return response.body as { id: number; version: number; name: string };
}
const newCustomer = (token?: string) => created('/api/v1/customers', customerBody(`m${++counter}`), token);
const newFamily = (planes: 1 | 2 = 2, token?: string) =>
  created('/api/v1/machine-families', familyBody(`m${++counter}`, planes), token);

const TABLES = ['machines', 'record_changes'];
const counts = () => TABLES.map((table) => rowCount(test, table));

describe('what a machine may name', () => {
  it('refuses another organisation’s customer or family on the field, and stores nothing', async () => {
    const theirCustomer = await newCustomer(test.otherOwner);
    const theirFamily = await newFamily(2, test.otherOwner);
    const ourCustomer = await newCustomer();
    const before = counts();

    const customer = await owner().post('/api/v1/machines', machineBody(theirCustomer.id));
    expect(customer.status).toBe(400);
    expect(customer.body.code).toBe(RECORDS_PROBLEM_CODES.unknownReference);
    expect(customer.body.errors).toEqual([
      { path: 'customerId', message: `There is no customer ${theirCustomer.id} in your organisation.` },
    ]);
    expect(JSON.stringify(customer.body)).not.toContain(theirCustomer.name);

    const family = await owner().post(
      '/api/v1/machines',
      machineBody(ourCustomer.id, { familyId: theirFamily.id }),
    );
    expect(family.status).toBe(400);
    expect(family.body.errors.map((error: { path: string }) => error.path)).toEqual(['familyId']);

    const both = await owner().post(
      '/api/v1/machines',
      machineBody(theirCustomer.id, { familyId: theirFamily.id }),
    );
    expect(both.body.errors.map((error: { path: string }) => error.path)).toEqual(['customerId', 'familyId']);

    const unknown = await owner().post('/api/v1/machines', machineBody(987654));
    expect(unknown.status).toBe(400);
    expect(unknown.body.errors[0].path).toBe('customerId');
    expect(counts()).toEqual(before);
  });

  it('refuses to be moved to another organisation’s customer', async () => {
    const machine = await created('/api/v1/machines', machineBody((await newCustomer()).id));
    const theirs = await newCustomer(test.otherOwner);
    const moved = await owner().patch(`/api/v1/machines/${machine.id}`, { customerId: theirs.id }, '"1"');
    expect(moved.status).toBe(400);
    expect(moved.body.errors[0].path).toBe('customerId');
    expect((await owner().get(`/api/v1/machines/${machine.id}`).expect(200)).body.version).toBe(1);
  });

  it('comes to name archived customers or families on no account, but keeps one archived since', async () => {
    const customer = await newCustomer();
    const family = await newFamily();
    const machine = await created('/api/v1/machines', machineBody(customer.id, { familyId: family.id }));
    await owner().change(`/api/v1/customers/${customer.id}/archive`, '"1"').expect(200);
    await owner().change(`/api/v1/machine-families/${family.id}/archive`, '"1"').expect(200);

    const fresh = await owner().post('/api/v1/machines', machineBody(customer.id, { familyId: family.id }));
    expect(fresh.status).toBe(400);
    expect(fresh.body.errors.map((error: { path: string; message: string }) => error.path)).toEqual([
      'customerId',
      'familyId',
    ]);
    expect(fresh.body.errors[0].message).toContain('is archived');

    const kept = await owner().patch(`/api/v1/machines/${machine.id}`, { hours: 2000 }, '"1"').expect(200);
    expect(kept.body).toMatchObject({ customerId: customer.id, familyId: family.id, hours: 2000 });

    const other = await newCustomer();
    await owner().patch(`/api/v1/machines/${machine.id}`, { customerId: other.id }, '"2"').expect(200);
    const back = await owner().patch(`/api/v1/machines/${machine.id}`, { customerId: customer.id }, '"3"');
    expect(back.status).toBe(400);
    expect(back.body.errors[0].path).toBe('customerId');
  });

  it('has as many planes as its family', async () => {
    const customer = await newCustomer();
    const drum = await newFamily(2);
    const fan = await newFamily(1);
    const before = counts();
    const tooFew = await owner().post(
      '/api/v1/machines',
      machineBody(customer.id, { familyId: drum.id, planeCount: 1 }),
    );
    expect(tooFew.status).toBe(400);
    expect(tooFew.body.code).toBe(RECORDS_PROBLEM_CODES.planesDoNotMatch);
    expect(tooFew.body.errors).toEqual([
      { path: 'planes', message: expect.stringContaining('has 2 planes') },
    ]);
    expect(counts()).toEqual(before);

    const machine = await created('/api/v1/machines', machineBody(customer.id, { familyId: drum.id }));
    const toFan = await owner().patch(`/api/v1/machines/${machine.id}`, { familyId: fan.id }, '"1"');
    expect(toFan.status).toBe(400);
    expect(toFan.body.errors[0].path).toBe('planes');
    const withPlane = await owner()
      .patch(
        `/api/v1/machines/${machine.id}`,
        { familyId: fan.id, planes: [{ correctionRadiusMm: 520, positions: { count: 6, firstDeg: 0 } }] },
        '"1"',
      )
      .expect(200);
    expect(withPlane.body).toMatchObject({ familyId: fan.id, familyName: fan.name, version: 2 });
  });

  it('has sensors on both sides of two planes and on the left of one, unless told', async () => {
    const customer = await newCustomer();
    const two = await created('/api/v1/machines', machineBody(customer.id));
    const one = await created('/api/v1/machines', machineBody(customer.id, { planeCount: 1 }));
    const right = await created('/api/v1/machines', {
      ...machineBody(customer.id, { planeCount: 1 }),
      sensorSides: ['right'],
    });
    expect((two as unknown as Machine).sensorSides).toEqual(['left', 'right']);
    expect((one as unknown as Machine).sensorSides).toEqual(['left']);
    expect((right as unknown as Machine).sensorSides).toEqual(['right']);
  });
});

describe('the list of machines', () => {
  let alder: { id: number; name: string };
  let birch: { id: number; name: string };
  let drum: { id: number };
  const ids: Record<string, number> = {};

  beforeAll(async () => {
    alder = await created('/api/v1/customers', { name: 'Alder Creek Clearing' });
    birch = await created('/api/v1/customers', { name: 'birch Hollow Roads' });
    drum = await newFamily(2);
    const rows: [string | null, string, typeof alder, boolean][] = [
      ['QS180-0457', 'Quernstone', alder, true],
      ['bf220-18734', 'Fenmarsh', birch, false],
      [null, 'Wrenmoor', alder, false],
      ['BF220-19102', 'fenmarsh', alder, true],
    ];
    for (const [serialNumber, make, customer, inFamily] of rows) {
      clock.advance(1000);
      const body = {
        ...machineBody(customer.id, { familyId: inFamily ? drum.id : null }),
        serialNumber,
        make,
        model: make === 'Wrenmoor' ? 'WF-240 flail' : 'M-1',
      };
      ids[serialNumber ?? 'none'] = (await created('/api/v1/machines', body)).id;
    }
    // Another organisation's machine that every search below would find.
    const theirs = await newCustomer(test.otherOwner);
    await created(
      '/api/v1/machines',
      { ...machineBody(theirs.id), serialNumber: 'BF220-QS180', make: 'Fenmarsh Wrenmoor Quernstone' },
      test.otherOwner,
    );
  });

  async function serials(query: string): Promise<{ serials: (string | null)[]; total: number }> {
    const response = await owner().get(`/api/v1/machines?pageSize=100&${query}`);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    return {
      serials: (response.body.items as Machine[]).map((machine) => machine.serialNumber),
      total: response.body.total,
    };
  }

  it('filters by customer and by family', async () => {
    expect(await serials(`customerId=${birch.id}`)).toEqual({ serials: ['bf220-18734'], total: 1 });
    expect(await serials(`customerId=${alder.id}`)).toEqual({
      serials: ['BF220-19102', 'QS180-0457', null],
      total: 3,
    });
    expect(await serials(`familyId=${drum.id}`)).toEqual({
      serials: ['BF220-19102', 'QS180-0457'],
      total: 2,
    });
    expect(await serials(`familyId=${drum.id}&customerId=${birch.id}`)).toEqual({ serials: [], total: 0 });
  });

  it('finds machines by serial number, make, model and customer name, in any case', async () => {
    expect((await serials(`customerId=${alder.id}&q=bf220`)).serials).toEqual(['BF220-19102']);
    expect((await serials('q=FENMARSH')).serials).toEqual(['bf220-18734', 'BF220-19102']);
    expect((await serials('q=flail')).serials).toEqual([null]);
    expect((await serials('q=hollow%20roads')).serials).toEqual(['bf220-18734']);
  });

  it('sorts by serial number without regard to case, those without one last either way', async () => {
    const scope = `customerId=${alder.id}&sort=serialNumber`;
    expect((await serials(scope)).serials).toEqual(['BF220-19102', 'QS180-0457', null]);
    expect((await serials(`${scope}&order=desc`)).serials).toEqual(['QS180-0457', 'BF220-19102', null]);
  });

  it('sorts by customer name, make and last change, both ways', async () => {
    const byCustomer = await owner().get('/api/v1/machines?sort=customerName&pageSize=100').expect(200);
    const customerNames = (byCustomer.body.items as Machine[]).map((machine) => machine.customerName);
    const folded = customerNames.map((name) => name.toLowerCase());
    expect(folded).toEqual([...folded].sort());
    expect(customerNames.indexOf('birch Hollow Roads')).toBeGreaterThan(
      customerNames.indexOf('Alder Creek Clearing'),
    );
    const down = await owner().get('/api/v1/machines?sort=customerName&order=desc&pageSize=100').expect(200);
    // Ties are broken by id in the same direction, so the descending list is the ascending one reversed.
    expect((down.body.items as Machine[]).map((machine) => machine.id)).toEqual(
      (byCustomer.body.items as Machine[]).map((machine) => machine.id).reverse(),
    );

    const scope = `customerId=${alder.id}`;
    expect((await serials(`${scope}&sort=make`)).serials).toEqual(['BF220-19102', 'QS180-0457', null]);
    expect((await serials(`${scope}&sort=make&order=desc`)).serials).toEqual([
      null,
      'QS180-0457',
      'BF220-19102',
    ]);

    clock.advance(1000);
    await owner().patch(`/api/v1/machines/${ids['QS180-0457']}`, { hours: 2400 }, '"1"').expect(200);
    expect((await serials(`${scope}&sort=updatedAt`)).serials).toEqual([null, 'BF220-19102', 'QS180-0457']);
    expect((await serials(`${scope}&sort=updatedAt&order=desc`)).serials).toEqual([
      'QS180-0457',
      'BF220-19102',
      null,
    ]);
  });

  it('pages, counts every match, lists archived ones on request, and shows the customer’s name as it is now', async () => {
    const scope = `customerId=${alder.id}&sort=serialNumber`;
    const page = await owner().get(`/api/v1/machines?${scope}&pageSize=2&page=2`).expect(200);
    expect(page.body).toMatchObject({ total: 3, page: 2, pageSize: 2 });
    expect((page.body.items as Machine[]).map((machine) => machine.serialNumber)).toEqual([null]);
    expect((await owner().get(`/api/v1/machines?${scope}&pageSize=2&page=9`).expect(200)).body).toMatchObject(
      {
        items: [],
        total: 3,
      },
    );

    await owner().change(`/api/v1/machines/${ids['none']}/archive`, '"1"').expect(200);
    expect(await serials(scope)).toEqual({ serials: ['BF220-19102', 'QS180-0457'], total: 2 });
    expect(await serials(`${scope}&archived=true`)).toEqual({ serials: [null], total: 1 });
    expect((await serials(`${scope}&archived=all`)).total).toBe(3);

    await owner()
      .patch(`/api/v1/customers/${alder.id}`, { name: 'Alder Creek Land Clearing' }, '"1"')
      .expect(200);
    const renamed = await owner().get(`/api/v1/machines/${ids['QS180-0457']}`).expect(200);
    expect(renamed.body.customerName).toBe('Alder Creek Land Clearing');
    expect((await serials('q=land%20clearing')).total).toBe(2);
  });
});
