/**
 * Test-only helpers for the engine specs: load the R reference fixtures kept in
 * fixtures/reference/ (copied unchanged from the shared reference set, with their R calls) and
 * compare numbers by relative error. Not exported from the library.
 */
import { readFileSync } from 'node:fs';
import { expect } from 'vitest';

/** The public series with stored R reference values. */
export type ReferenceSeries = 'lh' | 'LakeHuron' | 'USAccDeaths';

/** Every reference series, for specs that check all three. */
export const referenceSeries: ReferenceSeries[] = ['lh', 'LakeHuron', 'USAccDeaths'];

const fixtureRoot = new URL('../../../../fixtures/reference/', import.meta.url);

/** The values of a series from fixtures/reference/data/<name>.json. */
export function loadSeries(name: ReferenceSeries): number[] {
  return JSON.parse(readFileSync(new URL(`data/${name}.json`, fixtureRoot), 'utf8')).values as number[];
}

/** The R reference values for a series from fixtures/reference/ref/<name>.json (layout in its README). */
// The layout is documented in fixtures/reference/README.md; specs read the keys they need.
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- reference JSON of documented layout; specs index it freely
export function loadReference(name: ReferenceSeries): any {
  return JSON.parse(readFileSync(new URL(`ref/${name}.json`, fixtureRoot), 'utf8'));
}

/** Asserts |actual − expected| ≤ tolerance·|expected| element by element, naming the index that fails. */
export function expectRelative(actual: ArrayLike<number>, expected: ArrayLike<number>, tolerance: number, what = 'value'): void {
  expect(actual.length, `${what}: length`).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    const error = Math.abs(actual[i] - expected[i]);
    expect(error, `${what}[${i}] = ${actual[i]}, expected ${expected[i]}`).toBeLessThanOrEqual(tolerance * Math.abs(expected[i]));
  }
}

/** Largest relative error over the elements, for reporting. */
export function maxRelativeError(actual: ArrayLike<number>, expected: ArrayLike<number>): number {
  let worst = 0;
  for (let i = 0; i < expected.length; i++) worst = Math.max(worst, Math.abs(actual[i] - expected[i]) / Math.abs(expected[i]));
  return worst;
}
