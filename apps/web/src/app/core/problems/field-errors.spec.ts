// Angular's libraries ship partially compiled; outside an Angular build they need the JIT compiler.
import '@angular/compiler';
import { FormControl, FormGroup, Validators } from '@angular/forms';
import { describe, expect, it } from 'vitest';
import { ApiProblem } from './api-problem';
import { applyFieldErrors, serverError } from './field-errors';

const invalid = (errors: { pointer: string; detail: string }[]) =>
  new ApiProblem({ type: '/problems/invalid-input', title: 'The request has invalid fields', status: 400, errors });

describe('applyFieldErrors', () => {
  it('puts each message on the control its pointer names, touched so it shows', () => {
    const form = new FormGroup({ email: new FormControl('a@b.example', Validators.required), name: new FormControl('') });
    const unplaced = applyFieldErrors(form, invalid([{ pointer: '/email', detail: 'Already has an account' }]));
    expect(unplaced).toEqual([]);
    expect(serverError(form.controls.email)).toBe('Already has an account');
    expect(form.controls.email.touched).toBe(true);
    expect(serverError(form.controls.name)).toBeNull();
  });

  it('returns the messages no control can take: unknown fields and the whole body', () => {
    const form = new FormGroup({ email: new FormControl('') });
    const unplaced = applyFieldErrors(
      form,
      invalid([
        { pointer: '/token', detail: 'Expired or already used' },
        { pointer: '', detail: 'Send at least one field' },
      ]),
    );
    expect(unplaced).toEqual(['Expired or already used', 'Send at least one field']);
  });

  it('follows nested pointers and unescapes ~1 and ~0', () => {
    const form = new FormGroup({ limits: new FormGroup({ 'a/b': new FormControl(1) }) });
    applyFieldErrors(form, invalid([{ pointer: '/limits/a~1b', detail: 'Too high' }]));
    expect(serverError(form.get(['limits', 'a/b'])!)).toBe('Too high');
  });

  it('lets the server message go once the person edits the field', () => {
    const form = new FormGroup({ email: new FormControl('a@b.example') });
    applyFieldErrors(form, invalid([{ pointer: '/email', detail: 'Already has an account' }]));
    form.controls.email.setValue('c@d.example');
    expect(serverError(form.controls.email)).toBeNull();
  });
});
