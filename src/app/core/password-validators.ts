import { AbstractControl, ValidationErrors, ValidatorFn, Validators } from '@angular/forms';

import { PASSWORD_MIN_LENGTH } from '../../../shared/session-types';

/** Required, and at least the shop-wide minimum length (the server checks the same). */
export const newPasswordValidators: ValidatorFn[] = [
  Validators.required,
  Validators.minLength(PASSWORD_MIN_LENGTH),
];

/**
 * On a group: its `repeat` control must equal its `password` control. A typo in a new password
 * would otherwise lock the person out at their next sign-in.
 */
export function repeatMatches(passwordKey: string, repeatKey: string): ValidatorFn {
  return (group: AbstractControl): ValidationErrors | null => {
    const password = group.get(passwordKey)?.value as unknown;
    const repeat = group.get(repeatKey);
    if (!repeat) {
      throw new Error(`repeatMatches: the form has no control "${repeatKey}".`);
    }
    const mismatch = Boolean(repeat.value) && repeat.value !== password;
    const others = { ...(repeat.errors ?? {}) };
    delete others['mismatch'];
    const next = mismatch ? { ...others, mismatch: true } : others;
    repeat.setErrors(Object.keys(next).length ? next : null);
    return mismatch ? { mismatch: true } : null;
  };
}
