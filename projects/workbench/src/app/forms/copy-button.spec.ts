import { Clipboard } from '@angular/cdk/clipboard';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal, viewChild } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { CopyButton } from './copy-button';

@Component({
  imports: [CopyButton],
  template: `<app-copy-button [text]="text()" label="Copy the key" what="key" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class CopyHost {
  readonly text = signal('cp_live_4f2a9c');
  readonly button = viewChild.required(CopyButton);
}

describe('CopyButton', () => {
  const copied: string[] = [];
  let clipboardWorks = true;

  beforeEach(() => {
    copied.length = 0;
    clipboardWorks = true;
    TestBed.configureTestingModule({
      providers: [
        { provide: Clipboard, useValue: { copy: (text: string) => clipboardWorks && copied.push(text) > 0 } },
      ],
    });
  });

  async function render() {
    const fixture = TestBed.createComponent(CopyHost);
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    const button = await TestbedHarnessEnvironment.loader(fixture).getHarness(
      MatButtonHarness.with({ text: /Copy the key/ }),
    );
    const status = () => element.querySelector('[role=status]')?.textContent?.trim() ?? '';
    return { fixture, element, button, status };
  }

  it('copies its text and says so in a status', async () => {
    const { button, status } = await render();
    expect(status()).toBe('');
    await button.click();
    expect(copied).toEqual(['cp_live_4f2a9c']);
    expect(status()).toContain('Copied.');
  });

  it('says how to copy by hand when the browser refuses, naming what', async () => {
    clipboardWorks = false;
    const { button, status } = await render();
    await button.click();
    expect(status()).toBe('The key could not be copied here; select it above and copy it by hand.');
  });

  it('clears the status when the text changes, and copies the new text', async () => {
    const { fixture, button, status } = await render();
    await button.click();
    fixture.componentInstance.text.set('cp_live_77b0e1');
    await fixture.whenStable();
    expect(status()).toBe('');
    await button.click();
    expect(copied).toEqual(['cp_live_4f2a9c', 'cp_live_77b0e1']);
  });

  it('takes the focus when asked', async () => {
    const { fixture, element } = await render();
    fixture.componentInstance.button().focus();
    expect(document.activeElement).toBe(element.querySelector('button'));
  });
});
