/**
 * Reads interval usage from a Green Button file: the Atom feed of the NAESB REQ.21 Energy Services
 * Provider Interface (ESPI). Each Atom `entry` carries one resource in its `content`; the ones used
 * here are MeterReading, ReadingType (unit of measure, power-of-ten multiplier, interval length,
 * accumulation), LocalTimeParameters (standard and daylight offsets) and IntervalBlock, whose
 * IntervalReadings give a `timePeriod` (start in UTC seconds since 1970, duration in seconds) and a
 * `value` (an integer, scaled by 10^powerOfTenMultiplier in the unit of measure). Resources are tied
 * together by Atom links: a MeterReading's `related` link names its ReadingType, and an
 * IntervalBlock's `up` link is its MeterReading's IntervalBlock collection.
 *
 * Only what Loadwright can store as load is accepted: energy per interval (uom 72, Wh, delta data)
 * or demand (uom 38, W) of electricity, delivered or net; anything else is refused with the reason.
 */
import { createXmlTreeReader, GreenButtonXmlError } from './green-button-xml';

/** A file that is not a usable Green Button feed; the message tells the sender what to fix. */
export class GreenButtonFormatError extends Error {
  override readonly name = 'GreenButtonFormatError';
}

/** ESPI unit-of-measure codes Loadwright imports, by code. */
export const greenButtonUnits = { 72: 'Wh', 38: 'W' } as const;

/** ESPI accumulation behaviour: each interval's energy on its own (the only one usable for Wh). */
export const deltaDataAccumulation = 4;

/** Accumulation behaviours that mean register reads rather than per-interval quantities. */
const registerAccumulations: Record<number, string> = {
  1: 'bulk quantity (register reads)',
  3: 'cumulative (register reads)',
  9: 'summation',
};

/** ESPI flow direction of energy sent back to the grid. */
const reverseFlow = 19;

/** ESPI commodity codes of electricity (0 none given, 1 secondary metered, 2 primary metered). */
const electricityCommodities = new Set([0, 1, 2]);

/** The ReadingType of the imported meter reading. */
export interface GreenButtonReadingType {
  uom: keyof typeof greenButtonUnits;
  powerOfTenMultiplier: number;
  intervalLengthSeconds: number | null;
  accumulationBehaviour: number | null;
}

/** The feed's local time parameters, as given. */
export interface GreenButtonLocalTime {
  tzOffsetSeconds: number;
  dstOffsetSeconds: number;
  dstStartRule: string | null;
  dstEndRule: string | null;
}

/** One interval reading: start in UTC seconds, duration in seconds, value already scaled by the multiplier (in Wh or W). */
export interface GreenButtonInterval {
  startSeconds: number;
  durationSeconds: number;
  value: number;
}

/** What a Green Button file holds for one meter reading. */
export interface GreenButtonUsage {
  readingType: GreenButtonReadingType;
  localTime: GreenButtonLocalTime | null;
  /** Title of the usage point, when the feed gives one. */
  usagePointTitle: string | null;
  intervals: GreenButtonInterval[];
}

/** One Atom entry: its links and the ESPI resource it carries. */
interface Entry {
  title: string | null;
  self: string | null;
  up: string | null;
  related: string[];
  resources: Record<string, unknown[]>;
}

/** Elements that may repeat and must always parse as arrays. */
const repeating = new Set(['entry', 'link', 'IntervalBlock', 'IntervalReading', 'ReadingQuality']);

/**
 * Parses a Green Button feed (or a single ESPI entry) and returns the intervals of its one meter
 * reading, sorted by start.
 * @throws GreenButtonFormatError when the XML is malformed, is not an ESPI feed, holds no intervals,
 *   holds several meter readings, or uses a unit, accumulation or flow Loadwright cannot store as load.
 */
export function parseGreenButton(xml: string): GreenButtonUsage {
  const reader = createGreenButtonReader();
  reader.write(xml);
  return reader.end();
}

/** A Green Button reader fed chunk by chunk as the file arrives (see green-button-xml.ts). */
export interface GreenButtonReader {
  write(chunk: string): void;
  end(): GreenButtonUsage;
}

/**
 * Reads a Green Button feed as it streams in; `end` returns what `parseGreenButton` returns.
 * @throws GreenButtonFormatError from `write` as soon as the XML is refused, and from `end` as parseGreenButton.
 */
export function createGreenButtonReader(): GreenButtonReader {
  const xml = createXmlTreeReader(repeating);
  const asFormatError = <T>(step: () => T): T => {
    try {
      return step();
    } catch (error) {
      if (error instanceof GreenButtonXmlError)
        throw new GreenButtonFormatError(error.malformed ? `The file is not well-formed XML: ${error.message}.` : `${error.message}.`);
      throw error;
    }
  };
  return {
    write: (chunk) => asFormatError(() => xml.write(chunk)),
    end: () => usageOf(asFormatError(() => xml.end())),
  };
}

