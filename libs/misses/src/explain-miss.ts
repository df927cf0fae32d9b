/**
 * Why a forecast missed: the error split into the part the temperature forecast's own error explains
 * and the rest (model error), plus flags a planner should know before blaming the model.
 *
 * ## Method
 * The forecast is a regression on heating and cooling degree-hours with ARMA errors. The ARMA part of
 * an h-step forecast depends only on the past, so re-forecasting the missed hours with the observed
 * temperatures changes the regression part alone:
 *   f'_t = f_t + β_h (HDH(T°_t) − HDH(T^f_t)) + β_c (CDH(T°_t) − CDH(T^f_t))
 * with HDH(T) = max(0, heatingBase − T) and CDH(T) = max(0, T − coolingBase) in the station's unit,
 * T^f the temperature the forecast used and T° the observed one. On a log-load model the same
 * difference multiplies: f'_t = f_t · exp(…). The temperature part of the error at t is f'_t − f_t, the
 * model part a_t − f'_t; they add up to the error a_t − f_t. Parts are averaged over the hours that have
 * both temperatures.
 */
import type { EvidenceHour } from './hour-point';
import type { LoadUnit } from './rule-kinds';

/** The fitted temperature response of the version's model. */
export interface TemperatureResponse {
  heatingCoefficient: number;
  coolingCoefficient: number;
  heatingBase: number;
  coolingBase: number;
  /** The model is fitted to log load. */
  log: boolean;
  /** The station's unit, °F or °C. */
  unit: 'degF' | 'degC';
}

/** The two temperatures of one missed hour (null when not known). */
export interface HourTemperatures {
  ts: string;
  /** What the forecast used. */
  forecast: number | null;
  /** What was observed afterwards. */
  observed: number | null;
}

/** Other facts about the missed hours. */
export interface MissContext {
  /** Days in the miss that are public holidays but missing from the organisation's calendar (YYYY-MM-DD and name). */
  holidaysMissing: { day: string; name: string }[];
  /** Local hours (HH:00) at which the band missed too often in the recent past, with the rate seen. */
  bandTooNarrowAt: { hour: string; misses: number; days: number; level: number }[];
}

/** The temperature split, when it can be made. */
export interface TemperatureSplit {
  hours: number;
  meanError: number;
  temperaturePart: number;
  modelPart: number;
  /** Mean of forecast minus observed temperature. */
  temperatureError: number;
}

/** The explanation stored with an event and shown on the Misses page and in e-mail. */
export interface MissCause {
  split: TemperatureSplit | null;
  /** Why no split was made, when none was. */
  splitUnavailable: string | null;
  flags: string[];
  /** The whole explanation in a few sentences. */
  words: string;
}

const degrees = { degF: '°F', degC: '°C' } as const;
const fmt = (value: number) => Math.abs(value).toLocaleString('en-US', { maximumFractionDigits: 1, minimumFractionDigits: 1 });

/** The load a forecast would have had with temperature `observed` instead of `used`. */
export function reforecast(forecast: number, used: number, observed: number, response: TemperatureResponse): number {
  const hdh = (t: number) => Math.max(0, response.heatingBase - t);
  const cdh = (t: number) => Math.max(0, t - response.coolingBase);
  const change = response.heatingCoefficient * (hdh(observed) - hdh(used)) + response.coolingCoefficient * (cdh(observed) - cdh(used));
  return response.log ? forecast * Math.exp(change) : forecast + change;
}

/** Splits the error of the missed hours and words the cause. */
export function explainMiss(
  hours: readonly EvidenceHour[],
  temperatures: readonly HourTemperatures[],
  response: TemperatureResponse | null,
  context: MissContext,
  unit: LoadUnit,
): MissCause {
  const flags: string[] = [];
  const estimated = hours.filter((hour) => hour.estimated).length;
  if (estimated > 0)
    flags.push(
      `${estimated} of the ${hours.length} missed hours hold a steward's estimate rather than a reading: check the actuals before the model.`,
    );
  for (const holiday of context.holidaysMissing)
    flags.push(
      `${holiday.day} is ${holiday.name}, a public holiday missing from the holiday calendar: the forecast treated it as a working day.`,
    );
  for (const narrow of context.bandTooNarrowAt)
    flags.push(
      `At ${narrow.hour} the ${narrow.level} % band missed on ${narrow.misses} of the last ${narrow.days} days (about ${fmt(((100 - narrow.level) / 100) * narrow.days)} expected): the band is too narrow at that hour.`,
    );

  let split: TemperatureSplit | null = null;
  let splitUnavailable: string | null = null;
  if (!response) splitUnavailable = 'The model uses no temperature, so all of the error is model error.';
  else {
    const byTs = new Map(temperatures.map((t) => [t.ts, t]));
    const usable = hours.flatMap((hour) => {
      const t = byTs.get(hour.ts);
      if (hour.actual === null || hour.forecast === null || t?.forecast == null || t.observed == null) return [];
      return [{ hour, used: t.forecast, observed: t.observed }];
    });
    if (usable.length === 0)
      splitUnavailable = 'Observed temperatures for these hours have not arrived yet; the split follows once they do.';
    else {
      let error = 0;
      let temperaturePart = 0;
      let temperatureError = 0;
      for (const { hour, used, observed } of usable) {
        const again = reforecast(hour.forecast!, used, observed, response);
        error += hour.actual! - hour.forecast!;
        temperaturePart += again - hour.forecast!;
        temperatureError += used - observed;
      }
      const n = usable.length;
      split = {
        hours: n,
        meanError: error / n,
        temperaturePart: temperaturePart / n,
        modelPart: (error - temperaturePart) / n,
        temperatureError: temperatureError / n,
      };
    }
  }

  const sentences: string[] = [];
  if (split) {
    const direction = split.meanError > 0 ? 'under' : 'over';
    const tempWords =
      Math.abs(split.temperatureError) < 0.05
        ? 'the temperature forecast was right'
        : `a temperature forecast ${fmt(split.temperatureError)} ${degrees[response!.unit]} too ${split.temperatureError < 0 ? 'low' : 'high'}`;
    const sameSide = Math.sign(split.temperaturePart) === Math.sign(split.meanError) && split.temperaturePart !== 0;
    sentences.push(
      sameSide
        ? `${fmt(split.temperaturePart)} of the ${fmt(split.meanError)} ${unit} ${direction}-forecast came from ${tempWords}; ${fmt(split.modelPart)} ${unit} is model error.`
        : `The forecast was ${fmt(split.meanError)} ${unit} ${direction} on average and ${tempWords}${split.temperaturePart === 0 ? '' : `, which pulled the other way by ${fmt(split.temperaturePart)} ${unit}`}: the miss is model error (${fmt(split.modelPart)} ${unit}).`,
    );
    if (split.hours < hours.length) sentences.push(`(${split.hours} of ${hours.length} hours have both temperatures.)`);
  } else if (splitUnavailable) sentences.push(splitUnavailable);
  sentences.push(...flags);
  return { split, splitUnavailable, flags, words: sentences.join(' ') };
}
