import { describe, expect, it } from 'vitest';
import { forecastArma } from '../forecast/forecast-arma';
import { localCalendar } from '../seasonal/local-calendar';
import { fitLoadModel } from './fit-load-model';
import { forecastLoadModel } from './forecast-load-model';
import type { LoadModelSpec } from './load-model-spec';
import {
  TRUTH,
  hourlyTimestamps,
  seededNormal,
  syntheticLoad,
  syntheticTemperature,
  trueProfile,
  weatherResponse,
} from './synthetic-load.testing';

// Synthetic truth (synthetic-load.testing.ts): load = 500 + hour-of-week profile + 1.2·HDH(15.5 °C)
// + 2.5·CDH(22 °C) + AR(2) noise (φ = 0.5, 0.3; σ = 2), hourly in America/Chicago from Monday
// 2 January 2023 00:00 CST for 104 weeks, plus 48 hours held out for the forecast checks.
const zone = 'America/Chicago';
const n = 104 * 168;
const horizon = 48;
const allTimestamps = hourlyTimestamps('2023-01-02T06:00:00Z', n + horizon);
const allTemperature = syntheticTemperature(allTimestamps, zone, 11);
const { values: allValues, noise } = syntheticLoad(allTimestamps, allTemperature, zone, 29);
const data = { timestamps: allTimestamps.subarray(0, n), values: allValues.subarray(0, n), temperature: allTemperature.subarray(0, n) };
const futureTemperature = allTemperature.subarray(n);

const spec: LoadModelSpec = {
  method: 'cmle',
  p: 2,
  q: 0,
  seasonal: { kind: 'profile', period: 168, form: 'additive' },
  log: false,
  temperature: { heatingBase: TRUTH.heatingBase, coolingBase: TRUTH.coolingBase },
  dayTypes: false,
  holidays: null,
  timeZone: zone,
};
const model = fitLoadModel(spec, data);

describe('fitLoadModel recovers the known parts of a synthetic hourly load', () => {
  it('recovers the temperature coefficients within 4 GLS standard errors', () => {
    const [heating, cooling] = model.regression.coefficients;
    const [seH, seC] = model.regression.stderr as number[];
    // 4 standard errors: a false alarm has probability ~6e-5 per coefficient under normality.
    expect(Math.abs(heating - TRUTH.heating)).toBeLessThan(4 * seH);
    expect(Math.abs(cooling - TRUTH.cooling)).toBeLessThan(4 * seC);
    expect(seH).toBeLessThan(0.05);
    expect(model.regression.converged).toBe(true);
    expect(model.regression.names).toEqual(['heating-degree-hours', 'cooling-degree-hours']);
  });

  it('recovers the AR(2) parameters and innovation variance', () => {
    const arma = model.arma!;
    const se = arma.stderr.ar!;
    expect(Math.abs(arma.ar[0] - TRUTH.ar[0])).toBeLessThan(4 * se[0]);
    expect(Math.abs(arma.ar[1] - TRUTH.ar[1])).toBeLessThan(4 * se[1]);
    // σ̂²/σ² ≈ 1 ± √(2/n) ≈ 1 ± 0.011; 4 of those is 0.045.
    expect(Math.abs(arma.sigma2 / TRUTH.sigma ** 2 - 1)).toBeLessThan(0.045);
  });

  it('recovers the hour-of-week profile within the sampling error of the slot means', () => {
    const profile = model.profile!;
    const calendar = localCalendar(data.timestamps, zone);
    // The estimate is centred with the slot counts; centre the truth the same way before comparing.
    let centre = 0;
    for (let t = 0; t < n; t++) centre += trueProfile(calendar.hourOfWeek[t]);
    centre /= n;
    let sd = 0;
    for (let t = 0; t < n; t++) sd += noise[t] ** 2;
    sd = Math.sqrt(sd / n);
    // Slot means average ~104 observations a week apart (AR(2) correlation at lag 168 is nil): the error
    // per slot is about sd/√count; the largest of 168 such normals stays below 4.5 of them (P ≈ 1e-3).
    for (let k = 0; k < 168; k++) {
      expect(Math.abs(profile.effect[k] - (trueProfile(k) - centre)), `slot ${k}`).toBeLessThan((4.5 * sd) / Math.sqrt(profile.count[k]));
    }
    expect(Math.abs(model.arma!.mean - (TRUTH.level + centre))).toBeLessThan(1);
  });

  it('forecasts the ARMA part exactly as forecastArma and adds profile and weather response', () => {
    const f = forecastLoadModel(model, { temperature: futureTemperature }, horizon, [95]);
    const part = forecastArma(model.arma!, model.remainder, horizon, model.arma!.residuals);
    const calendar = localCalendar(f.timestamps, zone);
    const [bh, bc] = model.regression.coefficients;
    for (let h = 0; h < horizon; h++) {
      const t = futureTemperature[h];
      const regression = bh * Math.max(0, TRUTH.heatingBase - t) + bc * Math.max(0, t - TRUTH.coolingBase);
      expect(f.mean[h] - regression - model.profile!.effect[calendar.hourOfWeek[h]]).toBeCloseTo(part.mean[h], 9);
      expect(f.se[h]).toBe(part.se[h]);
    }
    expect(f.timestamps[0]).toBe(data.timestamps[n - 1] + 3_600_000);
  });

  it('gives 95 % intervals that cover about 95 % of simulated future paths', () => {
    // 2000 paths of the true process continued from the true end-of-sample noise: binomial sd of a
    // coverage of 0.95 is √(0.95·0.05/2000) ≈ 0.0049, so ±0.02 is about 4 sd.
    const f = forecastLoadModel(model, { temperature: futureTemperature }, horizon, [95]);
    const { lower, upper } = f.intervals[0];
    const calendar = localCalendar(allTimestamps.subarray(n), zone);
    const normal = seededNormal(7);
    const paths = 2000;
    const covered = new Float64Array(horizon);
    for (let path = 0; path < paths; path++) {
      let u1 = noise[n - 1];
      let u2 = noise[n - 2];
      for (let h = 0; h < horizon; h++) {
        const u = TRUTH.ar[0] * u1 + TRUTH.ar[1] * u2 + TRUTH.sigma * normal();
        [u1, u2] = [u, u1];
        const y = TRUTH.level + trueProfile(calendar.hourOfWeek[h]) + weatherResponse(futureTemperature[h]) + u;
        if (y >= lower[h] && y <= upper[h]) covered[h]++;
      }
    }
    for (const h of [0, 5, 23, 47]) expect(Math.abs(covered[h] / paths - 0.95), `h = ${h + 1}`).toBeLessThan(0.02);
  });
});
