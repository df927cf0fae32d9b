import type { TrialResults, TrialScores } from '@loadwright/contracts';
import { withUnit } from '../series-page/chart-theme';

/** Which way a measure is better. */
type Goal = { readonly kind: 'lower' } | { readonly kind: 'nominal'; readonly level: number };

/** One row of the side-by-side table: a measure for the current and the proposed settings, and which is better. */
export interface ComparisonRow {
  readonly measure: string;
  /** What the measure means, in a few words. */
  readonly meaning: string;
  readonly current: string;
  readonly proposed: string;
  readonly verdict: 'better' | 'worse' | 'same' | 'none';
  /** The verdict in words (never colour alone). */
  readonly verdictText: string;
}

/** A measure of the table: how to read it from the scores and how to show it. */
interface Measure {
  readonly measure: string;
  readonly meaning: string;
  readonly value: (s: TrialScores) => number | null;
  readonly text: (value: number | null, unit: string) => string;
  readonly goal: Goal;
}

/** A number with `digits` decimals and a suffix, or a dash. */
const plain =
  (digits: number, suffix = '') =>
  (value: number | null) =>
    value === null ? '—' : `${value.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits })}${suffix}`;

/** The measures in the order a planner reads them: errors, skill against naive, bands, then peaks. */
const measures: readonly Measure[] = [
  { measure: 'MAE', meaning: 'mean absolute error', value: (s) => s.mae, text: (v, unit) => withUnit(v, unit, 2), goal: { kind: 'lower' } },
  { measure: 'MAPE', meaning: 'mean absolute percentage error', value: (s) => s.mape, text: plain(2, ' %'), goal: { kind: 'lower' } },
  {
    measure: 'RMSE',
    meaning: 'root mean squared error',
    value: (s) => s.rmse,
    text: (v, unit) => withUnit(v, unit, 2),
    goal: { kind: 'lower' },
  },
  {
    measure: 'MASE',
    meaning: 'MAE over the seasonal-naive MAE (same hour last week); below 1 beats it',
    value: (s) => s.mase,
    text: plain(3),
    goal: { kind: 'lower' },
  },
  {
    measure: '80 % band coverage',
    meaning: 'share of hours inside the 80 % band; closest to 80 % is best',
    value: (s) => s.coverage80,
    text: plain(1, ' %'),
    goal: { kind: 'nominal', level: 80 },
  },
  {
    measure: '95 % band coverage',
    meaning: 'share of hours inside the 95 % band; closest to 95 % is best',
    value: (s) => s.coverage95,
    text: plain(1, ' %'),
    goal: { kind: 'nominal', level: 95 },
  },
  {
    measure: 'Daily peak error',
    meaning: 'mean absolute error of each day’s peak',
    value: (s) => s.peakError,
    text: (v, unit) => withUnit(v, unit, 2),
    goal: { kind: 'lower' },
  },
  {
    measure: 'Peak hour error',
    meaning: 'mean hours between the forecast and the actual peak hour',
    value: (s) => s.peakHourError,
    text: plain(2, ' h'),
    goal: { kind: 'lower' },
  },
];

/** The rows comparing both sides at one horizon. */
export function comparisonRows(results: TrialResults, horizon: 'dayAhead' | 'weekAhead', unit: string): ComparisonRow[] {
  return measures.map((m) => {
    const current = m.value(results.current[horizon]);
    const proposed = m.value(results.proposed[horizon]);
    const currentText = m.text(current, unit);
    const proposedText = m.text(proposed, unit);
    const verdict = judge(current, proposed, currentText === proposedText, m.goal);
    return {
      measure: m.measure,
      meaning: m.meaning,
      current: currentText,
      proposed: proposedText,
      verdict,
      verdictText: { better: 'Proposed better', worse: 'Proposed worse', same: 'Same', none: '—' }[verdict],
    };
  });
}

/** Better, worse or the same for the proposal (the same when both show the same figure). */
function judge(current: number | null, proposed: number | null, sameText: boolean, goal: Goal): ComparisonRow['verdict'] {
  if (current === null || proposed === null) return 'none';
  if (sameText) return 'same';
  const distance = (v: number) => (goal.kind === 'lower' ? v : Math.abs(v - goal.level));
  const [c, p] = [distance(current), distance(proposed)];
  return p < c ? 'better' : p > c ? 'worse' : 'same';
}

/** The headline of a finished trial: day-ahead MAPE (or MAE) of both sides, e.g. "Day-ahead MAPE 3.10 % → 2.71 %". */
export function trialHeadline(results: TrialResults, unit: string): string {
  const [row] = comparisonRows(results, 'dayAhead', unit).filter(
    (r) => r.measure === (results.current.dayAhead.mape === null ? 'MAE' : 'MAPE'),
  );
  return `Day-ahead ${row!.measure} ${row!.current} → ${row!.proposed}`;
}

/** How the proposal fared over a table's measures, e.g. "proposed better on 5 of 8 measures, worse on 2". */
export function verdictSummary(rows: readonly ComparisonRow[]): string {
  const judged = rows.filter((row) => row.verdict !== 'none');
  const count = (verdict: ComparisonRow['verdict']) => judged.filter((row) => row.verdict === verdict).length;
  const [better, worse] = [count('better'), count('worse')];
  return `proposed better on ${better} of ${judged.length} measures, worse on ${worse}`;
}
