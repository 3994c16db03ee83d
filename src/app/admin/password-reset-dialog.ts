import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';

import { newPasswordValidators, repeatMatches } from '../core/password-validators';
import { UsersApi, type UserRow } from './users-api';
import { DialogSave } from '../ui/dialog-save';
import { NewPasswordFields } from '../ui/new-password-fields';
import { FormAlert } from '../ui/form-alert';

/** Sets a new password for someone who forgot theirs; closes with the updated user. */
@Component({
  selector: 'app-password-reset-dialog',
  imports: [FormAlert, MatButtonModule, MatDialogModule, NewPasswordFields, ReactiveFormsModule],
  templateUrl: './password-reset-dialog.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PasswordResetDialog {
  private readonly api = inject(UsersApi);
  protected readonly user = inject<UserRow>(MAT_DIALOG_DATA);

  protected readonly form = inject(NonNullableFormBuilder).group(
    {
      password: ['', newPasswordValidators],
      repeat: ['', Validators.required],
    },
    { validators: repeatMatches('password', 'repeat') },
  );
  protected readonly save = new DialogSave<UserRow>();

  protected submit(): void {
    this.save.submit(this.form, () =>
      this.api.update(this.user.id, { password: this.form.getRawValue().password }),
    );
  }
}
