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

/** GET /api/health: public, so a load balancer or the sign-in page can read it. */
export const healthReportSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  version: z.string(),
  checkedAt: z.iso.datetime(),
  database: componentHealthSchema,
  queue: componentHealthSchema.extend({ queues: z.array(queueDepthSchema) }),
});

export type ComponentHealth = z.infer<typeof componentHealthSchema>;
export type QueueDepth = z.infer<typeof queueDepthSchema>;
export type HealthReport = z.infer<typeof healthReportSchema>;
