/**
 * Model settings between their stored form (model_specs row) and their contract form, in one place
 * for the API and the worker.
 */
import type { ModelMethod, ModelSettingsRequest, SeasonalTreatment } from '@loadwright/contracts';
import type { modelSpecs } from '@loadwright/db';

/** A stored model_specs row. */
export type ModelSpecRow = typeof modelSpecs.$inferSelect;
/** The columns a settings change writes. */
export type ModelSpecValues = Omit<typeof modelSpecs.$inferInsert, 'seriesId' | 'createdAt'>;

/** Stored method names by contract name. */
const storedMethod = {
  auto: 'auto',
  'yule-walker': 'yule_walker',
  cmle: 'conditional_mle',
  nls: 'nls_arma',
  ridge: 'ridge_ar',
  lasso: 'lasso_ar',
  'seasonal-naive': 'seasonal_naive',
} as const satisfies Record<ModelMethod, ModelSpecRow['method']>;

/** Contract method name of a stored one. */
export function contractMethod(stored: ModelSpecRow['method']): ModelMethod {
  const found = (Object.keys(storedMethod) as ModelMethod[]).find((name) => storedMethod[name] === stored);
  if (!found) throw new Error(`unknown stored model method ${stored}`);
  return found;
}

/** Stored method name of a contract one. */
export function toStoredMethod(method: ModelMethod): ModelSpecRow['method'] {
  return storedMethod[method];
}

/** The settings of a row, as the contract shapes them (without the read-only extras). */
export function settingsFromRow(row: ModelSpecRow): ModelSettingsRequest {
  return {
    method: contractMethod(row.method),
    arOrder: row.arOrder,
    maOrder: row.maOrder,
    maxArOrder: row.maxArOrder,
    maxMaOrder: row.maxMaOrder,
    extraLags: row.extraLags,
    seasonal: seasonalFromRow(row),
    log: row.logTransform,
    temperature: { enabled: row.useTemperature, heatingBase: row.heatingBase, coolingBase: row.coolingBase },
    dayTypes: row.useDayType,
    trainingWindowDays: row.trainingWindowDays,
    horizonHours: row.horizonHours,
    levels: row.levels,
  };
}

/** The seasonal treatment a row describes. */
function seasonalFromRow(row: ModelSpecRow): SeasonalTreatment {
  switch (row.seasonalTreatment) {
    case 'none':
      return { kind: 'none' };
    case 'seasonal_difference':
      return { kind: 'difference', lag: row.differenceLag === 24 ? 24 : 168 };
    case 'hour_of_day_profile':
      return { kind: 'profile', slot: 'hour-of-day', form: row.profileForm };
    case 'hour_of_week_profile':
      return { kind: 'profile', slot: 'hour-of-week', form: row.profileForm };
  }
}

/** The columns that store `settings`. */
export function rowValuesFromSettings(settings: ModelSettingsRequest, updatedById: number | null): ModelSpecValues {
  const seasonal = settings.seasonal;
  return {
    method: toStoredMethod(settings.method),
    arOrder: settings.arOrder,
    maOrder: settings.maOrder,
    maxArOrder: settings.maxArOrder,
    maxMaOrder: settings.maxMaOrder,
    extraLags: settings.extraLags,
    seasonalTreatment:
      seasonal.kind === 'none'
        ? 'none'
        : seasonal.kind === 'difference'
          ? 'seasonal_difference'
          : seasonal.slot === 'hour-of-day'
            ? 'hour_of_day_profile'
            : 'hour_of_week_profile',
    profileForm: seasonal.kind === 'profile' ? seasonal.form : 'additive',
    differenceLag: seasonal.kind === 'difference' ? seasonal.lag : 168,
    logTransform: settings.log,
    useTemperature: settings.temperature.enabled,
    heatingBase: settings.temperature.heatingBase,
    coolingBase: settings.temperature.coolingBase,
    useDayType: settings.dayTypes,
    trainingWindowDays: settings.trainingWindowDays,
    horizonHours: settings.horizonHours,
    levels: settings.levels,
    updatedById,
    updatedAt: new Date(),
  };
}

/** The settings a series without a model_specs row gets (the schema's defaults). */
export const defaultModelSettings: ModelSettingsRequest = {
  method: 'auto',
  arOrder: null,
  maOrder: null,
  maxArOrder: 48,
  maxMaOrder: 2,
  extraLags: [],
  seasonal: { kind: 'profile', slot: 'hour-of-week', form: 'additive' },
  log: false,
  temperature: { enabled: true, heatingBase: null, coolingBase: null },
  dayTypes: true,
  trainingWindowDays: 365,
  horizonHours: 168,
  levels: [80, 95],
};
