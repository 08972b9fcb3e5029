import { describe, expect, it } from 'vitest';
import { PROCESS, TONER_CLASS } from '../schemas/vocab';
import { lightSettingsSchema } from '../schemas/light';
import { DEFAULT_RESPONSIVITY_RULES, defaultResponsivity } from './light-budget';
import { DEFAULT_LIGHT_SETTINGS, categoryByRules } from './light-rules';

describe('light settings rules', () => {
  it('the default settings pass their own schema', () => {
    expect(lightSettingsSchema.parse(DEFAULT_LIGHT_SETTINGS)).toEqual(DEFAULT_LIGHT_SETTINGS);
  });

  it('the ordered default rules give the same category as the process/toner table for every process and every pair of toner classes', () => {
    const toners = [[], ...TONER_CLASS.codes.map((t) => [t]), ...TONER_CLASS.codes.flatMap((a) => TONER_CLASS.codes.map((b) => [a, b]))];
    for (const process of PROCESS.codes) {
      for (const t of toners) {
        expect(categoryByRules(DEFAULT_LIGHT_SETTINGS, process, t), `${process} ${t.join('+')}`).toBe(defaultResponsivity(process, t, DEFAULT_RESPONSIVITY_RULES));
      }
    }
  });

  it('iron-blue toning makes a gelatin silver print high (common practice: Prussian blue fades in light, REFERENCES.md §4)', () => {
    expect(categoryByRules(DEFAULT_LIGHT_SETTINGS, 'gelatin_silver_developing_out', ['selenium', 'iron_blue'])).toBe('high');
    expect(categoryByRules(DEFAULT_LIGHT_SETTINGS, 'gelatin_silver_developing_out', ['selenium'])).toBe('medium');
  });

  it('the first matching rule wins, and a print no rule matches takes the fallback', () => {
    const s = { rules: [{ process: 'cyanotype' as const, category: 'low' as const }, { tonerClass: 'iron_blue' as const, category: 'high' as const }], fallbackCategory: 'irresponsive' as const };
    expect(categoryByRules(s, 'cyanotype', ['iron_blue'])).toBe('low');
    expect(categoryByRules(s, 'albumen', ['iron_blue'])).toBe('high');
    expect(categoryByRules(s, 'albumen', [])).toBe('irresponsive');
  });
});
