/** Recognising PostgreSQL errors by SQLSTATE, whether node-postgres raised them or Drizzle wrapped them. */

/** The SQLSTATE of a database error, looking through Drizzle's wrapper; undefined for anything else. */
export function sqlState(error: unknown): string | undefined {
  const direct = (error as { code?: unknown } | null)?.code;
  if (typeof direct === 'string') return direct;
  const cause = (error as { cause?: { code?: unknown } } | null)?.cause?.code;
  return typeof cause === 'string' ? cause : undefined;
}

/** 55000: the immutability triggers refused to change a version that is no longer a draft. */
export const versionNotDraftState = '55000';
