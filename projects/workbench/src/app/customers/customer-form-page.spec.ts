import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { aChange, aCustomer, nextRequest, recordsTestBed } from '../records/testing';
import { CustomerFormPage } from './customer-form-page';

describe('CustomerFormPage', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = recordsTestBed([
      { path: 'customers/new', component: CustomerFormPage },
      { path: 'customers/:id/edit', component: CustomerFormPage },
      { path: 'customers/:id', component: RouteStandIn, data: { heading: 'The customer' } },
    ]);
    TestBed.inject(AuthSession).start(aSession('technician'));
  });

  afterEach(() => http.verify());

  async function field(loader: ReturnType<typeof TestbedHarnessEnvironment.loader>, label: string | RegExp) {
    return loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  }

  async function input(loader: ReturnType<typeof TestbedHarnessEnvironment.loader>, label: string | RegExp) {
    return (await field(loader, label)).getControl(MatInputHarness);
  }

  it('checks the form before sending, with the message under the field', async () => {
    const harness = await RouterTestingHarness.create('/customers/new');
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    await (await input(loader, 'E-mail address'))!.setValue('yard');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Add the customer' }))).click();
    expect(await (await field(loader, 'Name')).getTextErrors()).toEqual(['Enter the customer’s name.']);
    expect(await (await field(loader, 'E-mail address')).getTextErrors()).toEqual([
      'Enter an e-mail address such as name@example.com.',
    ]);
    http.expectNone('/api/v1/customers');
  });

  it('adds a customer with its contacts, shows the server’s refusal on its field, keeps what was typed', async () => {
    const harness = await RouterTestingHarness.create('/customers/new');
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    await (await input(loader, 'Name'))!.setValue('Wrenhollow Parish Council');
    await (await input(loader, 'E-mail address'))!.setValue('Clerk@Wrenhollow.example.com');
    await (await loader.getHarness(MatButtonHarness.with({ text: /Add a contact person/ }))).click();
    const contactFields = await loader.getAllHarnesses(MatFormFieldHarness.with({ ancestor: '.contact' }));
    await (await contactFields[0]!.getControl(MatInputHarness))!.setValue('Ewan Moorcroft');
    await (await contactFields[2]!.getControl(MatInputHarness))!.setValue('ewan@wrenhollow.example.com');

    const save = await loader.getHarness(MatButtonHarness.with({ selector: '[type="submit"]' }));
    const saving = save.click();
    const create = await nextRequest(http, '/api/v1/customers');
    expect(create.request.method).toBe('POST');
    expect(create.request.body).toEqual({
      name: 'Wrenhollow Parish Council',
      email: 'clerk@wrenhollow.example.com',
      phone: null,
      siteAddress: null,
      notes: null,
      contacts: [{ name: 'Ewan Moorcroft', email: 'ewan@wrenhollow.example.com' }],
    });
    harness.fixture.detectChanges();
    expect(await save.getText()).toBe('Saving…');
    expect(await save.isDisabled()).toBe(true);
    create.flush(
      {
        type: 'about:blank',
        title: 'Bad Request',
        status: 400,
        errors: [{ path: 'contacts[0].email', message: 'This address bounced last time.' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await saving;
    await harness.fixture.whenStable();
    const contactEmail = (
      await loader.getAllHarnesses(MatFormFieldHarness.with({ ancestor: '.contact' }))
    )[2]!;
    expect(await contactEmail.getTextErrors()).toEqual(['This address bounced last time.']);
    expect(await (await input(loader, 'Name'))!.getValue()).toBe('Wrenhollow Parish Council');
    expect(await save.isDisabled()).toBe(false);

    await (await contactEmail.getControl(MatInputHarness))!.setValue('clerk@wrenhollow.example.com');
    const again = save.click();
    (await nextRequest(http, '/api/v1/customers')).flush(aCustomer({ id: 8, version: 1 }), {
      status: 201,
      statusText: 'Created',
      headers: { ETag: '"1"' },
    });
    await again;
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/customers/8');
  });

  /** Opens the customer's form filled from version 3. */
  async function edit() {
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/customers/7/edit');
    (await nextRequest(http, '/api/v1/customers/7')).flush(aCustomer(), { headers: { ETag: '"3"' } });
    await navigated;
    await harness.fixture.whenStable();
    return { harness, loader: TestbedHarnessEnvironment.loader(harness.fixture) };
  }

  it('sends only the fields changed, with the version they were changed on', async () => {
    const { harness, loader } = await edit();
    expect(await (await input(loader, 'Name'))!.getValue()).toBe('Bramblecote Estate Services');
    await (await input(loader, 'Phone'))!.setValue('+44 1632 960 999');
    const saving = (await loader.getHarness(MatButtonHarness.with({ text: 'Save the changes' }))).click();
    const update = await nextRequest(http, '/api/v1/customers/7');
    expect(update.request.method).toBe('PATCH');
    expect(update.request.headers.get('If-Match')).toBe('"3"');
    expect(update.request.body).toEqual({ phone: '+44 1632 960 999' });
    update.flush(aCustomer({ version: 4, phone: '+44 1632 960 999' }), { headers: { ETag: '"4"' } });
    await saving;
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/customers/7');
  });

  it('on a change made meanwhile, takes theirs when asked: the form shows their version', async () => {
    const { harness, loader } = await edit();
    await (await input(loader, 'Phone'))!.setValue('+44 1632 960 999');
    const saving = (await loader.getHarness(MatButtonHarness.with({ text: 'Save the changes' }))).click();
    const theirs = aCustomer({ version: 4, phone: '+44 1632 960 555', notes: 'Gate code 4412' });
    (await nextRequest(http, '/api/v1/customers/7')).flush(
      {
        type: 'about:blank',
        title: 'Precondition Failed',
        status: 412,
        code: 'CHANGED_MEANWHILE',
        current: theirs,
      },
      { status: 412, statusText: 'Precondition Failed', headers: { ETag: '"4"' } },
    );
    (await nextRequest(http, '/api/v1/customers/7/history')).flush({ changes: [aChange({ version: 4 })] });
    await saving;
    const dialog = await TestbedHarnessEnvironment.documentRootLoader(harness.fixture).getHarness(
      MatDialogHarness,
    );
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Take theirs' }))).click();
    await harness.fixture.whenStable();
    expect(await (await input(loader, 'Phone'))!.getValue()).toBe('+44 1632 960 555');
    expect(await (await input(loader, 'Notes'))!.getValue()).toBe('Gate code 4412');
    expect(TestBed.inject(Router).url).toBe('/customers/7/edit');

    // A save now goes on their version.
    await (await input(loader, 'Phone'))!.setValue('+44 1632 960 777');
    const second = (await loader.getHarness(MatButtonHarness.with({ text: 'Save the changes' }))).click();
    const update = await nextRequest(http, '/api/v1/customers/7');
    expect(update.request.headers.get('If-Match')).toBe('"4"');
    expect(update.request.body).toEqual({ phone: '+44 1632 960 777' });
    update.flush(aCustomer({ version: 5 }));
    await second;
  });
});
