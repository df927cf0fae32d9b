import { describe, expect, it } from 'vitest';
import { textRuns } from './text-links';

describe('textRuns', () => {
  it('splits out a link and keeps the words around it', () => {
    expect(textRuns('Choose one:\n\nhttp://127.0.0.1/set-password?token=abc_DEF-1\n')).toEqual([
      { kind: 'text', text: 'Choose one:\n\n' },
      { kind: 'link', href: 'http://127.0.0.1/set-password?token=abc_DEF-1' },
      { kind: 'text', text: '\n' },
    ]);
  });

  it('leaves a full stop after an address outside the link', () => {
    expect(textRuns('See https://example.org/a.')).toEqual([
      { kind: 'text', text: 'See ' },
      { kind: 'link', href: 'https://example.org/a' },
      { kind: 'text', text: '.' },
    ]);
  });

  it('never makes a link of another scheme', () => {
    expect(textRuns('javascript:alert(1)')).toEqual([{ kind: 'text', text: 'javascript:alert(1)' }]);
  });
});
