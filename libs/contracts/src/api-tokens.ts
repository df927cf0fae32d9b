import { z } from 'zod';
import { tokenScopes } from './permissions';

/** An API token as admins see it: never its secret. */
export const apiTokenSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  prefix: z.string(),
  scope: z.enum(tokenScopes),
  createdAt: z.iso.datetime(),
  createdBy: z.string().nullable(),
  expiresAt: z.iso.datetime().nullable(),
  lastUsedAt: z.iso.datetime().nullable(),
  revokedAt: z.iso.datetime().nullable(),
});

/** POST /api/tokens */
export const createApiTokenRequestSchema = z.object({
  name: z.string().trim().min(1, 'Name the system that will use the token').max(120),
  scope: z.enum(tokenScopes),
  /** Days until it expires; null for no expiry. */
  expiresInDays: z.number().int().min(1).max(3650).nullable(),
});

/** The one response that carries the secret: shown once. */
export const createdApiTokenSchema = z.object({ token: apiTokenSchema, secret: z.string() });

export type ApiToken = z.infer<typeof apiTokenSchema>;
export type CreateApiTokenRequest = z.infer<typeof createApiTokenRequestSchema>;
export type CreatedApiToken = z.infer<typeof createdApiTokenSchema>;
