import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { RouterTestingHarness } from '@angular/router/testing';
import type { Role } from '@counterpoise/api';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { aChange, aCustomer, aMachine, aPage, nextRequest, recordsTestBed } from '../records/testing';
import { CustomerPage } from './customer-page';

describe('CustomerPage', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = recordsTestBed([
      { path: 'customers/:id', component: CustomerPage },
      { path: '**', component: RouteStandIn, data: { heading: 'Elsewhere' } },
    ]);
  });

  afterEach(() => http.verify());

  async function open(role: Role) {
    TestBed.inject(AuthSession).start(aSession(role));
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/customers/7');
    (await nextRequest(http, '/api/v1/customers/7')).flush(aCustomer(), { headers: { ETag: '"3"' } });
    const machines = await nextRequest(http, (r) => r.url === '/api/v1/machines');
    expect(machines.request.params.get('customerId')).toBe('7');
    machines.flush(aPage([aMachine()]));
    (await nextRequest(http, '/api/v1/customers/7/history')).flush({ changes: [aChange()] });
    await navigated;
    await harness.fixture.whenStable();
    const element = harness.routeNativeElement as HTMLElement;
    const buttons = () =>
      [...element.querySelectorAll('.header .actions a, .header .actions button, .section-header a')].map(
        (button) => button.textContent?.trim(),
      );
    return { harness, element, buttons, loader: TestbedHarnessEnvironment.loader(harness.fixture) };
  }

  it('shows how to reach the customer, the contacts, the machines and who changed what', async () => {
    const { element } = await open('viewer');
    expect(element.querySelector('h1')?.textContent?.trim()).toBe('Bramblecote Estate Services');
    const text = element.textContent?.replace(/\s+/g, ' ') ?? '';
    expect(text).toContain('yard@bramblecote.example.com');
    const contact = [...element.querySelectorAll('.contacts li > *')].map((part) => part.textContent?.trim());
    expect(contact).toEqual(['Orla Penhallow', 'fleet manager', '+44 1632 960 119']);
    expect(element.querySelector('a[href="/machines/12"]')?.textContent?.trim()).toBe('TM225-0419');
    expect(text).toContain(
      'Dagny Fairbrook changed the phone number from “+44 1632 960 100” to “+44 1632 960 118”.',
    );
  });

  it('lets a technician edit and add a machine, but not archive', async () => {
    const { buttons, element } = await open('technician');
    expect(buttons()).toEqual(['Edit', 'Add a machine']);
    expect(element.querySelector('a[href="/machines/new?customerId=7"]')).not.toBeNull();
  });

  it('shows a viewer no buttons that change the record', async () => {
    const { buttons } = await open('viewer');
    expect(buttons()).toEqual([]);
  });

  it('lets a manager archive the customer after asking, with the ETag it was read with', async () => {
    const { loader, buttons, harness, element } = await open('manager');
    expect(buttons()).toEqual(['Edit', 'Archive', 'Add a machine']);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Archive/ }))).click();
    const overlays = TestbedHarnessEnvironment.documentRootLoader(harness.fixture);
    const dialog = await overlays.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Archive Bramblecote Estate Services?');
    const confirmed = (await dialog.getHarness(MatButtonHarness.with({ text: 'Archive' }))).click();
    const archive = await nextRequest(http, '/api/v1/customers/7/archive');
    expect(archive.request.method).toBe('POST');
    expect(archive.request.headers.get('If-Match')).toBe('"3"');
    archive.flush(aCustomer({ version: 4, archivedAt: '2026-12-04T09:00:00.000Z' }), {
      headers: { ETag: '"4"' },
    });
    (await nextRequest(http, '/api/v1/customers/7/history')).flush({
      changes: [aChange({ id: 32, version: 4, action: 'archived', fields: [] }), aChange()],
    });
    await confirmed;
    await harness.fixture.whenStable();
    expect(element.querySelector('h1 .badge')?.textContent).toBe('Archived');
    expect(buttons()).toEqual(['Edit', 'Restore']);
    expect(element.textContent).toContain('Dagny Fairbrook archived this customer.');
  });
});
