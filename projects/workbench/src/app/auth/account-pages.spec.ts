import type { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';

import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AccountPage } from './account-page';
import { AUTH_URLS, AuthSession } from './auth-session';
import { NotAvailablePage } from './not-available-page';
import { aSession, aUser } from './testing';
import { routedPageTestBed } from '../shell/testing';

describe('the account pages', () => {
  let http: HttpTestingController;
  let session: AuthSession;

  beforeEach(() => {
    http = routedPageTestBed([
      { path: 'account', component: AccountPage },
      { path: 'not-available', component: NotAvailablePage },
    ]);
    session = TestBed.inject(AuthSession);
  });

  afterEach(() => http.verify());

  describe('NotAvailablePage', () => {
    it('says which role keeps the page closed, and who can change it', async () => {
      session.start(aSession('technician'));
      const harness = await RouterTestingHarness.create('/not-available?need=people:read');
      const text = (harness.routeNativeElement as HTMLElement).textContent ?? '';
      expect(text).toContain('Not available for your role');
      expect(text).toContain('This page is for people who see the people of the organisation.');
      expect(text).toContain('As a technician at Alder Ridge Rotor Service');
      expect(text).toContain('ask an owner of Alder Ridge Rotor Service');
    });

    it('reads naturally before a role that starts with a vowel', async () => {
      session.start(aSession('owner'));
      const harness = await RouterTestingHarness.create('/not-available');
      expect((harness.routeNativeElement as HTMLElement).textContent).toContain('As an owner at');
    });
  });

  describe('AccountPage', () => {
    it('shows the person, their organisation and what their role lets them do, as the server now says', async () => {
      session.start(aSession('technician'));
      const harness = await RouterTestingHarness.create('/account');
      // An owner made this person a manager since they signed in.
      http.expectOne(AUTH_URLS.me).flush({
        user: aUser('technician', { role: 'manager' }),
        permissions: ['people:read', 'people:invite'],
      });
      await harness.fixture.whenStable();
      const element = harness.routeNativeElement as HTMLElement;
      expect(element.textContent).toContain('Suvi Achterberg');
      expect(element.textContent).toContain('Manager');
      const allowed = [...element.querySelectorAll('.allowed li span')].map((item) =>
        item.textContent?.trim(),
      );
      expect(allowed).toEqual(['You can see the people of the organisation.', 'You can invite people.']);
      expect(session.can('people:invite')).toBe(true);
    });

    it('keeps showing the details of the session when the server cannot be asked', async () => {
      session.start(aSession('developer'));
      const harness = await RouterTestingHarness.create('/account');
      http.expectOne(AUTH_URLS.me).error(new ProgressEvent('error'));
      await harness.fixture.whenStable();
      const element = harness.routeNativeElement as HTMLElement;
      expect(element.textContent).toContain('The latest details could not be fetched');
      expect(element.textContent).toContain('Bram Oyelaran');
      expect(element.textContent).toContain('You can create and revoke API keys.');
    });

    it('e-mails a link to change the password to the person’s own address', async () => {
      session.start(aSession('viewer'));
      const harness = await RouterTestingHarness.create('/account');
      http.expectOne(AUTH_URLS.me).flush({ user: aUser('viewer'), permissions: ['jobs:read'] });
      await harness.fixture.whenStable();
      const element = harness.routeNativeElement as HTMLElement;
      [...element.querySelectorAll('button')]
        .find((b) => b.textContent?.includes('E-mail me a link'))
        ?.click();
      const request = http.expectOne(AUTH_URLS.passwordReset);
      expect(request.request.body).toEqual({ email: 'ines@example.com' });
      request.flush(null, { status: 202, statusText: 'Accepted' });
      await harness.fixture.whenStable();
      expect(element.querySelector('[role=status]')?.textContent).toContain('on its way to ines@example.com');
    });
  });
});
