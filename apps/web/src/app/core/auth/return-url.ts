/** Where the app goes after signing in when no return address was given. */
export const defaultAfterSignIn = '/overview';

/**
 * A return address safe to navigate to after signing in: a path inside this app only. Anything else
 * ("//host", "https://…", "/sign-in" itself) falls back to the Overview, so a link cannot send
 * someone elsewhere after they type their password.
 */
export function safeReturnUrl(raw: string | null | undefined): string {
  if (!raw || !raw.startsWith('/') || raw.startsWith('//') || raw.startsWith('/\\')) return defaultAfterSignIn;
  if (raw === '/sign-in' || raw.startsWith('/sign-in?') || raw.startsWith('/set-password')) return defaultAfterSignIn;
  return raw;
}
