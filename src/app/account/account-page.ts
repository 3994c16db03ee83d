import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import {
  FormGroupDirective,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatRadioChange, MatRadioModule } from '@angular/material/radio';

import type { LengthJson } from '../../../shared/lengths';
import { PASSWORD_MIN_LENGTH, type LengthUnit } from '../../../shared/session-types';
import { apiErrorBody, apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { newPasswordValidators, repeatMatches } from '../core/password-validators';
import { ROLE_LABELS } from '../core/role-labels';
import { Session } from '../core/session';
import { NewPasswordFields } from '../ui/new-password-fields';
import { AccountApi } from './account-api';
import { FormAlert } from '../ui/form-alert';

/** 2.5555 in is exactly 64.9097 mm (1 in = 25.4 mm): a bore that reads cleanly in both units. */
const SAMPLE_BORE: LengthJson = { mm: '64.9097', in: '2.5555' };

/** Your own settings: the unit lengths show in, and your password. */
@Component({
  selector: 'app-account-page',
  imports: [
    FormAlert,
    LengthPipe,
    MatButtonModule,
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
    NewPasswordFields,
    MatRadioModule,
    ReactiveFormsModule,
  ],
  templateUrl: './account-page.html',
  styleUrl: './account-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AccountPage {
  private readonly api = inject(AccountApi);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  protected readonly user = this.session.user;
  protected readonly roleLabel = computed(() => {
    const user = this.user();
    return user ? ROLE_LABELS[user.role] : '';
  });
  protected readonly sample = SAMPLE_BORE;
  protected readonly minLength = PASSWORD_MIN_LENGTH;

  protected readonly savingUnit = signal(false);

  protected readonly passwordForm = inject(NonNullableFormBuilder).group(
    {
      currentPassword: ['', Validators.required],
      newPassword: ['', newPasswordValidators],
      repeat: ['', Validators.required],
    },
    { validators: repeatMatches('newPassword', 'repeat') },
  );
  protected readonly savingPassword = signal(false);
  protected readonly passwordProblem = signal('');

  protected chooseUnit(change: MatRadioChange<LengthUnit>): void {
    const previous = this.session.unit();
    this.savingUnit.set(true);
    this.api.setUnit(change.value).subscribe({
      next: (user) => {
        this.savingUnit.set(false);
        this.notifier.success(
          user.unit === 'in' ? 'Lengths now show in inches.' : 'Lengths now show in millimetres.',
        );
      },
      error: (error: unknown) => {
        this.savingUnit.set(false);
        change.source.radioGroup.value = previous; // the saved choice is still in force
        this.notifier.error(apiErrorMessage(error));
      },
    });
  }

  protected changePassword(formDirective: FormGroupDirective): void {
    if (this.savingPassword()) return;
    if (this.passwordForm.invalid) {
      this.passwordForm.markAllAsTouched();
      return;
    }
    const { currentPassword, newPassword } = this.passwordForm.getRawValue();
    this.savingPassword.set(true);
    this.passwordProblem.set('');
    this.api.changePassword(currentPassword, newPassword).subscribe({
      next: () => {
        this.savingPassword.set(false);
        // Resetting through the directive also clears "submitted", so no field turns red.
        formDirective.resetForm();
        this.notifier.success('Password changed. Use the new one next time you sign in.');
      },
      error: (error: unknown) => {
        this.savingPassword.set(false);
        this.passwordProblem.set(describePasswordFailure(error));
        const fields = apiFieldErrors(error);
        for (const key of ['currentPassword', 'newPassword'] as const) {
          if (fields[key]) {
            this.passwordForm.controls[key].setErrors({ server: fields[key] });
          }
        }
      },
    });
  }
}

function describePasswordFailure(error: unknown): string {
  if (error instanceof HttpErrorResponse && error.status === 401) {
    return apiErrorBody(error)?.error.message ?? 'Your current password is not right.';
  }
  return apiErrorMessage(error);
}
