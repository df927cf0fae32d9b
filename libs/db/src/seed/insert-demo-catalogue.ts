import { demoCatalogue, type CatalogueEntry } from '../../../../fixtures/demo/catalogue';
import type { DemoScenario } from '../../../../fixtures/demo/scenario';
import type { Database } from '../client';
import { modelSpecs } from '../schema/models';
import { series } from '../schema/series';

/** A transaction or database that can insert. */
type Executor = Pick<Database, 'insert'>;

/**
 * Inserts the scenario's series catalogue and a default model spec for every load series. Stations go
 * first, then each level of the hierarchy, so parent and temperature links point at rows that
 * exist. Substations are not series of their own here: a feeder names its substation in its
 * description. Returns the database id of each series key.
 */
export async function insertDemoCatalogue(executor: Executor, scenario: DemoScenario): Promise<Map<string, number>> {
  const ids = new Map<string, number>();
  const entries = demoCatalogue(scenario);
  const mixByKey = new Map(scenario.feeders.map((feeder) => [feeder.key, feeder.mix]));

  for (const level of ['station', 'system', 'zone', 'feeder'] as const) {
    const rows = entries
      .filter((entry) => entry.level === level)
      .map((entry) => ({
        key: entry.key,
        name: entry.name,
        kind: entry.kind,
        level: entry.level === 'station' ? null : entry.level,
        parentId: entry.parentKey ? ids.get(entry.parentKey)! : null,
        unit: entry.unit as 'kW' | 'MW' | 'degF',
        intervalMinutes: scenario.intervalMinutes,
        timeZone: scenario.organisation.timeZone,
        timestampsMark: 'start' as const,
        temperatureSeriesId: entry.temperatureKey ? ids.get(entry.temperatureKey)! : null,
        peerGroup: entry.peerGroup,
        description: describe(entry, mixByKey.get(entry.key)),
      }));
    const inserted = await executor.insert(series).values(rows).returning({ id: series.id, key: series.key });
    for (const row of inserted) ids.set(row.key, row.id);
  }

  const loadIds = entries.filter((entry) => entry.kind === 'load').map((entry) => ids.get(entry.key)!);
  // Every setting at the schema's defaults (automatic method choice, hour-of-week profile, temperature
  // and day-type regressors, one year of training, a week ahead at 80 % and 95 %).
  await executor.insert(modelSpecs).values(loadIds.map((seriesId) => ({ seriesId })));
  return ids;
}

/** A one-line description for the catalogue: where a feeder leaves from and what it serves. */
function describe(entry: CatalogueEntry, mix: { residential: number; commercial: number; industrial: number } | undefined): string | null {
  if (entry.level !== 'feeder' || !mix) return null;
  const shares = Object.entries(mix)
    .sort(([, a], [, b]) => b - a)
    .map(([customerClass, share]) => `${Math.round(share * 100)} % ${customerClass}`)
    .join(', ');
  return `Leaves ${entry.substation} substation; ${shares}.`;
}
