import { HttpErrorResponse } from '@angular/common/http';
import { FormControl, FormGroup } from '@angular/forms';
import { Subject } from 'rxjs';
import { describe, expect, it } from 'vitest';
import { requiredWith } from '../shell/validators';
import { FormRequest } from './form-request';

function aForm() {
  return new FormGroup({
    email: new FormControl('', { nonNullable: true, validators: requiredWith('Enter the address.') }),
  });
}

const refusal = (status: number, body: object) =>
  new HttpErrorResponse({ status, error: body, statusText: 'Refused' });

describe('FormRequest', () => {
  it('sends nothing while the form is invalid, and shows its messages', () => {
    const form = aForm();
    const request = new FormRequest();
    let asked = 0;
    const sent = request.send(form, () => (asked++, new Subject<string>()), { sent: () => undefined });
    expect(sent).toBe(false);
    expect(asked).toBe(0);
    expect(form.controls.email.touched).toBe(true);
    expect(request.busy()).toBe(false);
  });

  it('is busy while the request runs, refuses a second, and is done with the answer', () => {
    const form = aForm();
    form.setValue({ email: 'marit@example.com' });
    const request = new FormRequest();
    const answer = new Subject<string>();
    const answers: string[] = [];
    expect(request.send(form, () => answer, { sent: (value) => answers.push(value) })).toBe(true);
    expect(request.busy()).toBe(true);
    expect(request.send(form, () => answer, { sent: (value) => answers.push(value) })).toBe(false);
    answer.next('sent');
    expect(answers).toEqual(['sent']);
    expect(request.busy()).toBe(false);
  });

  it('stays busy after the answer when the page leaves', () => {
    const form = aForm();
    form.setValue({ email: 'marit@example.com' });
    const request = new FormRequest();
    const answer = new Subject<string>();
    request.send(form, () => answer, { sent: () => undefined, leaves: true });
    answer.next('sent');
    expect(request.busy()).toBe(true);
  });

  it('puts a refusal’s field messages on their fields and the rest above the form, keeping what was typed', () => {
    const form = aForm();
    form.setValue({ email: 'marit@example.com' });
    const request = new FormRequest();
    const answer = new Subject<string>();
    request.send(form, () => answer, { sent: () => undefined });
    answer.error(
      refusal(400, {
        title: 'Bad Request',
        status: 400,
        errors: [{ path: 'email', message: 'Already invited.' }],
      }),
    );
    expect(form.controls.email.errors).toEqual({ server: 'Already invited.' });
    expect(form.controls.email.value).toBe('marit@example.com');
    expect(request.formError()).toBeNull();
    expect(request.busy()).toBe(false);

    const again = new Subject<string>();
    request.send(form, () => again, { sent: () => undefined });
    // The server's message on the field stays until the person changes it: nothing is sent meanwhile.
    expect(request.busy()).toBe(false);
    form.controls.email.setValue('ines@example.com');
    request.send(form, () => again, { sent: () => undefined });
    again.error(new HttpErrorResponse({ status: 0 }));
    expect(request.formError()).toContain('The server cannot be reached.');
  });

  it('says a refusal in the form’s own words, or leaves it to the page', () => {
    const form = aForm();
    form.setValue({ email: 'marit@example.com' });
    const request = new FormRequest();
    const first = new Subject<string>();
    request.send(form, () => first, { sent: () => undefined, refused: () => 'Those do not match.' });
    first.error(refusal(401, { title: 'Unauthorized', status: 401 }));
    expect(request.formError()).toBe('Those do not match.');

    const second = new Subject<string>();
    request.send(form, () => second, { sent: () => undefined, refused: () => 'handled' });
    second.error(refusal(502, { title: 'Bad Gateway', status: 502 }));
    expect(request.formError()).toBeNull();
    expect(request.busy()).toBe(true);
  });
});
