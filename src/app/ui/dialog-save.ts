import { inject, signal } from '@angular/core';
import type { AbstractControl } from '@angular/forms';
import { MatDialogRef } from '@angular/material/dialog';
import type { Observable } from 'rxjs';

import { apiErrorMessage } from '../core/api-error';

export interface DialogSaveOptions {
  /**
   * Runs when the request fails, before the sentence is shown: to put the server's words under
   * the fields they name. A returned sentence is shown instead of the server's message.
   */
  failed?: (error: unknown) => string | void;
}

/**
 * The saving side of a dialog that sends one request and closes with its answer: a refused form
 * shows every field's error instead of sending, a second press while the request runs does
 * nothing, and a failure keeps the dialog open with the reason (`problem`) above the form.
 * Create it in a field initializer (it injects the dialog's ref).
 */
export class DialogSave<R> {
  private readonly dialogRef = inject<MatDialogRef<unknown, R>>(MatDialogRef);

  /** True while the request runs: the dialog's save button is disabled. */
  readonly busy = signal(false);
  /** Why the last request failed, or ''. */
  readonly problem = signal('');

  submit(
    form: AbstractControl,
    request: () => Observable<R>,
    options: DialogSaveOptions = {},
  ): void {
    if (this.busy()) return;
    if (form.invalid) {
      form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.problem.set('');
    request().subscribe({
      next: (answer) => this.dialogRef.close(answer),
      error: (error: unknown) => {
        this.busy.set(false);
        this.problem.set(options.failed?.(error) || apiErrorMessage(error));
      },
    });
  }
}
