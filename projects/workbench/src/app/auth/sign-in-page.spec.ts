import type { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AUTH_URLS, AuthSession } from './auth-session';
import { SignInPage } from './sign-in-page';
import { aSession, RouteStandIn } from './testing';
import { routedPageTestBed } from '../shell/testing';

describe('SignInPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = routedPageTestBed([
      { path: 'sign-in', component: SignInPage },
      { path: '**', component: RouteStandIn, data: { heading: 'Elsewhere' } },
    ]);
  });

  afterEach(() => http.verify());

  async function open(url = '/sign-in') {
    const harness = await RouterTestingHarness.create(url);
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    const element = harness.routeNativeElement as HTMLElement;
    const email = await loader.getHarness(MatInputHarness.with({ selector: '[type=email]' }));
    const password = await loader.getHarness(
      MatInputHarness.with({ selector: '[autocomplete=current-password]' }),
    );
    const submit = await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }));
    const fields = await loader.getAllHarnesses(MatFormFieldHarness);
    return { harness, loader, element, email, password, submit, fields };
  }

  it('says what is missing on each field and sends nothing', async () => {
    const { submit, fields, harness } = await open();
    await submit.click();
    await harness.fixture.whenStable();
    expect(await fields[0]?.getTextErrors()).toEqual(['Enter your e-mail address.']);
    expect(await fields[1]?.getTextErrors()).toEqual(['Enter your password.']);
    http.expectNone(AUTH_URLS.signIn);
  });

  it('signs in and goes back to the page the person asked for', async () => {
    const { email, password, submit, harness } = await open('/sign-in?returnUrl=%2Fpeople%3Ffilter%3Dtech');
    await email.setValue('Marit@Example.com ');
    await password.setValue('a long walk to the far gate');
    await submit.click();

    const request = http.expectOne(AUTH_URLS.signIn);
    expect(request.request.body).toEqual({
      email: 'Marit@Example.com',
      password: 'a long walk to the far gate',
    });
    request.flush(aSession('owner'));
    await harness.fixture.whenStable();

    expect(TestBed.inject(Router).url).toBe('/people?filter=tech');
    expect(TestBed.inject(AuthSession).user()?.name).toBe('Marit Okafor');
  });

  it('goes to the start page when the address to return to would leave the workbench', async () => {
    const { email, password, submit, harness } = await open(
      '/sign-in?returnUrl=' + encodeURIComponent('//elsewhere.example.com/'),
    );
    await email.setValue('marit@example.com');
    await password.setValue('a long walk to the far gate');
    await submit.click();
    http.expectOne(AUTH_URLS.signIn).flush(aSession('owner'));
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/');
  });

  it('says when the address and password do not match, and keeps both', async () => {
    const { email, password, submit, element, harness } = await open();
    await email.setValue('marit@example.com');
    await password.setValue('not quite the right one');
    await submit.click();
    http
      .expectOne(AUTH_URLS.signIn)
      .flush(
        { type: 'about:blank', title: 'Unauthorized', status: 401 },
        { status: 401, statusText: 'Unauthorized' },
      );
    await harness.fixture.whenStable();

    expect(element.querySelector('[role=alert]')?.textContent).toContain(
      'This e-mail address and password do not match an account',
    );
    expect(await email.getValue()).toBe('marit@example.com');
    expect(await password.getValue()).toBe('not quite the right one');
    expect(TestBed.inject(AuthSession).signedIn()).toBe(false);
  });

  it('says how long to wait after too many attempts', async () => {
    const { email, password, submit, element, harness } = await open();
    await email.setValue('marit@example.com');
    await password.setValue('not quite the right one');
    await submit.click();
    http
      .expectOne(AUTH_URLS.signIn)
      .flush(
        { type: 'about:blank', title: 'Too Many Requests', status: 429, code: 'SIGN_IN_THROTTLED' },
        { status: 429, statusText: 'Too Many Requests', headers: { 'Retry-After': '8' } },
      );
    await harness.fixture.whenStable();
    expect(element.querySelector('[role=alert]')?.textContent).toContain('Wait 8 seconds, then try again.');
  });

  it.each([
    [
      'CLIENT_THROTTLED',
      429,
      { 'Retry-After': '600' },
      'Too many failed sign-ins from this network. Wait 10 minutes',
    ],
    ['PASSWORD_CHECKS_BUSY', 429, { 'Retry-After': '1' }, 'The server is checking many sign-ins just now.'],
    ['CROSS_SITE_REQUEST', 403, {}, 'sent from another site’s page and was refused'],
    ['ACCOUNT_DEACTIVATED', 403, {}, 'This account is deactivated.'],
  ] as const)('tells a %s refusal apart by its code', async (code, status, headers, expected) => {
    const { email, password, submit, element, harness } = await open();
    await email.setValue('marit@example.com');
    await password.setValue('not quite the right one');
    await submit.click();
    http
      .expectOne(AUTH_URLS.signIn)
      .flush(
        { type: 'about:blank', title: 'Refused', status, code },
        { status, statusText: 'Refused', headers },
      );
    await harness.fixture.whenStable();
    expect(element.querySelector('[role=alert]')?.textContent).toContain(expected);
  });

  it('shows the server’s message on the field it concerns', async () => {
    const { email, password, submit, fields, harness } = await open();
    await email.setValue('marit@example.com');
    await password.setValue('secret words');
    await submit.click();
    http.expectOne(AUTH_URLS.signIn).flush(
      {
        type: 'about:blank',
        title: 'Bad Request',
        status: 400,
        errors: [{ path: 'email', message: 'This address belongs to a deactivated account.' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await harness.fixture.whenStable();
    expect(await fields[0]?.getTextErrors()).toEqual(['This address belongs to a deactivated account.']);
  });

  it('tells the person why they are here when their session ended', async () => {
    const { element } = await open('/sign-in?returnUrl=%2Fpeople&ended=1');
    expect(element.querySelector('[role=status]')?.textContent).toContain('Your session has ended');
  });

  it('reads the password back on request', async () => {
    const { loader, password, harness } = await open();
    expect(await password.getType()).toBe('password');
    const toggle = await loader.getHarness(
      MatButtonHarness.with({ selector: '[aria-label="Show the password"]' }),
    );
    await toggle.click();
    await harness.fixture.whenStable();
    expect(await password.getType()).toBe('text');
    expect(await (await toggle.host()).getAttribute('aria-pressed')).toBe('true');
    expect(await (await toggle.host()).getAttribute('aria-label')).toBe('Hide the password');
  });
});
