import type { RefitCounts, RefitRunSummary } from '@loadwright/contracts';

/** Share of a run's series that have finished (done or failed), 0–100, rounded down so 100 means all. */
export function finishedPercent(counts: RefitCounts): number {
  if (counts.total === 0) return 100;
  return Math.floor(((counts.done + counts.failed) / counts.total) * 100);
}

/** A run's counts in words, e.g. "12 of 18 done · 1 failed · 5 queued". */
export function countsSentence(counts: RefitCounts): string {
  const parts = [`${counts.done} of ${counts.total} done`];
  if (counts.running) parts.push(`${counts.running} running`);
  if (counts.failed) parts.push(`${counts.failed} failed`);
  if (counts.queued) parts.push(`${counts.queued} queued`);
  return parts.join(' · ');
}

/** A duration in words fit for a table: "850 ms", "42 s", "3 min 05 s", "1 h 02 min". */
export function durationText(ms: number | null): string {
  if (ms === null) return '—';
  if (ms < 1_000) return `${Math.round(ms)} ms`;
  const seconds = Math.round(ms / 1_000);
  if (seconds < 60) return `${seconds} s`;
  const minutes = Math.floor(seconds / 60);
  if (minutes < 60) return `${minutes} min ${String(seconds % 60).padStart(2, '0')} s`;
  return `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')} min`;
}

/** What a run covered, in words, naming its series by name (a series deleted since is said to be so). */
export function scopeText(run: Pick<RefitRunSummary, 'scope' | 'scopeSeries'>): string {
  const scope = run.scope;
  const name = (id: number) => run.scopeSeries.find((entry) => entry.id === id)?.name ?? 'a series deleted since';
  if (scope.kind === 'all') return 'All active series';
  if (scope.kind === 'subtree') return `${name(scope.seriesId)} and everything below it`;
  if (scope.seriesIds.length === 1) return name(scope.seriesIds[0]!);
  if (scope.seriesIds.length <= 3) return scope.seriesIds.map(name).join(', ');
  return `${scope.seriesIds.length} series: ${scope.seriesIds.slice(0, 2).map(name).join(', ')} and ${scope.seriesIds.length - 2} more`;
}

/** The run's outcome in a few words: still going, all done, or how many failed. */
export function outcomeText(run: RefitRunSummary): string {
  if (run.state === 'queued') return 'Queued';
  if (run.state === 'running') return 'Running';
  return run.counts.failed ? `Finished, ${run.counts.failed} failed` : 'Finished, all done';
}
