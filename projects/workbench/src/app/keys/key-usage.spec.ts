import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import type { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { BehaviorSubject, map } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { nextRequest } from '../records/testing';
import { routedPageTestBed } from '../shell/testing';
import { KeyUsage } from './key-usage';
import { KEYS_URLS } from './keys.api';
import { emptyUsage, USAGE_BY_DAY } from './keys-testing';
import { lastDays } from './usage-query';

const isUsage = (url: string) => url === KEYS_URLS.usage;
const SPAN = '/usage?from=2026-05-01&to=2026-05-07&by=day';

describe('KeyUsage', { timeout: 30_000 }, () => {
  let http: HttpTestingController;
  const wide = new BehaviorSubject(true);

  beforeEach(() => {
    wide.next(true);
    http = routedPageTestBed(
      [{ path: 'usage', component: KeyUsage }],
      [
        {
          provide: BreakpointObserver,
          useValue: {
            observe: () => wide.pipe(map((matches): BreakpointState => ({ matches, breakpoints: {} }))),
          },
        },
      ],
    );
  });

  afterEach(() => http.verify());

  /** Opens the usage at `url`, answering its report with `answer` (or an empty one of the span asked). */
  async function open(url: string, answer = USAGE_BY_DAY) {
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl(url);
    const request = await nextRequest(http, (r) => isUsage(r.url));
    request.flush(answer);
    await navigated;
    await harness.fixture.whenStable();
    return {
      request,
      harness,
      element: harness.routeNativeElement as HTMLElement,
      loader: TestbedHarnessEnvironment.loader(harness.fixture),
    };
  }

  const params = () => new URL(TestBed.inject(Router).url, 'http://localhost').searchParams;

  it('asks for the span and grouping in the address and shows totals, errors by status and a table', async () => {
    const { request, element, loader, harness } = await open(SPAN);
    expect(request.request.params.keys().map((key) => [key, request.request.params.get(key)])).toEqual([
      ['from', '2026-05-01'],
      ['to', '2026-05-07'],
      ['groupBy', 'day'],
    ]);
    const totals = element.querySelector('.totals')!.textContent!.replace(/\s+/g, ' ');
    expect(totals).toMatch(/Requests\s*40\s*Calculations\s*44\s*Errors\s*5/);
    expect(
      [...element.querySelectorAll('.statuses li')].map((li) =>
        [...li.querySelectorAll('span')].map((span) => span.textContent!.trim()).join(' '),
      ),
    ).toEqual(['400 Bad request 2', '422 Not computable 1', '429 Over the limit 2']);

    const table = await loader.getHarness(MatTableHarness);
    const cells = await table.getCellTextByColumnName();
    // Days without requests stay on the chart's axis but not in the table.
    expect(cells['group']?.text).toEqual(['2 May', '4 May', '6 May']);
    expect(cells['requests']?.text).toEqual(['12', '20', '8']);
    expect(cells['calculations']?.text).toEqual(['12', '24', '8']);
    expect(cells['errors']?.text).toEqual([
      'None',
      '3: 400 Bad request ×2, 422 Not computable ×1',
      '2: 429 Over the limit ×2',
    ]);
    const footer = await (await table.getFooterRows())[0]!.getCellTextByColumnName();
    expect(footer).toMatchObject({ group: 'Total', requests: '40', calculations: '44' });

    // The chart draws every day of the span, with the table's figures, once the browser is idle.
    for (let wait = 0; wait < 100 && element.querySelector('app-usage-chart') === null; wait++) {
      await new Promise((resolve) => setTimeout(resolve, 20));
      harness.fixture.detectChanges();
    }
    const chart = element.querySelector('app-usage-chart')!;
    const series = JSON.parse(chart.getAttribute('data-series')!);
    expect(series.requests).toEqual([0, 12, 0, 20, 0, 8, 0]);
    expect(series.calculations).toEqual([0, 12, 0, 24, 0, 8, 0]);
    expect(chart.querySelector('canvas')!.getAttribute('aria-label')).toMatch(/40 requests, 44 calculations/);
  });

  /** Clicks a button by its text, as a person would; a harness would wait for the request it starts. */
  function press(element: HTMLElement, text: string): void {
    const button = [...element.querySelectorAll<HTMLButtonElement>('button')].find((one) =>
      one.textContent?.trim().endsWith(text),
    );
    if (!button) throw new Error(`No button “${text}”`);
    button.click();
  }

  /** Types a day into one end of the range, as a keyboard does: the value, then its input event. */
  function type(element: HTMLElement, end: 'First day' | 'Last day', text: string): void {
    const input = element.querySelector<HTMLInputElement>(`input[aria-label="${end}"]`)!;
    input.value = text;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
  }

  it('writes another grouping into the address and asks for it', async () => {
    const { loader, harness, element } = await open(SPAN);
    press(element, 'By route');
    harness.fixture.detectChanges();
    const request = await nextRequest(http, (r) => isUsage(r.url));
    expect(request.request.params.get('groupBy')).toBe('route');
    expect(params().get('by')).toBe('route');
    expect(params().get('from')).toBe('2026-05-01');
    request.flush({
      ...USAGE_BY_DAY,
      groupBy: 'route',
      groups: [{ ...USAGE_BY_DAY.groups[1]!, group: 'POST /api/v1/calc/single-plane' }],
    });
    await harness.fixture.whenStable();
    const cells = await (await loader.getHarness(MatTableHarness)).getCellTextByColumnName();
    expect(cells['group']?.text).toEqual(['POST calc/single-plane']);
    expect(
      await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'By route' }))).isChecked(),
    ).toBe(true);
  });

  it('takes a ready-made span, and a span typed in the date range', async () => {
    const { loader, harness, element } = await open(SPAN);
    press(element, 'Last 7 days');
    harness.fixture.detectChanges();
    const preset = await nextRequest(http, (r) => isUsage(r.url));
    const week = lastDays(7, Date.now());
    expect([preset.request.params.get('from'), preset.request.params.get('to')]).toEqual([
      week.from,
      week.to,
    ]);
    expect([params().get('from'), params().get('to')]).toEqual([week.from, week.to]);
    preset.flush(emptyUsage(week.from, week.to));
    await harness.fixture.whenStable();
    const chosen = await loader.getHarness(MatButtonHarness.with({ text: /Last 7 days/ }));
    expect(await (await chosen.host()).getAttribute('aria-pressed')).toBe('true');

    type(element, 'First day', '4/1/2026');
    type(element, 'Last day', '4/30/2026');
    harness.fixture.detectChanges();
    const typed = await nextRequest(
      http,
      (r) => isUsage(r.url) && r.params.get('from') === '2026-04-01' && r.params.get('to') === '2026-04-30',
    );
    typed.flush(emptyUsage('2026-04-01', '2026-04-30'));
    // The first end typed alone asked for its own span on the way; only the last span counts.
    for (const stale of http.match((r) => isUsage(r.url)))
      stale.flush(emptyUsage('2026-04-01', '2026-04-30'));
    await harness.fixture.whenStable();
    expect([params().get('from'), params().get('to')]).toEqual(['2026-04-01', '2026-04-30']);
    expect(element.textContent).toContain('No requests with the organisation');
  });

  it('refuses a span longer than a report covers, saying why, and keeps the last one shown', async () => {
    const { element, harness } = await open(SPAN);
    type(element, 'First day', '1/1/2024');
    harness.fixture.detectChanges();
    await harness.fixture.whenStable();
    expect(element.querySelector('mat-error')?.textContent).toMatch(/at most 366 days/);
    expect(params().get('from')).toBe('2026-05-01');
  });

  it('stacks a line’s figures under its name on a phone', async () => {
    wide.next(false);
    const { loader } = await open(SPAN);
    const cells = await (await loader.getHarness(MatTableHarness)).getCellTextByColumnName();
    expect(cells['summary']?.text[1]).toMatch(/4 May.*Requests\s*20.*Calculations\s*24/s);
  });

  it('says when the usage could not be fetched, and tries again', async () => {
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl(SPAN);
    (await nextRequest(http, (r) => isUsage(r.url))).flush(
      { title: 'Forbidden', status: 403, detail: 'Reading usage needs the owner or developer role.' },
      { status: 403, statusText: 'Forbidden' },
    );
    await navigated;
    await harness.fixture.whenStable();
    const element = harness.routeNativeElement as HTMLElement;
    expect(element.querySelector('app-error-banner')?.textContent).toContain(
      'The usage could not be fetched.',
    );
    press(element, 'Try again');
    harness.fixture.detectChanges();
    (await nextRequest(http, (r) => isUsage(r.url))).flush(USAGE_BY_DAY);
    await harness.fixture.whenStable();
    expect(element.querySelector('app-error-banner')).toBeNull();
  });
});
