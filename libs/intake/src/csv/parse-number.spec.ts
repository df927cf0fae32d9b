import { describe, expect, it } from 'vitest';
import { parseValueCell } from './parse-number';

describe('parseValueCell', () => {
  it('reads plain decimal numbers with sign and exponent', () => {
    expect(['812.5', '-0.3', '+4', '1.2e3', '.5', ' 7 '].map((cell) => parseValueCell(cell))).toEqual(
      [812.5, -0.3, 4, 1200, 0.5, 7].map((value) => ({ kind: 'number', value })),
    );
  });

  it('reads a decimal comma only when told', () => {
    expect(parseValueCell('12,5', ',')).toEqual({ kind: 'number', value: 12.5 });
    expect(parseValueCell('12,5')).toEqual({ kind: 'invalid' });
  });

  it('treats empty cells and missing-value markers as no reading', () => {
    expect(['', 'NA', 'n/a', 'NaN', 'null'].map((cell) => parseValueCell(cell).kind)).toEqual([
      'missing',
      'missing',
      'missing',
      'missing',
      'missing',
    ]);
  });

  it('refuses formulas and other text', () => {
    expect(['=SUM(A1:A3)', '@cmd', '+A1', '-B2*2'].map((cell) => parseValueCell(cell).kind)).toEqual([
      'formula',
      'formula',
      'formula',
      'formula',
    ]);
    expect(['12.5.1', 'Infinity', '0x10', '1_000', 'kW'].map((cell) => parseValueCell(cell).kind)).toEqual([
      'invalid',
      'invalid',
      'invalid',
      'invalid',
      'invalid',
    ]);
  });
});
