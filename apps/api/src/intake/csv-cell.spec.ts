import { describe, expect, it } from 'vitest';
import { csvLine, csvNumber, csvText } from './csv-cell';

describe('csvText', () => {
  it('prefixes every formula starter with an apostrophe (OWASP CSV injection)', () => {
    expect(['=SUM(A1)', '+1', '-2+3', '@cmd', '\tx', '\rx'].map(csvText)).toEqual([
      `"'=SUM(A1)"`,
      `"'+1"`,
      `"'-2+3"`,
      `"'@cmd"`,
      `"'\tx"`,
      `"'\rx"`,
    ]);
  });

  it('quotes plain text and doubles inner quotes', () => {
    expect(csvText('fdr "north" 1')).toBe('"fdr ""north"" 1"');
    expect(csvText(null)).toBe('');
  });

  it('writes numbers bare and lines with CRLF', () => {
    expect(csvLine([csvNumber(-1.5), csvNumber(null), csvText('a')])).toBe('-1.5,,"a"\r\n');
  });
});
