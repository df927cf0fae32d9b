/**
 * Weather scenarios of a load series' forecast: how the reviewed version's hours and daily peaks move if the
 * week runs hotter or colder than the temperatures it assumed, or brings the weather of the same calendar
 * weeks of past years (from the station's own history). Decision support for peak warnings: the same model
 * re-run with other temperatures, nothing more.
 *
 * Route (under /api): GET series/:id/temperature-scenarios?shift=N   data.read   → temperatureScenariosSchema
 * `shift` is whole degrees in the station's unit (1 to 20, default 5): one line N degrees hotter, one N colder.
 */
import { z } from 'zod';
import { dailyPeakSchema, horizonPeakSchema } from './forecasts';
import { digitsSchema } from './input';

/** Past years whose weather is tried, at most. */
export const scenarioPastYears = 5;

/** GET /api/series/:id/temperature-scenarios query. */
export const temperatureScenariosQuerySchema = z.object({
  shift: digitsSchema(1, 20, 'the shift in whole degrees').default(5),
});
export type TemperatureScenariosQuery = z.infer<typeof temperatureScenariosQuerySchema>;

/** One hour of a scenario: the temperature tried and the load the model gives with it. */
export const scenarioPointSchema = z.object({ ts: z.iso.datetime(), temperature: z.number(), value: z.number() });

/** One scenario line. */
export const temperatureScenarioSchema = z.object({
  /** `hotter`, `colder`, or `year-YYYY` for the weather of a past year. */
  key: z.string(),
  kind: z.enum(['shift', 'past-year']),
  /** Words for the legend and the table, e.g. "5 °F hotter" or "Weather of 2025 (2 Dec to 9 Dec)". */
  label: z.string(),
  /** Degrees added to every assumed temperature (negative: colder); null for a past year. */
  shift: z.number().nullable(),
  /** Mean of scenario temperature minus assumed temperature over the hours. */
  meanTemperatureChange: z.number(),
  points: z.array(scenarioPointSchema),
  dailyPeaks: z.array(dailyPeakSchema),
  peak: horizonPeakSchema.nullable(),
});
export type TemperatureScenario = z.infer<typeof temperatureScenarioSchema>;

/** GET /api/series/:id/temperature-scenarios */
export const temperatureScenariosSchema = z.object({
  /** The version the scenarios re-run (draft, else approved); null when the series has none. */
  versionId: z.number().int().nullable(),
  station: z.object({ id: z.number().int(), key: z.string(), name: z.string(), unit: z.enum(['degC', 'degF']) }).nullable(),
  /** False when the version's model has no temperature terms (then `reason` says why and there are no scenarios). */
  available: z.boolean(),
  reason: z.string(),
  /** The whole-degree shift asked for. */
  shift: z.number(),
  /** Daily peaks and the week's peak of the version as reviewed (adjusted where adjusted). */
  base: z.object({ dailyPeaks: z.array(dailyPeakSchema), peak: horizonPeakSchema.nullable() }),
  scenarios: z.array(temperatureScenarioSchema),
  /** Past years left out, each with why (station history missing or with long gaps). */
  skipped: z.array(z.string()),
  /** The caution shown beside the scenarios. */
  caution: z.string(),
});
export type TemperatureScenarios = z.infer<typeof temperatureScenariosSchema>;
