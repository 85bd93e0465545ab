import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { aFamily, nextRequest, recordsTestBed } from '../records/testing';
import { MachineFamilyFormPage } from './machine-family-form-page';

describe('MachineFamilyFormPage', { timeout: 40_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = recordsTestBed([
      { path: 'machine-families/new', component: MachineFamilyFormPage },
      { path: 'machine-families/:id', component: RouteStandIn, data: { heading: 'The family' } },
    ]);
    TestBed.inject(AuthSession).start(aSession('manager'));
  });

  afterEach(() => http.verify());

  it('adds a family: one radius per plane, common-practice limits, grade G16 and a typed figure', async () => {
    const harness = await RouterTestingHarness.create('/machine-families/new');
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    const input = async (label: string | RegExp) =>
      (await (
        await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }))
      ).getControl(MatInputHarness))!;
    await (await input('Name')).setValue('Kestrel FL-180 flail mowers');
    const rotorType = await loader.getHarness(
      MatSelectHarness.with({ selector: '[formControlName="rotorType"]' }),
    );
    await rotorType.open();
    await rotorType.clickOptions({ text: 'Flail rotor' });
    await (await input('Nominal speed')).setValue('2400');
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: /One/ }))).check();
    const radii = await loader.getAllHarnesses(
      MatFormFieldHarness.with({ floatingLabelText: /correction radius/ }),
    );
    expect(radii).toHaveLength(1);
    await (await radii[0]!.getControl(MatInputHarness))!.setValue('180');
    await (await loader.getHarness(MatButtonHarness.with({ text: /Add a sensitivity/ }))).click();
    await (await input('Grams per unit')).setValue('95');
    await (await input('Phase lag')).setValue('20');

    const saving = (await loader.getHarness(MatButtonHarness.with({ text: 'Add the family' }))).click();
    const create = await nextRequest(http, '/api/v1/machine-families');
    expect(create.request.method).toBe('POST');
    expect(create.request.body).toEqual({
      name: 'Kestrel FL-180 flail mowers',
      rotorType: 'flail',
      nominalSpeedRpm: 2400,
      planeCount: 1,
      correctionRadiiMm: [180],
      inspectionLimits: { bearingEndPlayMm: 3.18, shaftRunoutMm: 0.36 },
      acceptance: { kind: 'balance-grade', grade: 'G16' },
      sensitivities: [
        {
          sensorSide: 'left',
          planeIndex: 0,
          gramsPerUnit: 95,
          unit: 'in/s-pk',
          phaseLagDeg: 20,
          jobCount: 0,
          spread: null,
        },
      ],
      notes: null,
    });
    create.flush(aFamily({ id: 5, version: 1 }), { status: 201, statusText: 'Created' });
    await saving;
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/machine-families/5');
  });

  it('asks for the speed and a radius per plane before sending', async () => {
    const harness = await RouterTestingHarness.create('/machine-families/new');
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Add the family' }))).click();
    const errors = async (label: string | RegExp) =>
      (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }))).getTextErrors();
    expect(await errors('Name')).toEqual(['Name the machine family.']);
    expect(await errors('Nominal speed')).toEqual(['Enter the speed in rpm.']);
    expect(await errors('Left plane: correction radius')).toEqual(['Enter the correction radius in mm.']);
    http.expectNone('/api/v1/machine-families');
  });
});
