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

  it('treats empty cells and missing-value markers as no reading, keeping the marker', () => {
    expect(['', 'NA', 'n/a', 'NaN', 'null'].map((cell) => parseValueCell(cell))).toEqual([
      { kind: 'missing', marker: null },
      { kind: 'missing', marker: 'NA' },
      { kind: 'missing', marker: 'n/a' },
      { kind: 'missing', marker: 'NaN' },
      { kind: 'missing', marker: 'null' },
    ]);
  });

  it('reads thousands separators only where they cannot be a decimal mark', () => {
    expect(parseValueCell('1,499.6')).toEqual({ kind: 'number', value: 1499.6 });
    expect(parseValueCell('12,345,678')).toEqual({ kind: 'number', value: 12345678 });
    expect(parseValueCell('1.499,6', ',')).toEqual({ kind: 'number', value: 1499.6 });
    // 1,49 and 1,4996 are not groups of three: no reading is guessed.
    expect(parseValueCell('1,49').kind).toBe('invalid');
    expect(parseValueCell('1,4996.5').kind).toBe('invalid');
  });

  it('keeps 12 significant digits, dropping binary noise an exporter wrote', () => {
    // 1347100 / 1000 in binary floating point printed with 17 digits by the exporting program.
    expect(parseValueCell('1347.1000000000001')).toEqual({ kind: 'number', value: 1347.1 });
    expect(parseValueCell('0.30000000000000004')).toEqual({ kind: 'number', value: 0.3 });
    expect(parseValueCell('123456.789012')).toEqual({ kind: 'number', value: 123456.789012 });
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
