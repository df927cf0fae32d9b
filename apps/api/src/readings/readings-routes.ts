/**
 * The routes under /api/series/:series/…: the history the series page charts, the push API for
 * actuals from other systems, and Green Button file import. `:series` is the series' id or its key.
 */
import express from 'express';
import type { Request, Response } from 'express';
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
import { GreenButtonFormatError, greenButtonUnits, parseGreenButton } from '@loadwright/readings';
import { readingHistory } from '@loadwright/readings';
import { importBatch, sha256Hex } from '@loadwright/readings';
import { pushedIntervalReadings } from '@loadwright/readings';

const seriesParams = z.object({ series: z.string().trim().min(1).max(64) });

/** The XML body parser, run only inside the Green Button route after access is checked. */
const readXmlBody = express.text({ type: [...greenButtonMediaTypes], limit: maxGreenButtonBytes });

/** Reads the request body as XML text; 413 above the size limit, 400 when it is not XML. */
async function xmlBody(req: Request, res: Response): Promise<string> {
  await new Promise<void>((resolve, reject) =>
    readXmlBody(req, res, (error?: unknown) => {
      if ((error as { type?: string } | undefined)?.type === 'entity.too.large') {
        reject(
          new HttpProblem(
            'payloadTooLarge',
            `Green Button files of up to ${maxGreenButtonBytes / 1024 / 1024} MB are accepted; split the download by date range.`,
          ),
        );
      } else if (error) reject(error);
      else resolve();
    }),
  );
  if (typeof req.body !== 'string' || req.body.trim() === '') {
    throw new HttpProblem(
      'invalidInput',
      `Send the Green Button XML file as the request body with Content-Type ${greenButtonMediaTypes.slice(0, 2).join(' or ')}.`,
      [{ pointer: '', detail: 'Expected an XML body' }],
    );
  }
  return req.body;
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
      handler: async ({ params, query, actor, req, res }) => {
        const series = await liveSeriesOf(params.series);
        const xml = await xmlBody(req, res);
        let usage;
        let readings;
        try {
          usage = parseGreenButton(xml);
          readings = greenButtonReadings(usage, series);
        } catch (error) {
          if (error instanceof GreenButtonFormatError)
            throw new HttpProblem('invalidInput', error.message, [{ pointer: '', detail: error.message }]);
          throw error;
        }
        const result = await importBatch(db, {
          series,
          readings,
          source: 'green_button',
          fileName: query.fileName ?? `Green Button file for ${series.key}`,
          contentSha256: sha256Hex(`${series.key}\n${xml}`),
          byteSize: Buffer.byteLength(xml),
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
