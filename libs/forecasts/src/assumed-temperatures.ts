/**
 * The temperatures a forecast assumed, for the overlay on the series page: the station's observed
 * temperatures over the three days before the version's origin, then for each forecast hour the observed
 * reading where the station had one when the refit ran, else the value of the forecast issue the fit names.
 */
import type { AssumedTemperatures } from '@loadwright/contracts';
import { fits, forecastVersions, observations, series, temperatureForecasts } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';
import { and, asc, eq, gte, inArray, lt } from 'drizzle-orm';
import type { Reader } from './forecast-repository';

const hourMs = 3_600_000;
/** Observed hours shown before the origin. */
const lookBackHours = 72;

/** What the current draft (else the approved version) of a load series assumed about temperature. */
export async function assumedTemperatures(db: Reader, seriesId: number): Promise<AssumedTemperatures> {
  const [row] = await db
    .select({ id: series.id, kind: series.kind, stationId: series.temperatureSeriesId })
    .from(series)
    .where(eq(series.id, seriesId));
  if (!row || row.kind !== 'load') throw new HttpProblem('notFound', `No load series with id ${seriesId}.`);
  const versions = await db
    .select({
      id: forecastVersions.id,
      origin: forecastVersions.origin,
      horizonHours: forecastVersions.horizonHours,
      diagnostics: fits.diagnostics,
      state: forecastVersions.state,
    })
    .from(forecastVersions)
    .innerJoin(fits, eq(fits.id, forecastVersions.fitId))
    .where(and(eq(forecastVersions.seriesId, seriesId), inArray(forecastVersions.state, ['draft', 'approved'])));
  const reviewed = versions.find((v) => v.state === 'draft') ?? versions.find((v) => v.state === 'approved') ?? null;
  const [station] =
    row.stationId === null
      ? []
      : await db
          .select({ id: series.id, key: series.key, name: series.name, unit: series.unit })
          .from(series)
          .where(eq(series.id, row.stationId));
  const stationOut = station ? { ...station, unit: station.unit as 'degC' | 'degF' } : null;
  if (!reviewed) return { versionId: null, station: stationOut, used: false, reason: 'No forecast yet.', issuedAt: null, hours: [] };
  const temperature = (reviewed.diagnostics['temperature'] ?? {}) as { used?: boolean; reason?: string; forecastIssuedAt?: string };
  const base = {
    versionId: reviewed.id,
    station: stationOut,
    used: temperature.used === true,
    reason: temperature.reason ?? 'The fit records nothing about temperature.',
    issuedAt: temperature.forecastIssuedAt ?? null,
  };
  if (!station || !base.used) return { ...base, hours: [] };
  const originMs = reviewed.origin.getTime();
  const endMs = originMs + reviewed.horizonHours * hourMs;
  const observed = await db
    .select({ ts: observations.ts, value: observations.value, estimated: observations.estimated })
    .from(observations)
    .where(
      and(
        eq(observations.seriesId, station.id),
        gte(observations.ts, new Date(originMs - lookBackHours * hourMs)),
        lt(observations.ts, new Date(endMs)),
      ),
    )
    .orderBy(asc(observations.ts));
  const byHour = new Map<number, { value: number; source: 'observed' | 'forecast' }>();
  for (const o of observed) {
    const value = o.estimated ?? o.value;
    if (value !== null) byHour.set(o.ts.getTime(), { value, source: 'observed' });
  }
  if (base.issuedAt) {
    const issued = await db
      .select({ ts: temperatureForecasts.ts, value: temperatureForecasts.value })
      .from(temperatureForecasts)
      .where(
        and(
          eq(temperatureForecasts.seriesId, station.id),
          eq(temperatureForecasts.issuedAt, new Date(base.issuedAt)),
          gte(temperatureForecasts.ts, new Date(originMs)),
          lt(temperatureForecasts.ts, new Date(endMs)),
        ),
      );
    for (const f of issued) if (!byHour.has(f.ts.getTime())) byHour.set(f.ts.getTime(), { value: f.value, source: 'forecast' });
  }
  const hours = [...byHour]
    .sort((a, b) => a[0] - b[0])
    .map(([ms, hour]) => ({ ts: new Date(ms).toISOString(), value: hour.value, source: hour.source }));
  return { ...base, hours };
}
