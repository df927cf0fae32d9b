/** Data access of the series catalogue: one place for the SQL the catalogue service runs. */
import { and, asc, count, desc, eq, ilike, inArray, isNotNull, isNull, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { qualityFlagBits, qualityFlagNames, type QualityFlagName, type SeriesListQuery } from '@loadwright/contracts';
import { series, type Database, type NewSeries, type Series } from '@loadwright/db';

/** The database, or a transaction on it. */
export type Executor = Pick<Database, 'select' | 'selectDistinct' | 'insert' | 'update' | 'execute'>;

/** A catalogue row with the keys of its parent and station and the time of its newest reading. */
export interface SeriesRow {
  series: Series;
  parentKey: string | null;
  temperatureSeriesKey: string | null;
  latestReadingAt: Date | null;
}

/** Filters of the catalogue list with the parent already resolved to an id. */
export type SeriesListFilter = Omit<SeriesListQuery, 'parent'> & { parentId?: number };

const parent = alias(series, 'parent');
const station = alias(series, 'station');

/** Newest reading of the row's series: a backwards scan of the (series_id, ts) primary key. */
const latestReading = sql<Date | null>`(select max(o.ts) from observations o where o.series_id = ${series.id})`.mapWith(
  (v: string | Date | null) => (v === null ? null : new Date(v)),
);

/** Escapes LIKE wildcards so a search for "n_1" finds that text, not "n-1". */
function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** The WHERE conditions of a list filter. */
function listConditions(filter: SeriesListFilter): SQL | undefined {
  const conditions: (SQL | undefined)[] = [];
  if (filter.kind) conditions.push(eq(series.kind, filter.kind));
  if (filter.level) conditions.push(eq(series.level, filter.level));
  if (filter.archived === 'false') conditions.push(isNull(series.archivedAt));
  if (filter.archived === 'true') conditions.push(isNotNull(series.archivedAt));
  if (filter.q) conditions.push(or(ilike(series.key, likePattern(filter.q)), ilike(series.name, likePattern(filter.q))));
  if (filter.parentId !== undefined) {
    conditions.push(
      filter.descendants
        ? sql`${series.id} in (
            with recursive subtree(id) as (
              select id from series where parent_id = ${filter.parentId}
              union all
              select s.id from series s join subtree on s.parent_id = subtree.id
            ) select id from subtree)`
        : eq(series.parentId, filter.parentId),
    );
  }
  return and(...conditions);
}

/** ORDER BY of a list sort, with the id as the last tie-break so pages never overlap. */
function listOrder(filter: SeriesListFilter): SQL[] {
  const direction = filter.order === 'desc' ? desc : asc;
  switch (filter.sort) {
    case 'name':
      return [direction(sql`lower(${series.name})`), direction(series.key), asc(series.id)];
    case 'level':
      // The level enum sorts system, zone, substation, feeder; temperature series (no level) come last.
      return [
        filter.order === 'desc' ? sql`${series.level} desc nulls last` : sql`${series.level} asc nulls last`,
        asc(series.key),
        asc(series.id),
      ];
    case 'updated':
      return [direction(series.updatedAt), asc(series.id)];
    case 'key':
      return [direction(series.key), asc(series.id)];
  }
}

/** One page of the catalogue and the number of rows that match the filter. */
export async function listSeriesRows(db: Executor, filter: SeriesListFilter): Promise<{ rows: SeriesRow[]; total: number }> {
  const where = listConditions(filter);
  const [counted] = await db.select({ total: count() }).from(series).where(where);
  const rows = await db
    .select({ series, parentKey: parent.key, temperatureSeriesKey: station.key, latestReadingAt: latestReading })
    .from(series)
    .leftJoin(parent, eq(parent.id, series.parentId))
    .leftJoin(station, eq(station.id, series.temperatureSeriesId))
    .where(where)
    .orderBy(...listOrder(filter))
    .limit(filter.limit)
    .offset(filter.offset);
  return { rows, total: counted?.total ?? 0 };
}

/** One catalogue row by id, or undefined. */
export async function findSeriesRow(db: Executor, id: number): Promise<SeriesRow | undefined> {
  const [row] = await db
    .select({ series, parentKey: parent.key, temperatureSeriesKey: station.key, latestReadingAt: latestReading })
    .from(series)
    .leftJoin(parent, eq(parent.id, series.parentId))
    .leftJoin(station, eq(station.id, series.temperatureSeriesId))
    .where(eq(series.id, id));
  return row;
}

/** A series by id, or undefined. */
export async function findSeriesById(db: Executor, id: number): Promise<Series | undefined> {
  const [row] = await db.select().from(series).where(eq(series.id, id));
  return row;
}

/** A series by key, or undefined. */
export async function findSeriesByKey(db: Executor, key: string): Promise<Series | undefined> {
  const [row] = await db.select().from(series).where(eq(series.key, key));
  return row;
}

/** A series named by its id (all digits) or its key (keys start with a letter), or undefined. */
export async function findSeriesByRef(db: Executor, ref: string): Promise<Series | undefined> {
  if (/^\d{1,9}$/.test(ref)) return findSeriesById(db, Number(ref));
  return findSeriesByKey(db, ref);
}

/** The ancestors of a series, from the top of the hierarchy down to its direct parent. */
export async function findAncestors(db: Executor, id: number): Promise<Series[]> {
  const result = await db.execute<{ id: number; depth: number }>(sql`
    with recursive chain(id, parent_id, depth) as (
      select id, parent_id, 0 from series where id = (select parent_id from series where id = ${id})
      union all
      select s.id, s.parent_id, chain.depth + 1 from series s join chain on s.id = chain.parent_id
      where chain.depth < 16
    ) select id, depth from chain order by depth desc`);
  const ids = result.rows.map((r) => Number(r.id));
  if (ids.length === 0) return [];
  const rows = await db.select().from(series).where(inArray(series.id, ids));
  return ids.map((ancestorId) => rows.find((r) => r.id === ancestorId)).filter((r): r is Series => r !== undefined);
}

/** Direct children of a series: all, and those not archived. */
export async function countChildren(db: Executor, id: number): Promise<{ all: number; active: number }> {
  const [row] = await db
    .select({ all: count(), active: sql<number>`count(*) filter (where ${series.archivedAt} is null)`.mapWith(Number) })
    .from(series)
    .where(eq(series.parentId, id));
  return { all: row?.all ?? 0, active: row?.active ?? 0 };
}

/** The distinct levels of a series' direct children. */
export async function childLevels(db: Executor, id: number): Promise<string[]> {
  const rows = await db.selectDistinct({ level: series.level }).from(series).where(eq(series.parentId, id));
  return rows.map((r) => r.level).filter((level): level is NonNullable<typeof level> => level !== null);
}

/** How many load series use a temperature series as their station. */
export async function countLinkedLoads(db: Executor, id: number): Promise<number> {
  const [row] = await db.select({ n: count() }).from(series).where(eq(series.temperatureSeriesId, id));
  return row?.n ?? 0;
}

/** Stored-reading counts of a series: total, first and last instant, rows per quality flag, clean rows. */
export async function readingStats(
  db: Executor,
  id: number,
): Promise<{ count: number; firstAt: Date | null; latestAt: Date | null; clean: number; byQuality: Record<QualityFlagName, number> }> {
  const perFlag = qualityFlagNames.map(
    (name) => sql`count(*) filter (where quality & ${qualityFlagBits[name]} <> 0)::int as ${sql.identifier(name)}`,
  );
  const result = await db.execute<Record<string, unknown>>(sql`
    select count(*)::int as total, min(ts) as first_at, max(ts) as latest_at,
      count(*) filter (where quality = 0)::int as clean, ${sql.join(perFlag, sql`, `)}
    from observations where series_id = ${id}`);
  const row = result.rows[0]!;
  const toDate = (v: unknown) => (v === null || v === undefined ? null : new Date(v as string));
  return {
    count: Number(row['total']),
    firstAt: toDate(row['first_at']),
    latestAt: toDate(row['latest_at']),
    clean: Number(row['clean']),
    byQuality: Object.fromEntries(qualityFlagNames.map((name) => [name, Number(row[name])])) as Record<QualityFlagName, number>,
  };
}

/** True when the series has at least one stored reading. */
export async function hasReadings(db: Executor, id: number): Promise<boolean> {
  const result = await db.execute(sql`select 1 from observations where series_id = ${id} limit 1`);
  return result.rows.length > 0;
}

/** Inserts a series and returns it. */
export async function insertSeries(db: Executor, values: NewSeries): Promise<Series> {
  const [row] = await db.insert(series).values(values).returning();
  return row!;
}

/** Updates a series and returns it. */
export async function updateSeriesRow(db: Executor, id: number, values: Partial<NewSeries>): Promise<Series> {
  const [row] = await db
    .update(series)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(series.id, id))
    .returning();
  return row!;
}
