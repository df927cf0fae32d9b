import { sql } from 'drizzle-orm';
import { bigint, check, doublePrecision, index, integer, jsonb, pgTable, text } from 'drizzle-orm/pg-core';
import { users } from './people';
import { series } from './series';
import { createdAt, instant } from './timestamps';

/** The unmetered load and losses of one parent over a reconciled horizon, in the parent's unit. */
export interface ReconciledRemainder {
  parentSeriesId: number;
  /** One value per hour from the reconciliation's origin. */
  mean: number[];
}

/**
 * One coherent set of draft versions written for a hierarchy (a parent and all its descendants) by a
 * planner's reconciliation: which method, which versions it wrote, and the remainder (unmetered load and
 * losses) it allotted under each parent, so that parent = Σ children + remainder at every hour.
 */
export const forecastReconciliations = pgTable(
  'forecast_reconciliations',
  {
    id: integer('id').primaryKey().generatedAlwaysAsIdentity(),
    rootSeriesId: integer('root_series_id')
      .notNull()
      .references(() => series.id, { onDelete: 'cascade' }),
    method: text('method').notNull(),
    /** Schäfer–Strimmer shrinkage intensity λ of the error covariance (null when not estimated). */
    shrinkage: doublePrecision('shrinkage'),
    origin: instant('origin').notNull(),
    horizonHours: integer('horizon_hours').notNull(),
    /** The draft versions written, one per series of the hierarchy. */
    versionIds: bigint('version_ids', { mode: 'number' }).array().notNull(),
    remainders: jsonb('remainders').$type<ReconciledRemainder[]>().notNull().default([]),
    createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [
    index('forecast_reconciliations_root_idx').on(t.rootSeriesId, t.createdAt.desc()),
    index('forecast_reconciliations_versions_idx').using('gin', t.versionIds),
    check('forecast_reconciliations_method_check', sql`${t.method} in ('bottom-up', 'top-down', 'min-trace')`),
  ],
);