/** The usage of one meter reading in a parsed feed. */
function usageOf(document: Record<string, unknown>): GreenButtonUsage {
  const entries = atomEntries(document);
  const blocks = entries.filter((e) => e.resources['IntervalBlock']);
  if (blocks.length === 0)
    throw new GreenButtonFormatError('The feed holds no IntervalBlock, so there are no interval readings to import.');

  const meterReadings = entries.filter((e) => e.resources['MeterReading']);
  const owners = new Set(blocks.map((block) => ownerOf(block, meterReadings)));
  if (owners.size > 1) {
    const names = [...owners].map((owner) => owner?.title ?? owner?.self ?? 'unlinked').join(', ');
    throw new GreenButtonFormatError(
      `The feed holds interval readings of ${owners.size} meter readings (${names}); send one meter reading per file.`,
    );
  }
  const meterReading = [...owners][0] ?? null;
  const readingType = readReadingType(pickReadingType(entries, meterReading));
  const usagePoint = entries.find((e) => e.resources['UsagePoint']);
  const localTimeEntry = entries.find((e) => e.resources['LocalTimeParameters']);
  const intervals = blocks.flatMap((entry) =>
    entry.resources['IntervalBlock']!.flatMap((block, b) => readIntervals(block, b + 1, readingType)),
  );
  if (intervals.length === 0)
    throw new GreenButtonFormatError("The feed's IntervalBlocks hold no IntervalReading, so there are no interval readings to import.");
  intervals.sort((a, b) => a.startSeconds - b.startSeconds);
  return {
    readingType,
    localTime: localTimeEntry ? readLocalTime(localTimeEntry.resources['LocalTimeParameters']![0]) : null,
    usagePointTitle: usagePoint?.title ?? null,
    intervals,
  };
}

/** The Atom entries of a feed, or the one entry of an entry document. */
function atomEntries(document: Record<string, unknown>): Entry[] {
  const feed = document['feed'];
  const rawEntries = isRecord(feed) ? feed['entry'] : document['entry'];
  if (!Array.isArray(rawEntries) || rawEntries.length === 0) {
    throw new GreenButtonFormatError(
      'The file is XML but not a Green Button feed: expected an Atom <feed> with <entry> elements holding ESPI resources.',
    );
  }
  return rawEntries.filter(isRecord).map((entry) => {
    const links = (Array.isArray(entry['link']) ? entry['link'] : []).filter(isRecord);
    const href = (rel: string) => links.filter((l) => l['@_rel'] === rel).map((l) => String(l['@_href'] ?? ''));
    const content = isRecord(entry['content']) ? entry['content'] : {};
    const resources: Record<string, unknown[]> = {};
    for (const [name, value] of Object.entries(content)) {
      if (name.startsWith('@_') || name === '#text') continue;
      resources[name] = Array.isArray(value) ? value : [value];
    }
    return { title: text(entry['title']), self: href('self')[0] ?? null, up: href('up')[0] ?? null, related: href('related'), resources };
  });
}

/** The MeterReading an IntervalBlock entry belongs to: the one whose link its own links extend; the only one when links say nothing. */
function ownerOf(block: Entry, meterReadings: Entry[]): Entry | null {
  const linked = meterReadings.find((m) => m.self && [block.up, block.self].some((href) => href?.startsWith(`${m.self}/`)));
  if (linked) return linked;
  return meterReadings.length === 1 ? meterReadings[0]! : null;
}

/** The ReadingType entry of a meter reading: named by its `related` link, or the only one in the feed. */
function pickReadingType(entries: Entry[], meterReading: Entry | null): Record<string, unknown> {
  const readingTypes = entries.filter((e) => e.resources['ReadingType']);
  const linked = meterReading ? readingTypes.find((rt) => rt.self && meterReading.related.includes(rt.self)) : undefined;
  const chosen = linked ?? (readingTypes.length === 1 ? readingTypes[0] : undefined);
  if (!chosen) {
    throw new GreenButtonFormatError(
      readingTypes.length === 0
        ? 'The feed has no ReadingType, so the unit of its values is unknown.'
        : 'The feed has several ReadingTypes and none is linked from the MeterReading, so the unit of its values is unknown.',
    );
  }
  const resource = chosen.resources['ReadingType']![0];
  if (!isRecord(resource)) throw new GreenButtonFormatError('The ReadingType is empty, so the unit of its values is unknown.');
  return resource;
}

