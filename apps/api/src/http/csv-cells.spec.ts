import { describe, expect, it } from 'vitest';
import { csvLine, numberCell, textCell } from './csv-cells';

describe('CSV cells', () => {
  it('neutralises text a spreadsheet would run as a formula', () => {
    expect(textCell('=HYPERLINK("http://x")')).toBe(`"'=HYPERLINK(""http://x"")"`);
    expect(textCell('+1')).toBe("'+1");
    expect(textCell('-2')).toBe("'-2");
    expect(textCell('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(textCell('\tcmd')).toBe("'\tcmd");
    expect(textCell('North feeder')).toBe('North feeder');
  });

  it('quotes commas, quotes and line breaks', () => {
    expect(textCell('a,b')).toBe('"a,b"');
    expect(textCell('say "hi"')).toBe('"say ""hi"""');
    expect(textCell('two\nlines')).toBe('"two\nlines"');
    expect(textCell(null)).toBe('');
  });

  it('writes numbers as numbers, negative ones included, rounded to 4 places', () => {
    expect(numberCell(-12.345678)).toBe('-12.3457');
    expect(numberCell(0.1 + 0.2)).toBe('0.3');
    expect(numberCell(-0.00001)).toBe('0');
    expect(numberCell(null)).toBe('');
    expect(numberCell(1347.123456, null)).toBe('1347.123456');
    expect(csvLine(['a', '1'])).toBe('a,1\r\n');
  });
});
