import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { BehaviorSubject, map } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { aCustomer, aFamily, aMachine, aPage, nextRequest, recordsTestBed } from '../records/testing';
import { MachinesPage } from './machines-page';

describe('MachinesPage', { timeout: 30_000 }, () => {
  let http: HttpTestingController;
  const wide = new BehaviorSubject(true);

  beforeEach(() => {
    wide.next(true);
    http = recordsTestBed(
      [
        { path: 'machines', component: MachinesPage },
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
    TestBed.inject(AuthSession).start(aSession('technician'));
  });

  afterEach(() => http.verify());

  async function open(url: string) {
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl(url);
    const list = await nextRequest(http, (r) => r.url === '/api/v1/machines');
    list.flush(aPage([aMachine()]));
    (await nextRequest(http, (r) => r.url === '/api/v1/machine-families')).flush(aPage([aFamily()]));
    return { harness, list, navigated, loader: TestbedHarnessEnvironment.loader(harness.fixture) };
  }

  it('finds a machine by its serial number, the search kept in the address', async () => {
    const { harness, navigated, loader } = await open('/machines');
    await navigated;
    await harness.fixture.whenStable();
    const search = await loader.getHarness(MatInputHarness.with({ selector: '[type="search"]' }));
    await search.setValue('TM225-0419');
    const request = await nextRequest(http, (r) => r.url === '/api/v1/machines');
    expect(request.request.params.get('q')).toBe('TM225-0419');
    request.flush(aPage([aMachine()]));
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/machines?q=TM225-0419');
    const table = await loader.getHarness(MatTableHarness.with({ selector: '.machines' }));
    const rows = await table.getCellTextByColumnName();
    expect(rows['serialNumber']?.text).toEqual(['TM225-0419']);
    expect(rows['customerName']?.text).toEqual(['Bramblecote Estate Services']);
    const link = (harness.routeNativeElement as HTMLElement).querySelector('td a.row-link');
    expect(link?.getAttribute('href')).toBe('/machines/12');
  });

  it('filters by the customer the address names, showing its name in the filter', async () => {
    const { harness, list, navigated, loader } = await open('/machines?customerId=7');
    expect(list.request.params.get('customerId')).toBe('7');
    (await nextRequest(http, '/api/v1/customers/7')).flush(aCustomer());
    await navigated;
    await harness.fixture.whenStable();
    const customer = await (
      await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Customer' }))
    ).getControl(MatInputHarness);
    expect(await customer!.getValue()).toBe('Bramblecote Estate Services');
    const addMachine = (harness.routeNativeElement as HTMLElement).querySelector('.header__action');
    expect(addMachine?.getAttribute('href')).toBe('/machines/new?customerId=7');
  });

  it('filters by family on the server', async () => {
    const { harness, navigated, loader } = await open('/machines');
    await navigated;
    await harness.fixture.whenStable();
    const family = await loader.getHarness(MatSelectHarness.with({ ancestor: '.filters' }));
    await family.open();
    const chosen = family.clickOptions({ text: 'Thornmill FM-225 mulcher heads' });
    const request = await nextRequest(http, (r) => r.url === '/api/v1/machines');
    expect(request.request.params.get('familyId')).toBe('4');
    request.flush(aPage([aMachine()]));
    await chosen;
    expect(TestBed.inject(Router).url).toBe('/machines?familyId=4');
  });
});
