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
        slashDateOrder: null,
        endOfDayStamps: false,
        // Two rows an hour apart.
        intervalMinutes: 60,
        mixedIntervals: [],
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

  it('decides month/day order from a row that can only be read one way, and sees 12-hour clocks', () => {
    const us = sniff('Date,Load (kW)\n3/12/2026 11:00 PM,10\n3/13/2026 12:00 AM,11\n3/13/2026 1:00 AM,12\n');
    expect(us.ok && us.layout).toMatchObject({ slashDateOrder: 'month-first', intervalMinutes: 60, timestampsHaveOffset: false });
    const european = sniff('Date;kW\n12/3/2026 23:00;10\n13/3/2026 00:00;11\n');
    expect(european.ok && european.layout).toMatchObject({ slashDateOrder: 'day-first', intervalMinutes: 60 });
    const undecided = sniff('Date,kW\n3/9/2026 1:00 AM,10\n3/9/2026 2:00 AM,11\n');
    expect(undecided.ok && undecided.layout).toMatchObject({ slashDateOrder: null });
  });

  it('sees midnight written as 24:00 and a 15-minute step despite one missing row', () => {
    const rows = ['hour_ending,kWh', '2026-06-01 23:15,1', '2026-06-01 23:30,1', '2026-06-02 00:00,1', '2026-06-01 24:00,1'];
    expect(sniff(rows.join('\n')).ok && (sniff(rows.join('\n')) as { layout: object }).layout).toMatchObject({
      endOfDayStamps: true,
      // Distinct times 23:15, 23:30, 00:00 (24:00 is the same instant): steps 15 and 30 tie, and the smaller wins.
      intervalMinutes: 15,
    });
  });

  it('sends Green Button (ESPI) XML to its own import, and refuses other markup', () => {
    const espi = '<?xml version="1.0"?>\n<feed xmlns="http://www.w3.org/2005/Atom" xmlns:espi="http://naesb.org/espi"><entry/></feed>\n';
    expect(sniff(espi)).toEqual({
      ok: false,
      message:
        'The file is Green Button (ESPI) XML, not CSV: import it with "Green Button file" on the Uploads page, which reads its intervals and units.',
    });
    expect(sniff('<!DOCTYPE html><html><body>Sign in</body></html>')).toMatchObject({
      ok: false,
      message: expect.stringMatching(/^The file is an HTML page, not CSV text\./),
    });
  });
});
