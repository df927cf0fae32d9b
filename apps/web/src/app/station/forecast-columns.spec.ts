import { describe, expect, it } from 'vitest';
import { guessForecastColumns } from './forecast-columns';

describe('guessForecastColumns', () => {
  it('finds issue time, valid hour and a °C temperature column by their names', () => {
    expect(guessForecastColumns(['issued', 'valid', 'temp_c'])).toEqual({
      issuedAtColumn: 'issued',
      validTimeColumn: 'valid',
      valueColumn: 'temp_c',
      unit: 'degC',
    });
  });

  it('reads °F from the header and leaves what no header says to the steward', () => {
    expect(guessForecastColumns(['issue_time', 'hour', 'Air temperature (°F)'])).toMatchObject({
      unit: 'degF',
      valueColumn: 'Air temperature (°F)',
    });
    expect(guessForecastColumns(['a', 'b', 'c'])).toEqual({ issuedAtColumn: null, validTimeColumn: null, valueColumn: null, unit: null });
  });
});
