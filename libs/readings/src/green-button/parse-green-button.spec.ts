import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createGreenButtonReader, GreenButtonFormatError, parseGreenButton } from './parse-green-button';

const fixture = (name: string) => readFileSync(resolve(import.meta.dirname, '../../../../fixtures/green-button', name), 'utf8');
const iso = (seconds: number) => new Date(seconds * 1000).toISOString();

describe('parseGreenButton', () => {
  it('reads hourly Wh intervals across the spring-forward Sunday (24 + 23 hours) with the local time parameters', () => {
    const usage = parseGreenButton(fixture('hourly-energy-wh.xml'));
    expect(usage.readingType).toEqual({ uom: 72, powerOfTenMultiplier: 0, intervalLengthSeconds: 3600, accumulationBehaviour: 4 });
    expect(usage.localTime).toEqual({ tzOffsetSeconds: -21600, dstOffsetSeconds: 3600, dstStartRule: '360E2000', dstEndRule: 'B40E2000' });
    expect(usage.usagePointTitle).toBe('Pump house meter');
    expect(usage.intervals).toHaveLength(47);
    // Local midnight of Saturday 7 March 2026 in US Central standard time (UTC−6) is 06:00 UTC.
    expect(iso(usage.intervals[0]!.startSeconds)).toBe('2026-03-07T06:00:00.000Z');
    expect(usage.intervals[0]).toMatchObject({ durationSeconds: 3600, value: 1180 });
    // Sunday starts at 06:00 UTC too (clocks change at 02:00 local), and ends at 05:00 UTC Monday (UTC−5).
    expect(iso(usage.intervals[24]!.startSeconds)).toBe('2026-03-08T06:00:00.000Z');
    expect(usage.intervals[24]!.value).toBe(1217);
    expect(iso(usage.intervals[46]!.startSeconds)).toBe('2026-03-09T04:00:00.000Z');
    expect(usage.intervals[46]!.value).toBe(1692);
  });

  it('applies a negative power-of-ten multiplier exactly and reads espi:-prefixed elements', () => {
    const usage = parseGreenButton(fixture('fifteen-minute-milliwatt-hours.xml'));
    expect(usage.readingType.powerOfTenMultiplier).toBe(-3);
    expect(usage.intervals.map((i) => i.value)).toEqual([381.25, 402.5, 415, 398.75, 377.5, 360, 352.5, 349.999]);
    expect(usage.intervals.every((i) => i.durationSeconds === 900)).toBe(true);
    expect(usage.localTime?.tzOffsetSeconds).toBe(-21600);
  });

  it('applies a positive multiplier to demand in W', () => {
    const usage = parseGreenButton(fixture('hourly-demand-kilowatts.xml'));
    expect(usage.readingType.uom).toBe(38);
    expect(usage.intervals.map((i) => i.value)).toEqual([1523000, 1587000, 1644000, 1702000, 1688000, 1610000]);
    expect(usage.localTime).toBeNull();
  });

  it('refuses malformed XML with the parser message and position', () => {
    expect(() => parseGreenButton(fixture('malformed-truncated.xml'))).toThrow(GreenButtonFormatError);
    expect(() => parseGreenButton(fixture('malformed-truncated.xml'))).toThrow(
      /^The file is not well-formed XML: .+ \(line \d+, column \d+\)\.$/,
    );
  });

  it('refuses a unit it does not import, naming the code and the accepted ones', () => {
    expect(() => parseGreenButton(fixture('unknown-unit-therms.xml'))).toThrow(
      'ReadingType uom 169 is not a unit Loadwright imports; use 72 (Wh, energy per interval) or 38 (W, demand).',
    );
  });

  it('refuses register reads', () => {
    expect(() => parseGreenButton(fixture('cumulative-register.xml'))).toThrow(
      'ReadingType accumulationBehaviour 3 is cumulative (register reads), not usage per interval; send interval data (accumulationBehaviour 4, delta data).',
    );
  });

  it('refuses XML that is not an Atom feed, and a feed without interval blocks', () => {
    expect(() => parseGreenButton('<?xml version="1.0"?><invoice><total>3</total></invoice>')).toThrow(/not a Green Button feed/);
    const noBlocks = fixture('hourly-energy-wh.xml').replace(/<entry>\s*<id>urn:uuid:[0-9a-f-]+02\d\d<\/id>[\s\S]*?<\/entry>\s*/g, '');
    expect(() => parseGreenButton(noBlocks)).toThrow('The feed holds no IntervalBlock, so there are no interval readings to import.');
  });

  it('refuses a value that is not a whole number, naming the reading', () => {
    const broken = fixture('hourly-demand-kilowatts.xml').replace('<value>1587</value>', '<value>15x7</value>');
    expect(() => parseGreenButton(broken)).toThrow('IntervalReading 2 of IntervalBlock 1 has value "15x7", which is not a whole number.');
  });

  it('refuses a feed with interval data of two meter readings', () => {
    const xml = fixture('hourly-demand-kilowatts.xml');
    const second = xml
      .match(/<entry>\s*<id>urn:uuid:[0-9a-f-]+0200<\/id>[\s\S]*?<\/entry>/)![0]
      .replaceAll('MeterReading/1/', 'MeterReading/2/');
    const meterReading2 = xml
      .match(/<entry>\s*<id>urn:uuid:[0-9a-f-]+0103<\/id>[\s\S]*?<\/entry>/)![0]
      .replaceAll('MeterReading/1', 'MeterReading/2')
      .replace('Interval usage', 'Second register');
    const doubled = xml.replace('</feed>', `${meterReading2}\n${second}\n</feed>`);
    expect(() => parseGreenButton(doubled)).toThrow(
      /holds interval readings of 2 meter readings \(Interval usage, Second register\); send one meter reading per file/,
    );
  });
});

describe('createGreenButtonReader', () => {
  it('reads a file fed in chunks of 7 characters exactly as in one piece', () => {
    const xml = fixture('fifteen-minute-milliwatt-hours.xml');
    const reader = createGreenButtonReader();
    for (let i = 0; i < xml.length; i += 7) reader.write(xml.slice(i, i + 7));
    expect(reader.end()).toEqual(parseGreenButton(xml));
  });

  it('refuses a DTD at its declaration, before any entity could be declared or expanded', () => {
    const reader = createGreenButtonReader();
    expect(() =>
      reader.write('<?xml version="1.0"?>\n<!DOCTYPE feed [<!ENTITY a "aaaa"><!ENTITY b "&a;&a;&a;">]>\n<feed>&b;</feed>'),
    ).toThrow(
      /^The file declares a DTD \(<!DOCTYPE …>\)\. Green Button files have none and Loadwright reads none; remove it \(line 2, column 1\)\.$/,
    );
  });

  it('refuses nesting deeper than 32 elements at the element that goes too deep', () => {
    // Elements 1 to 32 are accepted; the 33rd opening tag is refused.
    const reader = createGreenButtonReader();
    expect(() => reader.write('<a>'.repeat(33))).toThrow(/nests elements more than 32 deep/);
    expect(() => parseGreenButton(`<feed>${'<a>'.repeat(10_000)}${'</a>'.repeat(10_000)}</feed>`)).toThrow(/more than 32 deep/);
  });

  it('refuses mismatched and unclosed elements as not well-formed, with the position', () => {
    expect(() => parseGreenButton('<feed><entry></feed>')).toThrow(/^The file is not well-formed XML: .+ \(line 1, column \d+\)\.$/);
    expect(() => parseGreenButton('<feed>\n<entry>')).toThrow(/ends inside <entry>.+\(line 2, column 8\)/);
  });
});
