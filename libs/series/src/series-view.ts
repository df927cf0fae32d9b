/** Turns catalogue rows into the shapes of the series contracts. */
import type { SeriesRef, SeriesSummary } from '@loadwright/contracts';
import type { Series } from '@loadwright/db';
import type { SeriesRow } from './series-repository';

/** A short reference to a series. */
export function toSeriesRef(row: Series): SeriesRef {
  return { id: row.id, key: row.key, name: row.name, kind: row.kind, level: row.level, unit: row.unit, archived: row.archivedAt !== null };
}

/** One row of the catalogue table. */
export function toSeriesSummary({ series, parentKey, temperatureSeriesKey, latestReadingAt }: SeriesRow): SeriesSummary {
  return {
    id: series.id,
    key: series.key,
    name: series.name,
    kind: series.kind,
    level: series.level,
    parentId: series.parentId,
    parentKey,
    unit: series.unit,
    intervalMinutes: series.intervalMinutes,
    timeZone: series.timeZone,
    timestampsMark: series.timestampsMark,
    temperatureSeriesId: series.temperatureSeriesId,
    temperatureSeriesKey,
    peerGroup: series.peerGroup,
    description: series.description,
    archivedAt: series.archivedAt?.toISOString() ?? null,
    latestReadingAt: latestReadingAt?.toISOString() ?? null,
    createdAt: series.createdAt.toISOString(),
    updatedAt: series.updatedAt.toISOString(),
  };
}
