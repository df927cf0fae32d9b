import { describe, expect, it } from 'vitest';
import type { TrialResults, TrialScores, TrialSide } from '@loadwright/contracts';
import { comparisonRows, trialHeadline, verdictSummary } from './comparison-rows';

const scores = (overrides: Partial<TrialScores>): TrialScores => ({
  hours: 336,
  mae: 100,
  rmse: 130,
  mape: 4,
  mase: 0.8,
  coverage80: 80,
  coverage95: 95,
  peakDays: 14,
  peakError: 150,
  peakHourError: 1.5,
  naive: { mae: 125, mase: 1 },
  ...overrides,
});
const side = (dayAhead: TrialScores): TrialSide => ({
  dayAhead,
  weekAhead: dayAhead,
  fitted: {},
  temperature: { used: false, reason: 'none linked' },
});

describe('comparisonRows', () => {
  it('calls lower errors better and bands closer to nominal better, in words', () => {
    const results: TrialResults = {
      current: side(scores({ coverage80: 70, coverage95: 96 })),
      proposed: side(scores({ mae: 90, mape: 4.5, coverage80: 84, coverage95: 92 })),
    };
    const rows = Object.fromEntries(comparisonRows(results, 'dayAhead', 'kW').map((row) => [row.measure, row]));
    expect(rows['MAE']).toMatchObject({ current: '100.00 kW', proposed: '90.00 kW', verdict: 'better', verdictText: 'Proposed better' });
    expect(rows['MAPE']).toMatchObject({ current: '4.00 %', proposed: '4.50 %', verdict: 'worse' });
    // |84 − 80| = 4 beats |70 − 80| = 10; |92 − 95| = 3 loses to |96 − 95| = 1.
    expect(rows['80 % band coverage']!.verdict).toBe('better');
    expect(rows['95 % band coverage']!.verdict).toBe('worse');
    expect(rows['RMSE']).toMatchObject({ verdict: 'same', verdictText: 'Same' });
    // Better: MAE, 80 % band; worse: MAPE, 95 % band; the same: the other four.
    expect(verdictSummary(Object.values(rows))).toBe('proposed better on 2 of 8 measures, worse on 2');
  });

  it('leaves a measure without a value unjudged and heads with MAE when MAPE is undefined', () => {
    const results: TrialResults = { current: side(scores({ mape: null })), proposed: side(scores({ mape: null, mae: 80 })) };
    const mape = comparisonRows(results, 'weekAhead', 'MW').find((row) => row.measure === 'MAPE')!;
    expect(mape).toMatchObject({ current: '—', proposed: '—', verdict: 'none' });
    expect(trialHeadline(results, 'MW')).toBe('Day-ahead MAE 100.00 MW → 80.00 MW');
  });
});
