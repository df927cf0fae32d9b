/** The live (not archived) series of the catalogue, as intake needs them. */
import { isNull } from 'drizzle-orm';
import { series, type Database } from '@loadwright/db';
import type { CatalogueEntry } from './catalogue-entry';

/** Every series that is not archived. */
export async function loadCatalogue(db: Pick<Database, 'select'>): Promise<CatalogueEntry[]> {
  return db
    .select({
      id: series.id,
      key: series.key,
      kind: series.kind,
      unit: series.unit,
      intervalMinutes: series.intervalMinutes,
      timeZone: series.timeZone,
      timestampsMark: series.timestampsMark,
    })
    .from(series)
    .where(isNull(series.archivedAt));
}
