/**
 * Weather scenarios of a load series' forecast: the reviewed version re-run with other temperatures for its
 * hours (N degrees hotter, N colder, and the station's observed weather of the same calendar weeks of past
 * years), with the daily peaks each gives. The model's own temperature terms move the forecast
 * (temperatureScenario in the engine); the ARMA part, the profile and the planner's adjustments stay as they are.
 */
import type { TemperatureScenario, TemperatureScenarios } from '@loadwright/contracts';
import { scenarioPastYears } from '@loadwright/contracts';
import { fits, forecastVersions, observations } from '@loadwright/db';
import { temperatureScenario, type ProfileForm, type ProfileSlot, type TemperatureTerms } from '@loadwright/forecasting';
import { defaultBalancePoints } from '@loadwright/refits';
import { and, asc, eq, gte, lt } from 'drizzle-orm';
import { assumedTemperatures } from './assumed-temperatures';
import { dailyPeaks, horizonPeak, type TimedValue } from './daily-peaks';
import { effectiveValues } from './forecast-review';
import { adjustmentsOf, findSeries, pointsOf, type Reader } from './forecast-repository';
import { localClock } from './local-time';

const hourMs = 3_600_000;
/** A past year is the same weeks 52 weeks back per year, so weekdays line up with the forecast's. */
const yearBackMs = 364 * 24 * hourMs;
/** Longest run of missing station hours bridged by a straight line in a past year's weather. */
const longestBridgedGap = 6;

/** The caution the scenarios carry wherever they are shown. */
export const scenarioCaution =
  'Scenarios are decision support for peak warnings: the same model re-run with other temperatures. They leave out how the weather forecast itself may err, and storms, outages and large new loads; operating decisions rest with authorised operators under the utility’s procedures.';

/** The temperature terms a stored fit records, or null when its model has none. */
export function storedTemperatureTerms(
  parameters: Record<string, unknown>,
  specSnapshot: Record<string, unknown>,
  stationUnit: string,
  timeZone: string,
): TemperatureTerms | null {
  const regression = parameters['regression'] as { names?: string[]; coefficients?: number[] } | undefined;
  const names = regression?.names ?? [];
  const heating = names.indexOf('heating-degree-hours');
  const cooling = names.indexOf('cooling-degree-hours');
  if (heating < 0 && cooling < 0) return null;
  const settings = (specSnapshot['temperature'] ?? {}) as { heatingBase?: number | null; coolingBase?: number | null };
  const defaults = defaultBalancePoints(stationUnit);
  const profile = parameters['profile'] as { slot: ProfileSlot; form: ProfileForm; effect: number[] } | undefined;
  return {
    heating: heating >= 0 ? (regression!.coefficients![heating] ?? 0) : 0,
    cooling: cooling >= 0 ? (regression!.coefficients![cooling] ?? 0) : 0,
    balance: { heatingBase: settings.heatingBase ?? defaults.heatingBase, coolingBase: settings.coolingBase ?? defaults.coolingBase },
    log: parameters['log'] === true,
    profile: profile ? { slot: profile.slot, form: profile.form, effect: profile.effect } : null,
    timeZone,
  };
}

