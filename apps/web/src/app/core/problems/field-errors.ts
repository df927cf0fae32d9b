import type { AbstractControl, FormGroup } from '@angular/forms';
import type { ApiProblem } from './api-problem';

/** Error key under which a server's message about a control is kept. */
export const serverErrorKey = 'server';

/**
 * Puts each of the problem's field errors on the control its pointer names ("/email" → `email`,
 * "/limits/0" → `limits.0`), marks it touched so it shows, and returns the details no control took.
 */
export function applyFieldErrors(form: FormGroup, problem: ApiProblem): string[] {
  const unplaced: string[] = [];
  for (const { pointer, detail } of problem.fieldErrors) {
    const control = controlAt(form, pointer);
    if (control) {
      control.setErrors({ ...control.errors, [serverErrorKey]: detail });
      control.markAsTouched();
    } else {
      unplaced.push(detail);
    }
  }
  return unplaced;
}

/** The control a JSON pointer names, or null (also for the empty pointer, which means the whole body). */
function controlAt(form: FormGroup, pointer: string): AbstractControl | null {
  const path = pointer
    .split('/')
    .slice(1)
    .map((token) => token.replace(/~1/g, '/').replace(/~0/g, '~'));
  return path.length === 0 || path[0] === '' ? null : form.get(path);
}

/** The server's message on a control, if it has one. */
export function serverError(control: AbstractControl): string | null {
  const message: unknown = control.errors?.[serverErrorKey];
  return typeof message === 'string' ? message : null;
}
