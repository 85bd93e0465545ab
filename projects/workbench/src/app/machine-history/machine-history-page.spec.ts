import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { RouterTestingHarness } from '@angular/router/testing';
import { CpCorrectionOverlayHarness } from '@counterpoise/ng/correction-overlay/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { nextRequest, recordsTestBed } from '../records/testing';
import { MachineHistoryPage } from './machine-history-page';
import type { MachineHistory } from './machine-history.api';
import { aHistory } from './machine-history-testing';

const text = (element: Element | null | undefined) => element?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
/** A cell's text with its parts (a link, a line under it) apart, as they stand on the page. */
const cellText = (cell: Element | null) =>
  [...(cell?.childNodes ?? [])]
    // What a screen reader reads: no comments, no icon names (they are aria-hidden).
    .filter(
      (node) =>
        node.nodeType !== Node.COMMENT_NODE &&
        !(node instanceof Element && node.getAttribute('aria-hidden') === 'true'),
    )
    .map((node) => node.textContent ?? '')
    .join(' ')
    .replace(/\s+/g, ' ')
    .trim();

describe('MachineHistoryPage', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = recordsTestBed([
      { path: 'machines/:id/history', component: MachineHistoryPage },
      { path: '**', component: RouteStandIn, data: { heading: 'Elsewhere' } },
    ]);
    TestBed.inject(AuthSession).start(aSession('viewer'));
  });

  afterEach(() => http.verify());

  async function open(answer: MachineHistory | { status: number; body: object }) {
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/machines/12/history');
    const request = await nextRequest(http, '/api/v1/machines/12/job-history');
    if ('status' in answer) request.flush(answer.body, { status: answer.status, statusText: 'Not Found' });
    else request.flush(answer);
    await navigated;
    await harness.fixture.whenStable();
    harness.fixture.detectChanges();
    return {
      element: harness.routeNativeElement as HTMLElement,
      loader: TestbedHarnessEnvironment.loader(harness.fixture),
    };
  }

  it('heads the page with the machine and names the chart by what it shows', async () => {
    const { element } = await open(aHistory());
    expect(text(element.querySelector('h1'))).toBe('History of Thornmill FM-225 · TM225-0419');
    const canvas = element.querySelector('app-history-chart canvas');
    expect(canvas?.getAttribute('role')).toBe('img');
    expect(canvas?.getAttribute('aria-label')).toContain('for 3 jobs, from 10 Jun 2025 to 30 Nov 2026');
    // A job read in mm/s RMS is drawn converted, and the page says so.
    expect(text(element.querySelector('[data-testid="converted-note"]'))).toContain(
      'One job was read in mm/s RMS: the chart draws it converted to in/s peak',
    );
  });

  it('lists every job newest first with each side before and after in the job’s own unit', async () => {
    const { element } = await open(aHistory());
    const jobs = [...element.querySelectorAll('[data-testid="history-job"]')];
    expect(jobs.map((job) => text(job.querySelector('th a')))).toEqual([
      'Job no. 57',
      'Job no. 42',
      'Job no. 18',
    ]);
    const begun = jobs[0]!.querySelectorAll('tr');
    expect(cellText(begun[0]!.querySelector('[data-label="Before"]'))).toBe(
      '0.24 in/s peak 212° · 2,150 rpm',
    );
    expect(cellText(begun[0]!.querySelector('[data-label="After"]'))).toBe('Not read yet');
    expect(cellText(begun[0]!.querySelector('[data-label="Acceptance"]'))).toBe('Limit 0.15 in/s peak');
    expect(text(jobs[0]!.querySelector('th'))).toContain('Open · Not finished');
    const oldest = jobs[2]!.querySelectorAll('tr');
    expect(cellText(oldest[0]!.querySelector('[data-label="Before"]'))).toBe('9.9 mm/s RMS 212° · 2,150 rpm');
    expect(cellText(oldest[0]!.querySelector('[data-label="After"]'))).toBe('1.8 mm/s RMS 61° · 2,151 rpm');
    expect(cellText(oldest[0]!.querySelector('[data-label="Acceptance"]'))).toBe(
      'Within the limit 2.69 mm/s RMS',
    );
    expect(text(oldest[1]!.querySelector('[data-label="Side"]'))).toBe('Right');
    expect(text(jobs[2]!.querySelector('[data-label="Method"]'))).toBe(
      'Trial weight, one plane, Trial weights, two planes',
    );
    expect(jobs[2]!.querySelector('th a')?.getAttribute('href')).toBe('/jobs/18');
  });

  it('draws the weights on the rotor on each plane and lists them with the job that fitted each', async () => {
    const { element, loader } = await open(aHistory());
    const overlays = await loader.getAllHarnesses(CpCorrectionOverlayHarness);
    expect(overlays).toHaveLength(2);
    const rows = [...element.querySelectorAll('[data-testid="weight-on-rotor"]')].map((row) =>
      [...row.querySelectorAll('th, td')].map(cellText),
    );
    expect(rows).toEqual([
      ['Left plane', '120 g', '40°', '240 mm', 'Bolted', 'Job no. 18 10 Jun 2025'],
      ['Left plane', '86 g', '118°', '240 mm', 'Welded', 'Job no. 42 14 Apr 2026'],
      ['Right plane', '54 g', '300°', '240 mm', 'Welded', 'Job no. 42 14 Apr 2026'],
    ]);
  });

  it('gives the family’s stored sensitivity with its spread and jobs, and what it means', async () => {
    const { element } = await open(aHistory());
    expect(text(element.querySelector('[data-testid="sensitivity-meaning"]'))).toBe(
      'On a machine of this family, about 612 g at the correction radius of the left plane moves the left ' +
        'reading by 1 in/s peak, give or take 6 %, so a one-run correction from these figures is a first ' +
        'estimate, to be verified by a run.',
    );
    const figures = [...element.querySelectorAll('[data-testid="family-figure"]')].map((row) =>
      [...row.querySelectorAll('th, td')].map((cell) => text(cell)),
    );
    expect(figures).toEqual([
      ['Left sensor', 'Left plane', '612 g per in/s peak', '41°', '4', '±6.2 % · ±3.6°'],
      ['Right sensor', 'Right plane', '655 g per in/s peak', '37°', '1', 'one job: no spread yet'],
    ]);
  });

  it('says plainly when the machine has no job, no weights and no family', async () => {
    const { element } = await open(aHistory({ jobs: [], unit: null, weightsOnRotor: null, family: null }));
    const states = [...element.querySelectorAll('.state')].map((state) => text(state));
    expect(states).toEqual([
      'No readings yet: the chart fills in as jobs on this machine are read.',
      'No job on this machine yet.',
      'No job on this machine is completed yet, so no weight is on record.',
      'The machine has no family, so there is no stored sensitivity to show.',
    ]);
    expect(element.querySelector('app-history-chart')).toBeNull();
  });

  it('says why when the history cannot be fetched', async () => {
    const { element } = await open({
      status: 404,
      body: {
        type: 'about:blank',
        title: 'Not Found',
        status: 404,
        detail: 'There is no machine 12 in your organisation.',
      },
    });
    expect(text(element.querySelector('app-error-banner'))).toContain(
      'The machine’s history could not be fetched.',
    );
  });
});