/** Checks and reads a ReadingType. */
function readReadingType(resource: Record<string, unknown>): GreenButtonReadingType {
  const uom = integerField(resource, 'uom', 'ReadingType');
  if (uom === null) throw new GreenButtonFormatError('The ReadingType gives no uom (unit of measure), so the values cannot be read.');
  if (!(uom in greenButtonUnits)) {
    throw new GreenButtonFormatError(
      `ReadingType uom ${uom} is not a unit Loadwright imports; use 72 (Wh, energy per interval) or 38 (W, demand).`,
    );
  }
  const commodity = integerField(resource, 'commodity', 'ReadingType');
  if (commodity !== null && !electricityCommodities.has(commodity)) {
    throw new GreenButtonFormatError(`ReadingType commodity ${commodity} is not electricity; Loadwright imports electricity usage only.`);
  }
  const flowDirection = integerField(resource, 'flowDirection', 'ReadingType');
  if (flowDirection === reverseFlow) {
    throw new GreenButtonFormatError(
      'ReadingType flowDirection 19 is energy sent back to the grid, not load; send the delivered (1) or net (4) reading.',
    );
  }
  const accumulationBehaviour = integerField(resource, 'accumulationBehaviour', 'ReadingType');
  if (accumulationBehaviour !== null && accumulationBehaviour in registerAccumulations) {
    throw new GreenButtonFormatError(
      `ReadingType accumulationBehaviour ${accumulationBehaviour} is ${registerAccumulations[accumulationBehaviour]}, not usage per interval; send interval data (accumulationBehaviour 4, delta data).`,
    );
  }
  return {
    uom: uom as keyof typeof greenButtonUnits,
    powerOfTenMultiplier: integerField(resource, 'powerOfTenMultiplier', 'ReadingType') ?? 0,
    intervalLengthSeconds: integerField(resource, 'intervalLength', 'ReadingType'),
    accumulationBehaviour,
  };
}

/** The readings of one IntervalBlock, values scaled by the multiplier. */
function readIntervals(block: unknown, blockNumber: number, readingType: GreenButtonReadingType): GreenButtonInterval[] {
  if (!isRecord(block)) return [];
  const readings = Array.isArray(block['IntervalReading']) ? block['IntervalReading'] : [];
  const scale = multiplier(readingType.powerOfTenMultiplier);
  return readings.map((reading, r) => {
    const where = `IntervalReading ${r + 1} of IntervalBlock ${blockNumber}`;
    if (!isRecord(reading) || !isRecord(reading['timePeriod'])) throw new GreenButtonFormatError(`${where} has no timePeriod.`);
    const startSeconds = integerField(reading['timePeriod'], 'start', where);
    const durationSeconds = integerField(reading['timePeriod'], 'duration', where) ?? readingType.intervalLengthSeconds;
    const raw = integerField(reading, 'value', where);
    if (startSeconds === null) throw new GreenButtonFormatError(`${where} has no timePeriod start.`);
    if (durationSeconds === null || durationSeconds <= 0)
      throw new GreenButtonFormatError(`${where} has no positive duration, and the ReadingType gives no intervalLength.`);
    if (raw === null) throw new GreenButtonFormatError(`${where} has no value.`);
    return { startSeconds, durationSeconds, value: scale(raw) };
  });
}

/** Reads LocalTimeParameters. */
function readLocalTime(resource: unknown): GreenButtonLocalTime | null {
  if (!isRecord(resource)) return null;
  return {
    tzOffsetSeconds: integerField(resource, 'tzOffset', 'LocalTimeParameters') ?? 0,
    dstOffsetSeconds: integerField(resource, 'dstOffset', 'LocalTimeParameters') ?? 0,
    dstStartRule: text(resource['dstStartRule']),
    dstEndRule: text(resource['dstEndRule']),
  };
}

/** Multiplies by 10^power, dividing for negative powers so 1234 × 10^−3 is exactly 1.234. */
function multiplier(power: number): (value: number) => number {
  if (power >= 0) {
    const factor = 10 ** power;
    return (value) => value * factor;
  }
  const divisor = 10 ** -power;
  return (value) => value / divisor;
}

/** An integer child element, null when absent. */
function integerField(parent: Record<string, unknown>, name: string, where: string): number | null {
  const value = text(parent[name]);
  if (value === null) return null;
  if (!/^[-+]?\d{1,15}$/.test(value))
    throw new GreenButtonFormatError(`${where} has ${name} "${value.slice(0, 40)}", which is not a whole number.`);
  return Number(value);
}

/** The text of a leaf element (or of an element with attributes), trimmed; null when absent or empty. */
function text(value: unknown): string | null {
  if (value === undefined || value === null) return null;
  if (isRecord(value)) return text(value['#text']);
  const s = String(value).trim();
  return s === '' ? null : s;
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
