/**
 * Negative and impossible values. Load cannot be negative here (net metering with export would be
 * its own series kind). The impossible bound for temperature is the range of air temperatures ever
 * recorded with margin, −60…60 °C (−76…140 °F); for load it is ten times the series' robust maximum
 * (the 99th percentile of the readings), which a scaling fault such as W recorded as kW exceeds at
 * once while no real peak comes near it.
 */

/** What a series measures, for its bounds. */
export interface BoundsSubject {
  kind: 'load' | 'temperature';
  /** Unit of stored values: W, kW, MW, degC or degF. */
  unit: string;
}

/** Fewest readings from which a robust maximum is trusted. */
export const robustMaxMinReadings = 24;

/** Multiple of the robust maximum beyond which a load reading is impossible. */
export const impossibleLoadFactor = 10;

/** The closed range of possible values, or null when the batch is too short to bound load. */
export function possibleRange(subject: BoundsSubject, values: Float64Array, length: number): { low: number; high: number } | null {
  if (subject.kind === 'temperature') return subject.unit === 'degF' ? { low: -76, high: 140 } : { low: -60, high: 60 };
  if (length < robustMaxMinReadings) return null;
  const magnitudes = new Float64Array(length);
  for (let i = 0; i < length; i++) magnitudes[i] = Math.abs(values[i]!);
  magnitudes.sort();
  const robustMax = magnitudes[Math.floor(0.99 * (length - 1))]!;
  if (robustMax === 0) return null;
  return { low: -Infinity, high: impossibleLoadFactor * robustMax };
}

/** True when a value of this series kind is negative where it cannot be. */
export function isNegativeLoad(subject: BoundsSubject, value: number): boolean {
  return subject.kind === 'load' && value < 0;
}

/**
 * Load beyond which a reading is no electric load at all, in watts: 10 TW, above the generating
 * capacity installed on the whole planet (about 9 TW in 2023, IRENA Renewable Capacity Statistics
 * 2024 with non-renewable capacity). Such a value (1e300 kW, a unit or exponent gone wrong) is refused
 * with its row and never stored, where a merely impossible one is stored flagged beside an estimate.
 */
export const absurdLoadWatts = 1e13;

const wattsPer: Record<string, number> = { W: 1, kW: 1e3, MW: 1e6 };

/**
 * The closed range outside which a value in the series' stored unit is absurd: beyond any electric
 * load (|value| over 10 TW), or a temperature below absolute zero (−273.15 °C, −459.67 °F) or above
 * 1,000 °C (1,832 °F), which no weather station reads.
 */
export function absurdRange(subject: BoundsSubject): { low: number; high: number } {
  if (subject.kind === 'temperature') return subject.unit === 'degF' ? { low: -459.67, high: 1832 } : { low: -273.15, high: 1000 };
  const limit = absurdLoadWatts / (wattsPer[subject.unit] ?? 1e3);
  return { low: -limit, high: limit };
}
