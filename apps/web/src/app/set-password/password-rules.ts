import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';

/** The API's rule for new passwords (length is what counts, NIST SP 800-63B §5.1.1.2); the server checks it too. */
export const MINIMUM_PASSWORD_LENGTH = 12;

/** Group validator: the repeat field must equal the first; the error sits on the repeat control. */
export function matchingPasswords(first: string, repeat: string): ValidatorFn {
  return (group: AbstractControl): ValidationErrors | null => {
    const repeatControl = group.get(repeat);
    const mismatch = !!repeatControl?.value && group.get(first)?.value !== repeatControl.value;
    if (repeatControl) {
      const { mismatch: _previous, ...others } = repeatControl.errors ?? {};
      repeatControl.setErrors(mismatch ? { ...others, mismatch: true } : Object.keys(others).length ? others : null);
    }
    return mismatch ? { mismatch: true } : null;
  };
}
