import { signal } from '@angular/core';
import type { AbstractControl } from '@angular/forms';
import type { Observable } from 'rxjs';

import { apiErrorBody, apiErrorMessage, apiFieldErrors } from '../core/api-error';

export interface FormSaveOptions<R> {
  /** What the page does with the answer (say so, go to the record). */
  saved: (answer: R) => void;
  /** The control a field the server names belongs to, if the form has one. */
  controlOf: (field: string) => AbstractControl | null | undefined;
}

/**
 * The saving side of a full-page form that sends one request and then leaves for the record it
 * saved: a refused form shows every field's error instead of sending, a second press while the
 * request runs does nothing (`busy` stays on while the page moves away), and a failure puts the
 * server's words under the fields it names (`fieldErrors`, and each control's `server` error)
 * and its message above the form (`problem`).
 */
export class FormSave {
  /** True while the request runs: the form's save button is disabled. */
  readonly busy = signal(false);
  /** The server's message for the last failure, or ''. */
  readonly problem = signal('');
  /** The server's words for each field it refused, by the field's name. */
  readonly fieldErrors = signal<Record<string, string>>({});

  /** Whether the form may be sent now; a refused form marks every field to show its error. */
  ready(form: AbstractControl): boolean {
    if (this.busy()) return false;
    if (form.invalid) {
      form.markAllAsTouched();
      return false;
    }
    return true;
  }

  send<R>(request: Observable<R>, { saved, controlOf }: FormSaveOptions<R>): void {
    this.busy.set(true);
    this.problem.set('');
    this.fieldErrors.set({});
    request.subscribe({
      next: saved,
      error: (error: unknown) => {
        this.busy.set(false);
        const fields = apiFieldErrors(error);
        this.fieldErrors.set(fields);
        for (const [field, message] of Object.entries(fields)) {
          const control = controlOf(field);
          if (control) {
            control.setErrors({ server: message });
            control.markAsTouched();
          }
        }
        this.problem.set(apiErrorBody(error)?.error.message ?? apiErrorMessage(error));
      },
    });
  }
}
