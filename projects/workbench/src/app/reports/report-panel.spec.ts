import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { AuthSession } from '../auth/auth-session';
import { aSession } from '../auth/testing';
import { COMPLETED_MULCHER_JOB } from '../jobs/steps/testing-jobs';
import type { Job } from '../jobs/jobs.api';
import { ReportPanel } from './report-panel';
import { signedReports, unsignedReports } from './reports-testing';
import { DRAWING_NEEDED } from './signature-dialog';

/*
 * The report panel with its dialogs, against answers the spec gives. jsdom draws nothing on a canvas: the
 * canvas's 2D context is a recorder of calls, and its PNG a fixed one, so that signature_pad runs as in a
 * browser and the spec draws with mouse events.
 */

const PNG =
  'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAQAAAACCAYAAAB/qH1jAAAAEUlEQVQI12NgYGD4z4AFwAUBJvsB/zqmEvQAAAAASUVORK5CYII=';

function fakeContext(): CanvasRenderingContext2D {
  return new Proxy({} as Record<string, unknown>, {
    get: (target, key) => (key in target ? target[key as string] : () => undefined),
    set: (target, key, value) => {
      target[key as string] = value;
      return true;
    },
  }) as unknown as CanvasRenderingContext2D;
}

/**
 * Draws a stroke on the pad as a mouse would: pointer events where the window has them (signature_pad then
 * listens to those), mouse events otherwise; the moves and the release go to the window, as in a browser.
 */
function drawOn(canvas: HTMLCanvasElement, points: readonly [number, number][]): void {
  const pointer = typeof window.PointerEvent === 'function';
  const make = (type: 'down' | 'move' | 'up', [x, y]: [number, number], buttons: number) =>
    pointer
      ? new PointerEvent(`pointer${type}`, { buttons, clientX: x, clientY: y, pointerId: 1, bubbles: true })
      : new MouseEvent(`mouse${type}`, { buttons, clientX: x, clientY: y, bubbles: true });
  canvas.dispatchEvent(make('down', points[0]!, 1));
  for (const point of points.slice(1)) window.dispatchEvent(make('move', point, 1));
  window.dispatchEvent(make('up', points.at(-1)!, 0));
}

const text = (element: Element | null | undefined) =>
  (element?.textContent ?? '').replace(/\s+/g, ' ').trim();

async function settle(): Promise<void> {
  for (let round = 0; round < 3; round++) {
    await new Promise((resolve) => setTimeout(resolve));
    TestBed.tick();
  }
}

