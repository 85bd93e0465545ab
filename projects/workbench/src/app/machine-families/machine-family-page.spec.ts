import { type HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { RouterTestingHarness } from '@angular/router/testing';
import type { Role } from '@counterpoise/api';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { aChange, aFamily, nextRequest, recordsTestBed } from '../records/testing';
import { MachineFamilyPage } from './machine-family-page';

describe('MachineFamilyPage', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = recordsTestBed([
      { path: 'machine-families/:id', component: MachineFamilyPage },
      { path: '**', component: RouteStandIn, data: { heading: 'Elsewhere' } },
    ]);
  });

  afterEach(() => http.verify());

  async function open(role: Role) {
    TestBed.inject(AuthSession).start(aSession(role));
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/machine-families/4');
    (await nextRequest(http, '/api/v1/machine-families/4')).flush(aFamily(), { headers: { ETag: '"2"' } });
    (await nextRequest(http, '/api/v1/machine-families/4/history')).flush({
      changes: [
        aChange({
          version: 2,
          fields: [
            {
              field: 'acceptance',
              before: { kind: 'balance-grade', grade: 'G16' },
              after: { kind: 'shop-target', amplitude: 0.12, unit: 'in/s-pk' },
            },
          ],
        }),
      ],
    });
    await navigated;
    await harness.fixture.whenStable();
    const element = harness.routeNativeElement as HTMLElement;
    const actions = [...element.querySelectorAll('.header .actions > *')].map((action) =>
      action.textContent?.trim(),
    );
    return { element, actions };
  }

  it('shows the family’s figures, its stored sensitivities with what stands behind them, and its history', async () => {
    const { element } = await open('technician');
    const text = element.textContent?.replace(/\s+/g, ' ') ?? '';
    expect(text).toContain('Fixed-tooth drum');
    expect(text).toContain('2,200 rpm');
    expect(text).toContain('Left plane: radius 240 mm');
    expect(text).toContain('Bearing end play 3.18 mm');
    expect(text).toContain('Shop target 0.12 in/s peak');
    expect(text).toContain('Left sensor · Left plane');
    expect(text).toContain('410 g per in/s peak, phase lag 35°');
    expect(text).toContain('From 5 jobs, spread ±8 % in mass and ±12° in phase.');
    expect(text).toContain(
      'Dagny Fairbrook changed the acceptance level from Balance grade G16 (ISO 21940-11) to Shop target 0.12 in/s peak.',
    );
    expect(element.querySelector('a[href="/machines?familyId=4"]')?.textContent?.trim()).toBe(
      '3 machines in use',
    );
  });

  it('lets an owner or manager edit and archive families, and a technician only read them', async () => {
    expect((await open('technician')).actions).toEqual([]);
  });

  it('offers a manager both', async () => {
    expect((await open('manager')).actions).toEqual(['Edit', 'Archive']);
  });
});
