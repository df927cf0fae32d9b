/**
 * Converts option strings to the numbers and lists the engine takes, with messages that name the option.
 */
import { InputError } from './input-error';

/** An integer option ≥ min, or the fallback when absent (throws when absent and no fallback). */
export function integerOption(name: string, raw: string | undefined, min: number, fallback?: number): number {
  if (raw === undefined) {
    if (fallback === undefined) throw new InputError(`--${name} is required`);
    return fallback;
  }
  const value = Number(raw);
  if (!Number.isInteger(value) || value < min) throw new InputError(`--${name} must be an integer ≥ ${min}, got "${raw}"`);
  return value;
}

/** A finite number option ≥ min, or undefined when absent. */
export function numberOption(name: string, raw: string | undefined, min: number): number | undefined {
  if (raw === undefined) return undefined;
  const value = Number(raw);
  if (raw.trim() === '' || !Number.isFinite(value) || value < min)
    throw new InputError(`--${name} must be a number ≥ ${min}, got "${raw}"`);
  return value;
}

/** One of the allowed words, or the fallback when absent. */
export function choiceOption<T extends string>(name: string, raw: string | undefined, allowed: readonly T[], fallback?: T): T {
  if (raw === undefined) {
    if (fallback === undefined) throw new InputError(`--${name} is required (${allowed.join(', ')})`);
    return fallback;
  }
  if (!(allowed as readonly string[]).includes(raw)) throw new InputError(`--${name} must be one of ${allowed.join(', ')}, got "${raw}"`);
  return raw as T;
}

/** Coverage levels in percent from "80,95". */
export function levelsOption(raw: string | undefined): number[] {
  const text = raw ?? '80,95';
  const levels = text.split(',').map((part) => Number(part.trim()));
  if (levels.some((level) => !(level > 0 && level < 100)))
    throw new InputError(`--levels must be percentages between 0 and 100 separated by commas, got "${text}"`);
  return levels;
}

/** A lag set from "1-48,168": single lags and inclusive ranges, each ≥ 1. */
export function lagsOption(raw: string): number[] {
  const lags = new Set<number>();
  for (const part of raw.split(',')) {
    const match = /^\s*(\d+)\s*(?:-\s*(\d+)\s*)?$/.exec(part);
    const from = match ? Number(match[1]) : Number.NaN;
    const to = match?.[2] !== undefined ? Number(match[2]) : from;
    if (!match || from < 1 || to < from) throw new InputError(`--lags must list lags ≥ 1 and ranges like "1-48,168", got "${raw}"`);
    for (let lag = from; lag <= to; lag++) lags.add(lag);
  }
  return [...lags].sort((a, b) => a - b);
}
