import type { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AcceptInvitationPage } from './accept-invitation-page';
import type { InvitationPreview } from './api-types';
import { AuthSession } from './auth-session';
import { aSession, RouteStandIn } from './testing';
import { routedPageTestBed } from '../shell/testing';

const PREVIEW: InvitationPreview = {
  email: 'suvi@example.com',
  role: 'technician',
  organisationName: 'Alder Ridge Rotor Service',
  expiresAt: '2026-06-01T12:00:00.000Z',
};

describe('AcceptInvitationPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = routedPageTestBed([
      { path: 'accept-invitation', component: AcceptInvitationPage },
      { path: '', component: RouteStandIn, data: { heading: 'Start' } },
    ]);
  });

  afterEach(() => http.verify());

  async function open(url = '/accept-invitation?token=inv-42') {
    const harness = await RouterTestingHarness.create(url);
    return {
      harness,
      loader: TestbedHarnessEnvironment.loader(harness.fixture),
      element: () => harness.routeNativeElement as HTMLElement,
    };
  }

  it('shows who invites the person, to what and as what, before they commit', async () => {
    const { harness, element } = await open();
    expect(element().textContent).toContain('Looking up your invitation');
    http.expectOne('/api/v1/invitations/inv-42').flush(PREVIEW);
    await harness.fixture.whenStable();
    const text = element().textContent ?? '';
    expect(text).toContain('You are invited to Alder Ridge Rotor Service as technician.');
    expect(text).toContain('Does the balancing jobs');
    expect(text).toContain('suvi@example.com');
  });

  it('sets the name and password, signs the person in and opens the start page', async () => {
    const { harness, loader } = await open();
    http.expectOne('/api/v1/invitations/inv-42').flush(PREVIEW);
    await harness.fixture.whenStable();
    await (
      await loader.getHarness(MatInputHarness.with({ selector: '[formControlName=name]' }))
    ).setValue(' Suvi Achterberg ');
    await (
      await loader.getHarness(MatInputHarness.with({ selector: '[autocomplete=new-password]' }))
    ).setValue('the kettle sings at dawn');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Join and sign in' }))).click();

    const request = http.expectOne('/api/v1/invitations/inv-42/accept');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ name: 'Suvi Achterberg', password: 'the kettle sings at dawn' });
    request.flush(aSession('technician'));
    await harness.fixture.whenStable();

    expect(TestBed.inject(AuthSession).user()?.name).toBe('Suvi Achterberg');
    expect(TestBed.inject(Router).url).toBe('/');
  });

  it('asks for a name and a long enough password before sending', async () => {
    const { harness, loader } = await open();
    http.expectOne('/api/v1/invitations/inv-42').flush(PREVIEW);
    await harness.fixture.whenStable();
    await (
      await loader.getHarness(MatInputHarness.with({ selector: '[autocomplete=new-password]' }))
    ).setValue('short');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Join and sign in' }))).click();
    await harness.fixture.whenStable();
    const [name, password] = await loader.getAllHarnesses(MatFormFieldHarness);
    expect(await name?.getTextErrors()).toEqual(['Enter your name.']);
    expect((await password?.getTextErrors())?.[0]).toContain('Use at least 15 characters');
    http.expectNone('/api/v1/invitations/inv-42/accept');
  });

  it('explains an invitation that can no longer be used', async () => {
    const { harness, element } = await open();
    http
      .expectOne('/api/v1/invitations/inv-42')
      .flush({ type: 'about:blank', title: 'Gone', status: 410 }, { status: 410, statusText: 'Gone' });
    await harness.fixture.whenStable();
    expect(element().querySelector('[role=alert]')?.textContent).toContain(
      'This invitation can no longer be used',
    );
    expect(element().querySelector('form')).toBeNull();
  });

  it('shows the server’s messages on the fields and keeps what was typed', async () => {
    const { harness, loader } = await open();
    http.expectOne('/api/v1/invitations/inv-42').flush(PREVIEW);
    await harness.fixture.whenStable();
    const password = await loader.getHarness(
      MatInputHarness.with({ selector: '[autocomplete=new-password]' }),
    );
    await (
      await loader.getHarness(MatInputHarness.with({ selector: '[formControlName=name]' }))
    ).setValue('Suvi');
    await password.setValue('password password password');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Join and sign in' }))).click();
    http.expectOne('/api/v1/invitations/inv-42/accept').flush(
      {
        type: 'about:blank',
        title: 'Bad Request',
        status: 400,
        errors: [{ path: '/password', message: 'This password is among the most used; choose another.' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await harness.fixture.whenStable();
    const fields = await loader.getAllHarnesses(MatFormFieldHarness);
    expect(await fields[1]?.getTextErrors()).toEqual([
      'This password is among the most used; choose another.',
    ]);
    expect(await password.getValue()).toBe('password password password');
  });
});
