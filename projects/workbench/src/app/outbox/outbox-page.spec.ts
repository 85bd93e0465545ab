import { BreakpointObserver, type BreakpointState } from '@angular/cdk/layout';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter, Router, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { BehaviorSubject, map } from 'rxjs';
import { RouteStandIn } from '../auth/testing';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { Outbox } from '../auth/api-types';
import { MASKED_SECRET } from './message-text';
import { OutboxPage } from './outbox-page';
import { OUTBOX_URL } from './outbox.api';

const ORIGIN = window.location.origin;
const OUTBOX: Outbox = {
  messages: [
    {
      id: 1,
      from: 'Counterpoise <no-reply@example.com>',
      to: ['kaito@example.com'],
      subject: 'You are invited to Alder Ridge Rotor Service',
      text: 'Marit Okafor invites you to join.\n\nAccept: https://shop.example.com/accept-invitation?token=inv-1\n',
      html: '<p>Marit Okafor invites you to join.</p>',
      receivedAt: '2026-05-04T08:00:00.000Z',
      attachments: [],
    },
    {
      id: 2,
      from: 'Counterpoise <no-reply@example.com>',
      to: ['suvi@example.com', 'records@example.com'],
      subject: 'Set a new password',
      text: `Choose a new password here: ${ORIGIN}/reset-password?token=rst-2\nThe link works once.`,
      html: null,
      receivedAt: '2026-05-05T09:30:00.000Z',
      attachments: [],
    },
  ],
};

