import { HttpErrorResponse } from '@angular/common/http';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { describe, expect, it } from 'vitest';
import { ErrorBanner } from './error-banner';

@Component({
  imports: [ErrorBanner],
  template: `
    <app-error-banner
      [lead]="lead()"
      [message]="message()"
      [error]="error()"
      [retryLabel]="retryLabel()"
      [politeness]="politeness()"
      [focusable]="focusable()"
      (retry)="retries.set(retries() + 1)"
    >
      <a href="/forgot-password">Ask for a new link</a>
      <a errorBannerAction href="/customers">Back to the customers</a>
    </app-error-banner>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class BannerHost {
  readonly lead = signal('The keys could not be fetched.');
  readonly message = signal<string | null>(null);
  readonly error = signal<unknown>(new HttpErrorResponse({ status: 0 }));
  readonly retryLabel = signal<string | null>('Try again');
  readonly politeness = signal<'assertive' | 'polite'>('assertive');
  readonly focusable = signal(false);
  readonly retries = signal(0);
}

async function render() {
  const fixture = TestBed.createComponent(BannerHost);
  await fixture.whenStable();
  const banner = (fixture.nativeElement as HTMLElement).querySelector('app-error-banner') as HTMLElement;
  return {
    fixture,
    host: fixture.componentInstance,
    banner,
    loader: TestbedHarnessEnvironment.loader(fixture),
  };
}

describe('ErrorBanner', () => {
  it('says what failed and why in one sentence, as an alert', async () => {
    const { banner } = await render();
    expect(banner.getAttribute('role')).toBe('alert');
    expect(banner.querySelector('p')?.textContent?.replace(/\s+/g, ' ').trim()).toBe(
      'The keys could not be fetched. The server cannot be reached. Check the connection; what you typed is kept here. Ask for a new link',
    );
    expect(banner.getAttribute('tabindex')).toBeNull();
  });

  it('prefers the page’s own words to the error’s', async () => {
    const { fixture, host, banner } = await render();
    host.lead.set('');
    host.message.set('This e-mail address and password do not match an account.');
    await fixture.whenStable();
    expect(banner.querySelector('p')?.textContent).toContain(
      'This e-mail address and password do not match an account.',
    );
    expect(banner.querySelector('p')?.textContent).not.toContain('cannot be reached');
  });

  it('tries again from its button, and shows no button without a label', async () => {
    const { fixture, host, loader, banner } = await render();
    const retry = await loader.getHarness(MatButtonHarness.with({ text: /Try again/ }));
    await retry.click();
    expect(host.retries()).toBe(1);
    host.retryLabel.set(null);
    await fixture.whenStable();
    expect(banner.querySelectorAll('button').length).toBe(0);
    // The projected way on stays, after the sentence.
    expect(banner.querySelector('p + a')?.textContent).toBe('Back to the customers');
  });

  it('waits its turn when polite, and takes the focus only when asked to', async () => {
    const { fixture, host, banner } = await render();
    host.politeness.set('polite');
    host.focusable.set(true);
    await fixture.whenStable();
    expect(banner.getAttribute('role')).toBe('status');
    expect(banner.getAttribute('tabindex')).toBe('-1');
    banner.focus();
    expect(document.activeElement).toBe(banner);
  });
});
