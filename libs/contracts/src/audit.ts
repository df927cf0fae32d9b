import { z } from 'zod';
import { digitsSchema, idParamSchema, instantSchema } from './input';

/** One audit log entry as admins read it. */
export const auditEntrySchema = z.object({
  id: z.number().int(),
  at: z.iso.datetime(),
  /** `visitor`: someone not signed in (a failed sign-in, a redeemed link); `system`: the product itself (e.g. the nightly refit). */
  actor: z.object({ kind: z.enum(['user', 'token', 'visitor', 'system']), id: z.number().int().nullable(), name: z.string().nullable() }),
  action: z.string(),
  targetType: z.string().nullable(),
  targetId: z.string().nullable(),
  /** The target's name as it is now (a person's, a series', a file's); null when it has none or was deleted. */
  targetName: z.string().nullable(),
  detail: z.record(z.string(), z.unknown()),
  ip: z.string().nullable(),
});

/** GET /api/audit filters; `before` pages backwards by id. */
export const auditQuerySchema = z.object({
  action: z.string().max(80).optional(),
  actorUserId: idParamSchema.optional(),
  from: instantSchema().optional(),
  to: instantSchema().optional(),
  before: idParamSchema.optional(),
  limit: digitsSchema(1, 500).default(100),
});

export const auditPageSchema = z.object({ entries: z.array(auditEntrySchema), nextBefore: z.number().int().nullable() });

export type AuditEntry = z.infer<typeof auditEntrySchema>;
export type AuditQuery = z.infer<typeof auditQuerySchema>;
export type AuditPage = z.infer<typeof auditPageSchema>;
