/**
 * Names of the things audit entries act on, so the log reads "Dana Reyes" or "North zone" rather
 * than "Person #8" or "Series 19". One query per kind of target on a page of entries; a target deleted
 * since keeps no name (the entry still says what it was and its id).
 */
import { sql, type SQL } from 'drizzle-orm';
import type { Database } from '@loadwright/db';

/** `($1, $2, …)`: ids as a parenthesised list of parameters. */
function list(ids: string[]): SQL {
  return sql`(${sql.join(
    ids.map((id) => sql`${id}`),
    sql`, `,
  )})`;
}

/** How each kind of target is named: a query from ids (as text) to names. */
const namingQueries: Record<string, (ids: string[]) => SQL> = {
  user: (ids) => sql`select id::text as id, display_name as name from users where id::text in ${list(ids)}`,
  api_token: (ids) => sql`select id::text as id, name from api_tokens where id::text in ${list(ids)}`,
  series: (ids) => sql`select id::text as id, name from series where id::text in ${list(ids)}`,
  upload: (ids) => sql`select id::text as id, file_name as name from uploads where id::text in ${list(ids)}`,
  holiday: (ids) => sql`select id::text as id, name from holidays where id::text in ${list(ids)}`,
  forecast_version: (ids) =>
    sql`select v.id::text as id, 'version ' || v.id || ' of ' || s.name as name
          from forecast_versions v join series s on s.id = v.series_id where v.id::text in ${list(ids)}`,
};

/** Names by `${targetType}:${targetId}` for the targets of some entries. */
export async function auditTargetNames(
  db: Pick<Database, 'execute'>,
  targets: readonly { targetType: string | null; targetId: string | null }[],
): Promise<Map<string, string>> {
  const idsByType = new Map<string, Set<string>>();
  for (const { targetType, targetId } of targets) {
    if (!targetType || !targetId || !namingQueries[targetType]) continue;
    const ids = idsByType.get(targetType) ?? new Set<string>();
    ids.add(targetId);
    idsByType.set(targetType, ids);
  }
  const names = new Map<string, string>();
  for (const [type, ids] of idsByType) {
    const { rows } = await db.execute<{ id: string; name: string }>(namingQueries[type]!([...ids]));
    for (const row of rows) names.set(`${type}:${row.id}`, row.name);
  }
  return names;
}
