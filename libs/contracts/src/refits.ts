/**
 * Refit runs: a nightly or manual refit over a set of series, and each series' progress in it.
 * Start with models.edit; read with data.read. Screens poll GET /api/refits/current quickly while a
 * run is active (`run !== null`) and GET /api/refits slowly otherwise.
 */
import { z } from 'zod';
import { digitsSchema, recordIdSchema } from './input';
import { fittedMethods } from './models';

/**
 * Which series a run covers: every active load series, a group (a series and everything below it in
 * the hierarchy, e.g. a zone and its feeders), or a list of series.
 */
export const refitScopeSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('all') }),
  z.object({ kind: z.literal('subtree'), seriesId: recordIdSchema }),
  z.object({ kind: z.literal('series'), seriesIds: z.array(recordIdSchema).min(1).max(10_000) }),
]);
/** See refitScopeSchema. */
export type RefitScope = z.infer<typeof refitScopeSchema>;

/** POST /api/refits */
export const startRefitRequestSchema = z.object({ scope: refitScopeSchema });

/** Where one series stands in a run. */
export const refitStatuses = ['queued', 'running', 'done', 'failed'] as const;
/** One of refitStatuses. */
export type RefitStatus = (typeof refitStatuses)[number];

/** A run as a whole: `queued` before any series started, `running`, then `finished` (even with failures). */
export const refitRunStates = ['queued', 'running', 'finished'] as const;

/** Series counts of a run by status. */
export const refitCountsSchema = z.object({
  total: z.number().int(),
  queued: z.number().int(),
  running: z.number().int(),
  done: z.number().int(),
  failed: z.number().int(),
});

/** One run, newest first in lists. */
export const refitRunSummarySchema = z.object({
  id: z.number().int(),
  trigger: z.enum(['schedule', 'manual']),
  scope: refitScopeSchema,
  state: z.enum(refitRunStates),
  /** Display name of the planner who started a manual run. */
  requestedBy: z.string().nullable(),
  /** The schedule's fire time (scheduled runs). */
  scheduledFor: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
  /** When the first series started. */
  startedAt: z.iso.datetime().nullable(),
  /** When the last series finished (done or failed). */
  finishedAt: z.iso.datetime().nullable(),
  /** finishedAt − createdAt, or the time so far while the run is going. */
  durationMs: z.number().int().nullable(),
  counts: refitCountsSchema,
  /** The series the scope names (a group's top series, or the listed ones, at most 20), with their names, so screens never show bare ids. */
  scopeSeries: z.array(z.object({ id: z.number().int(), name: z.string() })),
});

/** Milliseconds spent in each phase of one series' refit. */
export const refitPhaseTimingsSchema = z.object({
  read: z.number().optional(),
  fit: z.number().optional(),
  /** CPU milliseconds of the fit (wall time above also counts waiting for a busy machine). */
  fitCpu: z.number().optional(),
  diagnose: z.number().optional(),
  forecast: z.number().optional(),
  write: z.number().optional(),
});

/** One series within a run. */
export const refitRunSeriesSchema = z.object({
  seriesId: z.number().int(),
  seriesKey: z.string(),
  seriesName: z.string(),
  status: z.enum(refitStatuses),
  /** Tries so far (a job is retried with backoff before it is marked failed). */
  attempts: z.number().int(),
  /** The last error, in words (kept when a retry succeeded: null once done). */
  error: z.string().nullable(),
  fitId: z.number().int().nullable(),
  /** The method the fit ended up with (auto's choice). */
  method: z.enum(fittedMethods).nullable(),
  /** The draft forecast version this run wrote for the series. */
  versionId: z.number().int().nullable(),
  phaseMs: refitPhaseTimingsSchema.nullable(),
  queuedAt: z.iso.datetime(),
  startedAt: z.iso.datetime().nullable(),
  finishedAt: z.iso.datetime().nullable(),
  durationMs: z.number().int().nullable(),
});

/** GET /api/refits/:id */
export const refitRunDetailSchema = refitRunSummarySchema.extend({ series: z.array(refitRunSeriesSchema) });

/** GET /api/refits?limit= */
export const refitRunListQuerySchema = z.object({ limit: digitsSchema(1, 200).default(20) });
/** GET /api/refits response. */
export const refitRunListSchema = z.object({ runs: z.array(refitRunSummarySchema) });

/** GET /api/refits/current: the newest run that has not finished, or null when idle. */
export const currentRefitSchema = z.object({ run: refitRunSummarySchema.nullable() });

export type StartRefitRequest = z.infer<typeof startRefitRequestSchema>;
export type RefitCounts = z.infer<typeof refitCountsSchema>;
export type RefitRunSummary = z.infer<typeof refitRunSummarySchema>;
export type RefitRunSeries = z.infer<typeof refitRunSeriesSchema>;
export type RefitRunDetail = z.infer<typeof refitRunDetailSchema>;
export type RefitRunList = z.infer<typeof refitRunListSchema>;
export type CurrentRefit = z.infer<typeof currentRefitSchema>;
