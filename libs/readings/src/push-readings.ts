/**
 * The push API's batch: readings other systems send as JSON, turned into interval starts in the
 * series' unit. Timestamps carry their own offset, so no local time is guessed; a series whose
 * timestamps mark the end of the interval has its readings moved back one interval, because the
 * store keeps interval starts.
 */
import type { PushReadingsRequest, SeriesUnit } from '@loadwright/contracts';
import type { Series } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';
import type { IntervalReading } from './import-service';
import { canConvert, unitConverter } from './unit-conversion';

/** The batch as interval readings in the series' unit, plus a canonical text of it for the content hash. */
export function pushedIntervalReadings(
  series: Series,
  request: PushReadingsRequest,
): { readings: IntervalReading[]; canonical: string; unit: SeriesUnit } {
  const unit = request.unit ?? series.unit;
  if (!canConvert(unit, series.unit)) {
    throw new HttpProblem(
      'invalidInput',
      `${series.key} is a ${series.kind} series stored in ${series.unit}; readings in ${unit} cannot be converted to it.`,
      [{ pointer: '/unit', detail: `Use a ${series.kind} unit` }],
    );
  }
  const convert = unitConverter(unit, series.unit);
  const shiftMs = series.timestampsMark === 'end' ? series.intervalMinutes * 60_000 : 0;
  const readings = request.readings.map((reading, i) => ({
    ts: new Date(Date.parse(reading.ts) - shiftMs),
    value: convert(reading.value),
    sourceRow: i + 1,
  }));
  // The same readings written with other offsets or spacing hash the same: instants and values only.
  const canonical = JSON.stringify({ series: series.key, unit, readings: request.readings.map((r) => [Date.parse(r.ts), r.value]) });
  return { readings, canonical, unit };
}
