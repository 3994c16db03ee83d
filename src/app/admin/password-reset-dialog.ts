import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';

import { PASSWORD_MIN_LENGTH } from '../../../shared/session-types';
import { apiErrorMessage } from '../core/api-error';
import { newPasswordValidators, repeatMatches } from '../core/password-validators';
import { UsersApi, type UserRow } from './users-api';

/** Sets a new password for someone who forgot theirs; closes with the updated user. */
@Component({
  selector: 'app-password-reset-dialog',
  imports: [
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  templateUrl: './password-reset-dialog.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PasswordResetDialog {
  private readonly api = inject(UsersApi);
  private readonly dialogRef = inject<MatDialogRef<PasswordResetDialog, UserRow>>(MatDialogRef);
  protected readonly user = inject<UserRow>(MAT_DIALOG_DATA);

  protected readonly minLength = PASSWORD_MIN_LENGTH;
  protected readonly form = inject(NonNullableFormBuilder).group(
    {
      password: ['', newPasswordValidators],
      repeat: ['', Validators.required],
    },
    { validators: repeatMatches('password', 'repeat') },
  );
  protected readonly busy = signal(false);
  protected readonly problem = signal('');

  protected submit(): void {
    if (this.busy()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.problem.set('');
    this.api.update(this.user.id, { password: this.form.getRawValue().password }).subscribe({
      next: (user) => this.dialogRef.close(user),
      error: (error: unknown) => {
        this.busy.set(false);
        this.problem.set(apiErrorMessage(error));
      },
    });
  }
}
