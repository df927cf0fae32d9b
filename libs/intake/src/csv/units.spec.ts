import { describe, expect, it } from 'vitest';
import { unitConversion } from './units';

const convert = (from: Parameters<typeof unitConversion>[0], to: string, minutes: number, value: number) => {
  const f = unitConversion(from, to, minutes);
  if (typeof f === 'string') throw new Error(f);
  return f(value);
};

describe('unitConversion', () => {
  it('scales demand by powers of 1000, exactly as written', () => {
    expect(convert('W', 'kW', 60, 1234)).toBe(1.234);
    expect(convert('MW', 'kW', 60, 1.5)).toBe(1500);
    expect(convert('kW', 'MW', 60, 812.4)).toBe(0.8124);
  });

  it('turns energy per interval into mean demand: 25 kWh in 15 minutes is 100 kW', () => {
    expect(convert('kWh', 'kW', 15, 25)).toBe(100);
    expect(convert('MWh', 'MW', 60, 3.2)).toBe(3.2);
    expect(convert('kWh', 'MW', 5, 10)).toBe(0.12);
    // 1,347,100 Wh in an hour is a mean of 1,347,100 W = 1347.1 kW, without binary noise.
    expect(convert('Wh', 'kW', 60, 1_347_100)).toBe(1347.1);
    // 514.6 kWh in 15 minutes is 514.6 × 60 / 15 = 2058.4 kW.
    expect(convert('kWh', 'kW', 15, 514.6)).toBe(2058.4);
  });

  it('converts temperatures between °C and °F', () => {
    expect(convert('degC', 'degF', 60, 100)).toBe(212);
    expect(convert('degF', 'degC', 60, -40)).toBe(-40);
  });

  it('says why a unit does not fit the series', () => {
    expect(unitConversion('degF', 'kW', 60)).toBe('degF is a temperature unit but the series stores kW');
    expect(unitConversion('kW', 'degC', 60)).toBe('kW is a load unit but the series stores temperatures in degC');
  });
});
