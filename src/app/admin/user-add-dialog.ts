import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import { PASSWORD_MIN_LENGTH, ROLES, type Role } from '../../../shared/session-types';
import { apiErrorBody, apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { newPasswordValidators } from '../core/password-validators';
import { ROLE_LABELS, ROLE_SUMMARIES } from '../core/role-labels';
import { UsersApi, type UserRow } from './users-api';
import { DialogSave } from '../ui/dialog-save';
import { RevealPassword } from '../ui/reveal-password';
import { DialogForm } from '../ui/dialog-form';

const FIELDS = ['name', 'email', 'role', 'password'] as const;
type Field = (typeof FIELDS)[number];

function isField(name: string): name is Field {
  return (FIELDS as readonly string[]).includes(name);
}

/** Adds a person who may sign in; closes with the new user, or with nothing when cancelled. */
@Component({
  selector: 'app-user-add-dialog',
  imports: [
    DialogForm,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
    RevealPassword,
  ],
  templateUrl: './user-add-dialog.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UserAddDialog {
  private readonly api = inject(UsersApi);

  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly roleSummaries = ROLE_SUMMARIES;
  protected readonly minLength = PASSWORD_MIN_LENGTH;

  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly form = this.fb.group({
    name: ['', [Validators.required, Validators.maxLength(120)]],
    email: ['', [Validators.required, Validators.email, Validators.maxLength(254)]],
    role: this.fb.control<Role | ''>('', Validators.required),
    password: ['', newPasswordValidators],
  });
  protected readonly save = new DialogSave<UserRow>();
  /** Messages the server attached to single fields, shown under each field. */
  protected readonly serverErrors = signal<Partial<Record<Field, string>>>({});

  protected submit(): void {
    const value = this.form.getRawValue();
    this.save.submit(
      this.form,
      () => {
        this.serverErrors.set({});
        return this.api.create({
          name: value.name.trim(),
          email: value.email.trim(),
          role: value.role as Role, // sent only when the form is valid, and the role is required
          password: value.password,
        });
      },
      { failed: (error) => this.showServerErrors(error) },
    );
  }

  /** Puts the server's words under the fields they name; answers the sentence to show above. */
  private showServerErrors(error: unknown): string {
    const fields = Object.entries(apiFieldErrors(error));
    const known: Partial<Record<Field, string>> = {};
    for (const [field, message] of fields) {
      if (isField(field)) {
        known[field] = message;
        this.form.controls[field].setErrors({ server: true });
        this.form.controls[field].markAsTouched();
      }
    }
    this.serverErrors.set(known);
    // The general message always shows (a conflict such as a taken e-mail may carry no field);
    // details about fields this form does not have are spelled out in it.
    const allPlaced = fields.every(([field]) => isField(field));
    const summary = apiErrorBody(error)?.error.message;
    return allPlaced && summary ? summary : apiErrorMessage(error);
  }
}
