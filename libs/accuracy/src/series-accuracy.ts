/** Reading a series' accuracy report: the window of its newest scored days, then the report over them. */
import type { SeriesAccuracy } from '@loadwright/contracts';
import { findSeries } from '@loadwright/forecasts';
import { HttpProblem } from '@loadwright/problems';
import { scoredUntil, storedScores, type ScoreDb } from './score-repository';
import { buildSeriesAccuracy } from './series-accuracy-report';

const dayMs = 86_400_000;

/** The accuracy of series `seriesId` over the `days` days up to its newest scored hour. */
export async function seriesAccuracy(db: ScoreDb, seriesId: number, days: number): Promise<SeriesAccuracy> {
  const target = await findSeries(db, seriesId);
  if (!target) throw new HttpProblem('notFound', `No series with id ${seriesId}.`);
  const to = (await scoredUntil(db, seriesId)) ?? new Date();
  const from = new Date(to.getTime() - days * dayMs);
  const rows = await storedScores(db, seriesId, from, to);
  return buildSeriesAccuracy(rows, { seriesId, unit: target.unit, timeZone: target.timeZone, from, to, days });
}
