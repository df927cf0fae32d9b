import { describe, expect, it } from 'vitest';
import { canConvert, unitConverter } from './unit-conversion';

describe('unitConverter', () => {
  it('scales load between W, kW and MW', () => {
    expect(unitConverter('kW', 'MW')(2500)).toBeCloseTo(2.5, 12);
    expect(unitConverter('MW', 'kW')(1.25)).toBeCloseTo(1250, 9);
    expect(unitConverter('W', 'kW')(812)).toBeCloseTo(0.812, 12);
    expect(unitConverter('kW', 'kW')(3.3)).toBe(3.3);
  });

  it('converts temperatures by the Celsius–Fahrenheit formula (0 °C = 32 °F, 100 °C = 212 °F, −40 ° equal)', () => {
    expect(unitConverter('degC', 'degF')(100)).toBeCloseTo(212, 12);
    expect(unitConverter('degF', 'degC')(32)).toBeCloseTo(0, 12);
    expect(unitConverter('degF', 'degC')(-40)).toBeCloseTo(-40, 12);
  });

  it('refuses to convert across kinds', () => {
    expect(canConvert('kW', 'degF')).toBe(false);
    expect(() => unitConverter('kW', 'degF')).toThrow(/cannot convert kW to degF/);
  });
});
