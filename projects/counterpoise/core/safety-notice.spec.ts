import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { describe, expect, it } from 'vitest';
import { CpSafetyNoticeHarness } from '@counterpoise/ng/core/testing';
import type { SafetyTopic } from './safety-cautions';
import { CpSafetyNotice } from './safety-notice';

@Component({
  imports: [CpSafetyNotice],
  template: `
    <cp-safety-notice heading="Before every run" [topics]="topics()" [compact]="compact()" />
    <cp-safety-notice />
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly topics = signal<SafetyTopic[]>(['running', 'weights']);
  readonly compact = signal(false);
}

async function setUp() {
  const fixture = TestBed.createComponent(Host);
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const notice = await loader.getHarness(CpSafetyNoticeHarness.with({ heading: 'Before every run' }));
  return { fixture, loader, notice };
}

describe('CpSafetyNotice', () => {
  it('shows the cautions of the topics asked for, under its heading', async () => {
    const { notice } = await setUp();
    expect(await notice.getHeading()).toBe('Before every run');
    expect(await notice.getCautionTitles()).toEqual([
      'Guards on, people clear',
      'Hands off a turning rotor',
      'Check every weight before the run',
    ]);
  });

  it('shows every caution under a default heading when no topic is given', async () => {
    const { loader } = await setUp();
    const all = await loader.getHarness(CpSafetyNoticeHarness.with({ heading: 'Safety first' }));
    expect((await all.getCautionTitles()).length).toBe(6);
  });

  it('is a note named by its heading, and always defers to local codes', async () => {
    const { fixture } = await setUp();
    const host: HTMLElement = fixture.nativeElement.querySelector('cp-safety-notice');
    const headingId = host.getAttribute('aria-labelledby');
    expect(host.getAttribute('role')).toBe('note');
    expect(host.querySelector(`#${headingId}`)?.textContent).toBe('Before every run');
    expect(host.textContent).toContain('local codes and licensed practice come first');
  });

  it('folds the details behind the titles in the compact variant', async () => {
    const { fixture, notice } = await setUp();
    fixture.componentInstance.compact.set(true);
    expect(await notice.isCompact()).toBe(true);
    expect(await notice.isCautionExpanded(1)).toBe(false);
    await notice.expandCaution(1);
    expect(await notice.isCautionExpanded(1)).toBe(true);
  });

  it('follows a change of topics', async () => {
    const { fixture, notice } = await setUp();
    fixture.componentInstance.topics.set(['hot-work']);
    expect(await notice.getCautionTitles()).toEqual(['Hot work near fuel and debris']);
  });
});
