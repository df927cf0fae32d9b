/**
 * Coherence of forecasts across the hierarchy, and reconciliation: does a parent's forecast equal the sum of
 * its children's (plus the unmetered load and losses a reconciliation allotted it), and writing one coherent
 * set of drafts for a parent and everything under it.
 *
 * Routes (under /api), with the permission each needs:
 * - GET  series/:id/coherence           data.read          coherenceQuerySchema → hierarchyCoherenceSchema
 * - POST series/:id/reconciliations     forecasts.approve  reconcileRequestSchema → 201 reconciliationResultSchema
 * Problems: 404 unknown series; 409 (`/problems/conflict`) when the series has no children, or when a series
 * under it has no draft to reconcile (each listed in `errors`).
 *
 * Conventions: children's values are converted to the parent's unit before summing; the adjusted numbers
 * count (see forecasts.ts); `gap = parent − Σ children − remainder`, with remainder 0 unless the parent's
 * version was written by a reconciliation.
 */
import { z } from 'zod';
import { forecastSeriesSchema } from './forecasts';

/** The ways a hierarchy can be made to add up. */
export const reconciliationMethodNames = ['bottom-up', 'top-down', 'min-trace'] as const;
export type ReconciliationMethodName = (typeof reconciliationMethodNames)[number];

/** GET /api/series/:id/coherence: compare the current drafts (default) or the approved versions. */
export const coherenceQuerySchema = z.object({ state: z.enum(['draft', 'approved']).default('draft') });

/** One hour of the comparison, in the parent's unit. */
export const coherenceHourSchema = z.object({
  ts: z.iso.datetime(),
  parent: z.number(),
  /** Σ of the children's values; null when a child has no value this hour. */
  childrenSum: z.number().nullable(),
  /** Unmetered load and losses the reconciliation allotted; null when the parent's version was not reconciled. */
  remainder: z.number().nullable(),
  /** parent − childrenSum − (remainder ?? 0); null when childrenSum is. */
  gap: z.number().nullable(),
  /** 100 · gap / parent. */
  gapPercent: z.number().nullable(),
});

/** Which reconciliation wrote the parent's version. */
export const reconciliationRefSchema = z.object({
  id: z.number().int(),
  method: z.enum(reconciliationMethodNames),
  createdAt: z.iso.datetime(),
  /** True when every child's compared version was written by the same reconciliation. */
  wholeSet: z.boolean(),
});

/** A parent's forecast against the sum of its children, hour by hour. */
export const hierarchyCoherenceSchema = z.object({
  parent: forecastSeriesSchema,
  state: z.enum(['draft', 'approved']),
  parentVersionId: z.number().int().nullable(),
  children: z.array(z.object({ series: forecastSeriesSchema, versionId: z.number().int().nullable() })),
  reconciliation: reconciliationRefSchema.nullable(),
  hours: z.array(coherenceHourSchema),
  summary: z.object({
    hoursCompared: z.number().int(),
    meanAbsGapPercent: z.number().nullable(),
    maxAbsGapPercent: z.number().nullable(),
    maxGapAt: z.iso.datetime().nullable(),
    /** True when every compared hour adds up to rounding (|gap| ≤ 10⁻⁶ · |parent|) and every child has a version. */
    coherent: z.boolean(),
  }),
  /** What keeps the comparison from being complete, in words (e.g. a child without a draft). */
  notes: z.array(z.string()),
});

/** POST /api/series/:id/reconciliations: reconcile the current drafts of this series and everything under it. */
export const reconcileRequestSchema = z.object({ method: z.enum(reconciliationMethodNames) });

/** The coherent set written. */
export const reconciliationResultSchema = z.object({
  id: z.number().int(),
  rootSeriesId: z.number().int(),
  method: z.enum(reconciliationMethodNames),
  /** Shrinkage intensity λ of the error covariance (min-trace), else null. */
  shrinkage: z.number().nullable(),
  origin: z.iso.datetime(),
  horizonHours: z.number().int(),
  versions: z.array(
    z.object({ seriesId: z.number().int(), key: z.string(), versionId: z.number().int(), replacedVersionId: z.number().int() }),
  ),
  /** The remainder (unmetered load and losses) each parent carries, as mean share of the parent over the horizon. */
  remainders: z.array(z.object({ parentSeriesId: z.number().int(), key: z.string(), meanSharePercent: z.number() })),
});

export type CoherenceQuery = z.infer<typeof coherenceQuerySchema>;
export type CoherenceHour = z.infer<typeof coherenceHourSchema>;
export type HierarchyCoherence = z.infer<typeof hierarchyCoherenceSchema>;
export type ReconcileRequest = z.infer<typeof reconcileRequestSchema>;
export type ReconciliationResult = z.infer<typeof reconciliationResultSchema>;