describe('OutboxPage', () => {
  let http: HttpTestingController;
  const twoPanes = new BehaviorSubject(true);

  beforeEach(() => {
    twoPanes.next(true);
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter(
          [
            { path: 'outbox', component: OutboxPage },
            { path: 'reset-password', component: RouteStandIn, data: { heading: 'Reset' } },
          ],
          withComponentInputBinding(),
        ),
        {
          provide: BreakpointObserver,
          useValue: {
            observe: () => twoPanes.pipe(map((matches): BreakpointState => ({ matches, breakpoints: {} }))),
          },
        },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  async function open(url = '/outbox') {
    const harness = await RouterTestingHarness.create();
    const navigation = harness.navigateByUrl(url);
    await navigation;
    http.expectOne(OUTBOX_URL).flush(OUTBOX);
    await harness.fixture.whenStable();
    return { harness, element: () => harness.routeNativeElement as HTMLElement };
  }

  it('lists the messages newest first, with their recipients', async () => {
    const { element } = await open();
    const items = [...element().querySelectorAll('.item')];
    expect(items.map((item) => item.querySelector('.item__subject')?.textContent?.trim())).toEqual([
      'Set a new password',
      'You are invited to Alder Ridge Rotor Service',
    ]);
    expect(items[0]?.textContent).toContain('To suvi@example.com, records@example.com');
    expect(element().querySelector('.placeholder')?.textContent).toContain('Choose a message to read it.');
  });

  it('opens a message from the list and shows its text with working links', async () => {
    const { harness, element } = await open();
    element().querySelectorAll<HTMLAnchorElement>('.item')[1]?.click();
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/outbox?message=1');

    const message = element().querySelector('article');
    expect(message?.querySelector('h2')?.textContent).toBe('You are invited to Alder Ridge Rotor Service');
    expect(message?.querySelector('.body')?.textContent).toBe(OUTBOX.messages[0]?.text);
    const link = message?.querySelector<HTMLAnchorElement>('.body a');
    expect(link?.getAttribute('href')).toBe('https://shop.example.com/accept-invitation?token=inv-1');
    expect(link?.target).toBe('_blank');
    expect(link?.rel).toBe('noopener noreferrer');
    expect(message?.textContent).toContain('the plain text is shown');
    expect(element().querySelector('[aria-current=true]')?.textContent).toContain('You are invited');
  });

  it('follows a link to this app inside the page', async () => {
    const { harness, element } = await open('/outbox?message=2');
    const link = element().querySelector<HTMLAnchorElement>('.body a');
    expect(link?.target).toBe('');
    link?.click();
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/reset-password?token=rst-2');
  });

  it('shows a masked link as text and says why it cannot be followed', async () => {
    const text = `Accept: https://shop.example.com/accept-invitation?token=${MASKED_SECRET}\n`;
    const harness = await RouterTestingHarness.create('/outbox?message=3');
    http.expectOne(OUTBOX_URL).flush({
      messages: [{ ...OUTBOX.messages[0]!, id: 3, text, html: null }],
    });
    await harness.fixture.whenStable();
    const message = (harness.routeNativeElement as HTMLElement).querySelector('article');
    expect(message?.querySelector('.body')?.textContent).toBe(text);
    expect(message?.querySelector('.body a')).toBeNull();
    expect(message?.querySelector('.note')?.textContent).toContain(
      `without the secret part of its links (shown as ${MASKED_SECRET})`,
    );
  });

  it('shows the list or the open message on a phone, with the way back', async () => {
    twoPanes.next(false);
    const { element } = await open('/outbox?message=2');
    expect(element().querySelector('nav')).toBeNull();
    expect(element().querySelector('a.back')?.getAttribute('href')).toBe('/outbox');
  });

  it('moves the focus to the message opened on a phone, and back to its entry afterwards', async () => {
    twoPanes.next(false);
    const { harness, element } = await open();
    element().querySelectorAll<HTMLAnchorElement>('.item')[1]?.click();
    await harness.fixture.whenStable();
    expect(document.activeElement?.id).toBe('message-subject');

    element().querySelector<HTMLAnchorElement>('a.back')?.click();
    await harness.fixture.whenStable();
    expect(document.activeElement?.id).toBe('message-1');
  });

  it('lists a report’s PDF with the message and downloads it through the data service', async () => {
    const report = {
      ...OUTBOX.messages[1]!,
      id: 4,
      subject: 'Service report J-000042 from Ridgeline Rotor Service',
      text: 'The report is attached as a PDF file.\n',
      attachments: [
        { id: 9, filename: 'report-J-000042-r1.pdf', contentType: 'application/pdf', byteSize: 48213 },
      ],
    };
    const created: string[] = [];
    const clicked: string[] = [];
    URL.createObjectURL = vi.fn((blob: Blob) => {
      created.push(blob.type);
      return 'blob:report';
    });
    URL.revokeObjectURL = vi.fn();
    const click = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
      this: HTMLAnchorElement,
    ) {
      clicked.push(this.download);
    });
    try {
      const harness = await RouterTestingHarness.create('/outbox?message=4');
      http.expectOne(OUTBOX_URL).flush({ messages: [report] });
      await harness.fixture.whenStable();
      const element = harness.routeNativeElement as HTMLElement;
      expect(element.querySelector('.item')?.textContent).toContain('1 attachment');
      const button = element.querySelector<HTMLButtonElement>('[data-testid=attachments] button');
      expect(button?.textContent).toContain('report-J-000042-r1.pdf');
      expect(button?.textContent).toContain('(47 kB)');
      button?.click();
      const request = http.expectOne(`${OUTBOX_URL}/4/attachments/9`);
      expect(request.request.responseType).toBe('blob');
      request.flush(new Blob(['%PDF-1.7'], { type: 'application/pdf' }), {
        headers: { 'Content-Disposition': 'attachment; filename="report-J-000042-r1.pdf"' },
      });
      await harness.fixture.whenStable();
      expect(created).toEqual(['application/pdf']);
      expect(clicked).toEqual(['report-J-000042-r1.pdf']);
    } finally {
      click.mockRestore();
    }
  });

  it('says when an attachment cannot be fetched', async () => {
    const report = {
      ...OUTBOX.messages[1]!,
      id: 5,
      attachments: [
        { id: 10, filename: 'report-J-000042-r2.pdf', contentType: 'application/pdf', byteSize: 900 },
      ],
    };
    const harness = await RouterTestingHarness.create('/outbox?message=5');
    http.expectOne(OUTBOX_URL).flush({ messages: [report] });
    await harness.fixture.whenStable();
    const element = harness.routeNativeElement as HTMLElement;
    element.querySelector<HTMLButtonElement>('[data-testid=attachments] button')?.click();
    http
      .expectOne(`${OUTBOX_URL}/5/attachments/10`)
      .flush(new Blob(['{}']), { status: 404, statusText: 'Not Found' });
    await harness.fixture.whenStable();
    expect(element.querySelector('.attachments__error')?.textContent).toContain(
      'report-J-000042-r2.pdf could not be fetched.',
    );
  });

  it('says when nothing has been sent yet', async () => {
    const harness = await RouterTestingHarness.create('/outbox');
    http.expectOne(OUTBOX_URL).flush({ messages: [] });
    await harness.fixture.whenStable();
    expect(harness.routeNativeElement?.textContent).toContain('No e-mail has been sent yet.');
  });

  it('says when the outbox cannot be fetched, and tries again on request', async () => {
    const harness = await RouterTestingHarness.create('/outbox');
    http.expectOne(OUTBOX_URL).error(new ProgressEvent('error'));
    await harness.fixture.whenStable();
    const element = harness.routeNativeElement as HTMLElement;
    expect(element.querySelector('[role=alert]')?.textContent).toContain('The server cannot be reached');
    [...element.querySelectorAll('button')]
      .find((button) => button.textContent?.includes('Try again'))
      ?.click();
    harness.fixture.detectChanges();
    http.expectOne(OUTBOX_URL).flush(OUTBOX);
  });
});
