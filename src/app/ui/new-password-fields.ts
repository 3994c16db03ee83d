import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { ControlContainer, ReactiveFormsModule, type AbstractControl } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

import { PASSWORD_MIN_LENGTH } from '../../../shared/session-types';

/**
 * A new password and the same again, inside the form that owns them (its group has the two
 * controls, with `newPasswordValidators` and `repeatMatches`): the fields, the hint and the
 * errors in the form's own words; a reason the server gave for the new one shows under it.
 */
@Component({
  selector: 'app-new-password-fields',
  imports: [MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  // The fields join the enclosing form, as if written in it (the control's name stays on the
  // input as an attribute too, as a static formControlName would leave it).
  viewProviders: [
    { provide: ControlContainer, useFactory: () => inject(ControlContainer, { skipSelf: true }) },
  ],
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>New password</mat-label>
      <input
        matInput
        type="password"
        [formControlName]="control()"
        [attr.formControlName]="control()"
        autocomplete="new-password"
        required
      />
      <mat-hint>{{ hint() }}</mat-hint>
      @if (field(control())?.hasError('required')) {
        <mat-error>{{ missing() }}</mat-error>
      } @else if (field(control())?.hasError('minlength')) {
        <mat-error>Use at least {{ minLength }} characters.</mat-error>
      } @else if (field(control())?.getError('server'); as message) {
        <mat-error>{{ message }}</mat-error>
      }
    </mat-form-field>

    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>New password again</mat-label>
      <input
        matInput
        type="password"
        [formControlName]="repeat()"
        [attr.formControlName]="repeat()"
        autocomplete="new-password"
        required
      />
      @if (field(repeat())?.hasError('required')) {
        <mat-error>Type the new password again.</mat-error>
      } @else if (field(repeat())?.hasError('mismatch')) {
        <mat-error>{{ differ() }}</mat-error>
      }
    </mat-form-field>
  `,
  styles: `
    :host {
      display: contents;
    }
    mat-form-field {
      width: 100%;
    }
  `,
  // Checked with the form around it: its errors follow the controls' state (a submit, a touch).
  changeDetection: ChangeDetectionStrategy.Default,
})
export class NewPasswordFields {
  private readonly container = inject(ControlContainer);
  protected readonly minLength = PASSWORD_MIN_LENGTH;

  /** The names of the two controls in the enclosing group. */
  readonly control = input('password');
  readonly repeat = input('repeat');
  readonly hint = input(`At least ${PASSWORD_MIN_LENGTH} characters.`);
  /** Said when the new password is left empty. */
  readonly missing = input('Enter the new password.');
  /** Said when the two differ. */
  readonly differ = input('The two passwords differ.');

  protected field(name: string): AbstractControl | null {
    return this.container.control?.get(name) ?? null;
  }
}
