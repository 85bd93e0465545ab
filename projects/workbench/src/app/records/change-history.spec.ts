import { TestBed } from '@angular/core/testing';
import { describe, expect, it } from 'vitest';
import { CUSTOMER_FIELDS } from '../customers/customer-form-model';
import { ChangeHistory, describeChange } from './change-history';
import { aChange } from './testing';

describe('describeChange', () => {
  it('says who changed which field from what to what', () => {
    expect(describeChange(aChange(), 'customer', CUSTOMER_FIELDS)).toEqual({
      headline: 'Dagny Fairbrook changed the phone number from “+44 1632 960 100” to “+44 1632 960 118”.',
      details: [],
    });
  });

  it('lists each field when several changed, and words setting and clearing', () => {
    const change = aChange({
      fields: [
        { field: 'email', before: null, after: 'yard@example.com' },
        { field: 'notes', before: 'Gate code 4412', after: null },
        { field: 'siteAddress', before: 'Home Farm', after: 'Low Barn' },
      ],
    });
    expect(describeChange(change, 'customer', CUSTOMER_FIELDS)).toEqual({
      headline: 'Dagny Fairbrook changed 3 fields:',
      details: [
        'set the e-mail address to “yard@example.com”',
        'cleared the notes (it was “Gate code 4412”)',
        'changed the site address from “Home Farm” to “Low Barn”',
      ],
    });
  });

  it('words the creation, archiving and restoring of the record', () => {
    const words = (action: 'created' | 'archived' | 'restored') =>
      describeChange(aChange({ action, fields: [] }), 'machine', {}).headline;
    expect(words('created')).toBe('Dagny Fairbrook added this machine.');
    expect(words('archived')).toBe('Dagny Fairbrook archived this machine.');
    expect(words('restored')).toBe('Dagny Fairbrook restored this machine.');
  });
});

describe('ChangeHistory', () => {
  it('lists the changes newest first with who, what and when', async () => {
    const fixture = TestBed.createComponent(ChangeHistory);
    fixture.componentRef.setInput('noun', 'customer');
    fixture.componentRef.setInput('fields', CUSTOMER_FIELDS);
    fixture.componentRef.setInput('changes', null);
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    expect(element.textContent).toContain('Fetching the history');

    fixture.componentRef.setInput('changes', [
      aChange(),
      aChange({ id: 30, version: 1, action: 'created', at: '2026-03-02T08:00:00.000Z', fields: [] }),
    ]);
    await fixture.whenStable();
    const items = [...element.querySelectorAll('.history > li')].map((item) =>
      [...item.querySelectorAll('p')].map((line) => line.textContent?.replace(/\s+/g, ' ').trim()).join(' '),
    );
    expect(items[0]).toMatch(
      /^Dagny Fairbrook changed the phone number from .* to .*\. 3 Dec 2026, \d\d:05 · version 3$/,
    );
    expect(items[1]).toMatch(/^Dagny Fairbrook added this customer\. 2 Mar 2026/);
    expect(element.querySelector('time')?.getAttribute('datetime')).toBe('2026-12-03T14:05:00.000Z');
  });

  it('says when there is nothing yet, and offers to try again after a failure', async () => {
    const fixture = TestBed.createComponent(ChangeHistory);
    fixture.componentRef.setInput('noun', 'customer');
    fixture.componentRef.setInput('changes', []);
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('No changes recorded yet.');

    let retried = 0;
    fixture.componentInstance.retry.subscribe(() => retried++);
    fixture.componentRef.setInput('failed', 'The server cannot be reached.');
    await fixture.whenStable();
    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('The history could not be fetched. The server cannot be reached.');
    alert?.querySelector('button')?.click();
    expect(retried).toBe(1);
  });
});
