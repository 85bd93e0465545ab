import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { Role } from '@counterpoise/api';
import { BehaviorSubject, map } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { aCustomer, aPage, nextRequest, recordsTestBed } from '../records/testing';
import { CustomersPage } from './customers-page';

const CUSTOMERS = [
  aCustomer(),
  aCustomer({
    id: 8,
    name: 'Wrenhollow Parish Council',
    email: null,
    phone: '+44 1632 960 200',
    machineCount: 0,
  }),
];

describe('CustomersPage', { timeout: 30_000 }, () => {
  let http: HttpTestingController;
  const wide = new BehaviorSubject(true);

  beforeEach(() => {
    wide.next(true);
    http = recordsTestBed(
      [
        { path: 'customers', component: CustomersPage },
        { path: 'customers/new', component: RouteStandIn, data: { heading: 'Add a customer' } },
        { path: 'customers/:id', component: RouteStandIn, data: { heading: 'A customer' } },
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

  /** Opens the list at `url` as someone in `role`, answering its first request with `customers`. */
  async function open(url = '/customers', role: Role = 'technician', total = CUSTOMERS.length) {
    TestBed.inject(AuthSession).start(aSession(role));
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl(url);
    const request = await nextRequest(http, (r) => r.url === '/api/v1/customers');
    request.flush(aPage(CUSTOMERS, total));
    await navigated;
    await harness.fixture.whenStable();
    return {
      request,
      harness,
      element: harness.routeNativeElement as HTMLElement,
      loader: TestbedHarnessEnvironment.loader(harness.fixture),
    };
  }

  const router = () => TestBed.inject(Router);

  it('shows the page of customers the server answers, each name a link to the customer', async () => {
    const { request, loader, element } = await open();
    expect(request.request.urlWithParams).toBe(
      '/api/v1/customers?archived=false&sort=name&order=asc&page=1&pageSize=25',
    );
    const table = await loader.getHarness(MatTableHarness.with({ selector: '.customers' }));
    const rows = await table.getCellTextByColumnName();
    expect(rows['name']?.text).toEqual(['Bramblecote Estate Services', 'Wrenhollow Parish Council']);
    expect(rows['machineCount']?.text).toEqual(['2', '0']);
    const links = [...element.querySelectorAll<HTMLAnchorElement>('td a.row-link')];
    expect(links.map((link) => link.getAttribute('href'))).toEqual(['/customers/7', '/customers/8']);
    expect(element.querySelector('.count')?.textContent?.trim()).toBe('2 customers in use.');
  });

  it('keeps the query of the address: a reload shows the same page, sorted and filtered', async () => {
    const { request, loader } = await open(
      '/customers?q=bramble&archived=all&sort=updatedAt&order=desc&page=2',
      'viewer',
      30,
    );
    expect(request.request.urlWithParams).toBe(
      '/api/v1/customers?archived=all&sort=updatedAt&order=desc&page=2&pageSize=25&q=bramble',
    );
    expect(
      await (await loader.getHarness(MatInputHarness.with({ selector: '[type="search"]' }))).getValue(),
    ).toBe('bramble');
    const sort = await loader.getHarness(MatSortHarness);
    expect(await (await sort.getActiveHeader())?.getLabel()).toBe('Last changed');
    expect(await (await loader.getHarness(MatPaginatorHarness)).getRangeLabel()).toBe('26 – 30 of 30');
    expect(await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'All' }))).isChecked()).toBe(
      true,
    );
  });

  it('sorts on the server and writes the sort into the address', async () => {
    const { loader } = await open();
    const header = (
      await (await loader.getHarness(MatSortHarness)).getSortHeaders({ label: 'Last changed' })
    )[0]!;
    const clicked = header.click();
    const request = await nextRequest(http, (r) => r.url === '/api/v1/customers');
    expect(request.request.params.get('sort')).toBe('updatedAt');
    expect(request.request.params.get('order')).toBe('asc');
    request.flush(aPage(CUSTOMERS));
    await clicked;
    expect(router().url).toBe('/customers?sort=updatedAt');
  });

  it('searches once typing pauses, from the first page, without a history entry per key', async () => {
    const { loader, harness } = await open('/customers?page=2', 'technician', 30);
    const search = await loader.getHarness(MatInputHarness.with({ selector: '[type="search"]' }));
    await search.setValue('wren');
    const request = await nextRequest(http, (r) => r.url === '/api/v1/customers');
    expect(request.request.params.get('q')).toBe('wren');
    expect(request.request.params.get('page')).toBe('1');
    request.flush(aPage([CUSTOMERS[1]!]));
    await harness.fixture.whenStable();
    expect(router().url).toBe('/customers?q=wren');
  });

  it('turns pages and shows archived customers on the server', async () => {
    const { loader } = await open('/customers', 'technician', 60);
    const paginator = await loader.getHarness(MatPaginatorHarness);
    const turned = paginator.goToNextPage();
    const next = await nextRequest(http, (r) => r.url === '/api/v1/customers');
    expect(next.request.params.get('page')).toBe('2');
    next.flush(aPage(CUSTOMERS, 60, 2));
    await turned;
    expect(router().url).toBe('/customers?page=2');

    const archived = (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Archived' }))).check();
    const filtered = await nextRequest(http, (r) => r.url === '/api/v1/customers');
    expect(filtered.request.params.get('archived')).toBe('true');
    expect(filtered.request.params.get('page')).toBe('1');
    filtered.flush(aPage([]));
    await archived;
    expect(router().url).toBe('/customers?archived=true');
  });

  it('offers adding a customer only to those who may', async () => {
    const technician = await open('/customers', 'technician');
    expect(technician.element.querySelector('a[href="/customers/new"]')?.textContent).toContain(
      'Add a customer',
    );
  });

  it('hides adding a customer from a viewer', async () => {
    const viewer = await open('/customers', 'viewer');
    expect(viewer.element.querySelector('a[href="/customers/new"]')).toBeNull();
  });

  it('says so when no customer matches the search', async () => {
    TestBed.inject(AuthSession).start(aSession('technician'));
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/customers?q=zzz');
    (await nextRequest(http, (r) => r.url === '/api/v1/customers')).flush(aPage([]));
    await navigated;
    await harness.fixture.whenStable();
    const element = harness.routeNativeElement as HTMLElement;
    expect(element.querySelector('.empty')?.textContent?.trim()).toBe('No customer in use matches “zzz”.');
  });
});
