import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatTooltipModule } from '@angular/material/tooltip';

import { PASSWORD_MIN_LENGTH, ROLES, type Role } from '../../../shared/session-types';
import { apiErrorBody, apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { newPasswordValidators } from '../core/password-validators';
import { ROLE_LABELS, ROLE_SUMMARIES } from '../core/role-labels';
import { UsersApi, type UserRow } from './users-api';

const FIELDS = ['name', 'email', 'role', 'password'] as const;
type Field = (typeof FIELDS)[number];

function isField(name: string): name is Field {
  return (FIELDS as readonly string[]).includes(name);
}

/** Adds a person who may sign in; closes with the new user, or with nothing when cancelled. */
@Component({
  selector: 'app-user-add-dialog',
  imports: [
    MatTooltipModule,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  templateUrl: './user-add-dialog.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UserAddDialog {
  private readonly api = inject(UsersApi);
  private readonly dialogRef = inject<MatDialogRef<UserAddDialog, UserRow>>(MatDialogRef);

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
  protected readonly busy = signal(false);
  protected readonly problem = signal('');
  /** Messages the server attached to single fields, shown under each field. */
  protected readonly serverErrors = signal<Partial<Record<Field, string>>>({});
  protected readonly showPassword = signal(false);

  protected submit(): void {
    if (this.busy()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    if (!value.role) return; // unreachable: the role control is required
    this.busy.set(true);
    this.problem.set('');
    this.serverErrors.set({});
    this.api
      .create({
        name: value.name.trim(),
        email: value.email.trim(),
        role: value.role,
        password: value.password,
      })
      .subscribe({
        next: (user) => this.dialogRef.close(user),
        error: (error: unknown) => {
          this.busy.set(false);
          this.showServerErrors(error);
        },
      });
  }

  private showServerErrors(error: unknown): void {
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
    this.problem.set(allPlaced && summary ? summary : apiErrorMessage(error));
  }
}
