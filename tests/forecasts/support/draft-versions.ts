/**
 * Writes a draft forecast version the way the nightly refit does: a fit, then in one transaction the
 * previous draft of the series superseded and a new draft with its points (mean, standard error,
 * 80 % and 95 % bounds). Tests use it to have drafts to review and approve.
 */
import { fits, forecastPoints, forecastVersions, type Database } from '@loadwright/db';
import { and, eq } from 'drizzle-orm';

/** z-values of the central 80 % and 95 % normal intervals. */
const z80 = 1.2815515655446004;
const z95 = 1.959963984540054;

/** What the draft should hold. */
export interface DraftSpec {
  seriesId: number;
  /** First forecast instant (interval start, UTC). */
  origin: Date;
  /** Number of hourly intervals (default 168). */
  hours?: number;
  /** The model mean of interval i (default a flat 100). */
  mean?: (i: number, ts: Date) => number;
  /** Standard error of interval i (default 2). */
  stdError?: (i: number) => number;
  /** When the version counts as issued (default now). */
  issuedAt?: Date;
}

/** Writes a fit and a draft version superseding the series' current draft; returns the version id. */
export async function writeDraftVersion(db: Database, spec: DraftSpec): Promise<number> {
  const hours = spec.hours ?? 168;
  const meanAt = spec.mean ?? (() => 100);
  const seAt = spec.stdError ?? (() => 2);
  return db.transaction(async (tx) => {
    const [fit] = await tx
      .insert(fits)
      .values({
        seriesId: spec.seriesId,
        specSnapshot: { method: 'auto' },
        method: 'yule_walker',
        arOrder: 2,
        maOrder: 0,
        parameters: { ar: [0.9, -0.2], intercept: 0 },
        sigma2: 4,
        logLikelihood: -1234.5,
        aic: 2475,
        aicc: 2475.1,
        bic: 2490,
        dataStart: new Date(spec.origin.getTime() - 365 * 86_400_000),
        dataEnd: new Date(spec.origin.getTime() - 3_600_000),
        observationCount: 8760,
        dataHash: `test-${spec.seriesId}-${spec.origin.toISOString()}-${Math.random()}`,
        durationMs: 12,
      })
      .returning({ id: fits.id });
    const supersededAt = new Date();
    await tx
      .update(forecastVersions)
      .set({ state: 'superseded', supersededAt })
      .where(and(eq(forecastVersions.seriesId, spec.seriesId), eq(forecastVersions.state, 'draft')));
    const [version] = await tx
      .insert(forecastVersions)
      .values({
        seriesId: spec.seriesId,
        fitId: fit!.id,
        origin: spec.origin,
        horizonHours: hours,
        ...(spec.issuedAt && { issuedAt: spec.issuedAt }),
      })
      .returning({ id: forecastVersions.id });
    const points = Array.from({ length: hours }, (_, i) => {
      const ts = new Date(spec.origin.getTime() + i * 3_600_000);
      const mean = meanAt(i, ts);
      const se = seAt(i);
      return {
        versionId: version!.id,
        ts,
        mean,
        stdError: se,
        lower80: mean - z80 * se,
        upper80: mean + z80 * se,
        lower95: mean - z95 * se,
        upper95: mean + z95 * se,
      };
    });
    await tx.insert(forecastPoints).values(points);
    return version!.id;
  });
}
