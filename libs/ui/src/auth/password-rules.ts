import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import { Validators } from '@angular/forms';

/** Same bounds as the API's PasswordSchema (bcrypt reads only the first 72 bytes). */
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 72;
export const passwordValidators: ValidatorFn[] = [
  Validators.required,
  Validators.minLength(PASSWORD_MIN),
  Validators.maxLength(PASSWORD_MAX),
];

/** Group validator: `password` and `confirmation` must be equal; the error sits on `confirmation`. */
export const passwordsMatch: ValidatorFn = (group: AbstractControl): ValidationErrors | null => {
  const password = group.get('password');
  const confirmation = group.get('confirmation');
  if (!password || !confirmation) return null;
  const mismatch = confirmation.value !== '' && password.value !== confirmation.value;
  const { mismatch: _previous, ...others } = confirmation.errors ?? {};
  confirmation.setErrors(mismatch ? { ...others, mismatch: true } : Object.keys(others).length ? others : null);
  return null;
};
