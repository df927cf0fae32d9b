/**
 * The series catalogue: list with filters and paging, one series in detail, and the steward's edits
 * (create, change, archive, restore), each checked against the catalogue rules and audited in the
 * same transaction as the change.
 */
import {
  createSeriesRequestSchema,
  type CreateSeriesRequest,
  type SeriesDetail,
  type SeriesListQuery,
  type SeriesPage,
  type UpdateSeriesRequest,
} from '@loadwright/contracts';
import type { Database, NewSeries, Series } from '@loadwright/db';
import type { Actor } from '@loadwright/audit';
import { recordAudit } from '@loadwright/audit';
import { HttpProblem } from '@loadwright/problems';
import {
  countChildren,
  countLinkedLoads,
  findAncestors,
  findSeriesById,
  findSeriesByRef,
  findSeriesRow,
  hasReadings,
  insertSeries,
  listSeriesRows,
  readingStats,
  updateSeriesRow,
  type Executor,
} from './series-repository';
import { assertSeriesRelations } from './series-rules';
import { toSeriesRef, toSeriesSummary } from './series-view';

/** Who made a change and from where, for the audit log. */
export interface ChangeAuthor {
  actor: Actor;
  ip: string;
}

/** The fields a steward edits, in the order audit details list them. */
const editableFields = [
  'key',
  'name',
  'kind',
  'level',
  'parentId',
  'unit',
  'intervalMinutes',
  'timeZone',
  'timestampsMark',
  'temperatureSeriesId',
  'peerGroup',
  'description',
] as const;

/** One page of the catalogue. A parent named by id or key that does not exist is a 400 on `parent`. */
export async function listSeries(db: Executor, query: SeriesListQuery): Promise<SeriesPage> {
  const { parent: parentRef, ...filter } = query;
  let parentId: number | undefined;
  if (parentRef !== undefined) {
    const parent = await findSeriesByRef(db, parentRef);
    if (!parent)
      throw new HttpProblem('invalidInput', `No series "${parentRef}" to list the children of.`, [
        { pointer: '/query/parent', detail: `No series "${parentRef}"` },
      ]);
    parentId = parent.id;
  }
  const { rows, total } = await listSeriesRows(db, { ...filter, parentId });
  return { items: rows.map(toSeriesSummary), total, offset: query.offset, limit: query.limit };
}

/** One series with its ancestors, children, station and reading counts; 404 when there is none. */
export async function getSeriesDetail(db: Executor, id: number): Promise<SeriesDetail> {
  const row = await findSeriesRow(db, id);
  if (!row) throw new HttpProblem('notFound', `No series with id ${id}.`);
  const [ancestors, children, station, linkedLoadCount, stats] = await Promise.all([
    findAncestors(db, id),
    countChildren(db, id),
    row.series.temperatureSeriesId === null ? undefined : findSeriesById(db, row.series.temperatureSeriesId),
    row.series.kind === 'temperature' ? countLinkedLoads(db, id) : 0,
    readingStats(db, id),
  ]);
  return {
    ...toSeriesSummary(row),
    parentChain: ancestors.map(toSeriesRef),
    childrenCount: children.all,
    activeChildrenCount: children.active,
    temperatureSeries: station ? toSeriesRef(station) : null,
    linkedLoadCount,
    readings: {
      count: stats.count,
      firstAt: stats.firstAt?.toISOString() ?? null,
      latestAt: stats.latestAt?.toISOString() ?? null,
      byQuality: stats.byQuality,
      clean: stats.clean,
    },
  };
}

/** Adds a series to the catalogue. */
export async function createSeries(db: Database, input: CreateSeriesRequest, author: ChangeAuthor): Promise<SeriesDetail> {
  const values: NewSeries = {
    key: input.key,
    name: input.name,
    kind: input.kind,
    level: input.level ?? null,
    parentId: input.parentId ?? null,
    unit: input.unit,
    intervalMinutes: input.intervalMinutes,
    timeZone: input.timeZone,
    timestampsMark: input.timestampsMark,
    temperatureSeriesId: input.temperatureSeriesId ?? null,
    peerGroup: input.peerGroup || null,
    description: input.description || null,
  };
  const id = await db.transaction(async (tx) => {
    await assertSeriesRelations(tx, {
      key: values.key,
      kind: values.kind,
      level: values.level ?? null,
      parentId: values.parentId ?? null,
      temperatureSeriesId: values.temperatureSeriesId ?? null,
    });
    const created = await insertUnique(() => insertSeries(tx, values), values.key);
    await recordAudit(tx, { ...author, action: 'series.created', targetType: 'series', targetId: created.id, detail: pick(created) });
    return created.id;
  });
  return getSeriesDetail(db, id);
}

