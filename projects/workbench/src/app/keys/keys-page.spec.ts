import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import { Clipboard } from '@angular/cdk/clipboard';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import type { ApiKeySummary } from '@counterpoise/api';
import { BehaviorSubject, map } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { ApiKeyList, CreatedApiKey } from '../auth/api-types';
import { AuthSession } from '../auth/auth-session';
import { aSession } from '../auth/testing';
import { KeysPage } from './keys-page';
import { KEYS_URLS } from './keys.api';
import { settle } from '../shell/testing';
import { nextRequest } from '../records/testing';
import { emptyUsage } from './keys-testing';

const PORTAL: ApiKeySummary = {
  id: 1,
  name: 'Dealer portal',
  prefix: 'cpk_Q2xvY2s5',
  limitPerMinute: 600,
  createdAt: '2026-05-04T08:00:00.000Z',
  lastUsedAt: '2026-05-04T09:12:30.250Z',
  revokedAt: null,
  allowedOrigins: ['https://portal.ridgeline-rotor.test'],
};
const LOGGER: ApiKeySummary = {
  id: 2,
  name: 'Test bench logger',
  prefix: 'cpk_bG9nZ2Vy',
  limitPerMinute: 60,
  createdAt: '2026-05-06T10:30:00.000Z',
  lastUsedAt: null,
  revokedAt: null,
  allowedOrigins: [],
};
const OLD: ApiKeySummary = {
  id: 3,
  name: 'Old spreadsheet',
  prefix: 'cpk_b2xkc2hl',
  limitPerMinute: 60,
  createdAt: '2026-01-10T10:30:00.000Z',
  lastUsedAt: '2026-02-01T10:30:00.000Z',
  revokedAt: '2026-02-02T10:30:00.000Z',
  allowedOrigins: [],
};
const LIST: ApiKeyList = { keys: [OLD, PORTAL, LOGGER] };
const WHOLE_KEY = 'cpk_bmV3LWtleS1mb3ItdGhlLWZpZWxkLXRhYmxldC0wMDE';

