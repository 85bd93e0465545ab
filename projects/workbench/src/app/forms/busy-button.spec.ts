import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { describe, expect, it } from 'vitest';
import { BusyButton } from './busy-button';

@Component({
  imports: [BusyButton],
  template: `
    <form (submit)="$event.preventDefault(); submits.set(submits() + 1)">
      <input aria-label="Anything" />
      <app-busy-button
        class="submit"
        type="submit"
        [busy]="busy()"
        [disabled]="disabled()"
        label="Send the invitation"
        busyLabel="Sending…"
        (click)="presses.set(presses() + 1)"
      />
    </form>
    <app-busy-button appearance="outlined" icon="password" [busy]="busy()" label="E-mail me a link" />
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class ButtonHost {
  readonly busy = signal(false);
  readonly disabled = signal(false);
  readonly presses = signal(0);
  readonly submits = signal(0);
}

async function render() {
  const fixture = TestBed.createComponent(ButtonHost);
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const element = fixture.nativeElement as HTMLElement;
  return {
    fixture,
    host: fixture.componentInstance,
    element,
    submit: await loader.getHarness(MatButtonHarness.with({ selector: '[type="submit"]' })),
    action: await loader.getHarness(MatButtonHarness.with({ selector: '[type="button"]' })),
    native: element.querySelector('button[type="submit"]') as HTMLButtonElement,
  };
}

describe('BusyButton', () => {
  it('submits its form and tells the page of the press while idle', async () => {
    const { host, submit, native } = await render();
    expect(await submit.getText()).toBe('Send the invitation');
    expect(await submit.isDisabled()).toBe(false);
    expect(native.getAttribute('aria-busy')).toBeNull();
    await submit.click();
    expect(host.presses()).toBe(1);
    expect(host.submits()).toBe(1);
  });

  it('shows the spinner and its busy words, announces busy, and refuses presses while busy', async () => {
    const { fixture, host, submit, native } = await render();
    host.busy.set(true);
    await fixture.whenStable();
    expect(await submit.getText()).toBe('Sending…');
    expect(await submit.isDisabled()).toBe(true);
    expect(native.getAttribute('aria-busy')).toBe('true');
    expect(native.getAttribute('aria-disabled')).toBe('true');
    expect(native.querySelector('mat-spinner')?.getAttribute('aria-hidden')).toBe('true');
    await submit.click();
    expect(host.presses()).toBe(0);
    expect(host.submits()).toBe(0);
  });

  it('stays in the tab order while busy, so that the focus is not lost', async () => {
    const { fixture, host, native } = await render();
    native.focus();
    host.busy.set(true);
    await fixture.whenStable();
    expect(native.hasAttribute('disabled')).toBe(false);
    expect(document.activeElement).toBe(native);
  });

  it('refuses presses for the page’s own reason without saying it is busy', async () => {
    const { fixture, host, submit, native } = await render();
    host.disabled.set(true);
    await fixture.whenStable();
    expect(await submit.isDisabled()).toBe(true);
    expect(native.getAttribute('aria-busy')).toBeNull();
    expect(await submit.getText()).toBe('Send the invitation');
    await submit.click();
    expect(host.presses()).toBe(0);
    expect(host.submits()).toBe(0);
  });

  it('keeps the words of the other state, unheard, to hold its width', async () => {
    const { fixture, host, element } = await render();
    const content = () => element.querySelectorAll('.busy-button__content');
    expect(content()[0]?.getAttribute('data-other')).toBe('Sending…');
    host.busy.set(true);
    await fixture.whenStable();
    expect(content()[0]?.getAttribute('data-other')).toBe('Send the invitation');
  });

  it('puts the spinner in the place of its icon while busy, the label kept', async () => {
    const { fixture, host, action } = await render();
    expect(await action.getText()).toBe('E-mail me a link');
    host.busy.set(true);
    await fixture.whenStable();
    expect(await action.getText()).toBe('E-mail me a link');
    expect(await action.isDisabled()).toBe(true);
  });
});
