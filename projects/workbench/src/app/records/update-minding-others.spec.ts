import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ApplicationRef, ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatDialog } from '@angular/material/dialog';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { CUSTOMER_FIELDS, customerFields } from '../customers/customer-form-model';
import { type Customer, CustomersApi, type UpdateCustomer } from '../customers/customers.api';
import { aChange, aCustomer } from './testing';
import { type UpdateOutcome, updateMindingOthers } from './update-minding-others';

/** A fixture to reach the document's overlays from. */
@Component({ selector: 'app-empty-host', template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class EmptyHost {}

describe('updateMindingOthers', { timeout: 20_000 }, () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  const base = { record: aCustomer(), etag: '"3"' };
  const theirs = aCustomer({
    version: 4,
    phone: '+44 1632 960 555',
    notes: 'Gate code 4412',
    updatedAt: '2026-12-03T14:05:00.000Z',
  });

  /** Sends a phone change on version 3; the server answers that version 4 was saved meanwhile. */
  async function changeMeanwhile() {
    const outcomes: UpdateOutcome<Customer>[] = [];
    const errors: unknown[] = [];
    updateMindingOthers<Customer, UpdateCustomer>({
      api: TestBed.inject(CustomersApi),
      dialog: TestBed.inject(MatDialog),
      noun: 'customer',
      fields: CUSTOMER_FIELDS,
      base,
      change: { phone: '+44 1632 960 999' },
      fieldsOf: customerFields,
    }).subscribe({
      next: (outcome) => outcomes.push(outcome),
      error: (error: unknown) => errors.push(error),
    });
    const first = http.expectOne({ method: 'PATCH', url: '/api/v1/customers/7' });
    expect(first.request.headers.get('If-Match')).toBe('"3"');
    first.flush(
      {
        type: 'about:blank',
        title: 'Precondition Failed',
        status: 412,
        code: 'CHANGED_MEANWHILE',
        current: theirs,
      },
      { status: 412, statusText: 'Precondition Failed', headers: { ETag: '"4"' } },
    );
    http.expectOne('/api/v1/customers/7/history').flush({ changes: [aChange({ version: 4 })] });
    await TestBed.inject(ApplicationRef).whenStable();
    const overlays = TestbedHarnessEnvironment.documentRootLoader(TestBed.createComponent(EmptyHost));
    const dialog = await overlays.getHarness(MatDialogHarness);
    return { outcomes, errors, dialog };
  }

  it('shows their version beside yours, field by field, naming who saved it', async () => {
    const { dialog } = await changeMeanwhile();
    expect(await dialog.getTitleText()).toBe('Changed by someone else meanwhile');
    const text = (await dialog.getContentText()).replace(/\s+/g, ' ');
    expect(text).toContain('Dagny Fairbrook saved this customer at');
    expect(text).toMatch(
      /Phone number.*changed by both\s*Theirs \(saved\)\s*“\+44 1632 960 555”\s*Yours\s*“\+44 1632 960 999”/,
    );
    expect(text).toMatch(
      /Notes\s*Theirs \(saved\)\s*“Gate code 4412”\s*Yours\s*not changed by you: theirs stays either way/,
    );
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Back to my edit' }))).click();
  });

  it('keeps yours on top of theirs: sends your fields again with their ETag', async () => {
    const { outcomes, dialog } = await changeMeanwhile();
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Keep mine on top of theirs' }))).click();
    const again = http.expectOne({ method: 'PATCH', url: '/api/v1/customers/7' });
    expect(again.request.headers.get('If-Match')).toBe('"4"');
    expect(again.request.body).toEqual({ phone: '+44 1632 960 999' });
    const saved = aCustomer({ version: 5, phone: '+44 1632 960 999', notes: 'Gate code 4412' });
    again.flush(saved, { headers: { ETag: '"5"' } });
    expect(outcomes).toEqual([{ kind: 'saved', versioned: { record: saved, etag: '"5"' } }]);
  });

  it('takes theirs: answers their version, sending nothing', async () => {
    const { outcomes, dialog } = await changeMeanwhile();
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Take theirs' }))).click();
    await TestBed.inject(ApplicationRef).whenStable();
    http.expectNone({ method: 'PATCH' });
    expect(outcomes).toEqual([{ kind: 'took-theirs', versioned: { record: theirs, etag: '"4"' } }]);
  });

  it('passes any other refusal on untouched', () => {
    const errors: unknown[] = [];
    updateMindingOthers<Customer, UpdateCustomer>({
      api: TestBed.inject(CustomersApi),
      dialog: TestBed.inject(MatDialog),
      noun: 'customer',
      fields: CUSTOMER_FIELDS,
      base,
      change: { email: 'yard' },
      fieldsOf: customerFields,
    }).subscribe({ error: (error: unknown) => errors.push(error) });
    http.expectOne('/api/v1/customers/7').flush(
      { title: 'Bad Request', status: 400, errors: [{ path: 'email', message: 'No.' }] },
      {
        status: 400,
        statusText: 'Bad Request',
      },
    );
    expect(errors).toHaveLength(1);
  });
});
