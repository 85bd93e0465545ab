import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import type { HttpTestingController } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatAutocompleteHarness } from '@angular/material/autocomplete/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';
import { MatRadioGroupHarness } from '@angular/material/radio/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { Role } from '@counterpoise/api';
import { BehaviorSubject, map } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession, aUser, RouteStandIn } from '../auth/testing';
import { aCustomer, aMachine, aPage, nextRequest } from '../records/testing';
import { routedPageTestBed, settle } from '../shell/testing';
import { todayIso } from './job-dates';
import { JobsPage } from './jobs-page';
import { aJob, aJobMachine, aJobSummary } from './jobs-testing';

const JOBS = [
  aJobSummary(),
  aJobSummary({
    id: 27,
    status: 'on-hold',
    scheduledFor: '2026-11-28',
    technician: { id: 6, name: 'Joss Marrable' },
    machine: aJobMachine({
      id: 15,
      serialNumber: 'SG36-0007',
      make: 'Ashgrove',
      model: 'SG-36',
      customerId: 8,
      customerName: 'Wrenhollow Parish Council',
    }),
  }),
  aJobSummary({ id: 19, status: 'completed', scheduledFor: '2026-10-02' }),
];

/** The shop's people as `GET /people` answers a manager: who does jobs, and who does not. */
const PEOPLE = {
  people: [
    aUser('manager'),
    aUser('technician'),
    aUser('technician', { id: 6, name: 'Joss Marrable', email: 'joss@example.com' }),
    aUser('technician', { id: 10, name: 'Old Hand', email: 'old@example.com', status: 'deactivated' }),
    aUser('viewer'),
    aUser('developer'),
  ],
  invitations: [],
};

const isList = (url: string) => url === '/api/v1/jobs';

