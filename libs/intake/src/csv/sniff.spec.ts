import { describe, expect, it } from 'vitest';
import { firstInvalidUtf8, sniffBytesOf } from './sniff';

const sniff = (text: string | Buffer) => sniffBytesOf(Buffer.isBuffer(text) ? text : Buffer.from(text, 'utf8'), true);

describe('sniffBytesOf', () => {
  it('detects a semicolon file with decimal commas, local times and a header', () => {
    const result = sniff('Zeit;Zähler;kW\n2026-01-01 00:00;fdr-a;12,5\n2026-01-01 01:00;fdr-a;13,0\n');
    expect(result).toEqual({
      ok: true,
      layout: {
        encoding: 'utf-8',
        delimiter: ';',
        hasHeader: true,
        columns: ['Zeit', 'Zähler', 'kW'],
        decimalSeparator: ',',
        timestampsHaveOffset: false,
      },
      preview: {
        columns: ['Zeit', 'Zähler', 'kW'],
        rows: [
          ['2026-01-01 00:00', 'fdr-a', '12,5'],
          ['2026-01-01 01:00', 'fdr-a', '13,0'],
        ],
      },
    });
  });

  it('names columns when the first row is already data, and reads tab-separated UTF-8 with a byte-order mark', () => {
    const result = sniff(
      Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('2026-01-01T00:00:00Z\t5\n2026-01-01T01:00:00Z\t6\n')]),
    );
    expect(result.ok && result.layout).toMatchObject({
      delimiter: '\t',
      hasHeader: false,
      columns: ['column 1', 'column 2'],
      timestampsHaveOffset: true,
    });
  });

  it('reads UTF-16 with its byte-order mark', () => {
    const text = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('ts,kW\n2026-01-01T00:00:00Z,5\n', 'utf16le')]);
    expect(sniff(text)).toMatchObject({ ok: true, layout: { encoding: 'utf-16le', columns: ['ts', 'kW'] } });
  });
});

describe('firstInvalidUtf8', () => {
  it('finds the first byte that breaks UTF-8 and forgives a sequence cut by the end of a partial read', () => {
    expect(firstInvalidUtf8(Buffer.from('aé€😀', 'utf8'), true)).toBe(-1);
    expect(firstInvalidUtf8(Buffer.from([0x61, 0xfc, 0x62]), true)).toBe(1);
    expect(firstInvalidUtf8(Buffer.from([0x61, 0xe2, 0x82]), false)).toBe(-1);
    expect(firstInvalidUtf8(Buffer.from([0x61, 0xe2, 0x82]), true)).toBe(1);
  });
});
