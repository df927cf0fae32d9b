import { describe, expect, it } from 'vitest';
import { defaultAfterSignIn, safeReturnUrl } from './return-url';

describe('safeReturnUrl', () => {
  it('follows a path inside the app, query included', () => {
    expect(safeReturnUrl('/people')).toBe('/people');
    expect(safeReturnUrl('/audit-log?action=user.')).toBe('/audit-log?action=user.');
  });

  it('refuses addresses that would leave the app or loop back to sign-in', () => {
    for (const raw of [
      'https://elsewhere.example/',
      '//elsewhere.example',
      '/\\elsewhere.example',
      'people',
      '/sign-in?returnUrl=/x',
      '/set-password?token=t',
      '',
      null,
      undefined,
    ]) {
      expect(safeReturnUrl(raw)).toBe(defaultAfterSignIn);
    }
  });
});
