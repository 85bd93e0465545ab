/*
 * The machine families' own behaviour through the real app: the rules a family keeps after a change,
 * the planeCount its machines hold it to, and search, filters, sort and paging.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type MachineFamily, RECORDS_PROBLEM_CODES } from '@counterpoise/api';
import {
  as,
  customerBody,
  familyBody,
  machineBody,
  type RecordsTestApp,
  rowCount,
  startRecordsTestApp,
} from '../records/records.test-app';

let test: RecordsTestApp;
const owner = () => as(test.app, test.tokens.owner);

beforeAll(async () => (test = await startRecordsTestApp()));
afterAll(async () => test.close());

async function createFamily(body: Record<string, unknown>): Promise<MachineFamily> {
  const response = await owner().post('/api/v1/machine-families', body);
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return response.body as MachineFamily;
}

describe('a machine family', () => {
  it('stores a sensitivity typed by hand as a rule of thumb', async () => {
    const family = await createFamily(familyBody('rule of thumb'));
    expect(family.sensitivities).toEqual([
      {
        sensorSide: 'left',
        planeIndex: 0,
        gramsPerUnit: 620,
        unit: 'in/s-pk',
        phaseLagDeg: 40,
        jobCount: 0,
        spread: null,
      },
    ]);
    expect(family.machineCount).toBe(0);
  });

  it('keeps its rules after a change: one radius per plane, sensitivities of its own planes', async () => {
    const family = await createFamily(familyBody('rules'));
    const path = `/api/v1/machine-families/${family.id}`;
    const before = rowCount(test, 'record_changes');

    const planesOnly = await owner().patch(path, { planeCount: 1 }, '"1"');
    expect(planesOnly.status).toBe(400);
    expect(planesOnly.body.errors).toEqual([
      { path: 'correctionRadiiMm', message: 'Give one correction radius per plane (1).' },
    ]);

    const onPlaneTwo = await owner().patch(
      path,
      {
        sensitivities: [
          { sensorSide: 'right', planeIndex: 1, gramsPerUnit: 500, unit: 'mm/s-rms', phaseLagDeg: 10 },
        ],
      },
      '"1"',
    );
    expect(onPlaneTwo.status).toBe(200);
    const toOnePlane = await owner().patch(path, { planeCount: 1, correctionRadiiMm: [300] }, '"2"');
    expect(toOnePlane.status).toBe(400);
    expect(toOnePlane.body.errors).toEqual([
      { path: 'sensitivities[0].planeIndex', message: 'The family has 1 plane.' },
    ]);
    expect(rowCount(test, 'record_changes')).toBe(before + 1);

    const together = await owner()
      .patch(path, { planeCount: 1, correctionRadiiMm: [300], sensitivities: [] }, '"2"')
      .expect(200);
    expect(together.body).toMatchObject({
      planeCount: 1,
      correctionRadiiMm: [300],
      sensitivities: [],
      version: 3,
    });
  });

  it('changes its planeCount only while no machine of it has another number of planes', async () => {
    const family = await createFamily(familyBody('in use'));
    const customer = (await owner().post('/api/v1/customers', customerBody('family-planes')).expect(201))
      .body;
    const machine = await owner()
      .post('/api/v1/machines', machineBody(customer.id, { familyId: family.id, serialNumber: 'FP-1' }))
      .expect(201);
    // An archived machine still names its family: it may be restored.
    await owner().change(`/api/v1/machines/${machine.body.id}/archive`, '"1"').expect(200);
    const path = `/api/v1/machine-families/${family.id}`;
    const refused = await owner().patch(
      path,
      { planeCount: 1, correctionRadiiMm: [300], sensitivities: [] },
      '"1"',
    );
    expect(refused.status).toBe(400);
    expect(refused.body.code).toBe(RECORDS_PROBLEM_CODES.planesDoNotMatch);
    expect(refused.body.errors).toEqual([
      {
        path: 'planeCount',
        message: '1 machine of this family has 2 planes: change it first, or make a new family.',
      },
    ]);
    expect((await owner().get(path).expect(200)).body.planeCount).toBe(2);

    await owner().patch(`/api/v1/machines/${machine.body.id}`, { familyId: null }, '"2"').expect(200);
    await owner()
      .patch(path, { planeCount: 1, correctionRadiiMm: [300], sensitivities: [] }, '"1"')
      .expect(200);
  });

  it('counts its machines in use, and shows its acceptance before and after a change in the history', async () => {
    const family = await createFamily(familyBody('counted'));
    const customer = (await owner().post('/api/v1/customers', customerBody('family-count')).expect(201)).body;
    for (const serialNumber of ['FC-1', 'FC-2']) {
      await owner()
        .post('/api/v1/machines', machineBody(customer.id, { familyId: family.id, serialNumber }))
        .expect(201);
    }
    const path = `/api/v1/machine-families/${family.id}`;
    expect((await owner().get(path).expect(200)).body.machineCount).toBe(2);
    await owner()
      .patch(path, { acceptance: { kind: 'balance-grade', grade: 'G16' } }, '"1"')
      .expect(200);
    const history = await owner().get(`${path}/history`).expect(200);
    expect(history.body.changes[0].fields).toEqual([
      {
        field: 'acceptance',
        before: { kind: 'shop-target', amplitude: 0.15, unit: 'in/s-pk' },
        after: { kind: 'balance-grade', grade: 'G16' },
      },
    ]);
  });
});

describe('the list of machine families', () => {
  beforeAll(async () => {
    const specs: [string, 1 | 2][] = [
      ['Wide flail rotor', 2],
      ['barn fan 1.2 m', 1],
      ['Mulcher drum 2.0 m', 2],
    ];
    for (const [name, planes] of specs) {
      const rotorType = name.includes('flail') ? { rotorType: 'flail' } : {};
      await createFamily({ ...familyBody(name, planes), name, ...rotorType });
    }
  });

  async function names(query: string): Promise<{ names: string[]; total: number }> {
    const response = await owner().get(`/api/v1/machine-families?${query}`);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    return {
      names: (response.body.items as MachineFamily[]).map((family) => family.name),
      total: response.body.total,
    };
  }

  it('finds families by name, in any case', async () => {
    expect(await names('q=ROTOR')).toEqual({ names: ['Wide flail rotor'], total: 1 });
    expect(await names('q=2.0%20m')).toEqual({ names: ['Mulcher drum 2.0 m'], total: 1 });
  });

  it('sorts by name and by rotor type, both ways, ties broken by id', async () => {
    const all = await names('pageSize=100');
    const sorted = [...all.names].sort((a, b) => a.toLowerCase().localeCompare(b.toLowerCase()));
    expect(all.names).toEqual(sorted);
    expect((await names('pageSize=100&order=desc')).names).toEqual([...sorted].reverse());
    const byType = (await names('q=rotor&sort=rotorType')).names;
    expect(byType).toEqual(['Wide flail rotor']);
    const types = await owner().get('/api/v1/machine-families?sort=rotorType&pageSize=100').expect(200);
    const rotorTypes = (types.body.items as MachineFamily[]).map((family) => family.rotorType);
    expect(rotorTypes).toEqual([...rotorTypes].sort());
    const typesDown = await owner()
      .get('/api/v1/machine-families?sort=rotorType&order=desc&pageSize=100')
      .expect(200);
    expect((typesDown.body.items as MachineFamily[]).map((family) => family.rotorType)).toEqual(
      [...rotorTypes].sort().reverse(),
    );
  });

  it('pages, counts every match, and filters archived families', async () => {
    const all = await names('pageSize=100');
    const page = await names('pageSize=2&page=2');
    expect(page.total).toBe(all.total);
    expect(page.names).toEqual(all.names.slice(2, 4));
    expect(await names(`pageSize=2&page=${all.total + 1}`)).toEqual({ names: [], total: all.total });
    const fan = (await owner().get('/api/v1/machine-families?q=barn').expect(200)).body
      .items[0] as MachineFamily;
    await owner().change(`/api/v1/machine-families/${fan.id}/archive`, `"${fan.version}"`).expect(200);
    expect((await names('q=barn')).total).toBe(0);
    expect(await names('q=barn&archived=true')).toEqual({ names: ['barn fan 1.2 m'], total: 1 });
    expect((await names('archived=all&pageSize=100')).total).toBe(all.total);
  });
});
