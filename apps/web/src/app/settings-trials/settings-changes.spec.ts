import { describe, expect, it } from 'vitest';
import type { ModelSettingsRequest } from '@loadwright/contracts';
import { changesInOneLine, settingChanges } from './settings-changes';

const current: ModelSettingsRequest = {
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

describe('settingChanges', () => {
  it('lists only the settings that differ, in the order of the settings form, in words', () => {
    const proposed: ModelSettingsRequest = {
      ...current,
      method: 'yule-walker',
      arOrder: 3,
      seasonal: { kind: 'difference', lag: 24 },
      trainingWindowDays: 90,
    };
    expect(settingChanges(current, proposed)).toEqual([
      { setting: 'Method', from: 'Automatic choice', to: 'AR by Yule-Walker' },
      { setting: 'AR order', from: 'chosen by the method', to: '3' },
      { setting: 'Seasonal treatment', from: 'hour-of-week profile, additive', to: 'differencing at 24 hours' },
      { setting: 'Training window', from: '365 days', to: '90 days' },
    ]);
  });

  it('says so when nothing differs', () => {
    expect(changesInOneLine(settingChanges(current, { ...current }))).toBe('no setting differs');
    expect(changesInOneLine(settingChanges(current, { ...current, log: true }))).toBe('Log of load: no → yes');
  });
});
