import { z } from 'zod';
import { permissionTable, roles, type Permission } from './permissions';

/** An e-mail address as people type it; compared without regard to letter case. */
export const emailSchema = z
  .string()
  .trim()
  .max(254, 'Use at most 254 characters')
  .pipe(z.email('Enter a valid e-mail address, e.g. name@utility.example'));

/** A new password: length is what counts (NIST SP 800-63B §5.1.1.2). */
export const newPasswordSchema = z.string().min(12, 'Use at least 12 characters').max(256, 'Use at most 256 characters');

/** POST /api/auth/sign-in */
export const signInRequestSchema = z.object({ email: emailSchema, password: z.string().min(1, 'Enter your password').max(256) });

/** The signed-in person and what they may do. */
export const sessionInfoSchema = z.object({
  user: z.object({ id: z.number().int(), email: z.string(), displayName: z.string(), role: z.enum(roles) }),
  permissions: z.array(z.enum(Object.keys(permissionTable) as [Permission, ...Permission[]])),
});

/** POST /api/auth/password: change one's own password. */
export const changePasswordRequestSchema = z.object({
  currentPassword: z.string().min(1, 'Enter your current password'),
  newPassword: newPasswordSchema,
});

/** POST /api/auth/forgot-password */
export const forgotPasswordRequestSchema = z.object({ email: emailSchema });

/** POST /api/auth/set-password: from an invite or reset link. */
export const setPasswordRequestSchema = z.object({ token: z.string().min(20).max(200), newPassword: newPasswordSchema });

/** A plain acknowledgement with a sentence for the person. */
export const messageResponseSchema = z.object({ message: z.string() });

export type SignInRequest = z.infer<typeof signInRequestSchema>;
export type SessionInfo = z.infer<typeof sessionInfoSchema>;
export type ChangePasswordRequest = z.infer<typeof changePasswordRequestSchema>;
export type SetPasswordRequest = z.infer<typeof setPasswordRequestSchema>;
