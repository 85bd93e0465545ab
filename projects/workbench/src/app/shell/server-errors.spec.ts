import { HttpErrorResponse } from '@angular/common/http';
import { FormControl, FormGroup } from '@angular/forms';
import { describe, expect, it } from 'vitest';
import { applyServerErrors, formErrorOf, httpErrorMessage, problemOf } from './server-errors';

function refusal(status: number, body: unknown = null): HttpErrorResponse {
  return new HttpErrorResponse({ status, error: body, url: '/api/v1/people' });
}

describe('server errors', () => {
  it('reads a problem only from a problem+json body', () => {
    const problem = { type: 'about:blank', title: 'Conflict', status: 409, detail: 'Already a member.' };
    expect(problemOf(refusal(409, problem))).toEqual(problem);
    expect(problemOf(refusal(502, '<html>Bad gateway</html>'))).toBeNull();
    expect(problemOf(new Error('not an answer'))).toBeNull();
  });

  it('words the statuses whose cause is known, and keeps the server’s detail otherwise', () => {
    expect(httpErrorMessage(refusal(0))).toContain('The server cannot be reached');
    expect(httpErrorMessage(refusal(403))).toBe('Your role does not allow this.');
    expect(httpErrorMessage(refusal(429))).toContain('Too many attempts');
    expect(httpErrorMessage(refusal(503, { title: 'Unavailable', status: 503, detail: 'stack…' }))).toBe(
      'The server ran into a problem. Try again in a moment.',
    );
    expect(
      httpErrorMessage(refusal(409, { title: 'Conflict', status: 409, detail: 'Already a member.' })),
    ).toBe('Already a member.');
    expect(httpErrorMessage(refusal(404))).toContain('no longer here');
    const mail = {
      title: 'Bad Gateway',
      status: 502,
      code: 'MAIL_NOT_SENT',
      detail: 'The mail server did not answer.',
    };
    expect(httpErrorMessage(refusal(502, mail))).toBe('The mail server did not answer.');
  });

  it('puts each field message on its control, whatever the form of the path', () => {
    const form = new FormGroup({
      email: new FormControl(''),
      address: new FormGroup({ city: new FormControl('') }),
      readings: new FormGroup({ 0: new FormGroup({ phaseDeg: new FormControl(0) }) }),
    });
    const unplaced = applyServerErrors(form, {
      type: 'about:blank',
      title: 'Bad Request',
      status: 400,
      errors: [
        { path: 'email', message: 'Taken.' },
        { path: '/address/city', message: 'Unknown city.' },
        { path: 'readings[0].phaseDeg', message: 'Between 0 and 360.' },
        { path: 'colour', message: 'No such field here.' },
        { path: '', message: 'The request as a whole.' },
      ],
    });
    expect(form.get('email')?.errors).toEqual({ server: 'Taken.' });
    expect(form.get('email')?.touched).toBe(true);
    expect(form.get('address.city')?.errors).toEqual({ server: 'Unknown city.' });
    expect(form.get('readings.0.phaseDeg')?.errors).toEqual({ server: 'Between 0 and 360.' });
    expect(unplaced).toEqual(['No such field here.', 'The request as a whole.']);
  });

  it('gives the form a sentence only for what found no field', () => {
    const form = new FormGroup({ email: new FormControl('') });
    const onField = { title: 'Bad Request', status: 400, errors: [{ path: 'email', message: 'Taken.' }] };
    expect(formErrorOf(form, refusal(400, onField))).toBeNull();
    expect(formErrorOf(form, refusal(0))).toContain('The server cannot be reached');
  });
});
