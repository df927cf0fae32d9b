import type { ModelSettingsRequest } from '@loadwright/contracts';
import { modelSettingsRequestSchema } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { defaultModelSettings, rowValuesFromSettings, settingsFromRow, type ModelSpecRow } from './model-settings';

/** Stores and reads back, as a row would. */
function roundTrip(settings: ModelSettingsRequest): ModelSettingsRequest {
  const values = rowValuesFromSettings(settings, 7);
  return settingsFromRow({ seriesId: 1, createdAt: new Date(), ...values } as ModelSpecRow);
}

describe('model settings in the database', () => {
  const cases: ModelSettingsRequest[] = [
    defaultModelSettings,
    {
      ...defaultModelSettings,
      method: 'nls',
      arOrder: 2,
      maOrder: 1,
      seasonal: { kind: 'profile', slot: 'hour-of-day', form: 'multiplicative' },
      log: true,
    },
    {
      ...defaultModelSettings,
      method: 'lasso',
      extraLags: [168],
      seasonal: { kind: 'difference', lag: 24 },
      temperature: { enabled: true, heatingBase: 58, coolingBase: 75 },
    },
    { ...defaultModelSettings, method: 'seasonal-naive', seasonal: { kind: 'none' }, dayTypes: false, levels: [50, 80, 95] },
  ];
  for (const settings of cases) {
    it(`keep ${settings.method} with ${settings.seasonal.kind} seasonality unchanged`, () => {
      expect(modelSettingsRequestSchema.parse(settings)).toEqual(settings);
      expect(roundTrip(settings)).toEqual(settings);
    });
  }
});
