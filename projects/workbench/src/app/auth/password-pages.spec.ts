import type { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';

import { RouterTestingHarness } from '@angular/router/testing';
import { PASSWORD_MIN_LENGTH } from '@counterpoise/api';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AUTH_URLS } from './auth-session';
import { ForgotPasswordPage } from './forgot-password-page';
import { ResetPasswordPage } from './reset-password-page';
import { routedPageTestBed } from '../shell/testing';

const BAD_REQUEST = { status: 400, statusText: 'Bad Request' };

describe('the password pages', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = routedPageTestBed([
      { path: 'forgot-password', component: ForgotPasswordPage },
      { path: 'reset-password', component: ResetPasswordPage },
    ]);
  });

  afterEach(() => http.verify());

  async function open(url: string) {
    const harness = await RouterTestingHarness.create(url);
    return {
      harness,
      loader: TestbedHarnessEnvironment.loader(harness.fixture),
      element: harness.routeNativeElement as HTMLElement,
    };
  }

  describe('ForgotPasswordPage', () => {
    it('takes the address typed on the sign-in page and says where the link went', async () => {
      const { harness, loader, element } = await open('/forgot-password?email=marit%40example.com');
      const email = await loader.getHarness(MatInputHarness);
      expect(await email.getValue()).toBe('marit@example.com');

      await (await loader.getHarness(MatButtonHarness.with({ text: 'Send the link' }))).click();
      const request = http.expectOne(AUTH_URLS.passwordReset);
      expect(request.request.body).toEqual({ email: 'marit@example.com' });
      request.flush(null, { status: 202, statusText: 'Accepted' });
      await harness.fixture.whenStable();

      expect(element.querySelector('[role=status]')?.textContent).toContain(
        'If an account uses marit@example.com',
      );
    });

    it('shows the server’s verdict on a malformed address on the field', async () => {
      const { harness, loader } = await open('/forgot-password');
      await (await loader.getHarness(MatInputHarness)).setValue('marit at example');
      await (await loader.getHarness(MatButtonHarness.with({ text: 'Send the link' }))).click();
      http.expectOne(AUTH_URLS.passwordReset).flush(
        {
          type: 'about:blank',
          title: 'Bad Request',
          status: 400,
          errors: [{ path: 'email', message: 'Enter an e-mail address such as name@example.com.' }],
        },
        BAD_REQUEST,
      );
      await harness.fixture.whenStable();
      expect(await (await loader.getHarness(MatFormFieldHarness)).getTextErrors()).toEqual([
        'Enter an e-mail address such as name@example.com.',
      ]);
    });

    it('keeps the address and says so when the server cannot be reached', async () => {
      const { harness, loader, element } = await open('/forgot-password');
      const email = await loader.getHarness(MatInputHarness);
      await email.setValue('marit@example.com');
      await (await loader.getHarness(MatButtonHarness.with({ text: 'Send the link' }))).click();
      http.expectOne(AUTH_URLS.passwordReset).error(new ProgressEvent('error'));
      await harness.fixture.whenStable();
      expect(element.querySelector('[role=alert]')?.textContent).toContain('The server cannot be reached');
      expect(await email.getValue()).toBe('marit@example.com');
    });
  });

  describe('ResetPasswordPage', () => {
    it('states the length rule before anything is typed', async () => {
      const { loader } = await open('/reset-password?token=t0k3n');
      const field = await loader.getHarness(MatFormFieldHarness);
      expect((await field.getTextHints()).join(' ')).toContain(`At least ${PASSWORD_MIN_LENGTH} characters`);
    });

    it('refuses a short password with the contract’s message, before asking the server', async () => {
      const { harness, loader } = await open('/reset-password?token=t0k3n');
      await (await loader.getHarness(MatInputHarness)).setValue('too short');
      await (await loader.getHarness(MatButtonHarness.with({ text: 'Save the new password' }))).click();
      await harness.fixture.whenStable();
      const errors = await (await loader.getHarness(MatFormFieldHarness)).getTextErrors();
      expect(errors[0]).toContain(`Use at least ${PASSWORD_MIN_LENGTH} characters`);
      http.expectNone(AUTH_URLS.passwordResetConfirm);
    });

    it('saves the new password with the token of the link and sends the person to sign in', async () => {
      const { harness, loader, element } = await open('/reset-password?token=t0k3n');
      await (await loader.getHarness(MatInputHarness)).setValue('seven stones along the river');
      await (await loader.getHarness(MatButtonHarness.with({ text: 'Save the new password' }))).click();
      const request = http.expectOne(AUTH_URLS.passwordResetConfirm);
      expect(request.request.body).toEqual({ token: 't0k3n', password: 'seven stones along the river' });
      request.flush(null, { status: 204, statusText: 'No Content' });
      await harness.fixture.whenStable();
      expect(element.querySelector('[role=status]')?.textContent).toContain('Your password is changed');
      expect(element.querySelector('a[href="/sign-in"]')).not.toBeNull();
    });

    it('puts the server’s verdict on the password on the field', async () => {
      const { harness, loader } = await open('/reset-password?token=t0k3n');
      await (await loader.getHarness(MatInputHarness)).setValue('password password password');
      await (await loader.getHarness(MatButtonHarness.with({ text: 'Save the new password' }))).click();
      http.expectOne(AUTH_URLS.passwordResetConfirm).flush(
        {
          type: 'about:blank',
          title: 'Bad Request',
          status: 400,
          errors: [{ path: 'password', message: 'This password is among the most used; choose another.' }],
        },
        BAD_REQUEST,
      );
      await harness.fixture.whenStable();
      expect(await (await loader.getHarness(MatFormFieldHarness)).getTextErrors()).toEqual([
        'This password is among the most used; choose another.',
      ]);
    });

    it('offers a new link when the server refuses the link itself', async () => {
      const { harness, loader, element } = await open('/reset-password?token=spent');
      await (await loader.getHarness(MatInputHarness)).setValue('seven stones along the river');
      await (await loader.getHarness(MatButtonHarness.with({ text: 'Save the new password' }))).click();
      http
        .expectOne(AUTH_URLS.passwordResetConfirm)
        .flush(
          { type: 'about:blank', title: 'Bad Request', status: 400, detail: 'This link has expired.' },
          BAD_REQUEST,
        );
      await harness.fixture.whenStable();
      const alert = element.querySelector('[role=alert]');
      expect(alert?.textContent).toContain('This link has expired.');
      expect(alert?.querySelector('a')?.getAttribute('href')).toBe('/forgot-password');
    });

    it('says so when the link lacks its token', async () => {
      const { element } = await open('/reset-password');
      expect(element.querySelector('[role=alert]')?.textContent).toContain('This link is incomplete');
      expect(element.querySelector('form')).toBeNull();
    });
  });
});
