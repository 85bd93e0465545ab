import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { JobsExport, lastDayOf } from './jobs-export';

@Component({
  imports: [JobsExport],
  template: `<app-jobs-export [from]="from()" [to]="to()" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly from = signal('');
  readonly to = signal('');
}

const text = (element: Element | null | undefined) => element?.textContent?.replace(/\s+/g, ' ').trim() ?? '';

describe('JobsExport', () => {
  let http: HttpTestingController;
  const saved: { name: string; type: string; url: string }[] = [];

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    saved.length = 0;
    // jsdom has no object URLs and does not download: record what the browser would be handed.
    vi.stubGlobal(
      'URL',
      Object.assign(URL, {
        createObjectURL: (blob: Blob) => `blob:test/${blob.size}`,
        revokeObjectURL: () => undefined,
      }),
    );
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      saved.push({ name: this.download, type: '', url: this.href });
    });
  });

  afterEach(() => {
    http.verify();
    vi.restoreAllMocks();
    vi.unstubAllGlobals();
  });

  async function render(from = '', to = '') {
    const fixture = TestBed.createComponent(Host);
    fixture.componentInstance.from.set(from);
    fixture.componentInstance.to.set(to);
    fixture.detectChanges();
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    const input = (label: string) =>
      [...element.querySelectorAll('mat-form-field')]
        .find((field) => text(field.querySelector('mat-label')) === label)!
        .querySelector('input')!;
    return { fixture, element, input };
  }

  it('starts from the list’s date filters and saves the file the server sends', async () => {
    const { fixture, element, input } = await render('2026-01-01', '2026-03-31');
    expect(input('First day').value).toBe('2026-01-01');
    expect(input('Last day').value).toBe('2026-03-31');
    element.querySelector('form')!.dispatchEvent(new Event('submit'));
    fixture.detectChanges();
    const request = http.expectOne(
      (candidate) =>
        candidate.url === '/api/v1/exports/jobs.csv' &&
        candidate.params.get('from') === '2026-01-01' &&
        candidate.params.get('to') === '2026-03-31',
    );
    request.flush(new Blob(['\uFEFFJob no.\r\n'], { type: 'text/csv' }), {
      headers: {
        'Content-Disposition': 'attachment; filename=counterpoise-jobs-2026-01-01-to-2026-03-31.csv',
      },
    });
    fixture.detectChanges();
    await fixture.whenStable();
    expect(saved.map((file) => file.name)).toEqual(['counterpoise-jobs-2026-01-01-to-2026-03-31.csv']);
    expect(text(element.querySelector('[role="status"]'))).toContain(
      'Saved counterpoise-jobs-2026-01-01-to-2026-03-31.csv.',
    );
  });

  it('refuses a range backwards or over three years before asking the server', async () => {
    const { fixture, element, input } = await render('2026-03-01', '2026-02-01');
    element.querySelector('form')!.dispatchEvent(new Event('submit'));
    fixture.detectChanges();
    http.expectNone('/api/v1/exports/jobs.csv');
    expect(text(element.querySelector('mat-error'))).toBe('The last day is before the first.');
    input('Last day').value = '2029-03-01';
    input('Last day').dispatchEvent(new Event('input'));
    element.querySelector('form')!.dispatchEvent(new Event('submit'));
    fixture.detectChanges();
    expect(text(element.querySelector('mat-error'))).toBe(
      'One file covers at most 3 years: end on 2029-02-28 or earlier.',
    );
    expect(lastDayOf('2024-02-29')).toBe('2027-02-28');
  });

  it('puts the server’s refusal on the field it names', async () => {
    const { fixture, element } = await render('2026-01-01', '2026-01-31');
    element.querySelector('form')!.dispatchEvent(new Event('submit'));
    fixture.detectChanges();
    const problem = {
      type: 'about:blank',
      title: 'Bad Request',
      status: 400,
      errors: [{ path: 'from', message: 'Write from as a day of the calendar, YYYY-MM-DD.' }],
    };
    http
      .expectOne((candidate) => candidate.url === '/api/v1/exports/jobs.csv')
      .flush(new Blob([JSON.stringify(problem)], { type: 'application/problem+json' }), {
        status: 400,
        statusText: 'Bad Request',
      });
    await fixture.whenStable();
    fixture.detectChanges();
    expect(text(element.querySelector('mat-error'))).toBe('Write from as a day of the calendar, YYYY-MM-DD.');
    expect(saved).toEqual([]);
  });
});
