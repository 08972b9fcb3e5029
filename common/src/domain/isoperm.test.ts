import { describe, expect, it } from 'vitest';
import { DEFAULT_CLIMATE_SETTINGS, relativePermanence, timeWeightedPermanence } from './isoperm';
import { climateSettingsSchema } from '../schemas/climate';

const at = (ea: number) => ({ reference: { temperatureC: 20, rhPercent: 50 }, activationEnergyKjMol: ea, rhExponent: 1 });

describe('relativePermanence (isoperms)', () => {
  // REFERENCES.md §3: values relative to 20 °C / 50 % RH, RH exponent 1, computed from the common form of
  // Sebera's isoperm model (Sebera 1994; the closed form is from memory, the table was computed from it).
  const table: [number, number, number, number][] = [
    // Ea kJ/mol, °C, %RH, P
    [83.68, 15, 40, 2.268], [83.68, 10, 30, 5.603], [83.68, 25, 50, 0.562], [83.68, 15, 50, 1.814],
    [100, 15, 40, 2.547], [100, 10, 30, 7.098], [100, 25, 50, 0.503], [100, 15, 50, 2.038],
    [104.6, 15, 40, 2.632], [104.6, 10, 30, 7.588], [104.6, 25, 50, 0.487], [104.6, 15, 50, 2.106],
  ];
  it.each(table)('Ea %s kJ/mol, %s °C %s %% RH → %s (REFERENCES.md §3)', (ea, t, rh, expected) => {
    expect(relativePermanence(t, rh, at(ea))).toBeCloseTo(expected, 2);
  });

  it('is 1 at the reference climate and follows the RH exponent', () => {
    expect(relativePermanence(20, 50, at(83.68))).toBe(1);
    // Humidity factor alone: (50/25)^2 = 4 at the reference temperature.
    expect(relativePermanence(20, 25, { ...at(83.68), rhExponent: 2 })).toBeCloseTo(4, 12);
  });

  it('refuses RH of 0', () => {
    expect(() => relativePermanence(20, 0, at(83.68))).toThrow(RangeError);
  });
});

describe('timeWeightedPermanence', () => {
  it('averages the rate, not the permanence: equal time at 2 and at ~0.5 gives 0.8 (worked by hand)', () => {
    const c = at(83.68);
    // RH 25 % at 20 °C is P = 2; RH 100 % at 20 °C is P = 0.5 (humidity factor alone). Mean rate (0.5 + 2)/2 = 1.25 → P = 0.8.
    expect(timeWeightedPermanence([{ minutes: 60, temperatureC: 20, rhPercent: 25 }, { minutes: 60, temperatureC: 20, rhPercent: 100 }], c)).toBeCloseTo(0.8, 12);
    expect(timeWeightedPermanence([], c)).toBeNull();
  });
});

describe('DEFAULT_CLIMATE_SETTINGS', () => {
  it('pass their own schema', () => {
    expect(climateSettingsSchema.parse(DEFAULT_CLIMATE_SETTINGS)).toEqual(DEFAULT_CLIMATE_SETTINGS);
  });
});
