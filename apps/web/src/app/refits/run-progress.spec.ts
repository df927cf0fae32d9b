import type { RefitRunSummary } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { countsSentence, durationText, finishedPercent, outcomeText, scopeText } from './run-progress';

const counts = { total: 18, queued: 5, running: 1, done: 11, failed: 1 };

describe('run progress', () => {
  it('counts failed series as finished and rounds down, so only a whole run reads 100 %', () => {
    expect(finishedPercent(counts)).toBe(66);
    expect(finishedPercent({ total: 3, queued: 0, running: 1, done: 2, failed: 0 })).toBe(66);
    expect(finishedPercent({ total: 3, queued: 0, running: 0, done: 2, failed: 1 })).toBe(100);
    expect(finishedPercent({ total: 0, queued: 0, running: 0, done: 0, failed: 0 })).toBe(100);
  });

  it('says the counts in words, leaving out the empty ones', () => {
    expect(countsSentence(counts)).toBe('11 of 18 done · 1 running · 1 failed · 5 queued');
    expect(countsSentence({ total: 4, queued: 0, running: 0, done: 4, failed: 0 })).toBe('4 of 4 done');
  });

  it('writes durations at a scale a planner reads at a glance', () => {
    expect([null, 850, 42_300, 185_000, 3_725_000].map(durationText)).toEqual(['—', '850 ms', '42 s', '3 min 05 s', '1 h 02 min']);
  });

  it('names the scope and the outcome', () => {
    const scopeSeries = [
      { id: 3, name: 'North zone' },
      { id: 9, name: 'Feeder N-1' },
      { id: 10, name: 'Feeder N-2' },
    ];
    expect(scopeText({ scope: { kind: 'all' }, scopeSeries: [] })).toBe('All active series');
    expect(scopeText({ scope: { kind: 'subtree', seriesId: 3 }, scopeSeries })).toBe('North zone and everything below it');
    expect(scopeText({ scope: { kind: 'series', seriesIds: [9] }, scopeSeries })).toBe('Feeder N-1');
    expect(scopeText({ scope: { kind: 'series', seriesIds: [3, 9] }, scopeSeries })).toBe('North zone, Feeder N-1');
    expect(scopeText({ scope: { kind: 'series', seriesIds: [3, 9, 10, 11] }, scopeSeries })).toBe(
      '4 series: North zone, Feeder N-1 and 2 more',
    );
    // Never a bare id: a series deleted since the run is said to be so.
    expect(scopeText({ scope: { kind: 'series', seriesIds: [19] }, scopeSeries })).toBe('a series deleted since');
    const run = { state: 'finished', counts: { ...counts, queued: 0, running: 0, done: 16, failed: 2 } } as RefitRunSummary;
    expect(outcomeText(run)).toBe('Finished, 2 failed');
    expect(outcomeText({ ...run, counts: { ...run.counts, failed: 0 } })).toBe('Finished, all done');
    expect(outcomeText({ ...run, state: 'running' })).toBe('Running');
  });
});