/** Changes a series; the result must satisfy every rule a new series must. */
export async function updateSeries(db: Database, id: number, patch: UpdateSeriesRequest, author: ChangeAuthor): Promise<SeriesDetail> {
  await db.transaction(async (tx) => {
    const current = await findSeriesById(tx, id);
    if (!current) throw new HttpProblem('notFound', `No series with id ${id}.`);
    if (patch.kind !== undefined && patch.kind !== current.kind) {
      throw new HttpProblem('invalidInput', `A series cannot change from ${current.kind} to ${patch.kind}; create a new series instead.`, [
        { pointer: '/kind', detail: 'The kind cannot change' },
      ]);
    }
    const merged = createSeriesRequestSchema.safeParse({ ...pick(current), ...patch });
    if (!merged.success) {
      const errors = merged.error.issues.map((issue) => ({ pointer: `/${issue.path.join('/')}`, detail: issue.message }));
      throw new HttpProblem('invalidInput', errors.map((e) => `${e.pointer}: ${e.detail}`).join('; '), errors);
    }
    const next = merged.data;
    if ((next.unit !== current.unit || next.intervalMinutes !== current.intervalMinutes) && (await hasReadings(tx, id))) {
      const field = next.unit !== current.unit ? 'unit' : 'intervalMinutes';
      throw new HttpProblem(
        'conflict',
        `${current.key} already holds readings in ${current.unit} every ${current.intervalMinutes} minutes; the ${field === 'unit' ? 'unit' : 'interval'} cannot change. Create a new series for the new ${field === 'unit' ? 'unit' : 'interval'}.`,
        [{ pointer: `/${field}`, detail: 'Cannot change once readings are stored' }],
      );
    }
    await assertSeriesRelations(
      tx,
      {
        key: next.key,
        kind: next.kind,
        level: next.level ?? null,
        parentId: next.parentId ?? null,
        temperatureSeriesId: next.temperatureSeriesId ?? null,
      },
      id,
    );
    const values: Partial<NewSeries> = {
      key: next.key,
      name: next.name,
      level: next.level ?? null,
      parentId: next.parentId ?? null,
      unit: next.unit,
      intervalMinutes: next.intervalMinutes,
      timeZone: next.timeZone,
      timestampsMark: next.timestampsMark,
      temperatureSeriesId: next.temperatureSeriesId ?? null,
      peerGroup: next.peerGroup || null,
      description: next.description || null,
    };
    const changes = changedFields(pick(current), values);
    if (Object.keys(changes).length === 0) return;
    await insertUnique(() => updateSeriesRow(tx, id, values), next.key);
    await recordAudit(tx, { ...author, action: 'series.updated', targetType: 'series', targetId: id, detail: { key: next.key, changes } });
  });
  return getSeriesDetail(db, id);
}

/** Archives a live series: hidden from the catalogue by default and never refit. Refused while it has live children. */
export async function archiveSeries(db: Database, id: number, author: ChangeAuthor): Promise<SeriesDetail> {
  await db.transaction(async (tx) => {
    const current = await findSeriesById(tx, id);
    if (!current) throw new HttpProblem('notFound', `No series with id ${id}.`);
    if (current.archivedAt) throw new HttpProblem('conflict', `${current.key} is already archived.`);
    const { active } = await countChildren(tx, id);
    if (active > 0)
      throw new HttpProblem(
        'conflict',
        `${current.key} has ${active} live ${active === 1 ? 'child' : 'children'}; archive or move ${active === 1 ? 'it' : 'them'} first.`,
      );
    await updateSeriesRow(tx, id, { archivedAt: new Date() });
    await recordAudit(tx, { ...author, action: 'series.archived', targetType: 'series', targetId: id, detail: { key: current.key } });
  });
  return getSeriesDetail(db, id);
}

/** Brings an archived series back. Refused while its parent is archived. */
export async function restoreSeries(db: Database, id: number, author: ChangeAuthor): Promise<SeriesDetail> {
  await db.transaction(async (tx) => {
    const current = await findSeriesById(tx, id);
    if (!current) throw new HttpProblem('notFound', `No series with id ${id}.`);
    if (!current.archivedAt) throw new HttpProblem('conflict', `${current.key} is not archived.`);
    const parent = current.parentId === null ? undefined : await findSeriesById(tx, current.parentId);
    if (parent?.archivedAt) throw new HttpProblem('conflict', `Its parent ${parent.key} is archived; restore the parent first.`);
    await updateSeriesRow(tx, id, { archivedAt: null });
    await recordAudit(tx, { ...author, action: 'series.restored', targetType: 'series', targetId: id, detail: { key: current.key } });
  });
  return getSeriesDetail(db, id);
}

/** The editable fields of a stored series. */
function pick(row: Series): Record<(typeof editableFields)[number], unknown> {
  return Object.fromEntries(editableFields.map((field) => [field, row[field]])) as Record<(typeof editableFields)[number], unknown>;
}

/** The fields whose value changes, with old and new values. */
function changedFields(before: Record<string, unknown>, after: Partial<NewSeries>): Record<string, { from: unknown; to: unknown }> {
  const changes: Record<string, { from: unknown; to: unknown }> = {};
  for (const [field, to] of Object.entries(after)) {
    if (before[field] !== to) changes[field] = { from: before[field], to };
  }
  return changes;
}

/** Runs a write, turning a race on the unique key into the same 409 the rules give. */
async function insertUnique<T>(write: () => Promise<T>, key: string): Promise<T> {
  try {
    return await write();
  } catch (error) {
    const cause = (error as { cause?: { code?: string; constraint?: string } }).cause ?? (error as { code?: string; constraint?: string });
    if (cause.code === '23505' && cause.constraint === 'series_key_key') {
      throw new HttpProblem('conflict', `The key "${key}" is already used by another series. Choose another key.`, [
        { pointer: '/key', detail: 'Already used' },
      ]);
    }
    throw error;
  }
}
