/** Reading uploads and their findings for the API: list, one upload with its report, findings page by page. */
import { and, count, desc, eq, notInArray, sql } from 'drizzle-orm';
import {
  validationRuleDescriptions,
  validationRuleSeverity,
  type Upload,
  type UploadFinding,
  type UploadMapping,
  type UploadReport,
  type UploadSettings,
  type UploadStatus,
  type ValidationRule,
} from '@loadwright/contracts';
import { apiTokens, uploads, users, type Database } from '@loadwright/db';
import { examplesPerRule } from './findings';

const iso = (date: Date | null) => date?.toISOString() ?? null;

/** The columns lists need, with who uploaded. */
function uploadQuery(db: Database) {
  return db
    .select({ upload: uploads, person: users.displayName, token: apiTokens.name })
    .from(uploads)
    .leftJoin(users, eq(users.id, uploads.uploadedById))
    .leftJoin(apiTokens, eq(apiTokens.id, uploads.uploadedByTokenId));
}

type UploadRow = Awaited<ReturnType<ReturnType<typeof uploadQuery>['execute']>>[number];

/** An upload as the contracts describe it. */
function toUpload({ upload, person, token }: UploadRow): Upload {
  return {
    id: upload.id,
    fileName: upload.fileName,
    byteSize: upload.byteSize,
    source: upload.source,
    status: upload.status,
    progress: Math.round(upload.progress * 1000) / 10,
    uploadedBy: person ?? token ?? null,
    createdAt: upload.createdAt.toISOString(),
    startedAt: iso(upload.startedAt),
    finishedAt: iso(upload.finishedAt),
    rowsTotal: upload.rowsTotal,
    rowsProcessed: upload.rowsProcessed,
    rowsImported: upload.rowsImported,
    rowsRejected: upload.rowsRejected,
    rowsUnchanged: upload.rowsUnchanged,
    rowsRevised: upload.rowsRevised,
    error: upload.error,
    mapping: (upload.mapping as UploadMapping | null) ?? null,
    settings: (upload.settings as UploadSettings | null) ?? null,
  };
}

/** One upload, or null. */
export async function findUpload(db: Database, id: number): Promise<Upload | null> {
  const [row] = await uploadQuery(db).where(eq(uploads.id, id));
  return row ? toUpload(row) : null;
}

/** A page of uploads, newest first. */
export async function listUploads(
  db: Database,
  query: { status?: UploadStatus; limit: number; offset: number },
): Promise<{ items: Upload[]; total: number }> {
  const where = query.status ? eq(uploads.status, query.status) : undefined;
  const rows = await uploadQuery(db)
    .where(where)
    .orderBy(desc(uploads.createdAt), desc(uploads.id))
    .limit(query.limit)
    .offset(query.offset);
  const [total] = await db.select({ n: count() }).from(uploads).where(where);
  return { items: rows.map(toUpload), total: total?.n ?? 0 };
}

/** A stored finding with its series key, as the report shows it. */
interface FindingRow {
  id: number;
  rule: ValidationRule;
  series_key: string | null;
  ts: Date | null;
  value: number | null;
  source_row: number | null;
  detail: Record<string, unknown>;
}

function toFinding(row: FindingRow): UploadFinding {
  return { rule: row.rule, seriesKey: row.series_key, ts: iso(row.ts), value: row.value, sourceRow: row.source_row, detail: row.detail };
}

/** Counts per rule and the first examples of each. */
export async function uploadReport(db: Database, uploadId: number): Promise<UploadReport> {
  const counts = await db.execute(
    sql`select rule, count(*)::int as count from upload_findings where upload_id = ${uploadId} group by rule order by count(*) desc, rule`,
  );
  const examples = await db.execute(sql`
    select id, rule, series_key, ts, value, source_row, detail from (
      select f.*, s.key as series_key, row_number() over (partition by f.rule order by f.id) as n
      from upload_findings f left join series s on s.id = f.series_id where f.upload_id = ${uploadId}) ranked
    where n <= ${examplesPerRule} order by rule, id`);
  return {
    counts: (counts.rows as { rule: ValidationRule; count: number }[]).map((row) => ({
      ...row,
      description: validationRuleDescriptions[row.rule],
      severity: validationRuleSeverity[row.rule],
    })),
    examples: (examples.rows as unknown as FindingRow[]).map((row) => toFinding({ ...row, ts: row.ts ? new Date(row.ts) : null })),
  };
}

/** Every finding of an upload, a page at a time by id (for the CSV download). */
export async function* allFindings(db: Database, uploadId: number, pageSize = 5000): AsyncGenerator<UploadFinding[]> {
  let after = 0;
  for (;;) {
    const page = await db.execute(sql`
      select f.id, f.rule, s.key as series_key, f.ts, f.value, f.source_row, f.detail
      from upload_findings f left join series s on s.id = f.series_id
      where f.upload_id = ${uploadId} and f.id > ${after} order by f.id limit ${pageSize}`);
    const rows = page.rows as unknown as FindingRow[];
    if (rows.length === 0) return;
    after = Number(rows[rows.length - 1]!.id);
    yield rows.map((row) => toFinding({ ...row, ts: row.ts ? new Date(row.ts) : null }));
  }
}

/** The upload that already holds these bytes (any status but failed or cancelled), if any. */
export async function uploadWithContent(db: Database, sha256: string): Promise<number | null> {
  const [row] = await db
    .select({ id: uploads.id })
    .from(uploads)
    .where(and(eq(uploads.contentSha256, sha256), notInArray(uploads.status, ['failed', 'cancelled'])));
  return row?.id ?? null;
}
