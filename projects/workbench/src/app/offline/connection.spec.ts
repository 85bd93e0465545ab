import { HttpErrorResponse } from '@angular/common/http';
import { TestBed } from '@angular/core/testing';
import { afterEach, describe, expect, it } from 'vitest';
import { Connection, HEALTH_PROBE, isNoAnswer } from './connection';

describe('isNoAnswer', () => {
  it('tells no answer at all from an answer', () => {
    expect(isNoAnswer(new HttpErrorResponse({ status: 0 }))).toBe(true);
    // The service worker's own 504 when its fetch fails has no problem body.
    expect(isNoAnswer(new HttpErrorResponse({ status: 504, error: null }))).toBe(true);
    expect(isNoAnswer(new HttpErrorResponse({ status: 504, error: { title: 'Timeout', status: 504 } }))).toBe(
      false,
    );
    expect(isNoAnswer(new HttpErrorResponse({ status: 500 }))).toBe(false);
    expect(isNoAnswer(new Error('boom'))).toBe(false);
  });
});

describe('Connection', () => {
  let answers: boolean[] = [];

  function connection(): Connection {
    TestBed.configureTestingModule({
      providers: [{ provide: HEALTH_PROBE, useValue: async () => answers.shift() ?? false }],
    });
    return TestBed.inject(Connection);
  }

  afterEach(() => {
    answers = [];
    TestBed.resetTestingModule();
  });

  it('goes offline on a request with no answer and online on an answer', () => {
    const status = connection();
    expect(status.online()).toBe(true);
    status.reportNoAnswer();
    expect(status.online()).toBe(false);
    status.reportAnswer();
    expect(status.online()).toBe(true);
  });

  it('asks the server whether it is back, and believes its answer', async () => {
    const status = connection();
    status.reportNoAnswer();
    answers = [false, true];
    await expect(status.check()).resolves.toBe(false);
    expect(status.online()).toBe(false);
    await expect(status.check()).resolves.toBe(true);
    expect(status.online()).toBe(true);
  });

  it('hears the browser say it went offline', () => {
    const status = connection();
    window.dispatchEvent(new Event('offline'));
    expect(status.online()).toBe(false);
  });
});