describe('ReportPanel', { timeout: 30_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockImplementation(() => fakeContext() as never);
    vi.spyOn(HTMLCanvasElement.prototype, 'toDataURL').mockReturnValue(PNG);
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    TestBed.inject(AuthSession).start(aSession('technician'));
  });

  afterEach(() => {
    http.verify();
    vi.restoreAllMocks();
    document.querySelectorAll('.cdk-overlay-container').forEach((overlay) => (overlay.innerHTML = ''));
  });

  async function render(job: Job = COMPLETED_MULCHER_JOB, answer = unsignedReports(job.id)) {
    const fixture = TestBed.createComponent(ReportPanel);
    fixture.componentRef.setInput('job', job);
    fixture.componentRef.setInput('etag', `"${job.version}"`);
    fixture.detectChanges();
    http.expectOne(`/api/v1/jobs/${job.id}/reports`).flush(answer);
    await settle();
    return { fixture, element: fixture.nativeElement as HTMLElement };
  }

  const button = (root: ParentNode, label: string) =>
    [...root.querySelectorAll('button')].find((one) => text(one).endsWith(label));
  const dialog = () => document.querySelector('mat-dialog-container') as HTMLElement | null;

  it('says the report is not signed yet and offers signing, not e-mail', async () => {
    const { element } = await render();
    expect(text(element.querySelector('[data-testid="report-state"]'))).toBe(
      'Not signed yet: the download is a draft, marked so on every page.',
    );
    expect(button(element, 'Customer signs')).toBeDefined();
    expect(button(element, 'E-mail to the customer')).toBeUndefined();
    expect(text(element.querySelector('.hint'))).toBe(
      'The report can be e-mailed once the customer has signed it.',
    );
  });

  it('lists the revisions and sendings of a signed report, and offers the e-mail', async () => {
    const { element } = await render(COMPLETED_MULCHER_JOB, signedReports(6));
    expect(text(element.querySelector('[data-testid="report-state"]'))).toContain(
      'Signed by Juno Hartwell on 5 Dec 2026',
    );
    expect(text(element.querySelector('[data-testid="revisions"]'))).toContain(
      'Revision 1 Signed by Juno Hartwell on 5 Dec 2026',
    );
    expect(text(element.querySelector('[data-testid="sendings"]'))).toContain(
      'office@aldercreek-clearing.test Revision 1',
    );
    expect(button(element, 'E-mail to the customer')).toBeDefined();
  });

  it('shows no signing or e-mail to a viewer, who may still download', async () => {
    TestBed.inject(AuthSession).start(aSession('viewer'));
    const { element } = await render(COMPLETED_MULCHER_JOB, signedReports(6));
    expect(button(element, 'Customer signs')).toBeUndefined();
    expect(button(element, 'E-mail to the customer')).toBeUndefined();
    expect(button(element, 'Download PDF')).toBeDefined();
  });

  it('downloads the PDF through the data service and hands it to the browser', async () => {
    URL.createObjectURL = vi.fn(() => 'blob:report');
    URL.revokeObjectURL = vi.fn();
    const saved: string[] = [];
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      saved.push(this.download);
    });
    const { element } = await render(COMPLETED_MULCHER_JOB, signedReports(6));
    button(element, 'Download r1')!.click();
    const request = http.expectOne('/api/v1/jobs/6/report?revision=1');
    expect(request.request.responseType).toBe('blob');
    request.flush(new Blob(['%PDF-1.7']), {
      headers: { 'Content-Disposition': 'attachment; filename="report-J-000006-r1.pdf"' },
    });
    await settle();
    expect(saved).toEqual(['report-J-000006-r1.pdf']);
  });

  it('takes the signature: a drawing is needed, then it is sent on the job’s ETag', async () => {
    const { element } = await render();
    button(element, 'Customer signs')!.click();
    await settle();
    const open = dialog()!;
    const name = open.querySelector<HTMLInputElement>('[data-testid="signer-name"]')!;
    name.value = 'Juno Hartwell';
    name.dispatchEvent(new Event('input'));
    button(open, 'Sign')!.click();
    await settle();
    expect(text(open.querySelector('[data-testid="pad-error"]'))).toBe(DRAWING_NEEDED);
    http.expectNone('/api/v1/jobs/6/report/signature');

    drawOn(open.querySelector('canvas')!, [
      [10, 10],
      [30, 16],
      [50, 22],
      [70, 14],
      [90, 20],
    ]);
    await settle();
    button(open, 'Sign')!.click();
    const request = http.expectOne('/api/v1/jobs/6/report/signature');
    expect(request.request.method).toBe('PUT');
    expect(request.request.headers.get('If-Match')).toBe('"11"');
    expect(request.request.body).toEqual({ signerName: 'Juno Hartwell', signaturePng: PNG });
    request.flush(signedReports(6), { status: 201, statusText: 'Created' });
    await settle();
    expect(dialog()).toBeNull();
    expect(text(element.querySelector('[data-testid="report-notice"]'))).toBe(
      'Signed by Juno Hartwell: revision 1 is kept as signed.',
    );
  });

  it('shows the server’s refusal of a signature under the pad and of the name on its field', async () => {
    const { element } = await render();
    button(element, 'Customer signs')!.click();
    await settle();
    const open = dialog()!;
    const name = open.querySelector<HTMLInputElement>('[data-testid="signer-name"]')!;
    name.value = 'Juno Hartwell';
    name.dispatchEvent(new Event('input'));
    drawOn(open.querySelector('canvas')!, [
      [10, 10],
      [30, 16],
      [50, 22],
      [70, 14],
      [90, 20],
    ]);
    await settle();
    button(open, 'Sign')!.click();
    http.expectOne('/api/v1/jobs/6/report/signature').flush(
      {
        type: 'about:blank',
        title: 'Bad Request',
        status: 400,
        code: 'BAD_SIGNATURE',
        errors: [
          {
            path: 'signaturePng',
            message: 'The signature pad is empty: the customer draws their signature before signing.',
          },
          {
            path: 'signerName',
            message: 'The signer’s name holds U+202E, an invisible control or text-direction character.',
          },
        ],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();
    expect(text(open.querySelector('[data-testid="pad-error"]'))).toContain('The signature pad is empty');
    expect(text(open.querySelector('mat-error'))).toContain('holds U+202E');
    expect(dialog()).not.toBeNull();
  });

  it('sends the signed report to the address confirmed, and lists the sending', async () => {
    const { element } = await render(COMPLETED_MULCHER_JOB, signedReports(6));
    button(element, 'E-mail to the customer')!.click();
    await settle();
    const open = dialog()!;
    const to = open.querySelector<HTMLInputElement>('[data-testid="email-to"]')!;
    expect(to.value).toBe('office@aldercreek-clearing.test');
    to.value = 'Yard@AlderCreek-Clearing.test';
    to.dispatchEvent(new Event('input'));
    button(open, 'Send')!.click();
    const request = http.expectOne('/api/v1/jobs/6/report/email');
    expect(request.request.body).toEqual({ to: 'Yard@AlderCreek-Clearing.test', revision: 1 });
    request.flush(
      { ...signedReports(6).sendings[0]!, id: 5, to: 'yard@aldercreek-clearing.test' },
      { status: 201, statusText: 'Created' },
    );
    await settle();
    expect(dialog()).toBeNull();
    expect(text(element.querySelector('[data-testid="report-notice"]'))).toBe(
      'Sent to yard@aldercreek-clearing.test.',
    );
    http.expectOne('/api/v1/jobs/6/reports').flush(signedReports(6));
    await settle();
  });

  it('shows a refusal of the address on its field and keeps the dialog open', async () => {
    const { element } = await render(COMPLETED_MULCHER_JOB, { ...signedReports(6), customerEmail: null });
    button(element, 'E-mail to the customer')!.click();
    await settle();
    const open = dialog()!;
    expect(text(open)).toContain('The customer has no e-mail address on record: enter one.');
    const to = open.querySelector<HTMLInputElement>('[data-testid="email-to"]')!;
    to.value = 'office@elsewhere.test';
    to.dispatchEvent(new Event('input'));
    button(open, 'Send')!.click();
    http.expectOne('/api/v1/jobs/6/report/email').flush(
      {
        type: 'about:blank',
        title: 'Bad Request',
        status: 400,
        errors: [{ path: 'to', message: 'Enter an e-mail address such as name@example.com.' }],
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();
    expect(text(open.querySelector('mat-error'))).toBe('Enter an e-mail address such as name@example.com.');
    expect(dialog()).not.toBeNull();
  });
});
