/**
 * Catalogue rules that need the database: the parent exists, is live and sits higher in the hierarchy,
 * the linked station is a live temperature series, the key is free, and a level change keeps every
 * child below its parent. Each broken rule becomes one `{pointer, detail}` so the form can show them all.
 */
import { seriesLevelDepth, type SeriesKind, type SeriesLevel } from '@loadwright/contracts';
import { HttpProblem } from '@loadwright/problems';
import { childLevels, findSeriesById, findSeriesByKey, type Executor } from './series-repository';

/** The fields of a series that the rules look at, as they would be after the change. */
export interface SeriesCandidate {
  key: string;
  kind: SeriesKind;
  level: SeriesLevel | null;
  parentId: number | null;
  temperatureSeriesId: number | null;
}

/** One broken rule, pointing at the field to fix. */
export interface RuleBreak {
  pointer: string;
  detail: string;
}

/** Checks the candidate; `selfId` is the series being edited (absent when creating). Throws 409 for a taken key, 400 for the rest. */
export async function assertSeriesRelations(db: Executor, candidate: SeriesCandidate, selfId?: number): Promise<void> {
  const taken = await findSeriesByKey(db, candidate.key);
  if (taken && taken.id !== selfId) {
    throw new HttpProblem(
      'conflict',
      `The key "${candidate.key}" is already used by series ${taken.id} (${taken.name}). Choose another key.`,
      [{ pointer: '/key', detail: `Already used by ${taken.name}` }],
    );
  }
  const breaks = [
    ...(await parentBreaks(db, candidate, selfId)),
    ...(await stationBreaks(db, candidate)),
    ...(await childBreaks(db, candidate, selfId)),
  ];
  if (breaks.length > 0) throw new HttpProblem('invalidInput', breaks.map((b) => `${b.pointer}: ${b.detail}`).join('; '), breaks);
}

async function parentBreaks(db: Executor, candidate: SeriesCandidate, selfId?: number): Promise<RuleBreak[]> {
  if (candidate.parentId === null) return [];
  const pointer = '/parentId';
  if (candidate.parentId === selfId) return [{ pointer, detail: 'A series cannot be its own parent' }];
  const parent = await findSeriesById(db, candidate.parentId);
  if (!parent) return [{ pointer, detail: `No series with id ${candidate.parentId}` }];
  if (parent.archivedAt) return [{ pointer, detail: `${parent.key} is archived; restore it first or choose a live parent` }];
  if (parent.kind !== 'load' || !parent.level)
    return [{ pointer, detail: `${parent.key} is a temperature series and cannot be a parent in the network hierarchy` }];
  if (candidate.level && seriesLevelDepth[parent.level] >= seriesLevelDepth[candidate.level]) {
    return [
      {
        pointer,
        detail: `${parent.key} is a ${parent.level}; the parent of a ${candidate.level} must be of a higher level (system > zone > substation > feeder)`,
      },
    ];
  }
  return [];
}

async function stationBreaks(db: Executor, candidate: SeriesCandidate): Promise<RuleBreak[]> {
  if (candidate.temperatureSeriesId === null) return [];
  const pointer = '/temperatureSeriesId';
  const station = await findSeriesById(db, candidate.temperatureSeriesId);
  if (!station) return [{ pointer, detail: `No series with id ${candidate.temperatureSeriesId}` }];
  if (station.kind !== 'temperature') return [{ pointer, detail: `${station.key} is a ${station.kind} series; link a temperature series` }];
  if (station.archivedAt) return [{ pointer, detail: `${station.key} is archived; restore it first or link a live station` }];
  return [];
}

async function childBreaks(db: Executor, candidate: SeriesCandidate, selfId?: number): Promise<RuleBreak[]> {
  if (selfId === undefined) return [];
  const levels = (await childLevels(db, selfId)) as SeriesLevel[];
  if (levels.length === 0) return [];
  if (!candidate.level) return [{ pointer: '/level', detail: 'This series has children, so it must stay in the network hierarchy' }];
  const tooHigh = levels.filter((level) => seriesLevelDepth[level] <= seriesLevelDepth[candidate.level!]);
  if (tooHigh.length === 0) return [];
  return [
    {
      pointer: '/level',
      detail: `This series has ${tooHigh.join(' and ')} children; a ${candidate.level} must sit above them. Move the children first`,
    },
  ];
}
