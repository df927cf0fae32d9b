/**
 * Converts readings between the units a series may be stored in: load between W, kW and MW, and
 * temperature between degrees Celsius and Fahrenheit. Never across kinds.
 */
import { unitsByKind, type SeriesUnit } from '@loadwright/contracts';

/** Watts per unit of each load unit. */
const wattsPer: Partial<Record<SeriesUnit, number>> = { W: 1, kW: 1e3, MW: 1e6 };

/** True when values in `from` can be converted to `to` (same kind). */
export function canConvert(from: SeriesUnit, to: SeriesUnit): boolean {
  return (
    (unitsByKind.load.includes(from) && unitsByKind.load.includes(to)) ||
    (unitsByKind.temperature.includes(from) && unitsByKind.temperature.includes(to))
  );
}

/**
 * A function converting one value from `from` to `to`.
 * @throws Error when the units measure different things (load and temperature).
 */
export function unitConverter(from: SeriesUnit, to: SeriesUnit): (value: number) => number {
  if (!canConvert(from, to)) throw new Error(`unitConverter: cannot convert ${from} to ${to}; they measure different things`);
  if (from === to) return (value) => value;
  if (from === 'degC') return (value) => (value * 9) / 5 + 32;
  if (from === 'degF') return (value) => ((value - 32) * 5) / 9;
  const factor = wattsPer[from]! / wattsPer[to]!;
  return (value) => value * factor;
}
