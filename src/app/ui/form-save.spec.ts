import { HttpErrorResponse } from '@angular/common/http';
import { FormControl, FormGroup, Validators } from '@angular/forms';
import { Subject } from 'rxjs';

import { FormSave } from './form-save';

/** A refusal as the server's one error handler writes it. */
function refused(
  message: string,
  details: { field: string; message: string }[],
): HttpErrorResponse {
  return new HttpErrorResponse({
    status: 400,
    error: { error: { code: 'validation_failed', message, details } },
  });
}

describe('FormSave', () => {
  function setUp() {
    const form = new FormGroup({
      name: new FormControl('', { nonNullable: true, validators: Validators.required }),
      sizes: new FormGroup({ bore: new FormControl('64.00', { nonNullable: true }) }),
    });
    const save = new FormSave();
    const saved: string[] = [];
    const send = (answer: Subject<string>) =>
      save.send(answer, {
        saved: (a) => saved.push(a),
        controlOf: (field) => form.controls.sizes.get(field) ?? form.get(field),
      });
    return { form, save, saved, send };
  }

  it('when the form is refused, then nothing may be sent and every field shows its error', () => {
    const { form, save } = setUp();
    expect(save.ready(form)).toBe(false);
    expect(form.controls.name.touched).toBe(true);
  });

  it('when a request runs, then a second press may not send, and the answer goes to the page', () => {
    const { form, save, saved, send } = setUp();
    form.controls.name.setValue('Kestrel Parts');
    expect(save.ready(form)).toBe(true);
    const answer = new Subject<string>();
    send(answer);
    expect(save.busy()).toBe(true);
    expect(save.ready(form)).toBe(false);
    answer.next('saved');
    expect(saved).toEqual(['saved']);
  });

  it('when the server refuses fields, then its words sit under them, its message above, and the form may be sent again', () => {
    const { form, save, send } = setUp();
    form.controls.name.setValue('Kestrel Parts');
    const answer = new Subject<string>();
    send(answer);
    answer.error(
      refused('Check the marked fields.', [
        { field: 'bore', message: 'Must be more than 0.' },
        { field: 'name', message: 'That name is taken.' },
      ]),
    );
    expect(save.busy()).toBe(false);
    expect(save.problem()).toBe('Check the marked fields.');
    expect(save.fieldErrors()).toEqual({
      bore: 'Must be more than 0.',
      name: 'That name is taken.',
    });
    expect(form.controls.sizes.controls.bore.getError('server')).toBe('Must be more than 0.');
    expect(form.controls.name.getError('server')).toBe('That name is taken.');
    expect(form.controls.sizes.controls.bore.touched).toBe(true);
    expect(save.ready(form)).toBe(false); // the marked fields are refused until they change
    form.controls.name.setValue('Kestrel Parts Ltd');
    form.controls.sizes.controls.bore.setValue('64.25');
    expect(save.ready(form)).toBe(true);
  });
});