describe('JobsPage', { timeout: 30_000 }, () => {
  let http: HttpTestingController;
  const wide = new BehaviorSubject(true);

  beforeEach(() => {
    wide.next(true);
    http = routedPageTestBed(
      [
        { path: 'jobs', component: JobsPage },
        { path: 'jobs/:id', component: RouteStandIn, data: { heading: 'A job' } },
      ],
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

  /**
   * Opens the list at `url` as someone in `role`, answering its first request with `jobs` (and, for those
   * who may read people, the people the technician filter offers).
   */
  async function open(url = '/jobs', role: Role = 'technician', total = JOBS.length) {
    TestBed.inject(AuthSession).start(aSession(role));
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl(url);
    const request = await nextRequest(http, (r) => isList(r.url));
    request.flush(aPage(JOBS, total));
    if (role === 'manager' || role === 'owner') {
      (await nextRequest(http, '/api/v1/people')).flush(PEOPLE);
    }
    await navigated;
    await harness.fixture.whenStable();
    return {
      request,
      harness,
      element: harness.routeNativeElement as HTMLElement,
      loader: TestbedHarnessEnvironment.loader(harness.fixture),
      overlays: TestbedHarnessEnvironment.documentRootLoader(harness.fixture),
    };
  }

  const router = () => TestBed.inject(Router);
  const listRequest = () => nextRequest(http, (r) => isList(r.url) && r.method === 'GET');

  it('shows the shop’s jobs the server answers, each row opening its job', async () => {
    const { request, loader, element } = await open();
    expect(request.request.urlWithParams).toBe('/api/v1/jobs?page=1&pageSize=25');
    const table = await loader.getHarness(MatTableHarness.with({ selector: '.jobs' }));
    const rows = await table.getCellTextByColumnName();
    expect(rows['machine']?.text).toEqual([
      'Thornmill FM-225 · TM225-0419',
      'Ashgrove SG-36 · SG36-0007',
      'Thornmill FM-225 · TM225-0419',
    ]);
    expect(rows['customer']?.text).toEqual([
      'Bramblecote Estate Services',
      'Wrenhollow Parish Council',
      'Bramblecote Estate Services',
    ]);
    expect(rows['scheduledFor']?.text).toEqual(['4 Dec 2026', '28 Nov 2026', '2 Oct 2026']);
    expect(rows['technician']?.text).toEqual(['Suvi Achterberg', 'Joss Marrable', 'Suvi Achterberg']);
    expect(rows['status']?.text).toEqual(['Open', 'On hold', 'Completed']);
    const links = [...element.querySelectorAll<HTMLAnchorElement>('td a.row-link')];
    expect(links.map((link) => link.getAttribute('href'))).toEqual(['/jobs/31', '/jobs/27', '/jobs/19']);
    expect(element.querySelector('.count')?.textContent?.trim()).toBe('3 jobs.');
  });

  it('fits a phone: the customer and date under the machine, the technician under the state', async () => {
    wide.next(false);
    const { loader, element } = await open();
    const table = await loader.getHarness(MatTableHarness.with({ selector: '.jobs' }));
    expect(await table.getHeaderRows().then((rows) => rows[0]!.getCellTextByIndex())).toEqual([
      'Machine',
      'State',
    ]);
    const row = element.querySelectorAll('tr.mat-mdc-row')[1]!;
    const texts = [...row.querySelectorAll('.row-link, .secondary, .status')].map((node) =>
      node.textContent?.trim(),
    );
    expect(texts).toEqual([
      'Ashgrove SG-36 · SG36-0007',
      'Wrenhollow Parish Council',
      '28 Nov 2026',
      'On hold',
      'Joss Marrable',
    ]);
  });

  it('keeps the filters of the address: a reload asks for and shows the same page', async () => {
    TestBed.inject(AuthSession).start(aSession('technician'));
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl(
      '/jobs?status=on-hold&technicianId=3&customerId=7&from=2026-11-01&to=2026-11-30&page=2',
    );
    const request = await listRequest();
    expect(request.request.urlWithParams).toBe(
      '/api/v1/jobs?status=on-hold&technicianId=3&customerId=7&from=2026-11-01&to=2026-11-30&page=2&pageSize=25',
    );
    request.flush(aPage(JOBS, 28, 2));
    (await nextRequest(http, '/api/v1/customers/7')).flush(aCustomer());
    await navigated;
    await harness.fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(harness.fixture);
    expect(
      await (await loader.getHarness(MatSelectHarness.with({ selector: '.status-filter' }))).getValueText(),
    ).toBe('On hold');
    expect(
      await (
        await loader.getHarness(MatSelectHarness.with({ selector: '.technician-filter' }))
      ).getValueText(),
    ).toBe('Suvi Achterberg (you)');
    expect(await (await loader.getHarness(MatAutocompleteHarness)).getValue()).toBe(
      'Bramblecote Estate Services',
    );
    expect(
      await (
        await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="from"]' }))
      ).getValue(),
    ).toBe('2026-11-01');
    expect(
      await (
        await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="to"]' }))
      ).getValue(),
    ).toBe('2026-11-30');
    expect(await (await loader.getHarness(MatPaginatorHarness)).getRangeLabel()).toBe('26 – 28 of 28');
    expect((harness.routeNativeElement as HTMLElement).querySelector('.count')?.textContent?.trim()).toBe(
      '28 jobs match the filters.',
    );
  });

  it('filters by state on the server, from the first page, and writes it into the address', async () => {
    const { loader } = await open('/jobs?page=2', 'technician', 60);
    const select = await loader.getHarness(MatSelectHarness.with({ selector: '.status-filter' }));
    await select.open();
    const chosen = select.clickOptions({ text: 'Completed' });
    const request = await listRequest();
    expect(request.request.params.get('status')).toBe('completed');
    expect(request.request.params.get('page')).toBe('1');
    request.flush(aPage([JOBS[2]!]));
    await chosen;
    expect(router().url).toBe('/jobs?status=completed');
  });

  it('filters by technician among the shop’s people who do jobs', async () => {
    const { loader } = await open('/jobs', 'manager');
    const select = await loader.getHarness(MatSelectHarness.with({ selector: '.technician-filter' }));
    await select.open();
    const offered = await Promise.all((await select.getOptions()).map((option) => option.getText()));
    expect(offered).toEqual([
      'Anyone',
      'Dario Lindqvist (you)',
      'Joss Marrable',
      'Old Hand',
      'Suvi Achterberg',
    ]);
    const chosen = select.clickOptions({ text: 'Joss Marrable' });
    const request = await listRequest();
    expect(request.request.params.get('technicianId')).toBe('6');
    request.flush(aPage([JOBS[1]!]));
    await chosen;
    expect(router().url).toBe('/jobs?technicianId=6');
  });

  it('filters by a customer found as one types', async () => {
    const { loader, harness } = await open();
    const picker = await loader.getHarness(MatAutocompleteHarness);
    await picker.enterText('wren');
    (await nextRequest(http, (r) => r.url === '/api/v1/customers')).flush(
      aPage([aCustomer({ id: 8, name: 'Wrenhollow Parish Council' })]),
    );
    await settle(harness.fixture);
    // The harness reads the panel as closed when its options came after the typing; entering again opens it.
    await picker.blur();
    await picker.focus();
    const chosen = picker.selectOption({ text: 'Wrenhollow Parish Council' });
    const request = await listRequest();
    expect(request.request.params.get('customerId')).toBe('8');
    request.flush(aPage([JOBS[1]!]));
    await chosen;
    expect(router().url).toBe('/jobs?customerId=8');
  });

  it('filters by dates, and refuses a last day before the first on its field', async () => {
    const { loader, harness } = await open();
    const from = await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="from"]' }));
    const typed = from.setValue('2026-11-01');
    const request = await listRequest();
    expect(request.request.params.get('from')).toBe('2026-11-01');
    request.flush(aPage(JOBS));
    await typed;
    expect(router().url).toBe('/jobs?from=2026-11-01');

    const to = await loader.getHarness(MatInputHarness.with({ selector: '[formControlName="to"]' }));
    await to.setValue('2026-10-01');
    await to.blur();
    await harness.fixture.whenStable();
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'To' }));
    expect(await field.getTextErrors()).toEqual(['The last day is before the first.']);
    http.expectNone((r) => isList(r.url));
    expect(router().url).toBe('/jobs?from=2026-11-01');

    const fixed = to.setValue('2026-11-30');
    const between = await listRequest();
    expect(between.request.params.get('from')).toBe('2026-11-01');
    expect(between.request.params.get('to')).toBe('2026-11-30');
    between.flush(aPage(JOBS));
    await fixed;
    expect(router().url).toBe('/jobs?from=2026-11-01&to=2026-11-30');
  });

  it('downloads the jobs of the filtered dates as a CSV file, with the session’s token', async () => {
    const clicked: string[] = [];
    vi.stubGlobal(
      'URL',
      Object.assign(URL, { createObjectURL: () => 'blob:jobs', revokeObjectURL: () => undefined }),
    );
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      clicked.push(this.download);
    });
    try {
      const { element, harness } = await open('/jobs?from=2026-11-01&to=2026-11-30');
      const form = element.querySelector('app-jobs-export form')!;
      const inputs = [...form.querySelectorAll('input')].map((input) => input.value);
      expect(inputs).toEqual(['2026-11-01', '2026-11-30']);
      form.dispatchEvent(new Event('submit'));
      const request = await nextRequest(http, (r) => r.url === '/api/v1/exports/jobs.csv');
      expect(request.request.params.get('from')).toBe('2026-11-01');
      expect(request.request.params.get('to')).toBe('2026-11-30');
      request.flush(new Blob(['\uFEFFJob no.\r\n']), {
        headers: {
          'Content-Disposition': 'attachment; filename=counterpoise-jobs-2026-11-01-to-2026-11-30.csv',
        },
      });
      await harness.fixture.whenStable();
      expect(clicked).toEqual(['counterpoise-jobs-2026-11-01-to-2026-11-30.csv']);
    } finally {
      vi.restoreAllMocks();
      vi.unstubAllGlobals();
    }
  });

  it('turns pages on the server', async () => {
    const { loader } = await open('/jobs', 'technician', 60);
    const turned = (await loader.getHarness(MatPaginatorHarness)).goToNextPage();
    const request = await listRequest();
    expect(request.request.params.get('page')).toBe('2');
    request.flush(aPage(JOBS, 60, 2));
    await turned;
    expect(router().url).toBe('/jobs?page=2');
  });

  it('says so when no job matches the filters', async () => {
    TestBed.inject(AuthSession).start(aSession('technician'));
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/jobs?status=abandoned');
    (await listRequest()).flush(aPage([]));
    await navigated;
    await harness.fixture.whenStable();
    expect((harness.routeNativeElement as HTMLElement).querySelector('.empty')?.textContent?.trim()).toBe(
      'No job matches the filters.',
    );
  });

  it('says so when the jobs cannot be fetched, and tries again', async () => {
    TestBed.inject(AuthSession).start(aSession('technician'));
    const harness = await RouterTestingHarness.create();
    const navigated = harness.navigateByUrl('/jobs');
    (await listRequest()).error(new ProgressEvent('error'));
    await navigated;
    await harness.fixture.whenStable();
    const element = harness.routeNativeElement as HTMLElement;
    expect(element.querySelector('app-error-banner')?.textContent).toContain(
      'The jobs could not be fetched.',
    );
    [...element.querySelectorAll('button')].find((b) => b.textContent?.includes('Try again'))?.click();
    (await listRequest()).flush(aPage(JOBS));
    await harness.fixture.whenStable();
    expect(element.querySelectorAll('td a.row-link')).toHaveLength(3);
  });

  it('offers assigning only to a manager, and starting a job only to those who may', async () => {
    const technician = await open('/jobs', 'technician');
    expect(technician.element.querySelector('.assign-cell button')).toBeNull();
    expect(technician.element.querySelector('.header button')?.textContent).toContain('Start a job');
  });

  it('offers a viewer neither starting nor assigning', async () => {
    const viewer = await open('/jobs', 'viewer');
    expect(viewer.element.querySelector('.header button')).toBeNull();
    expect(viewer.element.querySelector('.assign-cell button')).toBeNull();
  });

  describe('assigning a job (managers)', () => {
    async function openAssign() {
      const page = await open('/jobs', 'manager');
      const buttons = [...page.element.querySelectorAll<HTMLButtonElement>('.assign-cell button')];
      // Open and on-hold jobs can move; the completed one keeps its technician.
      expect(buttons.map((button) => button.getAttribute('aria-label'))).toEqual([
        'Assign the job on Thornmill FM-225 · TM225-0419 to someone else',
        'Assign the job on Ashgrove SG-36 · SG36-0007 to someone else',
      ]);
      buttons[0]!.click();
      (await nextRequest(http, '/api/v1/jobs/31')).flush(aJob(), { headers: { ETag: '"4"' } });
      (await nextRequest(http, '/api/v1/people')).flush(PEOPLE);
      await page.harness.fixture.whenStable();
      const dialog = await page.overlays.getHarness(MatDialogHarness);
      return { ...page, dialog };
    }

    it('sends the choice with the job’s ETag, then shows the list again', async () => {
      const { dialog, overlays, element, harness } = await openAssign();
      expect(await dialog.getTitleText()).toBe('Give the job to someone else');
      const group = await overlays.getHarness(MatRadioGroupHarness);
      const names = await Promise.all((await group.getRadioButtons()).map((radio) => radio.getLabelText()));
      expect(names).toEqual(['Dario Lindqvist', 'Joss Marrable', 'Suvi Achterberg (has it now)']);
      await group.checkRadioButton({ label: 'Joss Marrable' });
      const give = [...document.querySelectorAll<HTMLButtonElement>('mat-dialog-actions button')].find((b) =>
        b.textContent?.includes('Give it to Joss Marrable'),
      );
      give!.click();
      const assign = await nextRequest(http, '/api/v1/jobs/31/assign');
      expect(assign.request.method).toBe('POST');
      expect(assign.request.headers.get('If-Match')).toBe('"4"');
      expect(assign.request.body).toEqual({ technicianId: 6 });
      assign.flush(aJob({ version: 5, technician: { id: 6, name: 'Joss Marrable' } }), {
        headers: { ETag: '"5"' },
      });
      await settle(harness.fixture);
      (await listRequest()).flush(aPage(JOBS));
      await harness.fixture.whenStable();
      expect(element.querySelector('.assigned')?.textContent).toBe(
        'The job on Thornmill FM-225 · TM225-0419 is now with Joss Marrable.',
      );
      expect(await overlays.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
    });

    it('shows the job as stored when it changed meanwhile (412), and sends again on its new ETag', async () => {
      const { overlays, harness } = await openAssign();
      const group = await overlays.getHarness(MatRadioGroupHarness);
      await group.checkRadioButton({ label: 'Joss Marrable' });
      const give = () =>
        [...document.querySelectorAll<HTMLButtonElement>('mat-dialog-actions button')].find((b) =>
          b.textContent?.includes('Give it to'),
        )!;
      give().click();
      const refused = await nextRequest(http, '/api/v1/jobs/31/assign');
      refused.flush(
        {
          type: 'about:blank',
          title: 'Precondition Failed',
          status: 412,
          code: 'CHANGED_MEANWHILE',
          detail: 'The job changed meanwhile.',
          current: aJob({ version: 6, status: 'on-hold', technician: { id: 2, name: 'Dario Lindqvist' } }),
        },
        { status: 412, statusText: 'Precondition Failed', headers: { ETag: '"6"' } },
      );
      await settle(harness.fixture);
      const dialogText = document.querySelector('mat-dialog-container')?.textContent ?? '';
      expect(dialogText).toContain(
        'Someone changed this job meanwhile: it is now with Dario Lindqvist, on hold. Nothing was saved',
      );
      expect(dialogText).toContain('Dario Lindqvist (has it now)');

      give().click();
      const again = await nextRequest(http, '/api/v1/jobs/31/assign');
      expect(again.request.headers.get('If-Match')).toBe('"6"');
      expect(again.request.body).toEqual({ technicianId: 6 });
      again.flush(aJob({ version: 7, technician: { id: 6, name: 'Joss Marrable' } }));
      await settle(harness.fixture);
      (await listRequest()).flush(aPage(JOBS));
      await harness.fixture.whenStable();
    });
  });

  describe('starting a job', () => {
    async function openStart(role: Role) {
      const page = await open('/jobs', role);
      page.element.querySelector<HTMLButtonElement>('.header button')!.click();
      await settle(page.harness.fixture);
      if (role === 'manager') (await nextRequest(http, '/api/v1/people')).flush(PEOPLE);
      const dialog = await page.overlays.getHarness(MatDialogHarness);
      // The dialog's own fields, not the list's filters behind it.
      const fields = await page.overlays.getChildLoader('mat-dialog-container');
      return { ...page, dialog, fields };
    }

    async function chooseMachine(overlays: HarnessLoader, fixture: ComponentFixture<unknown>) {
      const machine = await overlays.getHarness(
        MatAutocompleteHarness.with({ selector: '[formControlName="machineId"]' }),
      );
      await machine.enterText('0419');
      const search = await nextRequest(http, (r) => r.url === '/api/v1/machines');
      expect(search.request.params.get('q')).toBe('0419');
      expect(search.request.params.get('archived')).toBe('false');
      search.flush(aPage([aMachine()]));
      await settle(fixture);
      // The harness reads the panel as closed when its options came after the typing; entering again opens it.
      await machine.blur();
      await machine.focus();
      await machine.selectOption({ text: /TM225-0419/ });
    }

    const submit = () =>
      [...document.querySelectorAll<HTMLButtonElement>('mat-dialog-actions button')]
        .find((b) => b.textContent?.includes('Start the job'))!
        .click();

    it('starts a technician’s own job on the machine found, today, and opens it', async () => {
      const { dialog, fields: overlays, harness } = await openStart('technician');
      expect(await dialog.getTitleText()).toBe('Start a job');
      expect(await overlays.getAllHarnesses(MatSelectHarness)).toHaveLength(0);
      const date = await overlays.getHarness(MatInputHarness.with({ selector: '[type="date"]' }));
      expect(await date.getValue()).toBe(todayIso());
      await chooseMachine(overlays, harness.fixture);
      submit();
      const create = await nextRequest(http, (r) => isList(r.url) && r.method === 'POST');
      expect(create.request.body).toEqual({ machineId: 12, scheduledFor: todayIso() });
      create.flush(aJob({ id: 40, version: 1 }), {
        status: 201,
        statusText: 'Created',
        headers: { ETag: '"1"' },
      });
      await settle(harness.fixture);
      await harness.fixture.whenStable();
      expect(router().url).toBe('/jobs/40');
    });

    it('says on the field what is missing before anything is sent', async () => {
      const { fields: overlays, harness } = await openStart('technician');
      const date = await overlays.getHarness(MatInputHarness.with({ selector: '[type="date"]' }));
      await date.setValue('');
      submit();
      await harness.fixture.whenStable();
      const machine = await overlays.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Machine' }));
      expect(await machine.getTextErrors()).toEqual(['Choose the machine to balance.']);
      const day = await overlays.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Date' }));
      expect(await day.getTextErrors()).toEqual(['Enter the date of the job.']);
      http.expectNone((r) => isList(r.url) && r.method === 'POST');
    });

    it('lets a manager name the technician, and shows the server’s refusal on its field', async () => {
      const { fields: overlays, harness, overlays: all } = await openStart('manager');
      const technician = await overlays.getHarness(MatSelectHarness);
      expect(await technician.getValueText()).toBe('Dario Lindqvist');
      await technician.open();
      const offered = await Promise.all((await technician.getOptions()).map((option) => option.getText()));
      expect(offered).toEqual(['Dario Lindqvist', 'Joss Marrable', 'Suvi Achterberg']);
      await technician.clickOptions({ text: 'Joss Marrable' });
      await chooseMachine(overlays, harness.fixture);
      const date = await overlays.getHarness(MatInputHarness.with({ selector: '[type="date"]' }));
      await date.setValue('2026-12-09');
      submit();
      const create = await nextRequest(http, (r) => isList(r.url) && r.method === 'POST');
      expect(create.request.body).toEqual({ machineId: 12, scheduledFor: '2026-12-09', technicianId: 6 });
      create.flush(
        {
          type: 'about:blank',
          title: 'Bad Request',
          status: 400,
          code: 'UNKNOWN_REFERENCE',
          errors: [{ path: 'technicianId', message: 'This person is not active in the organisation.' }],
        },
        { status: 400, statusText: 'Bad Request' },
      );
      await settle(harness.fixture);
      const field = await overlays.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Technician' }));
      expect(await field.getTextErrors()).toEqual(['This person is not active in the organisation.']);
      expect(router().url).toBe('/jobs');
      expect(await all.getAllHarnesses(MatDialogHarness)).toHaveLength(1);
    });
  });
});