/** The scenarios of the current draft (else the approved version) of a load series, `shift` degrees either way. */
export async function temperatureScenarios(db: Reader, seriesId: number, shift: number): Promise<TemperatureScenarios> {
  const assumed = await assumedTemperatures(db, seriesId);
  const seriesRow = (await findSeries(db, seriesId))!;
  const none = (reason: string, base: TemperatureScenarios['base'] = { dailyPeaks: [], peak: null }): TemperatureScenarios => ({
    versionId: assumed.versionId,
    station: assumed.station,
    available: false,
    reason,
    shift,
    base,
    scenarios: [],
    skipped: [],
    caution: scenarioCaution,
  });
  if (assumed.versionId === null) return none('No forecast yet.');
  const [version] = await db
    .select({ origin: forecastVersions.origin, parameters: fits.parameters, specSnapshot: fits.specSnapshot })
    .from(forecastVersions)
    .innerJoin(fits, eq(fits.id, forecastVersions.fitId))
    .where(eq(forecastVersions.id, assumed.versionId));
  const [points, adjustments] = await Promise.all([pointsOf(db, [assumed.versionId]), adjustmentsOf(db, [assumed.versionId])]);
  const effective = effectiveValues(points.get(assumed.versionId)!, adjustments.get(assumed.versionId)!);
  const { timeZone, intervalMinutes } = seriesRow;
  const base = { dailyPeaks: dailyPeaks(effective, timeZone, intervalMinutes), peak: horizonPeak(effective, timeZone) };
  if (!assumed.used || !assumed.station)
    return none(`This forecast was made without temperature (${assumed.reason}), so weather scenarios cannot move it.`, base);
  const station = assumed.station;
  const terms = storedTemperatureTerms(version!.parameters, version!.specSnapshot, station.unit, timeZone);
  if (!terms) return none('The model of this forecast has no temperature terms.', base);

  const temperatureAt = new Map(assumed.hours.map((hour) => [Date.parse(hour.ts), hour.value]));
  const hours = effective.filter((point) => temperatureAt.has(point.ts.getTime()));
  if (hours.length < effective.length)
    return none(`${effective.length - hours.length} forecast hours have no assumed temperature, so the scenarios cannot be re-run.`, base);
  const timestamps = hours.map((point) => point.ts.getTime());
  const used = timestamps.map((ms) => temperatureAt.get(ms)!);
  const values = hours.map((point) => point.value);
  const degrees = station.unit === 'degC' ? '°C' : '°F';

  const scenario = (key: string, label: string, tried: number[], shiftBy: number | null): TemperatureScenario => {
    const moved = temperatureScenario(terms, timestamps, used, tried, values);
    const timed: TimedValue[] = timestamps.map((ms, h) => ({ ts: new Date(ms), value: moved[h]! }));
    return {
      key,
      kind: shiftBy === null ? 'past-year' : 'shift',
      label,
      shift: shiftBy,
      meanTemperatureChange: tried.reduce((sum, t, h) => sum + t - used[h]!, 0) / tried.length,
      points: timed.map((point, h) => ({ ts: point.ts.toISOString(), temperature: tried[h]!, value: point.value })),
      dailyPeaks: dailyPeaks(timed, timeZone, intervalMinutes),
      peak: horizonPeak(timed, timeZone),
    };
  };
  const scenarios = [
    scenario(
      'hotter',
      `${shift} ${degrees} hotter`,
      used.map((t) => t + shift),
      shift,
    ),
    scenario(
      'colder',
      `${shift} ${degrees} colder`,
      used.map((t) => t - shift),
      -shift,
    ),
  ];
  const skipped: string[] = [];
  for (let back = 1; back <= scenarioPastYears; back++) {
    const weather = await pastWeather(db, station.id, timestamps, back);
    const from = localClock(timestamps[0]! - back * yearBackMs, timeZone).date;
    const to = localClock(timestamps[timestamps.length - 1]! - back * yearBackMs, timeZone).date;
    if (weather.kind === 'none') break;
    if (weather.kind === 'gaps') {
      skipped.push(
        `The weather of ${from} to ${to} is left out: the station's history misses ${weather.missing} of its ${timestamps.length} hours, ${weather.longest} of them in a row.`,
      );
      continue;
    }
    scenarios.push(scenario(`year-${from.slice(0, 4)}`, `Weather of ${from} to ${to}`, weather.values, null));
  }
  return {
    versionId: assumed.versionId,
    station,
    available: true,
    reason: assumed.reason,
    shift,
    base,
    scenarios,
    skipped,
    caution: scenarioCaution,
  };
}

/** The station's observed temperatures at the forecast hours `back` years (of 52 weeks) earlier; short gaps bridged. */
async function pastWeather(
  db: Reader,
  stationId: number,
  timestamps: number[],
  back: number,
): Promise<{ kind: 'none' } | { kind: 'gaps'; missing: number; longest: number } | { kind: 'ok'; values: number[] }> {
  const first = timestamps[0]! - back * yearBackMs;
  const rows = await db
    .select({ ts: observations.ts, value: observations.value, estimated: observations.estimated })
    .from(observations)
    .where(
      and(
        eq(observations.seriesId, stationId),
        gte(observations.ts, new Date(first)),
        lt(observations.ts, new Date(timestamps[timestamps.length - 1]! - back * yearBackMs + hourMs)),
      ),
    )
    .orderBy(asc(observations.ts));
  const byHour = new Map<number, number>();
  for (const row of rows) {
    const value = row.estimated ?? row.value;
    if (value !== null) byHour.set(row.ts.getTime() + back * yearBackMs, value);
  }
  if (byHour.size === 0) return { kind: 'none' };
  const values: Array<number | null> = timestamps.map((ms) => byHour.get(ms) ?? null);
  let missing = 0;
  let longest = 0;
  let run = 0;
  for (const value of values) {
    run = value === null ? run + 1 : 0;
    if (value === null) missing++;
    longest = Math.max(longest, run);
  }
  if (longest > longestBridgedGap || values[0] === null || values[values.length - 1] === null) return { kind: 'gaps', missing, longest };
  return { kind: 'ok', values: bridge(values) };
}

/** Fills each run of missing hours with the straight line between the readings either side. */
function bridge(values: Array<number | null>): number[] {
  const out = [...values];
  for (let h = 0; h < out.length; h++) {
    if (out[h] !== null) continue;
    const start = h - 1;
    let end = h;
    while (out[end] === null) end++;
    for (let k = h; k < end; k++) out[k] = out[start]! + ((out[end]! - out[start]!) * (k - start)) / (end - start);
  }
  return out as number[];
}
