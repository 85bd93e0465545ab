import { Clipboard } from '@angular/cdk/clipboard';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatSelectHarness } from '@angular/material/select/testing';
import { API_KEY_HEADER, type ApiKeySummary, CALC_ROUTES } from '@counterpoise/api';
import { beforeEach, describe, expect, it } from 'vitest';
import { curlLine, QUICK_START_BODY, QuickStart } from './quick-start';

const key = (id: number, name: string, prefix: string, createdAt: string, revokedAt: string | null = null) =>
  ({
    id,
    name,
    prefix,
    limitPerMinute: 600,
    createdAt,
    lastUsedAt: null,
    revokedAt,
    allowedOrigins: [],
  }) satisfies ApiKeySummary;

const PORTAL = key(1, 'Dealer portal', 'cpk_Q2xvY2s5', '2026-05-04T08:00:00.000Z');
const LOGGER = key(2, 'Test bench logger', 'cpk_bG9nZ2Vy', '2026-05-06T10:30:00.000Z');
const OLD = key(3, 'Old spreadsheet', 'cpk_b2xkc2hl', '2026-05-10T10:30:00.000Z', '2026-05-11T10:30:00.000Z');

describe('the quick start’s command', () => {
  it('sends the single-plane calculator’s documented example', () => {
    expect(QUICK_START_BODY).toEqual(CALC_ROUTES['single-plane'].example);
  });

  it('names the key by its prefix alone, in the API’s header', () => {
    const line = curlLine('https://portal.example', PORTAL);
    expect(line).toContain(`-H '${API_KEY_HEADER}: cpk_Q2xvY2s5…'`);
    expect(line).toContain(`curl -X POST 'https://portal.example/api/v1/calc/single-plane'`);
    expect(line).toContain(JSON.stringify(CALC_ROUTES['single-plane'].example));
    expect(line).not.toContain('Origin:');
  });

  it('sends the first web origin of a key limited to some, as its pages would', () => {
    const line = curlLine('https://portal.example', {
      ...PORTAL,
      allowedOrigins: ['https://portal.ridgeline-rotor.test', 'http://localhost:4200'],
    });
    expect(line).toContain(`-H 'Origin: https://portal.ridgeline-rotor.test'`);
    expect(line).not.toContain('localhost:4200');
  });
});

describe('QuickStart', { timeout: 20_000 }, () => {
  const copied: string[] = [];

  beforeEach(() => {
    copied.length = 0;
    TestBed.configureTestingModule({
      providers: [
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
        { provide: Clipboard, useValue: { copy: (text: string) => copied.push(text) > 0 } },
      ],
    });
  });

  async function render(keys: readonly ApiKeySummary[]) {
    const fixture = TestBed.createComponent(QuickStart);
    fixture.componentRef.setInput('keys', keys);
    await fixture.whenStable();
    return {
      fixture,
      element: fixture.nativeElement as HTMLElement,
      loader: TestbedHarnessEnvironment.loader(fixture),
    };
  }

  it('offers the newest key in use, lets another be chosen, and copies its command', async () => {
    const { element, loader } = await render([PORTAL, LOGGER, OLD]);
    const select = await loader.getHarness(MatSelectHarness);
    expect(await select.getValueText()).toBe('Test bench logger (cpk_bG9nZ2Vy…)');
    await select.open();
    expect((await select.getOptions()).length).toBe(2);
    await select.clickOptions({ text: 'Dealer portal (cpk_Q2xvY2s5…)' });
    const command = element.querySelector('pre')!.textContent!;
    expect(command).toContain('X-Api-Key: cpk_Q2xvY2s5…');
    expect(command).not.toContain('cpk_bG9nZ2Vy');

    await (await loader.getHarness(MatButtonHarness.with({ text: /Copy the command/ }))).click();
    expect(copied).toEqual([command]);
    expect(element.querySelector('[role=status]')?.textContent).toContain('Copied.');
  });

  it('links the API reference, the integrators’ guide and the typed client', async () => {
    const { element } = await render([PORTAL]);
    expect([...element.querySelectorAll('a')].map((a) => [a.textContent, a.getAttribute('href')])).toEqual([
      ['API reference', '/api/docs'],
      ["Integrators' guide", '/docs/integrators/'],
      ['Typed client', '/docs/integrators/client.html'],
    ]);
  });

  it('asks for a key first when there is none in use', async () => {
    const { element } = await render([OLD]);
    expect(element.textContent).toContain('Create a key above');
    expect(element.querySelector('pre')).toBeNull();
  });
});
