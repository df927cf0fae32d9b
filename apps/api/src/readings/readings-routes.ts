/**
 * The routes under /api/series/:series/…: the history the series page charts, the push API for
 * actuals from other systems, and Green Button file import. `:series` is the series' id or its key.
 */
import type { Request } from 'express';
import {
  greenButtonImportResultSchema,
  greenButtonMediaTypes,
  importResultSchema,
  maxGreenButtonBytes,
  pushReadingsRequestSchema,
  readingHistoryQuerySchema,
  readingHistorySchema,
} from '@loadwright/contracts';
import type { Series } from '@loadwright/db';
import { z } from 'zod';
import type { AppContext } from '../app-context';
import { clientAddress } from '../auth/client-address';
import { HttpProblem } from '@loadwright/problems';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { findSeriesByRef } from '@loadwright/series';
import { greenButtonReadings } from '@loadwright/readings';
import { GreenButtonFormatError, GreenButtonTooLargeError, greenButtonUnits, readGreenButtonOffThread } from '@loadwright/readings';
import { readingHistory } from '@loadwright/readings';
import { importBatch, sha256Hex } from '@loadwright/readings';
import { pushedIntervalReadings } from '@loadwright/readings';

const seriesParams = z.object({ series: z.string().trim().min(1).max(64) });

/**
 * Checks the request carries an XML body the reading thread can take: one of the Green Button media
 * types, UTF-8 (the default of XML), not compressed.
 */
function assertXmlBody(req: Request): void {
  const type = (req.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase();
  if (!(greenButtonMediaTypes as readonly string[]).includes(type)) {
    throw new HttpProblem(
      'invalidInput',
      `Send the Green Button XML file as the request body with Content-Type ${greenButtonMediaTypes.slice(0, 2).join(' or ')}.`,
      [{ pointer: '', detail: 'Expected an XML body' }],
    );
  }
  const charset = /;\s*charset\s*=\s*"?([^";\s]+)/i.exec(req.headers['content-type'] ?? '')?.[1]?.toLowerCase();
  if (charset && charset !== 'utf-8' && charset !== 'utf8')
    throw new HttpProblem('unsupportedMediaType', 'Send the Green Button file as UTF-8 (charset=utf-8), as utilities publish it.');
  const encoding = (req.headers['content-encoding'] ?? 'identity').trim().toLowerCase();
  if (encoding !== 'identity')
    throw new HttpProblem('unsupportedMediaType', 'Send the Green Button file uncompressed (no Content-Encoding).');
}

/** Readings routes. */
export function readingsRoutes({ db }: AppContext): RouteDefinition[] {
  /** The series named in the path; 404 when there is none. */
  const seriesOf = async (ref: string): Promise<Series> => {
    const series = await findSeriesByRef(db, ref);
    if (!series) throw new HttpProblem('notFound', `No series "${ref}".`);
    return series;
  };
  /** The series, which must be live to take readings. */
  const liveSeriesOf = async (ref: string): Promise<Series> => {
    const series = await seriesOf(ref);
    if (series.archivedAt) throw new HttpProblem('conflict', `${series.key} is archived and takes no readings; restore it first.`);
    return series;
  };

  return [
    defineRoute({
      method: 'get',
      path: '/series/:series/readings',
      access: 'data.read',
      tag: 'Readings',
      summary: 'History for the chart: each reading with its estimate and quality flags, or hourly/daily aggregates over long ranges',
      params: seriesParams,
      query: readingHistoryQuerySchema,
      response: readingHistorySchema,
      handler: async ({ params, query }) => readingHistory(db, await seriesOf(params.series), query),
    }),
    defineRoute({
      method: 'post',
      path: '/series/:series/readings',
      access: 'data.upload',
      tag: 'Readings',
      summary: 'Push actuals from another system: validated and stored like an upload; the same batch twice adds nothing',
      params: seriesParams,
      body: pushReadingsRequestSchema,
      response: importResultSchema,
      handler: async ({ params, body, actor, req }) => {
        const series = await liveSeriesOf(params.series);
        const { readings, canonical, unit } = pushedIntervalReadings(series, body);
        return importBatch(db, {
          series,
          readings,
          source: 'api',
          fileName: `API push to ${series.key}`,
          contentSha256: sha256Hex(canonical),
          byteSize: Buffer.byteLength(canonical),
          unit,
          timestampsMark: series.timestampsMark,
          actor,
          ip: clientAddress(req),
          auditAction: 'readings.pushed',
        });
      },
    }),
    defineRoute({
      method: 'post',
      path: '/series/:series/green-button',
      access: 'data.upload',
      tag: 'Readings',
      summary: 'Import a Green Button (ESPI) interval usage file sent as the XML body (application/xml or application/atom+xml)',
      params: seriesParams,
      query: z.object({ fileName: z.string().trim().min(1).max(200).optional() }),
      response: greenButtonImportResultSchema,
      handler: async ({ params, query, actor, req }) => {
        const series = await liveSeriesOf(params.series);
        assertXmlBody(req);
        let file;
        let readings;
        try {
          // Parsed in a worker thread as the bytes arrive: a large file never blocks other requests.
          file = await readGreenButtonOffThread(req, { maxBytes: maxGreenButtonBytes, hashPrefix: `${series.key}\n` });
          readings = greenButtonReadings(file.usage, series);
        } catch (error) {
          if (error instanceof GreenButtonFormatError)
            throw new HttpProblem('invalidInput', error.message, [{ pointer: '', detail: error.message }]);
          if (error instanceof GreenButtonTooLargeError)
            throw new HttpProblem(
              'payloadTooLarge',
              `Green Button files of up to ${maxGreenButtonBytes / 1024 / 1024} MB are accepted; split the download by date range.`,
            );
          throw error;
        }
        const { usage } = file;
        const result = await importBatch(db, {
          series,
          readings,
          source: 'green_button',
          fileName: query.fileName ?? `Green Button file for ${series.key}`,
          contentSha256: file.sha256,
          byteSize: file.byteSize,
          // Values were converted to the series' unit from the file's interval starts.
          unit: series.unit,
          timestampsMark: 'start',
          sourceDetail: { readingType: usage.readingType, localTime: usage.localTime, usagePoint: usage.usagePointTitle },
          actor,
          ip: clientAddress(req),
          auditAction: 'greenButton.imported',
        });
        return {
          ...result,
          readingType: { ...usage.readingType, uomName: greenButtonUnits[usage.readingType.uom] },
          localTime: usage.localTime,
          firstIntervalStart: new Date(usage.intervals[0]!.startSeconds * 1000).toISOString(),
          lastIntervalStart: new Date(usage.intervals.at(-1)!.startSeconds * 1000).toISOString(),
        };
      },
    }),
  ];
}
