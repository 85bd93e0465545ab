import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Health } from '@counterpoise/api';
import { CpSafetyNoticeHarness } from '@counterpoise/ng/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { API_REFERENCE_URL, HEALTH_URL } from '../status/health.api';
import { HomePage, uptimeLabel } from './home-page';

describe('HomePage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  // whenStable() would wait for the health request itself, so the first render is driven by hand.
  async function render() {
    const fixture = TestBed.createComponent(HomePage);
    fixture.detectChanges();
    return fixture;
  }

  it('explains the job and lists its six stages', async () => {
    const fixture = await render();
    http.expectOne(HEALTH_URL);
    const element: HTMLElement = fixture.nativeElement;
    expect(element.querySelector('h1')?.textContent).toContain('Balance rotors in the field');
    const stages = [...element.querySelectorAll('.step__title')].map((title) => title.textContent?.trim());
    expect(stages).toEqual(['1. Inspect', '2. Set up', '3. Read', '4. Correct', '5. Verify', '6. Record']);
    const reference = [...element.querySelectorAll('a')].find((link) =>
      link.textContent?.includes('Calculation API reference'),
    );
    expect(reference?.getAttribute('href')).toBe(API_REFERENCE_URL);
  });

  it('shows the safety cautions in their compact form', async () => {
    const fixture = await render();
    http.expectOne(HEALTH_URL).error(new ProgressEvent('error'));
    const notice = await TestbedHarnessEnvironment.loader(fixture).getHarness(CpSafetyNoticeHarness);
    expect(await notice.isCompact()).toBe(true);
    expect(await notice.getCautionTitles()).toContain('Lock out and tag out');
  });

  it('reports the server and its database once the server answers', async () => {
    const fixture = await render();
    const health: Health = {
      status: 'ok',
      version: '0.1.0',
      uptimeSeconds: 3_700,
      database: { status: 'ok', migrations: 3 },
    };
    http.expectOne(HEALTH_URL).flush(health);
    await fixture.whenStable();
    const text = (fixture.nativeElement as HTMLElement).querySelector('.status')?.textContent ?? '';
    expect(text).toContain('Working, version 0.1.0');
    expect(text).toMatch(/3\s+migrations applied/);
    expect(text).toContain('61 min');
  });

  it('says the readings stay on the device when the server cannot be reached', async () => {
    const fixture = await render();
    http.expectOne(HEALTH_URL).error(new ProgressEvent('error'));
    await fixture.whenStable();
    const text = (fixture.nativeElement as HTMLElement).querySelector('.status')?.textContent ?? '';
    expect(text).toContain('The server cannot be reached');
  });

  it('asks the server again on request', async () => {
    const fixture = await render();
    http.expectOne(HEALTH_URL).error(new ProgressEvent('error'));
    await fixture.whenStable();
    const button = [...(fixture.nativeElement as HTMLElement).querySelectorAll('button')].find((b) =>
      b.textContent?.includes('Check again'),
    );
    button?.click();
    fixture.detectChanges();
    http.expectOne(HEALTH_URL);
  });
});

describe('uptimeLabel', () => {
  it('reads naturally from seconds to days', () => {
    expect(uptimeLabel(12)).toBe('Under a minute');
    expect(uptimeLabel(90)).toBe('1 min');
    expect(uptimeLabel(7_260)).toBe('2 h 1 min');
    expect(uptimeLabel(3 * 86_400 + 5)).toBe('3 days');
  });
});
