/**
 * A deterministic fleet of hourly load series for the refit benchmark: one weather station (°F) and
 * N feeders whose load has a daily and weekly shape, a heating and cooling response to the station's
 * temperature and AR(1) noise, each with its own size and mix. The station also holds a week of
 * temperature forecast past the last actual, as the nightly refit expects.
 */

/** A seeded uniform(0, 1) generator (mulberry32, public-domain algorithm by Tommy Ettinger). */
function uniform(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal draws by Box-Muller. */
function normal(seed: number): () => number {
  const u = uniform(seed);
  return () => Math.sqrt(-2 * Math.log(1 - u())) * Math.cos(2 * Math.PI * u());
}

/** Station temperature (°F) for `hours` hours from `startMs`, `extra` hours of forecast included. */
export function stationTemperatures(startMs: number, hours: number): Float64Array {
  const noise = normal(7);
  const out = new Float64Array(hours);
  let ar = 0;
  for (let t = 0; t < hours; t++) {
    const date = new Date(startMs + t * 3_600_000);
    const dayOfYear = Math.floor((date.getTime() - Date.UTC(date.getUTCFullYear(), 0, 1)) / 86_400_000);
    const localHour = (date.getUTCHours() + 18) % 24;
    ar = 0.9 * ar + 1.2 * noise();
    out[t] = 55 - 22 * Math.cos((2 * Math.PI * (dayOfYear - 15)) / 365) + 9 * Math.sin((2 * Math.PI * (localHour - 9)) / 24) + ar;
  }
  return out;
}

/** Hourly load (kW) of feeder `index` over the station's first `hours` temperatures. */
export function feederLoad(index: number, startMs: number, hours: number, temperature: Float64Array): Float64Array {
  const u = uniform(1000 + index);
  const noise = normal(5000 + index);
  const size = 800 + 4000 * u();
  const commercial = u();
  const heating = 0.004 + 0.01 * u();
  const cooling = 0.006 + 0.02 * u();
  const out = new Float64Array(hours);
  let ar = 0;
  for (let t = 0; t < hours; t++) {
    const date = new Date(startMs + t * 3_600_000);
    const localHour = (date.getUTCHours() + 18) % 24;
    const weekday = (date.getUTCDay() + 6) % 7;
    const weekend = weekday >= 5;
    const residential = 1 + 0.25 * Math.sin((2 * Math.PI * (localHour - 13)) / 24) + 0.1 * Math.cos((2 * Math.PI * localHour) / 12);
    const business = localHour >= 8 && localHour < 18 && !weekend ? 1.4 : 0.7;
    const shape = (1 - commercial) * residential + commercial * business;
    const weather = 1 + heating * Math.max(0, 60 - temperature[t]) + cooling * Math.max(0, temperature[t] - 72);
    ar = 0.8 * ar + 0.02 * noise();
    out[t] = Math.round(size * shape * weather * (1 + ar) * 100) / 100;
  }
  return out;
}
