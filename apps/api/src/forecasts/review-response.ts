/**
 * Sends a series' forecast review fast: the review is computed once per state of its inputs and kept
 * as JSON and gzip bytes, keyed by the series and a fingerprint of everything the review reads (see
 * reviewFingerprint). A request costs the fingerprint's one round trip and a write of stored bytes;
 * the points, peaks and comparison are computed again only after something changed (a refit, an
 * approval, an adjustment, a reading). The fingerprint's hash is the strong ETag, so a client that
 * has the current review gets 304 Not Modified without a body.
 */
import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import { forecastReviewSchema } from '@loadwright/contracts';
import type { Database } from '@loadwright/db';
import type pg from 'pg';
import { reviewFingerprint, reviewForecast } from '@loadwright/forecasts';
import { HttpProblem } from '@loadwright/problems';
import type { Request, Response } from 'express';

/** A computed review, ready to send. */
interface StoredReview {
  fingerprint: string;
  etag: string;
  json: Buffer;
  gzip: Buffer;
}

/** Reviews kept: a few hundred series' at about 100 kB of JSON and 15 kB of gzip each. */
const maxStored = 300;

/** A review store for one application; reviews are dropped least recently used first. */
export function createReviewResponder(db: Database, pool: pg.Pool) {
  const stored = new Map<number, StoredReview>();
  /** Reviews being computed, by series and fingerprint: fifty clients arriving at once compute it once. */
  const computing = new Map<string, Promise<StoredReview>>();

  /** The stored review of `seriesId` for `fingerprint`, computing and storing it when missing or outdated. */
  function current(seriesId: number, fingerprint: string): Promise<StoredReview> {
    const hit = stored.get(seriesId);
    if (hit?.fingerprint === fingerprint) {
      // Refresh its place in the least-recently-used order.
      stored.delete(seriesId);
      stored.set(seriesId, hit);
      return Promise.resolve(hit);
    }
    const key = `${seriesId}|${fingerprint}`;
    let pending = computing.get(key);
    if (!pending) {
      pending = compute(seriesId, fingerprint).finally(() => computing.delete(key));
      computing.set(key, pending);
    }
    return pending;
  }

  /** Computes, serialises and stores one review. */
  async function compute(seriesId: number, fingerprint: string): Promise<StoredReview> {
    const review = forecastReviewSchema.parse(await reviewForecast(db, seriesId));
    const json = Buffer.from(JSON.stringify(review));
    const entry = {
      fingerprint,
      etag: `"${createHash('sha256').update(fingerprint).digest('base64url').slice(0, 27)}"`,
      json,
      gzip: gzipSync(json),
    };
    stored.delete(seriesId);
    stored.set(seriesId, entry);
    if (stored.size > maxStored) stored.delete(stored.keys().next().value!);
    return entry;
  }

  /** Answers GET /api/series/:id/forecast: 304 when the client's ETag is current, else the review (gzip when accepted). */
  return async function sendReview(seriesId: number, req: Request, res: Response): Promise<void> {
    const fingerprint = await reviewFingerprint(pool, seriesId);
    if (fingerprint === null) throw new HttpProblem('notFound', `No series with id ${seriesId}.`);
    const entry = await current(seriesId, fingerprint);
    res.setHeader('ETag', entry.etag);
    // Private: it needs a sign-in; no-cache: keep it, but ask each time (a draft changes with every adjustment).
    res.setHeader('Cache-Control', 'private, no-cache');
    res.setHeader('Vary', 'Accept-Encoding');
    const known = req.headers['if-none-match'];
    if (known && known.split(',').some((tag) => tag.trim() === entry.etag)) {
      res.status(304).end();
      return;
    }
    res.setHeader('Content-Type', 'application/json; charset=utf-8');
    const gzip = req.headers['accept-encoding'] !== undefined && req.acceptsEncodings('gzip', 'identity') === 'gzip';
    // Setting Content-Encoding tells the compression middleware the body is compressed already.
    if (gzip) res.setHeader('Content-Encoding', 'gzip');
    const body = gzip ? entry.gzip : entry.json;
    res.setHeader('Content-Length', body.length);
    res.status(200).end(body);
  };
}
