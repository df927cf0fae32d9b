import { z } from 'zod';

/** One component's state in the health report. */
export const componentHealthSchema = z.object({
  ok: z.boolean(),
  latencyMs: z.number().nonnegative().nullable(),
  detail: z.string(),
});

/** Jobs waiting, running and failed in one pg-boss queue. */
export const queueDepthSchema = z.object({
  name: z.string(),
  queued: z.number().int().nonnegative(),
  active: z.number().int().nonnegative(),
  failed: z.number().int().nonnegative(),
});

/**
 * One worker process as its heartbeat row tells it. `live` means its last beat is younger than three of
 * its own beat intervals; a killed worker stays listed (not live) for ten minutes, a stopped one not at all.
 * Holds no host secrets: the host name and process id are what an administrator needs to find it.
 */
export const workerProcessSchema = z.object({
  name: z.string(),
  host: z.string(),
  pid: z.number().int(),
  startedAt: z.iso.datetime(),
  lastBeatAt: z.iso.datetime(),
  beatSeconds: z.number().int().positive(),
  live: z.boolean(),
  /** Jobs its handlers hold right now (imports, refits). */
  jobsInHand: z.number().int().nonnegative(),
});

/** GET /api/health: public, so a load balancer or the sign-in page can read it. */
export const healthReportSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  version: z.string(),
  checkedAt: z.iso.datetime(),
  database: componentHealthSchema,
  queue: componentHealthSchema.extend({ queues: z.array(queueDepthSchema) }),
  /** ok while at least one worker is live: without one, uploads and refits wait. */
  workers: componentHealthSchema.extend({ processes: z.array(workerProcessSchema) }),
});

export type ComponentHealth = z.infer<typeof componentHealthSchema>;
export type QueueDepth = z.infer<typeof queueDepthSchema>;
export type WorkerProcess = z.infer<typeof workerProcessSchema>;
export type HealthReport = z.infer<typeof healthReportSchema>;
