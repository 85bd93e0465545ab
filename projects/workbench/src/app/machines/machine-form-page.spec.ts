import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { CpCorrectionOverlayHarness } from '@counterpoise/ng/correction-overlay/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { aCustomer, aFamily, aMachine, aPage, nextRequest, recordsTestBed } from '../records/testing';
import { MachineFormPage } from './machine-form-page';

describe('MachineFormPage', { timeout: 40_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = recordsTestBed([
      { path: 'machines/new', component: MachineFormPage },
      { path: 'machines/:id/edit', component: MachineFormPage },
      { path: 'machines/:id', component: RouteStandIn, data: { heading: 'The machine' } },
    ]);
    TestBed.inject(AuthSession).start(aSession('technician'));
  });

  afterEach(() => http.verify());

  /** Opens the form to add a machine for customer 7, with one family on offer. */
  async function addForCustomer() {
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/machines/new?customerId=7');
    (await nextRequest(http, (r) => r.url === '/api/v1/machine-families')).flush(aPage([aFamily()]));
    (await nextRequest(http, '/api/v1/customers/7')).flush(aCustomer(), { headers: { ETag: '"3"' } });
    await navigated;
    await harness.fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    const input = async (label: string | RegExp) =>
      (await (
        await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }))
      ).getControl(MatInputHarness))!;
    return { harness, loader, input };
  }

  it('starts with the customer it was opened for, and says what the far end sees', async () => {
    const { input, loader, harness } = await addForCustomer();
    expect(await (await input(/^Customer/)).getValue()).toBe('Bramblecote Estate Services');
    const element = harness.routeNativeElement as HTMLElement;
    expect(element.textContent).toContain('Seen from the right end it turns counter-clockwise.');
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: /Counter-clockwise/ }))).check();
    expect(element.textContent).toContain('Seen from the right end it turns clockwise.');
    const [left, right] = await loader.getAllHarnesses(CpCorrectionOverlayHarness);
    expect(await left!.getDescription()).toContain('turning counter-clockwise');
    expect(await right!.getDescription()).toContain('turning clockwise');
  });

  it('fills in planes, radii, speed and acceptance from the family chosen, with a way back', async () => {
    const { input, loader, harness } = await addForCustomer();
    await (await input('Operating speed')).setValue('1900');
    const family = await loader.getHarness(
      MatSelectHarness.with({ selector: '[formControlName="familyId"]' }),
    );
    await family.open();
    await family.clickOptions({ text: 'Thornmill FM-225 mulcher heads' });
    expect(await (await input('Operating speed')).getValue()).toBe('2200');
    const radii = await loader.getAllHarnesses(MatInputHarness.with({ selector: '[id$="-radius"]' }));
    expect(await Promise.all(radii.map((radius) => radius.getValue()))).toEqual(['240', '240']);
    const acceptance = await loader.getHarness(
      MatSelectHarness.with({ selector: '[formControlName="kind"]' }),
    );
    expect(await acceptance.getValueText()).toBe('The family’s: Shop target 0.12 in/s peak');
    const planeCount = await loader.getHarness(MatButtonToggleHarness.with({ text: /One/ }));
    expect(await planeCount.isDisabled()).toBe(true);

    const overlays = TestbedHarnessEnvironment.documentRootLoader(harness.fixture);
    const snackBar = await overlays.getHarness(MatSnackBarHarness);
    expect(await snackBar.getMessage()).toBe(
      'Filled in from Thornmill FM-225 mulcher heads: planes, radii, speed and acceptance.',
    );
    await snackBar.dismissWithAction();
    expect(await (await input('Operating speed')).getValue()).toBe('1900');
    expect(await family.getValueText()).toBe('');
    expect(await planeCount.isDisabled()).toBe(false);
  });

  it('adds the machine with its planes as drawn, then opens its page', async () => {
    const { input, loader, harness } = await addForCustomer();
    await (await input('Serial number')).setValue('TM225-0502');
    await (await input('Make')).setValue('Thornmill');
    const [left] = await loader.getAllHarnesses(CpCorrectionOverlayHarness);
    await left!.moveCrosshair(15);
    await left!.markWithKeyboard();
    await (await loader.getHarness(MatButtonHarness.with({ selector: '#plane-0-set-first' }))).click();
    for (const radius of await loader.getAllHarnesses(
      MatInputHarness.with({ selector: '[id$="-radius"]' }),
    )) {
      await radius.setValue('240');
    }

    const saving = (await loader.getHarness(MatButtonHarness.with({ text: 'Add the machine' }))).click();
    const create = await nextRequest(http, '/api/v1/machines');
    expect(create.request.method).toBe('POST');
    expect(create.request.body).toEqual({
      customerId: 7,
      familyId: null,
      make: 'Thornmill',
      model: null,
      serialNumber: 'TM225-0502',
      hours: null,
      rotorMassKg: null,
      operatingSpeedRpm: null,
      sensorSides: ['left', 'right'],
      rotationSeenFromLeft: 'clockwise',
      planes: [
        { correctionRadiusMm: 240, positions: { count: 12, firstDeg: 15 }, blockedSectors: [] },
        { correctionRadiusMm: 240, positions: null, blockedSectors: [] },
      ],
      stockWeightsGrams: [],
      acceptance: null,
      notes: null,
    });
    create.flush(aMachine({ id: 13, version: 1 }), {
      status: 201,
      statusText: 'Created',
      headers: { ETag: '"1"' },
    });
    await saving;
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/machines/13');
  });

  it('shows the server’s refusal of a plane’s field on that field', async () => {
    const { input, loader, harness } = await addForCustomer();
    for (const radius of await loader.getAllHarnesses(
      MatInputHarness.with({ selector: '[id$="-radius"]' }),
    )) {
      await radius.setValue('240');
    }
    await (await input('Serial number')).setValue('TM225-0502');
    const saving = (await loader.getHarness(MatButtonHarness.with({ text: 'Add the machine' }))).click();
    (await nextRequest(http, '/api/v1/machines')).flush(
      {
        type: 'about:blank',
        title: 'Bad Request',
        status: 400,
        errors: [{ path: 'planes[1].correctionRadiusMm', message: 'The right plane needs its own radius.' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await saving;
    await harness.fixture.whenStable();
    const field = await loader.getHarness(
      MatFormFieldHarness.with({
        ancestor: 'app-plane-editor:nth-of-type(2)',
        floatingLabelText: 'Correction radius',
      }),
    );
    expect(await field.getTextErrors()).toEqual(['The right plane needs its own radius.']);
    expect(await (await input('Serial number')).getValue()).toBe('TM225-0502');
  });

  it('fills the form from the machine when editing it', async () => {
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/machines/12/edit');
    (await nextRequest(http, (r) => r.url === '/api/v1/machine-families')).flush(aPage([aFamily()]));
    (await nextRequest(http, '/api/v1/machines/12')).flush(aMachine(), { headers: { ETag: '"5"' } });
    await navigated;
    await harness.fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    const [left] = await loader.getAllHarnesses(CpCorrectionOverlayHarness);
    expect(await left!.getDescription()).toContain('Blocked: holder 350 to 10 degrees.');
    const sectorLabel = await loader.getHarness(
      MatInputHarness.with({ selector: '#plane-0-sector-0-label' }),
    );
    await sectorLabel.setValue('tooth holder');
    const saving = (await loader.getHarness(MatButtonHarness.with({ text: 'Save the changes' }))).click();
    const update = await nextRequest(http, '/api/v1/machines/12');
    expect(update.request.method).toBe('PATCH');
    expect(update.request.headers.get('If-Match')).toBe('"5"');
    expect(Object.keys(update.request.body as object)).toEqual(['planes']);
    update.flush(aMachine({ version: 6 }));
    await saving;
  });
});
