/**
 * A CSV file of temperature forecast issues, received by the upload route and read here: checked first (what
 * each issue would store, and every row or hour that stops the file), then stored all or nothing. Each issue
 * is checked by the same rules as a pushed issue; a file with any problem, or with an issue time the station
 * holds already, stores no row. A stored file ends its upload `done`, its rows counted and its file deleted.
 */
import { rm } from 'node:fs/promises';
import type { TemperatureForecastFile, TemperatureForecastFileResult, TemperatureForecastIssue } from '@loadwright/contracts';
import { maxTemperatureForecastHours } from '@loadwright/contracts';
import { recordAudit, type Actor } from '@loadwright/audit';
import { series, temperatureForecasts, uploads, type Database, type Series } from '@loadwright/db';
import { readTemperatureForecastFile, sniffFile, UploadRejection, type ForecastFileHour } from '@loadwright/intake';
import { HttpProblem } from '@loadwright/problems';
import { and, eq, inArray } from 'drizzle-orm';
import { assertStation, checkIssueHours, insertIssue, issueExists, issueSummary } from './temperature-forecast-issues';

/** One issue of the file, checked. */
interface CheckedIssue {
  summary: TemperatureForecastIssue;
  rows: { ts: Date; value: number }[];
  alreadyStored: boolean;
}

/** Reads, checks and (unless `checkOnly`) stores the forecast issues of received upload `uploadId`. */
export async function storeTemperatureForecastFile(
  db: Database,
  uploadId: number,
  request: TemperatureForecastFile,
  caller: { actor: Actor; ip?: string },
): Promise<TemperatureForecastFileResult> {
  const [upload] = await db.select().from(uploads).where(eq(uploads.id, uploadId));
  if (!upload) throw new HttpProblem('notFound', `No upload with id ${uploadId}.`);
  if (upload.status !== 'received')
    throw new HttpProblem(
      'conflict',
      `Upload ${uploadId} is ${upload.status}; only a file awaiting its mapping can be read as forecast issues.`,
    );
  const [station] = await db.select().from(series).where(eq(series.key, request.station));
  if (!station)
    throw new HttpProblem('invalidInput', `No series "${request.station}".`, [{ pointer: '/station', detail: 'Choose a weather station' }]);
  assertStation(station);
  const sniffed = upload.storagePath ? await sniffFile(upload.storagePath).catch(() => null) : null;
  if (!sniffed?.ok) throw new HttpProblem('conflict', `The stored file of upload ${uploadId} is gone; upload it again.`);

  const contents = await readTemperatureForecastFile(upload.storagePath!, sniffed.layout, request).catch((error: unknown) => {
    if (error instanceof UploadRejection)
      throw new HttpProblem('invalidInput', error.message, [{ pointer: '/issuedAtColumn', detail: error.message }]);
    throw error;
  });
  const problems = [...contents.problems];
  const held = await heldIssueTimes(db, station, [...contents.issues.keys()]);
  const issues: CheckedIssue[] = [...contents.issues.entries()]
    .sort(([a], [b]) => a - b)
    .flatMap(([issuedMs, hours]) => {
      const checked = checkIssue(station, request, issuedMs, hours, problems);
      return checked ? [{ ...checked, alreadyStored: held.has(issuedMs) }] : [];
    });
  for (const issue of issues)
    if (issue.alreadyStored)
      problems.push(
        `${station.key} already holds the forecast issued at ${issue.summary.issuedAt}; issues are kept as issued and never overwritten.`,
      );
  const stationOut = { id: station.id, key: station.key, name: station.name, unit: station.unit as 'degC' | 'degF' };
  const result = (stored: boolean, message: string): TemperatureForecastFileResult => ({
    uploadId,
    stored,
    station: stationOut,
    rows: contents.rows,
    issues: issues.map((issue) => ({ ...issue.summary, alreadyStored: issue.alreadyStored })),
    problems,
    message,
  });
  const hours = issues.reduce((sum, issue) => sum + issue.rows.length, 0);
  const found = `${issues.length} issue${issues.length === 1 ? '' : 's'} with ${hours} valid hours for ${station.name}`;
  if (request.checkOnly)
    return result(
      false,
      problems.length
        ? `${found}; ${problems.length} problem${problems.length === 1 ? ' stops' : 's stop'} the file from being stored.`
        : `${found}, ready to store.`,
    );
  if (problems.length > 0) {
    const refused = issues.find((issue) => issue.alreadyStored);
    if (refused && problems.length === 1) throw issueExists(station, refused.summary.issuedAt, 'Nothing from this file was stored.');
    throw new HttpProblem(
      'invalidInput',
      `${problems.length} problem${problems.length === 1 ? ' stops' : 's stop'} the file from being stored; nothing was stored. ${problems[0]}`,
      problems.map((detail) => ({ pointer: '/file', detail })),
    );
  }
  await db.transaction(async (tx) => {
    for (const issue of issues)
      if (!(await insertIssue(tx, station, new Date(issue.summary.issuedAt), issue.rows, uploadId)))
        throw issueExists(station, issue.summary.issuedAt, 'Nothing from this file was stored.');
    const updated = await tx
      .update(uploads)
      .set({
        status: 'done',
        content: 'temperature_forecast',
        rowsTotal: contents.rows,
        rowsProcessed: contents.rows,
        rowsImported: hours,
        progress: 1,
        storagePath: null,
        startedAt: new Date(),
        finishedAt: new Date(),
      })
      .where(and(eq(uploads.id, uploadId), eq(uploads.status, 'received')))
      .returning({ id: uploads.id });
    if (updated.length === 0) throw new HttpProblem('conflict', `Upload ${uploadId} was confirmed meanwhile.`);
    await recordAudit(tx, {
      actor: caller.actor,
      action: 'temperature-forecast.uploaded',
      targetType: 'series',
      targetId: station.id,
      detail: { uploadId, fileName: upload.fileName, issues: issues.map((issue) => issue.summary.issuedAt), hours, unit: request.unit },
      ...(caller.ip !== undefined && { ip: caller.ip }),
    });
  });
  // The file goes only once its rows and the audit entry are committed.
  await rm(upload.storagePath!, { force: true });
  return result(
    true,
    `Stored ${found}${request.unit !== station.unit ? `, converted from ${request.unit === 'degC' ? '°C' : '°F'}` : ''}.`,
  );
}

