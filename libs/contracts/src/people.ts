import { z } from 'zod';
import { emailSchema } from './auth';
import { roles } from './permissions';

/** A person as admins see them on the People page. */
export const personSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  displayName: z.string(),
  role: z.enum(roles),
  active: z.boolean(),
  /** Invited but has not set a password yet. */
  invitePending: z.boolean(),
  createdAt: z.iso.datetime(),
  lastSignInAt: z.iso.datetime().nullable(),
});

/** The answer to an invite: the person, and whether the invitation mail is on its way or delayed. */
export const inviteResponseSchema = personSchema.extend({ mailNotice: z.string() });

/** POST /api/people: invite someone by e-mail. */
export const inviteRequestSchema = z.object({
  email: emailSchema,
  displayName: z.string().trim().min(1, 'Enter a name').max(120),
  role: z.enum(roles),
});

/** PATCH /api/people/:id */
export const updatePersonRequestSchema = z
  .object({ role: z.enum(roles), active: z.boolean(), displayName: z.string().trim().min(1).max(120) })
  .partial()
  .refine((value) => Object.keys(value).length > 0, 'Send at least one of role, active, displayName');

export type Person = z.infer<typeof personSchema>;
export type InviteResponse = z.infer<typeof inviteResponseSchema>;
export type InviteRequest = z.infer<typeof inviteRequestSchema>;
export type UpdatePersonRequest = z.infer<typeof updatePersonRequestSchema>;