// Dialogs and their harnesses take jsdom seconds; the default of five per test is too tight.
describe('KeysPage', { timeout: 20_000 }, () => {
  let http: HttpTestingController;
  const wide = new BehaviorSubject(true);
  const copied: string[] = [];
  let clipboardWorks = true;

  beforeEach(() => {
    wide.next(true);
    copied.length = 0;
    clipboardWorks = true;
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
        {
          provide: BreakpointObserver,
          useValue: {
            observe: () => wide.pipe(map((matches): BreakpointState => ({ matches, breakpoints: {} }))),
          },
        },
        {
          provide: Clipboard,
          useValue: { copy: (text: string) => clipboardWorks && copied.push(text) > 0 },
        },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    TestBed.inject(AuthSession).start(aSession('developer'));
  });

  afterEach(() => http.verify());

  /** The page with its list answered, and its usage (the last 30 days by day) answered empty. */
  async function render(list: ApiKeyList = LIST) {
    const fixture = TestBed.createComponent(KeysPage);
    fixture.detectChanges();
    http.expectOne(KEYS_URLS.list).flush(list);
    // The usage is asked for once the keys are there.
    fixture.detectChanges();
    const usage = await nextRequest(http, (request) => request.url === KEYS_URLS.usage);
    usage.flush(emptyUsage(usage.request.params.get('from')!, usage.request.params.get('to')!));
    await fixture.whenStable();
    return {
      fixture,
      element: fixture.nativeElement as HTMLElement,
      loader: TestbedHarnessEnvironment.loader(fixture),
      overlays: TestbedHarnessEnvironment.documentRootLoader(fixture),
    };
  }

  function buttonByText(text: string): HTMLButtonElement | undefined {
    return [...document.querySelectorAll<HTMLButtonElement>('.cdk-overlay-container button')].find(
      (button) => button.textContent?.trim() === text,
    );
  }

  async function createKey(overlays: HarnessLoader, name: string, limit = '') {
    const dialog = await overlays.getHarness(MatDialogHarness);
    await (
      await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName=name]' }))
    ).setValue(name);
    await (
      await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName=limitPerMinute]' }))
    ).setValue(limit);
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Create the key' }))).click();
    return dialog;
  }

  it('lists the keys in use, newest first, then the revoked ones, with all their details', async () => {
    const { loader } = await render();
    const table = await loader.getHarness(MatTableHarness);
    const cells = await table.getCellTextByColumnName();
    expect(cells['name']?.text).toEqual([
      'Test bench logger From any origin',
      'Dealer portal Only from https://portal.ridgeline-rotor.test',
      'Old spreadsheet From any origin',
    ]);
    expect(cells['prefix']?.text).toEqual(['cpk_bG9nZ2Vy…', 'cpk_Q2xvY2s5…', 'cpk_b2xkc2hl…']);
    expect(cells['lastUsedAt']?.text[0]).toBe('Never');
    expect(cells['limitPerMinute']?.text).toEqual(['60/min', '600/min', '60/min']);
    expect(cells['actions']?.text).toEqual(['Origins  Revoke', 'Origins  Revoke', 'Revoked 2 Feb 2026']);
  });

  it('stacks the details of each key on a phone', async () => {
    wide.next(false);
    const { loader } = await render({ keys: [PORTAL] });
    const cells = await (await loader.getHarness(MatTableHarness)).getCellTextByColumnName();
    expect(cells['summary']?.text[0]).toContain('Dealer portal');
    expect(cells['summary']?.text[0]).toContain('600 calculations a minute');
    expect(cells['summary']?.text[0]).toMatch(/Web origins\s*https:\/\/portal\.ridgeline-rotor\.test/);
  });

  it('says when there are no keys yet', async () => {
    const { element } = await render({ keys: [] });
    expect(element.textContent).toContain('No keys yet.');
  });

  it('creates a key and shows it once, with a copy button, until the person says it is kept', async () => {
    const { loader, overlays, fixture } = await render();
    await (await loader.getHarness(MatButtonHarness.with({ text: /Create a key/ }))).click();
    const dialog = await createKey(overlays, 'Field tablet', '120');

    const request = http.expectOne(KEYS_URLS.list);
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ name: 'Field tablet', limitPerMinute: 120 });
    const created: CreatedApiKey = {
      key: WHOLE_KEY,
      summary: {
        ...LOGGER,
        id: 4,
        name: 'Field tablet',
        limitPerMinute: 120,
        prefix: WHOLE_KEY.slice(0, 12),
      },
    };
    request.flush(created, { status: 201, statusText: 'Created' });
    await fixture.whenStable();

    expect(await dialog.getTitleText()).toBe('Your new key');
    // The submit button went with the form: the focus is on the next step.
    expect(document.activeElement?.textContent).toContain('Copy the key');
    // The dialog places the focus itself once its opening ends, which can come after a quick answer: its
    // initial element is the same step, not the key's text box. (The focus trap finds no visible element
    // without a layout; tests/browser/portal.spec.ts sees the focus in Chromium.)
    const container = document.querySelector<HTMLElement>('mat-dialog-container')!;
    expect(container.querySelector('[cdkFocusInitial]')?.textContent).toContain('Copy the key');
    expect(await (await dialog.getHarness(MatInputHarness)).getValue()).toBe(WHOLE_KEY);
    await (await dialog.getHarness(MatButtonHarness.with({ text: /Copy the key/ }))).click();
    expect(copied).toEqual([WHOLE_KEY]);
    expect(await dialog.getText()).toContain('Copied.');

    // Escape does not close it: the key would be lost.
    await (await dialog.host()).dispatchEvent('keydown', { key: 'Escape', keyCode: 27 });
    await settle(fixture);
    expect(await overlays.getAllHarnesses(MatDialogHarness)).toHaveLength(1);

    // Clicked without a harness: a harness would wait for the page to settle, which the reload of the list
    // it sets off prevents until the test answers it.
    buttonByText('I have kept the key')?.click();
    await settle(fixture);
    http.expectOne(KEYS_URLS.list).flush(LIST);
    expect(await overlays.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
  });

  it('says how to copy the key by hand when the clipboard refuses', async () => {
    clipboardWorks = false;
    const { loader, overlays, fixture } = await render();
    await (await loader.getHarness(MatButtonHarness.with({ text: /Create a key/ }))).click();
    const dialog = await createKey(overlays, 'Field tablet');
    const request = http.expectOne(KEYS_URLS.list);
    // An empty limit leaves the server's default.
    expect(request.request.body).toEqual({ name: 'Field tablet' });
    request.flush({ key: WHOLE_KEY, summary: LOGGER }, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    await (await dialog.getHarness(MatButtonHarness.with({ text: /Copy the key/ }))).click();
    expect(await dialog.getText()).toContain('select it above and copy it by hand');
  });

  it('checks the name and the limit before asking the server, and shows the server’s messages too', async () => {
    const { loader, overlays, fixture } = await render();
    await (await loader.getHarness(MatButtonHarness.with({ text: /Create a key/ }))).click();
    let dialog = await createKey(overlays, ' ', '0');
    let [name, limit] = await dialog.getAllHarnesses(MatFormFieldHarness);
    expect(await name?.getTextErrors()).toEqual(['Give the key a name that says who or what uses it.']);
    expect(await limit?.getTextErrors()).toEqual(['The limit is at least 1 calculation per minute.']);
    http.expectNone(KEYS_URLS.list);

    dialog = await createKey(overlays, 'Dealer portal', '60');
    http.expectOne(KEYS_URLS.list).flush(
      {
        type: 'about:blank',
        title: 'Conflict',
        status: 409,
        errors: [{ path: 'name', message: 'A key in use already has this name.' }],
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    [name, limit] = await dialog.getAllHarnesses(MatFormFieldHarness);
    expect(await name?.getTextErrors()).toEqual(['A key in use already has this name.']);
    expect(await limit?.getTextErrors()).toEqual([]);
  });

  it('revokes a key only after a confirmation', async () => {
    const { loader, overlays, fixture } = await render();
    const revoke = await loader.getHarness(
      MatButtonHarness.with({ selector: '[aria-label="Revoke the key Dealer portal"]' }),
    );
    await revoke.click();
    let dialog = await overlays.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Revoke the key “Dealer portal”?');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    await settle(fixture);
    http.expectNone(KEYS_URLS.key(1));

    await revoke.click();
    dialog = await overlays.getHarness(MatDialogHarness);
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Revoke the key' }))).click();
    await settle(fixture);
    const request = http.expectOne(KEYS_URLS.key(1));
    expect(request.request.method).toBe('DELETE');
    request.flush(null, { status: 204, statusText: 'No Content' });
    await settle(fixture);
    http.expectOne(KEYS_URLS.list).flush({ keys: [{ ...PORTAL, revokedAt: '2026-05-07T08:00:00.000Z' }] });
    // The revoke button went with the key; the focus waits on the way to create another.
    expect(document.activeElement?.textContent).toContain('Create a key');
  });

  it('says when the keys cannot be fetched', async () => {
    const fixture = TestBed.createComponent(KeysPage);
    fixture.detectChanges();
    http
      .expectOne(KEYS_URLS.list)
      .flush(
        { type: 'about:blank', title: 'Forbidden', status: 403 },
        { status: 403, statusText: 'Forbidden' },
      );
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).querySelector('[role=alert]')?.textContent).toContain(
      'Your role does not allow this.',
    );
  });

  it('creates a key limited to web origins, checking each with the contract’s rule', async () => {
    const { loader, overlays, fixture } = await render();
    await (await loader.getHarness(MatButtonHarness.with({ text: /Create a key/ }))).click();
    const dialog = await overlays.getHarness(MatDialogHarness);
    await (
      await dialog.getHarness(MatInputHarness.with({ selector: '[formControlName=name]' }))
    ).setValue('Dealer portal page');
    const origins = await dialog.getHarness(
      MatInputHarness.with({ selector: '[formControlName=allowedOrigins]' }),
    );
    await origins.setValue('http://portal.ridgeline-rotor.test');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Create the key' }))).click();
    const field = await dialog.getHarness(
      MatFormFieldHarness.with({ floatingLabelText: /Allowed web origins/ }),
    );
    expect((await field.getTextErrors())[0]).toMatch(/uses http:.*use https:/);
    http.expectNone(KEYS_URLS.list);

    await origins.setValue('https://portal.ridgeline-rotor.test/\nhttp://localhost:4200');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Create the key' }))).click();
    const request = http.expectOne(KEYS_URLS.list);
    expect(request.request.body).toEqual({
      name: 'Dealer portal page',
      allowedOrigins: ['https://portal.ridgeline-rotor.test/', 'http://localhost:4200'],
    });
    request.flush(
      {
        key: WHOLE_KEY,
        summary: {
          ...LOGGER,
          id: 5,
          allowedOrigins: ['https://portal.ridgeline-rotor.test', 'http://localhost:4200'],
        },
      } satisfies CreatedApiKey,
      { status: 201, statusText: 'Created' },
    );
    await fixture.whenStable();
    expect(await dialog.getTitleText()).toBe('Your new key');
    // Clicked without a harness, which would wait for the list's reload it starts.
    buttonByText('I have kept the key')!.click();
    await settle(fixture);
    http.expectOne(KEYS_URLS.list).flush(LIST);
  });

  it('changes a key’s web origins, the whole list at once', async () => {
    const { loader, overlays, fixture } = await render();
    await (
      await loader.getHarness(
        MatButtonHarness.with({ selector: '[aria-label="Change the web origins of the key Dealer portal"]' }),
      )
    ).click();
    const dialog = await overlays.getHarness(MatDialogHarness);
    expect(await dialog.getTitleText()).toBe('Web origins of “Dealer portal”');
    const origins = await dialog.getHarness(MatInputHarness);
    expect(await origins.getValue()).toBe('https://portal.ridgeline-rotor.test');
    await origins.setValue('https://portal.ridgeline-rotor.test\nhttps://staging.ridgeline-rotor.test');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Save the origins' }))).click();
    const request = http.expectOne(KEYS_URLS.origins(1));
    expect(request.request.method).toBe('PUT');
    expect(request.request.body).toEqual({
      allowedOrigins: ['https://portal.ridgeline-rotor.test', 'https://staging.ridgeline-rotor.test'],
    });
    const changed = { ...PORTAL, allowedOrigins: request.request.body.allowedOrigins };
    request.flush(changed);
    await settle(fixture);
    http.expectOne(KEYS_URLS.list).flush({ keys: [changed, LOGGER] });
    await fixture.whenStable();
    const cells = await (await loader.getHarness(MatTableHarness)).getCellTextByColumnName();
    expect(cells['name']?.text[1]).toContain('https://staging.ridgeline-rotor.test');
  });
});
