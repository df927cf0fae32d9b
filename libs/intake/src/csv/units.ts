/**
 * Converting an upload's unit to a series' stored unit. Demand converts by powers of 1000. Energy per
 * interval becomes mean demand over the interval: E kWh over m minutes is E · 60 / m kW (for example
 * 25 kWh in 15 minutes is a mean of 100 kW). Temperature converts between °C and °F. Results keep 12
 * significant digits (binary rounding noise removed; no meter records more).
 */
import type { UploadUnit } from '@loadwright/contracts';

const demandInWatts: Record<string, number> = { W: 1, kW: 1e3, MW: 1e6 };
const energyInWattHours: Record<string, number> = { Wh: 1, kWh: 1e3, MWh: 1e6 };

/**
 * A function from the file's value to the stored value, or a sentence saying why there is none.
 * `intervalMinutes` is the interval each file value covers (the file's own, for energy).
 */
export function unitConversion(from: UploadUnit, to: string, intervalMinutes: number): ((value: number) => number) | string {
  if (from === 'degC' || from === 'degF') {
    if (to !== 'degC' && to !== 'degF') return `${from} is a temperature unit but the series stores ${to}`;
    if (from === to) return (value) => value;
    return from === 'degC'
      ? (value) => Number((value * 1.8 + 32).toPrecision(12))
      : (value) => Number(((value - 32) / 1.8).toPrecision(12));
  }
  const target = demandInWatts[to];
  if (target === undefined) return `${from} is a load unit but the series stores temperatures in ${to}`;
  const energy = energyInWattHours[from];
  const sourceWatts = energy !== undefined ? (energy * 60) / intervalMinutes : demandInWatts[from]!;
  if (sourceWatts === target) return (value) => value;
  // Rounded to 12 significant digits, so that 1234 W reads 1.234 kW as written, not 1.2340000000000002.
  return (value) => Number(((value * sourceWatts) / target).toPrecision(12));
}
