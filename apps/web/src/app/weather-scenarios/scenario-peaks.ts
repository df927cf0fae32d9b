/** The rows of the scenarios' daily peak table: each local day's forecast peak and how each scenario moves it. */
import type { DailyPeak, TemperatureScenarios } from '@loadwright/contracts';

/** One scenario's peak of one day, and its change from the forecast's. */
export interface ScenarioPeakCell {
  key: string;
  peak: DailyPeak | null;
  /** Scenario peak minus forecast peak; null when either is missing. */
  change: number | null;
  /** True when the scenario's peak falls at another time of day than the forecast's. */
  moved: boolean;
}

/** One local day of the table. */
export interface ScenarioPeakRow {
  date: string;
  forecast: DailyPeak | null;
  cells: ScenarioPeakCell[];
}

/** Rows by local day, in date order, for the scenarios in `keys` (in that order). */
export function scenarioPeakRows(scenarios: TemperatureScenarios, keys: readonly string[]): ScenarioPeakRow[] {
  const dates = [...new Set(scenarios.base.dailyPeaks.map((peak) => peak.date))].sort();
  const chosen = keys.flatMap((key) => scenarios.scenarios.filter((scenario) => scenario.key === key));
  return dates.map((date) => {
    const forecast = scenarios.base.dailyPeaks.find((peak) => peak.date === date) ?? null;
    return {
      date,
      forecast,
      cells: chosen.map((scenario) => {
        const peak = scenario.dailyPeaks.find((candidate) => candidate.date === date) ?? null;
        return {
          key: scenario.key,
          peak,
          change: peak && forecast ? peak.value - forecast.value : null,
          moved: !!peak && !!forecast && peak.ts !== forecast.ts,
        };
      }),
    };
  });
}
