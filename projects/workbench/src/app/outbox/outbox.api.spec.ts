import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ApplicationRef } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Outbox } from '../auth/api-types';
import { OutboxApi } from './outbox.api';

const OUTBOX: Outbox = {
  messages: [
    {
      id: 1,
      from: 'Counterpoise <noreply@example.com>',
      to: ['kaito@example.com'],
      subject: 'Marit Okafor invites you to Alder Ridge Rotor Service on Counterpoise',
      text: 'Hello,\n',
      html: null,
      receivedAt: '2026-05-07T08:00:00.000Z',
      attachments: [],
    },
  ],
};

describe('OutboxApi', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('reads the captured e-mail into a resource', async () => {
    const outbox = TestBed.runInInjectionContext(() => TestBed.inject(OutboxApi).listResource());
    TestBed.tick();
    const request = http.expectOne('/api/v1/outbox');
    expect(request.request.method).toBe('GET');
    request.flush(OUTBOX);
    await TestBed.inject(ApplicationRef).whenStable();
    expect(outbox.value()).toEqual(OUTBOX);
  });
});