/** The issue times among `issuedMs` the station holds already. */
async function heldIssueTimes(db: Database, station: Series, issuedMs: number[]): Promise<Set<number>> {
  if (issuedMs.length === 0) return new Set();
  const rows = await db
    .selectDistinct({ issuedAt: temperatureForecasts.issuedAt })
    .from(temperatureForecasts)
    .where(
      and(
        eq(temperatureForecasts.seriesId, station.id),
        inArray(
          temperatureForecasts.issuedAt,
          issuedMs.map((ms) => new Date(ms)),
        ),
      ),
    );
  return new Set(rows.map((row) => row.issuedAt.getTime()));
}

/** One issue of the file checked by the push rules, its problems named by file row; null when none of it can be stored. */
function checkIssue(
  station: Series,
  request: TemperatureForecastFile,
  issuedMs: number,
  hours: ForecastFileHour[],
  problems: string[],
): Omit<CheckedIssue, 'alreadyStored'> | null {
  const issuedAt = new Date(issuedMs).toISOString();
  if (hours.length > maxTemperatureForecastHours)
    problems.push(`The issue of ${issuedAt} has ${hours.length} hours; an issue carries at most ${maxTemperatureForecastHours} (16 days).`);
  const { rows, errors } = checkIssueHours(station, {
    issuedAt,
    unit: request.unit,
    hours: hours.map((hour) => ({ ts: new Date(hour.ts).toISOString(), value: hour.value })),
  });
  for (const error of errors)
    problems.push(
      `Row ${hours[error.index]!.line}, ${error.field === 'ts' ? request.validTimeColumn : request.valueColumn}: ${error.detail}`,
    );
  return rows.length ? { summary: issueSummary(station, new Date(issuedMs), rows, request.unit !== station.unit), rows } : null;
}
