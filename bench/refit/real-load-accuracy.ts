/**
 * Accuracy and band coverage of the refit on real hourly system demand: PJM East (PJME) metered load,
 * 2002 (fixtures/reference/data/pjm-east-2002.json names the source). 42 daily origins (the last six
 * weeks of 2002), each refitted on the 280 days before it with the refit's default settings (no
 * temperature in this data; US holidays), forecasting the next 24 hours. Side by side: seasonal naive,
 * each `auto` candidate alone (estimated and banded exactly as `auto` would if it chose it), and `auto`.
 * Slow (a few minutes): runs only as `npm run bench -- real-load-accuracy`.
 */
import { candidateKeys, defaultModelSettings } from '@loadwright/refits';
import { realHourlyLoad, REAL_LOAD_NAME } from '../../libs/refits/src/evaluation/real-load.testing';
import { rollingOriginEvaluation, type RollingOriginScores } from '../../libs/refits/src/evaluation/rolling-origin';
import type { Benchmark } from '../support/harness';

const settings = {
  ...defaultModelSettings,
  trainingWindowDays: 280,
  temperature: { enabled: false, heatingBase: null, coolingBase: null },
};
const options = { origins: 42, horizon: 24, holidays: { country: 'US', extraDates: [] }, timeZone: 'UTC' };

export const bench: Benchmark = {
  name: 'real-load-accuracy',
  description: `day-ahead MAPE, peak error and 80/95 % coverage over 42 daily origins on ${REAL_LOAD_NAME}`,
  onlyWhenNamed: true,
  run() {
    const { data, source } = realHourlyLoad();
    const runs: Array<[string, RollingOriginScores]> = [];
    runs.push([
      'seasonal naive',
      rollingOriginEvaluation(data, { ...settings, method: 'seasonal-naive', seasonal: { kind: 'none' } }, options),
    ]);
    for (const key of candidateKeys)
      runs.push([key, rollingOriginEvaluation(data, settings, { ...options, autoOptions: { only: [key] } })]);
    const auto = rollingOriginEvaluation(data, settings, options);
    runs.push(['auto', auto]);
    const rows = runs.map(([name, s]) => ({
      model: name,
      'MAPE %': Number(s.mape.toFixed(2)),
      'peak MAE MW': Math.round(s.peakMae),
      'cover 80 %': Number(s.coverage80.toFixed(1)),
      'cover 95 %': Number(s.coverage95.toFixed(1)),
      bands: Object.keys(s.bands).join('+'),
      'fit CPU ms': Math.round(s.fitCpuMs.reduce((a, b) => a + b, 0) / s.fitCpuMs.length),
    }));
    const naive = runs[0][1];
    const best = Math.min(...runs.slice(1, -1).map(([, s]) => s.mape));
    const counts: Record<string, number> = {};
    for (const c of auto.chosen) counts[c] = (counts[c] ?? 0) + 1;
    return {
      rows,
      notes: [
        `Data: ${source}.`,
        'Each origin refits on the 280 days before it (the fixture holds one year; the refit default is 365 days) with no temperature; MAPE, peak error and coverage over the 24 hours after each origin.',
        `auto chose: ${Object.entries(counts)
          .map(([k, v]) => `${k} ×${v}`)
          .join('; ')}.`,
        'fit CPU: process CPU of the fit phase per origin (the band calibration runs in the forecast phase and is not included).',
      ],
      checks: [
        {
          name: "auto's MAPE no worse than the best single candidate",
          passed: auto.mape <= best + 1e-9,
          detail: `${auto.mape.toFixed(3)} % vs ${best.toFixed(3)} %`,
        },
        {
          name: "auto's MAPE at most 0.6 × seasonal naive's",
          passed: auto.mape <= 0.6 * naive.mape,
          detail: `${auto.mape.toFixed(3)} % vs ${(0.6 * naive.mape).toFixed(3)} %`,
        },
        {
          name: '80 % band covers 77–83 % of hours',
          passed: Math.abs(auto.coverage80 - 80) <= 3,
          detail: `${auto.coverage80.toFixed(1)} %`,
        },
        {
          name: '95 % band covers 92–98 % of hours',
          passed: Math.abs(auto.coverage95 - 95) <= 3,
          detail: `${auto.coverage95.toFixed(1)} %`,
        },
      ],
      data: { runs: Object.fromEntries(runs) },
    };
  },
};
