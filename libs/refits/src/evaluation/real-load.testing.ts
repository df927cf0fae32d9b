/**
 * Real public hourly system demand for tests and benchmarks: PJM East metered load, the 8,760 hours of
 * 2002 (fixtures/reference/data/pjm-east-2002.json names the repository, path, commit, publisher and
 * licence). The values sit on the local clock, 24 per day, so they are given UTC timestamps with the
 * time zone 'UTC' (the calendar of the grid is the local calendar); the two daylight-saving hours the
 * source has no row for are bridged by straight lines.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { LoadSeriesData } from '@loadwright/forecasting';

/** The fixture's content. */
interface RealLoadFixture {
  name: string;
  source: { publisher: string; repository: string; path: string; commit: string };
  values: Array<number | null>;
}

/** Name of the series as tests and benchmarks cite it. */
export const REAL_LOAD_NAME = 'PJM East (PJME) hourly metered load, 2002, MW';
/** First hour of the fixture, 2002-01-01 00:00 on the local clock. */
export const REAL_LOAD_START_MS = Date.UTC(2002, 0, 1);

/** The PJM East 2002 series with timestamps, and where it comes from. */
export function realHourlyLoad(): { data: LoadSeriesData; source: string } {
  const path = fileURLToPath(new URL('../../../../fixtures/reference/data/pjm-east-2002.json', import.meta.url));
  const fixture = JSON.parse(readFileSync(path, 'utf8')) as RealLoadFixture;
  const raw = fixture.values;
  const values = new Float64Array(raw.length);
  for (let i = 0; i < raw.length; i++) {
    const v = raw[i];
    if (v !== null) {
      values[i] = v;
      continue;
    }
    let next = i + 1;
    while (raw[next] === null) next++;
    const before = raw[i - 1] as number;
    const after = raw[next] as number;
    values[i] = before + (after - before) / (next - i + 1);
  }
  const timestamps = Float64Array.from({ length: values.length }, (_, i) => REAL_LOAD_START_MS + i * 3_600_000);
  const { publisher, repository, path: file, commit } = fixture.source;
  return { data: { timestamps, values }, source: `${publisher}; ${repository}/${file} at ${commit}` };
}
