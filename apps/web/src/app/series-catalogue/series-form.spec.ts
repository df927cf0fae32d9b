import type { SeriesSummary } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { changedFields, formIssues, formToRequest, newSeriesForm, seriesToForm } from './series-form';

const feeder = {
  id: 7,
  key: 'fdr-n1',
  name: 'N1 Harrow Pike East',
  kind: 'load',
  level: 'feeder',
  parentId: 3,
  parentKey: 'zone-north',
  unit: 'kW',
  intervalMinutes: 60,
  timeZone: 'America/Chicago',
  timestampsMark: 'start',
  temperatureSeriesId: 1,
  temperatureSeriesKey: 'wx-upland',
  peerGroup: 'rural-residential',
  description: null,
} as SeriesSummary;

describe('formIssues (the shared schema)', () => {
  it('accepts a complete new feeder', () => {
    expect(formIssues({ ...newSeriesForm('America/Chicago'), key: 'fdr-n9', name: 'N9 New Road' })).toEqual({});
  });

  it('names each field the schema refuses, with its message', () => {
    const issues = formIssues({ ...newSeriesForm('Mars/Olympus'), key: '9x', name: ' ', level: '', unit: 'degF' });
    expect(Object.keys(issues).sort()).toEqual(['key', 'level', 'name', 'timeZone', 'unit']);
    expect(issues['key']).toContain('starting with a letter');
    expect(issues['unit']).toBe('A load series is stored in W, kW, MW, not degF');
    expect(issues['timeZone']).toContain('Not an IANA time zone name');
  });
});

describe('formToRequest', () => {
  it('drops level, parent and station for a temperature series and turns blank text into null', () => {
    const request = formToRequest({
      ...newSeriesForm('UTC'),
      key: 'wx-new',
      name: 'New station',
      kind: 'temperature',
      unit: 'degF',
      parentId: 3,
      temperatureSeriesId: 1,
    });
    expect(request).toMatchObject({ level: null, parentId: null, temperatureSeriesId: null, peerGroup: null, description: null });
  });
});

describe('changedFields', () => {
  it('sends only what the edit changed', () => {
    const value = { ...seriesToForm(feeder), name: 'N1 Harrow Pike East (rebuilt)', description: 'Reconductored 2026' };
    expect(changedFields(feeder, value)).toEqual({ name: 'N1 Harrow Pike East (rebuilt)', description: 'Reconductored 2026' });
  });

  it('sends nothing when nothing changed', () => {
    expect(changedFields(feeder, seriesToForm(feeder))).toEqual({});
  });
});
