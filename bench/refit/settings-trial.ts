/**
 * What a settings trial costs and what it reports, on real hourly system demand: PJM East (PJME) metered
 * load, 2002 (fixtures/reference/data/pjm-east-2002.json names the source), the last 280 + 20 days. One
 * trial side (14 refits with the refit's default settings, `auto` on a 280-day window, no temperature in
 * this data, US holidays, then both horizons scored) is timed beside its reference measured in the same
 * run: 14 single refits of the same window, i.e. what 14 nightly refits cost. The ratio says what the
 * trial adds to its refits (slicing, storing forecasts, the two backtests). Beside it, the trial's scores
 * against seasonal naive. Slow (about a minute): runs only as `npm run bench -- settings-trial`.
 */
import { defaultModelSettings, fitSeriesModel, inputsAtOrigin, trialOrigins } from '@loadwright/refits';
import { cpuMilliseconds } from '../../libs/refits/src/auto-select';
import { realHourlyLoad, REAL_LOAD_NAME } from '../../libs/refits/src/evaluation/real-load.testing';
import { forecastFromOrigins, scoreSide } from '../../libs/refits/src/trials/trial-backtest';
import type { TrialHistory } from '../../libs/refits/src/trials/trial-history';
import { summarise, type Benchmark } from '../support/harness';

const windowDays = 280;
const settings = {
  ...defaultModelSettings,
  trainingWindowDays: windowDays,
  temperature: { enabled: false, heatingBase: null, coolingBase: null },
};
const naive = { ...settings, method: 'seasonal-naive' as const, seasonal: { kind: 'none' as const } };
const holidays = { country: 'US', extraDates: [] };
/** Timed rounds of each side; the median is reported. */
const ROUNDS = 3;

export const bench: Benchmark = {
  name: 'settings-trial',
  description: `one settings-trial side (14 refits and scoring) beside 14 single refits, on ${REAL_LOAD_NAME}`,
  onlyWhenNamed: true,
  async run() {
    const { data, source } = realHourlyLoad();
    const hours = windowDays * 24 + 13 * 24 + 168;
    const start = data.values.length - hours;
    const history: TrialHistory = {
      series: { id: 1, key: 'pjme', name: REAL_LOAD_NAME, unit: 'MW', intervalMinutes: 60, timeZone: 'UTC', temperatureSeriesId: null },
      timestamps: data.timestamps.slice(start),
      values: data.values.slice(start),
      bridgedHours: 0,
      temperature: { usable: false, reason: 'the fixture has no temperatures' },
    };
    const origins = trialOrigins(hours);
    const trialMs: number[] = [];
    const refitsMs: number[] = [];
    const trialWallMs: number[] = [];
    const refitsWallMs: number[] = [];
    let side = null as ReturnType<typeof scoreSide> | null;
    // Alternate the two so that both meet the same load on the shared machine.
    for (let round = 0; round < ROUNDS; round++) {
      let [cpu, wall] = [cpuMilliseconds(), performance.now()];
      for (const origin of origins) fitSeriesModel(inputsAtOrigin(history, settings, origin), holidays);
      refitsMs.push(cpuMilliseconds() - cpu);
      refitsWallMs.push(performance.now() - wall);
      [cpu, wall] = [cpuMilliseconds(), performance.now()];
      side = scoreSide(history, await forecastFromOrigins(history, settings, holidays, async () => {}));
      trialMs.push(cpuMilliseconds() - cpu);
      trialWallMs.push(performance.now() - wall);
    }
    const benchmark = scoreSide(history, await forecastFromOrigins(history, naive, null, async () => {}));
    const trial = summarise(trialMs);
    const refits = summarise(refitsMs);
    const ratio = trial.medianMs / refits.medianMs;
    const seconds = (ms: number) => Number((ms / 1000).toFixed(2));
    const rows = [
      {
        measured: '14 single refits (reference)',
        'CPU s (median)': seconds(refits.medianMs),
        'wall s (median)': seconds(summarise(refitsWallMs).medianMs),
        rounds: ROUNDS,
      },
      {
        measured: 'one trial side',
        'CPU s (median)': seconds(trial.medianMs),
        'wall s (median)': seconds(summarise(trialWallMs).medianMs),
        rounds: ROUNDS,
      },
      { measured: 'ratio side / refits (CPU)', 'CPU s (median)': Number(ratio.toFixed(3)), 'wall s (median)': null, rounds: ROUNDS },
    ];
    const s = side!;
    return {
      rows,
      notes: [
        `Data: ${source}; the last ${hours} hours, origins a day apart from hour ${origins[0]} to ${origins.at(-1)}.`,
        `A whole trial is two sides: about ${((2 * trial.medianMs) / 1000).toFixed(1)} CPU seconds for the default settings on a ${windowDays}-day window.`,
        `auto day-ahead: MAPE ${s.dayAhead.mape?.toFixed(2)} %, MASE ${s.dayAhead.mase?.toFixed(3)}, 80/95 % coverage ${s.dayAhead.coverage80.toFixed(1)}/${s.dayAhead.coverage95.toFixed(1)} %, peak error ${s.dayAhead.peakError?.toFixed(0)} MW; ` +
          `seasonal naive MAPE ${benchmark.dayAhead.mape?.toFixed(2)} %, MASE ${benchmark.dayAhead.mase?.toFixed(3)}.`,
        `auto week-ahead: MAPE ${s.weekAhead.mape?.toFixed(2)} %, MASE ${s.weekAhead.mase?.toFixed(3)}; seasonal naive MAPE ${benchmark.weekAhead.mape?.toFixed(2)} %.`,
      ],
      checks: [
        {
          name: 'a trial side costs at most 10 % more than its 14 refits',
          passed: ratio <= 1.1,
          detail: `ratio of CPU-time medians ${ratio.toFixed(3)}`,
        },
        {
          name: 'the trial scores auto ahead of seasonal naive a day ahead (MASE)',
          passed: s.dayAhead.mase! < benchmark.dayAhead.mase!,
          detail: `${s.dayAhead.mase?.toFixed(3)} against ${benchmark.dayAhead.mase?.toFixed(3)}`,
        },
      ],
      data: { trialCpuMs: trialMs, refitsCpuMs: refitsMs, trialWallMs, refitsWallMs, side: s, benchmark },
    };
  },
};
