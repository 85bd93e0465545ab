import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import type { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import type { Health, Role } from '@counterpoise/api';
import { CpSafetyNoticeHarness } from '@counterpoise/ng/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, RouteStandIn } from '../auth/testing';
import { todayIso } from '../jobs/job-dates';
import { aJob, aJobMachine, aJobsHome, aJobSummary } from '../jobs/jobs-testing';
import { nextRequest } from '../records/testing';
import { routedPageTestBed, settle } from '../shell/testing';
import { API_REFERENCE_URL, HEALTH_URL } from '../status/health.api';
import { HomePage, uptimeLabel } from './home-page';

const HOME_URL = '/api/v1/jobs/home';

describe('HomePage for a visitor signed out', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = routedPageTestBed([]);
  });

  afterEach(() => http.verify());

  // whenStable() would wait for the health request itself, so the first render is driven by hand.
  async function render() {
    const fixture = TestBed.createComponent(HomePage);
    fixture.detectChanges();
    return fixture;
  }

  it('explains the job and lists its six stages, and asks for no day', async () => {
    const fixture = await render();
    http.expectOne(HEALTH_URL);
    http.expectNone(HOME_URL);
    expect((fixture.nativeElement as HTMLElement).querySelector('.day')).toBeNull();
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

const MY_OPEN = aJobSummary({ id: 31, version: 4 });
const MY_NEW = aJobSummary({
  id: 32,
  version: 1,
  scheduledFor: '2026-12-05',
  machine: aJobMachine({ id: 14, serialNumber: 'FW180-2210', make: 'Ferncastle', model: 'Flail 180' }),
});
const ON_HOLD = aJobSummary({
  id: 27,
  status: 'on-hold',
  technician: { id: 6, name: 'Joss Marrable' },
  machine: aJobMachine({ id: 15, serialNumber: 'SG36-0007', make: 'Ashgrove', model: 'SG-36' }),
});
const DUE = {
  machine: aJobMachine({ id: 9, serialNumber: 'WM240-1188', make: 'Wrenmoor', model: 'WM-240' }),
  lastJob: { id: 3, scheduledFor: '2025-10-11', status: 'completed' as const },
  reason: 'The last job was on 2025-10-11, more than 365 days ago.',
};

describe('HomePage for someone signed in', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    http = routedPageTestBed([
      { path: 'jobs/:id', component: RouteStandIn, data: { heading: 'A job' } },
      { path: 'jobs', component: RouteStandIn, data: { heading: 'Jobs' } },
    ]);
  });

  afterEach(() => http.verify());

  /** The home page of someone in `role`, their day answered with `day` (or left unanswered when null). */
  async function open(role: Role, day: object | null = aJobsHome()) {
    TestBed.inject(AuthSession).start(aSession(role));
    const fixture = TestBed.createComponent(HomePage);
    fixture.detectChanges();
    http.expectOne(HEALTH_URL).error(new ProgressEvent('error'));
    const request = await nextRequest(http, HOME_URL);
    if (day) {
      request.flush(day);
      await settle(fixture);
    }
    return { fixture, request, element: fixture.nativeElement as HTMLElement };
  }

  const section = (element: HTMLElement, id: string) =>
    element.querySelector(`section[aria-labelledby="${id}"]`) as HTMLElement;
  const texts = (element: Element, selector: string) =>
    [...element.querySelectorAll(selector)].map((node) => node.textContent?.replace(/\s+/g, ' ').trim());

  it('puts a technician’s day first: their open jobs, each with the way on to its page', async () => {
    const { element } = await open('technician', aJobsHome({ myOpenJobs: [MY_OPEN, MY_NEW] }));
    expect(element.querySelector('h1')?.textContent).toBe('Your day');
    expect(element.querySelector('.day')?.compareDocumentPosition(element.querySelector('.intro')!)).toBe(
      Node.DOCUMENT_POSITION_FOLLOWING,
    );
    expect(element.querySelector('#intro-heading')?.tagName).toBe('H2');

    const mine = section(element, 'my-jobs-heading');
    expect(texts(mine, '.card__title')).toEqual([
      'Thornmill FM-225 · TM225-0419',
      'Ferncastle Flail 180 · FW180-2210',
    ]);
    expect(texts(mine, '.card__line')).toEqual([
      'Bramblecote Estate Services',
      '4 Dec 2026 · Open',
      'Bramblecote Estate Services',
      '5 Dec 2026 · Open',
    ]);
    const ways = [...mine.querySelectorAll<HTMLAnchorElement>('a.card__action')];
    expect(ways.map((link) => [link.textContent?.trim(), link.getAttribute('href')])).toEqual([
      ['Carry on', '/jobs/31'],
      ['Begin', '/jobs/32'],
    ]);
    expect(ways[0]?.getAttribute('aria-label')).toBe(
      'Carry on: Thornmill FM-225 · TM225-0419, Bramblecote Estate Services',
    );
    expect(element.querySelector('a[href="/jobs"]')).toBeNull();
  });

  it('says honestly when each part of the day is empty', async () => {
    const { element } = await open('technician');
    expect(section(element, 'my-jobs-heading').querySelector('.day__empty')?.textContent).toContain(
      'No job is open in your name.',
    );
    expect(section(element, 'waiting-heading').querySelector('.day__empty')?.textContent).toContain(
      'No job is on hold.',
    );
    expect(section(element, 'due-heading').querySelector('.day__empty')?.textContent).toContain(
      'No machine is due.',
    );
    expect(section(element, 'waiting-heading').textContent).toContain('Your jobs on hold');
  });

  it('shows a manager the shop’s jobs on hold, the machines due, and the way to all jobs', async () => {
    const { element } = await open(
      'manager',
      aJobsHome({ waitingForManager: [ON_HOLD], machinesDue: [DUE], dueAfterDays: 365 }),
    );
    expect(element.querySelector('a[href="/jobs"]')?.textContent).toContain('All jobs');
    const waiting = section(element, 'waiting-heading');
    expect(waiting.textContent).toContain('The shop’s jobs on hold');
    expect(texts(waiting, '.card__line')).toContain('4 Dec 2026 · Joss Marrable');
    expect(waiting.querySelector('a.card__action')?.getAttribute('href')).toBe('/jobs/27');

    const due = section(element, 'due-heading');
    expect(due.textContent).toContain('more than 365 days old');
    expect(texts(due, '.card__line')).toEqual([
      'Bramblecote Estate Services',
      'The last job was on 2025-10-11, more than 365 days ago.',
      'Last job: 11 Oct 2025, completed',
    ]);
    expect(due.querySelector('.card__title a')?.getAttribute('href')).toBe('/machines/9');
  });

  it('starts a job today on a machine due, in the person’s own name, and opens it', async () => {
    const { element, fixture } = await open('technician', aJobsHome({ machinesDue: [DUE] }));
    const start = section(element, 'due-heading').querySelector<HTMLButtonElement>('app-busy-button button');
    expect(start?.textContent).toContain('Start a job');
    start?.click();
    const request = await nextRequest(http, '/api/v1/jobs');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ machineId: 9, scheduledFor: todayIso() });
    request.flush(aJob({ id: 40 }), { headers: { ETag: '"1"' } });
    await fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/jobs/40');
  });

  it('says why a job could not be started, and tries again', async () => {
    const { element, fixture } = await open('technician', aJobsHome({ machinesDue: [DUE] }));
    section(element, 'due-heading').querySelector<HTMLButtonElement>('app-busy-button button')?.click();
    (await nextRequest(http, '/api/v1/jobs')).flush(
      { type: 'about:blank', title: 'Bad Request', status: 400, detail: 'The machine is archived.' },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle(fixture);
    const banner = element.querySelector('.day app-error-banner');
    expect(banner?.textContent).toContain('The job could not be started. The machine is archived.');
    [...banner!.querySelectorAll('button')].find((b) => b.textContent?.includes('Try again'))?.click();
    const again = await nextRequest(http, '/api/v1/jobs');
    expect(again.request.body).toEqual({ machineId: 9, scheduledFor: todayIso() });
    again.flush(aJob({ id: 41 }));
    await fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/jobs/41');
  });

  it('offers a viewer the day without starting anything', async () => {
    const { element } = await open('viewer', aJobsHome({ machinesDue: [DUE] }));
    expect(element.querySelector('h1')?.textContent).toBe('Your day');
    expect(texts(element, 'button').some((text) => text?.includes('Start a job'))).toBe(false);
  });

  it('says when the day could not be fetched, and asks again', async () => {
    const { request, fixture, element } = await open('technician', null);
    request.error(new ProgressEvent('error'));
    await settle(fixture);
    const banner = element.querySelector('.day app-error-banner');
    expect(banner?.textContent).toContain('Your day could not be fetched.');
    [...banner!.querySelectorAll('button')].find((b) => b.textContent?.includes('Try again'))?.click();
    fixture.detectChanges();
    (await nextRequest(http, HOME_URL)).flush(aJobsHome({ myOpenJobs: [MY_OPEN] }));
    await settle(fixture);
    expect(element.querySelector('a.card__action')?.getAttribute('href')).toBe('/jobs/31');
  });

  it('keeps what Counterpoise does, the safety cautions and the server status below the day', async () => {
    const { fixture, element } = await open('technician');
    expect(element.querySelector('#intro-heading')?.textContent).toContain('Balance rotors in the field');
    expect(element.querySelectorAll('.step')).toHaveLength(6);
    const notice = await TestbedHarnessEnvironment.loader(fixture).getHarness(CpSafetyNoticeHarness);
    expect(await notice.getCautionTitles()).toContain('Lock out and tag out');
    expect(element.querySelector('.status')?.textContent).toContain('The server cannot be reached');
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
