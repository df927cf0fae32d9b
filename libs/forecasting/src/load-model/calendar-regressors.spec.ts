import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { forecastArma } from '../forecast/forecast-arma';
import { holidayDates } from '../seasonal/holiday-calendar';
import { localCalendar } from '../seasonal/local-calendar';
import { fitLoadModel } from './fit-load-model';
import { forecastLoadModel } from './forecast-load-model';
import type { LoadModelSpec } from './load-model-spec';
import { regressorColumns } from './regressor-columns';
import { hourlyTimestamps, seededNormal } from './synthetic-load.testing';

// Synthetic load in America/Chicago over 2023–2024 with a multiplicative hour-of-day profile and day-type
// effects: Saturday −30, Sunday or US public holiday −50 (MW), plus an extra plant-shutdown date
// 2023-08-14 that also counts as a holiday, plus AR(1) noise (φ = 0.8, σ = 3). Seeded.
const zone = 'America/Chicago';
const n = 2 * 364 * 24;
const timestamps = hourlyTimestamps('2023-01-02T06:00:00Z', n + 72);
const calendar = localCalendar(timestamps, zone);
const holidays = holidayDates({ country: 'US', extraDates: ['2023-08-14'] }, [2023, 2024, 2025]);
const dailyShape = (hour: number) => 1 + 0.3 * Math.sin((2 * Math.PI * (hour - 9)) / 24);
const normal = seededNormal(17);
let u = 0;
const values = Float64Array.from(timestamps, (_, t) => {
  u = 0.8 * u + 3 * normal();
  const day = calendar.dayOfWeek[t];
  const offDay = day === 6 || holidays.has(calendar.localDate[t]);
  return dailyShape(calendar.hourOfDay[t]) * 600 + (offDay ? -50 : day === 5 ? -30 : 0) + u;
});

const spec: LoadModelSpec = {
  method: 'yule-walker',
  p: 1,
  q: 0,
  seasonal: { kind: 'profile', period: 24, form: 'additive' },
  log: false,
  temperature: null,
  dayTypes: true,
  holidays: { country: 'US', extraDates: ['2023-08-14'] },
  timeZone: zone,
};

describe('day-type and holiday regressors in the load model', () => {
  it('recovers the Saturday and Sunday-or-holiday effects within 4 standard errors', () => {
    const model = fitLoadModel(spec, { timestamps: timestamps.subarray(0, n), values: values.subarray(0, n) });
    expect(model.regression.names).toEqual(['saturday', 'sunday-holiday']);
    const [saturday, sundayHoliday] = model.regression.coefficients;
    const [seSat, seSun] = model.regression.stderr as number[];
    expect(Math.abs(saturday + 30)).toBeLessThan(4 * seSat);
    expect(Math.abs(sundayHoliday + 50)).toBeLessThan(4 * seSun);
    expect(Math.abs(model.arma!.ar[0] - 0.8)).toBeLessThan(0.02); // se ≈ √((1 − φ²)/n) ≈ 0.005
  });

  it('marks future holidays: New Year 2025 (a Wednesday) is forecast like a Sunday', () => {
    const model = fitLoadModel(spec, { timestamps: timestamps.subarray(0, n), values: values.subarray(0, n) });
    // Training ends Sunday 29 December 2024, 23:00 CST; hours 49..72 are Wednesday 1 January 2025.
    const f = forecastLoadModel(model, {}, 72, [95]);
    const futureCalendar = localCalendar(f.timestamps, zone);
    expect(futureCalendar.localDate[48]).toBe('2025-01-01');
    const tuesdayNoon = f.mean[24 + 12];
    const newYearNoon = f.mean[48 + 12];
    // Same hour of day, AR part nearly settled (0.8^24 ≈ 0.005): the gap is the Sunday-or-holiday effect.
    expect(tuesdayNoon - newYearNoon).toBeCloseTo(-model.regression.coefficients[1], 0);
  });

  it('uses a lone holiday column without day types, and refuses day types with an hour-of-week profile', () => {
    const cal = localCalendar(timestamps.subarray(0, 24 * 7), zone);
    const onlyHolidays = regressorColumns({ ...spec, dayTypes: false }, cal, undefined);
    expect(onlyHolidays.names).toEqual(['holiday']);
    // 2 January 2023 was the observed New Year holiday (1 January fell on a Sunday).
    expect(onlyHolidays.columns[0][12]).toBe(1);
    expect(() => regressorColumns({ ...spec, seasonal: { kind: 'profile', period: 168, form: 'additive' } }, cal, undefined)).toThrow(
      ForecastingError,
    );
  });

  it('fits a multiplicative profile and scales forecasts and standard errors by it', () => {
    const multiplicative: LoadModelSpec = { ...spec, seasonal: { kind: 'profile', period: 24, form: 'multiplicative' } };
    const model = fitLoadModel(multiplicative, { timestamps: timestamps.subarray(0, n), values: values.subarray(0, n) });
    const profile = model.profile!;
    expect(profile.form).toBe('multiplicative');
    // Slot means over the data are 600·shape(h) − a constant day-type average; the ratio to the level
    // tracks shape(h) to within that shift (≈ 12/600 ≈ 2 %).
    for (let h = 0; h < 24; h++) expect(Math.abs(profile.effect[h] / dailyShape(h) - 1)).toBeLessThan(0.03);
    const f = forecastLoadModel(model, {}, 24, [95]);
    const cal = localCalendar(f.timestamps, zone);
    const part = forecastArma(model.arma!, model.remainder, 24, model.arma!.residuals);
    for (const h of [0, 12, 23]) expect(f.se[h]).toBeCloseTo(part.se[h] * profile.effect[cal.hourOfDay[h]], 10);
  });
});
