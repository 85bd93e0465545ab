import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { Role } from '@counterpoise/api';
import { CpCorrectionOverlayHarness } from '@counterpoise/ng/correction-overlay/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { todayIso } from '../jobs/job-dates';
import { aJob } from '../jobs/jobs-testing';
import { aChange, aMachine, nextRequest, recordsTestBed } from '../records/testing';
import { MachinePage } from './machine-page';

describe('MachinePage', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = recordsTestBed([
      { path: 'machines/:id', component: MachinePage },
      { path: '**', component: RouteStandIn, data: { heading: 'Elsewhere' } },
    ]);
  });

  afterEach(() => {
    // The page lists the machine's photos; these specs show none.
    for (const request of http.match((each) => each.url.endsWith('/photos'))) {
      if (!request.cancelled) request.flush({ photos: [], limit: 40 });
    }
    http.verify();
  });

  async function open(role: Role) {
    TestBed.inject(AuthSession).start(aSession(role));
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/machines/12');
    (await nextRequest(http, '/api/v1/machines/12')).flush(aMachine(), { headers: { ETag: '"5"' } });
    (await nextRequest(http, '/api/v1/machines/12/history')).flush({
      changes: [
        aChange({
          version: 5,
          fields: [
            { field: 'hours', before: 1650, after: 1830 },
            { field: 'stockWeightsGrams', before: [50, 100], after: [50, 100, 150] },
          ],
        }),
      ],
    });
    await navigated;
    await harness.fixture.whenStable();
    return {
      element: harness.routeNativeElement as HTMLElement,
      loader: TestbedHarnessEnvironment.loader(harness.fixture),
    };
  }

  it('shows every field of the machine, in words', async () => {
    const { element } = await open('viewer');
    expect(element.querySelector('h1')?.textContent?.trim()).toBe('Thornmill FM-225 · TM225-0419');
    const details = Object.fromEntries(
      [...element.querySelectorAll('.details > div')].map((item) => [
        item.querySelector('dt')?.textContent?.trim(),
        item.querySelector('dd')?.textContent?.replace(/\s+/g, ' ').trim(),
      ]),
    );
    expect(details).toEqual({
      Customer: 'Bramblecote Estate Services',
      Family: 'Thornmill FM-225 mulcher heads',
      'Make and model': 'Thornmill FM-225',
      'Serial number': 'TM225-0419',
      Hours: '1,830 h',
      'Rotor mass': '410 kg',
      'Operating speed': '2,200 rpm',
      Sensors: 'Left bearing, Right bearing',
      Rotation: 'Clockwise seen from the left end; counter-clockwise from the right',
      'Stock weights': '50 g100 g150 g',
      'Acceptance level': 'The family’s',
    });
  });

  it('starts a job on this machine today, in the technician’s name, and opens it', async () => {
    const { element } = await open('technician');
    const start = element.querySelector<HTMLButtonElement>('.start-job button');
    expect(start?.textContent).toContain('Start a job');
    start!.click();
    const create = await nextRequest(http, '/api/v1/jobs');
    expect(create.request.method).toBe('POST');
    expect(create.request.body).toEqual({ machineId: 12, scheduledFor: todayIso() });
    create.flush(aJob({ id: 40, version: 1 }), { status: 201, statusText: 'Created' });
    await new Promise((resolve) => setTimeout(resolve));
    expect(TestBed.inject(Router).url).toBe('/jobs/40');
  });

  it('offers starting a job only to those who may', async () => {
    const { element } = await open('viewer');
    expect(element.querySelector('.start-job')).toBeNull();
  });

  it('lists the stock weights one by one', async () => {
    const { element } = await open('viewer');
    expect([...element.querySelectorAll('.chip')].map((chip) => chip.textContent?.trim())).toEqual([
      '50 g',
      '100 g',
      '150 g',
    ]);
  });

  it('draws each plane from its own end, with its positions and blocked sectors', async () => {
    const { loader } = await open('viewer');
    const [left, right] = await loader.getAllHarnesses(CpCorrectionOverlayHarness);
    expect(await left!.getLabel()).toBe('Left plane, seen from the left end');
    const leftWords = await left!.getDescription();
    expect(leftWords).toContain('turning clockwise');
    expect(leftWords).toContain('12 allowed positions, every 30 degrees from 15 degrees.');
    expect(leftWords).toContain('Blocked: holder 350 to 10 degrees.');
    expect(await left!.isPickable()).toBe(false);
    expect(await right!.getLabel()).toBe('Right plane, seen from the right end');
    expect(await right!.getDescription()).toContain('turning counter-clockwise');
  });

  it('tells the history of the machine in sentences', async () => {
    const { element } = await open('viewer');
    const history = element.querySelector('app-change-history')?.textContent?.replace(/\s+/g, ' ');
    expect(history).toContain('Dagny Fairbrook changed 2 fields:');
    expect(history).toContain('changed the hours from 1,650 h to 1,830 h');
    expect(history).toContain('changed the stock weights from 50 g, 100 g to 50 g, 100 g, 150 g');
  });

  it('offers editing to a technician and archiving to a manager only', async () => {
    const technician = await open('technician');
    const actions = (element: HTMLElement) =>
      [...element.querySelectorAll('.header .actions > *')].map((action) => action.textContent?.trim());
    expect(actions(technician.element)).toEqual(['Edit']);
  });

  it('offers archiving to a manager', async () => {
    const manager = await open('manager');
    const actions = [...manager.element.querySelectorAll('.header .actions > *')].map((action) =>
      action.textContent?.trim(),
    );
    expect(actions).toEqual(['Edit', 'Archive']);
  });
});
