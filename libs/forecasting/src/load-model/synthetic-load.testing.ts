/**
 * Test-only: seeded synthetic hourly load with known parts (hour-of-week profile, degree-hour response,
 * AR(2) noise) for the load-model specs. Not exported from the library.
 */
import { mulberry32 } from '../core/random';
import { localCalendar } from '../seasonal/local-calendar';

/** Standard normal draws by Box-Muller from a seeded uniform. */
export function seededNormal(seed: number): () => number {
  const uniform = mulberry32(seed);
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

/** The true hour-of-week profile (Monday 00:00 = slot 0): a daily swing and lower weekends. */
export function trueProfile(slot: number): number {
  const hour = slot % 24;
  const day = Math.floor(slot / 24);
  return 40 * Math.sin((2 * Math.PI * (hour - 9)) / 24) + 8 * Math.cos((2 * Math.PI * hour) / 12) - (day === 5 ? 25 : day === 6 ? 35 : 0);
}

/** Known parameters of the synthetic load. */
export const TRUTH = { level: 500, heating: 1.2, cooling: 2.5, heatingBase: 15.5, coolingBase: 22, ar: [0.5, 0.3], sigma: 2 };

/** Hourly UTC timestamps from an ISO instant. */
export function hourlyTimestamps(startIso: string, count: number): Float64Array {
  const start = Date.parse(startIso);
  return Float64Array.from({ length: count }, (_, i) => start + i * 3_600_000);
}

/** Temperature with an annual and a daily cycle plus AR(1) weather noise (°C), local-time phased. */
export function syntheticTemperature(timestamps: Float64Array, timeZone: string, seed: number): Float64Array {
  const normal = seededNormal(seed);
  const calendar = localCalendar(timestamps, timeZone);
  let weather = 0;
  return Float64Array.from(timestamps, (ms, i) => {
    weather = 0.95 * weather + 0.6 * normal();
    const dayOfYear = (ms - Date.UTC(2023, 0, 1)) / 86_400_000;
    return (
      13 +
      11 * Math.sin((2 * Math.PI * (dayOfYear - 110)) / 365.25) +
      5 * Math.sin((2 * Math.PI * (calendar.hourOfDay[i] - 9)) / 24) +
      weather
    );
  });
}

/** Load = level + profile(local hour of week) + degree-hour response + AR(2) noise; also returns the noise. */
export function syntheticLoad(
  timestamps: Float64Array,
  temperature: Float64Array,
  timeZone: string,
  seed: number,
): { values: Float64Array; noise: Float64Array } {
  const normal = seededNormal(seed);
  const calendar = localCalendar(timestamps, timeZone);
  const noise = new Float64Array(timestamps.length);
  let u1 = 0;
  let u2 = 0;
  for (let burn = 0; burn < 500; burn++) [u1, u2] = [TRUTH.ar[0] * u1 + TRUTH.ar[1] * u2 + TRUTH.sigma * normal(), u1];
  const values = Float64Array.from(timestamps, (_, t) => {
    const u = TRUTH.ar[0] * u1 + TRUTH.ar[1] * u2 + TRUTH.sigma * normal();
    [u1, u2] = [u, u1];
    noise[t] = u;
    return TRUTH.level + trueProfile(calendar.hourOfWeek[t]) + weatherResponse(temperature[t]) + u;
  });
  return { values, noise };
}

/** The true degree-hour response at temperature T. */
export function weatherResponse(temperature: number): number {
  return TRUTH.heating * Math.max(0, TRUTH.heatingBase - temperature) + TRUTH.cooling * Math.max(0, temperature - TRUTH.coolingBase);
}
