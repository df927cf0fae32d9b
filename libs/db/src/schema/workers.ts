import { sql } from 'drizzle-orm';
import { check, index, integer, pgTable, text, uuid } from 'drizzle-orm/pg-core';
import { instant } from './timestamps';

/**
 * One row per running worker process, on any machine: it writes `beat_at` every `beat_seconds` and
 * lists the pg-boss jobs its handlers hold. A worker is live while its last beat is younger than three
 * of its own beat intervals; the API reads this for service health, and workers use it to give the
 * jobs of a dead worker back to the queue (jobs/worker-presence.ts). A worker that stops cleanly
 * deletes its row; the row of a killed worker stays until pruned, so health can say it stopped.
 */
export const workerHeartbeats = pgTable(
  'worker_heartbeats',
  {
    id: uuid('id').primaryKey(),
    /** The process's name in logs, e.g. worker-1. */
    name: text('name').notNull(),
    host: text('host').notNull(),
    pid: integer('pid').notNull(),
    startedAt: instant('started_at').notNull().defaultNow(),
    beatAt: instant('beat_at').notNull().defaultNow(),
    beatSeconds: integer('beat_seconds').notNull(),
    /** pg-boss job ids whose handlers are running in this process. */
    jobs: uuid('jobs')
      .array()
      .notNull()
      .default(sql`'{}'::uuid[]`),
  },
  (table) => [
    index('worker_heartbeats_beat_at_idx').on(table.beatAt),
    check('worker_heartbeats_beat_positive', sql`${table.beatSeconds} > 0`),
  ],
);
