import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { Role } from '@counterpoise/api';
import { BehaviorSubject, map } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { aFamily, aPage, nextRequest, recordsTestBed } from '../records/testing';
import { MachineFamiliesPage } from './machine-families-page';

describe('MachineFamiliesPage', { timeout: 30_000 }, () => {
  let http: HttpTestingController;
  const wide = new BehaviorSubject(true);

  beforeEach(() => {
    http = recordsTestBed(
      [
        { path: 'machine-families', component: MachineFamiliesPage },
        { path: '**', component: RouteStandIn, data: { heading: 'Elsewhere' } },
      ],
      [
        {
          provide: BreakpointObserver,
          useValue: {
            observe: () => wide.pipe(map((matches): BreakpointState => ({ matches, breakpoints: {} }))),
          },
        },
      ],
    );
  });

  afterEach(() => http.verify());

  async function open(role: Role, isWide = true) {
    wide.next(isWide);
    TestBed.inject(AuthSession).start(aSession(role));
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/machine-families');
    (await nextRequest(http, (r) => r.url === '/api/v1/machine-families')).flush(
      aPage([
        aFamily(),
        aFamily({ id: 5, name: 'Kestrel FL-180 flail mowers', rotorType: 'flail', planeCount: 1 }),
      ]),
    );
    await navigated;
    await harness.fixture.whenStable();
    return {
      harness,
      element: harness.routeNativeElement as HTMLElement,
      loader: TestbedHarnessEnvironment.loader(harness.fixture),
    };
  }

  it('lists the families with their rotor, speed and planes, each name a link', async () => {
    const { loader, element } = await open('technician');
    const table = await loader.getHarness(MatTableHarness.with({ selector: '.families' }));
    const rows = await table.getCellTextByColumnName();
    expect(rows['name']?.text).toEqual(['Thornmill FM-225 mulcher heads', 'Kestrel FL-180 flail mowers']);
    expect(rows['rotorType']?.text).toEqual(['Fixed-tooth drum', 'Flail rotor']);
    expect(rows['nominalSpeedRpm']?.text).toEqual(['2,200 rpm', '2,200 rpm']);
    expect(rows['planeCount']?.text).toEqual(['2', '1']);
    expect(element.querySelector('td a.row-link')?.getAttribute('href')).toBe('/machine-families/4');
  });

  it('puts the rotor, speed and planes under the name at phone width', async () => {
    const { loader } = await open('technician', false);
    const table = await loader.getHarness(MatTableHarness.with({ selector: '.families' }));
    const rows = await table.getCellTextByColumnName();
    expect(Object.keys(rows)).toEqual(['name', 'machineCount']);
    expect(rows['name']?.text[1]).toMatch(/Kestrel FL-180 flail mowers\s*Flail rotor · 2,200 rpm · 1 plane/);
  });

  it('sorts by rotor type on the server', async () => {
    const { loader } = await open('viewer');
    const [header] = await (await loader.getHarness(MatSortHarness)).getSortHeaders({ label: 'Rotor type' });
    const clicked = header!.click();
    const request = await nextRequest(http, (r) => r.url === '/api/v1/machine-families');
    expect(request.request.params.get('sort')).toBe('rotorType');
    request.flush(aPage([aFamily()]));
    await clicked;
    expect(TestBed.inject(Router).url).toBe('/machine-families?sort=rotorType');
  });

  it('offers adding a family to a manager, not to a technician', async () => {
    expect((await open('technician')).element.querySelector('a[href="/machine-families/new"]')).toBeNull();
  });

  it('offers it to a manager', async () => {
    expect((await open('manager')).element.querySelector('a[href="/machine-families/new"]')).not.toBeNull();
  });
});
